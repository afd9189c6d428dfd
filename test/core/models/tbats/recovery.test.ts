/**
 * Parameter recovery on seeded simulations with known truth: series from the independent
 * generator (simulate.ts, written from De Livera, Hyndman & Snyder, 2011, §2), fitted by
 * fitTbatsStructure at the true structure.
 *
 * Checks per seed (5 seeds per case):
 *  - the optimiser's concentrated objective L* = n log SSE − 2(λ − 1)Σ log y is never worse than
 *    at the true parameters with their own least-squares seeds (Objective.value on the truth),
 *    1e-6 of slack;
 *  - the likelihood-ratio statistic LR = L*(truth) − L*(fit) = 2(ℓ̂ − ℓ(truth)) stays below the
 *    χ²_k 0.999 quantile (Wilks; k = free parameters, seeds profiled out in both): a much larger
 *    LR would mean the likelihood rewards something the truth does not have (e.g. a Jacobian
 *    with the wrong sign). Boundary estimates (γ at 0 below) only make LR smaller.
 *  - parameters within tolerances justified per case, and σ within 10% (σ̂/σ has standard error
 *    ≈ 1/√(2n) ≈ 3.2% at n = 500, so 10% is about 3 standard errors);
 *  - the fit from the default start is as good as a fit warm-started at the truth (no local
 *    optimum the start decides).
 *
 * The smoothing weights γ are not checked: with the true γ = 0.005–0.01 and n = 500 the estimate
 * piles up at γ = 0 (measured, seeds 1–12: max|γ̂| < 1e-5 in 6, 8 and 6 of the 12 seeds of cases
 * i–iii, the others 3e-5–0.056), the boundary pile-up of a small variance-like parameter
 * (Shephard & Harvey, 1990, for the local level model, from memory); at γ = 0 the seasonal roots
 * sit on the unit circle, the edge admissible.ts admits. Some of those zeros are the optimiser
 * stopping at ρ = |γ| → 0 rather than the likelihood's optimum: warm-started at the truth, case
 * iii seeds 1 and 2 end at |γ| ≈ 0.009 with L* lower by about 1 (the last test).
 */
import { MersenneTwister } from "../../../../src/core/math/rng";
import { Objective, prepare } from "../../../../src/core/models/tbats/estimate";
import { fitTbatsStructure } from "../../../../src/core/models/tbats/model";
import type { TbatsParameters, TbatsStructure } from "../../../../src/core/models/tbats/structure";
import { simulateTbats, type TbatsTruth } from "./simulate";

const WEEK_YEAR = 365.25 / 7;
const N = 500;
const SEEDS = [1, 2, 3, 4, 5];
/** χ²_k upper 0.1% points (published tables, e.g. Abramowitz & Stegun, 1964, Table 26.8; from memory). */
const CHI2_999: Record<number, number> = { 4: 18.467, 6: 22.458 };

function trueParameters(t: TbatsTruth): TbatsParameters {
  return {
    lambda: t.lambda,
    alpha: t.alpha,
    beta: t.trend ? t.beta : 0,
    phi: t.trend ? t.phi : 1,
    gamma1: t.gamma1,
    gamma2: t.gamma2,
    ar: t.ar,
    ma: t.ma,
  };
}

interface Outcome {
  seed: number;
  fit: TbatsParameters;
  lr: number;
  /** σ̂/σ on the Box–Cox normalised scale (below). */
  sigmaRatio: number;
  /** L*(fit from the default start) − L*(fit warm-started at the truth). */
  startGap: number;
}

/**
 * Fit one simulated series. σ is compared on the normalised scale of Box & Cox (1964, §3),
 * z/ẏ^{λ−1} with ẏ the geometric mean of y, which makes residual scales comparable across λ
 * (σ on the z-scale alone changes by ẏ^{Δλ} ≈ 0.7 for Δλ = 0.05 at rates near 1000). Without a
 * transform the factor is 1 and this is plain σ̂/σ.
 */
