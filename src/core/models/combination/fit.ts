/**
 * A fitted combination behind the model interface (types.ts). Point forecasts are the mean,
 * the median or the inverse-MSE weighted mean of the members' point forecasts; intervals are
 * either quantiles of simulated paths pooled from the members, or the members' bounds
 * combined by the same rule. Fitted values are combined the same way, so residuals and sigma2
 * describe the combination's own one-step errors.
 */
import { median } from "../../math/median";
import { MersenneTwister, type Rng } from "../../math/rng";
import { InputError, isInputError } from "../../series/errors";
import { appendWeeks, checkHorizon, checkLevels } from "../arguments";
import { quantileSorted } from "../../math/quantile";
import type { FitSummary, Fitted, Forecast, MethodCode, ModelSpec, UpdateOptions } from "../types";
import { Member, allotPaths, fitMembers, inverseMseWeights, opening, scoreMembers } from "./members";
import {
  CheckedCombination,
  CombinationOptions,
  CombinationRule,
  IntervalMethod,
  ModelTable,
  checkCombination,
  combinationMinLength,
} from "./options";

/** update() options of a combination: the interface's, plus new MSEs for inverse-mse. */
export interface CombinationUpdateOptions extends UpdateOptions {
  /**
   * New member MSEs (inverse-mse only), one per member now combined, in the order of
   * summary().parameters; the weights are recomputed from them. Without it the weights of the
   * fit are kept (the holdout is not rerun: refit for fresh holdout weights).
   */
  mse?: number[];
}

interface State {
  y: Float64Array;
  members: Member[];
  /** Normalised weights; equal shares for mean and median (the median's path shares). */
  weights: Float64Array;
  mse: Float64Array | null;
  rule: CombinationRule;
  intervals: IntervalMethod;
  paths: number;
  seed: number;
  notes: string[];
}

const RULE_WORDS: Record<CombinationRule, string> = { mean: "mean", median: "median", "inverse-mse": "inverse-MSE weighted mean" };

function equalWeights(k: number): Float64Array {
  return new Float64Array(k).fill(1 / k);
}

function checkMse(mse: unknown, members: Member[]): Float64Array {
  if (!Array.isArray(mse) || mse.length !== members.length) {
    throw new InputError("BAD_OPTION", `Give one MSE per method combined: ${members.length} methods but ${Array.isArray(mse) ? mse.length : "no list of"} MSEs.`);
  }
  mse.forEach((v, i) => {
    if (typeof v !== "number" || !Number.isFinite(v) || v <= 0) {
      throw new InputError("BAD_OPTION", `Each MSE must be a number above zero; the one for ${members[i].short} is ${String(v)}.`);
    }
  });
  return Float64Array.from(mse as number[]);
}

export class CombinationFit implements Fitted {
  readonly method: MethodCode = "combo";
  readonly n: number;
  readonly aicc = NaN; // a combination has no likelihood
  readonly sigma2: number;
  readonly fitted: Float64Array;
  readonly residuals: Float64Array;

  constructor(private readonly s: State) {
    const { y, members } = s;
    this.n = y.length;
    this.fitted = new Float64Array(this.n);
    this.residuals = new Float64Array(this.n);
    const v = new Float64Array(members.length);
    let ss = 0;
    let m = 0;
    for (let t = 0; t < this.n; t++) {
      let missing = false;
      members.forEach((mem, i) => {
        v[i] = mem.fit.fitted[t];
        if (Number.isNaN(v[i])) missing = true;
      });
      this.fitted[t] = missing ? NaN : this.combine(v);
      this.residuals[t] = y[t] - this.fitted[t];
      if (!missing) {
        ss += this.residuals[t] ** 2;
        m++;
      }
    }
    this.sigma2 = m > 0 ? ss / m : NaN;
  }

  /** Combined value of one number per member, by the rule. */
  private combine(v: Float64Array): number {
    const k = v.length;
    if (this.s.rule === "median") return median(v);
    let sum = 0;
    if (this.s.rule === "mean") {
      for (let i = 0; i < k; i++) sum += v[i];
      return sum / k;
    }
    for (let i = 0; i < k; i++) sum += this.s.weights[i] * v[i];
    return sum;
  }

  /** The weights, in member order (copies). */
  get weights(): Float64Array {
    return Float64Array.from(this.s.weights);
  }

  /** The MSEs behind inverse-mse weights (holdout or supplied), null for the other rules. */
  get mse(): Float64Array | null {
    return this.s.mse && Float64Array.from(this.s.mse);
  }

  /** The fitted members, in order, for inspection and tests. */
  get members(): { code: string; label: string; fit: Fitted }[] {
    return this.s.members.map((m) => ({ code: m.code, label: m.label, fit: m.fit }));
  }

