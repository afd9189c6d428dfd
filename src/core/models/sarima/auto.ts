/**
 * Automatic choice of the seasonal ARIMA structure, in the manner of Hyndman & Khandakar
 * (2008), "Automatic time series forecasting: the forecast package for R", JSS 27(3), §3.2:
 * differencing by tests first, then a stepwise search over the ARMA orders on AICc.
 *
 *  - Seasonality of weekly rates is carried one of two ways. "fourier" (the default with two
 *    years of data): K Fourier pairs of the period 365.25/7 with ARMA errors, K chosen by AICc.
 *    "lag52": seasonal AR/MA terms and, when the STL seasonal strength is at least 0.64, a
 *    seasonal difference (the strength rule of Wang, Smith & Hyndman, 2006, which Hyndman &
 *    Khandakar's later software uses for the seasonal difference; threshold from memory).
 *  - d: the KPSS level test at 5 % applied repeatedly (Kwiatkowski et al., 1992), at most 2.
 *  - Stepwise search (HK §3.2): start from (2,d,2)(1,D,1), (0,d,0)(0,D,0), (1,d,0)(1,D,0) and
 *    (0,d,1)(0,D,1), with a constant when d + D ≤ 1; then repeatedly move to the best of the
 *    neighbours that vary one of p, q, P, Q by ±1, p and q together by ±1, P and Q together by
 *    ±1, or toggle the constant, while AICc improves. Orders are bounded (p, q ≤ 5,
 *    p + q + P + Q ≤ 5) and the number of fits is capped. The search keeps P, Q ≤ 1 at the
 *    52-week lag (our rule): a second seasonal lag reaches two years back, is poorly
 *    determined from a decade of weekly data, and doubles the cost of each likelihood; a
 *    fixed structure may still ask for 2.
 *  - Fits whose AR or MA factors have a root within 1.01 of the unit circle (in B, or in B^s
 *    for the seasonal factors) are refused: their AR and MA parts nearly cancel and their
 *    intervals are unreliable (HK refuse near-unit roots too; our threshold).
 * AICc is compared only between fits with the same differencing and the same Box-Cox λ, since
 * the likelihood is of the differenced, transformed series.
 */
import { guerreroLambda } from "../../math/boxcox";
import { boxCoxTransform } from "../../math/boxcox";
import { kpss } from "../../diagnostics/unitroot/kpss";
import { stl } from "../../diagnostics/seasonality/stl";
import { stlStrength } from "../../diagnostics/seasonality/strength";
import { WEEKS_PER_YEAR, WEEKLY_PERIOD } from "../../series/calendar";
import { InputError } from "../../series/errors";
import { difference, differencingLags } from "./polynomial";
import { estimate, prepare } from "./estimate";
import { SarimaFitted } from "./model";
import { smallestRootModulus } from "./roots";
import { MAX_ORDER, defaultSpec, orderLabel, validateSpec, type RegressorSet, type SarimaOrder, type SarimaSpec } from "./spec";
import { calendarRegressors, type CalendarSpec } from "../../series/calendarRegressors";

export type SeasonalityMode = "fourier" | "lag52" | "none" | "auto";

export interface SarimaOptions {
  /** How the annual pattern is carried (module comment). Default "auto". */
  seasonality?: SeasonalityMode;
  /** Parts of the structure to hold fixed; the rest is searched. */
  structure?: Partial<SarimaOrder>;
  /** Fourier pairs to use (fourier mode); searched when absent. */
  pairs?: number;
  /** Include a mean or drift; searched when absent (only possible for d + D ≤ 1). */
  constant?: boolean;
  /** Box-Cox λ: a number, "auto" (Guerrero's method, period 52), or null (none, the default). */
  lambda?: number | "auto" | null;
  /** Most model fits the search may spend. Default 60. */
  fitBudget?: number;
  /** Most Fourier pairs the search tries. Default 10. */
  maxPairs?: number;
  /** Point forecasts as bias-adjusted means on the rate scale (Box-Cox only). */
  biasAdjust?: boolean;
  /** Calendar or other regressors on the level scale. */
  extra?: RegressorSet;
  /**
   * Calendar regressors described as data (so the option crosses to a worker): the week-ending
   * date of the first week, and the lunar-new-year window (lunarRegressors.ts). Ignored when
   * `extra` is given.
   */
  calendar?: CalendarSpec;
}

/** The calendar a fit keeps for its re-estimations (none when the caller gave its own columns). */
function calendarOf(options: SarimaOptions): { calendar?: CalendarSpec } {
  return options.calendar && !options.extra ? { calendar: options.calendar } : {};
}

