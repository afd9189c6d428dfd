import { adf, schwertLag, type LagRule } from "../../../../src/core/diagnostics/unitroot/adf";
import type { UnitRootCase } from "../../../../src/core/diagnostics/unitroot/mackinnon";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { loadFixture } from "../../../fixtures";
import { randomWalk } from "../../../simulate";

interface AdfCase {
  dataset: string;
  regression: UnitRootCase;
  autolag: "AIC" | "BIC" | "t-stat" | null;
  maxlag: number;
  stat: number;
  pvalue: number;
  usedlag: number;
  nobs: number;
  crit: [number, number, number];
}

// statsmodels 0.13.5 `adfuller` on Nile, yearly sunspots, log real GDP (macrodata) and the
// weekly CO2 series (test/reference/make_unitroot.py; the exact series are in the fixture).
const series = loadFixture<Record<string, number[]>>("unitroot_series.json");
const cases = loadFixture<AdfCase[]>("unitroot_adf.json");
const RULE: Record<string, LagRule> = { AIC: "aic", BIC: "bic", "t-stat": "tstat" };

function label(c: AdfCase): string {
  return `${c.dataset} ${c.regression} ${c.autolag ?? "fixed"} maxlag=${c.maxlag}`;
}

describe("ADF vs statsmodels adfuller", () => {
  it("the fixture's maxlag is Schwert's rule, so the default is what was checked", () => {
    for (const c of cases.filter((k) => k.autolag !== null)) expect(c.maxlag).toBe(schwertLag(series[c.dataset].length));
  });

  it.each(cases.map((c) => [label(c), c] as const))("%s", (_name, c) => {
    const y = series[c.dataset];
    const r =
      c.autolag === null
        ? adf(y, { regression: c.regression, lags: c.maxlag })
        : adf(y, { regression: c.regression, maxLag: c.maxlag, lagRule: RULE[c.autolag] });
    // Lag chosen and sample size: exact (integers).
    expect(r.usedLag).toBe(c.usedlag);
    expect(r.nobs).toBe(c.nobs);
    // τ: two QR least-squares solvers on the same design agree to ~1e-12; 1e-8 relative
    // leaves room for the ill-conditioning of long lag designs (CO2, 2284 weeks).
    expect(Math.abs(r.statistic - c.stat) / Math.abs(c.stat)).toBeLessThan(1e-8);
    // p-value: same MacKinnon (1994) surface at the same τ; 1e-6 absolute.
    expect(Math.abs((r.pValue ?? NaN) - c.pvalue)).toBeLessThan(1e-6);
    // Critical values: MacKinnon (2010) at the same T; rounding only.
    expect(Math.abs((r.criticalValues?.["1%"] ?? NaN) - c.crit[0])).toBeLessThan(1e-10);
    expect(Math.abs((r.criticalValues?.["5%"] ?? NaN) - c.crit[1])).toBeLessThan(1e-10);
    expect(Math.abs((r.criticalValues?.["10%"] ?? NaN) - c.crit[2])).toBeLessThan(1e-10);
  });

  it("the default (no options) is a constant, AIC, Schwert's maxLag", () => {
    const y = series.nile;
    const ref = cases.find((c) => c.dataset === "nile" && c.regression === "c" && c.autolag === "AIC");
    const r = adf(y);
    expect(r.regression).toBe("c");
    expect(r.lagRule).toBe("aic");
    expect(r.usedLag).toBe(ref?.usedlag);
    expect(r.parameters["max lag"]).toBe(12);
  });

  it("the verdict is a sentence at 5% matching the printed 5% critical value", () => {
    const r = adf(series.lgdp, { regression: "ct", subject: "the log rate" });
    expect(r.rejected).toBe(r.statistic < (r.criticalValues?.["5%"] ?? NaN));
    expect(r.parameters["verdict by"]).toBe("5% critical value at this length");
    expect(r.verdict).toMatch(/^The log rate (behaves like a random walk|returns to a trend line)/);
    expect(r.verdict).toContain("5%");
  });
});

