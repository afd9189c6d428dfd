import type { SelectionBlocks } from "../../src/taskpane/excel/readSelection";
import {
  areasOf,
  columnAddress,
  DataSource,
  eventsText,
  isDataSource,
  LAST_COLUMN,
  LAST_ROW,
  placeTable,
  RangeSource,
  sameSource,
  sourceFromSelection,
  sourceLabel,
  TableSource,
  touches,
  withEvents,
} from "../../src/taskpane/source";

// Fridays from 2025-01-03 (Excel serial 45660).
const serials = [45660, 45667, 45674];
const rates = [[1834.2], [1850], [1790.5]];

describe("sourceFromSelection", () => {
  it("keeps one column of rates with its header and the dates column on its left", () => {
    const blocks: SelectionBlocks = {
      address: "Rates!C1:C4",
      values: [["Halden–Corvane FEU"], ...rates],
      dates: [["Week ending"], ...serials.map((s) => [s])],
      datesAddress: "Rates!B1:B4",
      datesFrom: "left",
    };
    expect(sourceFromSelection(blocks)).toEqual({
      kind: "range",
      sheet: "Rates",
      ratesColumn: 2,
      datesColumn: 1,
      top: 0,
      header: true,
    });
  });

  it("splits a two-column selection without a header, starting below row 1", () => {
    const blocks: SelectionBlocks = {
      address: "'Lane book'!E12:E14",
      values: rates,
      dates: serials.map((s) => [s]),
      datesAddress: "'Lane book'!D12:D14",
      datesFrom: "selection",
    };
    expect(sourceFromSelection(blocks)).toEqual({
      kind: "range",
      sheet: "Lane book",
      ratesColumn: 4,
      datesColumn: 3,
      top: 11,
      header: false,
    });
  });

  it("reads column A with no dates, and unquotes a sheet name holding a quote", () => {
    const blocks: SelectionBlocks = { address: "'Desk''s rates'!$A$2:$A$4", values: rates, datesFrom: "none" };
    expect(sourceFromSelection(blocks)).toEqual({
      kind: "range",
      sheet: "Desk's rates",
      ratesColumn: 0,
      datesColumn: null,
      top: 1,
      header: false,
    });
  });

  it("takes text on top as a header only when the intake would", () => {
    const base = { address: "Rates!C1:C4", datesAddress: "Rates!B1:B4", datesFrom: "left" as const };
    const dates = serials.map((s) => [s]);
    // A rate written as text is a rate, not a name.
    expect(sourceFromSelection({ ...base, values: [["1,834"], ...rates], dates: [[45653], ...dates] }).header).toBe(false);
    // A label beside a date in the first row is a stray word in a data row, not a header.
    expect(sourceFromSelection({ ...base, values: [["FEU"], ...rates], dates: [[45653], ...dates] }).header).toBe(false);
    expect(sourceFromSelection({ ...base, values: [[""], ...rates], dates: [["Week"], ...dates] }).header).toBe(false);
    expect(sourceFromSelection({ ...base, values: [["FEU"], ...rates], dates: [["Week"], ...dates] }).header).toBe(true);
  });

  it("refuses an address without a sheet, which could not be read again", () => {
    expect(() => sourceFromSelection({ address: "C1:C4", values: rates, datesFrom: "none" })).toThrow(/sheet/);
  });
});

describe("areasOf", () => {
  it("reads cells, whole rows, whole columns and several areas", () => {
    expect(areasOf("Rates!D120:E121")).toEqual([{ sheet: "Rates", top: 119, bottom: 120, left: 3, right: 4 }]);
    expect(areasOf("$5:$7")).toEqual([{ sheet: null, top: 4, bottom: 6, left: 0, right: LAST_COLUMN }]);
    expect(areasOf("C:D")).toEqual([{ sheet: null, top: 0, bottom: LAST_ROW, left: 2, right: 3 }]);
    expect(areasOf("'Lane, book'!A1, B3:A2")).toEqual([
      { sheet: "Lane, book", top: 0, bottom: 0, left: 0, right: 0 },
      { sheet: null, top: 1, bottom: 2, left: 0, right: 1 },
    ]);
  });

  it.each(["", "Rates!", "A1:B", "A0", "XFE1", "A1:B2:C3", "!A1", "1048577:1048577"])("does not read %p", (a) => {
    expect(areasOf(a)).toBeNull();
  });
});

