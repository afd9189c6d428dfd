/**
 * An analysis run by the engine with its backtest spread over the pool: the backtest's
 * (method, mode, window) runs go to all workers (backtestInEngine), and the analysis job then
 * fits the chosen method with that result in hand, so "auto" on one series uses every core
 * instead of one. The report is the one analyse() gives on one thread, bit for bit, apart from
 * the cost table's seconds.
 */
import { backtestOptionsFor, backtestSeries, needsBacktest, resolveOptions, type AnalysisOptions, type Report } from "../core/analysis";
import type { WeeklySeries } from "../core/series/types";
import type { Engine, ProgressListener, RunOptions } from "./api";
import { backtestInEngine } from "./backtest";

/** Share of the progress bar given to the backtest when there is one (it is most of the work). */
const BACKTEST_SHARE = 0.9;

export async function analyseInEngine(engine: Engine, series: WeeklySeries, options: AnalysisOptions, run: RunOptions = {}): Promise<Report> {
  const resolved = resolveOptions(series, options);
  const report = run.onProgress;
  if (!needsBacktest(resolved)) return engine.run("analyse", { series, options }, run);
  const scaled = (from: number, share: number): ProgressListener | undefined =>
    report ? (f, sentence) => report(from + share * f, sentence) : undefined;
  // The weeks the backtest sees (all, or the first options.backtestThrough): a refresh that keeps
  // the last full run's backtest asks the pool for the very jobs that run did, and so hits the cache.
  const seen = backtestSeries(series, resolved);
  const backtest = await backtestInEngine(engine, seen.values, backtestOptionsFor(seen, resolved), {
    onProgress: scaled(0, BACKTEST_SHARE),
    signal: run.signal,
    cache: run.cache,
  });
  return engine.run("analyse", { series, options, backtest }, { ...run, onProgress: scaled(BACKTEST_SHARE, 1 - BACKTEST_SHARE) });
}

/** One series and the options it is analysed with. */
export interface AnalysisJob {
  series: WeeklySeries;
  options: AnalysisOptions;
}

/**
 * Several analyses in one engine, side by side; progress is the mean share done over them,
 * with the series' name before the sentence when there is more than one. Rejects with the
 * first failure (the others are cancelled through the signal the caller gives).
 */
export function analyseMany(engine: Engine, jobs: AnalysisJob[], run: RunOptions = {}): Promise<Report[]> {
  const done = new Array<number>(jobs.length).fill(0);
  const report = run.onProgress;
  const say =
    (i: number): ProgressListener =>
    (f, sentence) => {
      done[i] = f;
      const mean = done.reduce((a, b) => a + b, 0) / jobs.length;
      report?.(mean, jobs.length > 1 ? `${jobs[i].series.name ?? `series ${i + 1}`}: ${sentence}` : sentence);
    };
  return Promise.all(jobs.map((j, i) => analyseInEngine(engine, j.series, j.options, { ...run, onProgress: say(i) })));
}
