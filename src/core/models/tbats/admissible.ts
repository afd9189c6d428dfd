/**
 * Admissibility of TBATS parameters (De Livera et al., 2011, §3.3): the discount matrix
 * D = F − g wᵀ must have every eigenvalue inside the unit circle, so that the forecasts forget
 * the seed states. Forming D and its eigenvalues would cost O(m³) per likelihood evaluation;
 * instead we use its structure (derived here, checked against the dense matrix in the tests):
 *
 *  - D is block lower triangular: the level, trend and seasonal rows have zeros in the ARMA
 *    columns (filter.ts), the d-lag block is nilpotent and the ε-lag block is the companion
 *    of the MA polynomial. So eig(D) = eig(D₁₁) ∪ {0} ∪ {roots of z^q + θ_1 z^{q−1} + … + θ_q},
 *    and the last set lies inside the circle exactly when the MA part is invertible, which the
 *    parametrisation guarantees (estimate.ts); AR stationarity is guaranteed the same way.
 *  - D₁₁ = F₁₁ − g₁w₁ᵀ is a rank-one change of F₁₁, so by the matrix determinant lemma
 *      det(zI − D₁₁) = det(zI − F₁₁)·(1 + w₁ᵀ(zI − F₁₁)⁻¹g₁).
 *    F₁₁ is the level/trend block [[1, φ], [0, φ]] and one rotation per harmonic, so with
 *    q_j(z) = z² − 2 cos ω_j z + 1, S = Π q_j and N_j = γ1(z − cos ω_j) + γ2 sin ω_j,
 *      with trend:    P(z) = (z−1)(z−φ)(S + T) + α(z−φ)S + βφ z S,
 *      without:       P(z) = (z−1)(S + T) + α S,          T = Σ_j N_j Π_{i≠j} q_i.
 *
 * P is monic of degree 1 + [trend] + 2H. Its roots lie inside the circle exactly when the
 * Schur–Cohn step-down (the Levinson recursion run backwards) gives reflection coefficients of
 * modulus below one, an O(degree²) test. We test the roots against radius 1 + 1e-7 rather
 * than 1, which admits γ = 0 (a fixed seasonal pattern: the rotations' roots on the circle,
 * the seed pattern never forgotten, which the paper's software also fits) without letting the
 * test hinge on rounding.
 */
import type { StateLayout, TbatsParameters } from "./structure";

export const ADMISSIBLE_RADIUS = 1 + 1e-7;

/** a ← a·(z − c) in ascending coefficients; `a` has room for one more degree. */
function mulLinear(a: Float64Array, deg: number, c: number): void {
  a[deg + 1] = a[deg];
  for (let k = deg; k > 0; k--) a[k] = a[k - 1] - c * a[k];
  a[0] = -c * a[0];
}

/** a ← a·(z² − 2cz + 1). */
function mulQuadratic(a: Float64Array, deg: number, c: number): void {
  a[deg + 2] = 0;
  a[deg + 1] = 0;
  for (let k = deg + 2; k >= 0; k--) {
    const a0 = k <= deg ? a[k] : 0;
    const a1 = k - 1 >= 0 && k - 1 <= deg ? a[k - 1] : 0;
    const a2 = k - 2 >= 0 && k - 2 <= deg ? a[k - 2] : 0;
    a[k] = a0 - 2 * c * a1 + a2;
  }
}

/** The characteristic polynomial of D₁₁, ascending coefficients, monic. */
export function characteristicPolynomial(L: StateLayout, par: TbatsParameters): Float64Array {
  const H = L.harmonicCount;
  const trend = L.trend > 0;
  const deg = 1 + (trend ? 1 : 0) + 2 * H;
  // S = Π q_j and T = Σ N_j Π_{i≠j} q_i by the running recursion
  //   T_j = T_{j−1} q_j + N_j S_{j−1},  S_j = S_{j−1} q_j.
  const S = new Float64Array(deg + 3);
  const T = new Float64Array(deg + 3);
  const tmp = new Float64Array(deg + 3);
  S[0] = 1;
  let sd = 0;
  for (let h = 0; h < H; h++) {
    const c = L.cos[h];
    const g1 = par.gamma1[L.periodOf[h]];
    const g2 = par.gamma2[L.periodOf[h]];
    // tmp = N_h·S (degree sd + 1).
    tmp.fill(0);
    for (let k = 0; k <= sd; k++) {
      tmp[k + 1] += g1 * S[k];
      tmp[k] += (g2 * L.sin[h] - g1 * c) * S[k];
    }
    if (h > 0) mulQuadratic(T, sd - 1, c);
    for (let k = 0; k <= sd + 1; k++) T[k] += tmp[k];
    mulQuadratic(S, sd, c);
    sd += 2;
  }
  // U = S + T (degree sd), then the level/trend factors.
  const U = new Float64Array(deg + 3);
  for (let k = 0; k <= sd; k++) U[k] = S[k] + T[k];
  const P = new Float64Array(deg + 1);
  if (trend) {
    const phi = par.phi;
    mulLinear(U, sd, 1);
    mulLinear(U, sd + 1, phi);
    const aS = Float64Array.from(S);
    mulLinear(aS, sd, phi);
    for (let k = 0; k <= sd + 2; k++) P[k] = U[k];
    for (let k = 0; k <= sd + 1; k++) P[k] += par.alpha * aS[k];
    for (let k = 0; k <= sd; k++) P[k + 1] += par.beta * phi * S[k];
  } else {
    mulLinear(U, sd, 1);
    for (let k = 0; k <= sd + 1; k++) P[k] = U[k];
    for (let k = 0; k <= sd; k++) P[k] += par.alpha * S[k];
  }
  return P;
}

