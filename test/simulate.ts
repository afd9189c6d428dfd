/** Seeded processes with known truth, shared by tests. */
import { MersenneTwister } from "../src/core/math/rng";

/** A seeded Gaussian random walk of n weeks around `start` (a true unit root). */
export function randomWalk(seed: number, n: number, start = 100): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let x = 0;
  for (let t = 0; t < n; t++) {
    x += rng.normal();
    y[t] = start + x;
  }
  return y;
}
