/**
 * Automatic TBATS: the structure search of De Livera et al. (2011), §4.2, on AIC.
 *
 *  1. Harmonics. For each seasonal period in turn, K is chosen by AIC among fits with a trend,
 *     the transform as asked and white-noise errors (our search): K = 0 (the period left out:
 *     a season must earn its seeds, or white noise would be given a pattern) and every K from
 *     1 to 5, then 7, 10 and K_max while each improves on the best, then the unvisited
 *     neighbours of every K within 2 AIC of the best, until none is left.
 *     A screen rather than a walk from one start, because AIC over K is rarely unimodal: a
 *     sharp seasonal feature (the lunar-new-year dip) needs many harmonics even when the first
 *     few add little, and the recovery tests found a walk stopping one short of the best. Each
 *     fit starts from the best so far, whose parameters mean the same thing at any K (γ is per
 *     period, not per harmonic).
 *  2. Components. With those harmonics, every combination of Box-Cox on/off, no trend / trend
 *     / damped trend that the options leave open is fitted with white-noise errors.
 *  3. ARMA errors. For each of those fits, an automatic ARMA search (sarima/auto.ts, stepwise
 *     on AICc, no differencing, no constant) on its one-step errors picks (p, q); when it picks
 *     a non-zero order the structure is refitted with ARMA(p, q) errors, warm-started, and kept
 *     as a further candidate.
 *  4. The final model is the candidate with the lowest AIC; every candidate's AIC is kept.
 * AIC counts the free parameters, the seed states, any calendar regressors and σ² (model.ts); the
 * likelihoods include the Box-Cox Jacobian, so fits with and without the transform compare on
 * the scale of the rates. Calendar regressors (lunar new year, event weeks), when asked, enter
 * every candidate alike, so the search chooses the rest of the structure around them.
 */
import { guerreroLambda } from "../../math/boxcox";
import { WEEKLY_PERIOD } from "../../series/calendar";
import { InputError } from "../../series/errors";
import { calendarRegressors, type CalendarSpec } from "../../series/calendarRegressors";
import { autoSarima } from "../sarima/auto";
import type { RegressorSet } from "../sarima/spec";
import { fitTbatsStructure, TbatsFitted, type TbatsCandidate } from "./model";
import { DEFAULT_PERIODS, maxHarmonicsFor, structureLabel, type TbatsParameters, type TbatsStructure } from "./structure";

export interface TbatsOptions {
  /**
   * Box-Cox transform: "search" (default: fitted with and without, kept by AIC), "auto" (λ always
   * estimated), a number (fixed λ), or null (no transform).
   */
  lambda?: "search" | "auto" | number | null;
  /** Trend on (true) or off (false); searched when absent. */
  trend?: boolean;
  /** Damping of the trend; searched when absent (only with a trend). */
  damped?: boolean;
  /** Seasonal periods in weeks; default [365.25/7]. An empty list fits no seasonality. */
  periods?: number[];
  /** Harmonics per period; searched when absent. */
  harmonics?: number[];
  /** Most harmonics the search tries per period. Default 12. */
  maxHarmonics?: number;
  /** ARMA errors: searched on the residuals (default, true), none (false), or fixed orders. */
  arma?: boolean | { p: number; q: number };
  /** Point forecasts as bias-adjusted means (Box-Cox only). */
  biasAdjust?: boolean;
  /** Regressors on the transformed scale, by week index from the first fitted week. */
  extra?: RegressorSet;
  /** Calendar regressors described as data (series/calendarRegressors.ts); ignored when `extra` is given. */
  calendar?: CalendarSpec;
}

/** Fewest weeks for any TBATS fit, and the fewest seasons a seasonal period needs. */
export const TBATS_MIN_WEEKS = 20;
export const MIN_SEASONS = 2;
export const DEFAULT_MAX_HARMONICS = 12;

export function tbatsMinLength(options: TbatsOptions = {}): number {
  if (options.harmonics && options.harmonics.some((k) => k > 0)) {
    const periods = options.periods ?? DEFAULT_PERIODS;
    return Math.max(TBATS_MIN_WEEKS, Math.ceil(MIN_SEASONS * Math.max(...periods)));
  }
  return TBATS_MIN_WEEKS;
}

function bad(message: string): InputError {
  return new InputError("BAD_OPTION", message);
}

