/**
 * Publish in the batch runner: on top of a run's managed sheets, the published snapshot
 * (core/present/published.ts), the run's forecasts appended to the book's forecast log
 * (core/record/log.ts), and the track record rewritten from the whole log and the rates just
 * read (core/record/track.ts, core/present/trackSheet.ts).
 *
 * The log sheet is the desk's record: it is read with exceljs into a grid of plain values and
 * only the rows the append plans are written, below the last one. The sheet is never removed,
 * recreated or rewritten, so rows corrected or added by hand stay exactly as they are.
 */
import ExcelJS from "exceljs";
import type { Report } from "../core/analysis";
import type { PublishPart } from "../core/present/published";
import { publishSheets, type PublishSheets } from "../core/present/publishSheets";
import type { AnalysedSeries, CellStyle } from "../core/present/sheets";
import type { StampInput } from "../core/present/stamp";
import { TRACK_SHEET } from "../core/present/trackSheet";
import { LOG_SHEET, LogRefused, appendStyles, readLog, type AppendPlan, type LogReading } from "../core/record/log";
import { parseIsoDateText } from "../core/series/excelDate";
import { UsageError } from "./errors";
import { plainValue } from "./source";
import { setTabOrder, sheetNamed, styleCell, tabOrder } from "./writeBook";

export interface PublishOutcome extends PublishSheets {
  parts: PublishPart[];
  /** When Publish was made (the run's stamp time), ISO-8601 UTC. */
  publishedAt: string;
  /** Parts asked for that show nothing for any series, with the run setting that left them out. */
  empty: { part: PublishPart; why: string }[];
}

/** The table a part cannot go without, and why a run would have none. */
const PART_TABLE: Partial<Record<PublishPart, { table: keyof Report["tables"]; why: (r: Report) => string }>> = {
  season: { table: "weekFactors", why: (r) => (r.options.checks ? "the series are undated or under two years" : "they come with the checks, which were off") },
  checks: { table: "stationarity", why: (r) => (r.options.checks ? "they gave no tables" : "they were off") },
  backtest: { table: "backtest", why: () => "no backtest was run" },
};

function emptyParts(analysed: AnalysedSeries[], parts: PublishPart[]): { part: PublishPart; why: string }[] {
  const out: { part: PublishPart; why: string }[] = [];
  for (const part of parts) {
    const need = PART_TABLE[part];
    if (need && analysed.length > 0 && analysed.every((a) => a.report.tables[need.table] === undefined)) out.push({ part, why: need.why(analysed[0].report) });
  }
  return out;
}

/** The Publish sheets and the log append of an analysed run; `reading` is the book's log (null: none yet). */
export function publishRun(analysed: AnalysedSeries[], stamp: StampInput, parts: PublishPart[], reading: LogReading | null): PublishOutcome {
  const publishedAt = stamp.ranAt;
  return { parts, publishedAt, ...publishSheets(analysed, stamp, parts, reading, publishedAt), empty: emptyParts(analysed, parts) };
}

/**
 * A sheet's cells from A1 as plain values (dates as Date, numbers, text, booleans; rich text
 * and hyperlinks as their text, formulas as their result; null when empty), every row padded
 * to the same width. Reads without touching the sheet (exceljs's getCell would add cells).
 */
export function sheetGrid(ws: ExcelJS.Worksheet): unknown[][] {
  const rows: unknown[][] = [];
  let width = 0;
  for (let r = 1; r <= ws.rowCount; r++) {
    const values = ws.findRow(r)?.values;
    const cells: unknown[] = [];
    if (Array.isArray(values)) {
      // Row.values is 1-based and sparse.
      for (let c = 1; c < values.length; c++) cells.push(plainValue((values[c] ?? null) as ExcelJS.CellValue));
    }
    while (cells.length > 0 && cells[cells.length - 1] === null) cells.pop();
    width = Math.max(width, cells.length);
    rows.push(cells);
  }
  for (const row of rows) while (row.length < width) row.push(null);
  return rows;
}

/**
 * The book's forecast log, read; null when it has none. A sheet of that name that is not the
 * log (or has lost what the rows cannot be read without) is refused with the log's sentence.
 */
export function readBookLog(wb: ExcelJS.Workbook): LogReading | null {
  const ws = sheetNamed(wb, LOG_SHEET);
  if (!ws) return null;
  try {
    return readLog(sheetGrid(ws));
  } catch (e) {
    if (e instanceof LogRefused) throw new UsageError(e.message);
    throw e;
  }
}

/** Style of a head cell of a new log: the mark, the caution's label, the header row. */
function headStyle(row: number, col: number, headerRow: number): CellStyle | null {
  if (row === headerRow) return "header";
  if (col !== 0) return null;
  return row === 0 ? "mark" : "stampLabel";
}

/** Widths in characters of a new log's columns (Logged at, Series, the weeks, …). */
const LOG_WIDTHS = [22, 24, 12, 12, 8, 10, 12, 8, 12, 12, 8, 12, 12, 11];

/**
 * Writes the planned rows at plan.start (0-based) from column A, nothing else. A book without
 * a log gets the sheet, placed before the track record (so after the managed sheets and the
 * snapshot), with its head rows and header.
 */
export function writeLog(wb: ExcelJS.Workbook, plan: AppendPlan, reading: LogReading | null): void {
  let ws = sheetNamed(wb, LOG_SHEET);
  if ((ws === undefined) !== (reading === null)) throw new Error(`The log was read from a book ${reading ? "with" : "without"} ${LOG_SHEET} but is written to one ${ws ? "with" : "without"} it.`);
  if (!ws) {
    ws = wb.addWorksheet(LOG_SHEET, { properties: { tabColor: { argb: "FF4A5A6A" } }, views: [{ state: "frozen", ySplit: plan.firstEntry }] });
    LOG_WIDTHS.forEach((w, j) => ((ws as ExcelJS.Worksheet).getColumn(j + 1).width = w));
    const track = sheetNamed(wb, TRACK_SHEET);
    if (track) {
      const at = tabOrder(track);
      for (const other of wb.worksheets) if (other !== ws && tabOrder(other) >= at) setTabOrder(other, tabOrder(other) + 1);
      setTabOrder(ws, at);
    }
  }
  const styles = appendStyles(reading);
  plan.rows.forEach((row, i) => {
    const entry = i >= plan.firstEntry;
    row.forEach((v, c) => {
      if (v === null) return;
      const style = entry ? (styles[c] ?? null) : headStyle(i, c, plan.firstEntry - 1);
      const cell = (ws as ExcelJS.Worksheet).getCell(plan.start + i + 1, c + 1);
      cell.value = style === "date" && typeof v === "string" ? (parseIsoDateText(v) ?? v) : v;
      if (style) styleCell(cell, style);
    });
  });
}
