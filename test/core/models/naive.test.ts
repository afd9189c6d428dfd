import { drift, lastWeek, lastYear } from "../../../src/core/models/naive";
import { MersenneTwister } from "../../../src/core/math/rng";
import { getModel } from "../../../src/core/models/registry";
import { InputError } from "../../../src/core/series/errors";

const Z95 = 1.959963984540054; // standard normal 97.5% point (published tables; from memory)

describe("baselines on hand-computed examples", () => {
  test("last week: flat point, σ√h intervals", () => {
    // diffs of 10, 12, 11, 15 are 2, −1, 4 → σ² = (4 + 1 + 16)/3 = 7.
    const f = lastWeek.fit(new Float64Array([10, 12, 11, 15]));
    expect(f.sigma2).toBeCloseTo(7, 12);
    const fc = f.forecast(4, [95]);
    expect(Array.from(fc.point)).toEqual([15, 15, 15, 15]);
    expect(fc.upper[0][3] - 15).toBeCloseTo(Z95 * Math.sqrt(7 * 4), 10);
    expect(Array.from(f.fitted.slice(1))).toEqual([10, 12, 11]);
    expect(Number.isNaN(f.fitted[0])).toBe(true);
  });

  test("drift: the line through first and last, with the drift's own uncertainty", () => {
    // y = 10, 12, 11, 15, 17: ĉ = 7/4; residuals 0.25, −2.75, 2.25, 0.25 → SS = 12.75, σ² = 4.25.
    const y = new Float64Array([10, 12, 11, 15, 17]);
    const f = drift.fit(y);
    expect(f.sigma2).toBeCloseTo(4.25, 12);
    const fc = f.forecast(3, [95]);
    expect(fc.point[2]).toBeCloseTo(17 + 3 * 1.75, 12);
    // Var_3 = σ²·3 + 9·σ²/4
    expect(fc.upper[0][2] - fc.point[2]).toBeCloseTo(Z95 * Math.sqrt(4.25 * (3 + 9 / 4)), 10);
  });

  test("same week last year: points repeat the last 52 weeks, variance steps up each year", () => {
    const y = new Float64Array(120);
    for (let t = 0; t < 120; t++) y[t] = 1000 + 50 * Math.sin((2 * Math.PI * t) / 52) + (t % 3);
    const f = lastYear.fit(y);
    const fc = f.forecast(60, [80]);
    expect(fc.point[0]).toBe(y[120 - 52]);
    expect(fc.point[51]).toBe(y[119]);
    expect(fc.point[52]).toBe(y[120 - 52]);
    const w = (s: number): number => fc.upper[0][s] - fc.point[s];
    expect(w(51)).toBeCloseTo(w(0), 12);
    expect(w(52) / w(0)).toBeCloseTo(Math.SQRT2, 12);
  });
});

describe("baselines on simulated processes with known truth", () => {
  test("naive 95% intervals cover a Gaussian random walk about 95% of the time", () => {
    // 2000 independent walks of 200 steps, σ = 5; binomial sd of the hit rate ≈ 0.5 points,
    // so [93.5, 96.5] is three standard deviations.
    const rng = new MersenneTwister(11);
    let hits = 0;
    const trials = 2000;
    for (let k = 0; k < trials; k++) {
      const y = new Float64Array(204);
      y[0] = 500;
      for (let t = 1; t < 204; t++) y[t] = y[t - 1] + 5 * rng.normal();
      const fc = lastWeek.fit(y.subarray(0, 200)).forecast(4, [95]);
      if (y[203] >= fc.lower[0][3] && y[203] <= fc.upper[0][3]) hits++;
    }
    const rate = (100 * hits) / trials;
    expect(rate).toBeGreaterThan(93.5);
    expect(rate).toBeLessThan(96.5);
  });

  test("simulated drift paths have the spread the interval formula states", () => {
    const rng = new MersenneTwister(5);
    const y = new Float64Array(80);
    y[0] = 100;
    for (let t = 1; t < 80; t++) y[t] = y[t - 1] + 0.8 + 2 * rng.normal();
    const f = drift.fit(y);
    const paths = f.simulate(8, 20000, new MersenneTwister(99));
    const last = paths.map((p) => p[7]);
    const mean = last.reduce((s, v) => s + v, 0) / last.length;
    const sd = Math.sqrt(last.reduce((s, v) => s + (v - mean) ** 2, 0) / (last.length - 1));
    const fc = f.forecast(8, [95]);
    const sdFormula = (fc.upper[0][7] - fc.point[7]) / Z95;
    // 20 000 paths: the sample sd has relative standard error 1/√(2·20000) ≈ 0.5%; allow 2%.
    expect(Math.abs(sd / sdFormula - 1)).toBeLessThan(0.02);
    expect(Math.abs(mean - fc.point[7]) / sdFormula).toBeLessThan(0.03);
  });

  test("update without re-estimation keeps σ; with re-estimation it moves", () => {
    const rng = new MersenneTwister(8);
    const y = new Float64Array(60);
    for (let t = 1; t < 60; t++) y[t] = y[t - 1] + rng.normal();
    const f = lastWeek.fit(y);
    const jump = new Float64Array([y[59] + 30, y[59] + 60]);
    const kept = f.update(jump, { reestimate: false });
    const refit = f.update(jump, { reestimate: true });
    expect(kept.sigma2).toBe(f.sigma2);
    expect(kept.n).toBe(62);
    expect(refit.sigma2).toBeGreaterThan(f.sigma2 * 5);
    expect(kept.forecast(1, [80]).point[0]).toBe(y[59] + 60);
  });
});

describe("registry", () => {
  test("unknown and not-yet-available methods are refused with the list of choices", () => {
    expect(getModel("LastYear").code).toBe("lastyear");
    expect(() => getModel("prophetic")).toThrow(InputError);
    // "auto" (chosen by backtest) arrives with the backtest; until then it is refused with the list.
    expect(() => getModel("auto")).toThrow(/choose one of: lastweek, lastyear, drift, sarima, nnar, tbats, combo\./);
    expect(getModel("TBATS").code).toBe("tbats");
  });
  test("too short a history is refused by the model itself", () => {
    expect(() => lastYear.fit(new Float64Array(40).fill(1))).toThrow(/at least 54 weeks/);
  });
});
