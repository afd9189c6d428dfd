/**
 * What a Publish writes, computed once for every sink: the snapshot sheet, the log's append
 * plan, and the track record of the log as it will stand; and the track record alone, which a
 * run over a book that keeps a log rewrites. The pane and the batch runner only read the log
 * before and write these after, each with its own workbook code (the pane under
 * src/taskpane/excel, the batch runner through exceljs).
 */
import { appendPlan, logEntries, type AppendPlan, type LogEntry, type LogReading } from "../record/log";
import { actualsOf, trackRecord, type TrackRecord } from "../record/track";
import { publishedSheet, type PublishPart } from "./published";
import type { AnalysedSeries, ManagedSheet } from "./sheets";
import type { StampInput } from "./stamp";
import { trackSheet } from "./trackSheet";

/** The track-record sheet of log entries scored against the rates of the series analysed. */
export function trackOfLog(entries: LogEntry[], analysed: AnalysedSeries[], stamp: StampInput): { sheet: ManagedSheet; record: TrackRecord } {
  const record = trackRecord(entries, actualsOf(analysed));
  return { sheet: trackSheet(record, stamp), record };
}

export interface PublishSheets {
  published: ManagedSheet;
  track: ManagedSheet;
  record: TrackRecord;
  /** The rows to add to the log (and what was found in it). */
  plan: AppendPlan;
  /** Series published but not logged: undated, they have no target weeks to score. */
  skipped: string[];
}

/** A Publish of `analysed` at `publishedAt` (ISO-8601 UTC) over the book's log as read (null: none yet). */
export function publishSheets(analysed: AnalysedSeries[], stamp: StampInput, parts: PublishPart[], reading: LogReading | null, publishedAt: string): PublishSheets {
  const { entries, skipped } = logEntries(analysed, publishedAt);
  const plan = appendPlan(reading, entries);
  // The whole log after the append, corrections by hand included, against the rates just read.
  const { sheet: track, record } = trackOfLog(plan.entries, analysed, stamp);
  return { published: publishedSheet(analysed, stamp, parts, publishedAt), track, record, plan, skipped };
}
