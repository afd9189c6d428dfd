/**
 * FAIRLEAD.* worksheet functions. Each one reads its arguments into analyse() options, runs
 * the analysis on the shared engine (engine.ts: Web Workers, one result cache with the pane),
 * and returns the columns of one report table as the 2-D array Excel spills; no statistics
 * are computed here. Identical inputs and options hit the engine's cache, so recalculating an
 * unchanged book refits nothing.
 *
 * Registration: custom-functions-metadata-plugin reads the JSDoc below into functions.json
 * and appends a CustomFunctions.associate(id, function) call for each @customfunction to
 * this file when webpack bundles it, so no associate call is written by hand. In the shared
 * runtime this bundle is loaded by taskpane.html, after office.js.
 *
 * The JSDoc is user-facing: Excel shows it while a formula is typed, so the descriptions are
 * plain sentences and the argument texts say what to enter, with an example.
 */
import type { AnalysisOptions, Report } from "../core/analysis";
import { resolveOptions } from "../core/analysis";
import { readWeekly } from "../core/series/intake";
import { InputError } from "../core/series/errors";
import type { ReportTable } from "../core/report";
import { ArgumentError, asNumberProblem, guardedAsync } from "./errors";
import { functionsEngine } from "./engine";
import {
  column,
  numberCell,
  omitted,
  readCoverage,
  readDates,
  readDirection,
  readHeaders,
  readCalendar,
  readMethod,
  readMethods,
  readNumber,
  readRefit,
  readText,
  readWhole,
  single,
  tableOut,
  type OutCell,
} from "./read";
import { dateToExcelSerial, parseIsoDateText, readDateCell } from "../core/series/excelDate";
import { isoDate } from "../core/series/calendar";

export { readCoverage } from "./read";
export type { OutCell } from "./read";

/** The rates (and dates) through the intake, the options checked, the analysis run on the engine. */
async function analysed(rates: unknown, dates: unknown, options: AnalysisOptions): Promise<Report> {
  if (!Array.isArray(rates)) throw new ArgumentError("#VALUE!", "The rates must be a range of cells, such as B2:B400.");
  const series = readWeekly(rates as unknown[][], { dates: readDates(dates) });
  // Weeks ahead, coverage and spans can only fail as numbers out of range: #NUM!.
  // The one option check that is not a number out of range (asNumberProblem's premise).
  if (options.calendar?.lunarNewYear && series.dates.length !== series.values.length) {
    throw new ArgumentError("#VALUE!", "The lunar-new-year switch needs the week-ending dates beside the rates: give the dates argument as well.");
  }
  if (options.calendar?.events && series.dates.length !== series.values.length) {
    throw new ArgumentError("#VALUE!", "Event weeks need the week-ending dates beside the rates: give the dates argument as well.");
  }
  const { calendar, ...plain } = options;
  asNumberProblem(() => resolveOptions(series, plain));
  if (calendar) {
    // What the calendar can fail on (no event week within the rates) is a wrong value, not a number out of range.
    try {
      resolveOptions(series, options);
    } catch (e) {
      if (e instanceof InputError && e.code === "BAD_OPTION") throw new ArgumentError("#VALUE!", e.message);
      throw e;
    }
  }
  return functionsEngine().run("analyse", { series, options });
}

/**
 * The table a function returns; when the analysis had to skip it, #N/A with the analysis's
 * own sentence (the checks say why they did not run: "… not run: …needs three years…").
 */
function present(t: ReportTable | undefined, what: string, report?: Report, check?: string): ReportTable {
  if (t) return t;
  const why = check ? report?.warnings.find((w) => w.startsWith(`${check} not run: `)) : undefined;
  throw new ArgumentError("#N/A", why ? why.slice(`${check} not run: `.length) : `${what} could not be computed for these rates.`);
}

/**
 * The outlook table as OUTLOOK returns it: week ending as an Excel date serial (the step
 * number for undated series), forecast, then low and high for each coverage level.
 */
