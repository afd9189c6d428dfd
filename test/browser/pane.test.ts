/**
 * The built side pane end to end in a real browser engine (Debian's Chromium, driven by
 * playwright-core). dist/taskpane.html is served as built; its office.js script tag is
 * answered with test/browser/excelStandIn.js, an in-memory Excel host, so no network is used.
 * The host opens the sample book sample-workbooks/desk-weekly.xlsx (read here with exceljs:
 * dates as Excel serial numbers with their date format, as Excel holds them).
 *
 * The flow a desk follows: read a lane from the WeeklyRates table, run with the pane's
 * defaults, find the four managed sheets, names, charts and saved settings; paste next week's
 * row under the table and see the pane refresh by itself, updating its charts in place; publish
 * and find the snapshot, the forecast log and the track record; type into a managed sheet and
 * see the next refresh refuse to overwrite it; cancel a run and find the book untouched. Screenshots of each stage go to test/artifacts/pane/.
 * Needs `npm run build` first (npm run test:browser does it).
 */
import * as fs from "fs";
import * as http from "http";
import type { AddressInfo } from "net";
import * as path from "path";
import ExcelJS from "exceljs";
import { chromium, type Browser, type Page } from "playwright-core";
import { CAUTION, MANAGED_MARK } from "../../src/core/present/stamp";
import { PUBLISHED_SHEET, PUBLISH_PARTS } from "../../src/core/present/published";
import { TRACK_SHEET } from "../../src/core/present/trackSheet";
import { LOG_COLUMNS, LOG_MARK, LOG_SHEET } from "../../src/core/record/log";
import { MANAGED_SHEETS } from "../../src/core/present/sheets";
import { HISTORY_WEEKS_SHOWN } from "../../src/core/present/charts";
import { outlookName } from "../../src/core/present/names";

const ROOT = path.join(__dirname, "..", "..");
const DIST = path.join(ROOT, "dist");
const STAND_IN = path.join(__dirname, "excelStandIn.js");
const ARTIFACTS = path.join(ROOT, "test", "artifacts", "pane");
const OFFICE_JS = "https://appsforoffice.microsoft.com/lib/1/hosted/office.js";
const BOOK = path.join(ROOT, "sample-workbooks", "desk-weekly.xlsx");
const TABLE = "WeeklyRates";
const LANE = "Halden–Corvane FEU";
const DATES = "Week ending";
const SHEET_NAMES = MANAGED_SHEETS.map((s) => s.name);
const DAY = 1;
const WEEK = 7 * DAY;
/** Excel's day 0 (serial numbers count days from 1899-12-30). */
const EXCEL_EPOCH_MS = Date.UTC(1899, 11, 30);

// ---- the sample book as Excel would hold it -------------------------------------------------

type CellValue = number | string | boolean;

interface SheetModel {
  name: string;
  values: CellValue[][];
  formats: string[][];
}

interface BookModel {
  name: string;
  sheets: SheetModel[];
  tables: { name: string; sheet: string; address: string }[];
}

function serialOf(d: Date): number {
  return (d.getTime() - EXCEL_EPOCH_MS) / 86_400_000;
}

function isoOf(serial: number): string {
  return new Date(EXCEL_EPOCH_MS + serial * 86_400_000).toISOString().slice(0, 10);
}

function excelValue(v: ExcelJS.CellValue): CellValue {
  if (v === null || v === undefined) return "";
  if (v instanceof Date) return serialOf(v);
  if (typeof v === "number" || typeof v === "string" || typeof v === "boolean") return v;
  if (typeof v === "object" && "result" in v) return excelValue((v as { result: ExcelJS.CellValue }).result);
  if (typeof v === "object" && "richText" in v) return (v as ExcelJS.CellRichTextValue).richText.map((t) => t.text).join("");
  throw new Error(`desk-weekly.xlsx holds a cell value this test does not read: ${JSON.stringify(v)}`);
}

async function readBook(): Promise<{ model: BookModel; table: { sheet: string; address: string; columns: string[]; rows: CellValue[][] } }> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(BOOK);
  const sheets: SheetModel[] = [];
  let table: { sheet: string; address: string } | null = null;
  wb.eachSheet((ws) => {
    const { bottom, right } = (ws.dimensions as unknown as { model: { bottom: number; right: number } }).model;
    const values: CellValue[][] = [];
    const formats: string[][] = [];
    for (let r = 1; r <= bottom; r++) {
      const vs: CellValue[] = [];
      const fmts: string[] = [];
      for (let c = 1; c <= right; c++) {
        const cell = ws.getCell(r, c);
        vs.push(excelValue(cell.value));
        fmts.push(cell.numFmt || "General");
      }
      values.push(vs);
      formats.push(fmts);
    }
    sheets.push({ name: ws.name, values, formats });
    const t = (ws as unknown as { tables?: Record<string, { table: { tableRef: string } }> }).tables?.[TABLE];
    if (t) table = { sheet: ws.name, address: t.table.tableRef };
  });
  if (!table) throw new Error(`desk-weekly.xlsx has no table ${TABLE}`);
  const found = table as { sheet: string; address: string };
  const m = /^A1:([A-Z])(\d+)$/.exec(found.address);
  if (!m) throw new Error(`the test expects ${TABLE} to start at A1, not ${found.address}`);
  const sheet = sheets.find((s) => s.name === found.sheet) as SheetModel;
  const lastRow = Number(m[2]);
  const width = m[1].charCodeAt(0) - 64;
  const columns = sheet.values[0].slice(0, width).map(String);
  const rows = sheet.values.slice(1, lastRow).map((r) => r.slice(0, width));
  return { model: { name: "desk-weekly.xlsx", sheets, tables: [{ name: TABLE, ...found }] }, table: { ...found, columns, rows } };
}

