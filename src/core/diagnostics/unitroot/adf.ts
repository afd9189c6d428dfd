/**
 * Augmented Dickey–Fuller test (Dickey & Fuller 1979; Said & Dickey 1984). The test
 * regression, on t = p+1 … n−1 (0-based levels y_0 … y_{n−1}), is
 *
 *   Δy_t = [α] + [β·t] + γ·y_{t−1} + Σ_{i=1..p} φ_i Δy_{t−i} + e_t,
 *
 * and τ = γ̂ / se(γ̂) is compared with the Dickey–Fuller distribution: p-value from the
 * MacKinnon (1994) response surface (asymptotic), critical values from MacKinnon (2010) at
 * the regression's sample size. At 1%, 5% or 10% the verdict compares τ with that
 * finite-sample critical value, so it always agrees with the value the report prints; at any
 * other level the asymptotic p-value decides (see unitRootVerdict in mackinnon.ts).
 *
 * Lag choice. With a lag rule, every candidate p = 0 … maxLag is fitted on the same sample —
 * the last n − 1 − maxLag differences — so that the information criteria compare like with
 * like; the test regression is then re-run at the chosen p on the full sample available to
 * that p (n − 1 − p observations). This is the usual practice (Ng & Perron 1995 discuss the
 * common sample) and matches the outside reference in test/reference/make_unitroot.py.
 *
 * "maic" is the modified AIC of Ng & Perron (2001, Econometrica 69, 1519–1554): on the common
 * sample of N = n − 1 − maxLag rows,
 *
 *   MAIC(p) = ln σ̂²_p + 2·(τ(p) + p)/N,   σ̂²_p = SSR_p/N,   τ(p) = γ̂_p²·Σ ỹ²_{t−1} / σ̂²_p,
 *
 * with γ̂_p the coefficient on y_{t−1} in the p-lag regression and ỹ_{t−1} the lagged level
 * over those rows with the deterministic terms removed (demeaned for "c", OLS-detrended for
 * "ct", raw for "n"). The τ term penalises lags that pull γ̂ towards zero, which plain AIC
 * rewards under a unit root; in short series AIC's over-fitting makes the test over-reject a
 * random walk. Perron & Qu (2007, Economics Letters) show the rule also works with OLS
 * detrending, which is what this regression uses.
 */
import { gaussianCriteria, ols, qrFactor, type LeadingFit, type OlsResult } from "../../math/ols";
import { normalQuantile } from "../../math/distributions";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { DEFAULT_LEVEL, levelText, type TestResult } from "../types";
import { caseLabel, mackinnonCritical, mackinnonP, unitRootVerdict, type UnitRootCase } from "./mackinnon";
import { capitalise } from "../../series/wording";

export type LagRule = "aic" | "bic" | "tstat" | "maic";

export interface AdfOptions {
  /** Deterministic terms: none, constant, constant + linear trend. Default "c". */
  regression?: UnitRootCase;
  /** A fixed number of lagged differences; no selection is then made. */
  lags?: number;
  /** Largest lag tried by the rule. Default ⌊12·(n/100)^{1/4}⌋ (Schwert 1989), capped as below. */
  maxLag?: number;
  /**
   * How p is chosen when `lags` is not given. Default "aic" (what statsmodels' adfuller does,
   * and what the reference fixtures check); "maic" is the modified AIC of Ng & Perron (2001),
   * which unitRootSummary uses because AIC over-rejects a random walk in short series.
   */
  lagRule?: LagRule;
  /** Significance level of the verdict. Default 0.05. */
  level?: number;
  /** How the verdict names the series, e.g. "the log rate". Default "the series". */
  subject?: string;
}

export interface AdfResult extends TestResult {
  regression: UnitRootCase;
  /** Lagged differences in the final regression. */
  usedLag: number;
  /** "fixed" when `lags` was given. */
  lagRule: LagRule | "fixed";
  /** Observations in the final regression. */
  nobs: number;
}

/** The t-stat rule keeps the last lag while |t| ≥ Φ⁻¹(0.95) = 1.6448536…, a 10% two-sided test. */
export const TSTAT_THRESHOLD = normalQuantile(0.95);

/** Residual degrees of freedom the largest regression must keep; fewer gives a meaningless τ. */
const MIN_RESIDUAL_DF = 10;

export function deterministicCount(regression: UnitRootCase): number {
  return regression === "n" ? 0 : regression === "c" ? 1 : 2;
}

/** ⌊12·(n/100)^{1/4}⌋, Schwert (1989). */
export function schwertLag(n: number): number {
  return Math.floor(12 * Math.pow(n / 100, 0.25));
}

/**
 * Largest p for which the regression on n − 1 − p observations with k = d + 1 + p
 * coefficients keeps MIN_RESIDUAL_DF residual degrees of freedom: n − 2 − 2p − d ≥ 10.
 */
