import { Matrix } from "ml-matrix";
import { ols } from "../../../src/core/math/ols";
import { loadFixture } from "../../fixtures";

interface OlsFit {
  params: number[];
  bse: number[];
  rsquared: number;
  rsquared_adj: number;
  llf: number;
  aic: number;
  bic: number;
}

interface LongleyFixture extends OlsFit {
  names: string[];
  y: number[];
  X: number[][];
  tvalues: number[];
  pvalues: number[];
  cov_params: number[][];
  fittedvalues: number[];
  resid: number[];
  ssr: number;
  scale: number;
  df_resid: number;
  nobs: number;
  no_constant: OlsFit;
}

// statsmodels 0.13.5 OLS on statsmodels.datasets.longley (test/reference/make_ols.py).
const fx = loadFixture<LongleyFixture>("ols_longley.json");
const y = Float64Array.from(fx.y);
const fit = ols(fx.X, y, { names: fx.names });

function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

function expectRel(actual: ArrayLike<number>, expected: ArrayLike<number>, tol: number): void {
  expect(actual.length).toBe(expected.length);
  for (let i = 0; i < expected.length; i++) {
    expect(relErr(actual[i], expected[i])).toBeLessThan(tol);
  }
}

describe("ols on the Longley data", () => {
  // NIST StRD, Statistical Reference Datasets, linear regression "Longley" (higher difficulty):
  // certified coefficients and standard errors, typed from memory. Each digit string was then
  // checked against the independent statsmodels fixture, which agrees to better than 1e-10.
  const nistCoef = [
    -3482258.63459582, 15.0618722713733, -0.358191792925910e-1, -2.02022980381683,
    -1.03322686717359, -0.511041056535807e-1, 1829.15146461355,
  ];
  const nistSe = [
    890420.383607373, 84.9149257747669, 0.334910077722432e-1, 0.488399681651699,
    0.214274163161675, 0.22607320006937, 455.478499142212,
  ];
  const nistResidualSd = 304.854073561965;
  const nistRSquared = 0.995479004577296;

  it("matches the NIST certified values", () => {
    // Longley's X has a condition number near 5e9 (unscaled): forming XᵀX squares it and
    // leaves only ~0–3 correct digits, so the normal equations fail 1e-7. Householder QR on
    // unit-length columns is backward stable and reaches ~5e-12 here (measured when written).
    expectRel(fit.coef, nistCoef, 1e-7);
    expectRel(fit.se, nistSe, 1e-7);
    expect(relErr(Math.sqrt(fit.sigma2), nistResidualSd)).toBeLessThan(1e-7);
    expect(relErr(fit.rSquared, nistRSquared)).toBeLessThan(1e-10);
  });

  it("the NIST digits typed from memory agree with statsmodels", () => {
    // Guards the memory transcription itself: two independent sources must agree.
    expectRel(fx.params, nistCoef, 1e-8);
    expectRel(fx.bse, nistSe, 1e-8);
  });

  it("matches statsmodels in every returned field", () => {
    // 1e-8 relative: statsmodels (pinv) is within ~1.4e-11 of the certified values and so are
    // we, so 1e-8 leaves room for other platforms' rounding while still failing any solver
    // that loses digits to conditioning; the fit statistics are far better conditioned.
    expectRel(fit.coef, fx.params, 1e-8);
    expectRel(fit.se, fx.bse, 1e-8);
    expectRel(fit.tStat, fx.tvalues, 1e-8);
    expectRel(fit.pValue, fx.pvalues, 1e-6); // p-values amplify t errors by the density ratio
    expectRel(fit.fitted, fx.fittedvalues, 1e-11);
    expectRel(fit.residuals, fx.resid, 1e-7); // residuals are small differences of large fits
    expect(relErr(fit.ssr, fx.ssr)).toBeLessThan(1e-9);
    expect(relErr(fit.sigma2, fx.scale)).toBeLessThan(1e-9);
    expect(fit.df).toBe(fx.df_resid);
    expect(fit.n).toBe(fx.nobs);
    expect(fit.k).toBe(7);
    expect(fit.rank).toBe(7);
    expect(fit.hasConstant).toBe(true);
    expect(fit.names).toEqual(fx.names);
    expect(relErr(fit.rSquared, fx.rsquared)).toBeLessThan(1e-12);
    expect(relErr(fit.adjRSquared, fx.rsquared_adj)).toBeLessThan(1e-12);
    expect(relErr(fit.logLik, fx.llf)).toBeLessThan(1e-11);
    expect(relErr(fit.aic, fx.aic)).toBeLessThan(1e-11);
    expect(relErr(fit.bic, fx.bic)).toBeLessThan(1e-11);
  });

  it("aicc adds 2k(k+1)/(n−k−1) to statsmodels' aic", () => {
    // Hurvich & Tsai (1989) correction; n = 16, k = 7, so the term is 112/8 = 14.
    expect(fit.aicc - fx.aic).toBeCloseTo(14, 9);
  });

  it("without a constant reports the uncentred R² as statsmodels does", () => {
    const X0 = fx.X.map((row) => row.slice(1));
    const f0 = ols(new Matrix(X0), y);
    expect(f0.hasConstant).toBe(false);
    expectRel(f0.coef, fx.no_constant.params, 1e-8);
    expectRel(f0.se, fx.no_constant.bse, 1e-8);
    expect(relErr(f0.rSquared, fx.no_constant.rsquared)).toBeLessThan(1e-12);
    expect(relErr(f0.adjRSquared, fx.no_constant.rsquared_adj)).toBeLessThan(1e-12);
    expect(relErr(f0.aic, fx.no_constant.aic)).toBeLessThan(1e-11);
    expect(relErr(f0.bic, fx.no_constant.bic)).toBeLessThan(1e-11);
  });

  it("the covariance matrix matches statsmodels' cov_params", () => {
    // Entries compared on the correlation scale, |Δ| ≤ 1e-8·seₐ·se_b, so that off-diagonal
    // entries near zero are not held to a meaningless relative tolerance.
    for (let a = 0; a < fit.k; a++) {
      for (let b = 0; b < fit.k; b++) {
        const scale = fx.bse[a] * fx.bse[b];
        expect(Math.abs(fit.cov.get(a, b) - fx.cov_params[a][b]) / scale).toBeLessThan(1e-8);
        expect(fit.cov.get(a, b)).toBe(fit.cov.get(b, a));
      }
    }
  });
});

