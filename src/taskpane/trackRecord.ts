/**
 * The sentence the pane shows of a track record (core/present/publishSheets.ts makes the sheet):
 * what it scored and what still waits. Pure: no Office calls.
 */
import { TRACK_SHEET } from "../core/present/trackSheet";
import type { TrackRecord } from "../core/record/track";

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
