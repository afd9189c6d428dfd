/**
 * The worker side, transport-agnostic: reads {id, kind, input} from a Port, runs the job from
 * the job table, and answers with progress, then done or error.
 *
 * - Progress is throttled to one message per `minInterval` ms (default 50, i.e. at most ~20 a
 *   second); the fraction is clamped to [0, 1] and never goes down. When the job ends, the
 *   latest fraction-1 report held back by the throttle is sent, or one is made up, so every
 *   successful job's progress ends at exactly 1 just before its result.
 * - An InputError keeps its code, sentence and cell. Anything else becomes one sentence
 *   naming the job and quoting the first line of the message, never a stack trace.
 * - Jobs run one at a time in arrival order (the pool only sends one at a time anyway).
 */
import { isInputError } from "../core/series/errors";
import { capitalise, plainReason, theJob } from "./errors";
import { findJob, jobTitle } from "./jobs";
import type { JobDefinition } from "./jobs";
import type { JobRequest, Port, WorkerReply } from "./protocol";

export interface ServeOptions {
  /** Where kinds are looked up (default: the job table in jobs.ts). */
  lookup?: (kind: string) => JobDefinition | undefined;
  /** Least time between two progress messages, in ms (default 50). */
  minInterval?: number;
  /** Clock in ms (default performance.now, or Date.now). */
  now?: () => number;
}

export interface ServeHandle {
  /** Stops answering: the running job's cancelled() turns true and nothing more is posted. */
  close(): void;
}

export const PROGRESS_INTERVAL_MS = 50;

function defaultNow(): () => number {
  const perf = (globalThis as { performance?: { now(): number } }).performance;
  return perf ? () => perf.now() : () => Date.now();
}

export function serve(port: Port, options: ServeOptions = {}): ServeHandle {
  const lookup = options.lookup ?? findJob;
  const minInterval = options.minInterval ?? PROGRESS_INTERVAL_MS;
  const now = options.now ?? defaultNow();
  const queue: JobRequest[] = [];
  let busy = false;
  let closed = false;

  const post = (reply: WorkerReply): void => {
    if (!closed) port.postMessage(reply);
  };

  async function runOne(request: JobRequest): Promise<void> {
    const { id, kind, input } = request;
    const def = lookup(kind);
    if (!def) {
      post({ id, type: "error", message: `The engine has no job called "${kind}".` });
      return;
    }
    const title = jobTitleFrom(def, kind, input);
    let lastPostAt = -Infinity;
    let fractionSoFar = 0;
    let posted: { fraction: number; sentence: string } | null = null;
    let held: { fraction: number; sentence: string } | null = null;
    const ctx = {
      progress(fraction: number, sentence: string): void {
        let f = Number.isFinite(fraction) ? Math.min(1, Math.max(0, fraction)) : fractionSoFar;
        if (f < fractionSoFar) f = fractionSoFar;
        fractionSoFar = f;
        const report = { fraction: f, sentence: String(sentence) };
        const t = now();
        if (t - lastPostAt >= minInterval) {
          lastPostAt = t;
          held = null;
          posted = report;
          post({ id, type: "progress", ...report });
        } else {
          held = report;
        }
      },
      cancelled: (): boolean => closed,
    };
    let output: unknown;
    try {
      output = await def.run(input, ctx);
    } catch (e) {
      post(errorReply(id, title, e));
      return;
    }
    // Close the progress at exactly 1: a held-back report of 1, else a sentence of our own.
    const last = held as { fraction: number; sentence: string } | null;
    const sent = posted as { fraction: number; sentence: string } | null;
    if (last !== null && last.fraction === 1) post({ id, type: "progress", ...last });
    else if (sent === null || sent.fraction !== 1) post({ id, type: "progress", fraction: 1, sentence: `${capitalise(title)}: done` });
    try {
      post({ id, type: "done", output });
    } catch (e) {
      post({
        id,
        type: "error",
        message: `${theJob(title)} finished, but its result could not be copied back from the worker (${plainReason(e)}).`,
      });
    }
  }

  async function drain(): Promise<void> {
    if (busy) return;
    busy = true;
    while (queue.length > 0 && !closed) {
      const next = queue.shift() as JobRequest;
      await runOne(next);
    }
    busy = false;
  }

  port.onMessage((message) => {
    if (closed) return;
    if (!message || typeof message.id !== "number" || typeof message.kind !== "string") return;
    queue.push(message);
    void drain();
  });

  return {
    close(): void {
      closed = true;
      queue.length = 0;
    },
  };
}

function jobTitleFrom(def: JobDefinition, kind: string, input: unknown): string {
  // jobTitle guards against a throwing title(); a lookup outside the table is guarded here.
  if (findJob(kind) === def) return jobTitle(kind, input);
  try {
    const t = def.title?.(input);
    if (typeof t === "string" && t.length > 0) return t;
  } catch {
    // fall through
  }
  return `"${kind}" job`;
}

function errorReply(id: number, title: string, e: unknown): WorkerReply {
  if (isInputError(e)) {
    const reply: WorkerReply = { id, type: "error", message: e.message, code: e.code };
    if (e.cell) reply.cell = { row: e.cell.row, col: e.cell.col };
    return reply;
  }
  return { id, type: "error", message: `${theJob(title)} failed inside the engine (${plainReason(e)}).` };
}
