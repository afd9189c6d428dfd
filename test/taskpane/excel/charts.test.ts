/**
 * drawCharts against office-addin-mock. The mock answers a property only after it was loaded
 * and the context synced, so these tests also check that drawCharts loads what it reads.
 * The mock knows plain properties only, not Office.js collections: a collection here loads
 * "items/name" the way Excel does, by loading `items` and `name` on every item, and every
 * mock object made is synced by the context (items sit in arrays, which the mock does not walk).
 */
import { OfficeMockObject } from "office-addin-mock";
import { mockCollection } from "./mockCollection";

import { analyse } from "../../../src/core/analysis";
import { managedSheets, type AnalysedSeries, type ManagedSheet } from "../../../src/core/present/sheets";
import type { StampInput } from "../../../src/core/present/stamp";
import { withChartData, type NativeChartPlan } from "../../../src/taskpane/chartData";
import { bandColor, drawCharts } from "../../../src/taskpane/excel/charts";
import { laneSeries } from "../../engine/lane";

type Data = Record<string, unknown>;
interface RangeRef {
  row: number;
  col: number;
  rows: number;
  cols: number;
}

/** What a test reads back from a fake series: what the code set on it. */
interface SeriesSeen {
  name: string;
  chartType?: string;
  valuesFrom?: RangeRef;
  xFrom?: RangeRef;
  deleted?: boolean;
  format: { line: { lineStyle?: string; color?: string; weight?: number }; fill: { cleared?: boolean; solid?: string } };
  load(what: string): void;
}

interface ChartSeen {
  name: string;
  chartType: string;
  top: number;
  left: number;
  width: number;
  height: number;
  title: { text: string };
  axes: { valueAxis: { title: { text: string } }; categoryAxis: { title: { text: string } } };
  legend: { visible: boolean; position: string };
  positionedAt?: { row: number; col: number };
  deleted?: boolean;
  load(what: string): void;
}

class Book {
  private mocks: OfficeMockObject[] = [];
  syncs = 0;
  added: { type: string; source: RangeRef; by: string }[] = [];
  /** Each chart's series as Excel holds them (the code reads them only through load). */
  private seriesLists = new Map<OfficeMockObject, OfficeMockObject[]>();

  seriesOf(chart: OfficeMockObject): SeriesSeen[] {
    return (this.seriesLists.get(chart) ?? []) as unknown as SeriesSeen[];
  }

  mock<T>(data: Data): T {
    const m = new OfficeMockObject(data);
    this.mocks.push(m);
    return m as unknown as T;
  }

  /** A collection whose load("items/a, items/b") loads items and a, b on each item. */
  collection(items: OfficeMockObject[], extra: Data = {}): Data {
    return mockCollection(items, extra);
  }

  series(name: string, extra: Data = {}): OfficeMockObject {
    return this.mock({
      name,
      chartType: "Line",
      format: { line: { color: "#123456", lineStyle: "Continuous", weight: 0.75 }, fill: { clear() { (this as Data).cleared = true; }, setSolidColor(c: string) { (this as Data).solid = c; } } },
      setValues(r: RangeRef) { (this as Data).valuesFrom = r; },
      setXAxisValues(r: RangeRef) { (this as Data).xFrom = r; },
      delete() { (this as Data).deleted = true; },
      ...extra,
    });
  }

  chart(init: { name: string; chartType: string; top?: number; left?: number; width?: number; height?: number; series: OfficeMockObject[] }): OfficeMockObject {
    const items = init.series;
    const book = this;
    const chart = this.mock<OfficeMockObject>({
      name: init.name,
      chartType: init.chartType,
      top: init.top ?? 0,
      left: init.left ?? 0,
      width: init.width ?? 360,
      height: init.height ?? 216,
      title: { text: "Old title" },
      axes: { valueAxis: { title: { text: "" } }, categoryAxis: { title: { text: "" } } },
      legend: { visible: false, position: "Right" },
      series: this.collection(items, {
        add(name: string) {
          const s = book.series(name);
          items.push(s);
          return s;
        },
        getItemAt(i: number) {
          return items[i];
        },
      }),
      setPosition(start: RangeRef) { (this as Data).positionedAt = start; },
      delete() { (this as Data).deleted = true; },
    });
    this.seriesLists.set(chart, items);
    return chart;
  }

