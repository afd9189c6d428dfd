/**
 * The command-line runner as a user meets it: the compiled `fairlead` started as a process of
 * its own, on small books and CSV files made here. Exit codes (0 done, 2 bad input with one
 * sentence, 1 internal), byte-identical JSON for identical inputs, the DESIGN.md forecast
 * object, the input book left untouched, and a user's sheet never overwritten.
 */
import { spawnSync } from "child_process";
import * as crypto from "crypto";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { analyse } from "../../src/core/analysis";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { readWeekly } from "../../src/core/series/intake";
import { BATCH_CLI } from "../engine/paths";
import { laneSeries } from "../engine/lane";

const SAMPLES = path.join(__dirname, "..", "..", "sample-workbooks");
let dir: string;

function fairlead(...args: string[]): { code: number; stdout: string; stderr: string } {
  const r = spawnSync(process.execPath, [BATCH_CLI, ...args], { encoding: "utf8", cwd: dir, timeout: 240_000 });
  return { code: r.status ?? -1, stdout: r.stdout, stderr: r.stderr };
}

function sha(file: string): string {
  return crypto.createHash("sha256").update(fs.readFileSync(file)).digest("hex");
}

/** The invented lane of the engine tests as CSV: ISO dates and rates with two decimals. */
function laneCsv(n: number, file: string): void {
  const s = laneSeries(n);
  const lines = ["Week ending,Halden–Corvane FEU"];
  s.dates.forEach((d, i) => lines.push(`${d.toISOString().slice(0, 10)},${s.values[i]}`));
  fs.writeFileSync(file, `${lines.join("\n")}\n`);
}

