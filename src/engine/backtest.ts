/**
 * A backtest run by the engine: the plan's (method, refit mode, window) runs go to the pool's
 * workers in parallel (work split by model and window), and the combinations are assembled
 * from their members' runs on the calling side, exactly as the one-thread backtest in
 * src/core/evaluate/run.ts does. A run whose worker crashed or whose method failed comes back
 * as a run with a sentence; the other runs still make the report.
 */
import { failedRun, type BacktestRun } from "../core/evaluate/backtest";
import { planBacktest, type BacktestOptions } from "../core/evaluate/plan";
import { assembleBacktest, tasksOf, type BacktestResult, type RunTask } from "../core/evaluate/run";
import { getModel } from "../core/models/registry";
import type { Engine, RunAllOptions } from "./api";
import { EngineCancelled, isEngineCancelled } from "./errors";
import type { BacktestRunInput } from "./jobs";

/** Rough relative cost of a run (ours), so the slowest start first and the pool stays busy. */
function weight(t: RunTask): number {
  const method = t.method === "nnar" ? 4 : t.method === "tbats" || t.method === "sarima" ? 2 : 1;
  const mode = t.mode === "every" ? 3 : t.mode === "fixed" ? 1 : 2;
  return method * mode;
}

export async function backtestInEngine(engine: Engine, y: Float64Array, options: BacktestOptions, run: RunAllOptions = {}): Promise<BacktestResult> {
  const plan = planBacktest(y.length, options, getModel);
  const tasks = tasksOf(plan)
    .map((t, i) => ({ t, i }))
    .sort((a, b) => weight(b.t) - weight(a.t) || a.i - b.i)
    .map((x) => x.t);
  const jobs = tasks.map((t) => ({
    kind: "backtest-run" as const,
    input: { y, method: t.method, plan, mode: t.mode, window: t.window, methodOptions: options.methodOptions?.[t.method] } as BacktestRunInput,
  }));
  const settled = await engine.runAllSettled(jobs, run);
  const runs: BacktestRun[] = settled.map((s, k) => {
    if (s.status === "fulfilled") return s.value as BacktestRun;
    if (isEngineCancelled(s.reason)) throw s.reason;
    const t = tasks[k];
    const label = getModel(t.method).label;
    const why = s.reason instanceof Error ? s.reason.message : String(s.reason);
    return failedRun(plan, t.method, label, t.mode, t.window, `${label} could not be backtested: ${why}`);
  });
  if (run.signal?.aborted) throw new EngineCancelled("The backtest was cancelled.");
  // Back in the plan's order, so the report does not depend on which worker finished first.
  const order = new Map(tasksOf(plan).map((t, i) => [`${t.method}|${String(t.mode)}|${t.window}`, i]));
  runs.sort((a, b) => (order.get(`${a.method}|${String(a.mode)}|${a.window}`) ?? 0) - (order.get(`${b.method}|${String(b.mode)}|${b.window}`) ?? 0));
  return assembleBacktest(plan, runs, getModel);
}
