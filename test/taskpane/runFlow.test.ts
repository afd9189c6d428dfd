/**
 * The pane's run from saved series to written sheets, with the real core and engine (inline
 * transport) and a stand-in workbook: what is read, what is written, what is saved, and how a
 * run stops (bad cells, cancel) without writing anything.
 */
import { analyse } from "../../src/core/analysis";
import { managedSheets, MANAGED_SHEETS, type ManagedSheet } from "../../src/core/present/sheets";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { createEngine, InlineTransport, type Engine } from "../../src/engine";
import type { LogReading } from "../../src/core/record/log";
import type { LogAppended } from "../../src/taskpane/excel/forecastLog";
import type { SourceBlocks } from "../../src/taskpane/excel/readSource";
import type { WriteOptions, WriteResult } from "../../src/taskpane/excel/writeSheets";
import { ledgerOf } from "../../src/taskpane/ledger";
import { runAnalysis, RunStopped, type PaneWorkbook } from "../../src/taskpane/runFlow";
import { emptySettings, type PaneSettings, type SavedSeries } from "../../src/taskpane/settings";
import { sourceLabel, type DataSource } from "../../src/taskpane/source";
import { laneSeries } from "../engine/lane";

const NOW = new Date("2026-12-03T09:00:00Z");

/** The lane as a sheet column: header on row 1, dates in A, rates in B. */
function laneBlocks(weeks: number): SourceBlocks {
  const lane = laneSeries(weeks);
  const n = lane.values.length;
  return {
    name: "Halden–Corvane FEU",
    address: `Rates!B1:B${n + 1}`,
    values: [["Halden–Corvane FEU"], ...Array.from(lane.values, (v) => [v])],
    dates: [["Week ending"], ...lane.dates.map((d) => [d.toISOString().slice(0, 10)])],
    datesAddress: `Rates!A1:A${n + 1}`,
    datesFrom: "left",
  };
}

const SOURCE: DataSource = { kind: "range", sheet: "Rates", ratesColumn: 1, datesColumn: 0, top: 0, header: true };

class StandInBook implements PaneWorkbook {
  blocks: SourceBlocks;
  writes: { sheets: ManagedSheet[]; options: WriteOptions }[] = [];
  saved: PaneSettings[] = [];
  constructor(blocks: SourceBlocks) {
    this.blocks = blocks;
  }
  async name(): Promise<string> {
    return "desk-weekly.xlsx";
  }
  async readSource(): Promise<SourceBlocks> {
    return this.blocks;
  }
  async write(sheets: ManagedSheet[], _l: unknown, options: WriteOptions): Promise<WriteResult> {
    this.writes.push({ sheets, options });
    return {
      sheets: sheets.map((s) => ({ name: s.name, rows: s.cells.length, cols: s.width, charts: [], created: true })),
      ledgers: sheets.map((s) => ledgerOf(s.name, s.cells.map((r) => r.map((c) => c ?? "")), [], s.names.map((n) => n.name))),
    };
  }
  async readLog(): Promise<LogReading | null> {
    return null;
  }
  async appendLog(): Promise<LogAppended> {
    throw new Error("a run never adds to the forecast log");
  }
  async saveSettings(s: PaneSettings): Promise<void> {
    this.saved.push(s);
  }
}

const OPTIONS = { method: "tbats", horizon: 8, levels: [80, 95], checks: true };
let engine: Engine;

beforeEach(() => {
  engine = createEngine(new InlineTransport());
});
afterEach(() => engine.close());

function entry(options = OPTIONS): SavedSeries {
  return { source: SOURCE, name: "", options };
}

