/**
 * Box-Cox power transformation (Box & Cox, 1964) of strictly positive data, its inverse, the
 * bias-adjusted back-transform of a mean, and two ways of choosing λ: Guerrero's (1993)
 * coefficient-of-variation criterion over seasonal subseries, and the profile likelihood of an
 * iid normal model on the transformed scale.
 *
 * Every routine is written in terms of log y and expm1/log1p so that it is continuous (and
 * accurate) as λ → 0, where the transform becomes the logarithm.
 */

/** Below this |λ·log y| the transform switches from expm1 to its Taylor series (see fromLog). */
const SERIES_CUTOFF = 1e-8;

function checkPositive(y: ArrayLike<number>, what: string): void {
  for (let i = 0; i < y.length; i++) {
    const v = y[i];
    if (!(v > 0) || !Number.isFinite(v)) {
      throw new RangeError(
        `${what} needs strictly positive, finite values; value ${i + 1} of ${y.length} is ${v}`,
      );
    }
  }
}

function checkLambda(lambda: number): void {
  if (!Number.isFinite(lambda)) throw new RangeError(`Box-Cox λ must be a finite number, got ${lambda}`);
}

/**
 * (e^{λL} − 1)/λ for L = log y. expm1 keeps full relative precision for small λL; when λL is
 * so small that λ itself could underflow the division, the Taylor series
 * L·(1 + λL/2 + (λL)²/6) is used instead (its truncation error is below 1e-24 relative there).
 */
function fromLog(logY: number, lambda: number): number {
  const x = lambda * logY;
  if (lambda === 0) return logY;
  if (Math.abs(x) < SERIES_CUTOFF) return logY * (1 + x / 2 + (x * x) / 6);
  return Math.expm1(x) / lambda;
}

/** Box & Cox (1964), eq. (1): y^(λ) = (y^λ − 1)/λ for λ ≠ 0, log y for λ = 0. */
export function boxCox(y: number, lambda: number): number {
  checkLambda(lambda);
  if (!(y > 0) || !Number.isFinite(y)) {
    throw new RangeError(`the Box-Cox transform needs a strictly positive, finite value, got ${y}`);
  }
  return fromLog(Math.log(y), lambda);
}

/** Box-Cox transform of every element; throws a RangeError naming the first non-positive value. */
export function boxCoxTransform(y: ArrayLike<number>, lambda: number): Float64Array {
  checkLambda(lambda);
  checkPositive(y, "the Box-Cox transform");
  const out = new Float64Array(y.length);
  for (let i = 0; i < y.length; i++) out[i] = fromLog(Math.log(y[i]), lambda);
  return out;
}

/**
 * Inverse of eq. (1): y = (1 + λz)^{1/λ} = exp(log1p(λz)/λ), exp(z) for λ = 0. Where the
 * inverse does not exist (1 + λz < 0, or = 0 with λ < 0) the result is NaN; with λ > 0 and
 * 1 + λz = 0 it is 0.
 */
export function boxCoxInverse(z: number, lambda: number): number {
  checkLambda(lambda);
  if (lambda === 0) return Math.exp(z);
  const x = lambda * z;
  if (Math.abs(x) < SERIES_CUTOFF) {
    // log1p(x)/λ = z·(1 − x/2 + x²/3 − …), the same continuity guard as fromLog.
    return Math.exp(z * (1 - x / 2 + (x * x) / 3));
  }
  const base = 1 + x;
  if (base < 0 || (base === 0 && lambda < 0)) return NaN;
  if (base === 0) return 0;
  return Math.exp(Math.log1p(x) / lambda);
}

export function boxCoxInverseTransform(z: ArrayLike<number>, lambda: number): Float64Array {
  const out = new Float64Array(z.length);
  for (let i = 0; i < z.length; i++) out[i] = boxCoxInverse(z[i], lambda);
  return out;
}

