/**
 * NNAR behind the model interface: reproducibility, forecast shapes and interval order,
 * Box-Cox round trips, option checks and update() semantics. The numbers checked against an
 * outside source are the one-step residuals after update(), recomputed here from the
 * weights with the network equations (FPP's description), and the Box-Cox inverse, checked
 * against y^λ = 1 + λ·g(y) written out directly.
 */
import { guerreroLambda } from "../../../../src/core/math/boxcox";
import { MersenneTwister } from "../../../../src/core/math/rng";
import { fitNnar, minLength, nnar } from "../../../../src/core/models/nnar";
import { toDataScale, toTransformed } from "../../../../src/core/models/nnar/settings";
import type { ModelSpec } from "../../../../src/core/models/types";
import { expectInputError } from "../../../inputError";

// Compile-time check: the model fits the registry's ModelSpec type as it is.
const asRegistered: ModelSpec = nnar;

/** Weekly rates with a yearly cycle and persistent noise (seeded), positive. */
function rates(n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const y = new Float64Array(n);
  let a = 0;
  for (let t = 0; t < n; t++) {
    a = 0.7 * a + 0.05 * rng.normal();
    y[t] = 1500 * Math.exp(0.1 * Math.sin((2 * Math.PI * t) / 52) + a);
  }
  return y;
}

/** The bytes of a Float64Array, for bit-for-bit comparisons (NaN payloads included). */
function bits(a: Float64Array): string {
  return Buffer.from(a.buffer, a.byteOffset, a.byteLength).toString("hex");
}

const Y = rates(160, 3);
// Few networks keep this file quick; the behaviour under test does not depend on the count.
const QUICK = { networks: 4, paths: 300 };

describe("NNAR reproducibility", () => {
  test("the same inputs and seed give the same numbers bit for bit; another seed does not", () => {
    const a = fitNnar(Y, QUICK);
    const b = fitNnar(Float64Array.from(Y), { ...QUICK });
    expect(bits(a.internals().weights)).toBe(bits(b.internals().weights));
    expect(bits(a.fitted)).toBe(bits(b.fitted));
    const fa = a.forecast(8, [80, 95]);
    const fb = b.forecast(8, [80, 95]);
    expect(bits(fa.point)).toBe(bits(fb.point));
    expect(bits(fa.lower[1])).toBe(bits(fb.lower[1]));
    expect(bits(fa.upper[0])).toBe(bits(fb.upper[0]));
    // forecast() draws its paths from the model seed afresh on every call.
    expect(bits(a.forecast(8, [80, 95]).upper[1])).toBe(bits(fa.upper[1]));

    const c = fitNnar(Y, { ...QUICK, seed: 7 });
    expect(bits(c.internals().weights)).not.toBe(bits(a.internals().weights));
    expect(bits(c.forecast(8, [80, 95]).point)).not.toBe(bits(fa.point));
  });

  test("simulate() follows the caller's generator", () => {
    const f = fitNnar(Y, QUICK);
    const p1 = f.simulate(6, 50, new MersenneTwister(1));
    const p2 = f.simulate(6, 50, new MersenneTwister(1));
    const p3 = f.simulate(6, 50, new MersenneTwister(2));
    expect(p1).toHaveLength(50);
    expect(p1[0]).toHaveLength(6);
    expect(bits(p1[17])).toBe(bits(p2[17]));
    expect(bits(p1[17])).not.toBe(bits(p3[17]));
  });
});

