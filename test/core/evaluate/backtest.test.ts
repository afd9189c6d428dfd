/**
 * Rolling-origin backtests (src/core/evaluate/backtest.ts, plan.ts, run.ts, score.ts,
 * tables.ts). Sources: the hand computation below for the naive method; the metric
 * definitions of Hyndman & Koehler (2006) as implemented in metrics.ts (checked against their
 * own fixture in metrics.test.ts); and the identity that, with parameters kept, a one-step
 * forecast from each origin is the model's own filtered one-step prediction.
 */
import { MersenneTwister } from "../../../src/core/math/rng";
import { BacktestCancelled, runWindow, type BacktestPlan } from "../../../src/core/evaluate/backtest";
import { planBacktest } from "../../../src/core/evaluate/plan";
import { backtest } from "../../../src/core/evaluate/run";
import { bestBy, dmAgainstBest, scoreRuns } from "../../../src/core/evaluate/score";
import { backtestTables } from "../../../src/core/evaluate/tables";
import { getModel } from "../../../src/core/models/registry";
import type { Fitted, ModelSpec, UpdateOptions } from "../../../src/core/models/types";
import { expectInputError } from "../../inputError";

/** Invented weekly lane rates: a slow walk with an annual swing, seeded. */
function lane(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let level = 1800;
  for (let t = 0; t < n; t++) {
    level *= Math.exp(0.01 * rng.normal());
    y[t] = level * (1 + 0.06 * Math.sin((2 * Math.PI * t) / (365.25 / 7))) * Math.exp(0.015 * rng.normal());
  }
  return y;
}

describe("the plan", () => {
  test("windows end at the last week, origins every week, the combination's members added", () => {
    const plan = planBacktest(300, { methods: ["sarima", "combo", "lastweek"], comboMembers: ["sarima", "drift"], testWeeks: 20, windows: 2, horizon: 3 }, getModel);
    expect(plan.windows).toEqual([
      { first: 260, last: 279 },
      { first: 280, last: 299 },
    ]);
    expect(plan.methods).toEqual(["sarima", "lastweek", "drift"]);
    expect(plan.combos).toEqual([{ code: "combo", members: ["sarima", "drift"] }]);
    expect(plan.modes).toEqual(["every"]);
  });

  test("options that cannot be honoured are refused with sentences", () => {
    const p = (o: object, n = 300) => () => planBacktest(n, o, getModel);
    expectInputError(p({ testWeeks: 0 }), "BAD_OPTION", /test weeks must be a whole number of at least 1/);
    expectInputError(p({ horizon: 2.5 }), "BAD_OPTION", /weeks ahead of a backtest/);
    expectInputError(p({ modes: ["sometimes"] }), "BAD_OPTION", /refit mode is "every"/);
    expectInputError(p({ methods: ["auto"] }), "BAD_OPTION", /chosen by a backtest/);
    expectInputError(p({ methods: ["combo", "lastweek"] }), "BAD_OPTION", /at least two methods to average/);
    expectInputError(p({ methods: ["crystalball"] }), "BAD_OPTION", /not available/);
    expectInputError(p({ methods: ["lastyear"], testWeeks: 52 }, 100), "TOO_FEW_POINTS", /leaves 48 weeks before its first origin, fewer than the 54/);
  });
});

