/**
 * The weeks a model was fitted to followed by new ones, for Fitted.update(). Sinks hand
 * update() rates already read by the intake, but the core still refuses a non-number, naming
 * the new week, rather than letting it spread through a filter.
 */
import { InputError } from "../series/errors";

export function appendWeeks(y: Float64Array, newY: ArrayLike<number>, method: string): Float64Array {
  for (let i = 0; i < newY.length; i++) {
    if (!Number.isFinite(newY[i])) {
      throw new InputError("NOT_A_NUMBER", `${method} needs a number in every week; new week ${i + 1} is ${newY[i]}.`);
    }
  }
  const out = new Float64Array(y.length + newY.length);
  out.set(y);
  out.set(newY, y.length);
  return out;
}
