/**
 * Lag polynomials of seasonal ARIMA models and the parameter transforms that keep them
 * stationary and invertible.
 *
 * Sign conventions (Box, Jenkins & Reinsel, 2008, ch. 9):
 *   AR  φ(B) = 1 − φ₁B − … − φ_pB^p,        seasonal Φ(B^s) = 1 − Φ₁B^s − … − Φ_PB^{Ps};
 *   MA  θ(B) = 1 + θ₁B + … + θ_qB^q,        seasonal Θ(B^s) = 1 + Θ₁B^s + … + Θ_QB^{Qs}.
 * A product φ(B)Φ(B^s) is held as the coefficient vector of its expansion, `ar[j − 1]` being
 * the coefficient of y_{t−j} on the right-hand side: y_t = Σ ar_j y_{t−j} + …; most entries
 * are zero (only lags i + s·k are present), and the hot loops visit the non-zero ones only.
 */

/** Non-zero lags of an expanded polynomial, for loops that skip the zeros. */
export interface SparseLags {
  lags: Int32Array;
  coefs: Float64Array;
}

/**
 * Right-hand-side coefficients of φ(B)Φ(B^s): y_t = Σ_{j≥1} out[j−1]·y_{t−j} + ….
 * (1 − Σ aᵢBⁱ)(1 − Σ A_k B^{sk}) = 1 − Σ aᵢBⁱ − Σ A_k B^{sk} + Σ aᵢA_k B^{i+sk}.
 */
export function expandAr(ar: ArrayLike<number>, sar: ArrayLike<number>, s: number): Float64Array {
  const len = ar.length + s * sar.length;
  const out = new Float64Array(len);
  for (let i = 1; i <= ar.length; i++) out[i - 1] += ar[i - 1];
  for (let k = 1; k <= sar.length; k++) {
    out[s * k - 1] += sar[k - 1];
    for (let i = 1; i <= ar.length; i++) out[i + s * k - 1] -= ar[i - 1] * sar[k - 1];
  }
  return out;
}

/** Coefficients of θ(B)Θ(B^s) after the leading 1: out[j−1] multiplies ε_{t−j}. */
export function expandMa(ma: ArrayLike<number>, sma: ArrayLike<number>, s: number): Float64Array {
  const len = ma.length + s * sma.length;
  const out = new Float64Array(len);
  for (let i = 1; i <= ma.length; i++) out[i - 1] += ma[i - 1];
  for (let k = 1; k <= sma.length; k++) {
    out[s * k - 1] += sma[k - 1];
    for (let i = 1; i <= ma.length; i++) out[i + s * k - 1] += ma[i - 1] * sma[k - 1];
  }
  return out;
}

export function sparse(coefs: Float64Array): SparseLags {
  const lags: number[] = [];
  const vals: number[] = [];
  for (let j = 0; j < coefs.length; j++) {
    if (coefs[j] !== 0) {
      lags.push(j + 1);
      vals.push(coefs[j]);
    }
  }
  return { lags: Int32Array.from(lags), coefs: Float64Array.from(vals) };
}

/**
 * Right-hand-side coefficients of the differencing operator (1 − B)^d (1 − B^s)^D:
 * Δ y_t = y_t − Σ out[j−1]·y_{t−j}, so the level follows from the difference by
 * y_t = Δy_t + Σ out[j−1]·y_{t−j}.
 */
export function differencingLags(d: number, D: number, s: number): Float64Array {
  // Full polynomial with leading 1, multiplied factor by factor.
  let poly = [1];
  const multiply = (factorLag: number): void => {
    const next = new Array<number>(poly.length + factorLag).fill(0);
    for (let i = 0; i < poly.length; i++) {
      next[i] += poly[i];
      next[i + factorLag] -= poly[i];
    }
    poly = next;
  };
  for (let i = 0; i < d; i++) multiply(1);
  for (let i = 0; i < D; i++) multiply(s);
  const out = new Float64Array(poly.length - 1);
  for (let j = 1; j < poly.length; j++) out[j - 1] = -poly[j];
  return out;
}

/** Apply (1 − B)^d (1 − B^s)^D to x; the result has x.length − (d + sD) entries. */
export function difference(x: ArrayLike<number>, lags: Float64Array): Float64Array {
  const m = lags.length;
  const n = x.length - m;
  const out = new Float64Array(Math.max(n, 0));
  for (let t = 0; t < n; t++) {
    let v = x[t + m];
    for (let j = 1; j <= m; j++) {
      const c = lags[j - 1];
      if (c !== 0) v -= c * x[t + m - j];
    }
    out[t] = v;
  }
  return out;
}

