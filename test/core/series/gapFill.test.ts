/**
 * The gap rule, checked against values worked out by hand. Geometric interpolation
 * between a and b over L missing weeks multiplies by (b/a)^(1/(L+1)) each week, so a
 * 2-week gap between 100 and 800 (ratio 8, step 8^(1/3) = 2) fills 200 and 400. These are
 * exact in real arithmetic; the tolerance of 1e-9 allows only for the last bits of pow().
 */
import { fillGap, fillScale, findGaps } from "../../../src/core/series/gapFill";
import { readWeekly } from "../../../src/core/series/intake";
import { column, isoDays, weekly } from "./blocks";

const TOL = 9; // decimal places for toBeCloseTo, see the header

describe("fillGap", () => {
  test("log scale: 100, _, _, 800 → 200, 400", () => {
    const y = new Float64Array([100, NaN, NaN, 800]);
    fillGap(y, { start: 1, length: 2 }, "log");
    expect(y[1]).toBeCloseTo(200, TOL);
    expect(y[2]).toBeCloseTo(400, TOL);
  });

  test("log scale: one week between 100 and 121 is 110 (√1.21 = 1.1)", () => {
    const y = new Float64Array([100, NaN, 121]);
    fillGap(y, { start: 1, length: 1 }, "log");
    expect(y[1]).toBeCloseTo(110, TOL);
  });

  test("log scale: 3 weeks between 81 and 1 → 27, 9, 3 (a falling market)", () => {
    const y = new Float64Array([5, 81, NaN, NaN, NaN, 1, 7]);
    fillGap(y, { start: 2, length: 3 }, "log");
    expect(Array.from(y.slice(2, 5)).map((v) => Number(v.toFixed(9)))).toEqual([27, 9, 3]);
    expect(y[0]).toBe(5); // neighbours and the rest are untouched
    expect(y[6]).toBe(7);
  });

  test("raw scale: straight line, -10, _, _, 20 → 0, 10", () => {
    const y = new Float64Array([-10, NaN, NaN, 20]);
    fillGap(y, { start: 1, length: 2 }, "raw");
    expect(y[1]).toBeCloseTo(0, TOL);
    expect(y[2]).toBeCloseTo(10, TOL);
  });

  test("a gap touching either end cannot be filled", () => {
    expect(() => fillGap(new Float64Array([NaN, 1, 2]), { start: 0, length: 1 }, "raw")).toThrow(RangeError);
    expect(() => fillGap(new Float64Array([1, 2, NaN]), { start: 2, length: 1 }, "raw")).toThrow(RangeError);
  });
});

describe("findGaps and fillScale", () => {
  test("finds the interior runs only", () => {
    const y = new Float64Array([NaN, 1, NaN, 2, NaN, NaN, NaN, 3, NaN]);
    expect(findGaps(y)).toEqual([
      { start: 2, length: 1 },
      { start: 4, length: 3 },
    ]);
  });
  test("log only when every observed value is positive", () => {
    expect(fillScale(new Float64Array([1, NaN, 2]))).toBe("log");
    expect(fillScale(new Float64Array([1, NaN, 0]))).toBe("raw");
    expect(fillScale(new Float64Array([-1, 2]))).toBe("raw");
  });
});

describe("gap filling inside readWeekly", () => {
  test("two blank rows between 100 and 800 fill 200 and 400, flagged, one warning", () => {
    const s = readWeekly(column([50, 100, "", "", 800]));
    expect(s.values[2]).toBeCloseTo(200, TOL);
    expect(s.values[3]).toBeCloseTo(400, TOL);
    expect(s.filled).toEqual([false, false, true, true, false]);
    const gapNotes = s.warnings.filter((w) => w.includes("filled"));
    expect(gapNotes).toEqual([
      "Rows 3 and 4 were blank and were filled by interpolating on the log scale " +
        "(a steady weekly growth rate) between the weeks either side.",
    ]);
  });

  test("with dates, the warning names the weeks by date", () => {
    const s = readWeekly(column([100, "", "", 800, 810]), { dates: column(weekly("2025-03-07", 5)) });
    expect(s.warnings).toEqual([
      "The 2 weeks ending 2025-03-14 and 2025-03-21 (rows 2 and 3) had no rate and were filled " +
        "by interpolating on the log scale (a steady weekly growth rate) between the weeks either side.",
    ]);
  });

  test("a 2-week gap from a 21-day step is filled the same way", () => {
    const s = readWeekly(column([100, 800, 810]), {
      dates: column(["2025-03-07", "2025-03-28", "2025-04-04"]),
    });
    expect(isoDays(s.dates)).toEqual(weekly("2025-03-07", 5));
    expect(s.values[1]).toBeCloseTo(200, TOL);
    expect(s.values[2]).toBeCloseTo(400, TOL);
    expect(s.filled).toEqual([false, true, true, false, false]);
  });

  test("a series with a zero is filled on the raw scale, and says so", () => {
    const s = readWeekly(column([0, "", 10, 20]));
    expect(s.values[1]).toBeCloseTo(5, TOL);
    expect(s.warnings.some((w) => w.includes("on the raw scale"))).toBe(true);
  });

  test("one warning per gap", () => {
    const s = readWeekly(column([1, "", 4, 5, "", "", 40]));
    expect(s.warnings.filter((w) => w.includes("filled"))).toHaveLength(2);
    expect(s.values[1]).toBeCloseTo(2, TOL); // √(1·4)
    expect(s.values[4]).toBeCloseTo(10, TOL); // 5 · 2, ratio 8 over 3 steps
    expect(s.values[5]).toBeCloseTo(20, TOL);
  });

  test("maxFill raises the limit; allowLongGaps fills longer gaps with a caution", () => {
    const cells = column([100, "", "", "", 1600, 1700]);
    expect(() => readWeekly(cells)).toThrow(/3 weeks missing/);
    const a = readWeekly(cells, { maxFill: 3 });
    expect(Array.from(a.values).map((v) => Number(v.toFixed(9)))).toEqual([100, 200, 400, 800, 1600, 1700]);
    expect(a.warnings.some((w) => w.includes("with care"))).toBe(false);
    const b = readWeekly(cells, { allowLongGaps: true });
    expect(b.values[2]).toBeCloseTo(400, TOL);
    expect(b.filled).toEqual([false, true, true, true, false, false]);
    expect(b.warnings.some((w) => w.includes("longer than 2 weeks, so treat the filled values with care"))).toBe(true);
  });

  test("observed values are never changed by filling", () => {
    const raw = [812.5, "", 790.25, 801, "", 799.75];
    const s = readWeekly(column(raw));
    [0, 2, 3, 5].forEach((i) => expect(s.values[i]).toBe(raw[i]));
  });
});