describe("a hand-computed naive backtest", () => {
  // y = 10, 12, 11, 15, 14, 18 with the last 3 weeks as the window and H = 2:
  // origin 3 (has seen 10, 12, 11): forecasts 11, 11 for weeks 15 and 14 → errors 4, 3;
  // origin 4 (… 15): 15, 15 for 14 and 18 → errors −1, 3; origin 5 (… 14): 14 for 18 → error 4.
  // h = 1 errors 4, −1, 4; h = 2 errors 3, 3.
  const y = Float64Array.of(10, 12, 11, 15, 14, 18);
  const result = backtest(y, { methods: ["lastweek"], testWeeks: 3, horizon: 2, modes: ["fixed"], levels: [80] }, getModel);

  test("forecasts and scores", () => {
    const run = result.runs[0];
    expect(run.origins).toEqual([3, 4, 5]);
    expect(Array.from(run.point[0])).toEqual([11, 11]);
    expect(Array.from(run.point[2].subarray(0, 1))).toEqual([14]);
    expect(run.point[2][1]).toBeNaN(); // week 7 is not observed
    const s = scoreRuns(y, result.plan, result.runs);
    const h1 = s.find((r) => r.h === 1)!;
    const h2 = s.find((r) => r.h === 2)!;
    expect(h1.count).toBe(3);
    expect(h2.count).toBe(2);
    expect(h1.rmse).toBeCloseTo(Math.sqrt((16 + 1 + 16) / 3), 14);
    // MAPE: mean of |e|/y over (15, 14, 18) = (4/15 + 1/14 + 4/18)/3 · 100.
    expect(h1.mape).toBeCloseTo(((4 / 15 + 1 / 14 + 4 / 18) / 3) * 100, 12);
    // MASE scale: the three weeks before the window (10, 12, 11) are under two years, so lag 1:
    // mean(|12 − 10|, |11 − 12|) = 1.5; h = 2: mean(3, 3)/1.5 = 2.
    expect(h2.mase).toBeCloseTo(2, 14);
    expect(result.runs[0].fits).toBe(1);
    expect(result.runs[0].updates).toBe(2);
  });

  test("the tables carry those numbers, with dated weeks when dates are given", () => {
    const dates = Array.from({ length: 6 }, (_, t) => new Date(Date.UTC(2026, 0, 2 + 7 * t)));
    const t = backtestTables(y, result, dates);
    const row = t.accuracy.rows.find((r) => r[3] === 2)!;
    expect(row[0]).toBe("Last week");
    expect(row[2]).toBe("2026-01-23 to 2026-02-06");
    expect(row[7]).toBeCloseTo(2, 14);
    // Errors by origin: 5 checkable forecasts, the first from the origin after 2026-01-16.
    expect(t.origins.rows).toHaveLength(5);
    expect(t.origins.rows[0].slice(2)).toEqual(["2026-01-16", 1, "2026-01-23", 15, 11, 4]);
  });
});

describe("refit modes on SARIMA and TBATS", () => {
  const y = lane(200, 3);
  const plan: BacktestPlan = planBacktest(y.length, { methods: ["sarima", "tbats"], testWeeks: 12, horizon: 4, modes: ["fixed", 4, "every"] }, getModel);

  test.each(["sarima", "tbats"])("%s with fixed parameters: each one-step forecast is the first fit's own filtered prediction (identity)", (method) => {
    const run = runWindow(y, method, getModel, plan, "fixed", 0);
    const o0 = plan.windows[0].first;
    const spec = getModel(method);
    const through = spec.fit(y.slice(0, o0)).update(y.slice(o0), { reestimate: false });
    for (let i = 0; i < run.origins.length; i++) {
      const o = run.origins[i];
      // fitted[o] is the one-step prediction of week o from the weeks before it. TBATS computes
      // both from the same filter state, so they agree bit for bit; SARIMA's fitted values come
      // from its GLS-adjusted innovations and its forecast from the state, the same number by
      // a different order of operations, so they agree to rounding (1e-12 relative).
      if (method === "tbats") expect(run.point[i][0]).toBe(through.fitted[o]);
      else expect(Math.abs(run.point[i][0] - through.fitted[o])).toBeLessThan(1e-12 * Math.abs(through.fitted[o]));
      expect(Math.abs(y[o] - run.point[i][0] - through.residuals[o])).toBeLessThan(1e-12 * Math.abs(y[o]));
    }
  });

  test("fits and updates counted per mode", () => {
    const counts = (["fixed", 4, "every"] as const).map((mode) => {
      const r = runWindow(y, "tbats", getModel, plan, mode, 0);
      return [r.fits, r.updates];
    });
    expect(counts).toEqual([
      [1, 11],
      [3, 9],
      [12, 0],
    ]);
  });
});

