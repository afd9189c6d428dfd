/**
 * Seasonality diagnostics: STL (Cleveland et al., 1990), seasonal and trend strength
 * (Wang, Smith & Hyndman, 2006), seasonal factors by ISO week (with ISO week 53 on its own),
 * and the week × year table.
 */
import type { ReportTable } from "../../report";
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { InputError } from "../../series/errors";
import type { WeeklySeries } from "../../series/types";
import type { FactorKind } from "./factors";
import { logRates, weekFactorsFrom } from "./factors";
import { holidayFactors } from "./holidayFactors";
import type { StlOptions } from "./stl";
import { stl } from "./stl";
import { noiseBaseline, stlStrength, strengthTable } from "./strength";
import { week53Factors } from "./week53";

export { loessAt, loessSmooth } from "./loess";
export type { StlOptions, StlResult, StlSettings } from "./stl";
export { DEFAULT_SEASONAL_WINDOW, robustnessWeights, smallestOddAtLeast, stl, stlMinLength, stlSettings } from "./stl";
export type { Components, StrengthResult } from "./strength";
export { BASELINE_REPLICATIONS, STRONG_STRENGTH, WEAK_STRENGTH, clearNoiseBaselineCache, noiseBaseline, stlStrength, strengthTable } from "./strength";
export type { FactorKind, WeekFactorOptions, WeekFactors } from "./factors";
export { HOLIDAY_WEEKS, holidayFactors, type HolidayFactors } from "./holidayFactors";
export { week53Factors, type Week53Factors, type Week53Source } from "./week53";
export { factorTable, factorsFromSeasonal, logRates, weekFactors, weekFactorsFrom } from "./factors";
export type { WeekBin } from "./weekYear";
export { decompositionTable } from "./decomposition";
export { ISO_WEEK_ROWS, foldNote, requireDates, weekBin, weekYearMeans, weekYearTable } from "./weekYear";

/** Fewest weeks for the seasonality summary: with only two years each week-of-year series has
 * two points, the seasonal smoother passes through them exactly, the remainder vanishes and
 * both strengths read 1 whatever the data. Three years leave the remainder something to measure. */
export const SEASONALITY_MIN_WEEKS = 3 * WEEKS_PER_YEAR;

export interface SeasonalitySummary {
  tables: ReportTable[];
  /** The rates with the STL seasonal component removed (on the rates' own scale). */
  adjusted: Float64Array;
  /** True when the seasonal strength exceeds the noise baseline: the annual pattern is real. */
  seasonalReal: boolean;
  kind: FactorKind;
}

/**
 * The seasonality tables for analyse(): strength, then (for a dated series) the factors by
 * ISO week, around the lunar new year and of ISO week 53, from one STL run with period 52 (plus the seeded noise baseline of strength.ts).
 * When every rate is positive STL runs on log rates and the factors are multiplicative;
 * otherwise on the rates, additive. An undated series gets the strength table only, with a
 * note. Fewer than three years is an InputError (see SEASONALITY_MIN_WEEKS); other
 * InputErrors from STL (constant, not finite, bad option) propagate.
 */
export function seasonalityAnalysis(series: WeeklySeries, options: StlOptions & { kind?: FactorKind } = {}): SeasonalitySummary {
  const n = series.values.length;
  if (n < SEASONALITY_MIN_WEEKS) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `Seasonal strength and factors need at least three years of weekly rates (${SEASONALITY_MIN_WEEKS} weeks); the series has ${n}.`,
    );
  }
  let positive = true;
  for (let i = 0; i < n; i++) {
    if (!(series.values[i] > 0)) positive = false;
  }
  if (options.kind === "multiplicative" && !positive) {
    throw new InputError("NON_POSITIVE", "Multiplicative seasonal factors need every rate above zero; some are zero or negative. Ask for additive factors instead.");
  }
  // Multiplicative (on log rates) whenever the rates allow it, unless additive is asked for.
  const kind: FactorKind = options.kind ?? (positive ? "multiplicative" : "additive");
  positive = kind === "multiplicative";
  const y = positive ? logRates(series.values, "The seasonal decomposition") : series.values;
  const { kind: _kind, ...stlRest } = options;
  void _kind;
  const stlOptions: StlOptions = { ...stlRest, period: WEEKS_PER_YEAR };
  const decomposition = stl(y, stlOptions);
  const baseline = noiseBaseline(y.length, stlOptions);
  const strength = stlStrength(decomposition, { noiseBaseline: baseline });
  const seasonalReal = strength.seasonal > baseline;
  const notes: string[] = [
    positive
      ? "Measured on log rates, so the components describe percentage swings."
      : "Measured on the rates themselves (some are zero or negative, so no logs).",
  ];
  const filled = series.filled.filter(Boolean).length;
  if (filled > 0) {
    notes.push(`${filled} filled week${filled === 1 ? "" : "s"} (interpolated across gaps) are included in the decomposition.`);
  }
  const dated = series.dates.length > 0 && series.dates.length === n;
  if (!dated) notes.push("The series has no dates, so no seasonal factors by ISO week are given.");
  const tables: ReportTable[] = [strengthTable(strength, notes)];
  if (dated) {
    const caveat = seasonalReal
      ? []
      : ["The seasonal strength is no higher than white noise would show: read these factors as noise, not as an annual pattern."];
    tables.push(weekFactorsFrom(series.dates, decomposition, kind, caveat).table);
    tables.push(holidayFactors(series.dates, decomposition, kind).table);
    tables.push(week53Factors(series.dates, decomposition, kind).table);
  }
  const adjusted = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    adjusted[t] = positive ? series.values[t] / Math.exp(decomposition.seasonal[t]) : series.values[t] - decomposition.seasonal[t];
  }
  return { tables, adjusted, seasonalReal, kind };
}

/** The seasonality report tables alone (see seasonalityAnalysis). */
export function seasonalitySummary(series: WeeklySeries, options: StlOptions = {}): ReportTable[] {
  return seasonalityAnalysis(series, options).tables;
}
