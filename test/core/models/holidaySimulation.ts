/**
 * The seeded simulation the calendar tests of SARIMA and TBATS share (known truth): weekly log
 * rates from Friday 2014-01-03 with an annual swing of period 365.25/7, AR(1) noise (φ = 0.7,
 * innovation sd 0.03) and, when asked, a dip in the weeks of the moving lunar new year.
 */
import { MersenneTwister } from "../../../src/core/math/rng";
import type { Fitted } from "../../../src/core/models/types";
import type { Report } from "../../../src/core/analysis";
import type { WeeklySeries } from "../../../src/core/series/types";
import { lunarNewYear } from "../../../src/core/series/lunar";
import { lunarOffset } from "../../../src/core/series/lunarRegressors";

export const START = "2014-01-03"; // a Friday
export const WEEK = 7 * 86_400_000;
/** The simulated effect on log rates, by week offset from the holiday (0 = the week holding it). */
export const DIP: Record<number, number> = { 0: -0.12, 1: -0.15, 2: -0.06 };

export function simulate(seed: number, n: number, effect: boolean): Float64Array {
  const rng = new MersenneTwister(seed);
  const start = Date.parse(`${START}T00:00:00Z`);
  const y = new Float64Array(n);
  let e = 0;
  for (let t = 0; t < n; t++) {
    e = 0.7 * e + 0.03 * rng.normal();
    const k = lunarOffset(new Date(start + t * WEEK));
    const dip = effect ? (DIP[k] ?? 0) : 0;
    y[t] = Math.exp(7.5 + 0.08 * Math.sin((2 * Math.PI * t) / (365.25 / 7)) + e + dip);
  }
  return y;
}

/** A named coefficient of a fit's summary with its standard error (throws when it has none). */
export function coefficient(f: Fitted, name: string): { value: number; se: number } {
  const p = f.summary().parameters.find((x) => x.name === name);
  if (!p || p.se === undefined || p.se === null) throw new Error(`no coefficient ${name}`);
  return { value: p.value, se: p.se };
}

/** Index of the first week of the holiday window (offset −1) in the last year of a series of n weeks. */
export function lastWindowStart(n: number): number {
  const start = Date.parse(`${START}T00:00:00Z`);
  const lastYear = new Date(start + (n - 1) * WEEK).getUTCFullYear();
  const l = lunarNewYear(lastYear).getTime();
  for (let t = n - 1; t >= 0; t--) if (start + t * WEEK < l - 7 * 86_400_000) return t + 1;
  throw new Error("no window");
}

/** The window's coefficient names, offsets −1 … +3. */
export const WINDOW_NAMES = ["Lunar new year week −1", "Lunar new year week", "Lunar new year week +1", "Lunar new year week +2", "Lunar new year week +3"];

/** The simulated rates as a dated weekly series (weeks ending Friday from START). */
export function datedSeries(y: Float64Array): WeeklySeries {
  const start = Date.parse(`${START}T00:00:00Z`);
  const n = y.length;
  return { dates: Array.from({ length: n }, (_, t) => new Date(start + t * WEEK)), values: y, filled: new Array<boolean>(n).fill(false), warnings: [] };
}

/** A method's backtest MASE averaged over its rows of the accuracy table (one per week ahead), and how many rows. */
export function backtestMase(report: Report, label: string): { mean: number; rows: number } {
  const t = report.tables.backtest;
  if (!t) throw new Error("no backtest");
  const col = (c: string): number => t.columns.indexOf(c);
  const rows = t.rows.filter((x) => x[col("Method")] === label);
  return { mean: rows.reduce((a, x) => a + Number(x[col("MASE")]), 0) / rows.length, rows: rows.length };
}
