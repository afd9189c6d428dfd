/** NNAR, the seasonal neural-network autoregression (fit.ts has the model's description). */
export { fitNnar, nnar } from "./fit";
export type { NnarFit } from "./fit";
export type { NnarOptions } from "./options";
export { DEFAULT_DECAY, DEFAULT_MAX_ITER, DEFAULT_REFIT_ITER, DEFAULT_PATHS, DEFAULT_REPEATS, DEFAULT_SEED, MIN_TRAINING_WEEKS, minLength } from "./options";
