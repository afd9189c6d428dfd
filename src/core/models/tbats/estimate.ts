/**
 * Maximum-likelihood estimation of one TBATS structure (De Livera et al., 2011, §4.1).
 *
 * With the seed states concentrated out by regression (filter.ts) and σ² by its estimate
 * SSE/n, the likelihood of the transformed series with the Box-Cox Jacobian is maximised by
 * minimising
 *   L*(θ) = n·log SSE(θ) − 2(λ − 1)·Σ log y_t.
 * Parameters reach the optimiser through smooth one-to-one maps (our choices, stated so the
 * summary can be read): λ ∈ (0, 1), between the log and no transform; α ∈ (0, 1); β = α·u with
 * u ∈ (0, 1), i.e. 0 < β < α, the usual restricted region for a local trend (Hyndman et al.,
 * 2008, §10.2, from memory); φ ∈ (0.8, 0.98) as for damped exponential smoothing; ARMA
 * coefficients through partial autocorrelations, so AR stationarity and MA invertibility
 * always hold. Admissibility of the discount matrix (admissible.ts) is checked before each
 * evaluation; an inadmissible point scores +∞.
 *
 * The seasonal smoothing (γ1, γ2) of each period is reached in polar form, size ρ ∈ (0, 0.3)
 * and a direction inside the wedge of directions that are admissible to first order
 * (admissible.ts, gammaWedge), which depends on α, β and φ. Directly in (γ1, γ2), a fixed
 * seasonal pattern (γ = 0) is the apex of that wedge with the inadmissible region on the
 * other side, and an optimum near it (common for rates: the pattern drifts slowly) jams the
 * optimiser against the admissibility edge; in polar form the same optimum is the smooth
 * limit ρ → 0. Points the first-order wedge admits but the exact test refuses still score +∞.
 *
 * The minimiser: a short Nelder–Mead run (25 evaluations per simplex vertex), robust far from
 * the optimum and next to the hard admissibility edge; a scan of the seasonal smoothing at the
 * simplex's point (scanSeasonalStart); then BFGS with forward-difference gradients on L*
 * divided by n, which converges in far fewer evaluations once near the optimum; and the scan
 * once more at the optimum, with BFGS again from anything better it finds. Measured on nine years of synthetic weekly rates, this reached the
 * best optimum that long Nelder–Mead runs found in 150–400 evaluations, where Nelder–Mead alone
 * needed 400–1700 and BFGS alone stopped early on flat directions (β → 0, ρ → 0).
 */
import { bfgs, centralHessian, forwardGradient, nelderMead } from "../../math/optimise";
import { symmetricInverse } from "../../math/symmetric";
import { EvaluationBudgetSpent } from "../../math/optimise/nelderMead";
import { toBoundedScalar, toUnboundedScalar, type Bound } from "../../math/optimise";
import { constrainStationary, unconstrainStationary } from "../sarima/polynomial";
import { admissible, gammaWedge } from "./admissible";
import { referenceSeed, SeedRegression } from "./filter";
import { layoutOf, type StateLayout, type TbatsParameters, type TbatsStructure } from "./structure";

export const LAMBDA_BOUND: Bound = { lower: 0, upper: 1 };
export const ALPHA_BOUND: Bound = { lower: 0, upper: 1 };
export const BETA_SHARE_BOUND: Bound = { lower: 0, upper: 1 };
export const PHI_BOUND: Bound = { lower: 0.8, upper: 0.98 };
/** Size ρ = |(γ1, γ2)| of a period's seasonal smoothing, and its direction's share of the wedge. */
export const GAMMA_SIZE_BOUND: Bound = { lower: 0, upper: 0.3 };
export const WEDGE_SHARE_BOUND: Bound = { lower: 0, upper: 1 };
/** Starting size of the seasonal smoothing, and the smallest a warm start carries over. */
const GAMMA_START = 1e-3;
const GAMMA_FLOOR = 1e-5;

/** Data for one fit: the series, its logs and, when λ is fixed or absent, the transform. */
export interface Prepared {
  y: Float64Array;
  logY: Float64Array;
  sumLogY: number;
}

