/**
 * The managed-sheet writer against office-addin-mock: what it reads before writing (the mark
 * in A1, the used cells, which names exist) must be loaded and synced first, as the mock
 * enforces; what it writes is recorded. The charts have tests of their own (charts.test.ts):
 * here drawCharts is replaced by a recorder.
 */
import { OfficeMockObject } from "office-addin-mock";
import type { ManagedSheet } from "../../../src/core/present/sheets";
import { MANAGED_MARK } from "../../../src/core/present/stamp";
import { ledgerOf, type SheetLedger } from "../../../src/taskpane/ledger";
import { writePlan } from "../../../src/taskpane/writePlan";
import { WriteRefused, writeManagedSheets } from "../../../src/taskpane/excel/writeSheets";

jest.mock("../../../src/taskpane/excel/charts", () => ({
  drawCharts: jest.fn(async (_c: unknown, _s: string, plans: { name: string }[]) => plans.map((p) => p.name)),
}));

interface Recorded {
  sheet: string;
  row: number;
  col: number;
  rows: number;
  cols: number;
  range: Record<string, unknown> & { format: { font: Record<string, unknown>; fill: Record<string, unknown> } };
}

interface Log {
  added: string[];
  cleared: string[];
  ranges: Recorded[];
  namesAdded: [string, string][];
  formulas: [string, string][];
  namesDeleted: string[];
}

/** A range that only records what is set on it. */
function recorder(log: Log, sheet: string, row: number, col: number, rows: number, cols: number) {
  const edge: Record<string, unknown> = {};
  const range = { format: { font: {}, fill: {}, borders: { getItem: () => edge }, columnWidth: 0 }, edge } as unknown as Recorded["range"];
  log.ranges.push({ sheet, row, col, rows, cols, range });
  return range;
}

function sheetStandIn(log: Log, name: string) {
  return {
    getRangeByIndexes: (row: number, col: number, rows: number, cols: number) => recorder(log, name, row, col, rows, cols),
    getRange: (address?: string) => {
      if (address === undefined) return { clear: () => log.cleared.push(name) };
      return recorder(log, name, -1, -1, 0, 0);
    },
    activate: () => undefined,
    tabColor: "",
  };
}

interface Existing {
  a1: unknown;
  used: unknown[][] | null;
}

/** A workbook with the given managed sheets and names, as office-addin-mock objects. */
function book(existing: Record<string, Existing>, names: string[] = []) {
  const log: Log = { added: [], cleared: [], ranges: [], namesAdded: [], formulas: [], namesDeleted: [] };
  const sheets: Record<string, unknown> = {};
  for (const [name, e] of Object.entries(existing)) {
    sheets[name] = {
      ...sheetStandIn(log, name),
      name,
      a1: { values: [[e.a1]] },
      used: { values: e.used ?? [], rowIndex: 0, columnIndex: 0 },
      getRange(address?: string) {
        if (address === "A1") return (this as unknown as { a1: unknown }).a1;
        return sheetStandIn(log, name).getRange(address);
      },
      getUsedRangeOrNullObject() {
        return (this as unknown as { used: unknown }).used;
      },
    };
  }
  const nameItems: Record<string, unknown> = {};
  for (const n of names) {
    nameItems[n] = {
      name: n,
      delete: () => log.namesDeleted.push(n),
    };
  }
  const data = {
    context: {
      workbook: {
        worksheets: {
          sheets,
          missing: { name: "" },
          getItemOrNullObject(name: string) {
            const self = this as unknown as { sheets: Record<string, unknown>; missing: unknown };
            return self.sheets[name] ?? self.missing;
          },
          getItem(name: string) {
            return (this as unknown as { sheets: Record<string, unknown> }).sheets[name] ?? sheetStandIn(log, name);
          },
          add(name: string) {
            log.added.push(name);
            return sheetStandIn(log, name);
          },
        },
        names: {
          items: nameItems,
          missing: { name: "" },
          getItemOrNullObject(name: string) {
            const self = this as unknown as { items: Record<string, unknown>; missing: unknown };
            return self.items[name] ?? self.missing;
          },
          add(name: string, ref: string) {
            log.namesAdded.push([name, ref]);
          },
        },
      },
    },
  };
  const mock = new OfficeMockObject(data);
  type M = { context: { workbook: { worksheets: { missing: { isNullObject: boolean }; sheets: Record<string, { used: { isNullObject: boolean } }> }; names: { missing: { isNullObject: boolean }; items: Record<string, { isNullObject: boolean; formula?: string }> } } } };
  const m = mock as unknown as M;
  m.context.workbook.worksheets.missing.isNullObject = true;
  m.context.workbook.names.missing.isNullObject = true;
  for (const [name, e] of Object.entries(existing)) m.context.workbook.worksheets.sheets[name].used.isNullObject = e.used === null;
  for (const n of names) m.context.workbook.names.items[n].isNullObject = false;
  const context = (mock as unknown as { context: Excel.RequestContext }).context;
  return { log, context, nameItem: (n: string) => m.context.workbook.names.items[n] };
}

