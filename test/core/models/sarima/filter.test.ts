/**
 * The O(r) filter against the definition of the exact Gaussian likelihood: the density of
 * N(0, σ²Γ_n) with Γ_n the Toeplitz matrix of autocovariances (Brockwell & Davis, 1991,
 * eq. 5.2.9), evaluated by a dense Cholesky factor. The autocovariances themselves are checked
 * against the closed forms for AR(1) and MA(1) (Box, Jenkins & Reinsel, 2008, eqs. 3.2.8, 3.3.4).
 */
import { armaAutocovariance, stationaryCovariance, stationaryFirstColumn } from "../../../../src/core/models/sarima/acvf";
import { armaFilter, glsLikelihood } from "../../../../src/core/models/sarima/filter";
import { expandAr, expandMa } from "../../../../src/core/models/sarima/polynomial";
import { MersenneTwister } from "../../../../src/core/math/rng";

function denseLogLik(gamma: Float64Array, y: Float64Array, sigma2: number): number {
  const n = y.length;
  const L = new Float64Array(n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      let s = sigma2 * gamma[i - j];
      for (let k = 0; k < j; k++) s -= L[i * n + k] * L[j * n + k];
      L[i * n + j] = i === j ? Math.sqrt(s) : s / L[j * n + j];
    }
  }
  const z = new Float64Array(n);
  let logDet = 0;
  let quad = 0;
  for (let i = 0; i < n; i++) {
    let s = y[i];
    for (let k = 0; k < i; k++) s -= L[i * n + k] * z[k];
    z[i] = s / L[i * n + i];
    logDet += 2 * Math.log(L[i * n + i]);
    quad += z[i] * z[i];
  }
  return -0.5 * (n * Math.log(2 * Math.PI) + logDet + quad);
}

function simulate(ar: Float64Array, ma: Float64Array, n: number, seed: number): Float64Array {
  const rng = new MersenneTwister(seed);
  const burn = 600;
  const e = new Float64Array(n + burn);
  const y = new Float64Array(n + burn);
  for (let t = 0; t < n + burn; t++) {
    e[t] = rng.normal();
    let v = e[t];
    for (let j = 1; j <= ar.length; j++) if (t - j >= 0) v += ar[j - 1] * y[t - j];
    for (let j = 1; j <= ma.length; j++) if (t - j >= 0) v += ma[j - 1] * e[t - j];
    y[t] = v;
  }
  return y.subarray(burn);
}

describe("ARMA autocovariances", () => {
  test("AR(1): γ(k) = φ^k/(1 − φ²) (Box, Jenkins & Reinsel, eq. 3.2.8)", () => {
    const g = armaAutocovariance(Float64Array.of(0.6), new Float64Array(0), 5);
    for (let k = 0; k <= 5; k++) expect(g[k]).toBeCloseTo(0.6 ** k / (1 - 0.36), 12);
  });
  test("MA(1): γ(0) = 1 + θ², γ(1) = θ, zero beyond (eq. 3.3.4)", () => {
    const g = armaAutocovariance(new Float64Array(0), Float64Array.of(-0.4), 3);
    expect(g[0]).toBeCloseTo(1.16, 14);
    expect(g[1]).toBeCloseTo(-0.4, 14);
    expect(g[2]).toBe(0);
  });
});

describe("exact likelihood by the O(r) filter", () => {
  const cases: [string, number[], number[], number[], number[], number][] = [
    ["AR(2)", [0.5, -0.3], [], [], [], 1],
    ["ARMA(1,1)", [0.7], [0.4], [], [], 1],
    ["MA(2) near non-invertible", [], [-1.2, 0.3], [], [], 1],
    ["(1,0,1)(1,0,1)[12]", [0.4], [-0.3], [0.5], [-0.6], 12],
    ["(0,0,1)(0,0,1)[52]", [], [0.3], [], [-0.5], 52],
  ];
  test.each(cases)("%s matches the dense N(0, σ²Γ) density to 1e-8", (_name, a, m, sa, sm, s) => {
    const ar = expandAr(a, sa, s);
    const ma = expandMa(m, sm, s);
    const n = s === 52 ? 300 : 150;
    const y = simulate(ar, ma, n, 11);
    const out = armaFilter(ar, ma, y, 1);
    const lik = glsLikelihood(out);
    const gamma = armaAutocovariance(ar, ma, n);
    const dense = denseLogLik(gamma, y, lik.sigma2);
    // Both are the same quantity computed two ways; agreement to 1e-8 relative leaves room only
    // for rounding in the n×n Cholesky factor.
    expect(Math.abs(lik.logLik - dense)).toBeLessThan(1e-8 * Math.abs(dense));
  });

  test("the gain reaches its steady state for a pure AR after p steps", () => {
    const y = simulate(Float64Array.of(0.5, -0.3), new Float64Array(0), 100, 3);
    const out = armaFilter(Float64Array.of(0.5, -0.3), new Float64Array(0), y, 1);
    expect(out.F[2]).toBeCloseTo(1, 12);
    expect(out.steadyFrom).toBeLessThanOrEqual(4);
  });
});

describe("stationary state covariance", () => {
  test.each([
    ["ARMA(1,1)", [0.7], [0.4], [], [], 1],
    ["(1,0,1)(1,0,1)[4]", [0.4], [-0.3], [0.5], [-0.6], 4],
    ["(2,0,0)(0,0,1)[6]", [0.5, -0.2], [], [], [0.7], 6],
  ] as [string, number[], number[], number[], number[], number][])(
    "%s solves the Lyapunov equation P = TPTᵀ + RRᵀ (Harvey, 1989, eq. 3.3.13) to 1e-12",
    (_n, a, m, sa, sm, s) => {
      const ar = expandAr(a, sa, s);
      const ma = expandMa(m, sm, s);
      const r = Math.max(ar.length, ma.length + 1);
      const P = stationaryCovariance(ar, ma, r);
      const T = (i: number, j: number) => (j === 0 ? (i < ar.length ? ar[i] : 0) : j === i + 1 ? 1 : 0);
      const R = (i: number) => (i === 0 ? 1 : i - 1 < ma.length ? ma[i - 1] : 0);
      const first = stationaryFirstColumn(ar, ma, r);
      for (let i = 0; i < r; i++) {
        expect(P[i * r]).toBeCloseTo(first[i], 12);
        for (let j = 0; j < r; j++) {
          let s2 = R(i) * R(j);
          for (let k = 0; k < r; k++) for (let l = 0; l < r; l++) s2 += T(i, k) * P[k * r + l] * T(j, l);
          expect(Math.abs(s2 - P[i * r + j])).toBeLessThan(1e-12 * Math.max(1, Math.abs(P[i * r + j])));
        }
      }
    },
  );
});
