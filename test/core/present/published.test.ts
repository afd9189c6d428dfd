/**
 * The published snapshot: only the chosen parts, every value copied from the report tables
 * (plain values, no formula text), charts with their own ids beside their part, and the stamp
 * saying when it was published. The report comes from analyse() on an invented lane.
 */
import { analyse } from "../../../src/core/analysis";
import { PUBLISHED_SHEET, parseParts, publishedSheet } from "../../../src/core/present/published";
import { managedSheets } from "../../../src/core/present/sheets";
import { MANAGED_MARK, stampOf } from "../../../src/core/present/stamp";
import type { Cell } from "../../../src/core/report";
import { laneSeries } from "../../engine/lane";

const series = laneSeries(260);
const report = analyse(series, { method: "lastyear", horizon: 6, backtest: { methods: ["lastyear", "drift"], testWeeks: 12, horizon: 3 } });
const analysed = [{ name: "Estmar–Halden FEU", series, report }];
const stamp = stampOf("desk.xlsx › Rates", analysed, new Date("2026-12-03T09:00:00Z"), "0.0.test");

function tableAt(cells: Cell[][], title: string): { header: Cell[]; rows: Cell[][] } {
  const top = cells.findIndex((r) => r[0] === title);
  expect(top).toBeGreaterThan(0);
  return { header: cells[top + 1], rows: cells.slice(top + 2) };
}

describe("published sheet", () => {
  test("the outlook and backtest parts hold the report's tables verbatim and nothing of the season or checks", () => {
    const sheet = publishedSheet(analysed, stamp, ["outlook", "backtest"], "2026-12-03T09:05:00Z");
    expect(sheet.name).toBe(PUBLISHED_SHEET);
    expect(sheet.cells[0][0]).toBe(MANAGED_MARK);
    expect(sheet.cells.find((r) => r[0] === "Published")?.[1]).toBe("2026-12-03T09:05:00Z");
    const o = report.tables.outlook;
    const shown = tableAt(sheet.cells, o.title);
    expect(shown.header.slice(0, o.columns.length)).toEqual(o.columns);
    o.rows.forEach((r, i) => expect(shown.rows[i].slice(0, r.length)).toEqual(r));
    const bt = report.tables.backtest;
    expect(bt).toBeDefined();
    expect(tableAt(sheet.cells, bt?.title as string).rows[0].slice(0, bt?.columns.length)).toEqual(bt?.rows[0]);
    const labels = sheet.blocks.map((b) => b.label);
    expect(labels).not.toContain("Estmar–Halden FEU: weekFactors");
    expect(labels).not.toContain("Estmar–Halden FEU: stationarity");
    // Plain values only: nothing a spreadsheet would read as a formula.
    for (const r of sheet.cells) for (const c of r) if (typeof c === "string") expect(c.startsWith("=")).toBe(false);
    expect(sheet.names).toEqual([]);
  });

  test("charts get ids of their own (the managed sheets hold the same charts) and sit right of their part", () => {
    const sheet = publishedSheet(analysed, stamp, ["outlook", "season", "checks", "backtest"], "2026-12-03T09:05:00Z");
    const ids = sheet.charts.map((c) => c.spec.id);
    expect(ids).toEqual(["published-outlook-estmar_halden_feu", "published-season-estmar_halden_feu", "published-backtest-estmar_halden_feu"]);
    const managedIds = managedSheets(analysed, stamp).flatMap((s) => s.charts.map((c) => c.spec.id));
    for (const id of ids) expect(managedIds).not.toContain(id);
    for (const ch of sheet.charts) {
      for (const b of sheet.blocks) {
        const rowsOverlap = b.row < ch.row + ch.heightRows && b.row + b.rows > ch.row;
        if (rowsOverlap) expect(b.col + b.cols).toBeLessThanOrEqual(ch.col);
      }
    }
  });

  test("parts are read from a list, in the sheet's order, and a wrong name is a sentence", () => {
    expect(parseParts("backtest, Outlook")).toEqual(["outlook", "backtest"]);
    expect(() => parseParts("outlook,forecast")).toThrow("Publish shows outlook, season, checks, backtest (any of them, separated by commas); got “outlook,forecast”.");
  });
});
