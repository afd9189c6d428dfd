/**
 * listTables against office-addin-mock. The mock answers a property only after it was loaded
 * and the context synced, so these tests also check what the code loads. The mock has no
 * collections: a collection here is an object whose children are mocks, with a load() that
 * passes "items/…" on to each child, as Office.js does, and an `items` array of the children.
 */
import { OfficeMockObject } from "office-addin-mock";

import { childCollection as collection, wireItems, type Data, type Mock } from "./mockCollection";
import type { ContextLike } from "../../../src/taskpane/excel/readSelection";
import { classifyColumns, listTables, looksLikeRates } from "../../../src/taskpane/excel/tables";

type Cells = unknown[][];

const DATE_FMT = "dd/mm/yyyy";
// Fridays from 2025-01-03 (Excel serial 45660).
const serials = [45660, 45667, 45674, 45681];

function tableData(name: string, sheet: string, columns: string[], values: Cells, numberFormat: Cells): Data {
  return {
    name,
    worksheet: { name: sheet },
    columns: collection(columns.map((c) => ({ name: c }))),
    body: { values, numberFormat },
    getDataBodyRange(this: Mock) {
      return this.body;
    },
  };
}

function workbook(tables: Data[]): { context: ContextLike; syncs: jest.SpyInstance } {
  const mock = new OfficeMockObject({ context: { workbook: { tables: collection(tables) } } }) as Mock;
  const context = mock.context as Mock;
  const tablesMock = (context.workbook as Mock).tables as Mock;
  wireItems(tablesMock, tables.length);
  tables.forEach((_, i) => {
    const t = tablesMock[`item${i}`] as Mock;
    wireItems(t.columns as Mock, Object.keys(tables[i].columns as Data).filter((k) => k.startsWith("item")).length);
  });
  const syncs = jest.spyOn(context as unknown as { sync: () => Promise<void> }, "sync");
  return { context: context as unknown as ContextLike, syncs };
}

const weekly = tableData(
  "WeeklyRates",
  "Rates",
  ["Week ending", "Halden–Corvane FEU", "Ostrava–Pellan TEU", "Change", "Remarks"],
  serials.map((s, r) => [s, 1834.2 + r * 10, r === 2 ? "n/a" : `USD ${2100 + r}`, 0.012, r === 1 ? "GRI 1 Feb" : ""]),
  serials.map(() => [DATE_FMT, "#,##0.00", "General", "0.0%", "General"]),
);
const bunker = tableData(
  "Bunker",
  "Costs",
  ["Port", "VLSFO"],
  [
    ["Rotterdam", 590],
    ["Singapore", 610],
  ],
  [
    ["General", "0"],
    ["General", "0"],
  ],
);

describe("listTables", () => {
  it("lists every table with its sheet, columns, and guessed date and rate columns, in two round trips", async () => {
    const { context, syncs } = workbook([weekly, bunker]);
    const tables = await listTables(context);
    expect(tables).toEqual([
      {
        name: "WeeklyRates",
        sheet: "Rates",
        columns: ["Week ending", "Halden–Corvane FEU", "Ostrava–Pellan TEU", "Change", "Remarks"],
        rows: 4,
        datesColumn: "Week ending",
        ratesColumns: ["Halden–Corvane FEU", "Ostrava–Pellan TEU"],
      },
      { name: "Bunker", sheet: "Costs", columns: ["Port", "VLSFO"], rows: 2, datesColumn: null, ratesColumns: ["VLSFO"] },
    ]);
    expect(syncs).toHaveBeenCalledTimes(2);
  });

  it("answers an empty list in one round trip when the workbook has no tables", async () => {
    const { context, syncs } = workbook([]);
    expect(await listTables(context)).toEqual([]);
    expect(syncs).toHaveBeenCalledTimes(1);
  });
});

describe("column guesses", () => {
  const general = (n: number): Cells => Array.from({ length: n }, () => ["General"]);

  it("takes a column as rates when more than half of its filled cells are rates", () => {
    expect(looksLikeRates([[1834], [""], ["n/a"], [1850]], general(4))).toBe(true);
    expect(looksLikeRates([[1834], ["n/a"]], general(2))).toBe(false); // half is not more than half
    expect(looksLikeRates([["USD 1,834"], ["1,850 EUR"]], general(2))).toBe(true);
    expect(looksLikeRates([[""], [null]], general(2))).toBe(false);
  });

  it("does not take dates or percentages for rates", () => {
    expect(looksLikeRates([[45660], [45667]], [[DATE_FMT], [DATE_FMT]])).toBe(false);
    expect(looksLikeRates([[0.012], [-0.03]], [["0.0%"], ["0.00%"]])).toBe(false);
    expect(looksLikeRates([[12], [14]], [['0" %pts"'], ['0" %pts"']])).toBe(true); // % inside quoted text
  });

  it("picks the first dates column and leaves it out of the rates", () => {
    const values = serials.map((s, r) => [1800 + r, s, s + 3]);
    const formats = serials.map(() => ["0", DATE_FMT, DATE_FMT]);
    expect(classifyColumns(["Lane", "Week ending", "Sailing"], values, formats)).toEqual({
      datesColumn: "Week ending",
      ratesColumns: ["Lane"],
    });
  });
});
