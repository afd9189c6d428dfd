/**
 * analyse(series, options) → Report: the single entry every sink (worksheet functions, pane,
 * batch) calls, so that all of them render the same tables. This version covers the data
 * summary, the outlook of one registered method and its fit summary; later sections
 * (season, checks, backtest) add tables here, not in the sinks.
 */
import { addWeeks, isoDate } from "./series/calendar";
import { InputError } from "./series/errors";
import type { WeeklySeries } from "./series/types";
import { WEEKDAY_NAMES } from "./series/wording";
import { DEFAULT_MEMBERS } from "./models/combination/options";
import { PLAIN_SUFFIX, getModel, isPlainKey, plainKey } from "./models/registry";
import type { SearchedStructure } from "./models/types";
import { modePhrase } from "./evaluate/backtest";
import { DEFAULT_TEST_WEEKS, type BacktestOptions } from "./evaluate/plan";
import { backtest, type BacktestControl, type BacktestResult } from "./evaluate/run";
import { bestBy, scoreRuns } from "./evaluate/score";
import { backtestTables, type BacktestTables } from "./evaluate/tables";
import type { Cell, ReportTable } from "./report";
import { table } from "./report";
import type { CheckTables } from "./diagnostics/battery";
import { runChecks } from "./diagnostics/battery";
import { decompositionTable } from "./diagnostics/seasonality/decomposition";
import type { FactorKind } from "./diagnostics/seasonality/factors";
import { checkWindow, type LunarWindow } from "./series/lunarRegressors";
import { eventWeekEndings } from "./series/eventRegressors";
import { checkSpans, checkThresholds, crossingChances, outlookPaths, spanAverages, type Span, type Threshold } from "./outlook/paths";
import { chanceTable, meanAheadTable } from "./outlook/tables";

export interface AnalysisOptions {
  /** Method code (DESIGN.md); default "lastyear" when two years of history exist, else "lastweek". */
  method?: string;
  /** Weeks ahead, 1–260; default 12. */
  horizon?: number;
  /** Central interval coverage levels in percent; default [80, 95]. */
  levels?: number[];
  /** Run the diagnostic checks (stationarity, seasonality, nonlinearity, residuals); default true. */
  checks?: boolean;
  /**
   * Run a rolling-origin backtest (src/core/evaluate) with these options and add its tables;
   * with method "auto" it runs anyway (defaults below) and picks the method. Default: none.
   */
  backtest?: BacktestOptions | null;
  /** The accuracy measure "auto" chooses by (mean over the backtest's weeks ahead); default "mase". */
  choose?: ChoiceMetric;
  /** Spans of future weeks whose average rate (with intervals) the report gives, from simulated paths. */
  spans?: Span[];
  /** Levels whose chance of being crossed in a future week the report gives, from the same paths. */
  thresholds?: Threshold[];
  /** Add the week-by-week STL decomposition; default false. */
  decompose?: boolean;
  /** Seasonal factors and decomposition multiplicative (on log rates) or additive; default: multiplicative when every rate is positive. */
  seasonKind?: FactorKind;
  /**
   * Calendar regressors: `lunarNewYear` true (the default window) or a window of weeks before
   * and after the holiday (series/lunarRegressors.ts). Used by SARIMA and TBATS, in the fit and
   * in the backtest (which also scores each without them); needs dates. Default: none.
   */
  calendar?: {
    lunarNewYear?: boolean | Partial<LunarWindow>;
    /**
     * Event weeks of the desk's own (dates written YYYY-MM-DD, any day of the week; past and
     * future): one 0/1 regressor for SARIMA and TBATS (series/eventRegressors.ts). Needs dates,
     * and at least one listed week within the rates.
     */
    events?: string[];
  };
  /**
   * The backtest sees only the first k weeks (the choice of "auto" with it). The pane's
   * refresh keeps its last full run's backtest this way, so a pasted week costs one fit, not a
   * backtest; k ≥ the series' length means every week. Default: every week.
   */
  backtestThrough?: number;
}

export type ChoiceMetric = "mase" | "mape" | "rmse" | "smape";

