/**
 * Benchmarks of the numerical base. Each case prints one JSON line (see harness.ts).
 * Sizes are those a desk meets: 14 years of weekly rates (≈ 730 weeks), regressions with a
 * few dozen columns (Fourier pairs, calendar dummies), optimisers over 5–20 parameters.
 */
import { syntheticRates } from "./synthetic";
import { runCase } from "./harness";
import { MersenneTwister } from "../src/core/math/rng";
import { ols } from "../src/core/math/ols";
import { guerreroLambda, profileLambda } from "../src/core/math/boxcox";
import { bfgs, nelderMead } from "../src/core/math/optimise";
import { drift, lastYear } from "../src/core/models/naive";
import { readWeekly } from "../src/core/series/intake";
import { analyse } from "../src/core/analysis";
import { runChecks } from "../src/core/diagnostics/battery";
import { unitRootSummary } from "../src/core/diagnostics/unitroot";
import { clearNoiseBaselineCache, seasonalitySummary, stl } from "../src/core/diagnostics/seasonality";
import { nonlinearitySummary } from "../src/core/diagnostics/nonlinearity";
import { residualChecks } from "../src/core/diagnostics/residuals";

const WEEKS = 730;


function rosenbrock(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i + 1 < x.length; i++) s += 100 * (x[i + 1] - x[i] * x[i]) ** 2 + (1 - x[i]) ** 2;
  return s;
}

const y = syntheticRates(WEEKS, 1);

runCase({
  name: "rng.normal",
  n: 1_000_000,
  setup: () => {
    const r = new MersenneTwister(7);
    return () => {
      let s = 0;
      for (let i = 0; i < 1_000_000; i++) s += r.normal();
      return s;
    };
  },
});

runCase({
  name: "intake.readWeekly (Excel serial dates + numeric text)",
  n: WEEKS,
  setup: () => {
    const start = 41279; // an Excel serial on a Friday in 2013
    const values: unknown[][] = [["Lane rate"]];
    const dates: unknown[][] = [["Week ending"]];
    for (let t = 0; t < WEEKS; t++) {
      values.push([t % 5 === 0 ? `$${y[t].toFixed(1)}` : y[t]]);
      dates.push([start + 7 * t]);
    }
    return () => readWeekly(values, { dates });
  },
});

runCase({
  name: "ols (n=730, k=27: constant, trend, 12 Fourier pairs, 1 dummy)",
  n: WEEKS,
  setup: () => {
    const X: number[][] = [];
    for (let t = 0; t < WEEKS; t++) {
      const row = [1, t / WEEKS];
      for (let k = 1; k <= 12; k++) {
        const w = (2 * Math.PI * k * t) / (365.25 / 7);
        row.push(Math.sin(w), Math.cos(w));
      }
      row.push(t % 52 === 5 ? 1 : 0);
      X.push(row);
    }
    return () => ols(X, y);
  },
});

runCase({ name: "boxcox.guerreroLambda (period 52)", n: WEEKS, setup: () => () => guerreroLambda(y, 52) });
runCase({ name: "boxcox.profileLambda", n: WEEKS, setup: () => () => profileLambda(y) });

runCase({
  name: "optimise.nelderMead rosenbrock-5",
  n: 5,
  setup: () => () => nelderMead(rosenbrock, new Float64Array(5).fill(-1), { maxEval: 20000 }),
});
runCase({
  name: "optimise.bfgs rosenbrock-10 (finite differences)",
  n: 10,
  setup: () => () => bfgs(rosenbrock, new Float64Array(10).fill(-1), { maxEval: 50000 }),
});

runCase({ name: "models.lastyear fit+forecast 12 weeks", n: WEEKS, setup: () => () => lastYear.fit(y).forecast(12, [80, 95]) });
runCase({ name: "models.drift simulate 12 weeks x 5000 paths", n: 5000, setup: () => () => drift.fit(y).simulate(12, 5000, new MersenneTwister(3)) });

runCase({
  name: "analyse (intake to outlook, lastyear, no checks)",
  n: WEEKS,
  setup: () => {
    const values = Array.from(y, (v) => [v]);
    const dates = Array.from(y, (_v, t) => [41279 + 7 * t]);
    return () => analyse(readWeekly(values, { dates }), { method: "lastyear", horizon: 12, checks: false });
  },
});

// The diagnostic battery on 470 weekly points (about nine years), the target size:
// stationarity on levels/logs/changes, STL strength and ISO-week factors, nonlinearity,
// residual checks of the seasonal naive.
{
  const n = 470;
  const z = syntheticRates(n, 4);
  const start = Date.UTC(2017, 0, 6);
  const series = {
    dates: Array.from({ length: n }, (_v, t) => new Date(start + t * 7 * 86_400_000)),
    values: z,
    filled: new Array<boolean>(n).fill(false),
    warnings: [],
  };
  const fit = lastYear.fit(z);
  const model = { residuals: fit.residuals, armaDf: 0, label: "lastyear" };
  // Cold: a new length (next week's paste) pays for the seasonal-strength noise baseline.
  runCase({
    name: "diagnostics.runChecks (all sections, cold)",
    n,
    setup: () => () => {
      clearNoiseBaselineCache();
      return runChecks(series, model);
    },
  });
  // Warm: the same length again (a recalculation, or another lane of the same length).
  runCase({ name: "diagnostics.runChecks (all sections, baseline memo warm)", n, setup: () => () => runChecks(series, model) });
  runCase({ name: "diagnostics.unitRootSummary", n, setup: () => () => unitRootSummary(z) });
  runCase({
    name: "diagnostics.seasonalitySummary (cold)",
    n,
    setup: () => () => {
      clearNoiseBaselineCache();
      return seasonalitySummary(series);
    },
  });
  runCase({ name: "diagnostics.stl (period 52)", n, setup: () => () => stl(Float64Array.from(z, Math.log), { period: 52 }) });
  runCase({ name: "diagnostics.nonlinearitySummary", n, setup: () => () => nonlinearitySummary(z) });
  runCase({ name: "diagnostics.residualChecks", n, setup: () => () => residualChecks(fit.residuals) });
}
