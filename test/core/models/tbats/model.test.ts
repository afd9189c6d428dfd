/**
 * TbatsFitted behaviour: updates, simulation against the forecast distribution, determinism,
 * the in-sample record, components and the summary. The fitted model is a Box-Cox, damped-trend,
 * ARMA(1,0), <52.18,2> TBATS on a seeded simulation from the independent generator (simulate.ts);
 * numeric references are the dense recursion of the paper's matrix form (dense.ts; De Livera,
 * Hyndman & Snyder, 2011, §3), the Gaussian likelihood with the Box–Cox Jacobian (Box & Cox,
 * 1964, §3) and binomial/χ² Monte-Carlo bounds for the simulated paths.
 */
import { Matrix } from "ml-matrix";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { filterPass } from "../../../../src/core/models/tbats/filter";
import { fitTbatsStructure, TbatsFitted } from "../../../../src/core/models/tbats/model";
import type { TbatsStructure } from "../../../../src/core/models/tbats/structure";
import { denseFilter, denseSystem, maxAbs, maxAbsDiff } from "./dense";
import { forwardBoxCox, inverseBoxCox, simulateTbats, type TbatsTruth } from "./simulate";

const WEEK_YEAR = 365.25 / 7;
const N = 200;
const EXTRA = 20;

const truth: TbatsTruth = {
  lambda: 0.4, alpha: 0.3, trend: true, beta: 0.03, phi: 0.92, periods: [WEEK_YEAR], harmonics: [2],
  gamma1: [0.01], gamma2: [0.01], ar: [0.4], ma: [], sigma: 0.3, level0: 20, slope0: 0.1, amplitude: 1.5,
};
const structure: TbatsStructure = { boxCox: true, trend: true, damped: true, periods: [WEEK_YEAR], harmonics: [2], p: 1, q: 0 };
const all = simulateTbats(truth, N + EXTRA, new MersenneTwister(4242)).y;
const y = all.slice(0, N);
const newY = all.slice(N);
const fit = fitTbatsStructure(y, structure);

describe("update", () => {
  const fixed = fit.update(newY, { reestimate: false }) as TbatsFitted;

  test("without re-estimation: same parameters, seeds and σ²; errors of the dense filter on the longer series", () => {
    expect(fixed).toBeInstanceOf(TbatsFitted);
    expect(fixed.n).toBe(N + EXTRA);
    expect(fixed.par).toEqual(fit.par);
    expect(Array.from(fixed.seed)).toEqual(Array.from(fit.seed));
    expect(fixed.sigma2).toBe(fit.sigma2);
    // Dense recursion (dense.ts) from the same seed over the whole transformed series; the
    // transform written independently in simulate.ts. Rounding ~1e-13 of the data's scale.
    const z = all.map((v) => forwardBoxCox(v, fit.par.lambda));
    const dense = denseFilter(denseSystem(structure, fit.par), z, fit.seed);
    expect(maxAbsDiff(fixed.pass.errors, dense.errors)).toBeLessThan(1e-10 * maxAbs(z));
    // The first N weeks are the original fit's record, bit for bit (same arithmetic).
    expect(Array.from(fixed.pass.errors.subarray(0, N))).toEqual(Array.from(fit.pass.errors));
  });

  test("the new weeks' errors are those of filtering on from the old final state (identity, 1e-12)", () => {
    const zNew = fixed.z.subarray(N);
    const onward = filterPass(fit.layout, fit.par, zNew, fit.pass.state);
    // The same operations on the same numbers: exact up to 1e-12 of the scale.
    expect(maxAbsDiff(onward.errors, fixed.pass.errors.subarray(N))).toBeLessThanOrEqual(1e-12 * maxAbs(zNew));
    expect(maxAbsDiff(onward.state, fixed.pass.state)).toBeLessThanOrEqual(1e-12 * maxAbs(zNew));
  });

  test("with re-estimation: log-likelihood at least that of the fixed parameters on the longer data", () => {
    const re = fit.update(newY, { reestimate: true }) as TbatsFitted;
    expect(re).toBeInstanceOf(TbatsFitted);
    expect(re.n).toBe(N + EXTRA);
    expect(re.structure).toEqual(structure);
    // The re-fit starts at the old parameters with least-squares seeds for the longer data
    // (no worse than the old seeds) and Nelder–Mead only keeps improvements; 1e-6 allows the
    // start's pull of 1e-6 of a range inside a bound (estimate.ts, unconstrainedFrom).
    expect(re.logLik).toBeGreaterThanOrEqual(fixed.logLik - 1e-6);
  });
});

