/**
 * Every way a selection can be refused: each case gives its own error code, a sentence
 * that names the row (1-based inside the block) and the 0-based cell offset.
 * 2025-01-03 is a Friday; the weekly dates below are Fridays unless said otherwise.
 */
import { InputError, InputErrorCode } from "../../../src/core/series/errors";
import { IntakeOptions, readWeekly } from "../../../src/core/series/intake";
import { column, plusDays, weekly } from "./blocks";

interface Case {
  name: string;
  values: unknown[][];
  options?: IntakeOptions;
  code: InputErrorCode;
  /** Text the message must contain (the row it names, and the point of the sentence). */
  says: string[];
  cell?: { row: number; col: number };
}

const five = column([100, 101, 102, 103, 104]);
const fiveDates = column(weekly("2025-01-03", 5));
const withDate = (i: number, v: unknown): unknown[][] =>
  fiveDates.map((r, k) => (k === i ? [v] : r));

const cases: Case[] = [
  {
    name: "text that is not a number",
    values: column([100, 101, "n/a", 103]),
    code: "NOT_A_NUMBER",
    says: ['Row 3 holds "n/a", which is not a number.'],
    cell: { row: 2, col: 0 },
  },
  {
    name: "a percentage",
    values: column([100, "4.5%", 102, 103]),
    code: "NOT_A_NUMBER",
    says: ["Row 2", "percentage"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "a boolean",
    values: column([100, 101, 102, true]),
    code: "NOT_A_NUMBER",
    says: ["Row 4", "TRUE"],
    cell: { row: 3, col: 0 },
  },
  {
    name: "an error value as text",
    values: column([100, "#DIV/0!", 102, 103]),
    code: "CELL_ERROR",
    says: ["Row 2", "#DIV/0!"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "an error value as a custom-function object",
    values: column([100, 101, { errorCode: "NotAvailable" }, 103]),
    code: "CELL_ERROR",
    says: ["Row 3", "#N/A"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "a header row that is not wanted",
    values: column(["Rate", 100, 101, 102]),
    options: { header: false },
    code: "NOT_A_NUMBER",
    says: ['Row 1 holds "Rate"'],
    cell: { row: 0, col: 0 },
  },
  {
    name: "a row series with text, reported by column",
    values: [[100, 101, "tbc", 103]],
    code: "NOT_A_NUMBER",
    says: ['Column 3 holds "tbc"'],
    cell: { row: 0, col: 2 },
  },
  {
    name: "offsets move the cell, not the row named",
    values: column([100, 101, "x", 103]),
    options: { rowOffset: 4, colOffset: 2 },
    code: "NOT_A_NUMBER",
    says: ['Row 3 holds "x"'],
    cell: { row: 6, col: 2 },
  },
  {
    name: "two columns",
    values: [
      [1, 2],
      [3, 4],
    ],
    code: "SHAPE",
    says: ["2 rows by 2 columns", "single column"],
  },
  {
    name: "rows of different lengths",
    values: [[1], [2, 3]],
    code: "SHAPE",
    says: ["different lengths"],
  },
  {
    name: "an empty selection",
    values: [],
    code: "SHAPE",
    says: ["empty"],
  },
  {
    name: "dates shorter than the rates",
    values: five,
    options: { dates: fiveDates.slice(0, 4) },
    code: "SHAPE",
    says: ["as tall as the rates (5 rows)"],
  },
  {
    name: "dates two columns wide",
    values: five,
    options: { dates: fiveDates.map((r) => [r[0], r[0]]) },
    code: "SHAPE",
    says: ["single column"],
  },
  {
    name: "text that is not a date",
    values: five,
    options: { dates: withDate(2, "next week") },
    code: "NOT_A_DATE",
    says: ['Row 3 is dated "next week", which is not a date', "YYYY-MM-DD"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "Excel serial 60, the day that never existed",
    values: five,
    options: { dates: withDate(0, 60) },
    code: "NOT_A_DATE",
    says: ["Row 1 is dated 60", "29 February 1900"],
    cell: { row: 0, col: 0 },
  },
  {
    name: "a rate without a date",
    values: five,
    options: { dates: withDate(3, ""), dateColOffset: 1 },
    code: "NOT_A_DATE",
    says: ["Row 4 has a rate but no date."],
    cell: { row: 3, col: 1 },
  },
  {
    name: "an error value in a date cell",
    values: five,
    options: { dates: withDate(1, "#REF!") },
    code: "CELL_ERROR",
    says: ["Row 2 is dated with the error value #REF!"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "the same date twice",
    values: five,
    options: { dates: withDate(2, plusDays("2025-01-03", 7)) },
    code: "DUPLICATE_DATE",
    says: ["Row 3 is dated 2025-01-10, the same as row 2"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "newest week first",
    values: five,
    options: { dates: column(weekly("2025-01-03", 5).reverse()) },
    code: "UNSORTED_DATES",
    says: ["Row 2 is dated 2025-01-24, earlier than row 1 (2025-01-31)", "oldest to newest"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "daily data",
    values: five,
    options: { dates: column(weekly("2025-01-03", 5, 1)) },
    code: "NOT_WEEKLY",
    says: ["Row 2 is dated 2025-01-04, 1 day after row 1", "not a weekly series"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "monthly data",
    values: five,
    options: { dates: column(["2025-01-31", "2025-02-28", "2025-03-31", "2025-04-30", "2025-05-31"]) },
    code: "NOT_WEEKLY",
    says: ["Row 2 is dated 2025-02-28, 28 days after row 1", "not a weekly series"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "fortnightly data",
    values: five,
    options: { dates: column(weekly("2025-01-03", 5, 14)) },
    code: "NOT_WEEKLY",
    says: ["Row 2", "14 days"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "an 11-day step inside weekly data",
    values: five,
    options: { dates: column(["2025-01-03", "2025-01-10", "2025-01-17", "2025-01-28", "2025-02-04"]) },
    code: "NOT_WEEKLY",
    says: ["Row 4 is dated 2025-01-28, 11 days after row 3", "6 to 8 days apart"],
    cell: { row: 3, col: 0 },
  },
  {
    name: "a 16-day step (two weeks and two days) inside weekly data",
    values: five,
    options: { dates: column(["2025-01-03", "2025-01-10", "2025-01-26", "2025-01-31", "2025-02-07"]) },
    code: "NOT_WEEKLY",
    says: ["Row 3 is dated 2025-01-26, 16 days after row 2"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "a 5-day step inside weekly data",
    values: five,
    options: { dates: column(["2025-01-03", "2025-01-10", "2025-01-15", "2025-01-24", "2025-01-31"]) },
    code: "NOT_WEEKLY",
    says: ["Row 3 is dated 2025-01-15, 5 days after row 2"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "dates drifting two days off the weekday",
    values: column([1, 2, 3, 4, 5, 6]),
    // Fridays, then +8 and +8 again: each step is a legal holiday shift, but row 6 ends
    // on a Sunday, two days from the Friday convention.
    options: {
      dates: column(["2025-01-03", "2025-01-10", "2025-01-17", "2025-01-24", "2025-02-01", "2025-02-09"]),
    },
    code: "NOT_WEEKLY",
    says: ["Row 6 is dated Sunday 2025-02-09, 2 days away from Friday"],
    cell: { row: 5, col: 0 },
  },
  {
    name: "three blank weeks in a row",
    values: column([100, 101, "", "", "", 105, 106]),
    code: "LONG_GAP",
    says: ["Rows 3–5 are blank: 3 weeks missing in a row", "at most 2 weeks"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "three weeks missing between two dates",
    values: column([100, 101, 102, 106, 107]),
    options: { dates: column(["2025-01-03", "2025-01-10", "2025-01-17", "2025-02-14", "2025-02-21"]) },
    code: "LONG_GAP",
    says: ["The 3 weeks ending 2025-01-24 to 2025-02-07 (between row 3 and row 4) have no rate"],
    cell: { row: 3, col: 0 },
  },
  {
    name: "a single gap when no filling is allowed",
    values: column([100, "", 102, 103]),
    options: { maxFill: 0 },
    code: "LONG_GAP",
    says: ["Row 2 is blank: 1 week missing"],
    cell: { row: 1, col: 0 },
  },
  {
    name: "too few points",
    values: column([100, 101, "", ""]),
    code: "TOO_FEW_POINTS",
    says: ["Only 2 weeks have a rate; at least 3 are needed."],
  },
  {
    name: "too few points for the model asked",
    values: column([1, 2, 3, 4, 5]),
    options: { minPoints: 104 },
    code: "TOO_FEW_POINTS",
    says: ["Only 5 weeks", "at least 104"],
  },
  {
    name: "no rates at all",
    values: column(["Rate", "", null]),
    code: "TOO_FEW_POINTS",
    says: ["no rates"],
  },
  {
    name: "zero where a log is asked",
    values: column([100, 101, 0, 103]),
    options: { positive: true },
    code: "NON_POSITIVE",
    says: ["Row 3 holds 0", "above zero"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "a negative rate where Box-Cox is asked, below a header",
    values: column(["Index", 100, -5, 103, 104]),
    options: { positive: true },
    code: "NON_POSITIVE",
    says: ["Row 3 holds -5"],
    cell: { row: 2, col: 0 },
  },
  {
    name: "a negative fill limit",
    values: five,
    options: { maxFill: -1 },
    code: "BAD_OPTION",
    says: ["at least 0"],
  },
  {
    name: "a fractional minimum",
    values: five,
    options: { minPoints: 2.5 },
    code: "BAD_OPTION",
    says: ["whole number"],
  },
];

describe("readWeekly refuses bad input", () => {
  test.each(cases.map((c) => [c.name, c] as const))("%s", (_name, c) => {
    let caught: unknown;
    try {
      readWeekly(c.values, c.options);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    const e = caught as InputError;
    expect(e.code).toBe(c.code);
    for (const s of c.says) expect(e.message).toContain(s);
    expect(e.cell).toEqual(c.cell);
    // A plain sentence: starts with a capital, ends with a full stop.
    expect(e.message).toMatch(/^[A-Z].*\.$/s);
  });

  test("the first problem in row order is the one reported", () => {
    expect(() => readWeekly(column([100, "a", "b", 103]))).toThrow(/Row 2 holds "a"/);
  });
});
