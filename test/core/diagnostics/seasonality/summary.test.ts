/**
 * seasonalityAnalysis: the guards a desk relies on. Simulated truth, seeded.
 */
import { seasonalityAnalysis } from "../../../../src/core/diagnostics/seasonality";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { InputError } from "../../../../src/core/series/errors";
import type { WeeklySeries } from "../../../../src/core/series/types";

function weekly(n: number, value: (t: number) => number): WeeklySeries {
  const start = Date.UTC(2015, 0, 2); // a Friday
  return {
    dates: Array.from({ length: n }, (_v, t) => new Date(start + t * 7 * 86_400_000)),
    values: Float64Array.from({ length: n }, (_v, t) => value(t)),
    filled: new Array<boolean>(n).fill(false),
    warnings: [],
  };
}

describe("seasonalityAnalysis", () => {
  test("two years are refused: STL would pass through the data and call noise a strong trend", () => {
    // With 104 weeks each week-of-year subseries has two points; the remainder vanishes.
    const rng = new MersenneTwister(1);
    let caught: unknown;
    try {
      seasonalityAnalysis(weekly(104, () => 1000 * Math.exp(0.05 * rng.normal())));
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).code).toBe("TOO_FEW_POINTS");
    expect((caught as InputError).message).toMatch(/at least three years .*156 weeks.*104/);
  });

  test("factors on pure noise carry a caveat; a real ±15% pattern does not, and is removed from the adjusted rates", () => {
    const rng = new MersenneTwister(7);
    const noise = seasonalityAnalysis(weekly(260, () => 1000 * Math.exp(0.05 * rng.normal())));
    expect(noise.seasonalReal).toBe(false);
    expect(noise.tables[1].notes.join(" ")).toMatch(/read these factors as noise/);

    const pattern = (t: number): number => Math.exp(0.15 * Math.sin((2 * Math.PI * t) / (365.25 / 7)));
    const real = seasonalityAnalysis(weekly(260, (t) => 1000 * pattern(t) * Math.exp(0.01 * rng.normal())));
    expect(real.seasonalReal).toBe(true);
    expect(real.tables[1].notes.join(" ")).not.toMatch(/read these factors as noise/);
    // The adjusted rates keep only the 1% noise around 1000: their log-sd is far below the
    // pattern's 0.15/√2 ≈ 0.106 (allow 0.03 for STL's slowly moving seasonal estimate).
    const logs = Array.from(real.adjusted, Math.log);
    const mean = logs.reduce((a, b) => a + b, 0) / logs.length;
    const sd = Math.sqrt(logs.reduce((a, b) => a + (b - mean) ** 2, 0) / (logs.length - 1));
    expect(sd).toBeLessThan(0.03);
  });

  test("filled weeks are said to be in the decomposition", () => {
    const s = weekly(200, (t) => 1000 + 50 * Math.sin(t / 8));
    s.filled[40] = true;
    s.filled[41] = true;
    const r = seasonalityAnalysis(s);
    expect(r.tables[0].notes.join(" ")).toMatch(/2 filled weeks/);
  });
});
