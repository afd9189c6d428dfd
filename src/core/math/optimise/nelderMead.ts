/**
 * Nelder–Mead simplex minimisation as specified by Lagarias, Reeds, Wright & Wright (1998),
 * Section 2: reflection ρ = 1, expansion χ = 2, contraction γ = ½, shrink σ = ½, with
 * their ordering and acceptance rules. Optionally the dimension-dependent coefficients of
 * Gao & Han (2012): ρ = 1, χ = 1 + 2/n, γ = ¾ − 1/(2n), σ = 1 − 1/n, which keep
 * the expansion and shrink steps from degenerating in higher dimensions.
 *
 * A non-finite objective value counts as +∞, so the simplex simply moves away from it.
 */

/** An objective on ℝⁿ; it must not keep or modify the array it is given. */
export type Objective = (x: Float64Array) => number;

export interface MinimiseResult {
  /** Best point evaluated. */
  x: Float64Array;
  f: number;
  iterations: number;
  /** Number of objective evaluations; never above maxEval. */
  evaluations: number;
  converged: boolean;
  message: string;
}

export interface NelderMeadOptions {
  maxIter?: number;
  maxEval?: number;
  /** Stop when every vertex is within xTol (max-norm) of the best vertex… */
  xTol?: number;
  /** …and every vertex's value is within fTol of the best value. */
  fTol?: number;
  /** Use Gao & Han (2012) coefficients. Default false. */
  adaptive?: boolean;
  /** Edge length of the starting simplex, per coordinate or for all; default 0.1·max(1, |x0ᵢ|). */
  initialStep?: number | ArrayLike<number>;
}

/** Thrown inside an optimiser when the evaluation budget is spent; never escapes. */
export class EvaluationBudgetSpent extends Error {
  constructor() {
    super("evaluation budget spent");
  }
}

/**
 * Wraps an objective: counts calls, refuses calls beyond the budget, maps non-finite values to
 * +∞ and remembers the best point seen.
 */
export class CountedObjective {
  evaluations = 0;
  bestX: Float64Array;
  bestF = Infinity;

  constructor(private readonly f: Objective, private readonly maxEval: number, n: number) {
    this.bestX = new Float64Array(n);
  }

  get exhausted(): boolean {
    return this.evaluations >= this.maxEval;
  }

  call(x: Float64Array): number {
    if (this.evaluations >= this.maxEval) throw new EvaluationBudgetSpent();
    this.evaluations++;
    const raw = this.f(x);
    const v = Number.isFinite(raw) ? raw : Infinity;
    if (v < this.bestF || (this.evaluations === 1 && v === Infinity)) {
      this.bestF = v;
      this.bestX.set(x);
    }
    return v;
  }
}

function checkStart(x0: ArrayLike<number>): void {
  if (x0.length === 0) throw new RangeError("the starting point has no coordinates");
  for (let i = 0; i < x0.length; i++) {
    if (!Number.isFinite(x0[i])) throw new RangeError(`starting coordinate ${i + 1} is not finite (${x0[i]})`);
  }
}

