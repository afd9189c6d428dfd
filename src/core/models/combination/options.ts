/**
 * Options of a forecast combination: their names, defaults and checks, and the fewest weeks a
 * setting needs. The names are ours (DESIGN.md, "Vocabulary").
 */
import type { MethodCode, ModelSpec } from "../types";
import { badOption, wholeOption } from "../arguments";

export type CombinationRule = "mean" | "median" | "inverse-mse";
export type IntervalMethod = "quantiles" | "paths";

/** The registry's table, read when a combination is fitted (registry.ts passes it in). */
export type ModelTable = Partial<Record<MethodCode, ModelSpec>>;

/** Combination options. A type alias (not an interface) so that it fits ModelSpec's default option type. */
export type CombinationOptions = {
  /**
   * Method codes to combine, in order; a code may repeat. Default: the registered ones of
   * tbats, sarima and nnar whose minLength fits the data, topped up with the baselines
   * lastyear, drift and then lastweek (as far as each fits) until there are two.
   */
  members?: string[];
  /** Options passed to each member's fit, keyed by method code, e.g. { nnar: { networks: 5 } }. */
  memberOptions?: Record<string, object>;
  /**
   * How member forecasts are combined. "mean" (default): the simple average, the usual choice
   * since it is hard to beat (Clemen, 1989; Makridakis & Hibon, 2000, the M3 competition).
   * "median": the median of the members at each step. "inverse-mse": weights proportional to
   * 1/MSE (Bates & Granger, 1969, the case of uncorrelated errors).
   */
  rule?: CombinationRule;
  /**
   * Members' MSEs for "inverse-mse", one per entry of `members` (which must then be given), in
   * the same order, each above zero; typically from a backtest. Without it the MSEs come from
   * a holdout (holdoutWeeks, holdoutHorizon).
   */
  mse?: number[];
  /**
   * Weeks at the end held out to score the members for "inverse-mse" without `mse`. Default
   * 52, reduced to what the series allows after the weeks the members need; a series that
   * leaves fewer than 13 is refused.
   */
  holdoutWeeks?: number;
  /** Forecast steps 1..holdoutHorizon scored from each holdout origin. Default 4. */
  holdoutHorizon?: number;
  /**
   * "paths": quantiles of simulated paths pooled from the members; "quantiles": the members'
   * bounds combined by the rule. Default "paths" when every member can simulate, else "quantiles".
   */
  intervals?: IntervalMethod;
  /** Pooled simulated paths behind "paths" intervals. Default 1000. */
  paths?: number;
  /** Seed of the pooled paths behind forecast() intervals. Default 20260101. */
  seed?: number;
};

/** Options after their checks. members is undefined when the data are to choose them. */
export interface CheckedCombination {
  members?: string[];
  memberOptions: Record<string, Record<string, unknown>>;
  rule: CombinationRule;
  mse?: number[];
  holdoutWeeks?: number;
  holdoutHorizon: number;
  intervals?: IntervalMethod;
  paths: number;
  seed: number;
}

/** Members tried first when none are named, and the baselines that top them up to two. */
export const DEFAULT_MEMBERS = ["tbats", "sarima", "nnar"] as const;
export const FALLBACK_BASELINES = ["lastyear", "drift", "lastweek"] as const;
export const DEFAULT_PATHS = 1000;
/** The project's default seed (createRng in math/rng.ts). */
export const DEFAULT_SEED = 20260101;
export const DEFAULT_HOLDOUT_WEEKS = 52;
/** Fewest holdout weeks the default holdout may shrink to (a quarter; our rule). */
export const MIN_HOLDOUT_WEEKS = 13;
export const DEFAULT_HOLDOUT_HORIZON = 4;

const KNOWN = ["members", "memberOptions", "rule", "mse", "holdoutWeeks", "holdoutHorizon", "intervals", "paths", "seed"];
const RULES: CombinationRule[] = ["mean", "median", "inverse-mse"];
const INTERVALS: IntervalMethod[] = ["quantiles", "paths"];

const bad = badOption;
const whole = wholeOption;

/** Registered codes a combination may contain (everything but combo itself). */
export function combinable(table: ModelTable): string[] {
  return Object.keys(table).filter((c) => c !== "combo");
}

/** A member code, trimmed and lower-cased, refused unless it names a registered model other than combo. */
export function memberCode(raw: unknown, table: ModelTable): string {
  if (typeof raw !== "string") throw bad(`Each method to combine must be a method code such as sarima; got ${String(raw)}.`);
  const code = raw.trim().toLowerCase();
  if (code === "combo") {
    throw bad('A combination cannot contain another combination ("combo"); list the methods to combine, such as sarima and nnar.');
  }
  if (!table[code as MethodCode]) {
    throw bad(`The method "${raw}" is not available to combine; choose from: ${combinable(table).join(", ")}.`);
  }
  return code;
}

