/** Synthetic weekly rates for the benchmarks: a log-random-walk level, a yearly cycle of period 365.25/7 and noise. */
import { MersenneTwister } from "../src/core/math/rng";

export function syntheticRates(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let level = 1500;
  for (let t = 0; t < n; t++) {
    level *= Math.exp(0.004 * rng.normal());
    y[t] = level * (1 + 0.08 * Math.sin((2 * Math.PI * t) / (365.25 / 7))) * Math.exp(0.02 * rng.normal());
  }
  return y;
}
