/**
 * The ISO week 53 table. Calendar facts first (which ISO years have a week 53 and which
 * Friday ends it), then seeded simulations with known truth: weekly Friday-ending log rates,
 * 2013-01-04 to 2026-11-27, a smooth annual cycle by day of the year, and an extra effect
 * only in ISO week 53. Week 53 against its neighbours (weeks 52 and 1) recovers the effect;
 * without it the ratio stays within noise of the cycle's own curvature; a surge over the turn
 * of the year does not show; the coming week 53 (2026, ending 2027-01-01) gets the mean.
 */
import { runChecks } from "../../../../src/core/diagnostics/battery";
import { factorsFromSeasonal, seasonalitySummary, week53Factors } from "../../../../src/core/diagnostics/seasonality";
import { stl, stlSettings, type StlResult } from "../../../../src/core/diagnostics/seasonality/stl";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { MS_PER_WEEK } from "../../../../src/core/series/calendar";
import { isoWeek, isoWeeksInYear } from "../../../../src/core/series/isoWeek";

const day = (s: string): Date => new Date(`${s}T00:00:00Z`);

/** Weekly dates from `first` to `last` inclusive. */
function weeks(first: string, last: string): Date[] {
  const out: Date[] = [];
  for (let t = day(first).getTime(); t <= day(last).getTime(); t += MS_PER_WEEK) out.push(new Date(t));
  return out;
}

/** A decomposition set by hand (no STL run), for checks that are exact arithmetic. */
function handMade(seasonal: Float64Array, remainder = new Float64Array(seasonal.length)): StlResult {
  const n = seasonal.length;
  return { trend: new Float64Array(n), seasonal, remainder, weights: new Float64Array(n).fill(1), settings: stlSettings({ period: 52 }) };
}

describe("calendar facts", () => {
  test("53-week ISO years and the Friday that ends each week 53", () => {
    // From memory, and by the ISO 8601 rule (a year has 53 weeks when it starts on a Thursday,
    // or is a leap year starting on a Wednesday): 2009, 2015, 2020, 2026, 2032 and 2037 from
    // 2008 to 2037. 1 January fell on a Thursday in 2009, 2015, 2026, 2037; 2020 and 2032 are
    // leap years, 2020 starting on a Wednesday and 2032 on a Thursday.
    const known = [2009, 2015, 2020, 2026, 2032, 2037];
    for (let y = 2008; y <= 2037; y++) expect(isoWeeksInYear(y) === 53).toBe(known.includes(y));
    // A series of Fridays 2008-01-04 … 2033-06-24 meets all of them, the last one still to come.
    const dates = weeks("2008-01-04", "2033-06-24");
    const f = week53Factors(dates, handMade(new Float64Array(dates.length)), "multiplicative");
    expect(f.years).toEqual(known);
    // A week belongs to the ISO year of its Thursday, so the Friday after the Thursday that
    // closes the year ends week 53: 2009-12-31, 2015-12-31, 2020-12-31 and 2026-12-31 are
    // Thursdays, so Fridays 2010-01-01, 2016-01-01, 2021-01-01, 2027-01-01; 2032-12-31 is a
    // Friday whose Thursday is 2032-12-30; 2037-12-31 is a Thursday, so 2038-01-01.
    expect(f.table.rows.map((r) => r[1])).toEqual(["2010-01-01", "2016-01-01", "2021-01-01", "2027-01-01", "2032-12-31", "2038-01-01"]);
    for (const d of f.weekEnding) expect(isoWeek(d).week).toBe(53);
    // Five weeks 53 in the data, the sixth (2037) coming: five "this year's", one mean.
    expect(f.source).toEqual(["observed", "observed", "observed", "observed", "observed", "mean"]);
  });

  test("the series' own weekday: Sunday-ending weeks end 2020-W53 on Sunday 2021-01-03", () => {
    // 2021-01-03 is in 2020-W53 (a Monday-to-Sunday week whose Thursday is 2020-12-31).
    const dates = weeks("2019-01-06", "2021-06-27");
    const f = week53Factors(dates, handMade(new Float64Array(dates.length)), "multiplicative");
    expect(f.table.rows.map((r) => [r[0], r[1]])).toEqual([[2020, "2021-01-03"], [2026, "2027-01-03"]]);
  });
});

