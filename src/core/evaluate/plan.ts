/**
 * Backtest options → a checked plan (which methods, windows, modes), with sentences a desk
 * analyst understands for every option that cannot be honoured.
 */
import { InputError } from "../series/errors";
import { PLAIN_SUFFIX } from "../models/types";
import type { BacktestPlan, ModelLookup, RefitMode, WindowSpan } from "./backtest";

export interface BacktestOptions {
  /** Method codes to compare; "combo" is scored from the other methods (default below). */
  methods?: string[];
  /** Options per method code, passed to its fit. */
  methodOptions?: Record<string, Record<string, unknown>>;
  /** Members of "combo" (default: the listed methods other than the baselines). */
  comboMembers?: string[];
  /** Weeks in each test window; default 52. */
  testWeeks?: number;
  /** Consecutive windows of testWeeks, ending at the last week; default 1. */
  windows?: number;
  /** Weeks ahead forecast from each origin; default 4. */
  horizon?: number;
  /** Refit modes to compare: "every", "fixed" or a whole number of weeks; default ["every"]. */
  modes?: RefitMode[];
  /** Interval coverage levels in percent; default [80, 95]. */
  levels?: number[];
}

export const DEFAULT_TEST_WEEKS = 52;
export const DEFAULT_BACKTEST_HORIZON = 4;
export const DEFAULT_METHODS = ["tbats", "sarima", "nnar", "combo"];
const BASELINES = new Set(["lastweek", "lastyear", "drift"]);

function bad(message: string): InputError {
  return new InputError("BAD_OPTION", message);
}

function wholeNumber(v: unknown, what: string, min: number): number {
  if (typeof v !== "number" || !Number.isInteger(v) || v < min) throw bad(`${what} must be a whole number of at least ${min}; got ${String(v)}.`);
  return v;
}

function checkMode(m: unknown): RefitMode {
  if (m === "every" || m === "fixed") return m;
  if (typeof m === "number" && Number.isInteger(m) && m >= 2) return m;
  if (m === 1) return "every";
  throw bad(`A refit mode is "every" (re-estimate every week), "fixed" (keep the first fit's parameters) or a whole number of weeks of 2 or more; got ${String(m)}.`);
}

/** Checks the options against the series and the methods' own minimum lengths. */
export function planBacktest(n: number, options: BacktestOptions, lookup: ModelLookup): BacktestPlan {
  const testWeeks = wholeNumber(options.testWeeks ?? DEFAULT_TEST_WEEKS, "The number of test weeks", 1);
  const windowCount = wholeNumber(options.windows ?? 1, "The number of test windows", 1);
  const horizon = wholeNumber(options.horizon ?? DEFAULT_BACKTEST_HORIZON, "The weeks ahead of a backtest", 1);
  const levels = options.levels ?? [80, 95];
  for (const l of levels) {
    if (!(typeof l === "number" && l > 0 && l < 100)) throw bad(`A coverage level must be a percentage between 0 and 100, such as 80 or 95; got ${String(l)}.`);
  }
  const modes = (options.modes ?? ["every"]).map(checkMode);
  if (modes.length === 0) throw bad("Give at least one refit mode.");
  const asked = (options.methods ?? DEFAULT_METHODS).map((m) => String(m).trim().toLowerCase());
  if (asked.length === 0) throw bad("Give at least one method to backtest.");
  if (asked.includes("auto")) throw bad('"auto" is chosen by a backtest, so it cannot be one of the methods a backtest compares.');
  const wantCombo = asked.includes("combo");
  const fitted = asked.filter((m) => m !== "combo");
  // The combination averages the models, not the baselines nor a model's calendar-free twin.
  const members = wantCombo ? (options.comboMembers ?? fitted.filter((m) => !BASELINES.has(m) && !m.endsWith(PLAIN_SUFFIX))).map((m) => m.toLowerCase()) : [];
  if (wantCombo && members.length < 2) {
    throw bad("A combination in a backtest needs at least two methods to average; list them as its members or among the methods.");
  }
  for (const m of members) if (m === "combo") throw bad("A combination cannot be one of its own members.");
  const methods = [...new Set([...fitted, ...members])];
  for (const m of methods) lookup(m); // refuses unknown codes with the list of choices

  const span = testWeeks * windowCount;
  const firstOrigin = n - span;
  const need = Math.max(...methods.map((m) => lookup(m).minLength(options.methodOptions?.[m])));
  if (firstOrigin < need) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `A backtest of ${span} weeks leaves ${Math.max(firstOrigin, 0)} weeks before its first origin, fewer than the ${need} the methods need; ` +
        `use fewer test weeks or windows (the series has ${n}).`,
    );
  }
  const windows: WindowSpan[] = [];
  for (let w = 0; w < windowCount; w++) {
    const first = firstOrigin + w * testWeeks;
    windows.push({ first, last: first + testWeeks - 1 });
  }
  return {
    n,
    horizon,
    levels: [...levels],
    windows,
    modes,
    methods,
    combos: wantCombo ? [{ code: "combo", members }] : [],
  };
}
