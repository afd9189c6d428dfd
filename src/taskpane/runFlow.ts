/**
 * One run of the pane, from saved series to written sheets: read every series' cells, run
 * analyse() for each in the engine (the same engine, and so the same result cache, as the
 * worksheet functions), lay the managed sheets out (core/present), write them, and keep the
 * ledger and the series list in the workbook. The host is reached only through `PaneWorkbook`
 * (excel/paneWorkbook.ts in Excel; a stand-in in tests), so this module runs anywhere.
 *
 * A refresh is the same run with one difference: a series that gained a few weeks keeps the
 * backtest of its last full run (options.backtestThrough, saved with the series), so a pasted
 * week costs the chosen method's fit instead of a whole backtest; the backtest and the choice
 * of "auto" are re-scored on Run, or by a refresh once RESCORE_AFTER_WEEKS weeks have gone
 * unscored. What a refresh computes depends only on the cells and the saved settings, so a
 * colleague's refresh of the same book gives the same numbers; a series whose cells did not
 * change is answered from the engine's cache without fitting anything.
 *
 * When the book keeps a forecast log (a Publish started one), a run or a refresh also rewrites
 * Fairlead Track Record from the log as it stands and the rates just read, in the same write
 * as the managed sheets. Neither adds to the log nor touches Fairlead Published: only Publish
 * does (publishFlow.ts).
 */
import type { Report } from "../core/analysis";
import { needsBacktest, resolveOptions, type AnalysisOptions } from "../core/analysis";
import { managedSheets, type AnalysedSeries, type ManagedSheet } from "../core/present/sheets";
import { stampOf, type StampInput } from "../core/present/stamp";
import { TRACK_SHEET } from "../core/present/trackSheet";
import { LogRefused, type AppendPlan, type LogReading } from "../core/record/log";
import { InputError } from "../core/series/errors";
import type { WeeklySeries } from "../core/series/types";
import { analyseMany, type Engine } from "../engine";
import { isEngineCancelled, plainReason } from "../engine/errors";
import { cellName } from "../core/present/a1";
import { markedWeeks, originOf, seriesOfBlocks } from "./dataSummary";
import type { LogAppended } from "./excel/forecastLog";
import type { SourceBlocks } from "./excel/readSource";
import type { WriteOptions, WriteResult } from "./excel/writeSheets";
import type { SheetLedger } from "./ledger";
import type { PaneSettings, SavedSeries } from "./settings";
import { sourceLabel, type DataSource } from "./source";
import { trackOfLog } from "../core/present/publishSheets";

/** The workbook as a run needs it. */
export interface PaneWorkbook {
  /** The file's name, for the stamp ("desk-weekly.xlsx"); "" when unknown. */
  name(): Promise<string>;
  readSource(source: DataSource): Promise<SourceBlocks>;
  write(sheets: ManagedSheet[], ledgers: Record<string, SheetLedger>, options: WriteOptions): Promise<WriteResult>;
  /** The forecast log as it stands, or null when the book has none; throws LogRefused when a sheet of its name is not the log. */
  readLog(): Promise<LogReading | null>;
  /** Writes an append plan's rows below the log (starting the sheet on a first Publish); never a row above. */
  appendLog(plan: AppendPlan, reading: LogReading | null): Promise<LogAppended>;
  saveSettings(settings: PaneSettings): Promise<void>;
}

export interface RunControl {
  onProgress?: (fraction: number, sentence: string) => void;
  signal?: AbortSignal;
}

export interface RunDeps {
  workbook: PaneWorkbook;
  engine: Engine;
  version: string;
  now?: () => Date;
}

export interface RunRequest {
  series: SavedSeries[];
  settings: PaneSettings;
  /** "run": everything afresh (the Run button); "refresh": after new weeks (default "run"). */
  kind?: "run" | "refresh";
  write?: WriteOptions;
}

/** Weeks a refresh may leave unscored before it runs the backtest again. */
export const RESCORE_AFTER_WEEKS = 4;

