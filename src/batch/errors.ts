/**
 * Exit codes of the command-line runner: 0 done, 2 bad input (a one-line reason on stderr),
 * 1 an internal failure. A UsageError is the batch runner's own bad-input error (arguments,
 * files); the core's InputError counts as bad input too.
 */
import { isInputError } from "../core/series/errors";

export const EXIT_OK = 0;
export const EXIT_INTERNAL = 1;
export const EXIT_BAD_INPUT = 2;

export class UsageError extends Error {
  constructor(message: string) {
    super(message);
    this.name = "UsageError";
  }
}

export function isBadInput(e: unknown): e is Error {
  return e instanceof UsageError || isInputError(e);
}
