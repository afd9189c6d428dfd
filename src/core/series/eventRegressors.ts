/**
 * Event weeks given by the desk (a port strike, a canal closure, a tariff deadline, a holiday
 * of their own trade) as one 0/1 calendar regressor: 1 in each listed week, 0 elsewhere, for
 * history and forecast weeks alike. A listed date marks the week that contains it: the week
 * ending e covers e − 6 … e, the same rule as the lunar-new-year weeks (lunarRegressors.ts).
 * One column, so every listed week shares one estimated effect; the regression with ARMA
 * errors (SARIMA) estimates it with its standard error.
 */
import type { RegressorSet } from "../models/sarima/spec";
import { isoDate, MS_PER_DAY } from "./calendar";
import { InputError } from "./errors";
import { parseIsoDateText } from "./excelDate";

export const EVENT_COLUMN = "Event weeks";

/** The week index (0 = the week ending on `start`) of the week that contains `date`. */
export function weekIndexOf(start: Date, date: Date): number {
  const days = Math.round((date.getTime() - start.getTime()) / MS_PER_DAY);
  return Math.ceil(days / 7);
}

/** The listed dates as the week endings of the series' weeks that contain them, sorted, once each. */
export function eventWeekEndings(start: Date, dates: readonly string[]): string[] {
  const out = new Set<string>();
  for (const text of dates) {
    const d = parseIsoDateText(text.trim());
    if (!d) throw new InputError("BAD_OPTION", `Event weeks are dates written as YYYY-MM-DD (any day of the week); got “${text}”.`);
    const t = weekIndexOf(start, d);
    out.add(isoDate(new Date(start.getTime() + t * 7 * MS_PER_DAY)));
  }
  return [...out].sort();
}

/** The regressor for a series whose week 0 ends on `start`; `weeks` are week endings (eventWeekEndings). */
export function eventRegressors(start: Date, weeks: readonly string[]): RegressorSet {
  const marked = new Set<number>();
  for (const w of weeks) {
    const d = parseIsoDateText(w);
    if (!d) throw new InputError("BAD_OPTION", `Event weeks are dates written as YYYY-MM-DD; got “${w}”.`);
    marked.add(weekIndexOf(start, d));
  }
  return {
    names: [EVENT_COLUMN],
    at(t: number, out: Float64Array): void {
      out[0] = marked.has(t) ? 1 : 0;
    },
  };
}

/** Several regressor sets side by side, as one (undefined when there are none). */
export function joinRegressors(sets: (RegressorSet | undefined)[]): RegressorSet | undefined {
  const present = sets.filter((s): s is RegressorSet => s !== undefined);
  if (present.length <= 1) return present[0];
  const widths = present.map((s) => s.names.length);
  const scratch = present.map((s) => new Float64Array(s.names.length));
  return {
    names: present.flatMap((s) => s.names),
    at(t: number, out: Float64Array): void {
      let j = 0;
      present.forEach((s, k) => {
        s.at(t, scratch[k]);
        out.set(scratch[k], j);
        j += widths[k];
      });
    },
  };
}