describe("simulate() against forecast()", () => {
  // 4000 paths: the fraction of paths inside a q-interval is binomial with sd √(q(1−q)/4000)
  // (0.63 points at 80%, 0.34 at 95%, 0.79 for the fraction below the median); we allow 4 sd.
  // On the transformed scale the paths are Gaussian with the forecast's mean and variance: the
  // sample mean is within 4·sd/√4000, and the sample variance within 4·√(2/3999) ≈ 9% (χ²).
  const PATHS = 4000;
  const H = 4;
  const paths = fit.simulate(H, PATHS, new MersenneTwister(31));
  const fc = fit.forecast(H, [80, 95]);
  const lam = fit.par.lambda;

  test.each([1, 2, 3, 4])("step %i: coverage of the bounds, median, mean and variance", (h) => {
    const s = h - 1;
    let in80 = 0;
    let in95 = 0;
    let below = 0;
    let sum = 0;
    let sumSq = 0;
    for (const p of paths) {
      const v = p[s];
      if (v >= fc.lower[0][s] && v <= fc.upper[0][s]) in80++;
      if (v >= fc.lower[1][s] && v <= fc.upper[1][s]) in95++;
      if (v < fc.point[s]) below++;
      const zv = forwardBoxCox(v, lam);
      sum += zv;
      sumSq += zv * zv;
    }
    expect(Math.abs(in80 / PATHS - 0.8)).toBeLessThan(4 * Math.sqrt((0.8 * 0.2) / PATHS));
    expect(Math.abs(in95 / PATHS - 0.95)).toBeLessThan(4 * Math.sqrt((0.95 * 0.05) / PATHS));
    // The point forecast is the back-transformed median (no bias adjustment asked for).
    expect(Math.abs(below / PATHS - 0.5)).toBeLessThan(4 * Math.sqrt(0.25 / PATHS));
    const zMid = forwardBoxCox(fc.point[s], lam);
    // sd from the 95% bounds on the transformed scale; Φ⁻¹(0.975) from published tables.
    const sd = (forwardBoxCox(fc.upper[1][s], lam) - forwardBoxCox(fc.lower[1][s], lam)) / (2 * 1.959963984540054);
    const mean = sum / PATHS;
    const variance = (sumSq - PATHS * mean * mean) / (PATHS - 1);
    expect(Math.abs(mean - zMid)).toBeLessThan((4 * sd) / Math.sqrt(PATHS));
    expect(Math.abs(variance / (sd * sd) - 1)).toBeLessThan(4 * Math.sqrt(2 / (PATHS - 1)));
  });

  test("paths are reproducible from the seed", () => {
    const again = fit.simulate(H, 3, new MersenneTwister(31));
    for (let p = 0; p < 3; p++) expect(Array.from(again[p])).toEqual(Array.from(paths[p]));
  });
});

describe("determinism, in-sample record and components", () => {
  test("two identical fits are bit-identical", () => {
    const other = fitTbatsStructure(Float64Array.from(y), structure);
    expect(other.par).toStrictEqual(fit.par);
    expect(Array.from(other.seed)).toStrictEqual(Array.from(fit.seed));
    expect(Object.is(other.logLik, fit.logLik)).toBe(true);
    expect(Object.is(other.sigma2, fit.sigma2)).toBe(true);
    expect(Array.from(other.fitted)).toStrictEqual(Array.from(fit.fitted));
    const a = other.forecast(8, [80, 95]);
    const b = fit.forecast(8, [80, 95]);
    expect(Array.from(a.point)).toStrictEqual(Array.from(b.point));
    expect(Array.from(a.upper[1])).toStrictEqual(Array.from(b.upper[1]));
  });

  test("fitted + residuals = y, and fitted is the back-transformed dense one-step prediction", () => {
    const z = y.map((v) => forwardBoxCox(v, fit.par.lambda));
    const dense = denseFilter(denseSystem(structure, fit.par), z, fit.seed);
    for (let t = 0; t < N; t++) {
      // One rounding of a subtraction: ≤ 1 ulp of y, far below 1e-12 relative.
      expect(Math.abs(fit.fitted[t] + fit.residuals[t] - y[t])).toBeLessThanOrEqual(1e-12 * y[t]);
      // z_t − ε_t = wᵀx_{t−1}, back-transformed by the inverse written in simulate.ts.
      const expected = inverseBoxCox(z[t] - dense.errors[t], fit.par.lambda);
      expect(Math.abs(fit.fitted[t] - expected)).toBeLessThan(1e-9 * expected);
    }
  });

  test("components(): in-sample seasonal Σ s_{j,t−1} and future values from the dense F^s x_n", () => {
    const ahead = 60;
    const comp = fit.components(ahead);
    const sys = denseSystem(structure, fit.par);
    const z = y.map((v) => forwardBoxCox(v, fit.par.lambda));
    // Seasonal states are indices 2..5 (ℓ, b, s_1, s_2, s*_1, s*_2): Σ s_j = x[2] + x[3].
    let x = Matrix.columnVector(Array.from(fit.seed));
    for (let t = 0; t < N; t++) {
      expect(Math.abs(comp.seasonal[t] - (x.get(2, 0) + x.get(3, 0)))).toBeLessThan(1e-10 * maxAbs(z));
      expect(Math.abs(comp.level[t] - x.get(0, 0))).toBeLessThan(1e-10 * maxAbs(z));
      const e = z[t] - sys.w.transpose().mmul(x).get(0, 0);
      x = sys.F.mmul(x).add(sys.g.clone().mul(e));
    }
    for (let s = 0; s < ahead; s++) {
      expect(Math.abs(comp.seasonal[N + s] - (x.get(2, 0) + x.get(3, 0)))).toBeLessThan(1e-10 * maxAbs(z));
      expect(Math.abs(comp.level[N + s] - x.get(0, 0))).toBeLessThan(1e-10 * maxAbs(z));
      x = sys.F.mmul(x);
    }
  });
});

