/**
 * Writes the managed sheets (core/present/sheets.ts), and on Publish the published snapshot and
 * the track record, into an exceljs workbook as plain values with their stamp, the workbook
 * names over the outlook, and the charts as embedded images. Only Fairlead's own sheets are
 * touched: a sheet of the same name that does not carry the managed mark in A1 is the user's,
 * and the write stops with a sentence instead. A sheet replaced keeps its place among the tabs.
 */
import * as fs from "fs";
import * as path from "path";
import ExcelJS from "exceljs";
import JSZip from "jszip";
import type { CellStyle, ManagedSheet } from "../core/present/sheets";
import { MANAGED_SHEETS } from "../core/present/sheets";
import { MANAGED_MARK } from "../core/present/stamp";
import { columnLetters } from "../core/present/a1";
import { parseIsoDateText } from "../core/series/excelDate";
import { UsageError } from "./errors";

const FORMATS: Partial<Record<CellStyle, string>> = {
  date: "yyyy-mm-dd",
  rate: "#,##0.0",
  ratio: "0.0000",
  share: "0.0",
  count: "0",
};

export function styleCell(cell: ExcelJS.Cell, style: CellStyle): void {
  const fmt = FORMATS[style];
  if (fmt) cell.numFmt = fmt;
  switch (style) {
    case "mark":
      cell.font = { bold: true, color: { argb: "FF4A5A6A" } };
      break;
    case "stampLabel":
      cell.font = { bold: true };
      break;
    case "seriesTitle":
      cell.font = { bold: true, size: 13, color: { argb: "FF1F4E79" } };
      break;
    case "tableTitle":
      cell.font = { bold: true };
      break;
    case "header":
      cell.font = { bold: true };
      cell.fill = { type: "pattern", pattern: "solid", fgColor: { argb: "FFE8EEF4" } };
      cell.border = { bottom: { style: "thin", color: { argb: "FF8EA9C1" } } };
      break;
    case "note":
      cell.font = { italic: true, color: { argb: "FF595959" } };
      break;
    default:
      break;
  }
}

function quoteSheet(name: string): string {
  return `'${name.replace(/'/g, "''")}'`;
}

function absolute(row: number, col: number): string {
  return `$${columnLetters(col)}$${row + 1}`;
}

/** The sheet of that name, matched as Excel matches sheet names: without regard to case. */
export function sheetNamed(wb: ExcelJS.Workbook, name: string): ExcelJS.Worksheet | undefined {
  const want = name.toLowerCase();
  return wb.worksheets.find((ws) => ws.name.toLowerCase() === want);
}

/** The four managed sheets' names: what `run` replaces. */
export const RUN_SHEETS: string[] = MANAGED_SHEETS.map((s) => s.name);

/**
 * Refuses when a sheet named as one of `names` (default: the four managed sheets) exists that
 * Fairlead did not write.
 */
export function checkManagedNames(wb: ExcelJS.Workbook, names: readonly string[] = RUN_SHEETS): void {
  for (const name of names) {
    const ws = sheetNamed(wb, name);
    if (ws && ws.getCell(1, 1).value !== MANAGED_MARK) {
      throw new UsageError(
        `The book already has a sheet "${ws.name}" that Fairlead did not write (its A1 is not "${MANAGED_MARK}"); rename that sheet so nothing of yours is overwritten.`,
      );
    }
  }
}

function writeSheet(wb: ExcelJS.Workbook, sheet: ManagedSheet, images: Map<string, Uint8Array>, names: DefinedNames): ExcelJS.Worksheet {
  const ws = wb.addWorksheet(sheet.name, { properties: { tabColor: { argb: "FF1F4E79" } } });
  const styleAt = new Map<string, CellStyle>();
  for (const s of sheet.styles) {
    for (let r = s.row; r < s.row + s.rows; r++) for (let c = s.col; c < s.col + s.cols; c++) styleAt.set(`${r},${c}`, s.style);
  }
  sheet.cells.forEach((row, r) => {
    row.forEach((v, c) => {
      if (v === null) return;
      const style = styleAt.get(`${r},${c}`);
      const cell = ws.getCell(r + 1, c + 1);
      if (style === "date" && typeof v === "string") cell.value = parseIsoDateText(v) ?? v;
      else cell.value = typeof v === "number" && !Number.isFinite(v) ? null : v;
      if (style) styleCell(cell, style);
    });
  });
  // Widths in characters; 14 is the CELL_PX.width the layout counts chart columns by.
  ws.getColumn(1).width = 30;
  const last = Math.max(sheet.width, ...sheet.charts.map((c) => c.col + c.widthCols));
  for (let c = 2; c <= last; c++) ws.getColumn(c).width = 14;
  for (const n of sheet.names) {
    const loc = `${quoteSheet(sheet.name)}!${absolute(n.row, n.col)}${n.rows > 1 || n.cols > 1 ? `:${absolute(n.row + n.rows - 1, n.col + n.cols - 1)}` : ""}`;
    names.add(loc, n.name);
  }
  for (const ch of sheet.charts) {
    const png = images.get(ch.spec.id);
    if (!png) continue;
    const id = wb.addImage({ buffer: Buffer.from(png) as unknown as ExcelJS.Buffer, extension: "png" });
    ws.addImage(id, { tl: { col: ch.col, row: ch.row }, ext: { width: ch.widthPx, height: ch.heightPx } });
  }
  return ws;
}