/** A small book: one sheet "Rates" with dates and two lanes, written as Excel would (real dates). */
async function smallBook(file: string, n: number, edit?: (ws: ExcelJS.Worksheet) => void): Promise<void> {
  const a = laneSeries(n, 7);
  const b = laneSeries(n, 11);
  const wb = new ExcelJS.Workbook();
  const ws = wb.addWorksheet("Rates");
  ws.addRow(["Week ending", "Halden–Corvane FEU", "Corvane–Estmar FEU"]);
  for (let i = 0; i < n; i++) ws.addRow([a.dates[i], a.values[i], b.values[i]]);
  ws.getColumn(1).numFmt = "yyyy-mm-dd";
  edit?.(ws);
  await wb.xlsx.writeFile(file);
}

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-cli-"));
  laneCsv(200, path.join(dir, "lane.csv"));
  await smallBook(path.join(dir, "small.xlsx"), 200);
});

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("forecast --json", () => {
  test("prints the DESIGN.md object, equal to analyse() on the same rates, byte-identical across runs", () => {
    const args = ["forecast", "--csv", "lane.csv", "--column", "Halden–Corvane FEU", "--horizon", "4", "--method", "sarima", "--json", "--quiet"];
    const one = fairlead(...args);
    expect(one.stderr).toBe("");
    expect(one.code).toBe(0);
    const two = fairlead(...args);
    expect(two.stdout).toBe(one.stdout);
    const out = JSON.parse(one.stdout) as {
      method: string;
      chosen: string;
      horizon: number;
      levels: number[];
      last_week: string;
      forecast: { step: number; week: string; point: number; lower: Record<string, number>; upper: Record<string, number> }[];
      warnings: string[];
      seconds?: number;
    };
    expect(Object.keys(out)).toEqual(["method", "chosen", "horizon", "levels", "last_week", "forecast", "warnings"]);
    // The same rates through the core directly: the CLI adds nothing and loses nothing.
    const s = laneSeries(200);
    const report = analyse(readWeekly([["Halden–Corvane FEU"], ...Array.from(s.values, (v) => [String(v)])], { dates: [["Week ending"], ...s.dates.map((d) => [d.toISOString().slice(0, 10)])] }), {
      method: "sarima",
      horizon: 4,
      checks: false,
    });
    expect(out.method).toBe("sarima");
    expect(out.chosen).toBe(report.model.structure);
    expect(out.last_week).toBe(report.lastWeek);
    expect(out.levels).toEqual([80, 95]);
    const t = report.tables.outlook;
    out.forecast.forEach((f, i) => {
      expect(f.step).toBe(i + 1);
      expect(f.week).toBe(t.rows[i][1]);
      expect(f.point).toBe(t.rows[i][2]);
      expect(f.lower["80"]).toBe(t.rows[i][3]);
      expect(f.upper["95"]).toBe(t.rows[i][6]);
    });
    expect(out.seconds).toBeUndefined();
    const timed = JSON.parse(fairlead(...args, "--timing").stdout) as { seconds: number };
    expect(timed.seconds).toBeGreaterThan(0);
  });

  test("--lunar-new-year gives SARIMA the holiday regressors", () => {
    const base = ["forecast", "--csv", "lane.csv", "--horizon", "2", "--method", "sarima", "--json", "--quiet"];
    const withCal = JSON.parse(fairlead(...base, "--lunar-new-year").stdout) as { chosen: string };
    const without = JSON.parse(fairlead(...base).stdout) as { chosen: string };
    expect(withCal.chosen).toMatch(/\+ 5 further regressors$/);
    expect(without.chosen).not.toMatch(/further regressors/);
  });

  test("--event-weeks adds one regressor beside the holiday's; a week outside the rates is one sentence, exit 2", () => {
    const s = laneSeries(200);
    const week = (t: number): string => s.dates[t].toISOString().slice(0, 10);
    const base = ["forecast", "--csv", "lane.csv", "--horizon", "2", "--method", "sarima", "--json", "--quiet", "--lunar-new-year"];
    const both = JSON.parse(fairlead(...base, "--event-weeks", `${week(60)},${week(120)}`).stdout) as { chosen: string };
    expect(both.chosen).toMatch(/\+ 6 further regressors$/);
    const late = fairlead(...base, "--event-weeks", "2099-01-01");
    expect(late.code).toBe(2);
    expect(late.stderr).toBe(`fairlead: None of the event weeks falls within the rates (${week(0)} to ${week(199)}), so their effect cannot be estimated; list at least one past week.\n`);
  });

  test("--event-column reads the weeks marked in a column (a coming week too) as --event-weeks would, and never as rates", async () => {
    const s = laneSeries(200, 7);
    const week = (t: number): string => s.dates[t].toISOString().slice(0, 10);
    const coming = new Date(s.dates[199].getTime() + 2 * 7 * 86_400_000);
    await smallBook(path.join(dir, "events.xlsx"), 200, (ws) => {
      ws.getCell("D1").value = "Port strike";
      ws.getCell("D62").value = "x"; // row 62 holds week index 60 (header in row 1)
      ws.getCell("D122").value = 1;
      // A dated row below the last rate, marked: a coming event week.
      ws.getCell("A203").value = coming;
      ws.getCell("D203").value = true;
    });
    const base = ["forecast", "events.xlsx", "--column", "Halden–Corvane FEU", "--horizon", "4", "--method", "sarima", "--json", "--quiet"];
    const byColumn = fairlead(...base, "--event-column", "Port strike");
    expect(byColumn.stderr).toBe("");
    const byList = fairlead(...base, "--event-weeks", `${week(60)},${week(120)},${coming.toISOString().slice(0, 10)}`);
    expect(byColumn.code).toBe(0);
    // Same regressor, same fit: the outputs are byte-identical.
    expect(byColumn.stdout).toBe(byList.stdout);
    expect((JSON.parse(byColumn.stdout) as { chosen: string }).chosen).toMatch(/\+ 1 further regressor$/);
    // run reads the two lanes, not the marks.
    const run = fairlead("run", "events.xlsx", "--method", "lastweek", "--backtest", "off", "--no-checks", "--event-column", "D", "--json", "--quiet");
    expect(run.code).toBe(0);
    expect((JSON.parse(run.stdout) as { series: { name: string }[] }).series.map((x) => x.name)).toEqual(["Halden–Corvane FEU", "Corvane–Estmar FEU"]);
    // A cell that is not a mark: one sentence naming the cell, exit 2.
    await smallBook(path.join(dir, "badmark.xlsx"), 200, (ws) => {
      ws.getCell("D1").value = "Port strike";
      ws.getCell("D62").value = "maybe";
    });
    const bad = fairlead("forecast", "badmark.xlsx", "--column", "Halden–Corvane FEU", "--method", "lastweek", "--event-column", "Port strike", "--quiet");
    expect(bad.code).toBe(2);
    expect(bad.stderr).toBe(
      "fairlead: badmark.xlsx › Rates: The event column \"Port strike\": “maybe” is not a mark; mark each event week with 1 (or x, TRUE) and leave the other weeks blank or 0. (cell Rates!D62)\n",
    );
  });

  test("--coverage sets the levels and the bound keys", () => {
    const r = fairlead("forecast", "--csv", "lane.csv", "--horizon", "2", "--method", "lastweek", "--coverage", "50,90", "--json");
    expect(r.code).toBe(0);
    const out = JSON.parse(r.stdout) as { levels: number[]; forecast: { lower: Record<string, number> }[] };
    expect(out.levels).toEqual([50, 90]);
    expect(Object.keys(out.forecast[0].lower)).toEqual(["50", "90"]);
  });
});

