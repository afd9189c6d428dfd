/**
 * The short table `run` prints when it is done: per series, the method used (the backtest's
 * winner under "auto"), the next four weeks' point forecasts, the fourth week's widest
 * interval and the winner's backtest MASE, all read from the report tables as they are.
 * `publish` adds what went into the log, what was found there, and the track record's count
 * and shortest-horizon MAPE per series, read from the track record's summary table.
 */
import type { Report } from "../core/analysis";
import type { Cell } from "../core/report";
import type { AnalysedSeries } from "../core/present/sheets";
import { PUBLISHED_SHEET, PUBLISH_PARTS } from "../core/present/published";
import { CAUTION, optionsPhrase } from "../core/present/stamp";
import type { SeriesRecord, TrackRecord } from "../core/record/track";
import type { PublishOutcome } from "./publish";

const WEEKS_SHOWN = 4;

function fmt(v: Cell | undefined, digits = 0): string {
  return typeof v === "number" && Number.isFinite(v)
    ? v.toLocaleString("en-US", { minimumFractionDigits: digits, maximumFractionDigits: digits })
    : "–";
}

/** The winner's MASE at 1 and at the last backtest horizon, for the first refit mode. */
function maseCells(r: Report): string {
  const t = r.tables.backtest;
  if (!t) return "–";
  const c = (k: string): number => t.columns.indexOf(k);
  const mine = t.rows.filter((row) => row[c("Method")] === r.model.label);
  if (mine.length === 0) return "–";
  const mode = mine[0][c("Re-estimated")];
  const rows = mine.filter((row) => row[c("Re-estimated")] === mode);
  const first = rows[0];
  const last = rows[rows.length - 1];
  return `${fmt(first[c("MASE")], 2)} / ${fmt(last[c("MASE")], 2)}`;
}

function pad(cells: string[][]): string {
  const widths = cells[0].map((_, j) => Math.max(...cells.map((r) => [...r[j]].length)));
  return cells.map((r) => r.map((x, j) => (j === 0 ? x.padEnd(widths[j]) : x.padStart(widths[j]))).join("  ").trimEnd()).join("\n");
}

function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** "1 week ahead MAPE 3.2%" for the shortest horizon with an outcome, method by method when several. */
function mapePhrase(s: SeriesRecord): string | null {
  const t = s.summary;
  const c = (k: string): number => t.columns.indexOf(k);
  const rows = t.rows.filter((r) => typeof r[c("Weeks ahead")] === "number" && Number(r[c("Forecasts scored")]) > 0 && typeof r[c("MAPE %")] === "number");
  if (rows.length === 0) return null;
  const h = Math.min(...rows.map((r) => r[c("Weeks ahead")] as number));
  const at = rows.filter((r) => r[c("Weeks ahead")] === h);
  const mape = (r: Cell[]): string => `${fmt(r[c("MAPE %")], 1)}%`;
  const value = at.length === 1 ? mape(at[0]) : at.map((r) => `${mape(r)} (${String(r[c("Method")])})`).join(", ");
  return `${h} week${h === 1 ? "" : "s"} ahead MAPE ${value}`;
}

/** The lines `publish` adds to the summary. */
export function publishLines(p: PublishOutcome): string[] {
  const shown = PUBLISH_PARTS.filter((x) => p.parts.includes(x.part)).map((x) => x.label.toLowerCase());
  const lines = [`Published ${shown.join(", ")} on ${PUBLISHED_SHEET} at ${p.publishedAt}.`];
  if (p.empty.length > 0) {
    const said = p.empty.map((e) => `${PUBLISH_PARTS.find((x) => x.part === e.part)?.label.toLowerCase() ?? e.part} (${e.why})`);
    lines.push(`Nothing to show for ${said.length === 1 ? said[0] : `${said.slice(0, -1).join(", ")} and ${said[said.length - 1]}`}.`);
  }
  lines.push(...p.plan.sentences);
  if (p.skipped.length > 0) lines.push(`Not logged, because undated (no target weeks to score): ${p.skipped.join(", ")}.`);
  lines.push(...trackLines(p.record));
  return lines;
}

/** One line per series of the track record, and the series it could not score. */
export function trackLines(record: TrackRecord): string[] {
  const lines: string[] = [];
  for (const s of record.series) {
    const mape = mapePhrase(s);
    lines.push(`Track record, ${s.name}: ${plural(s.scoredCount, "forecast")} scored, ${s.awaiting} awaiting${mape ? `; ${mape}` : ""}.`);
  }
  if (record.unread.length > 0) lines.push(`Track record: not scored, because this run did not read their rates: ${record.unread.join(", ")}.`);
  return lines;
}

export function summaryText(
  source: string,
  analysed: AnalysedSeries[],
  written: string | null,
  seconds: number,
  warnings: string[],
  publish?: PublishOutcome,
  track?: TrackRecord,
): string {
  const first = analysed[0].report;
  const ot = first.tables.outlook;
  const weekCol = ot.columns.indexOf("Week ending");
  const shown = Math.min(WEEKS_SHOWN, ot.rows.length);
  const widest = [...first.options.levels].sort((a, b) => b - a)[0];
  const header = ["Series", "Method"];
  for (let s = 0; s < shown; s++) header.push(typeof ot.rows[s][weekCol] === "string" ? String(ot.rows[s][weekCol]) : `week +${s + 1}`);
  const lastLabel = `week +${shown} ${widest}% range`;
  header.push(lastLabel, "MASE 1 / 4 wk");
  const rows: string[][] = [header];
  for (const a of analysed) {
    const t = a.report.tables.outlook;
    const col = (k: string): number => t.columns.indexOf(k);
    const row = [a.name, a.report.model.label];
    for (let s = 0; s < shown; s++) row.push(fmt(t.rows[s]?.[col("Forecast")]));
    const r = t.rows[shown - 1];
    row.push(r ? `${fmt(r[col(`Low ${widest}%`)])}–${fmt(r[col(`High ${widest}%`)])}` : "–");
    row.push(maseCells(a.report));
    rows.push(row);
  }
  const lines = [
    `Fairlead outlook from ${source}, as of week ending ${first.lastWeek ?? "(undated)"}`,
    "",
    pad(rows),
    "",
  ];
  lines.push(`Options: ${optionsPhrase(first.options)}.`);
  if (first.tables.backtest) lines.push("MASE is the chosen method's in the backtest, 1 and 4 weeks ahead (lower is better; the Backtest sheet compares every method).");
  if (publish) lines.push(...publishLines(publish));
  else if (track) lines.push(...trackLines(track));
  for (const w of warnings) lines.push(w);
  lines.push(written ? `Written to ${written} in ${seconds.toFixed(1)} s.` : `Done in ${seconds.toFixed(1)} s.`);
  lines.push(CAUTION);
  return `${lines.join("\n")}\n`;
}
