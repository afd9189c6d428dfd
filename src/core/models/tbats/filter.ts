/**
 * The TBATS innovations filter and the seed-state regression, in O(state size) per week.
 *
 * Innovations form (De Livera et al., 2011, §3): x_t = F x_{t−1} + g ε_t, z_t = wᵀx_{t−1} + ε_t.
 * F is never formed: one step applies the level/trend update, one 2×2 rotation per harmonic and
 * the ARMA shift registers in place (structure.ts has the equations).
 *
 * Seed states (§4.1 of the paper): the one-step errors are linear in the seed x_0,
 *   ε_t(x_0) = ε_t(x_ref) − r_tᵀ (x_0 − x_ref),  r_1 = w,  r_{t+1}ᵀ = r_tᵀ D,  D = F − g wᵀ,
 * so x_0 is the least-squares regression of the errors of one filter pass from a reference seed
 * on the rows r_t. ARMA states are seeded at zero (their stationary mean), so only the first
 * `seedCount` columns enter. rᵀD is applied in O(state size) too: in D the ARMA terms of the level,
 * trend and seasonal rows cancel (F's rows carry α φ_k etc., and g wᵀ subtracts the same), which
 * leaves, with Γ = rᵀg,
 *   (rᵀD)_ℓ = r_ℓ − Γ,   (rᵀD)_b = φ(r_ℓ + r_b − Γ),
 *   (rᵀD)_{s_j} = r_{s_j} cos ω_j − r_{s*_j} sin ω_j − Γ,   (rᵀD)_{s*_j} = r_{s_j} sin ω_j + r_{s*_j} cos ω_j,
 *   (rᵀD)_{d_k} = r_{d_{k+1}} − φ_k r_{ε_1},   (rᵀD)_{ε_k} = r_{ε_{k+1}} − θ_k r_{ε_1}.
 * (Derived here from the model equations; a test checks it against the dense D.)
 *
 * Calendar regressors on the transformed scale, z_t = wᵀx_{t−1} + βᵀu_t + ε_t (the state is
 * driven by ε_t, so z − Uβ follows the TBATS model): the filter is linear in its input, so
 *   ε_t(x_0, β) = ε_t(x_ref, 0) − r_tᵀ(x_0 − x_ref) − Σ_j β_j c_{j,t},
 * where c_j is the filter's error sequence for input u_j from a zero state. That filter is time
 * invariant (x_t = D x_{t−1} + g u_t, c_t = u_t − wᵀx_{t−1}), so c_j is u_j convolved with one
 * impulse response h (h_0 = 1, h_i = −wᵀD^{i−1}g), computed once per parameter point; calendar
 * columns are sparse 0/1, so the convolution costs a few holidays × n, far below one more
 * filter pass per column (a dense column is filtered directly instead). β joins the seed in
 * the same least squares.
 *
 * The regression is solved from normal equations accumulated in the same pass, and the sum of
 * squares evaluated as the quadratic form at the solution, which is second-order insensitive to
 * the solve's rounding. The reference seed is the mean of the first season, so the errors of
 * the reference pass stay on the scale of the data's variation rather than its level.
 */
import type { StateLayout, TbatsParameters } from "./structure";

/** Per-harmonic smoothing weights γ1, γ2 (expanded from the per-period values). */
function harmonicGammas(L: StateLayout, par: TbatsParameters, g1: Float64Array, g2: Float64Array): void {
  for (let h = 0; h < L.harmonicCount; h++) {
    g1[h] = par.gamma1[L.periodOf[h]];
    g2[h] = par.gamma2[L.periodOf[h]];
  }
}

/** wᵀx: the one-step prediction from state x. */
export function predictFrom(L: StateLayout, par: TbatsParameters, x: Float64Array): number {
  let pred = x[0];
  if (L.trend > 0) pred += par.phi * x[1];
  for (let h = 0; h < L.harmonicCount; h++) pred += x[L.sIndex[h]];
  return pred + armaPart(L, par, x);
}

function armaPart(L: StateLayout, par: TbatsParameters, x: Float64Array): number {
  let a = 0;
  for (let k = 0; k < par.ar.length; k++) a += par.ar[k] * x[L.arStart + k];
  for (let k = 0; k < par.ma.length; k++) a += par.ma[k] * x[L.maStart + k];
  return a;
}

/**
 * x ← F x + g ε in place: the transition with innovation ε. Used for forecasting, simulation
 * and variance weights (the filter's hot loop inlines the same arithmetic).
 */
