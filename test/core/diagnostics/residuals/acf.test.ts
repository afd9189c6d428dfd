import {
  acf,
  bartlettBand,
  correlogram,
  correlogramTable,
  defaultAcfLags,
  pacf,
  pacfFromAcf,
} from "../../../../src/core/diagnostics/residuals";
import { InputError } from "../../../../src/core/series/errors";
import { fx, maxAbsErr, maxRelErr, relErr } from "./fixture";
import { expectInputError } from "../../../inputError";

// Tolerances. Autocorrelations lie in [−1, 1], so absolute error is the meaningful scale:
// each is a ratio of two sums of up to n = 2283 products, whose rounding is bounded by about
// n·ε ≈ 5e-13 and in practice is near 1e-15 (worst seen 3e-14, on the PACF of weekly CO2,
// after 60 Durbin–Levinson steps). We allow 1e-12 absolute. The band half-widths are
// square roots of such sums, well away from zero, so they are compared relatively at 1e-10.
const ABS = 1e-12;
const REL = 1e-10;

describe("correlogram against statsmodels 0.13.5 (test/reference/make_residuals.py)", () => {
  test.each(fx.cases.map((c) => [c.name, c]))("%s: ACF to lag 60, denominators n (stattools.acf adjusted=False)", (_n, c) => {
    const g = correlogram(c.y, { nlags: 60 });
    expect(g.n).toBe(c.n);
    expect(g.acf.length).toBe(61);
    expect(maxAbsErr(g.acf, c.acf)).toBeLessThan(ABS);
  });

  test.each(fx.cases.map((c) => [c.name, c]))("%s: Bartlett band = acf confint half-width (alpha 0.05)", (_n, c) => {
    const g = correlogram(c.y, { nlags: 60, level: fx.alpha });
    expect(g.bartlettBand[0]).toBe(0);
    expect(maxRelErr(g.bartlettBand.subarray(1), c.acf_bartlett_halfwidth.slice(1))).toBeLessThan(REL);
  });

  test.each(fx.cases.map((c) => [c.name, c]))("%s: PACF = pacf(method='ldb'), band = its confint half-width", (_n, c) => {
    const g = correlogram(c.y, { nlags: c.pacf_lags });
    expect(maxAbsErr(g.pacf, c.pacf)).toBeLessThan(ABS);
    for (let k = 1; k <= c.pacf_lags; k++) expect(relErr(g.whiteNoiseBand, c.pacf_halfwidth[k])).toBeLessThan(REL);
    // statsmodels' "ldb" (Durbin–Levinson) and "ywm" (direct Yule–Walker) agree, as they must:
    // both solve the Yule–Walker equations on the biased ACF.
    expect(c.pacf_ldb_vs_ywm_max_gap).toBeLessThan(1e-13);
  });

  test("acf() and pacf() give the correlogram's arrays", () => {
    const c = fx.cases[0];
    const g = correlogram(c.y, { nlags: 20 });
    expect(Array.from(acf(c.y, { nlags: 20 }))).toEqual(Array.from(g.acf));
    expect(Array.from(pacf(c.y, { nlags: 20 }))).toEqual(Array.from(g.pacf));
  });
});

describe("Durbin–Levinson on theoretical autocorrelations (Box & Jenkins, 1976, ch. 3)", () => {
  // Exact arithmetic facts, so the only error is rounding over a few steps: 1e-14 absolute.
  test("AR(1), ρ_k = φ^k: PACF is φ at lag 1 and 0 beyond", () => {
    const phi = 0.7;
    const r = Float64Array.from({ length: 13 }, (_, k) => Math.pow(phi, k));
    const p = pacfFromAcf(r);
    expect(Math.abs(p[1] - phi)).toBeLessThan(1e-14);
    for (let k = 2; k <= 12; k++) expect(Math.abs(p[k])).toBeLessThan(1e-14);
  });

  test("MA(1), ρ_1 = θ/(1+θ²): φ_kk = −(−θ)^k (1 − θ²) / (1 − θ^{2(k+1)})", () => {
    // x_t = e_t + θ e_{t−1}; the MA(1) PACF of Box & Jenkins (1976, §3.3), quoted from memory
    // and written with their θ = −ours (their model is e_t − θ e_{t−1}).
    const theta = 0.6;
    const r = new Float64Array(16);
    r[0] = 1;
    r[1] = theta / (1 + theta * theta);
    const p = pacfFromAcf(r);
    for (let k = 1; k <= 15; k++) {
      const expected = (-Math.pow(-theta, k) * (1 - theta * theta)) / (1 - Math.pow(theta, 2 * (k + 1)));
      expect(Math.abs(p[k] - expected)).toBeLessThan(1e-14);
    }
  });

  test("Bartlett band: z/√n at lag 1, then z·sqrt((1 + 2Σ_{j<k} r_j²)/n)", () => {
    const r = Float64Array.from([1, 0.5, 0.25, 0.1]);
    const b = bartlettBand(r, 100, 2);
    expect(Array.from(b)).toEqual([0, 0.2, 2 * Math.sqrt(1.5 / 100), 2 * Math.sqrt(1.625 / 100)]);
  });
});

describe("defaults and the report table", () => {
  test("default lags: two seasonal cycles, at most n/4", () => {
    expect(defaultAcfLags(260)).toBe(65);
    expect(defaultAcfLags(1000)).toBe(104);
    expect(defaultAcfLags(1000, 1)).toBe(20);
    expect(defaultAcfLags(3)).toBe(1);
    expect(correlogram(fx.cases[0].y).nlags).toBe(25); // Nile, n = 100
  });

  test("table: one row per lag with ACF, PACF and both bands", () => {
    const g = correlogram(fx.cases[1].y, { nlags: 12 });
    const t = correlogramTable(g);
    expect(t.columns).toEqual(["Lag", "ACF", "PACF", "White-noise band (±)", "Bartlett band for ACF (±)"]);
    expect(t.rows.length).toBe(12);
    expect(t.rows[0]).toEqual([1, g.acf[1], g.pacf[1], g.whiteNoiseBand, g.bartlettBand[1]]);
    expect(t.rows[11][0]).toBe(12);
    expect(t.notes.join(" ")).toContain("95%");
  });
});

describe("bad input is an InputError with a sentence", () => {
  const y = fx.cases[0].y;
  test.each([
    ["NaN", () => acf([1, 2, NaN, 4]), "NOT_A_NUMBER", /week 3/],
    ["too short", () => acf([1]), "TOO_FEW_POINTS", /at least 2 weeks/],
    ["constant", () => pacf([5, 5, 5, 5]), "CONSTANT_SERIES", /constant series/],
    ["lags ≥ n", () => correlogram(y, { nlags: 100 }), "BAD_OPTION", /whole number from 1 to 99/],
    ["fractional lags", () => correlogram(y, { nlags: 2.5 }), "BAD_OPTION", /whole number/],
    ["level", () => correlogram(y, { level: 5 }), "BAD_OPTION", /between 0 and 1/],
    ["period", () => correlogram(y, { period: 0 }), "BAD_OPTION", /seasonal period/],
  ])("%s", (_what, run, code, message) => {
    expectInputError(run, code, message);
  });
});
