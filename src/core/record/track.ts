/**
 * The track record: the forecast log (log.ts) joined with the rates that have since arrived.
 * For every logged forecast whose target week now has a rate: the error, the percentage error
 * and whether the rate fell inside each logged interval; summed up by method and weeks ahead
 * (mean error, mean absolute error, MAPE, interval hit rates), with a table and chart of the
 * forecasts against the outcome. Recomputed from the log and the rates alone, so it follows
 * every pasted week and every correction made in the log by hand.
 *
 * Errors are actual minus forecast (Hyndman & Athanasopoulos, Forecasting: Principles and
 * Practice, 3rd ed., §5.8): a positive mean error means the forecasts ran low.
 */
import type { Cell, ReportTable } from "../report";
import { isoDate } from "../series/calendar";
import type { LineChartSpec } from "../present/chartSpec";
import type { AnalysedSeries } from "../present/sheets";
import { seriesKey } from "../present/names";
import { maseScale } from "../evaluate/metrics";
import type { LogEntry } from "./log";

/** The observed rates of one series by week ending (weeks the intake filled are not observations). */
export interface SeriesActuals {
  byWeek: Map<string, number>;
  /** The last week of data, or null when none is dated. */
  last: string | null;
  /**
   * The MASE scale at an origin week: the mean absolute error of the same week a year earlier
   * over the weeks up to it (of last week's rate with under two years), as the backtest scales
   * (evaluate/metrics.ts); null when it cannot be formed. Absent: no MASE.
   */
  scaleAt?: (origin: string) => number | null;
}

/** The scale function of a dated series: the backtest's MASE scale (maseScale) over the weeks up to the origin. */
function scaleOf(weeks: string[], values: Float64Array): (origin: string) => number | null {
  const cache = new Map<string, number | null>();
  return (origin) => {
    const hit = cache.get(origin);
    if (hit !== undefined) return hit;
    let end = weeks.length - 1;
    while (end >= 0 && weeks[end] > origin) end--;
    let scale: number | null = null;
    if (end >= 1) {
      const s = maseScale(values.subarray(0, end + 1)).scale;
      scale = Number.isFinite(s) && s > 0 ? s : null;
    }
    cache.set(origin, scale);
    return scale;
  };
}

export function actualsOf(analysed: AnalysedSeries[]): Map<string, SeriesActuals> {
  const out = new Map<string, SeriesActuals>();
  for (const a of analysed) {
    const s = a.series;
    const n = s.values.length;
    if (s.dates.length !== n || n === 0) continue;
    const byWeek = new Map<string, number>();
    const weeks = s.dates.map(isoDate);
    for (let i = 0; i < n; i++) if (!s.filled[i] && Number.isFinite(s.values[i])) byWeek.set(weeks[i], s.values[i]);
    out.set(a.name, { byWeek, last: weeks[n - 1], scaleAt: scaleOf(weeks, s.values) });
  }
  return out;
}

/** One logged forecast with its outcome (actual null while the week is still to come). */
export interface Scored {
  entry: LogEntry;
  actual: number | null;
  error: number | null;
  errorPct: number | null;
  /** |error| over the MASE scale at the entry's origin, or null. */
  scaledError: number | null;
  insideInner: boolean | null;
  insideOuter: boolean | null;
}

export interface SeriesRecord {
  name: string;
  summary: ReportTable;
  outcome: ReportTable;
  scored: ReportTable;
  chart: LineChartSpec | null;
  /** Logged forecasts with an outcome, and those still waiting for one. */
  scoredCount: number;
  awaiting: number;
}

export interface TrackRecord {
  series: SeriesRecord[];
  /** Series in the log whose rates this run did not read (no outcome can be looked up). */
  unread: string[];
  /** Entries left out because a later one logged the same series, origin, target and method. */
  superseded: number;
}

function inside(band: LogEntry["inner"], y: number): boolean | null {
  if (!band || band.low === null || band.high === null) return null;
  return y >= band.low && y <= band.high;
}

