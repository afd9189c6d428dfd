import {
  defaultLjungBoxLags,
  ljungBox,
  ljungBoxByLag,
  ljungBoxTable,
} from "../../../../src/core/diagnostics/residuals";
import { chi2Quantile } from "../../../../src/core/math/distributions";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { InputError } from "../../../../src/core/series/errors";
import { fx, maxRelErr, relErr } from "./fixture";
import { expectInputError } from "../../../inputError";

// Q is n(n+2) times a sum of 30 positive terms built from the autocorrelations, so its
// relative error is that of the ACF, ~1e-15 (worst seen 1e-14). A χ² tail p-value amplifies
// a relative error in Q by about Q/2, and Q reaches ~1e4 on weekly CO2, so p carries up to
// ~1e-11 relative (worst seen 7e-12). 1e-10 relative covers both with margin and would still
// catch any slip in the formula (n − k vs n, m vs m − fitDf), which moves the 3rd digit.
const REL = 1e-10;

describe("Ljung–Box against statsmodels 0.13.5 acorr_ljungbox (test/reference/make_residuals.py)", () => {
  test.each(fx.cases.map((c) => [c.name, c]))("%s: Q and p at lags 1..30, model_df 0", (_n, c) => {
    const b = ljungBoxByLag(c.y, { lags: 30 });
    expect(b.statistic.length).toBe(30);
    expect(maxRelErr(b.statistic, c.lb_stat)).toBeLessThan(REL);
    expect(maxRelErr(b.pValue, c.lb_pvalue)).toBeLessThan(REL);
  });

  test.each(fx.cases.map((c) => [c.name, c]))("%s: with model_df, p undefined (NaN) where lag ≤ model_df", (_n, c) => {
    const b = ljungBoxByLag(c.y, { lags: 30, fitDf: c.model_df });
    expect(maxRelErr(b.statistic, c.lb_df_stat)).toBeLessThan(REL);
    // maxRelErr requires NaN exactly where statsmodels has NaN.
    expect(maxRelErr(b.pValue, c.lb_df_pvalue)).toBeLessThan(REL);
    for (let k = 1; k <= c.model_df; k++) expect(b.pValue[k - 1]).toBeNaN();
  });

  test.each(fx.cases.map((c) => [c.name, c]))("%s: the TestResult at 30 lags", (_n, c) => {
    const r = ljungBox(c.y, { lags: 30, fitDf: c.model_df });
    expect(relErr(r.statistic, c.lb_df_stat[29])).toBeLessThan(REL);
    expect(relErr(r.pValue as number, c.lb_df_pvalue[29])).toBeLessThan(REL);
    expect(r.lags).toBe(30);
    expect(r.parameters["degrees of freedom"]).toBe(30 - c.model_df);
    expect(r.criticalValues?.["5%"]).toBe(chi2Quantile(0.95, 30 - c.model_df));
    expect(r.rejected).toBe((r.pValue as number) < 0.05);
    expect(r.verdict).toMatch(r.rejected ? /autocorrelated within 30 weeks at the 5% level/ : /No sign/);
  });
});

describe("default number of lags (ljungBox.ts header: 2·period, capped at n/5)", () => {
  test("weekly rule and non-seasonal rule", () => {
    expect(defaultLjungBoxLags(260)).toBe(52);
    expect(defaultLjungBoxLags(780)).toBe(104);
    expect(defaultLjungBoxLags(780, 1)).toBe(10);
    expect(defaultLjungBoxLags(40, 1)).toBe(8);
    expect(ljungBox(fx.cases[3].y).lags).toBe(104); // weekly CO2, n = 2283
    expect(ljungBox(fx.cases[0].y).lags).toBe(20); // Nile, n = 100
  });
});

describe("size under Gaussian white noise", () => {
  // R = 500 replications of n = 200 standard normal draws from MersenneTwister(seed), which
  // reproduces numpy's RandomState draw for draw, so statsmodels saw the same series. Two checks:
  // (1) the rejection count equals statsmodels' exactly. This is safe because no replication's
  //     p-value lies within 1e-6 of 0.05 (asserted), far beyond the ~1e-12 by which the two
  //     computations (or a last-ulp difference in V8's log inside the normal draws) can differ.
  // (2) the rate is within 3 binomial standard errors of 5%: sqrt(0.05·0.95/500) = 0.0097,
  //     so [0.021, 0.079]; Ljung–Box at m = 10, n = 200 is close to its nominal size.
  const s = fx.size;
  test(`rejects about 5% of ${s.R} white-noise series at m = ${s.lags}`, () => {
    const g = new MersenneTwister(s.seed);
    let rejections = 0;
    let nearest = Infinity;
    let first = NaN;
    for (let i = 0; i < s.R; i++) {
      const e = Float64Array.from({ length: s.n }, () => g.normal());
      const r = ljungBox(e, { lags: s.lags, level: s.level });
      const p = r.pValue as number;
      if (i === 0) first = p;
      nearest = Math.min(nearest, Math.abs(p - s.level));
      if (r.rejected) rejections++;
    }
    expect(relErr(first, s.first_pvalue)).toBeLessThan(REL);
    expect(nearest).toBeGreaterThan(1e-6);
    expect(rejections).toBe(s.rejections);
    const se = Math.sqrt((s.level * (1 - s.level)) / s.R);
    expect(Math.abs(rejections / s.R - s.level)).toBeLessThan(3 * se);
  });
});

describe("table by lag", () => {
  test("blank degrees of freedom and p-value where lag ≤ fitted parameters", () => {
    const b = ljungBoxByLag(fx.cases[2].y, { lags: 5, fitDf: 2 });
    const t = ljungBoxTable(b);
    expect(t.columns).toEqual(["Lag", "Q", "Degrees of freedom", "p-value"]);
    expect(t.rows[0]).toEqual([1, b.statistic[0], null, null]);
    expect(t.rows[1][3]).toBeNull();
    expect(t.rows[2]).toEqual([3, b.statistic[2], 1, b.pValue[2]]);
    expect(t.notes.join(" ")).toMatch(/Lags up to 2/);
  });
});

describe("bad input is an InputError with a sentence", () => {
  const y = fx.cases[0].y;
  test.each([
    ["lags = fitDf", () => ljungBox(y, { lags: 3, fitDf: 3 }), "BAD_OPTION", /3 lags with 3 fitted parameters leave no degrees of freedom\. Use at least 4 lags/],
    ["lags < fitDf", () => ljungBoxByLag(y, { lags: 2, fitDf: 5 }), "BAD_OPTION", /Use at least 6 lags/],
    ["default too short for fitDf", () => ljungBox(y.slice(0, 30), { fitDf: 6 }), "TOO_FEW_POINTS", /only 6 by default/],
    ["lags ≥ n", () => ljungBox(y, { lags: 100 }), "BAD_OPTION", /whole number from 1 to 99/],
    ["negative fitDf", () => ljungBox(y, { fitDf: -1 }), "BAD_OPTION", /fitted model parameters must be a whole number/],
    ["Infinity", () => ljungBox([1, 2, Infinity, 4, 5, 6]), "NOT_A_NUMBER", /week 3/],
    ["constant", () => ljungBox(new Array(50).fill(2)), "CONSTANT_SERIES", /constant/],
    ["level", () => ljungBox(y, { level: 0 }), "BAD_OPTION", /between 0 and 1/],
  ])("%s", (_what, run, code, message) => {
    expectInputError(run, code, message);
  });
});
