/**
 * A tiny benchmark harness: runs a case repeatedly and prints one JSON object per line
 * (name, n, runs, median_ms, min_ms). Timings are for reading trends, never asserted in tests.
 */
export interface BenchCase {
  name: string;
  /** Problem size reported beside the timing (observations, draws, dimensions). */
  n: number;
  /** Called once before timing; returns the function to time. */
  setup: () => () => unknown;
  runs?: number;
}

let sink: unknown;

export function runCase(c: BenchCase): Record<string, number | string> {
  const fn = c.setup();
  sink = fn(); // warm-up, also lets the JIT settle
  const runs = c.runs ?? 15;
  const times: number[] = [];
  for (let i = 0; i < runs; i++) {
    const t0 = process.hrtime.bigint();
    sink = fn();
    times.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  times.sort((a, b) => a - b);
  const line = {
    name: c.name,
    n: c.n,
    runs,
    median_ms: Number(times[Math.floor(runs / 2)].toFixed(4)),
    min_ms: Number(times[0].toFixed(4)),
  };
  process.stdout.write(JSON.stringify(line) + "\n");
  return line;
}

/** Keeps results observable so the optimiser cannot drop the timed work. */
export function consumed(): unknown {
  return sink;
}