export function outlookRows(t: ReportTable, headers = false): Array<Array<number | string | CustomFunctions.Error>> {
  const step = column(t, "Step");
  const week = column(t, "Week ending");
  const forecast = column(t, "Forecast");
  const rows: Array<Array<number | string | CustomFunctions.Error>> = t.rows.map((row) => {
    const iso = row[week];
    const date = typeof iso === "string" ? parseIsoDateText(iso) : undefined;
    const first = date ? dateToExcelSerial(date) : row[step];
    return [numberCell(first), ...row.slice(forecast).map(numberCell)];
  });
  return headers ? [["Week ending", ...t.columns.slice(forecast)], ...rows] : rows;
}

/**
 * Forecast of the next weeks' rates, with low and high bounds for each coverage level.
 * @customfunction OUTLOOK
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400. A header cell on top is allowed; short gaps are filled and said so.
 * @param weeks Number of weeks ahead to forecast, a whole number from 1 to 260, such as 12.
 * @param [method] Method code as text, such as "tbats": "tbats", "sarima", "nnar", "combo" (average of the three), "lastyear" (same week a year earlier), "lastweek", "drift", or "auto" (chosen by a one-year backtest; slow the first time). If omitted: lastyear with two years of rates, otherwise lastweek.
 * @param [coverage] Interval coverage in percent: one number such as 80, or a row or column of numbers such as {80,95}. If omitted: 80 and 95.
 * @param [dates] Week-ending dates beside the rates, one per rate cell, such as A2:A400. If omitted, the first column counts the weeks ahead (1, 2, 3 …).
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @param [lunar_new_year] Whether the weeks around the lunar new year are calendar regressors (SARIMA and TBATS take them; under "auto" the backtest also scores each without them), such as TRUE. Needs the dates. If omitted: FALSE.
 * @param [event_weeks] Weeks of events of your own (a strike, a closure) as one regressor for SARIMA and TBATS: a range of dates, any day of each week, past or coming, such as H2:H9; or a column of marks beside the dates, 1 (or x, TRUE) in the event weeks and 0 or blank elsewhere, such as C2:C400. Needs the dates. If omitted: none.
 * @returns One row per week ahead: week ending, forecast, then low and high per coverage level.
 */
export async function outlook(
  rates: any[][],
  weeks: number,
  method?: string,
  coverage?: any[][],
  dates?: any[][],
  headers?: boolean,
  lunar_new_year?: boolean,
  event_weeks?: any[][],
): Promise<any[][]> {
  return guardedAsync(async () => {
    const horizon = readNumber(weeks, "Weeks ahead");
    const report = await analysed(rates, dates, { method: readMethod(method), horizon, levels: readCoverage(coverage), checks: false, ...readCalendar(lunar_new_year, event_weeks, dates) });
    return outlookRows(report.tables.outlook, readHeaders(headers));
  });
}

/**
 * Expected average rate over a span of future weeks, with its interval, for budgets.
 * @customfunction MEANAHEAD
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param from_week First week ahead of the span, such as 1 for next week.
 * @param to_week Last week ahead of the span, such as 13 for the next quarter.
 * @param [method] Method code as text, such as "tbats" (see OUTLOOK). If omitted: lastyear with two years of rates, otherwise lastweek.
 * @param [coverage] Interval coverage in percent, such as 80 or {80,95}. If omitted: 80 and 95.
 * @param [dates] Week-ending dates beside the rates, such as A2:A400.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @param [lunar_new_year] Whether the weeks around the lunar new year are calendar regressors (SARIMA and TBATS take them; under "auto" the backtest also scores each without them), such as TRUE. Needs the dates. If omitted: FALSE.
 * @param [event_weeks] Weeks of events of your own (a strike, a closure) as one regressor for SARIMA and TBATS: a range of dates, any day of each week, past or coming, such as H2:H9; or a column of marks beside the dates, 1 (or x, TRUE) in the event weeks and 0 or blank elsewhere, such as C2:C400. Needs the dates. If omitted: none.
 * @returns One row: the expected average, then low and high per coverage level.
 */