describe("touches", () => {
  // Rates in column D (3) from a header in row 3 (0-based 2), dates in column B (1).
  const src: RangeSource = { kind: "range", sheet: "Rates", ratesColumn: 3, datesColumn: 1, top: 2, header: true };

  it.each([
    ["an edit inside the rates column", "D40", true],
    ["a pasted row below the last week", "A121:F121", true],
    ["a block covering the rates column", "C120:E121", true],
    ["a date corrected", "B7", true],
    ["a renamed header", "D3", true],
    ["an edit above the top row", "D2", false],
    ["a block ending just above the top row", "A1:F2", false],
    ["an edit in another lane", "E40", false],
    ["an edit between the two watched columns", "C40", false],
    ["whole rows inserted at and below the top", "5:7", true],
    ["whole rows inserted above the top", "1:2", false],
    ["the whole rates column", "D:D", true],
    ["other whole columns", "E:F", false],
    ["several areas, one of them watched", "F1,G9:H9,D50", true],
    ["several areas, none watched", "F1,G9:H9,C50", false],
  ])("%s (%s): %s", (_, address, expected) => {
    expect(touches(src, address, "Rates")).toBe(expected);
  });

  it("compares sheets as Excel does and prefers the sheet the address names", () => {
    expect(touches(src, "D40", "Summary")).toBe(false);
    expect(touches(src, "D40", "RATES")).toBe(true);
    expect(touches(src, "Summary!D40", "Rates")).toBe(false);
    expect(touches(src, "Rates!D40", "Summary")).toBe(true);
    expect(touches(src, "Summary!A1,Rates!D40", "Summary")).toBe(true);
  });

  it("watches only the rates column when there are no dates", () => {
    const noDates: RangeSource = { ...src, datesColumn: null };
    expect(touches(noDates, "B7", "Rates")).toBe(false);
    expect(touches(noDates, "D7", "Rates")).toBe(true);
  });

  it("counts an address it cannot read as a change", () => {
    expect(touches(src, "#REF!", "Rates")).toBe(true);
  });

  it("places a table source by its columns' positions before filtering", () => {
    const table: DataSource = { kind: "table", table: "WeeklyRates", rates: "Halden–Corvane FEU", dates: "Week ending" };
    const placed = placeTable(table, "Rates!B4:E60", ["Week ending", "Notes", "Halden–Corvane FEU", "Ostrava–Pellan"]);
    expect(placed).toEqual({ kind: "range", sheet: "Rates", ratesColumn: 3, datesColumn: 1, top: 3, header: true });
    expect(touches(placed as RangeSource, "D61", "Rates")).toBe(true); // a row added to the table
    expect(touches(placed as RangeSource, "E61", "Rates")).toBe(false); // the other lane only
    expect(touches(placed as RangeSource, "C10", "Rates")).toBe(false); // the notes
    // A renamed or deleted column cannot be placed.
    expect(placeTable(table, "Rates!B4:E60", ["Week ending", "Ostrava–Pellan"])).toBeNull();
    expect(placeTable(table, "B4:E60", ["Week ending", "Halden–Corvane FEU"])).toBeNull();
    expect(placeTable({ ...table, dates: null }, "'Q1 book'!A1:B9", ["x", "HALDEN–CORVANE FEU"])).toEqual({
      kind: "range",
      sheet: "Q1 book",
      ratesColumn: 1,
      datesColumn: null,
      top: 0,
      header: true,
    });
  });
});

describe("sources saved in settings", () => {
  const table: DataSource = { kind: "table", table: "WeeklyRates", rates: "Halden–Corvane FEU", dates: "Week ending" };
  const range: DataSource = { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 1, top: 0, header: true };

  it("accepts sources that went through JSON", () => {
    expect(isDataSource(JSON.parse(JSON.stringify(table)))).toBe(true);
    expect(isDataSource(JSON.parse(JSON.stringify(range)))).toBe(true);
    expect(isDataSource({ ...table, dates: null })).toBe(true);
    expect(isDataSource({ ...range, datesColumn: null })).toBe(true);
    expect(isDataSource({ ...range, addedLater: "x" })).toBe(true);
  });

  it.each([
    ["null", null],
    ["an array", [range]],
    ["a string", JSON.stringify(range)],
    ["an unknown kind", { ...range, kind: "sheet" }],
    ["a table without rates", { kind: "table", table: "WeeklyRates", dates: null }],
    ["a blank table name", { ...table, table: " " }],
    ["dates missing instead of null", { kind: "table", table: "T", rates: "R" }],
    ["dates the same column as rates", { ...table, dates: "halden–corvane feu" }],
    ["a fractional column", { ...range, ratesColumn: 2.5 }],
    ["a negative top", { ...range, top: -1 }],
    ["a column past XFD", { ...range, ratesColumn: LAST_COLUMN + 1 }],
    ["a row past the sheet", { ...range, top: LAST_ROW + 1 }],
    ["a column given as letters", { ...range, ratesColumn: "C" }],
    ["header as text", { ...range, header: "true" }],
    ["dates column equal to rates column", { ...range, datesColumn: 2 }],
    ["no sheet", { ...range, sheet: undefined }],
  ])("rejects %s", (_, value) => {
    expect(isDataSource(value)).toBe(false);
  });

  it("labels sources as a desk says them", () => {
    expect(sourceLabel(table)).toBe("WeeklyRates › Halden–Corvane FEU");
    expect(sourceLabel(range)).toBe("Rates › column C from row 2");
    expect(sourceLabel({ ...range, header: false, top: 11, ratesColumn: 27 })).toBe("Rates › column AB from row 12");
  });

  it("compares sources by the cells they name", () => {
    expect(sameSource(table, { ...table, table: "WEEKLYRATES" })).toBe(true);
    expect(sameSource(table, { ...table, dates: null })).toBe(false);
    expect(sameSource({ ...table, dates: null }, { ...table, dates: null })).toBe(true);
    expect(sameSource(table, { ...table, rates: "Ostrava–Pellan" })).toBe(false);
    expect(sameSource(range, { ...range, sheet: "rates" })).toBe(true);
    expect(sameSource(range, { ...range, top: 1 })).toBe(false);
    expect(sameSource(range, { ...range, datesColumn: null })).toBe(false);
    expect(sameSource(range, { ...range, header: false })).toBe(false);
    expect(sameSource(range, table)).toBe(false);
  });

  it("writes one-column addresses with Excel's own sheet prefix", () => {
    expect(columnAddress("'Lane book'!C1:C99", 2, 0, 119)).toBe("'Lane book'!C1:C120");
    expect(columnAddress("Rates!C5", 2, 4, 4)).toBe("Rates!C5");
  });
});

