/**
 * BFGS quasi-Newton minimisation (Nocedal & Wright, 2006, Alg. 6.1) on ℝⁿ, with the inverse
 * Hessian approximation updated by eq. (6.17), scaled before the first update by eq. (6.20),
 * and a line search satisfying the strong Wolfe conditions, eq. (3.7), by Alg. 3.5 with the
 * zoom of Alg. 3.6 (cubic interpolation, eq. (3.59), safeguarded).
 *
 * Without an analytic gradient, central differences are used (Nocedal & Wright, Section 8.1)
 * with step hᵢ = ε^{1/3}·max(|xᵢ|, 1), which balances truncation error O(h²) against rounding
 * error O(ε/h). A non-finite objective value is treated as +∞, so the line search backs off.
 */
import { CountedObjective, EvaluationBudgetSpent, MinimiseResult, Objective } from "./nelderMead";

export interface BfgsOptions {
  /** Analytic gradient; without it central differences are used. */
  gradient?: (x: Float64Array) => Float64Array;
  maxIter?: number;
  /** Cap on objective evaluations, finite-difference ones included. */
  maxEval?: number;
  /** Converged when max|∂f/∂xᵢ| ≤ gTol. Default 1e-6. */
  gTol?: number;
  /** Also converged when one step changes f by at most fTol·max(1, |f|)… Default 1e-13. */
  fTol?: number;
  /** …and moves x by at most xTol·max(1, max|xᵢ|) in every coordinate. Default 1e-11. */
  xTol?: number;
  /** Sufficient-decrease and curvature constants of eq. (3.7); 0 < c1 < c2 < 1. */
  c1?: number;
  c2?: number;
}

export interface BfgsResult extends MinimiseResult {
  /** Max-norm of the gradient at x (NaN if it could not be computed). */
  gradientNorm: number;
  gradientEvaluations: number;
}

const FD_STEP = Math.cbrt(Number.EPSILON);

/**
 * Central-difference gradient of f at x, where f(x) = fx. If one side of a coordinate is not
 * finite the one-sided difference on the other side is used; if neither is, that entry is NaN.
 */
export function numericalGradient(f: Objective, x: Float64Array, fx: number): Float64Array {
  const n = x.length;
  const g = new Float64Array(n);
  const t = Float64Array.from(x);
  for (let i = 0; i < n; i++) {
    const xi = x[i];
    const h0 = FD_STEP * Math.max(Math.abs(xi), 1);
    // Use the representable step actually taken, so that the quotient matches the points.
    t[i] = xi + h0;
    const hp = t[i] - xi;
    const fp = f(t);
    t[i] = xi - h0;
    const hm = xi - t[i];
    const fm = f(t);
    t[i] = xi;
    const okP = Number.isFinite(fp);
    const okM = Number.isFinite(fm);
    if (okP && okM) g[i] = (fp - fm) / (hp + hm);
    else if (okP) g[i] = (fp - fx) / hp;
    else if (okM) g[i] = (fx - fm) / hm;
    else g[i] = NaN;
  }
  return g;
}

const FORWARD_STEP = Math.sqrt(Number.EPSILON);

/**
 * Forward-difference gradient (Nocedal & Wright, 2006, eq. 8.1): k evaluations instead of the
 * 2k of central differences, with error O(h·|f″|) + O(ε|f|/h), about 1e-8 for unit curvature
 * at h = √ε·max(|xᵢ|, 1): ample for a gradient tolerance of 1e-5 on an objective of order
 * one. A step that leaves the finite region is taken backwards. Pass it as BfgsOptions.gradient when f is costly.
 */
export function forwardGradient(f: Objective, x: Float64Array): Float64Array {
  const fx = f(x);
  const g = new Float64Array(x.length);
  const t = Float64Array.from(x);
  for (let i = 0; i < x.length; i++) {
    const h0 = FORWARD_STEP * Math.max(Math.abs(x[i]), 1);
    t[i] = x[i] + h0;
    const hp = t[i] - x[i];
    let fp = f(t);
    if (Number.isFinite(fp)) g[i] = (fp - fx) / hp;
    else {
      t[i] = x[i] - h0;
      fp = f(t);
      g[i] = (fx - fp) / (x[i] - t[i]);
    }
    t[i] = x[i];
  }
  return g;
}

function dot(a: Float64Array, b: Float64Array): number {
  let s = 0;
  for (let i = 0; i < a.length; i++) s += a[i] * b[i];
  return s;
}

function maxAbs(a: Float64Array): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}

function allFinite(a: Float64Array): boolean {
  for (let i = 0; i < a.length; i++) if (!Number.isFinite(a[i])) return false;
  return true;
}

interface Trial {
  alpha: number;
  f: number;
  /** φ'(α) = ∇f(x + αp)·p, NaN when not computed. */
  d: number;
  x: Float64Array | null;
  g: Float64Array | null;
}

