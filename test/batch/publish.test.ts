/**
 * `fairlead publish` on the sample desk book, run in this process through main() with the
 * inline engine (no worker threads, a fixed clock), the way a desk would use it week after
 * week: the published snapshot is plain values, the log only ever grows below its last row,
 * rows changed by hand are kept and reported, a user's sheet is never overwritten, and the
 * track record is the log scored against the rates pasted since.
 */
import * as crypto from "crypto";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import { main } from "../../src/batch/cli";
import { sheetGrid } from "../../src/batch/publish";
import { PUBLISHED_SHEET } from "../../src/core/present/published";
import { MANAGED_MARK } from "../../src/core/present/stamp";
import { TRACK_SHEET } from "../../src/core/present/trackSheet";
import { LOG_COLUMNS, LOG_MARK, LOG_SHEET } from "../../src/core/record/log";
import { InlineTransport } from "../../src/engine";

const DESK = path.join(__dirname, "..", "..", "sample-workbooks", "desk-weekly.xlsx");
const SERIES = ["Tidemark Box Index", "Halden–Corvane FEU", "Corvane–Estmar FEU", "Estmar–Halden FEU"];
const HORIZON = 4;
/** Fast settings: a naive method, no backtest, no checks. */
const QUICK = ["--method", "lastweek", "--backtest", "off", "--no-checks", "--horizon", String(HORIZON), "--quiet"];
const FIRST_AT = new Date("2026-12-01T09:00:00Z");
const SECOND_AT = new Date("2026-12-15T09:00:00Z");
/** The book's last week is 2026-11-27; the two weeks pasted after it, with invented rates per series. */
const PASTED: { week: string; rates: number[] }[] = [
  { week: "2026-12-04", rates: [1987.3, 2361, 1402, 2095] },
  { week: "2026-12-11", rates: [2015.8, 2249, 1471, 1990] },
];

let dir: string;

interface Ran {
  code: number;
  stdout: string;
  stderr: string;
}

/** main() as the command line calls it; book names are taken in the temporary folder, as if run there. */
async function fairlead(now: Date, ...args: string[]): Promise<Ran> {
  let stdout = "";
  let stderr = "";
  const argv = args.map((a) => (/\.xlsx$/i.test(a) && !path.isAbsolute(a) ? path.join(dir, a) : a));
  const code = await main(argv, { transport: new InlineTransport(), now, stdout: (t) => (stdout += t), stderr: (t) => (stderr += t) });
  return { code, stdout, stderr };
}

async function ok(now: Date, ...args: string[]): Promise<string> {
  const r = await fairlead(now, ...args);
  if (r.code !== 0) throw new Error(`fairlead ${args.join(" ")} exited ${r.code}: ${r.stderr}`);
  expect(r.stderr).toBe("");
  return r.stdout;
}

async function book(file: string): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(path.join(dir, file));
  return wb;
}

function sheet(wb: ExcelJS.Workbook, name: string): ExcelJS.Worksheet {
  const ws = wb.getWorksheet(name);
  if (!ws) throw new Error(`no sheet ${name}; the book has ${wb.worksheets.map((w) => w.name).join(", ")}`);
  return ws;
}

/** Every row of a sheet as its cells' values and number formats, for before/after comparisons. */
function snapshot(ws: ExcelJS.Worksheet): string[] {
  const rows: string[] = [];
  for (let r = 1; r <= ws.rowCount; r++) {
    const cells: unknown[] = [];
    ws.findRow(r)?.eachCell({ includeEmpty: false }, (cell, c) => cells.push([c, cell.value, cell.numFmt ?? null]));
    rows.push(JSON.stringify(cells));
  }
  while (rows.length > 0 && rows[rows.length - 1] === "[]") rows.pop();
  return rows;
}

/** The log's entry rows (under its header), as rows of cell values in LOG_COLUMNS order. */
function logRows(wb: ExcelJS.Workbook): ExcelJS.CellValue[][] {
  const ws = sheet(wb, LOG_SHEET);
  expect(ws.getCell("A1").value).toBe(LOG_MARK);
  let header = -1;
  const out: ExcelJS.CellValue[][] = [];
  for (let r = 1; r <= ws.rowCount; r++) {
    const row = LOG_COLUMNS.map((_, j) => ws.getCell(r, j + 1).value);
    if (header < 0) {
      if (row[0] === LOG_COLUMNS[0] && row[2] === "Origin week") header = r;
      continue;
    }
    if (row.some((v) => v !== null && v !== undefined)) out.push(row);
  }
  expect(header).toBe(4);
  return out;
}