export function prepare(y: Float64Array): Prepared {
  const n = y.length;
  const logY = new Float64Array(n);
  let sumLogY = 0;
  for (let t = 0; t < n; t++) {
    logY[t] = y[t] > 0 ? Math.log(y[t]) : NaN;
    sumLogY += logY[t];
  }
  return { y, logY, sumLogY };
}

/** z_t = (y_t^λ − 1)/λ written into out, from the logs (log y at λ = 0). */
export function transformInto(prep: Prepared, lambda: number | null, out: Float64Array): void {
  const { y, logY } = prep;
  const n = y.length;
  if (lambda === null) {
    out.set(y);
  } else if (lambda === 0) {
    out.set(logY);
  } else {
    for (let t = 0; t < n; t++) out[t] = Math.expm1(lambda * logY[t]) / lambda;
  }
}

/** Number of free parameters of a structure (seeds and σ² not counted). */
export function parameterCount(s: TbatsStructure): number {
  return (s.boxCox ? 1 : 0) + 1 + (s.trend ? 1 : 0) + (s.trend && s.damped ? 1 : 0) + 2 * s.periods.length + s.p + s.q;
}

/** Unconstrained vector → parameters; `fixedLambda` is λ when the structure does not estimate it. */
export function parametersFrom(u: ArrayLike<number>, s: TbatsStructure, fixedLambda: number | null = null): TbatsParameters {
  let i = 0;
  const lambda = s.boxCox ? toBoundedScalar(u[i++], LAMBDA_BOUND) : fixedLambda;
  const alpha = toBoundedScalar(u[i++], ALPHA_BOUND);
  const beta = s.trend ? alpha * toBoundedScalar(u[i++], BETA_SHARE_BOUND) : 0;
  const phi = s.trend && s.damped ? toBoundedScalar(u[i++], PHI_BOUND) : 1;
  const gamma1: number[] = [];
  const gamma2: number[] = [];
  for (let k = 0; k < s.periods.length; k++) {
    const rho = toBoundedScalar(u[i++], GAMMA_SIZE_BOUND);
    const share = toBoundedScalar(u[i++], WEDGE_SHARE_BOUND);
    const wedge = gammaWedge(s.periods[k], s.harmonics[k], alpha, beta, phi, s.trend);
    if (wedge === null) {
      gamma1.push(0);
      gamma2.push(0);
    } else {
      const theta = wedge.lo + (wedge.hi - wedge.lo) * share;
      gamma1.push(rho * Math.cos(theta));
      gamma2.push(rho * Math.sin(theta));
    }
  }
  const arU = new Float64Array(s.p);
  for (let k = 0; k < s.p; k++) arU[k] = u[i++];
  const maU = new Float64Array(s.q);
  for (let k = 0; k < s.q; k++) maU[k] = u[i++];
  const ar = Array.from(constrainStationary(arU));
  // MA: 1 + θB invertible ⇔ 1 − (−θ)B stationary (sarima/polynomial.ts).
  const ma = Array.from(constrainStationary(maU), (v) => -v);
  return { lambda, alpha, beta, phi, gamma1, gamma2, ar, ma };
}

/** Parameters → unconstrained vector (values on a bound are pulled just inside). */
export function unconstrainedFrom(par: TbatsParameters, s: TbatsStructure): Float64Array {
  const u: number[] = [];
  const inside = (x: number, b: Bound): number => {
    const lo = b.lower as number;
    const hi = b.upper as number;
    const eps = 1e-6 * (hi - lo);
    return toUnboundedScalar(Math.min(hi - eps, Math.max(lo + eps, x)), b);
  };
  if (s.boxCox) u.push(inside(par.lambda ?? 0.5, LAMBDA_BOUND));
  u.push(inside(par.alpha, ALPHA_BOUND));
  if (s.trend) u.push(inside(par.alpha > 0 ? par.beta / par.alpha : 0.1, BETA_SHARE_BOUND));
  if (s.trend && s.damped) u.push(inside(par.phi, PHI_BOUND));
  const beta = s.trend ? par.beta : 0;
  const phi = s.trend && s.damped ? par.phi : 1;
  for (let k = 0; k < s.periods.length; k++) {
    const g1 = par.gamma1[k] ?? 0;
    const g2 = par.gamma2[k] ?? 0;
    const rho = Math.hypot(g1, g2);
    u.push(inside(Math.max(rho, GAMMA_FLOOR), GAMMA_SIZE_BOUND));
    const wedge = gammaWedge(s.periods[k], s.harmonics[k], par.alpha, beta, phi, s.trend);
    let share = 0.5;
    if (wedge !== null && rho > 0) {
      const mid = 0.5 * (wedge.lo + wedge.hi);
      let theta = Math.atan2(g2, g1);
      while (theta - mid > Math.PI) theta -= 2 * Math.PI;
      while (theta - mid <= -Math.PI) theta += 2 * Math.PI;
      share = Math.min(0.98, Math.max(0.02, (theta - wedge.lo) / (wedge.hi - wedge.lo)));
    }
    u.push(inside(share, WEDGE_SHARE_BOUND));
  }
  const ar = par.ar.slice(0, s.p);
  while (ar.length < s.p) ar.push(0);
  const ma = par.ma.slice(0, s.q).map((v) => -v);
  while (ma.length < s.q) ma.push(0);
  u.push(...unconstrainStationary(ar), ...unconstrainStationary(ma));
  return Float64Array.from(u);
}