export async function meanahead(
  rates: any[][],
  from_week: number,
  to_week: number,
  method?: string,
  coverage?: any[][],
  dates?: any[][],
  headers?: boolean,
  lunar_new_year?: boolean,
  event_weeks?: any[][],
): Promise<any[][]> {
  return guardedAsync(async () => {
    const from = readNumber(from_week, "The first week ahead");
    const to = readNumber(to_week, "The last week ahead");
    const report = await analysed(rates, dates, { method: readMethod(method), horizon: 1, levels: readCoverage(coverage), checks: false, spans: [{ from, to }], ...readCalendar(lunar_new_year, event_weeks, dates) });
    const t = present(report.tables.meanAhead, "The average over those weeks");
    const cols = ["Average", ...t.columns.filter((c) => /^(Low|High) /.test(c))];
    return tableOut(t, readHeaders(headers), cols);
  });
}

/**
 * Chance that the rate in a future week is above (or below) a level, such as a contract rate.
 * @customfunction CHANCE
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param level The rate level, such as 2100.
 * @param week Which week ahead, such as 4.
 * @param [direction] Which side of the level counts, such as "above" (or "below"). If omitted: above.
 * @param [method] Method code as text, such as "tbats" (see OUTLOOK). If omitted: lastyear with two years of rates, otherwise lastweek.
 * @param [dates] Week-ending dates beside the rates, such as A2:A400.
 * @param [headers] Whether the first row of the result holds the column name, such as TRUE. If omitted: no header row.
 * @param [lunar_new_year] Whether the weeks around the lunar new year are calendar regressors (SARIMA and TBATS take them; under "auto" the backtest also scores each without them), such as TRUE. Needs the dates. If omitted: FALSE.
 * @param [event_weeks] Weeks of events of your own (a strike, a closure) as one regressor for SARIMA and TBATS: a range of dates, any day of each week, past or coming, such as H2:H9; or a column of marks beside the dates, 1 (or x, TRUE) in the event weeks and 0 or blank elsewhere, such as C2:C400. Needs the dates. If omitted: none.
 * @returns The probability, between 0 and 1.
 */
export async function chance(
  rates: any[][],
  level: number,
  week: number,
  direction?: string,
  method?: string,
  dates?: any[][],
  headers?: boolean,
  lunar_new_year?: boolean,
  event_weeks?: any[][],
): Promise<any[][]> {
  return guardedAsync(async () => {
    const threshold = { level: readNumber(level, "The level"), week: readNumber(week, "The week ahead"), direction: readDirection(direction) };
    const report = await analysed(rates, dates, { method: readMethod(method), horizon: 1, checks: false, thresholds: [threshold], ...readCalendar(lunar_new_year, event_weeks, dates) });
    return tableOut(present(report.tables.chance, "The chance"), readHeaders(headers), ["Probability"]);
  });
}

/**
 * Seasonal factor of each ISO week, from an STL decomposition of the rates.
 * @customfunction WEEKFACTORS
 * @param rates Weekly rates, oldest first, at least three years: one column or row of cells, such as B2:B400.
 * @param [dates] Week-ending dates beside the rates, such as A2:A400 (needed to know the ISO weeks).
 * @param [kind] Factor kind, such as "multiplicative" (1.08 is 8% above the seasonally adjusted level) or "additive" (in the rates' own units). If omitted: multiplicative when every rate is positive.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @returns One row per ISO week 1–52: week, factor, years averaged.
 */
export async function weekfactors(rates: any[][], dates?: any[][], kind?: string, headers?: boolean): Promise<any[][]> {
  return guardedAsync(async () => {
    const k = readText(kind, 'The kind ("multiplicative" or "additive")')?.toLowerCase();
    if (k !== undefined && k !== "multiplicative" && k !== "additive") {
      throw new ArgumentError("#VALUE!", `The kind is "multiplicative" or "additive"; got "${k}".`);
    }
    if (readDates(dates) === undefined) throw new ArgumentError("#VALUE!", "Seasonal factors by ISO week need the week-ending dates beside the rates.");
    const report = await analysed(rates, dates, { method: "lastweek", horizon: 1, seasonKind: k });
    if (!report.tables.weekFactors && k === "multiplicative" && report.warnings.some((w) => /above zero/.test(w))) {
      throw new ArgumentError("#NUM!", "Multiplicative seasonal factors need every rate above zero; ask for additive factors instead.");
    }
    return tableOut(present(report.tables.weekFactors, "The seasonal factors", report, "Seasonality checks"), readHeaders(headers));
  });
}

