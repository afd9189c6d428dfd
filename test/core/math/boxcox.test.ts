import {
  boxCox,
  boxCoxInverse,
  boxCoxInverseTransform,
  boxCoxLogLik,
  boxCoxMeanBiasAdjusted,
  boxCoxTransform,
  guerreroLambda,
  profileLambda,
} from "../../../src/core/math/boxcox";
import { MersenneTwister } from "../../../src/core/math/rng";
import { loadFixture } from "../../fixtures";

interface SeriesFixture {
  y: number[];
  lmbda_mle: number;
  llf_at_mle: number;
  llf: { lmbda: number; llf: number }[];
  transformed: { lmbda: number; values: number[] }[];
}

// scipy 1.10 stats.boxcox / boxcox_llf on the statsmodels Nile, yearly sunspots + 1 and
// weekly CO2 (gaps dropped) series (test/reference/make_boxcox.py).
const fixtures = loadFixture<Record<string, SeriesFixture>>("boxcox.json");
const names = Object.keys(fixtures).sort();

describe("Box-Cox against scipy", () => {
  it("has the three reference series", () => {
    expect(names).toEqual(["co2", "nile", "sunspots_plus1"]);
  });

  it.each(names)("%s: transformed values at fixed λ to 1e-10 relative", (name) => {
    // Both sides evaluate expm1(λ log y)/λ or log y in double precision, so they agree to a
    // few ulps; 1e-10 leaves room for libm differences and nothing else.
    const fx = fixtures[name];
    for (const { lmbda, values } of fx.transformed) {
      const z = boxCoxTransform(fx.y, lmbda);
      for (let i = 0; i < values.length; i++) {
        expect(Math.abs(z[i] - values[i])).toBeLessThanOrEqual(1e-10 * Math.abs(values[i]) + 1e-300);
      }
    }
  });

  it.each(names)("%s: profile log-likelihood at fixed λ to 1e-9 relative", (name) => {
    // scipy forms var(y^λ/λ) directly and we use a centred form (see boxCoxLogLik); both are
    // accurate to ~1e-13 relative on these data, so 1e-9 only absorbs summation order.
    const fx = fixtures[name];
    for (const { lmbda, llf } of fx.llf) {
      const got = boxCoxLogLik(fx.y, lmbda);
      expect(Math.abs(got - llf) / Math.abs(llf)).toBeLessThan(1e-9);
    }
  });

  it.each(names)("%s: maximum-likelihood λ within 1e-5 of scipy", (name) => {
    // scipy's Brent search stops at ~1.5e-8 relative in λ and ours at ~1e-8, so 1e-5
    // absolute is loose for both; the CO2 optimum (≈ −2.17) lies outside the default bounds.
    const fx = fixtures[name];
    const lam = profileLambda(fx.y, [-4, 4]);
    expect(Math.abs(lam - fx.lmbda_mle)).toBeLessThan(1e-5);
    // And the likelihood there is no worse than scipy's maximum (up to rounding).
    expect(boxCoxLogLik(fx.y, lam)).toBeGreaterThanOrEqual(fx.llf_at_mle - 1e-9 * Math.abs(fx.llf_at_mle));
  });

  it("an optimum outside the bounds is returned as the nearer bound", () => {
    // The CO2 likelihood rises monotonically towards −2.17, so on [−1, 2] the maximum is −1.
    expect(profileLambda(fixtures.co2.y)).toBe(-1);
  });
});

describe("Box-Cox transform and inverse", () => {
  const ys = [0.05, 0.3, 1, 2.5, 17, 50, 480, 1834.2, 5000];
  const lambdas = [-0.5, -1e-7, -1e-13, 0, 1e-13, 1e-7, 0.5, 1, 1.3, 2];

  it("inverse(transform(y)) = y to 1e-12 relative", () => {
    // The round trip amplifies rounding by about y^{−λ}/|λ| when y^λ ≪ 1; over these values
    // that factor stays below ~200, so 1e-12 is a real bound. λ = −1 is checked on y ≤ 50.
    for (const lam of lambdas) {
      for (const y of ys) {
        expect(Math.abs(boxCoxInverse(boxCox(y, lam), lam) - y) / y).toBeLessThan(1e-12);
      }
    }
    for (const y of ys.filter((v) => v <= 50)) {
      expect(Math.abs(boxCoxInverse(boxCox(y, -1), -1) - y) / y).toBeLessThan(1e-12);
    }
    const z = boxCoxTransform(ys, 0.37);
    const back = boxCoxInverseTransform(z, 0.37);
    ys.forEach((y, i) => expect(Math.abs(back[i] - y) / y).toBeLessThan(1e-12));
  });

  it("is continuous in λ through 0", () => {
    // (y^λ − 1)/λ = L + λL²/2 + λ²L³/6 + …, L = log y (Taylor series of e^{λL}).
    for (const y of [0.05, 3, 5000]) {
      const L = Math.log(y);
      expect(boxCox(y, 0)).toBe(L);
      for (const lam of [1e-15, -1e-10, 3e-9, 1e-6]) {
        const series = L + (lam * L * L) / 2 + (lam * lam * L * L * L) / 6;
        // Remaining series term λ³L⁴/24 plus a few ulps of L.
        const bound = Math.abs(lam ** 3 * L ** 4) / 24 + 4 * Number.EPSILON * Math.abs(L);
        expect(Math.abs(boxCox(y, lam) - series)).toBeLessThanOrEqual(bound);
      }
    }
  });

  it("inverse of a value outside the range of the transform is NaN", () => {
    // λ = 0.5 maps (0, ∞) onto (−2, ∞); z = −3 has no preimage.
    expect(boxCoxInverse(-3, 0.5)).toBeNaN();
    expect(boxCoxInverse(-2, 0.5)).toBe(0);
    // λ = −1 maps onto (−∞, 1); z = 1 would need y = ∞.
    expect(boxCoxInverse(1, -1)).toBeNaN();
  });

  it("rejects non-positive data with a RangeError naming the value", () => {
    expect(() => boxCoxTransform([3, 2, 0, 4], 0.5)).toThrow(RangeError);
    expect(() => boxCoxTransform([3, 2, 0, 4], 0.5)).toThrow(/value 3 of 4 is 0/);
    expect(() => boxCox(-1, 0)).toThrow(RangeError);
    expect(() => profileLambda([1, 2, -3])).toThrow(/strictly positive/);
    expect(() => guerreroLambda([1, 2, 3, NaN], 2)).toThrow(RangeError);
    expect(() => boxCoxLogLik([1, 2, 3], Infinity)).toThrow(RangeError);
  });
});