/** Options after defaults, as the report states them. */
export interface ResolvedOptions {
  method: string;
  horizon: number;
  levels: number[];
  checks: boolean;
  backtest: BacktestOptions | null;
  choose: ChoiceMetric;
  spans: Span[];
  thresholds: Threshold[];
  decompose: boolean;
  seasonKind: FactorKind | null;
  /** `events`: the listed weeks as week endings of the series' weeks, sorted (empty: none). */
  calendar: { lunarNewYear: LunarWindow | null; events: string[] };
  /** Weeks the backtest sees when fewer than the series has (options.backtestThrough), else null. */
  backtestThrough: number | null;
}

/** Progress and cancellation for the slow part of an analysis (the backtest). */
export type AnalysisControl = BacktestControl;

export interface Report {
  tables: {
    data: ReportTable;
    outlook: ReportTable;
    fit: ReportTable;
    /** Structures the method's automatic search fitted (TBATS, SARIMA). */
    search?: ReportTable;
    /** Seasonal factors from the method's own seasonal part, for dated series (TBATS). */
    modelSeason?: ReportTable;
    /** Backtest tables, when a backtest ran (evaluate/tables.ts). */
    backtest?: ReportTable;
    backtestSignificance?: ReportTable;
    backtestCost?: ReportTable;
    backtestOrigins?: ReportTable;
    /** Average rate over spans of future weeks, with intervals (options.spans). */
    meanAhead?: ReportTable;
    /** Chance of a rate above or below a level in a future week (options.thresholds). */
    chance?: ReportTable;
    /** STL trend, seasonal and remainder week by week (options.decompose). */
    decomposition?: ReportTable;
  } & CheckTables;
  /** Intake warnings followed by the model's notes. */
  warnings: string[];
  /** The last week of data as YYYY-MM-DD, or null for an undated series. */
  lastWeek: string | null;
  /** The options actually used, after defaults. */
  options: ResolvedOptions;
  /** The method that made the outlook: its code (the backtest's pick for "auto"), name and fitted structure. */
  model: { method: string; label: string; structure: string };
}

export const MAX_HORIZON = 260;
export const DEFAULT_HORIZON = 12;
export const DEFAULT_LEVELS = [80, 95];

export function resolveOptions(series: WeeklySeries, options: AnalysisOptions = {}): ResolvedOptions {
  const horizon = options.horizon ?? DEFAULT_HORIZON;
  if (!Number.isInteger(horizon) || horizon < 1 || horizon > MAX_HORIZON) {
    throw new InputError("BAD_OPTION", `The number of weeks ahead must be a whole number from 1 to ${MAX_HORIZON}; got ${horizon}.`);
  }
  const levels = options.levels ?? DEFAULT_LEVELS;
  if (levels.length === 0) throw new InputError("BAD_OPTION", "Give at least one coverage level, such as 80 or 95.");
  for (const l of levels) {
    if (!(typeof l === "number" && l > 0 && l < 100)) {
      throw new InputError("BAD_OPTION", `A coverage level must be a percentage between 0 and 100, such as 80 or 95; got ${l}.`);
    }
  }
  const method = options.method ?? (series.values.length >= 104 ? "lastyear" : "lastweek");
  const choose = options.choose ?? "mase";
  if (!["mase", "mape", "rmse", "smape"].includes(choose)) {
    throw new InputError("BAD_OPTION", `"auto" chooses by MASE, MAPE, RMSE or sMAPE; got "${String(choose)}".`);
  }
  const spans = (options.spans ?? []).map((x) => ({ from: x.from, to: x.to }));
  const thresholds = (options.thresholds ?? []).map((x) => ({ level: x.level, week: x.week, direction: x.direction }));
  checkSpans(spans, MAX_HORIZON);
  checkThresholds(thresholds, MAX_HORIZON);
  return {
    method: method.trim().toLowerCase(),
    horizon,
    levels: [...levels],
    checks: options.checks ?? true,
    backtest: options.backtest ?? null,
    choose,
    spans,
    thresholds,
    decompose: options.decompose ?? false,
    seasonKind: checkKind(options.seasonKind),
    calendar: { lunarNewYear: lunarOption(series, options.calendar?.lunarNewYear), events: eventsOption(series, options.calendar?.events) },
    backtestThrough: throughOption(series, options.backtestThrough),
  };
}