  get intervals(): IntervalMethod {
    return this.s.intervals;
  }

  forecast(h: number, levels: number[]): Forecast {
    checkHorizon(h);
    checkLevels(levels);
    const { members, intervals } = this.s;
    const fromPaths = intervals === "paths" && levels.length > 0;
    const fcs = members.map((m) => m.fit.forecast(h, fromPaths ? [] : levels));
    const v = new Float64Array(members.length);
    const at = (pick: (f: Forecast) => Float64Array, s: number): number => {
      fcs.forEach((f, i) => (v[i] = pick(f)[s]));
      return this.combine(v);
    };
    const point = new Float64Array(h);
    for (let s = 0; s < h; s++) point[s] = at((f) => f.point, s);
    const lower = levels.map(() => new Float64Array(h));
    const upper = levels.map(() => new Float64Array(h));
    if (fromPaths) {
      // Deterministic: the pooled paths are drawn from the seed on every call.
      const paths = this.pool(h, this.s.paths, new MersenneTwister(this.s.seed));
      const column = new Float64Array(paths.length);
      for (let s = 0; s < h; s++) {
        paths.forEach((p, j) => (column[j] = p[s]));
        column.sort();
        levels.forEach((l, i) => {
          const tail = (1 - l / 100) / 2;
          lower[i][s] = quantileSorted(column, tail); // Hyndman & Fan (1996), definition 7
          upper[i][s] = quantileSorted(column, 1 - tail);
        });
      }
    } else {
      levels.forEach((_, i) => {
        for (let s = 0; s < h; s++) {
          lower[i][s] = at((f) => f.lower[i], s);
          upper[i][s] = at((f) => f.upper[i], s);
        }
      });
    }
    return { point, levels: [...levels], lower, upper };
  }

  /** Paths from each member in turn, their numbers in proportion to the weights, one rng throughout. */
  private pool(h: number, total: number, rng: Rng): Float64Array[] {
    const counts = allotPaths(this.s.weights, total);
    const out: Float64Array[] = [];
    this.s.members.forEach((m, i) => {
      for (const p of m.fit.simulate(h, counts[i], rng)) out.push(p);
    });
    return out;
  }

  /**
   * Pooled paths in proportion to the weights, shuffled (Fisher–Yates, same rng) so that any
   * leading subset is a fair mixture too. Asked for fewer paths than members, each member
   * gives one and a shuffled subset is returned.
   */
  simulate(h: number, paths: number, rng: Rng): Float64Array[] {
    checkHorizon(h);
    if (!Number.isInteger(paths) || paths < 1) {
      throw new InputError("BAD_OPTION", `The number of simulated paths must be a whole number of at least 1; got ${paths}.`);
    }
    const out = this.pool(h, paths, rng);
    for (let j = out.length - 1; j > 0; j--) {
      const r = rng.integer(j + 1);
      const tmp = out[j];
      out[j] = out[r];
      out[r] = tmp;
    }
    return out.length > paths ? out.slice(0, paths) : out;
  }

  /**
   * Every member updated with the same options and recombined. The weights are kept (a member
   * that fails inside is left out and the rest renormalised) unless new MSEs are supplied.
   */
  update(newY: Float64Array, options: CombinationUpdateOptions): CombinationFit {
    const y = appendWeeks(this.s.y, newY, "The combination");
    const notes = [...this.s.notes];
    const supplied = options.mse === undefined ? null : checkMse(options.mse, this.s.members);
    if (supplied && this.s.rule !== "inverse-mse") {
      throw new InputError("BAD_OPTION", `Member MSEs are used only by the inverse-mse rule; the rule here is ${this.s.rule}.`);
    }
    const members: Member[] = [];
    const kept: number[] = [];
    this.s.members.forEach((m, i) => {
      try {
        members.push({ ...m, fit: m.fit.update(newY, { reestimate: options.reestimate }) });
        kept.push(i);
      } catch (e) {
        if (isInputError(e)) throw e;
        notes.push(`${opening(m.short)} could not be extended by the new weeks (${e instanceof Error ? e.message : String(e)}), so it is left out from then on.`);
      }
    });
    if (members.length === 0) {
      throw new InputError("BAD_OPTION", "None of the combined methods could be extended by the new weeks; fit the combination again.");
    }
    const mseSource = supplied ?? this.s.mse;
    const mse = mseSource ? Float64Array.from(kept, (i) => mseSource[i]) : null;
    let weights: Float64Array;
    if (this.s.rule !== "inverse-mse") weights = equalWeights(members.length);
    else if (supplied || kept.length < this.s.members.length) weights = inverseMseWeights(mse as Float64Array);
    else weights = this.s.weights;
    if (newY.length > 0 || supplied) {
      notes.push(
        `Extended by ${newY.length} week(s), every method ${options.reestimate ? "re-estimated" : "with its parameters fixed"}; ` +
          `${supplied ? "weights from the MSEs supplied with the update" : "weights kept from the fit"}.`,
      );
    }
    return new CombinationFit({ ...this.s, y, members, weights, mse, notes });
  }

