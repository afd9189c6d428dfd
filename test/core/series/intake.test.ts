/**
 * Good selections of every accepted form. 2025-01-03 is a Friday, 2025-01-05 a Sunday;
 * Excel serial 45660 is 2025-01-03 (Excel's documented 1900 date system, from memory:
 * 45658 = 2025-01-01).
 */
import { readWeekly } from "../../../src/core/series/intake";
import { column, isoDays, plusDays, weekly } from "./blocks";

describe("readWeekly without dates", () => {
  test("a plain column is consecutive weeks of unknown date", () => {
    const s = readWeekly(column([1834.2, 1850, 1901.5, 1877]));
    expect(Array.from(s.values)).toEqual([1834.2, 1850, 1901.5, 1877]);
    expect(s.values).toBeInstanceOf(Float64Array);
    expect(s.dates).toEqual([]);
    expect(s.filled).toEqual([false, false, false, false]);
    expect(s.weekday).toBeUndefined();
    expect(s.name).toBeUndefined();
    expect(s.warnings).toEqual([
      "No dates were given, so the rates were taken as consecutive weeks of unknown date.",
    ]);
  });

  test("a single row is read as a series too", () => {
    const s = readWeekly([[100, "1,200", "$1,300", 1400]]);
    expect(Array.from(s.values)).toEqual([100, 1200, 1300, 1400]);
  });

  test("every accepted text form of a number", () => {
    const cells = [1834, "1,834.5", "$1,834", "USD 1834", "1834 €", "£1,200.00", "  1900  "];
    const s = readWeekly(column(cells));
    expect(Array.from(s.values)).toEqual([1834, 1834.5, 1834, 1834, 1834, 1200, 1900]);
  });

  test("blank rows above and below the table are dropped without a warning", () => {
    const s = readWeekly(column(["", null, 10, 11, 12, "", undefined, "  "]));
    expect(Array.from(s.values)).toEqual([10, 11, 12]);
    expect(s.warnings).toHaveLength(1); // only the no-dates note
  });

  test("a header is found and named", () => {
    const s = readWeekly(column(["  Halden–Corvane FEU ", 2100, 2150, 2190]));
    expect(s.name).toBe("Halden–Corvane FEU");
    expect(Array.from(s.values)).toEqual([2100, 2150, 2190]);
  });

  test("header: true drops the first row even if it is a number", () => {
    const s = readWeekly(column([999, 1, 2, 3]), { header: true });
    expect(Array.from(s.values)).toEqual([1, 2, 3]);
    expect(s.name).toBeUndefined();
  });

  test("numeric or percentage text in the first row is not a header", () => {
    expect(readWeekly(column(["1,000", 1, 2])).values[0]).toBe(1000);
    expect(() => readWeekly(column(["5%", 1, 2, 3]))).toThrow(/percentage/);
  });
});

