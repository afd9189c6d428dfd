/**
 * Rolling-origin evaluation ("recursive horizon"): how each method would have forecast the
 * last weeks of the series had it been run every week (Tashman, 2000, "Out-of-sample tests
 * of forecasting accuracy", IJF 16; Hyndman & Athanasopoulos, "Forecasting: principles and
 * practice", §5.10, time-series cross-validation).
 *
 * Test windows are the last W weeks (default 52), or several consecutive windows of W weeks
 * ending at the last week. Inside a window there is an origin every week: the method sees the
 * weeks before the origin and forecasts h = 1..H weeks from it (steps that would fall after
 * the last observed week are left empty). A method is fitted afresh, with its full automatic
 * search, at the first origin of each window; at later origins it is extended by one week in
 * one of three refit modes:
 *   "every": re-estimated at every origin, warm-started from the previous optimum with the
 *            structure kept (Fitted.update with reestimate: true);
 *   k (a whole number ≥ 2): re-estimated every k weeks, filtered with fixed parameters between;
 *   "fixed": the parameters of the first origin kept, new weeks only filtered in.
 * A combination ("combo") is scored from its members' backtest forecasts at each origin (the
 * mean of their points and of their interval bounds), so it costs nothing beyond its members;
 * pooled-path intervals would need every member's paths at every origin.
 *
 * Each (method, mode, window) run is independent, the unit the engine farms out to workers.
 */
import { isInputError } from "../series/errors";
import type { Fitted, ModelSpec } from "../models/types";

export type RefitMode = "every" | "fixed" | number;

/** Looks a method code up (the registry's getModel; passed in to keep the import graph acyclic). */
export type ModelLookup = (code: string) => ModelSpec;

export interface WindowSpan {
  /** First and last origin (0-based week index; origin o forecasts weeks o, o+1, …). */
  first: number;
  last: number;
}

export interface BacktestPlan {
  n: number;
  horizon: number;
  levels: number[];
  windows: WindowSpan[];
  modes: RefitMode[];
  /** Methods fitted one by one, and the combinations scored from them. */
  methods: string[];
  combos: { code: string; members: string[] }[];
}

/** One method's forecasts in one refit mode over one window. */
export interface BacktestRun {
  method: string;
  label: string;
  mode: RefitMode;
  window: number;
  /** Origins, in order. */
  origins: number[];
  /** point[i][s]: forecast of week origins[i] + s (NaN beyond the data or after a failure). */
  point: Float64Array[];
  /** lower[l][i][s], upper[l][i][s] at levels[l]. */
  lower: Float64Array[][];
  upper: Float64Array[][];
  /** Full fits and re-estimations, filter-only updates, and the milliseconds spent in both. */
  fits: number;
  updates: number;
  milliseconds: number;
  /** Why the run stopped early, in a sentence (null when it ran through). */
  failure: string | null;
}

/** Thrown when the caller's cancel check says stop; the engine turns it into a cancelled job. */
export class BacktestCancelled extends Error {
  constructor() {
    super("the backtest was cancelled");
  }
}

export interface RunControl {
  methodOptions?: Record<string, unknown>;
  /** Called after every origin with the share of this run done. */
  progress?: (fraction: number) => void;
  /** Checked after every origin; true stops the run with BacktestCancelled. */
  cancelled?: () => boolean;
  /** A clock in milliseconds (default performance.now, or Date.now where that is missing). */
  now?: () => number;
}

function defaultNow(): () => number {
  const perf = (globalThis as { performance?: { now(): number } }).performance;
  return perf ? () => perf.now() : () => Date.now();
}

export function modeLabel(mode: RefitMode): string {
  if (mode === "every") return "every week";
  if (mode === "fixed") return "never (parameters of the first origin)";
  return `every ${mode} weeks`;
}

/** How a refit mode reads inside a sentence ("Backtesting TBATS, re-estimated every week"). */
export function modePhrase(mode: RefitMode): string {
  if (mode === "every") return "re-estimated every week";
  if (mode === "fixed") return "parameters kept from the first origin";
  return `re-estimated every ${mode} weeks`;
}

function reestimateAt(mode: RefitMode, step: number): boolean {
  if (mode === "every") return true;
  if (mode === "fixed") return false;
  return step % mode === 0;
}

