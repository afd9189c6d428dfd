/** Optimisers on ℝⁿ and the transforms that let them respect parameter bounds. */
export { nelderMead } from "./nelderMead";
export type { NelderMeadOptions, MinimiseResult, Objective } from "./nelderMead";
export { bfgs, forwardGradient, numericalGradient } from "./bfgs";
export { centralHessian } from "./hessian";
export type { BfgsOptions, BfgsResult } from "./bfgs";
export {
  toBounded,
  toUnbounded,
  toBoundedScalar,
  toUnboundedScalar,
  boundedDerivativeScalar,
  boundedJacobianDiagonal,
  unboundedObjective,
  unboundedGradient,
} from "./bounds";
export type { Bound } from "./bounds";
