/**
 * The forecast log: every Publish appends the outlook it published, one row per series and week
 * ahead (origin week, target week, method, point, the inner and outer interval), to a sheet of
 * the book. The log is append-only: a new Publish writes below the last row and never rewrites
 * one. The rows are the desk's once written: someone may correct, delete or add rows by hand,
 * and the track record (track.ts) reads them as they stand.
 *
 * Each row carries a check (FNV-1a of its fields as written) so that a later Publish can tell a
 * row changed by hand from one Fairlead wrote, and say so. Pure data: the pane and the batch
 * runner read the sheet into a grid of cell values and write the rows this module plans.
 */
import type { Cell } from "../report";
import { fnv1a } from "../math/fnv1a";
import { isoDate } from "../series/calendar";
import { readDateCell } from "../series/excelDate";
import type { AnalysedSeries, CellStyle } from "../present/sheets";
import { CAUTION } from "../present/stamp";

export const LOG_SHEET = "Fairlead Log";
/** A1 of the log sheet: how a sink knows the sheet is the log it may append to. */
export const LOG_MARK = "Fairlead forecast log";
export const LOG_LEAD =
  "Every Publish adds its forecasts below the last row; rows already here are never rewritten. Correct or delete rows as you see fit: the track record reads them as they stand.";

/** The log's columns, in the order Fairlead writes them; a reader finds them by header. */
export const LOG_COLUMNS = [
  "Logged at",
  "Series",
  "Origin week",
  "Target week",
  "Weeks ahead",
  "Method",
  "Forecast",
  "Inner %",
  "Inner low",
  "Inner high",
  "Outer %",
  "Outer low",
  "Outer high",
  "Row check",
] as const;

type LogColumn = (typeof LOG_COLUMNS)[number];

/** Columns a row cannot be scored without. */
const REQUIRED: LogColumn[] = ["Series", "Origin week", "Target week", "Weeks ahead", "Method", "Forecast"];

/** How each column is shown (the writers' number formats). */
export const LOG_STYLES: (CellStyle | null)[] = LOG_COLUMNS.map((c) =>
  c === "Origin week" || c === "Target week" ? "date" : c === "Weeks ahead" || c === "Inner %" || c === "Outer %" ? "count" : /^(Forecast|Inner low|Inner high|Outer low|Outer high)$/.test(c) ? "rate" : null,
);

/** The rows above the header: the mark, what the log is, the caution, a blank row. */
export const LOG_HEAD_ROWS: Cell[][] = [
  [LOG_MARK, LOG_LEAD],
  ["Caution", CAUTION],
  [],
];

export interface LoggedBand {
  level: number;
  low: number | null;
  high: number | null;
}

/** One logged forecast. Weeks are ISO dates (YYYY-MM-DD, week ending). */
export interface LogEntry {
  /** When it was published, ISO-8601 UTC ("2026-12-03T14:00:00Z"); "" when a hand-made row has none. */
  loggedAt: string;
  series: string;
  origin: string;
  target: string;
  ahead: number;
  method: string;
  point: number;
  inner: LoggedBand | null;
  outer: LoggedBand | null;
}

function num15(v: number | null): string {
  return v === null ? "" : String(Number(v.toPrecision(15)));
}

/** The check written beside a row: 8 hex digits of FNV-1a over its fields at Excel's 15 digits. */
export function rowCheck(e: LogEntry): string {
  const band = (b: LoggedBand | null): string => (b ? `${num15(b.level)}|${num15(b.low)}|${num15(b.high)}` : "||");
  const text = [e.loggedAt, e.series, e.origin, e.target, String(e.ahead), e.method, num15(e.point), band(e.inner), band(e.outer)].join("|");
  return fnv1a(text).toString(16).padStart(8, "0");
}

