import { loadFixture } from "../../fixtures";
import { coverage, mae, mape, mase, maseScale, me, msis, rmse, smape, winkler } from "../../../src/core/evaluate/metrics";

describe("metrics on a hand-computed example", () => {
  // Worked by hand: actual 100, 200, 400; forecast 110, 180, 400.
  // errors (a − f): −10, 20, 0 → ME = 10/3, MAE = 10, RMSE = √(500/3) = 12.9099…
  // MAPE = 100·(0.1 + 0.1 + 0)/3 = 6.666…%; sMAPE = 200·(10/210 + 20/380 + 0)/3 = 6.6081…
  const a = [100, 200, 400];
  const f = [110, 180, 400];
  test("point measures", () => {
    expect(me(a, f)).toBeCloseTo(10 / 3, 12);
    expect(mae(a, f)).toBeCloseTo(10, 12);
    expect(rmse(a, f)).toBeCloseTo(Math.sqrt(500 / 3), 12);
    expect(mape(a, f)).toBeCloseTo(20 / 3, 12);
    expect(smape(a, f)).toBeCloseTo((200 * (10 / 210 + 20 / 380)) / 3, 12);
  });

  test("interval measures", () => {
    // 80% intervals [95,105], [170,190], [390,410]: 100 and 400 fall inside, 200 lies 10 above 190.
    const lo = [95, 170, 390];
    const hi = [105, 190, 410];
    expect(coverage(a, lo, hi)).toBeCloseTo(200 / 3, 12);
    // Winkler at 80% (α = 0.2): widths 10, 20, 20; penalty (2/0.2)·10 = 100 on the second.
    expect(winkler(a, lo, hi, 80)).toBeCloseTo((10 + 120 + 20) / 3, 12);
    expect(msis(a, lo, hi, 80, 25)).toBeCloseTo(50 / 25, 12);
  });

  test("MASE scaling: lag 52 with two years of history, lag 1 otherwise, and it says which", () => {
    const long = Array.from({ length: 104 }, (_, t) => 100 + (t % 52) + Math.floor(t / 52) * 3);
    const s = maseScale(long);
    expect(s.lag).toBe(52);
    expect(s.scale).toBeCloseTo(3, 12); // every week is 3 above the same week a year before
    expect(s.note).toMatch(/lag 52/);
    const short = long.slice(0, 103);
    const s1 = maseScale(short);
    expect(s1.lag).toBe(1);
    expect(s1.note).toMatch(/shorter than two years/);
    expect(mase([10], [13], s)).toBeCloseTo(1, 12);
  });

  test("undefined terms are skipped, mismatched lengths refused", () => {
    expect(mape([0, 100], [5, 110])).toBeCloseTo(10, 12); // the zero actual has no percentage error
    expect(mae([1, NaN, 3], [2, 2, 2])).toBeCloseTo(1, 12);
    expect(() => mae([1, 2], [1])).toThrow(RangeError);
    expect(() => winkler([1], [0], [2], 100)).toThrow(RangeError);
  });
});

describe("metrics against a numpy computation of the published definitions", () => {
  // Reference: test/reference/make_metrics.py (numpy, Hyndman & Koehler 2006 definitions,
  // M4 sMAPE and MSIS). Agreement to 1e-12 relative: same sums in double precision.
  interface Fx {
    train: number[]; actual: number[]; forecast: number[]; lower: number[]; upper: number[]; level: number;
    me: number; mae: number; rmse: number; mape: number; smape: number; mase_scale_52: number; mase: number;
    short_train: number[]; mase_scale_short_lag1: number; coverage: number; winkler: number; msis: number;
  }
  const fx = loadFixture<Fx>("metrics.json");
  const rel = (x: number, y: number): number => Math.abs(x - y) / Math.abs(y);

  test("every measure", () => {
    const { actual: a, forecast: f, lower: lo, upper: hi } = fx;
    expect(rel(me(a, f), fx.me)).toBeLessThan(1e-12);
    expect(rel(mae(a, f), fx.mae)).toBeLessThan(1e-12);
    expect(rel(rmse(a, f), fx.rmse)).toBeLessThan(1e-12);
    expect(rel(mape(a, f), fx.mape)).toBeLessThan(1e-12);
    expect(rel(smape(a, f), fx.smape)).toBeLessThan(1e-12);
    const s = maseScale(fx.train);
    expect(s.lag).toBe(52);
    expect(rel(s.scale, fx.mase_scale_52)).toBeLessThan(1e-12);
    expect(rel(mase(a, f, s), fx.mase)).toBeLessThan(1e-12);
    expect(rel(maseScale(fx.short_train).scale, fx.mase_scale_short_lag1)).toBeLessThan(1e-12);
    expect(coverage(a, lo, hi)).toBeCloseTo(fx.coverage, 12);
    expect(fx.coverage).toBeGreaterThan(0); // the fixture exercises both hits and misses
    expect(fx.coverage).toBeLessThan(100);
    expect(rel(winkler(a, lo, hi, fx.level), fx.winkler)).toBeLessThan(1e-12);
    expect(rel(msis(a, lo, hi, fx.level, s), fx.msis)).toBeLessThan(1e-12);
  });
});
