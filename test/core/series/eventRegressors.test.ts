/**
 * Event weeks of the desk's own as a SARIMA regressor, on a seeded simulation with known truth:
 * eight one-week jumps of +15% on log rates (a strike, a canal closure…) over six years of an
 * AR(1) lane with an annual swing, plus one listed week in the forecast horizon. The regression
 * with ARMA errors must recover the jump within 3 standard errors and carry it into the
 * forecast; the week mapping and the refusals are checked by hand.
 */
import { analyse } from "../../../src/core/analysis";
import { MersenneTwister } from "../../../src/core/math/rng";
import { getModel } from "../../../src/core/models/registry";
import type { Fitted } from "../../../src/core/models/types";
import { optionsPhrase } from "../../../src/core/present/stamp";
import { autoTbats } from "../../../src/core/models/tbats/auto";
import type { InputError } from "../../../src/core/series/errors";
import { EVENT_COLUMN, eventRegressors, eventWeekEndings, eventWeeksFromMarks, isMarkColumn, joinRegressors, readMark, weekIndexOf } from "../../../src/core/series/eventRegressors";
import { lunarRegressors } from "../../../src/core/series/lunarRegressors";

const START = "2019-01-04"; // a Friday
const start = new Date(`${START}T00:00:00Z`);
const WEEK = 7 * 86_400_000;
const N = 6 * 52;
const EVENTS = [30, 61, 95, 140, 171, 200, 240, 280]; // week indices of the jumps
const JUMP = 0.15;
const FUTURE = N + 2; // a listed week three weeks after the data

function weekEnding(t: number): string {
  return new Date(start.getTime() + t * WEEK).toISOString().slice(0, 10);
}

function simulate(seed: number, withEvents: boolean): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(N);
  let e = 0;
  for (let t = 0; t < N; t++) {
    e = 0.6 * e + 0.03 * rng.normal();
    y[t] = Math.exp(7.4 + 0.07 * Math.sin((2 * Math.PI * t) / (365.25 / 7)) + e + (withEvents && EVENTS.includes(t) ? JUMP : 0));
  }
  return y;
}

function coefficient(f: Fitted, name: string): { value: number; se: number } {
  const p = f.summary().parameters.find((x) => x.name === name);
  if (!p || p.se === undefined || p.se === null) throw new Error(`no coefficient ${name}`);
  return { value: p.value, se: p.se };
}

// AR(1) with a mean and 2 Fourier pairs on logs, held fixed: the check is of the regressor alone.
const FIXED = { structure: { p: 1, d: 0, q: 0 }, pairs: 2, constant: true, lambda: 0 };
// Listed by a day inside each week (a Tuesday), as a desk would note the day of the strike.
const LISTED = [...EVENTS, FUTURE].map((t) => new Date(start.getTime() + t * WEEK - 3 * 86_400_000).toISOString().slice(0, 10));