// ---- the page -------------------------------------------------------------------------------

let server: http.Server;
let browser: Browser;
let page: Page;
let book: Awaited<ReturnType<typeof readBook>>;
const pageErrors: string[] = [];
let shot = 0;

const CONTENT_TYPES: Record<string, string> = {
  ".js": "text/javascript",
  ".html": "text/html",
  ".css": "text/css",
  ".png": "image/png",
  ".json": "application/json",
  ".xml": "application/xml",
};

/** Calls a method of the stand-in's control surface (window.__host) in the page. */
function host<T>(method: string, ...args: unknown[]): Promise<T> {
  return page.evaluate(
    ([m, a]) => {
      const h = (window as unknown as { __host: Record<string, (...x: unknown[]) => unknown> }).__host;
      return h[m](...a) as T;
    },
    [method, args] as [string, unknown[]],
  );
}

/** A screenshot of the pane at `stage`, scrolled to `show` (the part the stage is about). */
async function screenshot(stage: string, show?: string, fullPage = false): Promise<void> {
  shot += 1;
  if (show) await page.locator(show).scrollIntoViewIfNeeded({ timeout: 5_000 });
  await page.screenshot({ path: path.join(ARTIFACTS, `${String(shot).padStart(2, "0")}-${stage}.png`), fullPage });
}

function text(selector: string): Promise<string> {
  return page.locator(selector).innerText();
}

/** The Data section's facts (dt/dd pairs) as an object. */
async function facts(): Promise<Record<string, string>> {
  return page.evaluate(() => {
    const out: Record<string, string> = {};
    const items = Array.from(document.querySelectorAll("#data-facts dt"));
    for (const dt of items) out[dt.textContent ?? ""] = dt.nextElementSibling?.textContent ?? "";
    return out;
  });
}

interface Source {
  sheet: string | null;
  address: string;
  values: CellValue[];
}
interface ChartView {
  id: string;
  name: string;
  sheet: string;
  type: string;
  title: string;
  categoryTitle: string;
  series: { name: string; chartType: string; values: Source | null; categories: Source | null }[];
}
interface NameView {
  name: string;
  formula: string;
  sheet: string | null;
  address: string | null;
  row: number;
  col: number;
  values: CellValue[][];
}
interface Snapshot {
  sheets: Record<string, unknown>;
  names: unknown;
  settings: unknown;
}

function numbers(xs: CellValue[]): number[] {
  return xs.filter((v): v is number => typeof v === "number" && Number.isFinite(v));
}

function colLetters(index: number): string {
  let s = "";
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

/** Rows of the outlook table on Fairlead Outlook: where its header is, and its rows. */
function outlookTable(grid: CellValue[][]): { header: number; columns: string[]; rows: CellValue[][] } {
  const header = grid.findIndex((r) => r[0] === "Step" && r[1] === "Week ending" && r[2] === "Forecast");
  if (header < 0) throw new Error("Fairlead Outlook has no outlook table (a row Step, Week ending, Forecast)");
  // The table's columns run from A to the first blank; a chart data block may sit further right.
  const blank = grid[header].indexOf("");
  const columns = grid[header].slice(0, blank < 0 ? undefined : blank).map(String);
  const rows: CellValue[][] = [];
  for (let r = header + 1; r < grid.length && typeof grid[r][0] === "number"; r++) rows.push(grid[r].slice(0, columns.length));
  return { header, columns, rows };
}

function lastWeekOf(rows: CellValue[][], datesCol: number): number {
  return rows[rows.length - 1][datesCol] as number;
}

/** The progress texts seen so far in the page (recorded by a MutationObserver). */
function progressLog(): Promise<string[]> {
  return page.evaluate(() => (window as unknown as { __progress: string[] }).__progress.slice());
}

beforeAll(async () => {
  if (!fs.existsSync(path.join(DIST, "taskpane.html")) || !fs.existsSync(path.join(DIST, "engine-worker.js"))) {
    throw new Error("dist/ is not built: run npm run build first");
  }
  // This run's screenshots only: the folder is the test's own (and gitignored).
  fs.rmSync(ARTIFACTS, { recursive: true, force: true });
  fs.mkdirSync(ARTIFACTS, { recursive: true });
  book = await readBook();
  server = http.createServer((req, res) => {
    const url = (req.url ?? "/").split("?")[0];
    const file = path.join(DIST, path.normalize(url).replace(/^[/\\]+/, ""));
    if (!file.startsWith(DIST) || !fs.existsSync(file) || !fs.statSync(file).isFile()) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { "content-type": CONTENT_TYPES[path.extname(file)] ?? "application/octet-stream" }).end(fs.readFileSync(file));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  browser = await chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--no-sandbox", "--headless", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"],
  });
  // 340 px: the width Excel gives a side pane by default.
  const context = await browser.newContext({ viewport: { width: 340, height: 900 } });
  // Nothing leaves the machine: every request that is not to the local server is refused,
  // except office.js, which the stand-in answers (routes registered later are matched first).
  await context.route(/^https?:\/\/(?!127\.0\.0\.1[:/])/, (route) => route.abort());
  const standIn = fs.readFileSync(STAND_IN, "utf8");
  await context.route(OFFICE_JS, (route) => route.fulfill({ status: 200, contentType: "text/javascript", body: standIn }));
  page = await context.newPage();
  page.on("pageerror", (e) => pageErrors.push(e.message));
  page.on("console", (m) => {
    if (m.type() === "error") pageErrors.push(m.text());
  });
  await page.goto(`${base}/taskpane.html`);
  await page.evaluate(() => {
    const log: string[] = [];
    (window as unknown as { __progress: string[] }).__progress = log;
    const el = document.getElementById("progress-text") as HTMLElement;
    new MutationObserver(() => log.push(el.textContent ?? "")).observe(el, { childList: true, characterData: true, subtree: true });
  });
  // Office.onReady resolves once the host has a workbook open, as when Excel opens the file.
  await host("open", book.model);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
});