describe("readWeekly with dates", () => {
  const rates = [100, 101, 102, 103, 104, 105];

  test("ISO text dates on Fridays", () => {
    const s = readWeekly(column(rates), { dates: column(weekly("2025-01-03", 6)) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 6));
    expect(s.weekday).toBe(5);
    expect(s.warnings).toEqual([]);
  });

  test("Excel serials, ISO text and Date objects mixed", () => {
    const dates = [45660, "2025-01-10", new Date("2025-01-17T00:00:00Z"), 45681.5, "2025-01-31T09:30Z", 45695];
    const s = readWeekly(column(rates), { dates: column(dates) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 6));
    expect(s.dates.every((d) => d.getUTCHours() === 0 && d.getUTCMinutes() === 0)).toBe(true);
  });

  test("a row series with a row of dates", () => {
    const s = readWeekly([rates.slice(0, 4)], { dates: [weekly("2025-01-05", 4)] });
    expect(s.weekday).toBe(0);
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-05", 4));
  });

  test("header over both columns", () => {
    const s = readWeekly(column(["TBX Estmar–Halden", ...rates]), {
      dates: column(["Week ending", ...weekly("2025-01-03", 6)]),
    });
    expect(s.name).toBe("TBX Estmar–Halden");
    expect(s.values.length).toBe(6);
  });

  test("a first row whose date cell is a date is data, not a header", () => {
    expect(() =>
      readWeekly(column(["Rate", ...rates.slice(1)]), { dates: column(weekly("2025-01-03", 6)) }),
    ).toThrow(/Row 1 holds "Rate"/);
  });

  test("a holiday shift is snapped to its week, with a warning", () => {
    const dates = weekly("2025-12-05", 6);
    dates[3] = "2025-12-25"; // Thursday before the Friday 2025-12-26
    const s = readWeekly(column(rates), { dates: column(dates) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-12-05", 6));
    expect(s.weekday).toBe(5);
    expect(s.warnings).toEqual([
      "Row 4 is dated Thursday 2025-12-25 rather than a Friday (probably a holiday shift); " +
        "it was taken as the week ending Friday 2025-12-26.",
    ]);
  });

  test("several shifted dates are named together; the grid stays 7-day regular", () => {
    const dates = weekly("2025-01-03", 6);
    dates[1] = plusDays(dates[1], 1); // Saturday
    dates[4] = plusDays(dates[4], -1); // Thursday
    const s = readWeekly(column(rates), { dates: column(dates) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 6));
    expect(s.warnings).toHaveLength(1);
    expect(s.warnings[0]).toContain("Rows 2 and 5 are dated on another weekday than Friday");
  });

  test("a week missing between two dates is inserted and filled", () => {
    const dates = ["2025-01-03", "2025-01-10", "2025-01-24", "2025-01-31"]; // 01-17 absent
    const s = readWeekly(column([100, 100, 400, 400]), { dates: column(dates) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 5));
    expect(s.filled).toEqual([false, false, true, false, false]);
    // Geometric midpoint of 100 and 400 is 200; tolerance covers the last bit of pow().
    expect(s.values[2]).toBeCloseTo(200, 10);
    expect(s.warnings).toEqual([
      "The week ending 2025-01-17 (between row 2 and row 3) had no rate and was filled by " +
        "interpolating on the log scale (a steady weekly growth rate) between the weeks either side.",
    ]);
  });

  test("a 13- or 15-day step is two weeks (one missing, with a holiday shift)", () => {
    const s = readWeekly(column([100, 100, 400, 400]), {
      dates: column(["2025-01-03", "2025-01-10", "2025-01-23", "2025-01-31"]),
    });
    expect(s.values.length).toBe(5);
    expect(s.filled[2]).toBe(true);
    expect(isoDays(s.dates)[3]).toBe("2025-01-24");
  });

  test("a dated row with a blank rate is a missing week", () => {
    const s = readWeekly(column([100, "", 400, 400]), { dates: column(weekly("2025-01-03", 4)) });
    expect(s.filled).toEqual([false, true, false, false]);
    expect(s.values[1]).toBeCloseTo(200, 10);
    expect(s.warnings[0]).toContain("The week ending 2025-01-10 (row 2) had no rate");
  });

  test("dated rows without rates at the top are dropped with a warning", () => {
    const s = readWeekly(column(["", "", 100, 101, 102]), { dates: column(weekly("2025-01-03", 5)) });
    expect(isoDays(s.dates)[0]).toBe("2025-01-17");
    expect(s.values.length).toBe(3);
    expect(s.warnings).toEqual(["Rows 1 and 2 have dates but no rate, so the series starts at row 3."]);
  });

  test("a label above the dates with no rate header is dropped without a warning", () => {
    const s = readWeekly(column(["", 100, 101, 102]), {
      dates: column(["Week ending", ...weekly("2025-01-03", 3)]),
    });
    expect(s.values.length).toBe(3);
    expect(s.name).toBeUndefined();
    expect(s.warnings).toEqual([]);
  });

  test("dated rows without rates at the bottom (weeks to come) are trimmed silently", () => {
    const dates = [...weekly("2025-01-03", 5), "", ""];
    const s = readWeekly(column([100, 101, 102, "", "", "", ""]), { dates: column(dates) });
    expect(s.values.length).toBe(3);
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 3));
    expect(s.warnings).toEqual([]);
  });

  test("the content of trimmed rows below the table is not read", () => {
    const s = readWeekly(column([100, 101, 102, ""]), {
      dates: column([...weekly("2025-01-03", 3), "to follow"]),
    });
    expect(s.values.length).toBe(3);
  });

  test("an empty row in the middle of dated data is skipped; its week is still found", () => {
    const dates = ["2025-01-03", "2025-01-10", "", "2025-01-17", "2025-01-24"];
    const s = readWeekly(column([100, 101, "", 102, 103]), { dates: column(dates) });
    expect(Array.from(s.values)).toEqual([100, 101, 102, 103]);
    expect(s.filled.some((f) => f)).toBe(false);
    expect(s.warnings).toEqual(["Row 3 is empty and was skipped."]);
  });

  test("the most common weekday wins; the most recent convention breaks ties", () => {
    // Two Thursdays then two Fridays, each 7–8 days apart: tie, the later Friday wins.
    const s = readWeekly(column([1, 2, 3, 4]), {
      dates: column(["2025-01-02", "2025-01-09", "2025-01-17", "2025-01-24"]),
    });
    expect(s.weekday).toBe(5);
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 4));
    expect(s.warnings[0]).toContain("Rows 1 and 2");
  });

  // 1900-01-01 was a Monday, so 1900-03-01 (59 days later) was a Thursday.
  test("Excel serials from 61 (1900-03-01) on keep their weekday", () => {
    const s = readWeekly(column([1, 2, 3]), { dates: column([61, 68, 75]) });
    expect(s.weekday).toBe(4);
    expect(isoDays(s.dates)).toEqual(["1900-03-01", "1900-03-08", "1900-03-15"]);
  });
});

describe("options", () => {
  test("minPoints counts observed rates only", () => {
    expect(() => readWeekly(column([1, "", 3]), { minPoints: 3 })).toThrow(/Only 2 weeks/);
    expect(readWeekly(column([1, "", 3]), { minPoints: 2 }).values.length).toBe(3);
  });

  test("positive accepts a positive series", () => {
    const s = readWeekly(column([0.5, 1, 2]), { positive: true });
    expect(Array.from(s.values)).toEqual([0.5, 1, 2]);
  });

  test("offsets do not change what is read", () => {
    const a = readWeekly(column([1, 2, 3]));
    const b = readWeekly(column([1, 2, 3]), { rowOffset: 9, colOffset: 4 });
    expect(Array.from(b.values)).toEqual(Array.from(a.values));
  });
});