/**
 * Mean on the original scale of a quantity whose transformed value has mean μ and variance σ².
 * Second-order Taylor expansion of g⁻¹ about μ: E[g⁻¹(Z)] ≈ g⁻¹(μ) + ½σ²·(g⁻¹)''(μ), and for
 * the Box-Cox inverse (g⁻¹)''(μ) = g⁻¹(μ)·(1 − λ)/(1 + λμ)², giving
 *   g⁻¹(μ)·[1 + σ²(1 − λ) / (2(1 + λμ)²)],  which is exp(μ)(1 + σ²/2) at λ = 0.
 * The error is O(σ⁴) (the fourth-derivative term of the expansion).
 */
export function boxCoxMeanBiasAdjusted(mu: number, variance: number, lambda: number): number {
  checkLambda(lambda);
  if (!(variance >= 0)) throw new RangeError(`variance must be non-negative, got ${variance}`);
  const base = boxCoxInverse(mu, lambda);
  const d = 1 + lambda * mu;
  return base * (1 + (variance * (1 - lambda)) / (2 * d * d));
}

/**
 * Profile log-likelihood of λ for an iid normal model on the transformed data, up to a
 * constant: ℓ(λ) = −n/2·log σ̂²(λ) + (λ − 1)·Σ log yᵢ, with σ̂² the variance (divisor n) of
 * the transformed values (Box & Cox, 1964, Section 3: the Jacobian term is (λ−1)Σ log y).
 *
 * σ̂² is computed as e^{2λc}·var((e^{λ(Lᵢ−c)} − 1)/λ) with Lᵢ = log yᵢ and c their mean; the
 * two are equal because a variance ignores the shift by 1/λ, and the centred form keeps
 * precision when y^λ is nearly constant (large |λ| or tightly clustered data).
 */
export function boxCoxLogLik(y: ArrayLike<number>, lambda: number): number {
  checkLambda(lambda);
  checkPositive(y, "the Box-Cox likelihood");
  const n = y.length;
  if (n < 2) throw new RangeError(`the Box-Cox likelihood needs at least 2 values, got ${n}`);
  const logs = new Float64Array(n);
  let sumLog = 0;
  for (let i = 0; i < n; i++) {
    logs[i] = Math.log(y[i]);
    sumLog += logs[i];
  }
  const c = sumLog / n;
  const u = new Float64Array(n);
  let mean = 0;
  for (let i = 0; i < n; i++) {
    u[i] = fromLog(logs[i] - c, lambda);
    mean += u[i];
  }
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const e = u[i] - mean;
    ss += e * e;
  }
  const logVar = 2 * lambda * c + Math.log(ss / n);
  return (lambda - 1) * sumLog - (n / 2) * logVar;
}

export type LambdaBounds = readonly [number, number];

function checkBounds(bounds: LambdaBounds): void {
  const [lo, hi] = bounds;
  if (!(Number.isFinite(lo) && Number.isFinite(hi) && lo < hi)) {
    throw new RangeError(`λ bounds must be finite with lower < upper, got [${lo}, ${hi}]`);
  }
}

/**
 * Minimise a univariate function on [a, b] by Brent's (1973, ch. 5) combination of golden
 * section and successive parabolic interpolation. Non-finite values count as +∞. Both ends
 * are evaluated too, so a minimum on the boundary is returned exactly.
 */
function minimiseOnInterval(f: (x: number) => number, a: number, b: number, tol = 1e-10): number {
  const safe = (x: number): number => {
    const v = f(x);
    return Number.isFinite(v) ? v : Infinity;
  };
  const golden = (3 - Math.sqrt(5)) / 2;
  const sqrtEps = Math.sqrt(Number.EPSILON);
  const lo0 = a;
  const hi0 = b;
  let x = a + golden * (b - a);
  let w = x;
  let v = x;
  let fx = safe(x);
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  for (let iter = 0; iter < 200; iter++) {
    const m = 0.5 * (a + b);
    const tol1 = sqrtEps * Math.abs(x) + tol / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - m) <= tol2 - 0.5 * (b - a)) break;
    let parabolic = false;
    if (Math.abs(e) > tol1 && Number.isFinite(fx) && Number.isFinite(fw) && Number.isFinite(fv)) {
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      else q = -q;
      r = e;
      e = d;
      // Accept the parabola's minimum only if it falls inside (a, b) and the step shrinks.
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (a - x) && p < q * (b - x)) {
        d = p / q;
        const u = x + d;
        if (u - a < tol2 || b - u < tol2) d = x < m ? tol1 : -tol1;
        parabolic = true;
      }
    }
    if (!parabolic) {
      e = (x < m ? b : a) - x;
      d = golden * e;
    }
    const u = x + (Math.abs(d) >= tol1 ? d : d > 0 ? tol1 : -tol1);
    const fu = safe(u);
    if (fu <= fx) {
      if (u < x) b = x;
      else a = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) a = u;
      else b = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
  const fLo = safe(lo0);
  const fHi = safe(hi0);
  if (fLo < fx && fLo <= fHi) return lo0;
  if (fHi < fx) return hi0;
  return x;
}

