/**
 * The demo books in sample-workbooks/, made from an invented market (DEVELOPERS.md, "Invented
 * scenario"): the Tidemark Box Index (TBX) and three lanes between the fictional ports of
 * Halden, Corvane and Estmar, weekly, USD per FEU, week ending Friday.
 *
 *   desk-weekly.xlsx  the desk's weekly book: table "WeeklyRates" on sheet "Rates", and "About"
 *   budget.xlsx       a budget whose formulas link by name to the outlook the batch publishes
 *   summary.xlsx      the book managers open: title, caution, and the same rates table
 *
 * Run (from the repository root):
 *   npx tsc -p sample-workbooks/tsconfig.json && node build/samples/sample-workbooks/make-samples.js
 * The data are seeded and the archives re-packed with fixed dates, so a re-run gives the same
 * bytes; test/batch/samples.test.ts fails when the committed books and this script disagree.
 */
import * as fs from "fs";
import * as path from "path";
import ExcelJS from "exceljs";
import { MersenneTwister } from "../src/core/math/rng";
import { lunarNewYear } from "../src/core/series/lunar";
import { isoWeek } from "../src/core/series/isoWeek";
import { outlookName } from "../src/core/present/names";
import { CAUTION } from "../src/core/present/stamp";
import { stableZip } from "../src/batch/stableZip";

export const TBX = "Tidemark Box Index";
export const LANES = ["Halden–Corvane FEU", "Corvane–Estmar FEU", "Estmar–Halden FEU"] as const;
export const TABLE_NAME = "WeeklyRates";
export const DATE_HEADER = "Week ending";
export const SEED = 20130104;

const DAY = 86_400_000;
const WEEK = 7 * DAY;
const FIRST_WEEK = Date.UTC(2013, 0, 4); // the first Friday of 2013
const LAST_WEEK = Date.UTC(2026, 10, 27);
/** Stamped on every zip entry and in the document properties, so the bytes do not move. */
export const FIXED_DATE = new Date(Date.UTC(2026, 0, 1));
const CREATOR = "Fairlead sample generator";

/** Cells left blank in single lanes (holiday weeks the lane reported nothing). */
export const BLANKS: readonly { lane: (typeof LANES)[number]; week: string }[] = [
  { lane: "Halden–Corvane FEU", week: "2017-02-03" }, // the week holding lunar new year, 28 Jan 2017
  { lane: "Corvane–Estmar FEU", week: "2018-12-28" }, // Christmas week …
  { lane: "Corvane–Estmar FEU", week: "2019-01-04" }, // … and New Year: two in a row, no more
];
/** The week whose whole row is absent from the books (the dates skip it). */
export const SKIPPED_WEEK = "2015-01-02";

interface LaneSpec {
  base: number; // USD/FEU at the start, before season and noise
  drift: number; // log change per year
  cycle: number; // amplitude (log) of a slow 6.5-year swing
  phase: number; // radians
  season: number; // scale of the annual pattern
  lnyDepth: number; // log depth of the lunar-new-year trough
  surgeStart: number; // week-ending (ms) the 2021–22 surge begins climbing
  surgePeak: number; // multiple of the normal level at the peak
  weight: number; // weight in the TBX
}

const LANE_SPECS: LaneSpec[] = [
  // Halden–Corvane: the lane out of Halden, most affected by the holiday.
  { base: 1750, drift: 0.018, cycle: 0.08, phase: 0.4, season: 1.0, lnyDepth: 0.2, surgeStart: Date.UTC(2021, 0, 8), surgePeak: 2.9, weight: 0.4 },
  { base: 1300, drift: 0.008, cycle: 0.06, phase: 1.9, season: 0.8, lnyDepth: 0.09, surgeStart: Date.UTC(2021, 1, 12), surgePeak: 2.5, weight: 0.35 },
  { base: 2250, drift: -0.006, cycle: 0.05, phase: 3.1, season: 0.6, lnyDepth: 0.13, surgeStart: Date.UTC(2021, 2, 12), surgePeak: 2.7, weight: 0.25 },
];

// Surge phases in weeks: a smooth climb, a plateau, a slower fall back to normal.
const SURGE_RISE = 28;
const SURGE_HOLD = 24;
const SURGE_FALL = 40;

// Noise on the log scale, so it grows with the level: AR(1) persistence plus a white part.
const AR_PHI = 0.8;
const AR_SIGMA = 0.03; // innovation sd; stationary sd 0.03 / sqrt(1 − 0.64) = 0.05
const COMMON_SHARE = 0.6; // share of the innovation common to all lanes (one market)
const WHITE_SIGMA = 0.015;
const TBX_SIGMA = 0.006;

