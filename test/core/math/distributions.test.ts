import { loadFixture } from "../../fixtures";
import {
  chi2Cdf, chi2Quantile, chi2Sf, fCdf, fQuantile, fSf, normalCdf, normalMultiplier,
  normalQuantile, normalSf, tCdf, tQuantile, tSf,
} from "../../../src/core/math/distributions";

// Reference: scipy.stats (norm, t, chi2, f) via test/reference/make_distributions.py.
interface Grid { x: number[]; cdf: number[]; sf: number[]; p: number[]; ppf: number[] }
interface Fx {
  normal: Grid;
  t: (Grid & { df: number })[];
  chi2: (Grid & { df: number })[];
  f: (Grid & { d1: number; d2: number })[];
}
const fx = loadFixture<Fx>("distributions.json");

/**
 * Relative agreement, with an absolute floor for values that underflow to near zero.
 * 1e-9 relative: both libraries implement the same special functions (regularised
 * incomplete beta/gamma, erfc) to close to double precision; a real defect (wrong
 * parameterisation, a lost tail) shows up orders of magnitude larger.
 */
function close(actual: number, expected: number, rel = 1e-9, abs = 1e-300): void {
  const err = Math.abs(actual - expected);
  const tol = Math.max(rel * Math.abs(expected), abs);
  if (!(err <= tol)) throw new Error(`got ${actual}, expected ${expected} (error ${err}, tolerance ${tol})`);
}

describe("distributions against scipy.stats", () => {
  test("normal cdf, sf and quantile", () => {
    const g = fx.normal;
    g.x.forEach((x, i) => {
      close(normalCdf(x), g.cdf[i]);
      close(normalSf(x), g.sf[i]);
    });
    // After the Newton refinement the quantile holds ~1e-11 even at p = 1e-12.
    g.p.forEach((p, i) => close(normalQuantile(p), g.ppf[i], 1e-10));
  });

  test.each(fx.t.map((g) => [g.df, g]))("Student t, df = %p", (_df, g) => {
    const grid = g as Grid & { df: number };
    grid.x.forEach((x, i) => {
      close(tCdf(x, grid.df), grid.cdf[i], 1e-8);
      close(tSf(x, grid.df), grid.sf[i], 1e-8);
    });
    // At p = 0.5 scipy returns ~1e-16 rounding noise for the exact 0: hence the 1e-15 floor.
    grid.p.forEach((p, i) => close(tQuantile(p, grid.df), grid.ppf[i], 1e-8, 1e-15));
  });

  test.each(fx.chi2.map((g) => [g.df, g]))("chi-square, df = %p", (_df, g) => {
    const grid = g as Grid & { df: number };
    grid.x.forEach((x, i) => {
      close(chi2Cdf(x, grid.df), grid.cdf[i], 1e-9);
      // The upper tail comes from the upper incomplete gamma directly, so it keeps relative
      // precision far out (sf(120; 1) ≈ 6e-28), where 1 − cdf would give 0.
      close(chi2Sf(x, grid.df), grid.sf[i], 1e-9);
    });
    grid.p.forEach((p, i) => close(chi2Quantile(p, grid.df), grid.ppf[i], 1e-8));
  });

  test.each(fx.f.map((g) => [`${g.d1},${g.d2}`, g]))("F, df = %s", (_df, g) => {
    const grid = g as Grid & { d1: number; d2: number };
    grid.x.forEach((x, i) => {
      // Lower tail at x = 1e-6 (values down to 1e-142) agrees to ~2e-8 relative.
      close(fCdf(x, grid.d1, grid.d2), grid.cdf[i], 1e-7);
      // sf near 1 is exact to one ulp of 1, hence the 2e-16 absolute floor.
      close(fSf(x, grid.d1, grid.d2), grid.sf[i], 1e-9, 2e-16);
    });
    // The library's F quantile stops its incomplete-beta inversion early in the extreme
    // lower tail (p ≤ 1e-8: ~1e-5 relative). Fairlead only needs F critical values at
    // p ≥ 0.001, which hold to 1e-8; the looser bound below documents the extreme tail.
    grid.p.forEach((p, i) => close(fQuantile(p, grid.d1, grid.d2), grid.ppf[i], p <= 1e-8 ? 1e-4 : 1e-8));
  });

  test("interval multipliers match the textbook values", () => {
    // Standard normal table values (any statistics textbook; from memory): 80% → 1.2816, 95% → 1.9600.
    expect(normalMultiplier(80)).toBeCloseTo(1.281552, 6);
    expect(normalMultiplier(95)).toBeCloseTo(1.959964, 6);
  });

  test("bad arguments are refused, not turned into NaN", () => {
    expect(() => normalQuantile(1.2)).toThrow(RangeError);
    expect(() => tCdf(1, 0)).toThrow(RangeError);
    expect(() => chi2Quantile(0.5, -1)).toThrow(RangeError);
    expect(() => normalMultiplier(100)).toThrow(RangeError);
  });
});