function largestFeasibleLag(n: number, d: number): number {
  return Math.floor((n - 2 - d - MIN_RESIDUAL_DF) / 2);
}

/**
 * Design for lag p on the rows that use the last `rows` differences. Columns:
 * deterministic terms (constant; trend 1, 2, …), y_{t−1}, Δy_{t−1} … Δy_{t−p}.
 */
function design(y: Float64Array, d: Float64Array, p: number, rows: number, regression: UnitRootCase): { X: Float64Array[]; dep: Float64Array; levelCol: number } {
  const m = d.length; // n − 1
  const start = m - rows; // Δy index: d[t] = y[t+1] − y[t], t = start + r
  const nd = deterministicCount(regression);
  const X: Float64Array[] = [];
  if (nd >= 1) X.push(new Float64Array(rows).fill(1));
  if (nd === 2) X.push(Float64Array.from({ length: rows }, (_, r) => r + 1));
  X.push(y.slice(start, start + rows));
  for (let i = 1; i <= p; i++) X.push(d.slice(start - i, start - i + rows));
  return { X, dep: d.slice(start, start + rows), levelCol: nd };
}

function exactPatternError(what: string): InputError {
  return new InputError(
    "CONSTANT_SERIES",
    `${what} cannot be run: the series moves in an exact pattern (for example a straight line), so there is nothing random to test.`,
  );
}

function fit(X: Float64Array[], dep: Float64Array, what: string): OlsResult {
  try {
    return ols(X, dep);
  } catch {
    // The only way the design loses rank on finite data is an exactly deterministic series
    // (a straight line with "ct", or changes that repeat exactly).
    throw exactPatternError(what);
  }
}

/**
 * The candidate fits p = 0 … maxLag on the common sample: each design is the leading
 * nd + 1 + p columns of the maxLag design on the same rows, so one QR factor of that design
 * gives every candidate exactly as its own fit would (QrFactor.leadingFits), SSR, coefficients
 * and the last coefficient's standard error, without per-candidate inference. fits[p] is lag p.
 */
function candidateFits(y: Float64Array, d: Float64Array, maxLag: number, rows: number, regression: UnitRootCase, what: string): LeadingFit[] {
  const { X, dep } = design(y, d, maxLag, rows, regression);
  let all: LeadingFit[];
  try {
    all = qrFactor(X).leadingFits(dep);
  } catch {
    // A leading block loses rank exactly when the whole design does, so this is the case in
    // which some candidate's own fit would have failed.
    throw exactPatternError(what);
  }
  return all.slice(deterministicCount(regression));
}

/** ADF verdict sentence at `level`. */
function verdict(subject: string, regression: UnitRootCase, rejected: boolean, level: number): string {
  const lv = levelText(level);
  if (!rejected) return `${capitalise(subject)} behaves like a random walk (no evidence against a unit root at ${lv}).`;
  if (regression === "ct") return `${capitalise(subject)} returns to a trend line: a unit root is rejected at ${lv}.`;
  if (regression === "c") return `${capitalise(subject)} returns to a fixed mean: a unit root is rejected at ${lv}.`;
  return `${capitalise(subject)} returns to zero: a unit root is rejected at ${lv}.`;
}

/**
 * Σ ỹ²_{t−1} over the common sample: the lagged level y[t], t = start … start + rows − 1,
 * after removing the deterministic terms of `regression` by OLS on those rows (the trend is
 * the same 1, 2, … column as the design's). Ng & Perron (2001), τ_T(k).
 */
function detrendedLevelSumSquares(y: Float64Array, start: number, rows: number, regression: UnitRootCase): number {
  let ss = 0;
  if (regression === "n") {
    for (let r = 0; r < rows; r++) ss += y[start + r] * y[start + r];
    return ss;
  }
  let mean = 0;
  for (let r = 0; r < rows; r++) mean += y[start + r];
  mean /= rows;
  if (regression === "c") {
    for (let r = 0; r < rows; r++) ss += (y[start + r] - mean) ** 2;
    return ss;
  }
  // Slope on the trend r + 1 (centred at (rows + 1)/2) by the closed-form simple regression.
  const tbar = (rows + 1) / 2;
  let sty = 0;
  let stt = 0;
  for (let r = 0; r < rows; r++) {
    const tc = r + 1 - tbar;
    sty += tc * (y[start + r] - mean);
    stt += tc * tc;
  }
  const slope = sty / stt;
  for (let r = 0; r < rows; r++) {
    const e = y[start + r] - mean - slope * (r + 1 - tbar);
    ss += e * e;
  }
  return ss;
}