/** exceljs orders the tabs by each worksheet's order number, which its typings leave out. */
type Ordered = { orderNo: number };

export function tabOrder(ws: ExcelJS.Worksheet): number {
  return (ws as unknown as Ordered).orderNo;
}

export function setTabOrder(ws: ExcelJS.Worksheet, orderNo: number): void {
  (ws as unknown as Ordered).orderNo = orderNo;
}

/** A worksheet's pictures as exceljs keeps them (its typings leave them out): an index into the book's media. */
type WithMedia = { _media: { imageId: number | string }[] };

function imageIds(ws: ExcelJS.Worksheet): number[] {
  return ((ws as unknown as WithMedia)._media ?? []).map((m) => Number(m.imageId));
}

/**
 * Drops from the book's media the pictures of the sheets just removed that no sheet left shows,
 * and renumbers the rest: exceljs keeps every image it loaded, so without this a book
 * rewritten every week would carry all its old charts. Pictures of the user's sheets stay.
 */
function dropImages(wb: ExcelJS.Workbook, removed: Set<number>): void {
  if (removed.size === 0) return;
  const book = wb as unknown as { media: unknown[] };
  const used = new Set(wb.worksheets.flatMap(imageIds));
  const renumber = new Map<number, number>();
  const kept: unknown[] = [];
  book.media.forEach((m, i) => {
    if (removed.has(i) && !used.has(i)) return;
    renumber.set(i, kept.length);
    kept.push(m);
  });
  for (const ws of wb.worksheets) {
    for (const m of (ws as unknown as WithMedia)._media ?? []) m.imageId = renumber.get(Number(m.imageId)) ?? Number(m.imageId);
  }
  book.media = kept;
}

type DefinedNames = { model: { name: string }[]; removeAllNames(name: string): void; add(loc: string, name: string): void };

/**
 * Replaces Fairlead's sheets and names in `wb` with `sheets`; `images` holds a PNG per chart id.
 * The four managed sheets are always replaced, any other sheet only when it is in `sheets`
 * (so a run leaves an earlier Publish's sheets as they are). A replaced sheet keeps its place
 * among the tabs; a new one goes at the end, in the order of `sheets`.
 */
export function writeManaged(wb: ExcelJS.Workbook, sheets: ManagedSheet[], images: Map<string, Uint8Array>): void {
  const replaced = [...new Set([...RUN_SHEETS, ...sheets.map((s) => s.name)])];
  checkManagedNames(wb, replaced);
  const place = new Map<string, number>();
  const pictures = new Set<number>();
  for (const name of replaced) {
    const ws = sheetNamed(wb, name);
    if (!ws) continue;
    place.set(name, tabOrder(ws));
    for (const id of imageIds(ws)) pictures.add(id);
    wb.removeWorksheet(ws.id);
  }
  dropImages(wb, pictures);
  const names = wb.definedNames as unknown as DefinedNames;
  for (const n of names.model.map((m) => m.name)) if (n.startsWith("FL_")) names.removeAllNames(n);
  for (const sheet of sheets) {
    const ws = writeSheet(wb, sheet, images, names);
    // The removed sheet's order number is free again: the new sheet takes it.
    const at = place.get(sheet.name);
    if (at !== undefined) setTabOrder(ws, at);
  }
}

/** Parts of an .xlsx that exceljs does not carry through a read and write. */
const NOT_KEPT: [RegExp, string][] = [
  [/^xl\/charts\//, "charts"],
  [/^xl\/pivotTables\//, "pivot tables"],
  [/^xl\/vbaProject\.bin$/, "macros"],
  [/^xl\/externalLinks\//, "links to other workbooks"],
  [/^xl\/slicers\//, "slicers"],
];

/** What a rewrite of this file would drop, as words ("charts, pivot tables"); empty when nothing. */
export async function partsNotKept(file: string): Promise<string[]> {
  const zip = await JSZip.loadAsync(fs.readFileSync(file));
  const found = new Set<string>();
  zip.forEach((p) => {
    for (const [re, what] of NOT_KEPT) if (re.test(p)) found.add(what);
  });
  return [...found];
}

/** Writes the book to `file` through a temporary file beside it, so a failure leaves no half-written book. */
export async function saveBook(wb: ExcelJS.Workbook, file: string): Promise<void> {
  fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const tmp = `${file}.${process.pid}.tmp`;
  try {
    await wb.xlsx.writeFile(tmp);
    fs.renameSync(tmp, file);
  } catch (e) {
    if (fs.existsSync(tmp)) fs.unlinkSync(tmp);
    const why = e instanceof Error ? e.message : String(e);
    if (/EBUSY|EACCES|EPERM/.test(why)) throw new UsageError(`${file} could not be written (${why.split("\n")[0]}); is it open in Excel?`);
    throw e;
  }
}
