/**
 * Strength of the seasonal pattern and of the trend in an STL decomposition, the measures of
 * Wang, Smith & Hyndman (2006), "Characteristic-based clustering for time series data",
 * Data Mining and Knowledge Discovery 13(3), in the form Hyndman & Athanasopoulos give in
 * "Forecasting: Principles and Practice" (3rd ed., the section on STL features):
 *
 *   F_S = max(0, 1 − Var(R) / Var(S + R)),   F_T = max(0, 1 − Var(R) / Var(T + R)).
 *
 * Both lie in [0, 1]: near 0 the component is lost in the remainder, near 1 it dominates it.
 *
 * Pure noise does not score 0: the cycle-subseries smoother absorbs part of the noise, and the
 * fewer the years the more (each subseries has one point a year). With the default settings,
 * white noise of 2 years scores 1.00, of 3 years about 0.67, of 5 years 0.43, of 10 years 0.26
 * (medians of 40 seeded simulations, made while writing this module). A fixed threshold alone
 * would call noise "strong" on a short history, so the verdict also compares F_S with the 95th
 * percentile of F_S for white noise of the same length and settings (our own addition,
 * a seeded simulation: see noiseBaseline).
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { MersenneTwister } from "../../math/rng";
import type { StlOptions } from "./stl";
import { stl, stlSettings } from "./stl";

/**
 * At or above this a pattern is called strong: 0.64 is the seasonal-strength threshold the R
 * `forecast` package documents for choosing a seasonal difference (nsdiffs, test "seas",
 * chosen there by forecast accuracy on the M3 and M4 data) — common practice, not a test.
 */
export const STRONG_STRENGTH = 0.64;

/** Below this a pattern is called weak or absent. Our own choice (F = 0.3 means the
 * component's swings explain under about a third of the variation around it). */
export const WEAK_STRENGTH = 0.3;

export interface StrengthResult {
  /** F_S in [0, 1]. */
  seasonal: number;
  /** F_T in [0, 1]. */
  trend: number;
  /** One sentence on the annual pattern, e.g. "Strong annual pattern (seasonal strength 0.78)." */
  verdict: string;
  /** One sentence on the trend. */
  trendVerdict: string;
  /** 95th percentile of F_S for white noise of the same length and settings, when computed. */
  noiseBaseline: number | null;
}

export interface Components {
  trend: ArrayLike<number>;
  seasonal: ArrayLike<number>;
  remainder: ArrayLike<number>;
}

/** Sample variance of a + b (b omitted: of a alone), divisor n − 1. */
function variance(a: ArrayLike<number>, b: ArrayLike<number> | null): number {
  const n = a.length;
  if (n < 2) return 0;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += a[i] + (b === null ? 0 : b[i]);
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) {
    const d = a[i] + (b === null ? 0 : b[i]) - mean;
    ss += d * d;
  }
  return ss / (n - 1);
}

/** max(0, 1 − Var(R) / Var(X + R)); 0 when X + R does not vary at all. */
function oneStrength(x: ArrayLike<number>, r: ArrayLike<number>): number {
  const total = variance(x, r);
  if (!(total > 0)) return 0;
  return Math.max(0, 1 - variance(r, null) / total);
}

function grade(f: number): "Strong" | "Moderate" | "Weak" {
  if (f >= STRONG_STRENGTH) return "Strong";
  if (f >= WEAK_STRENGTH) return "Moderate";
  return "Weak";
}

function seasonalSentence(f: number, baseline: number | null): string {
  const g = grade(f);
  const text = f.toFixed(2);
  if (baseline !== null && f <= baseline) {
    return `No annual pattern beyond what noise alone would show (seasonal strength ${text}; pure noise of this length reaches ${baseline.toFixed(2)}).`;
  }
  if (g === "Strong") return `Strong annual pattern (seasonal strength ${text}).`;
  if (g === "Moderate") return `Moderate annual pattern (seasonal strength ${text}).`;
  return `Little or no annual pattern (seasonal strength ${text}).`;
}

function trendSentence(f: number): string {
  const g = grade(f);
  const text = f.toFixed(2);
  if (g === "Strong") return `Strong trend (trend strength ${text}).`;
  if (g === "Moderate") return `Moderate trend (trend strength ${text}).`;
  return `Little trend beyond week-to-week noise (trend strength ${text}).`;
}

