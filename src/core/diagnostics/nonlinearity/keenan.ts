/**
 * Keenan (1985), "A Tukey nonadditivity-type test for time series nonlinearity",
 * Biometrika 72, 39–44: a one-degree-of-freedom test of the linear AR(p) null against a
 * second-order (Volterra-type) departure, in the paper's three regressions (here on t = p+1..n):
 *   (i)   y_t on 1, y_{t−1..t−p}: fitted ŷ_t and residuals ê_t;
 *   (ii)  ŷ_t² on the same regressors: residuals ξ̂_t;
 *   (iii) ê_t on ξ̂_t: η̂ = η̂₀(Σξ̂_t²)^{1/2} with η̂₀ = Σê_tξ̂_t / Σξ̂_t²;
 * and F̂ = η̂²(n − 2p − 2)/(Σê_t² − η̂²), referred to F(1, n − 2p − 2) as in the paper, where
 * n is the length of the whole series (so n − 2p − 2 = (n − p) − (p + 1) − 1, the residual df
 * of regressing y_t on the AR regressors and ξ̂_t together).
 */
import { fSf } from "../../math/distributions";
import type { TestResult } from "../types";
import {
  ArOrderOptions, fitAr, nonlinearityVerdict, orderParameters, prepareSeries, PreparedSeries, requireNewDirection,
  requireResidualDf,
} from "./arOrder";

export type KeenanOptions = ArOrderOptions;

/** Keenan's test on a prepared (checked, scaled, order-fixed) series. */
export function keenanPrepared(prep: PreparedSeries): TestResult {
  const n = prep.z.length;
  const p = prep.order;
  const df2 = n - 2 * p - 2;
  requireResidualDf(df2, n, p, "Keenan's test");
  const { X, fit } = fitAr(prep, p); // (i)
  const rows = fit.n;
  const sq = new Float64Array(rows);
  for (let r = 0; r < rows; r++) sq[r] = fit.fitted[r] * fit.fitted[r];
  const xi = X.residuals(sq); // (ii), on the factor of (i)
  const e = fit.residuals;
  let exi = 0;
  let xixi = 0;
  for (let r = 0; r < rows; r++) {
    exi += e[r] * xi[r];
    xixi += xi[r] * xi[r];
  }
  requireNewDirection(sq, xi); // ŷ² in the span of the lags, e.g. rates on two levels at p = 1
  // (iii): η̂² = (Σêξ̂)²/Σξ̂², the part of Σê² explained by ξ̂.
  const eta2 = (exi * exi) / xixi;
  const F = (eta2 * df2) / (fit.ssr - eta2);
  const pValue = fSf(F, 1, df2);
  return {
    test: "Keenan",
    nullHypothesis: "the rates follow a linear autoregression (no second-order nonlinearity)",
    statistic: F,
    pValue,
    lags: p,
    parameters: { ...orderParameters(prep, p), df1: 1, df2, observations: rows },
    level: prep.level,
    rejected: pValue < prep.level,
    verdict: nonlinearityVerdict("Keenan F", F, pValue, prep.level),
  };
}

/** Keenan (1985) one-degree-of-freedom test for nonlinearity. */
export function keenan(y: ArrayLike<number>, options: KeenanOptions = {}): TestResult {
  return keenanPrepared(prepareSeries(y, options, "Keenan's nonlinearity test"));
}