describe("bad input: exit 2 and one sentence", () => {
  beforeAll(async () => {
    await smallBook(path.join(dir, "text.xlsx"), 120, (ws) => {
      ws.getCell("B40").value = "n/a (port closed)";
    });
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet("Rates");
    ws.addRow(["Day", "Rate"]);
    for (let i = 0; i < 60; i++) ws.addRow([new Date(Date.UTC(2026, 0, 1 + i)), 1000 + i]);
    await wb.xlsx.writeFile(path.join(dir, "daily.xlsx"));
  });

  test.each([
    ["a missing file", ["run", "nowhere.xlsx"], /^fairlead: There is no file nowhere\.xlsx\.$/],
    ["a missing column", ["run", "small.xlsx", "--column", "Estmar–Halden FEU"], /has no rate column "Estmar–Halden FEU"; its columns are "Week ending", "Halden–Corvane FEU", "Corvane–Estmar FEU"\.$/],
    ["text in the rate column", ["run", "text.xlsx", "--column", "Halden–Corvane FEU"], /column "Halden–Corvane FEU": .*n\/a \(port closed\).*\(cell Rates!B40\)$/],
    ["a date column that is not weekly", ["forecast", "daily.xlsx", "--column", "Rate", "--method", "lastweek"], /column "Rate": .*(daily|week).*$/i],
    ["an unknown option", ["run", "small.xlsx", "--horizn", "4"], /"run" has no option --horizn/],
    ["an unknown method", ["forecast", "--csv", "lane.csv", "--method", "oracle"], /The method "oracle" is not available; choose one of:/],
    ["an impossible horizon", ["forecast", "--csv", "lane.csv", "--horizon", "0"], /--horizon must be a whole number from 1 to 260; got "0"/],
    ["an unknown verb", ["publish-all"], /fairlead has no verb "publish-all"/],
  ])("%s", (_what, args, message) => {
    const r = fairlead(...args);
    expect(r.code).toBe(2);
    expect(r.stdout).toBe("");
    const lines = r.stderr.trim().split("\n");
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatch(message);
  });
});

