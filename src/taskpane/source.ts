/**
 * Where an analysed series comes from: a column of an Excel table, addressed by names, or a
 * column of a sheet, addressed by position. A source is saved in the workbook's settings and
 * read back in a later session, so it is a plain JSON value and is checked when read back
 * (isDataSource). A range source has no bottom row: it runs to the last used cell of its
 * rates column, so the weeks a desk pastes below are part of the next run.
 *
 * Pure: no Office calls and no DOM, so the filtering behind the change watch is unit-tested.
 */
import { looksLikeMalformedNumber } from "../core/series/cells";
import { isLabelText } from "../core/series/intake";
import { readDateCell } from "../core/series/excelDate";
import { InputError } from "../core/series/errors";
import { cellName, columnIndex, columnLetters } from "../core/present/a1";
import type { SelectionBlocks } from "./excel/readSelection";

/**
 * `events` / `eventsColumn` (optional, absent in settings saved before it existed): a column of
 * the same table or sheet marking the desk's event weeks with 1 (or x, TRUE) beside the dates;
 * read with the rates on every run, so a mark added for a coming week counts at the next run.
 */
export type DataSource =
  | { kind: "table"; table: string; rates: string; dates: string | null; events?: string | null }
  | { kind: "range"; sheet: string; ratesColumn: number; datesColumn: number | null; top: number; header: boolean; eventsColumn?: number | null };

export type TableSource = Extract<DataSource, { kind: "table" }>;
export type RangeSource = Extract<DataSource, { kind: "range" }>;

/** Last 0-based row and column of a sheet (1,048,576 rows, columns to XFD). */
export const LAST_ROW = 1_048_575;
export const LAST_COLUMN = 16_383;

/** One rectangle of an A1 address, 0-based and inclusive; whole rows or columns run to the sheet's edge. */
export interface Area {
  /** Sheet name without quotes, or null when the address names none. */
  sheet: string | null;
  top: number;
  bottom: number;
  left: number;
  right: number;
}

/** Text that names a column rather than holding a rate, judged as the core intake judges a header. */
export { isLabelText };

/** "'Lane book'" → "Lane book", "'Desk''s rates'" → "Desk's rates", "Rates" → "Rates". */
function unquoteSheet(text: string): string {
  const t = text.trim();
  if (t.length >= 2 && t.startsWith("'") && t.endsWith("'")) return t.slice(1, -1).replace(/''/g, "'");
  return t;
}

/** Splits a multi-area address at its commas, except commas inside a quoted sheet name. */
function splitAreas(address: string): string[] {
  const parts: string[] = [];
  let quoted = false;
  let start = 0;
  for (let i = 0; i < address.length; i++) {
    const ch = address[i];
    // A doubled quote inside a quoted name toggles twice, which leaves the state as it was.
    if (ch === "'") quoted = !quoted;
    else if (ch === "," && !quoted) {
      parts.push(address.slice(start, i));
      start = i + 1;
    }
  }
  parts.push(address.slice(start));
  return parts;
}

type Ref = { kind: "cell"; row: number; col: number } | { kind: "col"; col: number } | { kind: "row"; row: number };

function parseRef(text: string): Ref | null {
  const m = /^\$?([A-Za-z]{1,3})?\$?(\d{1,7})?$/.exec(text.trim());
  if (!m || (m[1] === undefined && m[2] === undefined)) return null;
  const col = m[1] === undefined ? undefined : columnIndex(m[1]);
  const row = m[2] === undefined ? undefined : Number(m[2]) - 1;
  if (col !== undefined && col > LAST_COLUMN) return null;
  if (row !== undefined && (row < 0 || row > LAST_ROW)) return null;
  if (col !== undefined && row !== undefined) return { kind: "cell", row, col };
  if (col !== undefined) return { kind: "col", col };
  return { kind: "row", row: row as number };
}

function parseArea(text: string): Area | null {
  const bang = text.lastIndexOf("!");
  const sheet = bang >= 0 ? unquoteSheet(text.slice(0, bang)) : null;
  if (sheet === "") return null;
  const ends = text.slice(bang + 1).split(":");
  if (ends.length > 2) return null;
  const a = parseRef(ends[0]);
  const b = ends.length === 2 ? parseRef(ends[1]) : a;
  if (!a || !b || a.kind !== b.kind) return null;
  if (a.kind === "cell" && b.kind === "cell") {
    return {
      sheet,
      top: Math.min(a.row, b.row),
      bottom: Math.max(a.row, b.row),
      left: Math.min(a.col, b.col),
      right: Math.max(a.col, b.col),
    };
  }
  if (a.kind === "col" && b.kind === "col") {
    return { sheet, top: 0, bottom: LAST_ROW, left: Math.min(a.col, b.col), right: Math.max(a.col, b.col) };
  }
  if (a.kind === "row" && b.kind === "row") {
    return { sheet, top: Math.min(a.row, b.row), bottom: Math.max(a.row, b.row), left: 0, right: LAST_COLUMN };
  }
  return null;
}

