/**
 * Report tables of a backtest (the shape every sink renders): accuracy by method, refit mode,
 * window and weeks ahead; Diebold–Mariano against the best; the cost of fitting; and the
 * errors origin by origin for charts.
 */
import type { Cell, ReportTable } from "../report";
import { table } from "../report";
import { addWeeks, isoDate } from "../series/calendar";
import { modeLabel, type BacktestRun } from "./backtest";
import type { BacktestResult } from "./run";
import { dmAgainstBest, scoreRuns, stepSeries, type HorizonScore } from "./score";

export interface BacktestTables {
  accuracy: ReportTable;
  significance: ReportTable;
  cost: ReportTable;
  origins: ReportTable;
}

/** Significance level of the verdict column (common practice). */
export const DM_LEVEL = 0.05;

function pct(l: number): string {
  return `${Number(l.toFixed(4))}%`;
}

function num(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

function weekName(dates: Date[] | null, index: number): Cell {
  if (!dates) return index + 1;
  if (index < dates.length) return isoDate(dates[index]);
  return isoDate(addWeeks(dates[dates.length - 1], index - dates.length + 1));
}

export function backtestTables(y: Float64Array, result: BacktestResult, dates: Date[] | null = null): BacktestTables {
  const { plan, runs } = result;
  const scores = scoreRuns(y, plan, runs);
  const windowLabel = (w: number): Cell => {
    if (w < 0) return "all windows";
    const span = plan.windows[w];
    return `${weekName(dates, span.first)} to ${weekName(dates, span.last)}`;
  };
  const accCols = ["Method", "Re-estimated", "Origins from", "Weeks ahead", "Forecasts scored", "MAPE %", "sMAPE %", "MASE", "RMSE"];
  for (const l of plan.levels) accCols.push(`Coverage ${pct(l)}`, `Winkler ${pct(l)}`);
  const accRows: Cell[][] = scores.map((s: HorizonScore) => {
    const row: Cell[] = [s.label, modeLabel(s.mode), windowLabel(s.window), s.h, s.count, num(s.mape), num(s.smape), num(s.mase), num(s.rmse)];
    plan.levels.forEach((_, l) => row.push(num(s.coverage[l]), num(s.winkler[l])));
    return row;
  });
  const notes = [
    `Rolling origin: from every week of the test window${plan.windows.length > 1 ? "s" : ""}, each method forecast the next ${plan.horizon} weeks from the weeks before it only.`,
    "MASE is scaled by the in-sample error of the same week a year earlier over the weeks before each window (last week's value when they are fewer than two years); below 1 beats that benchmark.",
    "Coverage is the share of actual rates inside the interval (close to its level is right); the Winkler score is the interval's width plus a penalty for each miss (lower is better).",
  ];
  if (plan.combos.length > 0) {
    notes.push(`The combination is the mean of ${plan.combos[0].members.join(", ")}: their points and interval bounds averaged at every origin.`);
  }
  const failures = runs.filter((r) => r.failure !== null).map((r) => r.failure as string);
  notes.push(...failures);
  const accuracy = table("Backtest accuracy", accCols, accRows, notes);

  const dm = dmAgainstBest(y, plan, runs);
  const sigRows: Cell[][] = dm.map((r) => [
    modeLabel(r.mode),
    r.h,
    r.label,
    r.bestLabel,
    num(r.mse),
    num(r.bestMse),
    num(r.statistic),
    num(r.pValue),
    Number.isFinite(r.pValue) ? (r.pValue < DM_LEVEL ? "less accurate than the best" : "not distinguishable from the best") : "too few forecasts to test",
  ]);
  const significance = table(
    "Backtest: each method against the most accurate",
    ["Re-estimated", "Weeks ahead", "Method", "Most accurate", "MSE", "MSE of most accurate", "DM statistic", "p-value", "Verdict"],
    sigRows,
    [
      "Diebold–Mariano test of equal accuracy on squared errors with the Harvey, Leybourne & Newbold (1997) small-sample correction, two-sided, at the 5% level.",
      "At 4 or more weeks ahead over a single 52-week window the test rejects somewhat too often (about 7% instead of 5% measured on simulated equal-accuracy forecasts).",
    ],
  );

  const costRows: Cell[][] = runs
    .filter((r) => !plan.combos.some((c) => c.code === r.method))
    .map((r) => [r.label, modeLabel(r.mode), windowLabel(r.window), r.fits, r.updates, r.milliseconds / 1000]);
  const cost: ReportTable = {
    ...table("Backtest cost", ["Method", "Re-estimated", "Origins from", "Fits", "Weeks filtered in", "Seconds"], costRows, [
      "Fits count the first fit of each window and every re-estimation; seconds are the time spent fitting and forecasting on this machine, so they vary from run to run.",
    ]),
    varying: ["Seconds"],
  };

  const originRows: Cell[][] = [];
  for (const r of runs as BacktestRun[]) {
    for (let h = 1; h <= plan.horizon; h++) {
      const s = stepSeries(y, r, h);
      for (let i = 0; i < r.origins.length; i++) {
        if (!Number.isFinite(s.actual[i])) continue;
        const o = r.origins[i];
        originRows.push([r.label, modeLabel(r.mode), weekName(dates, o - 1), h, weekName(dates, o + h - 1), s.actual[i], num(s.point[i]), num(s.actual[i] - s.point[i])]);
      }
    }
  }
  const origins = table(
    "Backtest errors by origin",
    ["Method", "Re-estimated", "Last week seen", "Weeks ahead", "Week forecast", "Actual", "Forecast", "Error"],
    originRows,
    ["One row per forecast that can be checked: the error is actual minus forecast."],
  );
  return { accuracy, significance, cost, origins };
}