describe("a pane run", () => {
  it("writes the sheets analyse() gives for the cells read, and saves series and ledgers", async () => {
    const book = new StandInBook(laneBlocks(180));
    const seen: [number, string][] = [];
    const out = await runAnalysis(
      { series: [entry()], settings: emptySettings(), write: { activate: true } },
      { workbook: book, engine, version: "0.1.0", now: () => NOW },
      { onProgress: (f, s) => seen.push([f, s]) },
    );
    // The same report the core gives on one thread for the same series and options.
    const direct = analyse(laneSeries(180), OPTIONS);
    expect(out.analysed[0].report.tables.outlook).toEqual(direct.tables.outlook);
    expect(book.writes).toHaveLength(1);
    const sheets = book.writes[0].sheets;
    expect(sheets.map((s) => s.name)).toEqual(MANAGED_SHEETS.map((m) => m.name));
    expect(sheets[0].cells[0][0]).toBe(MANAGED_MARK);
    // The stamp names the book and the source, the series' span and the run's time.
    const stamp = sheets[0].cells.slice(0, 9).map((r) => `${r[0]}: ${r[1]}`);
    expect(stamp).toContain(`Data: desk-weekly.xlsx › ${sourceLabel(SOURCE)}`);
    expect(stamp.find((l) => l.startsWith("Made"))).toBe("Made: 2026-12-03T09:00:00Z by Fairlead 0.1.0");
    // Progress rises to 1 and ends on Done.
    for (let i = 1; i < seen.length; i++) expect(seen[i][0]).toBeGreaterThanOrEqual(seen[i - 1][0] - 1e-12);
    expect(seen[seen.length - 1]).toEqual([1, "Done"]);
    // Saved: the series with its name as read, and one ledger per sheet.
    const saved = book.saved[0];
    expect(saved.series).toEqual([{ source: SOURCE, name: "Halden–Corvane FEU", options: OPTIONS }]);
    expect(Object.keys(saved.ledgers).sort()).toEqual(MANAGED_SHEETS.map((m) => m.name).sort());
  });

  it("stamps the sheets with the book, the source, each series' span and the run's time, as a hand-built stamp says", async () => {
    const book = new StandInBook(laneBlocks(160));
    const out = await runAnalysis({ series: [entry()], settings: emptySettings() }, { workbook: book, engine, version: "0.1.0", now: () => NOW });
    const again = managedSheets(out.analysed, {
      version: "0.1.0",
      source: `desk-weekly.xlsx › ${sourceLabel(SOURCE)}`,
      series: out.analysed.map((a) => ({ name: a.name, first: "2017-01-06", last: a.report.lastWeek, weeks: 160, method: a.report.model.label })),
      options: out.analysed[0].report.options,
      ranAt: "2026-12-03T09:00:00Z",
    });
    expect(out.sheets.map((s) => s.cells)).toEqual(again.map((s) => s.cells));
  });

  it("answers an unchanged refresh from the engine's cache, and re-analyses a series that gained a week", async () => {
    const book = new StandInBook(laneBlocks(150));
    const deps = { workbook: book, engine, version: "0.1.0", now: () => NOW };
    const first = await runAnalysis({ series: [entry()], settings: emptySettings() }, deps);
    const hits = engine.stats().cache?.hits ?? 0;
    const again = await runAnalysis({ series: first.settings.series, settings: first.settings }, deps);
    expect(engine.stats().cache?.hits).toBe(hits + 1);
    expect(again.sheets[0].cells).toEqual(first.sheets[0].cells);

    book.blocks = laneBlocks(151);
    const grown = await runAnalysis({ series: first.settings.series, settings: first.settings }, deps);
    expect(engine.stats().cache?.hits).toBe(hits + 1);
    expect(grown.analysed[0].series.values.length).toBe(151);
    expect(grown.analysed[0].report.tables.outlook).toEqual(analyse(laneSeries(151), OPTIONS).tables.outlook);
  });

  it("keeps the last full run's backtest on a refresh after new weeks, re-scoring once four weeks go unscored", async () => {
    const AUTO = { method: "auto", horizon: 6, levels: [80, 95], checks: false, backtest: { methods: ["lastweek", "lastyear", "drift"], testWeeks: 20, horizon: 4, modes: ["every" as const] } };
    const book = new StandInBook(laneBlocks(150));
    const deps = { workbook: book, engine, version: "0.1.0", now: () => NOW };
    const first = await runAnalysis({ series: [entry(AUTO)], settings: emptySettings() }, deps);
    // Saved with the weeks its backtest saw.
    expect(first.settings.series[0].options).toEqual({ ...AUTO, backtestThrough: 150 });
    const started = engine.stats().started;

    book.blocks = laneBlocks(151);
    const one = await runAnalysis({ series: first.settings.series, settings: first.settings, kind: "refresh" }, deps);
    // Only the final fit ran: the backtest's jobs (one per method) came from the cache.
    expect(engine.stats().started).toBe(started + 1);
    expect(one.analysed[0].report.tables.backtest!.rows).toEqual(first.analysed[0].report.tables.backtest!.rows);
    expect(one.analysed[0].report.model.method).toBe(first.analysed[0].report.model.method);
    expect(one.analysed[0].report.lastWeek).not.toBe(first.analysed[0].report.lastWeek);
    expect(one.settings.series[0].options.backtestThrough).toBe(150);
    // What a colleague's refresh of the same book computes, from the cells and the saved options alone.
    expect(one.analysed[0].report.tables.outlook).toEqual(analyse(laneSeries(151), { ...AUTO, backtestThrough: 150 }).tables.outlook);

    book.blocks = laneBlocks(155);
    const five = await runAnalysis({ series: one.settings.series, settings: one.settings, kind: "refresh" }, deps);
    expect(five.settings.series[0].options.backtestThrough).toBe(155);
    expect(five.analysed[0].report.options.backtestThrough).toBeNull();
    expect(five.analysed[0].report.tables.backtest!.rows).toEqual(analyse(laneSeries(155), AUTO).tables.backtest!.rows);

    // Run (not a refresh) always re-scores.
    book.blocks = laneBlocks(156);
    const run = await runAnalysis({ series: five.settings.series, settings: five.settings }, deps);
    expect(run.analysed[0].report.options.backtestThrough).toBeNull();
    expect(run.settings.series[0].options.backtestThrough).toBe(156);
  });

  it("stops on a bad cell with the intake's sentence and the sheet cell, writing nothing", async () => {
    const blocks = laneBlocks(120);
    blocks.values[50] = ["n/a"];
    const book = new StandInBook(blocks);
    const e = await runAnalysis({ series: [entry()], settings: emptySettings() }, { workbook: book, engine, version: "0.1.0" }).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(RunStopped);
    expect((e as RunStopped).reason).toBe("input");
    // The series has no name before its first read: the sentence starts with where it is.
    expect((e as RunStopped).message.startsWith(`${sourceLabel(SOURCE)}: Row 51 holds "n/a"`)).toBe(true);
    expect((e as RunStopped).message).toMatch(/\(Cell Rates!B51\.\)$/);
    expect(book.writes).toHaveLength(0);
    expect(book.saved).toHaveLength(0);
  });

  it("stops on a bad option before any work", async () => {
    const book = new StandInBook(laneBlocks(120));
    const e = await runAnalysis({ series: [entry({ ...OPTIONS, horizon: 0 })], settings: emptySettings() }, { workbook: book, engine, version: "x" }).catch((x: unknown) => x);
    expect((e as RunStopped).message).toMatch(/weeks ahead must be a whole number/);
    expect(engine.stats().started).toBe(0);
  });

  it("cancels: nothing is written or saved", async () => {
    const book = new StandInBook(laneBlocks(200));
    const abort = new AbortController();
    const run = runAnalysis(
      { series: [entry({ ...OPTIONS, method: "auto", backtest: { testWeeks: 30, horizon: 4, modes: ["every"] } } as typeof OPTIONS)], settings: emptySettings() },
      { workbook: book, engine, version: "x" },
      { signal: abort.signal },
    );
    // Cancel as soon as the run has started its backtest jobs.
    setTimeout(() => abort.abort(), 0);
    const e = await run.catch((x: unknown) => x);
    expect(e).toBeInstanceOf(RunStopped);
    expect((e as RunStopped).reason).toBe("cancelled");
    expect(book.writes).toHaveLength(0);
    expect(book.saved).toHaveLength(0);
  }, 60_000);

  it("refuses two series of the same name", async () => {
    const book = new StandInBook(laneBlocks(120));
    const other: SavedSeries = { source: { ...SOURCE, ratesColumn: 2 }, name: "", options: OPTIONS };
    const e = await runAnalysis({ series: [entry(), other], settings: emptySettings() }, { workbook: book, engine, version: "x" }).catch((x: unknown) => x);
    expect((e as RunStopped).message).toMatch(/both called “Halden–Corvane FEU”/);
  });
});

