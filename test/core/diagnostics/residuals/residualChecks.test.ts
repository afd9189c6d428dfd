import {
  correlogram,
  jarqueBera,
  ljungBox,
  residualChecks,
  trimLeadingMissing,
} from "../../../../src/core/diagnostics/residuals";
import { InputError } from "../../../../src/core/series/errors";
import { fx } from "./fixture";

// residualChecks only assembles the tested pieces, so its numbers must be those pieces'
// numbers exactly (same operations on the same values): compared with toBe / toEqual.
const gdp = fx.cases[2]; // log-differenced real GDP, n = 202 (macrodata)

describe("residualChecks", () => {
  test("two test rows and the correlogram table, numbers as from the parts", () => {
    const out = residualChecks(gdp.y, { fitDf: 2, lags: 12, acfLags: 24 });
    const lb = ljungBox(gdp.y, { fitDf: 2, lags: 12 });
    const jb = jarqueBera(gdp.y);
    expect(out.tests.columns).toEqual(["Test", "Statistic", "p-value", "Lags", "5% critical value", "Settings", "Verdict"]);
    expect(out.tests.rows.map((r) => r[0])).toEqual(["Ljung–Box", "Jarque–Bera"]);
    expect(out.tests.rows[0][1]).toBe(lb.statistic);
    expect(out.tests.rows[0][2]).toBe(lb.pValue);
    expect(out.tests.rows[0][3]).toBe(12);
    expect(out.tests.rows[1][1]).toBe(jb.statistic);
    expect(out.tests.notes).toEqual(["Ljung–Box uses 12 lags less 2 fitted model parameters: 10 degrees of freedom."]);
    expect(out.correlogram.rows.length).toBe(24);
    expect(Array.from(out.acf.acf)).toEqual(Array.from(correlogram(gdp.y, { nlags: 24 }).acf));
    expect(out.dropped).toBe(0);
  });

  test("leading NaN weeks are dropped and said so in both tables' notes", () => {
    const withGap = [NaN, NaN, NaN, ...gdp.y];
    const out = residualChecks(withGap, { fitDf: 1, lags: 10 });
    const plain = residualChecks(gdp.y, { fitDf: 1, lags: 10 });
    expect(out.dropped).toBe(3);
    expect(out.ljungBox.statistic).toBe(plain.ljungBox.statistic);
    expect(out.jarqueBera.statistic).toBe(plain.jarqueBera.statistic);
    expect(out.tests.notes[0]).toBe(
      "The first 3 weeks have no residual (the model has no fitted value there) and were left out; the checks use the remaining 202 weeks.",
    );
    expect(out.correlogram.notes[0]).toBe(out.tests.notes[0]);
    expect(residualChecks([NaN, ...gdp.y]).tests.notes[0]).toMatch(/^The first week has no residual .* was left out/);
  });

  test("defaults: weekly rule for the lags", () => {
    const out = residualChecks(gdp.y);
    expect(out.ljungBox.lags).toBe(40); // min(104, ⌊202/5⌋)
    expect(out.acf.nlags).toBe(50); // min(104, ⌊202/4⌋)
  });
});

describe("missing values: only at the start", () => {
  test("trimLeadingMissing keeps the rest untouched", () => {
    const t = trimLeadingMissing([NaN, NaN, 1.5, -2, 0.25]);
    expect(t.dropped).toBe(2);
    expect(Array.from(t.values)).toEqual([1.5, -2, 0.25]);
  });

  test.each([
    ["NaN in the middle", [NaN, 1, 2, NaN, 3], "NOT_A_NUMBER", /week 4 is missing although earlier weeks have one/],
    ["NaN at the end", [1, 2, 3, NaN], "NOT_A_NUMBER", /week 4 is missing/],
    ["Infinity", [NaN, 1, -Infinity, 2], "NOT_A_NUMBER", /week 3 is -Infinity/],
    ["all missing", [NaN, NaN], "TOO_FEW_POINTS", /All 2 residuals are missing/],
    ["empty", [], "TOO_FEW_POINTS", /no residuals/],
  ])("%s", (_what, y, code, message) => {
    let caught: unknown;
    try {
      residualChecks(y as number[]);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).code).toBe(code);
    expect((caught as InputError).message).toMatch(message);
  });

  test("too many parameters for the lags is refused, not answered with NaN", () => {
    expect(() => residualChecks(gdp.y, { fitDf: 4, lags: 4 })).toThrow(/Use at least 5 lags/);
  });
});
