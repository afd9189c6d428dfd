/** The pool over the in-thread transport: the shipped jobs, progress, errors and cancellation. */
import { analyse } from "../../src/core/analysis";
import type { BacktestRun } from "../../src/core/evaluate/backtest";
import { runWindow } from "../../src/core/evaluate/backtest";
import { getModel } from "../../src/core/models/registry";
import { InputError } from "../../src/core/series/errors";
import { EngineCancelled, EngineError, InlineTransport, createEngine } from "../../src/engine";
import type { Engine } from "../../src/engine";
import { counter } from "./testJobs";
import { expectWellFormedProgress, progressRecorder, rejectionOf, smallPlan, withoutTiming } from "./helpers";
import { laneSeries } from "./lane";

describe("inline transport", () => {
  let engine: Engine;
  beforeEach(() => {
    engine = createEngine(new InlineTransport());
  });
  afterEach(() => engine.close());

  test("analyse returns the same Report as calling analyse() directly (TBATS, 156 weeks, with the checks)", async () => {
    const series = laneSeries(156);
    const options = { method: "tbats", horizon: 8, levels: [80, 95] };
    const progress = progressRecorder();
    const viaEngine = await engine.run("analyse", { series, options }, { onProgress: progress.listener });
    // Deep equality, numbers by Object.is: the engine adds no arithmetic of its own.
    expect(viaEngine).toEqual(analyse(series, options));
    expect(viaEngine.tables.search).toBeDefined();
    expectWellFormedProgress(progress.events);
    expect(progress.events[0].sentence).toBe("Analysing Halden–Corvane FEU with TBATS");
  });

  test("backtest-run through runAll equals runWindow called directly, apart from the milliseconds", async () => {
    const y = laneSeries(120).values;
    const plan = smallPlan(y.length);
    const runs = await engine.runAll(
      plan.methods.map((method) => ({ kind: "backtest-run" as const, input: { y, method, plan, mode: "fixed" as const, window: 0 } })),
    );
    const direct = plan.methods.map((m) => runWindow(y, m, getModel, plan, "fixed", 0));
    expect(runs.map(withoutTiming)).toEqual(direct.map(withoutTiming));
    expect(runs[0].point).toHaveLength(8);
    // A Float64Array (from Node's realm, not jest's: structuredClone made it, so no instanceof).
    expect(Object.prototype.toString.call(runs[0].point[0])).toBe("[object Float64Array]");
  });

  test("progress of a spinning job is monotone, ends at 1, carries sentences and is throttled to ~20 a second", async () => {
    const progress = progressRecorder();
    const out = await engine.run<"test-spin", string>("test-spin", { ms: 300, step: 5 }, { onProgress: progress.listener });
    expectWellFormedProgress(progress.events);
    expect(progress.events[0].sentence).toMatch(/^Spinning: 5 of 300 ms$/);
    // The job made 60 reports; at one message per 50 ms over the time it really took (it can
    // be descheduled on a busy machine, which only lowers the count), plus the closing one.
    const took = Number(/spun (\d+) ms/.exec(out)?.[1]);
    expect(progress.events.length).toBeLessThanOrEqual(Math.ceil(took / 50) + 2);
    expect(progress.events.length).toBeGreaterThanOrEqual(2);
  });

  test("runAll reports combined progress: the mean over its jobs, monotone, ending at 1", async () => {
    const progress = progressRecorder();
    const outs = await engine.runAll<"test-spin", string>(
      [1, 2, 3].map((i) => ({ kind: "test-spin" as const, input: { ms: 100 + i, step: 5 } })),
      { onProgress: progress.listener },
    );
    expect(outs).toHaveLength(3);
    expectWellFormedProgress(progress.events);
    // One job at a time on one thread: after the first finishes the combined share is 1/3.
    expect(progress.events.some((e) => Math.abs(e.fraction - 1 / 3) < 1e-12)).toBe(true);
    expect(progress.events.every((e) => /^Spinning: \d+ of 10[123] ms$/.test(e.sentence))).toBe(true);
  });

  test("an InputError inside a job comes back as an InputError with its code, sentence and cell", async () => {
    const e = await rejectionOf(engine.run("test-input-error", {}));
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).code).toBe("TOO_FEW_POINTS");
    expect((e as InputError).message).toBe("TBATS needs at least 104 weeks of rates; the data has 30.");
    expect((e as InputError).cell).toEqual({ row: 4, col: 1 });
  });

  test("the core's own InputErrors pass through too: a method that does not exist", async () => {
    const e = await rejectionOf(engine.run("analyse", { series: laneSeries(60), options: { method: "prophet" } }));
    expect(e).toBeInstanceOf(InputError);
    expect((e as InputError).code).toBe("BAD_OPTION");
    expect((e as InputError).message).toMatch(/^The method "prophet" is not available; choose one of: /);
  });

  test("other failures are EngineErrors: one sentence naming the job, no stack trace", async () => {
    const e = await rejectionOf(engine.run("test-throw", {}));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe("The failing job failed inside the engine (matrix is singular).");
    const unknown = await rejectionOf(engine.run("no-such-kind", {}));
    expect((unknown as Error).message).toBe('The engine has no job called "no-such-kind".');
    const fn = await rejectionOf(engine.run("test-echo", { f: () => 1 }));
    expect(fn).toBeInstanceOf(EngineError);
    expect((fn as Error).message).toMatch(/^The echo job could not be handed to a worker: its input holds something that cannot be copied/);
    // The engine still works after all three.
    await expect(engine.run("test-echo", { ok: true })).resolves.toEqual({ ok: true });
  });

  test("cancelling a queued job drops it before it starts; the job ahead of it is not disturbed", async () => {
    const before = counter.runs;
    const first = engine.run<"test-spin", string>("test-spin", { ms: 100 });
    const ac = new AbortController();
    const second = engine.run("test-count", { values: new Float64Array([1, 2]) }, { signal: ac.signal });
    ac.abort();
    const e = await rejectionOf(second);
    expect(e).toBeInstanceOf(EngineCancelled);
    expect((e as Error).message).toBe("The counting job was cancelled.");
    await expect(first).resolves.toMatch(/^spun/);
    await new Promise((r) => setTimeout(r, 20));
    expect(counter.runs).toBe(before);
  });

  test("cancelling a job that yields rejects it at once, and the next job runs", async () => {
    const ac = new AbortController();
    const waiting = engine.run("test-wait", { ms: 5000 }, { signal: ac.signal });
    await new Promise((r) => setTimeout(r, 50));
    const t0 = Date.now();
    ac.abort();
    const e = await rejectionOf(waiting);
    expect(Date.now() - t0).toBeLessThan(1500); // at once in fact; the bound only allows for a loaded machine
    expect(e).toBeInstanceOf(EngineCancelled);
    expect(engine.stats().terminated).toBe(1);
    await expect(engine.run("test-echo", [1, 2])).resolves.toEqual([1, 2]);
  });

  test("an already aborted signal rejects without running", async () => {
    const ac = new AbortController();
    ac.abort();
    await expect(engine.run("test-echo", 1, { signal: ac.signal })).rejects.toBeInstanceOf(EngineCancelled);
    expect(engine.stats().started).toBe(0);
  });

  test("identical jobs asked for at once run once; one caller leaving does not cancel the other", async () => {
    const before = counter.runs;
    const input = { values: new Float64Array([1, 2, 3]) };
    const ac = new AbortController();
    const a = engine.run("test-count", input, { signal: ac.signal });
    const b = engine.run("test-count", input);
    ac.abort();
    await expect(a).rejects.toBeInstanceOf(EngineCancelled);
    await expect(b).resolves.toBe(6);
    expect(counter.runs - before).toBe(1);
    expect(engine.stats().joined).toBe(1);
  });

  test("close() rejects what is left with EngineCancelled, and later jobs with an EngineError", async () => {
    const pending = engine.run("test-spin", { ms: 50 });
    engine.close();
    await expect(pending).rejects.toBeInstanceOf(EngineCancelled);
    const e = await rejectionOf(engine.run("test-echo", 1));
    expect(e).toBeInstanceOf(EngineError);
    expect((e as Error).message).toBe("The echo job was not started: the engine is closed.");
  });

  test("determinism: two runs of the same backtest give identical outputs", async () => {
    const y = laneSeries(120).values;
    const plan = { ...smallPlan(y.length), methods: ["nnar"] };
    const input = { y, method: "nnar", plan, mode: "fixed" as const, window: 0 };
    const a: BacktestRun = await engine.run("backtest-run", input, { cache: false });
    const b: BacktestRun = await engine.run("backtest-run", input, { cache: false });
    expect(engine.stats().started).toBe(2);
    expect(withoutTiming(a)).toEqual(withoutTiming(b));
    expect(a.failure).toBeNull();
  });
});
