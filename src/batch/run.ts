/**
 * The `run` and `publish` verbs: read a book, analyse every chosen rate column with analyse()
 * through the engine (backtests spread over the worker threads), and write the managed sheets,
 * workbook names and chart images into a copy of the book (or into another book, or in place
 * when told). Publish goes one step further on the same path (publish.ts): the published
 * snapshot, the run's forecasts appended to the book's log, and the track record.
 */
import * as fs from "fs";
import * as path from "path";
import type ExcelJS from "exceljs";
import type { AnalysisOptions, Report } from "../core/analysis";
import { resolveOptions } from "../core/analysis";
import type { WeeklySeries } from "../core/series/types";
import { PUBLISHED_SHEET, type PublishPart } from "../core/present/published";
import { managedSheets, type AnalysedSeries, type ManagedSheet } from "../core/present/sheets";
import { stampOf, type StampInput } from "../core/present/stamp";
import { TRACK_SHEET } from "../core/present/trackSheet";
import { trackOfLog } from "../core/present/publishSheets";
import { MANAGED_MARK } from "../core/present/stamp";
import { LOG_SHEET, type LogReading } from "../core/record/log";
import type { TrackRecord } from "../core/record/track";
import { analyseMany, createEngine, type Engine, type Transport } from "../engine";
import { NodeTransport } from "../engine/node";
import { chartPng } from "./chartImage";
import { UsageError } from "./errors";
import { publishRun, readBookLog, writeLog, type PublishOutcome } from "./publish";
import { bookBlock, chooseColumns, dateColumn, eventColumnWeeks, loadBook, readSeries, type Block } from "./source";
import type { ProgressSink } from "./progress";
import { RUN_SHEETS, checkManagedNames, partsNotKept, saveBook, sheetNamed, writeManaged } from "./writeBook";

export interface RunSettings {
  book: string;
  sheet?: string;
  table?: string;
  columns?: string[];
  dates?: string;
  /** A column of event marks (1, x or TRUE in the event weeks): its weeks join options.calendar.events. */
  eventColumn?: string;
  options: AnalysisOptions;
  /** Output book (default: <book>.fairlead.xlsx beside the input). */
  out?: string;
  /** Write the managed sheets into this book instead of a copy of the input. */
  into?: string;
  /** Rewrite the input book itself (only its managed sheets). */
  inPlace: boolean;
  /** Draw the charts as images (default true). */
  charts: boolean;
  /** Workers (default: the machine's cores). */
  workers?: number;
  /** How the engine runs its jobs (default: worker threads); tests may run them inline. */
  transport?: Transport;
  /** The run's timestamp for the stamp (default now); tests fix it. Publish is stamped with it too. */
  now?: Date;
  /** Publish as well: the snapshot of these parts, the log append and the track record. */
  publish?: { parts: PublishPart[] };
}

export interface RunResult {
  analysed: AnalysedSeries[];
  sheets: ManagedSheet[];
  stamp: StampInput;
  /** The book written, or null when nothing was written (--json without --out). */
  written: string | null;
  warnings: string[];
  seconds: number;
  /** What Publish wrote and found, when publishing. */
  publish?: PublishOutcome;
  /** The track record written (by publish, or by a run over a book that keeps a log). */
  track?: TrackRecord;
}

/**
 * The log a plain run scores for the track record: none when the book keeps no log, or when
 * the track record cannot be rewritten, which a warning says only if Fairlead wrote one before
 * (a sheet of the user's that happens to be called Fairlead Log is no business of a run).
 */
function logForTrack(wb: ExcelJS.Workbook, warnings: string[]): LogReading | null {
  if (!sheetNamed(wb, LOG_SHEET)) return null;
  const had = sheetNamed(wb, TRACK_SHEET);
  if (had && had.getCell(1, 1).value !== MANAGED_MARK) return null;
  try {
    return readBookLog(wb);
  } catch (e) {
    if (!(e instanceof UsageError)) throw e;
    if (had) warnings.push(`${TRACK_SHEET} is left as it was: ${e.message}`);
    return null;
  }
}

/** The project's version, from the package.json above this file (source or build tree alike). */
export function fairleadVersion(): string {
  let dir = __dirname;
  for (let i = 0; i < 6; i++) {
    const p = path.join(dir, "package.json");
    if (fs.existsSync(p)) {
      const pkg = JSON.parse(fs.readFileSync(p, "utf8")) as { name?: string; version?: string };
      if (pkg.name === "fairlead" && pkg.version) return pkg.version;
    }
    dir = path.dirname(dir);
  }
  return "unknown";
}

export function defaultOut(book: string): string {
  return book.replace(/(\.xlsx)?$/i, ".fairlead.xlsx");
}

/** The series of a block, every chosen column through the intake (an event column is never one). */
export function seriesOfBlock(block: Block, columns: string[] | undefined, dates: string | undefined, eventColumn?: string): WeeklySeries[] {
  const chosen = chooseColumns(block, { columns, dates, events: eventColumn });
  if (chosen.dates === null && !columns) {
    // Without dates the season and the outlook's weeks are unknown: say so rather than guess.
    throw new UsageError(`${block.label} has no column of dates; name it with --dates (or give --column to analyse undated rates).`);
  }
  return chosen.rates.map((j) => readSeries(block, j, chosen.dates));
}

/**
 * The analysis options with the weeks an event column marks added to the listed event weeks
 * (unchanged without an event column).
 */
