/**
 * readSelection against office-addin-mock: the mock answers a property only after it was
 * loaded and the context synced (before that it returns an error text), so these tests also
 * check that the code loads what it reads and syncs before reading it.
 */
import { OfficeMockObject } from "office-addin-mock";

import { InputError } from "../../../src/core/series/errors";
import { ContextLike, holdsDates, isDateFormat, readSelection } from "../../../src/taskpane/excel/readSelection";

type Cells = unknown[][];

interface RangeData {
  address: string;
  values: Cells;
  numberFormat: Cells;
  columnCount: number;
  columnIndex: number;
}

const DATE_FMT = "yyyy-mm-dd";
// Fridays from 2025-01-03 (Excel serial 45660).
const serials = [45660, 45667, 45674, 45681];
const rateCells: Cells = [["Halden–Corvane"], [1834.2], [1850], [1790.5], [1802]];
const dateCells: Cells = [["Week ending"], ...serials.map((s) => [s])];
const dateFormats: Cells = [["General"], ...serials.map(() => [DATE_FMT])];
const general = (rows: number, cols = 1): Cells => Array.from({ length: rows }, () => Array(cols).fill("General"));

function range(d: RangeData, extra: Record<string, unknown> = {}): Record<string, unknown> {
  return { ...d, ...extra };
}

/**
 * A workbook whose selection's used range is `used`. isNullObject is set by Excel on every
 * sync rather than loaded, so it is given to the mock as a plain property after creation.
 */
function workbook(used: Record<string, unknown> | null): { mock: OfficeMockObject; context: ContextLike } {
  const data = {
    context: {
      workbook: {
        selection: {
          // A null object accepts load() like any range; its properties are never read.
          used: used ?? { address: "", values: [], numberFormat: [], columnCount: 0, columnIndex: 0 },
          getUsedRangeOrNullObject(valuesOnly?: boolean) {
            (this as unknown as { valuesOnly?: boolean }).valuesOnly = valuesOnly;
            return (this as unknown as { used: unknown }).used;
          },
        },
        getSelectedRange() {
          return (this as unknown as { selection: unknown }).selection;
        },
      },
    },
  };
  const mock = new OfficeMockObject(data);
  const m = mock as unknown as { context: { workbook: { selection: { used: { isNullObject: boolean } } } } };
  m.context.workbook.selection.used.isNullObject = used === null;
  const context = (mock as unknown as { context: ContextLike }).context;
  return { mock, context };
}

function countSyncs(context: ContextLike): jest.SpyInstance {
  return jest.spyOn(context as unknown as { sync: () => Promise<void> }, "sync");
}

