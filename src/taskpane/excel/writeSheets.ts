/**
 * Writes the managed sheets (core/present/sheets.ts) into the open workbook: plain values with
 * their stamp, number formats and looks (writePlan.ts), the FL_ workbook names over the
 * outlook, and native charts over a chart-data block beside them (chartData.ts, charts.ts).
 *
 * The writer never overwrites a cell it did not create. Before anything is written it reads
 * every managed sheet back: a sheet of Fairlead's name without the mark in A1 is the user's;
 * a cell that differs from the ledger of what the pane wrote last time (ledger.ts) was typed
 * by someone. Either stops the whole write, on every sheet, with a sentence that names the
 * cells. A sheet that carries the mark but has no ledger (written by the batch runner, or by a
 * copy of the pane whose settings were lost) is only rewritten when the user says so (`adopt`).
 */
import type { ManagedSheet } from "../../core/present/sheets";
import { MANAGED_MARK } from "../../core/present/stamp";
import { cellName, columnLetters } from "../../core/present/a1";
import { withChartData, type NativeChartPlan } from "../chartData";
import { editedCells, ledgerOf, type EditedCell, type SheetLedger } from "../ledger";
import { writePlan } from "../writePlan";
import { drawCharts } from "./charts";

/** Why a write did not happen: what the pane shows, and whether adopting would let it go ahead. */
export class WriteRefused extends Error {
  constructor(
    message: string,
    /** Sheets that carry Fairlead's mark but no ledger: the user may let the pane take them over. */
    readonly adoptable: string[],
  ) {
    super(message);
    this.name = "WriteRefused";
  }
}

export interface WriteOptions {
  /** Draw native charts (default true). */
  charts?: boolean;
  /** Rewrite these marked sheets although the book holds no ledger for them. */
  adopt?: string[];
  /** Show the first sheet when done (a first run); a refresh leaves the user where they are. */
  activate?: boolean;
}

export interface WrittenSheet {
  name: string;
  rows: number;
  cols: number;
  charts: string[];
  created: boolean;
}

export interface WriteResult {
  sheets: WrittenSheet[];
  /** The ledgers to keep (one per sheet written), and the names of ledgers to forget. */
  ledgers: SheetLedger[];
}

/** Column widths in points: the label column, then the 14-character columns the layout counts by (CELL_PX). */
const FIRST_COLUMN_PT = 160;
const OTHER_COLUMN_PT = 77.25;

function quoted(sheet: string): string {
  return `'${sheet.replace(/'/g, "''")}'`;
}

function absolute(row: number, col: number): string {
  return `$${columnLetters(col)}$${row + 1}`;
}

function shown(v: unknown): string {
  if (v === "" || v === null || v === undefined) return "now empty";
  const text = String(v);
  return `now “${text.length > 24 ? `${text.slice(0, 23)}…` : text}”`;
}

function editSentence(sheet: string, cells: EditedCell[]): string {
  const named = cells.slice(0, 3).map((c) => `${cellName(c.row, c.col)} (${shown(c.now)})`);
  const more = cells.length > 3 ? `, and ${cells.length >= 20 ? "more" : cells.length - 3} other cell${cells.length - 3 === 1 ? "" : "s"}` : "";
  return `${sheet} has been typed into at ${named.join(", ")}${more}.`;
}

interface Existing {
  sheet: Excel.Worksheet;
  mark: Excel.Range;
  used: Excel.Range;
}

/**
 * Writes `sheets`: a run's four (and the track record when the book keeps a forecast log), or
 * Publish's two. `ledgers` are the ones saved with the book; the sheets not in `sheets` and
 * their names are left alone. Throws
 * WriteRefused before writing anything when a sheet is not the pane's to rewrite.
 */