const col = (name: (typeof LOG_COLUMNS)[number]): number => LOG_COLUMNS.indexOf(name);
const iso = (v: ExcelJS.CellValue): string => (v instanceof Date ? v.toISOString().slice(0, 10) : String(v));

/** A table on a Fairlead sheet, found by its title under the series' heading: header and rows as exceljs reads them. */
function tableAt(ws: ExcelJS.Worksheet, seriesName: string, title: string): { columns: string[]; rows: ExcelJS.CellValue[][] } {
  const a = (r: number): ExcelJS.CellValue => ws.getCell(r, 1).value;
  let r = 1;
  while (r <= ws.rowCount && a(r) !== seriesName) r++;
  while (r <= ws.rowCount && a(r) !== title) r++;
  expect(a(r)).toBe(title);
  const header = ws.getRow(r + 1).values as ExcelJS.CellValue[];
  const columns = header.slice(1).map(String);
  const rows: ExcelJS.CellValue[][] = [];
  for (let k = r + 2; k <= ws.rowCount; k++) {
    const row = columns.map((_, j) => ws.getCell(k, j + 1).value);
    if (row[0] === null || (typeof row[0] === "string" && row.slice(1).every((v) => v === null))) break;
    rows.push(row);
  }
  return { columns, rows };
}

/** Appends the pasted weeks to the Rates table of a book, as a desk pastes next week's figures. */
async function pasteWeeks(file: string): Promise<void> {
  const wb = await book(file);
  const ws = sheet(wb, "Rates");
  const last = ws.rowCount;
  PASTED.forEach((p, k) => {
    const row = ws.getRow(last + 1 + k);
    row.values = [new Date(`${p.week}T00:00:00Z`), ...p.rates];
    row.getCell(1).numFmt = "yyyy-mm-dd";
  });
  // exceljs cannot add rows to a table it has read; its range is widened by hand.
  const t = ws.getTable("WeeklyRates") as unknown as { table: { tableRef: string; autoFilterRef?: string } };
  t.table.tableRef = `A1:E${last + PASTED.length}`;
  t.table.autoFilterRef = t.table.tableRef;
  await wb.xlsx.writeFile(path.join(dir, file));
}

function sha(file: string): string {
  return crypto.createHash("sha256").update(fs.readFileSync(path.join(dir, file))).digest("hex");
}

interface PublishDoc {
  series: { name: string; tables: Record<string, { title: string; columns: string[]; rows: (number | string | null)[][] }> }[];
  publish: {
    parts: string[];
    empty_parts: { part: string }[];
    log: { added: number; repeated: number; rows: number };
    track: { series: string; scored: number; awaiting: number; summary: { columns: string[]; rows: (number | string | null)[][] } }[];
  };
}

let firstDoc: PublishDoc;

beforeAll(async () => {
  dir = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-publish-"));
  fs.copyFileSync(DESK, path.join(dir, "desk.xlsx"));
  // The first publish, with charts, shared by the tests below: a copy of the desk book at first.xlsx.
  firstDoc = JSON.parse(await ok(FIRST_AT, "publish", "desk.xlsx", ...QUICK, "--out", "first.xlsx", "--json")) as PublishDoc;
});

afterAll(() => {
  fs.rmSync(dir, { recursive: true, force: true });
});

