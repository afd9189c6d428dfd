/**
 * Dates are snapped to the week grid before their spacing is judged, so opposite one-day
 * holiday shifts side by side are accepted. 2025-01-03 is a Friday (so 01-16 is a
 * Thursday and 01-18 a Saturday); all other dates below are Fridays.
 */
import { InputError } from "../../../src/core/series/errors";
import { readWeekly } from "../../../src/core/series/intake";
import { column, isoDays, weekly } from "./blocks";

const SHIFTED_3_4 =
  "Rows 3 and 4 are dated on another weekday than Friday (probably holiday shifts); " +
  "each was taken as the week ending on the Friday nearest to it.";

function refusal(rates: unknown[], dates: unknown[]): InputError {
  try {
    readWeekly(column(rates), { dates: column(dates) });
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error("readWeekly accepted the block");
}

describe("opposite holiday shifts side by side", () => {
  const rates = [100, 101, 102, 103, 104];

  test("Thursday then Saturday (9 days apart) are consecutive weeks", () => {
    const s = readWeekly(column(rates), {
      dates: column(["2025-01-03", "2025-01-10", "2025-01-16", "2025-01-25", "2025-01-31"]),
    });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 5));
    expect(Array.from(s.values)).toEqual(rates);
    expect(s.warnings).toEqual([SHIFTED_3_4]);
  });

  test("Saturday then Thursday (5 days apart) are consecutive weeks", () => {
    const s = readWeekly(column(rates), {
      dates: column(["2025-01-03", "2025-01-10", "2025-01-18", "2025-01-23", "2025-01-31"]),
    });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 5));
    expect(s.warnings).toEqual([SHIFTED_3_4]);
  });

  test("Thursday, a missing week, then Saturday (16 days apart) leave one week to fill", () => {
    const s = readWeekly(column(rates), {
      dates: column(["2025-01-03", "2025-01-10", "2025-01-16", "2025-02-01", "2025-02-07"]),
    });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 6));
    expect(s.filled).toEqual([false, false, false, true, false, false]);
    // Geometric midpoint of 102 and 103; 1e-10 covers rounding in pow().
    expect(s.values[3]).toBeCloseTo(Math.sqrt(102 * 103), 10);
    expect(s.warnings).toEqual([
      SHIFTED_3_4,
      "The week ending 2025-01-24 (between row 3 and row 4) had no rate and was filled by " +
        "interpolating on the log scale (a steady weekly growth rate) between the weeks either side.",
    ]);
  });
});

describe("spacing, order and duplicates on the snapped days", () => {
  test("a Thursday and the Saturday after it are one week: DUPLICATE_DATE naming both rows", () => {
    const e = refusal([1, 2, 3, 4, 5], ["2025-01-03", "2025-01-09", "2025-01-11", "2025-01-17", "2025-01-24"]);
    expect(e.code).toBe("DUPLICATE_DATE");
    expect(e.message).toBe(
      "Row 3 is dated Saturday 2025-01-11 and row 2 Thursday 2025-01-09: both fall in the " +
        "week ending Friday 2025-01-10, and each week must appear only once.",
    );
    expect(e.cell).toEqual({ row: 2, col: 0 });
  });

  test("a Saturday then the Thursday before it are one week too, not out of order", () => {
    const e = refusal([1, 2, 3, 4, 5], ["2025-01-03", "2025-01-11", "2025-01-09", "2025-01-17", "2025-01-24"]);
    expect(e.code).toBe("DUPLICATE_DATE");
    expect(e.message).toBe(
      "Row 3 is dated Thursday 2025-01-09 and row 2 Saturday 2025-01-11: both fall in the " +
        "week ending Friday 2025-01-10, and each week must appear only once.",
    );
  });

  test("a shifted date on an earlier week is out of order", () => {
    const e = refusal([1, 2, 3, 4, 5], ["2025-01-03", "2025-01-10", "2025-01-17", "2025-01-11", "2025-01-24"]);
    expect(e.code).toBe("UNSORTED_DATES");
    expect(e.message).toBe(
      "Row 4 is dated 2025-01-11, earlier than row 3 (2025-01-17); the weeks must run from oldest to newest.",
    );
  });

  test("a date two days off the grid is still refused by its spacing", () => {
    // 2025-01-15 is a Wednesday: 5 days after row 2 and two days from Friday.
    const e = refusal([1, 2, 3, 4, 5], ["2025-01-03", "2025-01-10", "2025-01-15", "2025-01-24", "2025-01-31"]);
    expect(e.code).toBe("NOT_WEEKLY");
    expect(e.message).toBe(
      "Row 3 is dated 2025-01-15, 5 days after row 2 (2025-01-10); weekly dates must be 6 to 8 " +
        "days apart, or whole weeks apart where weeks are missing.",
    );
  });
});