/** Default starting values (ours): light smoothing, no seasonal drift, white-noise errors. */
export function defaultStart(s: TbatsStructure, lambda: number | null): TbatsParameters {
  const alpha = 0.1;
  const beta = s.trend ? 0.01 : 0;
  const phi = s.trend && s.damped ? 0.95 : 1;
  // γ: small, pointing into the middle of the admissible wedge.
  const wedges = s.periods.map((m, k) => gammaWedge(m, s.harmonics[k], alpha, beta, phi, s.trend));
  const mid = (w: { lo: number; hi: number } | null): number => (w ? 0.5 * (w.lo + w.hi) : 0);
  return {
    lambda: s.boxCox ? (lambda ?? 0.5) : lambda,
    alpha,
    beta,
    phi,
    gamma1: wedges.map((w) => (w ? GAMMA_START * Math.cos(mid(w)) : 0)),
    gamma2: wedges.map((w) => (w ? GAMMA_START * Math.sin(mid(w)) : 0)),
    ar: new Array<number>(s.p).fill(0),
    ma: new Array<number>(s.q).fill(0),
  };
}

/**
 * Starting simplex edges in the unconstrained coordinates (ours): 0.4 in the logit of λ, α,
 * β/α and φ; 1 in the logit of the seasonal size ρ (for small ρ about a factor e, a search on
 * the log scale, which suits a quantity that may lie anywhere from 1e-5 to 1e-1) and 0.5 in its
 * direction's share of the wedge; 0.1 for the ARMA partials.
 */
function initialSteps(s: TbatsStructure): Float64Array {
  const steps: number[] = [];
  if (s.boxCox) steps.push(0.4);
  steps.push(0.4);
  if (s.trend) steps.push(0.4);
  if (s.trend && s.damped) steps.push(0.4);
  for (let k = 0; k < s.periods.length; k++) steps.push(1, 0.5);
  for (let k = 0; k < s.p + s.q; k++) steps.push(0.1);
  return Float64Array.from(steps);
}

/** Regressor values for the fitted weeks, by column: column j is columns[j·n … (j+1)·n − 1]. */
export interface Regressors {
  count: number;
  columns: Float64Array;
}

/** A workspace that evaluates L* for one structure and data set. */
export class Objective {
  readonly L: StateLayout;
  readonly reg: SeedRegression;
  /** Box-Cox of y at the current λ (rewritten when λ changes). */
  readonly z: Float64Array;
  private ref: Float64Array;
  private refLambda: number | null | undefined = undefined;
  evaluations = 0;

  /**
   * `regressors`: calendar regressors on the transformed scale, by column (count × n), whose
   * coefficients are concentrated out with the seeds (filter.ts).
   */
  constructor(
    readonly prep: Prepared,
    readonly structure: TbatsStructure,
    readonly regressors: Regressors | null = null,
  ) {
    this.L = layoutOf(structure);
    this.reg = new SeedRegression(this.L, regressors?.count ?? 0);
    this.ref = new Float64Array(this.L.size);
    this.z = new Float64Array(prep.y.length);
  }

