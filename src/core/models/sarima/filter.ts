/**
 * Exact Gaussian likelihood of a stationary ARMA process by the Kalman filter, in O(r) work
 * per observation for r = max(p, q + 1) states.
 *
 * State space (Harvey, 1989, §3.3.1): y_t = α_{1,t}; α_{t+1} = T α_t + R ε_t with T the
 * companion matrix (first column φ₁..φ_r, ones on the superdiagonal) and R = (1, θ₁..θ_{r−1})ᵀ.
 * A seasonal model of weekly data has r ≈ 53–110, so a dense filter (O(r²) to O(r³) a week)
 * is what must be avoided. Two facts make it linear in r:
 *  1. T·v is a shift plus φ·v₁: O(r) with no matrix product, fused with the gain update so
 *     each week makes one pass over the state.
 *  2. The Chandrasekhar recursions (Morf, Sidhu & Kailath, 1974; for likelihoods, Herbst,
 *     2015) propagate ΔP_t = P_{t+1} − P_t = W_t M_t W_tᵀ instead of P_t. With the stationary
 *     start P₀ = TP₀Tᵀ + RRᵀ, ΔP₀ = −G₀G₀ᵀ/F₀ has rank one, and for scalar observations
 *       F_{t+1} = F_t + M_t u²,           u = W_{t,1}
 *       G_{t+1} = G_t + M_t u · T W_t,     (G_t = T P_t e₁, the unscaled gain)
 *       W_{t+1} = T W_t − G_{t+1} u / F_{t+1},
 *       M_{t+1} = M_t + M_t² u² / F_t  (= M_t F_{t+1}/F_t).
 *     Once M‖W‖² is negligible the gain has reached its steady state and only the O(r)
 *     state recursion a_{t+1} = T a_t + G_t v_t / F_t remains.
 * Regressors are filtered beside the data with the same gains (the gains do not depend on
 * the observations), so GLS estimates of regression coefficients come from the same pass
 * (Kohn & Ansley, 1985; Harvey, 1989, §3.4.2).
 * Innovation variances are in units of σ² (R scaled to Var ε = 1); σ² is concentrated out.
 */
import { symmetricInverse } from "../../math/symmetric";
import { stationaryCovariance, stationaryFirstColumn } from "./acvf";

export interface FilterOutput {
  /** Observations filtered. */
  n: number;
  /** Columns filtered: 0 = data, then the regressors. */
  columns: number;
  /** F_t, innovation variance in units of σ². */
  F: Float64Array;
  /** Innovations, row-major n × columns: innovations[t·columns + c] is the one-step error of column c. */
  innovations: Float64Array;
  /** Predicted states a_{n+1|n}, row-major columns × r. */
  finalState: Float64Array;
  /** State dimension r. */
  r: number;
  sumLogF: number;
  /** Index at which the gain had reached its steady state (n when it never did). */
  steadyFrom: number;
  /** P_{n+1|n} (r × r, σ² units), when asked for: P₀ + Σ_t W_t M_t W_tᵀ. */
  finalCovariance?: Float64Array;
}

/** Relative size of ΔP below which the gain is treated as converged. */
const STEADY_TOL = 1e-15;

/** Columns side by side, row-major n × columns, the layout the filter reads. */
export function interleave(columns: Float64Array[]): Float64Array {
  const nc = columns.length;
  const n = nc ? columns[0].length : 0;
  const out = new Float64Array(n * nc);
  for (let c = 0; c < nc; c++) {
    const col = columns[c];
    for (let t = 0; t < n; t++) out[t * nc + c] = col[t];
  }
  return out;
}

/**
 * Run the filter over `data` (row-major n × nc: the data column, then regressors) for the
 * ARMA with right-hand-side AR coefficients `ar` and MA coefficients `ma` (expanded
 * polynomials, see polynomial.ts).
 */
