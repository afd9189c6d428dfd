import { jarqueBera } from "../../../../src/core/diagnostics/residuals";
import { InputError } from "../../../../src/core/series/errors";
import { fx, relErr } from "./fixture";
import { expectInputError } from "../../../inputError";

// JB, S and K are closed forms in three moment sums; their relative error is a few ε per
// term (worst seen 2.5e-14, weekly CO2). The χ²(2) tail is exp(−JB/2), so p's relative error
// is about JB/2 times JB's (JB ≤ 90 here; worst seen 1.1e-12). 1e-10 relative covers both.
const REL = 1e-10;

describe("Jarque–Bera against statsmodels 0.13.5 stats.stattools.jarque_bera (make_residuals.py)", () => {
  test.each(fx.cases.map((c) => [c.name, c]))("%s: JB, p, skewness, kurtosis", (_n, c) => {
    const r = jarqueBera(c.y);
    expect(relErr(r.statistic, c.jb)).toBeLessThan(REL);
    expect(relErr(r.pValue as number, c.jb_pvalue)).toBeLessThan(REL);
    expect(relErr(r.parameters.skewness as number, c.skewness)).toBeLessThan(REL);
    expect(relErr(r.parameters.kurtosis as number, c.kurtosis)).toBeLessThan(REL);
    expect(r.rejected).toBe(c.jb_pvalue < 0.05);
  });
});

describe("a hand-worked example (Jarque & Bera, 1987, definition)", () => {
  test("x = 1, 2, 3, 4, 10", () => {
    // Mean 4, deviations −3 −2 −1 0 6: m2 = 50/5 = 10, m3 = 180/5 = 36, m4 = 1394/5 = 278.8,
    // so S² = 36²/10³ = 1.296, K = 2.788 and JB = 5/6·(1.296 + 0.212²/4) = 1.089363…;
    // the χ²(2) upper tail is exactly exp(−JB/2). Rounding only: 1e-14 relative.
    const r = jarqueBera([1, 2, 3, 4, 10]);
    const jb = (5 / 6) * (1.296 + (0.212 * 0.212) / 4);
    expect(relErr(r.statistic, jb)).toBeLessThan(1e-14);
    expect(relErr(r.pValue as number, Math.exp(-jb / 2))).toBeLessThan(1e-14);
    expect(relErr(r.parameters.skewness as number, 36 / Math.pow(10, 1.5))).toBeLessThan(1e-14);
    expect(relErr(r.parameters.kurtosis as number, 2.788)).toBeLessThan(1e-14);
    expect(r.rejected).toBe(false);
    expect(r.verdict).toBe("No evidence against normally distributed residuals at the 5% level.");
  });

  test("a rejection names the shape", () => {
    // Sunspots: skewness ≈ 0.99, kurtosis ≈ 3.41 (fixture) — right-skewed, heavy-tailed.
    const r = jarqueBera(fx.cases[1].y);
    expect(r.rejected).toBe(true);
    expect(r.verdict).toMatch(/skewed towards large rises, heavy-tailed/);
  });
});

describe("bad input is an InputError with a sentence", () => {
  test.each([
    ["NaN", () => jarqueBera([1, NaN, 3, 4]), "NOT_A_NUMBER", /week 2 is NaN/],
    ["too short", () => jarqueBera([1, 2]), "TOO_FEW_POINTS", /at least 3 weeks/],
    ["constant", () => jarqueBera([3, 3, 3, 3]), "CONSTANT_SERIES", /every week is 3/],
    ["level", () => jarqueBera([1, 2, 4, 8], { level: 1.5 }), "BAD_OPTION", /between 0 and 1/],
  ])("%s", (_what, run, code, message) => {
    expectInputError(run, code, message);
  });
});