  /** A workbook with one sheet holding `charts`; `charts.add` makes a chart with one series, as Excel does. */
  context(sheetName: string, charts: OfficeMockObject[]): Excel.RequestContext {
    const book = this;
    const sheet = this.mock({
      name: sheetName,
      charts: this.collection(charts, {
        add(type: string, source: RangeRef, by: string) {
          book.added.push({ type, source, by });
          const c = book.chart({ name: "Chart 1", chartType: type, series: [book.series("Series1")] });
          charts.push(c);
          return c;
        },
      }),
      getCell(row: number, col: number) {
        return { row, col };
      },
      getRangeByIndexes(row: number, col: number, rows: number, cols: number): RangeRef {
        return { row, col, rows, cols };
      },
    });
    const workbook = this.mock({
      worksheets: {
        getItem(name: string) {
          expect(name).toBe(sheetName);
          return sheet;
        },
      },
    });
    return {
      workbook,
      sync: async () => {
        this.syncs++;
        for (const m of this.mocks) await m.sync();
        // The mock copies loaded values up to parents in later microtasks: let them run.
        await new Promise((r) => setImmediate(r));
      },
    } as unknown as Excel.RequestContext;
  }
}

const OPTIONS = { method: "lastyear", horizon: 8, levels: [80, 95], checks: true, backtest: { methods: ["lastyear", "drift"], testWeeks: 20, horizon: 4, modes: ["every" as const] } };

function sheetsFor(weeks: number): ManagedSheet[] {
  const series = laneSeries(weeks, 7);
  const a: AnalysedSeries = { name: "Halden–Corvane FEU", series, report: analyse(series, OPTIONS) };
  const stamp: StampInput = {
    version: "0.0.test",
    source: "desk.xlsx › Rates",
    series: [{ name: a.name, first: "2017-01-06", last: a.report.lastWeek, weeks, method: a.report.model.label }],
    options: a.report.options,
    ranAt: "2026-12-02T09:00:00Z",
  };
  return managedSheets([a], stamp);
}

/** Relative luminance of "#RRGGBB" (sRGB weights, no gamma: enough to order shades of one blue). */
function lightness(color: string): number {
  const n = (i: number): number => parseInt(color.slice(i, i + 2), 16);
  return 0.2126 * n(1) + 0.7152 * n(3) + 0.0722 * n(5);
}

function rows(plan: NativeChartPlan, col: number): RangeRef {
  return { row: plan.firstRow, col, rows: plan.lastRow - plan.firstRow + 1, cols: 1 };
}

let full: ManagedSheet[];
let short: ManagedSheet[];
let long: ManagedSheet[];

beforeAll(() => {
  // Five years: every chart kind (the season needs some years of weeks).
  full = sheetsFor(260);
  // A week pasted in: lanes shorter than the 156 history weeks the outlook chart shows, so the
  // chart gains a row (longer lanes keep their length and slide along).
  short = sheetsFor(130);
  long = sheetsFor(131);
});

