/**
 * TBATS against references outside the project (fixtures written by
 * test/reference/make_tbats.py with Debian's statsmodels 0.13.5 / scipy / numpy).
 *
 * Weekly CO2 (statsmodels.datasets.co2, 520 training weeks 1991–2000, 52 holdout weeks of
 * 2001): statsmodels' UnobservedComponents, local linear trend plus trigonometric seasonality
 * of period 365.25/7 with K harmonics, fitted by exact ML for K = 1..8.
 *  - In-sample likelihood. The comparable UC figure is `llf_seed_profile`: the UC model's
 *    Gaussian likelihood at its MLE with the initial states treated as estimated parameters,
 *    which is how TBATS treats its seeds (the fixture's augmented filter computes it; it
 *    agrees with statsmodels' exact diffuse likelihood where that works, K = 1, to 4e-10).
 *    statsmodels' own llf (approximate diffuse start, first 2 + 2K weeks dropped) is checked
 *    too. TBATS at the K it chooses must reach at least the UC figure at that K: both are
 *    single-source vs multi-source state-space models of the same shape, and TBATS also
 *    chooses its ARMA errors.
 *  - Holdout accuracy. MASE (scaled by the training weeks' lag-52 MAE, as ours). Measured:
 *    TBATS 0.192 (its AIC choice, ARMA(2,3) errors; 0.190 without them), UC 0.175 at the same
 *    K = 3 and 0.182 at UC's own AIC choice K = 2: TBATS is not more accurate here, it is 10%
 *    behind. The two forecasts differ by under 0.2 ppm at every step, a tenth of the holdout's
 *    mean absolute error, and a single 52-week path from one origin cannot rank models this
 *    close, so the check is a guard against gross failure: within 25% of both.
 *
 * Monthly elec_equip (statsmodels.datasets.elec_equip, 257 months), period 12: the λ and the
 * seasonal pattern of a Box-Cox + STL reading.
 *  - λ: the fixture's `stl_profile_lambda`, the λ maximising the Gaussian profile likelihood of
 *    a non-robust STL remainder (Jacobian included) and its approximate 95% interval. TBATS's λ
 *    must lie in that interval. (scipy's iid λ_mle, 1.16, answers a different question.)
 *  - Pattern: monthly multiplicative factors from robust STL of log y (statsmodels), against
 *    TBATS's factors from its seasonal states averaged by calendar month. Sign: the same side
 *    of 1 in every month whose STL factor is at least 2% from 1. Size: the effects (factor − 1)
 *    regressed on STL's through the origin have a slope within [0.8, 1.25] (the same size to
 *    within a quarter), and correlate above 0.9. Measured: slope 0.97, correlation 0.95, the
 *    largest monthly difference 0.039 (July) on effects of −14% to +13%; the two smooth the
 *    pattern differently (STL lets it change, seasonal window 7; TBATS keeps 5 harmonics).
 */
import { loadFixture } from "../../../fixtures";
import { mase, maseScale } from "../../../../src/core/evaluate/metrics";
import { autoTbats } from "../../../../src/core/models/tbats";
import { seasonalEffects } from "../../../../src/core/models/tbats/factors";

interface UcFit {
  K: number;
  llf: number;
  llf_seed_profile: number;
  mase: number;
  forecast: { point: number[] };
}
interface Co2Fixture {
  train: number[];
  holdout: number[];
  fits: UcFit[];
  best_K_by_aic: number;
  mase_scale: number;
}
interface ElecFixture {
  y: number[];
  stl_profile_lambda: { lambda: number; ci95: [number, number] };
  multiplicative_factors: { all: number[] };
}

const co2 = loadFixture<Co2Fixture>("tbats_co2_uc.json");
const elec = loadFixture<ElecFixture>("tbats_elec_equip_stl.json");

describe("weekly CO2 against statsmodels UnobservedComponents (trigonometric seasonality, period 52.18)", () => {
  const y = Float64Array.from(co2.train);
  const holdout = Float64Array.from(co2.holdout);
  const fit = autoTbats(y);
  const K = fit.structure.harmonics[0];
  const uc = co2.fits.find((f) => f.K === K) as UcFit;
  const ucChosen = co2.fits.find((f) => f.K === co2.best_K_by_aic) as UcFit;

  test("the search keeps the 52.18-week period with a K that UC was fitted at", () => {
    expect(fit.structure.periods).toEqual([365.25 / 7]);
    expect(uc).toBeDefined();
  });

  test("our MASE scale is the fixture's (same training weeks, lag 52)", () => {
    expect(maseScale(y).scale).toBeCloseTo(co2.mase_scale, 12);
  });

  test("in-sample log-likelihood at least UC's at the same K (seeds as parameters, and statsmodels' own)", () => {
    expect(fit.logLik).toBeGreaterThanOrEqual(uc.llf_seed_profile);
    expect(fit.logLik).toBeGreaterThanOrEqual(uc.llf);
  });

  test("holdout MASE within 25% of UC's at the same K and of UC's AIC choice", () => {
    const ours = mase(holdout, fit.forecast(52, [80]).point, maseScale(y));
    expect(ours).toBeLessThan(1.25 * uc.mase);
    expect(ours).toBeLessThan(1.25 * ucChosen.mase);
    // The fixture's own MASE of UC reproduces with our metric (so the comparison is like for like).
    expect(mase(holdout, Float64Array.from(uc.forecast.point), maseScale(y))).toBeCloseTo(uc.mase, 12);
  });
});

describe("monthly elec_equip, period 12, against a Box-Cox + STL reading", () => {
  const y = Float64Array.from(elec.y);
  const fit = autoTbats(y, { periods: [12] });

  test("λ lies in the STL-remainder profile interval", () => {
    const lam = fit.par.lambda ?? 1;
    const [lo, hi] = elec.stl_profile_lambda.ci95;
    expect(lam).toBeGreaterThanOrEqual(lo);
    expect(lam).toBeLessThanOrEqual(hi);
  });

  test("monthly factors agree with STL's in sign and size", () => {
    const effects = seasonalEffects(fit, "multiplicative");
    const sum = new Float64Array(12);
    const count = new Float64Array(12);
    // The series starts in January, so index t falls in month t mod 12.
    for (let t = 0; t < y.length; t++) {
      sum[t % 12] += Math.exp(effects[t]);
      count[t % 12]++;
    }
    const ours = Array.from(sum, (s, m) => s / count[m]);
    const mean = ours.reduce((a, b) => a + b, 0) / 12;
    for (let m = 0; m < 12; m++) ours[m] /= mean;
    const stl = elec.multiplicative_factors.all;
    let sxy = 0;
    let sxx = 0;
    let syy = 0;
    for (let m = 0; m < 12; m++) {
      if (Math.abs(stl[m] - 1) >= 0.02) expect(Math.sign(ours[m] - 1)).toBe(Math.sign(stl[m] - 1));
      sxy += (ours[m] - 1) * (stl[m] - 1);
      sxx += (stl[m] - 1) ** 2;
      syy += (ours[m] - 1) ** 2;
    }
    const slope = sxy / sxx;
    expect(slope).toBeGreaterThan(0.8);
    expect(slope).toBeLessThan(1.25);
    expect(sxy / Math.sqrt(sxx * syy)).toBeGreaterThan(0.9);
  });
});
