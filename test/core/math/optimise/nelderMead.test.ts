import { nelderMead } from "../../../../src/core/math/optimise";
import { countNonFinite, distanceFromOnes, logBarrier, logBarrierMin, rosenbrock } from "./problems";

// Truth: the Rosenbrock minimiser (1, …, 1) and the closed-form minimiser in problems.ts.
describe("nelderMead", () => {
  it("finds the 2-D Rosenbrock minimum from (−1.2, 1) to 1e-5", () => {
    const r = nelderMead(rosenbrock, [-1.2, 1], { xTol: 1e-10, fTol: 1e-16 });
    expect(r.converged).toBe(true);
    expect(distanceFromOnes(r.x)).toBeLessThan(1e-5);
    expect(r.f).toBeLessThan(1e-12);
    expect(r.evaluations).toBeGreaterThan(r.iterations); // every iteration evaluates at least once
  });

  it.each([false, true])("finds the 5-D Rosenbrock minimum to 1e-5 (adaptive = %s)", (adaptive) => {
    const r = nelderMead(rosenbrock, [-1.2, 1, -1.2, 1, -1.2], {
      adaptive, xTol: 1e-10, fTol: 1e-16, maxIter: 20000, maxEval: 40000,
    });
    expect(r.converged).toBe(true);
    expect(distanceFromOnes(r.x)).toBeLessThan(1e-5);
  });

  it("honours maxEval exactly and reports converged: false", () => {
    for (const maxEval of [1, 3, 17, 50]) {
      let calls = 0;
      const r = nelderMead((x) => (calls++, rosenbrock(x)), [-1.2, 1], { maxEval });
      expect(calls).toBe(maxEval);
      expect(r.evaluations).toBe(maxEval);
      expect(r.converged).toBe(false);
      expect(r.message).toMatch(/maxEval/);
      expect(r.f).toBe(rosenbrock(r.x)); // the reported value belongs to the reported point
    }
  });

  it("honours maxIter", () => {
    const r = nelderMead(rosenbrock, [-1.2, 1], { maxIter: 10 });
    expect(r.iterations).toBe(10);
    expect(r.converged).toBe(false);
    expect(r.message).toMatch(/maxIter/);
  });

  it("survives NaN values and still reaches the minimum", () => {
    // Steps from (5, 5) overshoot into x ≤ 0 where the logs are NaN.
    const probe = countNonFinite(logBarrier);
    const r = nelderMead(probe.f, [5, 5], { xTol: 1e-10, fTol: 1e-15 });
    expect(probe.count()).toBeGreaterThan(0);
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x[0] - logBarrierMin[0])).toBeLessThan(1e-6);
    expect(Math.abs(r.x[1] - logBarrierMin[1])).toBeLessThan(1e-6);
  });

  it("reports an objective that is NaN everywhere instead of looping", () => {
    const r = nelderMead(() => NaN, [0, 0]);
    expect(r.converged).toBe(false);
    expect(r.evaluations).toBe(3);
    expect(r.message).toMatch(/not finite/);
  });
});
