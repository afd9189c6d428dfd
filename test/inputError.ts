/** Shared assertion: `f` throws an InputError with this code and a sentence matching `message`. */
import { InputError } from "../src/core/series/errors";

export function expectInputError(f: () => unknown, code: string, message: RegExp | string): InputError {
  let caught: unknown;
  try {
    f();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(InputError);
  expect((caught as InputError).code).toBe(code);
  expect((caught as InputError).message).toMatch(message);
  return caught as InputError;
}
