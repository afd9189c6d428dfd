/**
 * Phillips–Perron (1988) unit-root tests Z(α) and Z(t). OLS of
 *
 *   y_t = [μ] + [β·(t − T/2)] + ρ·y_{t−1} + u_t,   t = 2 … n  (T = n − 1 observations),
 *
 * then a non-parametric correction for serial correlation in u instead of ADF's lagged
 * differences. In the form of Hamilton (1994, §17.6, eqs. 17.6.8 and 17.6.12):
 *
 *   Z(α) = T(ρ̂ − 1) − ½ (T²·se(ρ̂)²/s²)(λ̂² − γ̂₀)
 *   Z(t) = √(γ̂₀/λ̂²)·t_ρ − ½ (λ̂² − γ̂₀)(1/λ̂)(T·se(ρ̂)/s)
 *
 * with t_ρ = (ρ̂ − 1)/se(ρ̂), s² = SSR/(T − k) the OLS variance, γ̂_j = T⁻¹ Σ_{t>j} û_t û_{t−j},
 * and λ̂² = γ̂₀ + 2 Σ_{j=1..q} (1 − j/(q+1)) γ̂_j the Bartlett-kernel long-run variance
 * (Newey & West 1987).
 *
 * Bandwidth: the fixed rule q = ⌊4·(T/100)^{2/9}⌋ on the T residuals (Newey & West 1994 give
 * the T^{2/9} rate for the Bartlett kernel; the factor 4 is the common non-adaptive choice).
 * A fixed rule keeps the test a plain function of the data length, so weekly reruns with one
 * more week do not jump between bandwidths because a pilot estimate moved. A given `lags`
 * overrides it.
 *
 * Z(t) has the asymptotic distribution of the Dickey–Fuller τ for the same case, so its
 * p-value and critical values come from mackinnon.ts, and its verdict is decided as ADF's: by
 * the finite-sample critical value at 1%, 5% or 10%, by the asymptotic p-value otherwise. Z(α) has critical values only (the
 * Dickey–Fuller n(ρ̂−1) tables) and is reported in `parameters`.
 */
import { Matrix } from "ml-matrix";
import { ols, type OlsResult } from "../../math/ols";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { DEFAULT_LEVEL, levelText, type TestResult } from "../types";
import { caseLabel, mackinnonCritical, mackinnonP, unitRootVerdict, type UnitRootCase } from "./mackinnon";
import { capitalise } from "../../series/wording";

export interface PpOptions {
  /** Deterministic terms. Default "c". */
  regression?: UnitRootCase;
  /** Bartlett bandwidth q; default ⌊4·(T/100)^{2/9}⌋. */
  lags?: number;
  level?: number;
  /** How the verdict names the series. Default "the series". */
  subject?: string;
}

export interface PpResult extends TestResult {
  regression: UnitRootCase;
  /** Z(α) = T(ρ̂ − 1) corrected. */
  zAlpha: number;
  /** Z(t), the main statistic. */
  zTau: number;
  /** Observations in the regression, T = n − 1. */
  nobs: number;
  rho: number;
  /** γ̂₀ and λ̂², the short- and long-run residual variances. */
  shortRunVariance: number;
  longRunVariance: number;
}

/** ⌊4·(T/100)^{2/9}⌋. */
export function ppBandwidth(T: number): number {
  return Math.floor(4 * Math.pow(T / 100, 2 / 9));
}

/** Bartlett long-run variance of a residual vector with bandwidth q (divisor T throughout). */
export function bartlettLongRunVariance(u: Float64Array, q: number): { gamma0: number; lrv: number } {
  const T = u.length;
  let g0 = 0;
  for (let t = 0; t < T; t++) g0 += u[t] * u[t];
  g0 /= T;
  let lrv = g0;
  for (let j = 1; j <= q; j++) {
    let g = 0;
    for (let t = j; t < T; t++) g += u[t] * u[t - j];
    lrv += (2 * (1 - j / (q + 1)) * g) / T;
  }
  return { gamma0: g0, lrv };
}

