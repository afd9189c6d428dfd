/**
 * TBATS with calendar regressors on the transformed scale, on seeded simulations with known
 * truth (the same generator as SARIMA's calendar test: weekly log rates with an annual swing,
 * AR(1) noise and, when present, a dip in the weeks of the moving holiday). With the effect
 * present, the regression recovers it and forecasts across the next holiday improve; with none,
 * the coefficients stay near zero and forecasts are not worse beyond noise. The exactness of the
 * joint seed/β least squares is checked densely in dense.test.ts (f).
 */
import { backtestMase, coefficient, datedSeries, DIP, lastWindowStart, simulate, START, WINDOW_NAMES } from "../holidaySimulation";
import { MersenneTwister as Rng } from "../../../../src/core/math/rng";
import { autoTbats } from "../../../../src/core/models/tbats/auto";
import type { Fitted } from "../../../../src/core/models/types";
import { analyse } from "../../../../src/core/analysis";

// Structure held fixed (log scale, no trend, 2 harmonics, AR(1) errors), so the comparison is
// of the regressors alone, not of two different searches.
const FIXED = { lambda: 0, trend: false, harmonics: [2], arma: { p: 1, q: 0 } };
const CALENDAR = { calendar: { start: START, lunarNewYear: { before: 1, after: 3 } } };

/** Sum of absolute log errors of an 8-week forecast from the cut. */
function logError(f: Fitted, y: Float64Array, cut: number): number {
  const p = f.forecast(8, [80]).point;
  let e = 0;
  for (let s = 0; s < 8; s++) e += Math.abs(Math.log(y[cut + s] / p[s]));
  return e;
}