  /** SSE at the concentrated seeds (left in reg.seed), or NaN when inadmissible. */
  sse(par: TbatsParameters): number {
    if (!admissible(this.L, par)) return NaN;
    const lam = par.lambda;
    if (this.refLambda !== lam) {
      transformInto(this.prep, lam, this.z);
      this.ref = referenceSeed(this.L, this.z, this.structure.periods[0] ?? 1);
      this.refLambda = lam;
    }
    this.evaluations++;
    return this.reg.sse(this.z, par, this.ref, this.regressors?.columns);
  }

  /** L* = n log SSE − 2(λ − 1) Σ log y, +∞ where not defined. */
  value(par: TbatsParameters): number {
    const sse = this.sse(par);
    if (!(sse > 0)) return Infinity;
    const n = this.prep.y.length;
    const lam = par.lambda;
    const jac = lam === null ? 0 : -2 * (lam - 1) * this.prep.sumLogY;
    return n * Math.log(sse) + jac;
  }
}

/** Where (in the unconstrained vector) period k's seasonal size and direction sit. */
function seasonalOffset(s: TbatsStructure, k: number): number {
  return (s.boxCox ? 1 : 0) + 1 + (s.trend ? 1 : 0) + (s.trend && s.damped ? 1 : 0) + 2 * k;
}

/** Seasonal sizes and wedge shares the start scan tries (ours). */
const SCAN_SIZES = [1e-3, 3e-3, 1e-2, 3e-2];
const SCAN_SHARES = [0.05, 0.2, 0.35, 0.5, 0.65, 0.8, 0.95];

/**
 * Improve a point's seasonal smoothing by a small grid over size and direction, one period at
 * a time, the other parameters held (28 evaluations a period); u is updated in place and the
 * best value returned. The likelihood can have one optimum with ρ → 0 (a fixed pattern) and
 * another with the direction near an edge of the wedge; from a single start the simplex finds
 * whichever is nearer, at small ρ the direction hardly changes the likelihood, so the simplex
 * does not explore it, and as ρ → 0 the logistic map flattens the gradient, so BFGS stops
 * there too. The scan is run where α and β have already been fitted: at the start's α a large
 * γ can stand in for a too-small α and lead the search astray (found by the recovery tests).
 */
function scanSeasonalStart(f: (u: Float64Array) => number, u: Float64Array, s: TbatsStructure): number {
  let best = f(u);
  const trial = Float64Array.from(u);
  for (let k = 0; k < s.periods.length; k++) {
    const at = seasonalOffset(s, k);
    let bestRho = u[at];
    let bestShare = u[at + 1];
    for (const rho of SCAN_SIZES) {
      for (const share of SCAN_SHARES) {
        trial[at] = toUnboundedScalar(rho, GAMMA_SIZE_BOUND);
        trial[at + 1] = toUnboundedScalar(share, WEDGE_SHARE_BOUND);
        const v = f(trial);
        if (v < best) {
          best = v;
          bestRho = trial[at];
          bestShare = trial[at + 1];
        }
      }
    }
    u[at] = trial[at] = bestRho;
    u[at + 1] = trial[at + 1] = bestShare;
  }
  return best;
}

/** Nelder–Mead evaluations per simplex vertex before BFGS takes over. */
const NM_EVALS_PER_PARAMETER = 25;

export interface EstimateResult {
  par: TbatsParameters;
  /** L* at the optimum. */
  objective: number;
  sse: number;
  /** Seed state x_0 (full state length; ARMA part zero). */
  seed: Float64Array;
  /** Regressor coefficients β (empty without regressors). */
  coef: Float64Array;
  evaluations: number;
  converged: boolean;
}

export interface EstimateControl {
  start?: TbatsParameters;
  /** Evaluation budget of the whole fit. Default 120 + 60 × parameters. */
  maxEval?: number;
  regressors?: Regressors | null;
}

/**
 * Fit one structure. `fixedLambda` is the transform when the structure does not estimate λ
 * (null: none). Starts from `control.start` when given (a warm start), else defaultStart.
 */
