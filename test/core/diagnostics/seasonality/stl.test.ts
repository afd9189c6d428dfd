import { stl, stlSettings } from "../../../../src/core/diagnostics/seasonality/stl";
import type { StlOptions } from "../../../../src/core/diagnostics/seasonality/stl";
import { loadFixture } from "../../../fixtures";

// Reference: statsmodels 0.13.5 `statsmodels.tsa.seasonal.STL` (test/reference/make_stl.py) on
// the weekly Mauna Loa CO2 series shipped with statsmodels (last 730 weeks, gaps interpolated),
// the Nile flow (period 10) and yearly sunspots (period 11). Every setting — windows, degrees,
// jumps, inner and outer passes — is passed explicitly to both sides.

interface Settings {
  period: number;
  seasonal: number;
  trend: number;
  low_pass: number;
  seasonal_deg: 0 | 1;
  trend_deg: 0 | 1;
  low_pass_deg: 0 | 1;
  seasonal_jump: number;
  trend_jump: number;
  low_pass_jump: number;
  robust: boolean;
  inner_iter: number;
  outer_iter: number;
}

interface Case {
  settings: Settings;
  trend: number[];
  seasonal: number[];
  weights?: number[];
}

interface Co2Fixture {
  dates: string[];
  y: number[];
  cases: Record<string, Case>;
  statsmodels_defaults: Record<string, number | boolean>;
}

const co2 = loadFixture<Co2Fixture>("stl_co2.json");
const short = loadFixture<{ nile: number[]; sunspots: number[]; cases: Record<string, Case> }>("stl_short.json");

function options(s: Settings): StlOptions {
  return {
    period: s.period,
    seasonal: s.seasonal,
    trend: s.trend,
    lowPass: s.low_pass,
    seasonalDegree: s.seasonal_deg,
    trendDegree: s.trend_deg,
    lowPassDegree: s.low_pass_deg,
    seasonalJump: s.seasonal_jump,
    trendJump: s.trend_jump,
    lowPassJump: s.low_pass_jump,
    robust: s.robust,
    inner: s.inner_iter,
    outer: s.outer_iter,
  };
}

function maxAbsDiff(a: ArrayLike<number>, b: ArrayLike<number>): number {
  expect(a.length).toBe(b.length);
  let m = 0;
  for (let i = 0; i < b.length; i++) m = Math.max(m, Math.abs(a[i] - b[i]));
  return m;
}

function scale(y: number[]): number {
  return y.reduce((m, v) => Math.max(m, Math.abs(v)), 0);
}

// With identical settings STL is deterministic, so the two implementations can differ only by
// floating-point summation order inside each loess fit (at most ~100 terms) carried through
// at most 32 inner passes: observed differences are below 3e-14 of max|y| for every case. The
// bound 1e-9 · max|y| is far below anything visible in a rate (1e-6 of a USD 1,000 rate) and
// far above rounding noise. Convention differences would show at 1e-6 … 1e-2 (see stl.ts and
// loess.ts: bisquare cut-offs, the window rule when n_s exceeds the subseries length).
const REL_TOL = 1e-9;
// Robustness weights lie in [0, 1]; the same argument gives an absolute bound.
const WEIGHT_TOL = 1e-9;

const all: [string, number[], Case][] = [
  ...Object.entries(co2.cases).map(([k, c]): [string, number[], Case] => [`co2 ${k}`, co2.y, c]),
  ...Object.entries(short.cases).map(([k, c]): [string, number[], Case] => [
    k,
    k.startsWith("nile") ? short.nile : short.sunspots,
    c,
  ]),
];