export function armaFilter(
  ar: Float64Array,
  ma: Float64Array,
  data: Float64Array,
  nc: number,
  trackCovariance = false,
): FilterOutput {
  const p = ar.length;
  const q = ma.length;
  const r = Math.max(p, q + 1);
  const n = nc > 0 ? data.length / nc : 0;
  const phi = new Float64Array(r);
  phi.set(ar);

  const c0 = stationaryFirstColumn(ar, ma, r);
  // G₀ = T·c0.
  const G = new Float64Array(r);
  for (let i = 0; i < r - 1; i++) G[i] = c0[i + 1];
  G[r - 1] = 0;
  for (let i = 0; i < r; i++) G[i] += phi[i] * c0[0];
  let F = c0[0];
  const W = Float64Array.from(G);
  let M = -1 / F;
  // Only for forecasts: the O(r²)-a-week sum of the rank-one covariance changes.
  const Pn = trackCovariance ? stationaryCovariance(ar, ma, r) : undefined;

  // states[c·r + i]: predicted state i of column c.
  const states = new Float64Array(nc * r);
  const innovations = new Float64Array(n * nc);
  const Fs = new Float64Array(n);
  let sumLogF = 0;
  let steady = false;
  let steadyFrom = n;

  for (let t = 0; t < n; t++) {
    Fs[t] = F;
    sumLogF += Math.log(F);
    const invF = 1 / F;
    const row = t * nc;
    for (let c = 0; c < nc; c++) {
      // a ← T a + G v/F in one pass: (T a)ᵢ = a_{i+1} + φᵢ a₀ (φ zero-padded to r).
      const o = c * r;
      const a0 = states[o];
      const v = data[row + c] - a0;
      innovations[row + c] = v;
      const kv = v * invF;
      for (let i = 0; i < r - 1; i++) states[o + i] = states[o + i + 1] + phi[i] * a0 + G[i] * kv;
      states[o + r - 1] = phi[r - 1] * a0 + G[r - 1] * kv;
    }
    if (steady) continue;
    if (Pn) {
      for (let i = 0; i < r; i++) {
        const mi = M * W[i];
        if (mi === 0) continue;
        for (let j = 0; j < r; j++) Pn[i * r + j] += mi * W[j];
      }
    }
    // Chandrasekhar step, fused into one pass over the state: TW, then G += M u·TW, W = TW − G u/F_{t+1}.
    const u = W[0];
    const Mu = M * u;
    const Fn = F + Mu * u;
    const s = u / Fn;
    let wmax = 0;
    for (let i = 0; i < r; i++) {
      const tw = (i + 1 < r ? W[i + 1] : 0) + phi[i] * u;
      const g = G[i] + Mu * tw;
      G[i] = g;
      const wi = tw - g * s;
      W[i] = wi;
      const aw = wi < 0 ? -wi : wi;
      if (aw > wmax) wmax = aw;
    }
    M = (M * Fn) / F;
    F = Fn;
    if (Math.abs(M) * wmax * wmax < STEADY_TOL * F) {
      steady = true;
      steadyFrom = t + 1;
    }
  }
  return { n, columns: nc, F: Fs, innovations, finalState: states, r, sumLogF, steadyFrom, finalCovariance: Pn };
}

export interface GlsLikelihood {
  /** Concentrated log-likelihood at σ̂² and β̂. */
  logLik: number;
  sigma2: number;
  beta: Float64Array;
  /** (Σ V Vᵀ/F)⁻¹, so Cov(β̂) = σ̂²·this. Empty without regressors. */
  betaPrecisionInverse: Float64Array;
  /** Σ v²/F of the regression-adjusted innovations. */
  ssr: number;
}

/**
 * Concentrated likelihood from a filter pass: with innovations v (data) and V (regressors),
 * S(β) = Σ (v_t − V_tβ)²/F_t is minimised by β̂ = (ΣVVᵀ/F)⁻¹ΣVv/F, σ̂² = S(β̂)/n and
 *   ℓ = −n/2·(log 2πσ̂² + 1) − ½ Σ log F_t.
 * `fixedBeta` evaluates S at given coefficients instead (no GLS step).
 */
export function glsLikelihood(out: FilterOutput, fixedBeta?: ArrayLike<number>): GlsLikelihood {
  const n = out.n;
  const nc = out.columns;
  const k = nc - 1;
  const V = out.innovations;
  const F = out.F;
  let beta: Float64Array = new Float64Array(k);
  let inv: Float64Array = new Float64Array(0);
  if (k > 0 && !fixedBeta) {
    // Upper triangle of Σ V Vᵀ/F (with the data column first) in one pass.
    const S = new Float64Array(nc * nc);
    for (let t = 0; t < n; t++) {
      const w = 1 / F[t];
      const row = t * nc;
      for (let i = 0; i < nc; i++) {
        const xi = V[row + i] * w;
        if (xi === 0) continue;
        const o = i * nc;
        for (let j = i; j < nc; j++) S[o + j] += xi * V[row + j];
      }
    }
    const A = new Float64Array(k * k);
    const b = new Float64Array(k);
    for (let i = 0; i < k; i++) {
      b[i] = S[i + 1];
      for (let j = i; j < k; j++) {
        A[i * k + j] = S[(i + 1) * nc + j + 1];
        A[j * k + i] = A[i * k + j];
      }
    }
    try {
      inv = symmetricInverse(A, k);
    } catch {
      throw new RangeError("the regressors are collinear after differencing");
    }
    for (let i = 0; i < k; i++) {
      let s = 0;
      for (let j = 0; j < k; j++) s += inv[i * k + j] * b[j];
      beta[i] = s;
    }
  } else if (fixedBeta) {
    beta = Float64Array.from(fixedBeta);
  }
  let ssr = 0;
  for (let t = 0; t < n; t++) {
    const row = t * nc;
    let e = V[row];
    for (let i = 0; i < k; i++) e -= beta[i] * V[row + i + 1];
    ssr += (e * e) / F[t];
  }
  const sigma2 = ssr / n;
  const logLik = -0.5 * n * (Math.log(2 * Math.PI * sigma2) + 1) - 0.5 * out.sumLogF;
  return { logLik, sigma2, beta, betaPrecisionInverse: inv, ssr };
}

/** Regression-adjusted innovation of week t: v_t − V_tᵀβ. */
export function adjustedInnovation(out: FilterOutput, beta: ArrayLike<number>, t: number): number {
  const nc = out.columns;
  const row = t * nc;
  let e = out.innovations[row];
  for (let i = 0; i < nc - 1; i++) e -= beta[i] * out.innovations[row + i + 1];
  return e;
}

/** Log-likelihood at a given σ² (not concentrated), for comparison with references that report it. */
export function logLikAtSigma2(out: FilterOutput, ssr: number, sigma2: number): number {
  return -0.5 * out.n * Math.log(2 * Math.PI * sigma2) - 0.5 * out.sumLogF - (0.5 * ssr) / sigma2;
}

