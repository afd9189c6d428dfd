/**
 * The members of a combination: fitting them (and leaving out those that cannot be fitted),
 * scoring them on a holdout for inverse-MSE weights, the weights themselves, and the share of
 * pooled paths each member simulates. Members are used only through ModelSpec and Fitted.
 */
import { isInputError, InputError } from "../../series/errors";
import type { Fitted, MethodCode, ModelSpec } from "../types";
import {
  CheckedCombination,
  DEFAULT_HOLDOUT_WEEKS,
  DEFAULT_MEMBERS,
  FALLBACK_BASELINES,
  MIN_HOLDOUT_WEEKS,
  ModelTable,
} from "./options";

/** Short names for structures and notes; published methods keep their published names. */
const SHORT: Record<string, string> = {
  tbats: "TBATS",
  sarima: "SARIMA",
  nnar: "NNAR",
  lastyear: "same week last year",
  lastweek: "last week",
  drift: "drift",
};

export interface Member {
  code: string;
  /** Short name, numbered when a code appears more than once ("SARIMA #2"). */
  short: string;
  /** The model's label (ModelSpec.label), numbered likewise. */
  label: string;
  spec: ModelSpec;
  options?: Record<string, unknown>;
  fit: Fitted;
  /** Index in the members the caller named (for their MSEs), −1 for chosen members. */
  asked: number;
}

export function shortName(code: string, spec: ModelSpec): string {
  return SHORT[code] ?? spec.label;
}

/** A note that opens with a short name ("drift …") starts with a capital ("Drift …"). */
export function opening(name: string): string {
  return name.charAt(0).toUpperCase() + name.slice(1);
}

function plainList(words: string[]): string {
  return words.length <= 1 ? words.join("") : `${words.slice(0, -1).join(", ")} and ${words[words.length - 1]}`;
}

/**
 * Fits one member, or says with a note why not: when it is too short for the data or fails
 * inside (anything but an InputError). Other InputErrors (bad member settings, a Box-Cox of
 * rates at or below zero) are the user's to fix and pass through.
 */
function tryFit(code: string, y: Float64Array, o: CheckedCombination, table: ModelTable, notes: string[]): Fitted | "short" | "failed" {
  const spec = table[code as MethodCode] as ModelSpec;
  const name = shortName(code, spec);
  const opts = o.memberOptions[code];
  const need = spec.minLength(opts);
  if (y.length < need) {
    notes.push(`${opening(name)} needs at least ${need} weeks and the series has ${y.length}, so it is left out.`);
    return "short";
  }
  try {
    return spec.fit(y, opts);
  } catch (e) {
    if (isInputError(e) && e.code !== "TOO_FEW_POINTS") throw e;
    notes.push(`${opening(name)} could not be fitted (${e instanceof Error ? e.message : String(e)}), so it is left out.`);
    return "failed";
  }
}

/** Numbers repeated codes: "SARIMA #1", "SARIMA #2". */
function numbered(list: Omit<Member, "short" | "label">[]): Member[] {
  const count = new Map<string, number>();
  for (const m of list) count.set(m.code, (count.get(m.code) ?? 0) + 1);
  const seen = new Map<string, number>();
  return list.map((m) => {
    const k = (seen.get(m.code) ?? 0) + 1;
    seen.set(m.code, k);
    const tag = (count.get(m.code) ?? 0) > 1 ? ` #${k}` : "";
    return { ...m, short: shortName(m.code, m.spec) + tag, label: m.spec.label + tag };
  });
}