describe("drawCharts on an empty sheet", () => {
  test("makes one native chart per plan, of the plan's type, its series reading the planned cells", async () => {
    const kinds: Record<string, string> = { line: "Line", radar: "Radar", column: "ColumnClustered" };
    const drawnKinds: string[] = [];
    for (const s of full) {
      const { charts: plans } = withChartData(s);
      if (plans.length === 0) continue;
      drawnKinds.push(...plans.map((p) => p.kind));
      const book = new Book();
      const made: OfficeMockObject[] = [];
      const context = book.context(s.name, made);
      const owned = await drawCharts(context, s.name, plans, []);
      expect(owned).toEqual(plans.map((p) => p.name));
      expect(made).toHaveLength(plans.length);
      // Names of existing charts, then the writes: no series to read on an empty sheet.
      expect(book.syncs).toBe(2);
      plans.forEach((plan, i) => {
        const chart = made[i] as unknown as ChartSeen;
        const series = book.seriesOf(made[i]);
        const n = plan.lastRow - plan.firstRow + 1;
        expect(book.added[i].type).toBe(kinds[plan.kind]);
        // Made from the first series' header and values: one column, one series.
        expect(book.added[i].source).toEqual({ row: plan.firstRow - 1, col: plan.series[0].column, rows: n + 1, cols: 1 });
        expect(chart.name).toBe(plan.name);
        expect(chart.title.text).toBe(plan.title);
        expect(chart.legend.position).toBe("Bottom");
        expect(chart.positionedAt).toEqual({ row: plan.placement.row, col: plan.placement.col });
        expect(chart.width).toBe(plan.placement.widthPx * 0.75);
        expect(chart.height).toBe(plan.placement.heightPx * 0.75);
        expect(series.map((x) => x.name)).toEqual(plan.series.map((x) => x.name));
        plan.series.forEach((p, k) => {
          expect(series[k].valuesFrom).toEqual(rows(plan, p.column));
          expect(series[k].xFrom).toEqual(rows(plan, plan.categoriesColumn));
        });
      });
    }
    expect(drawnKinds).toEqual(["line", "radar", "column"]);
  });

  test("looks: solid history, dashed forecast, clear base, blue bands darker inside, the latest year heavier", async () => {
    const drawn = new Map<string, { plan: NativeChartPlan; chart: ChartSeen; series: SeriesSeen[] }>();
    for (const s of full) {
      const { charts: plans } = withChartData(s);
      const made: OfficeMockObject[] = [];
      const book = new Book();
      await drawCharts(book.context(s.name, made), s.name, plans, []);
      plans.forEach((p, i) => drawn.set(p.kind, { plan: p, chart: made[i] as unknown as ChartSeen, series: book.seriesOf(made[i]) }));
    }
    const line = drawn.get("line");
    if (!line) throw new Error("expected an outlook chart");
    const look = (l: string): SeriesSeen[] => line.series.filter((_, k) => line.plan.series[k].look === l);
    const [history] = look("history");
    const [forecast] = look("forecast");
    const [base] = look("bandBase");
    const bands = look("band");
    expect([history.chartType, history.format.line.lineStyle]).toEqual(["Line", "Continuous"]);
    expect([forecast.chartType, forecast.format.line.lineStyle]).toEqual(["Line", "Dash"]);
    expect([base.chartType, base.format.fill.cleared, base.format.fill.solid]).toEqual(["AreaStacked", true, undefined]);
    expect(bands.map((b) => b.chartType)).toEqual(["AreaStacked", "AreaStacked", "AreaStacked"]);
    // The two 95% rings share a colour; the 80% band between them is darker.
    const [outerLow, inner, outerHigh] = bands.map((b) => b.format.fill.solid as string);
    expect(outerLow).toBe(outerHigh);
    expect(inner).toBe(bandColor(1));
    expect(lightness(inner)).toBeLessThan(lightness(outerLow));
    // One blue: the blue channel leads in every shade.
    for (const c of [outerLow, inner]) expect(parseInt(c.slice(5, 7), 16)).toBeGreaterThan(parseInt(c.slice(1, 3), 16));
    expect(line.chart.axes.valueAxis.title.text).toBe("Rate");

    const radar = drawn.get("radar");
    if (!radar) throw new Error("expected a season chart");
    const weights = radar.series.map((x) => x.format.line.weight as number);
    const latest = weights[weights.length - 1];
    expect(weights.slice(0, -1).every((w) => w < latest)).toBe(true);

    const column = drawn.get("column");
    if (!column) throw new Error("expected a backtest chart");
    const fills = column.series.map((x) => x.format.fill.solid);
    expect(new Set(fills).size).toBe(fills.length);
    expect(column.chart.axes.valueAxis.title.text).toBe("MASE");
  });
});

