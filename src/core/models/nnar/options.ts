/**
 * NNAR options: their checks, their defaults, and the fewest weeks a setting needs.
 *
 * Defaults follow Hyndman & Athanasopoulos (FPP, "Neural network autoregression"): p is the
 * AIC order of a linear AR fitted to the seasonally adjusted series, P = 1 seasonal lag when
 * the series is long enough, k = round((p + P + 1)/2) hidden units, an average of 20 networks.
 * The choices the book leaves open are fixed here and reported in the fit's notes.
 */
import { WEEKS_PER_YEAR } from "../../series/calendar";
import { badOption, wholeOption } from "../arguments";

/** Season length of the seasonal lags (DESIGN.md, "Periods": NNAR uses the integer lag 52). */
export const SEASON = WEEKS_PER_YEAR;
/** Weight decay λ_d on the connection weights (not the biases), see network.ts. */
export const DEFAULT_DECAY = 1e-3;
export const DEFAULT_REPEATS = 20;
export const DEFAULT_PATHS = 1000;
/** The project's default seed (createRng in math/rng.ts). */
export const DEFAULT_SEED = 20260101;
/**
 * BFGS iterations per network. Training stops early on purpose: with weight decay this light,
 * stopping is part of the regularisation. On two seeded checks (a random-walk index with a
 * yearly cycle, and a SETAR with a seasonal lag; 470 weeks, 70-week holdout, 4 seeds each) the
 * one-step holdout MSE was flat from 50 to 100 iterations and worse at 200; 75 keeps the
 * default 20-network fit to 470 weeks under a second (bench/nnar.ts).
 */
export const DEFAULT_MAX_ITER = 75;
/**
 * BFGS iterations per network when update() re-estimates from the previous weights. A warm
 * start continues the training, so with the full 75 every weekly re-estimation would train the
 * networks further than the first fit did, which the early stopping above is there to prevent;
 * 25 also makes a weekly re-estimating backtest affordable (measured on 470 synthetic weeks, 52
 * weekly re-estimations: 26.5 s at 75 iterations, 7.8 s at 25, one-step forecasts within 0.3%).
 */
export const DEFAULT_REFIT_ITER = 25;
/** Fewest training weeks (rows after the longest lag) a network is fitted to. */
export const MIN_TRAINING_WEEKS = 20;
/**
 * P defaults to 1 only with two full years plus this margin: the seasonal lag costs the first
 * 52 weeks, and 2·52 + 26 = 130 weeks leaves at least 78 (a year and a half) to train on.
 */
export const SEASONAL_MARGIN = 26;
/** Weeks STL needs (two full cycles), for the seasonal adjustment before the AIC choice of p. */
export const STL_MIN_WEEKS = 2 * SEASON;

/** NNAR options. A type alias (not an interface) so that it fits ModelSpec's default option type. */
export type NnarOptions = {
  /** Non-seasonal lags 1..p. Default: AIC order of a linear AR on the seasonally adjusted series. */
  p?: number;
  /** Seasonal lags 52, 104, …, 52·P. Default 1 with ≥ 130 weeks, else 0. */
  P?: number;
  /** Hidden units k. Default round((p + P + 1)/2). */
  hiddenUnits?: number;
  /** Networks averaged. Default 20. */
  networks?: number;
  /** Weight decay on connection weights. Default 1e-3. */
  weightDecay?: number;
  /** Box-Cox λ in [−1, 2], "auto" for Guerrero's choice (period 52), null (default) for none. */
  lambda?: number | "auto" | null;
  /** Seed of every random draw (starting weights, interval paths). Default 20260101. */
  seed?: number;
  /** BFGS iterations per network. Default 75. */
  maxIter?: number;
  /** BFGS iterations per network when update() re-estimates from the previous weights. Default 25. */
  refitIter?: number;
  /** Simulated paths behind forecast() intervals. Default 1000. */
  paths?: number;
};

const KNOWN = new Set(["p", "P", "hiddenUnits", "networks", "weightDecay", "lambda", "seed", "maxIter", "refitIter", "paths"]);

/** Options after their checks; p, P and size stay undefined until the data decide them. */
export interface CheckedOptions {
  p?: number;
  P?: number;
  size?: number;
  repeats: number;
  decay: number;
  lambda: number | "auto" | null;
  seed: number;
  maxIter: number;
  refitIter: number;
  paths: number;
}

