/**
 * The chart data blocks behind the pane's native charts, on managed sheets built from real
 * reports (analyse() on two invented lanes) and on a hand-made sheet whose band arithmetic
 * can be done in one's head.
 */
import { analyse } from "../../src/core/analysis";
import type { LineChartSpec } from "../../src/core/present/chartSpec";
import { managedSheets, type AnalysedSeries, type ManagedSheet } from "../../src/core/present/sheets";
import type { StampInput } from "../../src/core/present/stamp";
import type { Cell } from "../../src/core/report";
import { withChartData, type NativeChartPlan } from "../../src/taskpane/chartData";
import { laneSeries } from "../engine/lane";

const OPTIONS = {
  method: "lastyear",
  horizon: 8,
  levels: [80, 95],
  checks: true,
  backtest: { methods: ["lastyear", "drift", "lastweek"], testWeeks: 20, horizon: 4, modes: ["every" as const] },
};

let sheets: ManagedSheet[];
let before: string;

beforeAll(() => {
  const lanes: AnalysedSeries[] = [
    { name: "Halden–Corvane FEU", series: laneSeries(260, 7) },
    { name: "Estmar–Halden TEU", series: laneSeries(200, 11) },
  ].map((l) => ({ ...l, report: analyse(l.series, OPTIONS) }));
  const stamp: StampInput = {
    version: "0.0.test",
    source: "desk.xlsx › Rates",
    series: lanes.map((l) => ({ name: l.name, first: l.series.dates[0].toISOString().slice(0, 10), last: l.report.lastWeek, weeks: l.series.values.length, method: l.report.model.label })),
    options: lanes[0].report.options,
    ranAt: "2026-12-02T09:00:00Z",
  };
  sheets = managedSheets(lanes, stamp);
  before = JSON.stringify(sheets);
});

function column(s: ManagedSheet, col: number, first: number, last: number): Cell[] {
  const out: Cell[] = [];
  for (let r = first; r <= last; r++) out.push(s.cells[r][col]);
  return out;
}

function byLook(plan: NativeChartPlan, look: string): number[] {
  return plan.series.filter((s) => s.look === look).map((s) => s.column);
}

