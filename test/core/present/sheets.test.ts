/**
 * The managed-sheet layout and the chart specs: every report table lands on its sheet verbatim,
 * the workbook names cover exactly the outlook columns they are named for, and charts sit
 * beside the tables, not over them. The report comes from analyse() on an invented lane.
 */
import { analyse, type Report } from "../../../src/core/analysis";
import { outlookName, seriesKey } from "../../../src/core/present/names";
import { CELL_PX, MANAGED_SHEETS, managedSheets, type ManagedSheet, type NamedRange } from "../../../src/core/present/sheets";
import { MANAGED_MARK, stampRows, type StampInput } from "../../../src/core/present/stamp";
import type { Cell } from "../../../src/core/report";
import type { WeeklySeries } from "../../../src/core/series/types";
import { laneSeries } from "../../engine/lane";

let series: WeeklySeries;
let report: Report;
let sheets: ManagedSheet[];
let stamp: StampInput;

beforeAll(() => {
  series = laneSeries(260);
  report = analyse(series, { method: "lastyear", horizon: 6, backtest: { methods: ["lastyear", "drift"], testWeeks: 12, horizon: 3 } });
  stamp = {
    version: "0.0.test",
    source: "desk.xlsx › Rates",
    series: [{ name: "Halden–Corvane FEU", first: "2017-01-06", last: report.lastWeek, weeks: 260, method: report.model.label }],
    options: report.options,
    ranAt: "2026-12-02T09:00:00Z",
  };
  sheets = managedSheets([{ name: "Halden–Corvane FEU", series, report }], stamp);
});

function rangeValues(s: ManagedSheet, n: NamedRange): Cell[] {
  const out: Cell[] = [];
  for (let r = n.row; r < n.row + n.rows; r++) for (let c = n.col; c < n.col + n.cols; c++) out.push(s.cells[r][c]);
  return out;
}

describe("workbook names", () => {
  test("keys are capitals, digits and single underscores; names cannot be read as cell references", () => {
    expect(seriesKey("Halden–Corvane FEU")).toBe("HALDEN_CORVANE_FEU");
    expect(seriesKey("  Estmar / Halden (40') ")).toBe("ESTMAR_HALDEN_40");
    expect(seriesKey("Córvane")).toBe("CORVANE");
    expect(seriesKey("–")).toBe("SERIES");
    expect(outlookName("Halden–Corvane FEU", { low: 97.5 })).toBe("FL_HALDEN_CORVANE_FEU_LOW_97_5");
    // Excel's rule for defined names: start with a letter or underscore, then letters, digits,
    // underscores or periods, and not a cell address such as FL1 or XFD100.
    for (const part of ["WEEK", "POINT", "ASOF", { low: 80 }, { high: 95 }] as const) {
      const n = outlookName("Halden–Corvane FEU", part);
      expect(n).toMatch(/^[A-Za-z_][A-Za-z0-9_.]*$/);
      expect(n).not.toMatch(/^[A-Za-z]{1,3}\d+$/);
    }
  });

  test("the outlook names cover exactly the forecast weeks, points and bounds of the report", () => {
    const outlook = sheets.find((s) => s.kind === "outlook") as ManagedSheet;
    const t = report.tables.outlook;
    const byName = new Map(outlook.names.map((n) => [n.name, n]));
    const column = (c: string): Cell[] => t.rows.map((r) => r[t.columns.indexOf(c)]);
    expect(rangeValues(outlook, byName.get(outlookName("Halden–Corvane FEU", "POINT")) as NamedRange)).toEqual(column("Forecast"));
    expect(rangeValues(outlook, byName.get(outlookName("Halden–Corvane FEU", "WEEK")) as NamedRange)).toEqual(column("Week ending"));
    expect(rangeValues(outlook, byName.get(outlookName("Halden–Corvane FEU", { low: 80 })) as NamedRange)).toEqual(column("Low 80%"));
    expect(rangeValues(outlook, byName.get(outlookName("Halden–Corvane FEU", { high: 95 })) as NamedRange)).toEqual(column("High 95%"));
    expect(rangeValues(outlook, byName.get(outlookName("Halden–Corvane FEU", "ASOF")) as NamedRange)).toEqual([report.lastWeek]);
    expect(outlook.names).toHaveLength(7); // week, point, 2 levels × 2 bounds, as-of
  });
});