// The simulation: Fridays 2013-01-04 … 2026-11-27 (726 weeks). The data meets ISO weeks 53
// of 2015 and 2020 (ending 2016-01-01 and 2021-01-01); 2026's ends 2027-01-01, after the data.
const SIM = weeks("2013-01-04", "2026-11-27");
const NOISE = 0.01;

/** Smooth annual cycle of log rates by the day of the calendar year (mean near 0). */
function cycle(d: Date): number {
  const a = (2 * Math.PI * (d.getTime() - Date.UTC(d.getUTCFullYear(), 0, 1))) / (365.25 * 86_400_000);
  return 0.12 * Math.sin(a) + 0.06 * Math.cos(2 * a);
}

/** Log rates: a wandering level, the cycle, log(1 + extra) in ISO week 53 only, and N(0, NOISE²) noise. */
function simulate(extra: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  return Float64Array.from(SIM, (d, t) => {
    const w53 = isoWeek(d).week === 53 ? Math.log(1 + extra) : 0;
    return Math.log(1500) + 0.0005 * t + 0.1 * Math.sin((2 * Math.PI * t) / 400) + cycle(d) + w53 + NOISE * rng.normal();
  });
}

/** Weeks 52 and 1 beside week `d` (a week earlier and a week later). */
function neighbours(d: Date): [Date, Date] {
  return [new Date(d.getTime() - MS_PER_WEEK), new Date(d.getTime() + MS_PER_WEEK)];
}

/** The true ratio of week `d` to the geometric mean of its neighbours, from the cycle alone, times 1 + extra. */
function truth(d: Date, extra: number): number {
  const [a, b] = neighbours(d);
  return Math.exp(cycle(d) - (cycle(a) + cycle(b)) / 2) * (1 + extra);
}

// One observed ratio carries the noise of three weeks: week 53's and half of each neighbour's,
// sd 1% × √(1 + ¼ + ¼) ≈ 1.22% on log rates; 4% is over three of those sds, and the 10% effect
// is more than twice the tolerance, so the check tells the effect from its absence.
const ONE_YEAR_TOL = 0.04;

