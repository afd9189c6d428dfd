/**
 * The NNAR ensemble: `repeats` networks of one shape trained by BFGS from their own starting
 * weights, averaged. Everything below works on the scaled transformed series z.
 *
 * Forecasts are recursive (FPP, "Neural network autoregression"): the ensemble's one-step
 * output is fed back as the lag-1 input of the next step, and so on. Sample paths add at each
 * step an error drawn with replacement from the centred in-sample one-step residuals, and the
 * simulated value, error included, is what is fed back.
 */
import { bfgs } from "../../math/optimise/bfgs";
import { MersenneTwister, Rng } from "../../math/rng";
import { NetShape, TrainingData, initialWeights, penalisedObjective, predictOne, weightCount } from "./network";

/** Module binding: a global Math lookup in the path loop costs measurably under jest. */
const exp = Math.exp;

/** Converged when the gradient's max-norm is below this; E is a sum over hundreds of weeks of z² ≈ 1. */
const GRADIENT_TOLERANCE = 1e-5;

export interface TrainingRecord {
  /** Networks whose BFGS stopped on a convergence test (the rest reached maxIter). */
  converged: number;
  /** Networks whose optimiser could not move from its start (kept as they were). */
  stuck: number;
  /** Penalised objective of each network at its final weights. */
  objective: Float64Array;
}

export interface Ensemble {
  shape: NetShape;
  lags: number[];
  maxLag: number;
  repeats: number;
  /** Weights of network r at [r·W, (r+1)·W), W = weightCount(shape). */
  weights: Float64Array;
}

/**
 * Seeds derived from the model seed: the first draw seeds forecast()'s interval paths, the next
 * `repeats` seed each network's starting weights. Network r's start therefore does not depend on
 * how many networks there are, so a larger ensemble extends a smaller one.
 */
export function derivedSeeds(seed: number, repeats: number): { forecast: number; networks: number[] } {
  const master = new MersenneTwister(seed);
  const forecast = master.nextUint32();
  const networks: number[] = [];
  for (let r = 0; r < repeats; r++) networks.push(master.nextUint32());
  return { forecast, networks };
}

export function startingWeights(shape: NetShape, networkSeeds: number[]): Float64Array {
  const W = weightCount(shape);
  const out = new Float64Array(W * networkSeeds.length);
  networkSeeds.forEach((s, r) => out.set(initialWeights(shape, new MersenneTwister(s)), r * W));
  return out;
}

/** Trains every network from its start (fresh or warm) on the same rows. */
export function train(
  data: TrainingData,
  shape: NetShape,
  decay: number,
  starts: Float64Array,
  repeats: number,
  maxIter: number,
): { weights: Float64Array; record: TrainingRecord } {
  const W = weightCount(shape);
  const obj = penalisedObjective(data, shape, decay);
  const weights = new Float64Array(W * repeats);
  const objective = new Float64Array(repeats);
  let converged = 0;
  let stuck = 0;
  for (let r = 0; r < repeats; r++) {
    const x0 = starts.subarray(r * W, (r + 1) * W);
    const res = bfgs(obj.value, x0, { gradient: obj.gradient, maxIter, gTol: GRADIENT_TOLERANCE });
    if (Number.isFinite(res.f) && res.x.every(Number.isFinite)) {
      weights.set(res.x, r * W);
      objective[r] = res.f;
      if (res.converged) converged++;
    } else {
      weights.set(x0, r * W);
      objective[r] = obj.value(x0);
      stuck++;
    }
  }
  return { weights, record: { converged, stuck, objective } };
}

/** Mean output of the networks at the input vector x[xOff..xOff+I). */
export function ensembleAt(e: Ensemble, x: Float64Array, xOff: number): number {
  const W = weightCount(e.shape);
  let s = 0;
  for (let r = 0; r < e.repeats; r++) s += predictOne(e.weights, r * W, e.shape, x, xOff);
  return s / e.repeats;
}

