/**
 * Job kinds for the engine tests only, registered at runtime (jobs.ts ships none of them).
 * The jest process registers them by importing this file; the Node worker registers them in
 * its own thread through testWorker.ts.
 */
import { InputError } from "../../src/core/series/errors";
import { findJob, registerJob } from "../../src/engine/jobs";
import type { JobContext } from "../../src/engine/jobs";

/** How often "test-count" ran in this thread. */
export const counter = { runs: 0 };

function busyWait(ms: number): void {
  const end = Date.now() + ms;
  while (Date.now() < end) {
    // spin: a job that computes and never yields or checks cancelled()
  }
}

export function registerTestJobs(): void {
  if (findJob("test-count")) return;
  registerJob<{ values: Float64Array }, number>("test-count", {
    title: () => "counting job",
    run(input) {
      counter.runs++;
      let s = 0;
      for (const v of input.values) s += v;
      return s;
    },
  });
  // Spins for `ms`, reporting progress every `step` ms; never checks cancelled().
  registerJob<{ ms: number; step?: number }, string>("test-spin", {
    title: (input) => `${input.ms} ms spin`,
    run(input, ctx: JobContext) {
      const step = input.step ?? 10;
      const start = Date.now();
      for (let t = 0; t < input.ms; t += step) {
        busyWait(step);
        ctx.progress((t + step) / input.ms, `Spinning: ${Math.min(input.ms, t + step)} of ${input.ms} ms`);
      }
      return `spun ${Date.now() - start} ms`;
    },
  });
  // Awaits timers and stops when cancelled(): a job that yields.
  registerJob<{ ms: number }, string>("test-wait", {
    title: () => "waiting job",
    async run(input, ctx) {
      const end = Date.now() + input.ms;
      while (Date.now() < end) {
        if (ctx.cancelled()) throw new Error("stopped");
        await new Promise((r) => setTimeout(r, 5));
      }
      return "waited";
    },
  });
  registerJob<{ code: number }, never>("test-exit", {
    title: () => "exiting job",
    run(input) {
      process.exit(input.code);
    },
  });
  registerJob<Record<string, never>, never>("test-throw", {
    title: () => "failing job",
    run() {
      throw new Error("matrix is singular\n    at solve (ols.ts:12:3)");
    },
  });
  // Throws outside the job, from a timer: the worker's uncaught-exception path.
  registerJob<Record<string, never>, never>("test-uncaught", {
    title: () => "escaping job",
    run() {
      setTimeout(() => {
        throw new Error("kaboom");
      }, 0);
      return new Promise<never>(() => undefined);
    },
  });
  registerJob<Record<string, never>, never>("test-input-error", {
    title: () => "checking job",
    run() {
      throw new InputError("TOO_FEW_POINTS", "TBATS needs at least 104 weeks of rates; the data has 30.", { row: 4, col: 1 });
    },
  });
  registerJob<unknown, unknown>("test-echo", {
    title: () => "echo job",
    run: (input) => input,
  });
  registerJob<Record<string, never>, unknown>("test-unclonable", {
    title: () => "unclonable job",
    run: () => ({ f: () => 1 }),
  });
}

registerTestJobs();
