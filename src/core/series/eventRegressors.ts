/**
 * Event weeks given by the desk (a port strike, a canal closure, a tariff deadline, a holiday
 * of their own trade) as one 0/1 calendar regressor: 1 in each listed week, 0 elsewhere, for
 * history and forecast weeks alike. A listed date marks the week that contains it: the week
 * ending e covers e − 6 … e, the same rule as the lunar-new-year weeks (lunarRegressors.ts).
 * One column, so every listed week shares one estimated effect; SARIMA (regression with ARMA
 * errors) and TBATS (on the transformed scale) estimate it with its standard error. The weeks
 * come as a list of dates or from a column of marks beside the dates (eventWeeksFromMarks).
 */
import type { RegressorSet } from "../models/sarima/spec";
import { isoDate, MS_PER_DAY } from "./calendar";
import { InputError } from "./errors";
import { parseIsoDateText, readDateCell, type DateSystem } from "./excelDate";

export const EVENT_COLUMN = "Event weeks";

/** The week index (0 = the week ending on `start`) of the week that contains `date`. */
export function weekIndexOf(start: Date, date: Date): number {
  const days = Math.round((date.getTime() - start.getTime()) / MS_PER_DAY);
  return Math.ceil(days / 7);
}

/** The listed dates as the week endings of the series' weeks that contain them, sorted, once each. */
export function eventWeekEndings(start: Date, dates: readonly string[]): string[] {
  const out = new Set<string>();
  for (const text of dates) {
    const d = parseIsoDateText(text.trim());
    if (!d) throw new InputError("BAD_OPTION", `Event weeks are dates written as YYYY-MM-DD (any day of the week); got “${text}”.`);
    const t = weekIndexOf(start, d);
    out.add(isoDate(new Date(start.getTime() + t * 7 * MS_PER_DAY)));
  }
  return [...out].sort();
}

/** The regressor for a series whose week 0 ends on `start`; `weeks` are week endings (eventWeekEndings). */
export function eventRegressors(start: Date, weeks: readonly string[]): RegressorSet {
  const marked = new Set<number>();
  for (const w of weeks) {
    const d = parseIsoDateText(w);
    if (!d) throw new InputError("BAD_OPTION", `Event weeks are dates written as YYYY-MM-DD; got “${w}”.`);
    marked.add(weekIndexOf(start, d));
  }
  return {
    names: [EVENT_COLUMN],
    at(t: number, out: Float64Array): void {
      out[0] = marked.has(t) ? 1 : 0;
    },
  };
}

/** Several regressor sets side by side, as one (undefined when there are none). */
export function joinRegressors(sets: (RegressorSet | undefined)[]): RegressorSet | undefined {
  const present = sets.filter((s): s is RegressorSet => s !== undefined);
  if (present.length <= 1) return present[0];
  const widths = present.map((s) => s.names.length);
  const scratch = present.map((s) => new Float64Array(s.names.length));
  return {
    names: present.flatMap((s) => s.names),
    at(t: number, out: Float64Array): void {
      let j = 0;
      present.forEach((s, k) => {
        s.at(t, scratch[k]);
        out.set(scratch[k], j);
        j += widths[k];
      });
    },
  };
}

/**
 * A cell of an event column read as a mark: 1, TRUE, "1", "x" or "yes" marks the week; 0,
 * FALSE, a blank, "0" or "no" leaves it unmarked; anything else is not a mark (null).
 */
export function readMark(v: unknown): boolean | null {
  if (v === null || v === undefined) return false;
  if (typeof v === "boolean") return v;
  if (typeof v === "number") return v === 1 ? true : v === 0 ? false : null;
  if (typeof v === "string") {
    const t = v.trim().toLowerCase();
    if (t === "" || t === "0" || t === "no" || t === "false") return false;
    if (t === "1" || t === "x" || t === "yes" || t === "true") return true;
  }
  return null;
}

/** Whether every cell reads as a mark and at least one marks a week (a column of 0/1, TRUE/FALSE or x). */
export function isMarkColumn(cells: readonly unknown[]): boolean {
  let marked = false;
  for (const c of cells) {
    const m = readMark(c);
    if (m === null) return false;
    if (m) marked = true;
  }
  return marked;
}

export interface MarkColumn {
  /** The column's cells, row by row beside `dates` (no header). */
  marks: readonly unknown[];
  /** The week-ending date cells of the same rows. */
  dates: readonly unknown[];
  /** What the column is called at the head of a sentence, such as `The event column "Strike"`. */
  what: string;
  dateSystem?: DateSystem;
  /** Offset of the first row and the columns inside the block read, for the error's cell. */
  rowOffset?: number;
  markColOffset?: number;
}

/**
 * The event weeks a column of marks names: the dates of its marked rows, as YYYY-MM-DD, in row
 * order. Rows may run past the last rate (coming weeks), as long as they are dated. Refuses a
 * cell that is not a mark, a marked row without a date, and a column that marks nothing.
 */
export function eventWeeksFromMarks(c: MarkColumn): string[] {
  const out: string[] = [];
  const at = (i: number): { row: number; col: number } | undefined =>
    c.markColOffset === undefined ? undefined : { row: (c.rowOffset ?? 0) + i, col: c.markColOffset };
  // With the cell known, the sink names it; otherwise the row is counted within the column.
  const row = (i: number): string => (at(i) ? "" : `, row ${i + 1}`);
  c.marks.forEach((v, i) => {
    const m = readMark(v);
    if (m === null) {
      throw new InputError("BAD_OPTION", `${c.what}${row(i)}: “${String(v)}” is not a mark; mark each event week with 1 (or x, TRUE) and leave the other weeks blank or 0.`, at(i));
    }
    if (!m) return;
    const d = readDateCell(c.dates[i], c.dateSystem ?? 1900);
    if (d.kind !== "date") {
      throw new InputError("BAD_OPTION", `${c.what}${row(i)}: a week is marked with no week-ending date beside it; date the row or clear the mark.`, at(i));
    }
    out.push(isoDate(d.date));
  });
  if (out.length === 0) throw new InputError("BAD_OPTION", `${c.what}: no week is marked; put 1 (or x) in the rows of the event weeks.`);
  return out;
}
