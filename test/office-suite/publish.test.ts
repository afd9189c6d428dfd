/**
 * Publish into the managers' book (sample-workbooks/summary.xlsx, with --into), opened by
 * LibreOffice headless as a manager without the add-in would open it: the published values it
 * reads are the run's, the log it reads holds the run's forecasts, and no cell of the book holds
 * a FAIRLEAD formula. LibreOffice saves the sheets twice, once as values and once with each
 * formula cell as its formula, so a formula anywhere would show as "=…".
 */
import { spawnSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { PUBLISHED_SHEET } from "../../src/core/present/published";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { TRACK_SHEET } from "../../src/core/present/trackSheet";
import { LOG_COLUMNS, LOG_MARK, LOG_SHEET } from "../../src/core/record/log";
import { BATCH_CLI } from "../engine/paths";
import { expectSame, libreOfficeAvailable, loDate, sheetsAsCsv, tableRows, type Table } from "./libreoffice";

const SAMPLES = path.join(__dirname, "..", "..", "sample-workbooks");

interface PublishDoc {
  series: { name: string; last_week: string; tables: Record<string, Table> }[];
  publish: { parts: string[]; log: { added: number; rows: number } };
}

let dir: string;
let doc: PublishDoc;
let values: Map<string, string[][]>;
let formulas: Map<string, string[][]>;

function fairlead(...args: string[]): string {
  const r = spawnSync(process.execPath, [BATCH_CLI, ...args], { encoding: "utf8", cwd: dir, timeout: 600_000 });
  if (r.status !== 0) throw new Error(`fairlead ${args.join(" ")} exited ${r.status}: ${r.stderr}`);
  return r.stdout;
}

beforeAll(async () => {
  if (!libreOfficeAvailable()) throw new Error("LibreOffice (soffice) is not installed: apt-get install libreoffice-calc-nogui");
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-office-publish-"));
  // The managers' book, with one formula of theirs on a sheet of its own: the control that a
  // formula in the book does show as a formula in LibreOffice's export.
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(path.join(SAMPLES, "summary.xlsx"));
  const notes = wb.addWorksheet("Notes");
  notes.getCell("A1").value = "Lanes followed";
  notes.getCell("B1").value = { formula: "1+2", result: 3 } as ExcelJS.CellFormulaValue;
  await wb.xlsx.writeFile(path.join(dir, "summary.xlsx"));
  // Checks on and a short backtest, so every part of the snapshot has something to show.
  doc = JSON.parse(
    fairlead(
      "publish", path.join(SAMPLES, "desk-weekly.xlsx"), "--into", "summary.xlsx", "--out", "summary-published.xlsx",
      "--method", "lastyear", "--backtest", "weeks=26,ahead=4,refit=fixed", "--methods", "lastyear,drift", "--json", "--quiet",
    ),
  ) as PublishDoc;
  values = sheetsAsCsv(path.join(dir, "summary-published.xlsx"));
  formulas = sheetsAsCsv(path.join(dir, "summary-published.xlsx"), { formulas: true });
});

afterAll(() => {
  if (dir) fs.rmSync(dir, { recursive: true, force: true });
});

function sheetOf(book: Map<string, string[][]>, name: string): string[][] {
  const s = book.get(name);
  if (!s) throw new Error(`LibreOffice saved no sheet ${name}; it saved ${[...book.keys()].join(", ")}`);
  return s;
}

describe("the managers' book after publish, as LibreOffice reads it", () => {
  test("keeps the managers' own sheets and adds Fairlead's, the log among them", () => {
    expect([...values.keys()].sort()).toEqual(
      ["Summary", "Rates", "Notes", "Fairlead Outlook", "Fairlead Season", "Fairlead Checks", "Fairlead Backtest", PUBLISHED_SHEET, LOG_SHEET, TRACK_SHEET].sort(),
    );
    expect(sheetOf(values, "Summary")[0][0]).toBe("Tidemark lanes: weekly rate summary");
    expect(sheetOf(values, PUBLISHED_SHEET)[0][0]).toBe(MANAGED_MARK);
    expect(sheetOf(values, TRACK_SHEET)[0][0]).toBe(MANAGED_MARK);
    expect(sheetOf(values, LOG_SHEET)[0][0]).toBe(LOG_MARK);
  });

  test("the published outlook, seasonal factors, checks and backtest are the run's numbers", () => {
    const sheet = sheetOf(values, PUBLISHED_SHEET);
    expect(doc.series).toHaveLength(4);
    for (const s of doc.series) {
      const t = s.tables.outlook;
      const rows = tableRows(sheet, s.name, t);
      t.rows.forEach((r, i) => {
        expect(loDate(rows[i][1])).toBe(r[1]);
        for (let j = 0; j < r.length; j++) if (j !== 1) expectSame(rows[i][j], r[j]);
      });
      for (const key of ["weekFactors", "stationarity", "backtest"]) {
        const other = s.tables[key];
        expect(other).toBeDefined();
        const got = tableRows(sheet, s.name, other);
        other.rows.forEach((r, i) => r.forEach((c, j) => expectSame(got[i][j], c)));
      }
    }
  });

  test("the log holds the run's forecasts, one row per series and week ahead", () => {
    const sheet = sheetOf(values, LOG_SHEET);
    const header = sheet.findIndex((r) => r[0] === LOG_COLUMNS[0]);
    expect(sheet[header].slice(0, LOG_COLUMNS.length)).toEqual([...LOG_COLUMNS]);
    const rows = sheet.slice(header + 1).filter((r) => r.some((c) => c !== ""));
    const horizon = doc.series[0].tables.outlook.rows.length;
    expect(rows).toHaveLength(doc.series.length * horizon);
    expect(doc.publish.log).toMatchObject({ added: rows.length, rows: rows.length });
    const at = (name: (typeof LOG_COLUMNS)[number]): number => LOG_COLUMNS.indexOf(name);
    doc.series.forEach((s, k) => {
      s.tables.outlook.rows.forEach((r, i) => {
        const row = rows[k * horizon + i];
        expect(row[at("Series")]).toBe(s.name);
        expect(loDate(row[at("Origin week")])).toBe(s.last_week);
        expect(loDate(row[at("Target week")])).toBe(r[1]);
        expectSame(row[at("Forecast")], r[2]);
        expectSame(row[at("Inner low")], r[3]);
        expectSame(row[at("Outer high")], r[6]);
      });
    });
  });

  test("no cell of the book is a FAIRLEAD formula, and no cell of Fairlead's sheets is a formula at all", () => {
    // The control: the managers' own formula is seen as a formula, and as its value.
    expect(sheetOf(formulas, "Notes")[0][1]).toBe("=1+2");
    expect(sheetOf(values, "Notes")[0][1]).toBe("3");
    let cells = 0;
    for (const [name, sheet] of formulas) {
      for (const row of sheet) {
        for (const cell of row) {
          cells++;
          expect(cell).not.toContain("FAIRLEAD.");
          if (name.startsWith("Fairlead ")) expect(cell.startsWith("=")).toBe(false);
        }
      }
    }
    expect(cells).toBeGreaterThan(1000);
  });
});
