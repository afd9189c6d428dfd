import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import ExcelJS from "exceljs";
import JSZip from "jszip";
import {
  BLANKS,
  BUDGET_BOXES,
  BUDGET_FIRST_LANE_ROW,
  DATE_HEADER,
  FIXED_DATE,
  LANES,
  SAMPLE_FILES,
  SKIPPED_WEEK,
  TABLE_NAME,
  TBX,
  sampleRates,
  writeSamples,
} from "../../sample-workbooks/make-samples";
import { stableZip } from "../../src/batch/stableZip";
import { outlookName } from "../../src/core/present/names";
import { CAUTION } from "../../src/core/present/stamp";
import { isoWeek } from "../../src/core/series/isoWeek";
import { lunarNewYear } from "../../src/core/series/lunar";
import { readWeekly } from "../../src/core/series/intake";

const SAMPLES = path.join(__dirname, "..", "..", "sample-workbooks");
const DAY = 86_400_000;
const iso = (d: Date): string => d.toISOString().slice(0, 10);
const mean = (a: number[]): number => a.reduce((s, x) => s + x, 0) / a.length;

const data = sampleRates();
const column = (name: string): (number | null)[] => {
  const c = data.columns.find((x) => x.name === name);
  if (!c) throw new Error(`no column ${name}`);
  return c.values;
};
/** The rates of a column whose week ending satisfies `keep` (blank cells left out). */
const where = (name: string, keep: (d: Date) => boolean): number[] =>
  column(name).flatMap((v, i) => (v !== null && keep(data.dates[i]) ? [v] : []));
const inYear = (y: number) => (d: Date) => d.getUTCFullYear() === y;