function throughOption(series: WeeklySeries, k: number | undefined): number | null {
  if (k === undefined) return null;
  if (!Number.isInteger(k) || k < 1) throw new InputError("BAD_OPTION", `The weeks the backtest sees must be a whole number of at least 1; got ${k}.`);
  return k >= series.values.length ? null : k;
}

/** The part of the series the backtest sees: all of it, or its first opts.backtestThrough weeks. */
export function backtestSeries(series: WeeklySeries, opts: ResolvedOptions): WeeklySeries {
  const k = opts.backtestThrough;
  if (k === null) return series;
  const dated = series.dates.length === series.values.length;
  return {
    ...series,
    values: series.values.slice(0, k),
    dates: dated ? series.dates.slice(0, k) : series.dates,
    filled: series.filled.slice(0, k),
  };
}

function lunarOption(series: WeeklySeries, v: boolean | Partial<LunarWindow> | undefined): LunarWindow | null {
  if (v === undefined || v === false) return null;
  if (series.dates.length !== series.values.length || series.values.length === 0) {
    throw new InputError("BAD_OPTION", "Lunar-new-year effects need the week-ending dates beside the rates.");
  }
  return checkWindow(v === true ? {} : v);
}

function eventsOption(series: WeeklySeries, v: string[] | undefined): string[] {
  if (v === undefined || v.length === 0) return [];
  const n = series.values.length;
  if (series.dates.length !== n || n === 0) throw new InputError("BAD_OPTION", "Event weeks need the week-ending dates beside the rates.");
  const weeks = eventWeekEndings(series.dates[0], v);
  const first = isoDate(series.dates[0]);
  const last = isoDate(series.dates[n - 1]);
  if (!weeks.some((w) => w >= first && w <= last)) {
    throw new InputError(
      "BAD_OPTION",
      `None of the event weeks falls within the rates (${first} to ${last}), so their effect cannot be estimated; list at least one past week.`,
    );
  }
  return weeks;
}

/** Whether any calendar regressor is asked for. */
export function hasCalendar(opts: ResolvedOptions): boolean {
  return opts.calendar.lunarNewYear !== null || opts.calendar.events.length > 0;
}

/** The calendar regressors asked for, in words for notes: "Lunar-new-year effects", "Event weeks" or both. */
function calendarWords(opts: ResolvedOptions): string {
  const parts = [opts.calendar.lunarNewYear ? "Lunar-new-year effects" : null, opts.calendar.events.length > 0 ? "event weeks" : null].filter((x): x is string => x !== null);
  const text = parts.join(" and ");
  return text.charAt(0).toUpperCase() + text.slice(1);
}

/** Methods that take calendar regressors: SARIMA (regression with ARMA errors) and TBATS (on the transformed scale). */
const CALENDAR_METHODS = ["sarima", "tbats"];

/** The fit options a method gets from the analysis options (its calendar regressors). */
function calendarOptions(series: WeeklySeries, opts: ResolvedOptions, code: string): Record<string, unknown> | undefined {
  const { lunarNewYear, events } = opts.calendar;
  if (!hasCalendar(opts) || !CALENDAR_METHODS.includes(code)) return undefined;
  return { calendar: { start: isoDate(series.dates[0]), ...(lunarNewYear ? { lunarNewYear } : {}), ...(events.length > 0 ? { events } : {}) } };
}

/** A method's fit options: the combination's members (as backtested) and, through it or directly, the calendar. */
function fitOptionsFor(series: WeeklySeries, opts: ResolvedOptions, code: string, comboMembers: string[] | undefined): Record<string, unknown> | undefined {
  if (code !== "combo") return calendarOptions(series, opts, code);
  const o: Record<string, unknown> = {};
  if (comboMembers) o.members = comboMembers;
  const memberOptions: Record<string, Record<string, unknown>> = {};
  for (const m of CALENDAR_METHODS) {
    const c = calendarOptions(series, opts, m);
    if (c && (!comboMembers || comboMembers.includes(m))) memberOptions[m] = c;
  }
  if (Object.keys(memberOptions).length > 0) o.memberOptions = memberOptions;
  return Object.keys(o).length > 0 ? o : undefined;
}