/** One-step in-sample ensemble outputs for the rows of the design. */
export function ensembleFitted(e: Ensemble, data: TrainingData): Float64Array {
  const out = new Float64Array(data.rows);
  for (let r = 0; r < data.rows; r++) out[r] = ensembleAt(e, data.x, r * data.inputs);
  return out;
}

/**
 * Runs the recursion h steps past the end of z. history holds the last maxLag values of z
 * followed by room for h more; step s writes history[maxLag + s]. `noise` gives the error
 * added at each step (0 for the point forecast). `input` is scratch of length lags.length.
 */
function recurse(e: Ensemble, history: Float64Array, h: number, input: Float64Array, noise: () => number): void {
  const L = e.lags.length;
  const m = e.maxLag;
  for (let s = 0; s < h; s++) {
    for (let i = 0; i < L; i++) input[i] = history[m + s - e.lags[i]];
    history[m + s] = ensembleAt(e, input, 0) + noise();
  }
}

function seededHistory(e: Ensemble, z: Float64Array, h: number): Float64Array {
  const history = new Float64Array(e.maxLag + h);
  history.set(z.subarray(z.length - e.maxLag));
  return history;
}

/** Recursive mean forecast on the z scale, steps 1..h. */
export function pointPath(e: Ensemble, z: Float64Array, h: number): Float64Array {
  const history = seededHistory(e, z, h);
  recurse(e, history, h, new Float64Array(e.lags.length), () => 0);
  return history.slice(e.maxLag);
}

/**
 * `paths` bootstrap sample paths on the z scale. errors are the centred in-sample residuals
 * on the z scale; each step draws one with rng.integer, path by path.
 *
 * At step s only the inputs whose lag is at most s differ between paths (they read simulated
 * weeks); the rest read observed weeks, the same for every path. Their share of each hidden
 * unit's pre-activation is therefore computed once per step, network and unit, and a path adds
 * only its own few terms: with lags 1..p and 52, step 1 needs no input sum at all per path, and
 * step s a sum over s − 1 inputs instead of p + 1.
 */
export function samplePaths(e: Ensemble, z: Float64Array, h: number, paths: number, errors: Float64Array, rng: Rng): Float64Array[] {
  const m = errors.length;
  const { lags, maxLag: M, repeats: R, weights: w } = e;
  const L = lags.length;
  const k = e.shape.hidden;
  const stride = e.shape.inputs + 1;
  const W = weightCount(e.shape);
  const history = seededHistory(e, z, h);
  const varying = new Int32Array(h);
  const common = new Float64Array(h * R * k);
  for (let s = 0; s < h; s++) {
    let V = 0;
    while (V < L && lags[V] <= s) V++;
    varying[s] = V;
    for (let r = 0; r < R; r++) {
      for (let j = 0; j < k; j++) {
        const base = r * W + j * stride;
        let a = w[base];
        for (let i = V; i < L; i++) a += w[base + 1 + i] * history[M + s - lags[i]];
        common[(s * R + r) * k + j] = a;
      }
    }
  }
  // Steps with no simulated input (step 1, and more when the smallest lag exceeds 1) have the
  // same network output on every path: computed once.
  const shared = new Float64Array(h).fill(NaN);
  const out: Float64Array[] = [];
  for (let p = 0; p < paths; p++) {
    const sim = new Float64Array(h);
    for (let s = 0; s < h; s++) {
      const V = varying[s];
      if (V === 0 && !Number.isNaN(shared[s])) {
        sim[s] = shared[s] + errors[rng.integer(m)];
        continue;
      }
      let total = 0;
      for (let r = 0; r < R; r++) {
        const o = r * W + k * stride;
        let y = w[o];
        const c0 = (s * R + r) * k;
        for (let j = 0; j < k; j++) {
          const base = r * W + j * stride;
          let a = common[c0 + j];
          for (let i = 0; i < V; i++) a += w[base + 1 + i] * sim[s - lags[i]];
          y += w[o + 1 + j] / (1 + exp(-a));
        }
        total += y;
      }
      if (V === 0) shared[s] = total / R;
      sim[s] = total / R + errors[rng.integer(m)];
    }
    out.push(sim);
  }
  return out;
}
