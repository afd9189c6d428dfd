/**
 * A pool of workers over any transport, with a queue, progress, cancellation, crash recovery
 * and the result cache in front.
 *
 * - Size: the transport's core count unless given, at least 1. Workers start on demand.
 * - run(): a cache hit resolves at once (no worker is involved). Otherwise an identical job
 *   already queued or running is joined rather than started twice (worksheet recalculation
 *   asks for the same analysis from several cells at once); else the job is queued.
 * - Cancellation: aborting a caller's signal rejects that caller with EngineCancelled at once.
 *   When no caller is left, a queued job is dropped and a running one's worker is terminated
 *   (busy or not) and replaced, so cancelling never waits on the job.
 * - A worker that crashes or exits mid-job rejects that job with an EngineError sentence
 *   ("The TBATS backtest stopped unexpectedly: …"); the next job gets a fresh worker and the
 *   other jobs go on. An InputError from a job comes back as an InputError with its code.
 */
import { InputError } from "../core/series/errors";
import type { Engine, EngineOptions, EngineStats, InputOf, JobSpec, OutputOf, ProgressListener, RunAllOptions, RunOptions } from "./api";
import { ResultCache, copyOf } from "./cache";
import { EngineCancelled, EngineError, capitalise, plainReason, theJob } from "./errors";
import { UnhashableInput, jobKey } from "./hash";
import { jobTitle } from "./jobs";
import type { JobRequest, Transport, WorkerHandle, WorkerReply } from "./protocol";

interface Subscriber {
  resolve(value: unknown): void;
  reject(error: unknown): void;
  onProgress?: ProgressListener;
  detach(): void;
}

interface Task {
  id: number;
  kind: string;
  input: unknown;
  key: string | null;
  title: string;
  subs: Set<Subscriber>;
  slot: Slot | null;
  fraction: number;
  sentence: string | null;
}

interface Slot {
  handle: WorkerHandle;
  task: Task | null;
  alive: boolean;
}

/**
 * Calls a caller's progress listener. A listener that throws (a pane bug) must not take the
 * worker's message handler with it, which in Node would be an uncaught exception in the
 * caller's process; its error is dropped.
 */
function tell(listener: ProgressListener | undefined, fraction: number, sentence: string): void {
  if (!listener) return;
  try {
    listener(fraction, sentence);
  } catch {
    // see above
  }
}

function cancelledError(title: string, why = ""): EngineCancelled {
  return new EngineCancelled(`${theJob(title)} was cancelled${why}.`);
}

export class Pool implements Engine {
  readonly size: number;
  private readonly transport: Transport;
  private readonly cache: ResultCache | null;
  private readonly slots: Slot[] = [];
  private readonly queue: Task[] = [];
  private readonly inflight = new Map<string, Task>();
  private nextId = 1;
  private closed = false;
  private counts = { started: 0, joined: 0, terminated: 0, crashed: 0 };

  constructor(transport: Transport, options: EngineOptions = {}) {
    this.transport = transport;
    const size = options.size ?? transport.cores;
    this.size = Math.max(1, Math.floor(Number.isFinite(size) ? size : 1));
    this.cache = options.cache === false ? null : (options.cache ?? new ResultCache(options.cacheEntries));
  }

  run<K extends string, O = OutputOf<K>>(kind: K, input: InputOf<K>, options: RunOptions = {}): Promise<O> {
    try {
      return this.submit(kind, input, options) as Promise<O>;
    } catch (e) {
      return Promise.reject(e);
    }
  }

