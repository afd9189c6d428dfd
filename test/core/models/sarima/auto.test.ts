/**
 * The automatic order search on simulated processes with known structure (seeded), and the
 * identities the backtests rely on. Recovery rates are stated, not hidden: the search is
 * expected to find the true orders in most replications, not all (Hyndman & Khandakar, 2008,
 * §5, report the same kind of rates for their stepwise search).
 */
import { MersenneTwister } from "../../../../src/core/math/rng";
import { autoSarima, fitStructure, defaultSpec } from "../../../../src/core/models/sarima";
import { getModel } from "../../../../src/core/models/registry";
import { expectInputError } from "../../../inputError";

interface Truth {
  ar: number[];
  ma: number[];
  d: number;
  mean: number;
}

function simulateArima(t: Truth, n: number, rng: MersenneTwister): Float64Array {
  const burn = 200;
  const e = new Float64Array(n + burn);
  const w = new Float64Array(n + burn);
  for (let i = 0; i < n + burn; i++) {
    e[i] = rng.normal();
    let v = e[i];
    t.ar.forEach((a, j) => { if (i - j - 1 >= 0) v += a * w[i - j - 1]; });
    t.ma.forEach((m, j) => { if (i - j - 1 >= 0) v += m * e[i - j - 1]; });
    w[i] = v;
  }
  const x = w.subarray(burn).map((v) => v + t.mean);
  if (t.d === 0) return Float64Array.from(x);
  const y = new Float64Array(n);
  let level = 100;
  for (let i = 0; i < n; i++) y[i] = level += x[i];
  return y;
}

describe("automatic order search on simulated ARIMA processes", () => {
  const REPS = 10;
  const cases: [string, Truth, number, number][] = [
    // name, truth, weeks, replications that must recover (p, d, q) exactly
    ["ARIMA(1,1,0)", { ar: [0.6], ma: [], d: 1, mean: 0 }, 300, 7],
    ["ARIMA(0,1,1)", { ar: [], ma: [0.5], d: 1, mean: 0 }, 300, 6],
    ["ARIMA(2,0,0) with mean", { ar: [1.0, -0.5], ma: [], d: 0, mean: 10 }, 300, 6],
  ];
  test.each(cases)("%s: orders recovered in most of 10 replications", (_name, truth, n, need) => {
    const rng = new MersenneTwister(42);
    let hits = 0;
    let searchMisses = 0;
    for (let r = 0; r < REPS; r++) {
      const y = simulateArima(truth, n, rng);
      const f = autoSarima(y, { seasonality: "none" });
      const s = f.spec;
      if (s.p === truth.ar.length && s.q === truth.ma.length && s.d === truth.d) hits++;
      // A stepwise search can stop at a local optimum: count the replications where the true
      // structure (same differencing) has a lower AICc than the one chosen.
      if (s.d === truth.d) {
        const trueFit = autoSarima(y, { seasonality: "none", structure: { p: truth.ar.length, q: truth.ma.length, d: truth.d }, constant: truth.d === 0 ? true : s.constant });
        if (f.aicc > trueFit.aicc + 1e-6) searchMisses++;
      }
    }
    // Measured when written: 0, 0 and 1 of 10 (the AR(2) search once settled on (2,0,3) at an
    // AICc 0.006 above the truth's, never visiting (2,0,0) from its (2,0,2) start).
    expect(searchMisses).toBeLessThanOrEqual(1);
    // Measured when written: 8, 7 and 7 of 10 (misses: KPSS choosing the other d once or
    // twice, or a neighbouring ARMA with a lower AICc); the bounds leave one replication of
    // room for platform rounding to tip a close AICc comparison.
    expect(hits).toBeGreaterThanOrEqual(need);
  });

  test("a seasonal (1,0,0)(0,1,1)[52] process: the seasonal difference and seasonal MA are found", () => {
    const rng = new MersenneTwister(7);
    const n = 364;
    const burn = 104;
    const e = new Float64Array(n + burn);
    const w = new Float64Array(n + burn);
    for (let i = 0; i < n + burn; i++) {
      e[i] = rng.normal();
      w[i] = e[i] + (i >= 1 ? 0.5 * w[i - 1] : 0) + (i >= 52 ? -0.6 * e[i - 52] : 0);
    }
    const y = new Float64Array(n + burn);
    for (let i = 0; i < n + burn; i++) y[i] = (i >= 52 ? y[i - 52] : 10 * Math.sin((2 * Math.PI * i) / 52)) + w[i];
    const f = autoSarima(y.subarray(burn), { seasonality: "lag52" });
    expect(f.spec.D).toBe(1);
    expect(f.spec.Q).toBe(1);
    expect(f.spec.p).toBeGreaterThanOrEqual(1);
  });
});

