/**
 * Arguments of the worksheet functions as Excel hands them over (numbers, text, booleans,
 * null for an omitted optional argument, 2-D arrays for ranges) read into core options, and
 * report tables written back as the 2-D arrays Excel spills. Wrong kinds are #VALUE!,
 * impossible numbers #NUM!, each with a sentence.
 */
import type { RefitMode } from "../core/evaluate/backtest";
import type { Direction } from "../core/outlook/paths";
import { isDateColumn, type Cell, type ReportTable } from "../core/report";
import { dateToExcelSerial, parseIsoDateText, readDateCell } from "../core/series/excelDate";
import { isoDate } from "../core/series/calendar";
import { isInputError } from "../core/series/errors";
import { eventWeeksFromMarks, isMarkColumn, readMark } from "../core/series/eventRegressors";
import { ArgumentError, cellError } from "./errors";

/** One cell of a returned array. */
export type OutCell = number | string | boolean | CustomFunctions.Error;

/** Excel passes null (or nothing) for an omitted optional argument. */
export function omitted(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === "string" && v.trim() === "");
}

/** A single cell, whether Excel passed it as a value or as a 1×1 range. */
export function single(v: unknown): unknown {
  if (Array.isArray(v)) {
    const flat = (v as unknown[]).flat();
    return flat.length === 1 ? flat[0] : v;
  }
  return v;
}

/** Coverage levels from a number or a block of numbers; blanks inside a block are skipped. */
export function readCoverage(coverage: unknown): number[] | undefined {
  if (omitted(coverage)) return undefined;
  const cells: unknown[] = Array.isArray(coverage) ? (coverage as unknown[]).flat() : [coverage];
  const levels: number[] = [];
  for (const c of cells) {
    if (omitted(c)) continue;
    if (typeof c !== "number" || !Number.isFinite(c)) {
      throw new ArgumentError("#VALUE!", "Coverage must be a number such as 80, or a row or column of numbers such as 80 and 95.");
    }
    levels.push(c);
  }
  return levels.length > 0 ? levels : undefined;
}

/** A number argument: #VALUE! when it is not a number. Range checks are the core's (#NUM!). */
export function readNumber(v: unknown, what: string): number {
  const x = single(v);
  if (typeof x !== "number" || !Number.isFinite(x)) throw new ArgumentError("#VALUE!", `${what} must be a number; got ${describe(x)}.`);
  return x;
}

/** A whole number in [min, max]: #VALUE! when not a number, #NUM! when out of range or fractional. */
export function readWhole(v: unknown, what: string, min: number, max: number): number {
  const x = readNumber(v, what);
  if (!Number.isInteger(x) || x < min || x > max) throw new ArgumentError("#NUM!", `${what} must be a whole number from ${min} to ${max}; got ${x}.`);
  return x;
}

function describe(x: unknown): string {
  if (typeof x === "string") return `"${x}"`;
  if (Array.isArray(x)) return "a range of several cells";
  return String(x);
}

export function readText(v: unknown, what: string): string | undefined {
  const x = single(v);
  if (omitted(x)) return undefined;
  if (typeof x !== "string") throw new ArgumentError("#VALUE!", `${what} must be text; got ${describe(x)}.`);
  return x.trim();
}

export function readMethod(method: unknown): string | undefined {
  const code = readText(method, 'The method (a code such as "tbats")');
  return code?.toLowerCase();
}

/** Method codes from text ("tbats, sarima") or a range of text cells. */
export function readMethods(v: unknown): string[] | undefined {
  if (omitted(v)) return undefined;
  const cells = Array.isArray(v) ? (v as unknown[]).flat() : [v];
  const out: string[] = [];
  for (const c of cells) {
    if (omitted(c)) continue;
    if (typeof c !== "string") throw new ArgumentError("#VALUE!", `Methods are codes written as text, such as "tbats, sarima"; got ${describe(c)}.`);
    out.push(...c.split(/[,;\s]+/).map((m) => m.trim().toLowerCase()).filter((m) => m.length > 0));
  }
  return out.length > 0 ? out : undefined;
}

export function readDirection(v: unknown): Direction {
  const d = readText(v, 'The direction ("above" or "below")');
  if (d === undefined) return "above";
  const key = d.toLowerCase();
  if (key === "above" || key === "below") return key;
  throw new ArgumentError("#VALUE!", `The direction is "above" or "below"; got "${d}".`);
}

/** "every" (default), "fixed", or a whole number of weeks between re-estimations. */
export function readRefit(v: unknown): RefitMode {
  const x = single(v);
  if (omitted(x)) return "every";
  if (typeof x === "number") {
    if (!Number.isInteger(x) || x < 1 || x > 52) throw new ArgumentError("#NUM!", `Re-estimation every N weeks takes a whole N from 1 to 52; got ${x}.`);
    return x === 1 ? "every" : x;
  }
  if (typeof x === "string" && ["every", "fixed"].includes(x.trim().toLowerCase())) return x.trim().toLowerCase() as "every" | "fixed";
  throw new ArgumentError("#VALUE!", `Re-estimation is "every" (every week), "fixed" (never) or a number of weeks; got ${describe(x)}.`);
}

/** A TRUE/FALSE argument (also 1/0, "yes"/"no"); omitted is FALSE. `what` names it in the error. */
export function readSwitch(v: unknown, what: string): boolean {
  const x = single(v);
  if (omitted(x)) return false;
  if (typeof x === "boolean") return x;
  if (typeof x === "number") return x !== 0;
  if (typeof x === "string" && ["yes", "true"].includes(x.trim().toLowerCase())) return true;
  if (typeof x === "string" && ["no", "false"].includes(x.trim().toLowerCase())) return false;
  throw new ArgumentError("#VALUE!", `${what} is TRUE or FALSE; got ${describe(x)}.`);
}