describe("a first publish", () => {
  test("writes the managed sheets, then Published, Log and Track Record, in that order", async () => {
    const wb = await book("first.xlsx");
    expect(wb.worksheets.map((w) => w.name)).toEqual([
      "Rates",
      "About",
      "Fairlead Outlook",
      "Fairlead Season",
      "Fairlead Checks",
      "Fairlead Backtest",
      PUBLISHED_SHEET,
      LOG_SHEET,
      TRACK_SHEET,
    ]);
    expect(sheet(wb, PUBLISHED_SHEET).getCell("A1").value).toBe(MANAGED_MARK);
    expect(sheet(wb, TRACK_SHEET).getCell("A1").value).toBe(MANAGED_MARK);
    expect(firstDoc.publish.parts).toEqual(["outlook", "season", "checks", "backtest"]);
    // Checks and backtest were off: the parts that need them are said to be empty.
    expect(firstDoc.publish.empty_parts.map((e) => e.part)).toEqual(["season", "checks", "backtest"]);
  });

  test("every cell of Published is a plain value, and its outlook points are the report's", async () => {
    const ws = sheet(await book("first.xlsx"), PUBLISHED_SHEET);
    let cells = 0;
    ws.eachRow((row) =>
      row.eachCell((cell) => {
        cells++;
        const v = cell.value;
        expect(cell.type).not.toBe(ExcelJS.ValueType.Formula);
        if (typeof v === "object" && v !== null && !(v instanceof Date)) throw new Error(`${cell.address} holds ${JSON.stringify(v)}, not a plain value`);
        if (typeof v === "string") {
          expect(v.startsWith("=")).toBe(false);
          expect(v).not.toContain("FAIRLEAD.");
        }
      }),
    );
    expect(cells).toBeGreaterThan(100);
    for (const s of firstDoc.series) {
      const t = s.tables.outlook;
      const onSheet = tableAt(ws, s.name, t.title);
      expect(onSheet.columns).toEqual(t.columns);
      expect(onSheet.rows).toHaveLength(HORIZON);
      // Written as doubles and read back: the same numbers, bit for bit; weeks as real dates.
      t.rows.forEach((r, i) => r.forEach((c, j) => expect(j === 1 ? iso(onSheet.rows[i][j]) : onSheet.rows[i][j]).toBe(c)));
    }
  });

  test("Published carries its outlook charts as images, the same pictures as the Outlook sheet's", async () => {
    const wb = await book("first.xlsx");
    const pictures = (name: string): string[] =>
      sheet(wb, name)
        .getImages()
        .map((im) => crypto.createHash("sha256").update((wb.model.media[Number(im.imageId)] as unknown as { buffer: Buffer }).buffer).digest("hex"));
    const outlook = pictures("Fairlead Outlook");
    expect(outlook).toHaveLength(SERIES.length);
    expect(pictures(PUBLISHED_SHEET)).toEqual(outlook);
    expect(pictures(TRACK_SHEET)).toHaveLength(SERIES.length);
  });

  test("starts the log with one row per series and week ahead, matching the outlook", async () => {
    const rows = logRows(await book("first.xlsx"));
    expect(rows).toHaveLength(SERIES.length * HORIZON);
    expect(firstDoc.publish.log).toEqual({ sheet: LOG_SHEET, added: 16, repeated: 0, rows: 16, skipped: [], notes: [expect.stringMatching(/^Started Fairlead Log with 16 forecasts\.$/)] });
    SERIES.forEach((name, k) => {
      const t = firstDoc.series[k].tables.outlook;
      for (let h = 1; h <= HORIZON; h++) {
        const row = rows[k * HORIZON + h - 1];
        expect(row[col("Logged at")]).toBe("2026-12-01T09:00:00Z");
        expect(row[col("Series")]).toBe(name);
        expect(iso(row[col("Origin week")])).toBe("2026-11-27");
        expect(iso(row[col("Target week")])).toBe(t.rows[h - 1][1]);
        expect(row[col("Weeks ahead")]).toBe(h);
        expect(row[col("Method")]).toBe("lastweek");
        expect(row[col("Forecast")]).toBe(t.rows[h - 1][2]);
        expect(row[col("Inner low")]).toBe(t.rows[h - 1][3]);
        expect(row[col("Outer high")]).toBe(t.rows[h - 1][6]);
      }
    });
    const ws = sheet(await book("first.xlsx"), LOG_SHEET);
    expect(ws.getCell(5, col("Target week") + 1).numFmt).toBe("yyyy-mm-dd");
    expect(ws.getCell(5, col("Forecast") + 1).numFmt).toBe("#,##0.0");
    expect(ws.getCell(4, 1).font?.bold).toBe(true);
  });
});

