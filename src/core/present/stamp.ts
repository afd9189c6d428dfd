/**
 * The stamp at the top of every managed sheet: what the results were made from and when, so a
 * manager who opens the book read-only, without the add-in, can tell how current they are.
 */
import type { Cell } from "../report";
import type { ResolvedOptions } from "../analysis";
import { isoDate } from "../series/calendar";
import type { AnalysedSeries } from "./sheets";
import { modePhrase } from "../evaluate/backtest";
import { DEFAULT_BACKTEST_HORIZON, DEFAULT_TEST_WEEKS } from "../evaluate/plan";

/** The first cell of every managed sheet: how a sink recognises a sheet it may rewrite. */
export const MANAGED_MARK = "Fairlead managed sheet";

export const CAUTION = "Forecasts are statistical estimates from past rates only; they are not advice to book, fix or trade.";

export interface StampInput {
  /** Product version (package.json). */
  version: string;
  /** Where the rates came from, as a person would say it: "desk-weekly.xlsx › Rates › WeeklyRates". */
  source: string;
  /** The series analysed, each with its first and last week (ISO dates, or null when undated). */
  series: { name: string; first: string | null; last: string | null; weeks: number; method: string; options?: ResolvedOptions }[];
  /**
   * The options the run used. A series analysed with other options (the pane keeps options per
   * series) carries its own, and its Series line says them.
   */
  options: ResolvedOptions;
  /** When the run was made, as an ISO-8601 UTC timestamp. */
  ranAt: string;
}

/** The options in one line of words. */
export function optionsPhrase(o: ResolvedOptions): string {
  const parts = [`${o.horizon} weeks ahead`, `coverage ${o.levels.map((l) => `${l}%`).join(", ")}`];
  parts.push(o.checks ? "checks on" : "checks off");
  const lny = o.calendar?.lunarNewYear;
  if (lny) parts.push(`lunar-new-year weeks −${lny.before} to +${lny.after} as regressors (SARIMA, TBATS)`);
  const events = o.calendar?.events ?? [];
  if (events.length > 0) parts.push(`${events.length} event week${events.length === 1 ? "" : "s"} as a regressor (SARIMA, TBATS): ${events.length <= 4 ? events.join(", ") : `${events.slice(0, 3).join(", ")} … ${events[events.length - 1]}`}`);
  if (o.backtest || o.method === "auto") {
    const b = o.backtest ?? {};
    const modes = (b.modes ?? ["every"]).map((m) => modePhrase(m)).join("; ");
    const windows = b.windows ?? 1;
    parts.push(
      `backtest over the last ${(b.testWeeks ?? DEFAULT_TEST_WEEKS) * windows} weeks, ${b.horizon ?? DEFAULT_BACKTEST_HORIZON} ahead, ${modes}` +
        (o.method === "auto" ? `, chosen by ${o.choose.toUpperCase()}` : "") +
        (o.backtestThrough !== null ? `, kept from the last full run (its first ${o.backtestThrough} weeks)` : ""),
    );
  }
  return parts.join("; ");
}

/** The latest week over all series (the as-of week), or null when none is dated. */
export function asOfWeek(stamp: StampInput): string | null {
  let last: string | null = null;
  for (const s of stamp.series) if (s.last !== null && (last === null || s.last > last)) last = s.last;
  return last;
}

/** What the mark's neighbour says of a managed sheet unless told otherwise. */
export const MANAGED_LEAD = "Fairlead rewrites this sheet on every run: type nothing here, link to it instead.";

/** The stamp as label/value rows; `what` names the sheet's contents ("Outlook"), `lead` how the sheet is kept. */
export function stampRows(stamp: StampInput, what: string, lead: string = MANAGED_LEAD): Cell[][] {
  const rows: Cell[][] = [
    [MANAGED_MARK, `${what}. ${lead}`],
    ["As of week ending", asOfWeek(stamp)],
    ["Data", stamp.source],
  ];
  const common = optionsPhrase(stamp.options);
  const own = (s: StampInput["series"][number]): string | null => {
    const p = s.options ? optionsPhrase(s.options) : common;
    return p === common ? null : p;
  };
  for (const s of stamp.series) {
    const span = s.first && s.last ? `${s.first} to ${s.last}` : "undated";
    const phrase = own(s);
    rows.push([`Series`, `${s.name}: ${s.weeks} weeks, ${span}; method ${s.method}${phrase ? `; options: ${phrase}` : ""}`]);
  }
  rows.push(["Options", stamp.series.some((s) => own(s) !== null) ? `${common} (unless a Series line says otherwise)` : common]);
  rows.push(["Made", `${stamp.ranAt} by Fairlead ${stamp.version}`]);
  rows.push(["Caution", CAUTION]);
  return rows;
}

/** The stamp of a run over analysed series; `source` says where the rates came from. */
export function stampOf(source: string, analysed: AnalysedSeries[], ranAt: Date, version: string): StampInput {
  return {
    version,
    source,
    series: analysed.map((a) => {
      const n = a.series.values.length;
      const dated = a.series.dates.length === n && n > 0;
      return {
        name: a.name,
        first: dated ? isoDate(a.series.dates[0]) : null,
        last: dated ? isoDate(a.series.dates[n - 1]) : null,
        weeks: n,
        method: a.report.model.label,
        options: a.report.options,
      };
    }),
    options: analysed[0].report.options,
    ranAt: ranAt.toISOString().replace(/\.\d{3}Z$/, "Z"),
  };
}