/** The row Fairlead writes for an entry, in LOG_COLUMNS order (weeks as ISO text the writers turn into dates). */
export function entryRow(e: LogEntry): Cell[] {
  return [
    e.loggedAt,
    e.series,
    e.origin,
    e.target,
    e.ahead,
    e.method,
    e.point,
    e.inner?.level ?? null,
    e.inner?.low ?? null,
    e.inner?.high ?? null,
    e.outer?.level ?? null,
    e.outer?.low ?? null,
    e.outer?.high ?? null,
    rowCheck(e),
  ];
}

function finite(c: Cell | undefined): number | null {
  return typeof c === "number" && Number.isFinite(c) ? c : null;
}

/**
 * The entries a published run adds: its outlook, series by series. Undated series have no
 * target weeks to score against and are left out (named in `skipped`).
 */
export function logEntries(analysed: AnalysedSeries[], loggedAt: string): { entries: LogEntry[]; skipped: string[] } {
  const entries: LogEntry[] = [];
  const skipped: string[] = [];
  for (const a of analysed) {
    const r = a.report;
    const t = r.tables.outlook;
    if (r.lastWeek === null) {
      skipped.push(a.name);
      continue;
    }
    const col = (c: string): number => t.columns.indexOf(c);
    const levels = [...r.options.levels].sort((x, y) => x - y);
    const band = (row: Cell[], level: number | undefined): LoggedBand | null => {
      if (level === undefined) return null;
      const label = `${Number(level.toFixed(4))}%`;
      return { level, low: finite(row[col(`Low ${label}`)]), high: finite(row[col(`High ${label}`)]) };
    };
    for (const row of t.rows) {
      const point = finite(row[col("Forecast")]);
      const week = row[col("Week ending")];
      if (point === null || typeof week !== "string") continue;
      entries.push({
        loggedAt,
        series: a.name,
        origin: r.lastWeek,
        target: week,
        ahead: Number(row[col("Step")]),
        method: r.model.method,
        point,
        inner: band(row, levels[0]),
        outer: levels.length > 1 ? band(row, levels[levels.length - 1]) : null,
      });
    }
  }
  return { entries, skipped };
}

/** A row of the log as read back. */
export interface LogRow {
  /** 0-based row on the sheet. */
  row: number;
  entry: LogEntry;
  /** Its check does not match its fields: changed by hand, or added by hand. */
  byHand: boolean;
}

export interface LogReading {
  /** 0-based row of the header. */
  headerRow: number;
  /** Column of each of Fairlead's columns (by header), -1 when the user removed it. */
  columns: Record<LogColumn, number>;
  rows: LogRow[];
  /** 0-based rows that hold something but not a forecast Fairlead can score (notes, half rows). */
  unreadable: number[];
  /** 0-based row after the last non-empty one: where new rows go. */
  next: number;
}

/** Why a log cannot be appended to: the pane and the batch refuse with this sentence. */
export class LogRefused extends Error {
  constructor(message: string) {
    super(message);
    this.name = "LogRefused";
  }
}

function blank(c: Cell | undefined | unknown): boolean {
  return c === null || c === undefined || (typeof c === "string" && c.trim() === "");
}

function weekOf(c: unknown): string | null {
  const d = readDateCell(c);
  return d.kind === "date" ? isoDate(d.date) : null;
}

function loggedAtOf(c: unknown): string {
  if (c instanceof Date && !Number.isNaN(c.getTime())) return c.toISOString().replace(/\.\d{3}Z$/, "Z");
  return typeof c === "string" ? c.trim() : typeof c === "number" ? String(c) : "";
}

/**
 * Reads a log sheet given as its cells from A1 (as Range.values or the batch reader give
 * them: numbers, text, booleans, dates as serials or Date objects). Throws LogRefused when the
 * sheet is not Fairlead's log or has lost a column the rows cannot be read without.
 */
