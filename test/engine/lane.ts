/**
 * An invented weekly lane for the engine tests: "Halden–Corvane FEU", week-ending Fridays from
 * 2017-01-06, read through the real intake (readWeekly) from ISO date text, as a sheet gives it.
 * Level drift, a yearly cycle of period 365.25/7 and a seeded disturbance.
 */
import { MersenneTwister } from "../../src/core/math/rng";
import { readWeekly } from "../../src/core/series/intake";
import type { WeeklySeries } from "../../src/core/series/types";

export function laneSeries(n: number, seed = 7): WeeklySeries {
  const rng = new MersenneTwister(seed);
  const values: unknown[][] = [["Halden–Corvane FEU"]];
  const dates: unknown[][] = [["Week ending"]];
  const start = Date.UTC(2017, 0, 6);
  let level = 1800;
  for (let t = 0; t < n; t++) {
    level *= Math.exp(0.01 * rng.normal());
    values.push([Math.round(100 * level * (1 + 0.1 * Math.sin((2 * Math.PI * t) / (365.25 / 7)))) / 100]);
    dates.push([new Date(start + t * 7 * 86_400_000).toISOString().slice(0, 10)]);
  }
  return readWeekly(values, { dates });
}
