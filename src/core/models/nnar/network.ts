/**
 * One feed-forward network of the NNAR model (Hyndman & Athanasopoulos, Forecasting:
 * Principles and Practice, "Neural network models"): I inputs, one hidden layer of k logistic
 * units, one linear output, biases on every unit.
 *
 *   h_j = σ(b_j + Σ_i w_ji x_i),  σ(a) = 1/(1 + e^{−a}),   ŷ = c + Σ_j v_j h_j.
 *
 * Weights live in one flat vector, hidden units first:
 *   [b_1, w_11..w_1I,  b_2, w_21..w_2I,  …,  b_k, w_k1..w_kI,   c, v_1..v_k]
 * so hidden unit j occupies [j(I+1), (j+1)(I+1)) and the output block starts at O = k(I+1).
 *
 * Training minimises the penalised squared error
 *   E(θ) = Σ_t (ŷ_t − z_t)² + λ_d Σ (non-bias weights)²,
 * a sum (not a mean) over the training weeks, so the decay λ_d acts relative to the sample size
 * as in the usual weight-decay formulation. Biases are not penalised: shrinking a bias towards
 * zero pulls the unit's response towards an arbitrary centre and serves no smoothing purpose.
 *
 * The gradient is the usual back-propagation of ∂E/∂ŷ_t = 2(ŷ_t − z_t):
 *   ∂E/∂c = Σ 2e_t,  ∂E/∂v_j = Σ 2e_t h_tj,  δ_tj = 2e_t v_j h_tj(1 − h_tj),
 *   ∂E/∂b_j = Σ δ_tj, ∂E/∂w_ji = Σ δ_tj x_ti, plus 2λ_d θ on the penalised weights.
 */
import type { Rng } from "../../math/rng";

// A module binding, not a global look-up in the hot loops (a global costs more in sandboxed runners such as jest's vm).
const exp = Math.exp;

export interface NetShape {
  inputs: number;
  hidden: number;
}

/** Training rows: x is row-major (rows × inputs), target the matching z_t. */
export interface TrainingData {
  x: Float64Array;
  target: Float64Array;
  rows: number;
  inputs: number;
}

/** Number of weights (biases included) of one network. */
export function weightCount(s: NetShape): number {
  return s.hidden * (s.inputs + 1) + s.hidden + 1;
}

/** 1 where the weight is penalised (a connection weight), 0 for a bias. */
export function penaltyMask(s: NetShape): Uint8Array {
  const mask = new Uint8Array(weightCount(s)).fill(1);
  const stride = s.inputs + 1;
  for (let j = 0; j < s.hidden; j++) mask[j * stride] = 0;
  mask[s.hidden * stride] = 0;
  return mask;
}

/** Starting weights drawn U(−0.5, 0.5): inputs are scaled to unit spread, so every hidden unit starts in the logistic's near-linear range. */
export function initialWeights(s: NetShape, rng: Rng): Float64Array {
  const w = new Float64Array(weightCount(s));
  for (let i = 0; i < w.length; i++) w[i] = rng.uniform() - 0.5;
  return w;
}

/**
 * Output of the network whose weights start at w[off], for the input vector x[xOff..xOff+I).
 */
export function predictOne(w: Float64Array, off: number, s: NetShape, x: Float64Array, xOff: number): number {
  const I = s.inputs;
  const k = s.hidden;
  const stride = I + 1;
  const o = off + k * stride;
  let out = w[o];
  for (let j = 0; j < k; j++) {
    const base = off + j * stride;
    let a = w[base];
    for (let i = 0; i < I; i++) a += w[base + 1 + i] * x[xOff + i];
    out += w[o + 1 + j] / (1 + exp(-a));
  }
  return out;
}

export interface PenalisedObjective {
  value: (w: Float64Array) => number;
  /** Gradient at w; the returned array is reused by the next call (bfgs copies it). */
  gradient: (w: Float64Array) => Float64Array;
}

/**
 * E(θ) and ∇E(θ) over the training rows (module comment). All buffers are allocated here,
 * once; value and gradient allocate nothing. The forward pass of `value` is kept (hidden
 * activations and errors), and `gradient` at the same weights reuses it, which is how the
 * line search calls them.
 */
export function penalisedObjective(data: TrainingData, s: NetShape, decay: number): PenalisedObjective {
  const { x, target, rows } = data;
  const I = s.inputs;
  const k = s.hidden;
  if (data.inputs !== I) throw new Error(`network expects ${I} inputs, the data has ${data.inputs}`);
  const stride = I + 1;
  const O = k * stride;
  const W = weightCount(s);
  const mask = penaltyMask(s);
  const H = new Float64Array(rows * k);
  const E = new Float64Array(rows);
  const G = new Float64Array(W);
  const lastW = new Float64Array(W);
  let cached = false;

  const value = (w: Float64Array): number => {
    let sse = 0;
    for (let r = 0; r < rows; r++) {
      const xo = r * I;
      const ho = r * k;
      let out = w[O];
      for (let j = 0; j < k; j++) {
        const base = j * stride;
        let a = w[base];
        for (let i = 0; i < I; i++) a += w[base + 1 + i] * x[xo + i];
        const h = 1 / (1 + exp(-a));
        H[ho + j] = h;
        out += w[O + 1 + j] * h;
      }
      const e = out - target[r];
      E[r] = e;
      sse += e * e;
    }
    let pen = 0;
    for (let i = 0; i < W; i++) if (mask[i] === 1) pen += w[i] * w[i];
    lastW.set(w);
    cached = true;
    return sse + decay * pen;
  };

  const sameAsLast = (w: Float64Array): boolean => {
    if (!cached) return false;
    for (let i = 0; i < W; i++) if (w[i] !== lastW[i]) return false;
    return true;
  };

  const gradient = (w: Float64Array): Float64Array => {
    if (!sameAsLast(w)) value(w);
    G.fill(0);
    for (let r = 0; r < rows; r++) {
      const xo = r * I;
      const ho = r * k;
      const e2 = 2 * E[r];
      G[O] += e2;
      for (let j = 0; j < k; j++) {
        const h = H[ho + j];
        G[O + 1 + j] += e2 * h;
        const d = e2 * w[O + 1 + j] * h * (1 - h);
        const base = j * stride;
        G[base] += d;
        for (let i = 0; i < I; i++) G[base + 1 + i] += d * x[xo + i];
      }
    }
    for (let i = 0; i < W; i++) if (mask[i] === 1) G[i] += 2 * decay * w[i];
    return G;
  };

  return { value, gradient };
}
