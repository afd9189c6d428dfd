/**
 * The STL decomposition week by week, as a report table: the same run the seasonality checks
 * make (period 52, on log rates when every rate is positive), shown on the rates' own scale.
 * On logs the parts multiply back to the rate: rate = trend × seasonal × remainder, with the
 * seasonal and remainder as factors around 1; otherwise they add: rate = trend + seasonal +
 * remainder.
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { WEEKS_PER_YEAR, isoDate } from "../../series/calendar";
import type { WeeklySeries } from "../../series/types";
import { InputError } from "../../series/errors";
import { logRates, type FactorKind } from "./factors";
import { stl, type StlOptions } from "./stl";

export function decompositionTable(series: WeeklySeries, options: StlOptions = {}, kind?: FactorKind): ReportTable {
  const y = series.values;
  const n = y.length;
  const allPositive = y.every((v) => v > 0);
  if (kind === "multiplicative" && !allPositive) {
    throw new InputError("NON_POSITIVE", "A multiplicative decomposition needs every rate above zero; some are zero or negative. Ask for an additive one instead.");
  }
  const positive = kind === undefined ? allPositive : kind === "multiplicative";
  const d = stl(positive ? logRates(y, "The decomposition") : y, { ...options, period: WEEKS_PER_YEAR });
  const dated = series.dates.length === n;
  const rows: Cell[][] = [];
  for (let t = 0; t < n; t++) {
    const parts = positive ? [Math.exp(d.trend[t]), Math.exp(d.seasonal[t]), Math.exp(d.remainder[t])] : [d.trend[t], d.seasonal[t], d.remainder[t]];
    rows.push([dated ? isoDate(series.dates[t]) : t + 1, y[t], ...parts, series.filled[t] ? "filled" : null]);
  }
  const s = d.settings;
  const notes = [
    positive
      ? "STL on log rates: the rate is trend × seasonal × remainder; seasonal and remainder are factors (1.05 is 5% above)."
      : "STL on the rates (some are zero or negative, so no logs): the rate is trend + seasonal + remainder.",
    `STL settings: period ${s.period}, seasonal window ${s.seasonal}, trend window ${s.trend}, ${s.robust ? "robust to outliers" : "not robust"}.`,
  ];
  if (series.filled.some(Boolean)) notes.push("Weeks marked filled had no rate in the sheet; their value was interpolated before the decomposition.");
  return table("Decomposition (STL)", [dated ? "Week ending" : "Week", "Rate", "Trend", "Seasonal", "Remainder", "Note"], rows, notes);
}
