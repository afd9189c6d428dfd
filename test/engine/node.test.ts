/**
 * The pool over worker_threads, running the scripts test/engine/globalSetup.ts compiled:
 * PRODUCTION_WORKER is src/engine/nodeWorker.ts as shipped; TEST_WORKER adds testJobs.ts.
 */
import { analyse } from "../../src/core/analysis";
import type { BacktestRun } from "../../src/core/evaluate/backtest";
import { runWindow } from "../../src/core/evaluate/backtest";
import { getModel } from "../../src/core/models/registry";
import { InputError } from "../../src/core/series/errors";
import { EngineCancelled, EngineError, createEngine } from "../../src/engine";
import type { Engine } from "../../src/engine";
import { NodeTransport } from "../../src/engine/node";
import { expectWellFormedProgress, progressRecorder, rejectionOf, smallPlan, withoutTiming } from "./helpers";
import { laneSeries } from "./lane";
import { PRODUCTION_WORKER, TEST_WORKER } from "./paths";
import "./testJobs";

describe("node transport, production worker script", () => {
  let engine: Engine;
  beforeAll(() => {
    engine = createEngine(new NodeTransport({ script: PRODUCTION_WORKER }));
  });
  afterAll(() => engine.close());

  test("analyse in a worker thread returns the same Report as analyse() here (TBATS, 156 weeks, with the checks)", async () => {
    const series = laneSeries(156);
    const options = { method: "tbats", horizon: 8, levels: [80, 95] };
    const progress = progressRecorder();
    const viaWorker = await engine.run("analyse", { series, options }, { onProgress: progress.listener, cache: false });
    // Deep equality with numbers compared by Object.is: bit for bit across threads.
    expect(viaWorker).toEqual(analyse(series, options));
    expectWellFormedProgress(progress.events);
  });

  test("determinism: two runs in worker threads give identical Reports", async () => {
    const series = laneSeries(156);
    const options = { method: "sarima", horizon: 4, checks: false };
    const [a, b] = await Promise.all([
      engine.run("analyse", { series, options }, { cache: false }),
      engine.run("analyse", { series, options }, { cache: false }),
    ]);
    expect(a).toEqual(b);
  });

  test("backtest-run through the pool equals runWindow here, apart from the milliseconds; combined progress is well formed", async () => {
    const y = laneSeries(120).values;
    const plan = smallPlan(y.length);
    const combined = progressRecorder();
    const runs: BacktestRun[] = await engine.runAll(
      plan.methods.map((method) => ({ kind: "backtest-run" as const, input: { y, method, plan, mode: "fixed" as const, window: 0 } })),
      { onProgress: combined.listener },
    );
    const direct = plan.methods.map((m) => runWindow(y, m, getModel, plan, "fixed", 0));
    expect(runs.map(withoutTiming)).toEqual(direct.map(withoutTiming));
    expect(runs.map((r) => r.fits + r.updates)).toEqual([8, 8]);
    expectWellFormedProgress(combined.events);
    expect(combined.events.some((e) => /^Backtesting (Last week|Drift), parameters kept from the first origin: origin \d of 8$/.test(e.sentence))).toBe(true);
  });

  test("cancelling a busy backtest rejects within a second, and the pool runs the next job", async () => {
    // A backtest that takes seconds: NNAR with 300 networks, re-estimated at each of 52
    // origins (~7 s alone). SARIMA warm-started from the previous optimum runs all 52 origins
    // of this lane in ~0.2 s, too short to be sure of aborting it mid-job.
    const y = laneSeries(156).values;
    const n = y.length;
    const plan = { ...smallPlan(n), windows: [{ first: n - 52, last: n - 1 }], methods: ["nnar"], modes: ["every" as const] };
    const ac = new AbortController();
    const progress = progressRecorder();
    let pastFirstOrigin: () => void = () => undefined;
    const started = new Promise<void>((r) => (pastFirstOrigin = r));
    const input = { y, method: "nnar", plan, mode: "every" as const, window: 0, methodOptions: { networks: 300 } };
    const job = engine.run("backtest-run", input, {
      signal: ac.signal,
      onProgress: (f, s) => {
        progress.listener(f, s);
        if (f > 0) pastFirstOrigin();
      },
    });
    const failure = rejectionOf(job);
    await started; // the worker is inside the job (the first origin is done) …
    await new Promise((r) => setTimeout(r, 200)); // … and keeps computing for 200 ms more
    const t0 = Date.now();
    ac.abort();
    const e = await failure;
    const latency = Date.now() - t0;
    expect(e).toBeInstanceOf(EngineCancelled);
    const label = getModel("nnar").label;
    expect((e as Error).message).toBe(`The ${label} backtest was cancelled.`);
    // The rejection does not wait for the job: it comes from the abort handler, and the worker is
    // terminated at the same time. The bound is the brief's one second plus room for a loaded
    // 2-core machine that is running the rest of the suite; a behaviour check, not a benchmark.
    expect(latency).toBeLessThan(1500);
    process.stdout.write(`engine cancel: busy NNAR backtest rejected ${latency} ms after abort (${progress.events.length} progress events before)\n`);
    expect(progress.events[progress.events.length - 1].fraction).toBeLessThan(1);
    expect(progress.events[0].sentence).toBe(`Backtesting ${label}, re-estimated every week: origin 0 of 52`);
    expect(progress.events[progress.events.length - 1].sentence).toMatch(/, re-estimated every week: origin [1-9]\d* of 52$/);
    expect(engine.stats().terminated).toBe(1);
    const next = await engine.run("analyse", { series: laneSeries(60), options: { method: "lastweek", checks: false, horizon: 2 } });
    expect(next.tables.outlook.rows).toHaveLength(2);
  });
});

