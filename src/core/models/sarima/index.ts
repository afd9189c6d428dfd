/**
 * Seasonal ARIMA behind the model interface: `sarima` in the registry. With no options the
 * structure is chosen automatically (auto.ts); `structure` holds parts of it fixed.
 */
import type { ModelSpec } from "../types";
import { autoSarima, sarimaMinLength, type SarimaOptions } from "./auto";

export const sarima: ModelSpec<SarimaOptions> = {
  code: "sarima",
  label: "Seasonal ARIMA",
  minLength: (options?: SarimaOptions) => sarimaMinLength(options),
  fit: (y: Float64Array, options?: SarimaOptions) => autoSarima(y, options),
};

export { autoSarima, chooseD, chooseSeasonalD, sarimaMinLength } from "./auto";
export type { SarimaOptions, SeasonalityMode } from "./auto";
export { SarimaFitted, fitStructure, fittedAt } from "./model";
export { defaultSpec, orderLabel } from "./spec";
export type { RegressorSet, SarimaOrder, SarimaSpec } from "./spec";
