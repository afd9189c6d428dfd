/**
 * JSON for scripts: the forecast object of DESIGN.md and the whole report. Identical inputs give
 * byte-identical text: keys in a fixed order, no run time, and the tables' varying columns
 * (timings, see ReportTable.varying) left out unless timing is asked for. The "publish" object
 * of `publish --json` says when it was published, and what it found in the book's log.
 */
import type { Report } from "../core/analysis";
import type { Cell, ReportTable } from "../core/report";
import type { AnalysedSeries } from "../core/present/sheets";
import { LOG_SHEET } from "../core/record/log";
import type { PublishOutcome } from "./publish";

function levelKey(l: number): string {
  return String(Number(l.toFixed(4)));
}

function numberOrNull(c: Cell | undefined): number | null {
  return typeof c === "number" && Number.isFinite(c) ? c : null;
}

export interface ForecastJson {
  method: string;
  chosen: string;
  horizon: number;
  levels: number[];
  last_week: string | null;
  forecast: { step: number; week: string | null; point: number | null; lower: Record<string, number | null>; upper: Record<string, number | null> }[];
  warnings: string[];
  seconds?: number;
}

/** The `forecast --json` object (contract in DESIGN.md); `seconds` only when timing is asked for. */
export function forecastJson(report: Report, seconds: number | null): ForecastJson {
  const t = report.tables.outlook;
  const col = (name: string): number => t.columns.indexOf(name);
  const levels = report.options.levels;
  const out: ForecastJson = {
    method: report.model.method,
    chosen: report.model.structure,
    horizon: report.options.horizon,
    levels: [...levels],
    last_week: report.lastWeek,
    forecast: t.rows.map((r) => {
      const lower: Record<string, number | null> = {};
      const upper: Record<string, number | null> = {};
      for (const l of levels) {
        lower[levelKey(l)] = numberOrNull(r[col(`Low ${levelKey(l)}%`)]);
        upper[levelKey(l)] = numberOrNull(r[col(`High ${levelKey(l)}%`)]);
      }
      const week = r[col("Week ending")];
      return { step: Number(r[col("Step")]), week: typeof week === "string" ? week : null, point: numberOrNull(r[col("Forecast")]), lower, upper };
    }),
    warnings: [...report.warnings],
  };
  if (seconds !== null) out.seconds = Math.round(seconds * 100) / 100;
  return out;
}

/** A table without its varying columns (unless `timing`). */
export function steadyTable(t: ReportTable, timing: boolean): ReportTable {
  const drop = timing ? [] : (t.varying ?? []);
  if (drop.length === 0) return { title: t.title, columns: t.columns, rows: t.rows, notes: t.notes };
  const keep = t.columns.map((c, j) => (drop.includes(c) ? -1 : j)).filter((j) => j >= 0);
  return { title: t.title, columns: keep.map((j) => t.columns[j]), rows: t.rows.map((r) => keep.map((j) => r[j])), notes: t.notes };
}

/** The `run --json` document: every series' whole report (and what Publish did, for `publish`). */
export function runJson(version: string, source: string, analysed: AnalysedSeries[], timing: boolean, seconds: number, publish?: PublishOutcome): unknown {
  return {
    fairlead: version,
    source,
    series: analysed.map((a) => ({
      name: a.name,
      method: a.report.model.method,
      chosen: a.report.model.structure,
      last_week: a.report.lastWeek,
      options: a.report.options,
      tables: Object.fromEntries(
        Object.entries(a.report.tables)
          .filter((e): e is [string, ReportTable] => e[1] !== undefined)
          .map(([k, t]) => [k, steadyTable(t, timing)]),
      ),
      warnings: a.report.warnings,
    })),
    ...(publish ? { publish: publishJson(publish) } : {}),
    ...(timing ? { seconds: Math.round(seconds * 100) / 100 } : {}),
  };
}

/**
 * The "publish" object: the parts shown, the log after the append (added, repeated, and rows:
 * every entry it holds now), and per series the track record's counts and summary table.
 */
export function publishJson(p: PublishOutcome): unknown {
  return {
    parts: [...p.parts],
    empty_parts: p.empty.map((e) => ({ part: e.part, why: e.why })),
    published_at: p.publishedAt,
    log: {
      sheet: LOG_SHEET,
      added: p.plan.added,
      repeated: p.plan.repeated,
      rows: p.plan.entries.length,
      skipped: [...p.skipped],
      notes: [...p.plan.sentences],
    },
    track: p.record.series.map((s) => ({ series: s.name, scored: s.scoredCount, awaiting: s.awaiting, summary: steadyTable(s.summary, false) })),
    track_unread: [...p.record.unread],
    track_superseded: p.record.superseded,
  };
}

/** JSON text with NaN and infinities as null (JSON has neither), two-space indent, newline at the end. */
export function jsonText(value: unknown): string {
  return `${JSON.stringify(value, (_k, v: unknown) => (typeof v === "number" && !Number.isFinite(v) ? null : v), 2)}\n`;
}