describe("NNAR fit and forecast", () => {
  const fit = fitNnar(Y, QUICK);
  const s = fit.summary();
  const lags = fit.internals().lags;
  const maxLag = lags[lags.length - 1];

  test("defaults on 160 weeks: P = 1, p by AIC, k by the rule, and a summary that says so", () => {
    const p = s.parameters.find((r) => r.name.startsWith("p "))?.value ?? NaN;
    const P = s.parameters.find((r) => r.name.startsWith("P "))?.value;
    const k = s.parameters.find((r) => r.name.startsWith("k "))?.value;
    expect(P).toBe(1);
    expect(p).toBeGreaterThanOrEqual(1);
    expect(k).toBe(Math.round((p + 1 + 1) / 2));
    expect(maxLag).toBe(52);
    expect(s.method).toBe("nnar");
    expect(s.structure).toContain(`NNAR(${p},1,${k})[52]`);
    expect(s.structure).toContain("averaged over 4 networks");
    expect(s.armaDf).toBe(0);
    expect(s.notes.join(" ")).toMatch(/AIC order .* STL seasonal component/);
    expect(s.notes.join(" ")).toMatch(/decay 0\.001 .*biases not penalised/);
    expect(Number.isNaN(fit.aicc)).toBe(true);
    expect(fit.n).toBe(160);
  });

  test("fitted and residuals: NaN for the first max(p, 52P) weeks, then y − fitted", () => {
    for (let t = 0; t < maxLag; t++) expect(Number.isNaN(fit.fitted[t])).toBe(true);
    let ss = 0;
    for (let t = maxLag; t < fit.n; t++) {
      expect(fit.residuals[t]).toBe(Y[t] - fit.fitted[t]);
      ss += fit.residuals[t] ** 2;
    }
    // No transform here: sigma2 is the mean squared residual on the data scale.
    expect(fit.sigma2).toBeCloseTo(ss / (fit.n - maxLag), 6);
  });

  test("forecast shapes and interval order lower95 ≤ lower80 ≤ point ≤ upper80 ≤ upper95", () => {
    const h = 12;
    const fc = fit.forecast(h, [80, 95]);
    expect(fc.levels).toEqual([80, 95]);
    expect(fc.point).toHaveLength(h);
    expect(fc.lower).toHaveLength(2);
    expect(fc.upper[1]).toHaveLength(h);
    for (let t = 0; t < h; t++) {
      expect(fc.lower[1][t]).toBeLessThanOrEqual(fc.lower[0][t]);
      expect(fc.lower[0][t]).toBeLessThan(fc.upper[0][t]);
      expect(fc.upper[0][t]).toBeLessThanOrEqual(fc.upper[1][t]);
      // The point is the recursive forecast without errors, not the paths' median, so it is
      // held only to the 80% band.
      expect(fc.point[t]).toBeGreaterThan(fc.lower[0][t]);
      expect(fc.point[t]).toBeLessThan(fc.upper[0][t]);
    }
    expect(fit.forecast(3, []).lower).toEqual([]);
  });
});

describe("NNAR with a Box-Cox transform", () => {
  test("transform and back-transform round trip; the edge of the range maps to its limit", () => {
    for (const lambda of [0, 0.5, -0.3, 1.5]) {
      const x = toTransformed(Y, lambda);
      for (let t = 0; t < Y.length; t += 17) {
        // Outside check: the definition y^λ = 1 + λ·g(y) (λ ≠ 0), log y = g(y) (λ = 0).
        const direct = lambda === 0 ? Math.exp(x[t]) : (1 + lambda * x[t]) ** (1 / lambda);
        expect(toDataScale(x[t], lambda) / Y[t]).toBeCloseTo(1, 12);
        expect(direct / Y[t]).toBeCloseTo(1, 12);
      }
    }
    expect(toDataScale(-3, 0.5)).toBe(0);
    expect(toDataScale(5, -0.5)).toBe(Infinity);
    expect(toDataScale(1234.5, null)).toBe(1234.5);
  });

  test("λ = 0 is the untransformed model of log y, mapped back through exp", () => {
    const logFit = fitNnar(Float64Array.from(Y, Math.log), { ...QUICK, p: 2 });
    const fit = fitNnar(Y, { ...QUICK, p: 2, lambda: 0 });
    const a = fit.forecast(6, [95]);
    const b = logFit.forecast(6, [95]);
    for (let t = 0; t < 6; t++) {
      expect(a.point[t]).toBe(Math.exp(b.point[t]));
      expect(a.upper[0][t]).toBe(Math.exp(b.upper[0][t]));
    }
    expect(fit.fitted[100]).toBe(Math.exp(logFit.fitted[100]));
    // sigma2 on the transformed (log) scale: the log model's own sigma2.
    expect(fit.sigma2).toBe(logFit.sigma2);
  });

  test('lambda "auto" uses Guerrero\'s choice with period 52 and says so', () => {
    const fit = fitNnar(Y, { ...QUICK, p: 1, lambda: "auto" });
    const lambda = guerreroLambda(Y, 52);
    expect(fit.internals().lambda).toBe(lambda);
    expect(fit.summary().notes.join(" ")).toMatch(/Guerrero/);
  });
});