export function scoreEntry(entry: LogEntry, actuals: SeriesActuals | undefined): Scored {
  const y = actuals?.byWeek.get(entry.target);
  if (y === undefined) return { entry, actual: null, error: null, errorPct: null, scaledError: null, insideInner: null, insideOuter: null };
  const error = y - entry.point;
  const scale = actuals?.scaleAt?.(entry.origin) ?? null;
  return {
    entry,
    actual: y,
    error,
    errorPct: y !== 0 ? (100 * error) / y : null,
    scaledError: scale !== null ? Math.abs(error) / scale : null,
    insideInner: inside(entry.inner, y),
    insideOuter: inside(entry.outer, y),
  };
}

/** The latest logged entry per series, origin, target and method (a re-published week replaces the earlier one). */
function latestEntries(entries: LogEntry[]): { kept: LogEntry[]; superseded: number } {
  const byKey = new Map<string, LogEntry>();
  for (const e of entries) {
    const key = `${e.series}\u0000${e.origin}\u0000${e.target}\u0000${e.method}`;
    const was = byKey.get(key);
    if (!was || e.loggedAt >= was.loggedAt) byKey.set(key, e);
  }
  return { kept: [...byKey.values()], superseded: entries.length - byKey.size };
}

function mean(xs: number[]): number | null {
  return xs.length === 0 ? null : xs.reduce((s, x) => s + x, 0) / xs.length;
}

function share(xs: (boolean | null)[]): number | null {
  const known = xs.filter((x): x is boolean => x !== null);
  return known.length === 0 ? null : (100 * known.filter((x) => x).length) / known.length;
}

/** "80%" when every entry's band has that level, else null (the header then says inner/outer). */
function commonLevel(entries: LogEntry[], which: "inner" | "outer"): number | null {
  const levels = new Set(entries.map((e) => e[which]?.level).filter((l): l is number => l !== undefined));
  return levels.size === 1 ? [...levels][0] : null;
}

function bandHeader(entries: LogEntry[], which: "inner" | "outer"): string {
  const l = commonLevel(entries, which);
  return l !== null ? `Inside ${Number(l.toFixed(4))}% interval` : `Inside ${which} interval`;
}

function summaryRow(method: string, ahead: Cell, group: Scored[]): Cell[] {
  const done = group.filter((s) => s.actual !== null);
  return [
    method,
    ahead,
    done.length,
    group.length - done.length,
    mean(done.map((s) => s.error as number)),
    mean(done.map((s) => Math.abs(s.error as number))),
    mean(done.filter((s) => s.errorPct !== null).map((s) => Math.abs(s.errorPct as number))),
    mean(done.filter((s) => s.scaledError !== null).map((s) => s.scaledError as number)),
    share(done.map((s) => s.insideInner)),
    share(done.map((s) => s.insideOuter)),
  ];
}

function yesNo(b: boolean | null): Cell {
  return b === null ? null : b ? "yes" : "no";
}

/** The horizons the outcome table and chart follow: the shortest logged, and 4 weeks (else the longest). */
function shownHorizons(entries: LogEntry[]): number[] {
  const hs = [...new Set(entries.map((e) => e.ahead))].sort((a, b) => a - b);
  if (hs.length === 0) return [];
  const second = hs.includes(4) && hs[0] !== 4 ? 4 : hs[hs.length - 1];
  return second === hs[0] ? [hs[0]] : [hs[0], second];
}

function aheadLabel(h: number): string {
  return `Forecast ${h} week${h === 1 ? "" : "s"} ahead`;
}

