/**
 * Seasonal factors by ISO week from a fitted TBATS model's seasonal states.
 *
 * Week t's one-step prediction on the transformed scale is base_t + s_t, with s_t = Σ_j s_{j,t−1}
 * the seasonal component and base_t = ℓ_{t−1} + φ b_{t−1} + (ARMA part) the rest. On the rate scale
 * the seasonal effect of week t is
 *   multiplicative: g⁻¹(base_t + s_t) / g⁻¹(base_t),    additive: g⁻¹(base_t + s_t) − g⁻¹(base_t),
 * g the Box-Cox transform (the identity without one), so the factor is the ratio of what the
 * model expected to what it would have expected without the season. These per-week effects are
 * averaged by ISO week as for the STL factors (diagnostics/seasonality/factors.ts: within each
 * ISO year, then across years; week 53 folded into 52; normalised to mean 1, or 0).
 */
import { boxCoxInverse } from "../../math/boxcox";
import { factorsFromSeasonal, foldNote, ISO_WEEK_ROWS, type FactorKind } from "../../diagnostics/seasonality";
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { InputError } from "../../series/errors";
import type { TbatsFitted } from "./model";

export interface TbatsFactors {
  kind: FactorKind;
  factors: Float64Array;
  years: Int32Array;
  foldedYears: number[];
  table: ReportTable;
}

/** Seasonal effect of each fitted week on the rate scale (log ratio for "multiplicative"). */
export function seasonalEffects(fit: TbatsFitted, kind: FactorKind): Float64Array {
  const { predictions, seasonal } = fit.pass;
  const lam = fit.par.lambda;
  const back = (z: number): number => (lam === null ? z : boxCoxInverse(z, lam));
  const n = fit.n;
  const out = new Float64Array(n);
  for (let t = 0; t < n; t++) {
    const base = predictions[t] - seasonal[t];
    const a = back(base + seasonal[t]);
    const b = back(base);
    if (kind === "multiplicative") out[t] = a > 0 && b > 0 ? Math.log(a / b) : NaN;
    else out[t] = a - b;
  }
  return out;
}

export function tbatsWeekFactors(fit: TbatsFitted, dates: Date[], kind: FactorKind = "multiplicative"): TbatsFactors {
  if (dates.length !== fit.n) {
    throw new InputError("SHAPE", `Seasonal factors need one date per fitted week; got ${dates.length} dates for ${fit.n} weeks.`);
  }
  if (fit.structure.periods.length === 0) {
    throw new InputError("TOO_FEW_POINTS", "This TBATS model has no seasonal part (too few weeks), so it gives no seasonal factors.");
  }
  const f = factorsFromSeasonal(dates, seasonalEffects(fit, kind), kind);
  const rows: Cell[][] = [];
  for (let r = 0; r < ISO_WEEK_ROWS; r++) rows.push([r + 1, Number.isNaN(f.factors[r]) ? null : f.factors[r], f.years[r]]);
  const notes = [
    kind === "multiplicative"
      ? "A factor of 1.08 means the model expected rates in that week about 8% above its seasonally adjusted expectation; the 52 factors average 1."
      : "An effect of +120 means the model expected rates in that week about 120 above its seasonally adjusted expectation, in the rates' own units; the 52 effects average 0.",
    `From the seasonal states of ${fit.summary().structure}, averaged per ISO week over the fitted years.`,
  ];
  if (f.foldedYears.length > 0) notes.push(foldNote(f.foldedYears));
  const title = kind === "multiplicative" ? "Seasonal factors by ISO week (TBATS)" : "Seasonal effects by ISO week (TBATS, additive)";
  return { kind, ...f, table: table(title, ["ISO week", "Factor", "Years averaged"], rows, notes) };
}
