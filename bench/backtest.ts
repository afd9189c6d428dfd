/**
 * Backtest benchmark: 470 synthetic weekly rates (synthetic.ts), 52 origins, 4 weeks ahead,
 * TBATS + SARIMA + NNAR + their combination, each refit mode, on the calling thread (the engine's
 * worker pool splits the same runs over the cores; bench/engine.ts times that). One JSON line per
 * method and mode with the fitting time, then one per mode for the whole backtest.
 * Targets (issue): re-estimation every week under 20 s wall on 2 cores; fixed parameters under 2 s.
 */
import { backtest } from "../src/core/evaluate/run";
import { getModel } from "../src/core/models/registry";
import { syntheticRates } from "./synthetic";

const N = 470;
const y = syntheticRates(N, 4);
for (const mode of ["fixed", 4, "every"] as const) {
  const t0 = process.hrtime.bigint();
  const r = backtest(y, { methods: ["tbats", "sarima", "nnar", "combo"], testWeeks: 52, horizon: 4, modes: [mode] }, getModel);
  const ms = Number(process.hrtime.bigint() - t0) / 1e6;
  for (const run of r.runs) {
    if (run.method === "combo") continue;
    process.stdout.write(JSON.stringify({ name: `evaluate.backtest ${run.method}, refit ${String(mode)}`, n: N, origins: 52, fits: run.fits, median_ms: Number(run.milliseconds.toFixed(1)) }) + "\n");
  }
  process.stdout.write(JSON.stringify({ name: `evaluate.backtest tbats+sarima+nnar+combo, refit ${String(mode)}, one thread`, n: N, origins: 52, horizon: 4, median_ms: Number(ms.toFixed(1)), runs: 1 }) + "\n");
}

/** The same backtests through the engine's worker pool (one worker per core). */
async function pooled(): Promise<void> {
  const { createEngine, backtestInEngine } = await import("../src/engine");
  const { NodeTransport } = await import("../src/engine/node");
  const transport = new NodeTransport();
  const engine = createEngine(transport, { cache: false });
  // The first run includes starting the workers and loading the core into each; the second
  // and later find them warm, as a pane or a long batch does.
  for (const [mode, when] of [["fixed", "cold workers"], ["fixed", "warm workers"], ["every", "warm workers"]] as const) {
    const t0 = process.hrtime.bigint();
    await backtestInEngine(engine, y, { methods: ["tbats", "sarima", "nnar", "combo"], testWeeks: 52, horizon: 4, modes: [mode] });
    const ms = Number(process.hrtime.bigint() - t0) / 1e6;
    process.stdout.write(
      JSON.stringify({ name: `evaluate.backtest tbats+sarima+nnar+combo, refit ${mode}, worker pool, ${when}`, n: N, origins: 52, horizon: 4, workers: engine.size, median_ms: Number(ms.toFixed(1)), runs: 1 }) + "\n",
    );
  }
  engine.close();
}
void pooled();
