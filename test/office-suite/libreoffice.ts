/**
 * LibreOffice headless as an independent spreadsheet engine: it opens a book Fairlead wrote,
 * recalculates every formula (OOXMLRecalcMode 0, "always", set in a throwaway profile, because
 * its default for .xlsx is to trust cached results, and exceljs writes none), and saves every
 * sheet as CSV with raw, unformatted values.
 */
import { execFileSync } from "child_process";
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { parseCsv } from "../../src/batch/csv";

const RECALC_ALWAYS = `<?xml version="1.0" encoding="UTF-8"?>
<oor:items xmlns:oor="http://openoffice.org/2001/registry" xmlns:xs="http://www.w3.org/2001/XMLSchema" xmlns:xsi="http://www.w3.org/2001/XMLSchema-instance">
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="OOXMLRecalcMode" oor:op="fuse"><value>0</value></prop></item>
<item oor:path="/org.openoffice.Office.Calc/Formula/Load"><prop oor:name="ODFRecalcMode" oor:op="fuse"><value>0</value></prop></item>
</oor:items>
`;

// CSV filter options: comma, double quote, UTF-8, from line 1, no column formats, default
// language, no quoting as text, detect special numbers, values not "as shown" (full precision),
// formulas as values (or as their text, "=…", when asked), no trimming, every sheet into its
// own file (-1).
const csvFilter = (formulas: boolean): string => `csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,${formulas},false,-1`;

export function libreOfficeAvailable(): boolean {
  try {
    execFileSync("soffice", ["--version"], { stdio: "pipe" });
    return true;
  } catch {
    return false;
  }
}

/**
 * Every sheet of the book as rows of cell text, keyed by sheet name: the values LibreOffice
 * computed, or with `formulas` each formula cell's formula ("=SUM(A1:A4)") instead.
 */
export function sheetsAsCsv(book: string, options: { formulas?: boolean } = {}): Map<string, string[][]> {
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-lo-"));
  const profile = path.join(work, "profile");
  fs.mkdirSync(path.join(profile, "user"), { recursive: true });
  fs.writeFileSync(path.join(profile, "user", "registrymodifications.xcu"), RECALC_ALWAYS);
  const outDir = path.join(work, "csv");
  execFileSync("soffice", [`-env:UserInstallation=file://${profile}`, "--headless", "--convert-to", csvFilter(options.formulas ?? false), "--outdir", outDir, book], {
    stdio: "pipe",
    timeout: 120_000,
  });
  const base = path.basename(book).replace(/\.xlsx$/i, "");
  const out = new Map<string, string[][]>();
  for (const f of fs.readdirSync(outDir)) {
    if (!f.startsWith(`${base}-`) || !f.endsWith(".csv")) continue;
    out.set(f.slice(base.length + 1, -4), parseCsv(fs.readFileSync(path.join(outDir, f), "utf8")));
  }
  fs.rmSync(work, { recursive: true, force: true });
  return out;
}

/** LibreOffice writes a date cell in its raw CSV as the ISO day or as M/D/YY text, depending on version: read both. */
export function loDate(text: string): string {
  if (/^\d{4}-\d{2}-\d{2}$/.test(text)) return text;
  const m = /^(\d{1,2})\/(\d{1,2})\/(\d{2,4})$/.exec(text);
  if (!m) return text;
  const year = m[3].length === 2 ? 2000 + Number(m[3]) : Number(m[3]);
  return `${year}-${m[1].padStart(2, "0")}-${m[2].padStart(2, "0")}`;
}

/** A report cell against LibreOffice's text of it: numbers to 1e-12 relative (its raw CSV keeps 15 digits or more). */
export function expectSame(lo: string, cell: number | string | null): void {
  if (cell === null) expect(lo).toBe("");
  else if (typeof cell === "number") {
    const v = Number(lo);
    expect(Number.isFinite(v)).toBe(true);
    expect(Math.abs(v - cell)).toBeLessThanOrEqual(1e-12 * Math.max(1, Math.abs(cell)));
  } else expect(lo).toBe(cell);
}

/** A report table as the batch's JSON gives it. */
export interface Table {
  title: string;
  columns: string[];
  rows: (number | string | null)[][];
}

/** The rows of a table as LibreOffice read them: found by title under the series' heading. */
export function tableRows(sheet: string[][], seriesName: string, t: Table): string[][] {
  const heading = sheet.findIndex((r) => r[0] === seriesName);
  expect(heading).toBeGreaterThanOrEqual(0);
  const top = sheet.findIndex((r, i) => i > heading && r[0] === t.title);
  expect(top).toBeGreaterThan(heading);
  expect(sheet[top + 1].slice(0, t.columns.length)).toEqual(t.columns);
  return sheet.slice(top + 2, top + 2 + t.rows.length);
}