describe("drawCharts over charts it made before", () => {
  function existingOutlook(book: Book, plan: NativeChartPlan, extraSeries: string[] = [], drop = 0): OfficeMockObject {
    const names = plan.series.map((s) => s.name).slice(0, plan.series.length - drop);
    return book.chart({
      name: plan.name,
      chartType: "Line",
      top: 500,
      left: 40,
      width: 300,
      height: 200,
      series: [...names, ...extraSeries].map((n) => book.series(n)),
    });
  }

  test("after a week more, every series reads down to the new last row; position, size and formatting stay", async () => {
    const [before] = withChartData(short[0]).charts;
    const [after] = withChartData(long[0]).charts;
    expect(after.lastRow).toBe(before.lastRow + 1);
    const book = new Book();
    const old = existingOutlook(book, before, ["Chart layer: 99% base"]);
    const context = book.context(short[0].name, [old]);
    const owned = await drawCharts(context, short[0].name, [after], [after.name]);
    expect(owned).toEqual([after.name]);
    expect(book.added).toHaveLength(0);
    // Names, then the series of the chart to update, then the writes.
    expect(book.syncs).toBe(3);

    const chart = old as unknown as ChartSeen;
    const series = book.seriesOf(old);
    after.series.forEach((p, k) => {
      expect(series[k].valuesFrom).toEqual(rows(after, p.column));
      const r = series[k].valuesFrom as RangeRef;
      expect(r.row + r.rows - 1).toBe(after.lastRow);
      expect(series[k].xFrom).toEqual(rows(after, after.categoriesColumn));
      expect(series[k].deleted).toBeUndefined();
    });
    expect(series[after.series.length].deleted).toBe(true);
    expect(chart.title.text).toBe(after.title);

    expect(chart.positionedAt).toBeUndefined();
    chart.load("top, left, width, height");
    for (const s of series) s.load("chartType, format/line/color, format/line/lineStyle");
    await context.sync();
    expect([chart.top, chart.left, chart.width, chart.height]).toEqual([500, 40, 300, 200]);
    // The user's colours and types are kept: the base series was not made an invisible area.
    expect(series.map((s) => s.format.line.color)).toEqual(series.map(() => "#123456"));
    expect(series.map((s) => s.chartType)).toEqual(series.map(() => "Line"));
  });

  test("a series missing from the chart is added with its look", async () => {
    const [plan] = withChartData(long[0]).charts;
    const book = new Book();
    const old = existingOutlook(book, plan, [], 1); // the forecast, last in the plan, is missing
    const context = book.context(long[0].name, [old]);
    await drawCharts(context, long[0].name, [plan], [plan.name]);
    const series = book.seriesOf(old);
    expect(series).toHaveLength(plan.series.length);
    const added = series[series.length - 1];
    added.load("name");
    await context.sync();
    expect(added.name).toBe(plan.series[plan.series.length - 1].name);
    expect(added.format.line.lineStyle).toBe("Dash");
    expect(added.valuesFrom).toEqual(rows(plan, plan.series[plan.series.length - 1].column));
  });

  test("a chart it made for a series now removed is deleted; the user's charts are not", async () => {
    const [plan] = withChartData(long[0]).charts;
    const book = new Book();
    const current = existingOutlook(book, plan);
    const stale = book.chart({ name: "Fairlead outlook-estmar_halden_teu", chartType: "Line", series: [book.series("Estmar–Halden TEU")] });
    const users = book.chart({ name: "Halden–Corvane by quarter", chartType: "ColumnClustered", series: [book.series("Q")] });
    const unknown = book.chart({ name: "Fairlead season-halden_corvane_feu", chartType: "Radar", series: [book.series("2020")] });
    const context = book.context(long[0].name, [users, stale, current, unknown]);
    const owned = await drawCharts(context, long[0].name, [plan], [plan.name, "Fairlead outlook-estmar_halden_teu"]);
    expect(owned).toEqual([plan.name]);
    expect((stale as unknown as ChartSeen).deleted).toBe(true);
    // Not named in `known`: left, even with the pane's prefix.
    for (const c of [users, current, unknown]) expect((c as unknown as ChartSeen).deleted).toBeUndefined();
    expect(book.added).toHaveLength(0);
    expect(book.syncs).toBe(3);
  });
});