/** Fits the named members, or chooses them from the data; throws when none can be fitted. */
export function fitMembers(y: Float64Array, o: CheckedCombination, table: ModelTable, notes: string[]): Member[] {
  const out: Omit<Member, "short" | "label">[] = [];
  let failures = 0;
  const add = (code: string, asked: number): void => {
    const fit = tryFit(code, y, o, table, notes);
    const spec = table[code as MethodCode] as ModelSpec;
    if (fit === "failed") failures++;
    else if (fit !== "short") out.push({ code, spec, options: o.memberOptions[code], fit, asked });
  };
  let tried: string[];
  if (o.members) {
    tried = o.members;
    o.members.forEach((code, i) => add(code, i));
  } else {
    tried = DEFAULT_MEMBERS.filter((c) => table[c]);
    tried.forEach((c) => add(c, -1));
    const fromModels = out.map((m) => shortName(m.code, m.spec));
    const added: string[] = [];
    for (const c of FALLBACK_BASELINES) {
      if (out.length >= 2) break;
      if (!table[c]) continue;
      tried.push(c);
      const before = out.length;
      add(c, -1);
      if (out.length > before) added.push(SHORT[c]);
    }
    if (added.length > 0) {
      const lead = fromModels.length === 0 ? `None of ${plainList(DEFAULT_MEMBERS.filter((c) => table[c]).map((c) => SHORT[c]))} could be used` : `Only ${fromModels[0]} could be used`;
      notes.push(`${lead} with ${y.length} weeks, so the baseline${added.length > 1 ? "s" : ""} ${plainList(added)} ${added.length > 1 ? "were" : "was"} added to make a combination of at least two.`);
    }
  }
  if (out.length === 0) {
    const names = plainList([...new Set(tried)].map((c) => shortName(c, table[c as MethodCode] as ModelSpec)));
    throw new InputError(
      failures === 0 ? "TOO_FEW_POINTS" : "BAD_OPTION",
      `None of the methods to combine (${names}) could be fitted to these ${y.length} weeks: ${notes.join(" ")} ` +
        "Combine other methods, or use a longer series.",
    );
  }
  if (out.length === 1) notes.push(`Only ${shortName(out[0].code, out[0].spec)} could be fitted, so the "combination" is that one method alone.`);
  return numbered(out);
}

/**
 * Mean squared h-step error of one member over a holdout of the last H weeks: fitted to the
 * first n − H weeks, it forecasts steps 1..min(horizon, weeks left) from each origin
 * n − H, …, n − 1, and is extended one week at a time with its parameters fixed
 * (update(…, { reestimate: false })). Errors of all origins and steps are pooled with equal weight.
 */
export function holdoutMse(spec: ModelSpec, options: Record<string, unknown> | undefined, y: Float64Array, H: number, horizon: number): number {
  const n = y.length;
  let fit = spec.fit(y.slice(0, n - H), options);
  let ss = 0;
  let count = 0;
  for (let origin = n - H; origin < n; origin++) {
    const steps = Math.min(horizon, n - origin);
    const point = fit.forecast(steps, []).point;
    for (let s = 0; s < steps; s++) {
      const e = y[origin + s] - point[s];
      ss += e * e;
      count++;
    }
    if (origin < n - 1) fit = fit.update(y.slice(origin, origin + 1), { reestimate: false });
  }
  return ss / count;
}

/** Holdout length: as asked (refused when too long), or the default reduced to what the series allows. */
export function holdoutLength(n: number, members: Member[], o: CheckedCombination, notes: string[]): number {
  let need = 0;
  let needy = members[0];
  for (const m of members) {
    const k = m.spec.minLength(m.options);
    if (k > need) {
      need = k;
      needy = m;
    }
  }
  if (o.holdoutWeeks !== undefined) {
    if (n - o.holdoutWeeks < need) {
      throw new InputError(
        "TOO_FEW_POINTS",
        `A holdout of ${o.holdoutWeeks} weeks leaves ${n - o.holdoutWeeks} weeks to fit on, fewer than the ${need} that ${needy.short} needs; use a shorter holdout.`,
      );
    }
    return o.holdoutWeeks;
  }
  const H = Math.min(DEFAULT_HOLDOUT_WEEKS, n - need);
  if (H < MIN_HOLDOUT_WEEKS) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `Inverse-MSE weights need at least ${MIN_HOLDOUT_WEEKS} recent weeks held out after the ${need} weeks ${needy.short} needs to fit; ` +
        `the series has ${n}. Use the mean rule, or supply the members' MSEs.`,
    );
  }
  if (H < DEFAULT_HOLDOUT_WEEKS) notes.push(`The holdout is ${H} weeks rather than ${DEFAULT_HOLDOUT_WEEKS}, to leave ${need} weeks to fit on.`);
  return H;
}