// ---- the flow -------------------------------------------------------------------------------

const lastTableWeek = (): number => lastWeekOf(book.table.rows, book.table.columns.indexOf(DATES));
let firstOutlookChart: ChartView;
let asOfAfterRefresh = 0;

test("the pane loads in Excel: the caution is shown and Run is enabled", async () => {
  await page.waitForFunction(() => !(document.getElementById("run") as HTMLButtonElement).disabled, null, { timeout: 15_000 });
  expect(await page.locator(".caution").isVisible()).toBe(true);
  expect((await text(".caution")).trim()).toBe(CAUTION);
  expect(await page.locator("#outside-excel").isHidden()).toBe(true);
  expect(await page.locator("#read-data").isEnabled()).toBe(true);
  // The shared runtime: the worksheet functions registered in the same page.
  expect(await host<string[]>("functions")).toEqual(expect.arrayContaining(["OUTLOOK", "MEANAHEAD", "WEEKFACTORS"]));
  await screenshot("loaded");
}, 30_000);

test("the host stand-in answers as Excel does where the pane relies on it", async () => {
  const seen = await page.evaluate(async () => {
    const errorOf = (p: Promise<unknown>): Promise<string> => p.then(() => "no error", (e: { code?: string }) => String(e.code));
    const missing = await errorOf(
      Excel.run(async (c) => {
        c.workbook.worksheets.getItem("No such sheet").load("name");
        await c.sync();
      }),
    );
    return Excel.run(async (c) => {
      const rates = c.workbook.worksheets.getItem("Rates");
      const none = c.workbook.tables.getItemOrNullObject("NoSuchTable");
      const table = c.workbook.tables.getItem("WeeklyRates").getRange();
      const used = rates.getUsedRangeOrNullObject(true);
      const cell = rates.getRangeByIndexes(1, 0, 1, 1);
      table.load("address");
      used.load("address");
      cell.load("values, numberFormat");
      await c.sync();
      return {
        missing,
        none: none.isNullObject,
        table: table.address,
        used: used.address,
        cell: [cell.values[0][0], cell.numberFormat[0][0]],
        sets: [Office.context.requirements.isSetSupported("ExcelApi", "1.12"), Office.context.requirements.isSetSupported("ExcelApi", "1.15")],
      };
    });
  });
  const dc = book.table.columns.indexOf(DATES);
  expect(seen).toEqual({
    missing: "ItemNotFound",
    none: true,
    table: `${book.table.sheet}!${book.table.address}`,
    used: `${book.table.sheet}!${book.table.address}`,
    cell: [book.table.rows[0][dc], "yyyy-mm-dd"],
    sets: [true, false],
  });
  expect(isoOf(book.table.rows[0][dc] as number)).toBe("2013-01-04");
});

