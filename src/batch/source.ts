/**
 * Where the rates come from: a block of columns with a header row, read from an .xlsx sheet
 * or table (exceljs) or from a CSV file, and the choice of the date column and the rate
 * columns in it. Cells are handed to the core's intake (readWeekly) as Excel would hand them
 * to the add-in, so the batch runner accepts and refuses exactly what the pane does.
 */
import * as fs from "fs";
import * as path from "path";
import ExcelJS from "exceljs";
import { readWeekly } from "../core/series/intake";
import { InputError, isInputError } from "../core/series/errors";
import { parseNumberText } from "../core/series/cells";
import { eventWeeksFromMarks } from "../core/series/eventRegressors";
import { readDateCell } from "../core/series/excelDate";
import type { DateSystem } from "../core/series/excelDate";
import type { WeeklySeries } from "../core/series/types";
import { cellName, columnIndex, columnLetters } from "../core/present/a1";
import { parseCsv } from "./csv";
import { UsageError } from "./errors";

/** A header row and the columns under it; columns[j][0] is the header cell. */
export interface Block {
  /** "desk-weekly.xlsx › Rates › WeeklyRates", for sentences and the stamp. */
  label: string;
  sheet: string | null;
  headers: string[];
  columns: unknown[][];
  /** 0-based sheet row and column of the header's first cell. */
  top: number;
  left: number;
  dateSystem: DateSystem;
}


/**
 * A cell's value as the add-in would see it: formulas by their result, rich text and
 * hyperlinks as their text, error values as their text ("#N/A"), null for an empty cell.
 */
