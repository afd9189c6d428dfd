import { KPSS_TABLE, kpss, kpssPValue, type KpssCase } from "../../../../src/core/diagnostics/unitroot/kpss";
import { loadFixture } from "../../../fixtures";

interface KpssCaseFx {
  dataset: string;
  regression: KpssCase;
  nlags: number;
  stat: number;
  pvalue: number;
  usedlags: number;
  crit: [number, number, number, number];
}

// statsmodels 0.13.5 `kpss` with nlags given (test/reference/make_unitroot.py).
const series = loadFixture<Record<string, number[]>>("unitroot_series.json");
const cases = loadFixture<KpssCaseFx[]>("unitroot_kpss.json");

describe("KPSS (1992) Table 1 critical values, as printed", () => {
  it("level (η_μ) and trend (η_τ) rows at 10, 5, 2.5 and 1%", () => {
    // Kwiatkowski, Phillips, Schmidt & Shin (1992), Table 1 (three decimals as printed).
    expect(KPSS_TABLE.c.crit).toEqual([0.347, 0.463, 0.574, 0.739]);
    expect(KPSS_TABLE.ct.crit).toEqual([0.119, 0.146, 0.176, 0.216]);
  });
  it("interpolates linearly inside the table and bounds the p-value outside it", () => {
    expect(kpssPValue(0.463, "c")).toEqual({ p: 0.05 });
    expect(kpssPValue((0.463 + 0.574) / 2, "c").p).toBeCloseTo(0.0375, 12);
    expect(kpssPValue(0.2, "c")).toEqual({ p: 0.1, bound: "above" });
    expect(kpssPValue(0.5, "ct")).toEqual({ p: 0.01, bound: "below" });
  });
});

describe("KPSS vs statsmodels kpss", () => {
  it.each(cases.map((c) => [`${c.dataset} ${c.regression} nlags=${c.nlags}`, c] as const))("%s", (_n, c) => {
    const r = kpss(series[c.dataset], { regression: c.regression, lags: c.nlags });
    expect(r.lags).toBe(c.usedlags);
    // η is a ratio of sums of squares; both sides compute it directly: 1e-10 relative.
    expect(Math.abs(r.statistic - c.stat) / c.stat).toBeLessThan(1e-10);
    // statsmodels interpolates in the same table (and clips at its ends): 1e-12 absolute.
    expect(Math.abs((r.pValue ?? NaN) - c.pvalue)).toBeLessThan(1e-12);
    const crit = r.criticalValues ?? {};
    expect([crit["10%"], crit["5%"], crit["2.5%"], crit["1%"]]).toEqual(c.crit);
    if (c.pvalue === 0.01 && c.stat > c.crit[3]) {
      expect(r.pValueBound).toBe("below");
      expect(r.verdict).toContain("p < 0.01");
    }
    if (c.pvalue === 0.1 && c.stat < c.crit[0]) expect(r.pValueBound).toBe("above");
    expect(r.rejected).toBe(c.stat > c.crit[1]);
  });

  it("the default lag is ⌊12·(n/100)^{1/4}⌋ and matches the fixture's case with that lag", () => {
    const y = series.nile; // n = 100 → 12
    const r = kpss(y);
    expect(r.lags).toBe(12);
    const ref = cases.find((c) => c.dataset === "nile" && c.regression === "c" && c.nlags === 12);
    expect(Math.abs(r.statistic - (ref?.stat ?? NaN)) / (ref?.stat ?? 1)).toBeLessThan(1e-10);
  });

  it("weekly CO2 rises steadily: level stationarity is rejected beyond the table", () => {
    const r = kpss(series.co2, { regression: "c" });
    expect(r.rejected).toBe(true);
    expect(r.pValueBound).toBe("below");
    expect(r.verdict).toMatch(/does not stay around a fixed level: stationarity is rejected at 5% \(p < 0.01/);
  });
});
