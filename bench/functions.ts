/**
 * Worksheet functions (src/functions), issue #8 targets, one JSON line per case:
 * - functions.cacheHit.outlook: FAIRLEAD.OUTLOOK recalculated on unchanged cells (470 weeks,
 *   as Excel hands them over: a header, numbers, date serials): the intake, the content hash
 *   and the cached report, no fit. Target < 2 ms.
 * - functions.cold.outlook.tbats: the same cells with method "tbats", each run on a fresh
 *   engine (empty cache): intake, TBATS search and fit, forecast. Target < 1.5 s.
 * In Node there is no Web Worker, so the shared engine runs jobs on the calling thread (as in
 * a functions-only runtime without one); in Excel the fit runs in the engine's worker.
 */
import { dateToExcelSerial } from "../src/core/series/excelDate";
import { createEngine, InlineTransport } from "../src/engine";
import { useFunctionsEngine } from "../src/functions/engine";
import { outlook } from "../src/functions/functions";
import { syntheticRates } from "./synthetic";

Object.assign(globalThis, {
  CustomFunctions: { Error: class extends Error {}, ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!" } },
});

function line(name: string, n: number, times: number[]): void {
  const s = [...times].sort((a, b) => a - b);
  process.stdout.write(`${JSON.stringify({ name, n, runs: s.length, median_ms: Number(s[Math.floor(s.length / 2)].toFixed(4)), min_ms: Number(s[0].toFixed(4)) })}\n`);
}

async function main(): Promise<void> {
  const n = 470;
  const y = syntheticRates(n, 3);
  const start = Date.UTC(2017, 0, 6);
  const rates: unknown[][] = [["Halden–Corvane FEU"], ...Array.from(y, (v) => [Math.round(100 * v) / 100])];
  const dates: unknown[][] = [["Week ending"], ...Array.from(y, (_, t) => [dateToExcelSerial(new Date(start + t * 7 * 86_400_000))])];

  const cold: number[] = [];
  for (let i = 0; i < 5; i++) {
    useFunctionsEngine(createEngine(new InlineTransport()));
    const t0 = process.hrtime.bigint();
    await outlook(rates as never, 12, "tbats", undefined, dates as never);
    cold.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  line("functions.cold.outlook.tbats", n, cold);

  const hits: number[] = [];
  for (let i = 0; i < 300; i++) {
    // A recalculation hands over fresh arrays each time.
    const r = rates.map((row) => [...row]);
    const d = dates.map((row) => [...row]);
    const t0 = process.hrtime.bigint();
    await outlook(r as never, 12, "tbats", undefined, d as never);
    if (i >= 50) hits.push(Number(process.hrtime.bigint() - t0) / 1e6);
  }
  line("functions.cacheHit.outlook", n, hits);
}

void main();
