/**
 * Autocovariances of a stationary ARMA process with unit innovation variance, and the first
 * column of the stationary state covariance that starts the exact-likelihood filter.
 */
import { psiWeights } from "./polynomial";

/**
 * γ(0..maxLag) of y_t = Σ φ_j y_{t−j} + ε_t + Σ θ_j ε_{t−j}, Var ε = 1, by Brockwell & Davis
 * (1991), eq. (3.3.8)–(3.3.9): for k = 0..p,
 *   γ(k) − Σ_{j=1}^{p} φ_j γ(|k − j|) = Σ_{j=k}^{q} θ_j ψ_{j−k}   (θ₀ = 1),
 * a linear system in γ(0..p), solved by Gaussian elimination with partial pivoting; larger
 * lags follow from the same equation as a recursion. Throws a RangeError when the system is
 * singular (a unit root).
 */
export function armaAutocovariance(ar: Float64Array, ma: Float64Array, maxLag: number): Float64Array {
  const p = ar.length;
  const q = ma.length;
  const psi = psiWeights(ar, ma, q + 1);
  const theta = (j: number): number => (j === 0 ? 1 : j <= q ? ma[j - 1] : 0);
  const rhs = (k: number): number => {
    let s = 0;
    for (let j = k; j <= q; j++) s += theta(j) * psi[j - k];
    return s;
  };
  const gamma = new Float64Array(Math.max(maxLag, p) + 1);
  const m = p + 1;
  const A = new Float64Array(m * m);
  const b = new Float64Array(m);
  for (let k = 0; k <= p; k++) {
    A[k * m + k] += 1;
    for (let j = 1; j <= p; j++) {
      if (ar[j - 1] !== 0) A[k * m + Math.abs(k - j)] -= ar[j - 1];
    }
    b[k] = rhs(k);
  }
  solveInPlace(A, b, m);
  for (let k = 0; k <= p; k++) gamma[k] = b[k];
  for (let k = p + 1; k < gamma.length; k++) {
    let s = rhs(k);
    for (let j = 1; j <= p; j++) if (ar[j - 1] !== 0) s += ar[j - 1] * gamma[k - j];
    gamma[k] = s;
  }
  return gamma.subarray(0, maxLag + 1);
}

/** Solve A x = b (A row-major m×m) by elimination with partial pivoting; x overwrites b. */
function solveInPlace(A: Float64Array, b: Float64Array, m: number): void {
  for (let col = 0; col < m; col++) {
    let piv = col;
    let best = Math.abs(A[col * m + col]);
    for (let r = col + 1; r < m; r++) {
      const v = Math.abs(A[r * m + col]);
      if (v > best) {
        best = v;
        piv = r;
      }
    }
    if (!(best > 1e-13)) throw new RangeError("the AR polynomial has a unit root: no stationary covariance");
    if (piv !== col) {
      for (let c = col; c < m; c++) {
        const t = A[col * m + c];
        A[col * m + c] = A[piv * m + c];
        A[piv * m + c] = t;
      }
      const t = b[col];
      b[col] = b[piv];
      b[piv] = t;
    }
    const d = A[col * m + col];
    for (let r = col + 1; r < m; r++) {
      const f = A[r * m + col] / d;
      if (f === 0) continue;
      for (let c = col; c < m; c++) A[r * m + c] -= f * A[col * m + c];
      b[r] -= f * b[col];
    }
  }
  for (let r = m - 1; r >= 0; r--) {
    let s = b[r];
    for (let c = r + 1; c < m; c++) s -= A[r * m + c] * b[c];
    b[r] = s / A[r * m + r];
  }
}

/**
 * First column of the stationary covariance P₀ of the state in Harvey's (1989, §3.3.1)
 * representation with r = max(p, q + 1) states:
 *   α_{i,t+1} = φᵢ y_t + α_{i+1,t} + θ_{i−1} ε_t,  y_t = α_{1,t},
 * whose solution α_{i,t} = Σ_{k=i}^{r} [φ_k y_{t−1−(k−i)} + θ_{k−1} ε_{t−(k−i)}] gives
 *   Cov(α_{i,t}, y_t) = Σ_{k=i}^{r} [φ_k γ(k − i + 1) + θ_{k−1} ψ_{k−i}].
 * Only this column is needed: the filter's covariance recursion starts from P₁ − P₀, which
 * is the rank-one −G₀G₀ᵀ/F₀ with G₀ = T·P₀e₁ (see filter.ts).
 */
