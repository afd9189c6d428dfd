/**
 * readSource against office-addin-mock: properties are readable only after load and sync, so
 * these tests also check that the code loads what it reads. isNullObject is set by Excel on
 * every sync rather than loaded, so it is given to the mock as a plain property.
 */
import { OfficeMockObject } from "office-addin-mock";

import { InputError } from "../../../src/core/series/errors";
import { describeFailure, summariseBlocks } from "../../../src/taskpane/dataSummary";
import type { ContextLike } from "../../../src/taskpane/excel/readSelection";
import { readSource } from "../../../src/taskpane/excel/readSource";
import type { DataSource } from "../../../src/taskpane/source";

type Cells = unknown[][];
type Data = Record<string, unknown>;
type Mock = OfficeMockObject & Record<string, unknown>;

const DATE_FMT_SERIALS = [45660, 45667, 45674, 45681, 45688, 45695]; // Fridays from 2025-01-03
const LANE = "Halden–Corvane FEU";
const rates = [1834.2, 1850, 1790.5, 1802, 1815.75, 1840];

function range(address: string, values: Cells): Data {
  return { address, values };
}

function column(name: string, r: Data): Data {
  return {
    name,
    range: r,
    getRange(this: Mock) {
      return this.range;
    },
  };
}

/** A lookup by name, with a null object for names not there (as *OrNullObject gives). */
function lookup(items: Record<string, Data>, blank: Data): Data {
  return {
    items,
    missing: blank,
    getItemOrNullObject(this: Mock, name: string) {
      return (this.items as Record<string, unknown>)[name] ?? this.missing;
    },
  };
}

/** Marks every mock under `lookupMock` as found, and its `missing` as the null object. */
function markNulls(lookupMock: Mock): void {
  // Only the child mocks: a mock also holds its own bookkeeping fields.
  for (const item of Object.values(lookupMock.items as Record<string, unknown>)) {
    if (item instanceof OfficeMockObject) (item as Mock).isNullObject = false;
  }
  (lookupMock.missing as Mock).isNullObject = true;
}

function contextOf(data: Data): { mock: Mock; context: ContextLike; syncs: jest.SpyInstance } {
  const mock = new OfficeMockObject({ context: { workbook: data } }) as Mock;
  const context = mock.context as Mock;
  const syncs = jest.spyOn(context as unknown as { sync: () => Promise<void> }, "sync");
  return { mock, context: context as unknown as ContextLike, syncs };
}

async function failure(p: Promise<unknown>): Promise<InputError> {
  const e = await p.then(
    () => undefined,
    (x: unknown) => x,
  );
  expect(e).toBeInstanceOf(InputError);
  return e as InputError;
}

