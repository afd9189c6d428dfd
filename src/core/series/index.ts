/** Public API of the weekly-series intake (cell values → WeeklySeries). */
export { InputError, isInputError } from "./errors";
export type { CellOffset, InputErrorCode } from "./errors";
export type { WeeklySeries } from "./types";
export {
  EXCEL_SERIAL_MIN,
  EXCEL_SERIAL_MAX,
  EXCEL_PHANTOM_LEAP_DAY,
  EXCEL_1904_SERIAL_MAX,
  excelSerialToDate,
  dateToExcelSerial,
  parseIsoDateText,
  readDateCell,
  utcDay,
} from "./excelDate";
export type { DateCell, DateSystem } from "./excelDate";
export { isoWeek, isoWeeksInYear, isoWeekStart, isoWeekday, isoWeekLabel } from "./isoWeek";
export type { IsoWeek } from "./isoWeek";
export {
  CURRENCY_CODES,
  EXCEL_ERROR_TEXTS,
  excelErrorOf,
  isBlankCell,
  looksLikeMalformedNumber,
  parseNumberText,
  readRateCell,
} from "./cells";
export type { CellPlace, RateCell } from "./cells";
export { fillGap, fillScale, findGaps } from "./gapFill";
export type { FillScale, Gap } from "./gapFill";
export { readWeekly } from "./intake";
export type { IntakeOptions } from "./intake";
