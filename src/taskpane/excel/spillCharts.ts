/**
 * Keeps the user's own charts over FAIRLEAD.* spill ranges current. A worksheet function such
 * as =FAIRLEAD.DECOMPOSE(...) spills one row more when a week is pasted in, but a chart made
 * over the spill keeps reading the old cells. For every chart not made by the pane, each
 * series whose values or categories are one column (or row) starting inside a spill anchored
 * by a FAIRLEAD.* formula is pointed at the same column down to the spill's current last row.
 *
 * Requirement sets: ExcelApi 1.15 to read a series' source address (checked first: without
 * it nothing is done), 1.12 for spill ranges, 1.7 to set series sources and read chart types.
 */
import { followSpill, formatAddress, localAddress, parseAddress, sameRect, type CellRect } from "../spillAddress";

export interface SpillChartChange {
  sheet: string;
  chart: string;
  series: string;
  from: string;
  to: string;
}

/** True when the host can say where a chart series reads from (ExcelApi 1.15). */
export function canReadSeriesSources(): boolean {
  return typeof Office !== "undefined" && Office.context?.requirements?.isSetSupported("ExcelApi", "1.15") === true;
}

/** The pane's own charts (chartData.nativeChartName) are redrawn by drawCharts, not here. */
function isPaneChart(name: string): boolean {
  return name.startsWith("Fairlead ");
}

const FAIRLEAD_FORMULA = /^=\s*FAIRLEAD\./i;

type Dimension = "Categories" | "Values" | "XValues" | "YValues";

interface UserChart {
  sheet: string;
  chart: Excel.Chart;
}

/** One dimension of one series whose source was read. */
interface Source {
  sheet: string;
  chart: Excel.Chart;
  series: Excel.ChartSeries;
  /** Categories (x values) or values (y values): which setter moves it. */
  axis: "x" | "y";
  text: OfficeExtension.ClientResult<string>;
}

/** Scatter and bubble charts keep their points in x and y values, not categories and values. */
function dimensionsFor(chartType: string): [Dimension, Dimension] {
  return /^(XYScatter|Bubble)/i.test(chartType) ? ["XValues", "YValues"] : ["Categories", "Values"];
}

function queueSources(c: UserChart): Source[] {
  const [x, y] = dimensionsFor(String(c.chart.chartType));
  return c.chart.series.items.flatMap((series) => [
    { sheet: c.sheet, chart: c.chart, series, axis: "x" as const, text: series.getDimensionDataSourceString(x) },
    { sheet: c.sheet, chart: c.chart, series, axis: "y" as const, text: series.getDimensionDataSourceString(y) },
  ]);
}

/**
 * Reads every series' sources in one round trip. A chart whose sources Excel will not give
 * (a pivot chart, say) would fail the whole batch, so on failure each chart is read alone and
 * the ones that fail are left out.
 */
async function readSources(context: Excel.RequestContext, charts: UserChart[]): Promise<Source[]> {
  const all = charts.flatMap(queueSources);
  try {
    await context.sync();
    return all;
  } catch {
    const kept: Source[] = [];
    for (const c of charts) {
      const one = queueSources(c);
      try {
        await context.sync();
        kept.push(...one);
      } catch {
        // Left as it is: nothing this chart reads can be followed.
      }
    }
    return kept;
  }
}

interface SpillLookup {
  parent: Excel.Range;
  spill?: Excel.Range;
}

/**
 * Follows the FAIRLEAD.* spills under every chart the user made in the workbook and returns
 * what it moved. `supported` defaults to the host check (tests pass their own).
 */
export async function extendSpillCharts(
  context: Excel.RequestContext,
  supported: () => boolean = canReadSeriesSources,
): Promise<SpillChartChange[]> {
  if (!supported()) return [];
  const sheets = context.workbook.worksheets;
  sheets.load("items/name");
  await context.sync();

  const lists = sheets.items.map((ws) => {
    const charts = ws.charts;
    charts.load("items/name, items/chartType");
    return { sheet: ws.name, charts };
  });
  await context.sync();

  const userCharts: UserChart[] = [];
  for (const l of lists) {
    for (const chart of l.charts.items) {
      if (isPaneChart(chart.name)) continue;
      chart.series.load("items/name");
      userCharts.push({ sheet: l.sheet, chart });
    }
  }
  if (userCharts.length === 0) return [];
  await context.sync();

  const sources = await readSources(context, userCharts);

  // Where each source starts, and whether a spill holds that cell, asked once per cell.
  const sheetByName = new Map(sheets.items.map((ws) => [ws.name.toLowerCase(), ws]));
  const parsed: { source: Source; rect: CellRect }[] = [];
  const lookups = new Map<string, SpillLookup>();
  for (const source of sources) {
    const rect = parseAddress(source.text.value ?? "");
    if (!rect || (rect.firstCol !== rect.lastCol && rect.firstRow !== rect.lastRow)) continue;
    const sheetName = rect.sheet ?? source.sheet;
    const ws = sheetByName.get(sheetName.toLowerCase());
    if (!ws) continue; // another workbook, or a sheet renamed since
    const located: CellRect = { ...rect, sheet: ws.name };
    parsed.push({ source, rect: located });
    const key = `${ws.name.toLowerCase()}!${rect.firstRow},${rect.firstCol}`;
    if (!lookups.has(key)) {
      const parent = ws.getCell(rect.firstRow, rect.firstCol).getSpillParentOrNullObject();
      parent.load("formulas");
      lookups.set(key, { parent });
    }
  }
  if (parsed.length === 0) return [];
  await context.sync();

  let spills = 0;
  for (const l of lookups.values()) {
    if (l.parent.isNullObject) continue;
    const formula = l.parent.formulas?.[0]?.[0];
    if (typeof formula !== "string" || !FAIRLEAD_FORMULA.test(formula)) continue;
    l.spill = l.parent.getSpillingToRangeOrNullObject();
    l.spill.load("address");
    spills++;
  }
  if (spills === 0) return [];
  await context.sync();

  const changes: SpillChartChange[] = [];
  for (const { source, rect } of parsed) {
    const l = lookups.get(`${(rect.sheet ?? "").toLowerCase()}!${rect.firstRow},${rect.firstCol}`);
    if (!l?.spill || l.spill.isNullObject) continue;
    const spill = parseAddress(l.spill.address);
    if (!spill) continue;
    const now = followSpill(rect, { ...spill, sheet: spill.sheet ?? rect.sheet });
    if (!now || sameRect(now, rect)) continue;
    const ws = sheetByName.get((rect.sheet ?? "").toLowerCase()) as Excel.Worksheet;
    const target = ws.getRange(localAddress(now));
    if (source.axis === "x") source.series.setXAxisValues(target);
    else source.series.setValues(target);
    changes.push({ sheet: source.sheet, chart: source.chart.name, series: source.series.name, from: formatAddress(rect), to: formatAddress(now) });
  }
  if (changes.length > 0) await context.sync();
  return changes;
}