/** Which members of a combination take the calendar, in words. */
function comboCalendarNote(opts: ResolvedOptions, members: readonly string[] | undefined): string {
  const taking = CALENDAR_METHODS.filter((m) => (members ?? DEFAULT_MEMBERS).includes(m)).map((m) => (m === "sarima" ? "SARIMA" : "TBATS"));
  const head = `${calendarWords(opts)} are used by SARIMA and TBATS only`;
  if (taking.length === 0) return `${head}; no member of the combination takes them.`;
  return `${head}: in the combination, its ${taking.join(" and ")} member${taking.length > 1 ? "s take" : " takes"} them.`;
}

function checkKind(k: unknown): FactorKind | null {
  if (k === undefined || k === null) return null;
  if (k === "multiplicative" || k === "additive") return k;
  throw new InputError("BAD_OPTION", `Seasonal factors are "multiplicative" or "additive"; got "${String(k)}".`);
}

function levelLabel(l: number): string {
  return `${Number(l.toFixed(4))}%`;
}

/** What the intake read, as the Data table every sink shows (the pane shows it before a run). */
export function describeData(series: WeeklySeries): ReportTable {
  const n = series.values.length;
  const dated = series.dates.length === n && n > 0;
  const filled = series.filled.filter(Boolean).length;
  const rows: Cell[][] = [
    ["Series", series.name ?? null],
    ["Weeks read", n],
    ["First week ending", dated ? isoDate(series.dates[0]) : null],
    ["Last week ending", dated ? isoDate(series.dates[n - 1]) : null],
    ["Weeks end on", series.weekday !== undefined ? WEEKDAY_NAMES[series.weekday] : null],
    ["Weeks filled", filled],
    ["Dates", dated ? "read from the sheet" : "none given: consecutive weeks assumed"],
    ["Last rate", n > 0 ? series.values[n - 1] : null],
  ];
  return table("Data", ["Item", "Value"], rows, [...series.warnings]);
}

/** The search table: every structure fitted, best first, with its distance from the best. */
export function searchTable(label: string, tried: SearchedStructure[]): ReportTable {
  const best = tried[0].value;
  const criterion = tried[0].criterion;
  const rows: Cell[][] = tried.map((c, i) => [c.structure, c.value, c.value - best, i === 0 ? "chosen" : null]);
  return table(`Structures tried: ${label}`, ["Structure", criterion, `${criterion} above best`, "Chosen"], rows, [
    `Every structure the automatic search fitted, lowest ${criterion} first. By a common rule of thumb (Burnham & Anderson, 2002), differences below about 2 are too small to prefer one structure on the data alone.`,
  ]);
}

/** Methods "auto" compares by default: the three models, their combination and the seasonal naive. */
export const AUTO_CANDIDATES = ["tbats", "sarima", "nnar", "combo", "lastyear"];

/**
 * The backtest options an analysis runs with: the caller's, with the methods and levels
 * filled in. For "auto" without a list, the candidates that the first origin has weeks enough
 * for (the seasonal naive needs two years, say). A caller that runs the backtest elsewhere (the
 * engine's pool) runs exactly these and hands the result to analyse().
 */
export function backtestOptionsFor(series: WeeklySeries, opts: ResolvedOptions): BacktestOptions {
  const asked = opts.backtest ?? {};
  const n = series.values.length;
  let methods = asked.methods;
  if (!methods) {
    const before = n - (asked.testWeeks ?? DEFAULT_TEST_WEEKS) * (asked.windows ?? 1);
    methods = AUTO_CANDIDATES.filter((m) => m === "combo" || getModel(m).minLength() <= before);
    if (methods.filter((m) => m !== "combo" && m !== "lastyear").length < 2) methods = methods.filter((m) => m !== "combo");
    if (methods.length === 0) {
      throw new InputError("TOO_FEW_POINTS", `A backtest needs more weeks before its test window; the series has ${n}. Use fewer test weeks.`);
    }
  }
  // With the calendar on, each method that takes it is also scored without it, so the backtest
  // shows what the regressors buy (and "auto" may choose either); the twin's options are the
  // method's less the calendar.
  let methodOptions = asked.methodOptions;
  for (const code of CALENDAR_METHODS) {
    const withCalendar = calendarOptions(series, opts, code);
    if (!withCalendar || !methods.includes(code)) continue;
    const own = asked.methodOptions?.[code];
    methodOptions = { ...methodOptions, [code]: { ...own, ...withCalendar } };
    if (!methods.includes(plainKey(code))) {
      const at: number = methods.indexOf(code) + 1;
      methods = [...methods.slice(0, at), plainKey(code), ...methods.slice(at)];
      if (own) methodOptions[plainKey(code)] = own;
    }
  }
  return { ...asked, methods, levels: asked.levels ?? opts.levels, ...(methodOptions ? { methodOptions } : {}) };
}

