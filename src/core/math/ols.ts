/**
 * Ordinary least squares by Householder QR (Golub & Van Loan, 2013, Alg. 5.2.1), with the
 * columns scaled to unit length first so that the rank check is relative to each column's
 * size. Inference is the classical Gaussian one: cov(β̂) = σ̂²(RᵀR)⁻¹ with σ̂² = SSR/(n − k),
 * two-sided t p-values, and the Gaussian log-likelihood with the ML variance SSR/n, from which
 * AIC, BIC and AICc follow (Hurvich & Tsai, 1989, for the AICc correction).
 *
 * The factorisation is an object of its own (`qrFactor`) so that several responses regressed on
 * the same X — Tsay's lag products, Keenan's auxiliaries — factor X once; `ols` is a factor plus
 * one solve. Regressors may be given as columns (`Float64Array[]`), which avoids a matrix copy.
 */
import { Matrix } from "ml-matrix";
import { tSf } from "./distributions";

export interface OlsOptions {
  /** Regressor names, used in error messages and carried into the result. */
  names?: string[];
  /**
   * A column whose part orthogonal to the earlier columns is shorter than this fraction of its
   * own length is treated as collinear with them. Default 1e-10.
   */
  rankTolerance?: number;
  /**
   * false skips the inference part (covariance, standard errors, t statistics, p-values) for
   * callers that need only SSR, coefficients, residuals or information criteria; the t
   * distribution's tail is not free. Default true.
   */
  inference?: boolean;
}

/** The fit without inference: what `ols(X, y, { inference: false })` returns. */
export interface OlsFit {
  names: string[];
  coef: Float64Array;
  residuals: Float64Array;
  fitted: Float64Array;
  /** Unbiased residual variance SSR/(n − k). */
  sigma2: number;
  ssr: number;
  /** Residual degrees of freedom n − k. */
  df: number;
  /** Whether X has a constant column; it decides the centring of R² as below. */
  hasConstant: boolean;
  /** 1 − SSR/TSS with TSS centred when X has a constant column, uncentred otherwise. */
  rSquared: number;
  adjRSquared: number;
  /** Gaussian log-likelihood at the ML variance SSR/n. */
  logLik: number;
  /** −2ℓ + 2k; σ² is not counted as a parameter. */
  aic: number;
  /** −2ℓ + k·log n. */
  bic: number;
  /** aic + 2k(k+1)/(n−k−1); +∞ when n ≤ k + 1. */
  aicc: number;
  rank: number;
  n: number;
  k: number;
}

export interface OlsResult extends OlsFit {
  se: Float64Array;
  tStat: Float64Array;
  pValue: Float64Array;
  /** Covariance matrix of the coefficients, σ̂²(XᵀX)⁻¹. */
  cov: Matrix;
}

/** Regressors as a matrix, as rows, or as columns (each of length n). */
export type Design = Matrix | number[][] | Float64Array[];

/** Coefficients, residuals and SSR of one response, from one application of Qᵀ. */
export interface QrSolution {
  coef: Float64Array;
  residuals: Float64Array;
  ssr: number;
}

/** The fit of y on the leading columns X[:, 0..k) of a factor (see QrFactor.leadingFits). */
export interface LeadingFit {
  k: number;
  coef: Float64Array;
  ssr: number;
  /** Standard error of the last of the k coefficients at σ̂² = SSR/(n − k). */
  lastSe: number;
}

/** Gaussian log-likelihood at the ML variance SSR/n and the criteria built on it. */
export function gaussianCriteria(ssr: number, n: number, k: number): { logLik: number; aic: number; bic: number; aicc: number } {
  const logLik = (-n / 2) * (Math.log(2 * Math.PI) + Math.log(ssr / n) + 1);
  const aic = -2 * logLik + 2 * k;
  const bic = -2 * logLik + k * Math.log(n);
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity;
  return { logLik, aic, bic, aicc };
}

function isColumns(X: Design): X is Float64Array[] {
  return Array.isArray(X) && (X.length === 0 || X[0] instanceof Float64Array);
}

