/**
 * A factor for ISO week 53. ISO-8601 years have 52 or 53 weeks (53 when the year starts on a
 * Thursday, or is a leap year starting on a Wednesday: 2015, 2020, 2026, 2032, …). The ISO-week
 * factor table keeps 52 rows and folds week 53 into week 52 (DESIGN.md, "Periods"), so a
 * budget for a 53-week year has no factor for its last week; this table gives one, one row per
 * 53-week ISO year from the first year of the data through the first week 53 still to come.
 *
 * An observed week 53 is measured against the weeks either side of it, the same year's week 52
 * and the next year's week 1: on log rates (the STL input, trend + seasonal + remainder), its
 * value less the mean of theirs, as a ratio exp(·) (additive: the rate less the mean of theirs).
 * Against its neighbours, not against the STL trend: at the turn of the year rates often jump
 * (new contract rates, surcharges), and a loess trend lags a jump by weeks, so a ratio to trend
 * in week 53 measures the trend's lag, not the week (found on the sample desk book, where the
 * index's 2020 week 53 read 0.81 of trend while it stood level with its neighbours). A local
 * linear drift cancels exactly in the neighbours' mean. The factor to use is the 52-week
 * table's mean factor of weeks 52 and 1 times that ratio (plus it, additive); a coming week 53
 * uses the mean ratio of the observed years, or none (the weeks-52-and-1 factor alone) when the
 * data hold no week 53.
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { MS_PER_DAY, MS_PER_WEEK, isoDate } from "../../series/calendar";
import { isoWeek, isoWeekStart, isoWeekday, isoWeeksInYear } from "../../series/isoWeek";
import type { FactorKind } from "./factors";
import { factorsFromSeasonal } from "./factors";
import type { StlResult } from "./stl";

/** Where a row's "Factor to use" comes from. */
export type Week53Source = "observed" | "mean" | "between";

export interface Week53Factors {
  /** The 53-week ISO years, ascending; the last is the first one whose week 53 ends after the data. */
  years: number[];
  /** Week-ending date of each year's week 53, on the series' own weekday. */
  weekEnding: Date[];
  /** The week against the mean of weeks 52 and 1 beside it: a ratio (additive: a difference); NaN where not in the data. */
  ratio: Float64Array;
  /** The factor to use (NaN only when the data has no week 53, 52 or 1 at all). */
  factor: Float64Array;
  source: Week53Source[];
  /** Weeks 53 in the data: how many ratios the mean is taken over. */
  observed: number;
  table: ReportTable;
}

/** The date with the weekday of `like` in ISO week 53 of `year` (which must have one). */
function week53Ending(year: number, like: Date): Date {
  return new Date(isoWeekStart(year, 53).getTime() + (isoWeekday(like) - 1) * MS_PER_DAY);
}

/** "2015, 2020 and 2026". */
function listYears(years: number[]): string {
  return years.length <= 1 ? years.join("") : `${years.slice(0, -1).join(", ")} and ${years[years.length - 1]}`;
}