test("Data: the table and its columns are offered, and reading the lane shows its weeks", async () => {
  await page.check('input[name="source-kind"][value="table"]');
  await page.waitForFunction(() => (document.getElementById("table-name") as HTMLSelectElement).options.length > 0, null, { timeout: 10_000 });
  expect(await page.locator("#table-name").inputValue()).toBe(TABLE);
  const rows = book.table.rows.length;
  expect(await page.locator("#table-name option:checked").innerText()).toBe(`${TABLE} (${book.table.sheet}, ${rows} rows)`);
  expect(await page.locator("#table-dates").inputValue()).toBe(DATES);
  const rateChoices = await page.locator("#table-rates option").allInnerTexts();
  // Every column but the dates holds rates.
  expect(rateChoices).toEqual(book.table.columns.filter((c) => c !== DATES));
  expect(await page.locator("#table-rates").inputValue()).toBe(rateChoices[0]);

  // The event column is offered from the same columns, none by default; the rates column is refused in words.
  expect(await page.locator("#table-events option").allInnerTexts()).toEqual(["None", ...book.table.columns]);
  expect(await page.locator("#table-events").inputValue()).toBe("");
  await page.selectOption("#table-rates", LANE);
  await page.selectOption("#table-events", LANE);
  await page.click("#read-data");
  await page.waitForFunction(() => !(document.getElementById("data-error") as HTMLElement).hidden, null, { timeout: 15_000 });
  expect(await text("#data-error")).toBe(`“${LANE}” is already the rates column; choose another column for the event weeks, or none.`);
  await page.selectOption("#table-events", "");
  await page.click("#read-data");
  await page.waitForFunction(() => /^Read \d+ weeks/.test(document.getElementById("data-status")?.textContent ?? ""), null, { timeout: 15_000 });
  expect(await page.locator("#data-error").isHidden()).toBe(true);

  // The weeks read are the table's rows plus the week absent from the book (filled), and the
  // weeks filled are that week plus the lane's blank cells.
  const dc = book.table.columns.indexOf(DATES);
  const lc = book.table.columns.indexOf(LANE);
  const first = book.table.rows[0][dc] as number;
  const last = lastTableWeek();
  const weeks = (last - first) / WEEK + 1;
  const blanks = book.table.rows.filter((r) => r[lc] === "").length;
  expect(weeks).toBe(rows + 1); // desk-weekly.xlsx lacks 2015-01-02 (sample-workbooks/README.md)
  const f = await facts();
  expect(f["Series"]).toBe(LANE);
  expect(f["Weeks read"]).toBe(String(weeks));
  expect(f["Weeks filled"]).toBe(String(weeks - rows + blanks));
  expect(f["First week ending"]).toBe(isoOf(first));
  expect(f["Last week ending"]).toBe(isoOf(last));
  // The header stays on top of the rates (the intake takes it as the series' name).
  expect(f["Rates from"]).toBe(`${book.table.sheet}!${colLetters(lc)}1:${colLetters(lc)}${rows + 1}`);
  expect(f["Dates from"]).toBe(`${book.table.sheet}!${colLetters(dc)}1:${colLetters(dc)}${rows + 1}`);
  expect(await text("#data-status")).toBe(`Read ${weeks} weeks of ${LANE}.`);
  await screenshot("data-read", "#data-result");
}, 30_000);

