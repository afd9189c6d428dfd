import {
  Bound, bfgs, boundedJacobianDiagonal, nelderMead, toBounded, toBoundedScalar, toUnbounded,
  unboundedGradient, unboundedObjective,
} from "../../../../src/core/math/optimise";

const spec: Bound[] = [{ lower: 0, upper: 2 }, { lower: 0 }, { upper: 1 }, {}];

describe("bound transforms", () => {
  it("map ℝ into each set and back (round trip to 1e-12 plus the rounding of x)", () => {
    // Closed-form inverses (see bounds.ts). Beyond 1e-12, the only loss is that x itself is
    // rounded to a few ulps: near an end at a nonzero bound (x ≈ 2 − 4e-9 for u = 20) that is
    // an error 4ε|x| in x, which becomes 4ε|x|·|du/dx| in u — a floating-point limit, not a bug.
    for (const u of [-20, -3, -0.1, 0, 0.7, 5, 20]) {
      const x = toBounded([u, u, u, u], spec);
      expect(x[0]).toBeGreaterThan(0);
      expect(x[0]).toBeLessThan(2);
      expect(x[1]).toBeGreaterThan(0);
      expect(x[2]).toBeLessThan(1);
      expect(x[3]).toBe(u);
      const back = toUnbounded(x, spec);
      const dxdu = boundedJacobianDiagonal([u, u, u, u], spec);
      for (let i = 0; i < 4; i++) {
        const tol = 1e-12 * Math.max(1, Math.abs(u)) + (4 * Number.EPSILON * Math.abs(x[i])) / Math.abs(dxdu[i]);
        expect(Math.abs(back[i] - u)).toBeLessThan(tol);
      }
    }
  });

  it("keep precision at both ends of a box", () => {
    // a + (b − a)σ(u) ≈ a + (b − a)e^{u}(1 − e^{u}) as u → −∞, and b − (b − a)e^{−u}(1 − e^{−u})
    // as u → ∞. At the lower end 0 the distance is exact to ulps; at the upper end it is
    // limited by the spacing of doubles near 1 (ε/2 absolute), i.e. ε/e^{−15} ≈ 7e-10 relative.
    const box = { lower: 0, upper: 1 };
    const tail = (u: number): number => Math.exp(-u) * (1 - Math.exp(-u));
    expect(Math.abs(toBoundedScalar(-30, box) / tail(30) - 1)).toBeLessThan(1e-12);
    expect(Math.abs((1 - toBoundedScalar(15, box)) / tail(15) - 1)).toBeLessThan(2 * Number.EPSILON / tail(15));
    expect(toBoundedScalar(30, box)).toBeLessThan(1);
  });

  it("Jacobian diagonal matches central differences", () => {
    // Smooth maps with |d³x/du³| ≤ 1 here, step 1e-5: truncation error ≲ 1e-10.
    const u = [0.3, -1.1, 0.4, 2];
    const d = boundedJacobianDiagonal(u, spec);
    for (let i = 0; i < 4; i++) {
      const up = [...u];
      const dn = [...u];
      up[i] += 1e-5;
      dn[i] -= 1e-5;
      const fd = (toBounded(up, spec)[i] - toBounded(dn, spec)[i]) / 2e-5;
      expect(Math.abs(fd - d[i])).toBeLessThan(1e-9);
    }
  });

  it("reject values on or outside the bounds and malformed specs", () => {
    expect(() => toUnbounded([2, 1, 0, 0], spec)).toThrow(/strictly below its upper bound 2/);
    expect(() => toUnbounded([1, 0, 0, 0], spec)).toThrow(/strictly above its lower bound 0/);
    expect(() => toUnbounded([1, 1], spec)).toThrow(/2 entries but 4 bounds/);
    expect(() => toBounded([0], [{ lower: 1, upper: 1 }])).toThrow(RangeError);
  });
});

describe("bounded minimisation through the transforms", () => {
  // f throws if it is ever evaluated outside the bounds, so staying inside is checked on
  // every call. It is a sum of separable terms with known minimisers:
  //   (x₀ − 1.5)² on (0, 2) → 1.5;  x₁ − 0.3·log x₁ on (0, ∞) → 0.3;
  //   (x₂ + 2)² on (−∞, 1) → −2;    (x₃ − 4)² free → 4.
  const f = (x: Float64Array): number => {
    if (!(x[0] > 0 && x[0] < 2 && x[1] > 0 && x[2] < 1)) throw new Error(`evaluated outside the bounds at ${x}`);
    return (x[0] - 1.5) ** 2 + x[1] - 0.3 * Math.log(x[1]) + (x[2] + 2) ** 2 + (x[3] - 4) ** 2;
  };
  const grad = (x: Float64Array): Float64Array =>
    Float64Array.from([2 * (x[0] - 1.5), 1 - 0.3 / x[1], 2 * (x[2] + 2), 2 * (x[3] - 4)]);
  const truth = [1.5, 0.3, -2, 4];
  const u0 = toUnbounded([0.2, 5, 0.9, 0], spec);

  it.each(["bfgs", "bfgs-analytic", "nelderMead"])("%s stays inside and finds the interior minimum", (method) => {
    const g = unboundedObjective(f, spec);
    const r =
      method === "bfgs"
        ? bfgs(g, u0)
        : method === "bfgs-analytic"
          ? bfgs(g, u0, { gradient: unboundedGradient(grad, spec) })
          : nelderMead(g, u0, { adaptive: true, xTol: 1e-10, fTol: 1e-15, maxEval: 20000, maxIter: 10000 });
    expect(r.converged).toBe(true);
    const x = toBounded(r.x, spec);
    // At the optimum the curvature in u is f''(x)·(dx/du)² ≥ 0.28 (x₀: 2·0.375²), so gTol = 1e-6
    // bounds |Δu| by ~4e-6 and |Δx| = |Δu|·dx/du by ~1.5e-6; 1e-5 is the bound with margin.
    for (let i = 0; i < 4; i++) expect(Math.abs(x[i] - truth[i])).toBeLessThan(1e-5);
  });

  it("a minimum on the boundary is approached from inside", () => {
    // (x₀ − 3)² on (0, 2): the infimum is at the excluded end 2. With x₀ = 2σ(u) the gradient
    // in u is 2(x₀ − 3)·2σ(1 − σ) ≈ −2(2 − x₀) near the end, so gTol = 1e-6 stops at
    // 2 − x₀ ≈ 5e-7.
    const g = unboundedObjective((x) => (x[0] - 3) ** 2, [{ lower: 0, upper: 2 }]);
    const r = bfgs(g, [0]);
    const x0 = toBounded(r.x, [{ lower: 0, upper: 2 }])[0];
    expect(r.converged).toBe(true);
    expect(x0).toBeLessThan(2);
    expect(2 - x0).toBeLessThan(1e-5);
  });
});
