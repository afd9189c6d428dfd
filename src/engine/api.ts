/**
 * The engine's API as its callers see it (worksheet functions, pane, batch): what `run`,
 * `runAll` and `runAllSettled` take and give. pool.ts implements it.
 */
import type { CacheStats, ResultCache } from "./cache";
import type { JobKinds } from "./jobs";

export type ProgressListener = (fraction: number, sentence: string) => void;

export interface RunOptions {
  onProgress?: ProgressListener;
  signal?: AbortSignal;
  /** false: neither read nor fill the cache for this job (default true). */
  cache?: boolean;
}

export interface RunAllOptions {
  /** Combined progress: the mean share done over all jobs, with the latest sentence from any. */
  onProgress?: ProgressListener;
  signal?: AbortSignal;
  cache?: boolean;
}

export interface JobSpec<K extends string = string, I = unknown> {
  kind: K;
  input: I;
}

export interface EngineOptions {
  /** Number of workers (default: the transport's cores), at least 1. */
  size?: number;
  /** A cache to use (shared between engines if you like), or false for none. Default: a new one. */
  cache?: ResultCache | false;
  /** Entries of the default cache (default 128). */
  cacheEntries?: number;
}

export interface EngineStats {
  transport: string;
  size: number;
  workers: number;
  busy: number;
  queued: number;
  /** Jobs handed to a worker since the engine was made. */
  started: number;
  /** Jobs that joined an identical job already queued or running. */
  joined: number;
  /** Workers terminated to cancel a job, and workers that died on their own. */
  terminated: number;
  crashed: number;
  cache: CacheStats | null;
}

/** A kind's input type: the shipped kinds' own, anything for kinds registered at runtime. */
export type InputOf<K extends string> = K extends keyof JobKinds ? JobKinds[K]["input"] : unknown;
/** A kind's output type: the shipped kinds' own, unknown for kinds registered at runtime. */
export type OutputOf<K extends string> = K extends keyof JobKinds ? JobKinds[K]["output"] : unknown;

// One signature per method rather than overloads: with overloads TypeScript's first (subtype)
// pass can pick the untyped fallback for a perfectly typed "analyse" call.
export interface Engine {
  readonly size: number;
  /** One job. Give O to type the output of a kind registered at runtime. */
  run<K extends string, O = OutputOf<K>>(kind: K, input: InputOf<K>, options?: RunOptions): Promise<O>;
  /** All jobs, spread over the workers; rejects with the first failure and cancels the rest. */
  runAll<K extends string, O = OutputOf<K>>(jobs: ReadonlyArray<JobSpec<K, InputOf<K>>>, options?: RunAllOptions): Promise<O[]>;
  /** All jobs; one result per job whether it succeeded or failed (a crash does not lose the others). */
  runAllSettled<K extends string, O = OutputOf<K>>(jobs: ReadonlyArray<JobSpec<K, InputOf<K>>>, options?: RunAllOptions): Promise<PromiseSettledResult<O>[]>;
  stats(): EngineStats;
  /** Terminates every worker; jobs not finished reject with EngineCancelled. */
  close(): void;
}