test("Run: progress advances to Done and the four managed sheets are written", async () => {
  await page.evaluate(() => ((window as unknown as { __progress: string[] }).__progress.length = 0));
  await page.click("#run");
  await page.locator("#progress-box").waitFor({ state: "visible", timeout: 5_000 });
  await page.locator("#cancel").waitFor({ state: "visible", timeout: 5_000 });
  expect(await page.locator("#run").isDisabled()).toBe(true);
  await page.waitForFunction(() => /Backtesting/.test(document.getElementById("progress-text")?.textContent ?? ""), null, { timeout: 30_000 });
  await screenshot("running", "#progress-box");
  await page.waitForFunction(() => /^Done at /.test(document.getElementById("run-done")?.textContent ?? ""), null, { timeout: 150_000 });
  // The outcome is shown before the pane renews its watch; the buttons come back after that.
  await page.waitForFunction(() => !(document.getElementById("run") as HTMLButtonElement).disabled, null, { timeout: 10_000 });
  expect(await page.locator("#run-error").isHidden()).toBe(true);
  expect(await text("#progress-text")).toBe("100% · Done");
  expect(await page.locator("#cancel").isHidden()).toBe(true);
  expect(await page.locator("#run").isEnabled()).toBe(true);
  expect(await page.locator("#progress").evaluate((p) => (p as HTMLProgressElement).value)).toBe(1);

  // The text advanced through the stages, its percentage never going back.
  const log = await progressLog();
  const percents = log.map((t) => /^(\d+)%/.exec(t)).filter((m): m is RegExpExecArray => m !== null).map((m) => Number(m[1]));
  expect(new Set(log).size).toBeGreaterThanOrEqual(5);
  expect(percents.every((p, i) => i === 0 || p >= percents[i - 1])).toBe(true);
  expect(percents[0]).toBeLessThan(10);
  expect(log.some((t) => /Writing Fairlead's sheets/.test(t))).toBe(true);
  expect(log[log.length - 1]).toBe("100% · Done");

  const names = await host<string[]>("sheetNames");
  expect(names).toEqual([...book.model.sheets.map((s) => s.name), ...SHEET_NAMES]);
  for (const s of SHEET_NAMES) {
    const a1 = await host<{ values: CellValue[][] }>("read", s, "A1");
    expect(a1.values[0][0]).toBe(MANAGED_MARK);
  }
  firstOutlookChart = (await host<ChartView[]>("charts", "Fairlead Outlook"))[0];
  // A first run shows its first sheet.
  expect(await host<string>("activeSheet")).toBe("Fairlead Outlook");
  expect(await text("#run-done")).toContain(`as of week ending ${isoOf(lastTableWeek())}`);
  await screenshot("done", undefined, true);
}, 180_000);

test("the outlook table: 12 weeks after the last, ordered bounds, dates as dates", async () => {
  const grid = await host<CellValue[][]>("grid", "Fairlead Outlook");
  const t = outlookTable(grid);
  expect(t.columns).toEqual(["Step", "Week ending", "Forecast", "Low 80%", "High 80%", "Low 95%", "High 95%"]);
  expect(t.rows).toHaveLength(12);
  const last = lastTableWeek();
  // A single model's point lies inside its own intervals; the combination's point is the mean
  // of the models' points and is not forced inside the pooled interval (its note says so).
  const title = String(grid[t.header - 1][0]);
  expect(title).toMatch(/^Outlook: /);
  const combined = title === "Outlook: Combination of methods";
  t.rows.forEach((r, i) => {
    expect(r[0]).toBe(i + 1);
    expect(r[1]).toBe(last + (i + 1) * WEEK);
    const [point, lo80, hi80, lo95, hi95] = r.slice(2) as number[];
    for (const v of [point, lo80, hi80, lo95, hi95]) expect(Number.isFinite(v)).toBe(true);
    expect(lo95).toBeLessThanOrEqual(lo80);
    expect(lo80).toBeLessThanOrEqual(hi80);
    expect(hi80).toBeLessThanOrEqual(hi95);
    if (!combined) {
      expect(lo80).toBeLessThanOrEqual(point);
      expect(point).toBeLessThanOrEqual(hi80);
    }
    // A USD-per-FEU rate stays positive at the 95% low bound.
    expect(lo95).toBeGreaterThan(0);
  });
  // The first week's band is the narrowest: uncertainty grows with the horizon.
  const width = (r: CellValue[]): number => (r[6] as number) - (r[5] as number);
  expect(width(t.rows[0])).toBeLessThan(width(t.rows[11]));
  // Dates are written as date serials with a date format, not as text.
  const cell = await host<{ formats: string[][] }>("read", "Fairlead Outlook", `B${t.header + 2}`);
  expect(cell.formats[0][0]).toBe("yyyy-mm-dd");
  const asOf = await host<{ values: CellValue[][]; formats: string[][] }>("read", "Fairlead Outlook", "A2:B2");
  expect(asOf.values[0]).toEqual(["As of week ending", last]);
  expect(asOf.formats[0][1]).toBe("yyyy-mm-dd");
});

test("workbook names point at the outlook's columns and its as-of cell", async () => {
  const grid = await host<CellValue[][]>("grid", "Fairlead Outlook");
  const t = outlookTable(grid);
  const expected: [string, string][] = [
    [outlookName(LANE, "WEEK"), "Week ending"],
    [outlookName(LANE, "POINT"), "Forecast"],
    [outlookName(LANE, { low: 80 }), "Low 80%"],
    [outlookName(LANE, { high: 80 }), "High 80%"],
    [outlookName(LANE, { low: 95 }), "Low 95%"],
    [outlookName(LANE, { high: 95 }), "High 95%"],
  ];
  expect(outlookName(LANE, "POINT")).toBe("FL_HALDEN_CORVANE_FEU_POINT");
  for (const [name, column] of expected) {
    const n = await host<NameView>("nameRange", name);
    expect(n).not.toBeNull();
    expect(n.sheet).toBe("Fairlead Outlook");
    const c = t.columns.indexOf(column);
    const letter = colLetters(c);
    expect(n.address).toBe(`${letter}${t.header + 2}:${letter}${t.header + 13}`);
    expect(n.formula).toBe(`='Fairlead Outlook'!$${letter}$${t.header + 2}:$${letter}$${t.header + 13}`);
    expect(n.values.map((r) => r[0])).toEqual(t.rows.map((r) => r[c]));
  }
  const asof = await host<NameView>("nameRange", outlookName(LANE, "ASOF"));
  expect(asof.values).toEqual([[lastTableWeek()]]);
  expect(grid[asof.row][0]).toBe("Last week of data");
  expect((await host<{ name: string }[]>("names")).map((n) => n.name).sort()).toEqual([...expected.map((e) => e[0]), outlookName(LANE, "ASOF")].sort());
});

test("three native charts, each plotting numbers from cells of its own sheet", async () => {
  const charts = await host<ChartView[]>("charts");
  expect(charts.map((c) => [c.sheet, c.type])).toEqual([
    ["Fairlead Outlook", "Line"],
    ["Fairlead Season", "Radar"],
    ["Fairlead Backtest", "ColumnClustered"],
  ]);
  for (const c of charts) {
    expect(c.name.startsWith("Fairlead ")).toBe(true);
    expect(c.series.length).toBeGreaterThan(0);
    for (const s of c.series) {
      expect(s.values?.sheet).toBe(c.sheet);
      expect(s.categories?.sheet).toBe(c.sheet);
      expect(s.values?.values.length).toBe(s.categories?.values.length);
    }
  }

  // Outlook: three years of history and the 12 forecast weeks; bands and lines.
  const [outlook, season, backtest] = charts;
  const rows = HISTORY_WEEKS_SHOWN + 12;
  const cats = outlook.series[0].categories as Source;
  expect(cats.values).toHaveLength(rows);
  const weeks = numbers(cats.values);
  expect(weeks).toHaveLength(rows);
  weeks.forEach((w, i) => i > 0 && expect(w - weeks[i - 1]).toBe(WEEK));
  expect(weeks[HISTORY_WEEKS_SHOWN - 1]).toBe(lastTableWeek());
  expect(weeks[rows - 1]).toBe(lastTableWeek() + 12 * WEEK);
  const byName = new Map(outlook.series.map((s) => [s.name, s]));
  const history = byName.get(LANE);
  expect(history?.chartType).toBe("Line");
  const lc = book.table.columns.indexOf(LANE);
  const lastRates = book.table.rows.slice(-HISTORY_WEEKS_SHOWN).map((r) => r[lc]);
  expect(numbers(history?.values?.values ?? [])).toEqual(lastRates);
  const forecast = outlook.series.find((s) => s.name.startsWith("Forecast ("));
  expect(forecast?.chartType).toBe("Line");
  // The forecast line starts at the last rate and runs the 12 weeks.
  expect(numbers(forecast?.values?.values ?? [])).toHaveLength(13);
  expect(numbers(forecast?.values?.values ?? [])[0]).toBe(lastRates[lastRates.length - 1]);
  const bands = outlook.series.filter((s) => s.chartType === "AreaStacked");
  expect(bands).toHaveLength(4); // base, 95→80 low, 80 low→high, 80→95 high
  for (const b of bands) expect(numbers(b.values?.values ?? [])).toHaveLength(13);
  // The stacked layers add up to the 95% high bound of the outlook table.
  const grid = await host<CellValue[][]>("grid", "Fairlead Outlook");
  const t = outlookTable(grid);
  const stacked = (i: number): number => bands.reduce((sum, b) => sum + (b.values?.values[HISTORY_WEEKS_SHOWN + i] as number), 0);
  t.rows.forEach((r, i) => expect(Math.abs(stacked(i) - (r[6] as number))).toBeLessThan(1e-9 * (r[6] as number)));
  expect(outlook.categoryTitle).toBe(`Fairlead, as of week ending ${isoOf(lastTableWeek())}`);

  // Season: the 52 ISO weeks around the circle, one series per recent year.
  const weekLabels = season.series[0].categories?.values ?? [];
  expect(weekLabels).toEqual(Array.from({ length: 52 }, (_, i) => `W${String(i + 1).padStart(2, "0")}`));
  expect(season.series.length).toBeGreaterThanOrEqual(2);
  for (const s of season.series.slice(0, -1)) expect(numbers(s.values?.values ?? [])).toHaveLength(52);
  expect(numbers(season.series[season.series.length - 1].values?.values ?? []).length).toBeGreaterThan(26);

  // Backtest: MASE by weeks ahead (4 by default), one positive number per method and week.
  expect(backtest.series[0].categories?.values).toEqual(["1 wk", "2 wk", "3 wk", "4 wk"]);
  expect(backtest.series.length).toBeGreaterThanOrEqual(3);
  for (const s of backtest.series) {
    const m = numbers(s.values?.values ?? []);
    expect(m).toHaveLength(4);
    for (const v of m) expect(v).toBeGreaterThan(0);
  }
});

test("the settings keep the analysed series and one ledger per managed sheet", async () => {
  const settings = await host<Record<string, unknown>>("settings");
  const stored = settings["fairlead.series"] as { version: number; watch: boolean; series: { source: unknown; name: string; options: { method: string; horizon: number } }[] };
  expect(stored.version).toBe(1);
  expect(stored.watch).toBe(true);
  expect(stored.series).toHaveLength(1);
  expect(stored.series[0].source).toEqual({ kind: "table", table: TABLE, rates: LANE, dates: DATES });
  expect(stored.series[0].name).toBe(LANE);
  expect(stored.series[0].options.method).toBe("auto");
  expect(stored.series[0].options.horizon).toBe(12);
  const ledgers = settings["fairlead.ledgers"] as Record<string, { sheet: string; rows: number; cols: number; charts: string[]; names: string[] }>;
  expect(Object.keys(ledgers).sort()).toEqual([...SHEET_NAMES].sort());
  const charts = await host<ChartView[]>("charts");
  for (const name of SHEET_NAMES) {
    const l = ledgers[name];
    const used = await host<{ rowIndex: number; columnIndex: number; rowCount: number; columnCount: number }>("usedRange", name);
    expect(l.sheet).toBe(name);
    // The ledger covers every cell the pane wrote: the used range from A1.
    expect(used.rowIndex).toBe(0);
    expect(used.columnIndex).toBe(0);
    expect(l.rows).toBe(used.rowCount);
    expect(l.cols).toBe(used.columnCount);
    expect(l.charts).toEqual(charts.filter((c) => c.sheet === name).map((c) => c.name));
  }
  expect(ledgers["Fairlead Outlook"].names).toHaveLength(7);
  // The pane watches the one table it analyses.
  expect((await host<{ tables: number }>("handlers")).tables).toBe(1);
  expect(await text("#watch-status")).toBe("Watching 1 series for new weeks.");
});

/** Next week's row of the table: one week after its last, each rate 1% above last week's. */
function nextRow(after: number, like: CellValue[]): CellValue[] {
  const dc = book.table.columns.indexOf(DATES);
  return like.map((v, c) => (c === dc ? isoOf(after + WEEK) : typeof v === "number" ? Math.round(v * 1.01 * 10) / 10 : v));
}

test("a week pasted under the table refreshes the pane by itself, charts updated in place", async () => {
  const last = lastTableWeek();
  const row = nextRow(last, book.table.rows[book.table.rows.length - 1]);
  // The desk is back on its rates sheet; a refresh must leave it there.
  await host("select", book.table.sheet, `A${book.table.rows.length + 2}`);
  await host("resetCalls");
  const typed = await host<{ tableGrew: string | null }>("appendTableRow", TABLE, row);
  expect(typed.tableGrew).toBe(TABLE);
  const tables = await host<{ rows: number }[]>("tables");
  expect(tables[0].rows).toBe(book.table.rows.length + 1);

  await page.waitForFunction(() => /^Refreshed at /.test(document.getElementById("run-done")?.textContent ?? ""), null, { timeout: 150_000 });
  await page.waitForFunction(() => !(document.getElementById("run") as HTMLButtonElement).disabled, null, { timeout: 10_000 });
  expect(await page.locator("#run-error").isHidden()).toBe(true);
  expect(await text("#progress-text")).toBe("100% · Refreshed");
  const asOf = await host<{ values: CellValue[][] }>("read", "Fairlead Outlook", "B2");
  asOfAfterRefresh = asOf.values[0][0] as number;
  expect(asOfAfterRefresh).toBe(last + WEEK);
  expect(await text("#run-done")).toContain(`as of week ending ${isoOf(last + WEEK)}`);
  expect(await host<string>("activeSheet")).toBe(book.table.sheet);

  const grid = await host<CellValue[][]>("grid", "Fairlead Outlook");
  const t = outlookTable(grid);
  expect(t.rows[0][1]).toBe(last + 2 * WEEK);
  expect(t.rows[11][1]).toBe(last + 13 * WEEK);

  // The same chart object, its series pointed at the new rows: nothing was created.
  const outlook = (await host<ChartView[]>("charts", "Fairlead Outlook"))[0];
  expect(outlook.id).toBe(firstOutlookChart.id);
  expect(outlook.series.map((s) => s.name)).toEqual(firstOutlookChart.series.map((s) => s.name));
  const cats = numbers(outlook.series[0].categories?.values ?? []);
  expect(cats).toHaveLength(HISTORY_WEEKS_SHOWN + 12);
  expect(cats[cats.length - 1]).toBe(t.rows[11][1]);
  expect(cats[HISTORY_WEEKS_SHOWN - 1]).toBe(last + WEEK);
  const history = outlook.series.find((s) => s.name === LANE);
  const lc = book.table.columns.indexOf(LANE);
  expect(numbers(history?.values?.values ?? []).slice(-1)[0]).toBe(row[lc]);
  const calls = await host<Record<string, number>>("calls");
  expect(calls["charts.add"]).toBeUndefined();
  expect(calls["worksheets.add"]).toBeUndefined();
  expect(calls["event.TableChanged"]).toBeGreaterThanOrEqual(1);
  // The watch was renewed, not doubled.
  expect((await host<{ tables: number }>("handlers")).tables).toBe(1);
  expect(await host<string[]>("handlerErrors")).toEqual([]);
  await screenshot("refreshed", "#run-result");
}, 180_000);

test("Publish writes the snapshot, starts the forecast log with the outlook and scores it in the track record", async () => {
  const asOf = isoOf(asOfAfterRefresh);
  expect(await page.locator("#publish").isEnabled()).toBe(true);
  expect(await text("#publish-status")).toBe(`Publishes ${LANE} as of week ending ${asOf}.`);
  const parts = await page.locator("#publish-parts label").allInnerTexts();
  expect(parts.map((t) => t.trim())).toEqual(PUBLISH_PARTS.map((p) => p.label));
  expect(await page.locator("#publish-parts input:checked").count()).toBe(PUBLISH_PARTS.length);
  const before = await host<Snapshot>("snapshot");

  await page.click("#publish");
  await page.locator("#publish-result").waitFor({ state: "visible", timeout: 30_000 });
  expect(await page.locator("#publish-error").isHidden()).toBe(true);
  expect(await text("#publish-status")).toMatch(new RegExp(`^Published at .+: ${LANE}, as of week ending ${asOf}\\.$`));
  const sentences = await page.locator("#publish-result li").allInnerTexts();
  expect(sentences[0]).toBe("Started Fairlead Log with 12 forecasts, rows 5–16.");
  expect(sentences).toContain(`${TRACK_SHEET}: 0 forecasts scored, 12 awaiting their weeks.`);

  const names = await host<string[]>("sheetNames");
  expect(names).toEqual(expect.arrayContaining([PUBLISHED_SHEET, TRACK_SHEET, LOG_SHEET]));
  expect((await host<{ values: CellValue[][] }>("read", PUBLISHED_SHEET, "A1")).values[0][0]).toBe(MANAGED_MARK);
  expect((await host<{ values: CellValue[][] }>("read", TRACK_SHEET, "A1")).values[0][0]).toBe(MANAGED_MARK);
  expect(await host<string>("activeSheet")).toBe(PUBLISHED_SHEET);
  expect((await host<ChartView[]>("charts", PUBLISHED_SHEET)).length).toBeGreaterThanOrEqual(1);

  // The log: its head, its header, then one row per week ahead, weeks as dates.
  const log = await host<CellValue[][]>("grid", LOG_SHEET);
  expect(log[0][0]).toBe(LOG_MARK);
  expect(log[3].slice(0, LOG_COLUMNS.length)).toEqual([...LOG_COLUMNS]);
  expect(log).toHaveLength(4 + 12);
  const origin = LOG_COLUMNS.indexOf("Origin week");
  const target = LOG_COLUMNS.indexOf("Target week");
  for (let i = 0; i < 12; i++) {
    expect(log[4 + i][origin]).toBe(asOfAfterRefresh);
    expect(log[4 + i][target]).toBe(asOfAfterRefresh + (i + 1) * WEEK);
  }
  const cell = await host<{ formats: string[][] }>("read", LOG_SHEET, `${colLetters(target)}5`);
  expect(cell.formats[0][0]).toBe("yyyy-mm-dd");

  // The four managed sheets were left as the refresh wrote them.
  const after = await host<Snapshot>("snapshot");
  for (const s of SHEET_NAMES) expect(after.sheets[s]).toEqual(before.sheets[s]);
  const ledgers = (await host<Record<string, Record<string, unknown>>>("settings"))["fairlead.ledgers"];
  expect(Object.keys(ledgers).sort()).toEqual([...SHEET_NAMES, PUBLISHED_SHEET, TRACK_SHEET].sort());
  await screenshot("published", "#publish-section");
}, 60_000);

let typedCell = "";
let typedWas: CellValue = "";

test("typing into a managed sheet stops the next refresh, which names the cell and keeps it", async () => {
  const point = await host<NameView>("nameRange", outlookName(LANE, "POINT"));
  typedCell = `${colLetters(point.col)}${point.row + 3}`; // the third forecast week
  typedWas = point.values[2][0];
  await host("edit", "Fairlead Outlook", typedCell, [["1234"]]);
  const typed = await host<{ values: CellValue[][] }>("read", "Fairlead Outlook", typedCell);
  expect(typed.values[0][0]).toBe(1234); // Excel reads the entry as a number
  const before = await host<Snapshot>("snapshot");

  const last = asOfAfterRefresh;
  const like = [...book.table.rows[book.table.rows.length - 1]];
  await host("appendTableRow", TABLE, nextRow(last, like));
  await page.waitForFunction(() => !(document.getElementById("run-error") as HTMLElement).hidden, null, { timeout: 150_000 });
  const message = await text("#run-error");
  expect(message).toContain(`Fairlead Outlook has been typed into at ${typedCell} (now “1234”)`);
  expect(message).toContain("Fairlead wrote nothing");
  expect(await text("#progress-text")).toBe("Stopped");
  expect(await page.locator("#adopt").isHidden()).toBe(true);
  expect((await host<{ values: CellValue[][] }>("read", "Fairlead Outlook", typedCell)).values[0][0]).toBe(1234);
  // Nothing of Fairlead's changed either: the sheets, charts, names and settings are as they were.
  const after = await host<Snapshot>("snapshot");
  for (const s of SHEET_NAMES) expect(after.sheets[s]).toEqual(before.sheets[s]);
  expect(after.names).toEqual(before.names);
  expect(after.settings).toEqual(before.settings);
  expect((await host<{ values: CellValue[][] }>("read", "Fairlead Outlook", "B2")).values[0][0]).toBe(last);
  await screenshot("typed-into", "#run-error");
}, 180_000);

test("Cancel stops a run before anything is written", async () => {
  // The desk undoes its typing; with another horizon the run has fresh work to do.
  await host("edit", "Fairlead Outlook", typedCell, [[typedWas]]);
  await page.locator("#outlook-section > summary").click();
  await page.fill("#horizon", "8");
  await page.locator("#horizon").dispatchEvent("change");
  const before = await host<Snapshot>("snapshot");
  await page.click("#run");
  await page.waitForFunction(() => /Backtesting|Analysing/.test(document.getElementById("progress-text")?.textContent ?? ""), null, { timeout: 30_000 });
  await page.click("#cancel");
  // Far sooner than the run would take (it is a whole analysis of the lane).
  await page.waitForFunction(() => !(document.getElementById("run-error") as HTMLElement).hidden, null, { timeout: 10_000 });
  expect(await text("#run-error")).toBe("Cancelled: nothing was written.");
  expect(await text("#progress-text")).toBe("Stopped");
  expect(await page.locator("#run").isEnabled()).toBe(true);
  expect(await page.locator("#cancel").isHidden()).toBe(true);
  // A moment for any write still under way to land, then the whole book is compared.
  await page.waitForTimeout(1_000);
  const after = await host<Snapshot>("snapshot");
  expect(after).toEqual(before);
  await screenshot("cancelled", "#run-error");
  expect(pageErrors).toEqual([]);
}, 60_000);
