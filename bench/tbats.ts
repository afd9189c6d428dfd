/**
 * TBATS benchmark on 470 synthetic weekly rates (about nine years, seeded; synthetic.ts):
 *  - the automatic structure search (target: under 1 s median),
 *  - a refit from a warm start, i.e. update({ reestimate: true }) with one new week (target:
 *    under 100 ms),
 *  - likelihood evaluations per second of the chosen model, beside the work bound of one
 *    filter pass, n × (state size) state updates, and the seed regression's Gram products,
 *    n × k(k+1)/2 multiply-adds for k seed states, so the line shows how close the evaluation
 *    runs to the cost of the filter itself.
 * One JSON line per case (harness.ts). Wall-clock lines, plus one CPU-time line for the
 * search, since the machine is shared.
 */
import { consumed, runCase } from "./harness";
import { syntheticRates } from "./synthetic";
import { autoTbats } from "../src/core/models/tbats";
import { Objective, prepare } from "../src/core/models/tbats/estimate";
import { filterPass } from "../src/core/models/tbats/filter";

const N = 470;
const RUNS = 7;
const y = syntheticRates(N + 1, 4);
const history = y.subarray(0, N);
const fit = autoTbats(history);
const label = fit.summary().structure;

runCase({ name: `models.tbats automatic search (${label})`, n: N, runs: RUNS, setup: () => () => autoTbats(history) });

/**
 * A harder pattern: the same walk with a sharp three-week dip early in each year and a broad
 * peak season, which needs many harmonics, so the search visits larger K.
 */
function sharpSeasonRates(n: number, seed: number): Float64Array {
  const base = syntheticRates(n, seed);
  const out = new Float64Array(n);
  const period = 365.25 / 7;
  for (let t = 0; t < n; t++) {
    const phase = ((t % period) + period) % period;
    const dip = -0.18 * Math.exp(-0.5 * ((phase - 6) / 1.2) ** 2);
    const peak = 0.1 * Math.exp(-0.5 * ((phase - 34) / 5) ** 2);
    out[t] = base[t] * Math.exp(dip + peak);
  }
  return out;
}
const sharp = sharpSeasonRates(N, 11);
const sharpLabel = autoTbats(sharp).summary().structure;
runCase({ name: `models.tbats automatic search, sharp seasonal pattern (${sharpLabel})`, n: N, runs: RUNS, setup: () => () => autoTbats(sharp) });

{
  const c0 = process.cpuUsage();
  for (let i = 0; i < RUNS; i++) autoTbats(history);
  const c = process.cpuUsage(c0);
  process.stdout.write(JSON.stringify({ name: "models.tbats automatic search, CPU time per run", n: N, runs: RUNS, mean_cpu_ms: Number(((c.user + c.system) / 1000 / RUNS).toFixed(2)) }) + "\n");
}

runCase({
  name: "models.tbats refit from warm start (update with one new week, reestimate)",
  n: N + 1,
  runs: RUNS,
  setup: () => () => fit.update(y.subarray(N, N + 1), { reestimate: true }),
});
runCase({
  name: "models.tbats update with one new week, parameters kept",
  n: N + 1,
  runs: 15,
  setup: () => () => fit.update(y.subarray(N, N + 1), { reestimate: false }),
});
runCase({ name: "models.tbats forecast 12 weeks with 80/95% intervals", n: N, runs: 15, setup: () => () => fit.forecast(12, [80, 95]) });

{
  const obj = new Objective(prepare(history), fit.structure);
  const par = fit.par;
  const reps = 2000;
  for (let i = 0; i < 200; i++) obj.value(par);
  let t0 = process.hrtime.bigint();
  for (let i = 0; i < reps; i++) obj.value(par);
  const evalNs = Number(process.hrtime.bigint() - t0) / reps;
  const z = fit.z;
  for (let i = 0; i < 50; i++) filterPass(fit.layout, par, z, fit.seed);
  t0 = process.hrtime.bigint();
  for (let i = 0; i < reps; i++) filterPass(fit.layout, par, z, fit.seed);
  const passNs = Number(process.hrtime.bigint() - t0) / reps;
  const m = fit.layout.size;
  const k = fit.layout.seedCount;
  process.stdout.write(
    JSON.stringify({
      name: `models.tbats likelihood evaluations (${label})`,
      n: N,
      state_size: m,
      seed_states: k,
      evaluations_per_s: Math.round(1e9 / evalNs),
      median_ms: Number((evalNs / 1e6).toFixed(4)),
      state_updates_per_eval: N * m,
      gram_multiply_adds_per_eval: (N * k * (k + 1)) / 2,
      ns_per_state_update: Number((evalNs / (N * m)).toFixed(2)),
      plain_filter_pass_ms: Number((passNs / 1e6).toFixed(4)),
      ratio_to_plain_pass: Number((evalNs / passNs).toFixed(2)),
    }) + "\n",
  );
}
void consumed();