function emptyRun(method: string, label: string, mode: RefitMode, window: number, origins: number[], H: number, L: number): BacktestRun {
  const blank = (): Float64Array[] => origins.map(() => new Float64Array(H).fill(NaN));
  return {
    method,
    label,
    mode,
    window,
    origins,
    point: blank(),
    lower: Array.from({ length: L }, blank),
    upper: Array.from({ length: L }, blank),
    fits: 0,
    updates: 0,
    milliseconds: 0,
    failure: null,
  };
}

/** A run that produced nothing, with the sentence saying why (a worker that crashed, say). */
export function failedRun(plan: BacktestPlan, method: string, label: string, mode: RefitMode, window: number, failure: string): BacktestRun {
  const run = emptyRun(method, label, mode, window, originsOf(plan.windows[window]), plan.horizon, plan.levels.length);
  run.failure = failure;
  return run;
}

export function originsOf(w: WindowSpan): number[] {
  const out: number[] = [];
  for (let o = w.first; o <= w.last; o++) out.push(o);
  return out;
}

/**
 * Backtest one method in one refit mode over one window. A fit that fails (anything but a
 * cancellation) ends the run with a plain `failure`; the origins done so far keep their
 * forecasts. Input errors from the method's own checks (too short a history at the first
 * origin, bad options) are failures too: the other methods' results still come back.
 */
export function runWindow(
  y: Float64Array,
  method: string,
  lookup: ModelLookup,
  plan: BacktestPlan,
  mode: RefitMode,
  window: number,
  control: RunControl = {},
): BacktestRun {
  const spec = lookup(method);
  const span = plan.windows[window];
  const origins = originsOf(span);
  const H = plan.horizon;
  const run = emptyRun(method, spec.label, mode, window, origins, H, plan.levels.length);
  const now = control.now ?? defaultNow();
  let fit: Fitted | null = null;
  for (let i = 0; i < origins.length; i++) {
    const o = origins[i];
    const t0 = now();
    try {
      if (fit === null) {
        fit = spec.fit(y.slice(0, o), control.methodOptions);
        run.fits++;
      } else {
        const re = reestimateAt(mode, i);
        fit = fit.update(y.slice(o - 1, o), { reestimate: re });
        if (re) run.fits++;
        else run.updates++;
      }
      const fc = fit.forecast(H, plan.levels);
      run.milliseconds += now() - t0;
      const steps = Math.min(H, plan.n - o);
      for (let s = 0; s < steps; s++) {
        run.point[i][s] = fc.point[s];
        for (let l = 0; l < plan.levels.length; l++) {
          run.lower[l][i][s] = fc.lower[l][s];
          run.upper[l][i][s] = fc.upper[l][s];
        }
      }
    } catch (e) {
      if (e instanceof BacktestCancelled) throw e;
      run.milliseconds += now() - t0;
      const why = isInputError(e) || e instanceof Error ? e.message : String(e);
      run.failure = `${spec.label} stopped at the origin after week ${o} (${why}); the origins before it are scored.`;
      break;
    }
    control.progress?.((i + 1) / origins.length);
    if (control.cancelled?.()) throw new BacktestCancelled();
  }
  return run;
}

/**
 * A combination's run from its members' runs (same mode and window): the mean of their
 * points and of their bounds at each origin and step; NaN where any member has none.
 */
export function combineRuns(code: string, label: string, members: BacktestRun[]): BacktestRun {
  const first = members[0];
  const H = first.point[0]?.length ?? 0;
  const L = first.lower.length;
  const run = emptyRun(code, label, first.mode, first.window, first.origins, H, L);
  const k = members.length;
  for (let i = 0; i < first.origins.length; i++) {
    for (let s = 0; s < H; s++) {
      let p = 0;
      for (const m of members) p += m.point[i][s];
      run.point[i][s] = p / k;
      for (let l = 0; l < L; l++) {
        let lo = 0;
        let hi = 0;
        for (const m of members) {
          lo += m.lower[l][i][s];
          hi += m.upper[l][i][s];
        }
        run.lower[l][i][s] = lo / k;
        run.upper[l][i][s] = hi / k;
      }
    }
  }
  run.fits = members.reduce((a, m) => a + m.fits, 0);
  run.updates = members.reduce((a, m) => a + m.updates, 0);
  run.milliseconds = members.reduce((a, m) => a + m.milliseconds, 0);
  const failed = members.filter((m) => m.failure !== null);
  if (failed.length > 0) run.failure = `The combination is missing where ${failed.map((m) => m.label).join(" and ")} stopped.`;
  return run;
}
