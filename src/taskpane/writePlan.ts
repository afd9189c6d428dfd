/**
 * What the pane puts into the cells of a managed sheet, worked out before any host call: the
 * values as Excel will hold them (ISO dates become date serials, text stays text), one number
 * format per cell, and the font and fill of each styled range. The batch runner gives the same
 * sheets the same look (src/batch/writeBook.ts); excel/writeSheets.ts hands this plan to the host.
 * Pure data: no Office, no DOM.
 */
import type { Cell } from "../core/report";
import { dateToExcelSerial, parseIsoDateText } from "../core/series/excelDate";
import type { CellStyle, ManagedSheet, SheetRange } from "../core/present/sheets";

/** A value as it goes into Range.values: a number, a text, or "" for an empty cell. */
export type Written = number | string;

export interface FontLook {
  bold?: boolean;
  italic?: boolean;
  size?: number;
  color?: string;
}

export interface StyledLook extends SheetRange {
  font?: FontLook;
  fill?: string;
  /** A thin line under the range (table headers). */
  underline?: string;
}

export interface WritePlan {
  /** Rectangular, sheet.cells' shape; row 0 column 0 is A1. */
  values: Written[][];
  formats: string[][];
  looks: StyledLook[];
}

/** Number formats by style; the batch runner uses the same ones. */
export const NUMBER_FORMATS: Partial<Record<CellStyle, string>> = {
  date: "yyyy-mm-dd",
  rate: "#,##0.0",
  ratio: "0.0000",
  share: "0.0",
  count: "0",
};

/** Text cells are formatted as text so that Excel keeps "2026-W48" or "1/2" as typed, not as a date. */
export const TEXT_FORMAT = "@";
export const GENERAL_FORMAT = "General";

const LOOKS: Partial<Record<CellStyle, Omit<StyledLook, keyof SheetRange>>> = {
  mark: { font: { bold: true, color: "#4A5A6A" } },
  stampLabel: { font: { bold: true } },
  seriesTitle: { font: { bold: true, size: 13, color: "#1F4E79" } },
  tableTitle: { font: { bold: true } },
  header: { font: { bold: true }, fill: "#E8EEF4", underline: "#8EA9C1" },
  note: { font: { italic: true, color: "#595959" } },
};

/** The style of every cell (the last range naming a cell wins, as in the batch writer). */
function styleGrid(sheet: ManagedSheet): (CellStyle | null)[][] {
  const grid = sheet.cells.map((row) => row.map((): CellStyle | null => null));
  for (const s of sheet.styles) {
    for (let r = s.row; r < s.row + s.rows && r < grid.length; r++) {
      for (let c = s.col; c < s.col + s.cols && c < sheet.width; c++) grid[r][c] = s.style;
    }
  }
  return grid;
}

/** One report cell as Excel will hold it. */
export function writtenValue(v: Cell, style: CellStyle | null): Written {
  if (v === null) return "";
  if (typeof v === "number") return Number.isFinite(v) ? v : "";
  if (style === "date") {
    const d = parseIsoDateText(v);
    if (d) return dateToExcelSerial(d);
  }
  return v;
}

/** The number format a written cell gets: text as text (blank as General), numbers by their style. */
export function formatFor(w: Written, style: CellStyle | null): string {
  return typeof w === "string" ? (w === "" ? GENERAL_FORMAT : TEXT_FORMAT) : ((style && NUMBER_FORMATS[style]) ?? GENERAL_FORMAT);
}

export function writePlan(sheet: ManagedSheet): WritePlan {
  const styles = styleGrid(sheet);
  const values: Written[][] = [];
  const formats: string[][] = [];
  sheet.cells.forEach((row, r) => {
    const vs: Written[] = [];
    const fs: string[] = [];
    row.forEach((cell, c) => {
      const style = styles[r][c];
      const w = writtenValue(cell, style);
      vs.push(w);
      fs.push(formatFor(w, style));
    });
    values.push(vs);
    formats.push(fs);
  });
  const looks: StyledLook[] = [];
  for (const s of sheet.styles) {
    const look = LOOKS[s.style];
    if (look) looks.push({ row: s.row, col: s.col, rows: s.rows, cols: s.cols, ...look });
  }
  return { values, formats, looks };
}