function runCase(truth: TbatsTruth, s: TbatsStructure, seed: number): Outcome {
  const sim = simulateTbats(truth, N, new MersenneTwister(seed));
  const fitted = fitTbatsStructure(sim.y, s);
  const obj = new Objective(prepare(sim.y), s);
  const atTruth = obj.value(trueParameters(truth));
  const atFit = obj.value(fitted.par);
  let sumLog = 0;
  for (const v of sim.y) sumLog += Math.log(v);
  const gm = Math.exp(sumLog / N);
  const lamHat = fitted.par.lambda ?? 1;
  const lam = truth.lambda ?? 1;
  const sigmaRatio = (Math.sqrt(fitted.sigma2) * Math.pow(gm, 1 - lamHat)) / (truth.sigma * Math.pow(gm, 1 - lam));
  const fromTruth = fitTbatsStructure(sim.y, s, { start: trueParameters(truth) });
  return { seed, fit: fitted.par, lr: atTruth - atFit, sigmaRatio, startGap: atFit - obj.value(fromTruth.par) };
}

function checkCommon(o: Outcome, k: number): void {
  expect(Number.isFinite(o.lr)).toBe(true);
  // Never worse than the truth (the truth is inside the estimator's box, so reachable).
  expect(o.lr).toBeGreaterThanOrEqual(-1e-6);
  expect(o.lr).toBeLessThan(CHI2_999[k]);
  expect(Math.abs(o.sigmaRatio - 1)).toBeLessThan(0.1);
}

const CASE_I: TbatsTruth = {
  lambda: null, alpha: 0.3, trend: true, beta: 0.02, phi: 1, periods: [WEEK_YEAR], harmonics: [2],
  gamma1: [0.01], gamma2: [0.01], ar: [], ma: [], sigma: 1, level0: 100, slope0: 0.05, amplitude: 5,
};
const S_I: TbatsStructure = { boxCox: false, trend: true, damped: false, periods: [WEEK_YEAR], harmonics: [2], p: 0, q: 0 };
const CASE_II: TbatsTruth = {
  lambda: 0.3, alpha: 0.4, trend: true, beta: 0.05, phi: 0.9, periods: [WEEK_YEAR], harmonics: [2],
  gamma1: [0.005], gamma2: [0.005], ar: [], ma: [], sigma: 0.5, level0: 20, slope0: 0.2, amplitude: 2,
};
const S_II: TbatsStructure = { boxCox: true, trend: true, damped: true, periods: [WEEK_YEAR], harmonics: [2], p: 0, q: 0 };
const CASE_III: TbatsTruth = {
  lambda: null, alpha: 0.1, trend: false, beta: 0, phi: 1, periods: [WEEK_YEAR], harmonics: [2],
  gamma1: [0.01], gamma2: [0.01], ar: [0.5], ma: [], sigma: 1, level0: 100, slope0: 0, amplitude: 5,
};
const S_III: TbatsStructure = { boxCox: false, trend: false, damped: false, periods: [WEEK_YEAR], harmonics: [2], p: 1, q: 0 };

/** Each case's five fits, computed once and shared by the tests below. */
const cache = new Map<TbatsTruth, Outcome[]>();
function outcomes(truth: TbatsTruth, s: TbatsStructure): Outcome[] {
  let o = cache.get(truth);
  if (!o) {
    o = SEEDS.map((seed) => runCase(truth, s, seed));
    cache.set(truth, o);
  }
  return o;
}

