/**
 * The forecast log in the open workbook (core/record/log.ts): reading the "Fairlead Log" sheet
 * back into a grid from A1, and writing the rows an append plan adds below its last row.
 *
 * The log is the desk's once written, so the writer only ever writes the plan's rows, at the
 * plan's row, from column A: it never clears, moves or rewrites a row above. Before writing it
 * reads the target rows back and stops if anything has appeared there since the log was read
 * (someone typing while Publish ran), rather than write over it.
 */
import { LOG_COLUMNS, LOG_HEAD_ROWS, LOG_SHEET, LogRefused, appendStyles, readLog, type AppendPlan, type LogReading } from "../../core/record/log";
import type { Cell } from "../../core/report";
import type { CellStyle } from "../../core/present/sheets";
import { formatFor, writtenValue, type Written } from "../writePlan";

/** A used range's values placed in a grid from A1: blank rows above it, blank cells to its left. */
export function gridFromA1(values: unknown[][], rowIndex: number, columnIndex: number): unknown[][] {
  const pad = (): unknown[] => new Array<unknown>(columnIndex).fill("");
  const above = Array.from({ length: rowIndex }, (): unknown[] => []);
  return [...above, ...values.map((row) => (columnIndex > 0 ? [...pad(), ...row] : [...row]))];
}

/** The log sheet's cells from A1, or null when the book has no sheet of that name. */
export async function readLogCells(context: Excel.RequestContext): Promise<unknown[][] | null> {
  const ws = context.workbook.worksheets.getItemOrNullObject(LOG_SHEET);
  ws.load("name");
  await context.sync();
  if (ws.isNullObject) return null;
  const used = ws.getUsedRangeOrNullObject(true);
  used.load("values, rowIndex, columnIndex");
  await context.sync();
  if (used.isNullObject) return [];
  return gridFromA1(used.values as unknown[][], used.rowIndex, used.columnIndex);
}

/**
 * The log as it stands (its entries, rows changed by hand, where new rows go), or null when
 * the book has none yet. Throws LogRefused when a sheet of the log's name is not the log.
 * A refresh reads the log with this alone: it scores the log, it never adds to it.
 */
export async function readForecastLog(context: Excel.RequestContext): Promise<LogReading | null> {
  const grid = await readLogCells(context);
  return grid === null ? null : readLog(grid);
}

/** What goes into the cells of an append, worked out before any host call. */
export interface LogWrite {
  /** 0-based row of the first row written; column A. */
  start: number;
  /** Rectangular: plan.rows padded to the widest. */
  values: Written[][];
  formats: string[][];
  /** 0-based rows within `values` shown bold (the mark and the header of a new log). */
  bold: number[];
}

/**
 * The cells of an append plan: weeks as date serials shown as dates, rates to one decimal,
 * counts whole, text formatted as text (so "2026-12-03T09:00:00Z" and a row check such as
 * "00012e40" stay as written, not turned into a date or a number).
 */
export function logWrite(plan: AppendPlan, reading: LogReading | null): LogWrite {
  const styles = appendStyles(reading);
  const width = Math.max(0, ...plan.rows.map((r) => r.length));
  const values: Written[][] = [];
  const formats: string[][] = [];
  plan.rows.forEach((row, i) => {
    // The head of a new log (mark, lead, caution, header) has no column styles.
    const styled = i >= plan.firstEntry;
    const vs: Written[] = [];
    const fs: string[] = [];
    for (let c = 0; c < width; c++) {
      const style = styled ? (styles[c] ?? null) : null;
      const w = writtenValue((row[c] ?? null) as Cell, style);
      vs.push(w);
      fs.push(formatFor(w, style));
    }
    values.push(vs);
    formats.push(fs);
  });
  const bold = reading === null && plan.rows.length > 0 ? [0, LOG_HEAD_ROWS.length] : [];
  return { start: plan.start, values, formats, bold };
}

/** What an append did. */
export interface LogAppended {
  sheet: string;
  /** Log entries written (plan.added), and the sheet rows they went to (1-based, inclusive; 0 when none). */
  added: number;
  firstRow: number;
  lastRow: number;
  created: boolean;
}

function blank(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === "string" && v.trim() === "");
}

/**
 * Writes an append plan's rows into the log, creating the sheet for a first Publish. `reading`
 * is the log the plan was made from (null: there was none). Throws LogRefused, writing nothing,
 * when the sheet has changed under the plan: it appeared, vanished, or has cells where the new
 * rows go.
 */
export async function appendToLog(context: Excel.RequestContext, plan: AppendPlan, reading: LogReading | null): Promise<LogAppended> {
  const write = logWrite(plan, reading);
  const rows = write.values.length;
  const width = rows > 0 ? write.values[0].length : 0;
  // Nothing new to log (every forecast already there, or no dated series): no rows, and no
  // log started with a header alone.
  if (plan.added === 0 || rows === 0 || width === 0) return { sheet: LOG_SHEET, added: 0, firstRow: 0, lastRow: 0, created: false };

  const book = context.workbook;
  const found = book.worksheets.getItemOrNullObject(LOG_SHEET);
  found.load("name");
  await context.sync();
  let ws: Excel.Worksheet;
  let created = false;
  if (found.isNullObject) {
    if (reading !== null) throw new LogRefused(`${LOG_SHEET} was removed while Fairlead was publishing; nothing was added to it. Publish again to start a new log.`);
    ws = book.worksheets.add(LOG_SHEET);
    ws.tabColor = "#1F4E79";
    created = true;
  } else {
    if (reading === null) throw new LogRefused(`A sheet “${LOG_SHEET}” appeared while Fairlead was publishing; nothing was added to it. Publish again.`);
    ws = found;
    // The rows the plan writes must still be empty: someone may have typed below the log since it was read.
    const target = ws.getRangeByIndexes(write.start, 0, rows, width);
    target.load("values");
    await context.sync();
    const taken = (target.values as unknown[][]).findIndex((r) => r.some((v) => !blank(v)));
    if (taken >= 0) {
      throw new LogRefused(`Row ${write.start + taken + 1} of ${LOG_SHEET}, below its last forecast, was filled while Fairlead was publishing; nothing was added to the log. Publish again.`);
    }
  }

  const target = ws.getRangeByIndexes(write.start, 0, rows, width);
  // Formats first: a text cell formatted as text keeps what it says.
  target.numberFormat = write.formats;
  target.values = write.values;
  for (const r of write.bold) ws.getRangeByIndexes(write.start + r, 0, 1, r === 0 ? 1 : width).format.font.bold = true;
  if (created) {
    // Fit the columns to the header and the rows, not to the long lead beside the mark.
    ws.getRangeByIndexes(LOG_HEAD_ROWS.length, 0, rows - LOG_HEAD_ROWS.length, Math.min(width, LOG_COLUMNS.length)).format.autofitColumns();
  }
  await context.sync();
  const first = write.start + plan.firstEntry + 1;
  return { sheet: LOG_SHEET, added: plan.added, firstRow: plan.added > 0 ? first : 0, lastRow: plan.added > 0 ? first + plan.added - 1 : 0, created };
}
