/**
 * Dates as they reach the intake: Excel serial numbers (1900 or 1904 date system), ISO-8601
 * calendar-date text, and JS Date objects. Every result is a UTC-midnight Date.
 *
 * The 1900 date system counts serial 1 as 1 January 1900 and, for compatibility with
 * older spreadsheets, also counts a 29 February 1900 as serial 60, although 1900 was not a
 * leap year. Serials 1–59 therefore run one day "early" against a plain day count and
 * serials from 61 (1 March 1900) on match a day count from 30 December 1899.
 *
 * Decision on serial 60: it is rejected as not a date. Mapping it to 1 March 1900 would
 * silently give two serials the same day (and a duplicate-date error far from its cause);
 * no freight series reaches back to 1900, so a 60 in a date column is almost surely a
 * number typed into the wrong column and is better reported than repaired.
 *
 * The 1904 date system (books from older Excel for Mac, or with "Use 1904 date system" set)
 * counts serial 0 as 1 January 1904 and has no phantom day, so a 1904 serial is the day
 * count from 1904-01-01. 1904-01-01 is 4 × 365 = 1460 days after 1900-01-01 (serial 1) and
 * the phantom day adds one more, so it is serial 1462 in the 1900 system: the same serial
 * means a day 1462 days later in the 1904 system than in the 1900 system.
 */

/** Which of Excel's two date systems a serial number counts in (see the header comment). */
export type DateSystem = 1900 | 1904;

const MS_PER_DAY = 86_400_000;

/** First serial of the 1900 date system (1 January 1900). */
export const EXCEL_SERIAL_MIN = 1;
/** Last serial Excel can show (31 December 9999). */
export const EXCEL_SERIAL_MAX = 2_958_465;
/** The serial of the non-existent 29 February 1900. */
export const EXCEL_PHANTOM_LEAP_DAY = 60;
/** Last serial of the 1904 date system (31 December 9999); its first is 0 (1 January 1904). */
export const EXCEL_1904_SERIAL_MAX = EXCEL_SERIAL_MAX - 1462;

/**
 * A UTC-midnight Date for a proleptic Gregorian calendar day (month 1–12). Built with
 * setUTCFullYear so that years 1–99 are not shifted into the 1900s the way Date.UTC does.
 */
export function utcDay(year: number, month: number, day: number): Date {
  const d = new Date(0);
  d.setUTCFullYear(year, month - 1, day);
  d.setUTCHours(0, 0, 0, 0);
  return d;
}

/** Whole days since 1970-01-01 of the UTC calendar day holding `date`. */
export function dayNumber(date: Date): number {
  return Math.floor(date.getTime() / MS_PER_DAY);
}

/** The UTC-midnight Date of a day number (inverse of dayNumber). */
export function fromDayNumber(day: number): Date {
  return new Date(day * MS_PER_DAY);
}

// Day numbers of the two anchors of the 1900 system (see the header comment).
const DAY_1899_12_30 = dayNumber(utcDay(1899, 12, 30));
const DAY_1899_12_31 = DAY_1899_12_30 + 1;
const DAY_1904_01_01 = dayNumber(utcDay(1904, 1, 1));

/**
 * The day an Excel serial (1900 date system) stands for, as a UTC-midnight Date. The time
 * of day in a fractional serial is dropped (truncated towards the start of the day).
 * Returns undefined for serial 60 (29 February 1900, which never existed), for serials
 * below 1 and above 2958465, and for non-finite numbers. With `dateSystem` 1904 the serial
 * counts days from 1904-01-01 (serial 0) up to 2957003 (9999-12-31).
 */
export function excelSerialToDate(serial: number, dateSystem: DateSystem = 1900): Date | undefined {
  if (!Number.isFinite(serial)) return undefined;
  const whole = Math.floor(serial);
  if (dateSystem === 1904) {
    if (whole < 0 || whole > EXCEL_1904_SERIAL_MAX) return undefined;
    return fromDayNumber(DAY_1904_01_01 + whole);
  }
  if (whole < EXCEL_SERIAL_MIN || whole > EXCEL_SERIAL_MAX) return undefined;
  if (whole === EXCEL_PHANTOM_LEAP_DAY) return undefined;
  const day = whole < EXCEL_PHANTOM_LEAP_DAY ? DAY_1899_12_31 + whole : DAY_1899_12_30 + whole;
  return fromDayNumber(day);
}

/**
 * The Excel serial (1900 date system) of the UTC calendar day holding `date`. Throws a
 * RangeError for days before 1 January 1900 or after 31 December 9999, which Excel cannot
 * show. Never returns 60.
 */
