/**
 * readWeekly: a selected column (or row) of weekly rates, with an optional block of dates
 * beside it, turned into a WeeklySeries or refused with an InputError naming the cell.
 *
 * Order of work: shape → header → trim blank rows at both ends, and trailing rows of 0 →
 * read each cell (rate, then date) in row order → place the dates on a weekly grid →
 * positivity → enough points → fill short gaps. The first problem found is the one reported.
 */
import {
  readRateCell,
  excelErrorOf,
  isBlankCell,
  parseNumberText,
  looksLikePercent,
  looksLikeMalformedNumber,
} from "./cells";
import { InputError } from "./errors";
import { DateSystem, readDateCell } from "./excelDate";
import { firstValueOutOfScale } from "./firstScale";
import { fillGap, fillScale, findGaps, FillScale, Gap } from "./gapFill";
import { trailingZeros } from "./trailingZeros";
import type { WeeklySeries } from "./types";
import { DatedRow, gridDate, placeOnWeekGrid, WeekGrid } from "./weekGrid";
import {
  Locator,
  capitalise,
  isoDay,
  positionName,
  positionsName,
  shownValue,
  weeksWord,
} from "./wording";

export interface IntakeOptions {
  /** Dates beside the rates: a block of the same height (same length and orientation). */
  dates?: unknown[][];
  /** Whether the first row is a header; "auto" (default) decides from its content. */
  header?: boolean | "auto";
  /** Longest run of missing weeks that is filled (default 2). */
  maxFill?: number;
  /** Fill longer gaps too, with a warning, instead of refusing them (default false). */
  allowLongGaps?: boolean;
  /** Fewest observed rates accepted (default 3). */
  minPoints?: number;
  /** Require every rate above zero, as a log or Box-Cox transform does (default false). */
  positive?: boolean;
  /** Added to every reported cell offset (rate cells, and date cells unless set below). */
  rowOffset?: number;
  colOffset?: number;
  /** Offsets for date cells when the dates block sits elsewhere (default: as above). */
  dateRowOffset?: number;
  dateColOffset?: number;
  /**
   * The workbook's date system, for dates given as serial numbers. 1900 (default): serial 1
   * is 1900-01-01, as in Excel for Windows and most books. 1904: serial 0 is 1904-01-01, as
   * in books made by older Excel for Mac (Excel's "Use 1904 date system" setting); the same
   * serial is then 1462 days later than in the 1900 system. Date text and Date objects are
   * read the same in both.
   */
  dateSystem?: DateSystem;
}

interface Resolved {
  header: boolean | "auto";
  maxFill: number;
  allowLongGaps: boolean;
  minPoints: number;
  positive: boolean;
  dateSystem: DateSystem;
}

function resolve(options: IntakeOptions): Resolved {
  const { header = "auto", maxFill = 2, minPoints = 3 } = options;
  if (header !== true && header !== false && header !== "auto") {
    throw new InputError("BAD_OPTION", 'The header option must be true, false or "auto".');
  }
  const whole = (v: unknown, min: number, what: string): void => {
    if (typeof v !== "number" || !Number.isInteger(v) || v < min) {
      throw new InputError("BAD_OPTION", `${what} must be a whole number of at least ${min}.`);
    }
  };
  whole(maxFill, 0, "The longest gap to fill");
  whole(minPoints, 1, "The fewest points");
  const { dateSystem = 1900 } = options;
  if (dateSystem !== 1900 && dateSystem !== 1904) {
    throw new InputError("BAD_OPTION", "The date system must be 1900 or 1904.");
  }
  for (const k of ["rowOffset", "colOffset", "dateRowOffset", "dateColOffset"] as const) {
    if (options[k] !== undefined) whole(options[k], 0, `The ${k} option`);
  }
  return {
    header,
    maxFill,
    minPoints,
    allowLongGaps: options.allowLongGaps === true,
    positive: options.positive === true,
    dateSystem,
  };
}

/** A block as one line of cells, and whether the line runs down rows or across columns. */
interface Line {
  cells: unknown[];
  unit: "row" | "column";
}

