/**
 * The Data section's model: the blocks read from the selection go through the core intake
 * (readWeekly), and the pane shows the core's own Data table (describeData), the same table
 * the functions and the batch runner render. No host calls and no DOM here.
 */
import { describeData } from "../core/analysis";
import type { ReportTable } from "../core/report";
import { InputError } from "../core/series/errors";
import { readWeekly } from "../core/series/intake";
import type { SelectionBlocks } from "./excel/readSelection";
import type { EventMarks } from "./excel/readSource";
import { eventWeeksFromMarks } from "../core/series/eventRegressors";
import type { WeeklySeries } from "../core/series/types";
import { cellName, columnIndex } from "../core/present/a1";

/** What the pane shows after a successful read. */
export interface DataView {
  /** The core's Data table for the series read. */
  table: ReportTable;
  /** Where the rates and (when found) the dates were read from. */
  ratesAddress: string;
  datesAddress: string | null;
  weeks: number;
  /** The weeks the source's event column marks (YYYY-MM-DD), and the column's name; null without one. */
  events: { weeks: string[]; column: string; address: string } | null;
}

export interface SheetOrigin {
  /** Sheet name as the address gives it (quotes kept), or "" when the address has none. */
  sheet: string;
  /** 0-based row and column of the block's top-left cell. */
  row: number;
  col: number;
}

/** Reads the top-left cell of an A1 address such as "Rates!C12:C40" or "'Lane book'!B2". */
export function originOf(address: string): SheetOrigin | null {
  const bang = address.lastIndexOf("!");
  const sheet = bang >= 0 ? address.slice(0, bang) : "";
  const m = /^\$?([A-Za-z]{1,3})\$?(\d+)/.exec(address.slice(bang + 1));
  if (!m) return null;
  return { sheet, row: Number(m[2]) - 1, col: columnIndex(m[1]) };
}

export { cellName };

/**
 * The intake on blocks read from the workbook, with cell offsets relative to the sheet so that
 * an error can point at the cell; `name` names a series whose block has no header.
 */
export function seriesOfBlocks(blocks: SelectionBlocks, name?: string): WeeklySeries {
  const rates = originOf(blocks.address);
  const dates = blocks.datesAddress ? originOf(blocks.datesAddress) : null;
  const series = readWeekly(blocks.values, {
    ...(blocks.dates ? { dates: blocks.dates } : {}),
    ...(rates ? { rowOffset: rates.row, colOffset: rates.col } : {}),
    ...(dates ? { dateRowOffset: dates.row, dateColOffset: dates.col } : {}),
  });
  return series.name === undefined && name !== undefined ? { ...series, name } : series;
}

/**
 * Runs the intake on the blocks read from the selection, with cell offsets relative to the
 * sheet so that an error can point at the cell. Throws the intake's InputError.
 */
export function summariseBlocks(blocks: SelectionBlocks & { events?: EventMarks }): DataView {
  const series = seriesOfBlocks(blocks);
  const weeks = blocks.events ? markedWeeks(blocks.events) : null;
  return {
    table: describeData(series),
    ratesAddress: blocks.address,
    datesAddress: blocks.datesAddress ?? null,
    weeks: series.values.length,
    events: weeks && blocks.events ? { weeks, column: blocks.events.name, address: blocks.events.address } : null,
  };
}

/**
 * The weeks an event column marks (core/series/eventRegressors.ts), with sheet offsets so a
 * cell that is not a mark, or a marked row without a date, is named.
 */
export function markedWeeks(events: EventMarks): string[] {
  const at = originOf(events.address);
  return eventWeeksFromMarks({
    marks: events.marks.map((r) => r[0]),
    dates: events.dates.map((r) => r[0]),
    what: `The event column “${events.name}”`,
    ...(at ? { rowOffset: at.row, markColOffset: at.col } : {}),
  });
}

/**
 * The sentence the pane shows when reading failed: the InputError's own sentence (whose row
 * numbers count from the top of the selection) followed by the sheet cell it points at, or a
 * plain sentence for a failure on Excel's side (never a stack trace).
 */
export function describeFailure(e: unknown, blocks?: SelectionBlocks): string {
  if (e instanceof InputError) {
    if (!e.cell) return e.message;
    const sheet = blocks ? originOf(blocks.address)?.sheet : undefined;
    const where = `${sheet ? `${sheet}!` : ""}${cellName(e.cell.row, e.cell.col)}`;
    return `${e.message} (Cell ${where}.)`;
  }
  const code = typeof e === "object" && e !== null ? (e as { code?: unknown }).code : undefined;
  if (code === "InvalidOperationInCellEditMode") {
    return "Excel is editing a cell. Press Enter or Esc in the sheet, then choose Read selection again.";
  }
  return "Excel did not return the selected cells. Choose Read selection again; if it keeps failing, close and reopen the pane.";
}