export function readLog(grid: unknown[][]): LogReading {
  if (grid.length === 0 || grid[0][0] !== LOG_MARK) {
    throw new LogRefused(`The book has a sheet “${LOG_SHEET}” that is not Fairlead's forecast log (its A1 is not “${LOG_MARK}”); rename that sheet so nothing of yours is overwritten.`);
  }
  const norm = (c: unknown): string => (typeof c === "string" ? c.trim().toLowerCase() : "");
  let headerRow = -1;
  for (let r = 1; r < Math.min(grid.length, 40) && headerRow < 0; r++) {
    const names = (grid[r] ?? []).map(norm);
    if (names.includes("origin week") && names.includes("target week")) headerRow = r;
  }
  if (headerRow < 0) {
    throw new LogRefused(`${LOG_SHEET} has lost its header row (the one with “Origin week” and “Target week”); restore it, and Fairlead will add to the log again.`);
  }
  const header = (grid[headerRow] ?? []).map(norm);
  const columns = Object.fromEntries(LOG_COLUMNS.map((c) => [c, header.indexOf(c.toLowerCase())])) as Record<LogColumn, number>;
  const lost = REQUIRED.filter((c) => columns[c] < 0);
  if (lost.length > 0) {
    throw new LogRefused(`${LOG_SHEET} has lost the column${lost.length === 1 ? "" : "s"} ${lost.map((c) => `“${c}”`).join(", ")} from its header; restore ${lost.length === 1 ? "it" : "them"}, and Fairlead will add to the log again.`);
  }
  const rows: LogRow[] = [];
  const unreadable: number[] = [];
  let next = headerRow + 1;
  for (let r = headerRow + 1; r < grid.length; r++) {
    const cells = grid[r] ?? [];
    if (cells.every((c) => blank(c))) continue;
    next = r + 1;
    const at = (c: LogColumn): unknown => (columns[c] >= 0 ? cells[columns[c]] : null);
    const series = typeof at("Series") === "string" ? (at("Series") as string).trim() : "";
    const origin = weekOf(at("Origin week"));
    const target = weekOf(at("Target week"));
    const ahead = at("Weeks ahead");
    const method = typeof at("Method") === "string" ? (at("Method") as string).trim() : "";
    const point = finite(at("Forecast") as Cell);
    if (!series || !origin || !target || typeof ahead !== "number" || !Number.isInteger(ahead) || ahead < 1 || !method || point === null) {
      unreadable.push(r);
      continue;
    }
    const band = (level: LogColumn, low: LogColumn, high: LogColumn): LoggedBand | null => {
      const l = finite(at(level) as Cell);
      if (l === null) return null;
      return { level: l, low: finite(at(low) as Cell), high: finite(at(high) as Cell) };
    };
    const entry: LogEntry = {
      loggedAt: loggedAtOf(at("Logged at")),
      series,
      origin,
      target,
      ahead,
      method,
      point,
      inner: band("Inner %", "Inner low", "Inner high"),
      outer: band("Outer %", "Outer low", "Outer high"),
    };
    const check = at("Row check");
    rows.push({ row: r, entry, byHand: typeof check !== "string" || check.trim() !== rowCheck(entry) });
  }
  return { headerRow, columns, rows, unreadable, next };
}

/** The same forecast: series, origin, target, method and values (not when it was logged). */
function sameForecast(a: LogEntry, b: LogEntry): boolean {
  const band = (x: LoggedBand | null, y: LoggedBand | null): boolean =>
    x === null || y === null ? x === y : num15(x.level) === num15(y.level) && num15(x.low) === num15(y.low) && num15(x.high) === num15(y.high);
  return (
    a.series === b.series && a.origin === b.origin && a.target === b.target && a.method === b.method && a.ahead === b.ahead &&
    num15(a.point) === num15(b.point) && band(a.inner, b.inner) && band(a.outer, b.outer)
  );
}

/** What an append writes, and what it says about the log it found. */
export interface AppendPlan {
  /** 0-based row where `rows` go, from column A. */
  start: number;
  /** The rows to write: the head and header first when the log is new. */
  rows: Cell[][];
  /** 0-based rows (within `rows`) that are log entries, and their count. */
  firstEntry: number;
  added: number;
  /** Forecasts already in the log with the same values (published twice): not added again. */
  repeated: number;
  /** The entries of the log after the append (what the track record reads). */
  entries: LogEntry[];
  /** Plain sentences: what was added, and what was found that Fairlead did not write. */
  sentences: string[];
}

