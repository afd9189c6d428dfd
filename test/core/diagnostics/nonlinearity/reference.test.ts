/**
 * The nonlinearity tests against test/reference/make_nonlinearity.py, which assembles each
 * statistic independently from statsmodels 0.13.5 pieces (OLS, compare_f_test, acorr_ljungbox,
 * tsa.stattools.bds) on datasets shipped with statsmodels: Nile, yearly sunspots and
 * log-differenced US real GDP (macrodata).
 *
 * Tolerance: 1e-8 relative on statistics and p-values. Both sides solve the same
 * least-squares problems to ~1e-13; the TypeScript side works on the standardised series
 * (every statistic is invariant to y → a + by, arOrder.ts), so the two differ only by rounding.
 */
import {
  bds, bdsStatistics, chooseArOrder, keenan, mcleodLi, terasvirta, tsay,
} from "../../../../src/core/diagnostics/nonlinearity";
import type { TestResult } from "../../../../src/core/diagnostics/types";
import { loadFixture } from "../../../fixtures";

interface FTest { order: number; F: number; p: number; df1: number; df2: number }
interface TerTest extends FTest { lm: number; lm_p: number }
interface LiTest { order: number; lags: number; Q: number; p: number }
interface BdsRef { distance: number; max_dim: number; z: number[]; p: number[] }
interface Dataset {
  y: number[];
  max_order: number;
  aic: number[];
  order: number;
  auto: { keenan: FTest; tsay: FTest; terasvirta: TerTest; mcleod_li: LiTest; bds: BdsRef };
  fixed: Record<string, { keenan: FTest; tsay: FTest; terasvirta: TerTest; mcleod_li: LiTest; bds_07: BdsRef }>;
  bds_raw: BdsRef;
}

const fx = loadFixture<Record<string, Dataset>>("nonlinearity.json");
const REL = 1e-8;

function close(actual: number, expected: number, rel = REL): void {
  const scale = Math.max(Math.abs(expected), 1e-300);
  expect(Math.abs(actual - expected) / scale).toBeLessThan(rel);
}

function checkF(r: TestResult, ref: FTest): void {
  expect(r.lags).toBe(ref.order);
  expect(r.parameters.df1).toBe(ref.df1);
  expect(r.parameters.df2).toBe(ref.df2);
  close(r.statistic, ref.F);
  close(r.pValue as number, ref.p);
  expect(r.rejected).toBe(ref.p < 0.05);
}

function checkBds(rs: TestResult[], ref: BdsRef): void {
  expect(rs.map((r) => r.lags)).toEqual(Array.from({ length: ref.max_dim - 1 }, (_, i) => i + 2));
  rs.forEach((r, i) => {
    close(r.statistic, ref.z[i]);
    close(r.pValue as number, ref.p[i]);
  });
}

describe.each(Object.keys(fx))("nonlinearity tests on %s vs statsmodels (make_nonlinearity.py)", (name) => {
  const d = fx[name];
  const y = Float64Array.from(d.y);

  test("AIC order on the common sample matches statsmodels OLS aic", () => {
    const choice = chooseArOrder(y, d.max_order);
    expect(choice.maxOrder).toBe(d.max_order);
    expect(choice.order).toBe(d.order);
    // Same fits on the raw series: AIC differences agree (the levels differ by a constant).
    for (let p = 1; p < d.max_order; p++) {
      close(choice.aic[p] - choice.aic[0], d.aic[p] - d.aic[0], 1e-7);
    }
  });

  test("automatic order: Keenan, Tsay, Teräsvirta, McLeod–Li and BDS (distance 1.5)", () => {
    checkF(keenan(y), d.auto.keenan);
    checkF(tsay(y), d.auto.tsay);
    const t = terasvirta(y);
    checkF(t, d.auto.terasvirta);
    close(t.parameters["chi-squared (T·R²)"] as number, d.auto.terasvirta.lm);
    close(t.parameters["chi-squared p-value"] as number, d.auto.terasvirta.lm_p);
    const li = mcleodLi(y);
    expect(li.lags).toBe(d.auto.mcleod_li.lags);
    close(li.statistic, d.auto.mcleod_li.Q);
    close(li.pValue as number, d.auto.mcleod_li.p);
    checkBds(bds(y), d.auto.bds);
    for (const r of [keenan(y), li, ...bds(y)]) expect(r.parameters["AR order"]).toBe(d.order);
  });

  test.each(["1", "2", "3"])("given order %s, McLeod–Li with 10 lags, BDS at 0.7 sd up to m = 4", (k) => {
    const f = d.fixed[k];
    const order = Number(k);
    checkF(keenan(y, { order }), f.keenan);
    checkF(tsay(y, { order }), f.tsay);
    const t = terasvirta(y, { order });
    checkF(t, f.terasvirta);
    close(t.parameters["chi-squared (T·R²)"] as number, f.terasvirta.lm);
    const li = mcleodLi(y, { order, lags: 10 });
    close(li.statistic, f.mcleod_li.Q);
    close(li.pValue as number, f.mcleod_li.p);
    checkBds(bds(y, { order, distance: 0.7, maxDimension: 4 }), f.bds_07);
  });

  test("BDS on the raw series (bdsStatistics) matches statsmodels bds", () => {
    const s = bdsStatistics(y, 5, 1.5);
    s.z.forEach((z, i) => close(z, d.bds_raw.z[i]));
    s.pValue.forEach((p, i) => close(p, d.bds_raw.p[i]));
  });
});

test("verdict sentences name the test and its numbers (sunspots: strongly nonlinear)", () => {
  const y = Float64Array.from(fx.sunspots.y);
  const r = tsay(y);
  expect(r.rejected).toBe(true);
  expect(r.verdict).toMatch(/^Evidence of nonlinear dynamics \(Tsay F = [0-9.]+, p (<|=) [0-9.e-]+\)\.$/);
  const nile = keenan(Float64Array.from(fx.nile.y));
  expect(nile.rejected).toBe(false);
  expect(nile.verdict).toBe("No sign of nonlinearity at the 5% level.");
});
