/**
 * The structure of a seasonal ARIMA model with regression terms, and the regressors it can
 * carry: a mean or a drift, Fourier pairs of the weekly period 365.25/7 (the practical way to
 * carry annual seasonality in weekly data: a lag-52 polynomial drifts a day and a quarter a
 * year against the calendar), and any further columns a caller supplies (calendar effects).
 *
 * Regressors are defined on the level scale, indexed by week t = 0, 1, … from the first
 * observation; the model differences them together with the rates:
 *   φ(B)Φ(B^s)(1 − B)^d(1 − B^s)^D (z_t − x_tᵀβ) = θ(B)Θ(B^s) ε_t,  z the (Box-Cox) rates.
 */
import { WEEKLY_PERIOD } from "../../series/calendar";
import { InputError } from "../../series/errors";

export interface SarimaOrder {
  p: number;
  d: number;
  q: number;
  P: number;
  D: number;
  Q: number;
  /** Seasonal lag (52 for weekly rates); ignored when P = D = Q = 0. */
  s: number;
}

/** Further regressors, evaluated at any week index (past or future) on the level scale. */
export interface RegressorSet {
  names: string[];
  /** Write the regressors' values at week index t into out (length names.length). */
  at(t: number, out: Float64Array): void;
}

export interface SarimaSpec extends SarimaOrder {
  /** A mean (d + D = 0) or a drift (d + D = 1); not allowed with more differencing. */
  constant: boolean;
  /** Fourier pairs of `fourierPeriod` (0 = none). */
  fourier: number;
  fourierPeriod: number;
  /** Box-Cox λ applied before the model, or null for none. */
  lambda: number | null;
  extra?: RegressorSet;
}

export const MAX_ORDER = { p: 5, q: 5, P: 2, Q: 2, d: 2, D: 1 } as const;

export function defaultSpec(order: Partial<SarimaSpec> = {}): SarimaSpec {
  return {
    p: 0,
    d: 0,
    q: 0,
    P: 0,
    D: 0,
    Q: 0,
    s: 52,
    constant: false,
    fourier: 0,
    fourierPeriod: WEEKLY_PERIOD,
    lambda: null,
    ...order,
  };
}

function wholeIn(name: string, v: number, lo: number, hi: number): void {
  if (!Number.isInteger(v) || v < lo || v > hi) {
    throw new InputError("BAD_OPTION", `The SARIMA order ${name} must be a whole number from ${lo} to ${hi}; got ${v}.`);
  }
}

/** Refuse structures the model cannot fit, with a sentence naming the offending part. */
export function validateSpec(spec: SarimaSpec): void {
  wholeIn("p", spec.p, 0, MAX_ORDER.p);
  wholeIn("q", spec.q, 0, MAX_ORDER.q);
  wholeIn("d", spec.d, 0, MAX_ORDER.d);
  wholeIn("P", spec.P, 0, MAX_ORDER.P);
  wholeIn("Q", spec.Q, 0, MAX_ORDER.Q);
  wholeIn("D", spec.D, 0, MAX_ORDER.D);
  if (spec.P + spec.D + spec.Q > 0) wholeIn("seasonal lag", spec.s, 2, 60);
  wholeIn("number of Fourier pairs", spec.fourier, 0, 26);
  if (spec.fourier > 0 && !(spec.fourierPeriod > 2 * spec.fourier)) {
    throw new InputError(
      "BAD_OPTION",
      `${spec.fourier} Fourier pairs need a period longer than ${2 * spec.fourier} weeks; got ${spec.fourierPeriod}.`,
    );
  }
  if (spec.fourier > 0 && spec.D > 0) {
    throw new InputError(
      "BAD_OPTION",
      "Fourier terms and a seasonal difference both remove the annual pattern; choose one of them.",
    );
  }
  if (spec.constant && spec.d + spec.D > 1) {
    throw new InputError(
      "BAD_OPTION",
      "A constant with two differences would be a quadratic trend in the rates; fit it without the constant.",
    );
  }
}

export function seasonalPart(spec: SarimaOrder): boolean {
  return spec.P + spec.D + spec.Q > 0;
}

/** "ARIMA(1,1,1)(0,1,1)[52]" */
export function orderLabel(spec: SarimaOrder): string {
  const base = `ARIMA(${spec.p},${spec.d},${spec.q})`;
  return seasonalPart(spec) ? `${base}(${spec.P},${spec.D},${spec.Q})[${spec.s}]` : base;
}

/** The regressors of a spec: mean or drift, Fourier pairs, then the caller's extra columns. */
export function regressorsOf(spec: SarimaSpec): RegressorSet {
  const names: string[] = [];
  const constantKind = spec.constant ? (spec.d + spec.D === 0 ? "mean" : "drift") : null;
  if (constantKind) names.push(constantKind);
  for (let k = 1; k <= spec.fourier; k++) names.push(`sin${k}`, `cos${k}`);
  const extra = spec.extra;
  const buf = extra ? new Float64Array(extra.names.length) : new Float64Array(0);
  if (extra) names.push(...extra.names);
  const w = (2 * Math.PI) / spec.fourierPeriod;
  return {
    names,
    at(t: number, out: Float64Array): void {
      let j = 0;
      if (constantKind === "mean") out[j++] = 1;
      else if (constantKind === "drift") out[j++] = t;
      for (let k = 1; k <= spec.fourier; k++) {
        out[j++] = Math.sin(w * k * t);
        out[j++] = Math.cos(w * k * t);
      }
      if (extra) {
        extra.at(t, buf);
        for (let i = 0; i < buf.length; i++) out[j++] = buf[i];
      }
    },
  };
}

/** Regressor columns for weeks from..to−1 (column-major: one Float64Array a regressor). */
export function regressorColumns(reg: RegressorSet, from: number, to: number): Float64Array[] {
  const k = reg.names.length;
  const cols: Float64Array[] = [];
  for (let j = 0; j < k; j++) cols.push(new Float64Array(to - from));
  const row = new Float64Array(k);
  for (let t = from; t < to; t++) {
    reg.at(t, row);
    for (let j = 0; j < k; j++) cols[j][t - from] = row[j];
  }
  return cols;
}