export function pp(y: ArrayLike<number>, options: PpOptions = {}): PpResult {
  const regression = options.regression ?? "c";
  const level = options.level ?? DEFAULT_LEVEL;
  const subject = options.subject ?? "the series";
  const what = `The Phillips–Perron test (${caseLabel(regression)})`;
  if (options.lags !== undefined && (!Number.isInteger(options.lags) || options.lags < 0)) {
    throw new InputError("BAD_OPTION", `Phillips–Perron: lags must be a whole number of weeks (0 or more); got ${options.lags}.`);
  }
  const nd = regression === "n" ? 0 : regression === "c" ? 1 : 2;
  // At least 10 residual degrees of freedom, and the bandwidth below the residual count.
  const minN = Math.max(nd + 12, (options.lags ?? 0) + 2);
  const series = checkSeries(y, minN, what);
  const n = series.length;
  const T = n - 1;
  const q = options.lags ?? ppBandwidth(T);

  const X = new Matrix(T, nd + 1);
  const dep = new Float64Array(T);
  for (let r = 0; r < T; r++) {
    dep[r] = series[r + 1];
    let c = 0;
    if (nd >= 1) X.set(r, c++, 1);
    if (nd === 2) X.set(r, c++, r + 1 - T / 2);
    X.set(r, c, series[r]);
  }
  let fit: OlsResult;
  try {
    fit = ols(X, dep);
  } catch {
    throw new InputError(
      "CONSTANT_SERIES",
      `${what} cannot be run: the series moves in an exact pattern (for example a straight line), so there is nothing random to test.`,
    );
  }
  const rho = fit.coef[nd];
  const se = fit.se[nd];
  const s = Math.sqrt(fit.sigma2);
  if (!(s > 0)) {
    throw new InputError("CONSTANT_SERIES", `${what} cannot be run: each week is an exact linear function of the week before.`);
  }
  const tRho = (rho - 1) / se;
  const { gamma0, lrv } = bartlettLongRunVariance(fit.residuals, q);
  if (!(lrv > 0)) {
    throw new InputError(
      "BAD_OPTION",
      `${what}: the long-run variance with ${q} lags is not positive; use fewer lags.`,
    );
  }
  const lambda = Math.sqrt(lrv);
  // Hamilton (1994), eq. 17.6.8.
  const zAlpha = T * (rho - 1) - 0.5 * ((T * T * se * se) / (s * s)) * (lrv - gamma0);
  // Hamilton (1994), eq. 17.6.12.
  const zTau = Math.sqrt(gamma0 / lrv) * tRho - (0.5 * (lrv - gamma0) * (T * se)) / (lambda * s);

  const pValue = mackinnonP(zTau, regression);
  const criticalValues = mackinnonCritical(regression, T);
  const { rejected, decidedBy } = unitRootVerdict(zTau, pValue, criticalValues, level);
  const lv = levelText(level);
  const verdict = rejected
    ? `${capitalise(subject)} ${regression === "ct" ? "returns to a trend line" : regression === "c" ? "returns to a fixed mean" : "returns to zero"}: a unit root is rejected at ${lv}.`
    : `${capitalise(subject)} behaves like a random walk (no evidence against a unit root at ${lv}).`;

  return {
    test: `PP Z(t) (${caseLabel(regression)})`,
    nullHypothesis: "a unit root (the series wanders like a random walk)",
    statistic: zTau,
    pValue,
    lags: q,
    parameters: {
      "Z(alpha)": zAlpha,
      "bandwidth rule": options.lags === undefined ? "4(T/100)^(2/9), Bartlett" : "given, Bartlett",
      "deterministic terms": caseLabel(regression),
      observations: T,
      rho,
      "verdict by": decidedBy,
    },
    criticalValues: { ...criticalValues },
    level,
    rejected,
    verdict,
    regression,
    zAlpha,
    zTau,
    nobs: T,
    rho,
    shortRunVariance: gamma0,
    longRunVariance: lrv,
  };
}