/** A raised-cosine bump: 1 at the centre, 0 beyond `half` weeks either side. */
function bump(w: number, centre: number, half: number): number {
  const x = (w - centre) / half;
  return Math.abs(x) < 1 ? 0.5 * (1 + Math.cos(Math.PI * x)) : 0;
}

/** Annual pattern (log) by ISO week: pre-holiday peak season around weeks 30–40, soft after. */
function seasonal(week: number): number {
  return 0.11 * bump(week, 35, 8) - 0.09 * bump(week, 46, 5);
}

/**
 * The holiday dip (0 … 1) at `weeks` after the lunar new year: falls from a week before,
 * trough 1.5 weeks after, recovered 4 weeks later.
 */
function lnyShape(weeks: number): number {
  if (weeks < -1 || weeks >= 5.5) return 0;
  return weeks < 1.5 ? (weeks + 1) / 2.5 : 1 - (weeks - 1.5) / 4;
}

/** The surge (log multiple of the normal level) and its phase (0 … 1), for calmer noise outside. */
function surge(t: number, spec: LaneSpec): { log: number; share: number } {
  const w = (t - spec.surgeStart) / WEEK;
  let share = 0;
  if (w >= 0 && w < SURGE_RISE) share = 0.5 * (1 - Math.cos((Math.PI * w) / SURGE_RISE));
  else if (w >= SURGE_RISE && w < SURGE_RISE + SURGE_HOLD) share = 1;
  else if (w >= SURGE_RISE + SURGE_HOLD && w < SURGE_RISE + SURGE_HOLD + SURGE_FALL) {
    share = 0.5 * (1 + Math.cos((Math.PI * (w - SURGE_RISE - SURGE_HOLD)) / SURGE_FALL));
  }
  return { log: share * Math.log(spec.surgePeak), share };
}

export interface SampleRates {
  dates: Date[];
  columns: { name: string; values: (number | null)[] }[];
}

const isoDay = (ms: number): string => new Date(ms).toISOString().slice(0, 10);

/**
 * The invented weekly rates, TBX first and then the three lanes. Pure and seeded: every call
 * gives the same numbers, bit for bit.
 */
export function sampleRates(): SampleRates {
  const rng = new MersenneTwister(SEED);
  const k = LANE_SPECS.length;
  const u = LANE_SPECS.map(() => (AR_SIGMA / Math.sqrt(1 - AR_PHI * AR_PHI)) * rng.normal());
  const dates: Date[] = [];
  const tbx: (number | null)[] = [];
  const lanes: (number | null)[][] = LANE_SPECS.map(() => []);
  const blank = new Set(BLANKS.map((b) => `${b.lane}|${b.week}`));

  for (let t = FIRST_WEEK; t <= LAST_WEEK; t += WEEK) {
    const date = new Date(t);
    const year = date.getUTCFullYear();
    const season = seasonal(isoWeek(date).week);
    const years = (t - FIRST_WEEK) / (365.25 * DAY);
    // Every week draws its shocks, the skipped one too, so the series runs on through it.
    const common = rng.normal();
    let index = 0;
    const level: number[] = [];
    for (let j = 0; j < k; j++) {
      const s = LANE_SPECS[j];
      const sg = surge(t, s);
      const idio = rng.normal();
      const white = rng.normal();
      // Turbulent markets are noisier: the innovation sd rises by up to 80% in the surge.
      const sigma = AR_SIGMA * (1 + 0.8 * sg.share);
      u[j] = AR_PHI * u[j] + sigma * (COMMON_SHARE * common + Math.sqrt(1 - COMMON_SHARE ** 2) * idio);
      let lny = 0;
      for (const y of [year - 1, year, year + 1]) lny += lnyShape((t - lunarNewYear(y).getTime()) / WEEK);
      const logRate =
        Math.log(s.base) +
        s.drift * years +
        s.cycle * Math.sin((2 * Math.PI * years) / 6.5 + s.phase) +
        s.season * season -
        s.lnyDepth * lny +
        sg.log +
        u[j] +
        WHITE_SIGMA * white;
      level.push(Math.exp(logRate));
      index += s.weight * level[j];
    }
    index *= Math.exp(TBX_SIGMA * rng.normal());
    if (isoDay(t) === SKIPPED_WEEK) continue;
    dates.push(date);
    tbx.push(Math.round(index * 10) / 10);
    LANES.forEach((name, j) => lanes[j].push(blank.has(`${name}|${isoDay(t)}`) ? null : Math.round(level[j])));
  }
  return {
    dates,
    columns: [{ name: TBX, values: tbx }, ...LANES.map((name, j) => ({ name, values: lanes[j] }))],
  };
}

