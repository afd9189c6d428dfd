/**
 * Reads the cells the Data section works on: the selected block of weekly rates and, when
 * there is one, the column of week-ending dates beside it.
 *
 * Accepted selections (kept simple on purpose):
 *   - one column of rates: the column just to its left is read as dates when it holds
 *     dates (date-formatted numbers or YYYY-MM-DD text, with at most a header above);
 *   - two columns: dates on the left, rates on the right.
 * Only the used part of the selection is read, so selecting whole columns is fine.
 *
 * Office.js calls only; what the cells mean is decided by the core intake (readWeekly).
 */
import { InputError } from "../../core/series/errors";
import { isBlankCell } from "../../core/series/cells";
import { readDateCell } from "../../core/series/excelDate";

/** The blocks read from the workbook, as Range.values gives them. */
export interface SelectionBlocks {
  /** Address of the rates block, e.g. "Rates!C1:C120". */
  address: string;
  /** One column of rate cells (a header cell on top is allowed). */
  values: unknown[][];
  /** The dates column, row for row with `values`, when one was found. */
  dates?: unknown[][];
  datesAddress?: string;
  /** Where the dates came from: the selection's left column, the column left of it, or none. */
  datesFrom: "selection" | "left" | "none";
}

/** The part of Excel.RequestContext this module uses (lets tests pass a mock). */
export type ContextLike = Pick<Excel.RequestContext, "workbook" | "sync">;

const EMPTY_MESSAGE =
  "The selected cells are empty. Select a column of weekly rates (with its dates to the left, if you have them).";

function tooWideMessage(columns: number): string {
  return `Select one column of weekly rates, or two columns with dates on the left and rates on the right; the selection has ${columns} columns with values.`;
}

/**
 * True when an Excel number format shows a date: it has a day or year token once quoted
 * text, bracketed sections ([$-409], [Red]) and escaped characters are removed. "m" alone
 * is not enough, as it also stands for minutes.
 */
export function isDateFormat(format: unknown): boolean {
  if (typeof format !== "string") return false;
  const bare = format
    .replace(/"[^"]*"/g, "")
    .replace(/\[[^\]]*\]/g, "")
    .replace(/\\./g, "")
    .trim();
  if (bare === "" || bare.toLowerCase() === "general") return false;
  return /[dy]/i.test(bare);
}

/** True when one cell holds a date as Range.values and Range.numberFormat report it. */
function isDateCell(value: unknown, format: unknown): boolean {
  if (typeof value === "number") return isDateFormat(format) && readDateCell(value).kind === "date";
  return readDateCell(value).kind === "date";
}

/**
 * True when a column holds dates: at least one date, and every other non-blank cell is a
 * date too, except a text header in the first row.
 */
export function holdsDates(values: unknown[][], formats: unknown[][]): boolean {
  let dates = 0;
  for (let r = 0; r < values.length; r++) {
    const v = values[r]?.[0];
    if (isBlankCell(v)) continue;
    if (isDateCell(v, formats[r]?.[0])) {
      dates++;
      continue;
    }
    if (r === 0 && typeof v === "string") continue; // a header such as "Week ending"
    return false;
  }
  return dates > 0;
}

function column(values: unknown[][], c: number): unknown[][] {
  return values.map((row) => [row[c]]);
}

/** Reads the selection (see the module comment). Two round trips to Excel at most. */
export async function readSelection(context: ContextLike): Promise<SelectionBlocks> {
  const used = context.workbook.getSelectedRange().getUsedRangeOrNullObject(true);
  used.load("address, values, numberFormat, columnCount, columnIndex");
  await context.sync();
  if (used.isNullObject) throw new InputError("SHAPE", EMPTY_MESSAGE);

  const values = used.values as unknown[][];
  if (used.columnCount === 2) {
    const left = used.getColumn(0);
    const right = used.getColumn(1);
    left.load("address");
    right.load("address");
    await context.sync();
    return {
      address: right.address,
      values: column(values, 1),
      dates: column(values, 0),
      datesAddress: left.address,
      datesFrom: "selection",
    };
  }
  if (used.columnCount !== 1) throw new InputError("SHAPE", tooWideMessage(used.columnCount));

  const blocks: SelectionBlocks = { address: used.address, values, datesFrom: "none" };
  if (used.columnIndex === 0) return blocks; // column A has nothing to its left

  const left = used.getOffsetRange(0, -1);
  left.load("address, values, numberFormat");
  await context.sync();
  const leftValues = left.values as unknown[][];
  if (holdsDates(leftValues, left.numberFormat as unknown[][])) {
    blocks.dates = leftValues;
    blocks.datesAddress = left.address;
    blocks.datesFrom = "left";
  }
  return blocks;
}
