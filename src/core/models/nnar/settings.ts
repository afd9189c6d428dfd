/**
 * From checked options and a series to the settings one NNAR fit runs with: the Box-Cox λ,
 * the lags p and P, the hidden-layer size, the scaling, and a note for every choice made.
 */
import { boxCoxInverse, boxCoxTransform, guerreroLambda } from "../../math/boxcox";
import { chooseArOrder, defaultMaxOrder } from "../../diagnostics/nonlinearity/arOrder";
import { stl } from "../../diagnostics/seasonality/stl";
import { checkSeries } from "../../diagnostics/input";
import { InputError } from "../../series/errors";
import type { TrainingData } from "./network";
import {
  CheckedOptions,
  MIN_TRAINING_WEEKS,
  NnarOptions,
  SEASON,
  SEASONAL_MARGIN,
  STL_MIN_WEEKS,
  checkOptions,
  defaultSeasonalLags,
  lagSet,
  minLength,
} from "./options";

export interface NnarSettings {
  p: number;
  P: number;
  size: number;
  lags: number[];
  maxLag: number;
  /** Box-Cox λ, null for none. */
  lambda: number | null;
  repeats: number;
  decay: number;
  seed: number;
  maxIter: number;
  refitIter: number;
  paths: number;
}

/** Centre and spread of the transformed series: z = (x − mean)/sd. */
export interface Scaling {
  mean: number;
  sd: number;
}

function fmt(x: number): string {
  return String(Number(x.toPrecision(3)));
}

/** Transformed values x = g(y): Box-Cox with λ, or a copy. Throws NON_POSITIVE for a log/Box-Cox of rates ≤ 0. */
export function toTransformed(y: Float64Array, lambda: number | null): Float64Array {
  if (lambda === null) return Float64Array.from(y);
  for (let i = 0; i < y.length; i++) {
    if (!(y[i] > 0)) {
      throw new InputError(
        "NON_POSITIVE",
        `A Box-Cox transform needs rates above zero, but week ${i + 1} is ${y[i]}; fit without a transform (lambda none) instead.`,
      );
    }
  }
  return boxCoxTransform(y, lambda);
}

/**
 * The data-scale value of a transformed one. Beyond the edge of the transform's range (a
 * simulated value below 0 for λ > 0, or above −1/λ for λ < 0) the limit is returned: 0 and +∞.
 */
export function toDataScale(x: number, lambda: number | null): number {
  if (lambda === null) return x;
  if (lambda !== 0 && 1 + lambda * x <= 0) return lambda > 0 ? 0 : Infinity;
  return boxCoxInverse(x, lambda);
}

export function scalingOf(x: Float64Array): Scaling {
  const n = x.length;
  let mean = 0;
  for (let i = 0; i < n; i++) mean += x[i];
  mean /= n;
  let ss = 0;
  for (let i = 0; i < n; i++) ss += (x[i] - mean) * (x[i] - mean);
  return { mean, sd: Math.sqrt(ss / (n - 1)) };
}

export function scaled(x: Float64Array, s: Scaling): Float64Array {
  const z = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) z[i] = (x[i] - s.mean) / s.sd;
  return z;
}

/** Rows t = maxLag..n−1: inputs z_{t−ℓ} for each lag ℓ, target z_t. */
export function buildDesign(z: Float64Array, lags: number[], maxLag: number): TrainingData {
  const n = z.length;
  const rows = n - maxLag;
  const inputs = lags.length;
  const x = new Float64Array(rows * inputs);
  const target = new Float64Array(rows);
  for (let r = 0; r < rows; r++) {
    const t = maxLag + r;
    target[r] = z[t];
    for (let i = 0; i < inputs; i++) x[r * inputs + i] = z[t - lags[i]];
  }
  return { x, target, rows, inputs };
}

export interface Resolved {
  settings: NnarSettings;
  y: Float64Array;
  x: Float64Array;
  scaling: Scaling;
  notes: string[];
}

