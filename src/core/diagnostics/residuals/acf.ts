/**
 * The correlogram of a series (normally a model's residuals): sample autocorrelations,
 * partial autocorrelations, and the bands a chart draws around zero.
 *
 * - ACF: the usual biased estimator, every autocovariance divided by n (not n − k), so the
 *   implied autocovariance matrix is non-negative definite (Brockwell & Davis, 1991, §7.2).
 * - PACF: the Yule–Walker estimator, i.e. the last coefficient of the order-k Yule–Walker
 *   equations built on that biased ACF, computed for k = 1, 2, … by the Durbin–Levinson
 *   recursion (Levinson, 1947; Durbin, 1960).
 * - Bands: the white-noise band ±z/√n (Quenouille, 1949, for the PACF; the same for the ACF
 *   under white noise) and Bartlett's (1946) band for the ACF at lag k,
 *   ±z·sqrt((1 + 2 Σ_{j<k} r_j²) / n), the standard error under the hypothesis that the
 *   autocorrelations vanish beyond lag k − 1.
 *
 * Arrays are indexed by lag and include lag 0 (acf[0] = pacf[0] = 1, bands 0 there).
 */
import { normalQuantile } from "../../math/distributions";
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { DEFAULT_LEVEL, levelText } from "../types";
import { WEEKS_PER_YEAR } from "../../series/calendar";

export interface CorrelogramOptions {
  /** Largest lag; default `defaultAcfLags(n, period)`. */
  nlags?: number;
  /** Seasonal period used only for the default number of lags; default 52. */
  period?: number;
  /** Significance level of the bands, as a fraction; default 0.05 (95% bands). */
  level?: number;
}

export interface Correlogram {
  /** Observations used. */
  n: number;
  nlags: number;
  level: number;
  /** Autocorrelations at lags 0..nlags. */
  acf: Float64Array;
  /** Partial autocorrelations at lags 0..nlags. */
  pacf: Float64Array;
  /** Half-width z/√n of the white-noise band (ACF and PACF). */
  whiteNoiseBand: number;
  /** Half-width of Bartlett's band for the ACF at lags 0..nlags (0 at lag 0). */
  bartlettBand: Float64Array;
}

/** Rejects a significance level outside (0, 1) with a sentence. */
export function checkLevel(level: number): number {
  if (!(level > 0 && level < 1)) {
    throw new InputError("BAD_OPTION", `The significance level must be a fraction between 0 and 1 (0.05 for 5%); got ${level}.`);
  }
  return level;
}

/** Rejects a count that is not a whole number in [lo, hi], naming what it counts. */
export function checkCount(value: number, lo: number, hi: number, what: string): number {
  if (!Number.isInteger(value) || value < lo || value > hi) {
    throw new InputError("BAD_OPTION", `The ${what} must be a whole number from ${lo} to ${hi}; got ${value}.`);
  }
  return value;
}

/**
 * Default correlogram length: two seasonal cycles (104 weeks for weekly rates, 20 when the
 * period is below 2), but no more than n/4, beyond which Box & Jenkins (1976, ch. 2) find
 * sample autocorrelations too unreliable to read; at least 1.
 */
export function defaultAcfLags(n: number, period: number = WEEKS_PER_YEAR): number {
  const cycles = period >= 2 ? 2 * Math.round(period) : 20;
  return Math.max(1, Math.min(cycles, Math.floor(n / 4), n - 1));
}

/** Biased autocorrelations r_0..r_nlags of a finite, checked series (no input checks). */
export function acfOf(x: Float64Array, nlags: number): Float64Array {
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  const d = new Float64Array(n);
  for (let t = 0; t < n; t++) d[t] = x[t] - mean;
  let c0 = 0;
  for (let t = 0; t < n; t++) c0 += d[t] * d[t];
  const r = new Float64Array(nlags + 1);
  r[0] = 1;
  for (let k = 1; k <= nlags; k++) {
    let ck = 0;
    for (let t = 0; t + k < n; t++) ck += d[t] * d[t + k];
    // Both sums carry the same 1/n, which cancels in the ratio.
    r[k] = ck / c0;
  }
  return r;
}

/**
 * Partial autocorrelations φ_kk, k = 0..nlags, from autocorrelations r_0..r_nlags by the
 * Durbin–Levinson recursion (Durbin, 1960):
 *   φ_kk = (r_k − Σ_{j<k} φ_{k−1,j} r_{k−j}) / v_{k−1},  φ_kj = φ_{k−1,j} − φ_kk φ_{k−1,k−j},
 *   v_k = v_{k−1} (1 − φ_kk²), v_0 = 1,
 * which solves the Yule–Walker equations of every order without forming a matrix.
 */