  private submit(kind: string, input: unknown, options: RunOptions): Promise<unknown> {
    const title = jobTitle(kind, input);
    if (this.closed) return Promise.reject(new EngineError(`${theJob(title)} was not started: the engine is closed.`));
    const signal = options.signal;
    if (signal?.aborted) return Promise.reject(cancelledError(title));
    let key: string | null = null;
    if (this.cache && options.cache !== false) {
      try {
        key = jobKey(kind, input);
      } catch (e) {
        if (!(e instanceof UnhashableInput)) throw e;
      }
      if (key !== null) {
        const hit = this.cache.get(key);
        if (hit) {
          // Progress still ends at 1 for every job that succeeds, hit or not.
          tell(options.onProgress, 1, `${capitalise(title)}: reused from an earlier run`);
          return Promise.resolve(hit.value);
        }
      }
    }
    return new Promise((resolve, reject) => {
      let task = key !== null ? this.inflight.get(key) : undefined;
      if (task) {
        this.counts.joined++;
      } else {
        task = { id: this.nextId++, kind, input, key, title, subs: new Set(), slot: null, fraction: 0, sentence: null };
        if (key !== null) this.inflight.set(key, task);
        this.queue.push(task);
      }
      const t = task;
      let onAbort: (() => void) | null = null;
      const sub: Subscriber = {
        resolve,
        reject,
        onProgress: options.onProgress,
        detach: () => {
          if (onAbort && signal) signal.removeEventListener("abort", onAbort);
        },
      };
      t.subs.add(sub);
      if (signal) {
        onAbort = () => this.abandon(t, sub);
        signal.addEventListener("abort", onAbort, { once: true });
      }
      if (t.sentence !== null) tell(sub.onProgress, t.fraction, t.sentence);
      this.pump();
    });
  }

  runAll<K extends string, O = OutputOf<K>>(jobs: ReadonlyArray<JobSpec<K, InputOf<K>>>, options: RunAllOptions = {}): Promise<O[]> {
    const inner = new AbortController();
    const onOuterAbort = (): void => inner.abort();
    if (options.signal?.aborted) inner.abort();
    else options.signal?.addEventListener("abort", onOuterAbort, { once: true });
    const runs = this.spread(jobs, options, inner.signal);
    const all = Promise.all(
      runs.map((p) =>
        p.catch((e) => {
          inner.abort(); // the first failure cancels the rest; their EngineCancelled is not reported
          throw e;
        }),
      ),
    );
    return all.finally(() => options.signal?.removeEventListener("abort", onOuterAbort)) as Promise<O[]>;
  }

  runAllSettled<K extends string, O = OutputOf<K>>(
    jobs: ReadonlyArray<JobSpec<K, InputOf<K>>>,
    options: RunAllOptions = {},
  ): Promise<PromiseSettledResult<O>[]> {
    return Promise.allSettled(this.spread(jobs, options, options.signal)) as Promise<PromiseSettledResult<O>[]>;
  }

  /** Starts every job and wires the combined progress. */
  private spread(jobs: ReadonlyArray<JobSpec>, options: RunAllOptions, signal: AbortSignal | undefined): Promise<unknown>[] {
    const n = jobs.length;
    const share = new Float64Array(n);
    let shown = 0;
    let latest = "";
    let done = 0;
    const report = (): void => {
      if (!options.onProgress) return;
      let sum = 0;
      for (let i = 0; i < n; i++) sum += share[i];
      const f = done === n ? 1 : Math.min(1, sum / n);
      if (f < shown) return;
      shown = f;
      tell(options.onProgress, f, latest || `${done} of ${n} jobs done`);
    };
    return jobs.map((job, i) =>
      this.run(job.kind, job.input, {
        signal,
        cache: options.cache,
        onProgress: (f, s) => {
          share[i] = f;
          latest = s;
          report();
        },
      }).then((out) => {
        share[i] = 1;
        done++;
        report();
        return out;
      }),
    );
  }

  stats(): EngineStats {
    return {
      transport: this.transport.name,
      size: this.size,
      workers: this.slots.length,
      busy: this.slots.filter((s) => s.task !== null).length,
      queued: this.queue.length,
      ...this.counts,
      cache: this.cache ? this.cache.stats() : null,
    };
  }

  close(): void {
    if (this.closed) return;
    this.closed = true;
    const tasks = [...this.queue, ...this.slots.map((s) => s.task).filter((t): t is Task => t !== null)];
    this.queue.length = 0;
    for (const slot of this.slots.splice(0)) {
      slot.alive = false;
      slot.handle.terminate();
    }
    for (const t of tasks) this.settle(t, { error: cancelledError(t.title, ": the engine was closed") });
  }

  // ---- internals ----