/** Options with the weeks an event column marks added to the listed event weeks. */
export function withMarkedEvents(options: AnalysisOptions, marked: string[]): AnalysisOptions {
  if (marked.length === 0) return options;
  return { ...options, calendar: { ...options.calendar, events: [...(options.calendar?.events ?? []), ...marked] } };
}

function withoutThrough(options: AnalysisOptions): AnalysisOptions {
  const { backtestThrough: _dropped, ...rest } = options;
  return rest;
}

/**
 * The options a series is analysed with in this run, and the ones saved for the next refresh
 * (which remember how many weeks the backtest saw).
 */
export function runOptions(entry: SavedSeries, series: WeeklySeries, kind: "run" | "refresh", marked: string[] = []): { use: AnalysisOptions; save: AnalysisOptions } {
  const weeks = series.values.length;
  const base = withoutThrough(entry.options);
  const through = entry.options.backtestThrough;
  const keep = kind === "refresh" && through !== undefined && through < weeks && weeks - through <= RESCORE_AFTER_WEEKS;
  // The weeks the event column marks join the listed ones for this run only: the column is
  // read afresh every run, so they are not saved with the options.
  const marking = withMarkedEvents(base, marked);
  const use = keep ? { ...marking, backtestThrough: through } : marking;
  // Options were checked against this series when it was read (readAll).
  const save = needsBacktest(resolveOptions(series, marking)) ? { ...base, backtestThrough: keep ? (through as number) : weeks } : base;
  return { use, save };
}

export interface RunOutcome {
  analysed: AnalysedSeries[];
  /** The stamp the sheets carry: what Publish stamps its sheets with. */
  stamp: StampInput;
  /** The managed sheets written, and Fairlead Track Record after them when the book keeps a log. */
  sheets: ManagedSheet[];
  written: WriteResult;
  /** The settings as saved after the run (series names refreshed, new ledgers). */
  settings: PaneSettings;
  warnings: string[];
}

/** A run that stopped before writing, with the sentence the pane shows. */
export class RunStopped extends Error {
  constructor(
    message: string,
    readonly reason: "cancelled" | "input" | "failed",
  ) {
    super(message);
    this.name = "RunStopped";
  }
}

/** Shares of the progress bar: reading, analysing, writing. */
const READ_SHARE = 0.03;
const WRITE_SHARE = 0.07;

/** The sentence for an input problem in one series, with the sheet cell it points at. */
export function inputSentence(e: InputError, entry: SavedSeries, blocks?: SourceBlocks): string {
  const where = e.cell && blocks ? (() => {
    const sheet = originOf(blocks.address)?.sheet;
    return ` (Cell ${sheet ? `${sheet}!` : ""}${cellName(e.cell.row, e.cell.col)}.)`;
  })() : "";
  return `${entry.name || sourceLabel(entry.source)}: ${e.message}${where}`;
}

async function readAll(workbook: PaneWorkbook, entries: SavedSeries[]): Promise<{ series: WeeklySeries[]; names: string[]; marked: string[][] }> {
  const series: WeeklySeries[] = [];
  const names: string[] = [];
  const marked: string[][] = [];
  for (const entry of entries) {
    let blocks: SourceBlocks | undefined;
    try {
      blocks = await workbook.readSource(entry.source);
      const s = seriesOfBlocks(blocks, blocks.name);
      const weeks = blocks.events ? markedWeeks(blocks.events) : [];
      // Bad options stop the run before any work starts, with the option's own sentence.
      resolveOptions(s, withMarkedEvents(entry.options, weeks));
      series.push(s);
      names.push(s.name ?? blocks.name);
      marked.push(weeks);
    } catch (e) {
      if (e instanceof InputError) throw new RunStopped(inputSentence(e, entry, blocks), "input");
      throw e;
    }
  }
  return { series, names, marked };
}

