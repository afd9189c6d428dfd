/**
 * The pane's run and refresh, timed on the sample desk book's first lane with the pane's
 * defaults (runDefaults: method chosen by a 52-week backtest re-estimated every week), on the
 * engine's worker threads (the add-in uses Web Workers; the work per job is the same). The
 * workbook is a stand-in that hands over the lane's cells and takes the sheets, so the lines
 * time the run flow, the engine and the sheet layout, not Excel.
 *   pane.run.cold           the first Run
 *   pane.refresh.unchanged  a refresh with nothing changed (every job from the engine's cache)
 *   pane.refresh.new_week   a refresh after next week's figure was pasted: the backtest of the
 *                           Run is kept (its jobs hit the cache), only the chosen method is fitted
 *   pane.run.new_week       Run on that same data: the backtest re-scored with the new week
 * One run per line: a cold run is several seconds.
 */
import * as path from "path";
import type { ManagedSheet } from "../src/core/present/sheets";
import { runDefaults } from "../src/core/present/defaults";
import { createEngine } from "../src/engine";
import { NodeTransport } from "../src/engine/node";
import { bookBlock, chooseColumns, loadBook } from "../src/batch/source";
import type { SourceBlocks } from "../src/taskpane/excel/readSource";
import type { WriteResult } from "../src/taskpane/excel/writeSheets";
import { ledgerOf } from "../src/taskpane/ledger";
import { runAnalysis, type PaneWorkbook } from "../src/taskpane/runFlow";
import { emptySettings, type PaneSettings, type SavedSeries } from "../src/taskpane/settings";
import { writePlan } from "../src/taskpane/writePlan";

async function main(): Promise<void> {
  const file = path.join(__dirname, "..", "..", "..", "sample-workbooks", "desk-weekly.xlsx");
  const block = bookBlock(await loadBook(file), file, {});
  const { dates, rates } = chooseColumns(block, {});
  if (dates === null) throw new Error("the sample book has no dates column");
  const j = rates[1];
  const iso = (v: unknown): unknown => (v instanceof Date ? v.toISOString().slice(0, 10) : v);
  // A block's columns start with their header cell.
  const rateCells: unknown[][] = block.columns[j].map((v) => [v]);
  const dateCells: unknown[][] = block.columns[dates].map((v) => [iso(v)]);
  let blocks: SourceBlocks = {
    name: block.headers[j],
    address: `Rates!B1:B${rateCells.length}`,
    values: rateCells,
    dates: dateCells,
    datesAddress: `Rates!A1:A${dateCells.length}`,
    datesFrom: "selection",
  };
  const workbook: PaneWorkbook = {
    name: async () => "desk-weekly.xlsx",
    readSource: async () => blocks,
    write: async (sheets: ManagedSheet[]): Promise<WriteResult> => ({
      sheets: sheets.map((s) => ({ name: s.name, rows: s.cells.length, cols: s.width, charts: [], created: false })),
      ledgers: sheets.map((s) => ledgerOf(s.name, writePlan(s).values)),
    }),
    // A book without a forecast log: a run reads nothing more.
    readLog: async () => null,
    appendLog: async () => ({ sheet: "Fairlead Log", added: 0, firstRow: 0, lastRow: 0, created: false }),
    saveSettings: async () => undefined,
  };
  const engine = createEngine(new NodeTransport());
  const entry: SavedSeries = { source: { kind: "table", table: "WeeklyRates", rates: blocks.name, dates: "Week ending" }, name: blocks.name, options: runDefaults() };
  let settings: PaneSettings = emptySettings();
  const time = async (name: string): Promise<void> => {
    const t0 = Date.now();
    const kind = name.startsWith("pane.refresh") ? "refresh" : "run";
    const out = await runAnalysis({ series: kind === "run" ? [entry] : settings.series, settings, kind }, { workbook, engine, version: "bench" });
    settings = out.settings;
    const ms = Date.now() - t0;
    process.stdout.write(`${JSON.stringify({ name, n: out.analysed[0].series.values.length, median_ms: ms, runs: 1, workers: engine.size, cache_hits: engine.stats().cache?.hits ?? 0 })}\n`);
  };
  try {
    await time("pane.run.cold");
    await time("pane.refresh.unchanged");
    const last = blocks.values[blocks.values.length - 1][0] as number;
    const lastDate = new Date(`${blocks.dates![blocks.dates!.length - 1][0] as string}T00:00:00Z`);
    const next = new Date(lastDate.getTime() + 7 * 86_400_000).toISOString().slice(0, 10);
    blocks = { ...blocks, values: [...blocks.values, [Math.round(last * 101) / 100]], dates: [...blocks.dates!, [next]] };
    await time("pane.refresh.new_week");
    await time("pane.run.new_week");
  } finally {
    engine.close();
  }
}

void main();
