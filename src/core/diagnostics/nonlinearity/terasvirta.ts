/**
 * Teräsvirta, Lin & Granger (1993), "Power of the neural network linearity test", J. Time
 * Series Analysis 14, 209–220: the Lagrange-multiplier test against a single-hidden-layer
 * network, with the network's logistic units replaced by their third-order Taylor expansion.
 * On t = p+1..n:
 *   1. y_t on 1, y_{t−1..t−p}: residuals û_t, SSR₀ = Σû_t²;
 *   2. û_t on 1, y_{t−1..t−p}, y_{t−i}y_{t−j} (1 ≤ i ≤ j ≤ p) and y_{t−i}y_{t−j}y_{t−k}
 *      (1 ≤ i ≤ j ≤ k ≤ p): SSR₁, with m = p(p+1)/2 + p(p+1)(p+2)/6 added terms;
 *   χ² form LM = T·R² = T(SSR₀ − SSR₁)/SSR₀ ~ χ²(m), T = n − p observations;
 *   F form  F = [(SSR₀ − SSR₁)/m] / [SSR₁/(T − p − 1 − m)] ~ F(m, T − p − 1 − m),
 * the F form being the one recommended for small samples and reported as the statistic.
 */
import { chi2Sf, fSf } from "../../math/distributions";
import { ols } from "../../math/ols";
import type { TestResult } from "../types";
import {
  ArOrderOptions, cappedOrder, fitAr, lagProducts, nonlinearityVerdict, orderParameters, prepareSeries,
  PreparedSeries, requireResidualDf, withConstant,
} from "./arOrder";

export type TerasvirtaOptions = ArOrderOptions;

function addedTerms(q: number): number {
  return (q * (q + 1)) / 2 + (q * (q + 1) * (q + 2)) / 6;
}

export function terasvirtaPrepared(prep: PreparedSeries): TestResult {
  const n = prep.z.length;
  const p = cappedOrder(prep, (q) => 1 + q + addedTerms(q));
  const m = addedTerms(p);
  const T = n - p;
  const df2 = T - p - 1 - m;
  requireResidualDf(df2, n, p, "Teräsvirta's test");
  const { design, fit } = fitAr(prep, p); // step 1
  const cols = [...design.lags, ...lagProducts(design.lags, 2), ...lagProducts(design.lags, 3)];
  const aux = ols(withConstant(cols, T), fit.residuals, { inference: false }); // step 2
  const ssr0 = fit.ssr;
  const ssr1 = aux.ssr;
  const F = (ssr0 - ssr1) / m / (ssr1 / df2);
  const pValue = fSf(F, m, df2);
  const lm = (T * (ssr0 - ssr1)) / ssr0;
  return {
    test: "Teräsvirta",
    nullHypothesis: "the rates follow a linear autoregression (no neural-network-type nonlinearity)",
    statistic: F,
    pValue,
    lags: p,
    parameters: {
      ...orderParameters(prep, p), df1: m, df2, observations: T,
      "chi-squared (T·R²)": lm, "chi-squared df": m, "chi-squared p-value": chi2Sf(lm, m),
    },
    level: prep.level,
    rejected: pValue < prep.level,
    verdict: nonlinearityVerdict("Teräsvirta F", F, pValue, prep.level),
  };
}

/** Teräsvirta, Lin & Granger (1993) neural-network linearity test (F form; χ² in parameters). */
export function terasvirta(y: ArrayLike<number>, options: TerasvirtaOptions = {}): TestResult {
  return terasvirtaPrepared(prepareSeries(y, options, "Teräsvirta's nonlinearity test"));
}
