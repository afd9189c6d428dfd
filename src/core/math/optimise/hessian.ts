/**
 * Central-difference Hessian of f at x (Nocedal & Wright, 2006, eqs. 8.7 and 8.9 in central
 * form): ∂²f/∂xᵢ² ≈ (f(x + hᵢeᵢ) − 2f(x) + f(x − hᵢeᵢ))/hᵢ², and the mixed terms from the four
 * points x ± hᵢeᵢ ± hⱼeⱼ. For the observed information of a likelihood at its maximum, where
 * only the lower triangle is evaluated and mirrored. Non-finite values pass through.
 */
import type { Objective } from "./nelderMead";

/** `step`: one step for every coordinate, or one per coordinate. */
export function centralHessian(f: Objective, x: ArrayLike<number>, step: number | ArrayLike<number>): Float64Array {
  const k = x.length;
  const h = (i: number): number => (typeof step === "number" ? step : step[i]);
  const base = Float64Array.from(x);
  const at = (i: number, a: number, j: number, b: number): number => {
    const v = Float64Array.from(base);
    v[i] += a;
    v[j] += b;
    return f(v);
  };
  const f0 = f(Float64Array.from(base));
  const H = new Float64Array(k * k);
  for (let i = 0; i < k; i++) {
    const hi = h(i);
    for (let j = 0; j <= i; j++) {
      const hj = h(j);
      const val =
        i === j
          ? (at(i, hi, i, 0) - 2 * f0 + at(i, -hi, i, 0)) / (hi * hi)
          : (at(i, hi, j, hj) - at(i, hi, j, -hj) - at(i, -hi, j, hj) + at(i, -hi, j, -hj)) / (4 * hi * hj);
      H[i * k + j] = val;
      H[j * k + i] = val;
    }
  }
  return H;
}
