/**
 * The in-thread transport: jobs run on the calling thread, for hosts without workers and for
 * tests. Messages are structured-cloned both ways and delivered on later macrotasks, exactly
 * as a worker would see them, so a job behaves the same here as off the thread (an input that
 * cannot be cloned fails the same way, and a caller cannot edit a job's input under it).
 *
 * What it cannot do is stop a job that is computing: the thread is the caller's. Cancelling
 * rejects the caller at once when the thread is free (a queued job, or a job that awaits),
 * and turns the job's `cancelled()` true, which the backtest checks after every origin; a
 * synchronous job that never yields holds the thread until it returns.
 */
import { copyOf } from "./cache";
import type { JobDefinition } from "./jobs";
import type { JobRequest, Transport, WorkerHandle, WorkerReply } from "./protocol";
import { serve } from "./worker";

/**
 * Runs `f` on a later macrotask without setTimeout's clamp (≥ 1 ms in Node, 4 ms for nested
 * timers in browsers), which would otherwise be most of a small job's cost: setImmediate in
 * Node, a MessageChannel in browsers, setTimeout only where neither exists.
 */
function laterFn(): (f: () => void) => void {
  const g = globalThis as {
    setImmediate?: (f: () => void) => unknown;
    MessageChannel?: new () => { port1: { onmessage: (() => void) | null }; port2: { postMessage(m: null): void } };
  };
  if (typeof g.setImmediate === "function") {
    const immediate = g.setImmediate;
    return (f) => void immediate(f);
  }
  if (typeof g.MessageChannel === "function") {
    const queue: (() => void)[] = [];
    const channel = new g.MessageChannel();
    channel.port1.onmessage = () => (queue.shift() as () => void)();
    return (f) => {
      queue.push(f);
      channel.port2.postMessage(null);
    };
  }
  return (f) => void setTimeout(f, 0);
}

const later = laterFn();

export interface InlineTransportOptions {
  /** Pool size (default 1: more would only interleave jobs on the same thread). */
  size?: number;
  /** Job lookup (default: the job table). */
  lookup?: (kind: string) => JobDefinition | undefined;
  minInterval?: number;
}

export class InlineTransport implements Transport {
  readonly name = "inline";
  readonly cores: number;
  private readonly options: InlineTransportOptions;

  constructor(options: InlineTransportOptions = {}) {
    this.options = options;
    this.cores = Math.max(1, options.size ?? 1);
  }

  spawn(): WorkerHandle {
    let alive = true;
    let toHost: ((reply: WorkerReply) => void) | null = null;
    let toLoop: ((request: JobRequest) => void) | null = null;
    const loop = serve(
      {
        postMessage: (reply) => {
          const copy = copyOf(reply); // throws for an output that cannot be cloned, as postMessage does
          later(() => {
            if (alive) toHost?.(copy);
          });
        },
        onMessage: (handler) => {
          toLoop = handler;
        },
      },
      { lookup: this.options.lookup, minInterval: this.options.minInterval },
    );
    return {
      post: (request) => {
        const copy = copyOf(request);
        later(() => {
          if (alive) toLoop?.(copy);
        });
      },
      onMessage: (handler) => {
        toHost = handler;
      },
      onFailure: () => {
        // a job on the caller's thread cannot crash the thread without crashing the caller
      },
      terminate: () => {
        alive = false;
        loop.close();
      },
    };
  }
}