/** A placeholder in the expected rows: the MASE column, checked on its own. */
const MASE_CHECKED = "MASE is checked on its own";

let rates: Map<string, number>[] = [];
/** Mean |y(w) − y(w − 364 days)| over the book's rate rows up to `origin`, for series k. */
function rawScale(k: number, origin: string): number {
  const byWeek = rates[k];
  let sum = 0;
  let count = 0;
  for (const [week, y] of byWeek) {
    if (week > origin) continue;
    const before = byWeek.get(new Date(Date.parse(`${week}T00:00:00Z`) - 364 * 86_400_000).toISOString().slice(0, 10));
    if (before === undefined) continue;
    sum += Math.abs(y - before);
    count++;
  }
  return sum / count;
}

describe("a second publish after two pasted weeks", () => {
  let before: string[];
  let after: ExcelJS.Workbook;
  let doc: PublishDoc;
  let text: string;

  beforeAll(async () => {
    fs.copyFileSync(path.join(dir, "first.xlsx"), path.join(dir, "weekly.xlsx"));
    await pasteWeeks("weekly.xlsx");
    // The rates as the book holds them (sheet Rates: week ending, then the series' columns).
    const ratesSheet = sheet(await book("weekly.xlsx"), "Rates");
    rates = SERIES.map(() => new Map<string, number>());
    ratesSheet.eachRow((row, r) => {
      if (r === 1) return;
      const week = row.getCell(1).value;
      if (!(week instanceof Date)) return;
      SERIES.forEach((_, k) => {
        const v = row.getCell(k + 2).value;
        if (typeof v === "number") rates[k].set(week.toISOString().slice(0, 10), v);
      });
    });
    before = snapshot(sheet(await book("weekly.xlsx"), LOG_SHEET));
    // The same publish twice, once for the JSON and once for the summary, into two copies.
    doc = JSON.parse(await ok(SECOND_AT, "publish", "weekly.xlsx", ...QUICK, "--no-charts", "--out", "second.xlsx", "--json")) as PublishDoc;
    text = await ok(SECOND_AT, "publish", "weekly.xlsx", ...QUICK, "--no-charts", "--out", "second-text.xlsx");
    after = await book("second.xlsx");
  });

  test("grows the log by exactly the run's rows, the earlier rows unchanged cell for cell", () => {
    const now = snapshot(sheet(after, LOG_SHEET));
    expect(now).toHaveLength(before.length + SERIES.length * HORIZON);
    expect(now.slice(0, before.length)).toEqual(before);
    expect(doc.publish.log).toMatchObject({ added: 16, repeated: 0, rows: 32 });
    const rows = logRows(after).slice(16);
    expect(rows.every((r) => iso(r[col("Origin week")]) === "2026-12-11" && r[col("Logged at")] === "2026-12-15T09:00:00Z")).toBe(true);
  });

  test("the track record is the hand computation from the log rows and the pasted rates", () => {
    // Error = actual − forecast; MAE = mean |e|; MAPE = mean |100·e/y| (Hyndman & Athanasopoulos,
    // Forecasting: Principles and Practice, 3rd ed., §5.8). The first publish's forecasts for the
    // two pasted weeks are 1 and 2 weeks ahead; every other logged forecast is still awaited.
    const rows = logRows(after);
    const ws = sheet(after, TRACK_SHEET);
    SERIES.forEach((name, k) => {
      const scored = PASTED.map((p, i) => {
        const row = rows.find((r) => r[col("Series")] === name && iso(r[col("Target week")]) === p.week && r[col("Weeks ahead")] === i + 1);
        if (!row) throw new Error(`no logged forecast of ${name} for ${p.week}`);
        const f = row[col("Forecast")] as number;
        const y = p.rates[k];
        const e = y - f;
        const inside = (lo: number, hi: number): number => (y >= lo && y <= hi ? 100 : 0);
        return { e, ae: Math.abs(e), ape: Math.abs((100 * e) / y), in80: inside(row[col("Inner low")] as number, row[col("Inner high")] as number), in95: inside(row[col("Outer low")] as number, row[col("Outer high")] as number) };
      });
      const mean = (xs: number[]): number => xs.reduce((a, b) => a + b, 0) / xs.length;
      const want: (number | string)[][] = [
        ["lastweek", 1, 1, 1, scored[0].e, scored[0].ae, scored[0].ape, MASE_CHECKED, scored[0].in80, scored[0].in95],
        ["lastweek", 2, 1, 1, scored[1].e, scored[1].ae, scored[1].ape, MASE_CHECKED, scored[1].in80, scored[1].in95],
        ["lastweek", 3, 0, 2],
        ["lastweek", 4, 0, 2],
        ["lastweek", "All", 2, 6, mean(scored.map((s) => s.e)), mean(scored.map((s) => s.ae)), mean(scored.map((s) => s.ape)), MASE_CHECKED, mean(scored.map((s) => s.in80)), mean(scored.map((s) => s.in95))],
      ];
      const got = tableAt(ws, name, "Track record by method and weeks ahead");
      expect(got.columns).toEqual(["Method", "Weeks ahead", "Forecasts scored", "Awaiting actuals", "Mean error", "Mean absolute error", "MAPE %", "MASE", "Inside 80% interval (%)", "Inside 95% interval (%)"]);
      const json = doc.publish.track.find((t) => t.series === name);
      expect(json).toMatchObject({ scored: 2, awaiting: 6 });
      expect(got.rows).toHaveLength(want.length);
      // MASE: both scored forecasts share the origin 2026-11-27, so one scale s divides every
      // MAE; s is the mean |y_t − y_{t−52 weeks}| of the rates up to the origin (the backtest's
      // scale), which the book's own rates give within 1% (the intake fills three blank cells
      // and one missing week that this by-date sum skips).
      const m = got.columns.indexOf("MASE");
      const s = (got.rows[0][5] as number) / (got.rows[0][m] as number);
      for (const i of [1, 4]) expect(Math.abs((got.rows[i][m] as number) - (got.rows[i][5] as number) / s)).toBeLessThanOrEqual(1e-12 * s);
      expect(Math.abs(s / rawScale(k, "2026-11-27") - 1)).toBeLessThan(0.01);
      want.forEach((w, i) => {
        for (let j = 0; j < got.columns.length; j++) {
          const sheetCell = got.rows[i][j];
          const jsonCell = json?.summary.rows[i][j] ?? null;
          if (w[j] === MASE_CHECKED) {
            expect(jsonCell).toBe(sheetCell);
          } else if (j >= w.length) {
            expect(sheetCell).toBeNull();
            expect(jsonCell).toBeNull();
          } else if (typeof w[j] === "number" && j >= 4) {
            // The same arithmetic on the same doubles, summed in another order at most: 1e-12 relative.
            const tol = 1e-12 * Math.max(1, Math.abs(w[j] as number));
            expect(Math.abs((sheetCell as number) - (w[j] as number))).toBeLessThanOrEqual(tol);
            expect(Math.abs((jsonCell as number) - (w[j] as number))).toBeLessThanOrEqual(tol);
          } else {
            expect(sheetCell).toBe(w[j]);
            expect(jsonCell).toBe(w[j]);
          }
        }
      });
      // The summary's line: counts and the 1-week MAPE to one decimal.
      const mape1 = scored[0].ape.toLocaleString("en-US", { minimumFractionDigits: 1, maximumFractionDigits: 1 });
      expect(text).toContain(`Track record, ${name}: 2 forecasts scored, 6 awaiting; 1 week ahead MAPE ${mape1}%.`);
    });
    expect(text).toContain("Added 16 forecasts to Fairlead Log (16 already there).");
  });
});