describe("ADF on simulated series with known truth (seeded MT19937)", () => {
  // 200 replications of n = 200 weeks, constant in the regression, AIC lags up to 4 (the
  // series are AR(1), so longer searches only cost time; the full rule is checked above).
  const reps = 200;
  const n = 200;

  function rejections(phi: number, seed: number): number {
    const rng = new MersenneTwister(seed);
    let count = 0;
    for (let r = 0; r < reps; r++) {
      const y = new Float64Array(n);
      let x = 0;
      for (let t = 0; t < n; t++) {
        x = phi * x + rng.normal();
        y[t] = 100 + x;
      }
      if (adf(y, { regression: "c", maxLag: 4 }).rejected) count++;
    }
    return count;
  }

  it("a random walk is rejected in about 5% of replications (size)", () => {
    // Under the null the rejection count is ~Binomial(200, 0.05): mean 10, sd 3.1. Allowing up
    // to 20 (mean + 3 sd) tolerates the small size distortion of AIC lag choice in finite
    // samples while catching a wrong sign, case or table.
    const k = rejections(1, 20260101);
    expect(k).toBeLessThanOrEqual(20);
    expect(k).toBeGreaterThanOrEqual(2);
  });

  it("a stationary AR(1) with φ = 0.5 is rejected in nearly every replication (power)", () => {
    // With n = 200 and φ = 0.5, γ = −0.5 is about 8 standard errors from 0; power is ≈ 1.
    // At least 190 of 200 (95%) allows for AIC picking extra lags in a few samples.
    expect(rejections(0.5, 20260102)).toBeGreaterThanOrEqual(190);
  });
});

describe("ADF verdicts in short series follow the finite-sample critical value", () => {

  it("worked case, n = 20 with a trend: τ between the asymptotic and finite-sample 5% values is not a rejection", () => {
    // Seed 46 was found by scanning seeds for a τ in the gap. At T = 19 the MacKinnon (2010)
    // 5% "ct" value is −3.41049 − 4.3904/19 − 9.036/19² − 45.374/19³ = −3.6732, while the
    // MacKinnon (1994) asymptotic p-value of τ = −3.514 is 0.038: the old verdict ("rejected",
    // from p < 0.05) contradicted the critical value printed in the same row.
    const r = adf(randomWalk(46, 20), { regression: "ct", lags: 0 });
    expect(r.nobs).toBe(19);
    expect(r.statistic).toBeCloseTo(-3.514, 3);
    expect(r.pValue).toBeGreaterThan(0.03);
    expect(r.pValue).toBeLessThan(0.05);
    expect(r.criticalValues?.["5%"]).toBeCloseTo(-3.6732, 4);
    expect(r.rejected).toBe(false);
    expect(r.verdict).toMatch(/behaves like a random walk/);
  });

  it("at a level with no tabulated critical value (2.5%) the asymptotic p-value decides", () => {
    const r = adf(randomWalk(46, 20), { regression: "ct", lags: 0, level: 0.025 });
    expect(r.rejected).toBe((r.pValue ?? 1) < 0.025);
    expect(r.parameters["verdict by"]).toBe("asymptotic p-value");
  });

  it("size at n = 20 (trend, no lags) is near 5%, and every verdict agrees with the printed value", () => {
    // 2000 random walks. By the asymptotic p-value this rejected 166 (8.3%): the asymptotic
    // distribution is too narrow for T = 19. The finite-sample value is built for that T, so
    // the count should be ~Binomial(2000, 0.05): mean 100, sd 9.7; 129 is mean + 3 sd.
    let rejected = 0;
    for (let s = 0; s < 2000; s++) {
      const r = adf(randomWalk(5000 + s, 20), { regression: "ct", lags: 0 });
      expect(r.rejected).toBe(r.statistic < (r.criticalValues?.["5%"] ?? NaN));
      if (r.rejected) rejected++;
    }
    expect(rejected).toBeLessThanOrEqual(129);
    expect(rejected).toBeGreaterThanOrEqual(71);
  });
});
