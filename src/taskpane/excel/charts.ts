/**
 * Draws the managed sheets' charts as native Excel charts from their plans (../chartData.ts),
 * over the chart data blocks the pane has already written.
 *
 * A chart the pane made earlier is found again by its name and updated in place: its series
 * are pointed at the plan's rows (this is how a refresh after new weeks lengthens the lines),
 * series are added or dropped to match the plan, and the title and caption are renewed. Its
 * position, size and any formatting the user gave it are left alone; looks are applied only
 * to series that are new, or whose meaning changed (a different name at that position).
 *
 * Requirement sets: ExcelApi 1.1 (charts, titles, legend, fills, setPosition) and 1.7
 * (series add/delete/setValues/setXAxisValues, series chart type, line style and weight,
 * getRangeByIndexes). String literals stand in for the Excel.* enums so the module also
 * loads where Office.js has not defined them (tests).
 */
import type { NativeChartPlan, NativeSeriesPlan } from "../chartData";

/** Excel sizes charts in points; the plans are in pixels at 96 dpi. */
export const POINTS_PER_PX = 0.75;

const CHART_TYPE: Record<NativeChartPlan["kind"], "Line" | "Radar" | "ColumnClustered"> = {
  line: "Line",
  radar: "Radar",
  column: "ColumnClustered",
};

/** The batch images' colours, so a book looks alike whichever sink drew its charts. */
const COLOR = {
  history: "#1F3A68",
  forecast: "#E07000",
  latestYear: "#0072B2",
  band: { r: 0x1f, g: 0x6f, b: 0xc0 },
};
/** Older years in the season radar: muted, so the latest year stands out. */
const YEAR_COLORS = ["#B8B8B8", "#9FB4C9", "#C9B79F", "#A9C2A3", "#C4A9C0", "#8C8C8C"];
const METHOD_COLORS = ["#0072B2", "#E69F00", "#009E73", "#D55E00", "#56B4E9", "#CC79A7", "#4D4D4D"];

function hex(n: number): string {
  return Math.round(n).toString(16).padStart(2, "0").toUpperCase();
}

/**
 * One blue for every band, mixed with white: shade 0 is nearly white, shade 1 a mid blue
 * that the history and forecast lines still read against.
 */
export function bandColor(shade: number): string {
  const t = 0.15 + 0.65 * Math.min(1, Math.max(0, shade));
  const mix = (c: number): number => 255 + (c - 255) * t;
  return `#${hex(mix(COLOR.band.r))}${hex(mix(COLOR.band.g))}${hex(mix(COLOR.band.b))}`;
}

/** Only names the pane gives its charts (chartData.nativeChartName) are ever deleted here. */
function isPaneName(name: string): boolean {
  return name.startsWith("Fairlead ");
}

function valuesRange(sheet: Excel.Worksheet, plan: NativeChartPlan, column: number): Excel.Range {
  return sheet.getRangeByIndexes(plan.firstRow, column, plan.lastRow - plan.firstRow + 1, 1);
}

/** The look of a series the pane adds; `index` counts series of the same look family. */
function applyLook(series: Excel.ChartSeries, s: NativeSeriesPlan, index: number): void {
  switch (s.look) {
    case "history":
      series.chartType = "Line";
      series.format.line.lineStyle = "Continuous";
      series.format.line.color = COLOR.history;
      series.format.line.weight = 2;
      break;
    case "forecast":
      series.chartType = "Line";
      series.format.line.lineStyle = "Dash";
      series.format.line.color = COLOR.forecast;
      series.format.line.weight = 2;
      break;
    case "bandBase":
      // The invisible bottom of the stack: it lifts the bands to the widest low bound.
      series.chartType = "AreaStacked";
      series.format.fill.clear();
      series.format.line.lineStyle = "None";
      break;
    case "band":
      series.chartType = "AreaStacked";
      series.format.fill.setSolidColor(bandColor(s.shade ?? 1));
      series.format.line.lineStyle = "None";
      break;
    case "year":
      series.format.line.color = YEAR_COLORS[index % YEAR_COLORS.length];
      series.format.line.weight = 1.25;
      break;
    case "yearLatest":
      series.format.line.color = COLOR.latestYear;
      series.format.line.weight = 3;
      break;
    case "method":
      series.format.fill.setSolidColor(METHOD_COLORS[index % METHOD_COLORS.length]);
      break;
  }
}