describe("an event column on a source", () => {
  const range: RangeSource = { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 1, top: 0, header: true };
  const table: DataSource = { kind: "table", table: "WeeklyRates", rates: "Halden–Corvane FEU", dates: "Week ending" };

  it("is set from a letter (range) or a column name (table), and refused in words when it cannot be", () => {
    expect(withEvents(range, " f ")).toEqual({ ...range, eventsColumn: 5 });
    // None leaves the field out, so the saved source reads as one saved before event columns.
    expect(withEvents({ ...range, eventsColumn: 5 }, "")).toStrictEqual(range);
    expect(eventsText(withEvents(range, "F"))).toBe("F");
    expect(() => withEvents(range, "C")).toThrow("Column C holds the rates; choose another column for the event weeks, or none.");
    expect(() => withEvents(range, "B")).toThrow("Column B holds the dates; choose another column for the event weeks, or none.");
    expect(() => withEvents(range, "F1")).toThrow("The event weeks column is a column letter of Rates, such as F; got “F1”.");
    expect(() => withEvents({ ...range, datesColumn: null }, "F")).toThrow(/go by the dates beside them/);
    expect(withEvents(table, "Port strike")).toEqual({ ...table, events: "Port strike" });
    expect(() => withEvents(table, "week ending")).toThrow("“week ending” is already the dates column; choose another column for the event weeks, or none.");
    expect(eventsText(table)).toBe("");
    expect(withEvents({ ...table, events: "Port strike" }, " ")).toStrictEqual(table);
  });

  it("is saved and read back (older settings without it still read), is watched, follows a table's columns, and does not make another series", () => {
    const withF = withEvents(range, "F");
    expect(isDataSource(JSON.parse(JSON.stringify(withF)))).toBe(true);
    expect(isDataSource(range)).toBe(true);
    expect(isDataSource({ ...range, eventsColumn: 2 })).toBe(false); // the rates column
    expect(isDataSource({ ...range, eventsColumn: -1 })).toBe(false);
    expect(isDataSource({ ...table, events: "Week ending" })).toBe(false);
    expect(isDataSource({ ...table, events: "Port strike" })).toBe(true);
    // A mark typed into column F below the top row triggers a refresh; column G does not.
    expect(touches(withF, "Rates!F40", "Rates")).toBe(true);
    expect(touches(withF, "Rates!G40", "Rates")).toBe(false);
    expect(touches(range, "Rates!F40", "Rates")).toBe(false);
    // Table WeeklyRates at Rates!B2:F60 with columns Week ending, …, Port strike (5th: column F).
    const placed = placeTable(
      { ...table, events: "Port strike" } as TableSource,
      "Rates!B2:F60",
      ["Week ending", "Corvane–Estmar FEU", "Halden–Corvane FEU", "Notes", "Port strike"],
    );
    expect(placed).toEqual({ kind: "range", sheet: "Rates", ratesColumn: 3, datesColumn: 1, top: 1, header: true, eventsColumn: 5 });
    expect(placeTable({ ...table, events: "Gone" } as TableSource, "Rates!B2:F60", ["Week ending", "Halden–Corvane FEU"])).toBeNull();
    // Same rates and dates: the same series, whatever its event column.
    expect(sameSource(withF, range)).toBe(true);
  });
});
