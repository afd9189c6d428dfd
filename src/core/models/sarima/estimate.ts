/**
 * Maximum-likelihood estimation of a seasonal ARIMA model with regression terms.
 *
 * The likelihood is the exact Gaussian likelihood of the differenced series w = Δ z with the
 * stationary start (Box, Jenkins & Reinsel, 2008, §7.1.2; the convention of "simple
 * differencing" — the first d + sD weeks are conditioned on), with σ² and the regression
 * coefficients concentrated out (filter.ts). The optimiser works on unconstrained reals that
 * map to stationary AR and invertible MA polynomials (polynomial.ts), so every point it
 * visits is admissible. It starts from the conditional-sum-of-squares estimate (Box, Jenkins
 * & Reinsel, §7.1.1) on the OLS-detrended series, as the usual "CSS, then ML" practice.
 */
import { bfgs, forwardGradient } from "../../math/optimise";
import { ols } from "../../math/ols";
import { armaFilter, glsLikelihood, interleave, logLikAtSigma2, type FilterOutput, type GlsLikelihood } from "./filter";
import { constrainStationary, difference, differencingLags, expandAr, expandMa, unconstrainStationary } from "./polynomial";
import { regressorColumns, regressorsOf, type RegressorSet, type SarimaSpec } from "./spec";

export interface ArmaCoefficients {
  ar: Float64Array;
  ma: Float64Array;
  sar: Float64Array;
  sma: Float64Array;
}

/** The data of one fit: the transformed rates differenced, and the differenced regressors. */
export interface Prepared {
  spec: SarimaSpec;
  /** Rates on the model scale (after Box-Cox), length n. */
  z: Float64Array;
  /** Right-hand-side coefficients of the differencing operator. */
  delta: Float64Array;
  /** Δz, length n − delta.length. */
  w: Float64Array;
  regressors: RegressorSet;
  /** Level-scale regressor columns for t = 0..n−1. */
  levelX: Float64Array[];
  /** Differenced regressor columns. */
  diffX: Float64Array[];
  /** w and diffX side by side, row-major, as the filter reads them. */
  data: Float64Array;
}

export function prepare(z: Float64Array, spec: SarimaSpec): Prepared {
  const delta = differencingLags(spec.d, spec.D, spec.s);
  const w = difference(z, delta);
  const regressors = regressorsOf(spec);
  const levelX = regressorColumns(regressors, 0, z.length);
  const diffX = levelX.map((x) => difference(x, delta));
  return { spec, z, delta, w, regressors, levelX, diffX, data: interleave([w, ...diffX]) };
}

export function parameterCount(spec: SarimaSpec): number {
  return spec.p + spec.q + spec.P + spec.Q;
}

/** Unconstrained x (ar | ma | sar | sma blocks) → admissible coefficients. */
export function coefficientsFrom(x: ArrayLike<number>, spec: SarimaSpec): ArmaCoefficients {
  let o = 0;
  const take = (m: number, negate: boolean): Float64Array => {
    const part = constrainStationary(Array.prototype.slice.call(x, o, o + m) as number[]);
    o += m;
    if (negate) for (let i = 0; i < m; i++) part[i] = -part[i];
    return part;
  };
  const ar = take(spec.p, false);
  const ma = take(spec.q, true);
  const sar = take(spec.P, false);
  const sma = take(spec.Q, true);
  return { ar, ma, sar, sma };
}

/** Coefficients → unconstrained x, pulling boundary values just inside the admissible region. */
export function unconstrainedFrom(c: ArmaCoefficients): Float64Array {
  const neg = (v: Float64Array): Float64Array => v.map((x) => -x);
  const parts = [unconstrainStationary(c.ar), unconstrainStationary(neg(c.ma)), unconstrainStationary(c.sar), unconstrainStationary(neg(c.sma))];
  const out = new Float64Array(parts.reduce((s, p) => s + p.length, 0));
  let o = 0;
  for (const p of parts) {
    out.set(p, o);
    o += p.length;
  }
  return out;
}

export interface Evaluation {
  filter: FilterOutput;
  gls: GlsLikelihood;
}

/** Filter w and the regressors for given coefficients; β by GLS unless fixed. */
export function evaluate(prep: Prepared, c: ArmaCoefficients, fixedBeta?: ArrayLike<number>): Evaluation {
  const s = prep.spec.s;
  const ar = expandAr(c.ar, c.sar, s);
  const ma = expandMa(c.ma, c.sma, s);
  const filter = armaFilter(ar, ma, prep.data, 1 + prep.diffX.length);
  return { filter, gls: glsLikelihood(filter, fixedBeta) };
}

/** Log-likelihood at given coefficients, β and σ² (no concentration), as references report it. */
export function logLikAt(prep: Prepared, c: ArmaCoefficients, beta: ArrayLike<number>, sigma2: number): number {
  const { filter, gls } = evaluate(prep, c, beta);
  return logLikAtSigma2(filter, gls.ssr, sigma2);
}

/**
 * Conditional sum of squares of the ARMA part on u = w − Xβ: e_t = u_t − Σφ*_j u_{t−j} −
 * Σθ*_j e_{t−j} for t ≥ p* (the expanded AR order), with earlier errors set to zero.
 */
