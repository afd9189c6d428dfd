/**
 * The chart specs of a report (chartSpec.ts), built from its tables and the rates they came
 * from: history with the outlook and its bands, the week × year season as a radar, and
 * backtest error by method and weeks ahead. The pane draws them as native charts, the batch
 * runner as images.
 */
import type { Report } from "../analysis";
import type { Cell, ReportTable } from "../report";
import { isoDate } from "../series/calendar";
import type { WeeklySeries } from "../series/types";
import type { ChartBand, ChartSeries, ColumnChartSpec, LineChartSpec, RadarChartSpec } from "./chartSpec";
import { seriesKey } from "./names";

/** History weeks shown before the forecast: three years, enough to see the season repeat. */
export const HISTORY_WEEKS_SHOWN = 156;
/** Years drawn in the season radar: more than five become a tangle. */
export const RADAR_YEARS = 5;

function num(c: Cell | undefined): number | null {
  return typeof c === "number" && Number.isFinite(c) ? c : null;
}

function caption(report: Report): string {
  return report.lastWeek ? `Fairlead, as of week ending ${report.lastWeek}` : "Fairlead";
}

/** History, forecast and interval bands (widest first), the forecast joined to the last rate. */
export function outlookChart(name: string, series: WeeklySeries, report: Report, historyWeeks = HISTORY_WEEKS_SHOWN): LineChartSpec {
  const t = report.tables.outlook;
  const n = series.values.length;
  const shown = Math.min(n, historyWeeks);
  const start = n - shown;
  const dated = series.dates.length === n;
  const categories: string[] = [];
  for (let i = start; i < n; i++) categories.push(dated ? isoDate(series.dates[i]) : String(i + 1));
  const weekCol = t.columns.indexOf("Week ending");
  const stepCol = t.columns.indexOf("Step");
  for (const r of t.rows) categories.push(dated && typeof r[weekCol] === "string" ? (r[weekCol] as string) : String(n + Number(r[stepCol])));
  const h = t.rows.length;
  const last = series.values[n - 1];
  const history: (number | null)[] = [];
  for (let i = start; i < n; i++) history.push(series.filled[i] ? null : series.values[i]);
  for (let s = 0; s < h; s++) history.push(null);
  const pointCol = t.columns.indexOf("Forecast");
  const forecast: (number | null)[] = new Array<number | null>(shown - 1).fill(null);
  forecast.push(last, ...t.rows.map((r) => num(r[pointCol])));
  const levels = [...report.options.levels].sort((a, b) => b - a);
  const bands: ChartBand[] = levels.map((l) => {
    const label = `${Number(l.toFixed(4))}%`;
    const lo = t.columns.indexOf(`Low ${label}`);
    const hi = t.columns.indexOf(`High ${label}`);
    const pad = new Array<number | null>(shown - 1).fill(null);
    return {
      name: `${label} interval`,
      low: [...pad, last, ...t.rows.map((r) => num(r[lo]))],
      high: [...pad, last, ...t.rows.map((r) => num(r[hi]))],
    };
  });
  const seriesList: ChartSeries[] = [
    { name, values: history, role: "history" },
    { name: `Forecast (${t.title.replace(/^Outlook: /, "")})`, values: forecast, role: "forecast" },
  ];
  return {
    kind: "line",
    id: `outlook-${seriesKey(name).toLowerCase()}`,
    title: `${name}: outlook for ${h} week${h === 1 ? "" : "s"}`,
    categories,
    series: seriesList,
    bands,
    yTitle: "Rate",
    caption: caption(report),
  };
}

/** The week × year means as a radar, the last RADAR_YEARS years; null without the table. */
export function seasonChart(name: string, report: Report): RadarChartSpec | null {
  const t: ReportTable | undefined = report.tables.weekYear;
  if (!t || t.columns.length < 2) return null;
  const first = Math.max(1, t.columns.length - RADAR_YEARS);
  const series: ChartSeries[] = [];
  for (let c = first; c < t.columns.length; c++) {
    series.push({ name: t.columns[c], values: t.rows.map((r) => num(r[c])), role: "year" });
  }
  return {
    kind: "radar",
    id: `season-${seriesKey(name).toLowerCase()}`,
    title: `${name}: rates by ISO week, ${t.columns[first]}–${t.columns[t.columns.length - 1]}`,
    categories: t.rows.map((r) => `W${String(r[0]).padStart(2, "0")}`),
    series,
    caption: caption(report),
  };
}

/**
 * MASE by method and weeks ahead, from the accuracy table: the first refit mode, the windows
 * pooled when there are several. Null without a backtest.
 */
export function backtestChart(name: string, report: Report): ColumnChartSpec | null {
  const t = report.tables.backtest;
  if (!t || t.rows.length === 0) return null;
  const c = (k: string): number => t.columns.indexOf(k);
  const mode = t.rows[0][c("Re-estimated")];
  const pooled = t.rows.some((r) => r[c("Origins from")] === "all windows");
  const rows = t.rows.filter((r) => r[c("Re-estimated")] === mode && (!pooled || r[c("Origins from")] === "all windows"));
  const horizons = [...new Set(rows.map((r) => Number(r[c("Weeks ahead")])))].sort((a, b) => a - b);
  const methods = [...new Set(rows.map((r) => String(r[c("Method")])))];
  const series: ChartSeries[] = methods.map((m) => ({
    name: m,
    role: "method",
    values: horizons.map((h) => num(rows.find((r) => r[c("Method")] === m && Number(r[c("Weeks ahead")]) === h)?.[c("MASE")])),
  }));
  return {
    kind: "column",
    id: `backtest-${seriesKey(name).toLowerCase()}`,
    title: `${name}: backtest MASE by weeks ahead (lower is better)`,
    categories: horizons.map((h) => `${h} wk`),
    series,
    yTitle: "MASE",
    caption: `${caption(report)}; re-estimated ${String(mode)}`,
  };
}