/** Fewest weeks for seasonal terms: two full years plus room for the ARMA part. */
export const SEASONAL_MIN_WEEKS = 2 * WEEKS_PER_YEAR + 12;
/** Fewest weeks for any ARIMA fit. */
export const SARIMA_MIN_WEEKS = 20;
/** Smallest admissible root modulus of any AR or MA factor. */
export const ROOT_MARGIN = 1.01;
export const KPSS_LEVEL = 0.05;
export const SEASONAL_STRENGTH_THRESHOLD = 0.64;
/** Highest seasonal AR or MA order the search visits (module comment). */
export const SEARCH_MAX_SEASONAL = 1;

export function sarimaMinLength(options: SarimaOptions = {}): number {
  const mode = options.seasonality ?? "auto";
  const D = options.structure?.D ?? 0;
  if (mode === "lag52" || D > 0) return SEASONAL_MIN_WEEKS;
  return SARIMA_MIN_WEEKS;
}

interface Candidate {
  spec: SarimaSpec;
  fit: SarimaFitted | null;
  aicc: number;
  why?: string;
}

function key(s: SarimaSpec): string {
  return `${s.p},${s.d},${s.q},${s.P},${s.D},${s.Q},${s.constant ? 1 : 0},${s.fourier}`;
}

function admissible(fit: SarimaFitted): boolean {
  const c = fit.est.coefficients;
  return (
    smallestRootModulus(c.ar) >= ROOT_MARGIN &&
    smallestRootModulus(c.ma, -1) >= ROOT_MARGIN &&
    smallestRootModulus(c.sar) >= ROOT_MARGIN &&
    smallestRootModulus(c.sma, -1) >= ROOT_MARGIN
  );
}

/** d by repeated KPSS level tests at 5 %: difference while stationarity is rejected. */
export function chooseD(z: Float64Array, D: number, s: number, maxD = MAX_ORDER.d): number {
  let x = D > 0 ? difference(z, differencingLags(0, D, s)) : z;
  let d = 0;
  while (d < maxD && x.length >= 12) {
    let rejected: boolean;
    try {
      rejected = kpss(x, { regression: "c", level: KPSS_LEVEL }).rejected;
    } catch {
      break;
    }
    if (!rejected) break;
    d++;
    x = difference(x, differencingLags(1, 0, s));
  }
  return d;
}

/** D = 1 when the STL seasonal strength of z reaches 0.64 (module comment). */
export function chooseSeasonalD(z: Float64Array, s: number): { D: number; strength: number } {
  const dec = stl(z, { period: s });
  const strength = stlStrength(dec).seasonal;
  return { D: strength >= SEASONAL_STRENGTH_THRESHOLD ? 1 : 0, strength };
}

export function resolveLambda(y: Float64Array, lambda: SarimaOptions["lambda"]): number | null {
  if (lambda === undefined || lambda === null) return null;
  if (lambda === "auto") return guerreroLambda(y, WEEKS_PER_YEAR);
  if (!Number.isFinite(lambda) || lambda < -1 || lambda > 2) {
    throw new InputError("BAD_OPTION", `The Box-Cox λ must lie between −1 and 2; got ${lambda}.`);
  }
  return lambda;
}