describe("a log edited by hand", () => {
  test("keeps the changed row and the note as they are, adds below them, and says what it found", async () => {
    fs.copyFileSync(path.join(dir, "first.xlsx"), path.join(dir, "edited.xlsx"));
    const wb = await book("edited.xlsx");
    const ws = sheet(wb, LOG_SHEET);
    // Sheet row 6 is the TBX forecast 2 weeks ahead; a broker's view typed over it, and a note below the log.
    ws.getCell(6, col("Forecast") + 1).value = 1999.5;
    ws.getCell(21, 1).value = "Checked against the broker's indication on 2 December.";
    await wb.xlsx.writeFile(path.join(dir, "edited.xlsx"));
    const before = snapshot(sheet(await book("edited.xlsx"), LOG_SHEET));
    expect(before).toHaveLength(21);

    const text = await ok(SECOND_AT, "publish", "edited.xlsx", ...QUICK, "--no-charts", "--in-place");
    const now = snapshot(sheet(await book("edited.xlsx"), LOG_SHEET));
    expect(now.slice(0, 21)).toEqual(before);
    // Same rates, same forecasts: only the one whose row was changed is logged again, below the note.
    expect(now).toHaveLength(22);
    const added = sheet(await book("edited.xlsx"), LOG_SHEET);
    expect(added.getCell(22, col("Forecast") + 1).value).toBe(firstDoc.series[0].tables.outlook.rows[1][2]);
    expect(added.getCell(22, col("Weeks ahead") + 1).value).toBe(2);
    expect(text).toContain("Added 1 forecast to Fairlead Log (16 already there).");
    expect(text).toContain("1 row of the log was changed or added by hand (row 6); it is kept as it stands and scored as it reads.");
    expect(text).toContain("1 row of the log (21) does not read as a forecast");
    expect(text).toContain("15 forecasts were already in the log with the same values and were not added again.");
    // Checks and backtest were off: the summary says which parts of the snapshot are empty, and why.
    expect(text).toContain("Nothing to show for seasonal factors (they come with the checks, which were off), checks (they were off) and backtest (no backtest was run).");
  });
});

