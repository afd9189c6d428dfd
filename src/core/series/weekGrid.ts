/**
 * Places dated rows on a regular 7-day grid. Rules (DESIGN.md, intake contract):
 * - consecutive dates 6–8 days apart are consecutive weeks (a date moved a day for a
 *   holiday is still its week);
 * - a whole number k ≥ 2 of weeks ± 1 day apart means k − 1 weeks are missing;
 * - equal dates are duplicates, a date earlier than the one above it is out of order, and
 *   any other spacing (daily, monthly, fortnightly data) is not weekly.
 * The week-ending weekday is the most common weekday of the dates; a date one day off it
 * is snapped to its grid week (with a warning), a date two or three days off it is refused,
 * since that is no longer a holiday shift but a different weekly convention.
 */
import { InputError } from "./errors";
import { dayNumber, fromDayNumber } from "./excelDate";
import {
  Locator,
  WEEKDAY_NAMES,
  capitalise,
  dayWithWeekday,
  daysWord,
  isoDay,
  positionName,
  positionsName,
} from "./wording";

export interface DatedRow {
  /** Position of the row in the block that was read (0-based). */
  at: number;
  date: Date;
}

export interface WeekGrid {
  /** Week-ending weekday, 0 = Sunday … 6 = Saturday. */
  weekday: number;
  /** Grid date (UTC midnight) of week 0, the week of the first row. */
  first: Date;
  /** Grid week of each row, in the order given; 0 for the first row, increasing. */
  week: number[];
  warnings: string[];
}

/** The grid date of week `k` of a grid. */
export function gridDate(grid: WeekGrid, k: number): Date {
  return fromDayNumber(dayNumber(grid.first) + 7 * k);
}

/** Weeks spanned by a spacing of `d` days (6–8 → 1, 7k ± 1 → k), or undefined if none. */
export function weeksInSpacing(d: number): number | undefined {
  if (d >= 6 && d <= 8) return 1;
  const k = Math.round(d / 7);
  return k >= 2 && Math.abs(d - 7 * k) <= 1 ? k : undefined;
}

function mostCommonWeekday(rows: readonly DatedRow[]): number {
  const counts = new Array<number>(7).fill(0);
  for (const r of rows) counts[r.date.getUTCDay()]++;
  const top = Math.max(...counts);
  // On a tie, the convention of the most recent rows wins.
  for (let i = rows.length - 1; i >= 0; i--) {
    const wd = rows[i].date.getUTCDay();
    if (counts[wd] === top) return wd;
  }
  return 0;
}

/** Throws the first ordering or spacing problem, in row order. */
function checkSpacing(rows: readonly DatedRow[], days: readonly number[], loc: Locator): void {
  const name = (i: number): string => positionName(loc, rows[i].at);
  for (let i = 1; i < rows.length; i++) {
    const d = days[i] - days[i - 1];
    const cell = loc.dateCell(rows[i].at);
    if (d < 0) {
      throw new InputError(
        "UNSORTED_DATES",
        `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, earlier than ${name(i - 1)} ` +
          `(${isoDay(rows[i - 1].date)}); the weeks must run from oldest to newest.`,
        cell,
      );
    }
    if (d === 0) {
      throw new InputError(
        "DUPLICATE_DATE",
        `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, the same as ${name(i - 1)}; ` +
          `each week must appear only once.`,
        cell,
      );
    }
  }
  const spacings = days.slice(1).map((d, i) => d - days[i]);
  const typical = [...spacings].sort((a, b) => a - b)[Math.floor((spacings.length - 1) / 2)];
  const typicalIsWeekly = typical === undefined || (typical >= 6 && typical <= 8);
  for (let i = 1; i < rows.length; i++) {
    const d = spacings[i - 1];
    const bad = typicalIsWeekly ? weeksInSpacing(d) === undefined : d < 6 || d > 8;
    if (!bad) continue;
    const where =
      `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, ${daysWord(d)} after ` +
      `${name(i - 1)} (${isoDay(rows[i - 1].date)})`;
    const why = typicalIsWeekly
      ? "; weekly dates must be 6 to 8 days apart, or whole weeks apart where weeks are missing."
      : `. Most dates here are ${daysWord(typical)} apart, so this is not a weekly series: ` +
        "Fairlead needs one rate a week.";
    throw new InputError("NOT_WEEKLY", `${where}${why}`, loc.dateCell(rows[i].at));
  }
}

/**
 * Puts each dated row on the weekly grid, or throws the InputError for the first row that
 * breaks the rules above. `rows` are in block order and must be non-empty.
 */
export function placeOnWeekGrid(rows: readonly DatedRow[], loc: Locator): WeekGrid {
  if (rows.length === 0) throw new RangeError("placeOnWeekGrid needs at least one row.");
  const days = rows.map((r) => dayNumber(r.date));
  checkSpacing(rows, days, loc);

  const weekday = mostCommonWeekday(rows);
  const shifted: number[] = [];
  const snapped = days.map((day, i) => {
    const wd = rows[i].date.getUTCDay();
    const ahead = (weekday - wd + 7) % 7; // 0 … 6 days forward to the grid weekday
    const shift = ahead <= 3 ? ahead : ahead - 7; // nearest grid day, −3 … +3
    if (Math.abs(shift) >= 2) {
      throw new InputError(
        "NOT_WEEKLY",
        `${capitalise(positionName(loc, rows[i].at))} is dated ${dayWithWeekday(rows[i].date)}, ` +
          `${daysWord(Math.abs(shift))} away from ${WEEKDAY_NAMES[weekday]}, the weekday most ` +
          "weeks here end on; a week may be moved by one day at most (a holiday shift).",
        loc.dateCell(rows[i].at),
      );
    }
    if (shift !== 0) shifted.push(i);
    return day + shift;
  });

  const warnings: string[] = [];
  const day = WEEKDAY_NAMES[weekday];
  if (shifted.length === 1) {
    const i = shifted[0];
    warnings.push(
      `${capitalise(positionName(loc, rows[i].at))} is dated ${dayWithWeekday(rows[i].date)} ` +
        `rather than a ${day} (probably a holiday shift); it was taken as the week ending ` +
        `${dayWithWeekday(fromDayNumber(snapped[i]))}.`,
    );
  } else if (shifted.length > 1) {
    const where = capitalise(positionsName(loc, shifted.map((i) => rows[i].at)));
    warnings.push(
      `${where} are dated on another weekday than ${day} (probably holiday shifts); ` +
        `each was taken as the week ending on the ${day} nearest to it.`,
    );
  }
  const week = snapped.map((d) => (d - snapped[0]) / 7);
  return { weekday, first: fromDayNumber(snapped[0]), week, warnings };
}