function validate(y: Float64Array, options: TbatsOptions): void {
  const n = y.length;
  const need = tbatsMinLength(options);
  if (n < need) throw new InputError("TOO_FEW_POINTS", `TBATS needs at least ${need} weeks of rates here; the series has ${n}.`);
  for (let t = 0; t < n; t++) {
    if (!Number.isFinite(y[t])) throw new InputError("NOT_A_NUMBER", `TBATS needs a number in every week; week ${t + 1} has none.`);
  }
  const lam = options.lambda;
  if (lam !== undefined && lam !== null && lam !== "search" && lam !== "auto" && !(typeof lam === "number" && lam >= -1 && lam <= 2)) {
    throw bad(`The Box-Cox setting must be "search", "auto", a number between -1 and 2, or none; got ${String(lam)}.`);
  }
  if (lam === "auto" || typeof lam === "number") {
    const at = y.findIndex((v) => !(v > 0));
    if (at >= 0) throw new InputError("NON_POSITIVE", `A Box-Cox transform needs rates above zero; week ${at + 1} has ${y[at]}.`);
  }
  const periods = options.periods ?? DEFAULT_PERIODS;
  for (const m of periods) {
    if (!(Number.isFinite(m) && m >= 2)) throw bad(`A seasonal period must be a number of weeks of at least 2; got ${m}.`);
  }
  if (options.harmonics) {
    if (options.harmonics.length !== periods.length) {
      throw bad(`Give one number of harmonics per seasonal period: ${periods.length} period(s), ${options.harmonics.length} number(s).`);
    }
    options.harmonics.forEach((k, i) => {
      const top = maxHarmonicsFor(periods[i]);
      if (!Number.isInteger(k) || k < 0 || k > top) throw bad(`A period of ${periods[i]} weeks allows 0 to ${top} harmonics; got ${k}.`);
    });
  }
  if (options.maxHarmonics !== undefined && !(Number.isInteger(options.maxHarmonics) && options.maxHarmonics >= 1)) {
    throw bad(`The most harmonics to try must be a whole number of 1 or more; got ${options.maxHarmonics}.`);
  }
  if (options.damped === true && options.trend === false) throw bad("A damped trend needs a trend; drop one of the two settings.");
  const a = options.arma;
  if (typeof a === "object" && !(Number.isInteger(a.p) && Number.isInteger(a.q) && a.p >= 0 && a.q >= 0 && a.p <= 5 && a.q <= 5)) {
    throw bad(`ARMA orders for the errors must be whole numbers from 0 to 5; got p = ${a.p}, q = ${a.q}.`);
  }
}

/** Fit a structure and record it; a fit that fails numerically is noted and skipped. */
class Search {
  readonly candidates: TbatsCandidate[] = [];
  readonly notes: string[] = [];
  best: TbatsFitted | null = null;
  private readonly cache = new Map<string, TbatsFitted | null>();

  constructor(
    private readonly y: Float64Array,
    private readonly fixedLambda: number | null,
    private readonly startLambda: number | null,
    private readonly biasAdjust: boolean,
    private readonly regressors: RegressorSet | undefined,
  ) {}

  fit(s: TbatsStructure, start?: TbatsParameters): TbatsFitted | null {
    const key = structureLabel(s) + `|${s.harmonics.join(",")}`;
    if (this.cache.has(key)) return this.cache.get(key) ?? null;
    let f: TbatsFitted | null = null;
    try {
      f = fitTbatsStructure(this.y, s, {
        start: start && fitsStart(start, s) ? adaptStart(start, s) : undefined,
        fixedLambda: this.fixedLambda,
        startLambda: this.startLambda,
        biasAdjust: this.biasAdjust,
        ...(this.regressors ? { regressors: this.regressors } : {}),
      });
      if (!Number.isFinite(f.aic)) f = null;
    } catch (e) {
      if (e instanceof InputError) throw e;
      f = null;
    }
    this.cache.set(key, f);
    if (f) {
      this.candidates.push({ structure: structureLabel(s, f.par), aic: f.aic });
      if (!this.best || f.aic < this.best.aic) this.best = f;
    } else {
      this.notes.push(`${structureLabel(s)} could not be fitted and was left out.`);
    }
    return f;
  }
}

/** A start is usable when it has the structure's periods (its own parts are adapted). */
function fitsStart(start: TbatsParameters, s: TbatsStructure): boolean {
  return start.gamma1.length === s.periods.length;
}

