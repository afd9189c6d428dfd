/** Builders for the cell blocks the intake tests read (not a test file itself). */

const DAY = 86_400_000;

/** ISO date text `days` after `start` (YYYY-MM-DD). */
export function plusDays(start: string, days: number): string {
  return new Date(Date.parse(`${start}T00:00:00Z`) + days * DAY).toISOString().slice(0, 10);
}

/** `n` ISO dates, `step` days apart, from `start`. */
export function weekly(start: string, n: number, step = 7): string[] {
  return Array.from({ length: n }, (_, i) => plusDays(start, i * step));
}

/** A single-column block. */
export function column(cells: readonly unknown[]): unknown[][] {
  return cells.map((c) => [c]);
}

/** ISO text of each output date. */
export function isoDays(dates: readonly Date[]): string[] {
  return dates.map((d) => d.toISOString().slice(0, 10));
}
