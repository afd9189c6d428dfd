/**
 * watchSources against office-addin-mock and a stand-in for Excel.run: each run gets a fresh
 * mock workbook, as each Excel.run gets a fresh request context. Events are delivered by
 * calling the handlers the code registered, with the arguments Excel would pass.
 */
import { OfficeMockObject } from "office-addin-mock";

import { childCollection as collection, wireItems, type Data, type Mock } from "./mockCollection";
import { watchSources } from "../../../src/taskpane/excel/watch";
import type { DataSource } from "../../../src/taskpane/source";

type Handler = (args: unknown) => Promise<void>;

interface Registration {
  target: string;
  handler: Handler;
  context: unknown;
  remove: jest.Mock;
}

const LANE = "Halden–Corvane FEU";
const OTHER = "Ostrava–Pellan";

let registrations: Registration[];
let contexts: Mock[];
let runCalls: { withContext: unknown }[];
let placementFails: boolean;

/** onChanged for `target`: add() records the handler with the context of the run in progress. */
function event(target: string): Data {
  return {
    add(handler: Handler) {
      const r: Registration = { target, handler, context: contexts[contexts.length - 1], remove: jest.fn() };
      registrations.push(r);
      return { context: r.context, remove: r.remove };
    },
  };
}


const tableColumns = ["Week ending", "Notes", LANE, OTHER];

/** A fresh workbook: table WeeklyRates (id {T1}) on Rates at B4:E60, and a sheet Spot. */
function newContext(): Mock {
  const weekly = {
    name: "WeeklyRates",
    id: "{T1}",
    onChanged: event("table:WeeklyRates"),
    range: { address: "Rates!B4:E60" },
    getRange(this: Mock) {
      return this.range;
    },
    columns: collection(tableColumns.map((name) => ({ name }))),
  };
  const data = {
    context: {
      workbook: {
        tables: {
          weekly,
          missing: { name: "" },
          getItemOrNullObject(this: Mock, name: string) {
            return name === "WeeklyRates" ? this.weekly : this.missing;
          },
          getItem(this: Mock, key: string) {
            if (placementFails) throw new Error("GeneralException");
            if (key !== "{T1}" && key !== "WeeklyRates") throw new Error("ItemNotFound");
            return this.weekly;
          },
        },
        worksheets: {
          spot: { name: "Spot", onChanged: event("sheet:Spot") },
          rates: { name: "Rates", onChanged: event("sheet:Rates") },
          missing: { name: "" },
          getItemOrNullObject(this: Mock, name: string) {
            if (name === "Spot") return this.spot;
            if (name === "Rates") return this.rates;
            return this.missing;
          },
        },
      },
    },
  };
  const mock = new OfficeMockObject(data) as Mock;
  const context = mock.context as Mock;
  const workbook = context.workbook as Mock;
  const tables = workbook.tables as Mock;
  const sheets = workbook.worksheets as Mock;
  (tables.weekly as Mock).isNullObject = false;
  (tables.missing as Mock).isNullObject = true;
  (sheets.spot as Mock).isNullObject = false;
  (sheets.rates as Mock).isNullObject = false;
  (sheets.missing as Mock).isNullObject = true;
  wireItems((tables.weekly as Mock).columns as Mock, tableColumns.length);
  return context;
}

async function run(a: unknown, b?: (context: unknown) => Promise<unknown>): Promise<unknown> {
  if (typeof a === "function") {
    runCalls.push({ withContext: null });
    const context = newContext();
    contexts.push(context);
    return (a as (context: unknown) => Promise<unknown>)(context);
  }
  runCalls.push({ withContext: a });
  return (b as (context: unknown) => Promise<unknown>)(a);
}

beforeEach(() => {
  registrations = [];
  contexts = [];
  runCalls = [];
  placementFails = false;
  (globalThis as unknown as { Excel: unknown }).Excel = { run };
});

afterEach(() => {
  delete (globalThis as unknown as { Excel?: unknown }).Excel;
});

const lane: DataSource = { kind: "table", table: "WeeklyRates", rates: LANE, dates: "Week ending" };
const other: DataSource = { kind: "table", table: "WeeklyRates", rates: OTHER, dates: null };
const spot: DataSource = { kind: "range", sheet: "Spot", ratesColumn: 2, datesColumn: 0, top: 1, header: true };
const gone: DataSource[] = [
  { kind: "table", table: "Rates2024", rates: LANE, dates: null },
  { kind: "range", sheet: "Old spot", ratesColumn: 1, datesColumn: null, top: 0, header: false },
];