export function dateToExcelSerial(date: Date): number {
  const t = date.getTime();
  if (Number.isNaN(t)) throw new RangeError("Invalid Date has no Excel serial.");
  const e = dayNumber(date) - DAY_1899_12_30;
  // 1900-01-01 is e = 2 and has serial 1; 1900-02-28 is e = 60 and has serial 59.
  const serial = e > EXCEL_PHANTOM_LEAP_DAY ? e : e - 1;
  if (serial < EXCEL_SERIAL_MIN || serial > EXCEL_SERIAL_MAX) {
    throw new RangeError(`${date.toISOString().slice(0, 10)} is outside Excel's date range.`);
  }
  return serial;
}

// YYYY-MM-DD, optionally followed by an ISO-8601 time of day and zone, which are ignored:
// the calendar date is taken as written.
const ISO_DATE =
  /^(\d{4})-(\d{2})-(\d{2})(?:T\d{2}(?::\d{2}(?::\d{2}(?:[.,]\d+)?)?)?(?:Z|[+-]\d{2}(?::?\d{2})?)?)?$/;

function daysInMonth(year: number, month: number): number {
  if (month === 2) {
    const leap = (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0;
    return leap ? 29 : 28;
  }
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/**
 * Parses ISO-8601 calendar-date text `YYYY-MM-DD`, or `YYYY-MM-DDTHH:mm[:ss[.fff]][zone]`
 * truncated to its date. Surrounding spaces are allowed. Returns undefined for any other
 * text and for days that do not exist (2025-02-29, 2025-13-01, year 0000).
 */
export function parseIsoDateText(text: string): Date | undefined {
  const m = ISO_DATE.exec(text.trim());
  if (!m) return undefined;
  const year = Number(m[1]);
  const month = Number(m[2]);
  const day = Number(m[3]);
  if (year < 1 || month < 1 || month > 12 || day < 1 || day > daysInMonth(year, month)) {
    return undefined;
  }
  return utcDay(year, month, day);
}

/** What one date cell holds. `reason` completes "…, which is not a date: <reason>." */
export type DateCell =
  | { kind: "date"; date: Date }
  | { kind: "blank" }
  | { kind: "invalid"; reason: string };

/**
 * Reads one date cell as the sheet hands it over (Range.values, a worksheet-function argument) or the batch reader reads it: a serial number,
 * ISO text, or a JS Date (read by its UTC calendar day). Blanks are "", whitespace-only
 * text, null and undefined. Anything else is not a date. Serials count in `dateSystem`.
 */
export function readDateCell(value: unknown, dateSystem: DateSystem = 1900): DateCell {
  if (value === null || value === undefined) return { kind: "blank" };
  if (typeof value === "number") {
    const date = excelSerialToDate(value, dateSystem);
    if (date) return { kind: "date", date };
    return { kind: "invalid", reason: serialProblem(value, dateSystem) };
  }
  if (typeof value === "string") {
    if (value.trim() === "") return { kind: "blank" };
    const date = parseIsoDateText(value);
    if (date) return { kind: "date", date };
    return {
      kind: "invalid",
      reason: "dates written as text must read YYYY-MM-DD (for example 2025-01-03)",
    };
  }
  if (value instanceof Date) {
    if (Number.isNaN(value.getTime())) return { kind: "invalid", reason: "it is an invalid date" };
    return { kind: "date", date: fromDayNumber(dayNumber(value)) };
  }
  if (typeof value === "boolean") {
    return { kind: "invalid", reason: "it is a TRUE/FALSE value" };
  }
  return { kind: "invalid", reason: "the cell holds neither a date nor date text" };
}

function serialProblem(serial: number, dateSystem: DateSystem): string {
  if (!Number.isFinite(serial)) return "it is not a finite number";
  const whole = Math.floor(serial);
  if (dateSystem === 1904) {
    return whole < 0
      ? "in the 1904 date system, Excel dates start at serial 0, which is 1 January 1904"
      : "in the 1904 date system, Excel dates end at serial 2957003, which is 31 December 9999";
  }
  if (whole === EXCEL_PHANTOM_LEAP_DAY) {
    return "Excel's serial 60 stands for 29 February 1900, a day that never existed";
  }
  if (whole < EXCEL_SERIAL_MIN) return "Excel dates start at serial 1, which is 1 January 1900";
  return "Excel dates end at serial 2958465, which is 31 December 9999";
}