/** Whether an analysis with these options runs a backtest. */
export function needsBacktest(opts: ResolvedOptions): boolean {
  return opts.method === "auto" || opts.backtest !== null;
}

/** The backtest of an analysis (run here, or given) and, for "auto", the method it picks. */
function runBacktest(
  series: WeeklySeries,
  opts: ResolvedOptions,
  control: AnalysisControl,
  given: BacktestResult | undefined,
): { tables: BacktestTables; chosen: string | null; note: string | null } {
  const full = series.values.length;
  const seen = backtestSeries(series, opts);
  const n = seen.values.length;
  const result = given ?? backtest(seen.values, backtestOptionsFor(seen, opts), getModel, control);
  if (result.plan.n !== n) {
    throw new Error(`analyse: the backtest given was planned for ${result.plan.n} weeks, the series has ${n}`);
  }
  const dated = seen.dates.length === n && n > 0;
  const tables = backtestTables(seen.values, result, dated ? seen.dates : null);
  if (n < full) {
    const since = full - n;
    const through = dated ? `week ending ${isoDate(seen.dates[n - 1])}` : `week ${n}`;
    const kept = `This backtest is the one of the last full run, through ${through}; the ${since} week${since === 1 ? "" : "s"} since ${since === 1 ? "is" : "are"} not scored yet.`;
    tables.accuracy = { ...tables.accuracy, notes: [...tables.accuracy.notes, kept] };
  }
  if (opts.method !== "auto") return { tables, chosen: null, note: null };
  const mode = result.plan.modes[0];
  const chosen = bestBy(scoreRuns(seen.values, result.plan, result.runs), mode, opts.choose, result.plan.windows.length);
  if (chosen === null) throw new InputError("TOO_FEW_POINTS", "None of the methods could be scored in the backtest, so none can be chosen.");
  const label = getModel(chosen).label;
  const note =
    `Chosen by backtest: ${label} had the lowest ${opts.choose.toUpperCase()} averaged over 1–${result.plan.horizon} weeks ahead, ` +
    `from every week of the last ${result.plan.windows.length * (result.plan.windows[0].last - result.plan.windows[0].first + 1)} weeks` +
    `${n < full ? ` to ${dated ? `week ending ${isoDate(seen.dates[n - 1])}` : `week ${n}`}` : ""} (${modePhrase(mode)}).`;
  return { tables, chosen, note };
}

/** What a caller may hand analyse() ready-made. */
export interface AnalysisGiven {
  /** The backtest of backtestOptionsFor(backtestSeries(series, resolved), resolved), run elsewhere (the engine's pool). */
  backtest?: BacktestResult;
}

