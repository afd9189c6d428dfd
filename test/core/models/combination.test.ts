/**
 * Forecast combinations with real members (the baselines, SARIMA, NNAR) on seeded simulated
 * weekly series. What each check is measured against:
 *  - the simple mean of the members' own forecasts, computed here (common practice: Clemen,
 *    1989; the M-competitions, Makridakis & Hibon, 2000);
 *  - the median of three members, which is the middle one;
 *  - inverse-MSE weights w_i = (1/MSE_i)/Σ_j(1/MSE_j), Bates & Granger (1969), for the case of
 *    uncorrelated errors, and holdout MSEs recomputed here from the members (fit to the
 *    truncated series, one-week updates with fixed parameters, h-step errors);
 *  - pooled-path intervals as sample quantiles of Hyndman & Fan (1996) definition 7, written
 *    out here from their formula, and their coverage on a Gaussian random walk.
 */
import { MersenneTwister } from "../../../src/core/math/rng";
import { normalCdf, normalMultiplier } from "../../../src/core/math/distributions";
import {
  CombinationFit,
  allotPaths,
  combination,
  fitCombination,
  type CombinationOptions,
  type ModelTable,
} from "../../../src/core/models/combination";
import { drift, lastWeek, lastYear } from "../../../src/core/models/naive";
import { availableMethods, getModel } from "../../../src/core/models/registry";
import type { Fitted, Forecast, ModelSpec } from "../../../src/core/models/types";
import { expectInputError } from "../../inputError";
import { randomWalk } from "../../simulate";

// Compile-time check: the combination fits the registry's ModelSpec type as it is.
const asRegistered: ModelSpec = combination(() => ({}));
void asRegistered;

const combo = getModel("combo");

/** The registry's models by code, for a combination over a reduced table. */
function registryTable(): ModelTable {
  const t: ModelTable = {};
  for (const c of availableMethods()) t[c] = getModel(c);
  return t;
}

/** Weekly rates with a yearly cycle and persistent noise (seeded), positive. */
function rates(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let a = 0;
  for (let t = 0; t < n; t++) {
    a = 0.9 * a + 0.04 * rng.normal();
    y[t] = 1500 * Math.exp(0.08 * Math.sin((2 * Math.PI * t) / 52) + a);
  }
  return y;
}

function bits(a: Float64Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("hex");
}

function fcBits(f: Forecast): string {
  return [f.point, ...f.lower, ...f.upper].map(bits).join("|");
}

/** |a − b| ≤ rel·|b| elementwise. */
function expectClose(a: ArrayLike<number>, b: ArrayLike<number>, rel: number): void {
  expect(a.length).toBe(b.length);
  for (let i = 0; i < b.length; i++) expect(Math.abs(a[i] - b[i])).toBeLessThanOrEqual(rel * Math.abs(b[i]));
}

const Y = rates(120, 3);
// Few networks, short training and a fixed, small SARIMA search keep this file quick; the
// combination's arithmetic does not depend on how good the members are.
const QUICK: Record<string, object> = {
  nnar: { networks: 2, maxIter: 25, paths: 200 },
  sarima: { seasonality: "none", fitBudget: 8 },
};
const quickFor = (members: string[]): Record<string, object> =>
  Object.fromEntries(Object.entries(QUICK).filter(([k]) => members.includes(k)));
const own = (code: string, y: Float64Array): Fitted => getModel(code).fit(y, QUICK[code] as Record<string, unknown> | undefined);