/** Minimiser of the interpolant on [lo, hi] (either order), or the midpoint if unusable. */
function interpolate(lo: Trial, hi: Trial): number {
  const a0 = lo.alpha;
  const a1 = hi.alpha;
  const left = Math.min(a0, a1);
  const width = Math.abs(a1 - a0);
  let a = NaN;
  if (Number.isFinite(hi.f) && Number.isFinite(hi.d) && Number.isFinite(lo.d)) {
    // Nocedal & Wright (2006), eq. (3.59).
    const d1 = lo.d + hi.d - (3 * (lo.f - hi.f)) / (a0 - a1);
    const rad = d1 * d1 - lo.d * hi.d;
    if (rad >= 0) {
      const d2 = Math.sign(a1 - a0) * Math.sqrt(rad);
      a = a1 - ((a1 - a0) * (hi.d + d2 - d1)) / (hi.d - lo.d + 2 * d2);
    }
  } else if (Number.isFinite(hi.f) && Number.isFinite(lo.d)) {
    // Quadratic through φ(lo), φ'(lo), φ(hi).
    const delta = a1 - a0;
    const c = (hi.f - lo.f - lo.d * delta) / (delta * delta);
    if (c > 0) a = a0 - lo.d / (2 * c);
  }
  // Safeguard: stay at least a tenth of the interval away from either end.
  if (!(a >= left + 0.1 * width && a <= left + 0.9 * width)) a = left + 0.5 * width;
  return a;
}