describe("STL against statsmodels", () => {
  test.each(all)("%s: trend, seasonal, remainder (and weights when robust)", (_name, y, c) => {
    const r = stl(y, options(c.settings));
    const tol = REL_TOL * scale(y);
    expect(maxAbsDiff(r.trend, c.trend)).toBeLessThan(tol);
    expect(maxAbsDiff(r.seasonal, c.seasonal)).toBeLessThan(tol);
    // statsmodels' resid is observed − trend − seasonal; rebuild it from the fixture.
    const resid = y.map((v, i) => v - c.trend[i] - c.seasonal[i]);
    expect(maxAbsDiff(r.remainder, resid)).toBeLessThan(tol);
    if (c.weights) {
      expect(maxAbsDiff(r.weights, c.weights)).toBeLessThan(WEIGHT_TOL);
      // The robust cases do down-weight something (else the weights check is vacuous).
      expect(Math.min(...c.weights)).toBeLessThan(0.5);
    } else {
      expect(r.weights.every((w) => w === 1)).toBe(true);
    }
  });

  test("the fixture covers every option the brief asks for", () => {
    const s = all.map(([, , c]) => c.settings);
    expect(new Set(s.map((x) => x.seasonal))).toEqual(new Set([7, 13, 53]));
    expect(new Set(s.map((x) => x.robust))).toEqual(new Set([true, false]));
    expect(new Set(s.map((x) => x.trend_deg))).toEqual(new Set([0, 1]));
    expect(s.some((x) => x.seasonal_jump === 1 && x.trend_jump === 1 && x.low_pass_jump === 1)).toBe(true);
    expect(s.some((x) => x.seasonal_jump > 1 && x.trend_jump > 1 && x.low_pass_jump > 1)).toBe(true);
  });
});

describe("STL default settings", () => {
  test("paper's rules (Cleveland et al. 1990, sections 3 and 4; inner/outer as statsmodels) for weekly data", () => {
    const s = stlSettings({});
    // n_t: least odd ≥ 1.5·52 / (1 − 1.5/13) = 88.17 → 89; n_l: least odd ≥ 52 → 53.
    expect(s).toMatchObject({ period: 52, seasonal: 13, trend: 89, lowPass: 53, inner: 5, outer: 0 });
    // Jumps ceil(window / 10).
    expect([s.seasonalJump, s.trendJump, s.lowPassJump]).toEqual([2, 9, 6]);
    expect(stlSettings({ robust: true })).toMatchObject({ inner: 2, outer: 15 });
    // n_s = 7: 1.5·52 / (1 − 1.5/7) = 99.27 → 101.
    expect(stlSettings({ seasonal: 7 }).trend).toBe(101);
  });

  test("trend and low-pass defaults equal statsmodels' own for period 52, seasonal 13", () => {
    // statsmodels' STL(...).config, recorded in the fixture (its jumps default to 1 instead).
    const d = co2.statsmodels_defaults;
    const s = stlSettings({ period: 52, seasonal: 13 });
    expect(d.trend).toBe(s.trend);
    expect(d.low_pass).toBe(s.lowPass);
    expect(d.seasonal_jump).toBe(1);
  });

  test("T + S + R reproduces the series exactly (the decomposition is additive)", () => {
    const r = stl(co2.y, { robust: true });
    let worst = 0;
    for (let i = 0; i < co2.y.length; i++) worst = Math.max(worst, Math.abs(r.trend[i] + r.seasonal[i] + r.remainder[i] - co2.y[i]));
    // One rounding of a ~370 ppm number.
    expect(worst).toBeLessThan(1e-12);
  });

  test("default jumps stay close to the full fit on CO2 (the paper's claim for the speed-up)", () => {
    // The paper (section 4) presents the jumps as a speed-up of negligible cost; on weekly CO2 the
    // seasonal with and without jumps differs by under 0.5% of its peak-to-trough swing.
    const full = stl(co2.y, { seasonalJump: 1, trendJump: 1, lowPassJump: 1 });
    const fast = stl(co2.y);
    let lo = Infinity;
    let hi = -Infinity;
    for (const v of full.seasonal) {
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
    expect(maxAbsDiff(fast.seasonal, full.seasonal)).toBeLessThan(0.005 * (hi - lo));
  });
});
