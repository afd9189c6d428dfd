/**
 * The pane's Outlook, Season, Checks and Backtest sections as plain values, and the analysis
 * options they stand for. The form starts from runDefaults() (the batch runner's `run` uses
 * the same), so one click on Run does the whole job; a saved series' options fill the form
 * back in. Pure: no DOM and no host calls; taskpane.ts moves values between this and the page.
 */
import type { AnalysisOptions } from "../core/analysis";
import { MAX_HORIZON } from "../core/analysis";
import type { RefitMode } from "../core/evaluate/backtest";
import { DEFAULT_BACKTEST_HORIZON, DEFAULT_TEST_WEEKS } from "../core/evaluate/plan";
import { runDefaults } from "../core/present/defaults";
import { parseIsoDateText } from "../core/series/excelDate";

/** Methods offered, in the order the Method list shows them, with the words beside each. */
export const METHOD_CHOICES: { code: string; label: string }[] = [
  { code: "auto", label: "Best in backtest (auto)" },
  { code: "tbats", label: "TBATS" },
  { code: "sarima", label: "Seasonal ARIMA (SARIMA)" },
  { code: "nnar", label: "Neural network autoregression (NNAR)" },
  { code: "combo", label: "Average of TBATS, SARIMA and NNAR (combo)" },
  { code: "lastyear", label: "Same week last year (lastyear)" },
  { code: "lastweek", label: "Last week's rate (lastweek)" },
  { code: "drift", label: "Last rate plus average drift (drift)" },
];

export type RefitChoice = "every" | "fixed" | "both" | "interval";

export interface PaneForm {
  method: string;
  horizon: string;
  coverage: string;
  lunarNewYear: boolean;
  /** Event weeks of the desk's own: dates YYYY-MM-DD separated by commas, spaces or lines. */
  eventWeeks: string;
  checks: boolean;
  seasonKind: "auto" | "multiplicative" | "additive";
  decompose: boolean;
  backtest: boolean;
  testWeeks: string;
  windows: string;
  backtestHorizon: string;
  refit: RefitChoice;
  /** Weeks between re-estimations when refit is "interval". */
  refitEvery: string;
}

/** A field the user must correct, with the sentence shown beside it. */
export interface FormProblem {
  field: keyof PaneForm;
  message: string;
}

export function defaultForm(): PaneForm {
  return formFromOptions(runDefaults());
}

function modesOf(choice: RefitChoice, every: number): RefitMode[] {
  switch (choice) {
    case "every":
      return ["every"];
    case "fixed":
      return ["fixed"];
    case "both":
      return ["every", "fixed"];
    case "interval":
      return [every];
  }
}

function wholeIn(text: string, min: number, max: number): number | null {
  const t = text.trim();
  if (!/^\d+$/.test(t)) return null;
  const n = Number(t);
  return n >= min && n <= max ? n : null;
}

/** The coverage text ("80, 95") as levels, or null when it does not read as percentages. */
export function parseCoverage(text: string): number[] | null {
  const parts = text
    .split(/[,;\s]+/)
    .map((p) => p.replace(/%$/, "").trim())
    .filter((p) => p !== "");
  if (parts.length === 0) return null;
  const levels = parts.map(Number);
  if (levels.some((l) => !Number.isFinite(l) || l <= 0 || l >= 100)) return null;
  return [...new Set(levels)].sort((a, b) => a - b);
}

/** The event-week dates of the field, in the order typed; null when one is not a YYYY-MM-DD date. */
export function parseEventWeeks(text: string): string[] | null {
  const items = text.split(/[\s,;]+/).map((x) => x.trim()).filter((x) => x.length > 0);
  return items.every((x) => parseIsoDateText(x) !== undefined) ? items : null;
}

