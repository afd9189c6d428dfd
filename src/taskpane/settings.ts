/**
 * What the pane keeps in the workbook (Excel's per-add-in settings), so that a colleague who
 * opens the book and refreshes gets the same run: every analysed series with where its rates
 * come from and the options it was analysed with, whether to refresh on new weeks, and the
 * ledger of cells the pane wrote on each managed sheet (ledger.ts).
 *
 * Settings read back from a book may have been written by another version or edited by hand:
 * they are checked entry by entry, and what cannot be used is dropped with a sentence.
 */
import type { AnalysisOptions } from "../core/analysis";
import { isSheetLedger, type SheetLedger } from "./ledger";
import { isDataSource, sameSource, type DataSource } from "./source";

/** Keys in the workbook settings. */
export const SERIES_KEY = "fairlead.series";
export const LEDGER_KEY = "fairlead.ledgers";

export interface SavedSeries {
  source: DataSource;
  /** The series' name as last read (header text or table column). */
  name: string;
  options: AnalysisOptions;
}

export interface PaneSettings {
  series: SavedSeries[];
  /** Re-run when rows are added or values change in a watched source. */
  watch: boolean;
  /** By managed sheet name. */
  ledgers: Record<string, SheetLedger>;
}

export function emptySettings(): PaneSettings {
  return { series: [], watch: true, ledgers: {} };
}

/** The stored form of the series list (one settings value). */
export interface StoredSeries {
  version: 1;
  watch: boolean;
  series: SavedSeries[];
}

function isOptions(x: unknown): x is AnalysisOptions {
  return typeof x === "object" && x !== null && !Array.isArray(x);
}

/** Reads the two settings values back; `problems` says what was dropped and why. */
export function parseSettings(series: unknown, ledgers: unknown): { settings: PaneSettings; problems: string[] } {
  const settings = emptySettings();
  const problems: string[] = [];
  if (series !== null && series !== undefined) {
    const s = series as Partial<StoredSeries>;
    if (typeof s !== "object" || s.version !== 1 || !Array.isArray(s.series)) {
      problems.push("The saved list of analysed series is not in a form this version of Fairlead reads; it was set aside.");
    } else {
      settings.watch = s.watch !== false;
      for (const item of s.series as unknown[]) {
        const e = item as Partial<SavedSeries>;
        if (typeof e === "object" && e !== null && isDataSource(e.source) && typeof e.name === "string" && isOptions(e.options)) {
          settings.series.push({ source: e.source, name: e.name, options: e.options });
        } else {
          problems.push("One saved series could not be read back and was dropped; analyse it again to keep it.");
        }
      }
    }
  }
  if (ledgers !== null && ledgers !== undefined) {
    if (typeof ledgers !== "object" || Array.isArray(ledgers)) {
      problems.push("The record of cells Fairlead wrote is unreadable; its sheets will be treated as unknown.");
    } else {
      for (const [name, l] of Object.entries(ledgers as Record<string, unknown>)) {
        if (isSheetLedger(l) && l.sheet === name) settings.ledgers[name] = l;
        else problems.push(`The record of cells Fairlead wrote on ${name} is unreadable; that sheet will be treated as unknown.`);
      }
    }
  }
  return { settings, problems };
}

export function storedSeries(settings: PaneSettings): StoredSeries {
  return { version: 1, watch: settings.watch, series: settings.series };
}

/** The list with `entry` in place of the series from the same source, or added at the end. */
export function withSeries(list: SavedSeries[], entry: SavedSeries): SavedSeries[] {
  const i = list.findIndex((s) => sameSource(s.source, entry.source));
  if (i < 0) return [...list, entry];
  const out = [...list];
  out[i] = entry;
  return out;
}

export function withoutSeries(list: SavedSeries[], source: DataSource): SavedSeries[] {
  return list.filter((s) => !sameSource(s.source, source));
}
