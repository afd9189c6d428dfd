import { pp, ppBandwidth } from "../../../../src/core/diagnostics/unitroot/pp";
import type { UnitRootCase } from "../../../../src/core/diagnostics/unitroot/mackinnon";
import { loadFixture } from "../../../fixtures";
import { randomWalk } from "../../../simulate";

interface PpCase {
  dataset: string;
  regression: UnitRootCase;
  lags: number;
  nobs: number;
  rho: number;
  t_rho: number;
  s2: number;
  lrv: number;
  z_alpha: number;
  z_t: number;
  z_t_pvalue: number;
  crit: [number, number, number];
}

// Phillips & Perron (1988) Z(α), Z(t) assembled in test/reference/make_unitroot.py from
// statsmodels 0.13.5 OLS pieces in the paper's own form (the residualised lagged level
// by a separate regression), an algebraically different route from pp.ts (Hamilton's form
// through se(ρ̂)); p-value and critical values from statsmodels' mackinnonp/mackinnoncrit.
const series = loadFixture<Record<string, number[]>>("unitroot_series.json");
const cases = loadFixture<PpCase[]>("unitroot_pp.json");

function rel(a: number, b: number): number {
  return Math.abs(a - b) / Math.abs(b);
}

describe("Phillips–Perron vs the assembled reference", () => {
  it.each(cases.map((c) => [`${c.dataset} ${c.regression} lags=${c.lags}`, c] as const))("%s", (_n, c) => {
    const r = pp(series[c.dataset], { regression: c.regression, lags: c.lags });
    expect(r.nobs).toBe(c.nobs);
    // ρ̂ near 1 on long persistent series (CO2): the OLS solvers agree to ~1e-12; 1e-9 relative.
    expect(rel(r.rho, c.rho)).toBeLessThan(1e-9);
    expect(rel(r.shortRunVariance, c.s2)).toBeLessThan(1e-9);
    expect(rel(r.longRunVariance, c.lrv)).toBeLessThan(1e-9);
    // Z statistics combine those pieces; the two algebraic forms agree to 1e-8 relative.
    expect(rel(r.zAlpha, c.z_alpha)).toBeLessThan(1e-8);
    expect(rel(r.statistic, c.z_t)).toBeLessThan(1e-8);
    expect(r.parameters["Z(alpha)"]).toBe(r.zAlpha);
    // Same MacKinnon surface at (nearly) the same Z(t): 1e-6 absolute.
    expect(Math.abs((r.pValue ?? NaN) - c.z_t_pvalue)).toBeLessThan(1e-6);
    expect(Math.abs((r.criticalValues?.["5%"] ?? NaN) - c.crit[1])).toBeLessThan(1e-10);
  });

  it("the default bandwidth is ⌊4·(T/100)^{2/9}⌋ on T = n − 1", () => {
    expect(ppBandwidth(99)).toBe(3);
    const ref = cases.find((c) => c.dataset === "nile" && c.regression === "c" && c.lags === 3);
    const r = pp(series.nile);
    expect(r.lags).toBe(3);
    expect(rel(r.statistic, ref?.z_t ?? NaN)).toBeLessThan(1e-8);
  });

  it("with zero lags Z(t) is the Dickey–Fuller t on (ρ̂ − 1) up to the variance divisor", () => {
    // q = 0 gives λ̂² = γ̂₀, so Z(t) = t_ρ exactly (Hamilton 1994, §17.6).
    const c = cases.find((k) => k.dataset === "sunspots" && k.regression === "ct" && k.lags === 0);
    const r = pp(series.sunspots, { regression: "ct", lags: 0 });
    expect(rel(r.statistic, c?.t_rho ?? NaN)).toBeLessThan(1e-10);
  });
});

describe("Phillips–Perron verdicts in short series follow the finite-sample critical value", () => {

  it("worked case, n = 20 with a trend: Z(t) between the asymptotic and finite-sample 5% values is not a rejection", () => {
    // Seed 46 (found by scanning): Z(t) = −3.543 has asymptotic p = 0.035 (MacKinnon 1994),
    // but the MacKinnon (2010) 5% value at T = 19 is −3.6732, the one the row prints.
    const r = pp(randomWalk(46, 20), { regression: "ct" });
    expect(r.nobs).toBe(19);
    expect(r.statistic).toBeCloseTo(-3.543, 3);
    expect(r.pValue).toBeLessThan(0.05);
    expect(r.criticalValues?.["5%"]).toBeCloseTo(-3.6732, 4);
    expect(r.rejected).toBe(false);
    expect(r.verdict).toMatch(/behaves like a random walk/);
    expect(r.parameters["verdict by"]).toBe("5% critical value at this length");
  });

  it("size at n = 20 (trend) is near 5%, and every verdict agrees with the printed value", () => {
    // 2000 random walks; by the asymptotic p-value 174 (8.7%) were rejected. Z(t) shares τ's
    // distribution only asymptotically, so a little excess remains (~6% here); the bound is
    // mean + 3 sd of Binomial(2000, 0.05), 129.
    let rejected = 0;
    for (let s = 0; s < 2000; s++) {
      const r = pp(randomWalk(5000 + s, 20), { regression: "ct" });
      expect(r.rejected).toBe(r.statistic < (r.criticalValues?.["5%"] ?? NaN));
      if (r.rejected) rejected++;
    }
    expect(rejected).toBeLessThanOrEqual(129);
    expect(rejected).toBeGreaterThanOrEqual(71);
  });
});