describe("event weeks", () => {
  test("a date marks the week that contains it: the week ending e covers e − 6 … e", () => {
    // 2019-01-04 is week 0; 2019-01-05 (Saturday) … 2019-01-11 (Friday) are week 1.
    expect(weekIndexOf(start, new Date("2019-01-04T00:00:00Z"))).toBe(0);
    expect(weekIndexOf(start, new Date("2019-01-05T00:00:00Z"))).toBe(1);
    expect(weekIndexOf(start, new Date("2019-01-11T00:00:00Z"))).toBe(1);
    expect(weekIndexOf(start, new Date("2019-01-12T00:00:00Z"))).toBe(2);
    expect(eventWeekEndings(start, ["2019-01-08", "2019-01-10", "2019-01-03"])).toEqual(["2019-01-04", "2019-01-11"]);
    expect(() => eventWeekEndings(start, ["8 Jan"])).toThrow("Event weeks are dates written as YYYY-MM-DD (any day of the week); got “8 Jan”.");
    const set = joinRegressors([lunarRegressors(start, { before: 0, after: 0 }), eventRegressors(start, ["2019-01-11"])]);
    expect(set?.names).toEqual(["Lunar new year week", EVENT_COLUMN]);
    const out = new Float64Array(2);
    set?.at(1, out);
    expect(Array.from(out)).toEqual([0, 1]);
    // Lunar new year 2019 fell on 2019-02-05 (from memory; computed by lunar.ts): the week ending Friday 2019-02-08, week 5.
    set?.at(5, out);
    expect(Array.from(out)).toEqual([1, 0]);
  });

  test("SARIMA recovers a +15% one-week jump within 3 standard errors and carries it into a listed future week", () => {
    const y = simulate(5, true);
    const sarima = getModel("sarima");
    const events = eventWeekEndings(start, LISTED);
    const fit = sarima.fit(y, { ...FIXED, calendar: { start: START, events } });
    const c = coefficient(fit, EVENT_COLUMN);
    expect(Math.abs(c.value - JUMP)).toBeLessThan(3 * c.se);
    // Eight jumps against 3% noise: the standard error is near 0.03/√8 ≈ 0.011; a loose cap.
    expect(c.se).toBeLessThan(0.03);
    const f = fit.forecast(5, [80]).point;
    // Week N+2 is listed: its forecast stands about exp(c) above its neighbours (the AR(1)
    // part has all but died out by then; the annual swing moves ≤ 1% a week).
    const ratio = f[2] / Math.sqrt(f[1] * f[3]);
    expect(Math.abs(Math.log(ratio) - c.value)).toBeLessThan(0.02);
    const plain = sarima.fit(y, FIXED);
    expect(plain.summary().parameters.map((p) => p.name)).not.toContain(EVENT_COLUMN);
  });

  test("with no effect in the rates, the coefficient stays within noise of zero", () => {
    const fit = getModel("sarima").fit(simulate(6, false), { ...FIXED, calendar: { start: START, events: eventWeekEndings(start, LISTED) } });
    const c = coefficient(fit, EVENT_COLUMN);
    expect(Math.abs(c.value)).toBeLessThan(3 * c.se);
  });

  test("analyse(): the options and stamp name the weeks; none within the rates, or no dates, is refused with a sentence", () => {
    const y = simulate(7, true);
    const series = { dates: Array.from({ length: N }, (_, t) => new Date(start.getTime() + t * WEEK)), values: y, filled: new Array<boolean>(N).fill(false), warnings: [] };
    const r = analyse(series, { method: "lastweek", horizon: 4, checks: false, calendar: { events: ["2019-08-01", "2019-08-02"] } });
    expect(r.options.calendar.events).toEqual([weekEnding(30)]);
    expect(optionsPhrase(r.options)).toContain(`1 event week as a regressor (SARIMA, TBATS): ${weekEnding(30)}`);
    expect(r.warnings).toContain("Event weeks are used by SARIMA and TBATS only; Last week was fitted without them.");
    expect(() => analyse(series, { method: "sarima", calendar: { events: ["2030-01-01"] } })).toThrow(
      `None of the event weeks falls within the rates (${START} to ${weekEnding(N - 1)}), so their effect cannot be estimated; list at least one past week.`,
    );
    expect(() => analyse({ ...series, dates: [] }, { method: "sarima", calendar: { events: ["2019-08-01"] } })).toThrow("Event weeks need the week-ending dates beside the rates.");
  });
});

describe("event weeks for TBATS", () => {
  test("TBATS recovers the +15% jump on the log scale within 3 standard errors and carries it into the listed future week", () => {
    const y = simulate(5, true);
    const events = eventWeekEndings(start, LISTED);
    // Fixed structure (log scale, no trend, one harmonic, AR(1) errors): the regressor alone is compared.
    const structure = { lambda: 0, trend: false, harmonics: [1], arma: { p: 1, q: 0 } };
    const fit = autoTbats(y, { ...structure, calendar: { start: START, events } });
    const c = coefficient(fit, EVENT_COLUMN);
    // Same noise as for SARIMA above, so the same bounds: s.e. near 0.011, within 3 s.e. of 0.15.
    expect(c.se).toBeLessThan(0.03);
    expect(Math.abs(c.value - JUMP)).toBeLessThan(3 * c.se);
    const f = fit.forecast(5, [80]).point;
    expect(Math.abs(Math.log(f[2] / Math.sqrt(f[1] * f[3])) - c.value)).toBeLessThan(0.02);
    // Without a listed week in the fitted weeks there is nothing to estimate: no regressor.
    const early = autoTbats(y.slice(0, 25), { ...structure, harmonics: [0], calendar: { start: START, events } });
    expect(early.summary().parameters.map((p) => p.name)).not.toContain(EVENT_COLUMN);
  });
});