describe("NNAR option and input checks", () => {
  test("bad options are BAD_OPTION with a sentence", () => {
    const y = Y;
    expectInputError(() => fitNnar(y, { p: -1 }), "BAD_OPTION", /recent weeks .* whole number/);
    expectInputError(() => fitNnar(y, { p: 1.5 }), "BAD_OPTION", /whole number/);
    expectInputError(() => fitNnar(y, { P: 9 }), "BAD_OPTION", /seasonal lags/);
    expectInputError(() => fitNnar(y, { p: 0, P: 0 }), "BAD_OPTION", /at least one input/);
    expectInputError(() => fitNnar(y, { hiddenUnits: 0 }), "BAD_OPTION", /hidden units/);
    expectInputError(() => fitNnar(y, { networks: 0 }), "BAD_OPTION", /networks/);
    expectInputError(() => fitNnar(y, { weightDecay: -1 }), "BAD_OPTION", /weight decay/);
    expectInputError(() => fitNnar(y, { weightDecay: NaN }), "BAD_OPTION", /weight decay/);
    expectInputError(() => fitNnar(y, { lambda: 5 }), "BAD_OPTION", /Box-Cox/);
    expectInputError(() => fitNnar(y, { seed: -1 }), "BAD_OPTION", /seed/);
    expectInputError(() => fitNnar(y, { maxIter: 0 }), "BAD_OPTION", /iteration/);
    expectInputError(() => fitNnar(y, { paths: 1 }), "BAD_OPTION", /paths/);
    expectInputError(() => fitNnar(y, { lags: 3 } as never), "BAD_OPTION", /"lags" is not an NNAR setting/);
    const fit = fitNnar(y, { ...QUICK, p: 1, P: 0 });
    expectInputError(() => fit.forecast(0, [80]), "BAD_OPTION", /horizon/);
    expectInputError(() => fit.forecast(4, [100]), "BAD_OPTION", /coverage/);
  });

  test("minLength reports the fewest weeks, and fit agrees at the boundary", () => {
    expect(minLength()).toBe(21);
    expect(nnar.minLength({ P: 1 })).toBe(72);
    expect(nnar.minLength({ p: 0 })).toBe(72);
    expect(nnar.minLength({ p: 5, P: 2 })).toBe(124);
    expect(nnar.minLength({ lambda: "auto" })).toBe(104);
    expect(asRegistered.minLength()).toBe(21);
    for (const o of [{}, { P: 1 }, { p: 3 }]) {
      const m = nnar.minLength(o);
      expect(() => fitNnar(Y.subarray(0, m), { ...o, networks: 2 })).not.toThrow();
      expectInputError(() => fitNnar(Y.subarray(0, m - 1), { ...o, networks: 2 }), "TOO_FEW_POINTS", new RegExp(`at least ${m} weeks`));
    }
  });

  test("bad series: non-finite, constant, non-positive under Box-Cox", () => {
    const y = Float64Array.from(Y);
    y[10] = NaN;
    expectInputError(() => fitNnar(y), "NOT_A_NUMBER", /week 11/);
    expectInputError(() => fitNnar(new Float64Array(60).fill(5)), "CONSTANT_SERIES", /constant/);
    const z = Float64Array.from(Y);
    z[30] = 0;
    expectInputError(() => fitNnar(z, { lambda: 0 }), "NON_POSITIVE", /week 31/);
    const fit = fitNnar(Y, { ...QUICK, p: 1, lambda: 0 });
    expectInputError(() => fit.update(new Float64Array([1500, -1]), { reestimate: false }), "NON_POSITIVE", /week 2/);
  });
});

