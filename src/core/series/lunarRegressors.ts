/**
 * Lunar-new-year calendar regressors for weekly rates: one 0/1 column per week of a window
 * around the holiday (DESIGN.md, "Periods": the effect is a calendar regressor, not part of
 * the fixed 52-week pattern, because the holiday moves by up to four weeks between years).
 *
 * A week ending on day e covers e − 6 … e. Its offset from the holiday is the whole number of
 * weeks k with L + 7k ≤ e ≤ L + 7k + 6, where L is the nearest lunar new year (lunar.ts): k = 0
 * is the week that contains the holiday, −1 the week before, +1 the week after. The columns
 * are the offsets −before … +after; every other week has zeros in all of them.
 */
import type { RegressorSet } from "../models/sarima/spec";
import { MS_PER_DAY, MS_PER_WEEK } from "./calendar";
import { InputError } from "./errors";
import { lunarNewYear } from "./lunar";

export interface LunarWindow {
  /** Weeks before the holiday's week, 0–6. */
  before: number;
  /** Weeks after it, 0–8. */
  after: number;
}

/** Common practice on container lanes: factories close for about a week, volumes recover over three to four. */
export const DEFAULT_LUNAR_WINDOW: LunarWindow = { before: 1, after: 3 };

/** The week's offset from the nearest lunar new year (module comment). */
export function lunarOffset(weekEnding: Date): number {
  const e = weekEnding.getTime();
  const y = weekEnding.getUTCFullYear();
  let best = Infinity;
  let offset = 0;
  for (const year of [y - 1, y, y + 1]) {
    if (year < 1900 || year > 2100) continue;
    const days = Math.round((e - lunarNewYear(year).getTime()) / MS_PER_DAY);
    const k = Math.floor(days / 7);
    if (Math.abs(days) < best) {
      best = Math.abs(days);
      offset = k;
    }
  }
  return offset;
}

export function checkWindow(w: Partial<LunarWindow> = {}): LunarWindow {
  const before = w.before ?? DEFAULT_LUNAR_WINDOW.before;
  const after = w.after ?? DEFAULT_LUNAR_WINDOW.after;
  if (!Number.isInteger(before) || before < 0 || before > 6) throw new InputError("BAD_OPTION", `Weeks before the lunar new year must be a whole number from 0 to 6; got ${before}.`);
  if (!Number.isInteger(after) || after < 0 || after > 8) throw new InputError("BAD_OPTION", `Weeks after the lunar new year must be a whole number from 0 to 8; got ${after}.`);
  return { before, after };
}

function weekName(k: number): string {
  return k === 0 ? "Lunar new year week" : `Lunar new year week ${k > 0 ? "+" : "−"}${Math.abs(k)}`;
}

/** The window's columns for week index t of a series whose week 0 ends on `start` (history and forecast weeks alike). */
export function lunarRegressors(start: Date, window: Partial<LunarWindow> = {}): RegressorSet {
  const w = checkWindow(window);
  const offsets: number[] = [];
  for (let k = -w.before; k <= w.after; k++) offsets.push(k);
  const cache = new Map<number, number>();
  return {
    names: offsets.map(weekName),
    at(t: number, out: Float64Array): void {
      let k = cache.get(t);
      if (k === undefined) {
        k = lunarOffset(new Date(start.getTime() + t * MS_PER_WEEK));
        cache.set(t, k);
      }
      for (let j = 0; j < offsets.length; j++) out[j] = offsets[j] === k ? 1 : 0;
    },
  };
}