/** Copies of the columns: the factorisation works on them in place. */
function toColumns(X: Design): { cols: Float64Array[]; n: number; k: number } {
  if (isColumns(X)) {
    const k = X.length;
    const n = k > 0 ? X[0].length : 0;
    const cols = X.map((c, j) => {
      if (c.length !== n) throw new Error(`ols: column ${j + 1} has ${c.length} rows, column 1 has ${n}`);
      return Float64Array.from(c);
    });
    return { cols, n, k };
  }
  const m = X instanceof Matrix ? X : new Matrix(X as number[][]);
  const n = m.rows;
  const k = m.columns;
  const cols: Float64Array[] = [];
  for (let j = 0; j < k; j++) {
    const c = new Float64Array(n);
    for (let i = 0; i < n; i++) c[i] = m.get(i, j);
    cols.push(c);
  }
  return { cols, n, k };
}

function isConstantColumn(c: Float64Array): boolean {
  if (c.length === 0 || c[0] === 0) return false;
  for (let i = 1; i < c.length; i++) if (c[i] !== c[0]) return false;
  return true;
}

/** Apply the reflector I − 2vvᵀ/(vᵀv), v nonzero from row j down, to the vector x in place. */
function reflect(v: Float64Array, vtv: number, j: number, x: Float64Array): void {
  let dot = 0;
  for (let i = j; i < v.length; i++) dot += v[i] * x[i];
  const f = (2 * dot) / vtv;
  for (let i = j; i < v.length; i++) x[i] -= f * v[i];
}

/**
 * The Householder QR of X with unit-length columns, X = Q·R·D (D the column lengths), kept
 * so that any number of responses can be solved against it at O(nk) each.
 */
export class QrFactor {
  readonly n: number;
  readonly k: number;
  readonly names: string[];
  readonly hasConstant: boolean;
  /** Column lengths D: β = D⁻¹β_s. */
  readonly scale: Float64Array;
  /** R, row-major upper triangle (k × k). */
  private readonly R: Float64Array;
  private readonly vs: Float64Array[];
  private readonly vtvs: Float64Array;
  private gramInverse: Float64Array | undefined;

  constructor(X: Design, options: Pick<OlsOptions, "names" | "rankTolerance"> = {}) {
    const { cols, n, k } = toColumns(X);
    const names = options.names ?? Array.from({ length: k }, (_, j) => `x${j + 1}`);
    const rankTol = options.rankTolerance ?? 1e-10;
    if (names.length !== k) throw new Error(`ols: ${names.length} names given for ${k} regressors`);
    if (k === 0) throw new Error("ols: X has no columns");
    if (n <= k) throw new Error(`ols: ${n} observations cannot estimate ${k} coefficients with residual variance`);
    for (let j = 0; j < k; j++) {
      for (let i = 0; i < n; i++) {
        if (!Number.isFinite(cols[j][i])) throw new Error(`ols: regressor '${names[j]}' has a non-finite value at row ${i + 1}`);
      }
    }
    this.n = n;
    this.k = k;
    this.names = names;
    this.hasConstant = cols.some(isConstantColumn);

    // Scale each column to unit Euclidean norm: X = X_s·D, so β = D⁻¹β_s.
    const scale = new Float64Array(k);
    for (let j = 0; j < k; j++) {
      let s = 0;
      for (let i = 0; i < n; i++) s += cols[j][i] * cols[j][i];
      s = Math.sqrt(s);
      if (s === 0) throw new Error(`ols: regressor '${names[j]}' is identically zero`);
      scale[j] = s;
      for (let i = 0; i < n; i++) cols[j][i] /= s;
    }

    // Householder QR in place: after step j, cols[j][0..j] holds column j of R, and the
    // reflector vectors are kept to apply Qᵀ to y and Q to the residual part.
    const vs: Float64Array[] = [];
    const vtvs = new Float64Array(k);
    const R = new Float64Array(k * k);
    for (let j = 0; j < k; j++) {
      const a = cols[j];
      for (let p = 0; p < j; p++) reflect(vs[p], vtvs[p], p, a);
      let norm = 0;
      for (let i = j; i < n; i++) norm += a[i] * a[i];
      norm = Math.sqrt(norm);
      // The column had unit length, so `norm` is the relative size of its new direction.
      if (norm <= rankTol) {
        throw new Error(
          `ols: regressor '${names[j]}' is (almost) a linear combination of the earlier regressors; ` +
            `X has rank below ${k}`,
        );
      }
      const alpha = a[j] > 0 ? -norm : norm; // sign chosen to avoid cancellation in v_j
      const v = new Float64Array(n);
      for (let i = j; i < n; i++) v[i] = a[i];
      v[j] -= alpha;
      let vtv = 0;
      for (let i = j; i < n; i++) vtv += v[i] * v[i];
      vs.push(v);
      vtvs[j] = vtv;
      for (let p = 0; p < j; p++) R[p * k + j] = a[p];
      R[j * k + j] = alpha;
    }
    this.scale = scale;
    this.R = R;
    this.vs = vs;
    this.vtvs = vtvs;
  }