describe("week 53 against weeks 52 and 1, on simulated rates", () => {
  test("a 10% effect only in ISO week 53 is recovered in each observed year, and the coming 2026 gets their mean", () => {
    const extra = 0.1;
    const f = week53Factors(SIM, stl(simulate(extra, 2013), { period: 52 }), "multiplicative");
    expect(f.years).toEqual([2015, 2020, 2026]);
    expect(f.observed).toBe(2);
    const rows = f.table.rows;
    const between = rows[0][3] as number;
    for (const j of [0, 1]) {
      expect(Math.abs(f.ratio[j] / truth(f.weekEnding[j], extra) - 1)).toBeLessThan(ONE_YEAR_TOL);
      // Factor to use = the weeks-52-and-1 factor × the ratio (the same product, so equal).
      expect(f.factor[j]).toBe(between * f.ratio[j]);
    }
    // The weeks-52-and-1 factor is the 52-week table's, as factors.ts makes it.
    const iso = factorsFromSeasonal(SIM, stl(simulate(extra, 2013), { period: 52 }).seasonal, "multiplicative").factors;
    expect(Math.abs(between - (iso[51] + iso[0]) / 2)).toBeLessThan(1e-15);
    // The mean over two years: noise sd 1.22%/√2 ≈ 0.9% around the 10% effect.
    const mean = (f.ratio[0] + f.ratio[1]) / 2;
    expect(mean).toBeGreaterThan(1.07);
    expect(mean).toBeLessThan(1.13);
    // The coming week 53: nothing observed; the factor to use applies the two years' mean.
    expect(rows[2].slice(0, 3)).toEqual([2026, "2027-01-01", null]);
    expect(Math.abs((rows[2][4] as number) - between * mean)).toBeLessThan(1e-15);
    expect(rows.map((r) => r[5])).toEqual(["this year's week 53", "this year's week 53", "mean of 2 observed weeks 53"]);
    expect(f.table.title).toBe("ISO week 53");
    expect(f.table.columns).toEqual(["ISO year", "Week ending", "Against weeks 52 and 1", "Weeks 52 and 1 factor", "Factor to use", "From"]);
    expect(f.table.notes[0]).toContain("in this table: 2015, 2020 and 2026");
  });

  test("without the effect, each observed ratio is within noise of 1", () => {
    const f = week53Factors(SIM, stl(simulate(0, 2014), { period: 52 }), "multiplicative");
    for (const j of [0, 1]) expect(Math.abs(f.ratio[j] / truth(f.weekEnding[j], 0) - 1)).toBeLessThan(ONE_YEAR_TOL);
  });

  test("a jump of rates soon after the turn of the year, which the STL trend anticipates, does not show as a week-53 effect", () => {
    // Log rates step up 40% from the week ending 2021-02-05, five weeks after 2020's week 53.
    // A loess trend (about 89 weeks wide) starts rising weeks before the step, so weeks 52, 53
    // and 1 all sit below it, alike: against its trend week 53 reads low, against its
    // neighbours it does not (the shape the sample desk book's index shows at 2020's week 53).
    const y = simulate(0, 2017);
    const from = SIM.findIndex((d) => d.getTime() === day("2021-02-05").getTime());
    for (let t = from; t < SIM.length; t++) y[t] += Math.log(1.4);
    const d = stl(y, { period: 52 });
    const f = week53Factors(SIM, d, "multiplicative");
    const t53 = SIM.findIndex((x) => x.getTime() === day("2021-01-01").getTime());
    // The ratio to trend reads the trend's anticipation: more than 5% from the season there.
    expect(Math.abs(Math.exp(d.seasonal[t53] + d.remainder[t53]) / Math.exp(cycle(SIM[t53])) - 1)).toBeGreaterThan(0.05);
    expect(Math.abs(f.ratio[1] / truth(f.weekEnding[1], 0) - 1)).toBeLessThan(ONE_YEAR_TOL);
  });

  test("additive: rate less the mean of its neighbours, in the rates' units, recovers +150 in week 53", () => {
    const rng = new MersenneTwister(2015);
    const sd = 10;
    const y = Float64Array.from(SIM, (d, t) => 1500 + 0.5 * t + 1000 * cycle(d) + (isoWeek(d).week === 53 ? 150 : 0) + sd * rng.normal());
    const f = week53Factors(SIM, stl(y, { period: 52 }), "additive");
    expect(f.table.title).toBe("ISO week 53 (additive)");
    for (const j of [0, 1]) {
      const [a, b] = neighbours(f.weekEnding[j]);
      const expected = 1000 * (cycle(f.weekEnding[j]) - (cycle(a) + cycle(b)) / 2) + 150;
      // Three weeks' noise, sd 10 × √1.5 ≈ 12.2: four of those sds (the 0.5-a-week drift cancels).
      expect(Math.abs(f.ratio[j] - expected)).toBeLessThan(4 * sd * Math.sqrt(1.5));
    }
    const between = f.table.rows[0][3] as number;
    expect(Math.abs(f.factor[2] - (between + (f.ratio[0] + f.ratio[1]) / 2))).toBeLessThan(1e-12);
  });
});