/** The options for the form, or the problems to fix first. */
export function optionsFromForm(form: PaneForm): { options: AnalysisOptions; problems: FormProblem[] } {
  const problems: FormProblem[] = [];
  const horizon = wholeIn(form.horizon, 1, MAX_HORIZON);
  if (horizon === null) problems.push({ field: "horizon", message: `Weeks ahead: a whole number from 1 to ${MAX_HORIZON}, such as 12.` });
  const levels = parseCoverage(form.coverage);
  if (levels === null) problems.push({ field: "coverage", message: "Coverage: percentages between 0 and 100, such as 80, 95." });
  if (!METHOD_CHOICES.some((m) => m.code === form.method)) problems.push({ field: "method", message: "Choose a method from the list." });

  const options: AnalysisOptions = {
    method: form.method,
    horizon: horizon ?? 12,
    levels: levels ?? [80, 95],
    checks: form.checks,
    choose: "mase",
  };
  if (form.seasonKind !== "auto") options.seasonKind = form.seasonKind;
  if (form.decompose) options.decompose = true;
  if (form.lunarNewYear) options.calendar = { lunarNewYear: true };
  const events = parseEventWeeks(form.eventWeeks);
  if (events === null) {
    problems.push({ field: "eventWeeks", message: "Event weeks: dates written YYYY-MM-DD (any day of each week), separated by commas, such as 2024-10-01, 2025-03-04." });
  } else if (events.length > 0) {
    options.calendar = { ...options.calendar, events };
  }

  const backtestWanted = form.backtest || form.method === "auto";
  if (form.method === "auto" && !form.backtest) {
    problems.push({ field: "backtest", message: "“Best in backtest” needs the backtest: tick Run a backtest, or choose a method." });
  }
  if (backtestWanted) {
    const testWeeks = wholeIn(form.testWeeks, 4, 520);
    if (testWeeks === null) problems.push({ field: "testWeeks", message: "Weeks tested: a whole number from 4 to 520, such as 52." });
    const windows = wholeIn(form.windows, 1, 10);
    if (windows === null) problems.push({ field: "windows", message: "Windows: a whole number from 1 to 10." });
    const bh = wholeIn(form.backtestHorizon, 1, 52);
    if (bh === null) problems.push({ field: "backtestHorizon", message: "Backtest weeks ahead: a whole number from 1 to 52, such as 4." });
    let every = 4;
    if (form.refit === "interval") {
      const e = wholeIn(form.refitEvery, 2, 52);
      if (e === null) problems.push({ field: "refitEvery", message: "Re-estimate every: a whole number of weeks from 2 to 52." });
      else every = e;
    }
    options.backtest = {
      testWeeks: testWeeks ?? DEFAULT_TEST_WEEKS,
      windows: windows ?? 1,
      horizon: bh ?? DEFAULT_BACKTEST_HORIZON,
      modes: modesOf(form.refit, every),
    };
    if ((windows ?? 1) === 1) delete options.backtest.windows;
  }
  return { options, problems };
}

/** The form showing `options` (a saved series' options, or the defaults). */
export function formFromOptions(options: AnalysisOptions): PaneForm {
  const b = options.backtest ?? null;
  const modes = b?.modes ?? ["every"];
  let refit: RefitChoice = "every";
  let refitEvery = "4";
  if (modes.length >= 2) refit = "both";
  else if (modes[0] === "fixed") refit = "fixed";
  else if (typeof modes[0] === "number") {
    refit = "interval";
    refitEvery = String(modes[0]);
  }
  return {
    method: options.method ?? "auto",
    horizon: String(options.horizon ?? 12),
    coverage: (options.levels ?? [80, 95]).join(", "),
    lunarNewYear: Boolean(options.calendar?.lunarNewYear),
    eventWeeks: (options.calendar?.events ?? []).join(", "),
    checks: options.checks !== false,
    seasonKind: options.seasonKind ?? "auto",
    decompose: options.decompose === true,
    backtest: b !== null,
    testWeeks: String(b?.testWeeks ?? DEFAULT_TEST_WEEKS),
    windows: String(b?.windows ?? 1),
    backtestHorizon: String(b?.horizon ?? DEFAULT_BACKTEST_HORIZON),
    refit,
    refitEvery,
  };
}
