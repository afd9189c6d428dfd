/**
 * STL, the seasonal-trend decomposition by loess of Cleveland, Cleveland, McRae & Terpenning
 * (1990), J. Official Statistics 6(1): Y = T + S + R.
 *
 * References below are to the paper's section 2 (loess; the inner loop, steps 1–6; the outer
 * loop and its robustness weights), section 3 (choosing the parameters) and section 4
 * (implementation, including the "jump" speed-ups). The loess itself is in ./loess.ts.
 * Section numbers are cited at that level only: finer numbering is from memory.
 */
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { loessAt, loessSmooth } from "./loess";
import { median } from "../../math/median";

export interface StlOptions {
  /** n_p, observations per cycle. Default 52 (DESIGN.md, "Periods"). */
  period?: number;
  /**
   * n_s, the seasonal smoothing window (odd, ≥ 7). Default 13: for weekly rates each
   * cycle-subseries holds one value a year, so 13 lets the pattern for a given week draw on
   * about a decade of years and drift only slowly; the paper leaves n_s to the analyst
   * (section 3) and advises odd n_s ≥ 7.
   */
  seasonal?: number;
  /** n_t (odd). Default the smallest odd integer ≥ 1.5 n_p / (1 − 1.5 / n_s) (section 3). */
  trend?: number;
  /** n_l (odd). Default the smallest odd integer ≥ n_p (section 3). */
  lowPass?: number;
  /** Loess degree of the cycle-subseries smoothing, 0 or 1. Default 1. */
  seasonalDegree?: 0 | 1;
  /** Loess degree of the trend smoothing, 0 or 1. Default 1. */
  trendDegree?: 0 | 1;
  /** Loess degree of the low-pass smoothing, 0 or 1. Default 1. */
  lowPassDegree?: 0 | 1;
  /** Use the outer loop's robustness weights (section 2). Default false. */
  robust?: boolean;
  /** n_i, passes of the inner loop. Default 2 when robust, 5 otherwise (as the reference, statsmodels). */
  inner?: number;
  /** n_o, passes of the outer loop. Default 15 when robust, 0 otherwise (as the reference). */
  outer?: number;
  /** Fit every j-th point of each cycle-subseries. Default ceil(n_s / 10) (section 4). */
  seasonalJump?: number;
  /** Fit every j-th point of the trend smoothing. Default ceil(n_t / 10). */
  trendJump?: number;
  /** Fit every j-th point of the low-pass smoothing. Default ceil(n_l / 10). */
  lowPassJump?: number;
}

/** Every setting resolved, as the decomposition ran. */
export interface StlSettings {
  period: number;
  seasonal: number;
  trend: number;
  lowPass: number;
  seasonalDegree: 0 | 1;
  trendDegree: 0 | 1;
  lowPassDegree: 0 | 1;
  robust: boolean;
  inner: number;
  outer: number;
  seasonalJump: number;
  trendJump: number;
  lowPassJump: number;
}

export interface StlResult {
  trend: Float64Array;
  seasonal: Float64Array;
  /** Y − T − S. */
  remainder: Float64Array;
  /**
   * Robustness weights ρ_v (section 2, outer loop) that the final inner passes used (computed from the
   * remainder before them, as the reference output reports them); all 1 when not robust.
   */
  weights: Float64Array;
  settings: StlSettings;
}

export const DEFAULT_SEASONAL_WINDOW = 13;

/** Smallest odd integer ≥ x. */
export function smallestOddAtLeast(x: number): number {
  const k = Math.ceil(x - 1e-12);
  return k % 2 === 1 ? k : k + 1;
}

function checkOdd(value: number, min: number, label: string): void {
  if (!Number.isInteger(value) || value < min || value % 2 !== 1) {
    throw new InputError("BAD_OPTION", `The ${label} must be an odd whole number of at least ${min}; got ${value}.`);
  }
}

function checkWhole(value: number, min: number, label: string): void {
  if (!Number.isInteger(value) || value < min) {
    throw new InputError("BAD_OPTION", `The ${label} must be a whole number of at least ${min}; got ${value}.`);
  }
}

function checkDegree(value: number, label: string): 0 | 1 {
  if (value !== 0 && value !== 1) {
    throw new InputError("BAD_OPTION", `The ${label} must be 0 (local mean) or 1 (local line); got ${value}.`);
  }
  return value;
}