describe("TBATS with lunar-new-year regressors", () => {
  const n = 9 * 52 + 20; // nine years and into February of the tenth
  const cut = lastWindowStart(n) - 3; // the fit ends three weeks before the last holiday window

  test("recovers a simulated holiday dip within 3 standard errors, and forecasts across the holiday improve", () => {
    let better = 0;
    let sumWith = 0;
    let sumWithout = 0;
    for (const seed of [11, 12, 13, 14, 15]) {
      const y = simulate(seed, n, true);
      const fit = autoTbats(y.slice(0, cut), { ...FIXED, ...CALENDAR });
      for (const [k, truth] of Object.entries(DIP)) {
        const name = Number(k) === 0 ? "Lunar new year week" : `Lunar new year week +${k}`;
        const c = coefficient(fit, name);
        // Nine holidays of AR(1) noise with sd 0.03/√(1 − 0.49) ≈ 0.042: a coefficient's standard
        // error is about 0.042/√9 ≈ 0.014 (less after the AR filter), so 3 s.e. is tight enough to
        // tell a recovered dip (−0.15) from none, and the s.e. itself must be of that size.
        expect(c.se).toBeGreaterThan(0.003);
        expect(c.se).toBeLessThan(0.03);
        expect(Math.abs(c.value - truth)).toBeLessThan(3 * c.se);
      }
      const plain = autoTbats(y.slice(0, cut), FIXED);
      const eWith = logError(fit, y, cut);
      const eWithout = logError(plain, y, cut);
      sumWith += eWith;
      sumWithout += eWithout;
      if (eWith < eWithout) better++;
    }
    // The dip sums to 0.33 in log terms over three weeks, several times the forecast noise.
    expect(better).toBeGreaterThanOrEqual(4);
    expect(sumWith).toBeLessThan(0.8 * sumWithout);
  });

  test("with no holiday effect the coefficients stay near zero and forecasts are not worse beyond noise", () => {
    let sumWith = 0;
    let sumWithout = 0;
    let outside = 0;
    for (const seed of [21, 22, 23, 24, 25]) {
      const y = simulate(seed, n, false);
      const fit = autoTbats(y.slice(0, cut), { ...FIXED, ...CALENDAR });
      for (const name of WINDOW_NAMES) {
        const c = coefficient(fit, name);
        if (Math.abs(c.value) > 2.5 * c.se) outside++;
      }
      sumWith += logError(fit, y, cut);
      sumWithout += logError(autoTbats(y.slice(0, cut), FIXED), y, cut);
    }
    // At 2.5 standard errors about 1% of true-zero coefficients fall outside by chance; allow 2 of 25.
    expect(outside).toBeLessThanOrEqual(2);
    expect(sumWith).toBeLessThan(1.15 * sumWithout);
  });

  test("the regressors carry into forecasts, simulated paths and updates; AIC counts them", () => {
    const y = simulate(31, n, true);
    const fit = autoTbats(y.slice(0, cut), { ...FIXED, ...CALENDAR });
    const plain = autoTbats(y.slice(0, cut), FIXED);
    // AIC = −2ℓ + 2k with k one larger per regressor (5 here).
    expect(fit.aic - -2 * fit.logLik).toBeCloseTo(plain.aic - -2 * plain.logLik + 2 * 5, 9);
    // The forecast over the holiday: its log ratio to the week before the window follows the
    // coefficients (the seasonal swing over a few weeks is ≤ 0.08·2π·4/52 ≈ 0.04, the AR part
    // decays); the plain model shows no such dip.
    const point = fit.forecast(8, [80]).point;
    const b = (name: string): number => coefficient(fit, name).value;
    const dipWeek = 3 + 1 + 1; // window starts 3 weeks after the cut; +1 week after the holiday's
    expect(Math.log(point[dipWeek] / point[0]) - b("Lunar new year week +1")).toBeGreaterThan(-0.05);
    expect(Math.log(point[dipWeek] / point[0]) - b("Lunar new year week +1")).toBeLessThan(0.05);
    // Simulated paths are centred on the forecast (log scale, 4000 paths: the mean log path
    // is within 4 s.e. ≈ 4·σ_h/√4000 of the log median point forecast).
    const paths = fit.simulate(8, 4000, new Rng(5));
    const fc = fit.forecast(8, [80]);
    for (let s = 0; s < 8; s++) {
      const logs = paths.map((p) => Math.log(p[s]));
      const mean = logs.reduce((a, v) => a + v, 0) / logs.length;
      const sd = Math.sqrt(logs.reduce((a, v) => a + (v - mean) ** 2, 0) / logs.length);
      expect(Math.abs(mean - Math.log(fc.point[s]))).toBeLessThan((4 * sd) / Math.sqrt(4000));
    }
    // An update without re-estimation keeps β and filters the new weeks with the holiday removed:
    // equal to a fresh fit object at the same parameters over the longer series.
    const grown = fit.update(y.slice(cut, cut + 8), { reestimate: false });
    expect(grown.summary().parameters.find((p) => p.name === "Lunar new year week +1")?.value).toBe(b("Lunar new year week +1"));
    expect(grown.residuals.length).toBe(cut + 8);
    // Its one-step errors over the holiday weeks are noise-sized, as the dip is explained.
    let worst = 0;
    for (let t = cut; t < cut + 8; t++) worst = Math.max(worst, Math.abs(Math.log(y[t] / grown.fitted[t])));
    expect(worst).toBeLessThan(0.15);
  });
});

describe("analyse() with TBATS and calendar: { lunarNewYear }", () => {
  const n = 9 * 52 + 20;
  const series = datedSeries(simulate(41, n, true));

  test("TBATS's fit table carries the holiday weeks, and one backtest scores it with and without them", () => {
    const bt = { methods: ["tbats"], testWeeks: 20, horizon: 4, modes: ["fixed" as const], methodOptions: { tbats: FIXED } };
    const r = analyse(series, { method: "auto", horizon: 8, checks: false, calendar: { lunarNewYear: true }, backtest: bt });
    expect(r.tables.fit.rows.map((x) => x[0])).toContain("Lunar new year week +1");
    const mase = (label: string): number => {
      const m = backtestMase(r, label);
      expect(m.rows).toBe(4);
      return m.mean;
    };
    expect(mase("TBATS")).toBeLessThan(mase("TBATS without calendar effects"));
    expect(r.model.method).toBe("tbats");
    expect(r.warnings.join(" ")).not.toMatch(/fitted without them/);
  });
});