describe("sheets of the user's", () => {
  test("a sheet named Fairlead Log that is not the log: exit 2, one sentence, the book not written", async () => {
    fs.copyFileSync(DESK, path.join(dir, "mine.xlsx"));
    const wb = await book("mine.xlsx");
    wb.addWorksheet("Fairlead Log").getCell("A1").value = "Calls with brokers";
    await wb.xlsx.writeFile(path.join(dir, "mine.xlsx"));
    const hash = sha("mine.xlsx");
    for (const where of [["--in-place"], ["--out", "mine-out.xlsx"]]) {
      const r = await fairlead(FIRST_AT, "publish", "mine.xlsx", ...QUICK, ...where);
      expect(r.code).toBe(2);
      expect(r.stdout).toBe("");
      const lines = r.stderr.trim().split("\n");
      expect(lines).toHaveLength(1);
      expect(lines[0]).toMatch(/^fairlead: The book has a sheet “Fairlead Log” that is not Fairlead's forecast log/);
    }
    expect(sha("mine.xlsx")).toBe(hash);
    expect(fs.existsSync(path.join(dir, "mine-out.xlsx"))).toBe(false);
  });

  test("a sheet of the user's named Fairlead Published stops publish, and run leaves it alone", async () => {
    fs.copyFileSync(DESK, path.join(dir, "notes.xlsx"));
    const wb = await book("notes.xlsx");
    wb.addWorksheet("Fairlead Published").getCell("A1").value = "What we sent the managers";
    await wb.xlsx.writeFile(path.join(dir, "notes.xlsx"));
    const r = await fairlead(FIRST_AT, "publish", "notes.xlsx", ...QUICK, "--out", "notes-out.xlsx");
    expect(r.code).toBe(2);
    expect(r.stderr).toMatch(/already has a sheet "Fairlead Published" that Fairlead did not write/);
    expect(fs.existsSync(path.join(dir, "notes-out.xlsx"))).toBe(false);
    await ok(FIRST_AT, "run", "notes.xlsx", ...QUICK, "--no-charts", "--out", "notes-run.xlsx");
    expect(sheet(await book("notes-run.xlsx"), "Fairlead Published").getCell("A1").value).toBe("What we sent the managers");
  });
});

describe("run after a publish", () => {
  test("adds nothing to the log and leaves Published as it was, pictures included; the track record is scored again, as the pane's Run does", async () => {
    const text = await ok(SECOND_AT, "run", "first.xlsx", ...QUICK, "--out", "rerun.xlsx");
    expect(text).not.toMatch(/Fairlead Log|Published/);
    expect(text).toMatch(/^Track record, Halden–Corvane FEU: 0 forecasts scored, 4 awaiting\.$/m);
    const was = await book("first.xlsx");
    const now = await book("rerun.xlsx");
    expect(now.worksheets.map((w) => w.name)).toEqual(was.worksheets.map((w) => w.name));
    for (const name of [PUBLISHED_SHEET, LOG_SHEET]) expect(snapshot(sheet(now, name))).toEqual(snapshot(sheet(was, name)));
    // Rewritten under the new run's stamp: the same scores (no new weeks), a later "Made" time.
    const made = (wb: ExcelJS.Workbook): unknown => sheet(wb, TRACK_SHEET).getColumn(1).values.indexOf("Made");
    const madeAt = (wb: ExcelJS.Workbook): unknown => sheet(wb, TRACK_SHEET).getCell(Number(made(wb)), 2).value;
    expect(made(now)).toBeGreaterThan(0);
    expect(madeAt(now)).not.toEqual(madeAt(was));
    // The Outlook sheet is the new run's (stamped at its time); the pictures of the kept sheets are theirs still.
    expect(sheet(now, "Fairlead Outlook").getCell("B9").value).not.toEqual(sheet(was, "Fairlead Outlook").getCell("B9").value);
    const pictures = (wb: ExcelJS.Workbook, name: string): string[] =>
      sheet(wb, name)
        .getImages()
        .map((im) => crypto.createHash("sha256").update((wb.model.media[Number(im.imageId)] as unknown as { buffer: Buffer }).buffer).digest("hex"));
    expect(pictures(now, PUBLISHED_SHEET)).toEqual(pictures(was, PUBLISHED_SHEET));
    expect(pictures(now, TRACK_SHEET)).toHaveLength(pictures(was, TRACK_SHEET).length);
    // The old outlook pictures are dropped, not carried along: as many images as before.
    expect(now.model.media.length).toBe(was.model.media.length);
  });
});

describe("reading the log sheet", () => {
  test("cells become the plain values the log reader takes, padded from A1", () => {
    const ws = new ExcelJS.Workbook().addWorksheet(LOG_SHEET);
    const week = new Date("2026-12-04T00:00:00Z");
    ws.getCell("A1").value = LOG_MARK;
    ws.getCell("B2").value = week;
    ws.getCell("C2").value = 1941.6;
    ws.getCell("A3").value = { richText: [{ text: "Halden–" }, { font: { bold: true }, text: "Corvane FEU" }] };
    ws.getCell("B3").value = { formula: "1900*1.02", result: 1938 } as ExcelJS.CellFormulaValue;
    ws.getCell("C3").value = { text: "broker note", hyperlink: "https://example.invalid/note" };
    ws.getCell("D3").value = true;
    expect(sheetGrid(ws)).toEqual([
      [LOG_MARK, null, null, null],
      [null, week, 1941.6, null],
      ["Halden–Corvane FEU", 1938, "broker note", true],
    ]);
  });
});

describe("the publish command line", () => {
  test("--parts chooses what Published shows; a bad part is one sentence, exit 2", async () => {
    const doc = JSON.parse(await ok(FIRST_AT, "publish", "desk.xlsx", ...QUICK, "--no-charts", "--parts", "season,outlook", "--out", "parts.xlsx", "--json")) as PublishDoc;
    expect(doc.publish.parts).toEqual(["outlook", "season"]);
    const r = await fairlead(FIRST_AT, "publish", "desk.xlsx", ...QUICK, "--parts", "outlook,forecast");
    expect(r.code).toBe(2);
    expect(r.stderr.trim().split("\n")).toHaveLength(1);
    expect(r.stderr).toMatch(/--parts: Publish shows outlook, season, checks, backtest .*got “outlook,forecast”/);
  });

  test("the usage lists publish, and help publish lists its options", async () => {
    const usage = await fairlead(FIRST_AT, "help");
    expect(usage.code).toBe(0);
    expect(usage.stdout).toMatch(/^ {2}fairlead publish <book\.xlsx>/m);
    const help = await fairlead(FIRST_AT, "help", "publish");
    expect(help.stdout).toMatch(/--parts VALUE +what the published sheet shows/);
    expect(help.stdout).toMatch(/--in-place/);
  });
});