export function pacfFromAcf(r: Float64Array, nlags: number = r.length - 1): Float64Array {
  if (nlags > r.length - 1) throw new RangeError(`PACF to lag ${nlags} needs autocorrelations to lag ${nlags}`);
  const out = new Float64Array(nlags + 1);
  out[0] = 1;
  let phi = new Float64Array(nlags + 1);
  let next = new Float64Array(nlags + 1);
  let v = 1;
  for (let k = 1; k <= nlags; k++) {
    let num = r[k];
    for (let j = 1; j < k; j++) num -= phi[j] * r[k - j];
    if (!(v > 0)) {
      throw new RangeError(`partial autocorrelations are undefined beyond lag ${k - 1}: the series is exactly predictable from its past`);
    }
    const a = num / v;
    next[k] = a;
    for (let j = 1; j < k; j++) next[j] = phi[j] - a * phi[k - j];
    const swap = phi;
    phi = next;
    next = swap;
    v *= 1 - a * a;
    out[k] = a;
  }
  return out;
}

/**
 * Half-widths of Bartlett's (1946) band at lags 0..nlags for n observations:
 * z·sqrt((1 + 2 Σ_{j=1}^{k−1} r_j²) / n) at lag k ≥ 1 (so z/√n at lag 1), 0 at lag 0.
 */
export function bartlettBand(r: Float64Array, n: number, z: number): Float64Array {
  const nlags = r.length - 1;
  const out = new Float64Array(nlags + 1);
  let s = 1;
  for (let k = 1; k <= nlags; k++) {
    out[k] = z * Math.sqrt(s / n);
    s += 2 * r[k] * r[k];
  }
  return out;
}

function resolveLags(n: number, options: CorrelogramOptions, what: string): number {
  const period = options.period ?? WEEKS_PER_YEAR;
  if (!(period >= 1) || !Number.isFinite(period)) {
    throw new InputError("BAD_OPTION", `The seasonal period must be a positive number of weeks; got ${period}.`);
  }
  const nlags = options.nlags ?? defaultAcfLags(n, period);
  return checkCount(nlags, 1, n - 1, `number of lags for the ${what} of a ${n}-week series`);
}

/** Sample autocorrelations at lags 0..nlags (denominators n). */
export function acf(y: ArrayLike<number>, options: CorrelogramOptions = {}): Float64Array {
  const x = checkSeries(y, 2, "The autocorrelation function");
  return acfOf(x, resolveLags(x.length, options, "autocorrelations"));
}

/** Yule–Walker partial autocorrelations at lags 0..nlags (Durbin–Levinson on the biased ACF). */
export function pacf(y: ArrayLike<number>, options: CorrelogramOptions = {}): Float64Array {
  const x = checkSeries(y, 2, "The partial autocorrelation function");
  const nlags = resolveLags(x.length, options, "partial autocorrelations");
  return pacfFromAcf(acfOf(x, nlags), nlags);
}

/** ACF, PACF and both bands in one pass. */
export function correlogram(y: ArrayLike<number>, options: CorrelogramOptions = {}): Correlogram {
  const x = checkSeries(y, 2, "The correlogram");
  const n = x.length;
  const nlags = resolveLags(n, options, "correlogram");
  const level = checkLevel(options.level ?? DEFAULT_LEVEL);
  const z = normalQuantile(1 - level / 2);
  const r = acfOf(x, nlags);
  return {
    n,
    nlags,
    level,
    acf: r,
    pacf: pacfFromAcf(r, nlags),
    whiteNoiseBand: z / Math.sqrt(n),
    bartlettBand: bartlettBand(r, n, z),
  };
}

/** The correlogram as a report table for charts: one row per lag 1..nlags. */
export function correlogramTable(c: Correlogram, title = "Residual autocorrelations"): ReportTable {
  const rows: Cell[][] = [];
  for (let k = 1; k <= c.nlags; k++) {
    rows.push([k, c.acf[k], c.pacf[k], c.whiteNoiseBand, c.bartlettBand[k]]);
  }
  const cover = levelText(1 - c.level);
  return table(title, ["Lag", "ACF", "PACF", "White-noise band (±)", "Bartlett band for ACF (±)"], rows, [
    `Autocorrelations use the ${c.n} weeks with denominators n; partial autocorrelations are the Yule–Walker estimates (Durbin–Levinson recursion).`,
    `Bands are ${cover} half-widths around zero: ±z/√n for white noise, and Bartlett's band, which widens with the autocorrelations at shorter lags.`,
  ]);
}