describe("point forecasts and bounds by rule", () => {
  test("mean rule: the plain average of the members' own forecasts, bounds and fitted values (common practice)", () => {
    const members = ["lastweek", "drift", "sarima", "nnar"];
    const fit = combo.fit(Y, { members, memberOptions: quickFor(members), intervals: "quantiles" });
    const fc = fit.forecast(8, [80, 95]);
    const parts = members.map((c) => own(c, Y));
    const mine = parts.map((p) => p.forecast(8, [80, 95]));
    const avg = (pick: (f: Forecast) => Float64Array): Float64Array =>
      Float64Array.from({ length: 8 }, (_, s) => mine.reduce((a, f) => a + pick(f)[s], 0) / members.length);
    // Relative 1e-12: a few roundings of numbers near 1500 in either sum.
    expectClose(fc.point, avg((f) => f.point), 1e-12);
    for (let i = 0; i < 2; i++) {
      expectClose(fc.lower[i], avg((f) => f.lower[i]), 1e-12);
      expectClose(fc.upper[i], avg((f) => f.upper[i]), 1e-12);
    }
    // Fitted values: the average where every member has one, NaN elsewhere (NNAR and the
    // baselines start at different weeks); sigma2 the mean squared combined residual.
    let ss = 0;
    let m = 0;
    for (let t = 0; t < Y.length; t++) {
      const v = parts.map((p) => p.fitted[t]);
      if (v.some(Number.isNaN)) {
        expect(Number.isNaN(fit.fitted[t])).toBe(true);
        expect(Number.isNaN(fit.residuals[t])).toBe(true);
        continue;
      }
      const f = v.reduce((a, b) => a + b, 0) / v.length;
      expect(Math.abs(fit.fitted[t] - f)).toBeLessThanOrEqual(1e-12 * f);
      expect(fit.residuals[t]).toBe(Y[t] - fit.fitted[t]);
      ss += fit.residuals[t] ** 2;
      m++;
    }
    expect(fit.sigma2).toBeCloseTo(ss / m, 9);
    expect(Number.isNaN(fit.aicc)).toBe(true);
    const sm = fit.summary();
    expect(sm.method).toBe("combo");
    expect(sm.structure).toBe("mean of last week, drift, SARIMA, NNAR");
    expect(sm.armaDf).toBe(0);
    expect(sm.parameters.map((p) => p.name)).toEqual(members.map((c) => `weight: ${getModel(c).label}`));
    expect(sm.parameters.map((p) => p.value)).toEqual([0.25, 0.25, 0.25, 0.25]);
    expect(sm.notes).toContain("A combination has no likelihood, so AICc is not defined.");
    expect(sm.notes.some((n) => n.startsWith("NNAR: "))).toBe(true);
    expect(sm.notes.some((n) => n.startsWith("SARIMA: "))).toBe(true);
  });

  test("median rule with three members: the middle one at every step, for points and bounds", () => {
    const fit = combo.fit(Y, { members: ["lastweek", "drift", "lastyear"], rule: "median", intervals: "quantiles" });
    const fc = fit.forecast(10, [90]);
    const mine = [lastWeek, drift, lastYear].map((s) => s.fit(Y).forecast(10, [90]));
    const middle = (v: number[]): number => [...v].sort((a, b) => a - b)[1];
    for (let s = 0; s < 10; s++) {
      expect(fc.point[s]).toBe(middle(mine.map((f) => f.point[s])));
      expect(fc.lower[0][s]).toBe(middle(mine.map((f) => f.lower[0][s])));
      expect(fc.upper[0][s]).toBe(middle(mine.map((f) => f.upper[0][s])));
    }
    expect(fit.summary().structure).toBe("median of last week, drift, same week last year");
  });

  test("inverse-MSE with supplied MSEs: w_i = (1/MSE_i)/Σ 1/MSE_j (Bates & Granger, 1969, uncorrelated errors)", () => {
    const members = ["lastweek", "drift", "sarima"];
    const fit = combo.fit(Y, { members, memberOptions: quickFor(members), rule: "inverse-mse", mse: [2, 4, 8], intervals: "quantiles" }) as CombinationFit;
    // 1/2 : 1/4 : 1/8 = 4 : 2 : 1.
    expectClose(fit.weights, [4 / 7, 2 / 7, 1 / 7], 1e-15);
    const mine = members.map((c) => own(c, Y).forecast(6, [80]));
    const weighted = (pick: (f: Forecast) => Float64Array): number[] =>
      Array.from({ length: 6 }, (_, s) => mine.reduce((a, f, i) => a + fit.weights[i] * pick(f)[s], 0));
    expectClose(fit.forecast(6, [80]).point, weighted((f) => f.point), 1e-12);
    expectClose(fit.forecast(6, [80]).upper[0], weighted((f) => f.upper[0]), 1e-12);
    expect(fit.summary().structure).toBe("inverse-MSE weighted mean of last week, drift, SARIMA");
  });
});

