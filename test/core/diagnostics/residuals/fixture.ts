/**
 * The statsmodels 0.13.5 reference cases for the residual diagnostics, written by
 * test/reference/make_residuals.py (acf fft=False adjusted=False alpha=0.05; pacf "ldb";
 * acorr_ljungbox lags 1..30 with and without model_df; stattools.jarque_bera) on Nile, yearly
 * sunspots, log-differenced real GDP (macrodata) and first-differenced weekly CO2.
 */
import { loadFixture } from "../../../fixtures";

export interface ResidualCase {
  name: string;
  n: number;
  y: number[];
  acf: number[];
  acf_bartlett_halfwidth: number[];
  pacf_lags: number;
  pacf: number[];
  pacf_halfwidth: number[];
  pacf_ldb_vs_ywm_max_gap: number;
  lb_stat: number[];
  lb_pvalue: number[];
  model_df: number;
  lb_df_stat: number[];
  lb_df_pvalue: number[];
  jb: number;
  jb_pvalue: number;
  skewness: number;
  kurtosis: number;
}

export interface SizeStudy {
  seed: number;
  R: number;
  n: number;
  lags: number;
  level: number;
  rejections: number;
  first_pvalue: number;
}

export const fx = loadFixture<{ alpha: number; cases: ResidualCase[]; size: SizeStudy }>("residuals.json");

/** |a − b| / |b|, or |a − b| when b is 0. */
export function relErr(a: number, b: number): number {
  return b === 0 ? Math.abs(a - b) : Math.abs(a - b) / Math.abs(b);
}

/** Largest relative error over two equal-length sequences (NaN must match NaN). */
export function maxRelErr(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error(`length ${a.length} vs ${b.length}`);
  let worst = 0;
  for (let i = 0; i < a.length; i++) {
    if (Number.isNaN(b[i])) {
      if (!Number.isNaN(a[i])) return Infinity;
      continue;
    }
    worst = Math.max(worst, relErr(a[i], b[i]));
  }
  return worst;
}

/** Largest absolute error over two equal-length sequences. */
export function maxAbsErr(a: ArrayLike<number>, b: ArrayLike<number>): number {
  if (a.length !== b.length) throw new Error(`length ${a.length} vs ${b.length}`);
  let worst = 0;
  for (let i = 0; i < a.length; i++) worst = Math.max(worst, Math.abs(a[i] - b[i]));
  return worst;
}