/**
 * The decomposition's rows lined up with the input's rows, so the result spills beside the
 * rates: a dated row gets its own week's parts (a week the dates skip has no input row, so it
 * is left out), an undated row the parts at its position; a header row or a row the intake
 * trimmed (blank at either end) gets empty cells, or the column names for the header when asked.
 */
function alignedDecomposition(t: ReportTable, rates: unknown[][], dates: unknown[][] | undefined, hadHeader: boolean, headers: boolean): OutCell[][] {
  const parts = ["Trend", "Seasonal", "Remainder"];
  const body = tableOut(t, false, parts);
  const blank = (): OutCell[] => parts.map(() => "");
  const out: OutCell[][] = [];
  const top = hadHeader ? 1 : 0;
  if (hadHeader) out.push(headers ? [...parts] : blank());
  if (dates) {
    const byWeek = new Map<string, OutCell[]>();
    t.rows.forEach((r, i) => byWeek.set(String(r[0]), body[i]));
    for (let i = top; i < rates.length; i++) {
      const d = readDateCell(single(dates[i]));
      out.push((d.kind === "date" ? byWeek.get(isoDate(d.date)) : undefined) ?? blank());
    }
  } else {
    let first = top;
    while (first < rates.length && omitted(single(rates[first]))) first++;
    for (let i = top; i < rates.length; i++) out.push(body[i - first] ?? blank());
  }
  return headers && !hadHeader ? [[...parts], ...out] : out;
}

/**
 * Trend, seasonal and remainder of each week, from an STL decomposition of the rates, one row per input row.
 * @customfunction DECOMPOSE
 * @param rates Weekly rates, oldest first, at least two years: one column of cells, such as B2:B400.
 * @param [dates] Week-ending dates beside the rates, such as A2:A400.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row (a header cell on top of the rates still gets a row, left empty, so the result lines up).
 * @returns One row per input row: trend, seasonal, remainder (factors when on log rates: rate = trend × seasonal × remainder).
 */
export async function decompose(rates: any[][], dates?: any[][], headers?: boolean): Promise<any[][]> {
  return guardedAsync(async () => {
    const report = await analysed(rates, dates, { method: "lastweek", horizon: 1, checks: false, decompose: true });
    const t = present(report.tables.decomposition, "The decomposition");
    const datesIn = readDates(dates);
    const hadHeader = report.tables.data.rows.some((r) => r[0] === "Series" && r[1] !== null);
    return alignedDecomposition(t, rates as unknown[][], datesIn, hadHeader, readHeaders(headers));
  });
}

const TRANSFORMS: Record<string, RegExp> = {
  levels: /— (adjusted )?levels$/,
  logs: /— (adjusted )?log levels$/,
  changes: /changes/,
};

/**
 * Unit-root and stationarity tests (ADF, Phillips–Perron, KPSS) with a verdict each.
 * @customfunction STATIONARITY
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param [transform] Only the tests on one form of the rates, such as "logs" ("levels", "logs" or "changes"). If omitted: all of them.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @returns One row per test: test, statistic, p-value, lags, 5% critical value, verdict.
 */
