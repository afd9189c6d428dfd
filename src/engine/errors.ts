/**
 * The engine's own failures, as plain sentences a desk analyst can read. Input problems are
 * not here: a job that meets one rejects with the core's InputError, code and sentence kept.
 */

/** The engine could not finish a job: a worker stopped, a result could not be copied, … */
export class EngineError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "EngineError";
  }
}

/** The caller cancelled the job (its AbortSignal fired) or the engine was closed first. */
export class EngineCancelled extends Error {
  constructor(message: string) {
    super(message);
    this.name = "EngineCancelled";
  }
}

export function isEngineCancelled(e: unknown): e is EngineCancelled {
  return e instanceof EngineCancelled || (e instanceof Error && e.name === "EngineCancelled");
}

export function isEngineError(e: unknown): e is EngineError {
  return e instanceof EngineError || (e instanceof Error && e.name === "EngineError");
}

/** "TBATS backtest" → "The TBATS backtest": job titles are noun phrases without an article. */
export function theJob(title: string): string {
  return `The ${title}`;
}

export function capitalise(s: string): string {
  return s.length > 0 ? s[0].toUpperCase() + s.slice(1) : s;
}

/** The first line of an error message, shortened: what a sentence may quote of an internal failure. */
export function plainReason(e: unknown): string {
  // By shape, not instanceof Error: an error from a worker or another realm is still an error.
  const message = typeof e === "object" && e !== null ? (e as { message?: unknown }).message : undefined;
  const raw = typeof message === "string" ? message : typeof e === "string" ? e : String(e);
  const line = raw.split(/\r?\n/)[0].trim().replace(/[.\s]+$/, "");
  if (line.length === 0) return "no reason was given";
  return line.length > 200 ? `${line.slice(0, 197)}…` : line;
}
