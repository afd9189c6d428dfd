/**
 * Publish from the pane, end to end below the page: runAnalysis with the real core and engine
 * (inline transport, the fast "drift" method), then publishRun, writing through the real
 * managed-sheet writer and forecast-log writer into a stored book over office-addin-mock
 * (excel/mockBook.ts). Only the rates' cells are given straight to the flow (readSource has
 * tests of its own), and native charts are replaced by a recorder (charts.test.ts covers them).
 */
import { PUBLISHED_SHEET } from "../../src/core/present/published";
import { MANAGED_SHEETS } from "../../src/core/present/sheets";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { TRACK_SHEET } from "../../src/core/present/trackSheet";
import { LOG_COLUMNS, LOG_SHEET } from "../../src/core/record/log";
import { createEngine, InlineTransport, type Engine } from "../../src/engine";
import { paneWorkbookOf } from "../../src/taskpane/excel/paneWorkbook";
import type { SourceBlocks } from "../../src/taskpane/excel/readSource";
import { WriteRefused } from "../../src/taskpane/excel/writeSheets";
import { publishRun, PublishStopped } from "../../src/taskpane/publishFlow";
import { runAnalysis, type PaneWorkbook, type RunOutcome } from "../../src/taskpane/runFlow";
import { emptySettings, LEDGER_KEY, type PaneSettings, type SavedSeries } from "../../src/taskpane/settings";
import type { DataSource } from "../../src/taskpane/source";
import { laneSeries } from "../engine/lane";
import { MockBook, type Value } from "./excel/mockBook";

jest.mock("../../src/taskpane/excel/charts", () => ({
  drawCharts: jest.fn(async (_c: unknown, _s: string, plans: { name: string }[]) => plans.map((p) => p.name)),
}));

const HORIZON = 4;
const OPTIONS = { method: "drift", horizon: HORIZON, levels: [80, 95], checks: false };
const DAY_MS = 86_400_000;
const START = Date.UTC(2017, 0, 6);

/** Excel's 1900 date system: days since 1899-12-30. */
const isoOfSerial = (s: number): string => new Date(Date.UTC(1899, 11, 30) + s * DAY_MS).toISOString().slice(0, 10);

interface Lane {
  name: string;
  rates: number[];
}

/** Two invented lanes, each a column of the Rates sheet with the week-ending dates in column A. */
function lanes(weeks: number): Lane[] {
  return [
    { name: "Halden–Corvane FEU", rates: Array.from(laneSeries(weeks, 7).values) },
    { name: "Corvane–Halden FEU", rates: Array.from(laneSeries(weeks, 11).values, (v) => Math.round(v * 45) / 100) },
  ];
}

function blocksOf(lane: Lane, column: number): SourceBlocks {
  const n = lane.rates.length;
  const letter = String.fromCharCode(65 + column);
  return {
    name: lane.name,
    address: `Rates!${letter}1:${letter}${n + 1}`,
    values: [[lane.name], ...lane.rates.map((v) => [v])],
    dates: [["Week ending"], ...lane.rates.map((_, t) => [new Date(START + t * 7 * DAY_MS).toISOString().slice(0, 10)])],
    datesAddress: `Rates!A1:A${n + 1}`,
    datesFrom: "left",
  };
}

function source(column: number): DataSource {
  return { kind: "range", sheet: "Rates", ratesColumn: column, datesColumn: 0, top: 0, header: true };
}

/** A desk's book: the stored workbook, the rates in it, the pane's settings and its clock. */
class Desk {
  readonly book = new MockBook();
  lanes: Lane[];
  settings: PaneSettings = emptySettings();
  last: RunOutcome | null = null;
  clock = Date.parse("2026-12-03T09:00:00Z");
  readonly workbook: PaneWorkbook;

  constructor(
    weeks: number,
    readonly engine: Engine,
    count = 2,
  ) {
    this.lanes = lanes(weeks).slice(0, count);
    this.workbook = { ...paneWorkbookOf(this.book.run), readSource: async (s) => this.blocks(s) };
  }

  private blocks(s: DataSource): SourceBlocks {
    if (s.kind !== "range") throw new Error("the desk reads sheet columns");
    return blocksOf(this.lanes[s.ratesColumn - 1], s.ratesColumn);
  }

  /** Pastes the next weeks' rates under every lane, one array of rates per lane. */
  paste(...rates: number[][]): void {
    this.lanes = this.lanes.map((l, i) => ({ ...l, rates: [...l.rates, ...rates[i]] }));
  }

