/**
 * Errors that a user can cause by what is in the cells. Each carries a stable code (for
 * sinks that map codes to Excel error values), a sentence a desk analyst understands, and,
 * when known, the offset of the offending cell inside the block that was read.
 */
export type InputErrorCode =
  | "NOT_A_NUMBER"
  | "CELL_ERROR"
  | "NOT_A_DATE"
  | "NOT_WEEKLY"
  | "DUPLICATE_DATE"
  | "UNSORTED_DATES"
  | "LONG_GAP"
  | "TOO_FEW_POINTS"
  | "NON_POSITIVE"
  | "CONSTANT_SERIES"
  | "SHAPE"
  | "BAD_OPTION";

export interface CellOffset {
  /** 0-based row inside the block that was read. */
  row: number;
  /** 0-based column inside the block that was read. */
  col: number;
}

export class InputError extends Error {
  readonly code: InputErrorCode;
  readonly cell?: CellOffset;

  constructor(code: InputErrorCode, message: string, cell?: CellOffset) {
    super(message);
    this.name = "InputError";
    this.code = code;
    this.cell = cell;
  }
}

export function isInputError(e: unknown): e is InputError {
  return e instanceof InputError;
}