/**
 * ψ-weights of θ(B)/φ(B) up to lag h − 1 (ψ₀ = 1): ψ_j = θ_j + Σ_{i=1}^{min(j,p)} φᵢψ_{j−i}
 * (Box, Jenkins & Reinsel, 2008, eq. 5.2.3). `ar` may include the differencing, giving the
 * weights of the integrated model that set forecast-error variances.
 */
export function psiWeights(ar: Float64Array, ma: Float64Array, h: number): Float64Array {
  const psi = new Float64Array(h);
  if (h === 0) return psi;
  psi[0] = 1;
  const arS = sparse(ar);
  for (let j = 1; j < h; j++) {
    let v = j <= ma.length ? ma[j - 1] : 0;
    for (let k = 0; k < arS.lags.length; k++) {
      const lag = arS.lags[k];
      if (lag > j) break;
      v += arS.coefs[k] * psi[j - lag];
    }
    psi[j] = v;
  }
  return psi;
}

/** Product of two right-hand-side AR coefficient vectors: (1 − Σ aB)(1 − Σ bB) = 1 − Σ out B. */
export function multiplyAr(a: Float64Array, b: Float64Array): Float64Array {
  const out = new Float64Array(a.length + b.length);
  for (let i = 0; i < a.length; i++) out[i] += a[i];
  for (let j = 0; j < b.length; j++) out[j] += b[j];
  for (let i = 0; i < a.length; i++) {
    for (let j = 0; j < b.length; j++) out[i + j + 1] -= a[i] * b[j];
  }
  return out;
}

/**
 * Map unconstrained reals to the coefficients of a stationary AR polynomial (Jones, 1980;
 * Monahan, 1984): each xᵢ becomes a partial autocorrelation rᵢ = xᵢ/√(1 + xᵢ²) ∈ (−1, 1),
 * and the Durbin–Levinson recursion φ^{(k)}_k = r_k, φ^{(k)}_j = φ^{(k−1)}_j − r_k φ^{(k−1)}_{k−j}
 * turns them into AR coefficients. Every AR polynomial with roots outside the unit circle is
 * reached exactly once. MA coefficients use the same map with the sign flipped, since
 * 1 + θB is invertible exactly when 1 − (−θ)B is stationary.
 */
export function constrainStationary(x: ArrayLike<number>, out = new Float64Array(x.length)): Float64Array {
  const p = x.length;
  const prev = new Float64Array(p);
  for (let k = 0; k < p; k++) {
    const r = x[k] / Math.sqrt(1 + x[k] * x[k]);
    for (let j = 0; j < k; j++) out[j] = prev[j] - r * prev[k - 1 - j];
    out[k] = r;
    for (let j = 0; j <= k; j++) prev[j] = out[j];
  }
  return out;
}

/**
 * Inverse of constrainStationary: the reverse Durbin–Levinson step
 * φ^{(k−1)}_j = (φ^{(k)}_j + r_k φ^{(k)}_{k−j}) / (1 − r_k²) recovers the partial
 * autocorrelations; xᵢ = rᵢ/√(1 − rᵢ²). Coefficients on or outside the stationary region
 * (some |r_k| ≥ 1) are pulled just inside it, so a start from a boundary estimate is usable.
 */
export function unconstrainStationary(phi: ArrayLike<number>): Float64Array {
  const p = phi.length;
  const cur = Float64Array.from(phi);
  const x = new Float64Array(p);
  const LIMIT = 0.99;
  for (let k = p - 1; k >= 0; k--) {
    let r = cur[k];
    if (!(Math.abs(r) < LIMIT)) r = Math.sign(r || 1) * LIMIT;
    x[k] = r / Math.sqrt(1 - r * r);
    const denom = 1 - r * r;
    const next = new Float64Array(k);
    for (let j = 0; j < k; j++) next[j] = (cur[j] + r * cur[k - 1 - j]) / denom;
    for (let j = 0; j < k; j++) cur[j] = next[j];
  }
  return x;
}

/**
 * Largest |rᵢ| among the partial autocorrelations behind φ (via the reverse recursion);
 * ≥ 1 means φ is not stationary. Used to refuse models on the edge of the admissible region.
 */
export function maxPartialAutocorrelation(phi: ArrayLike<number>): number {
  const p = phi.length;
  const cur = Float64Array.from(phi);
  let worst = 0;
  for (let k = p - 1; k >= 0; k--) {
    const r = cur[k];
    worst = Math.max(worst, Math.abs(r));
    if (!(Math.abs(r) < 1)) return Infinity;
    const denom = 1 - r * r;
    const next = new Float64Array(k);
    for (let j = 0; j < k; j++) next[j] = (cur[j] + r * cur[k - 1 - j]) / denom;
    for (let j = 0; j < k; j++) cur[j] = next[j];
  }
  return worst;
}