  async run(kind: "run" | "refresh" = "run"): Promise<RunOutcome> {
    const series: SavedSeries[] =
      this.settings.series.length > 0 ? this.settings.series : this.lanes.map((_, i) => ({ source: source(i + 1), name: "", options: OPTIONS }));
    this.clock += 60_000;
    const at = this.clock;
    this.last = await runAnalysis({ series, settings: this.settings, kind }, { workbook: this.workbook, engine: this.engine, version: "0.1.0", now: () => new Date(at) });
    this.settings = this.last.settings;
    return this.last;
  }

  async publish(parts = ["outlook", "season", "checks", "backtest"] as ("outlook" | "season" | "checks" | "backtest")[]) {
    this.clock += 60_000;
    const at = this.clock;
    const out = await publishRun({ run: this.last!, parts, settings: this.settings, write: { activate: true } }, { workbook: this.workbook, now: () => new Date(at) });
    this.settings = out.settings;
    return out;
  }

  /** A week later: one more week of rates per lane, then a Run. */
  async nextWeek(...rates: number[]): Promise<RunOutcome> {
    this.paste(...rates.map((r) => [r]));
    this.clock += 7 * DAY_MS;
    return this.run();
  }
}

/** The log's entry rows as read from the sheet: header by name, rows below it. */
function logRows(book: MockBook): Record<(typeof LOG_COLUMNS)[number], Value>[] {
  const grid = book.grid(LOG_SHEET);
  const h = grid.findIndex((r) => r.includes("Origin week"));
  return grid.slice(h + 1).filter((r) => r.some((v) => v !== "")).map((r) => Object.fromEntries(LOG_COLUMNS.map((c) => [c, r[grid[h].indexOf(c)]])) as Record<(typeof LOG_COLUMNS)[number], Value>);
}

/** The track record's summary rows of one series, by "Weeks ahead" (1, 2, …, "All"). */
function trackSummary(book: MockBook, series: string): Map<Value, Record<string, Value>> {
  const grid = book.grid(TRACK_SHEET);
  const heading = grid.findIndex((r) => r[0] === series);
  const h = grid.findIndex((r, i) => i > heading && r[0] === "Method" && r[1] === "Weeks ahead");
  const columns = grid[h].filter((c) => c !== "") as string[];
  const out = new Map<Value, Record<string, Value>>();
  for (let r = h + 1; grid[r][0] === "drift"; r++) out.set(grid[r][1], Object.fromEntries(columns.map((c, j) => [c, grid[r][j]])));
  return out;
}

let engine: Engine;
beforeEach(() => {
  engine = createEngine(new InlineTransport());
});
afterEach(() => engine.close());

