/**
 * The Diebold–Mariano test of equal predictive accuracy (Diebold & Mariano 1995) with the
 * small-sample correction of Harvey, Leybourne & Newbold (1997).
 *
 * Given two series of h-step forecast errors e1, e2 (actual − forecast) aligned by target
 * week, the loss differential is d_t = L(e1_t) − L(e2_t) with L squared or absolute. Under
 * equal accuracy E[d_t] = 0. Optimal h-step errors are at most MA(h−1), so the long-run
 * variance of d is estimated from its autocovariances up to lag h−1 with rectangular weights,
 * V̂ = γ̂₀ + 2 Σ_{k=1}^{h−1} γ̂_k, γ̂_k = (1/n) Σ_{t=k+1}^{n} (d_t − d̄)(d_{t−k} − d̄)
 * (Diebold & Mariano 1995, sec. 1.1), and DM = d̄ / √(V̂/n).
 *
 * The rectangular window is not positive semi-definite, so V̂ can come out ≤ 0; the test then
 * uses Bartlett weights 1 − k/h over the same lags (Newey & West 1987), which cannot be
 * negative, and says so. Should that be zero too (d constant), the statistic is NaN.
 *
 * HLN correction: DM* = DM · √((n + 1 − 2h + h(h−1)/n) / n), referred to Student t with
 * n − 1 degrees of freedom (Harvey, Leybourne & Newbold 1997, eq. (9) and sec. 3). The factor
 * equals √((n − h)(n − h + 1)) / n, so it is positive whenever n > h.
 *
 * Pairs where either error is not finite are dropped and the remaining ones are treated as
 * consecutive; `n` reports how many were used.
 */
import { tCdf, tSf } from "../math/distributions";

export type DmLoss = "squared" | "absolute";
/** "less": model 1 is more accurate (E[d] < 0); "greater": model 2 is. */
export type DmAlternative = "two-sided" | "less" | "greater";

export interface DieboldMarianoOptions {
  /** Forecast horizon h the errors belong to (integer ≥ 1); default 1. */
  horizon?: number;
  /** Loss applied to each error; default "squared". */
  loss?: DmLoss;
  /** Default "two-sided". */
  alternative?: DmAlternative;
}

export interface DieboldMarianoResult {
  /** HLN-corrected statistic DM*, compared with t(n − 1). */
  statistic: number;
  /** Uncorrected Diebold–Mariano statistic d̄ / √(V̂/n). */
  dm: number;
  pValue: number;
  /** Number of pairs used (both errors finite). */
  n: number;
  horizon: number;
  /** d̄, the mean of L(e1) − L(e2): negative means model 1 had the lower loss. */
  meanDifference: number;
  /** Long-run variance V̂ of d (not divided by n) under the weights actually used. */
  variance: number;
  weights: "rectangular" | "bartlett";
  note?: string;
}

/** HLN (1997) eq. (9) multiplier on DM, written as published. */
function hlnFactor(n: number, h: number): number {
  return Math.sqrt((n + 1 - 2 * h + (h * (h - 1)) / n) / n);
}

/** γ̂_0 … γ̂_maxLag of a series about its mean, divisor n. */
function autocovariances(d: Float64Array, mean: number, maxLag: number): Float64Array {
  const n = d.length;
  const g = new Float64Array(maxLag + 1);
  for (let k = 0; k <= maxLag; k++) {
    let s = 0;
    for (let t = k; t < n; t++) s += (d[t] - mean) * (d[t - k] - mean);
    g[k] = s / n;
  }
  return g;
}

export function dieboldMariano(
  e1: ArrayLike<number>,
  e2: ArrayLike<number>,
  options: DieboldMarianoOptions = {},
): DieboldMarianoResult {
  const h = options.horizon ?? 1;
  const loss = options.loss ?? "squared";
  const alternative = options.alternative ?? "two-sided";
  if (e1.length !== e2.length) {
    throw new RangeError(`the two error series differ in length (${e1.length} and ${e2.length})`);
  }
  if (!Number.isInteger(h) || h < 1) throw new RangeError(`horizon must be an integer ≥ 1, got ${h}`);
  const L = loss === "absolute" ? Math.abs : (x: number): number => x * x;

  const buf = new Float64Array(e1.length);
  let n = 0;
  for (let i = 0; i < e1.length; i++) {
    const a = e1[i];
    const b = e2[i];
    if (Number.isFinite(a) && Number.isFinite(b)) buf[n++] = L(a) - L(b);
  }
  if (n < h + 2) {
    throw new RangeError(`the Diebold–Mariano test at horizon ${h} needs at least ${h + 2} usable pairs of errors, got ${n}`);
  }
  const d = buf.subarray(0, n);
  let sum = 0;
  for (let t = 0; t < n; t++) sum += d[t];
  const mean = sum / n;

  const g = autocovariances(d, mean, h - 1);
  // Diebold & Mariano (1995): rectangular window over lags 0..h−1.
  let variance = g[0];
  for (let k = 1; k < h; k++) variance += 2 * g[k];
  // A variance at rounding level relative to the size of d (a constant differential such as
  // |e1| − |e2| = 0.1 every week leaves deviations of a few ulps) counts as zero, or DM would
  // be a meaningless 1e15.
  const floor = 1e-20 * (mean * mean + g[0]);
  let weights: DieboldMarianoResult["weights"] = "rectangular";
  let note: string | undefined;
  if (!(variance > floor) && h > 1) {
    // Newey & West (1987): Bartlett weights 1 − k/h on the same h − 1 lags, never negative.
    let bartlett = g[0];
    for (let k = 1; k < h; k++) bartlett += 2 * (1 - k / h) * g[k];
    weights = "bartlett";
    variance = bartlett;
    note =
      `The usual variance estimate of the loss difference was not positive, so it was ` +
      `recomputed with declining (Bartlett) weights over the same ${h - 1} lag${h - 1 === 1 ? "" : "s"}.`;
  }

  let dm = NaN;
  let statistic = NaN;
  let pValue = NaN;
  if (variance > floor) {
    dm = mean / Math.sqrt(variance / n);
    statistic = dm * hlnFactor(n, h);
    const df = n - 1;
    if (alternative === "two-sided") pValue = Math.min(1, 2 * tSf(Math.abs(statistic), df));
    else if (alternative === "less") pValue = tCdf(statistic, df);
    else pValue = tSf(statistic, df);
  } else {
    note =
      `The loss difference between the two forecasts does not vary from week to week, ` +
      `so the test cannot be computed.`;
  }
  const out: DieboldMarianoResult = { statistic, dm, pValue, n, horizon: h, meanDifference: mean, variance, weights };
  if (note !== undefined) out.note = note;
  return out;
}
