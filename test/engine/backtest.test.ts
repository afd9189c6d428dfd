/**
 * A backtest through the engine's pool (src/engine/backtest.ts) must give what the one-thread
 * backtest gives (src/core/evaluate/run.ts), whichever worker finishes first: the same runs in
 * the plan's order with the same numbers (all but the milliseconds spent), and the same
 * combination assembled from them. A method that fails comes back as a run with a sentence.
 */
import { backtest } from "../../src/core/evaluate/run";
import { getModel } from "../../src/core/models/registry";
import { backtestInEngine, createEngine, InlineTransport, type Engine } from "../../src/engine";
import { NodeTransport } from "../../src/engine/node";
import { progressRecorder, expectWellFormedProgress, withoutTiming } from "./helpers";
import { laneSeries } from "./lane";
import { PRODUCTION_WORKER } from "./paths";

const y = laneSeries(140).values;
const options = { methods: ["lastweek", "drift", "sarima", "combo"], comboMembers: ["drift", "sarima"], testWeeks: 12, horizon: 3, modes: ["fixed" as const, 4] };

describe.each([
  ["inline", () => createEngine(new InlineTransport())],
  ["worker threads", () => createEngine(new NodeTransport({ script: PRODUCTION_WORKER, cores: 2 }))],
])("backtest through the %s engine", (_name, make) => {
  let engine: Engine;
  beforeAll(() => {
    engine = make();
  });
  afterAll(() => engine.close());

  test("equals the one-thread backtest, run for run, in the plan's order", async () => {
    const direct = backtest(y, options, getModel);
    const { events, listener } = progressRecorder();
    const pooled = await backtestInEngine(engine, y, options, { onProgress: listener, cache: false });
    expect(pooled.plan).toEqual(direct.plan);
    expect(pooled.runs.map(withoutTiming)).toEqual(direct.runs.map(withoutTiming));
    expectWellFormedProgress(events);
  });

  test("a method that fails is a run with a sentence; the others are scored", async () => {
    // A week at zero makes NNAR's log transform impossible when it is fitted (in the worker).
    const withZero = Float64Array.from(y);
    withZero[3] = 0;
    const bad = { methods: ["lastweek", "nnar"], testWeeks: 12, horizon: 3, modes: ["fixed" as const], methodOptions: { nnar: { lambda: 0 } } };
    const r = await backtestInEngine(engine, withZero, bad, { cache: false });
    const nn = r.runs.find((x) => x.method === "nnar")!;
    expect(nn.failure).toMatch(/^Neural network autoregression \(NNAR\) stopped at the origin after week 128 \(.+\); the origins before it are scored\.$/);
    expect(nn.point.every((p) => Number.isNaN(p[0]))).toBe(true);
    expect(r.runs.find((x) => x.method === "lastweek")!.failure).toBeNull();
  });
});
