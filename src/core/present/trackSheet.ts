/**
 * The track-record sheet: the stamp, then per series the summary by method and weeks ahead,
 * the forecasts against the outcome with their chart beside, and every logged forecast with
 * its outcome (record/track.ts). Rewritten from the log and the rates whenever either changes.
 */
import type { TrackRecord } from "../record/track";
import { LOG_SHEET } from "../record/log";
import { SheetBuilder, chartRows } from "./sheetBuilder";
import type { ManagedSheet } from "./sheets";
import { stampRows, type StampInput } from "./stamp";

export const TRACK_SHEET = "Fairlead Track Record";

export const TRACK_LEAD = `Fairlead rewrites this sheet from ${LOG_SHEET} and the rates whenever either changes: type nothing here; correct the log instead.`;

export function trackSheet(record: TrackRecord, stamp: StampInput): ManagedSheet {
  const b = new SheetBuilder();
  b.pairs(stampRows(stamp, "Track record: published forecasts against the rates that followed", TRACK_LEAD), "stamp");
  const notes: string[] = [];
  if (record.superseded > 0) {
    notes.push(`${record.superseded} logged forecast${record.superseded === 1 ? " is" : "s are"} left out: a later Publish logged the same series, origin week, target week and method.`);
  }
  if (record.unread.length > 0) {
    notes.push(`Not scored, because this run did not read their rates: ${record.unread.join(", ")}.`);
  }
  for (const n of notes) {
    b.set(b.cursor, 0, n);
    b.style(b.cursor, 0, 1, 1, "note");
    b.cursor += 1;
  }
  if (notes.length > 0) b.cursor += 1;
  if (record.series.length === 0) {
    b.set(b.cursor, 0, `Nothing to score yet: ${LOG_SHEET} holds no forecast of the series read.`);
    b.style(b.cursor, 0, 1, 1, "note");
    b.cursor += 2;
  }
  for (const s of record.series) {
    b.heading(s.name);
    b.table(s.summary, `${s.name}: trackSummary`);
    const top = b.cursor;
    b.table(s.outcome, `${s.name}: trackOutcome`);
    if (s.chart) {
      b.chart(s.chart, top, s.outcome.columns.length + 1);
      b.cursor = Math.max(b.cursor, top + chartRows(s.chart) + 1);
    }
    b.table(s.scored, `${s.name}: trackScored`);
  }
  return b.done("track", TRACK_SHEET);
}