/**
 * Carry a neighbour's optimum over to a structure that differs in parts. Smoothing weights that
 * sat on a boundary of their range are pulled inside (ours: β ≥ 0.05α, 0.02 ≤ α ≤ 0.9, φ ≤ 0.97):
 * the neighbour may have pushed a weight to the boundary to make up for what it lacked (a
 * missing harmonic absorbed by a large α and a vanishing β), and in the unconstrained
 * coordinates a boundary value is a flat region the optimiser cannot leave (measured: a K = 3
 * fit warm-started from K = 2 ended 22 AIC units short of a cold start).
 */
function adaptStart(start: TbatsParameters, s: TbatsStructure): TbatsParameters {
  const ar = start.ar.slice(0, s.p);
  while (ar.length < s.p) ar.push(0);
  const ma = start.ma.slice(0, s.q);
  while (ma.length < s.q) ma.push(0);
  const alpha = Math.min(0.9, Math.max(0.02, start.alpha));
  return {
    lambda: s.boxCox ? (start.lambda ?? 0.5) : null,
    alpha,
    beta: s.trend ? Math.max(start.beta, 0.05 * alpha) : 0,
    phi: s.trend && s.damped ? Math.min(start.phi, 0.97) : 1,
    gamma1: [...start.gamma1],
    gamma2: [...start.gamma2],
    ar,
    ma,
  };
}

/**
 * Harmonics the screen always visits, the larger ones it visits while they keep improving
 * AIC, and the AIC band around the best whose neighbours are refined (ours).
 */
const SCREEN_ALWAYS = [1, 2, 3, 4, 5];
const SCREEN_LARGE = [7, 10];
const REFINE_BAND = 2;

function harmonicsSearch(search: Search, base: TbatsStructure, periodIndex: number, kMax: number): number {
  // K = 0 is the structure without this period at all: the season must earn its seeds.
  const withK = (k: number): TbatsStructure =>
    k === 0
      ? { ...base, periods: base.periods.filter((_, i) => i !== periodIndex), harmonics: base.harmonics.filter((_, i) => i !== periodIndex) }
      : { ...base, harmonics: base.harmonics.map((h, i) => (i === periodIndex ? k : h)) };
  const aicAt = new Map<number, number>();
  let best: TbatsFitted | null = null;
  let bestK = 0;
  const tryK = (k: number): boolean => {
    if (k < 0 || k > kMax || aicAt.has(k)) return false;
    const f = search.fit(withK(k));
    aicAt.set(k, f ? f.aic : Infinity);
    if (f && (!best || f.aic < best.aic)) {
      best = f;
      bestK = k;
      return true;
    }
    return false;
  };
  // Every K up to 5 (the first few harmonics can add little before a sharp feature's harmonics
  // add a lot, so no early stop there); then 7, 10 and K_max while each improves on the best.
  for (const k of [0, ...SCREEN_ALWAYS]) tryK(k);
  for (const k of SCREEN_LARGE.concat(kMax > 10 ? [kMax] : []).filter((v) => v <= kMax)) {
    if (!tryK(k)) break;
  }
  // Refine: try the unvisited neighbours of every K within REFINE_BAND of the best, until no
  // new K enters the band (AIC over K has several dips when the screen is coarse).
  for (;;) {
    const bestAic = aicAt.get(bestK) ?? Infinity;
    const near = [...aicAt.entries()].filter(([, a]) => a <= bestAic + REFINE_BAND).map(([k]) => k);
    const fresh = near.flatMap((k) => [k - 1, k + 1]).filter((k) => k >= 0 && k <= kMax && !aicAt.has(k));
    if (fresh.length === 0) break;
    for (const k of fresh) tryK(k);
  }
  return bestK;
}