// ---------------------------------------------------------------------------------------
// The books

const BOLD: Partial<ExcelJS.Font> = { bold: true };

function newBook(title: string): ExcelJS.Workbook {
  const wb = new ExcelJS.Workbook();
  wb.creator = CREATOR;
  wb.lastModifiedBy = CREATOR;
  wb.created = FIXED_DATE;
  wb.modified = FIXED_DATE;
  wb.title = title;
  return wb;
}

/** Sheet "Rates": the lane data as the Excel table "WeeklyRates", header frozen. */
function addRatesSheet(wb: ExcelJS.Workbook, data: SampleRates): void {
  const ws = wb.addWorksheet("Rates", { views: [{ state: "frozen", xSplit: 0, ySplit: 1, topLeftCell: "A2", activeCell: "A2" }] });
  const headers = [DATE_HEADER, ...data.columns.map((c) => c.name)];
  ws.addTable({
    name: TABLE_NAME,
    ref: "A1",
    headerRow: true,
    totalsRow: false,
    style: { theme: "TableStyleMedium2", showRowStripes: true },
    columns: headers.map((name) => ({ name, filterButton: true })),
    rows: data.dates.map((d, i) => [d, ...data.columns.map((c) => c.values[i])]),
  });
  headers.forEach((_, j) => {
    ws.getColumn(j + 1).width = j === 0 ? 13 : 21;
    ws.getCell(1, j + 1).font = BOLD;
  });
  for (let i = 0; i < data.dates.length; i++) {
    const row = ws.getRow(i + 2);
    row.getCell(1).numFmt = "yyyy-mm-dd";
    row.getCell(2).numFmt = "#,##0.0";
    for (let j = 3; j <= headers.length; j++) row.getCell(j).numFmt = "#,##0";
  }
}

function deskBook(data: SampleRates): ExcelJS.Workbook {
  const wb = newBook("Tidemark weekly rates");
  addRatesSheet(wb, data);
  const about = wb.addWorksheet("About");
  about.getColumn(1).width = 100;
  const lines = [
    "About this book",
    "The data in this book are invented for demonstration: the Tidemark Box Index and the ports of Halden, Corvane",
    "and Estmar do not exist, and the rates were made by Fairlead's sample generator (sample-workbooks/make-samples.ts).",
    "Kept by: the Halden Chartering Desk (a fictional desk). One row per week, week ending Friday, USD per FEU.",
    "Add each new week as a row at the foot of the WeeklyRates table on the Rates sheet.",
  ];
  lines.forEach((text, i) => {
    const c = about.getCell(i + 1, 1);
    c.value = text;
    if (i === 0) c.font = { bold: true, size: 14 };
  });
  return wb;
}

/** Where each budget formula sits: exported so the test can check cells as well as names. */
export const BUDGET_FIRST_LANE_ROW = 6;
export const BUDGET_BOXES = [120, 80, 60];
export const BUDGET_NOTE =
  "Figures fill in when Fairlead publishes the outlook into this book (for example: fairlead run desk-weekly.xlsx --into budget.xlsx --out budget-published.xlsx). " +
  "Until then the linked cells show #NAME?, because the names do not exist yet.";

const firstFour = (name: string): string => `AVERAGE(INDEX(${name},1):INDEX(${name},4))`;

