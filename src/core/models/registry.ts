/**
 * The model registry: method code → model. A new model is one folder plus one line here.
 * Codes from DESIGN.md that are not registered yet are refused with a sentence that lists
 * what this version offers, never silently replaced by another method.
 */
import { InputError } from "../series/errors";
import { combination } from "./combination";
import { drift, lastWeek, lastYear } from "./naive";
import { nnar } from "./nnar";
import { sarima } from "./sarima";
import { tbats } from "./tbats";
import type { MethodCode, ModelSpec } from "./types";

const MODELS: Partial<Record<MethodCode, ModelSpec>> = {
  lastweek: lastWeek,
  lastyear: lastYear,
  drift: drift,
  sarima: sarima as ModelSpec,
  nnar: nnar as ModelSpec,
  tbats: tbats as ModelSpec,
  // The combination reads this table when it is fitted, so members registered here are found.
  combo: combination(() => MODELS) as ModelSpec,
};

export function availableMethods(): MethodCode[] {
  return Object.keys(MODELS) as MethodCode[];
}

export function getModel(code: string): ModelSpec {
  const key = code.trim().toLowerCase() as MethodCode;
  const model = MODELS[key];
  if (!model) {
    throw new InputError(
      "BAD_OPTION",
      `The method "${code}" is not available; choose one of: ${availableMethods().join(", ")}.`,
    );
  }
  return model;
}