describe("node transport, test worker script", () => {
  let engine: Engine;
  beforeAll(() => {
    engine = createEngine(new NodeTransport({ script: TEST_WORKER, cores: 2 }));
  });
  afterAll(() => engine.close());

  test("a job that never yields is still cancelled: its worker is terminated and replaced", async () => {
    const ac = new AbortController();
    const spin = engine.run("test-spin", { ms: 20_000 }, { signal: ac.signal });
    await new Promise((r) => setTimeout(r, 300));
    const t0 = Date.now();
    ac.abort();
    await expect(spin).rejects.toBeInstanceOf(EngineCancelled);
    expect(Date.now() - t0).toBeLessThan(1500); // see the NNAR test for the bound
    await expect(engine.run("test-echo", { x: 1 })).resolves.toEqual({ x: 1 });
  });

  test("a worker that exits mid-job: that job gets a plain EngineError, the job beside it finishes, the pool goes on", async () => {
    const beside = engine.run<"test-spin", string>("test-spin", { ms: 400 });
    const e = await rejectionOf(engine.run("test-exit", { code: 3 }));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe("The exiting job stopped unexpectedly: the worker thread exited with code 3.");
    await expect(beside).resolves.toMatch(/^spun/);
    await expect(engine.run("test-echo", "still here")).resolves.toBe("still here");
    expect(engine.stats().crashed).toBeGreaterThanOrEqual(1);
  });

  test("an exception that escapes the job (thrown from a timer) is a crash with the first line of its message", async () => {
    const e = await rejectionOf(engine.run("test-uncaught", {}));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe("The escaping job stopped unexpectedly: the worker met an uncaught error (kaboom).");
    await expect(engine.run("test-echo", 2)).resolves.toBe(2);
  });

  test("an exception inside the job is one sentence naming it, no stack trace", async () => {
    const e = await rejectionOf(engine.run("test-throw", {}));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe("The failing job failed inside the engine (matrix is singular).");
  });

  test("an InputError inside a job comes back with its code, sentence and cell", async () => {
    const e = await rejectionOf(engine.run("test-input-error", {}));
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).code).toBe("TOO_FEW_POINTS");
    expect((e as InputError).message).toBe("TBATS needs at least 104 weeks of rates; the data has 30.");
    expect((e as InputError).cell).toEqual({ row: 4, col: 1 });
  });

  test("typed arrays, Dates, NaN and ±Infinity survive the trip", async () => {
    const input = { y: new Float64Array([1, NaN, Infinity, -Infinity, -0]), d: new Date(Date.UTC(2026, 10, 27)), n: null };
    const out = await engine.run<"test-echo", typeof input>("test-echo", input, { cache: false });
    expect(out).toEqual(input);
    expect(Object.is(out.y[4], -0)).toBe(true);
  });

  test("an output that cannot be cloned is refused in a sentence", async () => {
    const e = await rejectionOf(engine.run("test-unclonable", {}));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toMatch(/^The unclonable job finished, but its result could not be copied back from the worker \(/);
  });
});

test("a missing worker script is reported as a sentence, not a stack", async () => {
  const engine = createEngine(new NodeTransport({ script: "/nonexistent/nodeWorker.js" }));
  try {
    const e = await rejectionOf(engine.run("analyse", { series: laneSeries(60), options: {} }));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe(
      "The engine's worker script is missing (/nonexistent/nodeWorker.js); compile src/engine/nodeWorker.ts and pass its path to NodeTransport.",
    );
  } finally {
    engine.close();
  }
});
