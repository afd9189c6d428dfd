/**
 * KPSS test of stationarity (Kwiatkowski, Phillips, Schmidt & Shin 1992). The null is the
 * reverse of ADF's: the series is stationary around a level ("c", η_μ) or a linear trend
 * ("ct", η_τ). With e_t the OLS residuals from a regression on a constant [and trend] and
 * S_t = Σ_{i≤t} e_i their partial sums, KPSS (1992) eq. (13)-(14):
 *
 *   η = T⁻² Σ S_t² / s²(l),   s²(l) = T⁻¹ Σ e_t² + 2T⁻¹ Σ_{s=1..l} w(s,l) Σ_{t>s} e_t e_{t−s},
 *
 * with Bartlett weights w(s,l) = 1 − s/(l+1). Default l = ⌊12·(T/100)^{1/4}⌋ (KPSS use
 * l12 = integer part of 12(T/100)^{1/4}, after Schwert 1989).
 *
 * Critical values: KPSS (1992), Table 1 (upper tail). The p-value is linear interpolation in
 * that table between its levels 10%, 5%, 2.5% and 1%; outside it the p-value is only known to
 * be above 0.10 or below 0.01, which `pValueBound` records.
 */
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { DEFAULT_LEVEL, levelText, type TestResult } from "../types";
import { bartlettLongRunVariance } from "./pp";
import { schwertLag } from "./adf";
import { capitalise } from "../../series/wording";

export type KpssCase = "c" | "ct";

export interface KpssOptions {
  /** "c": stationary around a level; "ct": around a linear trend. Default "c". */
  regression?: KpssCase;
  /** Bartlett lags l; default ⌊12·(n/100)^{1/4}⌋. */
  lags?: number;
  level?: number;
  /** How the verdict names the series. Default "the series". */
  subject?: string;
}

export interface KpssResult extends TestResult {
  regression: KpssCase;
  longRunVariance: number;
}

/** KPSS (1992), Table 1: upper-tail critical values, ordered by falling tail probability. */
export const KPSS_TABLE: Record<KpssCase, { p: readonly number[]; crit: readonly number[] }> = {
  c: { p: [0.1, 0.05, 0.025, 0.01], crit: [0.347, 0.463, 0.574, 0.739] },
  ct: { p: [0.1, 0.05, 0.025, 0.01], crit: [0.119, 0.146, 0.176, 0.216] },
};

/** Interpolated p-value, with the side when the statistic lies outside the table. */
export function kpssPValue(stat: number, regression: KpssCase): { p: number; bound?: "below" | "above" } {
  const { p, crit } = KPSS_TABLE[regression];
  if (stat < crit[0]) return { p: p[0], bound: "above" };
  if (stat > crit[crit.length - 1]) return { p: p[p.length - 1], bound: "below" };
  for (let i = 0; i < crit.length - 1; i++) {
    if (stat <= crit[i + 1]) {
      const f = (stat - crit[i]) / (crit[i + 1] - crit[i]);
      return { p: p[i] + f * (p[i + 1] - p[i]) };
    }
  }
  return { p: p[p.length - 1] };
}

export function kpss(y: ArrayLike<number>, options: KpssOptions = {}): KpssResult {
  const regression = options.regression ?? "c";
  const level = options.level ?? DEFAULT_LEVEL;
  const subject = options.subject ?? "the series";
  const label = regression === "c" ? "level" : "trend";
  const what = `The KPSS test (${label})`;
  if (options.lags !== undefined && (!Number.isInteger(options.lags) || options.lags < 0)) {
    throw new InputError("BAD_OPTION", `KPSS: lags must be a whole number of weeks (0 or more); got ${options.lags}.`);
  }
  // At least 12 weeks, and the Bartlett window shorter than the series.
  const series = checkSeries(y, Math.max(12, (options.lags ?? 0) + 2), what);
  const n = series.length;
  const lags = options.lags ?? schwertLag(n);

  // Residuals from the level or trend regression, in closed form.
  const e = new Float64Array(n);
  let mean = 0;
  for (let t = 0; t < n; t++) mean += series[t];
  mean /= n;
  if (regression === "c") {
    for (let t = 0; t < n; t++) e[t] = series[t] - mean;
  } else {
    const tbar = (n + 1) / 2;
    let sxy = 0;
    let sxx = 0;
    for (let t = 0; t < n; t++) {
      const dt = t + 1 - tbar;
      sxy += dt * (series[t] - mean);
      sxx += dt * dt;
    }
    const b = sxy / sxx;
    for (let t = 0; t < n; t++) e[t] = series[t] - mean - b * (t + 1 - tbar);
  }
  let ssr = 0;
  let sst = 0;
  for (let t = 0; t < n; t++) {
    ssr += e[t] * e[t];
    sst += (series[t] - mean) * (series[t] - mean);
  }
  if (ssr <= 1e-20 * sst) {
    throw new InputError("CONSTANT_SERIES", `${what} cannot be run: the series is an exact straight line, so there is nothing random to test.`);
  }

  // KPSS (1992), eq. (13): partial sums of the residuals.
  let s = 0;
  let sumS2 = 0;
  for (let t = 0; t < n; t++) {
    s += e[t];
    sumS2 += s * s;
  }
  const { lrv } = bartlettLongRunVariance(e, lags);
  if (!(lrv > 0)) {
    throw new InputError("BAD_OPTION", `${what}: the long-run variance with ${lags} lags is not positive; use fewer lags.`);
  }
  const statistic = sumS2 / (n * n * lrv);
  const { p, bound } = kpssPValue(statistic, regression);
  // Beyond the table only the side is known: p < 0.01 rejects at any usual level; p > 0.10
  // never counts as a rejection.
  const rejected = bound === "below" ? level >= 0.01 : bound === "above" ? false : p < level;
  const lv = levelText(level);
  const around = regression === "c" ? "a fixed level" : "a trend line";
  const pText = bound === "below" ? "p < 0.01, beyond the KPSS table" : bound === "above" ? "p > 0.10, beyond the KPSS table" : "";
  const verdict = rejected
    ? `${capitalise(subject)} does not stay around ${around}: stationarity is rejected at ${lv}${pText ? ` (${pText})` : ""}.`
    : `${capitalise(subject)} is consistent with staying around ${around} (stationarity not rejected at ${lv}${pText ? `; ${pText}` : ""}).`;
  const { crit } = KPSS_TABLE[regression];

  return {
    test: `KPSS (${label})`,
    nullHypothesis: `stationarity around ${around}`,
    statistic,
    pValue: p,
    ...(bound ? { pValueBound: bound } : {}),
    lags,
    parameters: {
      "lag rule": options.lags === undefined ? "12(n/100)^(1/4), Bartlett" : "given, Bartlett",
      "long-run variance": lrv,
      observations: n,
    },
    criticalValues: { "10%": crit[0], "5%": crit[1], "2.5%": crit[2], "1%": crit[3] },
    level,
    rejected,
    verdict,
    regression,
    longRunVariance: lrv,
  };
}
