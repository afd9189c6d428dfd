/**
 * Probability distributions used across the core: cdf, survival function and quantile of
 * the normal, Student t, chi-square and F laws. The numerics come from the stdlib project's
 * ports of the Cephes/Boost algorithms (see DEVELOPERS.md for why that library); this module
 * only fixes the parameterisation and checks arguments so that a bad degree of freedom is a
 * clear internal error rather than a silent NaN in a report.
 */
import normalCdfImpl = require("@stdlib/stats-base-dists-normal-cdf");
import normalQuantileImpl = require("@stdlib/stats-base-dists-normal-quantile");
import tCdfImpl = require("@stdlib/stats-base-dists-t-cdf");
import tQuantileImpl = require("@stdlib/stats-base-dists-t-quantile");
import chi2CdfImpl = require("@stdlib/stats-base-dists-chisquare-cdf");
import chi2QuantileImpl = require("@stdlib/stats-base-dists-chisquare-quantile");
import fCdfImpl = require("@stdlib/stats-base-dists-f-cdf");
import fQuantileImpl = require("@stdlib/stats-base-dists-f-quantile");
import gammainc = require("@stdlib/math-base-special-gammainc");
import betainc = require("@stdlib/math-base-special-betainc");

function checkProb(p: number): void {
  if (!(p >= 0 && p <= 1)) throw new RangeError(`probability must lie in [0, 1], got ${p}`);
}

function checkDf(name: string, df: number): void {
  if (!(df > 0) || !Number.isFinite(df)) throw new RangeError(`${name} must be a positive finite number, got ${df}`);
}

/** Standard normal cdf Φ(x). */
export function normalCdf(x: number): number {
  return normalCdfImpl(x, 0, 1);
}

/** Standard normal upper tail 1 − Φ(x), computed without cancellation. */
export function normalSf(x: number): number {
  return normalCdfImpl(-x, 0, 1);
}

/** Standard normal quantile Φ⁻¹(p). */
export function normalQuantile(p: number): number {
  checkProb(p);
  const x = normalQuantileImpl(p, 0, 1);
  if (!Number.isFinite(x) || p === 0.5) return x;
  // One Newton step on the tail that p lies in: the library's rational approximation loses
  // about six digits below p = 1e-10, while Φ itself (through erfc) keeps full relative precision.
  const lowerTail = p < 0.5;
  const q = lowerTail ? p : 1 - p;
  const xl = lowerTail ? x : -x;
  const density = Math.exp(-0.5 * xl * xl) / Math.sqrt(2 * Math.PI);
  const refined = xl - (normalCdf(xl) - q) / density;
  return lowerTail ? refined : -refined;
}

/** Student t cdf with df degrees of freedom. */
export function tCdf(x: number, df: number): number {
  checkDf("degrees of freedom", df);
  return tCdfImpl(x, df);
}

/** Student t upper tail, by symmetry so that small p-values keep their precision. */
export function tSf(x: number, df: number): number {
  checkDf("degrees of freedom", df);
  return tCdfImpl(-x, df);
}

export function tQuantile(p: number, df: number): number {
  checkProb(p);
  checkDf("degrees of freedom", df);
  return tQuantileImpl(p, df);
}

export function chi2Cdf(x: number, df: number): number {
  checkDf("degrees of freedom", df);
  return chi2CdfImpl(x, df);
}

/** Chi-square upper tail as the regularised upper incomplete gamma Q(df/2, x/2), without 1 − cdf cancellation. */
export function chi2Sf(x: number, df: number): number {
  checkDf("degrees of freedom", df);
  if (x <= 0) return 1;
  return gammainc(x / 2, df / 2, true, true);
}

export function chi2Quantile(p: number, df: number): number {
  checkProb(p);
  checkDf("degrees of freedom", df);
  return chi2QuantileImpl(p, df);
}

/** F cdf with numerator d1 and denominator d2 degrees of freedom. */
export function fCdf(x: number, d1: number, d2: number): number {
  checkDf("numerator degrees of freedom", d1);
  checkDf("denominator degrees of freedom", d2);
  return fCdfImpl(x, d1, d2);
}

/** F upper tail as I_{d2/(d2 + d1·x)}(d2/2, d1/2), the regularised incomplete beta, without cancellation. */
export function fSf(x: number, d1: number, d2: number): number {
  checkDf("numerator degrees of freedom", d1);
  checkDf("denominator degrees of freedom", d2);
  if (x <= 0) return 1;
  return betainc(d2 / (d2 + d1 * x), d2 / 2, d1 / 2);
}

export function fQuantile(p: number, d1: number, d2: number): number {
  checkProb(p);
  checkDf("numerator degrees of freedom", d1);
  checkDf("denominator degrees of freedom", d2);
  return fQuantileImpl(p, d1, d2);
}

/** Two-sided central interval multiplier for a coverage level given in percent (e.g. 95 → 1.96). */
export function normalMultiplier(levelPercent: number): number {
  if (!(levelPercent > 0 && levelPercent < 100)) {
    throw new RangeError(`coverage level must be a percentage strictly between 0 and 100, got ${levelPercent}`);
  }
  return normalQuantile(0.5 + levelPercent / 200);
}