export function estimate(prep: Prepared, s: TbatsStructure, fixedLambda: number | null, startLambda: number | null, control: EstimateControl = {}): EstimateResult {
  const obj = new Objective(prep, s, control.regressors ?? null);
  const lam0 = s.boxCox ? startLambda : fixedLambda;
  const start = control.start ? { ...control.start, lambda: s.boxCox ? control.start.lambda : fixedLambda } : defaultStart(s, lam0);
  const dim = parameterCount(s);
  const maxEval = control.maxEval ?? 120 + 60 * dim;
  const f = (u: Float64Array): number => obj.value(parametersFrom(u, s, fixedLambda));
  let u0 = unconstrainedFrom(start, s);
  if (!Number.isFinite(f(u0))) {
    // A warm start outside the admissible region for this structure: fall back to the default.
    u0 = unconstrainedFrom(defaultStart(s, lam0), s);
  }
  let best = { x: u0, f: f(u0) };
  let converged = false;
  if (dim > 0) {
    const steps = initialSteps(s);
    const n = prep.y.length;
    // The whole fit's budget is enforced here, since BFGS cannot see the gradient's calls:
    // once it is spent the objective signals so and BFGS returns its best point.
    const g = (u: Float64Array): number => {
      if (obj.evaluations >= maxEval) throw new EvaluationBudgetSpent();
      return f(u) / n;
    };
    const polish = (from: Float64Array): void => {
      // BFGS counts only its own calls, not the dim + 1 of each forward-difference gradient, so
      // the budget left is handed over as iterations (each about dim + 3 evaluations).
      const left = Math.max(40, maxEval - obj.evaluations);
      const maxIter = Math.max(4, Math.floor(left / (dim + 3)));
      const q = bfgs(g, from, { maxIter, maxEval: left, gTol: 1e-5, fTol: 1e-12, gradient: (u) => forwardGradient(g, u) });
      // Only a spent budget counts as not converged: BFGS also stops when the optimum sits on
      // the admissibility edge (no finite step left), which is the constrained optimum.
      converged = q.converged || (q.iterations < maxIter && q.evaluations < left);
      if (q.f * n < best.f) best = { x: Float64Array.from(q.x), f: q.f * n };
    };
    const nm = nelderMead(f, u0, { maxEval: Math.min(maxEval, NM_EVALS_PER_PARAMETER * (dim + 1)), xTol: 1e-3, fTol: 1e-3, adaptive: dim > 4, initialStep: steps });
    if (nm.f < best.f) best = { x: Float64Array.from(nm.x), f: nm.f };
    // The seasonal scan at the simplex's α and β (not at the start's), then BFGS; the scan again
    // at the optimum, and BFGS once more if it found better (module comment).
    const scanned = Float64Array.from(best.x);
    const v = scanSeasonalStart(f, scanned, s);
    if (v < best.f) best = { x: scanned, f: v };
    polish(best.x);
    const again = Float64Array.from(best.x);
    const w = scanSeasonalStart(f, again, s);
    if (w < best.f - 1e-6) {
      best = { x: again, f: w };
      polish(best.x);
    }
  } else {
    converged = true;
  }
  const par = parametersFrom(best.x, s, fixedLambda);
  const sse = obj.sse(par);
  return { par, objective: best.f, sse, seed: Float64Array.from(obj.reg.seed), coef: Float64Array.from(obj.reg.coef), evaluations: obj.evaluations, converged };
}

/** Names of the natural parameters in summary order, with their values (parametersFrom's order). */
export function namedParameters(par: TbatsParameters, s: TbatsStructure): { name: string; value: number }[] {
  const out: { name: string; value: number }[] = [];
  if (s.boxCox && par.lambda !== null) out.push({ name: "lambda", value: par.lambda });
  out.push({ name: "alpha", value: par.alpha });
  if (s.trend) out.push({ name: "beta", value: par.beta });
  if (s.trend && s.damped) out.push({ name: "phi", value: par.phi });
  s.periods.forEach((_, i) => {
    const tag = s.periods.length > 1 ? `${i + 1}` : "";
    out.push({ name: `gamma1${tag}`, value: par.gamma1[i] }, { name: `gamma2${tag}`, value: par.gamma2[i] });
  });
  par.ar.forEach((v, j) => out.push({ name: `ar${j + 1}`, value: v }));
  par.ma.forEach((v, j) => out.push({ name: `ma${j + 1}`, value: v }));
  return out;
}

/** Unconstrained coordinates beyond this size sit on a boundary of their range (σ(8) ≈ 0.9997). */
const BOUNDARY_COORDINATE = 8;

