/**
 * One rate cell, as the sheet hands it over (Range.values, custom-function
 * arguments) or from the batch reader, turned into a number, a blank (null) or an
 * InputError. The accepted text forms are what desks paste from e-mails and web pages:
 * thousands separators, one currency sign or code (CURRENCY_CODES) before or after the
 * number, surrounding spaces. A percentage is a change, not a rate, and is refused.
 */
import { CellOffset, InputError } from "./errors";
import { shownValue } from "./wording";

/** The error values Excel shows in cells, as Range.values reports them (text). */
export const EXCEL_ERROR_TEXTS: readonly string[] = [
  "#N/A",
  "#VALUE!",
  "#DIV/0!",
  "#REF!",
  "#NAME?",
  "#NUM!",
  "#NULL!",
  "#SPILL!",
  "#CALC!",
  "#GETTING_DATA",
  "#BUSY!",
  "#BLOCKED!",
  "#CONNECT!",
  "#FIELD!",
  "#UNKNOWN!",
  "#EXTERNAL!",
  "#PYTHON!",
];

// Names used for the same errors by the object forms (custom-function error codes and
// error cell values), keyed in lower case, mapped to the text Excel shows.
const ERROR_NAMES: Readonly<Record<string, string>> = {
  notavailable: "#N/A",
  na: "#N/A",
  invalidvalue: "#VALUE!",
  value: "#VALUE!",
  divisionbyzero: "#DIV/0!",
  div0: "#DIV/0!",
  invalidreference: "#REF!",
  ref: "#REF!",
  invalidname: "#NAME?",
  name: "#NAME?",
  invalidnumber: "#NUM!",
  num: "#NUM!",
  nullreference: "#NULL!",
  null: "#NULL!",
  spill: "#SPILL!",
  calc: "#CALC!",
  gettingdata: "#GETTING_DATA",
  busy: "#BUSY!",
  blocked: "#BLOCKED!",
  connect: "#CONNECT!",
  field: "#FIELD!",
  external: "#EXTERNAL!",
  python: "#PYTHON!",
  unknown: "#UNKNOWN!",
};

// Shape of error texts Excel may add later: "#" then capitals, ending in "!" or "?".
const ERROR_TEXT_SHAPE = /^#[A-Z][A-Z0-9_/]*[!?]$/;

function errorFromName(name: string): string {
  const t = name.trim();
  if (t.startsWith("#")) return t.toUpperCase();
  return ERROR_NAMES[t.toLowerCase().replace(/[^a-z0-9]/g, "")] ?? t;
}

/**
 * The Excel error a cell holds, named as Excel shows it ("#N/A"), or undefined when the
 * cell holds no error. Recognises error text ("#DIV/0!") and objects carrying a string
 * `code`, `errorCode` or `errorType` property ({ code: "#N/A" }, { errorCode: "NotAvailable" }).
 */
export function excelErrorOf(value: unknown): string | undefined {
  if (typeof value === "string") {
    const t = value.trim().toUpperCase();
    if (EXCEL_ERROR_TEXTS.includes(t) || ERROR_TEXT_SHAPE.test(t)) return t;
    return undefined;
  }
  if (value !== null && typeof value === "object" && !(value instanceof Date)) {
    const o = value as Record<string, unknown>;
    for (const key of ["code", "errorCode", "errorType"]) {
      const v = o[key];
      if (typeof v === "string" && v.trim() !== "") return errorFromName(v);
    }
  }
  return undefined;
}

/** True for the blank forms: "", whitespace-only text, null, undefined. */
export function isBlankCell(value: unknown): boolean {
  return value === null || value === undefined || (typeof value === "string" && value.trim() === "");
}

/**
 * The currency codes read beside a number: the ISO 4217 codes freight desks meet in rate
 * sheets, plus RMB, which is not an ISO code (the renminbi's ISO code is CNY) but is common
 * in the trade. A fixed list and not "any three capitals", so that an index or lane name
 * such as "FBX11" or "WCI 40" in a header is text, not the rate 11 or 40.
 */
export const CURRENCY_CODES: readonly string[] = [
  "USD", "EUR", "CNY", "RMB", "GBP", "JPY", "HKD", "SGD", "KRW", "INR",
  "AUD", "CAD", "CHF", "DKK", "NOK", "SEK", "AED", "BRL", "MXN", "ZAR",
  "TWD", "THB", "MYR", "IDR", "VND", "PHP", "TRY", "PLN", "NZD", "SAR",
];