describe("readSource: a table", () => {
  // WeeklyRates spans B2:E7 on Rates: header row 2, four weeks, a totals row 7.
  const weeks = DATE_FMT_SERIALS.slice(0, 4);
  const laneCells: Cells = [[LANE], ...rates.slice(0, 4).map((v) => [v]), [7276.7]];
  const dateCells: Cells = [["Week ending"], ...weeks.map((s) => [s]), ["Total"]];

  function tableWorkbook(options: { showTotals?: boolean; extra?: Record<string, Data> } = {}) {
    const columns = lookup(
      {
        "Week ending": column("Week ending", range("Rates!B2:B7", dateCells)),
        [LANE]: column(LANE, range("Rates!D2:D7", laneCells)),
        ...options.extra,
      },
      column("", range("", [])),
    );
    const weekly = { name: "WeeklyRates", showHeaders: true, showTotals: options.showTotals ?? true, columns };
    const built = contextOf({ tables: lookup({ WeeklyRates: weekly }, { name: "", showHeaders: true, showTotals: false, columns: lookup({}, {}) }) });
    const tables = (built.context as unknown as { workbook: { tables: Mock } }).workbook.tables;
    markNulls(tables);
    markNulls((tables.items as Record<string, Mock>).WeeklyRates.columns as Mock);
    return built;
  }

  it("reads the rate column with its header on top and the date column beside it, without the totals row", async () => {
    const { context, syncs } = tableWorkbook();
    const source: DataSource = { kind: "table", table: "WeeklyRates", rates: LANE, dates: "Week ending" };
    const blocks = await readSource(context, source);
    expect(blocks).toEqual({
      address: "Rates!D2:D6",
      values: laneCells.slice(0, 5),
      dates: dateCells.slice(0, 5),
      datesAddress: "Rates!B2:B6",
      datesFrom: "selection",
      name: LANE,
    });
    expect(syncs).toHaveBeenCalledTimes(3);
    // The intake reads the header as the name and the rest as four weeks.
    const view = summariseBlocks(blocks);
    expect(view.weeks).toBe(4);
  });

  it("reads a table without a totals row to its end, and without dates when none is named", async () => {
    const { context } = tableWorkbook({ showTotals: false });
    const blocks = await readSource(context, { kind: "table", table: "WeeklyRates", rates: LANE, dates: null });
    expect(blocks).toEqual({ address: "Rates!D2:D7", values: laneCells, datesFrom: "none", name: LANE });
  });

  it("leaves out a header that reads as a number, keeping it as the name", async () => {
    const yearCells: Cells = [["2025"], [1834.2], [1850], [1790.5], [1802], [""]];
    const { context } = tableWorkbook({ extra: { "2025": column("2025", range("Rates!E2:E7", yearCells)) } });
    const blocks = await readSource(context, { kind: "table", table: "WeeklyRates", rates: "2025", dates: "Week ending" });
    expect(blocks.address).toBe("Rates!E3:E6");
    expect(blocks.values).toEqual(yearCells.slice(1, 5));
    expect(blocks.datesAddress).toBe("Rates!B3:B6");
    expect(blocks.dates).toEqual(dateCells.slice(1, 5));
    expect(blocks.name).toBe("2025");
    expect(summariseBlocks(blocks).weeks).toBe(4);
  });

  it("reads an event column's marks on every body row with the dates beside them, and the Data view lists the marked weeks", async () => {
    const markCells: Cells = [["Port strike"], [null], ["x"], [0], [1], [""]];
    const { context } = tableWorkbook({ extra: { "Port strike": column("Port strike", range("Rates!F2:F7", markCells)) } });
    const source: DataSource = { kind: "table", table: "WeeklyRates", rates: LANE, dates: "Week ending", events: "Port strike" };
    const blocks = await readSource(context, source);
    // Header and totals row left out; four body rows, dates row for row.
    expect(blocks.events).toEqual({ marks: markCells.slice(1, 5), dates: dateCells.slice(1, 5), address: "Rates!F3:F6", name: "Port strike" });
    const view = summariseBlocks(blocks);
    // Serials 45667 and 45681 are Fridays 2025-01-10 and 2025-01-24.
    expect(view.events).toEqual({ weeks: ["2025-01-10", "2025-01-24"], column: "Port strike", address: "Rates!F3:F6" });
    const gone = await failure(readSource(context, { ...source, events: "Strike" }));
    expect(gone.message).toBe("The table WeeklyRates has no column “Strike” any more; pick the event column again.");
    const undated = await failure(readSource(context, { ...source, dates: null }));
    expect(undated.message).toBe("The event column “Port strike” marks weeks by the dates beside it; choose the dates column too.");
  });

  it("says so plainly when the table or a column has gone", async () => {
    const { context } = tableWorkbook();
    const noTable = await failure(readSource(context, { kind: "table", table: "Rates2024", rates: LANE, dates: null }));
    expect(noTable.code).toBe("SHAPE");
    expect(noTable.message).toBe("The workbook has no table named Rates2024 any more; pick the table again.");

    const noLane = await failure(readSource(context, { kind: "table", table: "WeeklyRates", rates: "Halden–Corvane FEU ", dates: null }));
    expect(noLane.code).toBe("SHAPE");
    expect(noLane.message).toBe(
      "The table WeeklyRates has no column “Halden–Corvane FEU ” any more; pick the rate column again.",
    );

    const noDates = await failure(readSource(context, { kind: "table", table: "WeeklyRates", rates: LANE, dates: "Week" }));
    expect(noDates.message).toBe("The table WeeklyRates has no column “Week” any more; pick the date column again.");
  });
});

