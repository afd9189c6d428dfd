/**
 * SARIMA with lunar-new-year regressors, on seeded simulations with known truth: weekly log
 * rates with an annual swing, AR(1) noise and, when present, a dip in the weeks of the moving
 * holiday (the kind of effect issue #11 describes). With the effect present, the regression
 * recovers it and forecasts across the next holiday improve; with none, the coefficients stay
 * near zero and forecasts are not worse beyond noise.
 */
import { backtestMase, coefficient, datedSeries, DIP, lastWindowStart, simulate, START, WINDOW_NAMES } from "../holidaySimulation";
import { getModel } from "../../../../src/core/models/registry";
import type { Fitted } from "../../../../src/core/models/types";
import { planBacktest } from "../../../../src/core/evaluate/plan";
import { analyse } from "../../../../src/core/analysis";

const sarima = getModel("sarima");
// Structure held fixed (AR(1) with a mean and 2 Fourier pairs, on logs), so the comparison is
// of the regressors alone, not of two different searches.
const FIXED = { structure: { p: 1, d: 0, q: 0 }, pairs: 2, constant: true, lambda: 0 };
const CALENDAR = { calendar: { start: START, lunarNewYear: { before: 1, after: 3 } } };

describe("SARIMA with lunar-new-year regressors", () => {
  const n = 9 * 52 + 20; // nine years and into February of the tenth
  const cut = lastWindowStart(n) - 3; // the fit ends three weeks before the last holiday window

  test("recovers a simulated holiday dip within 3 standard errors, and forecasts across the holiday improve", () => {
    let better = 0;
    const seeds = [11, 12, 13, 14, 15];
    let sumWith = 0;
    let sumWithout = 0;
    for (const seed of seeds) {
      const y = simulate(seed, n, true);
      const fit = sarima.fit(y.slice(0, cut), { ...FIXED, ...CALENDAR });
      for (const [k, truth] of Object.entries(DIP)) {
        const name = Number(k) === 0 ? "Lunar new year week" : `Lunar new year week +${k}`;
        const c = coefficient(fit, name);
        expect(Math.abs(c.value - truth)).toBeLessThan(3 * c.se);
      }
      const plain = sarima.fit(y.slice(0, cut), FIXED);
      // Log errors over the 8 weeks from the window's start: the holiday and its recovery.
      const h = 8;
      const withCal = fit.forecast(h, [80]).point;
      const without = plain.forecast(h, [80]).point;
      let eWith = 0;
      let eWithout = 0;
      for (let s = 0; s < h; s++) {
        eWith += Math.abs(Math.log(y[cut + s] / withCal[s]));
        eWithout += Math.abs(Math.log(y[cut + s] / without[s]));
      }
      sumWith += eWith;
      sumWithout += eWithout;
      if (eWith < eWithout) better++;
    }
    expect(better).toBeGreaterThanOrEqual(4);
    expect(sumWith).toBeLessThan(0.8 * sumWithout);
  });

  test("with no holiday effect the coefficients stay near zero and forecasts are not worse beyond noise", () => {
    let sumWith = 0;
    let sumWithout = 0;
    let outside = 0;
    let count = 0;
    for (const seed of [21, 22, 23, 24, 25]) {
      const y = simulate(seed, n, false);
      const fit = sarima.fit(y.slice(0, cut), { ...FIXED, ...CALENDAR });
      for (const name of WINDOW_NAMES) {
        const c = coefficient(fit, name);
        count++;
        if (Math.abs(c.value) > 2.5 * c.se) outside++;
      }
      const plain = sarima.fit(y.slice(0, cut), FIXED);
      const a = fit.forecast(8, [80]).point;
      const b = plain.forecast(8, [80]).point;
      for (let s = 0; s < 8; s++) {
        sumWith += Math.abs(Math.log(y[cut + s] / a[s]));
        sumWithout += Math.abs(Math.log(y[cut + s] / b[s]));
      }
    }
    // At 2.5 standard errors about 1% of true-zero coefficients fall outside by chance; allow 2 of 25.
    expect(outside).toBeLessThanOrEqual(2);
    expect(sumWith).toBeLessThan(1.15 * sumWithout);
  });
});

