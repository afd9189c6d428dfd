/**
 * Lists the workbook's Excel tables for the Data section's table picker, with a first guess
 * at which column holds the week-ending dates and which hold rates, so the picker can offer
 * sensible choices. The desk still picks; nothing here is final.
 *
 * Office.js calls only (two round trips for all tables); the guesses are plain functions below.
 */
import { isBlankCell, parseNumberText } from "../../core/series/cells";
import { ContextLike, holdsDates, isDateFormat } from "./readSelection";

export interface TableInfo {
  name: string;
  /** Name of the worksheet the table is on. */
  sheet: string;
  /** Column names, left to right. */
  columns: string[];
  /** Body rows (header and totals rows not counted). */
  rows: number;
  /** The first column that holds dates, or null. */
  datesColumn: string | null;
  /** The other columns whose filled cells are mostly rates. */
  ratesColumns: string[];
}

/** True when a number format shows a percentage: a week-on-week change, not a rate. */
function isPercentFormat(format: unknown): boolean {
  if (typeof format !== "string") return false;
  return /%/.test(format.replace(/"[^"]*"/g, "").replace(/\\./g, ""));
}

/**
 * More than half of the filled cells are rates: numbers not shown as dates or percentages,
 * or number text the intake reads ("USD 1,834"). A lane with the odd "n/a" stays a lane; a
 * remarks column with the odd figure does not become one.
 */
export function looksLikeRates(values: unknown[][], formats: unknown[][]): boolean {
  let filled = 0;
  let rates = 0;
  for (let r = 0; r < values.length; r++) {
    const v = values[r]?.[0];
    if (isBlankCell(v)) continue;
    filled++;
    const f = formats[r]?.[0];
    if (typeof v === "number" && !isDateFormat(f) && !isPercentFormat(f)) rates++;
    else if (typeof v === "string" && parseNumberText(v) !== undefined) rates++;
  }
  return rates > 0 && rates * 2 > filled;
}

function columnOf(cells: unknown[][], c: number): unknown[][] {
  return cells.map((row) => [row[c]]);
}

/** Guesses the dates column and the rate columns of one table's body. */
export function classifyColumns(
  columns: string[],
  values: unknown[][],
  formats: unknown[][],
): Pick<TableInfo, "datesColumn" | "ratesColumns"> {
  let datesAt = -1;
  for (let c = 0; c < columns.length && datesAt < 0; c++) {
    if (holdsDates(columnOf(values, c), columnOf(formats, c))) datesAt = c;
  }
  const ratesColumns = columns.filter(
    (_, c) => c !== datesAt && looksLikeRates(columnOf(values, c), columnOf(formats, c)),
  );
  return { datesColumn: datesAt < 0 ? null : columns[datesAt], ratesColumns };
}

/** The workbook's tables, in the order the workbook lists them. */
export async function listTables(context: ContextLike): Promise<TableInfo[]> {
  const tables = context.workbook.tables;
  tables.load("items/name");
  await context.sync();
  if (tables.items.length === 0) return [];

  // Column names come from the columns, not the header row, so a table with its header row
  // hidden is listed by the same names.
  const parts = tables.items.map((table) => {
    const sheet = table.worksheet;
    sheet.load("name");
    const columns = table.columns;
    columns.load("items/name");
    const body = table.getDataBodyRange();
    body.load("values, numberFormat");
    return { table, sheet, columns, body };
  });
  await context.sync();

  return parts.map(({ table, sheet, columns, body }) => {
    const names = columns.items.map((c) => c.name);
    const values = body.values as unknown[][];
    const formats = body.numberFormat as unknown[][];
    return {
      name: table.name,
      sheet: sheet.name,
      columns: names,
      rows: values.length,
      ...classifyColumns(names, values, formats),
    };
  });
}