// One currency marker: a code from CURRENCY_CODES, a symbol, or a dollar with a country
// prefix (US$, HK$, S$).
const CODE = `(?:${CURRENCY_CODES.join("|")})`;
const SYMBOL = "(?:[A-Z]{0,2}\\$|[€£¥￥₩₹₽₺₫₱₪฿])";
const CURRENCY = `(?:${CODE}(?![A-Z])|${SYMBOL})`;
const PREFIX = new RegExp(`^${CURRENCY}\\s*`);
const SUFFIX = new RegExp(`\\s*(?<![A-Z])${CURRENCY}$`);
const SIGN = /^[-+\u2212]\s*/;
// 1,834 / 1,834.5 (groups of three) or 1834 / 1834.5 / .5 / 1.8e3.
const GROUPED = /^\d{1,3}(?:,\d{3})+(?:\.\d*)?$/;
const PLAIN = /^(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

/**
 * The number written in `text`, or undefined when the text is not one of the accepted
 * forms. A sign may stand before or after a currency prefix ("-$1,834", "$-1,834"). A
 * percent sign anywhere makes the text not a number here (see readRateCell).
 */
export function parseNumberText(text: string): number | undefined {
  let s = text.trim();
  let negative = false;
  const takeSign = (): boolean => {
    const m = SIGN.exec(s);
    if (!m) return false;
    negative = m[0][0] !== "+";
    s = s.slice(m[0].length);
    return true;
  };
  const signed = takeSign();
  const pre = PREFIX.exec(s);
  if (pre) {
    s = s.slice(pre[0].length);
  } else {
    const suf = SUFFIX.exec(s);
    if (suf) s = s.slice(0, s.length - suf[0].length);
  }
  if (!signed) takeSign();
  s = s.trim();
  let n: number;
  if (GROUPED.test(s)) n = Number(s.replace(/,/g, ""));
  else if (PLAIN.test(s)) n = Number(s);
  else return undefined;
  if (!Number.isFinite(n)) return undefined;
  return negative ? -n : n;
}

/** True for text such as "12%", "-3.5 %" or "%4": a percentage written as text. */
export function looksLikePercent(text: string): boolean {
  const t = text.trim();
  if (!t.includes("%")) return false;
  return parseNumberText(t.replace("%", "")) !== undefined;
}

// Any currency marker in any case, anywhere: for spotting number-like text, not reading it.
const ANY_CURRENCY = new RegExp(
  `(?<![A-Za-z])(?:${CODE}(?![A-Za-z])|[A-Za-z]{0,2}\\$|[€£¥￥₩₹₽₺₫₱₪฿])`,
  "gi",
);

/**
 * True for text that looks like a number but is not in a form parseNumberText reads:
 * "1 834", "(1,834)", "usd 1834", "1.834,50". Such text holds only digits, separators
 * (comma, full stop, spaces), parentheses, a sign at either end and currency marks or codes
 * in any case. Index or lane names ("FBX11", "WCI 40", "40'") and years with words are not.
 */
export function looksLikeMalformedNumber(text: string): boolean {
  if (parseNumberText(text) !== undefined) return false;
  let s = text.replace(ANY_CURRENCY, " ").replace(/[()]/g, " ").trim();
  s = s.replace(/^[+\-\u2212]\s*/, "").replace(/\s*[+\-\u2212]$/, "");
  return /\d/.test(s) && /^[\d.,\s]+$/.test(s);
}

/** Where a cell sits, for messages: a sentence subject such as "Row 14", and its offset. */
export interface CellPlace {
  /** Starts the sentence, e.g. "Row 14" or "Column 3". */
  label: string;
  /** Offset reported with the error (already shifted to the sheet, if the caller wants). */
  cell?: CellOffset;
}

/** Result of reading one rate cell: a number, null for a blank, or the error to raise. */
export type RateCell = number | null | InputError;

/**
 * Reads one rate cell. Numbers must be finite; text is read by parseNumberText; the blank
 * forms give null; Excel errors give CELL_ERROR naming the error; booleans, percentages,
 * dates, other objects and other text give NOT_A_NUMBER.
 */
export function readRateCell(value: unknown, place: CellPlace = { label: "The cell" }): RateCell {
  const { label, cell } = place;
  const notNumber = (tail: string): InputError =>
    new InputError("NOT_A_NUMBER", `${label} holds ${shownValue(value)}, ${tail}.`, cell);

  if (typeof value === "number") {
    return Number.isFinite(value) ? value : notNumber("which is not a finite number");
  }
  if (isBlankCell(value)) return null;
  const err = excelErrorOf(value);
  if (err !== undefined) {
    return new InputError(
      "CELL_ERROR",
      `${label} holds the error value ${err}; fix or clear that cell first.`,
      cell,
    );
  }
  if (typeof value === "string") {
    const n = parseNumberText(value);
    if (n !== undefined) return n;
    if (looksLikePercent(value)) return notNumber("which is a percentage, not a rate");
    return notNumber("which is not a number");
  }
  if (typeof value === "boolean") return notNumber("which is a TRUE/FALSE value, not a number");
  if (value instanceof Date) return notNumber("which is not a rate");
  return notNumber("which is not a number");
}