export function advance(L: StateLayout, par: TbatsParameters, x: Float64Array, eps: number): void {
  const d = armaPart(L, par, x) + eps;
  const l = x[0];
  const b = L.trend > 0 ? x[1] : 0;
  x[0] = l + par.phi * b + par.alpha * d;
  if (L.trend > 0) x[1] = par.phi * b + par.beta * d;
  for (let h = 0; h < L.harmonicCount; h++) {
    const i = L.sIndex[h];
    const j = L.sStarIndex[h];
    const s = x[i];
    const ss = x[j];
    const p = L.periodOf[h];
    x[i] = L.cos[h] * s + L.sin[h] * ss + par.gamma1[p] * d;
    x[j] = -L.sin[h] * s + L.cos[h] * ss + par.gamma2[p] * d;
  }
  shiftIn(x, L.arStart, par.ar.length, d);
  shiftIn(x, L.maStart, par.ma.length, eps);
}

function shiftIn(x: Float64Array, start: number, len: number, v: number): void {
  if (len === 0) return;
  for (let k = len - 1; k > 0; k--) x[start + k] = x[start + k - 1];
  x[start] = v;
}

/** The reference seed: level = mean of the first min(n, ⌈m⌉) values, everything else 0. */
export function referenceSeed(L: StateLayout, z: Float64Array, firstPeriod: number): Float64Array {
  const x = new Float64Array(L.size);
  const m = Math.max(1, Math.min(z.length, Math.ceil(firstPeriod)));
  let s = 0;
  for (let t = 0; t < m; t++) s += z[t];
  x[0] = s / m;
  return x;
}

/**
 * Reusable workspace for one structure: evaluates the seed-concentrated sum of squared one-step
 * errors for any parameters, without allocating.
 */
export class SeedRegression {
  readonly seed: Float64Array;
  /** Regressor coefficients β at the least-squares solution (length regressorCount). */
  readonly coef: Float64Array;
  /** Columns in the regression: seed states, then regressors. */
  private readonly K: number;
  /** Each regressor column's nonzero weeks (null for a dense column, filtered directly). */
  private pulses: (Int32Array | null)[] | null = null;
  private pulsesFor: Float64Array | null = null;
  private impulse = new Float64Array(0);
  private readonly x: Float64Array;
  private readonly r: Float64Array;
  private readonly A: Float64Array;
  private readonly rhs: Float64Array;
  private readonly g1: Float64Array;
  private readonly g2: Float64Array;
  private readonly factor: Float64Array;
  private readonly scale: Float64Array;
  private readonly delta: Float64Array;
  /** Regression rows by column (k × n) and the reference pass's errors; grown on demand. */
  private R = new Float64Array(0);
  private E = new Float64Array(0);

  /**
   * `regressorCount` columns of calendar regressors join the seed in the regression; `sse` then
   * takes them as a k × n array by column.
   */
  constructor(
    readonly L: StateLayout,
    readonly regressorCount = 0,
  ) {
    const k = L.seedCount + regressorCount;
    this.K = k;
    this.coef = new Float64Array(regressorCount);
    this.seed = new Float64Array(L.size);
    this.x = new Float64Array(L.size);
    this.r = new Float64Array(L.size);
    this.A = new Float64Array(k * k);
    this.rhs = new Float64Array(k);
    this.g1 = new Float64Array(L.harmonicCount);
    this.g2 = new Float64Array(L.harmonicCount);
    this.factor = new Float64Array(k * k);
    this.scale = new Float64Array(k);
    this.delta = new Float64Array(k);
  }

