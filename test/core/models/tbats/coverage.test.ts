/**
 * Prediction-interval coverage on seeded simulations from known TBATS processes (simulate.ts,
 * the model equations of De Livera, Hyndman & Snyder, 2011, §2): each replication simulates
 * n + 4 weeks, fits (or, for the "true parameters" checks, filters with the truth, its σ² and
 * regression seeds) on the first n, forecasts 1..4 weeks ahead and records whether the next four simulated
 * rates fall inside the 80% and 95% intervals.
 *
 * Tolerance: ±3 percentage points of nominal for the coverage pooled over h = 1..4. The four
 * indicators of one replication are dependent (they share ε_{n+1}), but the variance of their
 * average is at most that of one of them (Cauchy–Schwarz), so with R independent replications
 * the pooled rate's standard error is at most √(p(1 − p)/R): with R = 2000, ≤ 0.89 points at
 * 80% and ≤ 0.49 at 95%, making ±3 points at least 3.4 and 6.1 standard errors. The tolerance is
 * not vacuous: intervals that ignored the growth of the h-step variance (σ² at every step) would
 * cover 90.6% on average instead of 95% for the local level with α = 0.5, and 80% intervals
 * reported as 95% would miss by 15 points.
 *
 * Measured here (seeds 77–79): local level, fitted, 78.7% / 93.9% pooled (by horizon, 80%:
 * 78.7 79.9 78.3 78.1; 95%: 94.3 94.0 93.5 93.7); local linear trend at the truth 79.8% / 95.1%;
 * Box-Cox case at the truth 79.2% / 94.6%.
 *
 * Estimated parameters cost some coverage (σ̂² = SSE/n is biased down by about k/n with k
 * parameters and seeds, and α̂, β̂ are uncertain). Measured outside this file with fitted
 * parameters, n = 150, and reported rather than tolerated: local linear trend (α = 0.5,
 * β = 0.1) 77.5% / 93.9% pooled, 75.5% / 93.1% at h = 4, against 79.3% / 94.9% for the same
 * 3000 replications at the true parameters with σ̂² from the residuals (mean σ̂²/σ² = 0.970 in the
 * fits); λ estimated with a local level
 * (λ = 0.5, α = 0.5) 78.3% / 93.8% (1200 replications). So only the local level, where the
 * shortfall is about 1 point, is checked with fitted parameters; the trend and Box-Cox processes
 * are checked at the true parameters and σ², where the intervals are exact up to the seeds'
 * estimation error and a shortfall would be a bug. (With σ̂² from the residuals instead of the
 * true σ², the Box-Cox case measured 78.8% / 94.5% over 8000 replications, 79.5% / 95.0% with σ².)
 */
import { MersenneTwister } from "../../../../src/core/math/rng";
import { Objective, prepare } from "../../../../src/core/models/tbats/estimate";
import { fitTbatsStructure, TbatsFitted } from "../../../../src/core/models/tbats/model";
import type { TbatsParameters, TbatsStructure } from "../../../../src/core/models/tbats/structure";
import { simulateTbats, type TbatsTruth } from "./simulate";

const N = 150;
const H = 4;
const REPS = 2000;

interface Coverage {
  c80: number;
  c95: number;
  byHorizon80: number[];
  byHorizon95: number[];
}

function truthParameters(t: TbatsTruth): TbatsParameters {
  return { lambda: t.lambda, alpha: t.alpha, beta: t.trend ? t.beta : 0, phi: t.trend ? t.phi : 1, gamma1: t.gamma1, gamma2: t.gamma2, ar: t.ar, ma: t.ma };
}

function coverage(truth: TbatsTruth, s: TbatsStructure, seed: number, useTruth: boolean): Coverage {
  const rng = new MersenneTwister(seed);
  const h80 = new Array<number>(H).fill(0);
  const h95 = new Array<number>(H).fill(0);
  const par = truthParameters(truth);
  for (let r = 0; r < REPS; r++) {
    const sim = simulateTbats(truth, N + H, rng);
    const y = sim.y.slice(0, N);
    let fit: TbatsFitted;
    if (useTruth) {
      // The truth, its σ², and the least-squares seeds (the seeds are the only thing estimated;
      // their error enters the forecasts at O(k/n) and decays with the discount matrix).
      const obj = new Objective(prepare(y), s);
      expect(Number.isFinite(obj.sse(par))).toBe(true);
      fit = new TbatsFitted(y, s, par, Float64Array.from(obj.reg.seed), {}, truth.sigma * truth.sigma);
    } else {
      fit = fitTbatsStructure(y, s);
    }
    const fc = fit.forecast(H, [80, 95]);
    for (let h = 0; h < H; h++) {
      const v = sim.y[N + h];
      if (v >= fc.lower[0][h] && v <= fc.upper[0][h]) h80[h]++;
      if (v >= fc.lower[1][h] && v <= fc.upper[1][h]) h95[h]++;
    }
  }
  const pct = (k: number): number => (100 * k) / REPS;
  const sum = (a: number[]): number => a.reduce((x, y) => x + y, 0);
  return { c80: pct(sum(h80)) / H, c95: pct(sum(h95)) / H, byHorizon80: h80.map(pct), byHorizon95: h95.map(pct) };
}

function expectNominal(c: Coverage): void {
  expect(Math.abs(c.c80 - 80)).toBeLessThan(3);
  expect(Math.abs(c.c95 - 95)).toBeLessThan(3);
}

const noSeason = { periods: [] as number[], harmonics: [] as number[], gamma1: [] as number[], gamma2: [] as number[], ar: [] as number[], ma: [] as number[] };

describe("80% and 95% interval coverage, h = 1..4, n = 150, 2000 replications", () => {
  test("local level α = 0.5, fitted: pooled coverage within 3 points of nominal", () => {
    const truth: TbatsTruth = { lambda: null, alpha: 0.5, trend: false, beta: 0, phi: 1, ...noSeason, sigma: 1, level0: 100, slope0: 0, amplitude: 0 };
    const s: TbatsStructure = { boxCox: false, trend: false, damped: false, periods: [], harmonics: [], p: 0, q: 0 };
    const c = coverage(truth, s, 77, false);
    expectNominal(c);
  });

  test("local linear trend α = 0.5, β = 0.1, true parameters: c_j = α + jβ grows, coverage nominal", () => {
    const truth: TbatsTruth = { lambda: null, alpha: 0.5, trend: true, beta: 0.1, phi: 1, ...noSeason, sigma: 1, level0: 100, slope0: 0.1, amplitude: 0 };
    const s: TbatsStructure = { boxCox: false, trend: true, damped: false, periods: [], harmonics: [], p: 0, q: 0 };
    const c = coverage(truth, s, 78, true);
    expectNominal(c);
  });

  test("Box-Cox λ = 0.5, damped trend, <12,1>, ARMA(1,0), true parameters: back-transformed bounds", () => {
    // Quantiles survive a monotone back-transform, so coverage on the rate scale is that on the
    // transformed scale; this exercises the back-transform, the damped trend, a seasonal and
    // the ARMA part of the variance recursion together.
    const truth: TbatsTruth = {
      lambda: 0.5, alpha: 0.3, trend: true, beta: 0.03, phi: 0.9, periods: [12], harmonics: [1], gamma1: [0.01], gamma2: [0.01],
      ar: [0.5], ma: [], sigma: 0.5, level0: 60, slope0: 0, amplitude: 2,
    };
    const s: TbatsStructure = { boxCox: true, trend: true, damped: true, periods: [12], harmonics: [1], p: 1, q: 0 };
    const c = coverage(truth, s, 79, true);
    expectNominal(c);
  });
});
