/**
 * A nonlinear process with known truth (seeded): the two-regime SETAR(2; 1, 1)
 *   y_t = 0.6 + 0.7·y_{t−1} + e_t   if y_{t−1} ≤ 0,
 *   y_t = −0.5 − 0.6·y_{t−1} + e_t  otherwise,   e_t ~ N(0, 1).
 * The coefficients are the ones set in the task brief, not a published example. Its
 * conditional mean is piecewise linear with a sign change in slope, which a linear AR(1)
 * cannot follow; a network on the same lag can.
 */
import { ols } from "../../../../src/core/math/ols";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { fitNnar } from "../../../../src/core/models/nnar";

const condMean = (prev: number): number => (prev <= 0 ? 0.6 + 0.7 * prev : -0.5 - 0.6 * prev);

function setar(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const burn = 100;
  const y = new Float64Array(n + burn);
  for (let t = 1; t < y.length; t++) y[t] = condMean(y[t - 1]) + rng.normal();
  return y.slice(burn);
}

test("NNAR(1,0,3) beats a least-squares AR(1) out of sample on a SETAR process", () => {
  const n = 600;
  const nTrain = 400;
  const y = setar(n, 1);
  // One-step forecasts over the 200-week holdout with the weights fixed at the training fit:
  // update(…, reestimate false) filters the new weeks, and its residuals there are the errors.
  const fit = fitNnar(y.subarray(0, nTrain), { p: 1, P: 0, hiddenUnits: 3 });
  const ext = fit.update(y.slice(nTrain), { reestimate: false });

  // Linear AR(1) with a constant by OLS on the same training weeks.
  const X = [new Float64Array(nTrain - 1).fill(1), y.slice(0, nTrain - 1)];
  const ar = ols(X, y.slice(1, nTrain), { inference: false });

  let mseNnar = 0;
  let mseAr = 0;
  let mseTrue = 0;
  for (let t = nTrain; t < n; t++) {
    mseNnar += ext.residuals[t] ** 2;
    mseAr += (y[t] - ar.coef[0] - ar.coef[1] * y[t - 1]) ** 2;
    mseTrue += (y[t] - condMean(y[t - 1])) ** 2;
  }
  const m = n - nTrain;
  mseNnar /= m;
  mseAr /= m;
  mseTrue /= m;
  // Seed 1 gives NNAR 1.017, AR 1.246, true conditional mean 1.013. The margin asked of NNAR:
  // at least 10% below the AR's MSE, and within 5% of the best any forecaster can do here
  // (the true conditional mean), i.e. it has learnt the regimes, not merely done better.
  expect(mseNnar).toBeLessThan(0.9 * mseAr);
  expect(mseNnar).toBeLessThan(1.05 * mseTrue);
});