describe("holdout MSEs for inverse-MSE weights", () => {
  /** The holdout written out directly: fit to the first n − H weeks, forecast, add a week, repeat. */
  function handMse(code: string, y: Float64Array, H: number, horizon: number): number {
    const n = y.length;
    let fit = own(code, y.slice(0, n - H));
    const errors: number[] = [];
    for (let k = 0; k < H; k++) {
      const origin = n - H + k;
      const point = fit.forecast(horizon, []).point;
      for (let s = 0; s < horizon && origin + s < n; s++) errors.push(y[origin + s] - point[s]);
      if (k < H - 1) fit = fit.update(Float64Array.of(y[origin]), { reestimate: false });
    }
    return errors.reduce((a, e) => a + e * e, 0) / errors.length;
  }

  test("MSEs equal a direct computation from the members, and the weights are 1/MSE normalised (Bates & Granger, 1969)", () => {
    const y = rates(100, 17);
    const members = ["lastweek", "drift", "nnar"];
    const fit = combo.fit(y, { members, memberOptions: quickFor(members), rule: "inverse-mse", holdoutWeeks: 20, holdoutHorizon: 4 }) as CombinationFit;
    const hand = members.map((c) => handMse(c, y, 20, 4));
    // 1e-9 relative: the same arithmetic in a different order of summation at most.
    expectClose(fit.mse as Float64Array, hand, 1e-9);
    const inv = hand.map((v) => 1 / v);
    const total = inv.reduce((a, b) => a + b, 0);
    expectClose(fit.weights, inv.map((v) => v / total), 1e-9);
    expect(fit.summary().notes.some((n) => /Bates & Granger/.test(n) && /last 20 weeks/.test(n))).toBe(true);
  });

  test("the default 52-week holdout shrinks to what a short series allows, and is refused below 13 weeks", () => {
    const members = ["lastweek", "sarima"];
    const opts: CombinationOptions = { members, memberOptions: quickFor(members), rule: "inverse-mse" };
    // SARIMA needs 20 weeks: 50 weeks leave a 30-week holdout.
    const fit = combo.fit(rates(50, 4), opts) as CombinationFit;
    expect(fit.summary().notes).toContain("The holdout is 30 weeks rather than 52, to leave 20 weeks to fit on.");
    expectClose(fit.mse as Float64Array, [handMse("lastweek", rates(50, 4), 30, 4), handMse("sarima", rates(50, 4), 30, 4)], 1e-9);
    expectInputError(() => combo.fit(rates(30, 4), opts), "TOO_FEW_POINTS", /at least 13 recent weeks held out after the 20 weeks SARIMA needs/);
    expectInputError(
      () => combo.fit(rates(50, 4), { ...opts, holdoutWeeks: 40 }),
      "TOO_FEW_POINTS",
      "A holdout of 40 weeks leaves 10 weeks to fit on, fewer than the 20 that SARIMA needs; use a shorter holdout.",
    );
  });
});

