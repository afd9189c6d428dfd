/**
 * What passes between the pool and a worker, and the two seams every transport fills:
 * the worker side sees a `Port`, the pool sees a `WorkerHandle` per worker from a `Transport`.
 * Messages are structured-cloned (postMessage), so inputs and outputs are plain data: objects,
 * arrays, typed arrays, Dates, numbers (NaN and ±Infinity survive), strings, booleans, null.
 */
import type { CellOffset, InputErrorCode } from "../core/series/errors";

/** Pool → worker: run one job. */
export interface JobRequest {
  id: number;
  kind: string;
  input: unknown;
}

export interface ProgressReply {
  id: number;
  type: "progress";
  /** Share of the job done, 0–1, never decreasing within a job. */
  fraction: number;
  sentence: string;
}

export interface DoneReply {
  id: number;
  type: "done";
  output: unknown;
}

export interface ErrorReply {
  id: number;
  type: "error";
  /** A plain sentence: the InputError's own, or one naming the job. Never a stack trace. */
  message: string;
  /** Present when the job met an InputError; the pool rebuilds it with this code. */
  code?: InputErrorCode;
  cell?: CellOffset;
}

/** Worker → pool. */
export type WorkerReply = ProgressReply | DoneReply | ErrorReply;

/** The worker side's view of its channel (a worker_threads parentPort, a Web Worker's self, …). */
export interface Port {
  postMessage(message: WorkerReply): void;
  onMessage(handler: (message: JobRequest) => void): void;
}

/** The pool's view of one worker. */
export interface WorkerHandle {
  /** Hands a job over; throws (as postMessage does) when the input cannot be cloned. */
  post(request: JobRequest): void;
  onMessage(handler: (reply: WorkerReply) => void): void;
  /** The worker died on its own (crash, exit, unreadable message): a plain reason, no stack. */
  onFailure(handler: (reason: string) => void): void;
  /**
   * Stops the worker now, busy or not. No message or failure is reported after this. May
   * return a promise that settles when the worker has really stopped (Node does).
   */
  terminate(): void | Promise<void>;
}

/** Makes workers of one kind. */
export interface Transport {
  /** For messages and stats: "worker_threads", "web worker", "inline". */
  readonly name: string;
  /** The pool's default size: the machine's cores as the host reports them (at least 1). */
  readonly cores: number;
  spawn(): WorkerHandle;
}

/**
 * The bookkeeping every transport's WorkerHandle shares: the pool's handlers, and a failure
 * or a termination reported at most once, after which replies are dropped. A transport feeds
 * `deliver` and `fail` from its worker's events and supplies how to post and to stop.
 */
export function handleFor(
  post: (request: JobRequest) => void,
  stop: () => void | Promise<void>,
): { handle: WorkerHandle; deliver: (reply: WorkerReply) => void; fail: (reason: string) => void } {
  let onReply: ((reply: WorkerReply) => void) | null = null;
  let onFailure: ((reason: string) => void) | null = null;
  let over = false;
  return {
    handle: {
      post,
      onMessage: (handler) => {
        onReply = handler;
      },
      onFailure: (handler) => {
        onFailure = handler;
      },
      terminate: () => {
        over = true;
        return stop();
      },
    },
    deliver: (reply) => {
      if (!over) onReply?.(reply);
    },
    fail: (reason) => {
      if (over) return;
      over = true;
      onFailure?.(reason);
    },
  };
}