describe("analyse() with calendar: { lunarNewYear }", () => {
  const n = 9 * 52 + 20;
  const series = datedSeries(simulate(31, n, true));

  test("SARIMA's fit table carries the holiday weeks; its backtest is more accurate than without them", () => {
    const bt = { methods: ["sarima"], testWeeks: 20, horizon: 4, modes: ["fixed" as const], methodOptions: { sarima: FIXED } };
    const withCal = analyse(series, { method: "sarima", horizon: 8, checks: false, calendar: { lunarNewYear: true }, backtest: bt });
    const without = analyse(series, { method: "sarima", horizon: 8, checks: false, backtest: bt });
    const names = withCal.tables.fit.rows.map((r) => r[0]);
    expect(names).toContain("Lunar new year week");
    expect(names).toContain("Lunar new year week +3");
    expect(without.tables.fit.rows.map((r) => r[0])).not.toContain("Lunar new year week");
    // The last 20 weeks hold the tenth year's holiday: mean MASE over 1–4 weeks ahead.
    const mase = (r: typeof withCal): number => {
      const t = r.tables.backtest;
      if (!t) throw new Error("no backtest");
      const c = t.columns.indexOf("MASE");
      const rows = t.rows.filter((x) => x[t.columns.indexOf("Origins from")] !== "all windows");
      return rows.reduce((a, x) => a + Number(x[c]), 0) / rows.length;
    };
    expect(mase(withCal)).toBeLessThan(mase(without));
  });

  test("one backtest scores SARIMA with and without the holiday weeks side by side, and auto takes the better", () => {
    const bt = { methods: ["sarima", "lastweek"], testWeeks: 20, horizon: 4, modes: ["fixed" as const], methodOptions: { sarima: FIXED } };
    const r = analyse(series, { method: "auto", horizon: 8, checks: false, calendar: { lunarNewYear: true }, backtest: bt });
    const mase = (label: string): number => {
      const m = backtestMase(r, label);
      expect(m.rows).toBe(4);
      return m.mean;
    };
    // The simulated holiday dip is there to find: the regressors make the holiday weeks forecastable.
    expect(mase("Seasonal ARIMA")).toBeLessThan(mase("Seasonal ARIMA without calendar effects"));
    expect(r.model.method).toBe("sarima");
  });

  test("a backtest's combination averages the models, not SARIMA's calendar-free twin", () => {
    const plan = planBacktest(n, { methods: ["sarima", "sarima:plain", "tbats", "lastweek", "combo"], testWeeks: 8, horizon: 2 }, getModel);
    expect(plan.combos).toEqual([{ code: "combo", members: ["sarima", "tbats"] }]);
  });

  test("when the backtest scores SARIMA better without the holiday weeks, the outlook is fitted without them and says so", () => {
    const flat = simulate(32, n, false);
    const plain = { ...series, values: flat };
    const bt = { methods: ["sarima:plain"], testWeeks: 8, horizon: 2, modes: ["fixed" as const], methodOptions: { "sarima:plain": FIXED } };
    const r = analyse(plain, { method: "auto", horizon: 4, checks: false, calendar: { lunarNewYear: true }, backtest: bt });
    expect(r.model.method).toBe("sarima:plain");
    expect(r.model.label).toBe("Seasonal ARIMA without calendar effects");
    expect(r.tables.fit.rows.map((x) => x[0])).not.toContain("Lunar new year week");
    expect(r.warnings.join(" ")).toContain("The backtest scored Seasonal ARIMA better without the lunar-new-year effects as regressors, so the outlook is fitted without them.");
  });

  test("other methods say they ignore it; an undated series is refused", () => {
    const r = analyse(series, { method: "lastweek", checks: false, calendar: { lunarNewYear: true } });
    expect(r.warnings.join(" ")).toMatch(/used by SARIMA and TBATS only; .* was fitted without them/);
    const undated = { ...series, dates: [] };
    expect(() => analyse(undated, { method: "sarima", calendar: { lunarNewYear: true } })).toThrow(/need the week-ending dates/);
  });
});

describe("a combination with calendar: { lunarNewYear }", () => {
  test("its SARIMA member is fitted with the holiday weeks, as in its backtest", () => {
    const n = 9 * 52 + 20;
    const y = simulate(41, n, true);
    const series = datedSeries(y);
    const calendar = { lunarNewYear: true };
    const bt = { methods: ["sarima", "lastweek", "combo"], comboMembers: ["sarima", "lastweek"], testWeeks: 8, horizon: 2, modes: ["fixed" as const] };
    const combo = analyse(series, { method: "combo", horizon: 6, checks: false, calendar, backtest: bt });
    const sarimaOnly = analyse(series, { method: "sarima", horizon: 6, checks: false, calendar });
    const naive = analyse(series, { method: "lastweek", horizon: 6, checks: false });
    const point = (r: typeof combo): number[] => r.tables.outlook.rows.map((row) => Number(row[2]));
    // The mean rule: the combination's point is the average of its members' points (combination/fit.ts).
    point(combo).forEach((p, s) => expect(Math.abs(p - (point(sarimaOnly)[s] + point(naive)[s]) / 2)).toBeLessThan(1e-9 * p));
    expect(combo.warnings.join(" ")).toMatch(/in the combination, its SARIMA member takes them/);
  });
});