  /**
   * Sum of squared one-step errors at the least-squares seed, which is left in `this.seed`.
   * `ref` is the reference seed (referenceSeed); `U` the regressors by column (regressorCount × n),
   * with β left in `this.coef`. Returns NaN if the normal equations are singular.
   */
  sse(z: Float64Array, par: TbatsParameters, ref: Float64Array, U?: Float64Array): number {
    const L = this.L;
    const { x, r, A, rhs, g1, g2 } = this;
    const k = L.seedCount;
    const K = this.K;
    const m = this.regressorCount;
    if (m > 0 && (!U || U.length !== m * z.length)) throw new Error(`SeedRegression: expected ${m} regressor columns of ${z.length} weeks`);
    const H = L.harmonicCount;
    const sIdx = L.sIndex;
    const sStar = L.sStarIndex;
    const cs = L.cos;
    const sn = L.sin;
    const hasTrend = L.trend > 0;
    const { alpha, beta, phi, ar, ma } = par;
    const p = ar.length;
    const q = ma.length;
    const a0 = L.arStart;
    const m0 = L.maStart;
    harmonicGammas(L, par, g1, g2);
    x.set(ref);
    r.fill(0);
    // r_1 = w.
    r[0] = 1;
    if (hasTrend) r[1] = phi;
    for (let h = 0; h < H; h++) r[sIdx[h]] = 1;
    for (let j = 0; j < p; j++) r[a0 + j] = ar[j];
    for (let j = 0; j < q; j++) r[m0 + j] = ma[j];
    const n = z.length;
    if (this.R.length < K * n || this.E.length !== n) {
      this.R = new Float64Array(K * n);
      this.E = new Float64Array(n);
    }
    const R = this.R;
    const E = this.E;
    // The errors of one filter pass from the reference seed, then the regression rows, which
    // do not depend on the states: r_1 = w, r_{t+1}ᵀ = r_tᵀ D (module comment).
    errorsOfInput(L, par, g1, g2, z, n, x, E);
    for (let t = 0; t < n; t++) {
      for (let i = 0; i < k; i++) R[i * n + t] = r[i];
      const rl = r[0];
      const rb = hasTrend ? r[1] : 0;
      const re1 = q > 0 ? r[m0] : 0;
      let G = rl * alpha + rb * beta + (p > 0 ? r[a0] : 0) + re1;
      for (let h = 0; h < H; h++) G += r[sIdx[h]] * g1[h] + r[sStar[h]] * g2[h];
      r[0] = rl - G;
      if (hasTrend) r[1] = phi * (rl + rb - G);
      for (let h = 0; h < H; h++) {
        const i = sIdx[h];
        const j = sStar[h];
        const s = r[i];
        const ss = r[j];
        r[i] = cs[h] * s - sn[h] * ss - G;
        r[j] = sn[h] * s + cs[h] * ss;
      }
      for (let j = 0; j < p; j++) r[a0 + j] = (j + 1 < p ? r[a0 + j + 1] : 0) - ar[j] * re1;
      for (let j = 0; j < q; j++) r[m0 + j] = (j + 1 < q ? r[m0 + j + 1] : 0) - ma[j] * re1;
    }
    if (m > 0) this.regressorColumns(par, U as Float64Array, n, R, k * n);
    // Normal equations of e ≈ r_tᵀδ + c_tᵀβ over the first k states, δ = x_0 − x_ref, and the
    // regressors: column dot products (accumulating in registers is several times faster than
    // a rank-one update of A per week).
    const ee = dot(E, 0, E, 0, n);
    gram(R, E, K, n, A, rhs);
    const delta = this.solve();
    if (delta === null) return NaN;
    // SSE(δ) = eᵀe − 2 δᵀ(Rᵀe) + δᵀ(RᵀR)δ.
    let quad = 0;
    let lin = 0;
    for (let i = 0; i < K; i++) {
      lin += delta[i] * rhs[i];
      let row = A[i * K + i] * delta[i];
      for (let j = i + 1; j < K; j++) row += 2 * A[i * K + j] * delta[j];
      quad += delta[i] * row;
    }
    const seed = this.seed;
    seed.set(ref);
    for (let i = 0; i < k; i++) seed[i] += delta[i];
    for (let j = 0; j < m; j++) this.coef[j] = delta[k + j];
    return Math.max(ee - 2 * lin + quad, 0);
  }

  /**
   * The diagonal of (XᵀX)⁻¹ for the regressor columns at the last solution, X = [r_t, c_t]:
   * times σ², the variances of β̂ given the smoothing parameters.
   */
  coefficientInverseDiagonal(): Float64Array {
    const k = this.L.seedCount;
    const K = this.K;
    const out = new Float64Array(this.regressorCount);
    const { factor: C, scale } = this;
    const y = new Float64Array(K);
    for (let j = 0; j < this.regressorCount; j++) {
      // Solve (S⁻¹CᵀCS⁻¹) x = e_c with c = k + j: x = S (CᵀC)⁻¹ S e_c; only x_c is wanted.
      const c = k + j;
      y.fill(0);
      for (let i = c; i < K; i++) {
        let s = i === c ? 1 : 0;
        for (let l = c; l < i; l++) s -= C[l * K + i] * y[l];
        y[i] = s / C[i * K + i];
      }
      let v = 0;
      for (let i = c; i < K; i++) v += y[i] * y[i];
      out[j] = v * scale[c] * scale[c];
    }
    return out;
  }