describe("run", () => {
  const quick = ["--method", "lastyear", "--backtest", "weeks=8,ahead=2,refit=fixed", "--methods", "lastyear,drift", "--no-charts", "--quiet"];

  test("writes a copy with the four managed sheets, leaves the input untouched, JSON byte-identical", async () => {
    const before = sha(path.join(dir, "small.xlsx"));
    const one = fairlead("run", "small.xlsx", ...quick, "--json", "--out", "one.xlsx");
    expect(one.stderr).toBe("");
    expect(one.code).toBe(0);
    const two = fairlead("run", "small.xlsx", ...quick, "--json", "--out", "two.xlsx");
    expect(two.stdout).toBe(one.stdout);
    expect(sha(path.join(dir, "small.xlsx"))).toBe(before);
    const doc = JSON.parse(one.stdout) as { series: { name: string; tables: Record<string, { columns: string[] }> }[] };
    expect(doc.series.map((s) => s.name)).toEqual(["Halden–Corvane FEU", "Corvane–Estmar FEU"]);
    expect(doc.series[0].tables.backtestCost.columns).not.toContain("Seconds");
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path.join(dir, "one.xlsx"));
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Rates", "Fairlead Outlook", "Fairlead Season", "Fairlead Checks", "Fairlead Backtest"]);
    for (const w of wb.worksheets.slice(1)) expect(w.getCell("A1").value).toBe(MANAGED_MARK);
  });

  test("a second run over its own output replaces Fairlead's sheets instead of adding more", async () => {
    expect(fairlead("run", "small.xlsx", ...quick, "--out", "again.xlsx").code).toBe(0);
    const r = fairlead("run", "again.xlsx", ...quick, "--in-place");
    expect(r.stderr).toBe("");
    expect(r.code).toBe(0);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.readFile(path.join(dir, "again.xlsx"));
    expect(wb.worksheets).toHaveLength(5);
  });

  test("a sheet of the user's under one of Fairlead's names stops the run before any work, unchanged", async () => {
    await smallBook(path.join(dir, "mine.xlsx"), 200, (ws) => {
      const own = ws.workbook.addWorksheet("Fairlead Outlook");
      own.getCell("A1").value = "My own notes";
    });
    const before = sha(path.join(dir, "mine.xlsx"));
    const r = fairlead("run", "mine.xlsx", ...quick, "--in-place");
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/already has a sheet "Fairlead Outlook" that Fairlead did not write/);
    expect(sha(path.join(dir, "mine.xlsx"))).toBe(before);
  });

  test("the summary names each lane, its method and the next weeks' forecasts", () => {
    const r = fairlead("run", "small.xlsx", ...quick, "--out", "summary.xlsx");
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/^Fairlead outlook from small\.xlsx › Rates, as of week ending \d{4}-\d{2}-\d{2}/);
    expect(r.stdout).toMatch(/Halden–Corvane FEU\s+Same week last year/);
    expect(r.stdout).toMatch(/Written to .*summary\.xlsx in \d+\.\d s\./);
    expect(r.stdout).toMatch(/not advice to book, fix or trade/);
  });

  test("the sample desk book reads as four weekly series, the gaps filled and said", () => {
    const r = fairlead("run", path.join(SAMPLES, "desk-weekly.xlsx"), "--method", "lastweek", "--backtest", "off", "--no-checks", "--no-charts", "--json", "--quiet");
    expect(r.code).toBe(0);
    const doc = JSON.parse(r.stdout) as { source: string; series: { name: string; last_week: string; warnings: string[] }[] };
    expect(doc.source).toBe("desk-weekly.xlsx › Rates › WeeklyRates");
    expect(doc.series.map((s) => s.name)).toEqual(["Tidemark Box Index", "Halden–Corvane FEU", "Corvane–Estmar FEU", "Estmar–Halden FEU"]);
    expect(doc.series.every((s) => s.last_week === "2026-11-27")).toBe(true);
    // The week absent from the book (2015-01-02) is filled in every series, and said.
    for (const s of doc.series) expect(s.warnings.join(" ")).toMatch(/2015-01-02/);
  });
});
