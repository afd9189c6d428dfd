/**
 * Tsay (1986), "Nonlinearity tests for time series", Biometrika 73, 461–466: Keenan's test
 * with the single squared fit replaced by all m = p(p+1)/2 cross-products of the lags. On
 * t = p+1..n the paper's steps are
 *   (i)   y_t on 1, y_{t−1..t−p}: residuals â_t;
 *   (ii)  Z_t = (y_{t−i}y_{t−j}, 1 ≤ i ≤ j ≤ p) on the same regressors: residual vectors X̂_t;
 *   (iii) â_t on X̂_t: residuals ε̂_t;
 * F̂ = [(Σ X̂_t â_t)ᵀ(Σ X̂_t X̂_tᵀ)⁻¹(Σ X̂_t â_t)/m] / [Σ ε̂_t²/(n − p − m − 1)],
 * referred to F(m, n − p − m − 1), n the length of the whole series: the paper's convention,
 * which counts the n − p observations of regression (iii) less its m slopes and one intercept
 * but not the p AR slopes already removed in (i)–(ii). The numerator sum is Σâ² − Σε̂².
 */
import { fSf } from "../../math/distributions";
import { ols } from "../../math/ols";
import type { TestResult } from "../types";
import {
  ArOrderOptions, cappedOrder, fitAr, lagProducts, nonlinearityVerdict, orderParameters,
  prepareSeries, PreparedSeries, requireNewDirection, requireResidualDf,
} from "./arOrder";

export type TsayOptions = ArOrderOptions;

/** Coefficients of the full Tsay regression at order q: 1 + q + q(q+1)/2. */
function tsayCoefficients(q: number): number {
  return 1 + q + (q * (q + 1)) / 2;
}

export function tsayPrepared(prep: PreparedSeries): TestResult {
  const n = prep.z.length;
  const p = cappedOrder(prep, tsayCoefficients);
  const m = (p * (p + 1)) / 2;
  const df2 = n - p - m - 1;
  requireResidualDf(df2, n, p, "Tsay's test");
  const { design, X, fit } = fitAr(prep, p); // (i)
  const products = lagProducts(design.lags, 2);
  const xhat = products.map((z) => X.residuals(z)); // (ii), X factored once
  products.forEach((z, c) => requireNewDirection(z, xhat[c]));
  const step3 = ols(xhat, fit.residuals, { inference: false }); // (iii)
  const explained = fit.ssr - step3.ssr;
  const F = explained / m / (step3.ssr / df2);
  const pValue = fSf(F, m, df2);
  return {
    test: "Tsay",
    nullHypothesis: "the rates follow a linear autoregression (no quadratic lag effects)",
    statistic: F,
    pValue,
    lags: p,
    parameters: { ...orderParameters(prep, p), df1: m, df2, observations: design.rows },
    level: prep.level,
    rejected: pValue < prep.level,
    verdict: nonlinearityVerdict("Tsay F", F, pValue, prep.level),
  };
}

/** Tsay (1986) F test for quadratic nonlinearity. */
export function tsay(y: ArrayLike<number>, options: TsayOptions = {}): TestResult {
  return tsayPrepared(prepareSeries(y, options, "Tsay's nonlinearity test"));
}
