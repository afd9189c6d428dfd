import { mackinnonCritical, mackinnonP, type UnitRootCase } from "../../../../src/core/diagnostics/unitroot/mackinnon";
import { loadFixture } from "../../../fixtures";

interface MackinnonFixture {
  taus: number[];
  pvalues: Record<UnitRootCase, number[]>;
  sizes: number[];
  crit: Record<UnitRootCase, number[][]>;
  crit_asymptotic: Record<UnitRootCase, number[]>;
}

const CASES: UnitRootCase[] = ["n", "c", "ct"];

describe("MacKinnon (2010) critical values, published asymptotic values", () => {
  // MacKinnon (2010), Table 2, N = 1, β∞ column, as printed (5 decimals); from memory, and
  // the same values appear in MacKinnon (1996) and Hamilton-style textbook tables to 2 dp.
  const printed: Record<UnitRootCase, [number, number, number]> = {
    n: [-2.56574, -1.941, -1.61682],
    c: [-3.43035, -2.86154, -2.56677],
    ct: [-3.95877, -3.41049, -3.12705],
  };
  it.each(CASES)("case %s: β∞ at 1/5/10%% to the printed 5 decimals", (reg) => {
    const cv = mackinnonCritical(reg);
    expect(cv["1%"]).toBeCloseTo(printed[reg][0], 5);
    expect(cv["5%"]).toBeCloseTo(printed[reg][1], 5);
    expect(cv["10%"]).toBeCloseTo(printed[reg][2], 5);
  });

  it("finite-sample values move away from zero as T shrinks (all β1 < 0 for c and ct)", () => {
    for (const reg of ["c", "ct"] as const) {
      expect(mackinnonCritical(reg, 50)["5%"]).toBeLessThan(mackinnonCritical(reg, 500)["5%"]);
    }
  });

  // Fuller (1976) Table 8.5.2, T = 100, as reprinted in Hamilton (1994) Table B.6: 5% critical
  // values of τ_μ −2.89 and τ_τ −3.45 (two decimals, from memory). The surface agrees to ±0.01.
  it("agrees with Fuller's T = 100 table to its two printed decimals", () => {
    expect(Math.abs(mackinnonCritical("c", 100)["5%"] - -2.89)).toBeLessThanOrEqual(0.01);
    expect(Math.abs(mackinnonCritical("ct", 100)["5%"] - -3.45)).toBeLessThanOrEqual(0.01);
  });
});

describe("MacKinnon coefficients vs statsmodels 0.13.5 adfvalues (test/reference/make_unitroot.py)", () => {
  const fx = loadFixture<MackinnonFixture>("unitroot_mackinnon.json");

  // mackinnonp at 231 values of τ in [−20, 3] (step 0.1) plus both sides of every cut-off. Both evaluate
  // the same published polynomials, so agreement to 1e-12 (rounding only) shows each typed
  // coefficient and cut-off is the published one.
  it.each(CASES)("p-values, case %s, within 1e-12", (reg) => {
    let worst = 0;
    fx.taus.forEach((tau, i) => {
      worst = Math.max(worst, Math.abs(mackinnonP(tau, reg) - fx.pvalues[reg][i]));
    });
    expect(worst).toBeLessThan(1e-12);
  });

  it.each(CASES)("critical values, case %s, at T = 10 … 5000 and ∞, within 1e-12", (reg) => {
    fx.sizes.forEach((T, i) => {
      const cv = mackinnonCritical(reg, T);
      const ref = fx.crit[reg][i];
      expect(Math.abs(cv["1%"] - ref[0])).toBeLessThan(1e-12);
      expect(Math.abs(cv["5%"] - ref[1])).toBeLessThan(1e-12);
      expect(Math.abs(cv["10%"] - ref[2])).toBeLessThan(1e-12);
    });
    const a = mackinnonCritical(reg, Infinity);
    expect([a["1%"], a["5%"], a["10%"]]).toEqual(fx.crit_asymptotic[reg]);
  });

  it("the p-value is 0 below τ_min, 1 above τ_max, and continuous near τ*", () => {
    expect(mackinnonP(-25, "c")).toBe(0);
    expect(mackinnonP(3, "c")).toBe(1);
    // MacKinnon (1994) chose τ* where the two fits meet; the jump there is below 1e-3.
    const star = -1.61;
    expect(Math.abs(mackinnonP(star - 1e-9, "c") - mackinnonP(star + 1e-9, "c"))).toBeLessThan(1e-3);
    // The asymptotic 5% critical value has p ≈ 0.05 on the 1994 surface (two different fits).
    expect(Math.abs(mackinnonP(-2.86154, "c") - 0.05)).toBeLessThan(0.002);
    expect(Math.abs(mackinnonP(-3.41049, "ct") - 0.05)).toBeLessThan(0.002);
    expect(Math.abs(mackinnonP(-1.941, "n") - 0.05)).toBeLessThan(0.002);
  });
});
