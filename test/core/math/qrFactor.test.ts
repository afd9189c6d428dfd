import { Matrix } from "ml-matrix";
import { ols, qrFactor } from "../../../src/core/math/ols";
import { loadFixture } from "../../fixtures";

// statsmodels 0.13.5 OLS on statsmodels.datasets.longley (test/reference/make_ols.py); only
// X, y and the statsmodels residuals are read here.
interface LongleyFixture {
  names: string[];
  y: number[];
  X: number[][];
  resid: number[];
  ssr: number;
}

const fx = loadFixture<LongleyFixture>("ols_longley.json");
const y = Float64Array.from(fx.y);
const k = fx.X[0].length;
const columns = Array.from({ length: k }, (_, j) => Float64Array.from(fx.X, (row) => row[j]));

function relErr(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe("qrFactor on the Longley data", () => {
  const fit = ols(fx.X, y);
  const qr = qrFactor(fx.X);

  it("residuals, SSR and coefficients agree with ols() to 1e-12", () => {
    // Same factorisation and the same floating-point operations as ols(), so agreement is
    // exact in practice; 1e-12 relative is the contract callers such as Tsay's test rely on.
    // Residuals are compared against the residual scale √(SSR/n), since single residuals can
    // be near zero.
    const scale = Math.sqrt(fit.ssr / fit.n);
    const e = qr.residuals(y);
    e.forEach((v, i) => expect(Math.abs(v - fit.residuals[i]) / scale).toBeLessThan(1e-12));
    expect(relErr(qr.ssr(y), fit.ssr)).toBeLessThan(1e-12);
    qr.coefficients(y).forEach((b, j) => expect(relErr(b, fit.coef[j])).toBeLessThan(1e-12));
    // And the factor's SSR is statsmodels' to the 1e-9 the ols test holds it to.
    expect(relErr(qr.ssr(y), fx.ssr)).toBeLessThan(1e-9);
  });

  it("the standard error of each coefficient matches ols()'s", () => {
    fit.se.forEach((s, j) => expect(relErr(qr.standardError(fit.sigma2, j), s)).toBeLessThan(1e-12));
  });

  it("one factor serves several responses", () => {
    // A second response on the same X (a column of X itself plus y): its fit from the shared
    // factor must equal a fresh ols() on it.
    const y2 = Float64Array.from(y, (v, i) => v + fx.X[i][3]);
    const fresh = ols(fx.X, y2);
    expect(relErr(qr.ssr(y2), fresh.ssr)).toBeLessThan(1e-12);
    qr.coefficients(y2).forEach((b, j) => expect(relErr(b, fresh.coef[j])).toBeLessThan(1e-12));
    expect(relErr(qr.ssr(y), fit.ssr)).toBeLessThan(1e-12); // the factor is not altered by use
  });

  it("columns, rows and a Matrix give the same fit, and the columns are not modified", () => {
    const before = columns.map((c) => Float64Array.from(c));
    const byCols = ols(columns, y);
    const byMatrix = ols(new Matrix(fx.X), y);
    for (const other of [byCols, byMatrix]) {
      other.coef.forEach((b, j) => expect(relErr(b, fit.coef[j])).toBeLessThan(1e-12));
      other.se.forEach((s, j) => expect(relErr(s, fit.se[j])).toBeLessThan(1e-12));
      expect(relErr(other.ssr, fit.ssr)).toBeLessThan(1e-12);
    }
    columns.forEach((c, j) => expect(c).toEqual(before[j]));
  });

  it("without inference returns the same fit and no inference fields", () => {
    const lean = ols(columns, y, { inference: false });
    expect(relErr(lean.ssr, fit.ssr)).toBeLessThan(1e-12);
    expect(relErr(lean.aic, fit.aic)).toBeLessThan(1e-12);
    lean.coef.forEach((b, j) => expect(relErr(b, fit.coef[j])).toBeLessThan(1e-12));
    expect("se" in lean).toBe(false);
    expect("pValue" in lean).toBe(false);
  });

  it("ols() accepts a factor", () => {
    const viaFactor = ols(qr, y);
    viaFactor.tStat.forEach((t, j) => expect(relErr(t, fit.tStat[j])).toBeLessThan(1e-12));
  });

  it("leadingFits equal separate ols() fits on each leading block of columns", () => {
    // The nested-model shortcut (ADF lag and AR order choice): Householder step j uses only
    // columns 0..j, so each block's fit is the same arithmetic as its own ols(); 1e-12 relative.
    const lead = qr.leadingFits(y);
    expect(lead.length).toBe(k);
    for (let kk = 1; kk <= k; kk++) {
      const own = ols(columns.slice(0, kk), y);
      const f = lead[kk - 1];
      expect(f.k).toBe(kk);
      expect(relErr(f.ssr, own.ssr)).toBeLessThan(1e-12);
      f.coef.forEach((b, j) => expect(relErr(b, own.coef[j])).toBeLessThan(1e-12));
      expect(relErr(f.lastSe, own.se[kk - 1])).toBeLessThan(1e-12);
    }
  });

  it("rejects a response of the wrong length and columns of unequal length", () => {
    expect(() => qr.ssr(y.subarray(1))).toThrow(/y has 15 values/);
    expect(() => qrFactor([Float64Array.from([1, 1, 1]), Float64Array.from([1, 2])])).toThrow(/column 2 has 2 rows/);
  });
});
