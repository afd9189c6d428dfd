/**
 * The Jarque–Bera test of normality (Jarque & Bera, 1980, 1987), used on residuals to judge
 * whether prediction intervals built on normal errors are trustworthy.
 *
 * With population (denominator n) central moments m_j = Σ (x_t − x̄)^j / n,
 *   S = m_3 / m_2^{3/2},  K = m_4 / m_2²,  JB = n/6 · (S² + (K − 3)²/4),
 * which is asymptotically χ² with 2 degrees of freedom under normality (Jarque & Bera, 1987).
 * The χ² law is only a large-sample approximation, poor on a few dozen weeks, so a verdict on
 * a short series is weak evidence either way.
 */
import { chi2Quantile, chi2Sf } from "../../math/distributions";
import { checkSeries } from "../input";
import type { TestResult } from "../types";
import { DEFAULT_LEVEL, levelText } from "../types";
import { checkLevel } from "./acf";

export interface JarqueBeraOptions {
  /** Significance level of the verdict; default 0.05. */
  level?: number;
}

/** Skewness S and kurtosis K (normal: 0 and 3) from population moments. */
export function moments(x: Float64Array): { skewness: number; kurtosis: number } {
  const n = x.length;
  let mean = 0;
  for (let t = 0; t < n; t++) mean += x[t];
  mean /= n;
  let m2 = 0;
  let m3 = 0;
  let m4 = 0;
  for (let t = 0; t < n; t++) {
    const d = x[t] - mean;
    const d2 = d * d;
    m2 += d2;
    m3 += d2 * d;
    m4 += d2 * d2;
  }
  m2 /= n;
  m3 /= n;
  m4 /= n;
  return { skewness: m3 / Math.pow(m2, 1.5), kurtosis: m4 / (m2 * m2) };
}

export function jarqueBera(residuals: ArrayLike<number>, options: JarqueBeraOptions = {}): TestResult {
  const x = checkSeries(residuals, 3, "The Jarque–Bera test");
  const level = checkLevel(options.level ?? DEFAULT_LEVEL);
  const n = x.length;
  const { skewness, kurtosis } = moments(x);
  const excess = kurtosis - 3;
  const jb = (n / 6) * (skewness * skewness + (excess * excess) / 4);
  const p = chi2Sf(jb, 2);
  const rejected = p < level;
  const at = levelText(level);
  let verdict: string;
  if (!rejected) {
    verdict = `No evidence against normally distributed residuals at the ${at} level.`;
  } else {
    const shape: string[] = [];
    if (Math.abs(skewness) >= 0.1) shape.push(skewness > 0 ? "skewed towards large rises" : "skewed towards large falls");
    if (excess >= 0.2) shape.push("heavy-tailed");
    else if (excess <= -0.2) shape.push("light-tailed");
    const how = shape.length > 0 ? ` (${shape.join(", ")})` : "";
    verdict = `The residuals are not normally distributed at the ${at} level${how}: intervals that assume normal errors may be too narrow or lopsided.`;
  }
  return {
    test: "Jarque–Bera",
    nullHypothesis: "normally distributed residuals (skewness 0, kurtosis 3)",
    statistic: jb,
    pValue: p,
    parameters: { skewness, kurtosis, weeks: n },
    criticalValues: { "1%": chi2Quantile(0.99, 2), "5%": chi2Quantile(0.95, 2), "10%": chi2Quantile(0.9, 2) },
    level,
    rejected,
    verdict,
  };
}
