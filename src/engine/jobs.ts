/**
 * The job table: kind → what a worker runs. Inputs and outputs are structured-clone data
 * (see protocol.ts). Each job also names itself (`title`, a noun phrase without an article,
 * e.g. "TBATS backtest") so that a failure can be reported in a sentence about it.
 *
 * Two kinds ship: "analyse" (the whole Report of analysis.ts) and "backtest-run" (one
 * method × refit mode × window of the rolling-origin backtest, the unit backtest.ts farms
 * out). More kinds can be registered at runtime with `registerJob`; a kind used with a
 * worker transport must be registered in the worker's script as well as here.
 */
import { analyse } from "../core/analysis";
import type { AnalysisOptions, Report } from "../core/analysis";
import { resolveOptions } from "../core/analysis";
import { modePhrase, runWindow } from "../core/evaluate/backtest";
import type { BacktestPlan, BacktestRun, RefitMode } from "../core/evaluate/backtest";
import type { BacktestResult } from "../core/evaluate/run";
import { getModel } from "../core/models/registry";
import type { WeeklySeries } from "../core/series/types";

/** What a running job may ask of its host. */
export interface JobContext {
  /** Share done (0–1) and a sentence for the pane's status line. */
  progress(fraction: number, sentence: string): void;
  /** True once the job should stop (checked by jobs that can stop part-way). */
  cancelled(): boolean;
}

export interface JobDefinition<I = unknown, O = unknown> {
  run(input: I, ctx: JobContext): O | Promise<O>;
  /** A noun phrase for sentences about the job ("TBATS backtest"); it must not throw on bad input. */
  title?(input: I): string;
}

export interface AnalyseInput {
  /** As structured-cloned: Dates stay Dates, values a Float64Array. */
  series: WeeklySeries;
  options: AnalysisOptions;
  /** The analysis's backtest, already run (by backtestInEngine over the pool); see analysis.ts. */
  backtest?: BacktestResult;
}

export interface BacktestRunInput {
  y: Float64Array;
  method: string;
  plan: BacktestPlan;
  mode: RefitMode;
  /** Index into plan.windows. */
  window: number;
  methodOptions?: Record<string, unknown>;
}

/** The shipped kinds with their input and output types (the pool's typed overloads read this). */
export interface JobKinds {
  analyse: { input: AnalyseInput; output: Report };
  "backtest-run": { input: BacktestRunInput; output: BacktestRun };
}

export type JobKind = keyof JobKinds;

function methodLabel(code: string): string {
  try {
    return getModel(code).label;
  } catch {
    return code;
  }
}

function analyseLabel(input: AnalyseInput): string {
  try {
    return methodLabel(resolveOptions(input.series, input.options).method);
  } catch {
    return methodLabel(String(input?.options?.method ?? "default"));
  }
}


const analyseJob: JobDefinition<AnalyseInput, Report> = {
  title: (input) => `${analyseLabel(input)} analysis`,
  run(input, ctx) {
    const label = analyseLabel(input);
    const what = input.series.name ? `${input.series.name}` : "the series";
    ctx.progress(0, `Analysing ${what} with ${label}`);
    const control = { progress: (f: number, s: string) => ctx.progress(f, s), cancelled: () => ctx.cancelled() };
    const report = analyse(input.series, input.options, control, input.backtest ? { backtest: input.backtest } : {});
    ctx.progress(1, `Analysed ${what} with ${label}`);
    return report;
  },
};

const backtestRunJob: JobDefinition<BacktestRunInput, BacktestRun> = {
  title: (input) => `${methodLabel(String(input?.method))} backtest`,
  run(input, ctx) {
    const { y, method, plan, mode, window } = input;
    const label = methodLabel(method);
    const span = plan.windows[window];
    const count = span ? span.last - span.first + 1 : 0;
    const windows = plan.windows.length > 1 ? `, window ${window + 1} of ${plan.windows.length}` : "";
    const sentence = (f: number): string =>
      `Backtesting ${label}, ${modePhrase(mode)}${windows}: origin ${Math.round(f * count)} of ${count}`;
    ctx.progress(0, sentence(0));
    return runWindow(y, method, getModel, plan, mode, window, {
      methodOptions: input.methodOptions,
      progress: (f) => ctx.progress(f, sentence(f)),
      cancelled: ctx.cancelled,
    });
  },
};

const TABLE = new Map<string, JobDefinition>([
  ["analyse", analyseJob as JobDefinition],
  ["backtest-run", backtestRunJob as JobDefinition],
]);

/**
 * Adds a kind at runtime (a later feature, or a test's own table). Refuses to replace a kind
 * already registered unless `replace` is set, so two modules cannot silently fight over a name.
 */
export function registerJob<I, O>(kind: string, definition: JobDefinition<I, O>, options: { replace?: boolean } = {}): void {
  if (TABLE.has(kind) && !options.replace) throw new Error(`engine job kind "${kind}" is already registered`);
  TABLE.set(kind, definition as JobDefinition);
}

export function findJob(kind: string): JobDefinition | undefined {
  return TABLE.get(kind);
}

export function jobKinds(): string[] {
  return [...TABLE.keys()];
}

/** The job's noun phrase, falling back to its kind: it is used in error sentences, so it never throws. */
export function jobTitle(kind: string, input: unknown): string {
  const def = TABLE.get(kind);
  if (def?.title) {
    try {
      const t = def.title(input);
      if (typeof t === "string" && t.length > 0) return t;
    } catch {
      // fall through to the kind's name
    }
  }
  return `"${kind}" job`;
}
