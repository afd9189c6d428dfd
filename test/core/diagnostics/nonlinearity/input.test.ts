/**
 * Bad input gives an InputError with a sentence, never a NaN; the summary table carries every
 * test's row. The series here are seeded Gaussian draws (src/core/math/rng.ts) and simple
 * hand-made patterns whose failure mode is known in advance.
 */
import {
  bds, chooseArOrder, defaultMaxOrder, defaultMcLeodLiLags, keenan, mcleodLi, nonlinearitySummary, terasvirta, tsay,
} from "../../../../src/core/diagnostics/nonlinearity";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { InputError } from "../../../../src/core/series/errors";

function noise(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  for (let i = 0; i < n; i++) y[i] = 1500 + 40 * rng.normal();
  return y;
}

function inputError(f: () => unknown): InputError {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(InputError);
    return e as InputError;
  }
  throw new Error("expected an InputError");
}

const TESTS: [string, (y: ArrayLike<number>, o?: { order?: number }) => unknown][] = [
  ["keenan", keenan], ["tsay", tsay], ["terasvirta", terasvirta], ["bds", bds], ["mcleodLi", mcleodLi],
  ["summary", nonlinearitySummary],
];

describe.each(TESTS)("%s rejects bad input with a sentence", (_name, run) => {
  test("too short (20 weeks, fewer than 30)", () => {
    const e = inputError(() => run(noise(20, 1)));
    expect(e.code).toBe("TOO_FEW_POINTS");
    expect(e.message).toMatch(/at least 30 weeks.*has 20\./);
  });
  test("constant", () => {
    const e = inputError(() => run(new Float64Array(60).fill(1234)));
    expect(e.code).toBe("CONSTANT_SERIES");
    expect(e.message).toMatch(/constant series/);
  });
  test("NaN and Infinity", () => {
    const y = noise(60, 2);
    y[17] = NaN;
    expect(inputError(() => run(y)).message).toMatch(/week 18 is NaN/);
    y[17] = Infinity;
    expect(inputError(() => run(y)).code).toBe("NOT_A_NUMBER");
  });
  test("an exact repeating pattern (period 2) has no noise to test", () => {
    const y = Float64Array.from({ length: 60 }, (_, i) => (i % 2 ? 1800 : 1650));
    const e = inputError(() => run(y));
    expect(e.code).toBe("CONSTANT_SERIES");
    expect(e.message).toMatch(/exact pattern/);
  });
  test("a non-integer AR order", () => {
    expect(inputError(() => run(noise(60, 3), { order: 1.5 })).code).toBe("BAD_OPTION");
  });
});

test("a given order too large for the auxiliary regression: Teräsvirta at p = 8 on 60 weeks", () => {
  // 8 + 36 + 120 regressors on 52 weeks: no residual degrees of freedom.
  const e = inputError(() => terasvirta(noise(60, 4), { order: 8 }));
  expect(e.code).toBe("TOO_FEW_POINTS");
  expect(e.message).toMatch(/AR order 8/);
});

test("bad BDS and McLeod–Li options", () => {
  const y = noise(100, 5);
  expect(inputError(() => bds(y, { distance: 0 })).code).toBe("BAD_OPTION");
  expect(inputError(() => bds(y, { maxDimension: 1 })).code).toBe("BAD_OPTION");
  expect(inputError(() => mcleodLi(y, { lags: 0 })).code).toBe("BAD_OPTION");
  expect(inputError(() => keenan(y, { level: 1.5 })).code).toBe("BAD_OPTION");
});

test("defaults: AIC ceiling min(12, ⌊n/10⌋), McLeod–Li lags min(20, ⌊N/4⌋)", () => {
  expect([30, 99, 100, 470].map(defaultMaxOrder)).toEqual([3, 9, 10, 12]);
  expect([40, 79, 80, 469].map(defaultMcLeodLiLags)).toEqual([10, 19, 20, 20]);
  expect(chooseArOrder(noise(100, 6)).aic).toHaveLength(10);
});

test("summary: one row per test, BDS m = 2..5, verdict column plain", () => {
  const t = nonlinearitySummary(noise(200, 7));
  expect(t.rows.map((r) => r[0])).toEqual(
    ["Keenan", "Tsay", "Teräsvirta", "BDS m=2", "BDS m=3", "BDS m=4", "BDS m=5", "McLeod–Li"],
  );
  for (const r of t.rows) {
    expect(typeof r[1]).toBe("number");
    expect(Number.isFinite(r[1] as number)).toBe(true);
    expect(r[6]).toMatch(/^(Evidence of nonlinear dynamics \(.+\)|No sign of nonlinearity at the 5% level)/);
  }
  expect(t.notes[0]).toMatch(/^Linear null: AR\(\d+\) with a constant, order chosen by AIC over 1\.\.12/);
});

test("summary leaves out degenerate tests and says so: rates on two levels", () => {
  // With two distinct values y² is a straight-line function of y, so Tsay's and Teräsvirta's
  // squared lags (and Keenan's squared fit at order 1) are collinear with the AR regressors;
  // BDS and McLeod–Li are still defined.
  const rng = new MersenneTwister(8);
  const y = Float64Array.from({ length: 120 }, () => 1500 + 100 * rng.integer(2));
  const t = nonlinearitySummary(y, { order: 1 });
  expect(t.rows.map((r) => r[0])).toEqual(["BDS m=2", "BDS m=3", "BDS m=4", "BDS m=5", "McLeod–Li"]);
  for (const name of ["Keenan", "Tsay", "Teräsvirta"]) {
    expect(t.notes).toContain(`${name} left out: its regression is degenerate for these rates (too few distinct values or an exact pattern).`);
  }
  for (const r of t.rows) expect(Number.isFinite(r[1] as number)).toBe(true);
});

describe("McLeod–Li with squared residuals that do not vary", () => {
  test("is refused rather than giving NaN, and the summary leaves it out with a sentence", () => {
    // Residuals of exactly ±1 have constant squares: r_k is 0/0.
    const { squaredAutocorrelationQ } = jest.requireActual("../../../../src/core/diagnostics/nonlinearity/mcleodLi") as typeof import("../../../../src/core/diagnostics/nonlinearity/mcleodLi");
    const a = Float64Array.from({ length: 60 }, (_v, t) => (t % 3 === 0 ? 1 : -1));
    expect(() => squaredAutocorrelationQ(a, 5)).toThrow(/do not vary/);
  });
});