  /**
   * Write the regressors' filter errors c_j (module comment) into R from offset `at`, column by
   * column: by convolution with the impulse response over a column's nonzero weeks, or by a
   * direct filter pass for a column with more nonzero weeks than the state has elements.
   */
  private regressorColumns(par: TbatsParameters, U: Float64Array, n: number, R: Float64Array, at: number): void {
    const m = this.regressorCount;
    if (this.pulsesFor !== U) {
      const cap = this.L.size;
      this.pulses = [];
      for (let j = 0; j < m; j++) {
        const idx: number[] = [];
        for (let t = 0; t < n && idx.length <= cap; t++) if (U[j * n + t] !== 0) idx.push(t);
        this.pulses.push(idx.length <= cap ? Int32Array.from(idx) : null);
      }
      this.pulsesFor = U;
    }
    const pulses = this.pulses as (Int32Array | null)[];
    if (pulses.some((p) => p !== null)) {
      if (this.impulse.length !== n) this.impulse = new Float64Array(n);
      this.x.fill(0);
      errorsOfInput(this.L, par, this.g1, this.g2, null, n, this.x, this.impulse);
    }
    const h = this.impulse;
    for (let j = 0; j < m; j++) {
      const o = at + j * n;
      const p = pulses[j];
      if (p === null) {
        this.x.fill(0);
        errorsOfInput(this.L, par, this.g1, this.g2, U.subarray(j * n, (j + 1) * n), n, this.x, R.subarray(o, o + n));
        continue;
      }
      R.fill(0, o, o + n);
      for (let i = 0; i < p.length; i++) {
        const tau = p[i];
        const u = U[j * n + tau];
        for (let t = tau; t < n; t++) R[o + t] += u * h[t - tau];
      }
    }
  }

  /**
   * Solve the accumulated normal equations (upper triangle of A) by Cholesky on a copy
   * equilibrated to unit diagonal; a pivot that is not positive gets a relative ridge of 1e-12
   * (a seed the data barely determine, e.g. a harmonic whose period exceeds the sample). Null
   * when A is not even positive semi-definite to rounding.
   */
  private solve(): Float64Array | null {
    const k = this.K;
    const { A, factor: C, scale, delta: y } = this;
    const b = this.rhs;
    for (let i = 0; i < k; i++) scale[i] = A[i * k + i] > 0 ? 1 / Math.sqrt(A[i * k + i]) : 1;
    for (let i = 0; i < k; i++) for (let j = i; j < k; j++) C[i * k + j] = A[i * k + j] * scale[i] * scale[j];
    const ridge = 1e-12;
    for (let i = 0; i < k; i++) {
      for (let j = i; j < k; j++) {
        let s = C[i * k + j];
        for (let l = 0; l < i; l++) s -= C[l * k + i] * C[l * k + j];
        if (i === j) {
          if (!(s > ridge)) {
            if (!(s > -1e-8)) return null;
            s = ridge + Math.max(s, 0);
          }
          C[i * k + i] = Math.sqrt(s);
        } else {
          C[i * k + j] = s / C[i * k + i];
        }
      }
    }
    for (let i = 0; i < k; i++) {
      let s = b[i] * scale[i];
      for (let l = 0; l < i; l++) s -= C[l * k + i] * y[l];
      y[i] = s / C[i * k + i];
    }
    for (let i = k - 1; i >= 0; i--) {
      let s = y[i];
      for (let l = i + 1; l < k; l++) s -= C[i * k + l] * y[l];
      y[i] = s / C[i * k + i];
    }
    for (let i = 0; i < k; i++) y[i] *= scale[i];
    return y;
  }
}

/**
 * The one-step errors of the filter for input `u` from the state in `x`, x_t = D x_{t−1} + g u_t,
 * c_t = u_t − wᵀx_{t−1}: the series' own pass from the reference seed (SeedRegression.sse), and
 * the regressors' from a zero state; `u` null is the unit pulse at t = 0, whose errors are the
 * impulse response.
 * `x` holds the starting state (overwritten: the state after the last week); `g1`, `g2` the
 * per-harmonic γ (harmonicGammas).
 */