describe("a pane run with an event column", () => {
  it("adds the weeks the column marks (a dated coming week too) to the listed ones, as analyse() with calendar.events; saves only the listed ones", async () => {
    const blocks = laneBlocks(180);
    const lane = laneSeries(180);
    const iso = (t: number): string => new Date(lane.dates[0].getTime() + t * 7 * 86_400_000).toISOString().slice(0, 10);
    // Column C marks weeks 40 and 100 and, two rows under the last rate, a coming week (t = 181).
    const marks: unknown[][] = Array.from({ length: 182 }, (_, t) => [t === 40 ? "x" : t === 100 ? 1 : t === 181 ? true : null]);
    const dates: unknown[][] = Array.from({ length: 182 }, (_, t) => [iso(t)]);
    const book = new StandInBook({ ...blocks, events: { marks, dates, address: "Rates!C2:C183", name: "Port strike" } });
    const options = { method: "sarima", horizon: 4, levels: [80], checks: false, calendar: { events: [iso(150)] } };
    const source: DataSource = { ...SOURCE, eventsColumn: 2 };
    const out = await runAnalysis({ series: [{ source, name: "", options }], settings: emptySettings() }, { workbook: book, engine, version: "0.1.0", now: () => NOW });
    const direct = analyse(lane, { ...options, calendar: { events: [iso(150), iso(40), iso(100), iso(181)] } });
    expect(direct.tables.fit.rows.map((r) => r[0])).toContain("Event weeks");
    expect(out.analysed[0].report.tables.outlook).toEqual(direct.tables.outlook);
    expect(out.analysed[0].report.tables.fit).toEqual(direct.tables.fit);
    // The column is read afresh every run: the saved options keep only the typed week.
    expect(book.saved[0].series[0].options).toEqual(options);
    expect(book.saved[0].series[0].source).toEqual(source);
  });

  it("stops before any work with the cell named when a mark is not one", async () => {
    const blocks = laneBlocks(120);
    const marks: unknown[][] = Array.from({ length: 120 }, (_, t) => [t === 30 ? "strike" : null]);
    const book = new StandInBook({ ...blocks, events: { marks, dates: blocks.dates?.slice(1) ?? [], address: "Rates!C2:C121", name: "Port strike" } });
    const run = runAnalysis(
      { series: [{ source: { ...SOURCE, eventsColumn: 2 }, name: "", options: { method: "lastweek", checks: false } }], settings: emptySettings() },
      { workbook: book, engine, version: "0.1.0", now: () => NOW },
    );
    await expect(run).rejects.toThrow(
      "Rates › column B from row 2: The event column “Port strike”: “strike” is not a mark; mark each event week with 1 (or x, TRUE) and leave the other weeks blank or 0. (Cell Rates!C32.)",
    );
    expect(book.writes).toHaveLength(0);
  });
});