/** Checks every option's type and range (not yet against the series). */
export function checkCombination(options: CombinationOptions | undefined, table: ModelTable): CheckedCombination {
  const o = (options ?? {}) as Record<string, unknown>;
  if (o === null || typeof o !== "object" || Array.isArray(o)) throw bad("The combination options must be a set of named settings.");
  for (const key of Object.keys(o)) {
    if (!KNOWN.includes(key)) throw bad(`"${key}" is not a combination setting; the settings are ${KNOWN.join(", ")}.`);
  }
  let members: string[] | undefined;
  if (o.members !== undefined) {
    if (!Array.isArray(o.members)) throw bad("The methods to combine (members) must be a list of method codes, such as sarima, nnar.");
    members = o.members.map((c) => memberCode(c, table));
    if (members.length < 2) {
      throw bad(`A combination needs at least two methods to combine; got ${members.length === 0 ? "none" : `only ${members[0]}`}.`);
    }
  }
  const memberOptions: Record<string, Record<string, unknown>> = {};
  if (o.memberOptions !== undefined) {
    const mo = o.memberOptions;
    if (mo === null || typeof mo !== "object" || Array.isArray(mo)) {
      throw bad("The member settings (memberOptions) must name a method code for each set, such as { nnar: { networks: 5 } }.");
    }
    for (const [raw, value] of Object.entries(mo as Record<string, unknown>)) {
      const code = memberCode(raw, table);
      if (members && !members.includes(code)) {
        throw bad(`There are settings for ${code} in memberOptions, but ${code} is not one of the methods combined (${members.join(", ")}).`);
      }
      if (value === null || typeof value !== "object" || Array.isArray(value)) {
        throw bad(`The settings for ${code} in memberOptions must be a set of named settings.`);
      }
      memberOptions[code] = value as Record<string, unknown>;
    }
  }
  const rule = (o.rule ?? "mean") as CombinationRule;
  if (!RULES.includes(rule)) throw bad(`The combination rule must be one of ${RULES.join(", ")}; got "${String(o.rule)}".`);
  let mse: number[] | undefined;
  if (o.mse !== undefined) {
    if (rule !== "inverse-mse") throw bad(`Member MSEs are used only by the inverse-mse rule; the rule here is ${rule}.`);
    if (!members) throw bad("Name the methods (members) when giving their MSEs, one MSE per method in the same order.");
    if (!Array.isArray(o.mse) || o.mse.length !== members.length) {
      throw bad(`Give one MSE per method combined: ${members.length} methods but ${Array.isArray(o.mse) ? o.mse.length : "no list of"} MSEs.`);
    }
    o.mse.forEach((v, i) => {
      if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) {
        throw bad(`Each MSE must be a number above zero; the one for ${members?.[i]} is ${String(v)}.`);
      }
    });
    mse = [...(o.mse as number[])];
  }
  const holdoutUsed = rule === "inverse-mse" && mse === undefined;
  if (!holdoutUsed && (o.holdoutWeeks !== undefined || o.holdoutHorizon !== undefined)) {
    throw bad("The holdout settings apply only when the inverse-mse rule computes its own MSEs (no mse given).");
  }
  const holdoutWeeks = o.holdoutWeeks === undefined ? undefined : whole(o.holdoutWeeks, 1, 100000, "number of holdout weeks (holdoutWeeks)");
  const holdoutHorizon = o.holdoutHorizon === undefined ? DEFAULT_HOLDOUT_HORIZON : whole(o.holdoutHorizon, 1, 104, "holdout horizon in weeks (holdoutHorizon)");
  const intervals = o.intervals as IntervalMethod | undefined;
  if (intervals !== undefined && !INTERVALS.includes(intervals)) {
    throw bad(`The interval method must be "quantiles" or "paths"; got "${String(o.intervals)}".`);
  }
  const paths = o.paths === undefined ? DEFAULT_PATHS : whole(o.paths, 2, 1000000, "number of simulated paths");
  const seed = o.seed === undefined ? DEFAULT_SEED : whole(o.seed, 0, 0xffffffff, "seed");
  return { members, memberOptions, rule, mse, holdoutWeeks, holdoutHorizon, intervals, paths, seed };
}

/**
 * Fewest weeks the combination can be fitted to: the fewest any one candidate member needs
 * (members that need more are left out with a note), plus the holdout when inverse-mse
 * computes its own MSEs. Member options are checked by the members' own minLength.
 */
export function combinationMinLength(options: CombinationOptions | undefined, table: ModelTable): number {
  const o = checkCombination(options, table);
  const pool = o.members ?? [...DEFAULT_MEMBERS, ...FALLBACK_BASELINES].filter((c) => table[c as MethodCode]);
  const holdout = o.rule === "inverse-mse" && !o.mse ? (o.holdoutWeeks ?? MIN_HOLDOUT_WEEKS) : 0;
  let least = Infinity;
  for (const code of pool) {
    const spec = table[code as MethodCode] as ModelSpec;
    least = Math.min(least, spec.minLength(o.memberOptions[code]) + holdout);
  }
  return least;
}