export function week53Factors(dates: Date[], decomposition: StlResult, kind: FactorKind): Week53Factors {
  const { trend, seasonal, remainder } = decomposition;
  const n = seasonal.length;
  const mult = kind === "multiplicative";
  const last = dates[n - 1];
  // The STL input (log rates when multiplicative) rebuilt from its parts.
  const level = (t: number): number => trend[t] + seasonal[t] + remainder[t];

  // The first week 53 ending after the last date: step a week at a time (at most about six years).
  let coming = new Date(last.getTime() + MS_PER_WEEK);
  while (isoWeek(coming).week !== 53) coming = new Date(coming.getTime() + MS_PER_WEEK);
  const comingYear = isoWeek(coming).year;

  const index = new Map<number, number>();
  for (let t = 0; t < n; t++) index.set(dates[t].getTime(), t);
  const years: number[] = [];
  const weekEnding: Date[] = [];
  for (let y = isoWeek(dates[0]).year; y < comingYear; y++) {
    if (isoWeeksInYear(y) !== 53) continue;
    years.push(y);
    weekEnding.push(week53Ending(y, last));
  }
  years.push(comingYear);
  weekEnding.push(coming);

  const m = years.length;
  const ratio = new Float64Array(m).fill(NaN);
  let sum = 0;
  let observed = 0;
  weekEnding.forEach((d, j) => {
    const t = index.get(d.getTime());
    if (t === undefined) return;
    // Weeks 52 and 1 beside it (the series is weekly without gaps: t − 1 and t + 1); one side at an end.
    const sides = [t - 1, t + 1].filter((u) => u >= 0 && u < n).map(level);
    if (sides.length === 0) return;
    const gap = level(t) - sides.reduce((a, b) => a + b, 0) / sides.length;
    const r = mult ? Math.exp(gap) : gap;
    if (!Number.isFinite(r)) return;
    ratio[j] = r;
    sum += r;
    observed++;
  });

  // The weeks either side in the 52-week table, as factors.ts makes them.
  const iso = factorsFromSeasonal(dates, seasonal, kind).factors;
  const sides = [iso[51], iso[0]].filter((v) => !Number.isNaN(v));
  const between = sides.length > 0 ? sides.reduce((a, b) => a + b, 0) / sides.length : NaN;
  const apply = (r: number): number => (mult ? between * r : between + r);
  const stand = observed > 0 ? apply(sum / observed) : between;
  const standSource: Week53Source = observed > 0 ? "mean" : "between";
  const standText =
    observed > 1
      ? `mean of ${observed} observed weeks 53`
      : observed === 1
        ? "the one observed week 53"
        : sides.length > 0
          ? "weeks 52 and 1 (no week 53 in the data)"
          : "none: no week 53, 52 or 1 in the data";

  const factor = new Float64Array(m);
  const source: Week53Source[] = [];
  const rows: Cell[][] = [];
  const cell = (v: number): Cell => (Number.isNaN(v) ? null : v);
  for (let j = 0; j < m; j++) {
    const seen = !Number.isNaN(ratio[j]);
    factor[j] = seen ? apply(ratio[j]) : stand;
    source.push(seen ? "observed" : standSource);
    rows.push([years[j], isoDate(weekEnding[j]), cell(ratio[j]), cell(between), cell(factor[j]), seen ? "this year's week 53" : standText]);
  }

  const notes = [
    `Some ISO years have a 53rd week (a week belongs to the year of its Thursday, and a year that starts on a Thursday, or a leap year that starts on a Wednesday, ends with a 53rd); in this table: ${listYears(years)}.`,
    "The 52-week table of seasonal factors folds week 53 into week 52, so it has no factor of week 53's own; this table gives one.",
    mult
      ? "Against weeks 52 and 1: the rate in week 53 over the mean of the weeks either side of it (on the log scale); 1.03 means about 3% above them. A jump of rates at the turn of the year, which a trend line lags, does not show in it."
      : "Against weeks 52 and 1: the rate in week 53 less the mean of the weeks either side of it, in the rates' own units. A jump of rates at the turn of the year, which a trend line lags, does not show in it.",
    mult
      ? "Factor to use: the 52-week table's factor for weeks 52 and 1 (their mean) times that ratio, on the table's scale; a coming week 53 takes the mean ratio of the years observed, or the weeks-52-and-1 factor alone when the data hold no week 53."
      : "Factor to use: the 52-week table's effect for weeks 52 and 1 (their mean) plus that difference; a coming week 53 takes the mean difference of the years observed, or the weeks-52-and-1 effect alone when the data hold no week 53.",
    "Each observed week holds that one year's noise besides the season, so a single week 53 can be off by the size of a normal week's swing; the mean of several years is steadier.",
  ];
  const title = mult ? "ISO week 53" : "ISO week 53 (additive)";
  return {
    years,
    weekEnding,
    ratio,
    factor,
    source,
    observed,
    table: table(title, ["ISO year", "Week ending", "Against weeks 52 and 1", "Weeks 52 and 1 factor", "Factor to use", "From"], rows, notes),
  };
}
