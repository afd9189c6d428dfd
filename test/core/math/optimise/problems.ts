/** Test problems with known minimisers, shared by the optimiser tests. */

/** Rosenbrock (1960) function Σ 100(x_{i+1} − x_i²)² + (1 − x_i)²; minimum 0 at (1, …, 1). */
export function rosenbrock(x: Float64Array): number {
  let s = 0;
  for (let i = 0; i + 1 < x.length; i++) s += 100 * (x[i + 1] - x[i] * x[i]) ** 2 + (1 - x[i]) ** 2;
  return s;
}

/** Its gradient, differentiated by hand. */
export function rosenbrockGradient(x: Float64Array): Float64Array {
  const g = new Float64Array(x.length);
  for (let i = 0; i + 1 < x.length; i++) {
    const t = x[i + 1] - x[i] * x[i];
    g[i] += -400 * x[i] * t - 2 * (1 - x[i]);
    g[i + 1] += 200 * t;
  }
  return g;
}

/** Largest coordinate distance from (1, …, 1). */
export function distanceFromOnes(x: Float64Array): number {
  let m = 0;
  for (const v of x) m = Math.max(m, Math.abs(v - 1));
  return m;
}

/**
 * f(x) = x₀ − log x₀ + 3x₁ − log x₁ + x₀x₁/2, NaN for x ≤ 0 (Math.log of a negative). From
 * ∇f = 0: x₁ = 1/(3 + x₀/2) and x₀² + 6x₀ − 6 = 0, so x₀ = √15 − 3.
 */
export function logBarrier(x: Float64Array): number {
  return x[0] - Math.log(x[0]) + 3 * x[1] - Math.log(x[1]) + 0.5 * x[0] * x[1];
}
export const logBarrierMin = [Math.sqrt(15) - 3, 1 / (3 + (Math.sqrt(15) - 3) / 2)];

/** Counts how often the wrapped function returned a non-finite value. */
export function countNonFinite(f: (x: Float64Array) => number): { f: (x: Float64Array) => number; count: () => number } {
  let n = 0;
  return {
    f: (x) => {
      const v = f(x);
      if (!Number.isFinite(v)) n++;
      return v;
    },
    count: () => n,
  };
}
