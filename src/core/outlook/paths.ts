/**
 * What a fitted model's simulated future paths say beyond the week-by-week outlook: the
 * average rate over a span of future weeks with its interval (a budget figure), and the
 * probability that the rate in a given week is above or below a level (a contract rate, say).
 *
 * Both come from the same seeded paths (Fitted.simulate), so they hold for every method and
 * are reproducible bit for bit. An average over weeks is not the average of the weekly
 * bounds: the weeks move together, and the paths carry that dependence. Intervals are
 * Hyndman–Fan type 7 sample quantiles; the Monte Carlo standard error is given beside each
 * estimate so a reader can see how many digits mean something.
 */
import { quantileSorted } from "../math/quantile";
import { createRng } from "../math/rng";
import type { Fitted } from "../models/types";
import { InputError } from "../series/errors";

/** Paths simulated for spans and chances: enough that a probability's standard error is at most 0.011. */
export const OUTLOOK_PATHS = 2000;
/** Seed of those paths (ours), so the same inputs give the same figures. */
export const OUTLOOK_PATHS_SEED = 20261202;

export interface Span {
  /** Weeks ahead, 1-based and inclusive: from 1 to 4 is the next four weeks. */
  from: number;
  to: number;
}

export type Direction = "above" | "below";

export interface Threshold {
  level: number;
  /** Weeks ahead, 1-based. */
  week: number;
  direction: Direction;
}

export interface SpanAverage extends Span {
  /** Mean over the paths of each path's average over the span. */
  mean: number;
  /** Monte Carlo standard error of that mean. */
  se: number;
  /** Per coverage level, the central interval of the path averages. */
  lower: number[];
  upper: number[];
}

export interface Chance extends Threshold {
  probability: number;
  se: number;
}

function whole(v: unknown, what: string, min: number, max: number): number {
  if (typeof v !== "number" || !Number.isInteger(v) || v < min || v > max) {
    throw new InputError("BAD_OPTION", `${what} must be a whole number from ${min} to ${max}; got ${String(v)}.`);
  }
  return v;
}

/** Checks spans and returns the furthest week they need. */
export function checkSpans(spans: readonly Span[], maxWeek: number): number {
  let far = 0;
  for (const s of spans) {
    const from = whole(s.from, "The first week of a span", 1, maxWeek);
    const to = whole(s.to, "The last week of a span", 1, maxWeek);
    if (to < from) throw new InputError("BAD_OPTION", `A span runs from an earlier week to a later one; got weeks ${from} to ${to}.`);
    far = Math.max(far, to);
  }
  return far;
}

/** Checks thresholds and returns the furthest week they need. */
export function checkThresholds(thresholds: readonly Threshold[], maxWeek: number): number {
  let far = 0;
  for (const t of thresholds) {
    if (typeof t.level !== "number" || !Number.isFinite(t.level)) {
      throw new InputError("BAD_OPTION", `The level must be a number, such as a contract rate; got ${String(t.level)}.`);
    }
    far = Math.max(far, whole(t.week, "The week ahead", 1, maxWeek));
    if (t.direction !== "above" && t.direction !== "below") {
      throw new InputError("BAD_OPTION", `The direction is "above" or "below"; got "${String(t.direction)}".`);
    }
  }
  return far;
}

/** The seeded paths both tables read, h weeks long. */
export function outlookPaths(fitted: Fitted, h: number): Float64Array[] {
  return fitted.simulate(h, OUTLOOK_PATHS, createRng(OUTLOOK_PATHS_SEED));
}

export function spanAverages(paths: Float64Array[], spans: readonly Span[], levels: readonly number[]): SpanAverage[] {
  const m = paths.length;
  return spans.map((s) => {
    const avg = new Float64Array(m);
    const k = s.to - s.from + 1;
    for (let j = 0; j < m; j++) {
      let sum = 0;
      for (let w = s.from - 1; w < s.to; w++) sum += paths[j][w];
      avg[j] = sum / k;
    }
    let mean = 0;
    for (let j = 0; j < m; j++) mean += avg[j];
    mean /= m;
    let ss = 0;
    for (let j = 0; j < m; j++) ss += (avg[j] - mean) ** 2;
    const se = Math.sqrt(ss / (m - 1) / m);
    const sorted = Float64Array.from(avg).sort();
    const lower = levels.map((l) => quantileSorted(sorted, (1 - l / 100) / 2));
    const upper = levels.map((l) => quantileSorted(sorted, 1 - (1 - l / 100) / 2));
    return { from: s.from, to: s.to, mean, se, lower, upper };
  });
}

export function crossingChances(paths: Float64Array[], thresholds: readonly Threshold[]): Chance[] {
  const m = paths.length;
  return thresholds.map((t) => {
    let hits = 0;
    for (let j = 0; j < m; j++) {
      const v = paths[j][t.week - 1];
      if (t.direction === "above" ? v > t.level : v < t.level) hits++;
    }
    const p = hits / m;
    return { ...t, probability: p, se: Math.sqrt((p * (1 - p)) / m) };
  });
}
