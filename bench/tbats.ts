/**
 * TBATS benchmark on 470 synthetic weekly rates (about nine years, seeded; synthetic.ts):
 *  - the automatic structure search (target: under 1 s median),
 *  - a refit from a warm start, i.e. update({ reestimate: true }) with one new week (target:
 *    under 100 ms),
 *  - likelihood evaluations per second of the chosen model, beside the work bound of one
 *    filter pass, n × (state size) state updates, and the seed regression's Gram products,
 *    n × k(k+1)/2 multiply-adds for k seed states, so the line shows how close the evaluation
 *    runs to the cost of the filter itself;
 *  - the same with the lunar-new-year calendar regressors (5 columns: the search, and one
 *    likelihood evaluation, each with its ratio to the same without them).
 * One JSON line per case (harness.ts). Wall-clock lines, plus one CPU-time line for the
 * search, since the machine is shared.
 */
import { consumed, runCase } from "./harness";
import { syntheticRates } from "./synthetic";
import { autoTbats } from "../src/core/models/tbats";
import { Objective, prepare } from "../src/core/models/tbats/estimate";
import { filterPass } from "../src/core/models/tbats/filter";
import { regressorColumns } from "../src/core/models/tbats/model";
import { calendarRegressors } from "../src/core/series/calendarRegressors";

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
{
  // Calendar regressors: the series read as weeks ending on Fridays from 2017-01-06.
  const calendar = { start: "2017-01-06", lunarNewYear: { before: 1, after: 3 } };
  const withCal = autoTbats(history, { calendar });
  const calLabel = withCal.summary().structure;
  const plainMs = Number(runCase({ name: "models.tbats automatic search (peer for the calendar line)", n: N, runs: RUNS, setup: () => () => autoTbats(history) }).median_ms);
  const calMs = Number(runCase({ name: `models.tbats automatic search with lunar-new-year regressors (${calLabel})`, n: N, runs: RUNS, setup: () => () => autoTbats(history, { calendar }) }).median_ms);
  process.stdout.write(JSON.stringify({ name: "models.tbats automatic search, calendar on / off", n: N, ratio: Number((calMs / plainMs).toFixed(2)) }) + "\n");
  const set = calendarRegressors(calendar, N);
  if (!set) throw new Error("no calendar regressors");
  const data = regressorColumns(set, N);
  const reps = 1000;
  const time = (o: Objective, par: typeof fit.par): number => {
    for (let i = 0; i < 100; i++) o.value(par);
    const t0 = process.hrtime.bigint();
    for (let i = 0; i < reps; i++) o.value(par);
    return Number(process.hrtime.bigint() - t0) / reps;
  };
  // The chosen plain model, and the many-harmonic model of the sharp pattern (larger state).
  const sharpFit = autoTbats(sharp);
  for (const [f, rates] of [[fit, history], [sharpFit, sharp]] as const) {
    const a = time(new Objective(prepare(rates), f.structure), f.par);
    const b = time(new Objective(prepare(rates), f.structure, data), f.par);
    process.stdout.write(
      JSON.stringify({
        name: `models.tbats likelihood evaluation with ${data.count} calendar regressors (${f.summary().structure})`,
        n: N,
        state_size: f.layout.size,
        regressors: data.count,
        median_ms: Number((b / 1e6).toFixed(4)),
        peer_ms_without: Number((a / 1e6).toFixed(4)),
        ratio: Number((b / a).toFixed(2)),
      }) + "\n",
    );
  }
}
void consumed();