/** Resolves the options to the settings STL will run with, checking each. */
export function stlSettings(options: StlOptions = {}): StlSettings {
  const period = options.period ?? WEEKS_PER_YEAR;
  checkWhole(period, 2, "season length (period)");
  const seasonal = options.seasonal ?? DEFAULT_SEASONAL_WINDOW;
  checkOdd(seasonal, 7, "seasonal smoothing window");
  // Section 3: n_t ≥ 1.5 n_p / (1 − 1.5 / n_s), odd; n_l the least odd ≥ n_p.
  const trend = options.trend ?? smallestOddAtLeast((1.5 * period) / (1 - 1.5 / seasonal));
  checkOdd(trend, 3, "trend smoothing window");
  const lowPass = options.lowPass ?? smallestOddAtLeast(period);
  checkOdd(lowPass, 3, "low-pass smoothing window");
  const robust = options.robust ?? false;
  const inner = options.inner ?? (robust ? 2 : 5);
  checkWhole(inner, 1, "number of inner passes");
  const outer = robust ? options.outer ?? 15 : 0;
  checkWhole(outer, 0, "number of outer passes");
  const seasonalJump = options.seasonalJump ?? Math.ceil(seasonal / 10);
  const trendJump = options.trendJump ?? Math.ceil(trend / 10);
  const lowPassJump = options.lowPassJump ?? Math.ceil(lowPass / 10);
  checkWhole(seasonalJump, 1, "seasonal jump");
  checkWhole(trendJump, 1, "trend jump");
  checkWhole(lowPassJump, 1, "low-pass jump");
  return {
    period,
    seasonal,
    trend,
    lowPass,
    seasonalDegree: checkDegree(options.seasonalDegree ?? 1, "seasonal degree"),
    trendDegree: checkDegree(options.trendDegree ?? 1, "trend degree"),
    lowPassDegree: checkDegree(options.lowPassDegree ?? 1, "low-pass degree"),
    robust,
    inner,
    outer,
    seasonalJump,
    trendJump,
    lowPassJump,
  };
}

/** Moving average of length `len` over x[0 … m−1] into out[0 … m−len]. */
function movingAverage(x: Float64Array, m: number, len: number, out: Float64Array): void {
  let sum = 0;
  for (let i = 0; i < len; i++) sum += x[i];
  out[0] = sum / len;
  for (let i = 1; i <= m - len; i++) {
    sum += x[i + len - 1] - x[i - 1];
    out[i] = sum / len;
  }
}

/** Scratch buffers of one decomposition, allocated once. */
interface Work {
  detrended: Float64Array;
  cycle: Float64Array; // C, length n + 2 n_p
  ma1: Float64Array;
  ma2: Float64Array;
  ma3: Float64Array;
  lowPass: Float64Array;
  sub: Float64Array;
  subW: Float64Array;
  subFit: Float64Array;
  deseason: Float64Array;
}

function allocate(n: number, np: number): Work {
  const m = Math.ceil(n / np);
  return {
    detrended: new Float64Array(n),
    cycle: new Float64Array(n + 2 * np),
    ma1: new Float64Array(n + np + 1),
    ma2: new Float64Array(n + 2),
    ma3: new Float64Array(n),
    lowPass: new Float64Array(n),
    sub: new Float64Array(m),
    subW: new Float64Array(m),
    subFit: new Float64Array(m),
    deseason: new Float64Array(n),
  };
}

/** Value of a subseries fit outside its points when the window has no weight: nearest point. */
function extend(v: number, fallback: number): number {
  return Number.isNaN(v) ? fallback : v;
}

/**
 * One pass of the inner loop, section 2 steps 1–6, updating `trend` and `seasonal`
 * in place; `rw` are the robustness weights (null in the first outer pass).
 */
