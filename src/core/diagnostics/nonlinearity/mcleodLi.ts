/**
 * McLeod & Li (1983), "Diagnostic checking ARMA time series models using squared-residual
 * autocorrelations", J. Time Series Analysis 4, 269–273: the Ljung–Box portmanteau applied to
 * the squared residuals of the linear AR(p) null. With â_t, t = 1..N (N = n − p), and
 * σ̂² = Σâ_t²/N,
 *   r_k = Σ_{t=k+1}^{N} (â_t² − σ̂²)(â_{t−k}² − σ̂²) / Σ_{t=1}^{N} (â_t² − σ̂²)²,
 *   Q = N(N + 2) Σ_{k=1}^{L} r_k²/(N − k) ~ χ²(L),
 * with no degrees of freedom subtracted for the AR fit: McLeod & Li show the squared-residual
 * autocorrelations are asymptotically unaffected by estimating the ARMA parameters.
 * Default L = min(20, ⌊N/4⌋): twenty weeks of memory in the size of moves, but never more
 * than a quarter of the residuals.
 */
import { chi2Sf } from "../../math/distributions";
import { InputError } from "../../series/errors";
import { acfOf } from "../residuals/acf";
import { cumulativeQ } from "../residuals/ljungBox";
import type { TestResult } from "../types";
import { ArOrderOptions, fitAr, nonlinearityVerdict, orderParameters, prepareSeries, PreparedSeries } from "./arOrder";

export interface McLeodLiOptions extends ArOrderOptions {
  /** Number of squared-residual autocorrelations L; default min(20, ⌊N/4⌋), N the residual count. */
  lags?: number;
}

export function defaultMcLeodLiLags(residualCount: number): number {
  return Math.max(1, Math.min(20, Math.floor(residualCount / 4)));
}

/**
 * Q and its χ²(L) p-value for the squared values of the residuals a: the Ljung–Box sum of
 * the residual checks (acfOf, cumulativeQ) applied to â_t², as McLeod & Li define it.
 */
export function squaredAutocorrelationQ(a: Float64Array, L: number): { q: number; pValue: number; acf: Float64Array } {
  const N = a.length;
  const sq = Float64Array.from(a, (v) => v * v);
  let s2 = 0;
  for (let t = 0; t < N; t++) s2 += sq[t];
  s2 /= N;
  let c0 = 0;
  for (let t = 0; t < N; t++) c0 += (sq[t] - s2) * (sq[t] - s2);
  // Every squared residual equal (e.g. residuals of ±σ only): the squares carry no
  // variation, the autocorrelations are undefined, and the test has nothing to say.
  if (!(c0 > 1e-24 * Math.max(1, s2 * s2 * N))) {
    throw new Error("McLeod–Li: the squared residuals do not vary");
  }
  const r = acfOf(sq, L);
  const q = cumulativeQ(r, N, L)[L - 1];
  return { q, pValue: chi2Sf(q, L), acf: r.slice(1) };
}

export function mcleodLiPrepared(prep: PreparedSeries, options: Pick<McLeodLiOptions, "lags"> = {}): TestResult {
  const p = prep.order;
  const { fit } = fitAr(prep, p);
  const N = fit.n;
  const L = options.lags ?? defaultMcLeodLiLags(N);
  if (!Number.isInteger(L) || L < 1 || L > Math.floor(N / 2)) {
    throw new InputError("BAD_OPTION", `The McLeod–Li lags must be a whole number from 1 to ${Math.floor(N / 2)} for this series; got ${L}.`);
  }
  const { q, pValue } = squaredAutocorrelationQ(fit.residuals, L);
  return {
    test: "McLeod–Li",
    nullHypothesis: "the squared AR residuals are uncorrelated (no clustering in the size of moves)",
    statistic: q,
    pValue,
    lags: L,
    parameters: { ...orderParameters(prep, p), "chi-squared df": L, observations: N },
    level: prep.level,
    rejected: pValue < prep.level,
    verdict: nonlinearityVerdict("McLeod–Li Q", q, pValue, prep.level, ": large and small moves come in clusters"),
  };
}

/** McLeod & Li (1983) portmanteau test on the squared AR residuals. */
export function mcleodLi(y: ArrayLike<number>, options: McLeodLiOptions = {}): TestResult {
  return mcleodLiPrepared(prepareSeries(y, options, "The McLeod–Li test"), options);
}