function handlerFor(target: string): Handler {
  const found = registrations.filter((r) => r.target === target);
  expect(found).toHaveLength(1);
  return found[0].handler;
}

const tableChange = (address: string, changeType = "RangeEdited") => ({
  type: "TableChanged",
  address,
  changeType,
  tableId: "{T1}",
  worksheetId: "{S-Rates}",
  source: "Local",
});
const sheetChange = (address: string, changeType = "RangeEdited") => ({
  type: "WorksheetChanged",
  address,
  changeType,
  worksheetId: "{S-Spot}",
  source: "Local",
});

describe("watchSources", () => {
  it("registers one handler per table and per sheet of range sources, and none for what has gone", async () => {
    await watchSources([lane, other, lane, spot, ...gone], () => undefined);
    expect(registrations.map((r) => r.target).sort()).toEqual(["sheet:Spot", "table:WeeklyRates"]);
    // The table's own sheet is not watched: the table's event covers its cells.
    expect(registrations.some((r) => r.target === "sheet:Rates")).toBe(false);
    expect(runCalls).toEqual([{ withContext: null }]);
  });

  it("reports a table change only for the sources whose columns it touches", async () => {
    const changed: DataSource[] = [];
    await watchSources([lane, other, lane], (s) => changed.push(s));
    const onTable = handlerFor("table:WeeklyRates");

    await onTable(tableChange("D20")); // the Halden–Corvane rate of one week
    expect(changed).toEqual([lane]); // once, though the source was given twice

    changed.length = 0;
    await onTable(tableChange("E20"));
    expect(changed).toEqual([other]);

    changed.length = 0;
    await onTable(tableChange("C20")); // the notes column
    expect(changed).toEqual([]);

    changed.length = 0;
    await onTable(tableChange("B7")); // a week-ending date: the lane uses it, the other source has no dates
    expect(changed).toEqual([lane]);

    changed.length = 0;
    await onTable(tableChange("B61:E61", "RowInserted")); // next week's row added below the table
    expect(changed).toEqual([lane, other]);
  });

  it("reports a table change to every source on the table when the columns cannot be placed", async () => {
    const changed: DataSource[] = [];
    await watchSources([lane, other], (s) => changed.push(s));
    placementFails = true;
    await handlerFor("table:WeeklyRates")(tableChange("C20"));
    expect(changed).toEqual([lane, other]);
  });

  it("reports a sheet change only in the watched columns at or below the top row", async () => {
    const changed: DataSource[] = [];
    await watchSources([spot], (s) => changed.push(s));
    const onSheet = handlerFor("sheet:Spot");

    await onSheet(sheetChange("C40"));
    await onSheet(sheetChange("A41:C42")); // a pasted week
    await onSheet(sheetChange("3:3", "RowInserted"));
    expect(changed).toEqual([spot, spot, spot]);

    changed.length = 0;
    await onSheet(sheetChange("D40")); // another lane
    await onSheet(sheetChange("C1")); // above the header row
    await onSheet(sheetChange("B5:B9")); // between the dates and the rates
    expect(changed).toEqual([]);
  });

  it("removes every handler through the context it was added with, and reports nothing after", async () => {
    const changed: DataSource[] = [];
    const watch = await watchSources([lane, spot], (s) => changed.push(s));
    expect(registrations).toHaveLength(2);
    const registeredWith = contexts[0];
    await watch.stop();
    for (const r of registrations) expect(r.remove).toHaveBeenCalledTimes(1);
    expect(runCalls.slice(1)).toEqual([{ withContext: registeredWith }]);

    await handlerFor("sheet:Spot")(sheetChange("C40"));
    await handlerFor("table:WeeklyRates")(tableChange("D20"));
    expect(changed).toEqual([]);

    await watch.stop(); // a second stop has nothing left to remove
    for (const r of registrations) expect(r.remove).toHaveBeenCalledTimes(1);
  });

  it("asks nothing of Excel when there is nothing to watch", async () => {
    const watch = await watchSources([], () => undefined);
    await watch.stop();
    expect(runCalls).toEqual([]);
  });
});
