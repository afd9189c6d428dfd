/**
 * The README's main command, timed: `fairlead run` on sample-workbooks/desk-weekly.xlsx with
 * the defaults (four series of 726 weeks; method chosen by a 52-week backtest re-estimated every
 * week, 4 weeks ahead; checks; 12-week outlook; chart images; the book written). Target: under
 * 60 s on the 2-core machine (issue #7). One run per line, because one run is most of a minute:
 * `run_s` is the whole command, `backtest_cpu_s` the sum of the backtest cost table's seconds
 * (CPU time over both workers), split by method, which says where the time goes.
 */
import * as fs from "fs";
import * as os from "os";
import * as path from "path";
import { runBook } from "../src/batch/run";
import { runDefaults } from "../src/core/present/defaults";

async function main(): Promise<void> {
  const out = path.join(fs.mkdtempSync(path.join(os.tmpdir(), "fairlead-demo-")), "desk.xlsx");
  const book = path.join(__dirname, "..", "..", "..", "sample-workbooks", "desk-weekly.xlsx");
  const quiet = { update: () => undefined, done: () => undefined };
  const t0 = Date.now();
  const r = await runBook({ book, options: runDefaults(), out, inPlace: false, charts: true }, quiet, true);
  const runS = (Date.now() - t0) / 1000;
  const byMethod: Record<string, number> = {};
  let total = 0;
  for (const a of r.analysed) {
    const t = a.report.tables.backtestCost;
    if (!t) continue;
    for (const row of t.rows) {
      const s = Number(row[t.columns.indexOf("Seconds")]);
      const m = String(row[0]);
      byMethod[m] = Number(((byMethod[m] ?? 0) + s).toFixed(2));
      total += s;
    }
  }
  const line = { name: "batch.demo", n: r.analysed.length, weeks: r.analysed[0].series.values.length, run_s: Number(runS.toFixed(2)), backtest_cpu_s: Number(total.toFixed(2)), by_method: byMethod };
  process.stdout.write(`${JSON.stringify(line)}\n`);
  fs.rmSync(path.dirname(out), { recursive: true, force: true });
}

void main();
