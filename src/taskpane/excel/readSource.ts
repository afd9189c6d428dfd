/**
 * Reads the cells of a saved source (see ../source.ts) into the same blocks readSelection
 * gives, so the Data section runs the intake on them unchanged. Addresses are Excel's own
 * A1 addresses with the sheet, so the intake's errors point at sheet cells.
 *
 * Each existence check gets its own round trip before anything is asked of the object found,
 * so a table, column or sheet that has gone is reported in words instead of failing the batch.
 *
 * Office.js calls only; what the cells mean is decided by the core intake (readWeekly).
 */
import { InputError } from "../../core/series/errors";
import { isBlankCell } from "../../core/series/cells";
import { columnLetters } from "../../core/present/a1";
import { areasOf, columnAddress, isLabelText, RangeSource, TableSource, type DataSource } from "../source";
import type { ContextLike, SelectionBlocks } from "./readSelection";

export interface SourceBlocks extends SelectionBlocks {
  /** The series name: the header text or the table column's name; else the column letter. */
  name: string;
  /** The source's event column, when it names one: its marks below the header, with the dates of the same rows. */
  events?: EventMarks;
}

/**
 * An event column as read: every row below the header, including dated rows under the last rate
 * (a coming event week), so `marks` and `dates` may run longer than the rates.
 */
export interface EventMarks {
  marks: unknown[][];
  dates: unknown[][];
  /** Address of the marks (the sheet's own, so a problem names the cell). */
  address: string;
  /** The column's header, or its letter. */
  name: string;
}

/**
 * Reads a source. For a table: its rate column (header on top when the header reads as a
 * name) and its date column, without the totals row. For a range: from `top` down to the last
 * used cell of the rates column, dates row for row. `datesFrom` is "selection" whenever the
 * source names a date column, since the desk chose it.
 */
export async function readSource(context: ContextLike, source: DataSource): Promise<SourceBlocks> {
  return source.kind === "table" ? readTable(context, source) : readRange(context, source);
}

function column(values: unknown[][]): unknown[][] {
  return values.map((row) => [row[0]]);
}

async function readTable(context: ContextLike, s: TableSource): Promise<SourceBlocks> {
  const table = context.workbook.tables.getItemOrNullObject(s.table);
  table.load("name, showHeaders, showTotals");
  await context.sync();
  if (table.isNullObject) {
    throw new InputError("SHAPE", `The workbook has no table named ${s.table} any more; pick the table again.`);
  }

  const rates = table.columns.getItemOrNullObject(s.rates);
  rates.load("name");
  const dates = s.dates === null ? null : table.columns.getItemOrNullObject(s.dates);
  dates?.load("name");
  const eventsName = s.events ?? null;
  const events = eventsName === null ? null : table.columns.getItemOrNullObject(eventsName);
  events?.load("name");
  await context.sync();
  if (rates.isNullObject) throw missingColumn(s.table, s.rates, "rate");
  if (dates?.isNullObject) throw missingColumn(s.table, s.dates as string, "date");
  if (events?.isNullObject) throw missingColumn(s.table, eventsName as string, "event");
  if (events && dates === null) throw noDatesForEvents(events.name);

  const ratesRange = rates.getRange();
  ratesRange.load("address, values");
  const datesRange = dates?.getRange() ?? null;
  datesRange?.load("address, values");
  const eventsRange = events?.getRange() ?? null;
  eventsRange?.load("address, values");
  await context.sync();

  const all = column(ratesRange.values as unknown[][]);
  // A column's range holds the header (when shown), the body and the totals row (when
  // shown); a total is not a week. A header that reads as a number ("2025") is left out too,
  // or the intake would take it for a rate; the name is carried in `name` either way.
  let first = 0;
  let end = all.length - (table.showTotals ? 1 : 0);
  if (table.showHeaders && !isLabelText(all[0]?.[0])) first = 1;
  if (end <= first) end = first; // a table shows at least one body row; this is only a guard
  const values = all.slice(first, end);
  const address = trimmed(ratesRange.address, first, end);
  const blocks: SourceBlocks = { address, values, datesFrom: "none", name: rates.name };
  if (datesRange) {
    blocks.dates = column(datesRange.values as unknown[][]).slice(first, end);
    blocks.datesAddress = trimmed(datesRange.address, first, end);
    blocks.datesFrom = "selection";
  }
  if (eventsRange && datesRange && events) {
    // Every body row (the header, when shown, is the column's name; the totals row is no week).
    const top = table.showHeaders ? 1 : 0;
    const bottom = all.length - (table.showTotals ? 1 : 0);
    blocks.events = {
      marks: column(eventsRange.values as unknown[][]).slice(top, bottom),
      dates: column(datesRange.values as unknown[][]).slice(top, bottom),
      address: trimmed(eventsRange.address, top, Math.max(top, bottom)),
      name: events.name,
    };
  }
  return blocks;
}

