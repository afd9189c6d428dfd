/**
 * ISO-8601 week numbers. The dated facts below are calendar facts that any ISO-8601 week
 * calendar confirms (e.g. a printed diary with week numbers). The brute-force checks test
 * the definition itself: weeks start on Monday, week 1 holds the year's first Thursday,
 * and week numbers run 1 … 52 or 53 without gaps.
 */
import {
  isoWeek,
  isoWeekLabel,
  isoWeekStart,
  isoWeekday,
  isoWeeksInYear,
} from "../../../src/core/series/isoWeek";
import { utcDay } from "../../../src/core/series/excelDate";

const day = (s: string): Date => new Date(`${s}T00:00:00Z`);

describe("isoWeek: calendar facts", () => {
  test.each([
    ["2020-12-31", "2020-W53"],
    ["2021-01-03", "2020-W53"],
    ["2021-01-04", "2021-W01"],
    ["2008-12-29", "2009-W01"],
    ["2009-12-31", "2009-W53"],
    ["2010-01-03", "2009-W53"],
    ["2005-01-01", "2004-W53"],
    ["2007-01-01", "2007-W01"],
    ["2026-01-01", "2026-W01"],
    ["2026-12-31", "2026-W53"],
    ["2027-01-03", "2026-W53"],
    ["2027-01-04", "2027-W01"],
    ["2025-12-29", "2026-W01"],
    ["2024-12-30", "2025-W01"],
  ])("%s is in %s", (d, label) => {
    expect(isoWeekLabel(isoWeek(day(d)))).toBe(label);
  });

  test("the time of day does not change the week", () => {
    expect(isoWeek(new Date("2021-01-03T23:59:59Z"))).toEqual({ year: 2020, week: 53 });
  });

  test.each([
    [2004, 53],
    [2009, 53],
    [2015, 53],
    [2020, 53],
    [2026, 53],
    [2032, 53],
    [2019, 52],
    [2021, 52],
    [2025, 52],
    [2027, 52],
  ])("%d has %d ISO weeks", (year, weeks) => {
    expect(isoWeeksInYear(year)).toBe(weeks);
  });

  test("isoWeekday counts Monday as 1 and Sunday as 7", () => {
    expect(isoWeekday(day("2025-01-06"))).toBe(1);
    expect(isoWeekday(day("2025-01-05"))).toBe(7);
  });
});

describe("isoWeek: brute force over 1899–2101", () => {
  test("every Monday starts the next week, other days stay in it, no week is skipped", () => {
    let prev = isoWeek(utcDay(1899, 1, 1));
    const maxWeek = new Map<number, number>();
    const wrong: string[] = []; // collected, then asserted once, to keep the loop fast
    for (let t = utcDay(1899, 1, 2).getTime(); t <= utcDay(2101, 12, 31).getTime(); t += 86_400_000) {
      const d = new Date(t);
      const w = isoWeek(d);
      let want = prev;
      if (d.getUTCDay() === 1) {
        want =
          prev.week === isoWeeksInYear(prev.year)
            ? { year: prev.year + 1, week: 1 }
            : { year: prev.year, week: prev.week + 1 };
      }
      if (w.year !== want.year || w.week !== want.week) {
        wrong.push(`${d.toISOString().slice(0, 10)}: ${isoWeekLabel(w)}, want ${isoWeekLabel(want)}`);
      }
      maxWeek.set(w.year, Math.max(maxWeek.get(w.year) ?? 0, w.week));
      prev = w;
    }
    expect(wrong).toEqual([]);
    // Whole ISO years seen: 1899 … 2101 except possibly the partial ends.
    for (let y = 1900; y <= 2100; y++) expect(maxWeek.get(y)).toBe(isoWeeksInYear(y));
  });

  test("week 1 is the week holding the first Thursday of the year", () => {
    for (let y = 1900; y <= 2100; y++) {
      let jan = 1;
      while (utcDay(y, 1, jan).getUTCDay() !== 4) jan++;
      expect(isoWeek(utcDay(y, 1, jan))).toEqual({ year: y, week: 1 });
      // The Monday of that week is the first day of ISO year y.
      const monday = isoWeekStart(y, 1);
      expect(monday.getUTCDay()).toBe(1);
      expect((utcDay(y, 1, jan).getTime() - monday.getTime()) / 86_400_000).toBe(3);
      expect(isoWeek(new Date(monday.getTime() - 86_400_000)).year).toBe(y - 1);
    }
  });

  test("a 400-year Gregorian cycle holds 71 years of 53 weeks", () => {
    // 400 Gregorian years are exactly 20871 weeks = 400 × 52 + 71.
    let long = 0;
    for (let y = 2000; y < 2400; y++) if (isoWeeksInYear(y) === 53) long++;
    expect(long).toBe(71);
  });

  test("isoWeekStart inverts isoWeek for every week of 1990–2040", () => {
    for (let y = 1990; y <= 2040; y++) {
      for (let w = 1; w <= isoWeeksInYear(y); w++) {
        const monday = isoWeekStart(y, w);
        expect(isoWeek(monday)).toEqual({ year: y, week: w });
        expect(isoWeek(new Date(monday.getTime() + 6 * 86_400_000))).toEqual({ year: y, week: w });
      }
    }
    expect(() => isoWeekStart(2025, 53)).toThrow(RangeError);
    expect(() => isoWeekStart(2025, 0)).toThrow(RangeError);
  });
});