function asLine(block: unknown, what: string): Line {
  if (!Array.isArray(block) || !block.every((r) => Array.isArray(r))) {
    throw new InputError("SHAPE", `The ${what} must be a block of cells, given row by row.`);
  }
  const rows = block as unknown[][];
  if (rows.length === 0 || rows[0].length === 0) {
    throw new InputError("SHAPE", `The ${what} selection is empty.`);
  }
  const width = rows[0].length;
  if (rows.some((r) => r.length !== width)) {
    throw new InputError("SHAPE", `The ${what} block has rows of different lengths.`);
  }
  if (width === 1) return { cells: rows.map((r) => r[0]), unit: "row" };
  if (rows.length === 1) return { cells: [...rows[0]], unit: "column" };
  throw new InputError(
    "SHAPE",
    `The ${what} selection is ${rows.length} rows by ${width} columns; ` +
      `choose a single column (or a single row) of ${what}.`,
  );
}

function datesLine(block: unknown, values: Line): unknown[] {
  const n = values.cells.length;
  const expect =
    values.unit === "row"
      ? `a single column as tall as the rates (${n} rows)`
      : `a single row as long as the rates (${n} columns)`;
  let line: Line;
  try {
    line = asLine(block, "dates");
  } catch (e) {
    if (e instanceof InputError) throw new InputError("SHAPE", `The dates must be ${expect}.`);
    throw e;
  }
  const sameWay = n === 1 || line.cells.length === 1 || line.unit === values.unit;
  if (!sameWay || line.cells.length !== n) {
    throw new InputError(
      "SHAPE",
      `The dates must be ${expect}; the dates selection has ${line.cells.length} cells.`,
    );
  }
  return line.cells;
}

function locator(unit: "row" | "column", o: IntakeOptions): Locator {
  const r = o.rowOffset ?? 0;
  const c = o.colOffset ?? 0;
  const dr = o.dateRowOffset ?? r;
  const dc = o.dateColOffset ?? c;
  return unit === "row"
    ? { unit, valueCell: (i) => ({ row: i + r, col: c }), dateCell: (i) => ({ row: i + dr, col: dc }) }
    : { unit, valueCell: (i) => ({ row: r, col: i + c }), dateCell: (i) => ({ row: dr, col: i + dc }) };
}

/** Text that names a column, not a rate: not blank, not an error, not a number or percentage. */
export function isLabelText(v: unknown): v is string {
  return (
    typeof v === "string" &&
    !isBlankCell(v) &&
    excelErrorOf(v) === undefined &&
    parseNumberText(v) === undefined &&
    !looksLikePercent(v)
  );
}

function headerOf(
  rate: unknown,
  date: unknown,
  hasDates: boolean,
  opt: Resolved,
  loc: Locator,
): { isHeader: boolean; name?: string } {
  const mode = opt.header;
  const name = isLabelText(rate) ? rate.trim() : undefined;
  if (mode === true) return { isHeader: true, name };
  if (mode === false) return { isHeader: false };
  const dateCell = hasDates ? readDateCell(date, opt.dateSystem).kind : "blank";
  if (name === undefined || dateCell === "date") return { isHeader: false };
  // "1 834" or "(1,834)" on top is a rate typed in a form we do not read, not a column name;
  // taking it as the header would drop that week without a word. A label beside it in the
  // dates column ("Week ending") still makes the row a header row.
  if (looksLikeMalformedNumber(name) && !isLabelText(date)) {
    throw new InputError(
      "NOT_A_NUMBER",
      `${capitalise(positionName(loc, 0))} holds ${shownValue(rate)}, which looks like a rate but is ` +
        "not written in a form Fairlead reads; write it as 1834 or 1,834.50 (a currency code " +
        "such as USD before or after is fine), or put a name in words there if it is a header.",
      loc.valueCell(0),
    );
  }
  return { isHeader: true, name };
}

/** One row kept after trimming: its position in the block and the rate read (null = blank). */
interface Row {
  at: number;
  value: number | null;
}

function readRate(raw: unknown, at: number, loc: Locator): number | null {
  const r = readRateCell(raw, { label: capitalise(positionName(loc, at)), cell: loc.valueCell(at) });
  if (r instanceof InputError) throw r;
  return r;
}

