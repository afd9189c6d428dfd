/**
 * ISO-8601 week dates. Weeks run Monday to Sunday; week 1 of a year is the week holding
 * that year's first Thursday (equivalently, the week holding 4 January), so the ISO year
 * of a day near New Year can differ from its calendar year, and a year has 52 or 53 weeks.
 * All functions read and build dates by their UTC calendar day.
 */
import { dayNumber, fromDayNumber, utcDay } from "./excelDate";

export interface IsoWeek {
  /** The ISO week-numbering year, which may differ from the calendar year near New Year. */
  year: number;
  /** 1 … 52 or 53. */
  week: number;
}

/** ISO weekday of a UTC day: 1 = Monday … 7 = Sunday. */
export function isoWeekday(date: Date): number {
  const d = date.getUTCDay();
  return d === 0 ? 7 : d;
}

/** The ISO year and week number of the UTC day holding `date`. */
export function isoWeek(date: Date): IsoWeek {
  const day = dayNumber(date);
  // The Thursday of the same Monday-to-Sunday week decides the ISO year (ISO 8601,
  // "week containing the first Thursday"); its ordinal day then gives the week number.
  const thursday = fromDayNumber(day - isoWeekday(date) + 4);
  const year = thursday.getUTCFullYear();
  const ordinal = dayNumber(thursday) - dayNumber(utcDay(year, 1, 1)); // 0-based
  return { year, week: Math.floor(ordinal / 7) + 1 };
}

/**
 * 52 or 53. A year has 53 ISO weeks exactly when it starts on a Thursday, or is a leap year
 * starting on a Wednesday: those are the years whose 1 January and 31 December lie in
 * weeks with their Thursday inside the year at both ends.
 */
export function isoWeeksInYear(year: number): number {
  const jan1 = isoWeekday(utcDay(year, 1, 1));
  const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
  return jan1 === 4 || (leap && jan1 === 3) ? 53 : 52;
}

/** The Monday (UTC midnight) that starts ISO week `week` of ISO year `year`. */
export function isoWeekStart(year: number, week: number): Date {
  if (!Number.isInteger(week) || week < 1 || week > isoWeeksInYear(year)) {
    throw new RangeError(`${year} has no ISO week ${week}.`);
  }
  const jan4 = utcDay(year, 1, 4); // always in week 1
  const monday1 = dayNumber(jan4) - (isoWeekday(jan4) - 1);
  return fromDayNumber(monday1 + 7 * (week - 1));
}

/** "2026-W53". */
export function isoWeekLabel(w: IsoWeek): string {
  return `${String(w.year).padStart(4, "0")}-W${String(w.week).padStart(2, "0")}`;
}