function rowList(rows: number[]): string {
  const shown = rows.slice(0, 5).map((r) => String(r + 1)).join(", ");
  return rows.length > 5 ? `${shown} and ${rows.length - 5} more` : shown;
}

/**
 * Plans the append of `entries` to the log read as `reading` (null when the book has no log
 * yet). Rows already in the log are never part of the plan: only rows below the last are.
 */
export function appendPlan(reading: LogReading | null, entries: LogEntry[]): AppendPlan {
  const kept = reading ? reading.rows.map((r) => r.entry) : [];
  const untouched = reading ? reading.rows.filter((r) => !r.byHand).map((r) => r.entry) : [];
  const fresh = entries.filter((e) => !untouched.some((k) => sameForecast(k, e)));
  const repeated = entries.length - fresh.length;
  const sentences: string[] = [];
  if (reading) {
    const byHand = reading.rows.filter((r) => r.byHand).map((r) => r.row);
    if (byHand.length > 0) {
      sentences.push(
        `${byHand.length} row${byHand.length === 1 ? " of the log was" : "s of the log were"} changed or added by hand (row${byHand.length === 1 ? "" : "s"} ${rowList(byHand)}); ${byHand.length === 1 ? "it is" : "they are"} kept as ${byHand.length === 1 ? "it stands" : "they stand"} and scored as ${byHand.length === 1 ? "it reads" : "they read"}.`,
      );
    }
    if (reading.unreadable.length > 0) {
      const k = reading.unreadable.length;
      sentences.push(
        `${k} row${k === 1 ? "" : "s"} of the log (${rowList(reading.unreadable)}) ${k === 1 ? "does" : "do"} not read as a forecast (a series, origin and target week, weeks ahead, method and forecast); ${k === 1 ? "it is" : "they are"} kept and not scored.`,
      );
    }
  }
  if (repeated > 0) sentences.push(`${repeated} forecast${repeated === 1 ? " was" : "s were"} already in the log with the same values and ${repeated === 1 ? "was" : "were"} not added again.`);
  const body = fresh.map(entryRow);
  if (reading === null) {
    const rows: Cell[][] = [...LOG_HEAD_ROWS.map((r) => [...r]), [...LOG_COLUMNS], ...body];
    sentences.unshift(`Started ${LOG_SHEET} with ${fresh.length} forecast${fresh.length === 1 ? "" : "s"}.`);
    return { start: 0, rows, firstEntry: LOG_HEAD_ROWS.length + 1, added: fresh.length, repeated, entries: fresh, sentences };
  }
  // Rows go in Fairlead's column order where the header still has them; a column the user
  // added stays blank in new rows, one they removed is left out.
  const width = Math.max(...Object.values(reading.columns)) + 1;
  const placed = body.map((r) => {
    const out: Cell[] = new Array<Cell>(width).fill(null);
    LOG_COLUMNS.forEach((c, j) => {
      const at = reading.columns[c];
      if (at >= 0) out[at] = r[j];
    });
    return out;
  });
  sentences.unshift(`Added ${fresh.length} forecast${fresh.length === 1 ? "" : "s"} to ${LOG_SHEET} (${kept.length} already there).`);
  return { start: reading.next, rows: placed, firstEntry: 0, added: fresh.length, repeated, entries: [...kept, ...fresh], sentences };
}

/** The style of each column of an appended row, in the sheet's column order. */
export function appendStyles(reading: LogReading | null): (CellStyle | null)[] {
  if (reading === null) return LOG_STYLES;
  const width = Math.max(...Object.values(reading.columns)) + 1;
  const out: (CellStyle | null)[] = new Array<CellStyle | null>(width).fill(null);
  LOG_COLUMNS.forEach((c, j) => {
    const at = reading.columns[c];
    if (at >= 0) out[at] = LOG_STYLES[j];
  });
  return out;
}