describe("sampleRates", () => {
  it("is deterministic: two calls give the same numbers", () => {
    expect(sampleRates()).toEqual(data);
  });

  it("has the TBX first, then the three lanes, each one value a week", () => {
    expect(data.columns.map((c) => c.name)).toEqual([TBX, ...LANES]);
    for (const c of data.columns) expect(c.values).toHaveLength(data.dates.length);
  });

  it("runs weekly on Fridays from 2013-01-04 to 2026-11-27, skipping exactly one week", () => {
    expect(iso(data.dates[0])).toBe("2013-01-04");
    expect(iso(data.dates[data.dates.length - 1])).toBe("2026-11-27");
    for (const d of data.dates) {
      expect(d.getUTCDay()).toBe(5);
      expect(d.getTime() % DAY).toBe(0);
    }
    const jumps: string[] = [];
    for (let i = 1; i < data.dates.length; i++) {
      const step = (data.dates[i].getTime() - data.dates[i - 1].getTime()) / DAY;
      if (step !== 7) jumps.push(`${iso(data.dates[i - 1])} +${step}`);
    }
    expect(jumps).toEqual(["2014-12-26 +14"]);
    expect(SKIPPED_WEEK).toBe("2015-01-02");
    // 726 Fridays from the first week to the last, one of them absent.
    expect(data.dates).toHaveLength(725);
  });

  it("leaves exactly the intended cells blank, never more than two weeks in a row", () => {
    const blanks = data.columns.flatMap((c) =>
      c.values.flatMap((v, i) => (v === null ? [`${c.name} ${iso(data.dates[i])}`] : [])),
    );
    expect(blanks).toEqual([
      "Halden–Corvane FEU 2017-02-03",
      "Corvane–Estmar FEU 2018-12-28",
      "Corvane–Estmar FEU 2019-01-04",
    ]);
    expect(BLANKS.map((b) => `${b.lane} ${b.week}`)).toEqual(blanks);
  });

  it("gives positive rates: whole dollars on the lanes, tenths on the TBX, plausible outside the surge", () => {
    for (const c of data.columns) {
      for (const v of c.values) {
        if (v === null) continue;
        expect(v).toBeGreaterThan(0);
        if (c.name === TBX) expect(Math.round(v * 10) / 10).toBe(v);
        else expect(Number.isInteger(v)).toBe(true);
      }
      // "Normal times": before mid-2020 and after the surge has gone (2023 on).
      const normal = where(c.name, (d) => d < new Date("2020-07-01") || d >= new Date("2023-01-01"));
      expect(Math.min(...normal)).toBeGreaterThanOrEqual(1000);
      expect(Math.max(...normal)).toBeLessThanOrEqual(4000);
    }
  });

  it("keeps the TBX a weighted mean of the lanes: always between the cheapest and dearest lane", () => {
    // TBX = 0.40·HC + 0.35·CE + 0.25·EH times a 0.6% noise; a 2% margin covers ~3 sd of it.
    const tbx = column(TBX);
    data.dates.forEach((_, i) => {
      const lanes = LANES.map((l) => column(l)[i]).filter((v): v is number => v !== null);
      if (lanes.length < LANES.length) return;
      expect(tbx[i] as number).toBeGreaterThan(Math.min(...lanes) * 0.98);
      expect(tbx[i] as number).toBeLessThan(Math.max(...lanes) * 1.02);
    });
  });

  it("dips after the lunar new year on the Halden lane in most years", () => {
    // Mean log-rate of the two weeks ending 1–14 days after the holiday against weeks −6..−3
    // (ending 14–41 days before, clear of the dip that starts a week ahead). The lane's trough
    // is 0.2 in logs and its noise sd 0.05; in 2021 the surge's climb can outweigh the dip,
    // so we ask for 11 of the 14 years, not all.
    const lane = "Halden–Corvane FEU";
    let dips = 0;
    for (let y = 2013; y <= 2026; y++) {
      const h = lunarNewYear(y).getTime();
      const days = (d: Date): number => (d.getTime() - h) / DAY;
      const after = where(lane, (d) => days(d) > 0 && days(d) <= 14).map(Math.log);
      const before = where(lane, (d) => days(d) > -42 && days(d) <= -14).map(Math.log);
      expect(after.length).toBeGreaterThanOrEqual(1);
      expect(before).toHaveLength(4);
      if (mean(after) < mean(before)) dips++;
    }
    expect(dips).toBeGreaterThanOrEqual(11);
  });

  it("has a 2021–22 surge of more than twice the 2019 level on every series, gone by 2023", () => {
    for (const c of data.columns) {
      const base = mean(where(c.name, inYear(2019)));
      const surge = where(c.name, (d) => d.getUTCFullYear() === 2021 || d.getUTCFullYear() === 2022);
      expect(Math.max(...surge) / base).toBeGreaterThan(2);
      // Before and after, the level is within 25% of 2019 (drift and cycle move it a little).
      expect(Math.abs(mean(where(c.name, inYear(2020))) / base - 1)).toBeLessThan(0.25);
      expect(Math.abs(mean(where(c.name, inYear(2023))) / base - 1)).toBeLessThan(0.25);
    }
  });

  it("peaks in weeks 32–38 and softens in weeks 44–49 (Halden lane, years without the surge)", () => {
    // The pattern is +0.11 (log) at week 35 and −0.09 at week 46; the seven-week means carry
    // most of it, and a 0.05 margin is about three standard errors of the noise.
    const lane = "Halden–Corvane FEU";
    const calm = (d: Date): boolean => d.getUTCFullYear() < 2020 || d.getUTCFullYear() > 2022;
    const weeks = (lo: number, hi: number) => (d: Date) => calm(d) && isoWeek(d).week >= lo && isoWeek(d).week <= hi;
    const peak = mean(where(lane, weeks(32, 38)).map(Math.log));
    const spring = mean(where(lane, weeks(10, 24)).map(Math.log));
    const soft = mean(where(lane, weeks(44, 49)).map(Math.log));
    expect(peak - spring).toBeGreaterThan(0.05);
    expect(peak - soft).toBeGreaterThan(0.05);
    expect(soft).toBeLessThan(spring);
  });
});

// ---------------------------------------------------------------------------------------
// The books

async function load(name: string): Promise<ExcelJS.Workbook> {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.readFile(path.join(SAMPLES, name));
  return wb;
}