describe("fixed-parameter updates and warm re-estimation", () => {
  const rng = new MersenneTwister(3);
  const y = simulateArima({ ar: [0.7], ma: [-0.3], d: 1, mean: 0.1 }, 260, rng);
  const origin = 200;
  const base = fitStructure(y.subarray(0, origin), defaultSpec({ p: 1, d: 1, q: 1, constant: true }));

  test("one-step errors after an update equal y minus the one-step forecast from each origin", () => {
    // The identity the backtest's fixed-parameter mode relies on (issue "Backtesting").
    const grown = base.update(y.subarray(origin), { reestimate: false });
    for (let j = 0; j < 10; j++) {
      const at = j === 0 ? base : base.update(y.subarray(origin, origin + j), { reestimate: false });
      const oneStep = at.forecast(1, [80]).point[0];
      expect(grown.residuals[origin + j]).toBeCloseTo(y[origin + j] - oneStep, 9);
    }
    expect(grown.sigma2).toBe(base.sigma2);
  });

  test("re-estimation from the previous optimum reaches the fresh fit's likelihood", () => {
    const warm = base.update(y.subarray(origin), { reestimate: true }) as ReturnType<typeof fitStructure>;
    const fresh = fitStructure(y, defaultSpec({ p: 1, d: 1, q: 1, constant: true }));
    expect(Math.abs(warm.logLik - fresh.logLik)).toBeLessThan(1e-4);
    expect(warm.est.evaluations).toBeLessThan(fresh.est.evaluations);
  });

  test("simulated paths have the forecast's centre and spread", () => {
    const fc = base.forecast(8, [95]);
    const paths = base.simulate(8, 4000, new MersenneTwister(9));
    for (const s of [0, 7]) {
      const vals = paths.map((p) => p[s]).sort((a, b) => a - b);
      const median = vals[2000];
      const sd = (fc.upper[0][s] - fc.lower[0][s]) / (2 * 1.959963984540054);
      // 4000 draws: the sample median's standard error is about 1.25·sd/√4000 ≈ 0.02 sd.
      expect(Math.abs(median - fc.point[s])).toBeLessThan(0.08 * sd);
      const inside = vals.filter((v) => v >= fc.lower[0][s] && v <= fc.upper[0][s]).length / 4000;
      expect(Math.abs(inside - 0.95)).toBeLessThan(0.015);
    }
  });
});

describe("Box-Cox and options", () => {
  const rng = new MersenneTwister(5);
  const x = simulateArima({ ar: [0.5], ma: [], d: 1, mean: 0 }, 200, rng);
  const y = x.map((v) => Math.exp(v / 50));

  test("on the log scale the intervals are the exponentials of the log-scale ones", () => {
    const logFit = fitStructure(Float64Array.from(y, Math.log), defaultSpec({ p: 1, d: 1 }));
    const fit = fitStructure(y, defaultSpec({ p: 1, d: 1, lambda: 0 }));
    const a = logFit.forecast(6, [80]);
    const b = fit.forecast(6, [80]);
    for (let s = 0; s < 6; s++) {
      expect(b.point[s]).toBeCloseTo(Math.exp(a.point[s]), 9);
      expect(b.upper[0][s]).toBeCloseTo(Math.exp(a.upper[0][s]), 9);
    }
  });

  test("bad options are refused with sentences", () => {
    expectInputError(() => autoSarima(y, { lambda: 5 }), "BAD_OPTION", /λ/);
    expectInputError(() => autoSarima(y, { seasonality: "weekly" as never }), "BAD_OPTION", /Seasonality/);
    expectInputError(() => fitStructure(y, defaultSpec({ p: 9 })), "BAD_OPTION", /order p/);
    expectInputError(() => autoSarima(y.subarray(0, 10)), "TOO_FEW_POINTS", /at least 20 weeks/);
    expectInputError(() => autoSarima(y, { structure: { d: 2 }, constant: true }), "BAD_OPTION", /polynomial trend/);
    expectInputError(() => autoSarima(y, { fitBudget: 0 }), "BAD_OPTION", /budget/);
    expectInputError(() => autoSarima(Float64Array.of(...y.subarray(0, 40), -1), { lambda: 0 }), "NON_POSITIVE", /week 41/);
    expectInputError(() => autoSarima(Float64Array.of(...y.subarray(0, 40), NaN)), "NOT_A_NUMBER", /week 41/);
  });

  test("the registry offers sarima", () => {
    const fit = getModel("SARIMA").fit(y.subarray(0, 150));
    expect(fit.summary().structure).toMatch(/^ARIMA\(\d,\d,\d\)/);
  });
});
