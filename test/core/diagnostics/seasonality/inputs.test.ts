import { stl } from "../../../../src/core/diagnostics/seasonality/stl";
import { weekFactors } from "../../../../src/core/diagnostics/seasonality/factors";
import { weekYearTable } from "../../../../src/core/diagnostics/seasonality/weekYear";
import { InputError } from "../../../../src/core/series/errors";
import type { WeeklySeries } from "../../../../src/core/series/types";

// Bad input must fail with an InputError carrying a code and a plain sentence (CONVENTIONS.md).
function failure(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    if (e instanceof InputError) return e;
    throw e;
  }
  throw new Error("expected an InputError");
}

const SENTENCE = /^[A-Z][^\n]+\.$/;
const wavy = (n: number): Float64Array => Float64Array.from({ length: n }, (_, i) => 100 + 10 * Math.sin(i / 5) + (i % 7));

describe("STL input checks", () => {
  test("fewer than two full periods", () => {
    const e = failure(() => stl(wavy(103)));
    expect(e.code).toBe("TOO_FEW_POINTS");
    expect(e.message).toBe("The seasonal decomposition (STL) needs at least 104 weeks with these settings; the series has 103.");
    expect(() => stl(wavy(104))).not.toThrow();
  });

  test("constant series", () => {
    const e = failure(() => stl(new Float64Array(200).fill(1850)));
    expect(e.code).toBe("CONSTANT_SERIES");
    expect(e.message).toMatch(SENTENCE);
  });

  test("NaN and Infinity", () => {
    const y = wavy(200);
    y[17] = NaN;
    const e = failure(() => stl(y));
    expect(e.code).toBe("NOT_A_NUMBER");
    expect(e.message).toContain("week 18");
    y[17] = Infinity;
    expect(failure(() => stl(y)).code).toBe("NOT_A_NUMBER");
  });

  test.each([
    [{ seasonal: 8 }],
    [{ seasonal: 5 }],
    [{ trend: 90 }],
    [{ lowPass: 1 }],
    [{ seasonalDegree: 2 as 0 }],
    [{ trendJump: 0 }],
    [{ period: 1 }],
    [{ robust: true, outer: -1 }],
  ])("bad option %j", (opts) => {
    const e = failure(() => stl(wavy(200), opts));
    expect(e.code).toBe("BAD_OPTION");
    expect(e.message).toMatch(SENTENCE);
  });
});

describe("factor and table input checks", () => {
  const undated: WeeklySeries = { dates: [], values: wavy(200), filled: [], warnings: ["No dates."] };

  test("undated series: factors and the week × year table need dates", () => {
    for (const f of [() => weekFactors(undated), () => weekYearTable(undated)]) {
      const e = failure(f);
      expect(e.code).toBe("BAD_OPTION");
      expect(e.message).toMatch(SENTENCE);
      expect(e.message).toContain("needs the week dates");
    }
  });

  test("multiplicative factors need positive rates; additive do not", () => {
    const dates = Array.from({ length: 200 }, (_, i) => new Date(Date.UTC(2020, 0, 3) + 7 * 86_400_000 * i));
    const values = wavy(200);
    values[40] = 0;
    const s: WeeklySeries = { dates, values, filled: dates.map(() => false), warnings: [] };
    const e = failure(() => weekFactors(s));
    expect(e.code).toBe("NON_POSITIVE");
    expect(e.message).toMatch(SENTENCE);
    expect(e.message).toContain("week 41 is 0");
    expect(() => weekFactors(s, { kind: "additive" })).not.toThrow();
    // A NaN is reported as not a number, not as non-positive.
    values[40] = NaN;
    expect(failure(() => weekFactors(s)).code).toBe("NOT_A_NUMBER");
  });
});
