/**
 * What the nonlinearity tests share: the linear AR(p) null model fitted by OLS with a
 * constant, its order chosen by AIC, the design-matrix builders (lags and their products) and
 * the wording of verdicts.
 *
 * Order choice. For p = 1..P every AR(p) is fitted on the same sample, the weeks t = P+1..n
 * (so the AICs compare like with like), and the p with the smallest AIC = −2ℓ + 2(p+1) wins;
 * ties go to the smaller p. The default ceiling is P = min(12, ⌊n/10⌋): a quarter of a year of
 * weekly lags at most, and never more than one lag per ten weeks of data. The chosen AR(p) is
 * then refitted on all the weeks it can use, t = p+1..n, which is the sample of every test.
 *
 * Scaling. The series is centred and divided by its standard deviation before any design is
 * built. Every statistic here is invariant to y → a + by (lags and their products span the same
 * column space with the constant and the lower-order terms included; Keenan's squared fit
 * changes only by terms in that span; BDS and McLeod–Li are scale-free), while cubes of raw
 * freight rates in the thousands would make the auxiliary regressions needlessly ill-conditioned.
 */
import { gaussianCriteria, ols, OlsFit, QrFactor, qrFactor } from "../../math/ols";
import { InputError } from "../../series/errors";
import { checkSeries } from "../input";
import { DEFAULT_LEVEL, levelText } from "../types";

/** Shortest series the nonlinearity tests accept: below 30 weeks none of them says anything. */
export const MIN_LENGTH = 30;
/** An auxiliary regression must keep at least this many residual degrees of freedom. */
export const MIN_RESIDUAL_DF = 10;
/**
 * When the order is chosen automatically, Tsay's and Teräsvirta's auxiliary regressions (whose
 * size grows like p² and p³) use the largest order q ≤ p that keeps at least this many
 * observations per coefficient; a given order is honoured as it is.
 */
export const OBSERVATIONS_PER_COEFFICIENT = 3;

export interface ArOrderOptions {
  /** AR order of the linear null model; chosen by AIC when omitted. */
  order?: number;
  /** Largest order the AIC search considers; default min(12, ⌊n/10⌋). */
  maxOrder?: number;
  /** Significance level of the verdict; default 0.05. */
  level?: number;
}

/** The default AIC ceiling min(12, ⌊n/10⌋), at least 1. */
export function defaultMaxOrder(n: number): number {
  return Math.max(1, Math.min(12, Math.floor(n / 10)));
}

/** Rows t = start..n−1 (0-based) of the AR regression: the target y_t and lag columns y_{t−i}. */
export interface ArDesign {
  /** y_t for t = start..n−1. */
  target: Float64Array;
  /** lags[i−1][r] = y_{start+r−i}, i = 1..p. */
  lags: Float64Array[];
  rows: number;
  start: number;
}

export function arDesign(y: Float64Array, p: number, start: number = p): ArDesign {
  const n = y.length;
  if (start < p) throw new Error(`arDesign: start ${start} is before the first usable week for order ${p}`);
  const rows = n - start;
  const target = y.slice(start);
  const lags: Float64Array[] = [];
  for (let i = 1; i <= p; i++) lags.push(y.slice(start - i, n - i));
  return { target, lags, rows, start };
}

/** [1, c₁, c₂, …] as columns for `ols` (the columns are shared, not copied). */
export function withConstant(cols: Float64Array[], rows: number): Float64Array[] {
  return [new Float64Array(rows).fill(1), ...cols];
}

/**
 * Products of the lag columns of a given degree with non-decreasing indices:
 * degree 2 gives y_{t−i}y_{t−j}, 1 ≤ i ≤ j ≤ p (p(p+1)/2 columns), degree 3 gives
 * y_{t−i}y_{t−j}y_{t−k}, i ≤ j ≤ k (p(p+1)(p+2)/6 columns).
 */
export function lagProducts(lags: Float64Array[], degree: 2 | 3): Float64Array[] {
  const p = lags.length;
  const rows = p > 0 ? lags[0].length : 0;
  const out: Float64Array[] = [];
  for (let i = 0; i < p; i++) {
    for (let j = i; j < p; j++) {
      if (degree === 2) {
        const c = new Float64Array(rows);
        const a = lags[i];
        const b = lags[j];
        for (let r = 0; r < rows; r++) c[r] = a[r] * b[r];
        out.push(c);
      } else {
        for (let k = j; k < p; k++) {
          const c = new Float64Array(rows);
          const a = lags[i];
          const b = lags[j];
          const d = lags[k];
          for (let r = 0; r < rows; r++) c[r] = a[r] * b[r] * d[r];
          out.push(c);
        }
      }
    }
  }
  return out;
}