export function nelderMead(f: Objective, x0: ArrayLike<number>, options: NelderMeadOptions = {}): MinimiseResult {
  checkStart(x0);
  const n = x0.length;
  const maxIter = options.maxIter ?? 1000 * n;
  const maxEval = options.maxEval ?? 2000 * n;
  const xTol = options.xTol ?? 1e-8;
  const fTol = options.fTol ?? 1e-12;
  const adaptive = options.adaptive ?? false;
  const rho = 1;
  const chi = adaptive ? 1 + 2 / n : 2;
  const gamma = adaptive ? 0.75 - 1 / (2 * n) : 0.5;
  const sigma = adaptive ? 1 - 1 / n : 0.5;

  const obj = new CountedObjective(f, maxEval, n);
  const simplex: Float64Array[] = [];
  const values = new Float64Array(n + 1);
  let iterations = 0;

  const done = (converged: boolean, message: string): MinimiseResult => ({
    x: Float64Array.from(obj.bestX),
    f: obj.bestF,
    iterations,
    evaluations: obj.evaluations,
    converged,
    message,
  });

  try {
    const start = Float64Array.from(x0);
    simplex.push(start);
    values[0] = obj.call(start);
    for (let i = 0; i < n; i++) {
      const v = Float64Array.from(x0);
      const step = options.initialStep;
      const h =
        step === undefined ? 0.1 * Math.max(1, Math.abs(x0[i])) : typeof step === "number" ? step : step[i];
      if (!(h !== 0 && Number.isFinite(h))) throw new RangeError(`initial step ${i + 1} must be finite and nonzero`);
      v[i] += h;
      simplex.push(v);
      values[i + 1] = obj.call(v);
    }

    const order = Array.from({ length: n + 1 }, (_, i) => i);
    const centroid = new Float64Array(n);
    const xr = new Float64Array(n);
    const xe = new Float64Array(n);
    const xc = new Float64Array(n);
    // Point centroid + t·(centroid − worst), written into out.
    const along = (t: number, worst: Float64Array, out: Float64Array): Float64Array => {
      for (let j = 0; j < n; j++) out[j] = centroid[j] + t * (centroid[j] - worst[j]);
      return out;
    };

    for (;;) {
      order.sort((a, b) => values[a] - values[b] || a - b);
      const best = order[0];
      if (values[best] === Infinity) return done(false, "the objective is not finite anywhere on the simplex");
      let xSpread = 0;
      let fSpread = 0;
      for (let i = 1; i <= n; i++) {
        const v = simplex[order[i]];
        fSpread = Math.max(fSpread, values[order[i]] - values[best]);
        for (let j = 0; j < n; j++) xSpread = Math.max(xSpread, Math.abs(v[j] - simplex[best][j]));
      }
      if (xSpread <= xTol && fSpread <= fTol) return done(true, "simplex size and value spread below xTol and fTol");
      if (iterations >= maxIter) return done(false, `stopped at maxIter = ${maxIter} iterations`);
      iterations++;

      const worstIdx = order[n];
      const worst = simplex[worstIdx];
      const fBest = values[best];
      const fSecond = values[order[n - 1]];
      const fWorst = values[worstIdx];
      centroid.fill(0);
      for (let i = 0; i < n; i++) {
        const v = simplex[order[i]];
        for (let j = 0; j < n; j++) centroid[j] += v[j] / n;
      }

      // Lagarias et al. (1998), Section 2, steps 2–5.
      const fr = obj.call(along(rho, worst, xr));
      if (fBest <= fr && fr < fSecond) {
        worst.set(xr);
        values[worstIdx] = fr;
        continue;
      }
      if (fr < fBest) {
        const fe = obj.call(along(rho * chi, worst, xe));
        if (fe < fr) {
          worst.set(xe);
          values[worstIdx] = fe;
        } else {
          worst.set(xr);
          values[worstIdx] = fr;
        }
        continue;
      }
      if (fr < fWorst) {
        const fc = obj.call(along(rho * gamma, worst, xc)); // outside contraction
        if (fc <= fr) {
          worst.set(xc);
          values[worstIdx] = fc;
          continue;
        }
      } else {
        const fcc = obj.call(along(-gamma, worst, xc)); // inside contraction
        if (fcc < fWorst) {
          worst.set(xc);
          values[worstIdx] = fcc;
          continue;
        }
      }
      // Shrink towards the best vertex.
      const xb = simplex[best];
      for (let i = 1; i <= n; i++) {
        const v = simplex[order[i]];
        for (let j = 0; j < n; j++) v[j] = xb[j] + sigma * (v[j] - xb[j]);
        values[order[i]] = obj.call(v);
      }
    }
  } catch (e) {
    if (e instanceof EvaluationBudgetSpent) return done(false, `stopped at maxEval = ${maxEval} evaluations`);
    throw e;
  }
}