/** Holdout MSE of each member; members that cannot be scored are left out (with a note). */
export function scoreMembers(y: Float64Array, members: Member[], o: CheckedCombination, notes: string[]): { kept: Member[]; mse: number[] } {
  const H = holdoutLength(y.length, members, o, notes);
  const kept: Member[] = [];
  const mse: number[] = [];
  for (const m of members) {
    let v = NaN;
    let why = "its errors are not finite numbers";
    try {
      v = holdoutMse(m.spec, m.options, y, H, o.holdoutHorizon);
    } catch (e) {
      if (isInputError(e) && e.code !== "TOO_FEW_POINTS") throw e;
      why = e instanceof Error ? e.message : String(e);
    }
    if (Number.isFinite(v)) {
      kept.push(m);
      mse.push(v);
    } else {
      notes.push(`${opening(m.short)} could not be scored on the holdout (${why}), so it is left out.`);
    }
  }
  if (kept.length === 0) {
    throw new InputError("BAD_OPTION", `None of the methods could be scored on the ${H}-week holdout, so inverse-MSE weights cannot be formed; use the mean rule.`);
  }
  notes.push(
    `Weights are proportional to 1/MSE (Bates & Granger, 1969): MSE of the 1- to ${o.holdoutHorizon}-week-ahead errors over the last ${H} weeks, ` +
      `each method fitted to the first ${y.length - H} weeks and then extended a week at a time with its parameters fixed. ` +
      `MSEs: ${kept.map((m, i) => `${m.short} ${Number(mse[i].toPrecision(4))}`).join("; ")}.`,
  );
  return { kept, mse };
}

/** w_i ∝ 1/MSE_i, normalised (Bates & Granger, 1969); members with MSE 0, if any, share the weight. */
export function inverseMseWeights(mse: ArrayLike<number>): Float64Array {
  const k = mse.length;
  const w = new Float64Array(k);
  const zeros = Array.from(mse).filter((v) => v === 0).length;
  let sum = 0;
  for (let i = 0; i < k; i++) {
    w[i] = zeros > 0 ? (mse[i] === 0 ? 1 : 0) : 1 / mse[i];
    sum += w[i];
  }
  for (let i = 0; i < k; i++) w[i] /= sum;
  return w;
}

/**
 * Paths per member: `total` shared in proportion to the weights by largest remainders (ties
 * to the earlier member), then at least one each, taken from the member with the most.
 */
export function allotPaths(weights: ArrayLike<number>, total: number): number[] {
  const k = weights.length;
  if (total <= k) return new Array<number>(k).fill(1);
  const raw = Array.from(weights, (w) => w * total);
  const counts = raw.map(Math.floor);
  let left = total - counts.reduce((a, b) => a + b, 0);
  const order = raw.map((r, i) => i).sort((a, b) => raw[b] - Math.floor(raw[b]) - (raw[a] - Math.floor(raw[a])) || a - b);
  for (let j = 0; left > 0; j++, left--) counts[order[j % k]]++;
  const largest = (): number => counts.reduce((best, c, i) => (c > counts[best] ? i : best), 0);
  for (; left < 0; left++) counts[largest()]--;
  for (let i = 0; i < k; i++) {
    if (counts[i] === 0) {
      counts[largest()]--;
      counts[i] = 1;
    }
  }
  return counts;
}
