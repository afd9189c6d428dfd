/**
 * The track record as the pane keeps it: the Fairlead Track Record sheet made from the forecast
 * log's entries and the rates of the run at hand (core/record/track.ts, core/present/trackSheet.ts),
 * and the sentence that says what it scored. Publish writes it after adding to the log; a Run or
 * a refresh after pasted weeks rewrites it whenever the book keeps a log, so it follows every
 * new week without anything being added to the log. Pure: no Office calls.
 */
import type { AnalysedSeries, ManagedSheet } from "../core/present/sheets";
import type { StampInput } from "../core/present/stamp";
import { TRACK_SHEET, trackSheet } from "../core/present/trackSheet";
import type { LogEntry } from "../core/record/log";
import { actualsOf, trackRecord, type TrackRecord } from "../core/record/track";

export function trackRecordSheet(entries: LogEntry[], analysed: AnalysedSeries[], stamp: StampInput): { sheet: ManagedSheet; record: TrackRecord } {
  const record = trackRecord(entries, actualsOf(analysed));
  return { sheet: trackSheet(record, stamp), record };
}

function count(n: number, one: string, many: string): string {
  return `${n} ${n === 1 ? one : many}`;
}

/** "Fairlead Track Record: 2 forecasts scored, 6 awaiting their week." */
export function trackSentence(record: TrackRecord): string {
  const scored = record.series.reduce((s, r) => s + r.scoredCount, 0);
  const awaiting = record.series.reduce((s, r) => s + r.awaiting, 0);
  const unread = record.unread.length > 0 ? ` Not scored, as this run did not read their rates: ${record.unread.join(", ")}.` : "";
  return `${TRACK_SHEET}: ${count(scored, "forecast", "forecasts")} scored, ${count(awaiting, "awaiting its week", "awaiting their weeks")}.${unread}`;
}