function seriesRecord(name: string, entries: LogEntry[], actuals: SeriesActuals | undefined): SeriesRecord {
  const scored = entries.map((e) => scoreEntry(e, actuals));
  const inner = bandHeader(entries, "inner");
  const outer = bandHeader(entries, "outer");
  const methods = [...new Set(entries.map((e) => e.method))].sort();
  const rows: Cell[][] = [];
  for (const m of methods) {
    const mine = scored.filter((s) => s.entry.method === m);
    const hs = [...new Set(mine.map((s) => s.entry.ahead))].sort((a, b) => a - b);
    for (const h of hs) rows.push(summaryRow(m, h, mine.filter((s) => s.entry.ahead === h)));
    if (hs.length > 1) rows.push(summaryRow(m, "All", mine));
  }
  const last = actuals?.last ?? null;
  const summary: ReportTable = {
    title: "Track record by method and weeks ahead",
    columns: ["Method", "Weeks ahead", "Forecasts scored", "Awaiting actuals", "Mean error", "Mean absolute error", "MAPE %", "MASE", `${inner} (%)`, `${outer} (%)`],
    rows,
    notes: [
      `Logged forecasts against the rates that followed${last ? `, through week ending ${last}` : ""}. Error is actual minus forecast: a positive mean error means the forecasts ran low.`,
      "MASE scales each error by the mean error of the same week a year earlier over the weeks up to its origin (last week's rate with under two years), as the backtest does: below 1 beats that benchmark.",
      "An interval's hit rate should come near its coverage over many weeks; a few dozen forecasts say little either way. Weeks the intake filled are not outcomes and stay awaiting.",
    ],
  };

  const hs = shownHorizons(entries);
  const byTarget = new Map<string, Map<number, LogEntry>>();
  for (const e of entries) {
    if (!hs.includes(e.ahead)) continue;
    const m = byTarget.get(e.target) ?? new Map<number, LogEntry>();
    const was = m.get(e.ahead);
    if (!was || e.loggedAt >= was.loggedAt) m.set(e.ahead, e);
    byTarget.set(e.target, m);
  }
  const weeks = [...byTarget.keys()].sort();
  const outcome: ReportTable = {
    title: "Forecasts against outcome",
    columns: ["Target week", "Actual", ...hs.map(aheadLabel)],
    rows: weeks.map((w) => [w, actuals?.byWeek.get(w) ?? null, ...hs.map((h) => byTarget.get(w)?.get(h)?.point ?? null)]),
    notes: ["The latest logged forecast made that many weeks before each target week, whatever its method."],
  };

  const order = [...scored].sort((a, b) => (a.entry.target < b.entry.target ? 1 : a.entry.target > b.entry.target ? -1 : a.entry.ahead - b.entry.ahead));
  const scoredTable: ReportTable = {
    title: "Logged forecasts and outcomes",
    columns: ["Origin week", "Target week", "Weeks ahead", "Method", "Forecast", "Actual", "Error", "Error %", inner, outer],
    rows: order.map((s) => [s.entry.origin, s.entry.target, s.entry.ahead, s.entry.method, s.entry.point, s.actual, s.error, s.errorPct, yesNo(s.insideInner), yesNo(s.insideOuter)]),
    notes: ["Newest target week first. Blank actual: the week has not arrived, or its rate is missing."],
  };

  const chart: LineChartSpec | null =
    weeks.length > 0
      ? {
          kind: "line",
          id: `track-${seriesKey(name).toLowerCase()}`,
          title: `${name}: logged forecasts against outcome`,
          categories: weeks,
          series: [
            { name: "Actual", role: "history", values: outcome.rows.map((r) => r[1] as number | null) },
            ...hs.map((h, j) => ({ name: aheadLabel(h), role: "forecast" as const, values: outcome.rows.map((r) => r[2 + j] as number | null) })),
          ],
          bands: [],
          yTitle: "Rate",
          caption: last ? `Fairlead track record, rates through week ending ${last}` : "Fairlead track record",
        }
      : null;
  const done = scored.filter((s) => s.actual !== null).length;
  return { name, summary, outcome, scored: scoredTable, chart, scoredCount: done, awaiting: scored.length - done };
}

/** The track record of a log given the rates of the series this run read. */
export function trackRecord(entries: LogEntry[], actuals: Map<string, SeriesActuals>): TrackRecord {
  const { kept, superseded } = latestEntries(entries);
  const names = [...new Set(kept.map((e) => e.series))];
  const series: SeriesRecord[] = [];
  const unread: string[] = [];
  for (const n of names) {
    if (!actuals.has(n)) {
      unread.push(n);
      continue;
    }
    series.push(seriesRecord(n, kept.filter((e) => e.series === n), actuals.get(n)));
  }
  return { series, unread, superseded };
}
