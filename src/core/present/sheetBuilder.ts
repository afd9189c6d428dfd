/**
 * Lays tables out on a sheet grid: the stamp's label/value rows, series headings, report tables
 * (title, header, rows, notes) with the number style each column asks for, and charts beside
 * them. The managed sheets (sheets.ts), the published snapshot (published.ts) and the track
 * record (trackSheet.ts) are all built with it, so they look alike. Pure data.
 */
import { isDateColumn, type Cell, type ReportTable } from "../report";
import type { ChartSpec } from "./chartSpec";
import type { CellStyle, ManagedSheet, NamedRange, PlacedChart, SheetKind, SheetRange, StyledRange } from "./sheets";

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

export function chartRows(spec: ChartSpec): number {
  return Math.ceil(CHART_PX[spec.kind].height / CELL_PX.height);
}

function isCountColumn(name: string): boolean {
  return /^(step|weeks ahead|iso week|forecasts scored|awaiting actuals|fits|weeks filtered in|years averaged|lags?|lag)$/i.test(name);
}

function isRateColumn(name: string): boolean {
  return /^(forecast|low .*%|high .*%|actual|error|last rate|mean error|mean absolute error|forecast \d+ weeks? ahead|(inner|outer) (low|high))$/i.test(name);
}

/** Percentages of the track record (errors and hit rates in percent), shown to one decimal. */
function isShareColumn(name: string): boolean {
  return /^(error %|mape %|inside .*\(%\))$/i.test(name);
}

export class SheetBuilder {
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
      const style: CellStyle | null = isDateColumn(c) ? "date" : isCountColumn(c) ? "count" : isRateColumn(c) ? "rate" : isShareColumn(c) ? "share" : null;
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