describe("combination, Diebold–Mariano and choice", () => {
  const y = lane(160, 5);
  const result = backtest(y, { methods: ["lastweek", "drift", "lastyear", "combo"], comboMembers: ["lastweek", "drift"], testWeeks: 26, horizon: 3, modes: ["fixed"] }, getModel);

  test("the combination is the mean of its members at every origin and step", () => {
    const get = (m: string) => result.runs.find((r) => r.method === m)!;
    const c = get("combo");
    for (let i = 0; i < c.origins.length; i++) {
      for (let s = 0; s < 3; s++) {
        const want = (get("lastweek").point[i][s] + get("drift").point[i][s]) / 2;
        if (Number.isNaN(want)) expect(c.point[i][s]).toBeNaN();
        else expect(c.point[i][s]).toBe(want);
      }
    }
  });

  test("every method but the best is tested against the best at each horizon", () => {
    const rows = dmAgainstBest(y, result.plan, result.runs);
    for (let h = 1; h <= 3; h++) {
      const at = rows.filter((r) => r.h === h);
      expect(at).toHaveLength(3);
      const best = at[0].best;
      expect(at.every((r) => r.best === best && r.method !== best && r.mse >= r.bestMse)).toBe(true);
    }
  });

  test("the best by MASE is the lowest mean MASE over horizons", () => {
    const scores = scoreRuns(y, result.plan, result.runs);
    const best = bestBy(scores, "fixed", "mase", 1)!;
    const mean = (m: string) => {
      const v = scores.filter((s) => s.method === m).map((s) => s.mase);
      return v.reduce((a, b) => a + b, 0) / v.length;
    };
    for (const m of ["lastweek", "drift", "lastyear", "combo"]) expect(mean(best)).toBeLessThanOrEqual(mean(m));
  });
});

describe("progress, cancellation and failures", () => {
  const y = lane(120, 8);

  test("progress rises to 1 with sentences", () => {
    const seen: number[] = [];
    const sentences: string[] = [];
    backtest(y, { methods: ["lastweek", "drift"], testWeeks: 10, horizon: 2 }, getModel, {
      progress: (f, s) => {
        seen.push(f);
        sentences.push(s);
      },
    });
    for (let i = 1; i < seen.length; i++) expect(seen[i]).toBeGreaterThanOrEqual(seen[i - 1]);
    expect(seen[seen.length - 1]).toBeCloseTo(1, 12);
    expect(sentences[0]).toBe("Backtesting Last week, re-estimated every week: origin 1 of 10.");
  });

  test("a cancel check stops the backtest", () => {
    let calls = 0;
    expect(() => backtest(y, { methods: ["lastweek"], testWeeks: 10 }, getModel, { cancelled: () => ++calls >= 3 })).toThrow(BacktestCancelled);
    expect(calls).toBe(3);
  });

  test("a method that fails mid-way is reported in a sentence; the others come back", () => {
    const drift = getModel("drift");
    let updates = 0;
    // Drift whose third weekly update throws, as an optimiser failure would.
    const wrap = (f: Fitted): Fitted =>
      Object.assign(Object.create(f) as Fitted, {
        update: (newY: Float64Array, o: UpdateOptions): Fitted => {
          if (++updates >= 3) throw new Error("the optimiser gave up");
          return wrap(f.update(newY, o));
        },
      });
    const flaky: ModelSpec = { ...drift, label: "Flaky", fit: (v, o) => wrap(drift.fit(v, o)) };
    const lookup = (code: string) => (code === "drift" ? flaky : getModel(code));
    const r = backtest(y, { methods: ["lastweek", "drift"], testWeeks: 10, horizon: 2 }, lookup);
    const f = r.runs.find((x) => x.method === "drift")!;
    expect(f.failure).toBe(`Flaky stopped at the origin after week ${110 + 3} (the optimiser gave up); the origins before it are scored.`);
    expect(f.point.slice(0, 3).every((p) => Number.isFinite(p[0]))).toBe(true);
    expect(f.point[3][0]).toBeNaN();
    expect(r.runs.find((x) => x.method === "lastweek")!.failure).toBeNull();
    expect(backtestTables(y, r).accuracy.notes).toContain(f.failure);
  });
});
