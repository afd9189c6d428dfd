/**
 * The TBATS state-space matrices written out densely, for the tests: De Livera, Hyndman &
 * Snyder (2011), JASA 106(496), §2.2 and eqs. (6)–(7) of §3 ("x_t = F x_{t−1} + g ε_t,
 * y_t^(ω) = wᵀx_{t−1} + ε_t"), with the block forms
 *
 *   w = [1, φ, a⁽¹⁾, …, a⁽ᵀ⁾, φ_1..φ_p, θ_1..θ_q],  a⁽ⁱ⁾ = [1_K, 0_K]
 *   g = [α, β, γ⁽¹⁾, …, γ⁽ᵀ⁾, 1, 0_{p−1}, 1, 0_{q−1}],  γ⁽ⁱ⁾ = [γ1⁽ⁱ⁾ 1_K, γ2⁽ⁱ⁾ 1_K]
 *
 *       ⎡ 1  φ   0   αφᵀ   αθᵀ ⎤
 *       ⎢ 0  φ   0   βφᵀ   βθᵀ ⎥
 *   F = ⎢ 0  0   A   Bφᵀ   Bθᵀ ⎥,   A = blockdiag of [[C, S], [−S, C]] per period,
 *       ⎢ 0  0   0   Ψ_p   Θ   ⎥    C = diag cos ω_j, S = diag sin ω_j, B = the γ block of g,
 *       ⎣ 0  0   0   0     Ψ_q ⎦
 *
 * where the d-rows are [φᵀ; I 0] (Ψ_p) and [θᵀ; 0] (Θ), and the ε-rows a plain shift (Ψ_q
 * with a zero first row). The state order is the one structure.ts documents (ℓ; b; per period
 * s_1..s_K, s*_1..s*_K; d lags; ε lags), built here from that description, not from layoutOf.
 */
import { Matrix } from "ml-matrix";
import type { TbatsParameters, TbatsStructure } from "../../../../src/core/models/tbats/structure";

export interface DenseSystem {
  F: Matrix;
  /** Column vectors. */
  g: Matrix;
  w: Matrix;
  /** D = F − g wᵀ. */
  D: Matrix;
  size: number;
  /** ℓ, b and seasonal states: the rows/columns of D₁₁, and the seeds. */
  seedCount: number;
}

export function denseSystem(s: TbatsStructure, par: TbatsParameters): DenseSystem {
  const nSeason = s.harmonics.reduce((a, k) => a + 2 * k, 0);
  const iB = s.trend ? 1 : -1;
  const seasonStart = s.trend ? 2 : 1;
  const dStart = seasonStart + nSeason;
  const eStart = dStart + s.p;
  const size = eStart + s.q;
  const F = Matrix.zeros(size, size);
  const g = Matrix.zeros(size, 1);
  const w = Matrix.zeros(size, 1);
  const phi = s.trend ? par.phi : 1;

  // Level and trend rows.
  F.set(0, 0, 1);
  g.set(0, 0, par.alpha);
  w.set(0, 0, 1);
  if (s.trend) {
    F.set(0, iB, phi);
    F.set(iB, iB, phi);
    g.set(iB, 0, par.beta);
    w.set(iB, 0, phi);
  }
  // Seasonal blocks.
  let at = seasonStart;
  s.periods.forEach((m, i) => {
    const K = s.harmonics[i];
    for (let j = 1; j <= K; j++) {
      const om = (2 * Math.PI * j) / m;
      const r = at + j - 1;
      const rs = at + K + j - 1;
      F.set(r, r, Math.cos(om));
      F.set(r, rs, Math.sin(om));
      F.set(rs, r, -Math.sin(om));
      F.set(rs, rs, Math.cos(om));
      g.set(r, 0, par.gamma1[i]);
      g.set(rs, 0, par.gamma2[i]);
      w.set(r, 0, 1);
    }
    at += 2 * K;
  });
  // ARMA parts: every row that receives d_t (= φᵀd_{lags} + θᵀε_{lags} + ε_t) gets g_row·[φᵀ θᵀ].
  if (s.p > 0) g.set(dStart, 0, 1);
  if (s.q > 0) g.set(eStart, 0, 1);
  const dRows: number[] = [0];
  if (s.trend) dRows.push(iB);
  for (let r = seasonStart; r < dStart; r++) dRows.push(r);
  if (s.p > 0) dRows.push(dStart);
  for (const r of dRows) {
    const gr = r === dStart ? 1 : g.get(r, 0);
    for (let k = 0; k < s.p; k++) F.set(r, dStart + k, gr * par.ar[k]);
    for (let k = 0; k < s.q; k++) F.set(r, eStart + k, gr * par.ma[k]);
  }
  for (let k = 1; k < s.p; k++) F.set(dStart + k, dStart + k - 1, 1);
  for (let k = 1; k < s.q; k++) F.set(eStart + k, eStart + k - 1, 1);
  for (let k = 0; k < s.p; k++) w.set(dStart + k, 0, par.ar[k]);
  for (let k = 0; k < s.q; k++) w.set(eStart + k, 0, par.ma[k]);
  const D = F.clone().sub(g.mmul(w.transpose()));
  return { F, g, w, D, size, seedCount: dStart };
}

export interface DenseFilter {
  errors: Float64Array;
  /** States x_0..x_n as columns. */
  final: Matrix;
}

/** The dense recursion ε_t = z_t − wᵀx_{t−1}, x_t = F x_{t−1} + g ε_t from x_0. */
export function denseFilter(sys: DenseSystem, z: ArrayLike<number>, x0: ArrayLike<number>): DenseFilter {
  let x = Matrix.columnVector(Array.from(x0));
  const wt = sys.w.transpose();
  const errors = new Float64Array(z.length);
  for (let t = 0; t < z.length; t++) {
    const e = z[t] - wt.mmul(x).get(0, 0);
    errors[t] = e;
    x = sys.F.mmul(x).add(sys.g.clone().mul(e));
  }
  return { errors, final: x };
}

/** Largest absolute entry, and largest absolute difference of two equal-length arrays. */
export function maxAbs(a: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i]));
  return m;
}

export function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let m = 0;
  for (let i = 0; i < a.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}