  summary(): FitSummary {
    const { members, weights, rule, intervals, paths } = this.s;
    const notes = [...this.s.notes];
    if (rule === "median") notes.push("The median rule has no weights; the weights listed are the equal shares of the pooled simulated paths.");
    if (intervals === "paths") {
      const counts = allotPaths(weights, paths);
      notes.push(
        `Intervals: sample quantiles (Hyndman & Fan, 1996, definition 7) of ${counts.reduce((a, b) => a + b, 0)} simulated paths pooled from the methods ` +
          `(${members.map((m, i) => `${m.short} ${counts[i]}`).join(", ")}). The point forecast is the combination of the methods' own points, ` +
          "so it is not forced to the centre of the interval, nor inside it.",
      );
    } else {
      notes.push(`Intervals: at each coverage the methods' bounds are combined by the ${RULE_WORDS[rule]}, step by step.`);
    }
    notes.push(
      "sigma2 is the mean squared one-step residual of the combined fitted values, over the weeks where every method has one.",
      "A combination has no likelihood, so AICc is not defined.",
    );
    for (const m of members) {
      const sm = m.fit.summary();
      notes.push(`${opening(m.short)}: ${sm.structure}.`, ...sm.notes.map((n) => `${opening(m.short)}: ${n}`));
    }
    return {
      method: "combo",
      structure: `${RULE_WORDS[rule]} of ${members.map((m) => m.short).join(", ")}`,
      parameters: members.map((m, i) => ({ name: `weight: ${m.label}`, value: weights[i] })),
      armaDf: 0,
      notes,
    };
  }
}

/** "paths" unless a member cannot simulate (then "quantiles", or a refusal if paths were asked for). */
function chooseIntervals(members: Member[], o: CheckedCombination, notes: string[]): IntervalMethod {
  if (o.intervals === "quantiles") return "quantiles";
  for (const m of members) {
    try {
      m.fit.simulate(1, 1, new MersenneTwister(o.seed));
    } catch (e) {
      if (o.intervals === "paths") {
        throw new InputError(
          "BAD_OPTION",
          `${opening(m.short)} cannot simulate future paths, so pooled-path intervals are not available; ask for intervals "quantiles" instead.`,
        );
      }
      notes.push(`${opening(m.short)} cannot simulate future paths (${e instanceof Error ? e.message : String(e)}), so the intervals combine the methods' bounds instead.`);
      return "quantiles";
    }
  }
  return "paths";
}

/** Fits a combination to weekly rates y; see CombinationOptions. */
export function fitCombination(yIn: ArrayLike<number>, options: CombinationOptions | undefined, table: ModelTable): CombinationFit {
  const o = checkCombination(options, table);
  const y = Float64Array.from(yIn);
  for (let t = 0; t < y.length; t++) {
    if (!Number.isFinite(y[t])) throw new InputError("NOT_A_NUMBER", `The combination needs a number in every week; week ${t + 1} has none.`);
  }
  const notes: string[] = [];
  let members = fitMembers(y, o, table, notes);
  let mse: Float64Array | null = null;
  let weights: Float64Array;
  if (o.rule === "inverse-mse") {
    if (o.mse) {
      const given = o.mse;
      mse = Float64Array.from(members, (m) => given[m.asked]);
      notes.push(`Weights are proportional to 1/MSE (Bates & Granger, 1969), from the MSEs supplied.`);
    } else {
      const scored = scoreMembers(y, members, o, notes);
      members = scored.kept;
      mse = Float64Array.from(scored.mse);
    }
    weights = inverseMseWeights(mse);
  } else {
    weights = equalWeights(members.length);
  }
  const intervals = chooseIntervals(members, o, notes);
  return new CombinationFit({ y, members, weights, mse, rule: o.rule, intervals, paths: o.paths, seed: o.seed, notes });
}

/**
 * The combination as a registry entry. The registry passes a function returning its own table
 * (read at fit time), so this module needs no import of registry.ts and the two do not cycle.
 */
export function combination(table: () => ModelTable): ModelSpec<CombinationOptions> {
  return {
    code: "combo",
    label: "Combination of methods",
    minLength: (options?: CombinationOptions) => combinationMinLength(options, table()),
    fit: (y: Float64Array, options?: CombinationOptions) => fitCombination(y, options, table()),
  };
}
