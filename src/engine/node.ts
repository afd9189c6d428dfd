/**
 * The Node transport (batch runner, tests): one worker_threads Worker per pool slot. This is
 * the only module that imports worker_threads; the worker side is `serveWorkerThread()`,
 * which the entry script `nodeWorker.ts` calls.
 *
 * Where the worker script is. A Worker runs JavaScript, so the entry must be compiled:
 * - tsc builds (the batch runner, `npm run bench`): nodeWorker.js lands beside this file's
 *   node.js, which is the default (`defaultWorkerScript()`), so nothing needs passing.
 * - jest: test/engine/globalSetup.ts compiles the entry and its imports into
 *   build/engine-test/ and the tests pass `new NodeTransport({ script })`.
 * - a webpack bundle for Node: make `src/engine/nodeWorker.ts` an entry of its own (target
 *   "node", `node: { __dirname: false }`), e.g. engine-worker.js beside the runner's bundle,
 *   and pass `script: path.join(__dirname, "engine-worker.js")`.
 * A worker script built with extra `registerJob` calls (as the tests' own entry is) serves
 * those kinds too.
 *
 * Idle workers are unref'd, so a runner that forgets close() still exits; close() is still
 * the way to end them.
 */
import { existsSync } from "fs";
import { availableParallelism, cpus } from "os";
import { join } from "path";
import { Worker, isMainThread, parentPort } from "worker_threads";
import type { ResourceLimits } from "worker_threads";
import { EngineError, plainReason } from "./errors";
import { handleFor, type JobRequest, type Transport, type WorkerHandle, type WorkerReply } from "./protocol";
import { serve } from "./worker";
import type { ServeOptions } from "./worker";

export const NODE_WORKER_FILE = "nodeWorker.js";

export interface NodeTransportOptions {
  /** Path of the compiled worker entry (default: nodeWorker.js beside this module). */
  script?: string;
  /** Pool size to suggest instead of the core count. */
  cores?: number;
  /** Per-worker heap limits (a runaway job then dies as a crash, not the process). */
  resourceLimits?: ResourceLimits;
}

/** nodeWorker.js next to this module, as a tsc build lays it out. */
export function defaultWorkerScript(): string {
  return join(__dirname, NODE_WORKER_FILE);
}

export function nodeCores(): number {
  const n = typeof availableParallelism === "function" ? availableParallelism() : cpus().length;
  return Math.max(1, n || 1);
}

export class NodeTransport implements Transport {
  readonly name = "worker_threads";
  readonly cores: number;
  readonly script: string;
  private readonly resourceLimits?: ResourceLimits;

  constructor(options: NodeTransportOptions = {}) {
    this.script = options.script ?? defaultWorkerScript();
    this.cores = Math.max(1, options.cores ?? nodeCores());
    this.resourceLimits = options.resourceLimits;
  }

  spawn(): WorkerHandle {
    if (!existsSync(this.script)) {
      throw new EngineError(
        `The engine's worker script is missing (${this.script}); compile src/engine/nodeWorker.ts and pass its path to NodeTransport.`,
      );
    }
    const worker = new Worker(this.script, { resourceLimits: this.resourceLimits });
    worker.unref();
    const { handle, deliver, fail } = handleFor(
      (request: JobRequest) => {
        worker.postMessage(request);
        worker.ref();
      },
      () =>
        worker.terminate().then(
          () => undefined,
          () => undefined,
        ),
    );
    worker.on("message", (reply: WorkerReply) => {
      if (reply.type !== "progress") worker.unref();
      deliver(reply);
    });
    worker.on("error", (e) => fail(`the worker met an uncaught error (${plainReason(e)})`));
    worker.on("messageerror", (e) => fail(`a message from the worker could not be read (${plainReason(e)})`));
    worker.on("exit", (code) => fail(`the worker thread exited with code ${code}`));
    return handle;
  }
}

/** The worker side: serves jobs on this thread's parentPort. Call it from the entry script. */
export function serveWorkerThread(options: ServeOptions = {}): void {
  if (isMainThread || !parentPort) throw new Error("serveWorkerThread() runs inside a worker thread");
  const port = parentPort;
  serve(
    {
      postMessage: (reply) => port.postMessage(reply),
      onMessage: (handler) => {
        port.on("message", handler);
      },
    },
    options,
  );
}
