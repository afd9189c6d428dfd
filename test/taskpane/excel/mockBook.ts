/**
 * A workbook that keeps its cells between Excel.run batches, over office-addin-mock: each run
 * gets a fresh request context whose worksheets, ranges and names are mock objects, so what
 * the code reads (values, used ranges, isNullObject) is readable only after load and sync, as
 * the mock enforces. What the code assigns (values, numberFormat, formulas, bold) is queued
 * and applied to the stored cells at the next sync, in the order it was assigned, and every
 * assignment is kept in `writes` for the tests to inspect.
 *
 * Enough of Excel for the managed-sheet writer (writeSheets.ts, with drawCharts replaced by
 * the test) and the forecast log (forecastLog.ts); a range's values are those of the store
 * when the range was made, which is all those writers need (they read before they write).
 */
import { OfficeMockObject } from "office-addin-mock";
import type { ExcelRun } from "../../../src/taskpane/excel/paneWorkbook";

export type Value = number | string | boolean;

export interface Rect {
  row: number;
  col: number;
  rows: number;
  cols: number;
}

export interface StoredSheet {
  name: string;
  values: Map<string, Value>;
  formats: Map<string, string>;
  bold: Set<string>;
}

/** One assignment the code made to a range: the sheet, the range, the property and what was assigned. */
export interface Assignment extends Rect {
  sheet: string;
  property: string;
  value: unknown;
}

type Mock = OfficeMockObject & Record<string, unknown>;

const key = (r: number, c: number): string => `${r},${c}`;
const RANGE_PROPS = new Set(["values", "numberFormat", "formulas", "formulasLocal", "formulasR1C1", "valuesAsJson"]);
const MOCK_ERRORS = /^Error, (property was not loaded|context\.sync\(\) was not called)$/;

