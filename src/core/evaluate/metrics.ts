/**
 * Forecast accuracy measures. Point measures take actuals and forecasts of equal length and
 * skip pairs where either is not finite; interval measures take the bounds of one central
 * interval and its coverage level in percent. Definitions:
 *   MAPE, sMAPE — Hyndman & Koehler (2006), sMAPE in the M4 form 200/n Σ|y−f|/(|y|+|f|);
 *   MASE — Hyndman & Koehler (2006), scaled by the in-sample MAE of the seasonal naive;
 *   Winkler score — Winkler (1972); MSIS — the interval score of Gneiting & Raftery (2007),
 *   eq. (43), averaged and scaled like MASE (as in the M4 competition).
 */
import { WEEKS_PER_YEAR } from "../series/calendar";

function check(actual: ArrayLike<number>, forecast: ArrayLike<number>): void {
  if (actual.length !== forecast.length) {
    throw new RangeError(`actuals (${actual.length}) and forecasts (${forecast.length}) differ in length`);
  }
}

function meanOver(n: number, term: (i: number) => number): number {
  let s = 0;
  let m = 0;
  for (let i = 0; i < n; i++) {
    const v = term(i);
    if (Number.isFinite(v)) {
      s += v;
      m++;
    }
  }
  return m === 0 ? NaN : s / m;
}

/** Mean error (actual − forecast): positive means the forecasts ran low. */
export function me(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  check(actual, forecast);
  return meanOver(actual.length, (i) => actual[i] - forecast[i]);
}

export function mae(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  check(actual, forecast);
  return meanOver(actual.length, (i) => Math.abs(actual[i] - forecast[i]));
}

export function rmse(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  check(actual, forecast);
  return Math.sqrt(meanOver(actual.length, (i) => (actual[i] - forecast[i]) ** 2));
}

/** Mean absolute percentage error, in percent; a zero actual gives no term (it is undefined). */
export function mape(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  check(actual, forecast);
  return 100 * meanOver(actual.length, (i) => (actual[i] === 0 ? NaN : Math.abs((actual[i] - forecast[i]) / actual[i])));
}

/** Symmetric MAPE, in percent, on the 0–200 scale. */
export function smape(actual: ArrayLike<number>, forecast: ArrayLike<number>): number {
  check(actual, forecast);
  return (
    200 *
    meanOver(actual.length, (i) => {
      const d = Math.abs(actual[i]) + Math.abs(forecast[i]);
      return d === 0 ? 0 : Math.abs(actual[i] - forecast[i]) / d;
    })
  );
}

export interface MaseScale {
  /** In-sample mean absolute difference at `lag`. */
  scale: number;
  /** 52 (seasonal naive) when the history covers two years, else 1 (naive). */
  lag: number;
  /** A sentence saying which scaling was used. */
  note: string;
}

/**
 * The MASE denominator from the training history: the in-sample MAE of the seasonal naive at
 * lag 52 when there are at least two full years (104 weeks), else of the naive at lag 1.
 */
export function maseScale(history: ArrayLike<number>, seasonalLag = WEEKS_PER_YEAR): MaseScale {
  const n = history.length;
  const lag = n >= 2 * seasonalLag ? seasonalLag : 1;
  if (n <= lag) throw new RangeError(`MASE needs more than ${lag} weeks of history, got ${n}`);
  let s = 0;
  let m = 0;
  for (let t = lag; t < n; t++) {
    const d = Math.abs(history[t] - history[t - lag]);
    if (Number.isFinite(d)) {
      s += d;
      m++;
    }
  }
  const scale = m === 0 ? NaN : s / m;
  const note =
    lag === seasonalLag
      ? `MASE is scaled by the in-sample error of the same week a year earlier (lag ${lag}).`
      : `MASE is scaled by the in-sample error of last week's value (lag 1), because the history is shorter than two years.`;
  return { scale, lag, note };
}

/** Mean absolute scaled error against a scale from `maseScale`. */
export function mase(actual: ArrayLike<number>, forecast: ArrayLike<number>, scale: MaseScale | number): number {
  const s = typeof scale === "number" ? scale : scale.scale;
  if (!(s > 0)) return NaN;
  return mae(actual, forecast) / s;
}

function checkLevel(levelPercent: number): number {
  if (!(levelPercent > 0 && levelPercent < 100)) {
    throw new RangeError(`coverage level must be a percentage strictly between 0 and 100, got ${levelPercent}`);
  }
  return 1 - levelPercent / 100;
}

/** Share of actuals inside [lower, upper], in percent. */
export function coverage(actual: ArrayLike<number>, lower: ArrayLike<number>, upper: ArrayLike<number>): number {
  check(actual, lower);
  check(actual, upper);
  return 100 * meanOver(actual.length, (i) => {
    const y = actual[i];
    if (!Number.isFinite(y) || !Number.isFinite(lower[i]) || !Number.isFinite(upper[i])) return NaN;
    return y >= lower[i] && y <= upper[i] ? 1 : 0;
  });
}

/** One interval's score: width plus 2/α times the distance by which the actual falls outside. */
function intervalScore(y: number, l: number, u: number, alpha: number): number {
  let s = u - l;
  if (y < l) s += (2 / alpha) * (l - y);
  else if (y > u) s += (2 / alpha) * (y - u);
  return s;
}

/** Mean Winkler score of central intervals at `levelPercent` (lower is better). */
export function winkler(actual: ArrayLike<number>, lower: ArrayLike<number>, upper: ArrayLike<number>, levelPercent: number): number {
  const alpha = checkLevel(levelPercent);
  check(actual, lower);
  check(actual, upper);
  return meanOver(actual.length, (i) => intervalScore(actual[i], lower[i], upper[i], alpha));
}

/** Mean scaled interval score: the Winkler score divided by the MASE scale. */
export function msis(
  actual: ArrayLike<number>,
  lower: ArrayLike<number>,
  upper: ArrayLike<number>,
  levelPercent: number,
  scale: MaseScale | number,
): number {
  const s = typeof scale === "number" ? scale : scale.scale;
  if (!(s > 0)) return NaN;
  return winkler(actual, lower, upper, levelPercent) / s;
}
