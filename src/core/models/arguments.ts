/**
 * Checks and helpers every model's Fitted methods share. Sinks validate what users type
 * before it reaches a model, but the core still refuses a bad horizon, coverage or new week
 * with a sentence rather than letting it spread through a filter.
 */
import { InputError } from "../series/errors";

export function checkHorizon(h: number): void {
  if (!Number.isInteger(h) || h < 1) {
    throw new InputError("BAD_OPTION", `The forecast horizon must be a whole number of weeks of at least 1; got ${h}.`);
  }
}

export function checkLevels(levels: number[]): void {
  for (const l of levels) {
    if (!(typeof l === "number" && l > 0 && l < 100)) {
      throw new InputError("BAD_OPTION", `Each interval coverage must be a percentage between 0 and 100, such as 80 or 95; got ${l}.`);
    }
  }
}

/** The weeks a model was fitted to followed by new ones, for Fitted.update(). */
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

/** An option the user set that cannot be honoured, as an InputError with the given sentence. */
export function badOption(sentence: string): InputError {
  return new InputError("BAD_OPTION", sentence);
}

/** A whole-number option from lo to hi, or an InputError naming it ("the number of paths"). */
export function wholeOption(value: unknown, lo: number, hi: number, what: string): number {
  if (typeof value !== "number" || !Number.isInteger(value) || value < lo || value > hi) {
    throw badOption(`The ${what} must be a whole number from ${lo} to ${hi}; got ${String(value)}.`);
  }
  return value;
}