function readDate(
  raw: unknown,
  at: number,
  hasRate: boolean,
  loc: Locator,
  dateSystem: DateSystem,
): Date | null {
  const label = capitalise(positionName(loc, at));
  const cell = loc.dateCell(at);
  const err = excelErrorOf(raw);
  if (err !== undefined) {
    throw new InputError(
      "CELL_ERROR",
      `${label} is dated with the error value ${err}; fix or clear that date cell first.`,
      cell,
    );
  }
  const d = readDateCell(raw, dateSystem);
  if (d.kind === "date") return d.date;
  if (d.kind === "invalid") {
    throw new InputError(
      "NOT_A_DATE",
      `${label} is dated ${shownValue(raw)}, which is not a date: ${d.reason}.`,
      cell,
    );
  }
  if (hasRate) throw new InputError("NOT_A_DATE", `${label} has a rate but no date.`, cell);
  return null;
}

/** Where the gap sits, in words, and the cell an error about it points at. */
function describeGap(
  gap: Gap,
  rowsInGap: number[],
  rowAtWeek: Map<number, number>,
  grid: WeekGrid | undefined,
  loc: Locator,
): { subject: string; plural: boolean; cellAt: number } {
  const L = gap.length;
  const after = rowAtWeek.get(gap.start + L) ?? 0;
  const cellAt = rowsInGap.length > 0 ? rowsInGap[0] : after;
  if (!grid) {
    return { subject: capitalise(positionsName(loc, rowsInGap)), plural: L > 1, cellAt };
  }
  const day = (k: number): string => isoDay(gridDate(grid, gap.start + k));
  const weeks =
    L === 1
      ? `The week ending ${day(0)}`
      : L === 2
        ? `The 2 weeks ending ${day(0)} and ${day(1)}`
        : `The ${L} weeks ending ${day(0)} to ${day(L - 1)}`;
  const before = rowAtWeek.get(gap.start - 1) ?? 0;
  const where =
    rowsInGap.length > 0
      ? positionsName(loc, rowsInGap)
      : `between ${positionName(loc, before)} and ${positionName(loc, after)}`;
  return { subject: `${weeks} (${where})`, plural: L > 1, cellAt };
}

function scaleWords(scale: FillScale): string {
  return scale === "log"
    ? "on the log scale (a steady weekly growth rate)"
    : "on the raw scale (the log scale needs every rate above zero)";
}

/**
 * Applies the gap rule to `out` in place (NaN = missing week) and returns the filled flags.
 * Adds one warning per gap; throws LONG_GAP for a gap over the limit unless it is allowed.
 */
function fillShortGaps(
  out: Float64Array,
  rowAtWeek: Map<number, number>,
  grid: WeekGrid | undefined,
  loc: Locator,
  opt: Resolved,
  warnings: string[],
): boolean[] {
  const filled = new Array<boolean>(out.length).fill(false);
  const scale = fillScale(out);
  for (const gap of findGaps(out)) {
    const rowsInGap: number[] = [];
    for (let k = gap.start; k < gap.start + gap.length; k++) {
      const at = rowAtWeek.get(k);
      if (at !== undefined) rowsInGap.push(at);
    }
    const { subject, plural, cellAt } = describeGap(gap, rowsInGap, rowAtWeek, grid, loc);
    const were = plural ? "were" : "was";
    const long = gap.length > opt.maxFill;
    if (long && !opt.allowLongGaps) {
      const state = grid ? (plural ? "have no rate" : "has no rate") : plural ? "are blank" : "is blank";
      throw new InputError(
        "LONG_GAP",
        `${subject} ${state}: ${weeksWord(gap.length)} missing in a row. Fairlead fills at most ` +
          `${weeksWord(opt.maxFill)} in a row; enter the missing rates, or allow long gaps ` +
          "to have them filled.",
        loc.valueCell(cellAt),
      );
    }
    fillGap(out, gap, scale);
    for (let k = gap.start; k < gap.start + gap.length; k++) filled[k] = true;
    const caution = long
      ? ` That is longer than ${weeksWord(opt.maxFill)}, so treat the filled values with care.`
      : "";
    warnings.push(
      `${subject} ${grid ? "had no rate" : `${were} blank`} and ${were} filled by interpolating ` +
        `${scaleWords(scale)} between the weeks either side.${caution}`,
    );
  }
  return filled;
}

/**
 * Reads a block of weekly rates into a WeeklySeries (contract in DESIGN.md). Throws an
 * InputError for every problem a user can cause; the message names the row (1-based inside
 * the block) and `cell` gives its 0-based offset plus any offsets passed in `options`.
 */