describe("summary()", () => {
  test("label in the paper's notation TBATS(λ, {p,q}, φ, {<m,K>}) and the parameter table", () => {
    const sm = fit.summary();
    expect(sm.method).toBe("tbats");
    // De Livera et al. (2011), §2.2: TBATS(ω, {p, q}, φ, {⟨m_1, k_1⟩, …}).
    expect(sm.structure).toBe(`TBATS(${(fit.par.lambda as number).toFixed(2)}, {1,0}, ${fit.par.phi.toFixed(3)}, {<52.18,2>})`);
    expect(sm.armaDf).toBe(1);
    const row = (name: string): number => {
      const r = sm.parameters.find((p) => p.name === name);
      if (!r) throw new Error(`no row ${name}`);
      return r.value;
    };
    expect(row("lambda")).toBe(fit.par.lambda);
    expect(row("alpha")).toBe(fit.par.alpha);
    expect(row("beta")).toBe(fit.par.beta);
    expect(row("phi")).toBe(fit.par.phi);
    expect(row("gamma1")).toBe(fit.par.gamma1[0]);
    expect(row("gamma2")).toBe(fit.par.gamma2[0]);
    expect(row("ar1")).toBe(fit.par.ar[0]);
    expect(row("sigma2")).toBe(fit.sigma2);
    // Gaussian log-likelihood at σ̂² = SSE/n with the Box–Cox Jacobian (λ − 1)Σ log y (Box &
    // Cox, 1964, §3), from the dense filter's errors.
    const lam = fit.par.lambda as number;
    const z = y.map((v) => forwardBoxCox(v, lam));
    const errors = denseFilter(denseSystem(structure, fit.par), z, fit.seed).errors;
    const sse = errors.reduce((a, e) => a + e * e, 0);
    const sumLog = y.reduce((a, v) => a + Math.log(v), 0);
    const logLik = -0.5 * N * (Math.log((2 * Math.PI * sse) / N) + 1) + (lam - 1) * sumLog;
    expect(Math.abs(row("log-likelihood") - logLik)).toBeLessThan(1e-9 * Math.abs(logLik));
    // AIC counts λ, α, β, φ, γ1, γ2, φ₁ (7), the seeds ℓ, b, s_1, s_2, s*_1, s*_2 (6) and σ² (1).
    const k = 14;
    expect(Math.abs(row("AIC") - (-2 * logLik + 2 * k))).toBeLessThan(1e-9 * Math.abs(logLik));
    expect(Math.abs(fit.aicc - (fit.aic + (2 * k * (k + 1)) / (N - k - 1)))).toBeLessThan(1e-9 * Math.abs(fit.aic));
    expect(sm.notes.join(" ")).toMatch(/6 seed states/);
    expect(sm.notes.join(" ")).toMatch(/σ² is on the Box-Cox scale/);
  });

  test("labels without a transform, without damping and without a trend", () => {
    const par = { lambda: null, alpha: 0.2, beta: 0.01, phi: 1, gamma1: [0.01], gamma2: [0.01], ar: [], ma: [] };
    const seed = new Float64Array(6);
    seed[0] = y[0];
    const trend = new TbatsFitted(y, { ...structure, boxCox: false, damped: false, p: 0 }, par, seed);
    expect(trend.summary().structure).toBe("TBATS(1, {0,0}, -, {<52.18,2>})");
    const flat = new TbatsFitted(y, { boxCox: false, trend: false, damped: false, periods: [7], harmonics: [1], p: 0, q: 2 }, { ...par, beta: 0, ma: [0.1, 0.1] }, new Float64Array(5));
    expect(flat.summary().structure).toBe("TBATS(1, {0,2}, -, {<7,1>}) without trend");
  });
});
