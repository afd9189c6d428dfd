/**
 * Ordinary least squares by Householder QR (Golub & Van Loan, 2013, Alg. 5.2.1), with the
 * columns scaled to unit length first so that the rank check is relative to each column's
 * size. Inference is the classical Gaussian one: cov(β̂) = σ̂²(RᵀR)⁻¹ with σ̂² = SSR/(n − k),
 * two-sided t p-values, and the Gaussian log-likelihood with the ML variance SSR/n, from which
 * AIC, BIC and AICc follow (Hurvich & Tsai, 1989, for the AICc correction).
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
}

export interface OlsResult {
  names: string[];
  coef: Float64Array;
  se: Float64Array;
  tStat: Float64Array;
  pValue: Float64Array;
  /** Covariance matrix of the coefficients, σ̂²(XᵀX)⁻¹. */
  cov: Matrix;
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

function toColumns(X: Matrix | number[][]): { cols: Float64Array[]; n: number; k: number } {
  const m = X instanceof Matrix ? X : new Matrix(X);
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

export function ols(X: Matrix | number[][], y: Float64Array, options: OlsOptions = {}): OlsResult {
  const { cols, n, k } = toColumns(X);
  const names = options.names ?? Array.from({ length: k }, (_, j) => `x${j + 1}`);
  const rankTol = options.rankTolerance ?? 1e-10;
  if (names.length !== k) throw new Error(`ols: ${names.length} names given for ${k} regressors`);
  if (y.length !== n) throw new Error(`ols: y has ${y.length} values but X has ${n} rows`);
  if (k === 0) throw new Error("ols: X has no columns");
  if (n <= k) throw new Error(`ols: ${n} observations cannot estimate ${k} coefficients with residual variance`);
  for (let j = 0; j < k; j++) {
    for (let i = 0; i < n; i++) {
      if (!Number.isFinite(cols[j][i])) throw new Error(`ols: regressor '${names[j]}' has a non-finite value at row ${i + 1}`);
    }
  }
  for (let i = 0; i < n; i++) if (!Number.isFinite(y[i])) throw new Error(`ols: y has a non-finite value at row ${i + 1}`);

  const hasConstant = cols.some(isConstantColumn);

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
  const R = new Float64Array(k * k); // row-major upper triangle
  const qty = Float64Array.from(y);
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
    reflect(v, vtv, j, qty);
  }

  // Back substitution R β_s = (Qᵀy)[0..k).
  const betaS = new Float64Array(k);
  for (let j = k - 1; j >= 0; j--) {
    let s = qty[j];
    for (let p = j + 1; p < k; p++) s -= R[j * k + p] * betaS[p];
    betaS[j] = s / R[j * k + j];
  }

  // Residuals e = Q·[0; (Qᵀy)[k..n)], which avoids the cancellation in y − Xβ.
  const residuals = new Float64Array(n);
  let ssr = 0;
  for (let i = k; i < n; i++) {
    residuals[i] = qty[i];
    ssr += qty[i] * qty[i];
  }
  for (let j = k - 1; j >= 0; j--) reflect(vs[j], vtvs[j], j, residuals);
  const fitted = new Float64Array(n);
  for (let i = 0; i < n; i++) fitted[i] = y[i] - residuals[i];

  const df = n - k;
  const sigma2 = ssr / df;

  // R⁻¹ (upper triangular) column by column; (RᵀR)⁻¹ = R⁻¹R⁻ᵀ.
  const Rinv = new Float64Array(k * k);
  for (let c = 0; c < k; c++) {
    for (let j = c; j >= 0; j--) {
      let s = j === c ? 1 : 0;
      for (let p = j + 1; p <= c; p++) s -= R[j * k + p] * Rinv[p * k + c];
      Rinv[j * k + c] = s / R[j * k + j];
    }
  }
  const cov = new Matrix(k, k);
  for (let a = 0; a < k; a++) {
    for (let b = a; b < k; b++) {
      let s = 0;
      for (let p = b; p < k; p++) s += Rinv[a * k + p] * Rinv[b * k + p];
      const v = (sigma2 * s) / (scale[a] * scale[b]);
      cov.set(a, b, v);
      cov.set(b, a, v);
    }
  }

  const coef = new Float64Array(k);
  const se = new Float64Array(k);
  const tStat = new Float64Array(k);
  const pValue = new Float64Array(k);
  for (let j = 0; j < k; j++) {
    coef[j] = betaS[j] / scale[j];
    se[j] = Math.sqrt(cov.get(j, j));
    tStat[j] = coef[j] / se[j];
    pValue[j] = 2 * tSf(Math.abs(tStat[j]), df);
  }

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

  const logLik = (-n / 2) * (Math.log(2 * Math.PI) + Math.log(ssr / n) + 1);
  const aic = -2 * logLik + 2 * k;
  const bic = -2 * logLik + k * Math.log(n);
  const aicc = n - k - 1 > 0 ? aic + (2 * k * (k + 1)) / (n - k - 1) : Infinity;

  return {
    names, coef, se, tStat, pValue, cov, residuals, fitted, sigma2, ssr, df, hasConstant,
    rSquared, adjRSquared, logLik, aic, bic, aicc, rank: k, n, k,
  };
}
