/**
 * Rates laid out by ISO-8601 week (rows 1 … 52) and ISO year (columns), the table the pane
 * draws as a radar chart of one ring per year. Week 53, which some ISO years have (2015,
 * 2020, 2026, …), is folded into week 52 (DESIGN.md, "Periods"): the cell holds the mean of
 * that year's weeks 52 and 53, and a note says so.
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { InputError } from "../../series/errors";
import { isoWeek } from "../../series/isoWeek";
import type { WeeklySeries } from "../../series/types";

/** Rows of the ISO-week tables. */
export const ISO_WEEK_ROWS = 52;

export interface WeekBin {
  /** ISO week-numbering year. */
  year: number;
  /** 1 … 52, week 53 counted as 52. */
  week: number;
  /** True when the date lies in ISO week 53. */
  folded: boolean;
}

/** ISO year and week row of a week-ending date, week 53 folded into 52. */
export function weekBin(date: Date): WeekBin {
  const w = isoWeek(date);
  return w.week === 53 ? { year: w.year, week: 52, folded: true } : { year: w.year, week: w.week, folded: false };
}

/** Throws an InputError when the series has no dates (or not one per value). */
export function requireDates(series: WeeklySeries, what: string): Date[] {
  if (series.dates.length === 0) {
    throw new InputError(
      "BAD_OPTION",
      `${what} needs the week dates, and this series was read without them; select the date column together with the rates.`,
    );
  }
  if (series.dates.length !== series.values.length) {
    throw new InputError(
      "SHAPE",
      `${what} needs one date per rate; the series has ${series.dates.length} dates for ${series.values.length} rates.`,
    );
  }
  return series.dates;
}

/** Sentence for the folding note, naming the years concerned. */
export function foldNote(years: number[]): string {
  const list = years.join(", ");
  const one = years.length === 1;
  return `ISO week 53 (in ${list}) is folded into week 52: ${one ? "that year's" : "each such year's"} weeks 52 and 53 are averaged; the ISO week 53 table gives that week its own factor.`;
}

/**
 * Mean of `values` per (ISO year, week row): `years` ascending, `means[r][c]` for row r
 * (week r + 1) and year `years[c]`, NaN where the year has no value for that week.
 */
export function weekYearMeans(dates: Date[], values: ArrayLike<number>): { years: number[]; means: Float64Array[]; foldedYears: number[] } {
  const n = values.length;
  const bins: WeekBin[] = new Array<WeekBin>(n);
  let first = Infinity;
  let last = -Infinity;
  for (let i = 0; i < n; i++) {
    const b = weekBin(dates[i]);
    bins[i] = b;
    if (b.year < first) first = b.year;
    if (b.year > last) last = b.year;
  }
  const nYears = n === 0 ? 0 : last - first + 1;
  const sum = new Float64Array(ISO_WEEK_ROWS * nYears);
  const count = new Float64Array(ISO_WEEK_ROWS * nYears);
  const folded = new Set<number>();
  for (let i = 0; i < n; i++) {
    const b = bins[i];
    const k = (b.week - 1) * nYears + (b.year - first);
    sum[k] += values[i];
    count[k] += 1;
    if (b.folded) folded.add(b.year);
  }
  const years: number[] = [];
  for (let c = 0; c < nYears; c++) years.push(first + c);
  const means: Float64Array[] = [];
  for (let r = 0; r < ISO_WEEK_ROWS; r++) {
    const row = new Float64Array(nYears);
    for (let c = 0; c < nYears; c++) {
      const k = r * nYears + c;
      row[c] = count[k] > 0 ? sum[k] / count[k] : NaN;
    }
    means.push(row);
  }
  return { years, means, foldedYears: [...folded].sort((a, b) => a - b) };
}

/** The week × year matrix of a dated series as a report table (cells null where no rate). */
export function weekYearTable(series: WeeklySeries): ReportTable {
  const dates = requireDates(series, "The week-by-year table");
  const { years, means, foldedYears } = weekYearMeans(dates, series.values);
  const rows: Cell[][] = means.map((row, r) => {
    const cells: Cell[] = [r + 1];
    for (let c = 0; c < row.length; c++) cells.push(Number.isNaN(row[c]) ? null : row[c]);
    return cells;
  });
  const notes = [
    "Rows are ISO-8601 weeks, columns ISO years (a week belongs to the year of its Thursday).",
  ];
  if (foldedYears.length > 0) notes.push(foldNote(foldedYears));
  const name = series.name ? ` — ${series.name}` : "";
  return table(`Rates by ISO week and year${name}`, ["ISO week", ...years.map(String)], rows, notes);
}
