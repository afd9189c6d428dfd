/**
 * How the FAIRLEAD.* worksheet functions report a failure: as an Excel error value with,
 * where Excel can show one, the plain sentence of the InputError behind it. Every function
 * reuses this mapping so the same cause gives the same error value everywhere.
 *
 *   #VALUE!  the wrong kind of input: text or error values among the rates, dates that are
 *            not dates or not weekly, a bad block shape, an unknown method code;
 *   #NUM!    an impossible number: weeks ahead ≤ 0 or too many, coverage outside (0, 100),
 *            non-positive rates where a log or Box-Cox is asked;
 *   #N/A     too little data for what was asked.
 *
 * Excel shows a custom message only with #VALUE! and #N/A (CustomFunctions.ErrorCode
 * reference); for #NUM! the message is kept on our side (ExcelErrorSpec) but not passed on.
 */
import { InputError, InputErrorCode } from "../core/series/errors";
import { isEngineCancelled, isEngineError } from "../engine/errors";

export type ExcelErrorValue = "#VALUE!" | "#NUM!" | "#N/A";

/** The error value and the sentence a worksheet function returns for one failure. */
export interface ExcelErrorSpec {
  value: ExcelErrorValue;
  message: string;
}

/** Excel error value for each InputError code. */
export const INPUT_ERROR_VALUES: Readonly<Record<InputErrorCode, ExcelErrorValue>> = {
  NOT_A_NUMBER: "#VALUE!",
  CELL_ERROR: "#VALUE!",
  NOT_A_DATE: "#VALUE!",
  NOT_WEEKLY: "#VALUE!",
  DUPLICATE_DATE: "#VALUE!",
  UNSORTED_DATES: "#VALUE!",
  LONG_GAP: "#VALUE!",
  SHAPE: "#VALUE!",
  // A bad option is reported as #VALUE! unless the function knows the option was a number
  // out of range (see `asNumberProblem`).
  BAD_OPTION: "#VALUE!",
  NON_POSITIVE: "#NUM!",
  // A constant column has no variation to test or model: a number problem, not a type one.
  CONSTANT_SERIES: "#NUM!",
  TOO_FEW_POINTS: "#N/A",
};

/** Error values that carry a custom message in Excel. */
const MESSAGE_VALUES: ReadonlySet<ExcelErrorValue> = new Set<ExcelErrorValue>(["#VALUE!", "#N/A"]);

/**
 * A failure a worksheet function found in its own arguments (or reclassified), already
 * holding the Excel error value it should become.
 */
export class ArgumentError extends Error {
  readonly value: ExcelErrorValue;

  constructor(value: ExcelErrorValue, message: string) {
    super(message);
    this.name = "ArgumentError";
    this.value = value;
  }
}

/**
 * Runs `fn`; a BAD_OPTION InputError it throws becomes a #NUM! ArgumentError with the same
 * sentence. For option checks whose only possible failure is a number out of range (weeks
 * ahead, coverage levels), which the core reports under the one BAD_OPTION code.
 */
export function asNumberProblem<T>(fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof InputError && e.code === "BAD_OPTION") throw new ArgumentError("#NUM!", e.message);
    throw e;
  }
}

const INTERNAL_MESSAGE =
  "Fairlead could not compute this result from these inputs. Check the rates and options; if they look right, please report it.";

/** The error value and sentence for anything a worksheet function may throw. */
export function excelErrorSpec(e: unknown): ExcelErrorSpec {
  if (e instanceof InputError) return { value: INPUT_ERROR_VALUES[e.code] ?? "#VALUE!", message: e.message };
  if (e instanceof ArgumentError) return { value: e.value, message: e.message };
  // The engine's own failures are plain sentences by design (src/engine/errors.ts).
  if (isEngineCancelled(e)) return { value: "#N/A", message: "The calculation was stopped before it finished; recalculate to run it again." };
  if (isEngineError(e)) return { value: "#VALUE!", message: e.message };
  // A number outside what a routine accepts: Excel's error for impossible numbers.
  if (e instanceof RangeError) return { value: "#NUM!", message: INTERNAL_MESSAGE };
  // Never a stack trace or an internal text in a cell.
  return { value: "#VALUE!", message: INTERNAL_MESSAGE };
}

const ERROR_CODES: Readonly<Record<ExcelErrorValue, () => CustomFunctions.ErrorCode>> = {
  "#VALUE!": () => CustomFunctions.ErrorCode.invalidValue,
  "#NUM!": () => CustomFunctions.ErrorCode.invalidNumber,
  "#N/A": () => CustomFunctions.ErrorCode.notAvailable,
};

/** A CustomFunctions.Error for a spec; the message is attached only where Excel shows it. */
export function toCustomFunctionsError(spec: ExcelErrorSpec): CustomFunctions.Error {
  const code = ERROR_CODES[spec.value]();
  return MESSAGE_VALUES.has(spec.value) ? new CustomFunctions.Error(code, spec.message) : new CustomFunctions.Error(code);
}

function isCustomFunctionsError(e: unknown): e is CustomFunctions.Error {
  return typeof CustomFunctions !== "undefined" && e instanceof CustomFunctions.Error;
}

/**
 * Runs the body of a worksheet function and turns anything it throws into the
 * CustomFunctions.Error Excel shows in the cell.
 */
export function guarded<T>(body: () => T): T {
  try {
    return body();
  } catch (e) {
    if (isCustomFunctionsError(e)) throw e;
    throw toCustomFunctionsError(excelErrorSpec(e));
  }
}

/** A single cell's error inside a returned array (for a value that could not be computed). */
export function cellError(value: ExcelErrorValue, message: string): CustomFunctions.Error {
  return toCustomFunctionsError({ value, message });
}

/** The same as `guarded`, for worksheet functions that return a promise. */
export async function guardedAsync<T>(body: () => Promise<T>): Promise<T> {
  try {
    return await body();
  } catch (e) {
    if (isCustomFunctionsError(e)) throw e;
    throw toCustomFunctionsError(excelErrorSpec(e));
  }
}
