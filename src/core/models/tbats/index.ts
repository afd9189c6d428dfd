/** TBATS (De Livera, Hyndman & Snyder, 2011): structure.ts has the model, auto.ts the search. */
import type { ModelSpec } from "../types";
import { autoTbats, tbatsMinLength, type TbatsOptions } from "./auto";

export const tbats: ModelSpec<TbatsOptions> = {
  code: "tbats",
  label: "TBATS",
  minLength: (options?: TbatsOptions) => tbatsMinLength(options),
  fit: (y: Float64Array, options?: TbatsOptions) => autoTbats(y, options),
};

export { autoTbats, tbatsMinLength, TBATS_MIN_WEEKS } from "./auto";
export type { TbatsOptions } from "./auto";
export { TbatsFitted, fitTbatsStructure } from "./model";
export type { TbatsCandidate } from "./model";
export { layoutOf, structureLabel } from "./structure";
export type { TbatsParameters, TbatsStructure } from "./structure";
export { seasonalEffects, tbatsWeekFactors } from "./factors";
export type { TbatsFactors } from "./factors";