/** Choose and fit a seasonal ARIMA model for rates y. */
export function autoSarima(y: Float64Array, options: SarimaOptions = {}): SarimaFitted {
  const fixed = options.structure ?? {};
  const notes: string[] = [];
  const n = y.length;
  if (n < sarimaMinLength(options)) {
    throw new InputError("TOO_FEW_POINTS", `SARIMA needs at least ${sarimaMinLength(options)} weeks of rates here; the series has ${n}.`);
  }
  for (let t = 0; t < n; t++) {
    if (!Number.isFinite(y[t])) throw new InputError("NOT_A_NUMBER", `SARIMA needs a number in every week; week ${t + 1} has none.`);
  }
  if (options.lambda !== undefined && options.lambda !== null) {
    const bad = y.findIndex((v) => !(v > 0));
    if (bad >= 0) {
      throw new InputError("NON_POSITIVE", `A Box-Cox transform needs rates above zero; week ${bad + 1} has ${y[bad]}.`);
    }
  }
  const lambda = resolveLambda(y, options.lambda);
  const z = lambda === null ? Float64Array.from(y) : boxCoxTransform(y, lambda);
  let mode = options.seasonality ?? "auto";
  if (!["fourier", "lag52", "none", "auto"].includes(mode)) {
    throw new InputError("BAD_OPTION", `Seasonality must be one of fourier, lag52, none or auto; got "${mode}".`);
  }
  const seasonalFixed = (fixed.P ?? 0) + (fixed.D ?? 0) + (fixed.Q ?? 0) > 0;
  if (mode === "auto" && seasonalFixed) mode = "lag52";
  if (mode === "auto") {
    mode = n >= SEASONAL_MIN_WEEKS ? "fourier" : "none";
    if (mode === "none") notes.push(`Under ${SEASONAL_MIN_WEEKS} weeks of rates, so no annual pattern is modelled.`);
  }
  if (mode === "fourier" && n < SEASONAL_MIN_WEEKS && options.pairs !== 0) {
    throw new InputError("TOO_FEW_POINTS", `Fourier seasonality needs at least ${SEASONAL_MIN_WEEKS} weeks; the series has ${n}.`);
  }
  const s = fixed.s ?? WEEKS_PER_YEAR;
  const seasonalArma = mode === "lag52";

  let D = fixed.D ?? 0;
  if (seasonalArma && fixed.D === undefined) {
    const choice = chooseSeasonalD(z, s);
    D = choice.D;
    notes.push(
      `Seasonal strength ${choice.strength.toFixed(2)} ${D ? "reaches" : "is below"} ${SEASONAL_STRENGTH_THRESHOLD}, so ${D ? "one seasonal difference is" : "no seasonal difference is"} taken.`,
    );
  }
  const d = fixed.d ?? chooseD(z, D, s);
  if (fixed.d === undefined) notes.push(`KPSS tests at 5% chose ${d} difference${d === 1 ? "" : "s"}.`);

  if (options.constant === true && d + D > 1) {
    throw new InputError(
      "BAD_OPTION",
      `A constant with ${d + D} differences would be a polynomial trend in the rates; fit it without the constant.`,
    );
  }
  const budget = options.fitBudget ?? 60;
  if (!Number.isInteger(budget) || budget < 1) {
    throw new InputError("BAD_OPTION", `The fit budget must be a whole number of fits (1 or more); got ${budget}.`);
  }
  const tried = new Map<string, Candidate>();
  let fits = 0;
  const base = defaultSpec({ d, D, s, lambda, fourierPeriod: WEEKLY_PERIOD, extra: options.extra ?? calendarRegressors(options.calendar, y.length) });
  const constantAllowed = d + D <= 1;

  const attempt = (spec: SarimaSpec): Candidate => {
    const k = key(spec);
    const seen = tried.get(k);
    if (seen) return seen;
    let cand: Candidate = { spec, fit: null, aicc: Infinity };
    if (fits >= budget) return cand;
    fits++;
    try {
      validateSpec(spec);
      const prep = prepare(z, spec);
      const est = estimate(prep);
      const fit = new SarimaFitted(y, prep, est, { biasAdjust: options.biasAdjust, ...calendarOf(options) });
      if (!Number.isFinite(fit.aicc)) cand = { spec, fit: null, aicc: Infinity, why: "too few weeks" };
      else if (!admissible(fit)) cand = { spec, fit: null, aicc: Infinity, why: "a root on the edge of the unit circle" };
      else cand = { spec, fit, aicc: fit.aicc };
    } catch (e) {
      cand = { spec, fit: null, aicc: Infinity, why: e instanceof Error ? e.message : String(e) };
    }
    tried.set(k, cand);
    return cand;
  };

  const within = (o: SarimaSpec): boolean =>
    o.p >= 0 && o.q >= 0 && o.P >= 0 && o.Q >= 0 &&
    o.p <= MAX_ORDER.p && o.q <= MAX_ORDER.q && o.P <= (fixed.P ?? SEARCH_MAX_SEASONAL) && o.Q <= (fixed.Q ?? SEARCH_MAX_SEASONAL) &&
    o.p + o.q + o.P + o.Q <= 5 &&
    (seasonalArma || (o.P === 0 && o.Q === 0)) &&
    (fixed.p === undefined || o.p === fixed.p) &&
    (fixed.q === undefined || o.q === fixed.q) &&
    (fixed.P === undefined || o.P === fixed.P) &&
    (fixed.Q === undefined || o.Q === fixed.Q) &&
    (options.constant === undefined || o.constant === options.constant) &&
    (!o.constant || constantAllowed);

  const clampFixed = (o: SarimaSpec): SarimaSpec => ({
    ...o,
    p: fixed.p ?? o.p,
    q: fixed.q ?? o.q,
    P: seasonalArma ? fixed.P ?? o.P : 0,
    Q: seasonalArma ? fixed.Q ?? o.Q : 0,
    constant: options.constant ?? (o.constant && constantAllowed),
  });

  const stepwise = (pairs: number, starts: SarimaSpec[]): Candidate => {
    let best: Candidate = { spec: base, fit: null, aicc: Infinity };
    for (const st of starts) {
      const c = attempt({ ...clampFixed(st), fourier: pairs });
      if (c.aicc < best.aicc) best = c;
    }
    let improved = best.fit !== null;
    while (improved && fits < budget) {
      improved = false;
      const cur = best.spec;
      const moves: Partial<SarimaSpec>[] = [];
      for (const dlt of [-1, 1]) {
        moves.push({ p: cur.p + dlt }, { q: cur.q + dlt }, { p: cur.p + dlt, q: cur.q + dlt });
        if (seasonalArma) moves.push({ P: cur.P + dlt }, { Q: cur.Q + dlt }, { P: cur.P + dlt, Q: cur.Q + dlt });
      }
      moves.push({ constant: !cur.constant });
      for (const mv of moves) {
        const next = { ...cur, ...mv };
        if (!within(next)) continue;
        const c = attempt(next);
        if (c.aicc < best.aicc) {
          best = c;
          improved = true;
        }
      }
    }
    return best;
  };

  const startsFor = (): SarimaSpec[] => {
    const c = constantAllowed;
    const st = [
      { ...base, p: 2, q: 2, P: 1, Q: 1, constant: c },
      { ...base, p: 0, q: 0, P: 0, Q: 0, constant: c },
      { ...base, p: 1, q: 0, P: 1, Q: 0, constant: c },
      { ...base, p: 0, q: 1, P: 0, Q: 1, constant: c },
    ];
    if (c) st.push({ ...base, p: 0, q: 0, P: 0, Q: 0, constant: false });
    return st.filter((x) => within(clampFixed(x)));
  };

  let best: Candidate;
  if (mode === "fourier") {
    const maxPairs = Math.min(options.maxPairs ?? 10, Math.floor(WEEKLY_PERIOD / 2));
    let pairs = options.pairs;
    if (pairs === undefined) {
      // Screen K with the first starting structure, then search the orders at the best K,
      // then move K one pair at a time while AICc improves with the chosen orders.
      const screen = clampFixed({ ...base, p: 2, q: 2, constant: constantAllowed });
      let bestK = 0;
      let bestA = Infinity;
      for (let k = 0; k <= maxPairs; k++) {
        const c = attempt({ ...screen, fourier: k });
        if (c.aicc < bestA) {
          bestA = c.aicc;
          bestK = k;
        }
      }
      best = stepwise(bestK, startsFor());
      for (const dir of [-1, 1]) {
        let k = best.spec.fourier + dir;
        while (k >= 0 && k <= maxPairs && fits < budget) {
          const c = attempt({ ...best.spec, fourier: k });
          if (!(c.aicc < best.aicc)) break;
          best = c;
          k += dir;
        }
      }
      notes.push(`${best.spec.fourier} Fourier pair${best.spec.fourier === 1 ? "" : "s"} of the ${WEEKLY_PERIOD.toFixed(2)}-week year chosen by AICc (0–${maxPairs} tried).`);
    } else {
      best = stepwise(pairs, startsFor());
    }
  } else {
    best = stepwise(0, startsFor());
  }
  if (fits >= budget) notes.push(`The search stopped at its budget of ${budget} fits.`);
  if (!best.fit) {
    // Every candidate failed: fall back to the plainest model with this differencing.
    const plain = { ...base, constant: false, fourier: 0 };
    const prep = prepare(z, plain);
    const reasons = [...tried.values()].map((c) => c.why).filter(Boolean);
    notes.push(`No searched model could be fitted (${reasons[0] ?? "unknown reason"}); ${orderLabel(plain)} is used.`);
    return new SarimaFitted(y, prep, estimate(prep), { notes, biasAdjust: options.biasAdjust, ...calendarOf(options) });
  }
  notes.unshift(`Chosen by AICc among ${fits} fitted structures.`);
  const candidates = [...tried.values()]
    .filter((c) => Number.isFinite(c.aicc))
    .map((c) => ({ structure: describe(c.spec), aicc: c.aicc }));
  return new SarimaFitted(y, best.fit.prep, best.fit.est, { notes, candidates, biasAdjust: options.biasAdjust, ...calendarOf(options) });
}

function describe(s: SarimaSpec): string {
  let t = orderLabel(s);
  if (s.constant) t += s.d + s.D === 0 ? " with mean" : " with drift";
  if (s.fourier) t += ` + ${s.fourier} Fourier`;
  return t;
}