describe("managed sheets", () => {
  test("four sheets, each opening with the mark and the stamp", () => {
    expect(sheets.map((s) => s.name)).toEqual(MANAGED_SHEETS.map((m) => m.name));
    for (const s of sheets) {
      expect(s.cells[0][0]).toBe(MANAGED_MARK);
      const rows = stampRows(stamp, MANAGED_SHEETS.find((m) => m.kind === s.kind)?.what ?? "");
      rows.forEach((r, i) => expect(s.cells[i].slice(0, 2)).toEqual(r));
      expect(s.cells.every((r) => r.length === s.width)).toBe(true);
    }
    const asOf = stampRows(stamp, "x").find((r) => r[0] === "As of week ending");
    expect(asOf?.[1]).toBe(report.lastWeek);
  });

  test("every table of the report is on its sheet verbatim: title, header, rows and notes", () => {
    const placed: string[] = [];
    for (const s of sheets) {
      for (const b of s.blocks) {
        if (b.label === "stamp") continue;
        const key = b.label.split(": ")[1] as keyof Report["tables"];
        const t = report.tables[key];
        expect(t).toBeDefined();
        if (!t) continue;
        placed.push(key);
        expect(s.cells[b.row][0]).toBe(t.title);
        expect(s.cells[b.row + 1].slice(0, t.columns.length)).toEqual(t.columns);
        t.rows.forEach((r, i) => expect(s.cells[b.row + 2 + i].slice(0, r.length)).toEqual(r));
        t.notes.forEach((n, i) => expect(s.cells[b.row + 2 + t.rows.length + i][0]).toBe(n));
      }
    }
    const present = Object.entries(report.tables).filter(([, t]) => t !== undefined).map(([k]) => k);
    expect(placed.sort()).toEqual(present.sort());
  });

  test("charts sit to the right of every table whose rows they run beside", () => {
    for (const s of sheets) {
      for (const ch of s.charts) {
        for (const b of s.blocks) {
          const besideRows = b.row < ch.row + ch.heightRows && b.row + b.rows > ch.row;
          if (besideRows && b.label !== "stamp") expect(ch.col).toBeGreaterThanOrEqual(b.cols + 1);
        }
        expect(ch.row).toBeGreaterThan(stampRows(stamp, "x").length);
      }
    }
    expect(sheets.map((s) => s.charts.map((c) => c.spec.kind))).toEqual([["line"], ["radar"], [], ["column"]]);
    // Drawn at their own proportions (the season's circle square), and the cells reserved cover them.
    const sizes = sheets.flatMap((s) => s.charts.map((c) => [c.widthPx, c.heightPx]));
    expect(sizes).toEqual([[960, 480], [640, 640], [960, 480]]);
    for (const c of sheets.flatMap((s) => s.charts)) {
      expect(c.heightRows * CELL_PX.height).toBeGreaterThanOrEqual(c.heightPx);
      expect(c.widthCols * CELL_PX.width).toBeGreaterThanOrEqual(c.widthPx);
    }
  });
});

describe("chart specs", () => {
  test("outlook: three years of history, then the forecast joined to the last rate, bands widest first", () => {
    const spec = sheets[0].charts[0].spec;
    if (spec.kind !== "line") throw new Error("expected a line chart");
    const h = report.options.horizon;
    expect(spec.categories).toHaveLength(156 + h);
    expect(spec.categories[155]).toBe(report.lastWeek);
    const [history, forecast] = spec.series;
    expect(history.values.slice(0, 156)).toEqual(Array.from(series.values.slice(260 - 156)));
    expect(history.values.slice(156).every((v) => v === null)).toBe(true);
    expect(forecast.values[155]).toBe(series.values[259]);
    const t = report.tables.outlook;
    expect(forecast.values.slice(156)).toEqual(t.rows.map((r) => r[t.columns.indexOf("Forecast")]));
    expect(spec.bands.map((b) => b.name)).toEqual(["95% interval", "80% interval"]);
    expect(spec.bands[0].high.slice(156)).toEqual(t.rows.map((r) => r[t.columns.indexOf("High 95%")]));
  });

  test("season: 52 ISO weeks, the last five years of the week × year table", () => {
    const spec = sheets[1].charts[0].spec;
    const t = report.tables.weekYear;
    if (!t) throw new Error("expected the week × year table");
    expect(spec.categories).toHaveLength(52);
    expect(spec.categories[0]).toBe("W01");
    expect(spec.series.map((s) => s.name)).toEqual(t.columns.slice(-5));
    expect(spec.series[4].values).toEqual(t.rows.map((r) => r[t.columns.length - 1]));
  });

  test("backtest: MASE per method and weeks ahead, as the accuracy table gives it", () => {
    const spec = sheets[3].charts[0].spec;
    const t = report.tables.backtest;
    if (!t) throw new Error("expected a backtest");
    expect(spec.categories).toEqual(["1 wk", "2 wk", "3 wk"]);
    const col = (c: string): number => t.columns.indexOf(c);
    for (const s of spec.series) {
      const rows = t.rows.filter((r) => r[col("Method")] === s.name);
      expect(s.values).toEqual(rows.map((r) => r[col("MASE")]));
    }
    expect(spec.series.map((s) => s.name).sort()).toEqual(["Drift", "Same week last year"].sort());
  });
});