export function bfgs(f: Objective, x0: ArrayLike<number>, options: BfgsOptions = {}): BfgsResult {
  const n = x0.length;
  if (n === 0) throw new RangeError("the starting point has no coordinates");
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(x0[i])) throw new RangeError(`starting coordinate ${i + 1} is not finite (${x0[i]})`);
  }
  const maxIter = options.maxIter ?? Math.max(100, 200 * n);
  const maxEval = options.maxEval ?? maxIter * (2 * n + 20);
  const gTol = options.gTol ?? 1e-6;
  const fTol = options.fTol ?? 1e-13;
  const xTol = options.xTol ?? 1e-11;
  const c1 = options.c1 ?? 1e-4;
  const c2 = options.c2 ?? 0.9;
  if (!(0 < c1 && c1 < c2 && c2 < 1)) throw new RangeError(`line search needs 0 < c1 < c2 < 1, got ${c1}, ${c2}`);

  const obj = new CountedObjective(f, maxEval, n);
  const call = (x: Float64Array): number => obj.call(x);
  let gradientEvaluations = 0;
  const gradient = (x: Float64Array, fx: number): Float64Array | null => {
    gradientEvaluations++;
    const g = options.gradient ? Float64Array.from(options.gradient(x)) : numericalGradient(call, x, fx);
    if (g.length !== n) throw new RangeError(`gradient has ${g.length} entries, expected ${n}`);
    return allFinite(g) ? g : null;
  };

  let x: Float64Array = Float64Array.from(x0);
  let fx = NaN;
  let g: Float64Array | null = null;
  let iterations = 0;
  const finish = (converged: boolean, message: string): BfgsResult => ({
    x: Float64Array.from(x),
    f: fx,
    iterations,
    evaluations: obj.evaluations,
    converged,
    message,
    gradientNorm: g ? maxAbs(g) : NaN,
    gradientEvaluations,
  });

  const p = new Float64Array(n);
  const xt = new Float64Array(n);
  const at = (alpha: number): Float64Array => {
    for (let i = 0; i < n; i++) xt[i] = x[i] + alpha * p[i];
    return Float64Array.from(xt);
  };

  /** Nocedal & Wright (2006), Alg. 3.6: shrink [lo, hi] to a strong-Wolfe point. */
  const zoom = (start: Trial, f0: number, d0: number, loIn: Trial, hiIn: Trial): { t: Trial; wolfe: boolean } | null => {
    let lo = loIn;
    let hi = hiIn;
    for (let j = 0; j < 50; j++) {
      if (Math.abs(hi.alpha - lo.alpha) <= Number.EPSILON * Math.max(1, lo.alpha)) break;
      const a = interpolate(lo, hi);
      const xa = at(a);
      const fa = call(xa);
      if (fa > f0 + c1 * a * d0 || fa >= lo.f) {
        hi = { alpha: a, f: fa, d: NaN, x: null, g: null };
        continue;
      }
      const ga = gradient(xa, fa);
      if (!ga) {
        hi = { alpha: a, f: Infinity, d: NaN, x: null, g: null };
        continue;
      }
      const da = dot(ga, p);
      const trial: Trial = { alpha: a, f: fa, d: da, x: xa, g: ga };
      if (Math.abs(da) <= -c2 * d0) return { t: trial, wolfe: true };
      if (da * (hi.alpha - lo.alpha) >= 0) hi = lo;
      lo = trial;
    }
    // Sufficient decrease holds at lo whenever lo moved off the start.
    return lo.alpha > 0 && lo !== start ? { t: lo, wolfe: false } : null;
  };

  /** Nocedal & Wright (2006), Alg. 3.5. */
  const lineSearch = (alpha1: number): { t: Trial; wolfe: boolean } | null => {
    const f0 = fx;
    const d0 = dot(g as Float64Array, p);
    const start: Trial = { alpha: 0, f: f0, d: d0, x, g };
    let prev = start;
    let a = alpha1;
    const aMax = 1e10 * alpha1;
    for (let i = 1; i <= 60; i++) {
      const xa = at(a);
      const fa = call(xa);
      if (fa > f0 + c1 * a * d0 || (i > 1 && fa >= prev.f)) {
        return zoom(start, f0, d0, prev, { alpha: a, f: fa, d: NaN, x: null, g: null });
      }
      const ga = gradient(xa, fa);
      if (!ga) return zoom(start, f0, d0, prev, { alpha: a, f: Infinity, d: NaN, x: null, g: null });
      const da = dot(ga, p);
      const trial: Trial = { alpha: a, f: fa, d: da, x: xa, g: ga };
      if (Math.abs(da) <= -c2 * d0) return { t: trial, wolfe: true };
      if (da >= 0) return zoom(start, f0, d0, trial, prev);
      prev = trial;
      if (a >= aMax) return { t: trial, wolfe: false };
      a = Math.min(2 * a, aMax);
    }
    return prev.alpha > 0 ? { t: prev, wolfe: false } : null;
  };

  try {
    fx = call(x);
    if (!Number.isFinite(fx)) return finish(false, "the objective is not finite at the starting point");
    g = gradient(x, fx);
    if (!g) return finish(false, "the gradient is not finite at the starting point");

    const H = new Float64Array(n * n);
    const resetH = (): void => {
      H.fill(0);
      for (let i = 0; i < n; i++) H[i * n + i] = 1;
    };
    resetH();
    let needsScaling = true; // H is the unscaled identity
    const Hy = new Float64Array(n);

    for (;;) {
      const gNow: Float64Array = g;
      if (maxAbs(gNow) <= gTol) return finish(true, "gradient max-norm below gTol");
      if (iterations >= maxIter) return finish(false, `stopped at maxIter = ${maxIter} iterations`);

      // p = −H g; fall back to steepest descent if rounding has made it uphill.
      for (let i = 0; i < n; i++) {
        let s = 0;
        for (let j = 0; j < n; j++) s += H[i * n + j] * gNow[j];
        p[i] = -s;
      }
      if (!(dot(p, gNow) < 0)) {
        resetH();
        needsScaling = true;
        for (let i = 0; i < n; i++) p[i] = -gNow[i];
      }
      // With an unscaled H the step length is unknown: start with a unit move in max-norm.
      const alpha1 = needsScaling ? Math.min(1, 1 / maxAbs(p)) : 1;
      const ls = lineSearch(alpha1);
      iterations++;
      if (!ls) {
        if (!needsScaling) {
          resetH();
          needsScaling = true;
          continue;
        }
        return finish(false, "the line search could not reduce the objective along steepest descent");
      }
      const xNew = ls.t.x as Float64Array;
      const gNew = ls.t.g as Float64Array;
      const s = new Float64Array(n);
      const yv = new Float64Array(n);
      for (let i = 0; i < n; i++) {
        s[i] = xNew[i] - x[i];
        yv[i] = gNew[i] - gNow[i];
      }
      const fChange = Math.abs(fx - ls.t.f);
      x = xNew;
      fx = ls.t.f;
      g = gNew;

      const sy = dot(s, yv);
      const yy = dot(yv, yv);
      // Update only with positive curvature; it is guaranteed when the Wolfe conditions hold.
      if (sy > 1e-12 * Math.sqrt(dot(s, s) * yy)) {
        if (needsScaling) {
          // Nocedal & Wright (2006), eq. (6.20): H₀ = (yᵀs / yᵀy)·I.
          H.fill(0);
          for (let i = 0; i < n; i++) H[i * n + i] = sy / yy;
          needsScaling = false;
        }
        // Eq. (6.17) expanded: H − ρ(s(Hy)ᵀ + (Hy)sᵀ) + (ρ²·yᵀHy + ρ)·ssᵀ, ρ = 1/yᵀs.
        const rho = 1 / sy;
        for (let i = 0; i < n; i++) {
          let t = 0;
          for (let j = 0; j < n; j++) t += H[i * n + j] * yv[j];
          Hy[i] = t;
        }
        const coefSS = rho * rho * dot(yv, Hy) + rho;
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            H[i * n + j] += -rho * (s[i] * Hy[j] + Hy[i] * s[j]) + coefSS * s[i] * s[j];
          }
        }
      }
      if (fChange <= fTol * Math.max(1, Math.abs(fx)) && maxAbs(s) <= xTol * Math.max(1, maxAbs(x))) {
        return finish(true, "step and change in value below xTol and fTol");
      }
    }
  } catch (e) {
    if (e instanceof EvaluationBudgetSpent) return finish(false, `stopped at maxEval = ${maxEval} evaluations`);
    throw e;
  }
}
