/**
 * Seasonality diagnostics: STL (Cleveland et al., 1990), seasonal and trend strength
 * (Wang, Smith & Hyndman, 2006), seasonal factors by ISO week, and the week × year table.
 */
import type { ReportTable } from "../../report";
import { WEEKS_PER_YEAR } from "../../series/calendar";
import type { WeeklySeries } from "../../series/types";
import type { FactorKind } from "./factors";
import { logRates, weekFactorsFrom } from "./factors";
import type { StlOptions } from "./stl";
import { stl } from "./stl";
import { noiseBaseline, stlStrength, strengthTable } from "./strength";

export { loessAt, loessSmooth } from "./loess";
export type { StlOptions, StlResult, StlSettings } from "./stl";
export { DEFAULT_SEASONAL_WINDOW, robustnessWeights, smallestOddAtLeast, stl, stlMinLength, stlSettings } from "./stl";
export type { Components, StrengthResult } from "./strength";
export { BASELINE_REPLICATIONS, STRONG_STRENGTH, WEAK_STRENGTH, noiseBaseline, stlStrength, strengthTable } from "./strength";
export type { FactorKind, WeekFactorOptions, WeekFactors } from "./factors";
export { factorTable, factorsFromSeasonal, logRates, weekFactors, weekFactorsFrom } from "./factors";
export type { WeekBin } from "./weekYear";
export { ISO_WEEK_ROWS, foldNote, requireDates, weekBin, weekYearMeans, weekYearTable } from "./weekYear";

/**
 * The seasonality tables for analyse(): strength, then (for a dated series) the factors by
 * ISO week, from one STL run with period 52 (plus the seeded noise baseline of strength.ts). When every rate is positive STL runs on log
 * rates and the factors are multiplicative; otherwise on the rates, additive. An undated
 * series gets the strength table only, with a note. InputErrors from STL (too short,
 * constant, not finite, bad option) propagate.
 */
export function seasonalitySummary(series: WeeklySeries, options: StlOptions = {}): ReportTable[] {
  let positive = true;
  for (let i = 0; i < series.values.length; i++) {
    if (!(series.values[i] > 0)) positive = false;
  }
  const kind: FactorKind = positive ? "multiplicative" : "additive";
  const y = positive ? logRates(series.values, "The seasonal decomposition") : series.values;
  const stlOptions: StlOptions = { ...options, period: WEEKS_PER_YEAR };
  const decomposition = stl(y, stlOptions);
  const baseline = noiseBaseline(y.length, stlOptions);
  const notes: string[] = [
    positive
      ? "Measured on log rates, so the components describe percentage swings."
      : "Measured on the rates themselves (some are zero or negative, so no logs).",
  ];
  const dated = series.dates.length > 0 && series.dates.length === series.values.length;
  if (!dated) notes.push("The series has no dates, so no seasonal factors by ISO week are given.");
  const out: ReportTable[] = [strengthTable(stlStrength(decomposition, { noiseBaseline: baseline }), notes)];
  if (dated) out.push(weekFactorsFrom(series.dates, decomposition, kind).table);
  return out;
}