/** λ maximising the profile log-likelihood boxCoxLogLik over the bounds. */
export function profileLambda(y: ArrayLike<number>, bounds: LambdaBounds = [-1, 2]): number {
  checkBounds(bounds);
  checkPositive(y, "choosing a Box-Cox λ");
  if (y.length < 2) throw new RangeError(`choosing a Box-Cox λ needs at least 2 values, got ${y.length}`);
  const ys = Float64Array.from(y);
  return minimiseOnInterval((l) => -boxCoxLogLik(ys, l), bounds[0], bounds[1]);
}

/**
 * Guerrero (1993): split the series into H consecutive subseries of `period` values (the
 * oldest n − H·period values are dropped so that the last subseries ends at the latest
 * value), take each subseries' mean m_h and standard deviation s_h, and choose λ so that
 * s_h / m_h^{1−λ} is as nearly constant across subseries as possible, measured by its
 * coefficient of variation. The ratio is constant exactly when s_h ∝ m_h^{1−λ}, the
 * power law under which the Box-Cox transform with that λ stabilises the variance.
 */
export function guerreroLambda(y: ArrayLike<number>, period: number, bounds: LambdaBounds = [-1, 2]): number {
  checkBounds(bounds);
  if (!Number.isInteger(period) || period < 2) {
    throw new RangeError(`Guerrero's method needs an integer period of at least 2, got ${period}`);
  }
  checkPositive(y, "choosing a Box-Cox λ");
  const n = y.length;
  const groups = Math.floor(n / period);
  if (groups < 2) {
    throw new RangeError(
      `Guerrero's method needs at least two full periods of ${period} values, got ${n} values`,
    );
  }
  const start = n - groups * period;
  const logMean = new Float64Array(groups);
  const logSd = new Float64Array(groups);
  let anySpread = false;
  for (let h = 0; h < groups; h++) {
    const off = start + h * period;
    let m = 0;
    for (let j = 0; j < period; j++) m += y[off + j];
    m /= period;
    let ss = 0;
    for (let j = 0; j < period; j++) {
      const e = y[off + j] - m;
      ss += e * e;
    }
    const s = Math.sqrt(ss / (period - 1));
    if (s > 0) anySpread = true;
    logMean[h] = Math.log(m);
    logSd[h] = Math.log(s);
  }
  if (!anySpread) {
    throw new RangeError("Guerrero's method needs a series that varies within at least one period");
  }
  const ratio = new Float64Array(groups);
  const cv = (lambda: number): number => {
    // log r_h = log s_h + (λ − 1) log m_h; rescaled by the largest before exponentiating,
    // which leaves the coefficient of variation unchanged and avoids overflow.
    let top = -Infinity;
    for (let h = 0; h < groups; h++) {
      ratio[h] = logSd[h] + (lambda - 1) * logMean[h];
      if (ratio[h] > top) top = ratio[h];
    }
    let mean = 0;
    for (let h = 0; h < groups; h++) {
      ratio[h] = Math.exp(ratio[h] - top);
      mean += ratio[h];
    }
    mean /= groups;
    let ss = 0;
    for (let h = 0; h < groups; h++) {
      const e = ratio[h] - mean;
      ss += e * e;
    }
    return Math.sqrt(ss / (groups - 1)) / mean;
  };
  return minimiseOnInterval(cv, bounds[0], bounds[1]);
}