  private checkResponse(y: Float64Array): void {
    if (y.length !== this.n) throw new Error(`ols: y has ${y.length} values but X has ${this.n} rows`);
    for (let i = 0; i < this.n; i++) if (!Number.isFinite(y[i])) throw new Error(`ols: y has a non-finite value at row ${i + 1}`);
  }

  /** Qᵀy. */
  private qty(y: Float64Array): Float64Array {
    this.checkResponse(y);
    const qty = Float64Array.from(y);
    for (let j = 0; j < this.k; j++) reflect(this.vs[j], this.vtvs[j], j, qty);
    return qty;
  }

  /**
   * Back substitution R β_s = (Qᵀy)[0..kk) on the leading kk×kk block of R (all of it by
   * default), then β = D⁻¹β_s.
   */
  private coefFromQty(qty: Float64Array, kk = this.k): Float64Array {
    const { k, R, scale } = this;
    const betaS = new Float64Array(kk);
    for (let j = kk - 1; j >= 0; j--) {
      let s = qty[j];
      for (let p = j + 1; p < kk; p++) s -= R[j * k + p] * betaS[p];
      betaS[j] = s / R[j * k + j];
    }
    for (let j = 0; j < kk; j++) betaS[j] /= scale[j];
    return betaS;
  }

  private ssrFromQty(qty: Float64Array): number {
    let ssr = 0;
    for (let i = this.k; i < this.n; i++) ssr += qty[i] * qty[i];
    return ssr;
  }

  /** Residuals e = Q·[0; (Qᵀy)[k..n)], which avoids the cancellation in y − Xβ. */
  private residualsFromQty(qty: Float64Array): Float64Array {
    const residuals = new Float64Array(this.n);
    for (let i = this.k; i < this.n; i++) residuals[i] = qty[i];
    for (let j = this.k - 1; j >= 0; j--) reflect(this.vs[j], this.vtvs[j], j, residuals);
    return residuals;
  }

  coefficients(y: Float64Array): Float64Array {
    return this.coefFromQty(this.qty(y));
  }

  residuals(y: Float64Array): Float64Array {
    return this.residualsFromQty(this.qty(y));
  }

  ssr(y: Float64Array): number {
    return this.ssrFromQty(this.qty(y));
  }

  /** Coefficients, residuals and SSR from a single Qᵀy. */
  solve(y: Float64Array): QrSolution {
    const qty = this.qty(y);
    return { coef: this.coefFromQty(qty), residuals: this.residualsFromQty(qty), ssr: this.ssrFromQty(qty) };
  }

  /**
   * The fits of y on X[:, 0..kk) for every kk = 1..k from this one factor. Householder step j
   * touches only column j and the steps before it, so the first kk steps are exactly those of
   * factoring X[:, 0..kk) alone, and (Qᵀy) after kk reflections is that regression's: each fit
   * is the one `ols` gives on the leading block, operation for operation, at O(n) per block
   * instead of O(nk²). Nested candidate models (AR orders, ADF lags) need one factor.
   */
  leadingFits(y: Float64Array): LeadingFit[] {
    this.checkResponse(y);
    const { n, k, R, scale } = this;
    const qty = Float64Array.from(y);
    const out: LeadingFit[] = [];
    for (let kk = 1; kk <= k; kk++) {
      const j = kk - 1;
      reflect(this.vs[j], this.vtvs[j], j, qty);
      let ssr = 0;
      for (let i = kk; i < n; i++) ssr += qty[i] * qty[i];
      const coef = this.coefFromQty(qty, kk);
      // (R⁻¹R⁻ᵀ) of the leading block, last diagonal entry: (1/R_jj)², as in covariance().
      const rinv = 1 / R[j * k + j];
      const sigma2 = ssr / (n - kk);
      const lastSe = Math.sqrt((sigma2 * (rinv * rinv)) / (scale[j] * scale[j]));
      out.push({ k: kk, coef, ssr, lastSe });
    }
    return out;
  }

