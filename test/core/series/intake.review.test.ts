/**
 * Intake behaviour fixed after review: index names in the header row, a first rate out of
 * scale, trailing rows of 0, number-like header text and the 1904 date system.
 * 2025-01-03 is a Friday.
 */
import { InputError } from "../../../src/core/series/errors";
import { IntakeOptions, readWeekly } from "../../../src/core/series/intake";
import { column, isoDays, weekly } from "./blocks";

const NO_DATES = "No dates were given, so the rates were taken as consecutive weeks of unknown date.";

function refusal(values: unknown[][], options?: IntakeOptions): InputError {
  try {
    readWeekly(values, options);
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error("readWeekly accepted the block");
}

describe("index or lane names in the header row", () => {
  test.each([["FBX11"], ["WCI 40"], ["SCFI 40"], ["EURO 40"]])("%p is the header, not a rate", (h) => {
    const s = readWeekly(column([h, 2100, 2150, 2190]));
    expect(s.name).toBe(h);
    expect(Array.from(s.values)).toEqual([2100, 2150, 2190]);
    expect(s.warnings).toEqual([NO_DATES]);
  });

  test("with header: false such a cell is refused, not read as a number", () => {
    const e = refusal(column(["FBX11", 2100, 2150, 2190]), { header: false });
    expect(e.code).toBe("NOT_A_NUMBER");
    expect(e.message).toBe('Row 1 holds "FBX11", which is not a number.');
  });
});

describe("a first rate far out of scale", () => {
  const warning = (row: number, v: number, n: number, median: number): string =>
    `Row ${row} holds ${v}, far out of scale with the ${n} weeks after it (median ${median}); ` +
    "it was kept, but check that it is a rate and not a year or code typed as a header.";

  test("below 1/5 of the next rates: kept, with a warning naming the row and value", () => {
    const s = readWeekly(column(["Lane", 11, 2100, 2150, 2190, 2200]));
    expect(Array.from(s.values)).toEqual([11, 2100, 2150, 2190, 2200]);
    // Median of 2100, 2150, 2190, 2200 is (2150 + 2190) / 2 = 2170; 11 < 2170 / 5.
    expect(s.warnings).toEqual([NO_DATES, warning(2, 11, 4, 2170)]);
  });

  test("above 5 times the next rates (a year over index points)", () => {
    const s = readWeekly(column([2024, 180, 190, 200, 210]));
    expect(s.values[0]).toBe(2024);
    expect(s.warnings).toEqual([NO_DATES, warning(1, 2024, 4, 195)]);
  });

  test("only the next 10 rates set the scale", () => {
    const cells = [100, ...new Array<number>(10).fill(1000), ...new Array<number>(20).fill(100)];
    const s = readWeekly(column(cells));
    expect(s.warnings).toEqual([NO_DATES, warning(1, 100, 10, 1000)]);
  });

  test("within a factor of 5 there is no warning", () => {
    // 500 > 2170 / 5 = 434 and 10000 < 5 × 2170 = 10850.
    expect(readWeekly(column([500, 2100, 2150, 2190, 2200])).warnings).toEqual([NO_DATES]);
    expect(readWeekly(column([10000, 2100, 2150, 2190, 2200])).warnings).toEqual([NO_DATES]);
  });
});

describe("trailing rows of 0 (formula rows for weeks to come)", () => {
  const rates = Array.from({ length: 21 }, (_, i) => 1800 + 10 * i);

  test("are left out, with one warning", () => {
    const s = readWeekly(column([...rates, 0, 0, 0]));
    expect(Array.from(s.values)).toEqual(rates);
    expect(s.warnings).toEqual([
      "The last 3 rows (rows 22–24) hold 0, read as weeks not yet filled in, and were left out.",
      NO_DATES,
    ]);
  });

  test("with dates, the zero rows and their date cells are not read", () => {
    const dates = [...weekly("2025-01-03", 22), "tbc", ""];
    const s = readWeekly(column([...rates, 0, "0", 0]), { dates: column(dates) });
    expect(isoDays(s.dates)).toEqual(weekly("2025-01-03", 21));
    expect(s.warnings).toEqual([
      "The last 3 rows (rows 22–24) hold 0, read as weeks not yet filled in, and were left out.",
    ]);
  });

  test("one zero row, below a header, and blanks among the zeros", () => {
    expect(readWeekly(column(["Rate", 100, 101, 102, 0])).warnings[0]).toBe(
      "The last row (row 5) holds 0, read as a week not yet filled in, and was left out.",
    );
    const s = readWeekly(column([100, 101, 102, 0, "", 0, ""]));
    expect(Array.from(s.values)).toEqual([100, 101, 102]);
    expect(s.warnings[0]).toBe(
      "The last 3 rows (rows 4–6) hold 0 or nothing, read as weeks not yet filled in, and were left out.",
    );
  });

  test("a row series names columns", () => {
    const s = readWeekly([[100, 101, 102, 0, 0]]);
    expect(s.warnings[0]).toBe(
      "The last 2 columns (columns 4 and 5) hold 0, read as weeks not yet filled in, and were left out.",
    );
  });

  test("trimmed zeros do not trip the positive check", () => {
    const s = readWeekly(column([100, 101, 102, 0, 0]), { positive: true });
    expect(Array.from(s.values)).toEqual([100, 101, 102]);
  });

  test("are kept when the series holds a zero earlier, or is all zeros", () => {
    const s = readWeekly(column([100, 0, 102, 0, 0]));
    expect(Array.from(s.values)).toEqual([100, 0, 102, 0, 0]);
    expect(s.warnings).toEqual([NO_DATES]);
    expect(Array.from(readWeekly(column([0, 0, 0])).values)).toEqual([0, 0, 0]);
  });

  test("a zero in the middle stays", () => {
    const s = readWeekly(column([100, 0, 102, 103]));
    expect(Array.from(s.values)).toEqual([100, 0, 102, 103]);
    expect(s.warnings).toEqual([NO_DATES]);
  });
});

describe("a number-like first cell that we do not read", () => {
  const says = (label: string, v: string): string =>
    `${label} holds "${v}", which looks like a rate but is not written in a form Fairlead ` +
    "reads; write it as 1834 or 1,834.50 (a currency code such as USD before or after is " +
    "fine), or put a name in words there if it is a header.";

  test.each([["1 834"], ["(1,834)"], ["usd 1834"], ["1.834,50"], ["-1 834 €"]])(
    "%p is NOT_A_NUMBER naming row 1, not a header",
    (v) => {
      const e = refusal(column([v, 1850, 1900, 1950]));
      expect(e.code).toBe("NOT_A_NUMBER");
      expect(e.message).toBe(says("Row 1", v));
      expect(e.cell).toEqual({ row: 0, col: 0 });
    },
  );

  test("in a row series it names column 1, at the offset given", () => {
    const e = refusal([["(1,834)", 1850, 1900, 1950]], { rowOffset: 3, colOffset: 2 });
    expect(e.message).toBe(says("Column 1", "(1,834)"));
    expect(e.cell).toEqual({ row: 3, col: 2 });
  });

  test.each([["40'"], ["2024-25"], ["Q1 2024"], ["Lane 7"]])("%p is still a header", (v) => {
    expect(readWeekly(column([v, 1850, 1900, 1950])).name).toBe(v);
  });

  test("a label in the dates column beside it still makes the row a header row", () => {
    const s = readWeekly(column(["1 834", 100, 101, 102]), {
      dates: column(["Week ending", ...weekly("2025-01-03", 3)]),
    });
    expect(s.name).toBe("1 834");
    expect(Array.from(s.values)).toEqual([100, 101, 102]);
  });
});

describe("dateSystem", () => {
  // Excel's 1900 system: serial 43466 is 2019-01-01 (from memory). In the 1904 system
  // serial 0 is 1904-01-01, so the same serial is 1462 days later; checked here with the
  // JS calendar, independently of the code under test: 2019-01-01 + 1462 days = 2023-01-02.
  test("the same serial is 1462 days later in the 1904 system", () => {
    const dayMs = 86_400_000;
    expect((Date.UTC(2023, 0, 2) - Date.UTC(2019, 0, 1)) / dayMs).toBe(1462);
    const a = readWeekly(column([1, 2, 3]), { dates: column([43466, 43473, 43480]) });
    const b = readWeekly(column([1, 2, 3]), { dates: column([43466, 43473, 43480]), dateSystem: 1904 });
    expect(isoDays(a.dates)).toEqual(["2019-01-01", "2019-01-08", "2019-01-15"]);
    expect(isoDays(b.dates)).toEqual(["2023-01-02", "2023-01-09", "2023-01-16"]);
    expect(a.weekday).toBe(2); // Tuesday
    expect(b.weekday).toBe(1); // Monday
  });

  test("a header beside a 1904 serial is data, and a negative serial is refused", () => {
    expect(() =>
      readWeekly(column(["Rate", 1, 2]), { dates: column([0, 7, 14]), dateSystem: 1904 }),
    ).toThrow('Row 1 holds "Rate", which is not a number.');
    const e = refusal(column([1, 2, 3]), { dates: column([-1, 6, 13]), dateSystem: 1904 });
    expect(e.code).toBe("NOT_A_DATE");
    expect(e.message).toBe(
      "Row 1 is dated -1, which is not a date: in the 1904 date system, Excel dates start " +
        "at serial 0, which is 1 January 1904.",
    );
  });

  test("any other value is a BAD_OPTION", () => {
    const e = refusal(column([1, 2, 3]), { dateSystem: 2000 as unknown as 1904 });
    expect(e.code).toBe("BAD_OPTION");
    expect(e.message).toBe("The date system must be 1900 or 1904.");
  });
});