/**
 * The areas of an A1 address as Excel reports them ("Rates!C1:C120", "'Lane book'!B2",
 * "D120:E121", "5:7", "C:D", "A1:B2,D4"), or null when any part cannot be read.
 */
export function areasOf(address: string): Area[] | null {
  if (address.trim() === "") return null;
  const areas: Area[] = [];
  for (const part of splitAreas(address)) {
    const area = parseArea(part.trim());
    if (!area) return null;
    areas.push(area);
  }
  return areas;
}

/** Sheet names are compared as Excel compares them: without regard to case. */
function sameName(a: string, b: string): boolean {
  return a.toUpperCase() === b.toUpperCase();
}

/** The source a selection read by readSelection stands for, kept by position so it can grow. */
export function sourceFromSelection(blocks: SelectionBlocks): RangeSource {
  const rates = areasOf(blocks.address)?.[0];
  if (!rates || rates.sheet === null) {
    // readSelection passes Excel's own addresses, which always name the sheet.
    throw new Error(`The selection address ${blocks.address} does not name a sheet and a cell.`);
  }
  const dates = blocks.datesAddress ? areasOf(blocks.datesAddress)?.[0] : undefined;
  return {
    kind: "range",
    sheet: rates.sheet,
    ratesColumn: rates.left,
    datesColumn: dates ? dates.left : null,
    top: rates.top,
    header: startsWithHeader(blocks),
  };
}

/**
 * Mirrors the intake's header rule so that the saved source says what the intake will do:
 * label text on top is a header unless a date stands beside it, and text that looks like a
 * badly written rate ("1 834") counts as a header only when the date column has a label too.
 */
function startsWithHeader(blocks: SelectionBlocks): boolean {
  const first = blocks.values[0]?.[0];
  if (!isLabelText(first)) return false;
  const date = blocks.dates?.[0]?.[0];
  if (blocks.dates && readDateCell(date).kind === "date") return false;
  if (looksLikeMalformedNumber(first) && !isLabelText(date)) return false;
  return true;
}

/**
 * A source with the event column the Data section names: a table column's name, or a sheet
 * column's letter for a range ("" for none). Refuses, in words, a letter that names no column
 * and a column that is already the rates or the dates.
 */
export function withEvents(source: DataSource, text: string): DataSource {
  const t = text.trim();
  if (source.kind === "table") {
    // None: the field left out, so settings saved without an event column read as before.
    if (t === "") {
      const { events: _none, ...rest } = source;
      return rest;
    }
    if (sameName(t, source.rates) || (source.dates !== null && sameName(t, source.dates))) {
      throw new InputError("BAD_OPTION", `“${t}” is already the ${sameName(t, source.rates) ? "rates" : "dates"} column; choose another column for the event weeks, or none.`);
    }
    if (source.dates === null) throw new InputError("BAD_OPTION", "Event weeks marked in a column go by the dates beside them; choose the dates column too.");
    return { ...source, events: t };
  }
  if (t === "") {
    const { eventsColumn: _none, ...rest } = source;
    return rest;
  }
  if (!/^[A-Za-z]{1,3}$/.test(t) || columnIndex(t) > LAST_COLUMN) {
    throw new InputError("BAD_OPTION", `The event weeks column is a column letter of ${source.sheet}, such as F; got “${t}”.`);
  }
  const col = columnIndex(t);
  if (col === source.ratesColumn || col === source.datesColumn) {
    throw new InputError("BAD_OPTION", `Column ${t.toUpperCase()} holds the ${col === source.ratesColumn ? "rates" : "dates"}; choose another column for the event weeks, or none.`);
  }
  if (source.datesColumn === null) throw new InputError("BAD_OPTION", "Event weeks marked in a column go by the dates beside them; select the dates with the rates.");
  return { ...source, eventsColumn: col };
}

/** What the Data section shows for a source's event column: its name, a letter, or "". */
export function eventsText(source: DataSource): string {
  if (source.kind === "table") return source.events ?? "";
  return source.eventsColumn === undefined || source.eventsColumn === null ? "" : columnLetters(source.eventsColumn);
}

/** How the pane names a source, as a desk would say it. */
export function sourceLabel(s: DataSource): string {
  if (s.kind === "table") return `${s.table} › ${s.rates}`;
  const firstRate = s.top + (s.header ? 1 : 0);
  return `${s.sheet} › column ${columnLetters(s.ratesColumn)} from row ${firstRate + 1}`;
}

/**
 * True when both name the same rates and dates; names are compared as Excel does, without case.
 * The event column is a setting of the series, not part of which series it is, so it is not compared.
 */
