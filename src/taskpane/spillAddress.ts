/**
 * A1 address arithmetic for following spill ranges with chart series (excel/spillCharts.ts):
 * reading the addresses Excel gives for a series' source ("'Sheet name'!$C$5:$C$60"),
 * intersecting rectangles, and stretching a one-column source to a spill's new last row.
 * Pure: no Office calls.
 */
import { columnIndex as a1ColumnIndex, columnLetters as a1ColumnLetters } from "../core/present/a1";
import { LAST_COLUMN, LAST_ROW } from "./source";

/** A rectangle of cells, 0-based and inclusive. `sheet` is null when the address has none. */
export interface CellRect {
  sheet: string | null;
  firstRow: number;
  firstCol: number;
  lastRow: number;
  lastCol: number;
}

/** The sheet's limits, as the sources use them (source.ts). */
export { LAST_ROW, LAST_COLUMN as LAST_COL } from "./source";

const CELL = /^\$?([A-Za-z]{1,3})\$?(\d{1,7})$/;

/** "A" → 0, "Z" → 25, "AA" → 26 (core/present/a1.ts); null for letters past column XFD. */
export function columnIndex(letters: string): number | null {
  const n = a1ColumnIndex(letters);
  return n >= 0 && n <= LAST_COLUMN ? n : null;
}

/** 0 → "A", 26 → "AA" (core/present/a1.ts). */
export const columnLetters = a1ColumnLetters;

function parseCell(text: string): { row: number; col: number } | null {
  const m = CELL.exec(text);
  if (!m) return null;
  const col = columnIndex(m[1]);
  const row = Number(m[2]) - 1;
  if (col === null || row < 0 || row > LAST_ROW) return null;
  return { row, col };
}

/** Splits "'It''s here'!A1:B2" into the sheet name and the cell part; the sheet is null when absent. */
function splitSheet(text: string): { sheet: string | null; cells: string } | null {
  if (text.startsWith("'")) {
    let name = "";
    let i = 1;
    for (; i < text.length; i++) {
      if (text[i] === "'") {
        if (text[i + 1] === "'") {
          name += "'";
          i++;
          continue;
        }
        break;
      }
      name += text[i];
    }
    if (i >= text.length || text[i + 1] !== "!" || name === "") return null;
    return { sheet: name, cells: text.slice(i + 2) };
  }
  const bang = text.lastIndexOf("!");
  if (bang < 0) return { sheet: null, cells: text };
  const sheet = text.slice(0, bang);
  // Unquoted sheet names cannot hold spaces or brackets: anything else is not a plain address
  // (a workbook reference, an external link).
  if (sheet === "" || /[\s'[\]!]/.test(sheet)) return null;
  return { sheet, cells: text.slice(bang + 1) };
}

/**
 * Parses one rectangular A1 address, with or without a sheet and "$" marks, and with the
 * leading "=" a formula-style source carries. Anything else (several areas, whole columns,
 * array constants, names, other workbooks) gives null: those are not followed.
 */
export function parseAddress(address: string): CellRect | null {
  const text = address.trim().replace(/^=/, "");
  const parts = splitSheet(text);
  if (!parts) return null;
  const [a, b, extra] = parts.cells.split(":");
  if (extra !== undefined || a === undefined) return null;
  const start = parseCell(a);
  const end = b === undefined ? start : parseCell(b);
  if (!start || !end) return null;
  return {
    sheet: parts.sheet,
    firstRow: Math.min(start.row, end.row),
    firstCol: Math.min(start.col, end.col),
    lastRow: Math.max(start.row, end.row),
    lastCol: Math.max(start.col, end.col),
  };
}

/** A sheet name as an address needs it: quoted (quotes doubled) unless it is a plain word. */
export function quoteSheet(name: string): string {
  const plain = /^[A-Za-z_][A-Za-z0-9_.]*$/.test(name) && !CELL.test(name) && !/^R\d*C\d*$/i.test(name);
  return plain ? name : `'${name.replace(/'/g, "''")}'`;
}

/** The cells part, absolute as chart sources are: "$C$5:$C$61", or "$C$5" for one cell. */
export function localAddress(r: CellRect): string {
  const cell = (row: number, col: number): string => `$${columnLetters(col)}$${row + 1}`;
  const start = cell(r.firstRow, r.firstCol);
  return r.firstRow === r.lastRow && r.firstCol === r.lastCol ? start : `${start}:${cell(r.lastRow, r.lastCol)}`;
}

/** "'Sheet name'!$C$5:$C$61"; without the sheet part when the rectangle has none. */
export function formatAddress(r: CellRect): string {
  return r.sheet === null ? localAddress(r) : `${quoteSheet(r.sheet)}!${localAddress(r)}`;
}

function sameSheet(a: CellRect, b: CellRect): boolean {
  return a.sheet === null || b.sheet === null || a.sheet.toLowerCase() === b.sheet.toLowerCase();
}

/** The cells two rectangles share, null when none (or on different sheets). Keeps a's sheet. */
export function intersect(a: CellRect, b: CellRect): CellRect | null {
  if (!sameSheet(a, b)) return null;
  const r: CellRect = {
    sheet: a.sheet ?? b.sheet,
    firstRow: Math.max(a.firstRow, b.firstRow),
    firstCol: Math.max(a.firstCol, b.firstCol),
    lastRow: Math.min(a.lastRow, b.lastRow),
    lastCol: Math.min(a.lastCol, b.lastCol),
  };
  return r.firstRow <= r.lastRow && r.firstCol <= r.lastCol ? r : null;
}

export function containsCell(r: CellRect, row: number, col: number): boolean {
  return row >= r.firstRow && row <= r.lastRow && col >= r.firstCol && col <= r.lastCol;
}

export function sameRect(a: CellRect, b: CellRect): boolean {
  return sameSheet(a, b) && a.firstRow === b.firstRow && a.firstCol === b.firstCol && a.lastRow === b.lastRow && a.lastCol === b.lastCol;
}

/**
 * The source a series should read now that its spill is `spill`: the same column from the
 * source's first row down to the spill's last row (or, for a one-row source, the same row
 * out to the spill's last column). Null when the source is not one column or one row, or its
 * first cell is not inside the spill. A one-cell source is taken as a column: spills of the
 * worksheet functions grow downwards, a week a row.
 */
export function followSpill(source: CellRect, spill: CellRect): CellRect | null {
  if (!sameSheet(source, spill) || !containsCell(spill, source.firstRow, source.firstCol)) return null;
  const column = source.firstCol === source.lastCol;
  const row = source.firstRow === source.lastRow;
  if (!column && !row) return null;
  const reach: CellRect = column
    ? { ...source, lastRow: LAST_ROW }
    : { ...source, lastCol: LAST_COLUMN };
  return intersect(reach, spill);
}
