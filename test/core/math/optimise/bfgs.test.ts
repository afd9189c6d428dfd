import { bfgs, forwardGradient, numericalGradient } from "../../../../src/core/math/optimise";
import { MersenneTwister } from "../../../../src/core/math/rng";
import {
  countNonFinite, distanceFromOnes, logBarrier, logBarrierMin, rosenbrock, rosenbrockGradient,
} from "./problems";

// Truth: the Rosenbrock minimiser (1, …, 1), its hand-derived gradient and the closed-form
// minimiser of logBarrier (problems.ts).
describe("bfgs", () => {
  const start2 = [-1.2, 1];
  const start5 = [-1.2, 1, -1.2, 1, -1.2];

  it.each([
    ["2-D, finite differences", start2, false],
    ["2-D, analytic gradient", start2, true],
    ["5-D, finite differences", start5, false],
    ["5-D, analytic gradient", start5, true],
  ] as const)("finds the Rosenbrock minimum to 1e-5 (%s)", (_label, start, analytic) => {
    // gTol 1e-6 and the smallest Hessian eigenvalue at (1, …, 1) (≈ 0.4 in 2-D) bound the
    // distance by ~1e-6/0.4; 1e-5 leaves a factor of four.
    const r = bfgs(rosenbrock, start, analytic ? { gradient: rosenbrockGradient } : {});
    expect(r.converged).toBe(true);
    expect(r.gradientNorm).toBeLessThanOrEqual(1e-6);
    expect(distanceFromOnes(r.x)).toBeLessThan(1e-5);
  });

  it("analytic and finite-difference gradients agree, and so do the minimisers", () => {
    // Central differences with h ≈ 6e-6 have truncation error ≈ h²|f'''|/6 and rounding error
    // ≈ ε|f|/h, both ≲ 1e-7 relative to the gradient at these points; 1e-6 is the bound.
    const rng = new MersenneTwister(42);
    for (let t = 0; t < 20; t++) {
      const x = Float64Array.from({ length: 5 }, () => 4 * rng.uniform() - 2);
      const ga = rosenbrockGradient(x);
      const gn = numericalGradient(rosenbrock, x, rosenbrock(x));
      let scale = 0;
      for (const v of ga) scale = Math.max(scale, Math.abs(v));
      for (let i = 0; i < 5; i++) expect(Math.abs(gn[i] - ga[i]) / scale).toBeLessThan(1e-6);
    }
    const a = bfgs(rosenbrock, start5, { gradient: rosenbrockGradient });
    const n = bfgs(rosenbrock, start5);
    for (let i = 0; i < 5; i++) expect(Math.abs(a.x[i] - n.x[i])).toBeLessThan(1e-5);
    // The analytic version needs far fewer objective calls: FD costs 2n per gradient.
    expect(a.evaluations).toBeLessThan(n.evaluations / 3);
  });

  it("honours maxEval, counting finite-difference calls, and reports converged: false", () => {
    for (const maxEval of [1, 4, 30, 101]) {
      let calls = 0;
      const r = bfgs((x) => (calls++, rosenbrock(x)), start2, { maxEval });
      expect(calls).toBeLessThanOrEqual(maxEval);
      expect(r.evaluations).toBe(calls);
      expect(r.converged).toBe(false);
      expect(r.message).toMatch(/maxEval/);
    }
  });

  it("honours maxIter", () => {
    const r = bfgs(rosenbrock, start2, { maxIter: 3 });
    expect(r.iterations).toBe(3);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/maxIter/);
  });

  it("backs off from NaN values in the line search and still converges", () => {
    // From (5, 5) the doubling phase of the line search steps into x ≤ 0, where f is NaN.
    const probe = countNonFinite(logBarrier);
    const r = bfgs(probe.f, [5, 5]);
    expect(probe.count()).toBeGreaterThan(0);
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x[0] - logBarrierMin[0])).toBeLessThan(1e-6);
    expect(Math.abs(r.x[1] - logBarrierMin[1])).toBeLessThan(1e-6);
  });

  it("a NaN region next to the minimum, with an analytic gradient", () => {
    // f is a quadratic with minimum (1, 2) but NaN for x₀ > 1.5 or x₁ > 2.5; from far away
    // the expanding line search overshoots into the NaN region.
    const quad = (x: Float64Array): number => (x[0] > 1.5 || x[1] > 2.5 ? NaN : (x[0] - 1) ** 2 + 3 * (x[1] - 2) ** 2);
    const grad = (x: Float64Array): Float64Array => Float64Array.from([2 * (x[0] - 1), 6 * (x[1] - 2)]);
    const probe = countNonFinite(quad);
    const r = bfgs(probe.f, [-20, -20], { gradient: grad });
    expect(probe.count()).toBeGreaterThan(0);
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x[0] - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.x[1] - 2)).toBeLessThan(1e-6);
  });

  it("returns instead of throwing when the start is not finite", () => {
    const r = bfgs(() => Infinity, [1, 2]);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/starting point/);
    expect(r.evaluations).toBe(1);
  });
});

describe("forward-difference gradient", () => {
  test("matches the analytic gradient of the Rosenbrock function to O(√ε) (Nocedal & Wright, eq. 8.1)", () => {
    const f = (x: Float64Array) => 100 * (x[1] - x[0] * x[0]) ** 2 + (1 - x[0]) ** 2;
    const x = Float64Array.of(-1.2, 1);
    const exact = [-400 * x[0] * (x[1] - x[0] * x[0]) - 2 * (1 - x[0]), 200 * (x[1] - x[0] * x[0])];
    const g = forwardGradient(f, x);
    // Truncation error ≈ h·|f''|/2 with h ≈ 1.5e-8 and |f''| ≤ 1400 here: about 1e-5.
    for (let i = 0; i < 2; i++) expect(Math.abs(g[i] - exact[i])).toBeLessThan(3e-5);
  });
  test("steps backwards where the forward point is not finite", () => {
    const f = (x: Float64Array) => (x[0] > 1 ? NaN : x[0] * x[0]);
    const g = forwardGradient(f, Float64Array.of(1));
    expect(g[0]).toBeCloseTo(2, 6);
  });
});
