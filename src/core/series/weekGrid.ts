/**
 * Places dated rows on a regular 7-day grid. Rules (DESIGN.md, intake contract):
 * - the week-ending weekday is the most common weekday of the dates; a date one day off it
 *   (a holiday shift) is snapped to its grid week, with a warning, and a date two or three
 *   days off it is refused, since that is a different weekly convention;
 * - spacing, order and duplicates are judged on the snapped days: consecutive grid weeks
 *   are consecutive weeks, k ≥ 2 grid weeks apart means k − 1 weeks are missing, two rows
 *   on one grid week are duplicates, and a row on an earlier week is out of order;
 * - data whose typical spacing is far from a week (daily, monthly, fortnightly) is refused
 *   as not weekly.
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

/** Median of the spacings between consecutive days (undefined for a single row). */
function typicalSpacing(days: readonly number[]): number | undefined {
  const spacings = days.slice(1).map((d, i) => d - days[i]);
  return [...spacings].sort((a, b) => a - b)[Math.floor((spacings.length - 1) / 2)];
}

/**
 * Data that is not weekly at all (daily, monthly, fortnightly): throws the first ordering
 * problem, else the first step that is not 6–8 days, read on the raw dates.
 */
function refuseNotWeekly(
  rows: readonly DatedRow[],
  days: readonly number[],
  typical: number,
  loc: Locator,
): never {
  const name = (i: number): string => positionName(loc, rows[i].at);
  for (let i = 1; i < rows.length; i++) {
    const d = days[i] - days[i - 1];
    if (d < 0) throw unsorted(rows, i, loc);
    if (d === 0) throw duplicate(rows, i, loc);
  }
  for (let i = 1; i < rows.length; i++) {
    const d = days[i] - days[i - 1];
    if (d >= 6 && d <= 8) continue;
    throw new InputError(
      "NOT_WEEKLY",
      `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, ${daysWord(d)} after ` +
        `${name(i - 1)} (${isoDay(rows[i - 1].date)}). Most dates here are ${daysWord(typical)} ` +
        "apart, so this is not a weekly series: Fairlead needs one rate a week.",
      loc.dateCell(rows[i].at),
    );
  }
  throw new RangeError("refuseNotWeekly found no step outside 6–8 days.");
}

function unsorted(rows: readonly DatedRow[], i: number, loc: Locator): InputError {
  const name = (k: number): string => positionName(loc, rows[k].at);
  return new InputError(
    "UNSORTED_DATES",
    `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, earlier than ${name(i - 1)} ` +
      `(${isoDay(rows[i - 1].date)}); the weeks must run from oldest to newest.`,
    loc.dateCell(rows[i].at),
  );
}

/** Row i falls in the same week as row i − 1: the same date, or both snapped to one week. */
function duplicate(rows: readonly DatedRow[], i: number, loc: Locator, gridDay?: number): InputError {
  const name = (k: number): string => positionName(loc, rows[k].at);
  const same = dayNumber(rows[i].date) === dayNumber(rows[i - 1].date);
  const message =
    same || gridDay === undefined
      ? `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, the same as ${name(i - 1)}; ` +
        "each week must appear only once."
      : `${capitalise(name(i))} is dated ${dayWithWeekday(rows[i].date)} and ${name(i - 1)} ` +
        `${dayWithWeekday(rows[i - 1].date)}: both fall in the week ending ` +
        `${dayWithWeekday(fromDayNumber(gridDay))}, and each week must appear only once.`;
  return new InputError("DUPLICATE_DATE", message, loc.dateCell(rows[i].at));
}

/**
 * Puts each dated row on the weekly grid, or throws the InputError for the first row that
 * breaks the rules above. `rows` are in block order and must be non-empty.
 *
 * Each date is snapped to its grid week before spacings are judged: a Thursday (holiday
 * shift back) followed by a Saturday (shift forward) around Fridays is 9 days on the
 * calendar but one week on the grid, and Saturday then Thursday is 5 days but one week.
 */
export function placeOnWeekGrid(rows: readonly DatedRow[], loc: Locator): WeekGrid {
  if (rows.length === 0) throw new RangeError("placeOnWeekGrid needs at least one row.");
  const days = rows.map((r) => dayNumber(r.date));
  // Two opposite one-day shifts side by side make 5- or 9-day steps, so a median of 5 or 9
  // days can still be weekly data; daily, fortnightly and monthly data are far from it.
  const typical = typicalSpacing(days);
  if (typical !== undefined && (typical < 5 || typical > 9)) {
    refuseNotWeekly(rows, days, typical, loc);
  }

  const weekday = mostCommonWeekday(rows);
  const shift = rows.map((r) => {
    const ahead = (weekday - r.date.getUTCDay() + 7) % 7; // 0 … 6 days forward to the grid weekday
    return ahead <= 3 ? ahead : ahead - 7; // nearest grid day, −3 … +3
  });
  const snapped = days.map((day, i) => day + shift[i]);
  const name = (i: number): string => positionName(loc, rows[i].at);

  // In row order: ordering, then spacing, then the weekday of the row itself.
  for (let i = 0; i < rows.length; i++) {
    if (i > 0) {
      // Snapped days of rows within a day of the grid are whole weeks apart; a row further
      // off is judged on its raw date, as it cannot be placed anyway.
      const onGrid = Math.abs(shift[i - 1]) <= 1 && Math.abs(shift[i]) <= 1;
      const d = onGrid ? snapped[i] - snapped[i - 1] : days[i] - days[i - 1];
      if (d < 0) throw unsorted(rows, i, loc);
      if (d === 0) throw duplicate(rows, i, loc, onGrid ? snapped[i] : undefined);
      if (!onGrid && weeksInSpacing(d) === undefined) {
        throw new InputError(
          "NOT_WEEKLY",
          `${capitalise(name(i))} is dated ${isoDay(rows[i].date)}, ${daysWord(d)} after ` +
            `${name(i - 1)} (${isoDay(rows[i - 1].date)}); weekly dates must be 6 to 8 days ` +
            "apart, or whole weeks apart where weeks are missing.",
          loc.dateCell(rows[i].at),
        );
      }
    }
    if (Math.abs(shift[i]) >= 2) {
      throw new InputError(
        "NOT_WEEKLY",
        `${capitalise(name(i))} is dated ${dayWithWeekday(rows[i].date)}, ` +
          `${daysWord(Math.abs(shift[i]))} away from ${WEEKDAY_NAMES[weekday]}, the weekday most ` +
          "weeks here end on; a week may be moved by one day at most (a holiday shift).",
        loc.dateCell(rows[i].at),
      );
    }
  }
  const shifted = rows.map((_, i) => i).filter((i) => shift[i] !== 0);

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
