/**
 * Seasonal factors by ISO-8601 week from the STL seasonal component (Cleveland et al., 1990).
 *
 * Multiplicative (the default for rates): STL runs on log rates, so S_v is a log effect and
 * exp(S_v) a ratio to the seasonally adjusted level. The factor of ISO week w is the mean of
 * exp(S_v) over the weeks v falling in week w, averaged first within each ISO year and then
 * across years (so each year counts once), and the 52 factors are divided by their mean so
 * they average exactly 1. Additive: the same averaging of S_v itself, shifted so the 52
 * effects average 0. STL uses the fixed lag 52 while ISO years have 52 or 53 weeks; week 53
 * is folded into week 52 (DESIGN.md, "Periods").
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { InputError } from "../../series/errors";
import type { WeeklySeries } from "../../series/types";
import type { StlOptions, StlResult } from "./stl";
import { stl } from "./stl";
import { foldNote, ISO_WEEK_ROWS, requireDates, weekYearMeans } from "./weekYear";

export type FactorKind = "multiplicative" | "additive";

export interface WeekFactorOptions {
  /** Default "multiplicative" (needs every rate positive). */
  kind?: FactorKind;
  /** STL settings (period is always 52 here). */
  stl?: StlOptions;
}

export interface WeekFactors {
  kind: FactorKind;
  /** factors[w − 1] for ISO week w = 1 … 52 (NaN if no year has that week). */
  factors: Float64Array;
  /** Number of ISO years averaged for each week. */
  years: Int32Array;
  /** ISO years whose week 53 was folded into week 52. */
  foldedYears: number[];
  table: ReportTable;
}

/** The log of every rate, or an InputError naming the first rate that is not positive. */
export function logRates(values: Float64Array, what: string): Float64Array {
  const out = new Float64Array(values.length);
  for (let i = 0; i < values.length; i++) {
    // Non-finite values pass through as NaN for STL's own check to name them.
    if (Number.isFinite(values[i]) && values[i] <= 0) {
      throw new InputError(
        "NON_POSITIVE",
        `${what} works on log rates, so every rate must be above zero; week ${i + 1} is ${values[i]}. Use additive factors instead.`,
      );
    }
    out[i] = Math.log(values[i]);
  }
  return out;
}

/**
 * Factors per ISO week from a seasonal component aligned with `dates` (log scale for
 * "multiplicative"). Exposed so a caller that already ran STL need not run it again.
 */
export function factorsFromSeasonal(
  dates: Date[],
  seasonal: Float64Array,
  kind: FactorKind,
): { factors: Float64Array; years: Int32Array; foldedYears: number[] } {
  const n = seasonal.length;
  const effect = new Float64Array(n);
  for (let i = 0; i < n; i++) effect[i] = kind === "multiplicative" ? Math.exp(seasonal[i]) : seasonal[i];
  const { means, foldedYears } = weekYearMeans(dates, effect);
  const factors = new Float64Array(ISO_WEEK_ROWS);
  const years = new Int32Array(ISO_WEEK_ROWS);
  let total = 0;
  let filled = 0;
  for (let r = 0; r < ISO_WEEK_ROWS; r++) {
    const row = means[r];
    let s = 0;
    let c = 0;
    for (let j = 0; j < row.length; j++) {
      if (!Number.isNaN(row[j])) {
        s += row[j];
        c++;
      }
    }
    years[r] = c;
    factors[r] = c > 0 ? s / c : NaN;
    if (c > 0) {
      total += factors[r];
      filled++;
    }
  }
  // Normalise: multiplicative factors to mean 1, additive effects to mean 0.
  const centre = total / filled;
  for (let r = 0; r < ISO_WEEK_ROWS; r++) {
    if (Number.isNaN(factors[r])) continue;
    factors[r] = kind === "multiplicative" ? factors[r] / centre : factors[r] - centre;
  }
  return { factors, years, foldedYears };
}

/** Renders factors as the report table: ISO week, factor, number of years averaged. */
export function factorTable(
  f: { factors: Float64Array; years: Int32Array; foldedYears: number[] },
  kind: FactorKind,
  decomposition: StlResult,
  extraNotes: string[] = [],
): ReportTable {
  const rows: Cell[][] = [];
  for (let r = 0; r < ISO_WEEK_ROWS; r++) {
    rows.push([r + 1, Number.isNaN(f.factors[r]) ? null : f.factors[r], f.years[r]]);
  }
  const s = decomposition.settings;
  const notes: string[] = [];
  if (kind === "multiplicative") {
    notes.push(
      "A factor of 1.08 means rates in that week run about 8% above the seasonally adjusted level; the 52 factors average 1.",
      "From STL on log rates: factor = exp(seasonal component), averaged per ISO week.",
    );
  } else {
    notes.push(
      "A factor of +120 means rates in that week run about 120 above the seasonally adjusted level, in the rates' own units; the 52 factors average 0.",
      "From STL on the rates: factor = seasonal component, averaged per ISO week.",
    );
  }
  notes.push(
    `STL settings: period ${s.period}, seasonal window ${s.seasonal}, trend window ${s.trend}, ` +
      `${s.robust ? "robust to outliers" : "not robust"}.`,
  );
  if (f.foldedYears.length > 0) notes.push(foldNote(f.foldedYears));
  notes.push(...extraNotes);
  const title = kind === "multiplicative" ? "Seasonal factors by ISO week" : "Seasonal effects by ISO week (additive)";
  return table(title, ["ISO week", "Factor", "Years averaged"], rows, notes);
}

/** STL and its factors, from a decomposition already made (on log rates when multiplicative). */
export function weekFactorsFrom(dates: Date[], decomposition: StlResult, kind: FactorKind, extraNotes: string[] = []): WeekFactors {
  const f = factorsFromSeasonal(dates, decomposition.seasonal, kind);
  return { kind, ...f, table: factorTable(f, kind, decomposition, extraNotes) };
}

/**
 * Seasonal factors by ISO week of a dated weekly series. Throws InputError when the series has
 * no dates, when a multiplicative factor meets a rate ≤ 0, and for STL's own input checks.
 */
export function weekFactors(series: WeeklySeries, options: WeekFactorOptions = {}): WeekFactors {
  const kind = options.kind ?? "multiplicative";
  const dates = requireDates(series, "Seasonal factors by ISO week");
  const y = kind === "multiplicative" ? logRates(series.values, "Multiplicative seasonal factors") : series.values;
  const decomposition = stl(y, { ...options.stl, period: WEEKS_PER_YEAR });
  return weekFactorsFrom(dates, decomposition, kind);
}