describe("TBATS parameter recovery at the true structure (n = 500, seeds 1–5)", () => {
  test("(i) no transform, trend, <52.18,2>: α within 0.1", () => {
    // Measured, seeds 1–12: α̂ 0.235–0.337 (truth 0.3), β̂ 0.009–0.024 (0.02), σ̂/σ 0.933–1.025,
    // LR 1.1–11.3 (χ²_4: mean 4). α's spread (sd ≈ 0.03) makes 0.1 about 3 standard errors.
    for (const o of outcomes(CASE_I, S_I)) {
      checkCommon(o, 4);
      expect(Math.abs(o.fit.alpha - CASE_I.alpha)).toBeLessThan(0.1);
    }
  });

  test("(ii) Box-Cox λ = 0.3, damped trend φ = 0.9, <52.18,2>: λ within 0.2, α within 0.1", () => {
    // The rates wander widely (seeds 1–5: minima 174–625, maxima 1651–6163), so the
    // level–variance link identifies λ.
    // Measured, seeds 1–12: λ̂ 0.097–0.343 (seeds 1–5: 0.255–0.343; seed 8 alone is 0.097, a
    // 3-sd draw for sd(λ̂) ≈ 0.06), α̂ 0.331–0.437 (0.4), φ̂ 0.80–0.97 (its whole box: φ is weakly
    // identified, not checked), normalised σ̂/σ 0.932–1.020, LR 0.9–15.3 (χ²_6: mean 6).
    for (const o of outcomes(CASE_II, S_II)) {
      checkCommon(o, 6);
      expect(Math.abs((o.fit.lambda as number) - 0.3)).toBeLessThan(0.2);
      expect(Math.abs(o.fit.alpha - CASE_II.alpha)).toBeLessThan(0.1);
    }
  });

  test("(iii) ARMA(1,0) errors φ₁ = 0.5, no trend, <52.18,2>: φ₁ within 3 standard errors", () => {
    // Without the seasonal part the model is ARIMA(1,1,1): (1 − φ₁B)Δz_t = (1 + θB)ε_t with
    // θ = α − 1, whose large-sample var(φ̂₁) = (1 − φ₁²)(1 + φ₁θ)² / (n(φ₁ + θ)²) (Box, Jenkins &
    // Reinsel, 2008, §7.3, ARMA(1,1), in the 1 + θB sign convention). α = 0.1 keeps the AR and MA
    // roots apart (0.5 vs 0.9; α = 0.3 would put them at 0.5 vs 0.7 and the standard error at
    // 0.13): SE(φ̂₁) = 0.053, SE(α̂) = √((1 − θ²)/n)·|1 + φ₁θ|/|φ₁ + θ| = 0.027.
    // Measured, seeds 1–12: φ̂₁ 0.417–0.535, α̂ 0.052–0.140, σ̂/σ 0.930–1.022, LR 3.8–14.2.
    const phi = 0.5;
    const theta = CASE_III.alpha - 1;
    const seAr = Math.sqrt(((1 - phi * phi) * (1 + phi * theta) ** 2) / (N * (phi + theta) ** 2));
    const seAlpha = Math.sqrt((1 - theta * theta) / N) * Math.abs((1 + phi * theta) / (phi + theta));
    for (const o of outcomes(CASE_III, S_III)) {
      checkCommon(o, 4);
      expect(Math.abs(o.fit.ar[0] - phi)).toBeLessThan(3 * seAr);
      expect(Math.abs(o.fit.alpha - CASE_III.alpha)).toBeLessThan(3 * seAlpha);
    }
  });

  test("the default start reaches the optimum that a warm start at the truth reaches", () => {
    // Same data, same structure, two starts: the estimate should not depend on where the
    // optimiser began by more than its tolerances. 0.5 of L* is 0.25 log-likelihood units, an
    // eighth of what one parameter is worth to AIC; where both starts end in the same basin the
    // gap measured ≤ 0.05. A larger gap is a local optimum, which would also shift the AIC
    // comparisons of the structure search.
    const gaps: string[] = [];
    for (const [name, truth, s] of [["i", CASE_I, S_I], ["ii", CASE_II, S_II], ["iii", CASE_III, S_III]] as const) {
      for (const o of outcomes(truth, s)) if (o.startGap > 0.5) gaps.push(`case ${name}, seed ${o.seed}: default start worse by ${o.startGap.toFixed(2)}`);
    }
    expect(gaps).toEqual([]);
  });
});