export function sameSource(a: DataSource, b: DataSource): boolean {
  if (a.kind === "table" && b.kind === "table") {
    return (
      sameName(a.table, b.table) &&
      sameName(a.rates, b.rates) &&
      (a.dates === null ? b.dates === null : b.dates !== null && sameName(a.dates, b.dates))
    );
  }
  if (a.kind === "range" && b.kind === "range") {
    return (
      sameName(a.sheet, b.sheet) &&
      a.ratesColumn === b.ratesColumn &&
      a.datesColumn === b.datesColumn &&
      a.top === b.top &&
      a.header === b.header
    );
  }
  return false;
}

function isName(v: unknown): v is string {
  return typeof v === "string" && v.trim() !== "";
}

function isIndex(v: unknown, last: number): v is number {
  return typeof v === "number" && Number.isInteger(v) && v >= 0 && v <= last;
}

/**
 * Checks a value read back from the workbook's settings. Settings can be edited by other
 * add-ins or older versions, so every field is checked; unknown extra fields are tolerated so
 * that a later version may add some without breaking this one.
 */
export function isDataSource(x: unknown): x is DataSource {
  if (typeof x !== "object" || x === null || Array.isArray(x)) return false;
  const o = x as Record<string, unknown>;
  if (o.kind === "table") {
    if (!isName(o.table) || !isName(o.rates)) return false;
    if (o.dates !== null && !(isName(o.dates) && !sameName(o.dates, o.rates))) return false;
    if (o.events === undefined || o.events === null) return true;
    return isName(o.events) && !sameName(o.events, o.rates) && !(o.dates !== null && sameName(o.events, o.dates as string));
  }
  if (o.kind === "range") {
    if (!isName(o.sheet) || !isIndex(o.ratesColumn, LAST_COLUMN) || !isIndex(o.top, LAST_ROW)) return false;
    if (typeof o.header !== "boolean") return false;
    if (o.datesColumn !== null && !(isIndex(o.datesColumn, LAST_COLUMN) && o.datesColumn !== o.ratesColumn)) return false;
    if (o.eventsColumn === undefined || o.eventsColumn === null) return true;
    return isIndex(o.eventsColumn, LAST_COLUMN) && o.eventsColumn !== o.ratesColumn && o.eventsColumn !== o.datesColumn;
  }
  return false;
}

/**
 * Does a change at `changedAddress` (as a worksheet's onChanged event reports it, with or
 * without a sheet name) touch the rate, date or event column of a range source at or below its
 * top row? `sheetName` is the sheet the event came from, used for areas that name no sheet.
 *
 * Rows inserted or deleted below the top and whole-row edits count; changes above the top or
 * in other columns do not. An address that cannot be read counts as a change, since a missed
 * change leaves the pane stale while an extra one only costs a run.
 *
 * A table source is placed by column names, which an address alone cannot locate: place it
 * with placeTable first. Unplaced, it answers true, as a table's own onChanged event already
 * comes from that table only.
 */
export function touches(source: DataSource, changedAddress: string, sheetName: string): boolean {
  if (source.kind === "table") return true;
  const areas = areasOf(changedAddress);
  if (!areas) return true;
  const columns = [source.ratesColumn, source.datesColumn, source.eventsColumn].filter((c): c is number => c !== null && c !== undefined);
  return areas.some(
    (a) =>
      sameName(a.sheet ?? sheetName, source.sheet) &&
      a.bottom >= source.top &&
      columns.some((c) => c >= a.left && c <= a.right),
  );
}

/**
 * Where a table source's columns are now: the range source covering the same cells, from the
 * table's full range address (header and totals included) and its column names in order.
 * Null when the address cannot be read or a column no longer exists.
 */
export function placeTable(source: TableSource, tableAddress: string, columnNames: string[]): RangeSource | null {
  const area = areasOf(tableAddress)?.[0];
  if (!area || area.sheet === null) return null;
  const position = (name: string): number => columnNames.findIndex((c) => sameName(c, name));
  const rates = position(source.rates);
  const dates = source.dates === null ? null : position(source.dates);
  const events = source.events === undefined || source.events === null ? null : position(source.events);
  if (rates < 0 || dates === -1 || events === -1) return null;
  return {
    kind: "range",
    sheet: area.sheet,
    ratesColumn: area.left + rates,
    datesColumn: dates === null ? null : area.left + dates,
    top: area.top,
    header: true,
    ...(events === null ? {} : { eventsColumn: area.left + events }),
  };
}

/**
 * A one-column address with the same sheet prefix as `like` (an address Excel returned, so
 * its quoting of the sheet name is Excel's own), covering rows `first`..`last` (0-based).
 */
export function columnAddress(like: string, col: number, first: number, last: number): string {
  const bang = like.lastIndexOf("!");
  const prefix = bang >= 0 ? like.slice(0, bang + 1) : "";
  const top = cellName(first, col);
  return last === first ? `${prefix}${top}` : `${prefix}${top}:${cellName(last, col)}`;
}