export async function writeManagedSheets(
  context: Excel.RequestContext,
  sheets: ManagedSheet[],
  ledgers: Record<string, SheetLedger>,
  options: WriteOptions = {},
): Promise<WriteResult> {
  const drawing = options.charts !== false;
  const prepared = sheets.map((s) => (drawing ? withChartData(s) : { sheet: s, charts: [] as NativeChartPlan[] }));
  const book = context.workbook;

  // Round trip 1: which managed sheets exist, and which of the names the pane writes or wrote.
  const found = sheets.map((s) => book.worksheets.getItemOrNullObject(s.name));
  for (const f of found) f.load("name");
  // Names the pane made over the sheets it now rewrites; those over sheets it leaves alone
  // (a Publish writes two sheets, not the Outlook) are not this write's to move or delete.
  const oldNames = new Set(sheets.flatMap((s) => ledgers[s.name]?.names ?? []));
  const wanted = new Set([...sheets.flatMap((s) => s.names.map((n) => n.name)), ...oldNames]);
  const nameItems = new Map([...wanted].map((n) => [n, book.names.getItemOrNullObject(n)] as const));
  for (const item of nameItems.values()) item.load("name");
  await context.sync();

  // Round trip 2: the mark and the used cells of every existing managed sheet.
  const existing = new Map<string, Existing>();
  sheets.forEach((s, i) => {
    const ws = found[i];
    if (ws.isNullObject) return;
    const mark = ws.getRange("A1");
    mark.load("values");
    const used = ws.getUsedRangeOrNullObject(true);
    used.load("values, rowIndex, columnIndex");
    existing.set(s.name, { sheet: ws, mark, used });
  });
  if (existing.size > 0) await context.sync();

  const problems: string[] = [];
  const adoptable: string[] = [];
  for (const [name, e] of existing) {
    if (e.mark.values[0][0] !== MANAGED_MARK) {
      problems.push(`The book has a sheet “${name}” that Fairlead did not write (its A1 is not “${MANAGED_MARK}”); rename that sheet so nothing of yours is overwritten.`);
      continue;
    }
    const ledger = ledgers[name];
    if (!ledger) {
      if (!options.adopt?.includes(name)) adoptable.push(name);
      continue;
    }
    const used = e.used.isNullObject ? null : { row: e.used.rowIndex, col: e.used.columnIndex, values: e.used.values as unknown[][] };
    const edits = editedCells(ledger, used);
    if (edits.length > 0) problems.push(editSentence(name, edits));
  }
  if (problems.length > 0) {
    throw new WriteRefused(
      `${problems.join(" ")} Fairlead wrote nothing. Move what you typed to a sheet of your own (or undo it), then run again.`,
      [],
    );
  }
  if (adoptable.length > 0) {
    const list = adoptable.map((n) => `“${n}”`).join(", ");
    throw new WriteRefused(
      `${list} carr${adoptable.length === 1 ? "ies" : "y"} Fairlead's mark, but this book holds no record of the cells the pane wrote there (the batch runner or another copy of Fairlead made ${adoptable.length === 1 ? "it" : "them"}), so the pane cannot tell whether anyone has typed into ${adoptable.length === 1 ? "it" : "them"}. Choose Rewrite them to let Fairlead replace ${adoptable.length === 1 ? "that sheet" : "those sheets"}, or rename ${adoptable.length === 1 ? "it" : "them"} to keep ${adoptable.length === 1 ? "it" : "them"}.`,
      adoptable,
    );
  }

  // Round trip 3: the cells, formats, looks and names of every sheet.
  const bookNames = new Set([...nameItems].filter(([, item]) => !item.isNullObject).map(([n]) => n));
  const written: WrittenSheet[] = [];
  const plans = prepared.map(({ sheet, charts }) => ({ sheet, charts, plan: writePlan(sheet) }));
  const newNames = new Set<string>();
  for (const { sheet, plan } of plans) {
    const e = existing.get(sheet.name);
    let ws: Excel.Worksheet;
    if (e) {
      ws = e.sheet;
      // Everything on it is the pane's (checked above): clear values and formats alike.
      ws.getRange().clear("All");
    } else {
      ws = book.worksheets.add(sheet.name);
      ws.tabColor = "#1F4E79";
    }
    const rows = plan.values.length;
    const cols = sheet.width;
    if (rows > 0 && cols > 0) {
      const target = ws.getRangeByIndexes(0, 0, rows, cols);
      // Formats first: a text cell formatted as text keeps "2026-W48" as typed.
      target.numberFormat = plan.formats;
      target.values = plan.values;
    }
    for (const look of plan.looks) {
      const r = ws.getRangeByIndexes(look.row, look.col, look.rows, look.cols);
      if (look.font?.bold) r.format.font.bold = true;
      if (look.font?.italic) r.format.font.italic = true;
      if (look.font?.size) r.format.font.size = look.font.size;
      if (look.font?.color) r.format.font.color = look.font.color;
      if (look.fill) r.format.fill.color = look.fill;
      if (look.underline) {
        const edge = r.format.borders.getItem("EdgeBottom");
        edge.style = "Continuous";
        edge.color = look.underline;
      }
    }
    ws.getRange("A:A").format.columnWidth = FIRST_COLUMN_PT;
    if (cols > 1) ws.getRange(`B:${columnLetters(cols - 1)}`).format.columnWidth = OTHER_COLUMN_PT;
    for (const n of sheet.names) {
      const ref = `=${quoted(sheet.name)}!${absolute(n.row, n.col)}${n.rows > 1 || n.cols > 1 ? `:${absolute(n.row + n.rows - 1, n.col + n.cols - 1)}` : ""}`;
      newNames.add(n.name);
      // An existing name keeps its identity (budget formulas over it never see #NAME?): only its reference moves.
      const item = nameItems.get(n.name);
      if (item && bookNames.has(n.name)) item.formula = ref;
      else book.names.add(n.name, ref);
    }
    written.push({ name: sheet.name, rows, cols, charts: [], created: !e });
  }
  // Names the pane made for series no longer analysed.
  for (const n of oldNames) if (!newNames.has(n) && bookNames.has(n)) nameItems.get(n)?.delete();
  await context.sync();

  // Charts, sheet by sheet (drawCharts keeps its own round trips few).
  const result: SheetLedger[] = [];
  for (let i = 0; i < plans.length; i++) {
    const { sheet, charts, plan } = plans[i];
    const known = ledgers[sheet.name]?.charts ?? [];
    const owned = drawing || known.length > 0 ? await drawCharts(context, sheet.name, charts, known) : [];
    written[i].charts = owned;
    result.push(ledgerOf(sheet.name, plan.values, owned, sheet.names.map((n) => n.name)));
  }
  if (options.activate && plans.length > 0) {
    book.worksheets.getItem(plans[0].sheet.name).activate();
    await context.sync();
  }
  return { sheets: written, ledgers: result };
}