describe("pooled-path intervals", () => {
  /** Hyndman & Fan (1996), definition 7, from their formula: h = (m − 1)p + 1 (1-based), x_⌊h⌋ + (h − ⌊h⌋)(x_⌊h⌋+1 − x_⌊h⌋). */
  function type7(values: number[], p: number): number {
    const x = [...values].sort((a, b) => a - b);
    const h = (x.length - 1) * p + 1;
    const j = Math.floor(h);
    return j >= x.length ? x[x.length - 1] : x[j - 1] + (h - j) * (x[j] - x[j - 1]);
  }

  const ARIMA110 = { structure: { p: 1, d: 1, q: 0 }, constant: false, seasonality: "none" };

  test("one member twice: the member's own simulated quantiles (Hyndman & Fan type 7), close to its Gaussian interval", () => {
    const fit = combo.fit(Y, { members: ["sarima", "sarima"], memberOptions: { sarima: ARIMA110 }, paths: 1000, seed: 7 });
    const fc = fit.forecast(6, [80, 95]);
    const single = getModel("sarima").fit(Y, ARIMA110);
    // Equal weights give 500 + 500 paths drawn in turn from one generator seeded 7: the same
    // draws as the member's own 1000 paths from that seed.
    const paths = single.simulate(6, 1000, new MersenneTwister(7));
    const own95 = single.forecast(6, [80, 95]);
    const z = [normalMultiplier(80), normalMultiplier(95)];
    // Quantile standard errors with 1000 draws, √(p(1−p)/m)/φ(z_p) in units of the h-step sd:
    // 0.054 (80%) and 0.085 (95%); four of them is the tolerance against the Gaussian bounds.
    const tol = [4 * 0.054, 4 * 0.085];
    for (let s = 0; s < 6; s++) {
      expect(fc.point[s]).toBe(own95.point[s]);
      const column = paths.map((p) => p[s]);
      [80, 95].forEach((l, i) => {
        const tail = (1 - l / 100) / 2;
        expect(Math.abs(fc.lower[i][s] - type7(column, tail))).toBeLessThanOrEqual(1e-12 * Math.abs(fc.lower[i][s]));
        expect(Math.abs(fc.upper[i][s] - type7(column, 1 - tail))).toBeLessThanOrEqual(1e-12 * Math.abs(fc.upper[i][s]));
        const sd = (own95.upper[i][s] - own95.point[s]) / z[i];
        expect(Math.abs(fc.lower[i][s] - own95.lower[i][s]) / sd).toBeLessThan(tol[i]);
        expect(Math.abs(fc.upper[i][s] - own95.upper[i][s]) / sd).toBeLessThan(tol[i]);
      });
    }
    expect(fit.summary().parameters.map((p) => p.name)).toEqual(["weight: Seasonal ARIMA #1", "weight: Seasonal ARIMA #2"]);
  });

  test("paths are shared in proportion to the weights, at least one each", () => {
    expect(allotPaths([0.5, 0.5], 1000)).toEqual([500, 500]);
    // 571.43, 285.71, 142.86: floors 571, 285, 142 leave two paths for the largest remainders.
    expect(allotPaths([4 / 7, 2 / 7, 1 / 7], 1000)).toEqual([571, 286, 143]);
    expect(allotPaths([0.9995, 0.0005], 100)).toEqual([99, 1]);
    expect(allotPaths([1 / 3, 1 / 3, 1 / 3], 2)).toEqual([1, 1, 1]);
    const fit = combo.fit(Y, { members: ["lastweek", "drift", "lastyear"], rule: "inverse-mse", mse: [1, 2, 4] });
    const sim = fit.simulate(3, 700, new MersenneTwister(1));
    expect(sim.length).toBe(700);
  });

  test("80% and 95% pooled intervals of last week + drift cover a Gaussian random walk near nominal", () => {
    // 1000 independent walks (σ = 1, no drift) of 100 weeks, scored at step 4 two ways.
    //  - Hits of the walk's own week 104: binomial standard errors √(0.8·0.2/1000) = 1.26 and
    //    √(0.95·0.05/1000) = 0.69 points; the bounds are three of them around nominal.
    //  - Exact conditional coverage, the truth being N(y_100, 4): Φ((U − y)/2) − Φ((L − y)/2),
    //    averaged (the device of test/core/models/nnar/coverage.test.ts). σ̂ moves one
    //    replication's coverage by about 3 points, so the average's noise is near 0.1 points;
    //    it is held within 0.75 points of what is expected:
    //    type-7 quantiles of 500 pooled draws cover a fresh draw with probability about
    //    1 − 2((m − 1)α/2 + 1)/(m + 1), i.e. 79.7% and 94.6%; σ̂ from 99 differences costs about
    //    0.1, while the drift member's spread of ĉ widens the mixture slightly.
    const trials = 1000;
    const hits = [0, 0];
    const exact = [0, 0];
    for (let k = 0; k < trials; k++) {
      const y = randomWalk(10000 + k, 104);
      const fc = combo.fit(y.subarray(0, 100), { members: ["lastweek", "drift"], paths: 500, seed: k }).forecast(4, [80, 95]);
      for (let i = 0; i < 2; i++) {
        const [lo, hi] = [fc.lower[i][3], fc.upper[i][3]];
        if (y[103] >= lo && y[103] <= hi) hits[i]++;
        exact[i] += normalCdf((hi - y[99]) / 2) - normalCdf((lo - y[99]) / 2);
      }
    }
    const rate = hits.map((h) => (100 * h) / trials);
    const cover = exact.map((c) => (100 * c) / trials);
    expect(Math.abs(rate[0] - 80)).toBeLessThan(3 * 1.26);
    expect(Math.abs(rate[1] - 95)).toBeLessThan(3 * 0.69);
    expect(Math.abs(cover[0] - 79.7)).toBeLessThan(0.75);
    expect(Math.abs(cover[1] - 94.6)).toBeLessThan(0.75);
  });
});