/** AR order for the default p (FPP: AIC order of a linear AR on the seasonally adjusted data). */
function defaultP(x: Float64Array, notes: string[]): number {
  const n = x.length;
  let series = x;
  if (n >= STL_MIN_WEEKS) {
    const d = stl(x, { period: SEASON });
    series = new Float64Array(n);
    for (let i = 0; i < n; i++) series[i] = x[i] - d.seasonal[i];
  }
  const ceiling = Math.max(1, Math.min(defaultMaxOrder(n), n - MIN_TRAINING_WEEKS));
  let p = 1;
  try {
    p = chooseArOrder(series, ceiling).order;
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    notes.push("The AR order could not be chosen (the rates repeat an exact pattern); p = 1 was used.");
    return 1;
  }
  notes.push(
    n >= STL_MIN_WEEKS
      ? `p = ${p}: the AIC order of a linear AR (1 to ${ceiling}) fitted to the series after removing its STL seasonal component.`
      : `p = ${p}: the AIC order of a linear AR (1 to ${ceiling}) on the series as it is; seasonal adjustment by STL needs ${STL_MIN_WEEKS} weeks and the series has ${n}.`,
  );
  return p;
}

export function resolve(yIn: ArrayLike<number>, options: NnarOptions | undefined): Resolved {
  const o: CheckedOptions = checkOptions(options ?? {});
  const y = checkSeries(yIn, minLength(options ?? {}), "NNAR");
  const n = y.length;
  const notes: string[] = [];

  let lambda: number | null = null;
  if (o.lambda === "auto") {
    toTransformed(y, 1); // only for its positivity check and sentence
    try {
      lambda = guerreroLambda(y, SEASON);
      notes.push(`Box-Cox λ = ${fmt(lambda)}, chosen by Guerrero's method over 52-week subseries.`);
    } catch (e) {
      if (!(e instanceof RangeError)) throw e;
      notes.push("Guerrero's method could not choose a Box-Cox λ (no spread within any year); no transform was used.");
    }
  } else if (o.lambda !== null) {
    lambda = o.lambda;
    notes.push(`Box-Cox λ = ${fmt(lambda)}, as given.`);
  }
  const x = toTransformed(y, lambda);
  const scaling = scalingOf(x);
  if (!(scaling.sd > 0) || !Number.isFinite(scaling.sd)) {
    throw new InputError("CONSTANT_SERIES", "NNAR cannot be fitted: after the transform the rates do not vary.");
  }

  const P = o.P ?? defaultSeasonalLags(n, o.p);
  if (o.P === undefined) {
    notes.push(
      P === 1
        ? n >= 2 * SEASON + SEASONAL_MARGIN
          ? `P = 1 seasonal lag (week t−52): the series has ${n} weeks, at least the ${2 * SEASON + SEASONAL_MARGIN} the seasonal lag is used from.`
          : "P = 1 seasonal lag, the only input when p = 0."
        : `P = 0 (no seasonal lag): the seasonal lag is used from ${2 * SEASON + SEASONAL_MARGIN} weeks on and the series has ${n}.`,
    );
  }
  const p = o.p ?? defaultP(x, notes);
  const lags = lagSet(p, P);
  const maxLag = lags[lags.length - 1];
  if (n - maxLag < MIN_TRAINING_WEEKS) {
    throw new InputError(
      "TOO_FEW_POINTS",
      `NNAR with lags up to ${maxLag} weeks needs at least ${maxLag + MIN_TRAINING_WEEKS} weeks; the series has ${n}.`,
    );
  }
  if (p >= SEASON && P >= 1) notes.push(`Lag 52 is both a recent and a seasonal lag; it is fed to the network once.`);
  const size = o.size ?? Math.max(1, Math.round((p + P + 1) / 2));
  if (o.size === undefined) notes.push(`k = ${size} hidden units, round((p + P + 1)/2).`);
  return {
    settings: { p, P, size, lags, maxLag, lambda, repeats: o.repeats, decay: o.decay, seed: o.seed, maxIter: o.maxIter, refitIter: o.refitIter, paths: o.paths },
    y,
    x,
    scaling,
    notes,
  };
}