/**
 * Largest reflection coefficient modulus of P(r·z)/rⁿ (≥ 1, or Infinity, when some root of P lies
 * on or outside radius r).
 */
export function stepDownMax(P: Float64Array, r: number): number {
  const n = P.length - 1;
  // Monic z^n + a_1 z^{n−1} + … + a_n of P(rz)/rⁿ: a_i = P[n−i]·r^{−i}. The AR form 1 − φ_1B − …
  // with φ_i = −a_i has the same roots in 1/B, so the stationarity test is the root test:
  // the reverse Durbin–Levinson recursion (as sarima/polynomial.ts maxPartialAutocorrelation),
  // here in place on one buffer since it runs at every likelihood evaluation.
  const cur = new Float64Array(n);
  const next = new Float64Array(n);
  let ri = 1;
  for (let i = 1; i <= n; i++) {
    ri /= r;
    cur[i - 1] = -P[n - i] * ri;
  }
  let worst = 0;
  for (let k = n - 1; k >= 0; k--) {
    const rk = cur[k];
    const a = Math.abs(rk);
    if (!(a < 1)) return Infinity;
    if (a > worst) worst = a;
    const denom = 1 - rk * rk;
    for (let j = 0; j < k; j++) next[j] = (cur[j] + rk * cur[k - 1 - j]) / denom;
    for (let j = 0; j < k; j++) cur[j] = next[j];
  }
  return worst;
}

/** True when the discount matrix's eigenvalues lie inside the (slightly widened) unit circle. */
export function admissible(L: StateLayout, par: TbatsParameters): boolean {
  const P = characteristicPolynomial(L, par);
  for (let k = 0; k < P.length; k++) if (!Number.isFinite(P[k])) return false;
  return stepDownMax(P, ADMISSIBLE_RADIUS) < 1;
}

/**
 * The admissible directions of (γ1, γ2) for one period near γ = 0, to first order.
 *
 * At γ = 0 the seasonal roots of P are the rotations' e^{±iω_j}, on the unit circle. For small
 * γ the root z_j = e^{iω_j} moves by δ_j, where (from P = Q·(1 + w₁ᵀ(zI − F₁₁)⁻¹g₁) above,
 * keeping the terms of first order in γ)
 *   q_j(z)·B_j(z) + N_j(z) ≈ 0,   B_j = 1 + α/(z − 1) [+ βφz/((z − 1)(z − φ))],
 *   q_j(z_j + δ) ≈ 2i sin ω_j·δ,  N_j(z_j) = sin ω_j·(γ2 + iγ1),
 * so δ_j = (iγ2 − γ1)/(2B_j) and |z_j + δ_j| < 1 exactly when Re(δ_j z̄_j) < 0, i.e.
 *   γ1·a_j + γ2·b_j > 0,   a_j + ib_j = z̄_j / B_j(z_j).
 * Each harmonic allows a half-plane of directions; a period's K harmonics share (γ1, γ2), so the
 * admissible directions are the wedge where all K half-planes meet: angles θ of (γ1, γ2) with
 * max_j ψ_j − π/2 < θ < min_j ψ_j + π/2, ψ_j = arg(a_j + ib_j). Null when the wedge is empty
 * (then only γ = 0 is admissible to first order). Without level terms (B = 1) the condition is
 * γ1 cos ω_j − γ2 sin ω_j > 0, which a 2×2 determinant confirms directly.
 */
export function gammaWedge(
  period: number,
  harmonics: number,
  alpha: number,
  beta: number,
  phi: number,
  trend: boolean,
): { lo: number; hi: number } | null {
  let lo = -Infinity;
  let hi = Infinity;
  let ref = 0;
  for (let j = 1; j <= harmonics; j++) {
    const w = (2 * Math.PI * j) / period;
    const c = Math.cos(w);
    const s = Math.sin(w);
    // B = 1 + α/(z − 1) + βφ z/((z − 1)(z − φ)), complex arithmetic by parts.
    const d1 = (c - 1) * (c - 1) + s * s;
    let bRe = 1 + (alpha * (c - 1)) / d1;
    let bIm = (-alpha * s) / d1;
    if (trend) {
      const wRe = (c - 1) * (c - phi) - s * s;
      const wIm = s * (c - phi) + s * (c - 1);
      const wd = wRe * wRe + wIm * wIm;
      // z·conj(w)/|w|²
      const tRe = (c * wRe + s * wIm) / wd;
      const tIm = (s * wRe - c * wIm) / wd;
      bRe += beta * phi * tRe;
      bIm += beta * phi * tIm;
    }
    // arg(z̄ / B) = −ω − arg B, unwrapped next to the first harmonic's.
    let psi = -w - Math.atan2(bIm, bRe);
    if (j === 1) ref = psi;
    while (psi - ref > Math.PI) psi -= 2 * Math.PI;
    while (psi - ref <= -Math.PI) psi += 2 * Math.PI;
    lo = Math.max(lo, psi - Math.PI / 2);
    hi = Math.min(hi, psi + Math.PI / 2);
  }
  if (!(hi - lo > 1e-6)) return null;
  return { lo, hi };
}
