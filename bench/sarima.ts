/**
 * Seasonal ARIMA benchmarks (JSON lines): the automatic search on 470 weeks of synthetic
 * rates in each seasonality mode, one likelihood evaluation, and the final structure fitted
 * again beside statsmodels' SARIMAX on the same data and specification, when Debian's
 * /usr/bin/python3 has statsmodels (bench/sarimax_peer.py). Targets (issue "Models I"):
 * automatic SARIMA under 1.5 s; the final fit at least 5× faster than the peer at equal or
 * better log-likelihood.
 */
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as path from "path";
import { runCase } from "./harness";
import { MersenneTwister } from "../src/core/math/rng";
import { autoSarima, fitStructure, type SarimaFitted } from "../src/core/models/sarima";
import { evaluate } from "../src/core/models/sarima/estimate";
import { regressorColumns } from "../src/core/models/sarima/spec";

const WEEKS = 470;

/** Weekly rates with a slow random-walk level, an annual cycle of period 52.18 and AR noise. */
function ratesWithArNoise(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let level = Math.log(1500);
  let noise = 0;
  for (let t = 0; t < n; t++) {
    level += 0.01 * rng.normal();
    noise = 0.6 * noise + 0.03 * rng.normal();
    y[t] = Math.exp(level + 0.08 * Math.sin((2 * Math.PI * t) / (365.25 / 7)) + noise);
  }
  return y;
}

const y = ratesWithArNoise(WEEKS, 3);
const chosen: Record<string, SarimaFitted> = {};

for (const seasonality of ["fourier", "lag52"] as const) {
  runCase({
    name: `sarima.auto (${seasonality})`,
    n: WEEKS,
    runs: 5,
    setup: () => () => {
      const f = autoSarima(y, { seasonality });
      chosen[seasonality] = f;
      return f.aicc;
    },
  });
  process.stdout.write(JSON.stringify({ name: `sarima.auto (${seasonality}) chose`, structure: chosen[seasonality].summary().structure }) + "\n");
}

const seasonalFit = chosen.lag52;
runCase({
  name: `sarima.loglik ${seasonalFit.summary().structure}`,
  n: seasonalFit.est.nobs,
  runs: 200,
  setup: () => () => evaluate(seasonalFit.prep, seasonalFit.est.coefficients).gls.logLik,
});

const peerScript = path.join(__dirname, "..", "..", "..", "bench", "sarimax_peer.py");
const python = "/usr/bin/python3";

for (const key of ["fourier", "lag52"]) {
  const fit = chosen[key];
  const spec = fit.spec;
  let ours: Record<string, number | string> = {};
  ours = runCase({ name: `sarima.fit final ${key}`, n: WEEKS, runs: 5, setup: () => () => fitStructure(y, spec).logLik });
  const line: Record<string, unknown> = { name: `sarima.fit final ${key} vs peer`, structure: fit.summary().structure, ours_llf: fit.logLik };
  if (fs.existsSync(python) && fs.existsSync(peerScript)) {
    const exog = regressorColumns(fit.prep.regressors, 0, WEEKS).map((c) => Array.from(c));
    const input = JSON.stringify({
      y: Array.from(y),
      order: [spec.p, spec.d, spec.q],
      seasonal: spec.P + spec.D + spec.Q > 0 ? [spec.P, spec.D, spec.Q, spec.s] : [0, 0, 0, 0],
      exog,
      repeats: 3,
    });
    const res = spawnSync(python, [peerScript], { input, encoding: "utf8", timeout: 600_000 });
    if (res.status === 0) {
      const peer = JSON.parse(res.stdout.trim().split("\n").pop() as string) as { peer: string; median_seconds: number; llf: number };
      line.peer = peer.peer;
      line.peer_median_ms = peer.median_seconds * 1000;
      line.peer_llf = peer.llf;
      line.ratio = Number((peer.median_seconds * 1000 / Number(ours.median_ms)).toFixed(1));
      line.llf_difference = fit.logLik - peer.llf;
    } else {
      line.peer = `not run: ${(res.stderr || res.error?.message || "").split("\n").slice(-2).join(" ")}`;
    }
  } else {
    line.peer = "not run: /usr/bin/python3 with statsmodels not found";
  }
  process.stdout.write(JSON.stringify(line) + "\n");
}
