/**
 * The Ljung–Box portmanteau test of Ljung & Box (1978): are a model's residuals white noise
 * up to lag m?
 *
 *   Q(m) = n (n + 2) Σ_{k=1}^{m} r_k² / (n − k),
 *
 * with r_k the biased sample autocorrelations of the residuals (acf.ts). Under the null, Q is
 * approximately χ² with m − fitDf degrees of freedom, where fitDf is the number of ARMA
 * coefficients estimated to produce the residuals (Box & Pierce, 1970; Ljung & Box, 1978).
 *
 * Default number of lags. The usual advice is m = 10 for non-seasonal data and m = 2s for
 * seasonal period s, capped at n/5 because the χ² approximation and the power both degrade
 * when m is a large share of the sample (Hyndman & Athanasopoulos, Forecasting: Principles
 * and Practice, 3rd ed., 2021, §5.4). Freight rates are weekly with s = 52, so the default is
 * min(104, ⌊n/5⌋): two years of lags on a long book, one year (52) on a five-year book.
 * With `period` below 2 the non-seasonal rule min(10, ⌊n/5⌋) applies.
 */
import { chi2Quantile, chi2Sf } from "../../math/distributions";
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import type { TestResult } from "../types";
import { DEFAULT_LEVEL, levelText } from "../types";
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { acfOf, checkCount, checkLevel } from "./acf";

export interface LjungBoxOptions {
  /** Number of autocorrelations m; default `defaultLjungBoxLags(n, period)`. */
  lags?: number;
  /** Number of fitted ARMA coefficients (p + q + P + Q); default 0. */
  fitDf?: number;
  /** Seasonal period for the default m; default 52 (weekly). Below 2: non-seasonal rule. */
  period?: number;
  /** Significance level of the verdict; default 0.05. */
  level?: number;
}

export interface LjungBoxByLag {
  n: number;
  fitDf: number;
  /** Q(k) for k = 1..m, at index k − 1. */
  statistic: Float64Array;
  /** Degrees of freedom k − fitDf (≤ 0 where the test is undefined). */
  df: Float64Array;
  /** χ² upper-tail p-value of Q(k); NaN where k ≤ fitDf. */
  pValue: Float64Array;
}

/** min(2·period, ⌊n/5⌋) for a seasonal period ≥ 2, else min(10, ⌊n/5⌋) (see the header). */
export function defaultLjungBoxLags(n: number, period: number = WEEKS_PER_YEAR): number {
  const rule = period >= 2 ? 2 * Math.round(period) : 10;
  return Math.min(rule, Math.floor(n / 5));
}

const WHAT = "The Ljung–Box test";

function resolve(y: ArrayLike<number>, options: LjungBoxOptions): { x: Float64Array; m: number; fitDf: number } {
  const x = checkSeries(y, 3, WHAT);
  const n = x.length;
  const fitDf = checkCount(options.fitDf ?? 0, 0, n, "number of fitted model parameters");
  const period = options.period ?? WEEKS_PER_YEAR;
  if (!(period >= 1) || !Number.isFinite(period)) {
    throw new InputError("BAD_OPTION", `The seasonal period must be a positive number of weeks; got ${period}.`);
  }
  let m: number;
  if (options.lags === undefined) {
    m = defaultLjungBoxLags(n, period);
    if (m <= fitDf) {
      throw new InputError(
        "TOO_FEW_POINTS",
        `${WHAT} needs more lags than the ${fitDf} fitted model parameters, but ${n} weeks allow only ${m} by default (one lag per five weeks); give the number of lags or use a longer series.`,
      );
    }
  } else {
    m = checkCount(options.lags, 1, n - 1, `number of Ljung–Box lags for a ${n}-week series`);
    if (m <= fitDf) {
      throw new InputError(
        "BAD_OPTION",
        `${WHAT} needs more lags than fitted model parameters: ${m} lags with ${fitDf} fitted parameters leave no degrees of freedom. Use at least ${fitDf + 1} lags.`,
      );
    }
  }
  return { x, m, fitDf };
}

/** Q(1..m) accumulated from the autocorrelations, Ljung & Box (1978). */
export function cumulativeQ(r: Float64Array, n: number, m: number): Float64Array {
  const q = new Float64Array(m);
  let s = 0;
  for (let k = 1; k <= m; k++) {
    s += (r[k] * r[k]) / (n - k);
    q[k - 1] = n * (n + 2) * s;
  }
  return q;
}

/** The Ljung–Box test at m lags with m − fitDf degrees of freedom. */
export function ljungBox(residuals: ArrayLike<number>, options: LjungBoxOptions = {}): TestResult {
  const { x, m, fitDf } = resolve(residuals, options);
  const level = checkLevel(options.level ?? DEFAULT_LEVEL);
  const n = x.length;
  const q = cumulativeQ(acfOf(x, m), n, m)[m - 1];
  const df = m - fitDf;
  const p = chi2Sf(q, df);
  const rejected = p < level;
  const at = levelText(level);
  return {
    test: "Ljung–Box",
    nullHypothesis: `no autocorrelation in the residuals up to lag ${m} (they behave like white noise)`,
    statistic: q,
    pValue: p,
    lags: m,
    parameters: { "fitted parameters": fitDf, "degrees of freedom": df, weeks: n },
    criticalValues: {
      "1%": chi2Quantile(0.99, df),
      "5%": chi2Quantile(0.95, df),
      "10%": chi2Quantile(0.9, df),
    },
    level,
    rejected,
    verdict: rejected
      ? `The residuals are autocorrelated within ${m} weeks at the ${at} level: the model leaves a pattern it could have used.`
      : `No sign of autocorrelation in the residuals within ${m} weeks at the ${at} level.`,
  };
}

/** Q and its p-value at every lag 1..m (m = `lags` or the default), for a table or chart. */
export function ljungBoxByLag(residuals: ArrayLike<number>, options: Omit<LjungBoxOptions, "level"> = {}): LjungBoxByLag {
  const { x, m, fitDf } = resolve(residuals, options);
  const n = x.length;
  const statistic = cumulativeQ(acfOf(x, m), n, m);
  const df = new Float64Array(m);
  const pValue = new Float64Array(m);
  for (let k = 1; k <= m; k++) {
    df[k - 1] = k - fitDf;
    pValue[k - 1] = k > fitDf ? chi2Sf(statistic[k - 1], k - fitDf) : NaN;
  }
  return { n, fitDf, statistic, df, pValue };
}

/** One row per lag: Q, degrees of freedom and p-value (blank where lag ≤ fitted parameters). */
export function ljungBoxTable(b: LjungBoxByLag, title = "Ljung–Box by lag"): ReportTable {
  const rows: Cell[][] = [];
  for (let i = 0; i < b.statistic.length; i++) {
    const defined = b.df[i] > 0;
    rows.push([i + 1, b.statistic[i], defined ? b.df[i] : null, defined ? b.pValue[i] : null]);
  }
  const notes = [`Q uses the ${b.n} weeks; degrees of freedom are the lag minus ${b.fitDf} fitted model parameters.`];
  if (b.fitDf > 0) notes.push(`Lags up to ${b.fitDf} have no degrees of freedom left, so no p-value.`);
  return table(title, ["Lag", "Q", "Degrees of freedom", "p-value"], rows, notes);
}
