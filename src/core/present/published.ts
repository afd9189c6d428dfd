/**
 * The published snapshot: the results a desk chooses to show (outlook, seasonal factors,
 * checks, backtest) on one sheet of plain values, under the same stamp as the managed sheets,
 * with charts that read only those values. A manager who opens the book read-only, without the
 * add-in, sees the same picture; nothing on it is a FAIRLEAD formula or a link to one. The
 * pane and the batch runner write it on Publish; the next Publish replaces it, while the
 * forecasts themselves stay in the log (record/log.ts).
 */
import type { Report } from "../analysis";
import type { ReportTable } from "../report";
import type { ChartSpec } from "./chartSpec";
import { backtestChart, outlookChart, seasonChart } from "./charts";
import { SheetBuilder, chartRows } from "./sheetBuilder";
import type { AnalysedSeries, ManagedSheet } from "./sheets";
import { stampRows, type StampInput } from "./stamp";

export const PUBLISHED_SHEET = "Fairlead Published";

/** What Publish can show, in the order it is laid out. */
export type PublishPart = "outlook" | "season" | "checks" | "backtest";
export const PUBLISH_PARTS: { part: PublishPart; label: string }[] = [
  { part: "outlook", label: "Outlook" },
  { part: "season", label: "Seasonal factors" },
  { part: "checks", label: "Checks" },
  { part: "backtest", label: "Backtest" },
];

/** Reads a list such as "outlook,season" (the batch's --parts); throws a sentence on a bad name. */
export function parseParts(text: string): PublishPart[] {
  const known = PUBLISH_PARTS.map((p) => p.part);
  const parts = text.split(",").map((x) => x.trim().toLowerCase()).filter((x) => x.length > 0);
  const bad = parts.filter((p) => !(known as string[]).includes(p));
  if (parts.length === 0 || bad.length > 0) {
    throw new Error(`Publish shows ${known.join(", ")} (any of them, separated by commas); got “${text}”.`);
  }
  return known.filter((k) => parts.includes(k));
}

function tablesOf(part: PublishPart, r: Report): [string, ReportTable | undefined][] {
  const t = r.tables;
  switch (part) {
    case "outlook":
      return [["outlook", t.outlook], ["meanAhead", t.meanAhead], ["chance", t.chance]];
    case "season":
      return [["weekFactors", t.weekFactors], ["holidayFactors", t.holidayFactors], ["week53", t.week53], ["seasonStrength", t.seasonStrength]];
    case "checks":
      return [["stationarity", t.stationarity], ["integration", t.integration], ["nonlinearity", t.nonlinearity], ["residualTests", t.residualTests]];
    case "backtest":
      return [["backtest", t.backtest], ["backtestSignificance", t.backtestSignificance]];
  }
}

function chartOf(part: PublishPart, a: AnalysedSeries): ChartSpec | null {
  const spec = part === "outlook" ? outlookChart(a.name, a.series, a.report) : part === "season" ? seasonChart(a.name, a.report) : part === "backtest" ? backtestChart(a.name, a.report) : null;
  // Its own id: the same chart also sits on a managed sheet, and ids name images and native charts.
  return spec ? { ...spec, id: `published-${spec.id}` } : null;
}

const MISSING: Record<PublishPart, string> = {
  outlook: "no outlook was made",
  season: "no seasonal factors were computed (the series is undated or under two years)",
  checks: "the checks did not run",
  backtest: "no backtest was run",
};

export const PUBLISHED_LEAD =
  "Published snapshot: plain values, and charts that read them, the same with or without the add-in. The next Publish replaces this sheet; every published forecast stays in Fairlead Log.";

/** The published sheet of a run; `publishedAt` is when Publish was chosen (ISO-8601 UTC). */
export function publishedSheet(analysed: AnalysedSeries[], stamp: StampInput, parts: PublishPart[], publishedAt: string): ManagedSheet {
  const b = new SheetBuilder();
  const shown = PUBLISH_PARTS.filter((p) => parts.includes(p.part));
  const head = stampRows(stamp, `Published: ${shown.map((p) => p.label.toLowerCase()).join(", ")}`, PUBLISHED_LEAD);
  head.splice(head.length - 1, 0, ["Published", publishedAt]);
  b.pairs(head, "stamp");
  for (const a of analysed) {
    b.heading(a.name);
    for (const { part } of shown) {
      const top = b.cursor;
      if (part === "outlook") {
        b.set(b.cursor, 0, "Last week of data");
        b.set(b.cursor, 1, a.report.lastWeek);
        b.style(b.cursor, 0, 1, 1, "stampLabel");
        if (a.report.lastWeek) b.style(b.cursor, 1, 1, 1, "date");
        b.cursor += 2;
      }
      let widest = 2;
      let present = 0;
      for (const [key, t] of tablesOf(part, a.report)) {
        if (!t) continue;
        present++;
        b.table(t, `${a.name}: ${key}`);
        widest = Math.max(widest, t.columns.length);
      }
      if (present === 0) {
        // Seasonal factors come with the checks: say that, not a guess about the data, when they were off.
        const why = part === "season" && !a.report.options.checks ? "the checks, which compute the seasonal factors, were off" : MISSING[part];
        b.set(b.cursor, 0, `Nothing to publish here: ${why} for ${a.name}.`);
        b.style(b.cursor, 0, 1, 1, "note");
        b.cursor += 2;
        continue;
      }
      const spec = chartOf(part, a);
      if (spec) {
        b.chart(spec, top, widest + 1);
        b.cursor = Math.max(b.cursor, top + chartRows(spec) + 1);
      }
    }
  }
  return b.done("published", PUBLISHED_SHEET);
}