/** Replications of the noise baseline: the 95th percentile is then the 38th of 39 sorted. */
export const BASELINE_REPLICATIONS = 39;

/**
 * 95th percentile of the seasonal strength F_S that STL with these settings gives on Gaussian
 * white noise of length n (seeded, so the same inputs give the same number). F_S does not
 * depend on the noise's mean or scale, so one baseline serves every series of that length.
 */
export function noiseBaseline(n: number, options: StlOptions = {}, seed = 20260101): number {
  // The baseline depends only on (n, settings, seed): a recalculation of an unchanged book,
  // or several lanes of the same length, must not rerun its 39 decompositions.
  const key = `${n}|${seed}|${JSON.stringify(stlSettings(options))}`;
  const known = baselineCache.get(key);
  if (known !== undefined) return known;
  const value = simulateBaseline(n, options, seed);
  if (baselineCache.size >= BASELINE_CACHE_SIZE) {
    const oldest = baselineCache.keys().next().value;
    if (oldest !== undefined) baselineCache.delete(oldest);
  }
  baselineCache.set(key, value);
  return value;
}

const BASELINE_CACHE_SIZE = 64;
const baselineCache = new Map<string, number>();

/** Empties the baseline memo (benchmarks use it to time the cold path). */
export function clearNoiseBaselineCache(): void {
  baselineCache.clear();
}

function simulateBaseline(n: number, options: StlOptions, seed: number): number {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  const f = new Float64Array(BASELINE_REPLICATIONS);
  for (let r = 0; r < BASELINE_REPLICATIONS; r++) {
    for (let i = 0; i < n; i++) y[i] = rng.normal();
    f[r] = stlStrength(stl(y, options)).seasonal;
  }
  f.sort();
  // Order statistic (R + 1) · 0.95 = 38 of R = 39.
  return f[Math.round((BASELINE_REPLICATIONS + 1) * 0.95) - 1];
}

/**
 * F_S and F_T of a decomposition, with plain verdicts. Pass `noiseBaseline` (from
 * noiseBaseline()) to have the seasonal verdict say so when F_S is no higher than noise gives.
 */
export function stlStrength(d: Components, options: { noiseBaseline?: number } = {}): StrengthResult {
  const n = d.remainder.length;
  if (d.trend.length !== n || d.seasonal.length !== n) {
    throw new Error("stlStrength: components of different lengths");
  }
  const seasonal = oneStrength(d.seasonal, d.remainder);
  const trend = oneStrength(d.trend, d.remainder);
  const baseline = options.noiseBaseline ?? null;
  return {
    seasonal,
    trend,
    verdict: seasonalSentence(seasonal, baseline),
    trendVerdict: trendSentence(trend),
    noiseBaseline: baseline,
  };
}

/** The strengths as a report table: measure, value, verdict. */
export function strengthTable(s: StrengthResult, notes: string[] = []): ReportTable {
  const rows: Cell[][] = [
    ["Seasonal strength", s.seasonal, s.verdict],
    ["Trend strength", s.trend, s.trendVerdict],
  ];
  const baselineNotes: string[] = [];
  if (s.noiseBaseline !== null) {
    rows.push(["Seasonal strength of pure noise (95th percentile)", s.noiseBaseline, null]);
    baselineNotes.push(
      `The noise row is from ${BASELINE_REPLICATIONS} seeded simulations of white noise with the same length and ` +
        "STL settings: a seasonal strength at or below it does not show an annual pattern.",
    );
  }
  return table(
    "Seasonal and trend strength (STL)",
    ["Measure", "Value", "Verdict"],
    rows,
    [
      "Strength = 1 − Var(remainder) / Var(component + remainder), from 0 (none) to 1 " +
        "(Wang, Smith & Hyndman, 2006).",
      `Strong at ${STRONG_STRENGTH} or more (the common seasonal-difference threshold); weak below ` +
        `${WEAK_STRENGTH} (our own cut-off); moderate between.`,
      ...baselineNotes,
      ...notes,
    ],
  );
}
