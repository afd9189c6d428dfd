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
// no formulas, no trimming, every sheet into its own file (-1).
const CSV_FILTER = "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1";

export function libreOfficeAvailable(): boolean {
  try {
    execFileSync("soffice", ["--version"], { stdio: "pipe" });
    return true;
  } catch {
    return false;
  }
}

/** Every sheet of the book as rows of cell text, keyed by sheet name. */
export function sheetsAsCsv(book: string): Map<string, string[][]> {
  const work = fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-lo-"));
  const profile = path.join(work, "profile");
  fs.mkdirSync(path.join(profile, "user"), { recursive: true });
  fs.writeFileSync(path.join(profile, "user", "registrymodifications.xcu"), RECALC_ALWAYS);
  const outDir = path.join(work, "csv");
  execFileSync("soffice", [`-env:UserInstallation=file://${profile}`, "--headless", "--convert-to", CSV_FILTER, "--outdir", outDir, book], {
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
