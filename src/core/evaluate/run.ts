/**
 * The whole backtest on the calling thread: every (method, refit mode, window) run in turn,
 * then the combinations from their members, with one progress stream. The engine runs the same
 * runs in parallel workers (src/engine) and assembles them with `assembleBacktest`.
 */
import { BacktestCancelled, combineRuns, modePhrase, runWindow, type BacktestPlan, type BacktestRun, type ModelLookup } from "./backtest";
import { planBacktest, type BacktestOptions } from "./plan";

export interface BacktestResult {
  plan: BacktestPlan;
  runs: BacktestRun[];
}

export interface BacktestControl {
  /** Fraction of the whole backtest done and a sentence saying what is running. */
  progress?: (fraction: number, sentence: string) => void;
  cancelled?: () => boolean;
  now?: () => number;
}

/** One unit of work: a method in a refit mode over a window. */
export interface RunTask {
  method: string;
  mode: BacktestPlan["modes"][number];
  window: number;
}

export function tasksOf(plan: BacktestPlan): RunTask[] {
  const out: RunTask[] = [];
  for (let window = 0; window < plan.windows.length; window++) {
    for (const mode of plan.modes) for (const method of plan.methods) out.push({ method, mode, window });
  }
  return out;
}

/** Adds the combinations' runs (from their members' runs) to the fitted methods' runs. */
export function assembleBacktest(plan: BacktestPlan, runs: BacktestRun[], lookup: ModelLookup): BacktestResult {
  const all = [...runs];
  for (const combo of plan.combos) {
    for (let window = 0; window < plan.windows.length; window++) {
      for (const mode of plan.modes) {
        const members = combo.members.map((m) => runs.find((r) => r.method === m && r.mode === mode && r.window === window) as BacktestRun);
        all.push(combineRuns(combo.code, lookup(combo.code).label, members));
      }
    }
  }
  return { plan, runs: all };
}

export function sentenceFor(label: string, mode: BacktestPlan["modes"][number], done: number, total: number): string {
  return `Backtesting ${label}, ${modePhrase(mode)}: origin ${done} of ${total}.`;
}

export function backtest(y: Float64Array, options: BacktestOptions, lookup: ModelLookup, control: BacktestControl = {}): BacktestResult {
  const plan = planBacktest(y.length, options, lookup);
  const tasks = tasksOf(plan);
  const runs: BacktestRun[] = [];
  tasks.forEach((task, k) => {
    const label = lookup(task.method).label;
    const origins = plan.windows[task.window].last - plan.windows[task.window].first + 1;
    runs.push(
      runWindow(y, task.method, lookup, plan, task.mode, task.window, {
        methodOptions: options.methodOptions?.[task.method],
        now: control.now,
        cancelled: control.cancelled,
        progress: (f) => control.progress?.((k + f) / tasks.length, sentenceFor(label, task.mode, Math.round(f * origins), origins)),
      }),
    );
  });
  if (control.cancelled?.()) throw new BacktestCancelled();
  return assembleBacktest(plan, runs, lookup);
}
