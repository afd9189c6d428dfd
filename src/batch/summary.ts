/**
 * The short table `run` prints when it is done: per series, the method used (the backtest's
 * winner under "auto"), the next four weeks' point forecasts, the fourth week's widest
 * interval and the winner's backtest MASE, all read from the report tables as they are.
 */
import type { Report } from "../core/analysis";
import type { Cell } from "../core/report";
import type { AnalysedSeries } from "../core/present/sheets";
import { CAUTION, optionsPhrase } from "../core/present/stamp";

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

export function summaryText(source: string, analysed: AnalysedSeries[], written: string | null, seconds: number, warnings: string[]): string {
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
  for (const w of warnings) lines.push(w);
  lines.push(written ? `Written to ${written} in ${seconds.toFixed(1)} s.` : `Done in ${seconds.toFixed(1)} s.`);
  lines.push(CAUTION);
  return `${lines.join("\n")}\n`;
}
