/**
 * NNAR benchmark: the default model (20 networks; p by AIC after STL, P = 1, k by the rule)
 * fitted to 470 synthetic weekly rates (about nine years, seeded) plus a 12-week forecast with
 * 80/95% intervals from 1000 simulated paths. One JSON line per case (see harness.ts).
 *
 * The machine is shared, so beside the wall-clock lines of runCase one line gives the same
 * work's CPU time (process.cpuUsage, user + system), which other load on the cores disturbs less.
 */
import { consumed, runCase } from "./harness";
import { syntheticRates } from "./synthetic";
import { fitNnar } from "../src/core/models/nnar";

const N = 470;
const RUNS = 7;


let keep: unknown;

function cpuCase(name: string, n: number, fn: () => unknown, runs = RUNS): void {
  keep = fn(); // warm-up
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const c0 = process.cpuUsage();
    keep = fn();
    const c = process.cpuUsage(c0);
    times.push((c.user + c.system) / 1000);
  }
  times.sort((a, b) => a - b);
  const line = {
    name,
    n,
    runs,
    median_cpu_ms: Number(times[Math.floor(runs / 2)].toFixed(4)),
    min_cpu_ms: Number(times[0].toFixed(4)),
  };
  process.stdout.write(JSON.stringify(line) + "\n");
}

const y = syntheticRates(N, 4);
const fit = fitNnar(y);
const structure = fit.summary().structure;

runCase({ name: `models.nnar fit + forecast 12 weeks (${structure})`, n: N, runs: RUNS, setup: () => () => fitNnar(y).forecast(12, [80, 95]) });
cpuCase("models.nnar fit + forecast 12 weeks, CPU time", N, () => fitNnar(y).forecast(12, [80, 95]));
runCase({ name: "models.nnar fit only (20 networks)", n: N, runs: RUNS, setup: () => () => fitNnar(y) });
runCase({ name: "models.nnar forecast 12 weeks, 1000 paths", n: N, runs: RUNS, setup: () => () => fit.forecast(12, [80, 95]) });
void consumed();
void keep;