  private pump(): void {
    while (!this.closed && this.queue.length > 0) {
      let slot = this.slots.find((s) => s.task === null);
      if (!slot) {
        if (this.slots.length >= this.size) return;
        const task = this.queue[0];
        try {
          slot = this.spawn();
        } catch (e) {
          this.queue.shift();
          this.settle(task, { error: e instanceof EngineError ? e : new EngineError(`${theJob(task.title)} could not start a worker (${plainReason(e)}).`) });
          continue;
        }
      }
      this.start(slot, this.queue.shift() as Task);
    }
  }

  private spawn(): Slot {
    const handle = this.transport.spawn();
    const slot: Slot = { handle, task: null, alive: true };
    handle.onMessage((reply) => this.onReply(slot, reply));
    handle.onFailure((reason) => this.onFailure(slot, reason));
    this.slots.push(slot);
    return slot;
  }

  private start(slot: Slot, task: Task): void {
    const request: JobRequest = { id: task.id, kind: task.kind, input: task.input };
    try {
      slot.handle.post(request);
    } catch (e) {
      this.settle(task, {
        error: new EngineError(`${theJob(task.title)} could not be handed to a worker: its input holds something that cannot be copied (${plainReason(e)}).`),
      });
      return;
    }
    slot.task = task;
    task.slot = slot;
    task.input = undefined; // the worker has its copy
    this.counts.started++;
  }

  private onReply(slot: Slot, reply: WorkerReply): void {
    const task = slot.task;
    if (!slot.alive || !task || reply.id !== task.id) return;
    if (reply.type === "progress") {
      const f = Math.max(task.fraction, Math.min(1, reply.fraction));
      task.fraction = f;
      task.sentence = reply.sentence;
      for (const s of task.subs) tell(s.onProgress, f, reply.sentence);
      return;
    }
    slot.task = null;
    task.slot = null;
    if (reply.type === "done") {
      this.settle(task, { output: reply.output });
    } else {
      const error = reply.code !== undefined ? new InputError(reply.code, reply.message, reply.cell) : new EngineError(reply.message);
      this.settle(task, { error });
    }
    this.pump();
  }

  private onFailure(slot: Slot, reason: string): void {
    if (!slot.alive) return;
    this.retire(slot);
    // A Web Worker outlives an uncaught error; a worker the pool has given up on is ended.
    slot.handle.terminate();
    this.counts.crashed++;
    const task = slot.task;
    slot.task = null;
    if (task) {
      task.slot = null;
      this.settle(task, { error: new EngineError(`${theJob(task.title)} stopped unexpectedly: ${reason}.`) });
    }
    // No eager replacement here: a script that dies on loading would otherwise respawn for
    // ever. The next queued job starts a fresh worker (pump).
    this.pump();
  }

  /** A caller gave up; when it was the last one, the job goes too. */
  private abandon(task: Task, sub: Subscriber): void {
    if (!task.subs.delete(sub)) return;
    sub.detach();
    sub.reject(cancelledError(task.title));
    if (task.subs.size > 0) return;
    if (task.key !== null && this.inflight.get(task.key) === task) this.inflight.delete(task.key);
    const slot = task.slot;
    if (slot === null) {
      const i = this.queue.indexOf(task);
      if (i >= 0) this.queue.splice(i, 1);
      return;
    }
    task.slot = null;
    slot.task = null;
    this.retire(slot);
    slot.handle.terminate();
    this.counts.terminated++;
    this.replace();
    this.pump();
  }

  private retire(slot: Slot): void {
    slot.alive = false;
    const i = this.slots.indexOf(slot);
    if (i >= 0) this.slots.splice(i, 1);
  }

  /** Starts a fresh worker in place of one terminated for a cancel, so the next job finds it warm. */
  private replace(): void {
    if (this.closed || this.slots.length >= this.size) return;
    try {
      this.spawn();
    } catch {
      // pump() reports a worker that cannot start to the job that needs it
    }
  }

  private settle(task: Task, result: { output: unknown } | { error: unknown }): void {
    if (task.key !== null && this.inflight.get(task.key) === task) this.inflight.delete(task.key);
    const subs = [...task.subs];
    task.subs.clear();
    if ("error" in result) {
      for (const s of subs) {
        s.detach();
        s.reject(result.error);
      }
      return;
    }
    if (this.cache && task.key !== null) this.cache.set(task.key, result.output);
    subs.forEach((s, i) => {
      s.detach();
      s.resolve(i === 0 ? result.output : copyOf(result.output));
    });
  }
}