describe("withChartData on the managed sheets of two lanes", () => {
  test("every chart gets a plan whose rows and columns point at the cells written for it", () => {
    for (const s of sheets) {
      const { sheet, charts } = withChartData(s);
      expect(charts.map((c) => c.name)).toEqual(s.charts.map((c) => `Fairlead ${c.spec.id}`));
      charts.forEach((plan, i) => {
        const placed = s.charts[i];
        const spec = placed.spec;
        expect(plan.kind).toBe(spec.kind);
        expect(plan.placement).toEqual({ row: placed.row, col: placed.col, widthPx: placed.widthPx, heightPx: placed.heightPx });
        // Title above the header, header above the data, the data one row per category.
        expect(plan.firstRow).toBe(placed.row + 2);
        expect(plan.lastRow - plan.firstRow + 1).toBe(spec.categories.length);
        expect(sheet.cells[placed.row][plan.categoriesColumn]).toBe(`Chart data: ${spec.title}`);
        expect(column(sheet, plan.categoriesColumn, plan.firstRow, plan.lastRow)).toEqual(spec.categories);
        // The history, forecast, year and method series read exactly the spec's values.
        for (const ser of spec.series) {
          const planned = plan.series.find((p) => p.name === ser.name);
          expect(planned).toBeDefined();
          if (!planned) continue;
          expect(sheet.cells[plan.firstRow - 1][planned.column]).toBe(ser.name);
          expect(column(sheet, planned.column, plan.firstRow, plan.lastRow)).toEqual(ser.values);
        }
      });
    }
  });

  test("looks: history and forecast lines, the latest year strongest, one look per method", () => {
    const [outlook, season, , backtest] = sheets.map((s) => withChartData(s).charts);
    expect(outlook).toHaveLength(2);
    for (const plan of outlook) {
      // Two levels give a base and three layers (lower 95% ring, 80% band, upper 95% ring).
      expect(plan.series.map((s) => s.look)).toEqual(["bandBase", "band", "band", "band", "history", "forecast"]);
      expect(plan.series.map((s) => s.shade)).toEqual([undefined, 0.5, 1, 0.5, undefined, undefined]);
      expect(plan.series[0].name).toBe("Chart layer: 95% base");
      expect(plan.yTitle).toBe("Rate");
    }
    season.forEach((plan, i) => {
      const looks = plan.series.map((s) => s.look);
      expect(looks[looks.length - 1]).toBe("yearLatest");
      expect(looks.slice(0, -1).every((l) => l === "year")).toBe(true);
      // One series per year of the spec, in its order: five for the 260-week lane, four for the 200-week one.
      expect(plan.series.map((s) => s.name)).toEqual(sheets[1].charts[i].spec.series.map((s) => s.name));
    });
    expect(season.map((p) => p.series.length)).toEqual([5, 4]);
    for (const plan of backtest) {
      expect(plan.series.map((s) => s.name).sort()).toEqual(["Drift", "Last week", "Same week last year"].sort());
      expect(plan.series.every((s) => s.look === "method")).toBe(true);
      expect(plan.yTitle).toBe("MASE");
    }
  });

  test("the layers stack back to the bounds: base + all layers = high 95%, base + layers to the inner band = high 80%", () => {
    const s = sheets[0];
    const { sheet, charts } = withChartData(s);
    charts.forEach((plan, i) => {
      const spec = s.charts[i].spec as LineChartSpec;
      const [base] = byLook(plan, "bandBase");
      const layers = byLook(plan, "band");
      expect(layers).toHaveLength(3);
      const h = 8;
      const n = spec.categories.length;
      // The last history week (where the bands start, at the last rate) and the forecast weeks.
      for (let k = n - h - 1; k < n; k++) {
        const r = plan.firstRow + k;
        const v = (c: number): number => sheet.cells[r][c] as number;
        const high95 = spec.bands[0].high[k] as number;
        const high80 = spec.bands[1].high[k] as number;
        // Sums of differences of rates near 2000 give the bound back to float rounding (about 1e-12), so six decimals is a real check.
        expect(v(base)).toBe(spec.bands[0].low[k]);
        expect(v(base) + v(layers[0]) + v(layers[1])).toBeCloseTo(high80, 6);
        expect(v(base) + v(layers[0]) + v(layers[1]) + v(layers[2])).toBeCloseTo(high95, 6);
        // Every layer is a thickness: never negative when the bands nest.
        for (const c of layers) expect(v(c)).toBeGreaterThanOrEqual(0);
      }
      // No band before the last history week: the layers are blank there.
      for (const c of [base, ...layers]) expect(sheet.cells[plan.firstRow][c]).toBeNull();
      // The readable bounds are written too, beside the forecast.
      const header = sheet.cells[plan.firstRow - 1];
      const lowCol = header.indexOf("Low 95%");
      expect(lowCol).toBeGreaterThan(plan.categoriesColumn);
      expect(column(sheet, lowCol, plan.firstRow, plan.lastRow)).toEqual(spec.bands[0].low);
      expect(plan.series.some((p) => p.column === lowCol)).toBe(false);
    });
  });

  test("blocks sit right of every chart and every other block, over cells that were empty", () => {
    for (const s of sheets) {
      const { sheet } = withChartData(s);
      const added = sheet.blocks.slice(s.blocks.length);
      expect(added).toHaveLength(s.charts.length);
      const rightOfCharts = Math.max(s.width, ...s.charts.map((c) => c.col + c.widthCols));
      let previousEnd = rightOfCharts;
      added.forEach((b, i) => {
        expect(b.label).toBe(`${s.charts[i].spec.id}: chart data`);
        expect(b.row).toBe(s.charts[i].row);
        // One blank column after the charts, then after the previous block.
        expect(b.col).toBe(previousEnd + 1);
        previousEnd = b.col + b.cols;
        for (const o of s.blocks) {
          const overlap = b.row < o.row + o.rows && o.row < b.row + b.rows && b.col < o.col + o.cols && o.col < b.col + b.cols;
          expect(overlap).toBe(false);
        }
        for (let r = b.row; r < b.row + b.rows; r++) {
          for (let c = b.col; c < b.col + b.cols; c++) {
            const old = s.cells[r]?.[c];
            expect(old === undefined || old === null).toBe(true);
          }
        }
      });
      // Rectangular and as wide as the last block.
      expect(sheet.width).toBe(added.length > 0 ? previousEnd : s.width);
      expect(sheet.cells.every((r) => r.length === sheet.width)).toBe(true);
      // Everything that was there is still there.
      s.cells.forEach((row, r) => expect(sheet.cells[r].slice(0, s.width)).toEqual(row));
    }
  });

  test("styles: title, header, dates and rates on the outlook data, ratios on the MASE", () => {
    const [outlook, , , backtest] = sheets.map((s) => withChartData(s));
    const plan = outlook.charts[0];
    const styleAt = (sh: ManagedSheet, row: number, col: number): string[] =>
      sh.styles.filter((st) => row >= st.row && row < st.row + st.rows && col >= st.col && col < st.col + st.cols).map((st) => st.style);
    expect(styleAt(outlook.sheet, plan.firstRow - 2, plan.categoriesColumn)).toEqual(["tableTitle"]);
    expect(styleAt(outlook.sheet, plan.firstRow - 1, plan.series[0].column)).toEqual(["header"]);
    expect(styleAt(outlook.sheet, plan.lastRow, plan.categoriesColumn)).toEqual(["date"]);
    for (const s of plan.series) expect(styleAt(outlook.sheet, plan.lastRow, s.column)).toEqual(["rate"]);
    const bt = backtest.charts[0];
    expect(styleAt(backtest.sheet, bt.firstRow, bt.series[0].column)).toEqual(["ratio"]);
    expect(styleAt(backtest.sheet, bt.firstRow, bt.categoriesColumn)).toEqual([]);
  });

  test("the input sheets are left exactly as they were", () => {
    for (const s of sheets) withChartData(s);
    expect(JSON.stringify(sheets)).toBe(before);
  });
});