describe("event weeks marked in a column", () => {
  test("marks: 1, x, yes, TRUE mark; 0, no, FALSE, blank do not; anything else is not a mark", () => {
    for (const v of [1, "1", "x", "X", " yes ", true, "TRUE"]) expect(readMark(v)).toBe(true);
    for (const v of [0, "0", "no", false, null, undefined, "", "  "]) expect(readMark(v)).toBe(false);
    for (const v of [2, 0.5, "maybe", 45000, "2025-01-03"]) expect(readMark(v)).toBeNull();
    expect(isMarkColumn([0, null, 1, "x"])).toBe(true);
    // A column of dates (Excel serials) is not one of marks, nor is one that marks nothing.
    expect(isMarkColumn([45658, 45665])).toBe(false);
    expect(isMarkColumn([0, null, false])).toBe(false);
  });

  test("the dates of the marked rows, a dated coming week included; refusals name the problem", () => {
    // Excel serial 45660 is Friday 2025-01-03 (1900 date system; serial 45658 = 2025-01-01, from memory).
    const dates = [45660, 45667, 45674, "2025-01-24", null];
    expect(eventWeeksFromMarks({ marks: [null, "x", 0, 1], dates, what: 'The event column "Strike"' })).toEqual(["2025-01-10", "2025-01-24"]);
    expect(() => eventWeeksFromMarks({ marks: ["x", "?"], dates, what: 'The event column "Strike"' })).toThrow('The event column "Strike", row 2: “?” is not a mark; mark each event week with 1 (or x, TRUE) and leave the other weeks blank or 0.');
    const undated = (): string[] => eventWeeksFromMarks({ marks: [0, 0, 0, 0, 1], dates, what: 'The event column "Strike"', rowOffset: 1, markColOffset: 3 });
    expect(undated).toThrow('The event column "Strike": a week is marked with no week-ending date beside it; date the row or clear the mark.');
    try {
      undated();
    } catch (e) {
      // The offset of the cell inside the block read (header in row 0): the sink names the cell.
      expect((e as InputError).cell).toEqual({ row: 5, col: 3 });
    }
    expect(() => eventWeeksFromMarks({ marks: [0, null], dates, what: 'The event column "Strike"' })).toThrow('The event column "Strike": no week is marked; put 1 (or x) in the rows of the event weeks.');
  });
});

describe("event weeks first seen after a fit", () => {
  test("a re-estimation over weeks that hold the first event week adds its column (SARIMA and TBATS); an update without one keeps the fit's columns", () => {
    const y = simulate(5, true);
    const events = eventWeekEndings(start, LISTED);
    const calendar = { calendar: { start: START, events } };
    // The first jump is week 30: a fit on 25 weeks has no event column; 40 weeks later it should.
    const names = (f: Fitted): string[] => f.summary().parameters.map((p) => p.name);
    const fits: [string, Fitted][] = [
      ["SARIMA", getModel("sarima").fit(y.slice(0, 25), { structure: { p: 1, d: 0, q: 0 }, pairs: 0, constant: true, lambda: 0, ...calendar })],
      ["TBATS", autoTbats(y.slice(0, 25), { lambda: 0, trend: false, harmonics: [0], arma: { p: 1, q: 0 }, ...calendar })],
    ];
    for (const [, fit] of fits) {
      expect(names(fit)).not.toContain(EVENT_COLUMN);
      expect(names(fit.update(y.slice(25, 65), { reestimate: false }))).not.toContain(EVENT_COLUMN);
      const grown = fit.update(y.slice(25, 65), { reestimate: true });
      expect(names(grown)).toContain(EVENT_COLUMN);
      // One jump (week 30) and one more (week 61) in 65 weeks: the estimate is near +0.15 to
      // within a few standard errors of two weeks' noise (s.e. about 0.03/√2 ≈ 0.02).
      const c = coefficient(grown, EVENT_COLUMN);
      expect(Math.abs(c.value - JUMP)).toBeLessThan(4 * c.se);
    }
  });
});