describe("determinism and update()", () => {
  const members = ["lastweek", "sarima", "nnar"];
  const opts: CombinationOptions = { members, memberOptions: quickFor(members), paths: 400 };

  test("two runs with the same inputs are bit-identical; the seed moves only the path quantiles", () => {
    const a = combo.fit(Y, opts);
    const b = combo.fit(Y, opts);
    expect(fcBits(a.forecast(5, [80, 95]))).toBe(fcBits(b.forecast(5, [80, 95])));
    expect(fcBits(a.forecast(5, [80, 95]))).toBe(fcBits(a.forecast(5, [80, 95])));
    expect(bits(a.fitted)).toBe(bits(b.fitted));
    const simA = a.simulate(4, 50, new MersenneTwister(3)).map(bits).join("");
    const simB = b.simulate(4, 50, new MersenneTwister(3)).map(bits).join("");
    expect(simA).toBe(simB);
    const c = combo.fit(Y, { ...opts, seed: 99 }).forecast(5, [80]);
    expect(bits(c.point)).toBe(bits(a.forecast(5, [80]).point));
    expect(bits(c.upper[0])).not.toBe(bits(a.forecast(5, [80]).upper[0]));
  });

  test("update(reestimate: false) equals recombining the members updated one by one", () => {
    const base = Y.slice(0, 110);
    const more = Y.slice(110, 114);
    const up = combo.fit(base, { ...opts, intervals: "quantiles" }).update(more, { reestimate: false });
    const mine = members.map((c) => own(c, base).update(more, { reestimate: false }).forecast(4, [80]));
    const avg = (pick: (f: Forecast) => Float64Array): number[] =>
      Array.from({ length: 4 }, (_, s) => mine.reduce((a, f) => a + pick(f)[s], 0) / mine.length);
    const fc = up.forecast(4, [80]);
    expectClose(fc.point, avg((f) => f.point), 1e-12);
    expectClose(fc.lower[0], avg((f) => f.lower[0]), 1e-12);
    expect(up.n).toBe(114);
    expect(up.fitted.length).toBe(114);
  });

  test("inverse-MSE weights are kept through update() unless new MSEs come with it", () => {
    const fit = combo.fit(Y.slice(0, 110), { members: ["lastweek", "drift"], rule: "inverse-mse", mse: [1, 3] }) as CombinationFit;
    const kept = fit.update(Y.slice(110, 112), { reestimate: true });
    expect(Array.from(kept.weights)).toEqual(Array.from(fit.weights));
    const fresh = fit.update(Y.slice(110, 112), { reestimate: true, mse: [3, 1] });
    expectClose(fresh.weights, [0.25, 0.75], 1e-15);
    expectInputError(() => fit.update(Y.slice(110, 112), { reestimate: false, mse: [1] }), "BAD_OPTION", /one MSE per method combined/);
    expectInputError(() => fit.update(Float64Array.of(NaN), { reestimate: false }), "NOT_A_NUMBER", /new week 1 is NaN/);
  });
});