/** The loaded table's own model; exceljs' typings declare only the properties for adding one. */
function tableModel(ws: ExcelJS.Worksheet, name: string): { name: string; tableRef: string; columns: { name: string }[] } {
  const t = ws.getTable(name) as unknown as { table?: { name: string; tableRef: string; columns: { name: string }[] } };
  if (!t || !t.table) throw new Error(`table ${name} not found on ${ws.name}`);
  return t.table;
}

function expectRatesTable(wb: ExcelJS.Workbook): void {
  const ws = wb.getWorksheet("Rates");
  expect(ws).toBeDefined();
  const rates = ws as ExcelJS.Worksheet;
  const table = tableModel(rates, TABLE_NAME);
  const header = [DATE_HEADER, TBX, ...LANES];
  expect(table.name).toBe(TABLE_NAME);
  expect(table.columns.map((c) => c.name)).toEqual(header);
  expect(table.tableRef).toBe(`A1:E${data.dates.length + 1}`);
  header.forEach((h, j) => {
    expect(rates.getCell(1, j + 1).value).toBe(h);
    expect(rates.getCell(1, j + 1).font?.bold).toBe(true);
  });
  // Excel-native cells: a real date with a date format, numbers as numbers.
  expect(rates.getCell("A2").value).toEqual(new Date("2013-01-04T00:00:00Z"));
  expect(rates.getCell("A2").numFmt).toBe("yyyy-mm-dd");
  expect(typeof rates.getCell("C2").value).toBe("number");
  expect(rates.views[0]).toMatchObject({ state: "frozen", ySplit: 1 });
}

