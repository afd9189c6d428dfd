/**
 * The engine: core work off the UI thread, behind one interface for the worksheet functions,
 * the pane and the batch runner.
 *
 *   const engine = createEngine(new BrowserTransport(workerUrl));   // pane / functions
 *   const engine = createEngine(new NodeTransport());               // batch (import "./node")
 *   const engine = createEngine(new InlineTransport());             // no workers, tests
 *   const report = await engine.run("analyse", { series, options }, { onProgress, signal });
 *
 * The Node transport is not re-exported here, so a browser bundle never sees worker_threads:
 * import it from "src/engine/node".
 */
import type { Transport } from "./protocol";
import { Pool } from "./pool";
import type { Engine, EngineOptions } from "./api";

export function createEngine(transport: Transport, options: EngineOptions = {}): Engine {
  return new Pool(transport, options);
}

export type { Engine, EngineOptions, EngineStats, InputOf, OutputOf, JobSpec, ProgressListener, RunAllOptions, RunOptions } from "./api";
export { Pool } from "./pool";
export { ResultCache, DEFAULT_CACHE_ENTRIES } from "./cache";
export type { CacheStats } from "./cache";
export { contentHash, jobKey, canonicalBytes, fnv1a64, UnhashableInput } from "./hash";
export { EngineCancelled, EngineError, isEngineCancelled, isEngineError } from "./errors";
export { registerJob, findJob, jobKinds, jobTitle } from "./jobs";
export type { AnalyseInput, BacktestRunInput, JobContext, JobDefinition, JobKind, JobKinds } from "./jobs";
export { InlineTransport } from "./inline";
export type { InlineTransportOptions } from "./inline";
export { BrowserTransport, browserCores } from "./browser";
export type { BrowserTransportOptions } from "./browser";
export { serve } from "./worker";
export type { ServeHandle, ServeOptions } from "./worker";
export type { JobRequest, Port, Transport, WorkerHandle, WorkerReply } from "./protocol";
export { backtestInEngine } from "./backtest";
export { analyseInEngine, analyseMany, type AnalysisJob } from "./analyse";
