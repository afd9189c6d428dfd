/**
 * One network's penalised objective and its analytic gradient (src/core/models/nnar/network.ts).
 * Checks: (1) the objective against a plain re-implementation of the network equations written
 * here from FPP's description (logistic hidden layer, linear output, biases), (2) the analytic
 * gradient against central finite differences, the standard outside check of back-propagation.
 */
import { MersenneTwister } from "../../../../src/core/math/rng";
import {
  NetShape,
  TrainingData,
  penalisedObjective,
  penaltyMask,
  predictOne,
  weightCount,
} from "../../../../src/core/models/nnar/network";

function randomData(rows: number, inputs: number, seed: number): TrainingData {
  const rng = new MersenneTwister(seed);
  const x = new Float64Array(rows * inputs);
  for (let i = 0; i < x.length; i++) x[i] = rng.normal();
  const target = new Float64Array(rows);
  for (let r = 0; r < rows; r++) target[r] = Math.tanh(x[r * inputs]) + 0.3 * rng.normal();
  return { x, target, rows, inputs };
}

function randomWeights(s: NetShape, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  return Float64Array.from({ length: weightCount(s) }, () => 2 * rng.uniform() - 1);
}

/** The network as nested arrays, straight from the equations (no flat layout, no buffers). */
function naiveObjective(d: TrainingData, s: NetShape, w: Float64Array, decay: number): number {
  const I = s.inputs;
  const hidden: { bias: number; weights: number[] }[] = [];
  for (let j = 0; j < s.hidden; j++) {
    const base = j * (I + 1);
    hidden.push({ bias: w[base], weights: Array.from(w.subarray(base + 1, base + 1 + I)) });
  }
  const o = s.hidden * (I + 1);
  const outBias = w[o];
  const outWeights = Array.from(w.subarray(o + 1, o + 1 + s.hidden));
  let sse = 0;
  for (let r = 0; r < d.rows; r++) {
    const input = Array.from(d.x.subarray(r * I, (r + 1) * I));
    const h = hidden.map((u) => 1 / (1 + Math.exp(-(u.bias + u.weights.reduce((a, wi, i) => a + wi * input[i], 0)))));
    const yHat = outBias + outWeights.reduce((a, v, j) => a + v * h[j], 0);
    sse += (yHat - d.target[r]) ** 2;
  }
  const sq = (a: number[]): number => a.reduce((t, v) => t + v * v, 0);
  const penalty = hidden.reduce((t, u) => t + sq(u.weights), 0) + sq(outWeights);
  return sse + decay * penalty;
}

describe("NNAR network objective", () => {
  const shape: NetShape = { inputs: 3, hidden: 4 };
  const data = randomData(60, 3, 11);
  const decay = 0.05;

  test("matches the network equations written out directly, biases unpenalised", () => {
    const w = randomWeights(shape, 5);
    const obj = penalisedObjective(data, shape, decay);
    // Same operations in a different order: agreement to rounding (1e-12 relative).
    expect(obj.value(w)).toBeCloseTo(naiveObjective(data, shape, w, decay), 10);
    expect(Array.from(penaltyMask(shape))).toEqual([0, 1, 1, 1, 0, 1, 1, 1, 0, 1, 1, 1, 0, 1, 1, 1, 0, 1, 1, 1, 1]);
    let sse = 0;
    for (let r = 0; r < data.rows; r++) sse += (predictOne(w, 0, shape, data.x, r * 3) - data.target[r]) ** 2;
    expect(penalisedObjective(data, shape, 0).value(w)).toBeCloseTo(sse, 10);
  });

  test("analytic gradient equals central finite differences (relative 1e-6) at random weights", () => {
    // Outside check: central differences (f(w + h e_i) − f(w − h e_i)) / 2h, h = 1e-5. The
    // truncation error is O(h²·f''') ≈ 1e-9 and rounding ≈ ε·f/h ≈ 1e-9 for f ≈ 50, both well
    // under 1e-6 of the entries' size.
    for (const seed of [1, 2, 3]) {
      const w = randomWeights(shape, seed);
      const obj = penalisedObjective(data, shape, decay);
      obj.value(new Float64Array(w.length)); // the cached forward pass is at other weights
      const g = Float64Array.from(obj.gradient(w));
      const h = 1e-5;
      const t = Float64Array.from(w);
      for (let i = 0; i < w.length; i++) {
        t[i] = w[i] + h;
        const fp = obj.value(t);
        t[i] = w[i] - h;
        const fm = obj.value(t);
        t[i] = w[i];
        const fd = (fp - fm) / (2 * h);
        expect(Math.abs(g[i] - fd)).toBeLessThanOrEqual(1e-6 * Math.max(1, Math.abs(g[i])));
      }
    }
  });

  test("the decay adds 2·decay·w on connection weights only", () => {
    const w = randomWeights(shape, 9);
    const g0 = Float64Array.from(penalisedObjective(data, shape, 0).gradient(w));
    const g1 = Float64Array.from(penalisedObjective(data, shape, decay).gradient(w));
    const mask = penaltyMask(shape);
    for (let i = 0; i < w.length; i++) expect(g1[i] - g0[i]).toBeCloseTo(mask[i] * 2 * decay * w[i], 12);
  });
});
