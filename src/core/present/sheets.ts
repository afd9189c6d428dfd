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
import { isDateColumn, type Cell, type ReportTable } from "../report";
import type { WeeklySeries } from "../series/types";
import type { ChartSpec } from "./chartSpec";
import { backtestChart, outlookChart, seasonChart } from "./charts";
import { outlookName } from "./names";
import { stampRows, type StampInput } from "./stamp";

export type SheetKind = "outlook" | "season" | "checks" | "backtest";

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
 * a statistic or p-value shown to four decimals; the rest are text roles.
 */
export type CellStyle = "mark" | "stampLabel" | "seriesTitle" | "tableTitle" | "header" | "note" | "date" | "rate" | "ratio" | "count";

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

/**
 * Pixels of one cell as the writers lay the sheets out: columns after the first are 14
 * characters wide (about 103 px in Excel's default font) and rows keep the default 20 px.
 */
export const CELL_PX = { width: 103, height: 20 };
/** Drawn size of each kind of chart: wide for time and comparisons, square for the season's circle. */
export const CHART_PX: Record<ChartSpec["kind"], { width: number; height: number }> = {
  line: { width: 960, height: 480 },
  column: { width: 960, height: 480 },
  radar: { width: 640, height: 640 },
};

function chartRows(spec: ChartSpec): number {
  return Math.ceil(CHART_PX[spec.kind].height / CELL_PX.height);
}

function isCountColumn(name: string): boolean {
  return /^(step|weeks ahead|iso week|forecasts scored|fits|weeks filtered in|years averaged|lags?|lag)$/i.test(name);
}

function isRateColumn(name: string): boolean {
  return /^(forecast|low .*%|high .*%|actual|error|last rate)$/i.test(name);
}

class SheetBuilder {
  private rows: Cell[][] = [];
  readonly styles: StyledRange[] = [];
  readonly names: NamedRange[] = [];
  readonly charts: PlacedChart[] = [];
  readonly blocks: (SheetRange & { label: string })[] = [];
  cursor = 0;

  set(row: number, col: number, value: Cell): void {
    while (this.rows.length <= row) this.rows.push([]);
    const r = this.rows[row];
    while (r.length < col) r.push(null);
    r[col] = value;
  }

  style(row: number, col: number, rows: number, cols: number, style: CellStyle): void {
    if (rows > 0 && cols > 0) this.styles.push({ row, col, rows, cols, style });
  }

  /** Label/value rows at the cursor. */
  pairs(rows: Cell[][], label: string): void {
    const top = this.cursor;
    rows.forEach((r, i) => r.forEach((v, j) => this.set(top + i, j, v)));
    this.style(top, 0, 1, 1, "mark");
    this.style(top + 1, 0, rows.length - 1, 1, "stampLabel");
    const asOf = rows.findIndex((r) => r[0] === "As of week ending");
    if (asOf >= 0 && typeof rows[asOf][1] === "string") this.style(top + asOf, 1, 1, 1, "date");
    this.blocks.push({ row: top, col: 0, rows: rows.length, cols: 2, label });
    this.cursor = top + rows.length + 1;
  }

  heading(text: string): void {
    this.set(this.cursor, 0, text);
    this.style(this.cursor, 0, 1, 1, "seriesTitle");
    this.cursor += 1;
  }

  /** A report table at the cursor; returns the row of its first data row. */
  table(t: ReportTable, label: string): number {
    const top = this.cursor;
    this.set(top, 0, t.title);
    this.style(top, 0, 1, 1, "tableTitle");
    t.columns.forEach((c, j) => this.set(top + 1, j, c));
    this.style(top + 1, 0, 1, t.columns.length, "header");
    const first = top + 2;
    t.rows.forEach((r, i) => r.forEach((v, j) => this.set(first + i, j, v)));
    t.columns.forEach((c, j) => {
      const style: CellStyle | null = isDateColumn(c) ? "date" : isCountColumn(c) ? "count" : isRateColumn(c) ? "rate" : null;
      if (style) this.style(first, j, t.rows.length, 1, style);
    });
    // Label/value tables whose values include dates (the Data table).
    if (t.columns[0] === "Item") {
      t.rows.forEach((r, i) => {
        if (typeof r[0] === "string" && isDateColumn(r[0]) && typeof r[1] === "string") this.style(first + i, 1, 1, 1, "date");
      });
    }
    t.notes.forEach((n, i) => this.set(first + t.rows.length + i, 0, n));
    this.style(first + t.rows.length, 0, t.notes.length, 1, "note");
    this.blocks.push({ row: top, col: 0, rows: 2 + t.rows.length + t.notes.length, cols: t.columns.length, label });
    this.cursor = first + t.rows.length + t.notes.length + 1;
    return first;
  }

  chart(spec: ChartSpec, row: number, col: number): void {
    const px = CHART_PX[spec.kind];
    this.charts.push({
      spec,
      row,
      col,
      widthPx: px.width,
      heightPx: px.height,
      widthCols: Math.ceil(px.width / CELL_PX.width),
      heightRows: chartRows(spec),
    });
  }

  done(kind: SheetKind, name: string): ManagedSheet {
    let width = 0;
    for (const r of this.rows) width = Math.max(width, r.length);
    const cells = this.rows.map((r) => [...r, ...new Array<Cell>(width - r.length).fill(null)]);
    return { kind, name, cells, width, styles: this.styles, names: this.names, charts: this.charts, blocks: this.blocks };
  }
}

/** Tables of one series for a sheet kind, in the order they are laid out. */
function tablesFor(kind: SheetKind, r: Report): [string, ReportTable | undefined][] {
  const t = r.tables;
  switch (kind) {
    case "outlook":
      return [["outlook", t.outlook], ["fit", t.fit], ["data", t.data], ["search", t.search]];
    case "season":
      return [["weekFactors", t.weekFactors], ["modelSeason", t.modelSeason], ["seasonStrength", t.seasonStrength], ["weekYear", t.weekYear]];
    case "checks":
      return [["stationarity", t.stationarity], ["integration", t.integration], ["nonlinearity", t.nonlinearity], ["residualTests", t.residualTests], ["correlogram", t.correlogram]];
    case "backtest":
      return [["backtest", t.backtest], ["backtestSignificance", t.backtestSignificance], ["backtestCost", t.backtestCost], ["backtestOrigins", t.backtestOrigins]];
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
