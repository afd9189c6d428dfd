/**
 * The managed sheets: where each report table goes on the sheets Fairlead writes (Outlook,
 * Season, Checks, Backtest), as a grid of plain values with style hints, workbook names and
 * chart placements. The pane and the batch runner both write these grids, so a book looks the
 * same whichever made it. Pure data: no Office, no file formats.
 *
 * Layout of a sheet: the stamp (stamp.ts) at the top, a blank row, then one section per
 * series: its name as a heading, its tables one under another (title, header, rows, notes,
 * blank row), and its chart to the right of the tables.
 */
import type { Report } from "../analysis";
import type { Cell, ReportTable } from "../report";
import type { WeeklySeries } from "../series/types";
import type { ChartSpec } from "./chartSpec";
import { backtestChart, outlookChart, seasonChart } from "./charts";
import { outlookName } from "./names";
import { stampRows, type StampInput } from "./stamp";
import { CELL_PX, CHART_PX, SheetBuilder, chartRows } from "./sheetBuilder";

export { CELL_PX, CHART_PX };

/** The four managed sheets of a run, the published snapshot (published.ts) and the track record (trackSheet.ts). */
export type SheetKind = "outlook" | "season" | "checks" | "backtest" | "published" | "track";

/** The four managed sheets, in the order they are written, with their names in the book. */
export const MANAGED_SHEETS: { kind: SheetKind; name: string; what: string }[] = [
  { kind: "outlook", name: "Fairlead Outlook", what: "Outlook: forecasts and prediction intervals" },
  { kind: "season", name: "Fairlead Season", what: "Season: factors by ISO week and the week × year pattern" },
  { kind: "checks", name: "Fairlead Checks", what: "Checks: stationarity, nonlinearity and residual tests" },
  { kind: "backtest", name: "Fairlead Backtest", what: "Backtest: rolling-origin accuracy" },
];

/**
 * How a range is shown. "date" cells hold ISO date text (YYYY-MM-DD) that the writer turns
 * into a real date; "rate" is a number of the series' own unit shown to one decimal; "ratio"
 * a statistic or p-value shown to four decimals; "share" a percentage (already ×100) to one
 * decimal; the rest are text roles.
 */
export type CellStyle = "mark" | "stampLabel" | "seriesTitle" | "tableTitle" | "header" | "note" | "date" | "rate" | "ratio" | "share" | "count";

/** A rectangle on a sheet, 0-based row and column. */
export interface SheetRange {
  row: number;
  col: number;
  rows: number;
  cols: number;
}

export interface StyledRange extends SheetRange {
  style: CellStyle;
}

export interface NamedRange extends SheetRange {
  name: string;
}

export interface PlacedChart {
  spec: ChartSpec;
  /** Top-left cell, the size drawn in pixels, and the cells that size covers (CELL_PX). */
  row: number;
  col: number;
  widthPx: number;
  heightPx: number;
  widthCols: number;
  heightRows: number;
}

export interface ManagedSheet {
  kind: SheetKind;
  name: string;
  /** Rectangular: every row has `width` cells. */
  cells: Cell[][];
  width: number;
  styles: StyledRange[];
  names: NamedRange[];
  charts: PlacedChart[];
  /** The ranges written, one per table and one for the stamp: what the sheet's owner tracks. */
  blocks: (SheetRange & { label: string })[];
}

/** One analysed series: the rates it came from and its report. */
export interface AnalysedSeries {
  name: string;
  series: WeeklySeries;
  report: Report;
}