/** Chooses p on the common sample of the last n − 1 − maxLag differences. */
function chooseLag(y: Float64Array, d: Float64Array, maxLag: number, rule: LagRule, regression: UnitRootCase, what: string): number {
  const rows = d.length - maxLag;
  const fits = candidateFits(y, d, maxLag, rows, regression, what);
  if (rule === "tstat") {
    // Start from maxLag and drop the last lag while |t| < threshold; p = 0 if none is kept.
    for (let p = maxLag; p >= 1; p--) {
      const f = fits[p];
      if (Math.abs(f.coef[f.k - 1] / f.lastSe) >= TSTAT_THRESHOLD) return p;
    }
    return 0;
  }
  // Only the modified AIC needs Σ ỹ²_{t−1}; the lagged levels are the same rows for every p.
  const sumY2 = rule === "maic" ? detrendedLevelSumSquares(y, d.length - rows, rows, regression) : 0;
  const levelCol = deterministicCount(regression);
  let best = 0;
  let bestIc = Infinity;
  for (let p = 0; p <= maxLag; p++) {
    const r = fits[p];
    let ic: number;
    if (rule === "maic") {
      // Ng & Perron (2001): MAIC(k) = ln σ̂²_k + 2(τ_T(k) + k)/(T − kmax), with
      // σ̂²_k = SSR_k/(T − kmax) and τ_T(k) = b̂₀²·Σ ỹ²_{t−1}/σ̂²_k; here T − kmax = rows.
      const s2 = r.ssr / rows;
      const b0 = r.coef[levelCol];
      const tau = (b0 * b0 * sumY2) / s2;
      ic = Math.log(s2) + (2 * (tau + p)) / rows;
    } else {
      const criteria = gaussianCriteria(r.ssr, rows, r.k);
      ic = rule === "aic" ? criteria.aic : criteria.bic;
    }
    if (ic < bestIc) {
      // Strictly smaller: ties go to the shorter lag.
      bestIc = ic;
      best = p;
    }
  }
  return best;
}

function checkLagOption(v: number | undefined, name: string): void {
  if (v !== undefined && (!Number.isInteger(v) || v < 0)) {
    throw new InputError("BAD_OPTION", `ADF: ${name} must be a whole number of weeks (0 or more); got ${v}.`);
  }
}

export function adf(y: ArrayLike<number>, options: AdfOptions = {}): AdfResult {
  const regression = options.regression ?? "c";
  const level = options.level ?? DEFAULT_LEVEL;
  const subject = options.subject ?? "the series";
  const what = `The ADF test (${caseLabel(regression)})`;
  checkLagOption(options.lags, "lags");
  checkLagOption(options.maxLag, "maxLag");
  const nd = deterministicCount(regression);

  // The largest lag that will be fitted decides the minimum length.
  const n0 = y.length;
  const asked = options.lags ?? options.maxLag;
  const top = asked ?? Math.max(0, Math.min(schwertLag(n0), largestFeasibleLag(n0, nd)));
  const series = checkSeries(y, 2 * top + nd + 2 + MIN_RESIDUAL_DF, what);
  const n = series.length;
  const d = new Float64Array(n - 1);
  for (let t = 0; t < n - 1; t++) d[t] = series[t + 1] - series[t];

  let usedLag: number;
  let lagRule: LagRule | "fixed";
  const parameters: Record<string, number | string> = {};
  if (options.lags !== undefined) {
    usedLag = options.lags;
    lagRule = "fixed";
  } else {
    lagRule = options.lagRule ?? "aic";
    usedLag = chooseLag(series, d, top, lagRule, regression, what);
    parameters["max lag"] = top;
  }
  parameters["lags chosen by"] =
    lagRule === "fixed"
      ? "given"
      : lagRule === "tstat"
        ? `t-stat (|t| ≥ ${TSTAT_THRESHOLD.toFixed(3)})`
        : lagRule === "maic"
          ? "modified AIC (Ng & Perron 2001)"
          : lagRule.toUpperCase();
  parameters["deterministic terms"] = caseLabel(regression);

  // Final regression at the chosen lag on every observation that lag allows.
  const rows = n - 1 - usedLag;
  const { X, dep, levelCol } = design(series, d, usedLag, rows, regression);
  const r = fit(X, dep, what);
  const statistic = r.tStat[levelCol];
  const pValue = mackinnonP(statistic, regression);
  const criticalValues = mackinnonCritical(regression, rows);
  const { rejected, decidedBy } = unitRootVerdict(statistic, pValue, criticalValues, level);
  parameters.observations = rows;
  parameters["verdict by"] = decidedBy;
  parameters["γ (coefficient on lagged level)"] = r.coef[levelCol];

  return {
    test: `ADF (${caseLabel(regression)})`,
    nullHypothesis: "a unit root (the series wanders like a random walk)",
    statistic,
    pValue,
    lags: usedLag,
    parameters,
    criticalValues: { ...criticalValues },
    level,
    rejected,
    verdict: verdict(subject, regression, rejected, level),
    regression,
    usedLag,
    lagRule,
    nobs: rows,
  };
}