describe("readSelection", () => {
  it("reads one column of rates and takes the dates column to its left", async () => {
    const left = range({ address: "Rates!B1:B5", values: dateCells, numberFormat: dateFormats, columnCount: 1, columnIndex: 1 });
    const used = range(
      { address: "Rates!C1:C5", values: rateCells, numberFormat: general(5), columnCount: 1, columnIndex: 2 },
      {
        left,
        getOffsetRange(rows: number, cols: number) {
          expect([rows, cols]).toEqual([0, -1]);
          return (this as unknown as { left: unknown }).left;
        },
      },
    );
    const { context } = workbook(used);
    const syncs = countSyncs(context);
    const blocks = await readSelection(context);
    expect(blocks).toEqual({
      address: "Rates!C1:C5",
      values: rateCells,
      dates: dateCells,
      datesAddress: "Rates!B1:B5",
      datesFrom: "left",
    });
    expect(syncs).toHaveBeenCalledTimes(2);
  });

  it("asks for the used cells only, ignoring formatting", async () => {
    const used = range({ address: "Rates!A1:A5", values: rateCells, numberFormat: general(5), columnCount: 1, columnIndex: 0 });
    const { mock, context } = workbook(used);
    await readSelection(context);
    const sel = (mock as unknown as { context: { workbook: { selection: { valuesOnly?: boolean } } } }).context.workbook
      .selection;
    expect(sel.valuesOnly).toBe(true);
  });

  it("reads no dates beside column A, in a single round trip", async () => {
    const used = range({ address: "Rates!A1:A5", values: rateCells, numberFormat: general(5), columnCount: 1, columnIndex: 0 });
    const { context } = workbook(used);
    const syncs = countSyncs(context);
    expect(await readSelection(context)).toEqual({ address: "Rates!A1:A5", values: rateCells, datesFrom: "none" });
    expect(syncs).toHaveBeenCalledTimes(1);
  });

  it("does not take a column of plain numbers on the left as dates", async () => {
    const left = range({
      address: "Rates!B1:B5",
      values: [["Other lane"], [2100], [2120], [2090], [2075]],
      numberFormat: general(5),
      columnCount: 1,
      columnIndex: 1,
    });
    const used = range(
      { address: "Rates!C1:C5", values: rateCells, numberFormat: general(5), columnCount: 1, columnIndex: 2 },
      {
        left,
        getOffsetRange() {
          return (this as unknown as { left: unknown }).left;
        },
      },
    );
    const { context } = workbook(used);
    const blocks = await readSelection(context);
    expect(blocks.datesFrom).toBe("none");
    expect(blocks.dates).toBeUndefined();
  });

  it("splits a two-column selection into dates and rates", async () => {
    const both: Cells = dateCells.map((d, r) => [d[0], rateCells[r][0]]);
    const formats: Cells = dateFormats.map((f) => [f[0], "General"]);
    const used = range(
      { address: "Rates!B1:C5", values: both, numberFormat: formats, columnCount: 2, columnIndex: 1 },
      {
        col0: { address: "Rates!B1:B5" },
        col1: { address: "Rates!C1:C5" },
        getColumn(i: number) {
          const self = this as unknown as { col0: unknown; col1: unknown };
          return i === 0 ? self.col0 : self.col1;
        },
      },
    );
    const { context } = workbook(used);
    const syncs = countSyncs(context);
    expect(await readSelection(context)).toEqual({
      address: "Rates!C1:C5",
      values: rateCells,
      dates: dateCells,
      datesAddress: "Rates!B1:B5",
      datesFrom: "selection",
    });
    expect(syncs).toHaveBeenCalledTimes(2);
  });

  it("refuses an empty selection and one wider than two columns with a plain sentence", async () => {
    const empty = workbook(null);
    await expect(readSelection(empty.context)).rejects.toThrow(/selected cells are empty/);

    const wide = workbook(
      range({ address: "Rates!A1:C5", values: general(5, 3), numberFormat: general(5, 3), columnCount: 3, columnIndex: 0 }),
    );
    const e = await readSelection(wide.context).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).code).toBe("SHAPE");
    expect((e as InputError).message).toMatch(/3 columns/);
  });
});

describe("date columns", () => {
  it.each([
    ["yyyy-mm-dd", true],
    ["d/m/yyyy", true],
    ["[$-en-GB]dd mmmm yyyy", true],
    ["mmm-yy", true],
    ["General", false],
    ["0.00", false],
    ['"USD "#,##0', false],
    ["[Red]#,##0;-#,##0", false],
    ["h:mm:ss", false],
  ])("number format %s shows a date: %s", (format, isDate) => {
    expect(isDateFormat(format)).toBe(isDate);
  });

  it("accepts ISO date text and a header, and refuses a stray number", () => {
    expect(holdsDates([["Week"], ["2025-01-03"], ["2025-01-10"]], general(3))).toBe(true);
    expect(holdsDates([[45660], [45667], [5]], [[DATE_FMT], [DATE_FMT], ["General"]])).toBe(false);
    expect(holdsDates([["Week"], [""], [null]], general(3))).toBe(false);
  });
});