function innerPass(
  y: Float64Array,
  s: StlSettings,
  rw: Float64Array | null,
  trend: Float64Array,
  seasonal: Float64Array,
  w: Work,
): void {
  const n = y.length;
  const np = s.period;
  const qs = s.seasonal;
  // Step 1, detrending: Y_v − T_v.
  for (let i = 0; i < n; i++) w.detrended[i] = y[i] - trend[i];
  // Step 2, cycle-subseries smoothing: each subseries (every np-th value) is smoothed by
  // loess with q = n_s, and also evaluated one period before its first and after its last
  // point, giving C of length n + 2 n_p; C[(i + 1) n_p + k] is subseries k at its i-th point.
  for (let k = 0; k < np; k++) {
    let m = 0;
    for (let v = k; v < n; v += np) {
      w.sub[m] = w.detrended[v];
      if (rw !== null) w.subW[m] = rw[v];
      m++;
    }
    const subRw = rw === null ? null : w.subW;
    loessSmooth(w.sub, m, qs, s.seasonalDegree, s.seasonalJump, subRw, w.subFit);
    const span = Math.min(qs, m);
    const before = loessAt(w.sub, m, qs, s.seasonalDegree, -1, 0, span - 1, subRw);
    const after = loessAt(w.sub, m, qs, s.seasonalDegree, m, m - span, m - 1, subRw);
    w.cycle[k] = extend(before, w.sub[0]);
    for (let i = 0; i < m; i++) w.cycle[(i + 1) * np + k] = w.subFit[i];
    w.cycle[(m + 1) * np + k] = extend(after, w.sub[m - 1]);
  }
  // Step 3, low-pass filtering of C: moving averages of lengths n_p, n_p and 3, then loess
  // with q = n_l (no robustness weights: the paper applies them in steps 2 and 6 only).
  movingAverage(w.cycle, n + 2 * np, np, w.ma1);
  movingAverage(w.ma1, n + np + 1, np, w.ma2);
  movingAverage(w.ma2, n + 2, 3, w.ma3);
  loessSmooth(w.ma3, n, s.lowPass, s.lowPassDegree, s.lowPassJump, null, w.lowPass);
  // Step 4, detrending of the smoothed cycle-subseries: S_v = C_{v + n_p} − L_v.
  // Step 5, deseasonalising: Y_v − S_v.
  for (let i = 0; i < n; i++) {
    seasonal[i] = w.cycle[i + np] - w.lowPass[i];
    w.deseason[i] = y[i] - seasonal[i];
  }
  // Step 6, trend smoothing: loess with q = n_t on the deseasonalised series.
  loessSmooth(w.deseason, n, s.trend, s.trendDegree, s.trendJump, rw, trend);
}

/**
 * Section 2, outer loop: ρ_v = B(|R_v| / h), h = 6 · median |R_v| (mean of the two middle values for an
 * even count), bisquare B(u) = (1 − u²)² for 0 ≤ u < 1 and 0 for u ≥ 1.
 * Two cut-offs are added: B = 1 for u ≤ 0.001 and B = 0 for u > 0.999. They are not in the
 * paper's text; they are the convention of the reference output (statsmodels STL), found by
 * comparison: with the plain bisquare the robust components differ from it by up to 2e-6
 * of the series' scale, with the cut-offs by 1e-13. The change to any weight is below 4e-6.
 */
export function robustnessWeights(remainder: Float64Array, out: Float64Array): void {
  const n = remainder.length;
  const abs = new Float64Array(n);
  for (let i = 0; i < n; i++) abs[i] = Math.abs(remainder[i]);
  const h = 6 * median(abs);
  for (let i = 0; i < n; i++) {
    if (h <= 0) {
      // More than half the remainder is exactly zero: only those points keep full weight.
      out[i] = abs[i] === 0 ? 1 : 0;
      continue;
    }
    const u = abs[i] / h;
    if (u <= 0.001) {
      out[i] = 1;
    } else if (u > 0.999) {
      out[i] = 0;
    } else {
      const t = 1 - u * u;
      out[i] = t * t;
    }
  }
}

/** Minimum series length for STL: two full cycles. */
export function stlMinLength(period: number): number {
  return 2 * period;
}

/**
 * STL decomposition of y (equally spaced, no gaps). Throws InputError for non-finite values,
 * fewer than two full periods, a constant series, or a bad option.
 */
export function stl(y: ArrayLike<number>, options: StlOptions = {}): StlResult {
  const s = stlSettings(options);
  const x = checkSeries(y, stlMinLength(s.period), "The seasonal decomposition (STL)");
  const n = x.length;
  const trend = new Float64Array(n); // T^(0) = 0 (section 2)
  const seasonal = new Float64Array(n);
  const remainder = new Float64Array(n);
  const weights = new Float64Array(n).fill(1);
  const work = allocate(n, s.period);
  let rw: Float64Array | null = null;
  for (let k = 0; k <= s.outer; k++) {
    for (let j = 0; j < s.inner; j++) innerPass(x, s, rw, trend, seasonal, work);
    if (k < s.outer) {
      // Section 2, outer loop: weights from the current remainder, used by the next inner passes.
      for (let i = 0; i < n; i++) remainder[i] = x[i] - trend[i] - seasonal[i];
      robustnessWeights(remainder, weights);
      rw = weights;
    }
  }
  for (let i = 0; i < n; i++) remainder[i] = x[i] - trend[i] - seasonal[i];
  return { trend, seasonal, remainder, weights, settings: s };
}