describe("sample workbooks", () => {
  it("regenerate byte for byte as committed (re-run make-samples after changing it)", async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-samples-"));
    try {
      const written = await writeSamples(dir);
      expect(written.map((f) => path.basename(f))).toEqual([...SAMPLE_FILES]);
      for (const file of written) {
        const committed = fs.readFileSync(path.join(SAMPLES, path.basename(file)));
        expect(fs.readFileSync(file).equals(committed)).toBe(true);
      }
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  });

  it("stamp every zip entry with the fixed date, and stableZip ignores the input's dates", async () => {
    const bytes = fs.readFileSync(path.join(SAMPLES, "desk-weekly.xlsx"));
    const zip = await JSZip.loadAsync(bytes);
    for (const entry of Object.values(zip.files)) expect(entry.date.getTime()).toBe(FIXED_DATE.getTime());
    // Re-date the archive to another day and back: the bytes return exactly.
    const other = await stableZip(bytes, new Date(Date.UTC(2030, 5, 15, 12, 34, 56)));
    expect(other.equals(bytes)).toBe(false);
    expect((await stableZip(other, FIXED_DATE)).equals(bytes)).toBe(true);
  });

  it("desk-weekly.xlsx holds the table WeeklyRates with the right header and rows, and an About sheet", async () => {
    const wb = await load("desk-weekly.xlsx");
    expectRatesTable(wb);
    expect(wb.creator).toBe("Fairlead sample generator");
    const about = wb.getWorksheet("About") as ExcelJS.Worksheet;
    const text = about.getColumn(1).values.filter((v) => typeof v === "string").join(" ");
    expect(text).toMatch(/invented for demonstration/i);
    expect(text).toMatch(/fictional desk/);
  });

  it("desk-weekly.xlsx reads through the intake: blanks and the skipped week filled, nothing else", async () => {
    const wb = await load("desk-weekly.xlsx");
    const ws = wb.getWorksheet("Rates") as ExcelJS.Worksheet;
    const block = (col: number): unknown[][] => {
      const out: unknown[][] = [];
      for (let r = 1; r <= data.dates.length + 1; r++) out.push([ws.getCell(r, col).value]);
      return out;
    };
    const dates = block(1);
    LANES.forEach((lane, j) => {
      const s = readWeekly(block(j + 3), { dates, header: true, positive: true });
      expect(s.dates).toHaveLength(726); // the skipped week is back on the grid
      const filled = s.dates.flatMap((d, i) => (s.filled[i] ? [iso(d)] : []));
      expect(filled).toEqual([SKIPPED_WEEK, ...BLANKS.filter((b) => b.lane === lane).map((b) => b.week)].sort());
    });
  });

  it("budget.xlsx links to exactly the names outlookName() gives, with no cached results", async () => {
    const wb = await load("budget.xlsx");
    const ws = wb.getWorksheet("Budget") as ExcelJS.Worksheet;
    const formulas = new Map<string, string>();
    ws.eachRow((row) =>
      row.eachCell((cell) => {
        if (cell.formula) formulas.set(cell.address, cell.formula);
      }),
    );
    const used = new Set([...formulas.values()].flatMap((f) => f.match(/\bFL_[A-Z0-9_]+/g) ?? []));
    const expected = new Set([
      outlookName(LANES[0], "ASOF"),
      ...LANES.flatMap((l) => [outlookName(l, "POINT"), outlookName(l, { low: 80 }), outlookName(l, { high: 80 })]),
    ]);
    expect([...used].sort()).toEqual([...expected].sort());

    // The cells, lane by lane.
    expect(formulas.get("B3")).toBe(outlookName(LANES[0], "ASOF"));
    LANES.forEach((lane, i) => {
      const r = BUDGET_FIRST_LANE_ROW + i;
      const avg = (n: string): string => `AVERAGE(INDEX(${n},1):INDEX(${n},4))`;
      expect(ws.getCell(r, 1).value).toBe(lane);
      expect(ws.getCell(r, 2).value).toBe(BUDGET_BOXES[i]);
      expect(formulas.get(`C${r}`)).toBe(`INDEX(${outlookName(lane, "POINT")},1)`);
      expect(formulas.get(`D${r}`)).toBe(avg(outlookName(lane, "POINT")));
      expect(formulas.get(`E${r}`)).toBe(avg(outlookName(lane, { low: 80 })));
      expect(formulas.get(`F${r}`)).toBe(avg(outlookName(lane, { high: 80 })));
      expect(formulas.get(`G${r}`)).toBe(`D${r}*B${r}*4`);
    });
    expect(formulas.get("B9")).toBe("SUM(B6:B8)");
    expect(formulas.get("G9")).toBe("SUM(G6:G8)");
    expect(String(ws.getCell("A2").value)).toMatch(
      /^Figures fill in when Fairlead publishes the outlook into this book \(for example: fairlead run desk-weekly\.xlsx --into budget\.xlsx/,
    );

    // No formula carries a cached value: in the sheet XML no <c> with an <f> has a <v>.
    const zip = await JSZip.loadAsync(fs.readFileSync(path.join(SAMPLES, "budget.xlsx")));
    const xml = await (zip.file("xl/worksheets/sheet1.xml") as JSZip.JSZipObject).async("string");
    const cells = xml.match(/<c [^>]*>.*?<\/c>/g) ?? [];
    const withFormula = cells.filter((c) => c.includes("<f>"));
    expect(withFormula).toHaveLength(formulas.size);
    for (const c of withFormula) expect(c).not.toContain("<v>");
    expect(await (zip.file("xl/workbook.xml") as JSZip.JSZipObject).async("string")).toContain('fullCalcOnLoad="1"');

    expectRatesTable(wb);
  });

  it("summary.xlsx carries the title, the caution sentence and the rates table", async () => {
    const wb = await load("summary.xlsx");
    expect(wb.worksheets.map((w) => w.name)).toEqual(["Summary", "Rates"]);
    const ws = wb.getWorksheet("Summary") as ExcelJS.Worksheet;
    expect(CAUTION).toBe(
      "Forecasts are statistical estimates from past rates only; they are not advice to book, fix or trade.",
    );
    expect(ws.getCell("A2").value).toBe(CAUTION);
    expect(String(ws.getCell("A1").value)).toMatch(/summary/i);
    expectRatesTable(wb);
  });
});
