/**
 * Small helpers that turn positions and values into the plain sentences the intake shows
 * to a desk analyst: "Row 14", "rows 10–12", a quoted cell text, a weekday name.
 */
import type { CellOffset } from "./errors";

export const WEEKDAY_NAMES = [
  "Sunday",
  "Monday",
  "Tuesday",
  "Wednesday",
  "Thursday",
  "Friday",
  "Saturday",
] as const;

/**
 * Where the cells of one series sit: how a position is named in a sentence and which cell
 * offset an error reports. Positions are 0-based indices along the series as read (header
 * row included), so "row 1" in a sentence is the first row of the block.
 */
export interface Locator {
  /** "row" for a single column, "column" for a single row. */
  readonly unit: "row" | "column";
  valueCell(i: number): CellOffset;
  dateCell(i: number): CellOffset;
}

export function capitalise(s: string): string {
  return s.length === 0 ? s : s[0].toUpperCase() + s.slice(1);
}

/** "row 14" (1-based) for position 13. */
export function positionName(loc: Locator, i: number): string {
  return `${loc.unit} ${i + 1}`;
}

/**
 * Names a set of positions compactly: "row 4", "rows 4 and 9", "rows 4–6 and 9". Long
 * lists are cut after `limit` pieces with "and N more".
 */
export function positionsName(loc: Locator, positions: readonly number[], limit = 6): string {
  const sorted = [...new Set(positions)].sort((a, b) => a - b);
  if (sorted.length === 0) return `no ${loc.unit}s`;
  if (sorted.length === 1) return positionName(loc, sorted[0]);
  const pieces: string[] = [];
  let start = sorted[0];
  let prev = sorted[0];
  const close = (): void => {
    if (start === prev) pieces.push(String(start + 1));
    else if (prev === start + 1) pieces.push(String(start + 1), String(prev + 1));
    else pieces.push(`${start + 1}–${prev + 1}`);
  };
  for (let k = 1; k < sorted.length; k++) {
    if (sorted[k] === prev + 1) {
      prev = sorted[k];
      continue;
    }
    close();
    start = prev = sorted[k];
  }
  close();
  let shown = pieces;
  let tail = "";
  if (pieces.length > limit) {
    shown = pieces.slice(0, limit);
    tail = ` and ${pieces.length - limit} more`;
  }
  return `${loc.unit}s ${joinList(shown)}${tail}`;
}

/** "a", "a and b", "a, b and c". */
export function joinList(items: readonly string[]): string {
  if (items.length <= 1) return items.join("");
  return `${items.slice(0, -1).join(", ")} and ${items[items.length - 1]}`;
}

/** A cell's content as it should appear inside a sentence, quoted when it is text. */
export function shownValue(value: unknown): string {
  if (typeof value === "string") {
    const t = value.length > 40 ? `${value.slice(0, 37)}...` : value;
    return `"${t}"`;
  }
  if (typeof value === "boolean") return value ? "TRUE" : "FALSE";
  if (typeof value === "number") return String(value);
  if (value instanceof Date) return Number.isNaN(value.getTime()) ? "an invalid date" : "a date";
  if (value === null || value === undefined) return "nothing";
  return "a value of an unexpected kind";
}

/** "1 week" / "3 weeks". */
export function weeksWord(n: number): string {
  return n === 1 ? "1 week" : `${n} weeks`;
}

/** ISO calendar date text YYYY-MM-DD of a UTC date. */
export function isoDay(date: Date): string {
  return date.toISOString().slice(0, 10);
}

/** "Friday 2025-01-03". */
export function dayWithWeekday(date: Date): string {
  return `${WEEKDAY_NAMES[date.getUTCDay()]} ${isoDay(date)}`;
}

/** "1 day" / "9 days". */
export function daysWord(n: number): string {
  return n === 1 ? "1 day" : `${n} days`;
}