export async function stationarity(rates: any[][], transform?: string, headers?: boolean): Promise<any[][]> {
  return guardedAsync(async () => {
    const form = readText(transform, 'The form ("levels", "logs" or "changes")')?.toLowerCase();
    if (form !== undefined && !(form in TRANSFORMS)) throw new ArgumentError("#VALUE!", `The form is "levels", "logs" or "changes"; got "${form}".`);
    const report = await analysed(rates, null, { method: "lastweek", horizon: 1 });
    const t = present(report.tables.stationarity, "The stationarity tests", report, "Stationarity checks");
    const rows = form === undefined ? t.rows : t.rows.filter((r) => TRANSFORMS[form].test(String(r[0])));
    if (rows.length === 0) throw new ArgumentError("#N/A", `No test was run on the ${form} of these rates.`);
    return tableOut({ ...t, rows }, readHeaders(headers), ["Test", "Statistic", "p-value", "Lags", "5% critical value", "Verdict"]);
  });
}

/**
 * Nonlinearity tests (Keenan, Tsay, Teräsvirta, BDS, McLeod–Li) on the rates made stationary.
 * @customfunction NONLINEARITY
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @returns One row per test: test, statistic, p-value, lags, verdict.
 */
export async function nonlinearity(rates: any[][], headers?: boolean): Promise<any[][]> {
  return guardedAsync(async () => {
    const report = await analysed(rates, null, { method: "lastweek", horizon: 1 });
    return tableOut(present(report.tables.nonlinearity, "The nonlinearity tests", report, "Nonlinearity checks"), readHeaders(headers), ["Test", "Statistic", "p-value", "Lags", "Verdict"]);
  });
}

/**
 * Rolling-origin backtest: how accurately each method forecast the last weeks from the weeks before them.
 * @customfunction BACKTEST
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param [test_weeks] Weeks at the end to forecast from, one origin a week, such as 52. If omitted: 52.
 * @param [horizon] Weeks ahead forecast from each origin, such as 4. If omitted: 4.
 * @param [refit] How often the models are re-estimated, such as "every" (every week), "fixed" (keep the first fit) or 4 (every 4 weeks). If omitted: every.
 * @param [methods] Method codes to compare, as text such as "tbats, sarima, lastyear". If omitted: tbats, sarima, nnar, their combination and lastyear, as far as the data allow.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @returns One row per method and week ahead: method, weeks ahead, MAPE %, MASE, RMSE, coverage of each interval.
 */
export async function backtest(
  rates: any[][],
  test_weeks?: number,
  horizon?: number,
  refit?: any,
  methods?: any[][],
  headers?: boolean,
): Promise<any[][]> {
  return guardedAsync(async () => {
    const testWeeks = test_weeks === null || test_weeks === undefined ? undefined : readWhole(test_weeks, "Test weeks", 1, 520);
    const ahead = horizon === null || horizon === undefined ? undefined : readWhole(horizon, "Weeks ahead", 1, 52);
    const report = await analysed(rates, null, {
      method: "lastweek",
      horizon: 1,
      checks: false,
      backtest: { testWeeks, horizon: ahead, modes: [readRefit(refit)], methods: readMethods(methods) },
    });
    const t = present(report.tables.backtest, "The backtest");
    const cols = ["Method", "Weeks ahead", "MAPE %", "MASE", "RMSE", ...t.columns.filter((c) => c.startsWith("Coverage "))];
    return tableOut(t, readHeaders(headers), cols);
  });
}

/**
 * The fitted model: its structure, each parameter with its standard error, AICc and σ.
 * @customfunction FITSUMMARY
 * @param rates Weekly rates, oldest first: one column or row of cells, such as B2:B400.
 * @param [method] Method code as text, such as "tbats" (see OUTLOOK). If omitted: lastyear with two years of rates, otherwise lastweek.
 * @param [headers] Whether the first row of the result holds the column names, such as TRUE. If omitted: no header row.
 * @returns Rows of name, value, standard error; the first row names the fitted structure.
 */
export async function fitsummary(rates: any[][], method?: string, headers?: boolean): Promise<any[][]> {
  return guardedAsync(async () => {
    const report = await analysed(rates, null, { method: readMethod(method), horizon: 1, checks: false });
    const rows = tableOut(report.tables.fit, false);
    const out: OutCell[][] = [["Structure", report.model.structure, ""], ...rows];
    return readHeaders(headers) ? [report.tables.fit.columns, ...out] : out;
  });
}