export function withEventColumn(block: Block, options: AnalysisOptions, eventColumn: string | undefined, dates: string | undefined): AnalysisOptions {
  if (!eventColumn) return options;
  const marked = eventColumnWeeks(block, eventColumn, dateColumn(block, dates));
  const listed = options.calendar?.events ?? [];
  return { ...options, calendar: { ...options.calendar, events: [...listed, ...marked] } };
}

/** Analyses the series in one engine with the same options; progress is the mean over the series. */
export function analyseAll(engine: Engine, series: WeeklySeries[], options: AnalysisOptions, progress: ProgressSink): Promise<Report[]> {
  return analyseMany(
    engine,
    series.map((s) => ({ series: s, options })),
    { onProgress: (f, sentence) => progress.update(f, sentence) },
  );
}

async function chartImages(sheets: ManagedSheet[]): Promise<Map<string, Uint8Array>> {
  const images = new Map<string, Uint8Array>();
  // The published snapshot repeats charts of the managed sheets under ids of its own: draw each picture once.
  const drawn = new Map<string, Uint8Array>();
  for (const s of sheets) {
    for (const c of s.charts) {
      const key = JSON.stringify([{ ...c.spec, id: "" }, c.widthPx, c.heightPx]);
      const png = drawn.get(key) ?? (await chartPng(c.spec, { width: c.widthPx, height: c.heightPx }));
      drawn.set(key, png);
      images.set(c.spec.id, png);
    }
  }
  return images;
}

export async function runBook(settings: RunSettings, progress: ProgressSink, write: boolean): Promise<RunResult> {
  const started = Date.now();
  const input = path.resolve(settings.book);
  const out = settings.inPlace ? input : path.resolve(settings.out ?? defaultOut(settings.into ?? settings.book));
  if (!settings.inPlace && (out === input || (settings.into && out === path.resolve(settings.into)))) {
    throw new UsageError(`The output ${settings.out} is the book itself; give another --out, or --in-place to rewrite only Fairlead's sheets in it.`);
  }
  if (settings.inPlace && settings.into) throw new UsageError("--in-place rewrites the input book; it cannot be combined with --into.");

  const wb = await loadBook(settings.book);
  const target: ExcelJS.Workbook = settings.into ? await loadBook(settings.into) : wb;
  // Publish is a write: the log and the snapshot live in the book.
  const writing = write || settings.publish !== undefined;
  // Refuse before the slow part: a user's sheet under one of Fairlead's names stops the run,
  // and so does a log that cannot be appended to.
  if (writing) checkManagedNames(target, settings.publish ? [...RUN_SHEETS, PUBLISHED_SHEET, TRACK_SHEET] : RUN_SHEETS);
  const warnings: string[] = [];
  const log = settings.publish ? readBookLog(target) : writing ? logForTrack(target, warnings) : null;
  if (writing) {
    const lost = await partsNotKept(settings.into ?? settings.book);
    if (lost.length > 0) {
      if (settings.inPlace) {
        throw new UsageError(
          `${path.basename(settings.book)} holds ${lost.join(", ")}, which rewriting it here would drop; write a copy with --out instead.`,
        );
      }
      warnings.push(`The copy in ${path.basename(out)} does not carry the source book's ${lost.join(", ")}; the original is untouched.`);
    }
  }

  const block = bookBlock(wb, settings.book, { sheet: settings.sheet, table: settings.table });
  const series = seriesOfBlock(block, settings.columns, settings.dates, settings.eventColumn);
  const options = withEventColumn(block, settings.options, settings.eventColumn, settings.dates);
  for (const s of series) resolveOptions(s, options); // bad options fail before any work starts

  const engine = createEngine(settings.transport ?? new NodeTransport(), { size: settings.workers });
  let reports: Report[];
  try {
    reports = await analyseAll(engine, series, options, progress);
  } finally {
    engine.close();
  }
  const analysed: AnalysedSeries[] = series.map((s, i) => ({ name: s.name ?? `Series ${i + 1}`, series: s, report: reports[i] }));
  const stamp = stampOf(block.label, analysed, settings.now ?? new Date(), fairleadVersion());
  const sheets = managedSheets(analysed, stamp);
  const publish = settings.publish ? publishRun(analysed, stamp, settings.publish.parts, log) : undefined;
  // A run over a book that keeps a log scores it against the rates just read, as the pane's Run does.
  const ofLog = !publish && log ? trackOfLog(log.rows.map((r) => r.entry), analysed, stamp) : null;
  const track = publish ? publish.record : ofLog?.record;
  const trackOnly = ofLog?.sheet ?? null;
  let written: string | null = null;
  if (writing) {
    progress.update(1, "Drawing the charts and writing the book");
    // The snapshot and the track record are replaced like the managed sheets; the log is only added to.
    const all = publish ? [...sheets, publish.published, publish.track] : trackOnly ? [...sheets, trackOnly] : sheets;
    const images = settings.charts ? await chartImages(all) : new Map<string, Uint8Array>();
    writeManaged(target, all, images);
    if (publish) writeLog(target, publish.plan, log);
    await saveBook(target, out);
    written = out;
  }
  progress.done();
  return { analysed, sheets, stamp, written, warnings, seconds: (Date.now() - started) / 1000, ...(publish ? { publish } : {}), ...(track ? { track } : {}) };
}