export function plainValue(v: ExcelJS.CellValue): unknown {
  if (v === null || v === undefined) return null;
  if (v instanceof Date || typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  if (typeof v === "object") {
    if ("error" in v) return String(v.error);
    if ("richText" in v) return v.richText.map((r) => r.text).join("");
    if ("formula" in v || "sharedFormula" in v) {
      const r = (v as { result?: unknown }).result;
      if (r === undefined) return null;
      if (typeof r === "object" && r !== null && "error" in r) return String((r as { error: unknown }).error);
      return r;
    }
    if ("text" in v) {
      // A hyperlink; its text may itself be rich text.
      const t = (v as { text: unknown }).text;
      if (typeof t === "object" && t !== null && "richText" in t) return (t as ExcelJS.CellRichTextValue).richText.map((r) => r.text).join("");
      return String(t);
    }
  }
  return String(v);
}

function parseRef(ref: string): { top: number; left: number; bottom: number; right: number } {
  const m = /^\$?([A-Z]+)\$?(\d+)(?::\$?([A-Z]+)\$?(\d+))?$/i.exec(ref.trim());
  if (!m) throw new UsageError(`The table's range "${ref}" could not be read.`);
  const left = columnIndex(m[1]);
  const top = Number(m[2]) - 1;
  return { top, left, bottom: m[4] ? Number(m[4]) - 1 : top, right: m[3] ? columnIndex(m[3]) : left };
}

function tablesOf(ws: ExcelJS.Worksheet): { name: string; ref: string }[] {
  const out: { name: string; ref: string }[] = [];
  for (const t of ws.getTables() as unknown as [{ table: { name: string; tableRef: string } }][]) {
    const tbl = (Array.isArray(t) ? t[0] : t) as { table?: { name: string; tableRef: string; ref?: string } };
    if (tbl?.table) out.push({ name: tbl.table.name, ref: tbl.table.tableRef ?? tbl.table.ref ?? "" });
  }
  return out;
}

export interface BookChoice {
  sheet?: string;
  table?: string;
}

export async function loadBook(file: string): Promise<ExcelJS.Workbook> {
  if (!fs.existsSync(file)) throw new UsageError(`There is no file ${file}.`);
  if (!/\.xlsx$/i.test(file)) throw new UsageError(`${file} is not an .xlsx workbook; give an .xlsx file (or use forecast --csv for a CSV file).`);
  const wb = new ExcelJS.Workbook();
  try {
    await wb.xlsx.readFile(file);
  } catch (e) {
    throw new UsageError(`${file} could not be opened as an .xlsx workbook (${e instanceof Error ? e.message.split("\n")[0] : String(e)}).`);
  }
  return wb;
}

/** The block to read: the named table, else the named sheet's only table or its used range. */
export function bookBlock(wb: ExcelJS.Workbook, file: string, choice: BookChoice): Block {
  const base = path.basename(file);
  const sheets = wb.worksheets;
  let ws: ExcelJS.Worksheet | undefined;
  let tableName: string | undefined = choice.table;
  if (choice.sheet) {
    ws = wb.getWorksheet(choice.sheet);
    if (!ws) throw new UsageError(`${base} has no sheet "${choice.sheet}"; its sheets are ${sheets.map((s) => `"${s.name}"`).join(", ")}.`);
  } else if (choice.table) {
    ws = sheets.find((s) => tablesOf(s).some((t) => t.name.toLowerCase() === choice.table?.toLowerCase()));
    if (!ws) {
      const all = sheets.flatMap((s) => tablesOf(s).map((t) => `"${t.name}"`));
      throw new UsageError(`${base} has no table "${choice.table}"${all.length ? `; its tables are ${all.join(", ")}` : "; it has no tables"}.`);
    }
  } else {
    // The first sheet holding a table, else the first sheet.
    ws = sheets.find((s) => tablesOf(s).length > 0) ?? sheets[0];
    if (!ws) throw new UsageError(`${base} has no sheets.`);
    const ts = tablesOf(ws);
    if (ts.length === 1) tableName = ts[0].name;
  }
  const dateSystem: DateSystem = wb.properties?.date1904 ? 1904 : 1900;
  let area: { top: number; left: number; bottom: number; right: number };
  let label: string;
  if (tableName) {
    const t = tablesOf(ws).find((x) => x.name.toLowerCase() === tableName?.toLowerCase());
    if (!t) throw new UsageError(`Sheet "${ws.name}" of ${base} has no table "${tableName}".`);
    area = parseRef(t.ref);
    label = `${base} › ${ws.name} › ${t.name}`;
  } else {
    if (ws.actualRowCount === 0) throw new UsageError(`Sheet "${ws.name}" of ${base} is empty.`);
    let right = 0;
    let left = Number.MAX_SAFE_INTEGER;
    let top = -1;
    let bottom = -1;
    ws.eachRow({ includeEmpty: false }, (row, r) => {
      row.eachCell({ includeEmpty: false }, (cell, c) => {
        if (plainValue(cell.value) === null) return;
        if (top < 0) top = r - 1;
        bottom = r - 1;
        left = Math.min(left, c - 1);
        right = Math.max(right, c - 1);
      });
    });
    if (top < 0) throw new UsageError(`Sheet "${ws.name}" of ${base} is empty.`);
    area = { top, left, bottom, right };
    label = `${base} › ${ws.name}`;
  }
  const headers: string[] = [];
  const columns: unknown[][] = [];
  for (let c = area.left; c <= area.right; c++) {
    const col: unknown[] = [];
    for (let r = area.top; r <= area.bottom; r++) col.push(plainValue(ws.getCell(r + 1, c + 1).value));
    columns.push(col);
    headers.push(col[0] === null || col[0] === undefined ? `column ${columnLetters(c)}` : String(col[0]).trim());
  }
  return { label, sheet: ws.name, headers, columns, top: area.top, left: area.left, dateSystem };
}

/** A CSV file as a block: the first line is the header; cells stay text for the intake to read. */
export function csvBlock(file: string): Block {
  if (!fs.existsSync(file)) throw new UsageError(`There is no file ${file}.`);
  const rows = parseCsv(fs.readFileSync(file, "utf8"));
  if (rows.length === 0) throw new UsageError(`${file} is empty.`);
  const width = Math.max(...rows.map((r) => r.length));
  const columns: unknown[][] = [];
  for (let c = 0; c < width; c++) columns.push(rows.map((r) => (c < r.length && r[c].trim() !== "" ? r[c] : null)));
  const headers = columns.map((col, c) => (typeof col[0] === "string" ? col[0].trim() : `column ${c + 1}`));
  return { label: path.basename(file), sheet: null, headers, columns, top: 0, left: 0, dateSystem: 1900 };
}

function findColumn(block: Block, name: string, what: string): number {
  const want = name.trim().toLowerCase();
  let j = block.headers.findIndex((h) => h.toLowerCase() === want);
  if (j < 0 && /^[A-Z]{1,3}$/i.test(name.trim()) && block.sheet !== null) {
    // A column letter of the sheet, as a desk might say "column C".
    const letter = name.trim().toUpperCase();
    j = block.headers.findIndex((_, k) => columnLetters(block.left + k) === letter);
  }
  if (j < 0) {
    throw new UsageError(`${block.label} has no ${what} column "${name}"; its columns are ${block.headers.map((h) => `"${h}"`).join(", ")}.`);
  }
  return j;
}

/** The share of a column's filled cells (below the header) that pass `test`. */
function share(block: Block, j: number, test: (v: unknown) => boolean): number {
  let passed = 0;
  let filled = 0;
  for (let i = 1; i < block.columns[j].length; i++) {
    const v = block.columns[j][i];
    if (v === null) continue;
    filled++;
    if (test(v)) passed++;
  }
  return filled === 0 ? 0 : passed / filled;
}

function dateShare(block: Block, j: number): number {
  return share(block, j, (v) => readDateCell(v, block.dateSystem).kind === "date");
}

function numberShare(block: Block, j: number): number {
  // Numeric text as the intake reads it (separators, currency codes): cells.ts.
  return share(block, j, (v) => typeof v === "number" || (typeof v === "string" && parseNumberText(v) !== undefined));
}

export interface ColumnChoice {
  columns?: string[];
  dates?: string;
  /** Header (or letter) of a column of event marks: never a rate column. */
  events?: string;
}

/** The date column: the one named, or the first column of dates (null when there is none). */
export function dateColumn(block: Block, name: string | undefined): number | null {
  if (name) return findColumn(block, name, "date");
  for (let j = 0; j < block.columns.length; j++) if (dateShare(block, j) >= 0.9) return j;
  return null;
}

/** The date column (given, or the first column of dates) and the rate columns (given, or every other numeric one). */
export function chooseColumns(block: Block, choice: ColumnChoice): { dates: number | null; rates: number[] } {
  const dates = dateColumn(block, choice.dates);
  const events = choice.events ? findColumn(block, choice.events, "event") : null;
  if (events !== null && events === dates) throw new UsageError(`"${block.headers[events]}" is the date column; it cannot also be the event column.`);
  let rates: number[];
  if (choice.columns && choice.columns.length > 0) {
    rates = choice.columns.map((c) => findColumn(block, c, "rate"));
    if (dates !== null && rates.includes(dates)) throw new UsageError(`"${block.headers[dates]}" is the date column; it cannot also be a rate column.`);
    if (events !== null && rates.includes(events)) throw new UsageError(`"${block.headers[events]}" is the event column; it cannot also be a rate column.`);
  } else {
    rates = [];
    for (let j = 0; j < block.columns.length; j++) if (j !== dates && j !== events && numberShare(block, j) >= 0.9) rates.push(j);
    if (rates.length === 0) throw new UsageError(`${block.label} has no column of rates; name one with --column.`);
  }
  return { dates, rates };
}

/** An intake error of a block, led by `lead` and followed by the sheet cell (or the file's line) it points at. */
function inBlock(block: Block, lead: string, e: InputError): InputError {
  const where = e.cell && block.sheet !== null ? ` (cell ${block.sheet}!${cellName(e.cell.row, e.cell.col)})` : e.cell ? ` (line ${e.cell.row + 1} of the file)` : "";
  return new InputError(e.code, `${lead}: ${e.message}${where}`, e.cell);
}

/**
 * The event weeks a column of marks names (core/series/eventRegressors.ts): the dates, in the
 * date column, of its rows marked 1, x or TRUE; rows below the last rate count when dated. A
 * problem names the cell.
 */
export function eventColumnWeeks(block: Block, name: string, dates: number | null): string[] {
  const j = findColumn(block, name, "event");
  if (dates === null) throw new UsageError(`The event column "${block.headers[j]}" needs a date column beside it; name it with --dates.`);
  try {
    return eventWeeksFromMarks({
      marks: block.columns[j].slice(1),
      dates: block.columns[dates].slice(1),
      what: `The event column "${block.headers[j]}"`,
      dateSystem: block.dateSystem,
      rowOffset: block.top + 1,
      markColOffset: block.left + j,
    });
  } catch (e) {
    if (!isInputError(e)) throw e;
    throw inBlock(block, block.label, e);
  }
}

/** One rate column through the core's intake; an InputError gets the column and cell named. */
export function readSeries(block: Block, rate: number, dates: number | null): WeeklySeries {
  try {
    const series = readWeekly(
      block.columns[rate].map((v) => [v]),
      {
        header: true,
        dates: dates === null ? undefined : block.columns[dates].map((v) => [v]),
        rowOffset: block.top,
        colOffset: block.left + rate,
        dateColOffset: dates === null ? undefined : block.left + dates,
        positive: false,
        dateSystem: block.dateSystem,
      },
    );
    return { ...series, name: block.headers[rate] };
  } catch (e) {
    if (!isInputError(e)) throw e;
    throw inBlock(block, `${block.label}, column "${block.headers[rate]}"`, e);
  }
}