describe("bias-adjusted back-transform of a mean", () => {
  it("λ = 0: within the O(σ⁴) error of the exact lognormal mean exp(μ + σ²/2)", () => {
    // exact − Taylor = e^μ(e^x − 1 − x), x = σ²/2, and x²/2 ≤ e^x − 1 − x ≤ (x²/2)e^x for
    // x > 0, so the error divided by e^μ lies in [σ⁴/8, (σ⁴/8)e^{σ²/2}].
    for (const mu of [-1, 0, 7.5]) {
      for (const s of [0.02, 0.1, 0.3]) {
        const v = s * s;
        const err = (Math.exp(mu + v / 2) - boxCoxMeanBiasAdjusted(mu, v, 0)) / Math.exp(mu);
        expect(err).toBeGreaterThanOrEqual((v * v) / 8 * (1 - 1e-6));
        expect(err).toBeLessThanOrEqual((v * v) / 8 * Math.exp(v / 2) * (1 + 1e-6));
      }
    }
  });

  it("λ = 1/2 and 1/3: equal to the exact normal moments (the inverse is a polynomial)", () => {
    // λ = 1/2: y = (1 + z/2)², E[y] = (1 + μ/2)² + σ²/4.
    // λ = 1/3: y = (1 + z/3)³, E[y] = m³ + mσ²/3 with m = 1 + μ/3 (odd central moments vanish).
    // In both the Taylor form is exact, so only rounding separates them.
    for (const [mu, v] of [[2, 0.3], [10, 4], [0.5, 0.01]]) {
      const half = (1 + mu / 2) ** 2 + v / 4;
      expect(Math.abs(boxCoxMeanBiasAdjusted(mu, v, 0.5) - half) / half).toBeLessThan(1e-14);
      const m = 1 + mu / 3;
      const third = m ** 3 + (m * v) / 3;
      expect(Math.abs(boxCoxMeanBiasAdjusted(mu, v, 1 / 3) - third) / third).toBeLessThan(1e-13);
    }
  });

  it("λ = 1 needs no adjustment and zero variance returns the plain inverse", () => {
    expect(boxCoxMeanBiasAdjusted(4, 9, 1)).toBe(5);
    expect(boxCoxMeanBiasAdjusted(1.2, 0, 0.3)).toBe(boxCoxInverse(1.2, 0.3));
    expect(() => boxCoxMeanBiasAdjusted(1, -1, 0)).toThrow(RangeError);
  });
});

describe("Guerrero's λ on simulated series with a known variance law", () => {
  const H = 20;
  const P = 52;
  // The level is constant within each 52-week subseries, so each subseries' sd is exactly the
  // noise sd and the power law s ∝ m^{1−λ} holds by construction.
  function simulate(seed: number, kind: "proportional" | "constant"): Float64Array {
    const rng = new MersenneTwister(seed);
    const y = new Float64Array(H * P);
    for (let h = 0; h < H; h++) {
      const m = kind === "proportional" ? 10 * 100 ** (h / (H - 1)) : 50 * 10 ** (h / (H - 1));
      for (let j = 0; j < P; j++) {
        const e = rng.normal();
        y[h * P + j] = kind === "proportional" ? m * (1 + 0.05 * e) : m + 2 * e;
      }
    }
    return y;
  }

  // Tolerances from the sampling error of λ̂: each log s_h has sd ≈ 1/√(2·51) ≈ 0.1, and λ̂
  // behaves like a regression slope of log s on log m, with se ≈ 0.1/(sd(log m)·√H): ≈ 0.016
  // for the 100-fold level range and ≈ 0.032 for the 10-fold one (200 seeds gave 0.016 and
  // 0.032). The tolerances are five of those, far from the wrong answers 1 and 0.
  it("sd proportional to the mean gives λ ≈ 0", () => {
    expect(Math.abs(guerreroLambda(simulate(20260101, "proportional"), P))).toBeLessThan(0.08);
  });

  it("constant sd gives λ ≈ 1", () => {
    expect(Math.abs(guerreroLambda(simulate(20260102, "constant"), P) - 1)).toBeLessThan(0.16);
  });

  it("uses the latest full periods and needs two of them", () => {
    const y = simulate(7, "proportional");
    // Prepending a partial period (wild values) must not change the answer: it is dropped.
    const padded = new Float64Array(y.length + 30);
    for (let i = 0; i < 30; i++) padded[i] = 1 + 1000 * (i % 2);
    padded.set(y, 30);
    expect(guerreroLambda(padded, P)).toBe(guerreroLambda(y, P));
    expect(() => guerreroLambda(y.subarray(0, 2 * P - 1), P)).toThrow(/two full periods/);
    expect(() => guerreroLambda(y, 52.18)).toThrow(/integer period/);
  });
});
