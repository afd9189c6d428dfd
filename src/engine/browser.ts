/**
 * The browser transport (pane and worksheet functions in the shared runtime): one Web Worker
 * per pool slot. The worker script is a bundle of `browserWorker.ts`; its URL comes from the
 * page's build (webpack), so the constructor takes it.
 *
 * A Web Worker reports an uncaught error ("error" event) and unreadable messages
 * ("messageerror"); both fail the job as a crash. Browsers have no exit event: a worker that
 * closes itself mid-job is not noticed (the jobs here never call close()).
 */
import { handleFor, type JobRequest, type Port, type Transport, type WorkerHandle, type WorkerReply } from "./protocol";
import { serve } from "./worker";
import type { ServeHandle, ServeOptions } from "./worker";

/** The parts of a MessageEvent / ErrorEvent the transport reads. */
export interface WorkerEventLike {
  data?: unknown;
  message?: string;
  preventDefault?(): void;
}

/** The part of a Worker the transport uses (a test can hand in a stand-in). */
export interface WorkerLike {
  postMessage(message: unknown): void;
  addEventListener(type: "message" | "error" | "messageerror", listener: (event: WorkerEventLike) => void): void;
  terminate(): void;
}

export interface BrowserTransportOptions {
  /** "module" for an ES-module worker bundle (default "classic"). */
  type?: "classic" | "module";
  /** Name shown in the browser's developer tools. */
  name?: string;
  /** Pool size to suggest instead of navigator.hardwareConcurrency. */
  cores?: number;
  /** Makes the worker (default `new Worker(url, options)`). */
  createWorker?: (url: string | URL, options: { type: "classic" | "module"; name?: string }) => WorkerLike;
}

export function browserCores(): number {
  const nav = (globalThis as { navigator?: { hardwareConcurrency?: number } }).navigator;
  const n = nav?.hardwareConcurrency;
  return typeof n === "number" && n >= 1 ? Math.floor(n) : 1;
}

export class BrowserTransport implements Transport {
  readonly name = "web worker";
  readonly cores: number;
  readonly url: string | URL;
  private readonly options: BrowserTransportOptions;

  constructor(url: string | URL, options: BrowserTransportOptions = {}) {
    this.url = url;
    this.options = options;
    this.cores = Math.max(1, options.cores ?? browserCores());
  }

  spawn(): WorkerHandle {
    const make =
      this.options.createWorker ??
      ((url: string | URL, opts: { type: "classic" | "module"; name?: string }): WorkerLike => new Worker(url, opts) as unknown as WorkerLike);
    const worker = make(this.url, { type: this.options.type ?? "classic", name: this.options.name });
    const { handle, deliver, fail } = handleFor(
      (request: JobRequest) => worker.postMessage(request),
      () => worker.terminate(),
    );
    worker.addEventListener("message", (event) => deliver(event.data as WorkerReply));
    worker.addEventListener("error", (event) => {
      event.preventDefault?.(); // reported as the job's failure, not also on the console
      fail(event.message ? `the worker met an uncaught error (${event.message})` : "the worker failed");
    });
    worker.addEventListener("messageerror", () => fail("a message from the worker could not be read"));
    return handle;
  }
}

/** The parts of a dedicated worker's global scope the loop uses. */
export interface WorkerScopeLike {
  postMessage(message: unknown): void;
  addEventListener(type: "message", listener: (event: WorkerEventLike) => void): void;
}

/** The worker side: serves jobs on the worker's own global scope. Call it from the entry script. */
export function serveBrowserWorker(scope?: WorkerScopeLike, options: ServeOptions = {}): ServeHandle {
  const s = scope ?? (globalThis as unknown as WorkerScopeLike);
  const port: Port = {
    postMessage: (reply) => s.postMessage(reply),
    onMessage: (handler) => s.addEventListener("message", (event) => handler(event.data as JobRequest)),
  };
  return serve(port, options);
}