export interface ArOrderChoice {
  order: number;
  maxOrder: number;
  /** aic[p − 1] is the AIC of the AR(p) fit on the common sample. */
  aic: Float64Array;
  /** Weeks in the common sample, n − maxOrder. */
  commonSample: number;
}

/**
 * aic[p − 1] for AR(p), p = 1..P, on the common sample. The AR(p) design is the leading p + 1
 * columns of the AR(P) one on the same rows, so one QR factor gives every order exactly as its
 * own fit would (QrFactor.leadingFits). When some order's lags are collinear (the rates repeat
 * an exact pattern) the orders are fitted one by one and those that fail get +∞.
 */
function commonSampleAic(y: Float64Array, maxOrder: number): Float64Array {
  const aic = new Float64Array(maxOrder);
  const full = arDesign(y, maxOrder, maxOrder);
  try {
    const fits = qrFactor(withConstant(full.lags, full.rows)).leadingFits(full.target);
    for (let p = 1; p <= maxOrder; p++) aic[p - 1] = gaussianCriteria(fits[p].ssr, full.rows, p + 1).aic;
    return aic;
  } catch {
    // Fall through to order-by-order fits, which tell the failing orders apart.
  }
  for (let p = 1; p <= maxOrder; p++) {
    const d = arDesign(y, p, maxOrder);
    try {
      aic[p - 1] = ols(withConstant(d.lags, d.rows), d.target, { inference: false }).aic;
    } catch {
      // Collinear lags: this order cannot be fitted.
      aic[p - 1] = Infinity;
    }
  }
  return aic;
}

/** AIC choice of the AR order on the common sample t = P+1..n (module comment). */
export function chooseArOrder(y: Float64Array, maxOrder: number = defaultMaxOrder(y.length)): ArOrderChoice {
  const aic = commonSampleAic(y, maxOrder);
  let best = 1;
  for (let p = 1; p <= maxOrder; p++) {
    if (aic[p - 1] < aic[best - 1] || !Number.isFinite(aic[best - 1])) best = p;
  }
  if (!Number.isFinite(aic[best - 1])) throw exactPatternError();
  return { order: best, maxOrder, aic, commonSample: y.length - maxOrder };
}

/** The series after checks and scaling, with the order every test of one call uses. */
export interface PreparedSeries {
  /** (y − ȳ)/s, see the module comment. */
  z: Float64Array;
  order: number;
  chosenBy: "AIC" | "given";
  maxOrder: number;
  level: number;
  /** AR fits already made on z, by order, so the tests of one summary fit each order once. */
  fits: Map<number, ArFit>;
}

function checkInteger(v: number, lo: number, hi: number, what: string): void {
  if (!Number.isInteger(v) || v < lo || v > hi) {
    throw new InputError("BAD_OPTION", `The ${what} must be a whole number from ${lo} to ${hi}; got ${v}.`);
  }
}

export function checkLevel(level: number): number {
  if (!(level > 0 && level < 0.5)) {
    throw new InputError("BAD_OPTION", `The significance level must be a fraction between 0 and 0.5, such as 0.05; got ${level}.`);
  }
  return level;
}

function exactPatternError(): InputError {
  return new InputError(
    "CONSTANT_SERIES",
    "The nonlinearity tests need week-to-week noise, but these rates repeat an exact pattern that past weeks predict without error.",
  );
}

/** Checks the series and options, scales the series and fixes the AR order. */
export function prepareSeries(y: ArrayLike<number>, options: ArOrderOptions, what: string): PreparedSeries {
  const x = checkSeries(y, MIN_LENGTH, what);
  const n = x.length;
  const level = checkLevel(options.level ?? DEFAULT_LEVEL);
  const limit = Math.floor(n / 3);
  const maxOrder = options.maxOrder ?? defaultMaxOrder(n);
  checkInteger(maxOrder, 1, limit, "largest AR order");
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - mean) * (x[i] - mean);
  const sd = Math.sqrt(ss / (n - 1));
  const z = new Float64Array(n);
  for (let i = 0; i < n; i++) z[i] = (x[i] - mean) / sd;
  let prep: PreparedSeries;
  if (options.order !== undefined) {
    checkInteger(options.order, 1, limit, "AR order");
    prep = { z, order: options.order, chosenBy: "given", maxOrder, level, fits: new Map() };
  } else {
    prep = { z, order: chooseArOrder(z, maxOrder).order, chosenBy: "AIC", maxOrder, level, fits: new Map() };
  }
  // z has variance 1, so an SSR this small is an exact recursion up to rounding.
  let ssr: number;
  try {
    ssr = fitAr(prep, prep.order).fit.ssr;
  } catch {
    throw exactPatternError();
  }
  if (ssr <= 1e-20 * (n - 1)) throw exactPatternError();
  return prep;
}

