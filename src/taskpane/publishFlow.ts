/**
 * Publish from the pane: the last run's results as a snapshot of plain values (Fairlead
 * Published, core/present/published.ts), its outlook added to the forecast log (Fairlead Log,
 * core/record/log.ts), and the track record rewritten from the log (Fairlead Track Record).
 * The host is reached only through `PaneWorkbook`, as for a run, so this module runs anywhere.
 *
 * The steps are ordered so that a refusal leaves nothing half-written:
 *   1. read the log and plan the append: a sheet of the log's name that is not the log, or a
 *      log that lost its header, stops Publish before anything is written;
 *   2. write Published and Track Record through the managed-sheet writer, which refuses (again
 *      before writing anything) when someone typed into either, or when a sheet of their name
 *      is not Fairlead's;
 *   3. add the plan's rows below the log: the only step that touches the log, and it never
 *      writes above its last row;
 *   4. keep the new ledgers in the book's settings.
 * Publishing the same run twice adds nothing to the log the second time (the log says so).
 */
import { PUBLISH_PARTS, type PublishPart } from "../core/present/published";
import { publishSheets } from "../core/present/publishSheets";
import type { AnalysedSeries } from "../core/present/sheets";
import type { StampInput } from "../core/present/stamp";
import { LOG_SHEET, LogRefused, type LogReading } from "../core/record/log";
import type { LogAppended } from "./excel/forecastLog";
import type { WriteOptions, WrittenSheet } from "./excel/writeSheets";
import type { SheetLedger } from "./ledger";
import type { PaneWorkbook } from "./runFlow";
import type { PaneSettings } from "./settings";
import { trackSentence } from "./trackRecord";

export interface PublishRequest {
  /** The run whose results are published: the pane's last Run or refresh. */
  run: { analysed: AnalysedSeries[]; stamp: StampInput };
  parts: PublishPart[];
  settings: PaneSettings;
  write?: WriteOptions;
}

export interface PublishDeps {
  workbook: PaneWorkbook;
  now?: () => Date;
}

export interface PublishOutcome {
  /** Fairlead Published and Fairlead Track Record, as written. */
  sheets: WrittenSheet[];
  log: LogAppended;
  /** The settings as saved (the two sheets' ledgers). */
  settings: PaneSettings;
  /** What the pane shows: what the log held and gained, and what was written. */
  sentences: string[];
}

/** A Publish that stopped, with the sentence the pane shows. */
export class PublishStopped extends Error {
  constructor(message: string) {
    super(message);
    this.name = "PublishStopped";
  }
}

function isoSeconds(d: Date): string {
  return d.toISOString().replace(/\.\d{3}Z$/, "Z");
}

function sheetPhrase(s: WrittenSheet): string {
  return `${s.name}: ${s.rows} rows${s.charts.length ? `, ${s.charts.length} chart${s.charts.length === 1 ? "" : "s"}` : ""}${s.created ? " (new sheet)" : ""}`;
}

/** Publishes `request.run`; throws PublishStopped, or the writer's WriteRefused (nothing written). */
export async function publishRun(request: PublishRequest, deps: PublishDeps): Promise<PublishOutcome> {
  const { analysed, stamp } = request.run;
  if (analysed.length === 0) throw new PublishStopped("Run first: Publish shows the results of the last run.");
  const parts = PUBLISH_PARTS.map((p) => p.part).filter((p) => request.parts.includes(p));
  if (parts.length === 0) throw new PublishStopped("Choose at least one part to publish.");
  const publishedAt = isoSeconds((deps.now ?? (() => new Date()))());

  // 1. The log as it stands, and what this Publish adds to it.
  let reading: LogReading | null;
  try {
    reading = await deps.workbook.readLog();
  } catch (e) {
    if (e instanceof LogRefused) throw new PublishStopped(`${e.message} Fairlead published nothing.`);
    throw e;
  }
  const { published, track, record, plan, skipped } = publishSheets(analysed, stamp, parts, reading, publishedAt);

  // 2. The snapshot and the track record of the log as it will stand.
  const sheets = [published, track];
  const own: Record<string, SheetLedger> = {};
  for (const s of sheets) if (request.settings.ledgers[s.name]) own[s.name] = request.settings.ledgers[s.name];
  const written = await deps.workbook.write(sheets, own, request.write ?? {});
  const ledgers: Record<string, SheetLedger> = { ...request.settings.ledgers };
  for (const l of written.ledgers) ledgers[l.sheet] = l;
  const settings: PaneSettings = { ...request.settings, ledgers };

  // 3. The log's new rows; 4. the ledgers (kept even when the log could not be added to, so
  // the next Publish can rewrite the two sheets just written).
  let log: LogAppended;
  try {
    log = await deps.workbook.appendLog(plan, reading);
  } catch (e) {
    await deps.workbook.saveSettings(settings);
    const why = e instanceof LogRefused ? e.message : `Excel did not take the rows (${e instanceof Error ? e.message : String(e)}).`;
    throw new PublishStopped(`${sheets.map((s) => s.name).join(" and ")} were written, but nothing was added to ${LOG_SHEET}: ${why}`);
  }
  await deps.workbook.saveSettings(settings);

  const sentences = [...plan.sentences];
  if (log.added > 0) sentences[0] = `${sentences[0].replace(/\.$/, "")}, rows ${log.firstRow}–${log.lastRow}.`;
  for (const name of skipped) sentences.push(`${name} has no dated weeks, so its outlook is published but not logged: the log needs target weeks to score.`);
  const shown = PUBLISH_PARTS.filter((p) => parts.includes(p.part)).map((p) => p.label.toLowerCase());
  sentences.push(`${sheetPhrase(written.sheets[0])}; shows ${shown.join(", ")}.`);
  sentences.push(trackSentence(record));
  return { sheets: written.sheets, log, settings, sentences };
}
