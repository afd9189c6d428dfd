/**
 * The one engine the worksheet functions run on. In the add-in's shared runtime the pane uses
 * the same instance (and so the same result cache): recalculating an unchanged book hits the
 * cache and fits nothing. Jobs go to Web Workers built from src/engine/browserWorker.ts
 * (webpack entry "engine-worker", served beside functions.js); where the runtime has no
 * Worker (a functions-only runtime without one, or a test), they run on the calling thread.
 */
import { BrowserTransport, InlineTransport, createEngine, type Engine } from "../engine";

/** The worker bundle's file name, as webpack.config.js writes it next to functions.js. */
export const ENGINE_WORKER_SCRIPT = "engine-worker.js";

let shared: Engine | null = null;

export function functionsEngine(): Engine {
  if (shared) return shared;
  const hasWorker = typeof (globalThis as { Worker?: unknown }).Worker === "function";
  shared = createEngine(hasWorker ? new BrowserTransport(ENGINE_WORKER_SCRIPT, { name: "Fairlead engine" }) : new InlineTransport());
  return shared;
}

/** Puts another engine in place (the pane's, or a test's); returns the one it replaces. */
export function useFunctionsEngine(engine: Engine | null): Engine | null {
  const before = shared;
  shared = engine;
  return before;
}