export function analyse(series: WeeklySeries, options: AnalysisOptions = {}, control: AnalysisControl = {}, given: AnalysisGiven = {}): Report {
  const opts = resolveOptions(series, options);
  let bt: { tables: BacktestTables; chosen: string | null; note: string | null } | null = null;
  if (needsBacktest(opts)) bt = runBacktest(series, opts, control, given.backtest);
  const code = bt?.chosen ?? opts.method;
  const model = getModel(code);
  const n = series.values.length;
  const need = model.minLength();
  if (n < need) {
    throw new InputError("TOO_FEW_POINTS", `${model.label} needs at least ${need} weeks of rates; the data has ${n}.`);
  }
  const comboMembers = code === "combo" && bt ? opts.backtest?.comboMembers : undefined;
  const fitted = model.fit(series.values, fitOptionsFor(series, opts, code, comboMembers));
  const calendarNote = !hasCalendar(opts) || CALENDAR_METHODS.includes(code)
    ? []
    : isPlainKey(code)
      ? [`The backtest scored ${getModel(code.slice(0, -PLAIN_SUFFIX.length)).label} better without the ${calendarWords(opts).toLowerCase()} as regressors, so the outlook is fitted without them.`]
      : code === "combo"
      ? [comboCalendarNote(opts, comboMembers)]
      : [`${calendarWords(opts)} are used by SARIMA and TBATS only; ${model.label} was fitted without them.`];
  const fc = fitted.forecast(opts.horizon, opts.levels);
  const dated = series.dates.length === n && n > 0;
  const last = dated ? series.dates[n - 1] : null;

  const columns = ["Step", "Week ending", "Forecast"];
  for (const l of opts.levels) columns.push(`Low ${levelLabel(l)}`, `High ${levelLabel(l)}`);
  const rows: Cell[][] = [];
  for (let s = 0; s < opts.horizon; s++) {
    const row: Cell[] = [s + 1, last ? isoDate(addWeeks(last, s + 1)) : null, fc.point[s]];
    for (let i = 0; i < opts.levels.length; i++) row.push(fc.lower[i][s], fc.upper[i][s]);
    rows.push(row);
  }
  const summary = fitted.summary();
  const outlook = table(`Outlook: ${model.label}`, columns, rows, [
    `Method: ${summary.structure}.`,
    ...(bt?.note ? [bt.note] : []),
    "Forecasts are statistical estimates from past rates only; they are not advice to book, fix or trade.",
  ]);
  const fitRows: Cell[][] = summary.parameters.map((p) => [p.name, p.value, p.se ?? null]);
  fitRows.push(["AICc", Number.isFinite(fitted.aicc) ? fitted.aicc : null, null]);
  const fit = table(`Fit: ${model.label}`, ["Parameter", "Value", "Std. error"], fitRows, summary.notes);

  const checks = opts.checks
    ? runChecks(series, { residuals: fitted.residuals, armaDf: summary.armaDf, label: model.label }, opts.seasonKind ? { seasonKind: opts.seasonKind } : {})
    : { tables: {}, skipped: [] };

  const extra: Partial<Record<"search" | "modelSeason" | "backtest" | "backtestSignificance" | "backtestCost" | "backtestOrigins" | "meanAhead" | "chance" | "decomposition", ReportTable>> = {};
  if (opts.spans.length > 0 || opts.thresholds.length > 0) {
    const far = Math.max(checkSpans(opts.spans, MAX_HORIZON), checkThresholds(opts.thresholds, MAX_HORIZON));
    const paths = outlookPaths(fitted, far);
    const weekOf = (k: number): Cell => (last ? isoDate(addWeeks(last, k)) : null);
    if (opts.spans.length > 0) extra.meanAhead = meanAheadTable(spanAverages(paths, opts.spans, opts.levels), opts.levels, weekOf, model.label);
    if (opts.thresholds.length > 0) extra.chance = chanceTable(crossingChances(paths, opts.thresholds), weekOf, model.label);
  }
  if (opts.decompose) extra.decomposition = decompositionTable(series, {}, opts.seasonKind ?? undefined);
  const tried = fitted.searched?.() ?? [];
  if (tried.length > 0) extra.search = searchTable(model.label, tried);
  if (fitted.weekFactorTable && dated) {
    try {
      extra.modelSeason = fitted.weekFactorTable(series.dates);
    } catch (e) {
      if (!(e instanceof InputError)) throw e; // a model without a seasonal part has no factors
    }
  }

  if (bt) {
    extra.backtest = bt.tables.accuracy;
    extra.backtestSignificance = bt.tables.significance;
    extra.backtestCost = bt.tables.cost;
    extra.backtestOrigins = bt.tables.origins;
  }

  return {
    tables: { data: describeData(series), outlook, fit, ...extra, ...checks.tables },
    warnings: [...series.warnings, ...(bt?.note ? [bt.note] : []), ...calendarNote, ...summary.notes, ...checks.skipped],
    lastWeek: last ? isoDate(last) : null,
    options: opts,
    model: { method: code, label: model.label, structure: summary.structure },
  };
}
