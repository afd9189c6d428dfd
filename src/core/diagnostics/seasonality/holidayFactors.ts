/**
 * Seasonal factors aligned to the lunar new year: the weeks around the holiday counted from
 * it (week 0 holds the holiday, −1 the week before), beside what the ISO-week factors say of
 * the same weeks. The holiday moves by up to four weeks between years, so a fixed 52-week
 * pattern (the ISO-week factors, STL's seasonal component) averages its dip over several ISO
 * weeks and shows it shallower and wider than it is; counted from the holiday, the dip lines up.
 *
 * From the same STL run as the ISO-week factors (Cleveland et al., 1990): the holiday-aligned
 * factor of offset k is the mean, first within each year and then across years, of the rate's
 * ratio to its trend, exp(S_t + R_t) on log rates (S_t + R_t, additive), over the weeks t at
 * offset k; beside it the mean of exp(S_t) (S_t) over the same weeks. Both are scaled as the
 * ISO-week factors are (divided by the mean of exp(S_t) over all weeks; additive: shifted by
 * the mean of S_t), so the columns compare directly with the ISO-week table.
 */
import type { Cell, ReportTable } from "../../report";
import { table } from "../../report";
import { lunarOffset } from "../../series/lunarRegressors";
import type { FactorKind } from "./factors";
import type { StlResult } from "./stl";

/** The weeks shown: a month before the holiday to six weeks after (common practice: factories close about a week, volumes recover over three to four). */
export const HOLIDAY_WEEKS = { before: 4, after: 6 };

function offsetLabel(k: number): string {
  return k === 0 ? "0 (holiday week)" : k > 0 ? `+${k}` : `−${-k}`;
}

/** The year of the holiday a week is counted from: December weeks before it belong to the next year's. */
function holidayYear(date: Date, k: number): number {
  return date.getUTCFullYear() + (k < 0 && date.getUTCMonth() === 11 ? 1 : 0);
}

export interface HolidayFactors {
  offsets: number[];
  aligned: Float64Array;
  iso: Float64Array;
  years: Int32Array;
  table: ReportTable;
}

export function holidayFactors(dates: Date[], decomposition: StlResult, kind: FactorKind, weeks = HOLIDAY_WEEKS): HolidayFactors {
  const { seasonal, remainder } = decomposition;
  const n = seasonal.length;
  const mult = kind === "multiplicative";
  const offsets: number[] = [];
  for (let k = -weeks.before; k <= weeks.after; k++) offsets.push(k);
  // Per offset, per holiday year: sums of the ratio to trend and of the fixed seasonal effect.
  const byYear = offsets.map(() => new Map<number, { a: number; s: number; c: number }>());
  let centre = 0;
  for (let t = 0; t < n; t++) {
    const s = mult ? Math.exp(seasonal[t]) : seasonal[t];
    centre += s;
    const k = lunarOffset(dates[t]);
    if (k < -weeks.before || k > weeks.after) continue;
    const a = mult ? Math.exp(seasonal[t] + remainder[t]) : seasonal[t] + remainder[t];
    if (!Number.isFinite(a)) continue;
    const m = byYear[k + weeks.before];
    const y = holidayYear(dates[t], k);
    const acc = m.get(y) ?? { a: 0, s: 0, c: 0 };
    acc.a += a;
    acc.s += s;
    acc.c += 1;
    m.set(y, acc);
  }
  centre /= n;
  const aligned = new Float64Array(offsets.length);
  const iso = new Float64Array(offsets.length);
  const years = new Int32Array(offsets.length);
  const rows: Cell[][] = [];
  offsets.forEach((k, j) => {
    const m = byYear[j];
    let a = 0;
    let s = 0;
    for (const acc of m.values()) {
      a += acc.a / acc.c;
      s += acc.s / acc.c;
    }
    const c = m.size;
    years[j] = c;
    aligned[j] = c > 0 ? (mult ? a / c / centre : a / c - centre) : NaN;
    iso[j] = c > 0 ? (mult ? s / c / centre : s / c - centre) : NaN;
    rows.push([offsetLabel(k), c > 0 ? aligned[j] : null, c > 0 ? iso[j] : null, c]);
  });
  const notes = [
    mult
      ? "Counted from the lunar new year: the rate's ratio to its STL trend in each week around the holiday, averaged over the years. Beside it, the ISO-week factors of the same weeks: a fixed 52-week pattern smears the moving holiday, so its dip looks shallower."
      : "Counted from the lunar new year: the rate minus its STL trend in each week around the holiday, averaged over the years. Beside it, the ISO-week effects of the same weeks: a fixed 52-week pattern smears the moving holiday, so its dip looks shallower.",
    "Each year's own noise is in the holiday-aligned column: with a dozen years, differences of a percent or two between the columns are within it.",
    "Week 0 holds the holiday (lunar new year's day); the dates are the Chinese calendar's, computed for every year.",
  ];
  const title = mult ? "Seasonal factors around the lunar new year" : "Seasonal effects around the lunar new year (additive)";
  return {
    offsets,
    aligned,
    iso,
    years,
    table: table(title, ["Weeks from lunar new year", "Factor aligned to the holiday", "ISO-week factor of those weeks", "Years averaged"], rows, notes),
  };
}