export interface ArFit {
  design: ArDesign;
  /** The AR regressors [1, y_{t−1}, …, y_{t−p}], factored once for every auxiliary regression on them. */
  X: QrFactor;
  fit: OlsFit;
}

/** The null AR(p) fitted by OLS on t = p+1..n (cached on the prepared series). */
export function fitAr(prep: PreparedSeries, p: number): ArFit {
  const cached = prep.fits.get(p);
  if (cached) return cached;
  const design = arDesign(prep.z, p);
  const X = qrFactor(withConstant(design.lags, design.rows));
  const out = { design, X, fit: ols(X, design.target, { inference: false }) };
  prep.fits.set(p, out);
  return out;
}

/**
 * For an automatic order, the largest q ≤ p whose regression of `coefficients(q)` terms on
 * n − q weeks keeps OBSERVATIONS_PER_COEFFICIENT observations per coefficient (at least 1).
 */
export function cappedOrder(prep: PreparedSeries, coefficients: (q: number) => number): number {
  if (prep.chosenBy === "given") return prep.order;
  const n = prep.z.length;
  let q = prep.order;
  while (q > 1 && n - q < OBSERVATIONS_PER_COEFFICIENT * coefficients(q)) q--;
  return q;
}

/** Throws a plain InputError when an auxiliary regression would have too few residual df. */
export function requireResidualDf(df: number, n: number, p: number, what: string): void {
  if (df < MIN_RESIDUAL_DF) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `${what} with AR order ${p} has too few weeks left to judge the fit (${n} weeks); use a lower order or a longer series.`,
    );
  }
}

/** The parameters every nonlinearity result reports about its AR order. */
export function orderParameters(prep: PreparedSeries, used: number): Record<string, number | string> {
  const out: Record<string, number | string> = { "AR order": used };
  if (prep.chosenBy === "AIC") {
    out["chosen by"] = `AIC over 1..${prep.maxOrder}`;
    if (used !== prep.order) out["AIC order (capped for this test)"] = prep.order;
  } else {
    out["chosen by"] = "given";
  }
  return out;
}

/** 4.1, 12.3, 0.0123: three significant digits, no exponent for ordinary sizes. */
export function formatNumber(x: number): string {
  if (!Number.isFinite(x)) return String(x);
  const a = Math.abs(x);
  if (a !== 0 && (a < 1e-3 || a >= 1e6)) return x.toExponential(2);
  return String(Number(x.toPrecision(3)));
}

export function formatP(p: number): string {
  return p < 0.001 ? "p < 0.001" : `p = ${formatNumber(p)}`;
}

/**
 * "Evidence of nonlinear dynamics (Tsay F = 4.1, p = 0.003)." or
 * "No sign of nonlinearity at the 5% level.", with an optional plain gloss after a rejection.
 */
export function nonlinearityVerdict(label: string, statistic: number, p: number, level: number, gloss = ""): string {
  if (p < level) return `Evidence of nonlinear dynamics (${label} = ${formatNumber(statistic)}, ${formatP(p)})${gloss}.`;
  return `No sign of nonlinearity at the ${levelText(level)} level.`;
}

/**
 * Throws when a regressor's residual on the AR regressors is only rounding noise (squared
 * norm below 1e-16 of its centred sum of squares): the term is collinear with the lags, as the
 * squared lag is when the rates take only two values, and no F statistic exists.
 */
export function requireNewDirection(original: Float64Array, residual: Float64Array): void {
  const n = original.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += original[i];
  mean /= n;
  let tss = 0;
  let rss = 0;
  for (let i = 0; i < n; i++) {
    tss += (original[i] - mean) * (original[i] - mean);
    rss += residual[i] * residual[i];
  }
  if (!(rss > 1e-16 * tss)) {
    throw new Error("a nonlinear term is a linear function of the lags (too few distinct rate values)");
  }
}