function letters(text: string): number {
  let n = 0;
  for (const ch of text.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

/** "B3", "A1:C4" as a rectangle; "A:A" and "B:N" (whole columns) as null: formats only. */
function parseAddress(address: string): Rect | null {
  const cols = /^([A-Z]+):([A-Z]+)$/i.exec(address);
  if (cols) return null;
  const m = /^([A-Z]+)(\d+)(?::([A-Z]+)(\d+))?$/i.exec(address);
  if (!m) throw new Error(`mock book: address ${address} is not one it reads`);
  const row = Number(m[2]) - 1;
  const col = letters(m[1]);
  const row2 = m[4] ? Number(m[4]) - 1 : row;
  const col2 = m[3] ? letters(m[3]) : col;
  return { row, col, rows: row2 - row + 1, cols: col2 - col + 1 };
}

export class MockBook {
  readonly sheets = new Map<string, StoredSheet>();
  readonly names = new Map<string, string>();
  readonly settings = new Map<string, string>();
  readonly writes: Assignment[] = [];
  syncs = 0;
  runs = 0;
  active: string | null = null;

  constructor(readonly fileName = "desk-weekly.xlsx") {}

  /** A sheet as a person made it: `cells` from A1. */
  addSheet(name: string, cells: Value[][] = []): StoredSheet {
    const s: StoredSheet = { name, values: new Map(), formats: new Map(), bold: new Set() };
    this.sheets.set(name, s);
    cells.forEach((row, r) => row.forEach((v, c) => this.type(name, r, c, v)));
    return s;
  }

  /** Someone types `value` into a cell ("" clears it). */
  type(sheet: string, row: number, col: number, value: Value): void {
    const s = this.must(sheet);
    if (value === "") s.values.delete(key(row, col));
    else s.values.set(key(row, col), value);
  }

  /** The sheet's values from A1 to its last used row and column, "" where empty. */
  grid(sheet: string): Value[][] {
    const s = this.must(sheet);
    const used = this.usedRect(s);
    if (!used) return [];
    return Array.from({ length: used.row + used.rows }, (_, r) => Array.from({ length: used.col + used.cols }, (_, c) => s.values.get(key(r, c)) ?? ""));
  }

  /** The number format of a cell ("General" when none was set). */
  format(sheet: string, row: number, col: number): string {
    return this.must(sheet).formats.get(key(row, col)) ?? "General";
  }

  isBold(sheet: string, row: number, col: number): boolean {
    return this.must(sheet).bold.has(key(row, col));
  }

  /** Every assignment made to ranges of `sheet`. */
  writesTo(sheet: string): Assignment[] {
    return this.writes.filter((w) => w.sheet === sheet);
  }

  /** Excel.run over this book. */
  readonly run: ExcelRun = async (batch) => {
    this.runs++;
    return batch(this.context() as unknown as Excel.RequestContext);
  };

  private must(name: string): StoredSheet {
    const s = this.sheets.get(name);
    if (!s) throw new Error(`mock book: no sheet ${name}`);
    return s;
  }

  private usedRect(s: StoredSheet): Rect | null {
    let top = Infinity;
    let left = Infinity;
    let bottom = -1;
    let right = -1;
    for (const k of s.values.keys()) {
      const [r, c] = k.split(",").map(Number);
      top = Math.min(top, r);
      left = Math.min(left, c);
      bottom = Math.max(bottom, r);
      right = Math.max(right, c);
    }
    return bottom < 0 ? null : { row: top, col: left, rows: bottom - top + 1, cols: right - left + 1 };
  }

  /** A fresh request context: the book as it stands now. */
  private context(): Mock {
    const book = this;
    const made: Mock[] = [];
    const queue: (() => void)[] = [];
    const pending: { sheet: StoredSheet; rect: Rect; property: string; value: unknown }[] = [];
    const bolds: { sheet: StoredSheet; rect: Rect; font: Record<string, unknown>; done: boolean }[] = [];

    const mock = (data: Record<string, unknown>): Mock => {
      const m = new OfficeMockObject(data) as Mock;
      made.push(m);
      return m;
    };
    const nullObject = (data: Record<string, unknown>): Mock => {
      const m = mock(data);
      m.isNullObject = true;
      return m;
    };

    const range = (sheet: StoredSheet, rect: Rect): Mock => {
      const values = Array.from({ length: rect.rows }, (_, r) => Array.from({ length: rect.cols }, (_, c) => sheet.values.get(key(rect.row + r, rect.col + c)) ?? ""));
      const formats = Array.from({ length: rect.rows }, (_, r) => Array.from({ length: rect.cols }, (_, c) => sheet.formats.get(key(rect.row + r, rect.col + c)) ?? "General"));
      const m = mock({
        values,
        numberFormat: formats,
        rowIndex: rect.row,
        columnIndex: rect.col,
        rowCount: rect.rows,
        columnCount: rect.cols,
        format: { font: {}, fill: {}, columnWidth: 0, borders: { getItem: () => ({}) }, autofitColumns: () => undefined },
      });
      m.isNullObject = false;
      bolds.push({ sheet, rect, font: (m.format as Mock).font as Mock, done: false });
      // Assignments go through the proxy and are queued for the next sync; the mock's own
      // load bookkeeping (error texts) is not an assignment.
      return new Proxy(m, {
        set(target, prop, value) {
          if (typeof prop === "string" && RANGE_PROPS.has(prop) && !(typeof value === "string" && MOCK_ERRORS.test(value))) {
            pending.push({ sheet, rect, property: prop, value });
          }
          return Reflect.set(target, prop, value);
        },
      });
    };

    const columns = (): Record<string, unknown> => ({ format: { columnWidth: 0 } });

    const worksheet = (sheet: StoredSheet): Mock => {
      const m = mock({
        name: sheet.name,
        tabColor: "",
        getRange: (address?: string) => {
          if (address === undefined) {
            return {
              clear: () =>
                queue.push(() => {
                  sheet.values.clear();
                  sheet.formats.clear();
                  sheet.bold.clear();
                }),
            };
          }
          const rect = parseAddress(address);
          return rect ? range(sheet, rect) : columns();
        },
        getRangeByIndexes: (row: number, col: number, rows: number, cols: number) => range(sheet, { row, col, rows, cols }),
        getUsedRangeOrNullObject: () => {
          const used = book.usedRect(sheet);
          return used ? range(sheet, used) : nullObject({ values: [], rowIndex: 0, columnIndex: 0 });
        },
        activate: () => {
          book.active = sheet.name;
        },
      });
      m.isNullObject = false;
      return m;
    };

    const root = new OfficeMockObject({
      workbook: {
        name: book.fileName,
        worksheets: {
          getItemOrNullObject: (name: string) => {
            const s = book.sheets.get(name);
            return s ? worksheet(s) : nullObject({ name: "" });
          },
          getItem: (name: string) => worksheet(book.must(name)),
          add: (name: string) => {
            if (book.sheets.has(name)) throw new Error(`mock book: a sheet ${name} exists already`);
            return worksheet(book.addSheet(name));
          },
        },
        names: {
          getItemOrNullObject: (name: string) => {
            const formula = book.names.get(name);
            const m = mock({ name: formula === undefined ? "" : name, delete: () => queue.push(() => book.names.delete(name)) });
            m.isNullObject = formula === undefined;
            return new Proxy(m, {
              set(target, prop, value) {
                if (prop === "formula") queue.push(() => book.names.set(name, String(value)));
                return Reflect.set(target, prop, value);
              },
            });
          },
          add: (name: string, formula: string) => queue.push(() => book.names.set(name, formula)),
        },
        settings: {
          add: (k: string, v: unknown) => queue.push(() => book.settings.set(k, JSON.stringify(v))),
        },
      },
      sync: async () => {
        book.syncs++;
        for (const op of queue.splice(0)) op();
        for (const p of pending.splice(0)) book.apply(p.sheet, p.rect, p.property, p.value);
        for (const b of bolds) {
          if (b.done || b.font.bold !== true) continue;
          b.done = true;
          for (let r = 0; r < b.rect.rows; r++) for (let c = 0; c < b.rect.cols; c++) b.sheet.bold.add(key(b.rect.row + r, b.rect.col + c));
        }
        for (const m of made) await OfficeMockObject.prototype.sync.call(m);
        await OfficeMockObject.prototype.sync.call(root);
        // The mock settles nested properties a few promise turns later.
        await new Promise((resolve) => setImmediate(resolve));
      },
    }) as Mock;
    return root;
  }

  private apply(sheet: StoredSheet, rect: Rect, property: string, value: unknown): void {
    this.writes.push({ sheet: sheet.name, ...rect, property, value });
    if (!Array.isArray(value) || value.length !== rect.rows || value.some((row) => !Array.isArray(row) || row.length !== rect.cols)) {
      throw new Error(`mock book: ${property} of ${rect.rows} × ${rect.cols} cells on ${sheet.name} was given another shape`);
    }
    const grid = value as unknown[][];
    for (let r = 0; r < rect.rows; r++) {
      for (let c = 0; c < rect.cols; c++) {
        const v = grid[r][c];
        const k = key(rect.row + r, rect.col + c);
        if (property === "numberFormat") {
          if (typeof v !== "string") throw new Error(`mock book: number format ${String(v)} is not text`);
          sheet.formats.set(k, v);
        } else {
          if (typeof v !== "number" && typeof v !== "string" && typeof v !== "boolean") {
            throw new Error(`mock book: ${property} cannot hold ${v === null ? "null" : typeof v} (${sheet.name}, row ${rect.row + r + 1})`);
          }
          if (v === "") sheet.values.delete(k);
          else sheet.values.set(k, v);
        }
      }
    }
  }
}
