/** The result cache on its own, and in front of the pool. */
import { performance } from "perf_hooks";
import type { Report } from "../../src/core/analysis";
import { InlineTransport, ResultCache, createEngine, jobKey } from "../../src/engine";
import { counter } from "./testJobs";
import { median } from "./helpers";
import { laneSeries } from "./lane";

describe("ResultCache", () => {
  test("keeps at most maxEntries, dropping the least recently used first", () => {
    const c = new ResultCache(3);
    c.set("a", 1);
    c.set("b", 2);
    c.set("c", 3);
    expect(c.get("a")).toEqual({ value: 1 }); // a is now the most recent
    c.set("d", 4); // evicts b
    expect(c.keys()).toEqual(["c", "a", "d"]);
    expect(c.get("b")).toBeUndefined();
    expect(c.stats()).toEqual({ entries: 3, maxEntries: 3, hits: 1, misses: 1 });
  });

  test("hands out copies: editing a result does not change the stored one", () => {
    const c = new ResultCache(2);
    const out = { rows: [[1, 2]], y: new Float64Array([5]) };
    c.set("k", out);
    out.rows[0][0] = 99; // the caller edits its own result after storing
    const first = c.get("k")?.value as typeof out;
    first.y[0] = -1;
    expect(c.get("k")?.value).toEqual({ rows: [[1, 2]], y: new Float64Array([5]) });
  });

  test("an undefined output is still a hit", () => {
    const c = new ResultCache(2);
    c.set("u", undefined);
    expect(c.get("u")).toEqual({ value: undefined });
  });

  test("refuses a bound below one entry", () => {
    expect(() => new ResultCache(0)).toThrow(RangeError);
  });
});

describe("the pool's cache", () => {
  test("a second identical call returns without running; one changed element misses", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      const before = counter.runs;
      const values = new Float64Array([1, 2, 3, 4]);
      expect(await engine.run("test-count", { values })).toBe(10);
      // Same content, a different object with keys in the same place: a hit.
      expect(await engine.run("test-count", { values: new Float64Array([1, 2, 3, 4]) })).toBe(10);
      expect(counter.runs - before).toBe(1);
      expect(engine.stats().started).toBe(1);
      const changed = values.slice();
      changed[2] = 3.5;
      expect(await engine.run("test-count", { values: changed })).toBe(10.5);
      expect(counter.runs - before).toBe(2);
      // cache: false neither reads nor fills.
      expect(await engine.run("test-count", { values }, { cache: false })).toBe(10);
      expect(counter.runs - before).toBe(3);
      expect(engine.stats().cache).toMatchObject({ hits: 1, misses: 2, entries: 2 });
    } finally {
      engine.close();
    }
  });

  test("failures are not cached", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      await expect(engine.run("test-throw", {})).rejects.toThrow("The failing job failed inside the engine");
      await expect(engine.run("test-throw", {})).rejects.toThrow("The failing job failed inside the engine");
      expect(engine.stats().started).toBe(2);
      expect(engine.stats().cache?.entries).toBe(0);
    } finally {
      engine.close();
    }
  });

  test("one cache can serve two engines (the functions and the pane share one)", async () => {
    const cache = new ResultCache(8);
    const a = createEngine(new InlineTransport(), { cache });
    const b = createEngine(new InlineTransport(), { cache });
    try {
      const before = counter.runs;
      await a.run("test-count", { values: new Float64Array([7]) });
      await b.run("test-count", { values: new Float64Array([7]) });
      expect(counter.runs - before).toBe(1);
    } finally {
      a.close();
      b.close();
    }
  });

  test("hit on a 470-week analyse input: same Report, a fresh copy each time, no job started; time reported", async () => {
    const engine = createEngine(new InlineTransport());
    try {
      const series = laneSeries(470);
      const options = { method: "lastyear", horizon: 12, levels: [80, 95] };
      const first: Report = await engine.run("analyse", { series, options });
      const hits: number[] = [];
      const hashes: number[] = [];
      let last: Report | null = null;
      for (let i = 0; i < 41; i++) {
        // A fresh clone of the input each time, as a worksheet recalculation would build it.
        const input = structuredClone({ series, options });
        const t0 = performance.now();
        last = await engine.run("analyse", input);
        hits.push(performance.now() - t0);
        const t1 = performance.now();
        jobKey("analyse", input);
        hashes.push(performance.now() - t1);
      }
      expect(last).toEqual(first);
      expect(last).not.toBe(first);
      (last as Report).tables.outlook.rows[0][2] = -1;
      expect(((await engine.run("analyse", { series, options })) as Report).tables.outlook.rows[0][2]).toBe(first.tables.outlook.rows[0][2]);
      expect(engine.stats().started).toBe(1);
      // Reported, not asserted: wall-clock limits belong to bench/ (CONVENTIONS.md).
      process.stdout.write(
        `engine cache hit, 470-week analyse input: median ${median(hits).toFixed(3)} ms (of which hashing ${median(hashes).toFixed(3)} ms), ` +
          `report ${JSON.stringify(first).length} characters as JSON\n`,
      );
    } finally {
      engine.close();
    }
  });
});