/** A small managed sheet: stamp mark, a header and two forecast rows, one workbook name. */
function outlookSheet(point = 1834.2): ManagedSheet {
  return {
    kind: "outlook",
    name: "Fairlead Outlook",
    cells: [
      [MANAGED_MARK, "Outlook"],
      ["Week ending", "Forecast"],
      ["2026-12-04", point],
      ["2026-12-11", 1840.5],
    ],
    width: 2,
    styles: [
      { row: 0, col: 0, rows: 1, cols: 1, style: "mark" },
      { row: 1, col: 0, rows: 1, cols: 2, style: "header" },
      { row: 2, col: 0, rows: 2, cols: 1, style: "date" },
      { row: 2, col: 1, rows: 2, cols: 1, style: "rate" },
    ],
    names: [{ name: "FL_HC_POINT", row: 2, col: 1, rows: 2, cols: 1 }],
    charts: [],
    blocks: [{ row: 0, col: 0, rows: 4, cols: 2, label: "stamp" }],
  };
}

function ledgerFor(sheet: ManagedSheet): SheetLedger {
  return ledgerOf(sheet.name, writePlan(sheet).values, [], sheet.names.map((n) => n.name));
}

describe("writeManagedSheets", () => {
  it("adds a missing sheet, writes formats before values, adds the names and returns the ledger", async () => {
    const { log, context } = book({});
    const sheet = outlookSheet();
    const syncs = jest.spyOn(context, "sync");
    const result = await writeManagedSheets(context, [sheet], {}, { charts: false });
    expect(log.added).toEqual(["Fairlead Outlook"]);
    expect(log.cleared).toEqual([]);
    const grid = log.ranges.find((r) => r.row === 0 && r.col === 0 && r.rows === 4 && r.cols === 2)!;
    // The dates went in as Excel serials (2026-12-04 is 46360), the text as text.
    expect(grid.range.values).toEqual([
      [MANAGED_MARK, "Outlook"],
      ["Week ending", "Forecast"],
      [46360, 1834.2],
      [46367, 1840.5],
    ]);
    expect(grid.range.numberFormat).toEqual([
      ["@", "@"],
      ["@", "@"],
      ["yyyy-mm-dd", "#,##0.0"],
      ["yyyy-mm-dd", "#,##0.0"],
    ]);
    // Formats assigned before values: Excel keeps text formatted as text, as typed.
    expect(Object.keys(grid.range).indexOf("numberFormat")).toBeLessThan(Object.keys(grid.range).indexOf("values"));
    expect(log.namesAdded).toEqual([["FL_HC_POINT", "='Fairlead Outlook'!$B$3:$B$4"]]);
    expect(result.ledgers).toEqual([ledgerFor(sheet)]);
    expect(result.sheets[0]).toMatchObject({ name: "Fairlead Outlook", rows: 4, cols: 2, created: true });
    // One round trip to look, one to write (no existing sheet to read back).
    expect(syncs).toHaveBeenCalledTimes(2);
  });

  it("rewrites its own sheet when nobody typed into it, moving an existing name rather than re-adding it", async () => {
    const before = outlookSheet(1834.2);
    const { log, context, nameItem } = book({ "Fairlead Outlook": { a1: MANAGED_MARK, used: writePlan(before).values } }, ["FL_HC_POINT"]);
    const after = outlookSheet(1850);
    const result = await writeManagedSheets(context, [after], { "Fairlead Outlook": ledgerFor(before) }, { charts: false });
    expect(log.added).toEqual([]);
    expect(log.cleared).toEqual(["Fairlead Outlook"]);
    expect(log.namesAdded).toEqual([]);
    expect(nameItem("FL_HC_POINT").formula).toBe("='Fairlead Outlook'!$B$3:$B$4");
    expect(result.ledgers[0]).toEqual(ledgerFor(after));
  });

  it("stops, names the cell and writes nothing when someone typed into a managed sheet", async () => {
    const before = outlookSheet();
    const now = writePlan(before).values.map((r) => [...r]);
    now[3][1] = 1999; // B4 overwritten by hand
    const { log, context } = book({ "Fairlead Outlook": { a1: MANAGED_MARK, used: now } });
    const e = await writeManagedSheets(context, [outlookSheet()], { "Fairlead Outlook": ledgerFor(before) }, { charts: false }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(WriteRefused);
    expect((e as Error).message).toMatch(/^Fairlead Outlook has been typed into at B4 \(now “1999”\)\. Fairlead wrote nothing\./);
    expect(log.cleared).toEqual([]);
    expect(log.ranges).toEqual([]);
    expect(log.namesAdded).toEqual([]);
  });

  it("refuses a sheet of Fairlead's name that the user made", async () => {
    const { log, context } = book({ "Fairlead Outlook": { a1: "My outlook notes", used: [["My outlook notes"]] } });
    await expect(writeManagedSheets(context, [outlookSheet()], {}, { charts: false })).rejects.toThrow(/Fairlead did not write \(its A1 is not/);
    expect(log.ranges).toEqual([]);
  });

  it("asks before taking over a marked sheet it has no record of, and takes it over when told", async () => {
    const made = { "Fairlead Outlook": { a1: MANAGED_MARK, used: writePlan(outlookSheet()).values } };
    const first = book(made);
    const e = await writeManagedSheets(first.context, [outlookSheet()], {}, { charts: false }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(WriteRefused);
    expect((e as WriteRefused).adoptable).toEqual(["Fairlead Outlook"]);
    expect(first.log.ranges).toEqual([]);

    const second = book(made);
    await writeManagedSheets(second.context, [outlookSheet()], {}, { charts: false, adopt: ["Fairlead Outlook"] });
    expect(second.log.cleared).toEqual(["Fairlead Outlook"]);
  });

  it("deletes the names of a series no longer analysed", async () => {
    const before = outlookSheet();
    const old = { ...ledgerFor(before), names: ["FL_HC_POINT", "FL_CE_POINT"] };
    const { log, context } = book({ "Fairlead Outlook": { a1: MANAGED_MARK, used: writePlan(before).values } }, ["FL_HC_POINT", "FL_CE_POINT"]);
    await writeManagedSheets(context, [outlookSheet()], { "Fairlead Outlook": old }, { charts: false });
    expect(log.namesDeleted).toEqual(["FL_CE_POINT"]);
  });

  it("leaves the names over a sheet it is not writing (Publish writes two sheets, not the Outlook)", async () => {
    const outlook = { ...ledgerFor(outlookSheet()), names: ["FL_HC_POINT", "FL_HC_WEEK"] };
    const published: ManagedSheet = { ...outlookSheet(), kind: "published", name: "Fairlead Published", names: [] };
    const { log, context } = book({}, ["FL_HC_POINT", "FL_HC_WEEK"]);
    await writeManagedSheets(context, [published], { "Fairlead Outlook": outlook }, { charts: false });
    expect(log.added).toEqual(["Fairlead Published"]);
    expect(log.namesDeleted).toEqual([]);
    expect(log.namesAdded).toEqual([]);
  });
});