describe("ols errors", () => {
  it("names the regressor that makes X rank deficient", () => {
    // GNP + POP duplicated as an extra column: exactly collinear in exact arithmetic.
    const X = fx.X.map((row) => [...row, row[2] + row[5]]);
    const names = [...fx.names, "GNP_plus_POP"];
    expect(() => ols(X, y, { names })).toThrow(/GNP_plus_POP.*linear combination/);
  });

  it("rejects a zero column, too few rows and mismatched lengths", () => {
    expect(() => ols([[1, 0], [1, 0], [1, 0]], Float64Array.from([1, 2, 3]))).toThrow(/identically zero/);
    expect(() => ols([[1, 2], [1, 3]], Float64Array.from([1, 2]))).toThrow(/2 observations/);
    expect(() => ols([[1], [1], [1]], Float64Array.from([1, 2]))).toThrow(/y has 2 values/);
  });

  it("an exact fit on a small made-up problem recovers the coefficients", () => {
    // y = 2 − 3x + noise-free: residuals must vanish to rounding (independent of any library).
    const xs = [0, 1, 2, 3, 4, 5];
    const X = xs.map((x) => [1, x]);
    const yy = Float64Array.from(xs.map((x) => 2 - 3 * x + (x % 2 === 0 ? 0.5 : -0.5)));
    const f = ols(X, yy);
    // The ±0.5 alternation projects onto x: slope −3 − 3/35, intercept 2 + 3/14 (solved by hand).
    expect(f.coef[1]).toBeCloseTo(-3 - 3 / 35, 12);
    expect(f.coef[0]).toBeCloseTo(2 + 3 / 14, 12);
  });
});

describe("ols on the statsmodels macrodata set", () => {
  // Reference: statsmodels OLS via test/reference/make_ols.py (log real consumption on log
  // real GDP, log real investment and unemployment, 203 quarters). A well-conditioned fit:
  // agreement to 1e-10 relative is what two QR solvers in double precision give here.
  interface Macro {
    y: number[]; X: number[][]; params: number[]; bse: number[]; pvalues: number[]; rsquared: number;
    rsquared_adj: number; llf: number; aic: number; bic: number; scale: number;
  }
  const fx = loadFixture<Macro>("ols_macrodata.json");
  const r = ols(fx.X, Float64Array.from(fx.y));
  const rel = (a: number, b: number): number => Math.abs(a - b) / Math.max(Math.abs(b), 1e-300);

  test("coefficients, standard errors and p-values", () => {
    fx.params.forEach((b, i) => expect(rel(r.coef[i], b)).toBeLessThan(1e-10));
    fx.bse.forEach((s, i) => expect(rel(r.se[i], s)).toBeLessThan(1e-10));
    // p-values pass through the t distribution: 1e-8 relative (its cdf's accuracy), and an
    // absolute floor for p-values that are zero to double precision.
    fx.pvalues.forEach((p, i) => expect(Math.abs(r.pValue[i] - p)).toBeLessThanOrEqual(Math.max(1e-8 * p, 1e-300)));
  });

  test("fit statistics", () => {
    expect(rel(r.sigma2, fx.scale)).toBeLessThan(1e-10);
    expect(rel(r.rSquared, fx.rsquared)).toBeLessThan(1e-12);
    expect(rel(r.adjRSquared, fx.rsquared_adj)).toBeLessThan(1e-12);
    expect(rel(r.logLik, fx.llf)).toBeLessThan(1e-10);
    expect(rel(r.aic, fx.aic)).toBeLessThan(1e-10);
    expect(rel(r.bic, fx.bic)).toBeLessThan(1e-10);
  });
});
