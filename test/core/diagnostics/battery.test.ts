/** runChecks: one failing check must not take the others (or the outlook) with it. */
import { MersenneTwister } from "../../../src/core/math/rng";
import type { WeeklySeries } from "../../../src/core/series/types";

jest.mock("../../../src/core/diagnostics/nonlinearity", () => ({
  ...jest.requireActual("../../../src/core/diagnostics/nonlinearity"),
  nonlinearitySummary: () => {
    throw new Error("internal: regression gave up");
  },
}));
import { runChecks } from "../../../src/core/diagnostics/battery";

function walk(n: number, seed: number): WeeklySeries {
  const rng = new MersenneTwister(seed);
  const start = Date.UTC(2016, 0, 1);
  let x = Math.log(1500);
  const values = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    x += 0.02 * rng.normal();
    values[t] = Math.exp(x + 0.1 * Math.sin((2 * Math.PI * t) / (365.25 / 7)));
  }
  return {
    dates: Array.from({ length: n }, (_v, t) => new Date(start + t * 7 * 86_400_000)),
    values,
    filled: new Array<boolean>(n).fill(false),
    warnings: [],
  };
}

test("an internal failure in one check becomes a plain sentence; the other checks still report", () => {
  const r = runChecks(walk(300, 3));
  expect(r.tables.nonlinearity).toBeUndefined();
  expect(r.skipped).toEqual([
    "Nonlinearity checks not run: they could not be computed for these rates (an internal step failed); the other results are unaffected.",
  ]);
  expect(r.tables.stationarity).toBeDefined();
  expect(r.tables.seasonStrength).toBeDefined();
  expect(r.skipped.join(" ")).not.toMatch(/regression gave up/); // no internal text reaches the sheet
});