  /** (R_sᵀR_s)⁻¹ = R_s⁻¹R_s⁻ᵀ on the unit-length columns, row-major, computed once. */
  private scaledGramInverse(): Float64Array {
    if (this.gramInverse) return this.gramInverse;
    const { k, R } = this;
    // R⁻¹ (upper triangular) column by column.
    const Rinv = new Float64Array(k * k);
    for (let c = 0; c < k; c++) {
      for (let j = c; j >= 0; j--) {
        let s = j === c ? 1 : 0;
        for (let p = j + 1; p <= c; p++) s -= R[j * k + p] * Rinv[p * k + c];
        Rinv[j * k + c] = s / R[j * k + j];
      }
    }
    const G = new Float64Array(k * k);
    for (let a = 0; a < k; a++) {
      for (let b = a; b < k; b++) {
        let s = 0;
        for (let p = b; p < k; p++) s += Rinv[a * k + p] * Rinv[b * k + p];
        G[a * k + b] = s;
        G[b * k + a] = s;
      }
    }
    this.gramInverse = G;
    return G;
  }

  /** Entry (a, b) of σ²(XᵀX)⁻¹. */
  covariance(sigma2: number, a: number, b: number): number {
    return (sigma2 * this.scaledGramInverse()[a * this.k + b]) / (this.scale[a] * this.scale[b]);
  }

  /** Standard error of coefficient j at residual variance σ²: √(σ²(XᵀX)⁻¹_jj). */
  standardError(sigma2: number, j: number): number {
    return Math.sqrt(this.covariance(sigma2, j, j));
  }
}

/** Factor X once to regress several responses on it (see QrFactor). */
export function qrFactor(X: Design, options: Pick<OlsOptions, "names" | "rankTolerance"> = {}): QrFactor {
  return new QrFactor(X, options);
}

export function ols(X: Design | QrFactor, y: Float64Array, options: OlsOptions & { inference: false }): OlsFit;
export function ols(X: Design | QrFactor, y: Float64Array, options?: OlsOptions): OlsResult;
export function ols(X: Design | QrFactor, y: Float64Array, options: OlsOptions = {}): OlsFit | OlsResult {
  const qr = X instanceof QrFactor ? X : new QrFactor(X, options);
  const { n, k, names, hasConstant } = qr;
  const { coef, residuals, ssr } = qr.solve(y);
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) fitted[i] = y[i] - residuals[i];

  const df = n - k;
  const sigma2 = ssr / df;

  let tss = 0;
  if (hasConstant) {
    let mean = 0;
    for (let i = 0; i < n; i++) mean += y[i];
    mean /= n;
    for (let i = 0; i < n; i++) tss += (y[i] - mean) * (y[i] - mean);
  } else {
    for (let i = 0; i < n; i++) tss += y[i] * y[i];
  }
  const rSquared = 1 - ssr / tss;
  const adjRSquared = 1 - ((n - (hasConstant ? 1 : 0)) / df) * (1 - rSquared);

  const { logLik, aic, bic, aicc } = gaussianCriteria(ssr, n, k);

  const fit: OlsFit = {
    names, coef, residuals, fitted, sigma2, ssr, df, hasConstant,
    rSquared, adjRSquared, logLik, aic, bic, aicc, rank: k, n, k,
  };
  if (options.inference === false) return fit;

  const cov = new Matrix(k, k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      const v = qr.covariance(sigma2, a, b);
      cov.set(a, b, v);
      cov.set(b, a, v);
    }
  }
  const se = new Float64Array(k);
  const tStat = new Float64Array(k);
  const pValue = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    se[j] = Math.sqrt(cov.get(j, j));
    tStat[j] = coef[j] / se[j];
    pValue[j] = 2 * tSf(Math.abs(tStat[j]), df);
  }
  return { ...fit, se, tStat, pValue, cov };
}
