/**
 * FAIRLEAD.* worksheet functions. Each one turns its arguments into a core call and the
 * core's report table into the 2-D array Excel spills; no statistics are computed here.
 *
 * Registration: custom-functions-metadata-plugin reads the JSDoc below into functions.json
 * and appends a CustomFunctions.associate(id, function) call for each @customfunction to
 * this file when webpack bundles it, so no associate call is written by hand. In the shared
 * runtime this bundle is loaded by taskpane.html, after office.js.
 */
import { analyse, resolveOptions } from "../core/analysis";
import { dateToExcelSerial, parseIsoDateText } from "../core/series/excelDate";
import { readWeekly } from "../core/series/intake";
import type { WeeklySeries } from "../core/series/types";
import type { Cell, ReportTable } from "../core/report";
import { ArgumentError, asNumberProblem, cellError, guarded } from "./errors";

/**
 * One cell of a returned array: a number, or an error value for a cell with no result.
 * Written out as Array<Array<number | CustomFunctions.Error>> in each @customfunction
 * signature: the metadata generator follows neither type aliases nor parenthesised types.
 */
export type OutCell = number | CustomFunctions.Error;

/** Excel passes null (or nothing) for an omitted optional argument. */
function omitted(v: unknown): boolean {
  return v === null || v === undefined || (typeof v === "string" && v.trim() === "");
}

/** Coverage levels from a number or a block of numbers; blanks inside a block are skipped. */
export function readCoverage(coverage: unknown): number[] | undefined {
  if (omitted(coverage)) return undefined;
  const cells: unknown[] = Array.isArray(coverage) ? (coverage as unknown[]).flat() : [coverage];
  const levels: number[] = [];
  for (const c of cells) {
    if (omitted(c)) continue;
    if (typeof c !== "number" || !Number.isFinite(c)) {
      throw new ArgumentError(
        "#VALUE!",
        "Coverage must be a number such as 80, or a row or column of numbers such as 80 and 95.",
      );
    }
    levels.push(c);
  }
  return levels.length > 0 ? levels : undefined;
}

function readWeeks(weeks: unknown): number {
  if (typeof weeks !== "number" || !Number.isFinite(weeks)) {
    throw new ArgumentError("#VALUE!", "Weeks ahead must be a number, such as 12.");
  }
  return weeks;
}

function readMethod(method: unknown): string | undefined {
  if (omitted(method)) return undefined;
  if (typeof method !== "string") {
    throw new ArgumentError("#VALUE!", "The method must be a method code written as text, such as \"lastyear\".");
  }
  const code = method.trim();
  // "auto" backtests every method (seconds to a minute); on the calculation thread that would
  // hold Excel up, so cells refuse it until the functions run through the engine's workers.
  if (code.toLowerCase() === "auto") {
    throw new ArgumentError(
      "#VALUE!",
      'A cell cannot use "auto" yet: it backtests every method, which takes too long to run inside a formula. Give a method code such as "tbats".',
    );
  }
  return code;
}

function readDates(dates: unknown): unknown[][] | undefined {
  if (omitted(dates)) return undefined;
  return Array.isArray(dates) ? (dates as unknown[][]) : [[dates]];
}

function column(t: ReportTable, name: string): number {
  const i = t.columns.indexOf(name);
  if (i < 0) throw new Error(`report table "${t.title}" has no column "${name}"`);
  return i;
}

function numberCell(c: Cell): OutCell {
  if (typeof c === "number" && Number.isFinite(c)) return c;
  return cellError("#N/A", "No value could be computed for this week.");
}

/**
 * The outlook table as OUTLOOK returns it: week ending as an Excel date serial (the step
 * number for undated series), forecast, then the columns after "Forecast" (low and high
 * for each coverage level) in the table's order.
 */
export function outlookRows(t: ReportTable): OutCell[][] {
  const step = column(t, "Step");
  const week = column(t, "Week ending");
  const forecast = column(t, "Forecast");
  return t.rows.map((row) => {
    const iso = row[week];
    const date = typeof iso === "string" ? parseIsoDateText(iso) : undefined;
    const first = date ? dateToExcelSerial(date) : row[step];
    return [numberCell(first), ...row.slice(forecast).map(numberCell)];
  });
}

// The JSDoc below is user-facing: custom-functions-metadata copies its text into
// functions.json and Excel shows it while the formula is typed, so the description is one
// plain sentence and the argument texts say what to enter. Output: one row per week ahead,
// week ending as an Excel date serial (step number when undated), forecast, then low and
// high per coverage level, in the order of the core's outlook table.
/**
 * Forecast of the next weeks' rates, with low and high bounds for each coverage level.
 * @customfunction OUTLOOK
 * @param rates Weekly rates, oldest first: one column (or one row) of cells. A header cell on top is allowed; short gaps are filled and said so.
 * @param weeks Number of weeks ahead to forecast, a whole number from 1 to 260.
 * @param [method] Method code as text: "tbats" (trigonometric exponential smoothing, period 52.18 weeks), "sarima" (seasonal ARIMA, orders chosen automatically), "nnar" (neural-network autoregression), "combo" (average of tbats, sarima and nnar), "lastyear" (same week a year earlier), "lastweek" or "drift". If omitted: lastyear with at least two years of rates, otherwise lastweek.
 * @param [coverage] Interval coverage in percent: one number such as 80, or a row or column of numbers. If omitted: 80 and 95.
 * @param [dates] Week-ending dates beside the rates, one per rate cell. If omitted, the first column counts the weeks ahead (1, 2, 3 …).
 * @returns One row per week ahead: week ending, forecast, then low and high per coverage level.
 */
export function outlook(
  rates: unknown[][],
  weeks: number,
  method?: string,
  coverage?: unknown[][],
  dates?: unknown[][],
): Array<Array<number | CustomFunctions.Error>> {
  return guarded(() => {
    const series: WeeklySeries = readWeekly(rates, { dates: readDates(dates) });
    const horizon = readWeeks(weeks);
    const levels = readCoverage(coverage);
    // Weeks ahead and coverage can only fail as numbers out of range: #NUM!.
    asNumberProblem(() => resolveOptions(series, { horizon, levels }));
    // What analyse refuses now is the method (or the data for that method).
    // The outlook needs no diagnostics; skipping them keeps recalculation light.
    const report = analyse(series, { method: readMethod(method), horizon, levels, checks: false });
    return outlookRows(report.tables.outlook);
  });
}