describe("NNAR update()", () => {
  const base = rates(200, 8);
  const fit = fitNnar(base.subarray(0, 170), { ...QUICK, p: 2 });
  const newY = base.slice(170);

  test("reestimate false keeps weights and scaling; residuals equal a fresh computation with those weights", () => {
    const ext = fit.update(newY, { reestimate: false });
    const a = fit.internals();
    const b = ext.internals();
    expect(bits(b.weights)).toBe(bits(a.weights));
    expect([b.mean, b.sd]).toEqual([a.mean, a.sd]);
    expect(ext.n).toBe(200);
    // The weeks already fitted are untouched.
    expect(bits(ext.fitted.subarray(0, 170))).toBe(bits(fit.fitted));
    // Fresh computation from the weights, written from the network equations.
    const W = a.weightsPerNetwork;
    const I = a.lags.length;
    const k = a.hidden;
    const repeats = a.weights.length / W;
    const z = Float64Array.from(base, (v) => (v - a.mean) / a.sd);
    for (let t = 52; t < 200; t++) {
      let mean = 0;
      for (let r = 0; r < repeats; r++) {
        const w = a.weights.subarray(r * W, (r + 1) * W);
        let out = w[k * (I + 1)];
        for (let j = 0; j < k; j++) {
          let act = w[j * (I + 1)];
          for (let i = 0; i < I; i++) act += w[j * (I + 1) + 1 + i] * z[t - a.lags[i]];
          out += w[k * (I + 1) + 1 + j] / (1 + Math.exp(-act));
        }
        mean += out / repeats;
      }
      const expected = base[t] - (a.mean + a.sd * mean);
      // Same arithmetic in a different order: agreement to rounding of rates near 1500.
      expect(Math.abs(ext.residuals[t] - expected)).toBeLessThan(1e-9);
    }
  });

  test("reestimate true retrains from the previous weights (warm start)", () => {
    // Trained to convergence, each network sits at a stationary point of its penalised error;
    // retraining on the same weeks from there must stay put, where a restart from fresh
    // weights would not.
    const small = { p: 1, P: 0, hiddenUnits: 2, networks: 2, maxIter: 5000 };
    const conv = fitNnar(base.subarray(0, 120), small);
    expect(conv.summary().notes.join(" ")).not.toMatch(/iteration limit/);
    const again = conv.update(new Float64Array(0), { reestimate: true });
    const w0 = conv.internals().weights;
    const w1 = again.internals().weights;
    let moved = 0;
    for (let i = 0; i < w0.length; i++) moved = Math.max(moved, Math.abs(w1[i] - w0[i]));
    expect(moved).toBeLessThan(1e-6);

    const warm = fit.update(newY, { reestimate: true });
    const kept = fit.update(newY, { reestimate: false });
    expect(bits(warm.internals().weights)).not.toBe(bits(kept.internals().weights));
    // Re-estimation lowers the in-sample error on the extended series.
    expect(warm.sigma2).toBeLessThan(kept.sigma2);
    expect(warm.summary().notes.join(" ")).toMatch(/previous weights/);
    // Deterministic like everything else.
    expect(bits(fit.update(newY, { reestimate: true }).internals().weights)).toBe(bits(warm.internals().weights));
  });
});
