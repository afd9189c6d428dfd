/**
 * Residual checks after a fit: the Ljung–Box test for leftover autocorrelation, the
 * Jarque–Bera test for normal errors, and the correlogram a chart draws.
 *
 * Models without fitted values for their first weeks (a seasonal difference needs a year of
 * history; NNAR needs its lags) hand over residuals that start with NaN. Those leading gaps are
 * dropped and the report says how many; a gap after the first residual is an input error.
 */
import type { ReportTable } from "../../report";
import { InputError } from "../../series/errors";
import type { TestResult } from "../types";
import { DEFAULT_LEVEL, testTable } from "../types";
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { checkLevel, correlogram, correlogramTable } from "./acf";
import type { Correlogram } from "./acf";
import { jarqueBera } from "./jarqueBera";
import { ljungBox } from "./ljungBox";

export * from "./acf";
export * from "./ljungBox";
export * from "./jarqueBera";

export interface ResidualCheckOptions {
  /** Number of fitted ARMA coefficients, subtracted from the Ljung–Box degrees of freedom; default 0. */
  fitDf?: number;
  /** Ljung–Box lags; default min(2·period, ⌊n/5⌋) (ljungBox.ts). */
  lags?: number;
  /** Correlogram lags; default min(2·period, ⌊n/4⌋) (acf.ts). */
  acfLags?: number;
  /** Seasonal period for the defaults; default 52. */
  period?: number;
  /** Significance level of verdicts and bands; default 0.05. */
  level?: number;
}

export interface ResidualChecks {
  /** Ljung–Box and Jarque–Bera, one row each (testTable). */
  tests: ReportTable;
  /** Lag, ACF, PACF and bands (correlogramTable). */
  correlogram: ReportTable;
  ljungBox: TestResult;
  jarqueBera: TestResult;
  acf: Correlogram;
  /** Leading weeks without a residual that were left out. */
  dropped: number;
}

/**
 * Drops the NaN entries at the start of a residual series. Any other non-finite value (NaN
 * after the first residual, ±Infinity anywhere) is an InputError naming the week.
 */
export function trimLeadingMissing(residuals: ArrayLike<number>): { values: Float64Array; dropped: number } {
  const n = residuals.length;
  let start = 0;
  while (start < n && Number.isNaN(residuals[start])) start++;
  if (start === n) {
    throw new InputError(
      "TOO_FEW_POINTS",
      n === 0 ? "There are no residuals to check." : `All ${n} residuals are missing: the model produced no fitted values to compare with the rates.`,
    );
  }
  for (let i = start; i < n; i++) {
    const v = residuals[i];
    if (Number.isNaN(v)) {
      throw new InputError(
        "NOT_A_NUMBER",
        `The residual for week ${i + 1} is missing although earlier weeks have one; only the first weeks, before the model has a fitted value, may be blank.`,
      );
    }
    if (!Number.isFinite(v)) {
      throw new InputError("NOT_A_NUMBER", `The residual for week ${i + 1} is ${v}; residual checks need finite values.`);
    }
  }
  return { values: Float64Array.from({ length: n - start }, (_, i) => residuals[start + i]), dropped: start };
}

/** Ljung–Box, Jarque–Bera and the correlogram of a model's residuals, as report tables. */
export function residualChecks(residuals: ArrayLike<number>, options: ResidualCheckOptions = {}): ResidualChecks {
  const { values, dropped } = trimLeadingMissing(residuals);
  const level = checkLevel(options.level ?? DEFAULT_LEVEL);
  const period = options.period ?? WEEKS_PER_YEAR;
  const fitDf = options.fitDf ?? 0;
  const lb = ljungBox(values, { lags: options.lags, fitDf, period, level });
  const jb = jarqueBera(values, { level });
  const c = correlogram(values, { nlags: options.acfLags, period, level });
  const notes: string[] = [];
  if (dropped > 0) {
    notes.push(
      `The first ${dropped === 1 ? "week has" : `${dropped} weeks have`} no residual (the model has no fitted value there) and ${dropped === 1 ? "was" : "were"} left out; the checks use the remaining ${values.length} weeks.`,
    );
  }
  notes.push(`Ljung–Box uses ${lb.lags} lags less ${fitDf} fitted model parameters: ${lb.parameters["degrees of freedom"]} degrees of freedom.`);
  const corr = correlogramTable(c);
  if (dropped > 0) corr.notes.unshift(notes[0]);
  return { tests: testTable("Residual checks", [lb, jb], notes), correlogram: corr, ljungBox: lb, jarqueBera: jb, acf: c, dropped };
}