/**
 * Standard errors of the natural parameters from the observed information of the profile
 * likelihood (seeds and σ² concentrated out, which leaves the other parameters' covariance
 * unchanged: the inverse of a profile Hessian is the matching block of the full inverse).
 * The Hessian of −ℓ = L* ÷ 2 is taken by central differences in the unconstrained coordinates
 * (step 1e-4·max(1, |u|)), inverted by Cholesky, and carried to the natural parameters by the
 * delta method with a central-difference Jacobian. Coordinates on a boundary of their range (a
 * weight driven to 0, a seasonal size to 0) are held fixed; parameters that depend only on
 * them, and all of them when the Hessian is not positive definite, get NaN.
 */
export function standardErrors(y: Float64Array, s: TbatsStructure, par: TbatsParameters, regressors: Regressors | null = null): Map<string, number> {
  const names = namedParameters(par, s).map((p) => p.name);
  const out = new Map<string, number>(names.map((n) => [n, NaN]));
  const fixedLambda = s.boxCox ? null : par.lambda;
  const obj = new Objective(prepare(y), s, regressors);
  const u0 = unconstrainedFrom(par, s);
  const free: number[] = [];
  for (let i = 0; i < u0.length; i++) if (Math.abs(u0[i]) < BOUNDARY_COORDINATE) free.push(i);
  const d = free.length;
  if (d === 0) return out;
  const step = free.map((i) => 1e-4 * Math.max(1, Math.abs(u0[i])));
  // −ℓ as a function of the free coordinates, the others held at the optimum.
  const nll = (v: Float64Array): number => {
    const u = Float64Array.from(u0);
    for (let i = 0; i < d; i++) u[free[i]] = v[i];
    return obj.value(parametersFrom(u, s, fixedLambda)) / 2;
  };
  const H = centralHessian(nll, free.map((i) => u0[i]), step);
  if (!H.every(Number.isFinite)) return out;
  let inv: Float64Array;
  try {
    inv = symmetricInverse(H, d);
  } catch {
    return out; // not positive definite: no standard errors
  }
  // Jacobian of the natural parameters with respect to the free coordinates.
  const values = (u: Float64Array): number[] => namedParameters(parametersFrom(u, s, fixedLambda), s).map((p) => p.value);
  const m = names.length;
  const J = new Float64Array(m * d);
  for (let j = 0; j < d; j++) {
    const up = Float64Array.from(u0);
    const dn = Float64Array.from(u0);
    up[free[j]] += step[j];
    dn[free[j]] -= step[j];
    const a = values(up);
    const b = values(dn);
    for (let r = 0; r < m; r++) J[r * d + j] = (a[r] - b[r]) / (2 * step[j]);
  }
  const owners = ownCoordinates(s);
  const isFree = new Set(free);
  for (let r = 0; r < m; r++) {
    // A parameter whose own coordinate sits on a boundary has no standard error (β with its
    // share of α at 0 would otherwise inherit a tiny one from α).
    if (!owners[r].every((c) => isFree.has(c))) continue;
    let v = 0;
    for (let i = 0; i < d; i++) {
      for (let j = 0; j < d; j++) v += J[r * d + i] * inv[i * d + j] * J[r * d + j];
    }
    if (v >= 0) out.set(names[r], Math.sqrt(v));
  }
  return out;
}

/** For each named parameter (namedParameters' order), the unconstrained coordinates it is made from. */
function ownCoordinates(s: TbatsStructure): number[][] {
  const out: number[][] = [];
  let i = 0;
  if (s.boxCox) out.push([i++]);
  const alpha = i++;
  out.push([alpha]);
  if (s.trend) out.push([alpha, i++]);
  if (s.trend && s.damped) out.push([i++]);
  for (let k = 0; k < s.periods.length; k++) {
    const pair = [i, i + 1];
    out.push(pair, pair);
    i += 2;
  }
  const ar = Array.from({ length: s.p }, (_, k) => i + k);
  i += s.p;
  const ma = Array.from({ length: s.q }, (_, k) => i + k);
  for (let k = 0; k < s.p; k++) out.push(ar);
  for (let k = 0; k < s.q; k++) out.push(ma);
  return out;
}