export function readWeekly(values: unknown[][], options: IntakeOptions = {}): WeeklySeries {
  const opt = resolve(options);
  const line = asLine(values, "rates");
  const loc = locator(line.unit, options);
  const cells = line.cells;
  const hasDates = options.dates !== undefined;
  const dateCells = hasDates ? datesLine(options.dates, line) : [];
  const warnings: string[] = [];

  const head = headerOf(cells[0], dateCells[0], hasDates, opt, loc);
  const top = head.isHeader ? 1 : 0;

  // Trim: the series runs from the first to the last cell with anything in the rate column.
  let first = -1;
  let last = -1;
  for (let i = top; i < cells.length; i++) {
    if (isBlankCell(cells[i])) continue;
    if (first < 0) first = i;
    last = i;
  }
  if (first < 0) {
    throw new InputError("TOO_FEW_POINTS", "The selection holds no rates.");
  }
  const zeros = trailingZeros(cells, first, last);
  if (zeros) {
    last = zeros.keptLast;
    warnings.push(zeros.warning(loc));
  }
  const leadingDated: number[] = [];
  for (let i = top; i < first && hasDates; i++) {
    // Only real dates count; a label such as "Week ending" above the data is no week.
    if (readDateCell(dateCells[i], opt.dateSystem).kind === "date") leadingDated.push(i);
  }

  // Read every kept row, rate then date, in row order.
  const rows: Row[] = [];
  const dated: DatedRow[] = [];
  const skipped: number[] = [];
  for (let at = first; at <= last; at++) {
    const value = readRate(cells[at], at, loc);
    if (!hasDates) {
      rows.push({ at, value });
      continue;
    }
    const date = readDate(dateCells[at], at, value !== null, loc, opt.dateSystem);
    if (date === null) {
      skipped.push(at); // both cells blank: nothing to place
      continue;
    }
    rows.push({ at, value });
    dated.push({ at, date });
  }

  let grid: WeekGrid | undefined;
  let week: number[];
  if (hasDates) {
    grid = placeOnWeekGrid(dated, loc);
    week = grid.week;
  } else {
    week = rows.map((r) => r.at - first);
    warnings.push("No dates were given, so the rates were taken as consecutive weeks of unknown date.");
  }
  if (leadingDated.length > 0) {
    warnings.push(
      `${capitalise(positionsName(loc, leadingDated))} ${leadingDated.length === 1 ? "has a date" : "have dates"} ` +
        `but no rate, so the series starts at ${positionName(loc, first)}.`,
    );
  }
  if (skipped.length > 0) {
    warnings.push(
      `${capitalise(positionsName(loc, skipped))} ${skipped.length === 1 ? "is" : "are"} empty ` +
        `and ${skipped.length === 1 ? "was" : "were"} skipped.`,
    );
  }
  if (grid) warnings.push(...grid.warnings);
  const scale = firstValueOutOfScale(rows, loc);
  if (scale !== undefined) warnings.push(scale);

  if (opt.positive) {
    const bad = rows.find((r) => r.value !== null && !(r.value > 0));
    if (bad) {
      throw new InputError(
        "NON_POSITIVE",
        `${capitalise(positionName(loc, bad.at))} holds ${bad.value}; a log or Box-Cox ` +
          "transform needs every rate above zero.",
        loc.valueCell(bad.at),
      );
    }
  }
  const observed = rows.filter((r) => r.value !== null).length;
  if (observed < opt.minPoints) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `Only ${weeksWord(observed)} ${observed === 1 ? "has" : "have"} a rate; ` +
        `at least ${opt.minPoints} are needed.`,
    );
  }

  // Lay the rates on the grid (NaN = missing) and fill the gaps.
  const n = week[week.length - 1] + 1;
  const out = new Float64Array(n).fill(NaN);
  const rowAtWeek = new Map<number, number>();
  rows.forEach((r, k) => {
    rowAtWeek.set(week[k], r.at);
    if (r.value !== null) out[week[k]] = r.value;
  });
  const filled = fillShortGaps(out, rowAtWeek, grid, loc, opt, warnings);

  const series: WeeklySeries = {
    dates: grid ? Array.from({ length: n }, (_, k) => gridDate(grid as WeekGrid, k)) : [],
    values: out,
    filled,
    warnings,
  };
  if (head.name !== undefined) series.name = head.name;
  if (grid) series.weekday = grid.weekday;
  return series;
}
