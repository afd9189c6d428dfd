/**
 * autoTbats: option checks (InputError codes and sentences), the short-series and
 * non-positive-data fallbacks, and the structure search on seeded simulations with known truth
 * (simulate.ts, the model equations of De Livera, Hyndman & Snyder, 2011, §2; search as in §4.2).
 */
import { MersenneTwister } from "../../../../src/core/math/rng";
import { autoTbats, type TbatsOptions } from "../../../../src/core/models/tbats/auto";
import { fitTbatsStructure, type TbatsFitted } from "../../../../src/core/models/tbats/model";
import { expectInputError } from "../../../inputError";
import { simulateTbats, type TbatsTruth } from "./simulate";

const WEEK_YEAR = 365.25 / 7;

function seasonalTruth(harmonics: number, amplitude: number): TbatsTruth {
  return {
    lambda: null, alpha: 0.2, trend: true, beta: 0.01, phi: 1, periods: [WEEK_YEAR], harmonics: [harmonics],
    gamma1: [0.005], gamma2: [0.005], ar: [], ma: [], sigma: 1, level0: 100, slope0: 0, amplitude,
  };
}

/** 120 positive weeks: enough for every option check to be reached (two seasons need 105). */
const rates = simulateTbats(seasonalTruth(2, 4), 120, new MersenneTwister(1)).y;