/** The header-row switch: TRUE, 1 or "yes" puts the column names on top; default no header. */
export function readHeaders(v: unknown): boolean {
  return readSwitch(v, "The header switch");
}

/** The lunar-new-year switch as analyse() options (the analysis refuses it without dates). */
export function readLunar(v: unknown): { calendar?: { lunarNewYear: true } } {
  return readSwitch(v, "The lunar-new-year switch") ? { calendar: { lunarNewYear: true } } : {};
}

/**
 * Event weeks: a cell or range of dates (serials, or text YYYY-MM-DD), blanks skipped, as
 * ISO dates in reading order; undefined when omitted or empty. A cell that is not a date is
 * #VALUE! naming it.
 */
export function readEventWeeks(v: unknown, dates?: unknown): string[] | undefined {
  if (omitted(v)) return undefined;
  const cells = Array.isArray(v) ? (v as unknown[][]).flat() : [v];
  const marks = markCells(cells);
  if (marks) return markedWeeks(marks, dates);
  const out: string[] = [];
  cells.forEach((c, i) => {
    if (omitted(c)) return;
    const d = readDateCell(c);
    if (d.kind !== "date") throw new ArgumentError("#VALUE!", `Event weeks are dates; cell ${i + 1} of them holds ${describe(c)}.`);
    out.push(isoDate(d.date));
  });
  return out.length > 0 ? out : undefined;
}

/**
 * The cells as a column of marks beside the dates (1, x or TRUE in the event weeks; 0, FALSE or
 * blank elsewhere), a header cell on top allowed; null when they are not marks (a list of dates).
 */
function markCells(cells: unknown[]): { marks: unknown[]; header: boolean } | null {
  // Every cell a mark and one not blank: marks, even if none marks a week (refused then, with its own sentence).
  const marks = (c: unknown[]): boolean => isMarkColumn(c) || (c.every((x) => readMark(x) !== null) && c.some((x) => !omitted(x)));
  if (marks(cells)) return { marks: cells, header: false };
  const [first, ...rest] = cells;
  if (typeof first === "string" && readMark(first) === null && marks(rest)) return { marks: rest, header: true };
  return null;
}

/** The dates beside the marked cells, row for row with the dates argument (its header skipped alike). */
function markedWeeks(m: { marks: unknown[]; header: boolean }, dates: unknown): string[] {
  if (omitted(dates)) throw new ArgumentError("#VALUE!", "Event weeks marked 1 or 0 need the dates argument, row for row beside the marks.");
  let d = Array.isArray(dates) ? (dates as unknown[][]).flat() : [dates];
  if (d.length > 0 && readDateCell(d[0]).kind === "invalid" && typeof d[0] === "string") d = d.slice(1);
  if (d.length !== m.marks.length) {
    throw new ArgumentError("#VALUE!", `Event weeks marked 1 or 0 need one mark per date: ${m.marks.length} mark${m.marks.length === 1 ? "" : "s"}${m.header ? " below the header" : ""} for ${d.length} dates.`);
  }
  try {
    return eventWeeksFromMarks({ marks: m.marks, dates: d, what: "Event marks" });
  } catch (e) {
    if (isInputError(e)) throw new ArgumentError("#VALUE!", e.message);
    throw e;
  }
}

/** The calendar options of the lunar-new-year switch and the event weeks together. */
export function readCalendar(lunar: unknown, events: unknown, dates?: unknown): { calendar?: { lunarNewYear?: true; events?: string[] } } {
  const l = readLunar(lunar).calendar;
  const e = readEventWeeks(events, dates);
  if (!l && !e) return {};
  return { calendar: { ...(l ?? {}), ...(e ? { events: e } : {}) } };
}

export function readDates(dates: unknown): unknown[][] | undefined {
  if (omitted(dates)) return undefined;
  return Array.isArray(dates) ? (dates as unknown[][]) : [[dates]];
}

/** A report cell as a worksheet cell: ISO dates in a date column become Excel serials. */
function outCell(c: Cell, dateColumn: boolean): OutCell {
  if (typeof c === "number") return Number.isFinite(c) ? c : "";
  if (c === null) return "";
  if (dateColumn) {
    const d = parseIsoDateText(c);
    if (d) return dateToExcelSerial(d);
  }
  return c;
}

/** The chosen columns of a report table (all when none are named), with the header row when asked. */
export function tableOut(t: ReportTable, headers: boolean, columns?: string[]): OutCell[][] {
  const idx = (columns ?? t.columns).map((c) => {
    const i = t.columns.indexOf(c);
    if (i < 0) throw new Error(`report table "${t.title}" has no column "${c}"`);
    return i;
  });
  const rows = t.rows.map((r) => idx.map((i) => outCell(r[i], isDateColumn(t.columns[i]))));
  return headers ? [idx.map((i) => t.columns[i]), ...rows] : rows;
}

export function column(t: ReportTable, name: string): number {
  const i = t.columns.indexOf(name);
  if (i < 0) throw new Error(`report table "${t.title}" has no column "${name}"`);
  return i;
}

/** A numeric result cell: #N/A with a sentence where no value could be computed, never NaN or blank. */
export function numberCell(c: Cell): number | CustomFunctions.Error {
  if (typeof c === "number" && Number.isFinite(c)) return c;
  return cellError("#N/A", "No value could be computed for this week.");
}