describe("readSource: a range", () => {
  /** Sheet Rates, whose used range covers rows 1..usedRows; columns B (dates) and C (rates). */
  function sheetWorkbook(usedRows: number | null, columns: Record<number, Data>) {
    const calls: unknown[][] = [];
    const rates = {
      name: "Rates",
      used: { rowIndex: 0, rowCount: usedRows ?? 0 },
      columns: Object.fromEntries(Object.entries(columns).map(([c, d]) => [`c${c}`, d])),
      getUsedRangeOrNullObject(this: Mock, valuesOnly?: boolean) {
        calls.push(["used", valuesOnly]);
        return this.used;
      },
      getRangeByIndexes(this: Mock, row: number, col: number, rows: number, cols: number) {
        calls.push(["byIndexes", row, col, rows, cols]);
        return (this.columns as Record<string, unknown>)[`c${col}`];
      },
    };
    const built = contextOf({ worksheets: lookup({ Rates: rates }, { name: "" }) });
    const worksheets = (built.context as unknown as { workbook: { worksheets: Mock } }).workbook.worksheets;
    markNulls(worksheets);
    const sheet = (worksheets.items as Record<string, Mock>).Rates;
    (sheet.used as Mock).isNullObject = usedRows === null;
    return { ...built, calls };
  }

  it("reads a range that has grown since it was saved down to the last rate, dates row for row", async () => {
    // Saved when the block was C1:C5 (header and four weeks); two weeks were pasted since,
    // and the next two week-ending dates are filled in ahead with no rates yet.
    const rateCells: Cells = [[LANE], ...rates.map((v) => [v]), [""], [null]];
    const dateCells: Cells = [["Week ending"], ...DATE_FMT_SERIALS.map((s) => [s]), [45702], [45709]];
    const { context, calls, syncs } = sheetWorkbook(9, {
      1: range("Rates!B1:B9", dateCells),
      2: range("Rates!C1:C9", rateCells),
    });
    const source: DataSource = { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 1, top: 0, header: true };
    const blocks = await readSource(context, source);
    expect(calls).toEqual([
      ["used", true],
      ["byIndexes", 0, 2, 9, 1],
      ["byIndexes", 0, 1, 9, 1],
    ]);
    expect(blocks).toEqual({
      address: "Rates!C1:C7",
      values: rateCells.slice(0, 7),
      dates: dateCells.slice(0, 7),
      datesAddress: "Rates!B1:B7",
      datesFrom: "selection",
      name: LANE,
    });
    expect(syncs).toHaveBeenCalledTimes(3);
    expect(summariseBlocks(blocks).weeks).toBe(6);
  });

  it("reads an event column to the sheet's last used row, so a dated coming week can be marked; a bad mark names its cell", async () => {
    const rateCells: Cells = [[LANE], ...rates.map((v) => [v]), [""], [null]];
    const dateCells: Cells = [["Week ending"], ...DATE_FMT_SERIALS.map((s) => [s]), [45702], [45709]];
    const markCells: Cells = [["Port strike"], [null], ["x"], [null], [null], [null], [null], [null], ["x"]];
    const { context, calls } = sheetWorkbook(9, {
      1: range("Rates!B1:B9", dateCells),
      2: range("Rates!C1:C9", rateCells),
      5: range("Rates!F1:F9", markCells),
    });
    const source: DataSource = { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 1, top: 0, header: true, eventsColumn: 5 };
    const blocks = await readSource(context, source);
    expect(calls[3]).toEqual(["byIndexes", 0, 5, 9, 1]);
    expect(blocks.values).toHaveLength(7); // the rates still end with the last rate
    expect(blocks.events).toEqual({ marks: markCells.slice(1), dates: dateCells.slice(1), address: "Rates!F2:F9", name: "Port strike" });
    // Row 3 (2025-01-10) and row 9, a week not yet priced (serial 45709 = 45660 + 49 days = 2025-02-21).
    expect(summariseBlocks(blocks).events?.weeks).toEqual(["2025-01-10", "2025-02-21"]);
    const bad = sheetWorkbook(9, {
      1: range("Rates!B1:B9", dateCells),
      2: range("Rates!C1:C9", rateCells),
      5: range("Rates!F1:F9", [["Port strike"], [null], ["strike"], [null], [null], [null], [null], [null], [null]]),
    });
    const e = await failure(readSource(bad.context, source).then((b) => summariseBlocks(b)));
    expect(describeFailure(e, await readSource(bad.context, source))).toBe(
      "The event column “Port strike”: “strike” is not a mark; mark each event week with 1 (or x, TRUE) and leave the other weeks blank or 0. (Cell Rates!F3.)",
    );
  });

  it("names a range without a header by its column letter, and starts at its top row", async () => {
    const rateCells: Cells = rates.slice(0, 3).map((v) => [v]);
    const { context, calls } = sheetWorkbook(14, { 2: range("Rates!C12:C14", rateCells) });
    const blocks = await readSource(context, {
      kind: "range",
      sheet: "Rates",
      ratesColumn: 2,
      datesColumn: null,
      top: 11,
      header: false,
    });
    expect(calls[1]).toEqual(["byIndexes", 11, 2, 3, 1]);
    expect(blocks).toEqual({ address: "Rates!C12:C14", values: rateCells, datesFrom: "none", name: "C" });
  });

  it("says so plainly when the sheet has gone or the column is empty from the top row down", async () => {
    const source: DataSource = { kind: "range", sheet: "Rates", ratesColumn: 2, datesColumn: 1, top: 4, header: false };
    const gone = await failure(readSource(sheetWorkbook(9, {}).context, { ...source, sheet: "Rates 2024" }));
    expect(gone.code).toBe("SHAPE");
    expect(gone.message).toBe("The workbook has no sheet named Rates 2024 any more; select the rates again.");

    const emptySheet = await failure(readSource(sheetWorkbook(null, {}).context, source));
    expect(emptySheet.message).toBe("Column C of Rates is empty from row 5 down; select the rates again.");

    const endsAbove = await failure(readSource(sheetWorkbook(4, {}).context, source));
    expect(endsAbove.message).toBe("Column C of Rates is empty from row 5 down; select the rates again.");

    const blankColumn = sheetWorkbook(6, {
      1: range("Rates!B5:B6", [[45660], [45667]]),
      2: range("Rates!C5:C6", [[""], [null]]),
    });
    const blank = await failure(readSource(blankColumn.context, source));
    expect(blank.message).toBe("Column C of Rates is empty from row 5 down; select the rates again.");
  });
});