describe("members chosen, dropped and refused", () => {
  test("default members: TBATS, SARIMA and NNAR when they fit; too few weeks bring in the baselines, with a note", () => {
    const fit = combo.fit(Y, { memberOptions: QUICK });
    expect(fit.summary().structure).toBe("mean of TBATS, SARIMA, NNAR");
    // NNAR needs 21 weeks (one lag plus 20 training weeks); TBATS and SARIMA 20.
    const twenty = combo.fit(rates(20, 5), { memberOptions: QUICK }).summary();
    expect(twenty.structure).toBe("mean of TBATS, SARIMA");
    expect(twenty.notes).toContain("NNAR needs at least 21 weeks and the series has 20, so it is left out.");
    const ten = combo.fit(rates(10, 5)).summary();
    expect(ten.structure).toBe("mean of drift, last week");
    expect(ten.notes).toContain(
      "None of TBATS, SARIMA and NNAR could be used with 10 weeks, so the baselines drift and last week were added to make a combination of at least two.",
    );
    expect(combo.minLength()).toBe(3);
  });

  test("with only one default member usable, one baseline is added to make two (registry without TBATS)", () => {
    const { tbats: _left, ...withoutTbats } = registryTable();
    const noTbats = combination(() => withoutTbats);
    const twenty = noTbats.fit(rates(20, 5), { memberOptions: QUICK }).summary();
    expect(twenty.structure).toBe("mean of SARIMA, drift");
    expect(twenty.notes).toContain("Only SARIMA could be used with 20 weeks, so the baseline drift was added to make a combination of at least two.");
  });

  test("a member too short for the data is left out with a plain note; none left is refused with a sentence", () => {
    const sm = combo.fit(rates(40, 6), { members: ["lastyear", "drift"] }).summary();
    expect(sm.structure).toBe("mean of drift");
    expect(sm.notes).toContain("Same week last year needs at least 54 weeks and the series has 40, so it is left out.");
    expect(sm.parameters).toEqual([{ name: "weight: Drift", value: 1 }]);
    expectInputError(
      () => combo.fit(rates(15, 6), { members: ["lastyear", "sarima"] }),
      "TOO_FEW_POINTS",
      /^None of the methods to combine \(same week last year and SARIMA\) could be fitted to these 15 weeks: .*Combine other methods, or use a longer series\.$/,
    );
  });

  test("a member that fails inside is left out; one that cannot simulate switches the intervals to combined bounds", () => {
    const failing: ModelSpec = { ...drift, fit: () => { throw new Error("the optimiser gave up"); } };
    const noPaths: ModelSpec = {
      ...drift,
      fit: (y: Float64Array) => {
        const f = drift.fit(y);
        return { ...f, fitted: f.fitted, residuals: f.residuals, forecast: f.forecast.bind(f), update: f.update.bind(f), summary: f.summary.bind(f), simulate: () => { throw new Error("no paths here"); } };
      },
    };
    const y = rates(60, 8);
    const dropped = fitCombination(y, { members: ["lastweek", "drift", "lastyear"] }, { lastweek: lastWeek, drift: failing, lastyear: lastYear } as ModelTable);
    expect(dropped.summary().notes).toContain("Drift could not be fitted (the optimiser gave up), so it is left out.");
    expect(dropped.summary().structure).toBe("mean of last week, same week last year");
    const table = { lastweek: lastWeek, drift: noPaths } as ModelTable;
    const q = fitCombination(y, { members: ["lastweek", "drift"] }, table);
    expect(q.intervals).toBe("quantiles");
    expect(q.summary().notes).toContain("Drift cannot simulate future paths (no paths here), so the intervals combine the methods' bounds instead.");
    expectInputError(() => fitCombination(y, { members: ["lastweek", "drift"], intervals: "paths" }, table), "BAD_OPTION", /Drift cannot simulate future paths/);
  });

  test("bad options give sentences", () => {
    const y = rates(60, 9);
    const bad = (o: unknown, message: RegExp | string): void => {
      expectInputError(() => combo.fit(y, o as CombinationOptions), "BAD_OPTION", message);
    };
    bad({ members: ["prophet", "drift"] }, /^The method "prophet" is not available to combine; choose from: lastweek, lastyear, drift, sarima, nnar/);
    bad({ members: ["combo", "drift"] }, 'A combination cannot contain another combination ("combo"); list the methods to combine, such as sarima and nnar.');
    bad({ members: ["drift"] }, "A combination needs at least two methods to combine; got only drift.");
    bad({ rule: "vote" }, /combination rule must be one of mean, median, inverse-mse/);
    bad({ members: ["drift", "lastweek"], rule: "inverse-mse", mse: [1] }, "Give one MSE per method combined: 2 methods but 1 MSEs.");
    bad({ members: ["drift", "lastweek"], rule: "inverse-mse", mse: [1, -2] }, "Each MSE must be a number above zero; the one for lastweek is -2.");
    bad({ members: ["drift", "lastweek"], mse: [1, 2] }, /used only by the inverse-mse rule; the rule here is mean/);
    bad({ rule: "inverse-mse", mse: [1, 2] }, /Name the methods \(members\) when giving their MSEs/);
    bad({ members: ["drift", "lastweek"], holdoutWeeks: 10 }, /holdout settings apply only/);
    bad({ paths: 1 }, /number of simulated paths must be a whole number from 2/);
    bad({ seed: -1 }, /seed must be a whole number/);
    bad({ intervals: "bands" }, /interval method must be "quantiles" or "paths"/);
    bad({ weights: [1, 2] }, /"weights" is not a combination setting/);
    bad({ members: ["drift", "lastweek"], memberOptions: { nnar: {} } }, /settings for nnar in memberOptions, but nnar is not one of the methods combined/);
    // A member's own setting errors are passed through, not hidden as a dropped member.
    bad({ members: ["drift", "nnar"], memberOptions: { nnar: { networks: 0 } } }, /number of networks/);
    expectInputError(() => combo.fit(Float64Array.of(1, 2, NaN, 4), {}), "NOT_A_NUMBER", "The combination needs a number in every week; week 3 has none.");
  });
});