describe("few or no weeks 53 in the data", () => {
  // A seasonal component set by hand per ISO week, so the fallback is exact arithmetic.
  const g = (w: number): number => 1 + 0.1 * Math.cos((2 * Math.PI * w) / 52);

  test("under a year, ending before a 53-week year: only the coming row, between weeks 52 and 1", () => {
    // Fridays 2021-06-04 (2021-W22) … 2022-03-25 (2022-W12): each ISO week once, none a 53rd
    // (2021 and 2022 have 52 weeks); the next week 53 is 2026's, ending Friday 2027-01-01.
    const dates = weeks("2021-06-04", "2022-03-25");
    const present = dates.map((d) => isoWeek(d).week);
    expect(new Set(present).size).toBe(dates.length);
    const f = week53Factors(dates, handMade(Float64Array.from(present, (w) => Math.log(g(w)))), "multiplicative");
    // The 52-week table's factors: g(w) over their mean across the weeks present.
    const mean = present.reduce((a, w) => a + g(w), 0) / present.length;
    const expected = (g(52) + g(1)) / 2 / mean;
    expect(f.table.rows).toHaveLength(1);
    expect(f.table.rows[0].slice(0, 3)).toEqual([2026, "2027-01-01", null]);
    expect(Math.abs((f.table.rows[0][4] as number) - expected)).toBeLessThan(1e-14);
    expect(f.table.rows[0][5]).toBe("weeks 52 and 1 (no week 53 in the data)");
    // The same as factors.ts gives for those weeks.
    const iso = factorsFromSeasonal(dates, Float64Array.from(present, (w) => Math.log(g(w))), "multiplicative").factors;
    expect(Math.abs(f.factor[0] - (iso[51] + iso[0]) / 2)).toBeLessThan(1e-15);
  });

  test("additive fallback, and a single observed week 53 named as such", () => {
    const a = (w: number): number => 50 * Math.sin((2 * Math.PI * w) / 52);
    const short = weeks("2021-06-04", "2022-03-25");
    const present = short.map((d) => isoWeek(d).week);
    const fa = week53Factors(short, handMade(Float64Array.from(present, a)), "additive");
    const mean = present.reduce((s, w) => s + a(w), 0) / present.length;
    expect(Math.abs(fa.factor[0] - ((a(52) + a(1)) / 2 - mean))).toBeLessThan(1e-12);
    // 2019 … mid-2023 holds one week 53 (2020's), 20% above its neighbours in the remainder;
    // with no trend and no season the ratio is exactly 1.2 and the weeks-52-and-1 factor 1.
    const dates = weeks("2019-01-04", "2023-06-30");
    const s = new Float64Array(dates.length);
    const r = Float64Array.from(dates, (d) => (isoWeek(d).week === 53 ? Math.log(1.2) : 0));
    const f = week53Factors(dates, handMade(s, r), "multiplicative");
    expect(f.years).toEqual([2020, 2026]);
    expect(Math.abs(f.ratio[0] - 1.2)).toBeLessThan(1e-14);
    expect(f.table.rows[0][3]).toBe(1);
    expect(f.factor[1]).toBe(f.factor[0]);
    expect(f.table.rows[1][5]).toBe("the one observed week 53");
  });
});

describe("wiring", () => {
  test("the seasonality tables and the checks carry the table right after the lunar new year's", () => {
    const values = Float64Array.from(simulate(0.1, 2016), Math.exp);
    const series = { dates: SIM, values, filled: SIM.map(() => false), warnings: [] };
    const titles = seasonalitySummary(series).map((t) => t.title);
    expect(titles.slice(2)).toEqual(["Seasonal factors around the lunar new year", "ISO week 53"]);
    const checks = runChecks(series);
    expect(checks.tables.week53?.rows.map((r) => r[0])).toEqual([2015, 2020, 2026]);
    // The 52-row table keeps its shape and points to this one.
    expect(checks.tables.weekFactors?.rows).toHaveLength(52);
    expect(checks.tables.weekFactors?.notes.join(" ")).toContain("the ISO week 53 table gives that week its own factor");
  });
});
