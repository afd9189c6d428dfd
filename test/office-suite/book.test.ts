/**
 * The output books opened by a real spreadsheet engine (LibreOffice headless, Debian's
 * libreoffice-calc-nogui): the values it reads from the managed sheets are the report's, no
 * managed cell holds a formula, and the sample budget's formulas, which link to the published
 * outlook by workbook name, recalculate to the numbers the outlook implies.
 */
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { BATCH_CLI } from "../engine/paths";
import { expectSame, libreOfficeAvailable, loDate, sheetsAsCsv, tableRows, type Table } from "./libreoffice";

const SAMPLES = path.join(__dirname, "..", "..", "sample-workbooks");
const LANES = ["Halden–Corvane FEU", "Corvane–Estmar FEU", "Estmar–Halden FEU"];

interface RunDoc {
  series: { name: string; last_week: string; tables: Record<string, Table> }[];
}

let dir: string;
let desk: RunDoc;
let budget: RunDoc;
let deskSheets: Map<string, string[][]>;
let budgetSheets: Map<string, string[][]>;

function fairlead(...args: string[]): string {
  const r = spawnSync(process.execPath, [BATCH_CLI, ...args], { encoding: "utf8", cwd: dir, timeout: 600_000 });
  if (r.status !== 0) throw new Error(`fairlead ${args.join(" ")} exited ${r.status}: ${r.stderr}`);
  return r.stdout;
}

beforeAll(() => {
  if (!libreOfficeAvailable()) throw new Error("LibreOffice (soffice) is not installed: apt-get install libreoffice-calc-nogui");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-office-"));
  // A real backtest (fixed parameters, half a year) keeps the suite short; the demo runs the full one.
  desk = JSON.parse(
    fairlead("run", path.join(SAMPLES, "desk-weekly.xlsx"), "--backtest", "weeks=26,ahead=4,refit=fixed", "--methods", "tbats,sarima,lastyear", "--out", "desk-out.xlsx", "--json", "--quiet"),
  ) as RunDoc;
  budget = JSON.parse(
    fairlead("run", path.join(SAMPLES, "desk-weekly.xlsx"), "--into", path.join(SAMPLES, "budget.xlsx"), "--method", "tbats", "--backtest", "off", "--no-checks", "--column", LANES.join(","), "--out", "budget-out.xlsx", "--json", "--quiet"),
  ) as RunDoc;
  // The budget receives the desk book's outlook (--into), as a budget owner's copy would.
  deskSheets = sheetsAsCsv(path.join(dir, "desk-out.xlsx"));
  budgetSheets = sheetsAsCsv(path.join(dir, "budget-out.xlsx"));
});

afterAll(() => {
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

describe("the desk book, as LibreOffice reads it", () => {
  test("the outlook values are the report's, lane by lane, dates included", () => {
    const sheet = deskSheets.get("Fairlead Outlook") as string[][];
    expect(sheet[0][0]).toBe(MANAGED_MARK);
    expect(desk.series).toHaveLength(4);
    for (const s of desk.series) {
      const t = s.tables.outlook;
      const rows = tableRows(sheet, s.name, t);
      t.rows.forEach((r, i) => {
        expect(loDate(rows[i][1])).toBe(r[1]);
        for (let j = 0; j < r.length; j++) if (j !== 1) expectSame(rows[i][j], r[j]);
      });
    }
  });

  test("seasonal factors, the stationarity table and the backtest accuracy are the report's", () => {
    for (const [sheetName, key] of [
      ["Fairlead Season", "weekFactors"],
      ["Fairlead Checks", "stationarity"],
      ["Fairlead Backtest", "backtest"],
    ] as const) {
      const sheet = deskSheets.get(sheetName) as string[][];
      for (const s of desk.series) {
        const t = s.tables[key];
        expect(t).toBeDefined();
        const rows = tableRows(sheet, s.name, t);
        t.rows.forEach((r, i) => r.forEach((c, j) => expectSame(rows[i][j], c)));
      }
    }
  });

  test("the managed sheets hold values only (no formula), and each chart is an embedded image", async () => {
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path.join(dir, "desk-out.xlsx"));
    let images = 0;
    for (const ws of wb.worksheets.filter((w) => w.name.startsWith("Fairlead "))) {
      ws.eachRow((row) =>
        row.eachCell((cell) => {
          expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
        }),
      );
      images += ws.getImages().length;
    }
    // Outlook, season and backtest chart per series.
    expect(images).toBe(3 * desk.series.length);
  });
});

describe("the budget book's links to the published outlook", () => {
  test("recalculate in LibreOffice to the outlook's numbers", () => {
    const sheet = budgetSheets.get("Budget") as string[][];
    const header = sheet.findIndex((r) => r[0] === "Lane");
    expect(header).toBeGreaterThanOrEqual(0);
    let total = 0;
    LANES.forEach((lane, k) => {
      const row = sheet[header + 1 + k];
      expect(row[0]).toBe(lane);
      const s = budget.series.find((x) => x.name === lane);
      if (!s) throw new Error(`no report for ${lane}`);
      const t = s.tables.outlook;
      const col = (c: string): number => t.columns.indexOf(c);
      const first4 = (c: string): number[] => t.rows.slice(0, 4).map((r) => r[col(c)] as number);
      const mean = (xs: number[]): number => xs.reduce((a, b) => a + b, 0) / xs.length;
      const boxes = Number(row[1]);
      // Hand computation from the report: next week's point; the mean of weeks 1–4 for the
      // average and for the 80% bounds; cost = average × boxes per week × 4 weeks.
      const near = (text: string, want: number): void => expect(Math.abs(Number(text) - want)).toBeLessThanOrEqual(1e-9 * Math.abs(want));
      near(row[2], t.rows[0][col("Forecast")] as number);
      near(row[3], mean(first4("Forecast")));
      near(row[4], mean(first4("Low 80%")));
      near(row[5], mean(first4("High 80%")));
      near(row[6], mean(first4("Forecast")) * boxes * 4);
      total += mean(first4("Forecast")) * boxes * 4;
    });
    const totalRow = sheet[header + 1 + LANES.length];
    expect(totalRow[0]).toBe("Total");
    expect(Math.abs(Number(totalRow[6]) - total)).toBeLessThanOrEqual(1e-9 * total);
    // The as-of cell links to FL_HALDEN_CORVANE_FEU_ASOF.
    const asOf = sheet.find((r) => /data to week ending/i.test(r[0]));
    expect(loDate(asOf?.[1] ?? "")).toBe(budget.series[0].last_week);
    expect(sheet.flat().some((c) => c.startsWith("#"))).toBe(false);
  });
});
