/** Calendar constants shared by the core (DESIGN.md, "Periods"). */

/** Integer seasonal lag for SARIMA, STL, NNAR and the seasonal naive. */
export const WEEKS_PER_YEAR = 52;

/** The true mean length of a year in weeks, used by TBATS and Fourier terms. */
export const WEEKLY_PERIOD = 365.25 / 7;

export const MS_PER_DAY = 86_400_000;
export const MS_PER_WEEK = 7 * MS_PER_DAY;

/** The week-ending date `steps` weeks after `date` (UTC). */
export function addWeeks(date: Date, steps: number): Date {
  return new Date(date.getTime() + steps * MS_PER_WEEK);
}

/** ISO calendar date text, YYYY-MM-DD, of a UTC date. */
export function isoDate(date: Date): string {
  return date.toISOString().slice(0, 10);
}