const bad = badOption;
const whole = wholeOption;

/** Checks every option's type and range (not yet against the series). */
export function checkOptions(options: NnarOptions = {}): CheckedOptions {
  if (options === null || typeof options !== "object") throw bad("The NNAR options must be a set of named settings.");
  for (const key of Object.keys(options)) {
    if (!KNOWN.has(key)) {
      throw bad(`"${key}" is not an NNAR setting; the settings are ${[...KNOWN].join(", ")}.`);
    }
  }
  const o = options as Record<string, unknown>;
  const p = o.p === undefined ? undefined : whole(o.p, 0, 520, "number of recent weeks fed to the network (p)");
  const P = o.P === undefined ? undefined : whole(o.P, 0, 5, "number of seasonal lags (P)");
  if (p === 0 && P === 0) throw bad("The network needs at least one input: p and P cannot both be 0.");
  const size = o.hiddenUnits === undefined ? undefined : whole(o.hiddenUnits, 1, 100, "number of hidden units (hiddenUnits)");
  const repeats = o.networks === undefined ? DEFAULT_REPEATS : whole(o.networks, 1, 1000, "number of networks (networks)");
  let decay = DEFAULT_DECAY;
  if (o.weightDecay !== undefined) {
    if (typeof o.weightDecay !== "number" || !Number.isFinite(o.weightDecay) || o.weightDecay < 0) {
      throw bad(`The weight decay must be a number of at least 0, such as 0.001; got ${String(o.weightDecay)}.`);
    }
    decay = o.weightDecay;
  }
  let lambda: number | "auto" | null = null;
  if (o.lambda !== undefined && o.lambda !== null) {
    if (o.lambda === "auto") lambda = "auto";
    else if (typeof o.lambda === "number" && Number.isFinite(o.lambda) && o.lambda >= -1 && o.lambda <= 2) lambda = o.lambda;
    else throw bad(`The Box-Cox λ must be a number from −1 to 2, "auto" or none; got ${String(o.lambda)}.`);
  }
  const seed = o.seed === undefined ? DEFAULT_SEED : whole(o.seed, 0, 0xffffffff, "seed");
  const maxIter = o.maxIter === undefined ? DEFAULT_MAX_ITER : whole(o.maxIter, 1, 100000, "iteration limit (maxIter)");
  const refitIter = o.refitIter === undefined ? DEFAULT_REFIT_ITER : whole(o.refitIter, 1, 100000, "re-estimation iteration limit (refitIter)");
  const paths = o.paths === undefined ? DEFAULT_PATHS : whole(o.paths, 2, 1000000, "number of simulated paths");
  return { p, P, size, repeats, decay, lambda, seed, maxIter, refitIter, paths };
}

/** The lags fed to the network: 1..p and 52·1..52·P, each once, ascending. */
export function lagSet(p: number, P: number): number[] {
  const set = new Set<number>();
  for (let i = 1; i <= p; i++) set.add(i);
  for (let i = 1; i <= P; i++) set.add(SEASON * i);
  return [...set].sort((a, b) => a - b);
}

/** Default P for n weeks given the non-seasonal lags: see SEASONAL_MARGIN. */
export function defaultSeasonalLags(n: number, p: number | undefined): number {
  // With p = 0 the seasonal lag is the network's only input.
  if (p === 0) return 1;
  if (n < 2 * SEASON + SEASONAL_MARGIN) return 0;
  return n - Math.max(p ?? 0, SEASON) >= MIN_TRAINING_WEEKS ? 1 : 0;
}

/**
 * Fewest weeks the settings need: the longest lag plus MIN_TRAINING_WEEKS training weeks, with
 * p = 1 and P = 0 where the data would choose them (the smallest they can come out; P = 1 when
 * p = 0, the seasonal lag then being the only input), and two
 * full years for λ = "auto" (Guerrero's method compares at least two years).
 */
export function minLength(options: NnarOptions = {}): number {
  const o = checkOptions(options);
  const p = o.p ?? 1;
  const P = o.P ?? (p === 0 ? 1 : 0);
  let n = Math.max(p, SEASON * P) + MIN_TRAINING_WEEKS;
  if (o.lambda === "auto") n = Math.max(n, 2 * SEASON);
  return n;
}
