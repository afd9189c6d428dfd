/**
 * The built worksheet functions in a real browser engine (Debian's Chromium, driven by
 * playwright-core): dist/functions.js is loaded by a page with a stand-in for Excel's
 * CustomFunctions runtime, and FAIRLEAD.OUTLOOK is called as Excel would call it. The
 * analysis must run in the engine's Web Worker (dist/engine-worker.js), give analyse()'s
 * numbers, and a second call with the same cells must come from the cache without new work.
 * Needs `npm run build` first (npm run test:browser does it).
 */
import * as fs from "fs";
import * as http from "http";
import type { AddressInfo } from "net";
import * as path from "path";
import { chromium, type Browser, type Page } from "playwright-core";
import { analyse } from "../../src/core/analysis";
import { readWeekly } from "../../src/core/series/intake";
import { laneSeries } from "../engine/lane";

const DIST = path.join(__dirname, "..", "..", "dist");

const PAGE = `<!doctype html><html><head><meta charset="utf-8"><title>functions</title>
<script>
  window.__registered = {};
  class CfError extends Error { constructor(code, message) { super(message); this.code = code; } }
  window.CustomFunctions = {
    associate: (id, f) => { window.__registered[id] = f; },
    Error: CfError,
    ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!" },
  };
</script>
<script src="functions.js"></script></head><body>functions</body></html>`;

let server: http.Server;
let browser: Browser;
let page: Page;
let base: string;
const workers: string[] = [];

beforeAll(async () => {
  if (!fs.existsSync(path.join(DIST, "engine-worker.js"))) throw new Error("dist/ is not built: run npm run build first");
  server = http.createServer((req, res) => {
    const url = (req.url ?? "/").split("?")[0];
    if (url === "/page.html") {
      res.writeHead(200, { "content-type": "text/html" }).end(PAGE);
      return;
    }
    const file = path.join(DIST, path.normalize(url).replace(/^[/\\]+/, ""));
    if (!file.startsWith(DIST) || !fs.existsSync(file)) {
      res.writeHead(404).end();
      return;
    }
    res.writeHead(200, { "content-type": file.endsWith(".js") ? "text/javascript" : "application/octet-stream" }).end(fs.readFileSync(file));
  });
  await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", resolve));
  base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
  browser = await chromium.launch({
    executablePath: "/usr/bin/chromium",
    args: ["--no-sandbox", "--headless", "--disable-gpu", "--disable-background-networking", "--disable-component-update", "--no-first-run"],
  });
  page = await browser.newPage();
  page.on("worker", (w) => workers.push(w.url()));
  await page.goto(`${base}/page.html`);
  await page.waitForFunction(() => Object.keys((window as unknown as { __registered: object }).__registered).length >= 9);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await new Promise<void>((resolve) => (server ? server.close(() => resolve()) : resolve()));
});

test("all nine functions are registered by the bundle", async () => {
  const ids = await page.evaluate(() => Object.keys((window as unknown as { __registered: object }).__registered).sort());
  expect(ids).toEqual(["BACKTEST", "CHANCE", "DECOMPOSE", "FITSUMMARY", "MEANAHEAD", "NONLINEARITY", "OUTLOOK", "STATIONARITY", "WEEKFACTORS"]);
});

test("OUTLOOK runs TBATS in the engine's Web Worker and gives analyse()'s outlook; the repeat is a cache hit", async () => {
  const lane = laneSeries(160);
  const cells = [["Halden–Corvane FEU"], ...Array.from(lane.values, (v) => [v])];
  const call = (c: unknown[][]) =>
    page.evaluate(async (rates) => {
      const t0 = performance.now();
      const f = (window as unknown as { __registered: Record<string, (...a: unknown[]) => Promise<unknown[][]>> }).__registered.OUTLOOK;
      const out = await f(rates, 4, "tbats", null, null, null);
      return { out, ms: performance.now() - t0 };
    }, c);
  const first = await call(cells);
  expect(workers.some((u) => u.endsWith("/engine-worker.js"))).toBe(true);
  const want = analyse(readWeekly(cells), { method: "tbats", horizon: 4, checks: false }).tables.outlook.rows;
  // Same V8 arithmetic in the browser's worker as in Node; 1e-9 relative allows for nothing but rounding.
  first.out.forEach((row, i) => {
    expect(row[0]).toBe(i + 1);
    (row as number[]).slice(1).forEach((v, j) => expect(Math.abs(v - (want[i][j + 2] as number))).toBeLessThanOrEqual(1e-9 * Math.abs(want[i][j + 2] as number)));
  });
  const workersBefore = workers.length;
  const second = await call(cells.map((r) => [...r]));
  expect(second.out).toEqual(first.out);
  expect(workers.length).toBe(workersBefore);
  expect(second.ms).toBeLessThan(first.ms / 5);
}, 120_000);

test("a bad cell comes back as an Excel error value with the intake's sentence", async () => {
  const err = await page.evaluate(async () => {
    const f = (window as unknown as { __registered: Record<string, (...a: unknown[]) => Promise<unknown>> }).__registered.OUTLOOK;
    try {
      await f([[100], ["tbc"], [101], [102]], 2, null, null, null, null);
      return null;
    } catch (e) {
      return { code: (e as { code: string }).code, message: (e as Error).message };
    }
  });
  expect(err).toEqual({ code: "#VALUE!", message: expect.stringMatching(/Row 2 holds "tbc", which is not a number/) });
});