/** Per series, its index among the plan's series of the same look (for the palettes). */
function lookIndexes(plan: NativeChartPlan): number[] {
  const seen = new Map<string, number>();
  return plan.series.map((s) => {
    const family = s.look === "yearLatest" ? "year" : s.look;
    const i = seen.get(family) ?? 0;
    seen.set(family, i + 1);
    return i;
  });
}

function pointSeries(sheet: Excel.Worksheet, series: Excel.ChartSeries, plan: NativeChartPlan, s: NativeSeriesPlan): void {
  series.setValues(valuesRange(sheet, plan, s.column));
  series.setXAxisValues(valuesRange(sheet, plan, plan.categoriesColumn));
}

/**
 * The caption (source and as-of week) goes where the batch image has it, under the plot, as
 * the category axis title. Radar charts have no axis title to hold it.
 */
function setCaption(chart: Excel.Chart, plan: NativeChartPlan): void {
  if (plan.kind !== "radar") chart.axes.categoryAxis.title.text = plan.caption;
}

function createChart(sheet: Excel.Worksheet, plan: NativeChartPlan): void {
  const [first] = plan.series;
  // Made from the first series' header and values, a single column Excel reads as exactly one
  // series (named by its header even when its values are blank), which is then set explicitly.
  const source = sheet.getRangeByIndexes(plan.firstRow - 1, first.column, plan.lastRow - plan.firstRow + 2, 1);
  const chart = sheet.charts.add(CHART_TYPE[plan.kind], source, "Columns");
  chart.name = plan.name;
  chart.title.text = plan.title;
  if (plan.yTitle) chart.axes.valueAxis.title.text = plan.yTitle;
  setCaption(chart, plan);
  chart.legend.visible = true;
  chart.legend.position = "Bottom";
  chart.setPosition(sheet.getCell(plan.placement.row, plan.placement.col));
  chart.width = plan.placement.widthPx * POINTS_PER_PX;
  chart.height = plan.placement.heightPx * POINTS_PER_PX;

  const index = lookIndexes(plan);
  plan.series.forEach((s, i) => {
    const series = i === 0 ? chart.series.getItemAt(0) : chart.series.add(s.name);
    series.name = s.name;
    pointSeries(sheet, series, plan, s);
    applyLook(series, s, index[i]);
  });
}

/** Needs the chart's series loaded with their names. */
function updateChart(sheet: Excel.Worksheet, chart: Excel.Chart, plan: NativeChartPlan): void {
  const have = chart.series.items;
  const index = lookIndexes(plan);
  plan.series.forEach((s, i) => {
    const old = have[i];
    const series = old ?? chart.series.add(s.name);
    pointSeries(sheet, series, plan, s);
    if (!old) {
      applyLook(series, s, index[i]);
    } else if (old.name !== s.name) {
      // Another meaning at this position (the levels changed, say): the old look would mislead.
      series.name = s.name;
      applyLook(series, s, index[i]);
    }
  });
  for (let i = have.length - 1; i >= plan.series.length; i--) have[i].delete();
  chart.title.text = plan.title;
  setCaption(chart, plan);
}

/**
 * Draws the plans on the sheet: updates the pane's charts that are there, creates the rest,
 * and deletes the charts in `known` (made by the pane earlier) that no plan names any more.
 * Returns the names of the charts the pane now owns on the sheet. Three round trips at most:
 * the charts' names, the series of those to update (only when there are any), the writes.
 */
export async function drawCharts(context: Excel.RequestContext, sheetName: string, plans: NativeChartPlan[], known: string[]): Promise<string[]> {
  const sheet = context.workbook.worksheets.getItem(sheetName);
  const charts = sheet.charts;
  charts.load("items/name");
  await context.sync();

  const byName = new Map<string, Excel.Chart>();
  for (const c of charts.items) if (!byName.has(c.name)) byName.set(c.name, c);

  // A plan without rows or series has nothing to draw; its old chart, if any, goes.
  const drawn = plans.filter((p, i) => p.lastRow >= p.firstRow && p.series.length > 0 && plans.findIndex((q) => q.name === p.name) === i);
  const existing = drawn.map((p) => byName.get(p.name));
  for (const c of existing) c?.series.load("items/name");
  if (existing.some((c) => c !== undefined)) await context.sync();

  drawn.forEach((p, i) => {
    const chart = existing[i];
    if (chart) updateChart(sheet, chart, p);
    else createChart(sheet, p);
  });
  const owned = new Set(drawn.map((p) => p.name));
  for (const name of new Set(known)) {
    const stale = byName.get(name);
    if (stale && !owned.has(name) && isPaneName(name)) stale.delete();
  }
  await context.sync();
  return [...owned];
}
