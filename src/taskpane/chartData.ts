/**
 * The cells behind the pane's native charts. The batch runner draws a managed sheet's charts
 * as images straight from their specs; a native Excel chart can only plot cells, so each chart
 * gets a "chart data" block on its own sheet, to the right of everything else, and a plan that
 * says which columns and rows each series reads (excel/charts.ts draws from the plan).
 *
 * Interval bands need one trick. Excel has no "fill between two lines", so a band is drawn as
 * stacked areas: an invisible base up to the widest band's low bound, then one layer per ring
 * between consecutive bounds, darker towards the inner band. The readable Low/High columns
 * stay beside them for people; only the layers, history and forecast are plotted.
 *
 * Pure: no Office calls, no DOM.
 */
import type { ChartSpec, LineChartSpec } from "../core/present/chartSpec";
import type { CellStyle, ManagedSheet, PlacedChart, SheetRange, StyledRange } from "../core/present/sheets";
import type { Cell } from "../core/report";

export type SeriesLook = "history" | "forecast" | "bandBase" | "band" | "year" | "yearLatest" | "method";

export interface NativeSeriesPlan {
  name: string;
  /** 0-based sheet column holding the values. */
  column: number;
  look: SeriesLook;
  /** Band darkness 0..1, inner bands darker (look "band" only). */
  shade?: number;
}

export interface NativeChartPlan {
  /** `Fairlead ${spec.id}`: how the pane finds its own chart again. */
  name: string;
  kind: "line" | "radar" | "column";
  title: string;
  caption: string;
  yTitle?: string;
  /** 0-based; data rows only (the header row is firstRow - 1). */
  categoriesColumn: number;
  firstRow: number;
  lastRow: number;
  series: NativeSeriesPlan[];
  placement: { row: number; col: number; widthPx: number; heightPx: number };
}

/** The name the pane gives the native chart drawn for a spec. */
export function nativeChartName(spec: ChartSpec): string {
  return `Fairlead ${spec.id}`;
}

