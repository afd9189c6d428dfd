/**
 * The calendar regressors a model fit takes, described as data so the option crosses to a
 * worker unchanged: the week-ending date of the series' first week, the lunar-new-year window
 * (lunarRegressors.ts) and the desk's event weeks (eventRegressors.ts). SARIMA (regression
 * with ARMA errors) and TBATS (regressors on the transformed scale) build the same columns
 * from it, for history and forecast weeks alike.
 */
import type { RegressorSet } from "../models/sarima/spec";
import { InputError } from "./errors";
import { eventRegressors, joinRegressors } from "./eventRegressors";
import { parseIsoDateText } from "./excelDate";
import { lunarRegressors, type LunarWindow } from "./lunarRegressors";

export interface CalendarSpec {
  /** Week-ending date (YYYY-MM-DD) of week 0 of the series being fitted. */
  start: string;
  lunarNewYear?: Partial<LunarWindow>;
  /** Week endings of the desk's event weeks. */
  events?: string[];
}

/**
 * The calendar's regressors for a fit on the first `n` weeks (undefined when it asks for none).
 * Event weeks count only when one of them falls in those weeks: a column of zeros has no effect
 * to estimate (a backtest origin before the first listed week fits without it).
 */
export function calendarRegressors(c: CalendarSpec | undefined, n: number): RegressorSet | undefined {
  if (!c || (!c.lunarNewYear && !(c.events && c.events.length > 0))) return undefined;
  const start = parseIsoDateText(c.start);
  if (!start) throw new InputError("BAD_OPTION", `The calendar's first week must be a date written as YYYY-MM-DD; got "${String(c.start)}".`);
  const events = c.events && c.events.length > 0 ? eventRegressors(start, c.events) : undefined;
  const probe = new Float64Array(1);
  let seen = false;
  for (let t = 0; t < n && events && !seen; t++) {
    events.at(t, probe);
    seen = probe[0] !== 0;
  }
  return joinRegressors([c.lunarNewYear ? lunarRegressors(start, c.lunarNewYear) : undefined, seen ? events : undefined]);
}
