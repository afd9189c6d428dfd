/**
 * Engine overheads (src/engine), one JSON line per case (name, n, runs, median_ms, min_ms):
 * - the cache hit for a 470-week "analyse" input, and the content hash alone;
 * - a small job (analyse, last week, 60 weeks, no checks) called directly, through the
 *   in-thread transport and through worker_threads: the difference is the pool's overhead
 *   per job (messages, structured clones, scheduling);
 * - how long a busy worker takes to stop after terminate() (the pool rejects the cancelled
 *   job at once; this is when the thread is really gone).
 * The worker script is the tsc output beside node.js (build/bench/src/engine/nodeWorker.js),
 * found by NodeTransport's default, as in any tsc build.
 */
import { analyse } from "../src/core/analysis";
import { readWeekly } from "../src/core/series/intake";
import type { WeeklySeries } from "../src/core/series/types";
import { InlineTransport, createEngine, jobKey } from "../src/engine";
import type { Engine } from "../src/engine";
import { NodeTransport } from "../src/engine/node";
import { syntheticRates } from "./synthetic";

function series(n: number): WeeklySeries {
  const y = syntheticRates(n, 3);
  const values: unknown[][] = [["Halden–Corvane FEU"]];
  const dates: unknown[][] = [["Week ending"]];
  const start = Date.UTC(2017, 0, 6);
  for (let t = 0; t < n; t++) {
    values.push([Math.round(100 * y[t]) / 100]);
    dates.push([new Date(start + t * 7 * 86_400_000).toISOString().slice(0, 10)]);
  }
  return readWeekly(values, { dates });
}

function ms(t0: bigint): number {
  return Number(process.hrtime.bigint() - t0) / 1e6;
}

function line(name: string, n: number, times: number[], extra: Record<string, number> = {}): number {
  const s = [...times].sort((a, b) => a - b);
  const median = s[Math.floor(s.length / 2)];
  const out = { name, n, runs: s.length, median_ms: Number(median.toFixed(4)), min_ms: Number(s[0].toFixed(4)), ...extra };
  process.stdout.write(JSON.stringify(out) + "\n");
  return median;
}

async function timed(runs: number, warmup: number, f: () => unknown): Promise<number[]> {
  for (let i = 0; i < warmup; i++) await f();
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.hrtime.bigint();
    await f();
    times.push(ms(t0));
  }
  return times;
}

async function main(): Promise<void> {
  // Cache hit, 470 weeks: each call hashes a fresh clone of the input, as a recalculation would.
  const big = series(470);
  const bigInput = { series: big, options: { method: "lastyear", horizon: 12, levels: [80, 95] } };
  const inline = createEngine(new InlineTransport());
  await inline.run("analyse", bigInput);
  const clones = Array.from({ length: 400 }, () => structuredClone(bigInput));
  let k = 0;
  line("engine.cacheHit.analyse", 470, await timed(200, 200, () => inline.run("analyse", clones[k++ % clones.length])));
  line("engine.jobKey.analyse", 470, await timed(200, 200, () => jobKey("analyse", clones[k++ % clones.length])));

  // A small job three ways; the cache is off so every call does the work.
  const small = { series: series(60), options: { method: "lastweek", horizon: 4, checks: false } };
  const direct = line("engine.direct.smallAnalyse", 60, await timed(200, 50, () => analyse(small.series, small.options)));
  const viaInline = await timed(200, 50, () => inline.run("analyse", small, { cache: false }));
  line("engine.inline.smallAnalyse", 60, viaInline, { overhead_ms: Number((median(viaInline) - direct).toFixed(4)) });
  inline.close();

  const node: Engine = createEngine(new NodeTransport(), { size: 1 });
  const viaNode = await timed(200, 50, () => node.run("analyse", small, { cache: false }));
  line("engine.node.smallAnalyse", 60, viaNode, { overhead_ms: Number((median(viaNode) - direct).toFixed(4)) });
  node.close();

  // A busy worker (SARIMA re-estimated every week) stopped by terminate().
  const y = series(156).values;
  const n = y.length;
  const plan = { n, horizon: 4, levels: [80, 95], windows: [{ first: n - 52, last: n - 1 }], methods: ["sarima"], combos: [], modes: ["every" as const] };
  const transport = new NodeTransport();
  const stops: number[] = [];
  for (let i = 0; i < 5; i++) {
    const handle = transport.spawn();
    const busy = new Promise<void>((resolve) => handle.onMessage((m) => m.type === "progress" && resolve()));
    handle.post({ id: 1, kind: "backtest-run", input: { y, method: "sarima", plan, mode: "every", window: 0 } });
    await busy;
    await new Promise((r) => setTimeout(r, 200));
    const t0 = process.hrtime.bigint();
    await handle.terminate();
    stops.push(ms(t0));
  }
  line("engine.node.terminateBusyWorker", 156, stops);
}

function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

main().catch((e) => {
  process.stderr.write(`${e instanceof Error ? e.message : String(e)}\n`);
  process.exit(1);
});