describe("option checks", () => {
  test.each<[string, TbatsOptions, RegExp]>([
    ["harmonics count ≠ periods", { harmonics: [2, 3] }, /one number of harmonics per seasonal period: 1 period\(s\), 2 number\(s\)/],
    // The most harmonics of period m: the largest K with 2K < m, so each harmonic is a distinct
    // frequency below Nyquist: 26 for 52.18, 3 for 7.5.
    ["negative K", { harmonics: [-1] }, /period of 52\.1\d+ weeks allows 0 to 26 harmonics; got -1/],
    ["fractional K", { harmonics: [2.5] }, /allows 0 to 26 harmonics; got 2\.5/],
    ["K beyond Nyquist", { periods: [7.5], harmonics: [4] }, /period of 7\.5 weeks allows 0 to 3 harmonics; got 4/],
    ["period < 2", { periods: [1.5] }, /seasonal period must be a number of weeks of at least 2; got 1\.5/],
    ["period not a number", { periods: [NaN] }, /at least 2; got NaN/],
    ["damped without trend", { trend: false, damped: true }, /damped trend needs a trend/],
    ["λ out of range", { lambda: 3 }, /Box-Cox setting must be "search", "auto", a number between -1 and 2, or none; got 3/],
    ["λ not a setting", { lambda: "maybe" as unknown as TbatsOptions["lambda"] }, /Box-Cox setting .* got maybe/],
    ["ARMA p > 5", { arma: { p: 6, q: 0 } }, /ARMA orders for the errors must be whole numbers from 0 to 5; got p = 6, q = 0/],
    ["ARMA q < 0", { arma: { p: 1, q: -1 } }, /from 0 to 5; got p = 1, q = -1/],
    ["ARMA fractional", { arma: { p: 1.5, q: 0 } }, /from 0 to 5; got p = 1\.5/],
    ["maxHarmonics 0", { maxHarmonics: 0 }, /most harmonics to try must be a whole number of 1 or more; got 0/],
  ])("%s → BAD_OPTION with a sentence", (_name, options, message) => {
    const e = expectInputError(() => autoTbats(rates, options), "BAD_OPTION", message);
    // A sentence: starts with a capital, ends with a full stop.
    expect(e.message).toMatch(/^[A-Z].*\.$/);
  });

  test("too few weeks: TOO_FEW_POINTS, with the number needed", () => {
    expectInputError(() => autoTbats(rates.slice(0, 15)), "TOO_FEW_POINTS", /at least 20 weeks of rates here; the series has 15\./);
    // Fixed harmonics need two full seasons: ⌈2 × 52.18⌉ = 105 weeks.
    expectInputError(() => autoTbats(rates.slice(0, 60), { harmonics: [2] }), "TOO_FEW_POINTS", /at least 105 weeks .* has 60\./);
  });

  test("non-positive rates: NON_POSITIVE with λ \"auto\" or a number; with the default, a note and no transform", () => {
    const y = Float64Array.from(rates.slice(0, 60));
    y[4] = 0;
    expectInputError(() => autoTbats(y, { lambda: "auto" }), "NON_POSITIVE", /Box-Cox transform needs rates above zero; week 5 has 0\./);
    expectInputError(() => autoTbats(y, { lambda: 0.5 }), "NON_POSITIVE", /week 5 has 0\./);
    const fit = autoTbats(y, { arma: false });
    expect(fit.par.lambda).toBeNull();
    expect(fit.structure.boxCox).toBe(false);
    const sm = fit.summary();
    expect(sm.notes).toContain("Some rates are zero or below, so no Box-Cox transform was tried.");
    expect(sm.structure).toMatch(/^TBATS\(1, /);
    // No candidate was fitted with a transform (a transformed label shows λ to two decimals).
    for (const c of fit.candidates()) expect(c.structure).toMatch(/^TBATS\(1, /);
  });

  test("under two years: fitted without seasonality, and summary() says so", () => {
    const fit = autoTbats(rates.slice(0, 80));
    expect(fit.structure.periods).toEqual([]);
    expect(fit.structure.harmonics).toEqual([]);
    const sm = fit.summary();
    expect(sm.structure).toMatch(/\{\}\)/);
    expect(sm.notes).toContain("Under 105 weeks of rates, so the 52.18-week pattern is not modelled.");
    expect(sm.notes.join(" ")).toMatch(/no seasonality/);
    expect(fit.forecast(4, [80]).point.every((v) => Number.isFinite(v))).toBe(true);
  });
});

describe("structure search on simulated rates with a <52.18,3> seasonal", () => {
  // Six years (n = 312), harmonic amplitudes 6, 3, 2 against σ = 1: K = 1 or 2 leaves a
  // harmonic with a likelihood-ratio statistic in the hundreds, so under-fitting is not a risk.
  // Over-fitting is AIC's tendency: each extra harmonic adds two seeds (penalty 4) and, absent
  // in the truth, gains LR ~ χ²₂, so AIC adds the 4th with probability P(χ²₂ > 4) = e⁻² ≈ 13.5%
  // and reaches K ≥ 5 with probability ≲ P(χ²₄ > 8) = 5e⁻⁴ ≈ 9%. A correct search is therefore
  // within ±1 of 3 in each seed with probability ≳ 0.91; we ask for at least 6 of 8 seeds, which
  // a correct search misses with probability ≈ 1.5–3% (binomial, per-seed failure 7–9%). Measured with the best AIC over
  // K = 1..8 each fitted directly: K = 4, 3, 4, 3, 3, 3, 3, 4 for seeds 1–8 (seeds 3 and 8 have
  // periodogram ordinates 12.4 and 14.8 at the 4th harmonic's frequency in their innovations,
  // a chance 4th harmonic, so 4 is right there).
  const SEEDS = [1, 2, 3, 4, 5, 6, 7, 8];
  // A restricted search (no transform, undamped trend, white-noise errors) keeps the runtime to
  // the harmonics search, which is what is tested here.
  const options: TbatsOptions = { lambda: null, trend: true, damped: false, arma: false };
  const runs = SEEDS.map((seed) => {
    const y = simulateTbats(seasonalTruth(3, 6), 312, new MersenneTwister(seed)).y;
    return { seed, y, fit: autoTbats(y, options) };
  });

  test("K within ±1 of the true 3 in at least 6 of 8 seeds", () => {
    const ks = runs.map((r) => r.fit.structure.harmonics[0]);
    const near = ks.filter((k) => Math.abs(k - 3) <= 1).length;
    expect({ ks, near: near >= 6 }).toEqual({ ks, near: true });
  });

  test("the candidates contain the chosen structure, and none has a lower AIC", () => {
    for (const { fit } of runs) checkCandidates(fit);
  });

  test("the chosen structure is no worse by AIC than the true structure fitted directly", () => {
    // The search should never return a structure that loses to one it could have fitted: here
    // the true <52.18,3> with the same components. 0.5 AIC units absorb optimiser differences
    // between a warm and a cold start (where the search visited K = 3, its fit was within 0.05
    // of the direct one, or better by 1.0 in seed 5). This caught two faults of an earlier
    // search: a screen of K = 1, 2, 4, 7, 10 with ±1 steps from the best never visited K = 3 when
    // 5 beat 4 (seed 2) or 7 edged out 4 (seed 6); and warm-starting each K from the previous
    // best left a K = 3 fit 22 AIC units short of a cold start (seed 4).
    const worse: string[] = [];
    for (const { seed, y, fit } of runs) {
      const direct = fitTbatsStructure(y, { boxCox: false, trend: true, damped: false, periods: [WEEK_YEAR], harmonics: [3], p: 0, q: 0 });
      if (fit.aic > direct.aic + 0.5) worse.push(`seed ${seed}: chose K = ${fit.structure.harmonics[0]}, AIC ${fit.aic.toFixed(2)} > ${direct.aic.toFixed(2)} at K = 3`);
    }
    expect(worse).toEqual([]);
  });
});

function checkCandidates(fit: TbatsFitted): void {
  const label = fit.summary().structure;
  const cands = fit.candidates();
  expect(cands.length).toBeGreaterThan(1);
  expect(cands.some((c) => c.structure === label && c.aic === fit.aic)).toBe(true);
  for (const c of cands) expect(c.aic).toBeGreaterThanOrEqual(fit.aic);
  // Best first.
  for (let i = 1; i < cands.length; i++) expect(cands[i].aic).toBeGreaterThanOrEqual(cands[i - 1].aic);
  expect(fit.summary().notes).toContain(`Chosen by AIC among ${cands.length} fitted structures.`);
}

describe("full default search", () => {
  test("transform, trend and ARMA choices all recorded; the chosen one has the least AIC", () => {
    const y = simulateTbats({ ...seasonalTruth(2, 4), lambda: 0.5, level0: 40, sigma: 0.4, ar: [0.5] }, 260, new MersenneTwister(9)).y;
    const fit = autoTbats(y);
    checkCandidates(fit);
    const labels = fit.candidates().map((c) => c.structure);
    // Both transform choices, a damped and an undamped trend, and no trend were fitted.
    expect(labels.some((l) => l.startsWith("TBATS(1, "))).toBe(true);
    expect(labels.some((l) => /^TBATS\(\d\.\d\d, /.test(l))).toBe(true);
    expect(labels.some((l) => /^TBATS\([^)]*, \{\d,\d\}, \d\.\d{3}, /.test(l))).toBe(true);
    expect(labels.some((l) => l.endsWith("without trend"))).toBe(true);
  });
});

describe("a season must earn its seeds", () => {
  // Independent N(1000, 50²) weeks have no annual pattern. Without K = 0 among the candidates
  // the search had to give them one, and chose 6 harmonics (measured on seed 3 with the default
  // options, before K = 0 was added);
  // with it, AIC keeps the pattern out in each of these seeds: an extra harmonic pair costs 4
  // in AIC and gains a χ²₂ statistic, so a spurious pattern wins a given K with probability
  // about 0.135, and the seeds here are checked one by one rather than hoped for.
  test.each([3, 4, 5])("white noise, seed %i: no seasonality, and the notes say why", (seed) => {
    const rng = new MersenneTwister(seed);
    const y = Float64Array.from({ length: 300 }, () => 1000 + 50 * rng.normal());
    const fit = autoTbats(y, { lambda: null, arma: false });
    expect(fit.structure.periods).toEqual([]);
    expect(fit.summary().notes).toContain("A 52.18-week pattern did not improve AIC at any number of harmonics, so it is not modelled.");
  });
});