function budgetBook(data: SampleRates): ExcelJS.Workbook {
  const wb = newBook("Freight budget (demonstration)");
  // Formulas are written without cached results; ask the spreadsheet to compute on opening.
  wb.calcProperties.fullCalcOnLoad = true;
  const header = 5;
  const ws = wb.addWorksheet("Budget", { views: [{ state: "frozen", xSplit: 0, ySplit: header, topLeftCell: "A6", activeCell: "B6" }] });
  [24, 16, 18, 18, 18, 18, 18].forEach((w, j) => (ws.getColumn(j + 1).width = w));
  ws.getCell("A1").value = "Freight budget: the next four weeks (invented lanes, demonstration only)";
  ws.getCell("A1").font = { bold: true, size: 14 };
  ws.getCell("A2").value = BUDGET_NOTE;
  ws.getCell("A3").value = "Outlook made from data to week ending";
  ws.getCell("B3").value = { formula: outlookName(LANES[0], "ASOF") } as ExcelJS.CellFormulaValue;
  ws.getCell("B3").numFmt = "yyyy-mm-dd";
  const titles = [
    "Lane",
    "Boxes per week",
    "Next week, USD/FEU",
    "4-week average, USD/FEU",
    "80% low (mean of weekly lows)",
    "80% high (mean of weekly highs)",
    "4-week cost, USD",
  ];
  titles.forEach((t, j) => {
    const c = ws.getCell(header, j + 1);
    c.value = t;
    c.font = BOLD;
    c.alignment = { wrapText: true, vertical: "top" };
  });
  const f = (formula: string): ExcelJS.CellFormulaValue => ({ formula }) as ExcelJS.CellFormulaValue;
  LANES.forEach((lane, i) => {
    const r = BUDGET_FIRST_LANE_ROW + i;
    const point = outlookName(lane, "POINT");
    ws.getCell(r, 1).value = lane;
    ws.getCell(r, 2).value = BUDGET_BOXES[i];
    ws.getCell(r, 3).value = f(`INDEX(${point},1)`);
    ws.getCell(r, 4).value = f(firstFour(point));
    ws.getCell(r, 5).value = f(firstFour(outlookName(lane, { low: 80 })));
    ws.getCell(r, 6).value = f(firstFour(outlookName(lane, { high: 80 })));
    ws.getCell(r, 7).value = f(`D${r}*B${r}*4`);
    for (let j = 3; j <= 7; j++) ws.getCell(r, j).numFmt = "#,##0";
  });
  const last = BUDGET_FIRST_LANE_ROW + LANES.length - 1;
  const total = last + 1;
  ws.getCell(total, 1).value = "Total";
  ws.getCell(total, 2).value = f(`SUM(B${BUDGET_FIRST_LANE_ROW}:B${last})`);
  ws.getCell(total, 7).value = f(`SUM(G${BUDGET_FIRST_LANE_ROW}:G${last})`);
  ws.getCell(total, 7).numFmt = "#,##0";
  ws.getRow(total).font = BOLD;
  ws.getCell(total + 2, 1).value =
    "The low and high columns average the weekly 80% bounds; that range is usually wider than an 80% " +
    "interval for the 4-week average itself, which the MEANAHEAD worksheet function gives.";
  ws.getCell(total + 3, 1).value = "Lane rates: sheet Rates, table WeeklyRates (the desk copies its weekly table in).";
  addRatesSheet(wb, data);
  return wb;
}

function summaryBook(data: SampleRates): ExcelJS.Workbook {
  const wb = newBook("Tidemark lanes: summary");
  const ws = wb.addWorksheet("Summary");
  ws.getColumn(1).width = 110;
  const lines = [
    "Tidemark lanes: weekly rate summary",
    CAUTION,
    "The Tidemark Box Index and the lanes between Halden, Corvane and Estmar are invented; the rates are demonstration data.",
    "Fairlead's batch runner publishes the outlook into this book from the table on the Rates sheet; please open it read-only.",
  ];
  lines.forEach((text, i) => {
    const c = ws.getCell(i + 1, 1);
    c.value = text;
    if (i === 0) c.font = { bold: true, size: 14 };
    if (i === 1) c.font = BOLD;
  });
  addRatesSheet(wb, data);
  return wb;
}

async function bookBytes(wb: ExcelJS.Workbook): Promise<Buffer> {
  const raw = Buffer.from(await wb.xlsx.writeBuffer());
  return stableZip(raw, FIXED_DATE);
}

export const SAMPLE_FILES = ["desk-weekly.xlsx", "budget.xlsx", "summary.xlsx"] as const;

/** Writes the three books into `dir` (made if absent); returns the paths written. */
export async function writeSamples(dir: string): Promise<string[]> {
  const data = sampleRates();
  fs.mkdirSync(dir, { recursive: true });
  const books: [string, ExcelJS.Workbook][] = [
    ["desk-weekly.xlsx", deskBook(data)],
    ["budget.xlsx", budgetBook(data)],
    ["summary.xlsx", summaryBook(data)],
  ];
  const written: string[] = [];
  for (const [name, wb] of books) {
    const file = path.join(dir, name);
    fs.writeFileSync(file, await bookBytes(wb));
    written.push(file);
  }
  return written;
}

/** sample-workbooks/ of the repository holding this script (source or compiled under build/). */
export function samplesDir(): string {
  let dir = __dirname;
  while (!fs.existsSync(path.join(dir, "package.json"))) {
    const up = path.dirname(dir);
    if (up === dir) throw new Error(`No package.json above ${__dirname}; run from inside the repository.`);
    dir = up;
  }
  return path.join(dir, "sample-workbooks");
}

export async function main(): Promise<void> {
  for (const file of await writeSamples(samplesDir())) console.log(`wrote ${file}`);
}

if (require.main === module) {
  main().catch((err: unknown) => {
    console.error(err instanceof Error ? err.message : err);
    process.exitCode = 1;
  });
}