function errorsOfInput(L: StateLayout, par: TbatsParameters, g1: Float64Array, g2: Float64Array, u: Float64Array | null, n: number, x: Float64Array, out: Float64Array): void {
  const H = L.harmonicCount;
  const sIdx = L.sIndex;
  const sStar = L.sStarIndex;
  const cs = L.cos;
  const sn = L.sin;
  const hasTrend = L.trend > 0;
  const { alpha, beta, phi, ar, ma } = par;
  const p = ar.length;
  const q = ma.length;
  const a0 = L.arStart;
  const m0 = L.maStart;
  for (let t = 0; t < n; t++) {
    let arma = 0;
    for (let j = 0; j < p; j++) arma += ar[j] * x[a0 + j];
    for (let j = 0; j < q; j++) arma += ma[j] * x[m0 + j];
    const l = x[0];
    const b = hasTrend ? x[1] : 0;
    let pred = l + phi * b + arma;
    for (let h = 0; h < H; h++) pred += x[sIdx[h]];
    const e = (u === null ? (t === 0 ? 1 : 0) : u[t]) - pred;
    out[t] = e;
    const d = arma + e;
    x[0] = l + phi * b + alpha * d;
    if (hasTrend) x[1] = phi * b + beta * d;
    for (let h = 0; h < H; h++) {
      const i = sIdx[h];
      const j = sStar[h];
      const s = x[i];
      const ss = x[j];
      x[i] = cs[h] * s + sn[h] * ss + g1[h] * d;
      x[j] = -sn[h] * s + cs[h] * ss + g2[h] * d;
    }
    if (p > 0) {
      for (let j = p - 1; j > 0; j--) x[a0 + j] = x[a0 + j - 1];
      x[a0] = d;
    }
    if (q > 0) {
      for (let j = q - 1; j > 0; j--) x[m0 + j] = x[m0 + j - 1];
      x[m0] = e;
    }
  }
}

/** Σ a[ao + t]·b[bo + t] over t < n, four partial sums for instruction-level parallelism. */
function dot(a: Float64Array, ao: number, b: Float64Array, bo: number, n: number): number {
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let s3 = 0;
  let t = 0;
  for (; t + 3 < n; t += 4) {
    s0 += a[ao + t] * b[bo + t];
    s1 += a[ao + t + 1] * b[bo + t + 1];
    s2 += a[ao + t + 2] * b[bo + t + 2];
    s3 += a[ao + t + 3] * b[bo + t + 3];
  }
  for (; t < n; t++) s0 += a[ao + t] * b[bo + t];
  return s0 + s1 + (s2 + s3);
}

/**
 * A = RᵀR (upper triangle) and rhs = RᵀE for R stored by column (k columns of length n), four
 * columns against one at a time, so each row of the pass loads five numbers for four
 * multiply-adds and keeps the sums in registers.
 */
function gram(R: Float64Array, E: Float64Array, k: number, n: number, A: Float64Array, rhs: Float64Array): void {
  for (let i = 0; i < k; i++) {
    const io = i * n;
    rhs[i] = dot(R, io, E, 0, n);
    let j = i;
    for (; j + 3 < k; j += 4) {
      const j0 = j * n;
      const j1 = j0 + n;
      const j2 = j1 + n;
      const j3 = j2 + n;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let t = 0; t < n; t++) {
        const a = R[io + t];
        s0 += a * R[j0 + t];
        s1 += a * R[j1 + t];
        s2 += a * R[j2 + t];
        s3 += a * R[j3 + t];
      }
      A[i * k + j] = s0;
      A[i * k + j + 1] = s1;
      A[i * k + j + 2] = s2;
      A[i * k + j + 3] = s3;
    }
    for (; j < k; j++) A[i * k + j] = dot(R, io, R, j * n, n);
  }
}

/** What a filter pass at known seeds records. */
export interface FilterPass {
  /** One-step errors ε_t on the transformed scale. */
  errors: Float64Array;
  /** One-step predictions wᵀx_{t−1} (transformed scale). */
  predictions: Float64Array;
  /** Seasonal component Σ s_{j,t−1} used in week t's prediction, and the level ℓ_{t−1}. */
  seasonal: Float64Array;
  level: Float64Array;
  /** State after the last week. */
  state: Float64Array;
}

/** Run the filter from seed `x0` over z, recording errors and components (not the hot loop). */
export function filterPass(L: StateLayout, par: TbatsParameters, z: Float64Array, x0: Float64Array): FilterPass {
  const n = z.length;
  const x = Float64Array.from(x0);
  const errors = new Float64Array(n);
  const predictions = new Float64Array(n);
  const seasonal = new Float64Array(n);
  const level = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    let s = 0;
    for (let h = 0; h < L.harmonicCount; h++) s += x[L.sIndex[h]];
    seasonal[t] = s;
    level[t] = x[0];
    const pred = predictFrom(L, par, x);
    predictions[t] = pred;
    const e = z[t] - pred;
    errors[t] = e;
    advance(L, par, x, e);
  }
  return { errors, predictions, seasonal, level, state: x };
}
