/**
 * TBATS's calendar regressors against statsmodels (fixture tbats_local_level_regression.json,
 * written by test/reference/make_tbats_regression.py, which explains the equivalence): with no
 * trend, season or ARMA part, TBATS with regressors is a regression with ARIMA(0,1,1) errors,
 * θ = α − 1, and at a given α its joint least squares of the seed level and β equals the GLS
 * estimate that statsmodels' SARIMAX finds with ma.L1 held at θ (and numpy's direct GLS on the
 * differenced Nile flow). Three regressors: two pulses (convolved with the impulse response)
 * and a step (filtered directly).
 */
import { loadFixture } from "../../../fixtures";
import { referenceSeed, SeedRegression } from "../../../../src/core/models/tbats/filter";
import { layoutOf, type TbatsStructure } from "../../../../src/core/models/tbats/structure";

interface Case {
  alpha: number;
  theta: number;
  statsmodels: { beta: number[]; bse_oim: number[]; sigma2: number };
  gls: { beta: number[]; inverse_diagonal: number[]; quadratic_form: number; n_differenced: number };
}
interface Fixture {
  y: number[];
  X: number[][];
  cases: Case[];
}

const fx = loadFixture<Fixture>("tbats_local_level_regression.json");
const LOCAL_LEVEL: TbatsStructure = { boxCox: false, trend: false, damped: false, periods: [], harmonics: [], p: 0, q: 0 };

describe("TBATS regressors on the Nile flow against statsmodels SARIMAX(0,1,1) with exog at fixed θ", () => {
  test.each(fx.cases.map((c) => [c.alpha, c] as const))("α = %s", (_a, c) => {
    const z = Float64Array.from(fx.y);
    const n = z.length;
    const L = layoutOf(LOCAL_LEVEL);
    const columns = new Float64Array(3 * n);
    fx.X.forEach((col, j) => columns.set(col, j * n));
    const reg = new SeedRegression(L, 3);
    const par = { lambda: null, alpha: c.alpha, beta: 0, phi: 1, gamma1: [], gamma2: [], ar: [], ma: [] };
    const sse = reg.sse(z, par, referenceSeed(L, z, 1), columns);
    // β against statsmodels' MLE (its BFGS stopped within 1e-9 relative of the direct GLS,
    // asserted in the maker) and against the GLS itself: the same estimator, so agreement to
    // rounding of a 100-week regression (1e-8 of the coefficients' size, ≈ 4e-6 in flow units).
    for (let j = 0; j < 3; j++) {
      expect(Math.abs(reg.coef[j] - c.gls.beta[j])).toBeLessThan(1e-8 * 400);
      expect(Math.abs(reg.coef[j] - c.statsmodels.beta[j])).toBeLessThan(1e-6 * 400);
    }
    // (XᵀX)⁻¹ for β equals the GLS (X̃ᵀΣ⁻¹X̃)⁻¹ diagonal: the seed's profile removes the same
    // direction as differencing.
    const inv = reg.coefficientInverseDiagonal();
    for (let j = 0; j < 3; j++) expect(Math.abs(inv[j] - c.gls.inverse_diagonal[j])).toBeLessThan(1e-8 * c.gls.inverse_diagonal[j]);
    // The concentrated sum of squares equals the GLS quadratic form of the differenced data, so
    // σ̂² on statsmodels' n − 1 differenced weeks is its sigma2 (to its optimiser, 1e-6).
    expect(Math.abs(sse - c.gls.quadratic_form)).toBeLessThan(1e-9 * c.gls.quadratic_form);
    expect(Math.abs(sse / c.gls.n_differenced - c.statsmodels.sigma2)).toBeLessThan(1e-6 * c.statsmodels.sigma2);
    // statsmodels' observed-information standard errors are √(σ̂²·inverse diagonal).
    for (let j = 0; j < 3; j++) {
      const se = Math.sqrt((sse / c.gls.n_differenced) * inv[j]);
      expect(Math.abs(se - c.statsmodels.bse_oim[j])).toBeLessThan(1e-4 * c.statsmodels.bse_oim[j]);
    }
  });
});
