/**
 * analyseInEngine: the backtest of an analysis spread over the pool, the chosen method fitted
 * in a worker with that backtest in hand. The report must be analyse()'s on one thread, table
 * for table, apart from the cost table's seconds (declared `varying`), for "auto" and for a
 * named method with a backtest; and without a backtest it is the plain analyse job.
 */
import { analyse, type AnalysisOptions, type Report } from "../../src/core/analysis";
import type { Cell, ReportTable } from "../../src/core/report";
import { analyseInEngine, createEngine, type Engine } from "../../src/engine";
import { NodeTransport } from "../../src/engine/node";
import { expectWellFormedProgress, progressRecorder } from "./helpers";
import { laneSeries } from "./lane";
import { PRODUCTION_WORKER } from "./paths";

const series = laneSeries(180);

/** The report without the columns its tables declare varying (timings). */
function steady(r: Report): unknown {
  const tables = Object.fromEntries(
    Object.entries(r.tables).map(([k, t]: [string, ReportTable | undefined]) => {
      if (!t?.varying) return [k, t];
      const keep = t.columns.map((c: string, j: number) => (t.varying?.includes(c) ? -1 : j)).filter((j: number) => j >= 0);
      return [k, { ...t, columns: keep.map((j: number) => t.columns[j]), rows: t.rows.map((row: Cell[]) => keep.map((j: number) => row[j])) }];
    }),
  );
  return { ...r, tables };
}

describe("analyseInEngine (worker threads)", () => {
  let engine: Engine;
  beforeAll(() => {
    engine = createEngine(new NodeTransport({ script: PRODUCTION_WORKER, cores: 2 }));
  });
  afterAll(() => engine.close());

  test.each<[string, AnalysisOptions]>([
    ["auto", { method: "auto", horizon: 6, checks: false, backtest: { methods: ["lastweek", "drift", "sarima"], testWeeks: 10, horizon: 3, modes: ["fixed"] } }],
    ["a named method with a backtest", { method: "drift", horizon: 4, backtest: { methods: ["lastweek", "drift"], testWeeks: 8, horizon: 2 } }],
    ["no backtest", { method: "lastweek", horizon: 3, checks: false }],
  ])("%s: the one-thread report, bit for bit but the seconds", async (_what, options) => {
    const direct = analyse(series, options);
    const { events, listener } = progressRecorder();
    const pooled = await analyseInEngine(engine, series, options, { onProgress: listener, cache: false });
    expect(steady(pooled)).toEqual(steady(direct));
    expect(pooled.model).toEqual(direct.model);
    expectWellFormedProgress(events);
  });

  test("a backtest planned for another series is refused, not silently used", async () => {
    const other = laneSeries(170);
    const options: AnalysisOptions = { method: "auto", checks: false, backtest: { methods: ["lastweek", "drift"], testWeeks: 8, horizon: 2 } };
    const { backtestOptionsFor, resolveOptions } = await import("../../src/core/analysis");
    const { backtest } = await import("../../src/core/evaluate/run");
    const { getModel } = await import("../../src/core/models/registry");
    const wrong = backtest(other.values, backtestOptionsFor(other, resolveOptions(other, options)), getModel);
    expect(() => analyse(series, options, {}, { backtest: wrong })).toThrow(/planned for 170 weeks, the series has 180/);
  });
});