function conditionalSumOfSquares(u: Float64Array, c: ArmaCoefficients, s: number, e: Float64Array): number {
  const ar = expandAr(c.ar, c.sar, s);
  const ma = expandMa(c.ma, c.sma, s);
  const arL: number[] = [];
  const maL: number[] = [];
  for (let j = 0; j < ar.length; j++) if (ar[j] !== 0) arL.push(j + 1);
  for (let j = 0; j < ma.length; j++) if (ma[j] !== 0) maL.push(j + 1);
  const p = ar.length;
  e.fill(0);
  let ss = 0;
  for (let t = p; t < u.length; t++) {
    let v = u[t];
    for (const j of arL) v -= ar[j - 1] * u[t - j];
    for (const j of maL) if (t - j >= p) v -= ma[j - 1] * e[t - j];
    e[t] = v;
    ss += v * v;
  }
  return ss / Math.max(u.length - p, 1);
}

export interface Estimate {
  coefficients: ArmaCoefficients;
  /** Unconstrained optimum, for warm starts. */
  x: Float64Array;
  beta: Float64Array;
  /** Cov(β̂) given the ARMA coefficients: σ̂²·(ΣVVᵀ/F)⁻¹, row-major. */
  betaCov: Float64Array;
  sigma2: number;
  logLik: number;
  /** Observations in the likelihood (after differencing). */
  nobs: number;
  evaluation: Evaluation;
  converged: boolean;
  /** Likelihood evaluations spent (CSS included). */
  evaluations: number;
  notes: string[];
}

/** Coefficients of the CSS fit, a start for the exact likelihood. */
function cssStart(prep: Prepared): { x: Float64Array; evaluations: number } {
  const k = parameterCount(prep.spec);
  let u = prep.w;
  if (prep.diffX.length > 0) {
    try {
      const fit = ols(prep.diffX, prep.w, { inference: false });
      u = Float64Array.from(fit.residuals);
    } catch {
      // Collinear regressors are reported by the exact fit; CSS just uses the raw difference.
    }
  }
  if (k === 0) return { x: new Float64Array(0), evaluations: 0 };
  const e = new Float64Array(u.length);
  const spec = prep.spec;
  const f = (x: Float64Array): number => conditionalSumOfSquares(u, coefficientsFrom(x, spec), spec.s, e);
  // A start only: a loose tolerance, the exact likelihood finishes the job.
  const res = bfgs(f, new Float64Array(k), { maxIter: 50, gTol: 1e-4, gradient: (u) => forwardGradient(f, u) });
  const x = Float64Array.from(res.x);
  // Keep the start away from the boundary, where the exact likelihood is flat.
  for (let i = 0; i < k; i++) x[i] = Math.max(-3, Math.min(3, x[i]));
  return { x, evaluations: res.evaluations };
}

/**
 * Convergence tolerance on max|∂(−ℓ/n)/∂x|. At 1e-5 the log-likelihood is within about
 * n·g²/2 ≈ 1e-7 of its maximum for a unit-curvature direction: far below the AICc
 * differences the order search acts on.
 */
const ML_GRADIENT_TOL = 1e-5;
export interface FitControl {
  /** Unconstrained start (a previous optimum); skips the CSS step. */
  start?: Float64Array;
  maxIter?: number;
}

/** Maximise the exact likelihood over the ARMA coefficients (β and σ² concentrated out). */
export function estimate(prep: Prepared, control: FitControl = {}): Estimate {
  const spec = prep.spec;
  const k = parameterCount(spec);
  const nobs = prep.w.length;
  const notes: string[] = [];
  let evaluations = 0;
  let x0: Float64Array;
  if (control.start && control.start.length === k) {
    x0 = Float64Array.from(control.start);
  } else {
    const css = cssStart(prep);
    x0 = css.x;
    evaluations += css.evaluations;
  }
  let x = x0;
  let converged = true;
  if (k > 0) {
    const f = (u: Float64Array): number => {
      evaluations++;
      try {
        return -evaluate(prep, coefficientsFrom(u, spec)).gls.logLik / nobs;
      } catch {
        return Infinity;
      }
    };
    const res = bfgs(f, x0, { maxIter: control.maxIter ?? 200, gTol: ML_GRADIENT_TOL, gradient: (u) => forwardGradient(f, u) });
    x = Float64Array.from(res.x);
    converged = res.converged;
    if (!converged) notes.push("The likelihood optimiser stopped before its convergence test was met; the estimate is the best point it found.");
  }
  const coefficients = coefficientsFrom(x, spec);
  const evaluation = evaluate(prep, coefficients);
  evaluations++;
  const { gls } = evaluation;
  const kb = gls.beta.length;
  const betaCov = new Float64Array(kb * kb);
  for (let i = 0; i < kb * kb; i++) betaCov[i] = gls.sigma2 * gls.betaPrecisionInverse[i];
  return {
    coefficients,
    x,
    beta: gls.beta,
    betaCov,
    sigma2: gls.sigma2,
    logLik: gls.logLik,
    nobs,
    evaluation,
    converged,
    evaluations,
    notes,
  };
}

/** AICc of a fit: k counts the ARMA coefficients, the regression coefficients and σ². */
export function aiccOf(logLik: number, nobs: number, spec: SarimaSpec, betaCount: number): number {
  const k = parameterCount(spec) + betaCount + 1;
  if (nobs - k - 1 <= 0) return Infinity;
  return -2 * logLik + 2 * k + (2 * k * (k + 1)) / (nobs - k - 1);
}