describe("Publish from the pane", () => {
  it("writes Published, Track Record and Log as plain values: numbers and text, no formulas, nothing that reads as one", async () => {
    const desk = new Desk(150, engine);
    await desk.run();
    const before = desk.book.writes.length;
    const names = new Map(desk.book.names);
    expect(names.size).toBeGreaterThan(0);
    const out = await desk.publish();
    const writes = desk.book.writes.slice(before);
    expect([...new Set(writes.map((w) => w.sheet))].sort()).toEqual([PUBLISHED_SHEET, LOG_SHEET, TRACK_SHEET].sort());
    // Only values and number formats are assigned: no formulas of any kind.
    expect([...new Set(writes.map((w) => w.property))].sort()).toEqual(["numberFormat", "values"]);
    for (const w of writes.filter((x) => x.property === "values")) {
      for (const v of (w.value as unknown[][]).flat()) {
        const plain = typeof v === "number" ? Number.isFinite(v) : typeof v === "string" && !v.startsWith("=");
        if (!plain) throw new Error(`${w.sheet} row ${w.row + 1}: ${JSON.stringify(v)} is not a plain value`);
      }
    }
    // No workbook names over the published sheets: the snapshot links to nothing and nothing links to it.
    // The outlook's names (the budget links) are left exactly as the run made them.
    expect(new Map(desk.book.names)).toEqual(names);
    expect(desk.book.grid(PUBLISHED_SHEET)[0][0]).toBe(MANAGED_MARK);
    expect(desk.book.grid(TRACK_SHEET)[0][0]).toBe(MANAGED_MARK);
    expect(desk.book.active).toBe(PUBLISHED_SHEET);
    // The two sheets' ledgers are kept in the book, beside the four of the run.
    const ledgers = JSON.parse(desk.book.settings.get(LEDGER_KEY)!) as Record<string, unknown>;
    expect(Object.keys(ledgers).sort()).toEqual([...MANAGED_SHEETS.map((m) => m.name), PUBLISHED_SHEET, TRACK_SHEET].sort());
    expect(out.sentences[0]).toBe(`Started Fairlead Log with ${2 * HORIZON} forecasts, rows 5–${4 + 2 * HORIZON}.`);
    expect(out.sentences).toContain(`${TRACK_SHEET}: 0 forecasts scored, ${2 * HORIZON} awaiting their weeks.`);
  });

  it("grows the log by exactly series × weeks ahead per Publish, below the earlier rows, which stay as they were", async () => {
    const desk = new Desk(150, engine);
    await desk.run();
    await desk.publish();
    const first = desk.book.grid(LOG_SHEET).map((r) => [...r]);
    const firstRows = logRows(desk.book);
    expect(firstRows).toHaveLength(2 * HORIZON);
    expect(new Set(firstRows.map((r) => r["Series"]))).toEqual(new Set(desk.lanes.map((l) => l.name)));

    const at = desk.lanes.map((l) => l.rates[l.rates.length - 1]);
    await desk.nextWeek(at[0] * 1.01, at[1] * 0.99);
    const out = await desk.publish();
    const second = desk.book.grid(LOG_SHEET);
    expect(second).toHaveLength(first.length + 2 * HORIZON);
    expect(second.slice(0, first.length)).toEqual(first);
    expect(out.log).toMatchObject({ added: 2 * HORIZON, firstRow: first.length + 1, lastRow: first.length + 2 * HORIZON, created: false });
    expect(out.sentences[0]).toBe(`Added ${2 * HORIZON} forecasts to Fairlead Log (${2 * HORIZON} already there), rows ${first.length + 1}–${first.length + 2 * HORIZON}.`);
    // The new rows are the later origin's.
    const rows = logRows(desk.book);
    const origins = [...new Set(rows.map((r) => r["Origin week"]))] as number[];
    expect(origins).toHaveLength(2);
    expect(origins[1] - origins[0]).toBe(7);
    expect(rows.slice(2 * HORIZON).every((r) => r["Origin week"] === origins[1])).toBe(true);

    // Publishing the same run again adds nothing, and says so.
    const again = await desk.publish();
    expect(desk.book.grid(LOG_SHEET)).toHaveLength(second.length);
    expect(again.sentences).toContain(`${2 * HORIZON} forecasts were already in the log with the same values and were not added again.`);
  });

  it("rewrites the track record on a refresh after two pasted weeks, as computed by hand from the log and the rates", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    await desk.publish();
    const logged = logRows(desk.book);
    const publishedBefore = desk.book.grid(PUBLISHED_SHEET);
    const writesBefore = desk.book.writes.length;

    // Two weeks arrive: the first above the logged outlook, the second below it.
    const byAhead = (h: number) => logged.find((r) => r["Weeks ahead"] === h)!;
    const y = [Math.round((byAhead(1)["Forecast"] as number) * 103) / 100, Math.round((byAhead(2)["Forecast"] as number) * 96) / 100];
    desk.paste(y);
    await desk.run("refresh");

    // The refresh wrote the managed sheets and Track Record, and neither Published nor the log.
    const touched = new Set(desk.book.writes.slice(writesBefore).map((w) => w.sheet));
    expect(touched.has(TRACK_SHEET)).toBe(true);
    expect(touched.has(PUBLISHED_SHEET)).toBe(false);
    expect(touched.has(LOG_SHEET)).toBe(false);
    expect(desk.book.grid(PUBLISHED_SHEET)).toEqual(publishedBefore);

    // By hand (Hyndman & Athanasopoulos, Forecasting: Principles and Practice, 3rd ed., §5.8):
    // error e = actual − forecast; MAPE = mean |100·e/y|. The pasted weeks are the logged
    // outlook's targets one and two weeks ahead.
    const lane = desk.lanes[0];
    const n = lane.rates.length;
    const weekOf = (t: number): string => new Date(START + t * 7 * DAY_MS).toISOString().slice(0, 10);
    expect(isoOfSerial(byAhead(1)["Target week"] as number)).toBe(weekOf(n - 2));
    expect(isoOfSerial(byAhead(2)["Target week"] as number)).toBe(weekOf(n - 1));
    const f = [byAhead(1)["Forecast"] as number, byAhead(2)["Forecast"] as number];
    const e = [y[0] - f[0], y[1] - f[1]];
    const ape = [Math.abs((100 * e[0]) / y[0]), Math.abs((100 * e[1]) / y[1])];
    const inside = (h: number, lo: "Inner low" | "Outer low", hi: "Inner high" | "Outer high"): number =>
      y[h - 1] >= (byAhead(h)[lo] as number) && y[h - 1] <= (byAhead(h)[hi] as number) ? 100 : 0;
    expect(e[0]).toBeGreaterThan(0);
    expect(e[1]).toBeLessThan(0);

    const summary = trackSummary(desk.book, lane.name);
    // The sheet holds the same sums taken in another order: agreement to 1e-9 is far inside
    // the 0.1 a rate is shown to, and far outside what a wrong pairing of weeks would give.
    const one = summary.get(1)!;
    expect(one["Forecasts scored"]).toBe(1);
    expect(one["Awaiting actuals"]).toBe(0);
    expect(one["Mean error"] as number).toBeCloseTo(e[0], 9);
    expect(one["Mean absolute error"] as number).toBeCloseTo(Math.abs(e[0]), 9);
    expect(one["MAPE %"] as number).toBeCloseTo(ape[0], 9);
    expect(one["Inside 80% interval (%)"]).toBe(inside(1, "Inner low", "Inner high"));
    expect(one["Inside 95% interval (%)"]).toBe(inside(1, "Outer low", "Outer high"));
    const two = summary.get(2)!;
    expect(two["Mean error"] as number).toBeCloseTo(e[1], 9);
    expect(two["MAPE %"] as number).toBeCloseTo(ape[1], 9);
    for (const h of [3, 4]) expect(summary.get(h)).toMatchObject({ "Forecasts scored": 0, "Awaiting actuals": 1, "Mean error": "" });
    const all = summary.get("All")!;
    expect(all["Forecasts scored"]).toBe(2);
    expect(all["Awaiting actuals"]).toBe(2);
    expect(all["Mean error"] as number).toBeCloseTo((e[0] + e[1]) / 2, 9);
    expect(all["Mean absolute error"] as number).toBeCloseTo((Math.abs(e[0]) + Math.abs(e[1])) / 2, 9);
    expect(all["MAPE %"] as number).toBeCloseTo((ape[0] + ape[1]) / 2, 9);
  });

  it("leaves Published and the log alone on a plain Run, and writes no track record before a first Publish", async () => {
    const desk = new Desk(150, engine, 1);
    const first = await desk.run();
    expect(first.written.sheets.map((s) => s.name)).toEqual(MANAGED_SHEETS.map((m) => m.name));
    await desk.publish();
    const log = desk.book.grid(LOG_SHEET);
    const published = desk.book.grid(PUBLISHED_SHEET);
    const at = desk.book.writes.length;
    const run = await desk.nextWeek(desk.lanes[0].rates[desk.lanes[0].rates.length - 1] + 5);
    expect(run.written.sheets.map((s) => s.name)).toEqual([...MANAGED_SHEETS.map((m) => m.name), TRACK_SHEET]);
    const touched = new Set(desk.book.writes.slice(at).map((w) => w.sheet));
    expect(touched.has(LOG_SHEET) || touched.has(PUBLISHED_SHEET)).toBe(false);
    expect(desk.book.grid(LOG_SHEET)).toEqual(log);
    expect(desk.book.grid(PUBLISHED_SHEET)).toEqual(published);
    expect(trackSummary(desk.book, desk.lanes[0].name).get(1)!["Forecasts scored"]).toBe(1);
  });

  it("keeps a log edited by hand as it stands and says what it found", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    await desk.publish();
    const grid = desk.book.grid(LOG_SHEET);
    const h = grid.findIndex((r) => r.includes("Origin week"));
    const forecast = grid[h].indexOf("Forecast");
    // A corrected forecast on the second logged row, and a note two rows under the last.
    desk.book.type(LOG_SHEET, h + 2, forecast, 2000);
    desk.book.type(LOG_SHEET, grid.length + 1, 0, "note: rates from week 49 are provisional");
    const edited = desk.book.grid(LOG_SHEET).map((r) => [...r]);

    await desk.nextWeek(desk.lanes[0].rates[desk.lanes[0].rates.length - 1]);
    const out = await desk.publish();
    const after = desk.book.grid(LOG_SHEET);
    expect(after.slice(0, edited.length)).toEqual(edited);
    expect(after).toHaveLength(edited.length + HORIZON);
    expect(out.sentences).toEqual(
      expect.arrayContaining([
        `Added ${HORIZON} forecasts to Fairlead Log (${HORIZON} already there), rows ${edited.length + 1}–${edited.length + HORIZON}.`,
        `1 row of the log was changed or added by hand (row ${h + 3}); it is kept as it stands and scored as it reads.`,
        `1 row of the log (${grid.length + 2}) does not read as a forecast (a series, origin and target week, weeks ahead, method and forecast); it is kept and not scored.`,
      ]),
    );
    // The track record scores the corrected forecast as it reads: the one-week-ahead target
    // of the first origin has arrived, and the corrected row is two weeks ahead.
    const track = desk.book.grid(TRACK_SHEET);
    expect(track.some((r) => r[3] === "drift" && r[2] === 2 && r[4] === 2000)).toBe(true);
  });

  it("stops on a sheet of the log's name that is not the log, writing nothing and saving nothing", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    desk.book.addSheet(LOG_SHEET, [["Calls to forwarders"], ["2026-11-02", "Asked for December space"]]);
    const writes = desk.book.writes.length;
    const settings = desk.book.settings.get(LEDGER_KEY);
    const e = await desk.publish().catch((x: unknown) => x);
    expect(e).toBeInstanceOf(PublishStopped);
    expect((e as Error).message).toBe(
      "The book has a sheet “Fairlead Log” that is not Fairlead's forecast log (its A1 is not “Fairlead forecast log”); rename that sheet so nothing of yours is overwritten. Fairlead published nothing.",
    );
    expect(desk.book.writes.length).toBe(writes);
    expect(desk.book.sheets.has(PUBLISHED_SHEET)).toBe(false);
    expect(desk.book.settings.get(LEDGER_KEY)).toBe(settings);
    expect(desk.book.grid(LOG_SHEET)).toEqual([["Calls to forwarders", ""], ["2026-11-02", "Asked for December space"]]);
    // A run does not mind the user's sheet, and says nothing of it: the pane never published here.
    const run = await desk.run();
    expect(run.warnings).toEqual([]);
  });

  it("leaves the track record as it was, and says why, when the log has lost its header after a Publish", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    await desk.publish();
    const track = desk.book.grid(TRACK_SHEET);
    const grid = desk.book.grid(LOG_SHEET);
    const h = grid.findIndex((r) => r.includes("Origin week"));
    desk.book.type(LOG_SHEET, h, grid[h].indexOf("Origin week"), "Made in week");
    const run = await desk.nextWeek(desk.lanes[0].rates[desk.lanes[0].rates.length - 1]);
    expect(run.written.sheets.map((s) => s.name)).toEqual(MANAGED_SHEETS.map((m) => m.name));
    expect(run.warnings).toContain(
      `${TRACK_SHEET} was left as it was: Fairlead Log has lost its header row (the one with “Origin week” and “Target week”); restore it, and Fairlead will add to the log again.`,
    );
    expect(desk.book.grid(TRACK_SHEET)).toEqual(track);
  });

  it("adds nothing to the log when someone typed into Fairlead Published: the writer refuses first", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    await desk.publish();
    desk.book.type(PUBLISHED_SHEET, 1, 1, "see my notes");
    const log = desk.book.grid(LOG_SHEET);
    await desk.nextWeek(desk.lanes[0].rates[desk.lanes[0].rates.length - 1]);
    const at = desk.book.writes.length;
    const e = await desk.publish().catch((x: unknown) => x);
    expect(e).toBeInstanceOf(WriteRefused);
    expect((e as Error).message).toMatch(/^Fairlead Published has been typed into at B2 \(now “see my notes”\)\. Fairlead wrote nothing\./);
    expect(desk.book.writes.length).toBe(at);
    expect(desk.book.grid(LOG_SHEET)).toEqual(log);
  });

  it("asks for at least one part, and publishes only the parts chosen", async () => {
    const desk = new Desk(150, engine, 1);
    await desk.run();
    await expect(desk.publish([])).rejects.toThrow("Choose at least one part to publish.");
    expect(desk.book.sheets.has(LOG_SHEET)).toBe(false);
    const out = await desk.publish(["outlook"]);
    expect(out.sentences).toContain(`${PUBLISHED_SHEET}: ${desk.book.grid(PUBLISHED_SHEET).length} rows, 1 chart (new sheet); shows outlook.`);
  });
});
