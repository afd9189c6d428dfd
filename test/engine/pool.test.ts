/** Pool behaviour that does not depend on a real transport: size, spreading, failures, runAll. */
import { EngineCancelled, EngineError, InlineTransport, createEngine } from "../../src/engine";
import type { Transport, WorkerHandle } from "../../src/engine";
import { expectWellFormedProgress, progressRecorder } from "./helpers";
import "./testJobs";

/** Workers that die as soon as they are given a job, as a script that fails to load does. */
function brokenTransport(): Transport & { spawned: number } {
  const t = {
    name: "broken",
    cores: 2,
    spawned: 0,
    spawn(): WorkerHandle {
      t.spawned++;
      let fail: (reason: string) => void = () => undefined;
      return {
        post: () => void setTimeout(() => fail("the worker thread exited with code 1"), 0),
        onMessage: () => undefined,
        onFailure: (h) => {
          fail = h;
        },
        terminate: () => undefined,
      };
    },
  };
  return t;
}

describe("pool", () => {
  test("size: the transport's cores unless given, never below 1", () => {
    expect(createEngine(new InlineTransport({ size: 3 })).size).toBe(3);
    expect(createEngine(new InlineTransport({ size: 3 }), { size: 0 }).size).toBe(1);
    expect(createEngine(new InlineTransport(), { size: 2.7 }).size).toBe(2);
  });

  test("jobs are spread over the workers, and no more workers start than the size", async () => {
    const engine = createEngine(new InlineTransport({ size: 2 }));
    try {
      const runs = [1, 2, 3, 4, 5].map((i) => engine.run("test-echo", i, { cache: false }));
      expect(engine.stats()).toMatchObject({ workers: 2, busy: 2, queued: 3 });
      expect(await Promise.all(runs)).toEqual([1, 2, 3, 4, 5]);
      expect(engine.stats()).toMatchObject({ workers: 2, busy: 0, queued: 0, started: 5 });
    } finally {
      engine.close();
    }
  });

  test("workers that die on every job fail each job in a sentence, without respawning in a loop", async () => {
    const transport = brokenTransport();
    const engine = createEngine(transport);
    try {
      const results = await engine.runAllSettled([1, 2, 3].map((i) => ({ kind: "test-echo", input: i })));
      expect(results.map((r) => r.status)).toEqual(["rejected", "rejected", "rejected"]);
      const reason = (results[0] as PromiseRejectedResult).reason as Error;
      expect(reason).toBeInstanceOf(EngineError);
      expect(reason.message).toBe("The echo job stopped unexpectedly: the worker thread exited with code 1.");
      await new Promise((r) => setTimeout(r, 20));
      expect(transport.spawned).toBe(3); // one per job, none while idle
      expect(engine.stats().crashed).toBe(3);
    } finally {
      engine.close();
    }
  });

  test("runAllSettled keeps the results of the jobs that succeeded beside one that failed", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      const results = await engine.runAllSettled<string>([
        { kind: "test-echo", input: "a" },
        { kind: "test-throw", input: {} },
        { kind: "test-echo", input: "c" },
      ]);
      expect(results.map((r) => r.status)).toEqual(["fulfilled", "rejected", "fulfilled"]);
      expect((results[2] as PromiseFulfilledResult<unknown>).value).toBe("c");
    } finally {
      engine.close();
    }
  });

  test("runAll rejects with the first failure and cancels the jobs not yet done", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      const failure = engine.runAll<string>([
        { kind: "test-throw", input: {} },
        { kind: "test-wait", input: { ms: 5000 } },
        { kind: "test-echo", input: "never" },
      ]);
      await expect(failure).rejects.toThrow("The failing job failed inside the engine (matrix is singular).");
      expect(engine.stats()).toMatchObject({ busy: 0, queued: 0 });
    } finally {
      engine.close();
    }
  });

  test("runAll with a signal: aborting rejects with EngineCancelled", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      const ac = new AbortController();
      const all = engine.runAll([{ kind: "test-wait", input: { ms: 5000 } }, { kind: "test-wait", input: { ms: 10 } }], { signal: ac.signal });
      setTimeout(() => ac.abort(), 20);
      await expect(all).rejects.toBeInstanceOf(EngineCancelled);
    } finally {
      engine.close();
    }
  });

  test("a cache hit still reports progress 1 with a sentence, so every success ends its progress at 1", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      await engine.run("test-echo", { a: 1 });
      const progress = progressRecorder();
      await engine.run("test-echo", { a: 1 }, { onProgress: progress.listener });
      expect(progress.events).toEqual([{ fraction: 1, sentence: "Echo job: reused from an earlier run" }]);
      const combined = progressRecorder();
      await engine.runAll([{ kind: "test-echo", input: { a: 1 } }, { kind: "test-echo", input: { a: 2 } }], { onProgress: combined.listener });
      expectWellFormedProgress(combined.events);
    } finally {
      engine.close();
    }
  });
});