/** One column of a chart data block: its header, one value per category, how it is shown. */
interface DataColumn {
  header: string;
  values: Cell[];
  style: CellStyle | null;
  /** Set when the column is plotted. */
  plot?: { name: string; look: SeriesLook; shade?: number };
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function difference(a: number | null, b: number | null): number | null {
  return a === null || b === null ? null : a - b;
}

/** "95% interval" → "95%": the level as the band names it, for column headers. */
function levelLabel(bandName: string): string {
  return bandName.replace(/ interval$/, "");
}

/**
 * The stacked layers of the bands, widest first (L1 > … > Lk): base = low₁; then
 * lowᵢ₊₁ − lowᵢ for the lower rings, highₖ − lowₖ for the inner band, highᵢ − highᵢ₊₁ for
 * the upper rings, so that base plus every layer is high₁ and base plus the layers up to the
 * inner band is highₖ. Each ring belongs to the wider band of its two bounds and is shaded
 * by that band's rank: shade (i+1)/k for band i (0-based), the inner band darkest.
 */
function bandLayers(spec: LineChartSpec): DataColumn[] {
  const bands = spec.bands;
  const k = bands.length;
  if (k === 0) return [];
  const n = spec.categories.length;
  const at = (xs: (number | null)[], r: number): number | null => xs[r] ?? null;
  const layer = (header: string, values: (number | null)[], look: SeriesLook, shade?: number): DataColumn => ({
    header,
    values,
    style: "rate",
    plot: { name: header, look, ...(shade === undefined ? {} : { shade }) },
  });
  const rows = (f: (r: number) => number | null): (number | null)[] => Array.from({ length: n }, (_, r) => f(r));
  const shade = (i: number): number => (i + 1) / k;
  const label = bands.map((b) => levelLabel(b.name));

  const out: DataColumn[] = [layer(`Chart layer: ${label[0]} base`, rows((r) => at(bands[0].low, r)), "bandBase")];
  for (let i = 0; i + 1 < k; i++) {
    out.push(
      layer(
        `Chart layer: ${label[i]} low to ${label[i + 1]} low`,
        rows((r) => difference(at(bands[i + 1].low, r), at(bands[i].low, r))),
        "band",
        shade(i),
      ),
    );
  }
  out.push(
    layer(
      `Chart layer: ${label[k - 1]} low to high`,
      rows((r) => difference(at(bands[k - 1].high, r), at(bands[k - 1].low, r))),
      "band",
      shade(k - 1),
    ),
  );
  for (let i = k - 2; i >= 0; i--) {
    out.push(
      layer(
        `Chart layer: ${label[i + 1]} high to ${label[i]} high`,
        rows((r) => difference(at(bands[i].high, r), at(bands[i + 1].high, r))),
        "band",
        shade(i),
      ),
    );
  }
  return out;
}

function lineColumns(spec: LineChartSpec): DataColumn[] {
  const dated = spec.categories.length > 0 && spec.categories.every((c) => ISO_DATE.test(c));
  // Read left to right by people: weeks, rates, the readable bounds; the layers come last.
  const cols: DataColumn[] = [{ header: dated ? "Week ending" : "Week", values: [...spec.categories], style: dated ? "date" : null }];
  for (const s of spec.series) {
    cols.push({ header: s.name, values: [...s.values], style: "rate", plot: { name: s.name, look: s.role === "forecast" ? "forecast" : "history" } });
  }
  for (const b of spec.bands) {
    const l = levelLabel(b.name);
    cols.push({ header: `Low ${l}`, values: [...b.low], style: "rate" });
    cols.push({ header: `High ${l}`, values: [...b.high], style: "rate" });
  }
  return [...cols, ...bandLayers(spec)];
}

function otherColumns(spec: Exclude<ChartSpec, LineChartSpec>): DataColumn[] {
  const radar = spec.kind === "radar";
  const cols: DataColumn[] = [{ header: radar ? "ISO week" : "Weeks ahead", values: [...spec.categories], style: null }];
  spec.series.forEach((s, i) => {
    const look: SeriesLook = radar ? (i === spec.series.length - 1 ? "yearLatest" : "year") : "method";
    // The week × year means are rates; the backtest chart plots MASE, a ratio.
    cols.push({ header: s.name, values: [...s.values], style: radar ? "rate" : "ratio", plot: { name: s.name, look } });
  });
  return cols;
}

function columnsFor(spec: ChartSpec): DataColumn[] {
  return spec.kind === "line" ? lineColumns(spec) : otherColumns(spec);
}

/**
 * Plotted series in drawing order: band layers first, because stacked areas stack in series
 * order and the lines added after them are drawn on top; then the rest as their columns come.
 */
function plottedOrder(cols: DataColumn[]): number[] {
  const rank = (c: DataColumn): number => (c.plot?.look === "bandBase" || c.plot?.look === "band" ? 0 : 1);
  return cols
    .map((_, j) => j)
    .filter((j) => cols[j].plot !== undefined)
    .sort((a, b) => rank(cols[a]) - rank(cols[b]) || a - b);
}

/**
 * The sheet with one chart data block per chart, right of everything already on it, and the
 * plan for each native chart. The input sheet is left as it was. A chart without categories
 * has nothing to plot and gets neither a block nor a plan.
 */
export function withChartData(sheet: ManagedSheet): { sheet: ManagedSheet; charts: NativeChartPlan[] } {
  const cells: Cell[][] = sheet.cells.map((r) => [...r]);
  const styles: StyledRange[] = [...sheet.styles];
  const blocks: (SheetRange & { label: string })[] = [...sheet.blocks];
  const plans: NativeChartPlan[] = [];

  // One blank column clear of the widest thing on the sheet: its cells or a chart drawn over them.
  let right = sheet.width;
  for (const c of sheet.charts) right = Math.max(right, c.col + c.widthCols);
  let nextCol = right + 1;
  let width = sheet.width;

  const put = (row: number, col: number, v: Cell): void => {
    while (cells.length <= row) cells.push([]);
    cells[row][col] = v;
  };

  for (const placed of sheet.charts) {
    const spec = placed.spec;
    const n = spec.categories.length;
    if (n === 0) continue;
    const cols = columnsFor(spec);
    const top = placed.row;
    const left = nextCol;
    const first = top + 2;

    put(top, left, `Chart data: ${spec.title}`);
    styles.push({ row: top, col: left, rows: 1, cols: 1, style: "tableTitle" });
    cols.forEach((c, j) => {
      put(top + 1, left + j, c.header);
      for (let r = 0; r < n; r++) put(first + r, left + j, c.values[r] ?? null);
    });
    styles.push({ row: top + 1, col: left, rows: 1, cols: cols.length, style: "header" });
    cols.forEach((c, j) => {
      if (c.style) styles.push({ row: first, col: left + j, rows: n, cols: 1, style: c.style });
    });
    blocks.push({ row: top, col: left, rows: 2 + n, cols: cols.length, label: `${spec.id}: chart data` });

    plans.push(planFor(placed, cols, left, first, first + n - 1));
    width = Math.max(width, left + cols.length);
    nextCol = left + cols.length + 1;
  }

  // Keep the grid rectangular: every row `width` long, gaps null.
  const grid = cells.map((r) => Array.from({ length: width }, (_, j) => (r[j] === undefined ? null : r[j])));
  return {
    sheet: { ...sheet, cells: grid, width, styles, blocks, names: [...sheet.names], charts: [...sheet.charts] },
    charts: plans,
  };
}

function planFor(placed: PlacedChart, cols: DataColumn[], left: number, firstRow: number, lastRow: number): NativeChartPlan {
  const spec = placed.spec;
  const series: NativeSeriesPlan[] = plottedOrder(cols).map((j) => {
    const p = cols[j].plot as NonNullable<DataColumn["plot"]>;
    return { name: p.name, column: left + j, look: p.look, ...(p.shade === undefined ? {} : { shade: p.shade }) };
  });
  return {
    name: nativeChartName(spec),
    kind: spec.kind,
    title: spec.title,
    caption: spec.caption,
    ...(spec.kind === "radar" ? {} : { yTitle: spec.yTitle }),
    categoriesColumn: left,
    firstRow,
    lastRow,
    series,
    placement: { row: placed.row, col: placed.col, widthPx: placed.widthPx, heightPx: placed.heightPx },
  };
}
