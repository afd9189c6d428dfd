/**
 * The TBATS model of De Livera, Hyndman & Snyder (2011), "Forecasting time series with complex
 * seasonal patterns using exponential smoothing", JASA 106(496), §2 (BATS with the
 * trigonometric seasonal of §2.2), in innovations state-space form. With z_t the Box-Cox
 * transform of y_t (parameter λ, or none):
 *
 *   z_t        = ℓ_{t−1} + φ b_{t−1} + Σ_i s^{(i)}_{t−1} + d_t
 *   ℓ_t        = ℓ_{t−1} + φ b_{t−1} + α d_t
 *   b_t        = φ b_{t−1} + β d_t
 *   s^{(i)}_t  = Σ_{j=1..K_i} s^{(i)}_{j,t}
 *   s^{(i)}_{j,t}  =  s^{(i)}_{j,t−1} cos ω_{ij} + s*^{(i)}_{j,t−1} sin ω_{ij} + γ1^{(i)} d_t
 *   s*^{(i)}_{j,t} = −s^{(i)}_{j,t−1} sin ω_{ij} + s*^{(i)}_{j,t−1} cos ω_{ij} + γ2^{(i)} d_t
 *   d_t        = Σ φ_k d_{t−k} + Σ θ_k ε_{t−k} + ε_t,      ω_{ij} = 2πj / m_i,
 *
 * with ε_t white noise. The paper's trend equation has a long-run growth b, b_t = (1 − φ)b +
 * φ b_{t−1} + β d_t; like the authors' own software we fix b = 0 (stated from memory), so a
 * damped trend dies away and an undamped one (φ = 1) is a local linear trend. The periods m_i
 * need not be integers: weekly rates use 365.25/7 ≈ 52.18.
 *
 * The state vector, in this order: ℓ; b (with a trend); per period, s_1..s_K then s*_1..s*_K;
 * d_{t−1}..d_{t−p}; ε_{t−1}..ε_{t−q}.
 */
import { WEEKLY_PERIOD } from "../../series/calendar";

/** What a TBATS model contains; its parameters are in TbatsParameters. */
export interface TbatsStructure {
  /** Box-Cox λ estimated (true) or no transform (false). */
  boxCox: boolean;
  trend: boolean;
  /** Damped trend (only with a trend). */
  damped: boolean;
  /** Seasonal periods in weeks, possibly non-integer; empty for no seasonality. */
  periods: number[];
  /** Harmonics K_i per period. */
  harmonics: number[];
  /** ARMA(p, q) orders of the errors d_t. */
  p: number;
  q: number;
}

export interface TbatsParameters {
  /** Box-Cox λ, or null for no transform. */
  lambda: number | null;
  alpha: number;
  /** 0 without a trend. */
  beta: number;
  /** 1 without damping (and without a trend, where it multiplies nothing). */
  phi: number;
  /** γ1, γ2 per period. */
  gamma1: number[];
  gamma2: number[];
  /** AR coefficients φ_1..φ_p and MA coefficients θ_1..θ_q of d_t. */
  ar: number[];
  ma: number[];
}

/** The weekly default: one period of 365.25/7 weeks. */
export const DEFAULT_PERIODS: readonly number[] = [WEEKLY_PERIOD];

/** Where each part lives in the state vector, and the harmonic frequencies. */
export interface StateLayout {
  /** Total state dimension. */
  size: number;
  /** Index of b, or −1. */
  trend: number;
  /** Number of harmonics over all periods (H). */
  harmonicCount: number;
  /** Index of s_1 of the first period; s-values occupy blocks of 2K_i per period. */
  seasonal: number;
  /** For harmonic h (0..H−1): state index of s_h, of s*_h, its period's index, cos ω and sin ω. */
  sIndex: Int32Array;
  sStarIndex: Int32Array;
  periodOf: Int32Array;
  cos: Float64Array;
  sin: Float64Array;
  /** Index of d_{t−1} and of ε_{t−1} (−1 when p or q is 0). */
  arStart: number;
  maStart: number;
  /** Seed states: ℓ, b and the seasonal states (ARMA states start at zero). */
  seedCount: number;
}

export function layoutOf(s: TbatsStructure): StateLayout {
  const H = s.harmonics.reduce((a, k) => a + k, 0);
  const sIndex = new Int32Array(H);
  const sStarIndex = new Int32Array(H);
  const periodOf = new Int32Array(H);
  const cos = new Float64Array(H);
  const sin = new Float64Array(H);
  let at = s.trend ? 2 : 1;
  const seasonal = at;
  let h = 0;
  for (let i = 0; i < s.periods.length; i++) {
    const K = s.harmonics[i];
    for (let j = 1; j <= K; j++, h++) {
      const w = (2 * Math.PI * j) / s.periods[i];
      sIndex[h] = at + j - 1;
      sStarIndex[h] = at + K + j - 1;
      periodOf[h] = i;
      cos[h] = Math.cos(w);
      sin[h] = Math.sin(w);
    }
    at += 2 * K;
  }
  const seedCount = at;
  const arStart = s.p > 0 ? at : -1;
  at += s.p;
  const maStart = s.q > 0 ? at : -1;
  at += s.q;
  return { size: at, trend: s.trend ? 1 : -1, harmonicCount: H, seasonal, sIndex, sStarIndex, periodOf, cos, sin, arStart, maStart, seedCount };
}

/** Most harmonics a period allows: 2K < m, so every pair is a distinct frequency below Nyquist. */
export function maxHarmonicsFor(period: number): number {
  return Math.max(0, Math.ceil(period / 2) - 1);
}

function fmt(x: number): string {
  return Number.isInteger(x) ? String(x) : x.toFixed(2);
}

/**
 * The paper's label TBATS(λ, {p, q}, φ, {⟨m_1, K_1⟩, …}), with "1" for no transform and "-"
 * for no damping, e.g. "TBATS(0.31, {1,0}, 0.95, {<52.18,6>})".
 */
export function structureLabel(s: TbatsStructure, par?: TbatsParameters): string {
  const lam = par ? (par.lambda !== null ? par.lambda.toFixed(2) : "1") : s.boxCox ? "λ" : "1";
  const damp = s.trend && s.damped ? (par ? par.phi.toFixed(3) : "φ") : "-";
  const seas = s.periods.map((m, i) => `<${fmt(m)},${s.harmonics[i]}>`).join(",");
  return `TBATS(${lam}, {${s.p},${s.q}}, ${damp}, {${seas}})` + (s.trend ? "" : " without trend");
}

/** Plain-words description for notes and the structure table. */
export function structureWords(s: TbatsStructure): string {
  const parts: string[] = [];
  parts.push(s.boxCox ? "Box-Cox transform" : "no transform");
  parts.push(s.trend ? (s.damped ? "damped trend" : "trend") : "no trend");
  if (s.periods.length === 0) parts.push("no seasonality");
  else parts.push(s.periods.map((m, i) => `${s.harmonics[i]} harmonic${s.harmonics[i] === 1 ? "" : "s"} of period ${fmt(m)}`).join(", "));
  parts.push(s.p + s.q > 0 ? `ARMA(${s.p},${s.q}) errors` : "white-noise errors");
  return parts.join(", ");
}

export function sameStructure(a: TbatsStructure, b: TbatsStructure): boolean {
  return (
    a.boxCox === b.boxCox &&
    a.trend === b.trend &&
    a.damped === b.damped &&
    a.p === b.p &&
    a.q === b.q &&
    a.periods.length === b.periods.length &&
    a.periods.every((m, i) => m === b.periods[i] && a.harmonics[i] === b.harmonics[i])
  );
}
