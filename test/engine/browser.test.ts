/**
 * The browser transport's glue, with a stand-in for Web Worker (jest runs in Node): the
 * stand-in runs serveBrowserWorker() on a fake worker scope in this thread and passes
 * structured clones both ways on later macrotasks, as a real worker would.
 */
import { analyse } from "../../src/core/analysis";
import { BrowserTransport, EngineCancelled, EngineError, browserCores, createEngine } from "../../src/engine";
import type { WorkerEventLike, WorkerLike } from "../../src/engine/browser";
import { serveBrowserWorker } from "../../src/engine/browser";
import type { ServeHandle } from "../../src/engine/worker";
import { expectWellFormedProgress, progressRecorder, rejectionOf } from "./helpers";
import { laneSeries } from "./lane";
import "./testJobs";

type Listener = (event: WorkerEventLike) => void;

class FakeWorker implements WorkerLike {
  static made: FakeWorker[] = [];
  terminated = false;
  readonly url: string | URL;
  private hostListeners = new Map<string, Listener[]>();
  private scopeListeners: Listener[] = [];
  private loop: ServeHandle;

  constructor(url: string | URL) {
    this.url = url;
    FakeWorker.made.push(this);
    this.loop = serveBrowserWorker({
      postMessage: (m) => {
        const data = structuredClone(m);
        setTimeout(() => !this.terminated && this.emit("message", { data }), 0);
      },
      addEventListener: (_type, listener) => this.scopeListeners.push(listener),
    });
  }

  postMessage(m: unknown): void {
    const data = structuredClone(m);
    setTimeout(() => !this.terminated && this.scopeListeners.forEach((l) => l({ data })), 0);
  }

  addEventListener(type: string, listener: Listener): void {
    this.hostListeners.set(type, [...(this.hostListeners.get(type) ?? []), listener]);
  }

  terminate(): void {
    this.terminated = true;
    this.loop.close(); // what ending the thread does to the job: it stops
  }

  /** What the browser does when an exception escapes the worker's code. */
  crash(message: string): void {
    this.emit("error", { message, preventDefault: () => undefined });
  }

  private emit(type: string, event: WorkerEventLike): void {
    for (const l of this.hostListeners.get(type) ?? []) l(event);
  }
}

const transport = (cores = 2): BrowserTransport =>
  new BrowserTransport("https://localhost:3000/engine-worker.js", { cores, createWorker: (url) => new FakeWorker(url) });

describe("browser transport (stand-in Worker)", () => {
  beforeEach(() => {
    FakeWorker.made = [];
  });

  test("runs analyse through the worker scope and returns the Report analyse() gives here", async () => {
    const engine = createEngine(transport());
    try {
      const series = laneSeries(120);
      const options = { method: "lastyear", horizon: 6 };
      const progress = progressRecorder();
      const report = await engine.run("analyse", { series, options }, { onProgress: progress.listener });
      expect(report).toEqual(analyse(series, options));
      expectWellFormedProgress(progress.events);
      expect(FakeWorker.made[0].url).toBe("https://localhost:3000/engine-worker.js");
    } finally {
      engine.close();
    }
  });

  test("cancelling terminates the Web Worker and the next job gets a fresh one", async () => {
    const engine = createEngine(transport(1));
    try {
      const ac = new AbortController();
      const waiting = engine.run("test-wait", { ms: 5000 }, { signal: ac.signal });
      await new Promise((r) => setTimeout(r, 30));
      ac.abort();
      await expect(waiting).rejects.toBeInstanceOf(EngineCancelled);
      expect(FakeWorker.made[0].terminated).toBe(true);
      await expect(engine.run("test-echo", "next")).resolves.toBe("next");
      expect(FakeWorker.made.length).toBe(2);
    } finally {
      engine.close();
    }
  });

  test("an error event mid-job fails that job with a plain sentence; the pool replaces the worker", async () => {
    const engine = createEngine(transport(1));
    try {
      const waiting = engine.run("test-wait", { ms: 5000 });
      await new Promise((r) => setTimeout(r, 30));
      FakeWorker.made[0].crash("Out of memory");
      const e = await rejectionOf(waiting);
      expect(e).toBeInstanceOf(EngineError);
      expect((e as Error).message).toBe("The waiting job stopped unexpectedly: the worker met an uncaught error (Out of memory).");
      await expect(engine.run("test-echo", 3)).resolves.toBe(3);
    } finally {
      engine.close();
    }
  });

  test("the pool size is navigator.hardwareConcurrency, at least 1", () => {
    const g = globalThis as { navigator?: unknown };
    const saved = Object.getOwnPropertyDescriptor(globalThis, "navigator");
    try {
      Object.defineProperty(globalThis, "navigator", { value: { hardwareConcurrency: 6 }, configurable: true });
      expect(browserCores()).toBe(6);
      expect(createEngine(new BrowserTransport("w.js")).size).toBe(6);
      Object.defineProperty(globalThis, "navigator", { value: {}, configurable: true });
      expect(browserCores()).toBe(1);
    } finally {
      if (saved) Object.defineProperty(globalThis, "navigator", saved);
      else delete g.navigator;
    }
  });
});