export function stationaryFirstColumn(ar: Float64Array, ma: Float64Array, r: number): Float64Array {
  const gamma = armaAutocovariance(ar, ma, r);
  const psi = psiWeights(ar, ma, r);
  const c = new Float64Array(r);
  for (let k = 1; k <= ar.length; k++) {
    const phi = ar[k - 1];
    if (phi === 0) continue;
    for (let i = 1; i <= k; i++) c[i - 1] += phi * gamma[k - i + 1];
  }
  for (let m = 0; m <= ma.length; m++) {
    const th = m === 0 ? 1 : ma[m - 1];
    if (th === 0) continue;
    // k − 1 = m, so k = m + 1 and i runs 1..m+1.
    for (let i = 1; i <= m + 1; i++) c[i - 1] += th * psi[m + 1 - i];
  }
  return c;
}

/**
 * The whole stationary state covariance P₀ (r × r, row-major, σ² = 1) of the representation
 * above, for exact forecast variances. With α_{i,t} = Σ_{k=i}^{r} [φ_k y_{t−1−(k−i)} +
 * θ_{k−1} ε_{t−1−(k−i)}] and Cov(y_{t−1−a}, ε_{t−1−b}) = ψ_{b−a−1} (b > a, else 0; y_s carries
 * ε_{s−1} as its newest shock in this representation),
 *   P₀[i][j] = Σ_{k≥i} Σ_{l≥j} [φ_kφ_l γ(|a − b|) + φ_kθ_{l−1} C(a, b) + θ_{k−1}φ_l C(b, a)
 *              + θ_{k−1}θ_{l−1}·[a = b]],  a = k − i, b = l − j,
 * summed over the non-zero lags only: O(r²·nnz²) for nnz non-zero coefficients.
 */
export function stationaryCovariance(ar: Float64Array, ma: Float64Array, r: number): Float64Array {
  const gamma = armaAutocovariance(ar, ma, r);
  const psi = psiWeights(ar, ma, r);
  const phiL: number[] = [];
  const phiV: number[] = [];
  for (let k = 1; k <= ar.length; k++) if (ar[k - 1] !== 0) { phiL.push(k); phiV.push(ar[k - 1]); }
  const thL: number[] = [1];
  const thV: number[] = [1];
  for (let m = 1; m <= ma.length; m++) if (ma[m - 1] !== 0) { thL.push(m + 1); thV.push(ma[m - 1]); }
  const C = (a: number, b: number): number => (b > a ? psi[b - a - 1] : 0);
  const P = new Float64Array(r * r);
  for (let i = 1; i <= r; i++) {
    for (let j = i; j <= r; j++) {
      let s = 0;
      for (let x = 0; x < phiL.length; x++) {
        const a = phiL[x] - i;
        if (a < 0) continue;
        for (let y = 0; y < phiL.length; y++) {
          const b = phiL[y] - j;
          if (b >= 0) s += phiV[x] * phiV[y] * gamma[Math.abs(a - b)];
        }
        for (let y = 0; y < thL.length; y++) {
          const b = thL[y] - j;
          if (b >= 0) s += phiV[x] * thV[y] * C(a, b);
        }
      }
      for (let x = 0; x < thL.length; x++) {
        const a = thL[x] - i;
        if (a < 0) continue;
        for (let y = 0; y < phiL.length; y++) {
          const b = phiL[y] - j;
          if (b >= 0) s += thV[x] * phiV[y] * C(b, a);
        }
        for (let y = 0; y < thL.length; y++) {
          if (thL[y] - j === a) s += thV[x] * thV[y];
        }
      }
      P[(i - 1) * r + (j - 1)] = s;
      P[(j - 1) * r + (i - 1)] = s;
    }
  }
  return P;
}
