/**
 * Factors around the lunar new year on seeded simulations with known truth: a moving-holiday
 * dip of 15% in the holiday's week and 8% the week after (counted from the true dates,
 * lunar.ts), on a slow trend with 2% weekly noise, fourteen years. Counted from the holiday
 * the dip is recovered; the ISO-week factors of the same weeks show it smeared (shallower),
 * which is why the calendar effect is a regressor and not part of the fixed pattern
 * (DESIGN.md, "Periods"). With no holiday effect the aligned factors stay near 1.
 */
import { holidayFactors, HOLIDAY_WEEKS } from "../../../../src/core/diagnostics/seasonality";
import { stl } from "../../../../src/core/diagnostics/seasonality/stl";
import { runChecks } from "../../../../src/core/diagnostics/battery";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { MS_PER_WEEK } from "../../../../src/core/series/calendar";
import { lunarOffset } from "../../../../src/core/series/lunarRegressors";

const WEEKS = 730;
const START = Date.UTC(2012, 0, 6);

function simulate(dip: Record<number, number>, seed: number): { dates: Date[]; logs: Float64Array } {
  const rng = new MersenneTwister(seed);
  const dates: Date[] = [];
  const logs = new Float64Array(WEEKS);
  for (let t = 0; t < WEEKS; t++) {
    const d = new Date(START + t * MS_PER_WEEK);
    dates.push(d);
    const k = lunarOffset(d);
    logs[t] = Math.log(1500) + 0.0004 * t + Math.log(dip[k] ?? 1) + 0.02 * rng.normal();
  }
  return { dates, logs };
}

function at(f: { offsets: number[]; aligned: Float64Array; iso: Float64Array }, k: number): { aligned: number; iso: number } {
  const j = f.offsets.indexOf(k);
  return { aligned: f.aligned[j], iso: f.iso[j] };
}

describe("factors around the lunar new year", () => {
  test("a 15% dip in the holiday week and 8% the week after are recovered counted from the holiday; the ISO-week factors smear them", () => {
    const { dates, logs } = simulate({ 0: 0.85, 1: 0.92 }, 11);
    const f = holidayFactors(dates, stl(logs, { period: 52 }), "multiplicative");
    expect(f.offsets).toEqual([-4, -3, -2, -1, 0, 1, 2, 3, 4, 5, 6]);
    // Relative to the quiet weeks a month before: noise 2%/√14 ≈ 0.5% per offset, plus the
    // STL trend's own error; 0.025 is about four of those.
    const base = at(f, -4).aligned;
    expect(at(f, 0).aligned / base).toBeGreaterThan(0.85 - 0.025);
    expect(at(f, 0).aligned / base).toBeLessThan(0.85 + 0.025);
    expect(at(f, 1).aligned / base).toBeGreaterThan(0.92 - 0.025);
    expect(at(f, 1).aligned / base).toBeLessThan(0.92 + 0.025);
    for (const k of [-3, 3, 4, 5, 6]) expect(Math.abs(at(f, k).aligned / base - 1)).toBeLessThan(0.025);
    // The fixed pattern spreads the dip over the ISO weeks the holiday visits: shallower.
    expect(at(f, 0).iso).toBeGreaterThan(at(f, 0).aligned + 0.04);
    expect(f.years[f.offsets.indexOf(0)]).toBe(14);
  });

  test("with no holiday effect, every aligned factor is within noise of 1", () => {
    const { dates, logs } = simulate({}, 12);
    const f = holidayFactors(dates, stl(logs, { period: 52 }), "multiplicative");
    for (let j = 0; j < f.offsets.length; j++) expect(Math.abs(f.aligned[j] - 1)).toBeLessThan(0.025);
  });

  test("the checks put the table beside the ISO-week factors, one row per week from −4 to +6", () => {
    const { dates, logs } = simulate({ 0: 0.85, 1: 0.92 }, 13);
    const values = Float64Array.from(logs, Math.exp);
    const checks = runChecks({ dates, values, filled: new Array(WEEKS).fill(false), warnings: [] });
    const t = checks.tables.holidayFactors;
    expect(t?.title).toBe("Seasonal factors around the lunar new year");
    expect(t?.rows.map((r) => r[0])).toEqual(["−4", "−3", "−2", "−1", "0 (holiday week)", "+1", "+2", "+3", "+4", "+5", "+6"]);
    expect(t?.rows).toHaveLength(HOLIDAY_WEEKS.before + HOLIDAY_WEEKS.after + 1);
  });
});