describe("band layers by hand", () => {
  // Three nested bands around 100 on the one forecast week, widest first, and a gap week.
  const spec: LineChartSpec = {
    kind: "line",
    id: "outlook-test",
    title: "Test: outlook for 2 weeks",
    categories: ["2026-11-27", "2026-12-04", "2026-12-11"],
    series: [
      { name: "Test", values: [100, null, null], role: "history" },
      { name: "Forecast (x)", values: [100, 100, 101], role: "forecast" },
    ],
    bands: [
      { name: "95% interval", low: [100, 90, null], high: [100, 110, null] },
      { name: "80% interval", low: [100, 94, null], high: [100, 106, null] },
      { name: "50% interval", low: [100, 97, null], high: [100, 103, null] },
    ],
    yTitle: "Rate",
    caption: "Fairlead",
  };
  const sheet: ManagedSheet = {
    kind: "outlook",
    name: "Fairlead Outlook",
    cells: [["x", null], [null, "y"]],
    width: 2,
    styles: [],
    names: [],
    charts: [{ spec, row: 1, col: 3, widthPx: 960, heightPx: 480, widthCols: 10, heightRows: 24 }],
    blocks: [],
  };

  test("base 90, rings 4 and 3, inner band 6, rings 3 and 4; null where a bound is null", () => {
    const { sheet: out, charts } = withChartData(sheet);
    const [plan] = charts;
    // Right of the chart (col 3 + 10 columns), one blank column clear.
    expect(plan.categoriesColumn).toBe(14);
    expect(plan.firstRow).toBe(3);
    const layers = plan.series.filter((s) => s.look === "bandBase" || s.look === "band");
    expect(layers.map((s) => s.name)).toEqual([
      "Chart layer: 95% base",
      "Chart layer: 95% low to 80% low",
      "Chart layer: 80% low to 50% low",
      "Chart layer: 50% low to high",
      "Chart layer: 50% high to 80% high",
      "Chart layer: 80% high to 95% high",
    ]);
    expect(layers.map((s) => out.cells[plan.firstRow + 1][s.column])).toEqual([90, 4, 3, 6, 3, 4]);
    expect(layers.map((s) => out.cells[plan.firstRow][s.column])).toEqual([100, 0, 0, 0, 0, 0]);
    expect(layers.map((s) => out.cells[plan.firstRow + 2][s.column])).toEqual([null, null, null, null, null, null]);
    // Darker towards the inner band: the 95% rings lightest, the 50% band darkest.
    expect(layers.slice(1).map((s) => s.shade)).toEqual([1 / 3, 2 / 3, 1, 2 / 3, 1 / 3]);
    expect(out.cells[plan.firstRow - 1][plan.categoriesColumn]).toBe("Week ending");
    expect(out.width).toBe(14 + 1 + 2 + 6 + 6); // categories, two lines, six bounds, six layers
    expect(out.cells).toHaveLength(plan.lastRow + 1);
    expect(sheet.cells).toEqual([["x", null], [null, "y"]]);
  });
});