/** Runs `request.series` and writes the managed sheets; throws RunStopped or the writer's WriteRefused. */
export async function runAnalysis(request: RunRequest, deps: RunDeps, control: RunControl = {}): Promise<RunOutcome> {
  if (request.series.length === 0) throw new RunStopped("Nothing to analyse: read a column of weekly rates in Data first.", "input");
  const say = control.onProgress ?? (() => undefined);
  say(0, "Reading the rates");
  const { series, names, marked } = await readAll(deps.workbook, request.series);
  const seen = new Set<string>();
  for (const n of names) {
    if (seen.has(n)) {
      throw new RunStopped(`Two analysed series are both called “${n}”; their sheets and names would collide. Give one of them another header.`, "input");
    }
    seen.add(n);
  }

  say(READ_SHARE, "Analysing");
  const kind = request.kind ?? "run";
  const plans = request.series.map((e, i) => runOptions(e, series[i], kind, marked[i]));
  let reports: Report[];
  try {
    reports = await analyseMany(
      deps.engine,
      series.map((s, i) => ({ series: s, options: plans[i].use })),
      {
        signal: control.signal,
        onProgress: (f, sentence) => say(READ_SHARE + (1 - READ_SHARE - WRITE_SHARE) * f, sentence),
      },
    );
  } catch (e) {
    if (isEngineCancelled(e) || control.signal?.aborted) throw new RunStopped("Cancelled: nothing was written.", "cancelled");
    if (e instanceof InputError) throw new RunStopped(e.message, "input");
    throw new RunStopped(`The analysis stopped: ${plainReason(e)}. Nothing was written.`, "failed");
  }
  if (control.signal?.aborted) throw new RunStopped("Cancelled: nothing was written.", "cancelled");

  const analysed: AnalysedSeries[] = series.map((s, i) => ({ name: names[i], series: s, report: reports[i] }));
  const book = await deps.workbook.name();
  const labels = request.series.map((e) => sourceLabel(e.source)).join("; ");
  const stamp = stampOf(book ? `${book} › ${labels}` : labels, analysed, (deps.now ?? (() => new Date()))(), deps.version);
  const sheets = managedSheets(analysed, stamp);
  const notes: string[] = [];
  const track = await trackOfRun(deps.workbook, analysed, stamp, request.settings, notes);
  if (track) sheets.push(track);

  say(1 - WRITE_SHARE, "Writing Fairlead's sheets and charts");
  const written = await deps.workbook.write(sheets, request.settings.ledgers, request.write ?? {});
  const ledgers: Record<string, SheetLedger> = { ...request.settings.ledgers };
  for (const l of written.ledgers) ledgers[l.sheet] = l;
  const settings: PaneSettings = {
    ...request.settings,
    series: request.series.map((e, i) => ({ ...e, name: names[i], options: plans[i].save })),
    ledgers,
  };
  await deps.workbook.saveSettings(settings);
  say(1, "Done");
  // The intake's notes are the Data section's (and the Data table's); these are the run's own.
  const warnings = analysed.flatMap((a) =>
    a.report.warnings.filter((w) => !a.series.warnings.includes(w)).map((w) => (analysed.length > 1 ? `${a.name}: ${w}` : w)),
  );
  return { analysed, stamp, sheets, written, settings, warnings: [...warnings, ...notes] };
}

/**
 * The track record a run rewrites: from the log as it stands, when the book keeps one. A sheet
 * of the log's name that is not the log leaves the track record as it was; that is said only
 * when the pane has written a track record in this book before (else the sheet is simply the
 * user's, and a run has no business with it).
 */
async function trackOfRun(workbook: PaneWorkbook, analysed: AnalysedSeries[], stamp: StampInput, settings: PaneSettings, notes: string[]): Promise<ManagedSheet | null> {
  let reading: LogReading | null;
  try {
    reading = await workbook.readLog();
  } catch (e) {
    if (!(e instanceof LogRefused)) throw e;
    if (settings.ledgers[TRACK_SHEET]) notes.push(`${TRACK_SHEET} was left as it was: ${e.message}`);
    return null;
  }
  if (reading === null) return null;
  return trackOfLog(reading.rows.map((r) => r.entry), analysed, stamp).sheet;
}
