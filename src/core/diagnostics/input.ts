/**
 * Input checks shared by the diagnostics: a series must be finite, long enough for what is
 * asked, and not constant. Each failure is an InputError with a sentence, never a NaN later.
 */
import { InputError } from "../series/errors";

export function checkSeries(y: ArrayLike<number>, minLength: number, what: string): Float64Array {
  const n = y.length;
  for (let i = 0; i < n; i++) {
    if (!Number.isFinite(y[i])) {
      throw new InputError("NOT_A_NUMBER", `${what} needs finite rates; week ${i + 1} is ${y[i]}.`);
    }
  }
  if (n < minLength) {
    throw new InputError("TOO_FEW_POINTS", `${what} needs at least ${minLength} weeks with these settings; the series has ${n}.`);
  }
  let lo = Infinity;
  let hi = -Infinity;
  for (let i = 0; i < n; i++) {
    if (y[i] < lo) lo = y[i];
    if (y[i] > hi) hi = y[i];
  }
  if (hi - lo <= 1e-12 * Math.max(1, Math.abs(hi))) {
    throw new InputError("CONSTANT_SERIES", `${what} cannot be run on a constant series: every week is ${y[0]}.`);
  }
  return Float64Array.from(y);
}