/** Tables of one series for a sheet kind, in the order they are laid out. */
function tablesFor(kind: SheetKind, r: Report): [string, ReportTable | undefined][] {
  const t = r.tables;
  switch (kind) {
    case "outlook":
      return [["outlook", t.outlook], ["fit", t.fit], ["data", t.data], ["search", t.search]];
    case "season":
      return [["weekFactors", t.weekFactors], ["holidayFactors", t.holidayFactors], ["week53", t.week53], ["modelSeason", t.modelSeason], ["seasonStrength", t.seasonStrength], ["weekYear", t.weekYear]];
    case "checks":
      return [["stationarity", t.stationarity], ["integration", t.integration], ["nonlinearity", t.nonlinearity], ["residualTests", t.residualTests], ["correlogram", t.correlogram]];
    case "backtest":
      return [["backtest", t.backtest], ["backtestSignificance", t.backtestSignificance], ["backtestCost", t.backtestCost], ["backtestOrigins", t.backtestOrigins]];
    case "published":
    case "track":
      return [];
  }
}

function chartFor(kind: SheetKind, a: AnalysedSeries): ChartSpec | null {
  switch (kind) {
    case "outlook":
      return outlookChart(a.name, a.series, a.report);
    case "season":
      return seasonChart(a.name, a.report);
    case "backtest":
      return backtestChart(a.name, a.report);
    case "checks":
    case "published":
    case "track":
      return null;
  }
}

/** Names over the outlook table's columns (names.ts), so budget formulas can link to them. */
function nameOutlook(b: SheetBuilder, a: AnalysedSeries, first: number): void {
  const t = a.report.tables.outlook;
  const rows = t.rows.length;
  const col = (c: string): number => t.columns.indexOf(c);
  const add = (name: string, c: number): void => {
    if (c >= 0) b.names.push({ name, row: first, col: c, rows, cols: 1 });
  };
  add(outlookName(a.name, "WEEK"), col("Week ending"));
  add(outlookName(a.name, "POINT"), col("Forecast"));
  for (const l of a.report.options.levels) {
    const label = `${Number(l.toFixed(4))}%`;
    add(outlookName(a.name, { low: l }), col(`Low ${label}`));
    add(outlookName(a.name, { high: l }), col(`High ${label}`));
  }
}

/** The managed sheets for a run over one or more series (all analysed with the same options). */
export function managedSheets(analysed: AnalysedSeries[], stamp: StampInput): ManagedSheet[] {
  return MANAGED_SHEETS.map(({ kind, name, what }) => {
    const b = new SheetBuilder();
    b.pairs(stampRows(stamp, what), "stamp");
    for (const a of analysed) {
      const sectionTop = b.cursor;
      b.heading(a.name);
      const tables = tablesFor(kind, a.report);
      if (kind === "outlook") {
        // The as-of cell a budget links to (FL_<KEY>_ASOF), just under the heading.
        b.set(b.cursor, 0, "Last week of data");
        b.set(b.cursor, 1, a.report.lastWeek);
        b.style(b.cursor, 0, 1, 1, "stampLabel");
        if (a.report.lastWeek) b.style(b.cursor, 1, 1, 1, "date");
        b.names.push({ name: outlookName(a.name, "ASOF"), row: b.cursor, col: 1, rows: 1, cols: 1 });
        b.cursor += 2;
      }
      let present = 0;
      for (const [key, t] of tables) {
        if (!t) continue;
        present++;
        const first = b.table(t, `${a.name}: ${key}`);
        if (kind === "outlook" && key === "outlook") nameOutlook(b, a, first);
      }
      if (present === 0) {
        b.set(b.cursor, 0, `Nothing for this sheet: ${kind === "backtest" ? "no backtest was run" : "the checks did not run"} for ${a.name}.`);
        b.style(b.cursor, 0, 1, 1, "note");
        b.cursor += 2;
      }
      const spec = chartFor(kind, a);
      if (spec) {
        // Right of every table the chart's rows run beside, one column clear.
        const top = sectionTop + 1;
        let col = 2;
        const rows = chartRows(spec);
        for (const k of b.blocks) if (k.row < top + rows && k.row + k.rows > top && k.row >= sectionTop) col = Math.max(col, k.cols);
        b.chart(spec, top, col + 1);
        b.cursor = Math.max(b.cursor, sectionTop + 1 + rows + 1);
      }
    }
    return b.done(kind, name);
  });
}
