/**
 * Forecast combinations: `combo` in the registry. A combination is itself a model behind the
 * model interface (types.ts) and uses only that interface on its members. fit.ts has the
 * combined forecasts and intervals, members.ts the members, their holdout scores and weights,
 * options.ts the settings and their defaults.
 */
export { CombinationFit, combination, fitCombination } from "./fit";
export type { CombinationUpdateOptions } from "./fit";
export { allotPaths, holdoutMse, inverseMseWeights } from "./members";
export {
  DEFAULT_HOLDOUT_HORIZON,
  DEFAULT_HOLDOUT_WEEKS,
  DEFAULT_MEMBERS,
  DEFAULT_PATHS,
  DEFAULT_SEED,
  FALLBACK_BASELINES,
  MIN_HOLDOUT_WEEKS,
  checkCombination,
  combinationMinLength,
} from "./options";
export type { CombinationOptions, CombinationRule, IntervalMethod, ModelTable } from "./options";
