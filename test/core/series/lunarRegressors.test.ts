/**
 * Lunar-new-year week offsets and regressors. The dates are the calendar's (lunar.ts, checked
 * against the almanac dates there); the offsets are counted by hand from them below.
 */
import { lunarOffset, lunarRegressors } from "../../../src/core/series/lunarRegressors";

const day = (iso: string): Date => new Date(`${iso}T00:00:00Z`);

describe("lunarOffset", () => {
  // 2024's holiday is Saturday 10 February. Weeks ending on Fridays: 2024-02-16 covers 10–16
  // February (offset 0); 2024-02-09 is the week before (−1); 2024-03-01 is three weeks after.
  test.each([
    ["2024-02-09", -1],
    ["2024-02-16", 0],
    ["2024-02-23", 1],
    ["2024-03-01", 2],
    ["2024-03-08", 3],
    ["2024-01-26", -3],
    // 2026's is Tuesday 17 February: the week ending Friday 20 February holds it.
    ["2026-02-20", 0],
    ["2026-02-13", -1],
    // A week ending on the holiday itself holds it (e − 6 … e).
    ["2024-02-10", 0],
  ])("week ending %s is offset %d", (iso, k) => {
    expect(lunarOffset(day(iso))).toBe(k);
  });

  test("far from the holiday the offset is large, in either direction", () => {
    expect(Math.abs(lunarOffset(day("2024-08-09")))).toBeGreaterThan(20);
  });
});

describe("lunarRegressors", () => {
  test("one 0/1 column per week of the window, a single 1 inside it, zeros outside; forecast weeks too", () => {
    const start = day("2023-01-06"); // a Friday
    const reg = lunarRegressors(start, { before: 1, after: 2 });
    expect(reg.names).toEqual(["Lunar new year week −1", "Lunar new year week", "Lunar new year week +1", "Lunar new year week +2"]);
    const out = new Float64Array(4);
    // 2023's holiday is Sunday 22 January: week ending 2023-01-27 (t = 3) holds it.
    reg.at(3, out);
    expect(Array.from(out)).toEqual([0, 1, 0, 0]);
    reg.at(2, out);
    expect(Array.from(out)).toEqual([1, 0, 0, 0]);
    reg.at(5, out);
    expect(Array.from(out)).toEqual([0, 0, 0, 1]);
    reg.at(20, out);
    expect(Array.from(out)).toEqual([0, 0, 0, 0]);
    // t = 58: week ending 2024-02-16 (2023-01-06 + 406 days), which holds 2024's holiday (10 February): beyond any history.
    reg.at(58, out);
    expect(Array.from(out)).toEqual([0, 1, 0, 0]);
  });

  test("windows outside the allowed range are refused with a sentence", () => {
    expect(() => lunarRegressors(day("2023-01-06"), { before: 7 })).toThrow(/from 0 to 6; got 7/);
    expect(() => lunarRegressors(day("2023-01-06"), { after: 1.5 })).toThrow(/from 0 to 8; got 1.5/);
  });
});