function noDatesForEvents(name: string): InputError {
  return new InputError("SHAPE", `The event column “${name}” marks weeks by the dates beside it; choose the dates column too.`);
}

function missingColumn(table: string, name: string, which: "rate" | "date" | "event"): InputError {
  return new InputError("SHAPE", `The table ${table} has no column “${name}” any more; pick the ${which} column again.`);
}

/** The address of rows [first, end) of a one-column range, relative to its top. */
function trimmed(address: string, first: number, end: number): string {
  const area = areasOf(address)?.[0];
  if (!area) return address;
  if (first === 0 && area.top + end - 1 === area.bottom) return address;
  return columnAddress(address, area.left, area.top + first, Math.max(area.top + first, area.top + end - 1));
}

async function readRange(context: ContextLike, s: RangeSource): Promise<SourceBlocks> {
  const sheet = context.workbook.worksheets.getItemOrNullObject(s.sheet);
  sheet.load("name");
  await context.sync();
  if (sheet.isNullObject) {
    throw new InputError("SHAPE", `The workbook has no sheet named ${s.sheet} any more; select the rates again.`);
  }

  // The used range (values only, so formatted empty rows do not count) bounds the last row
  // with anything in it; the rates column itself may end earlier, which the trim below finds.
  const used = sheet.getUsedRangeOrNullObject(true);
  used.load("rowIndex, rowCount");
  await context.sync();
  const last = used.isNullObject ? -1 : used.rowIndex + used.rowCount - 1;
  const letter = columnLetters(s.ratesColumn);
  const empty = new InputError(
    "SHAPE",
    `Column ${letter} of ${s.sheet} is empty from row ${s.top + 1} down; select the rates again.`,
  );
  if (last < s.top) throw empty;

  const rows = last - s.top + 1;
  const ratesRange = sheet.getRangeByIndexes(s.top, s.ratesColumn, rows, 1);
  ratesRange.load("address, values");
  const datesRange = s.datesColumn === null ? null : sheet.getRangeByIndexes(s.top, s.datesColumn, rows, 1);
  datesRange?.load("address, values");
  const eventsColumn = s.eventsColumn ?? null;
  if (eventsColumn !== null && !datesRange) throw noDatesForEvents(`column ${columnLetters(eventsColumn)}`);
  const eventsRange = eventsColumn === null ? null : sheet.getRangeByIndexes(s.top, eventsColumn, rows, 1);
  eventsRange?.load("address, values");
  await context.sync();

  const all = ratesRange.values as unknown[][];
  // Dates are often filled in ahead for weeks not yet priced; the series ends with the last rate.
  let end = all.length;
  while (end > 0 && isBlankCell(all[end - 1]?.[0])) end--;
  if (end === 0) throw empty;

  const values = all.slice(0, end);
  const head = values[0]?.[0];
  const name = s.header && isLabelText(head) ? head.trim() : letter;
  const blocks: SourceBlocks = { address: trimmed(ratesRange.address, 0, end), values, datesFrom: "none", name };
  if (datesRange) {
    blocks.dates = (datesRange.values as unknown[][]).slice(0, end);
    blocks.datesAddress = trimmed(datesRange.address, 0, end);
    blocks.datesFrom = "selection";
  }
  if (eventsRange && datesRange && eventsColumn !== null) {
    // Down to the sheet's last used row, past the last rate: a dated coming week may be marked.
    const marks = eventsRange.values as unknown[][];
    const top = s.header ? 1 : 0;
    const head = marks[0]?.[0];
    blocks.events = {
      marks: marks.slice(top),
      dates: (datesRange.values as unknown[][]).slice(top),
      address: trimmed(eventsRange.address, top, Math.max(top, marks.length)),
      name: s.header && isLabelText(head) ? head.trim() : `column ${columnLetters(eventsColumn)}`,
    };
  }
  return blocks;
}
