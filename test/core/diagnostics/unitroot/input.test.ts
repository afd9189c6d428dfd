import { adf } from "../../../../src/core/diagnostics/unitroot/adf";
import { kpss } from "../../../../src/core/diagnostics/unitroot/kpss";
import { pp } from "../../../../src/core/diagnostics/unitroot/pp";
import { unitRootSummary } from "../../../../src/core/diagnostics/unitroot/integration";
import { InputError } from "../../../../src/core/series/errors";
import { expectInputError } from "../../../inputError";

function noisy(n: number): Float64Array {
  // A deterministic but irregular series (no randomness needed to test input handling).
  return Float64Array.from({ length: n }, (_, t) => 100 + Math.sin(t * 1.7) * 5 + t * 0.1);
}


describe("unit-root tests refuse bad input with a sentence", () => {
  it("too short for the lags asked", () => {
    // lags 20 with a constant needs 2·20 + 1 + 2 + 10 = 53 weeks.
    expectInputError(() => adf(noisy(40), { lags: 20 }), "TOO_FEW_POINTS", /ADF test \(constant\) needs at least 53 weeks with these settings; the series has 40\./);
    expectInputError(() => adf(noisy(8)), "TOO_FEW_POINTS", /needs at least 13 weeks/);
    expectInputError(() => kpss(noisy(30), { lags: 40 }), "TOO_FEW_POINTS", /KPSS test \(level\) needs at least 42 weeks/);
    expectInputError(() => pp(noisy(10), { regression: "ct" }), "TOO_FEW_POINTS", /needs at least 14 weeks/);
  });

  it("a constant series", () => {
    const flat = new Float64Array(60).fill(1450);
    for (const f of [() => adf(flat), () => pp(flat), () => kpss(flat), () => unitRootSummary(flat)]) {
      expectInputError(f, "CONSTANT_SERIES", /cannot be run on a constant series: every week is 1450\./);
    }
  });

  it("an exact straight line (nothing random to test)", () => {
    const line = Float64Array.from({ length: 60 }, (_, t) => 1000 + 5 * t);
    expectInputError(() => kpss(line, { regression: "ct" }), "CONSTANT_SERIES", /exact straight line/);
    expectInputError(() => adf(line, { regression: "ct" }), "CONSTANT_SERIES", /exact pattern/);
  });

  it("NaN or Infinity in the rates", () => {
    const y = noisy(60);
    y[17] = NaN;
    expectInputError(() => adf(y), "NOT_A_NUMBER", /needs finite rates; week 18 is NaN\./);
    expectInputError(() => kpss(y), "NOT_A_NUMBER", /week 18 is NaN/);
    y[17] = Infinity;
    expectInputError(() => pp(y), "NOT_A_NUMBER", /week 18 is Infinity/);
  });

  it("a lag that is not a whole number", () => {
    expectInputError(() => adf(noisy(60), { lags: 2.5 }), "BAD_OPTION", /whole number of weeks/);
    expectInputError(() => kpss(noisy(60), { lags: -1 }), "BAD_OPTION", /whole number of weeks/);
  });
});
