/**
 * Smooth one-to-one maps between ℝ and the sets a parameter may be confined to, so that an
 * unconstrained optimiser can search ℝⁿ while the model only ever sees admissible values:
 *
 *   box (a, b):      x = a + (b − a)·σ(u),  σ(u) = 1/(1 + e^{−u}),  u = log((x − a)/(b − x))
 *   half-line (a,∞): x = a + e^{u},                               u = log(x − a)
 *   half-line (−∞,b): x = b − e^{u},                              u = log(b − x)
 *   free:            x = u.
 *
 * Near the upper end of a box the map is evaluated as b − (b − a)·σ(−u), so that x keeps its
 * precision as it approaches either end. For very large |u| the value can still round onto the
 * boundary itself; objectives should tolerate that or return a non-finite value there (the
 * optimisers treat non-finite values as +∞).
 */

/** Bounds of one parameter; an omitted or infinite side is unbounded. */
export interface Bound {
  lower?: number;
  upper?: number;
}

type Kind = "free" | "box" | "lower" | "upper";

function kindOf(b: Bound, index: number): Kind {
  const lo = b.lower ?? -Infinity;
  const hi = b.upper ?? Infinity;
  if (Number.isNaN(lo) || Number.isNaN(hi)) throw new RangeError(`bound ${index + 1} has a NaN end`);
  const hasLo = Number.isFinite(lo);
  const hasHi = Number.isFinite(hi);
  if (hasLo && hasHi) {
    if (!(lo < hi)) throw new RangeError(`bound ${index + 1}: lower ${lo} must be below upper ${hi}`);
    return "box";
  }
  if (lo === Infinity || hi === -Infinity) throw new RangeError(`bound ${index + 1} is empty`);
  if (hasLo) return "lower";
  if (hasHi) return "upper";
  return "free";
}

/** Logistic σ(u) without overflow for large |u|. */
function logistic(u: number): number {
  if (u >= 0) return 1 / (1 + Math.exp(-u));
  const e = Math.exp(u);
  return e / (1 + e);
}

function checkLength(v: ArrayLike<number>, spec: readonly Bound[]): void {
  if (v.length !== spec.length) {
    throw new RangeError(`parameter vector has ${v.length} entries but ${spec.length} bounds were given`);
  }
}

/** Map one unbounded value to its bounded parameter. */
export function toBoundedScalar(u: number, b: Bound, index = 0): number {
  switch (kindOf(b, index)) {
    case "box": {
      const lo = b.lower as number;
      const hi = b.upper as number;
      return u <= 0 ? lo + (hi - lo) * logistic(u) : hi - (hi - lo) * logistic(-u);
    }
    case "lower":
      return (b.lower as number) + Math.exp(u);
    case "upper":
      return (b.upper as number) - Math.exp(u);
    default:
      return u;
  }
}

/** Map one admissible parameter to ℝ; a value on or outside its bounds is a RangeError. */
export function toUnboundedScalar(x: number, b: Bound, index = 0): number {
  const kind = kindOf(b, index);
  if (!Number.isFinite(x)) throw new RangeError(`parameter ${index + 1} is not finite (${x})`);
  const lo = b.lower ?? -Infinity;
  const hi = b.upper ?? Infinity;
  if ((kind === "box" || kind === "lower") && !(x > lo)) {
    throw new RangeError(`parameter ${index + 1} = ${x} must lie strictly above its lower bound ${lo}`);
  }
  if ((kind === "box" || kind === "upper") && !(x < hi)) {
    throw new RangeError(`parameter ${index + 1} = ${x} must lie strictly below its upper bound ${hi}`);
  }
  switch (kind) {
    case "box":
      // log((x − a)/(b − x)), written as a difference of logs to keep precision at both ends.
      return Math.log(x - lo) - Math.log(hi - x);
    case "lower":
      return Math.log(x - lo);
    case "upper":
      return Math.log(hi - x);
    default:
      return x;
  }
}

/** dx/du at u: the chain-rule factor for carrying a gradient from x to u. */
export function boundedDerivativeScalar(u: number, b: Bound, index = 0): number {
  switch (kindOf(b, index)) {
    case "box": {
      const s = logistic(u);
      return ((b.upper as number) - (b.lower as number)) * s * (1 - s);
    }
    case "lower":
      return Math.exp(u);
    case "upper":
      return -Math.exp(u);
    default:
      return 1;
  }
}

/** Vectorised toBoundedScalar. */
export function toBounded(u: ArrayLike<number>, spec: readonly Bound[]): Float64Array {
  checkLength(u, spec);
  const x = new Float64Array(u.length);
  for (let i = 0; i < u.length; i++) x[i] = toBoundedScalar(u[i], spec[i], i);
  return x;
}

/** Vectorised toUnboundedScalar. */
export function toUnbounded(x: ArrayLike<number>, spec: readonly Bound[]): Float64Array {
  checkLength(x, spec);
  const u = new Float64Array(x.length);
  for (let i = 0; i < x.length; i++) u[i] = toUnboundedScalar(x[i], spec[i], i);
  return u;
}

/** Diagonal of the Jacobian dx/du (the map acts coordinate by coordinate). */
export function boundedJacobianDiagonal(u: ArrayLike<number>, spec: readonly Bound[]): Float64Array {
  checkLength(u, spec);
  const d = new Float64Array(u.length);
  for (let i = 0; i < u.length; i++) d[i] = boundedDerivativeScalar(u[i], spec[i], i);
  return d;
}

/** f(x) as a function of the unbounded u, for handing to an optimiser. */
export function unboundedObjective(
  f: (x: Float64Array) => number,
  spec: readonly Bound[],
): (u: Float64Array) => number {
  return (u) => f(toBounded(u, spec));
}

/** ∇_u f = ∇_x f ⊙ dx/du, for an analytic gradient given in x. */
export function unboundedGradient(
  grad: (x: Float64Array) => Float64Array,
  spec: readonly Bound[],
): (u: Float64Array) => Float64Array {
  return (u) => {
    const gx = grad(toBounded(u, spec));
    const d = boundedJacobianDiagonal(u, spec);
    const gu = new Float64Array(u.length);
    for (let i = 0; i < u.length; i++) gu[i] = gx[i] * d[i];
    return gu;
  };
}