/** Fit TBATS with the structure chosen by AIC. */
export function autoTbats(y: Float64Array, options: TbatsOptions = {}): TbatsFitted {
  validate(y, options);
  const n = y.length;
  const notes: string[] = [];
  const positive = y.every((v) => v > 0);
  let lamOpt = options.lambda === undefined ? "search" : options.lambda;
  if (lamOpt === "search" && !positive) {
    lamOpt = null;
    notes.push("Some rates are zero or below, so no Box-Cox transform was tried.");
  }
  const fixedLambda = typeof lamOpt === "number" ? lamOpt : null;
  // Periods the data can carry: at least two full seasons.
  const asked = options.periods ?? DEFAULT_PERIODS;
  const periods: number[] = [];
  const fixedK: number[] = [];
  asked.forEach((m, i) => {
    if (n >= MIN_SEASONS * m) {
      periods.push(m);
      if (options.harmonics) fixedK.push(options.harmonics[i]);
    } else {
      notes.push(`Under ${Math.ceil(MIN_SEASONS * m)} weeks of rates, so the ${m.toFixed(2)}-week pattern is not modelled.`);
    }
  });
  // Starting λ: Guerrero's method on the first period when two full seasons exist (0.5 otherwise).
  const guerreroPeriod = Math.round(periods[0] ?? WEEKLY_PERIOD);
  const startLambda = !positive
    ? null
    : n >= 2 * guerreroPeriod
      ? Math.min(0.95, Math.max(0.05, guerreroLambda(y, guerreroPeriod, [0, 1])))
      : 0.5;
  const regressors = options.extra ?? calendarRegressors(options.calendar, n);
  const search = new Search(y, fixedLambda, startLambda, options.biasAdjust === true, regressors);

  const boxCoxChoices = lamOpt === "search" ? [true, false] : [lamOpt === "auto"];
  const trendChoices: { trend: boolean; damped: boolean }[] = [];
  for (const trend of options.trend === undefined ? [false, true] : [options.trend]) {
    if (!trend) trendChoices.push({ trend: false, damped: false });
    else for (const damped of options.damped === undefined ? [false, true] : [options.damped]) trendChoices.push({ trend, damped });
  }
  const armaFixed = typeof options.arma === "object" ? options.arma : null;
  const armaSearch = options.arma === undefined || options.arma === true;

  // 1. Harmonics, on a base with a trend (when allowed), undamped, and the first transform choice.
  const base: TbatsStructure = {
    boxCox: boxCoxChoices[0],
    trend: trendChoices.some((c) => c.trend),
    damped: trendChoices.every((c) => c.damped),
    periods,
    harmonics: periods.map((_, i) => (options.harmonics ? fixedK[i] : 1)),
    p: 0,
    q: 0,
  };
  if (!options.harmonics) {
    const kCap = options.maxHarmonics ?? DEFAULT_MAX_HARMONICS;
    for (let i = 0; i < periods.length; i++) {
      const kMax = Math.min(kCap, maxHarmonicsFor(periods[i]));
      base.harmonics[i] = harmonicsSearch(search, base, i, kMax);
    }
    // A period whose best K is 0 (no harmonic earned its seeds, or none could be fitted) is dropped.
    const keep = base.harmonics.map((k) => k > 0);
    periods.forEach((m, i) => {
      if (!keep[i]) notes.push(`A ${m.toFixed(2)}-week pattern did not improve AIC at any number of harmonics, so it is not modelled.`);
    });
    base.periods = periods.filter((_, i) => keep[i]);
    base.harmonics = base.harmonics.filter((k) => k > 0);
  }

  // 2. Components, white-noise errors; 3. ARMA errors on each.
  const start = search.best?.par;
  for (const boxCox of boxCoxChoices) {
    for (const tc of trendChoices) {
      const s: TbatsStructure = { ...base, boxCox, trend: tc.trend, damped: tc.damped, p: 0, q: 0 };
      const plain = search.fit(armaFixed ? { ...s, ...armaFixed } : s, start);
      if (!plain || !armaSearch) continue;
      const orders = residualArma(plain.pass.errors);
      if (orders.p + orders.q > 0) search.fit({ ...s, ...orders }, plain.par);
    }
  }
  const best = search.best;
  if (!best) throw new Error("no TBATS structure could be fitted");
  notes.push(...search.notes);
  notes.push(`Chosen by AIC among ${search.candidates.length} fitted structures.`);
  return new TbatsFitted(
    best.y,
    best.structure,
    best.par,
    best.seed,
    { ...best.options, notes, candidates: search.candidates, ...(options.calendar && !options.extra ? { calendar: options.calendar } : {}) },
    undefined,
    best.coef,
  );
}

/** ARMA orders an automatic search picks for the one-step errors (none when it fails). */
function residualArma(errors: Float64Array): { p: number; q: number } {
  try {
    const fit = autoSarima(errors, { seasonality: "none", structure: { d: 0, D: 0, P: 0, Q: 0 }, constant: false, fitBudget: 30 });
    return { p: fit.spec.p, q: fit.spec.q };
  } catch (e) {
    if (e instanceof InputError) throw e;
    return { p: 0, q: 0 };
  }
}
