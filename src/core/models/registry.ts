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
import { PLAIN_SUFFIX, type MethodCode, type ModelSpec } from "./types";

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

/**
 * A backtest compares a method taking calendar regressors with the same method without them
 * under the key "<code>:plain" (analysis.ts adds it when the calendar is on): the same model,
 * fitted with no calendar options, labelled so the tables tell the two apart.
 */
export { PLAIN_SUFFIX };
const plainVariants = new Map<string, ModelSpec>();

export function plainKey(code: string): string {
  return `${code}${PLAIN_SUFFIX}`;
}

export function isPlainKey(code: string): boolean {
  return code.trim().toLowerCase().endsWith(PLAIN_SUFFIX);
}

export function getModel(code: string): ModelSpec {
  if (isPlainKey(code)) {
    const base = code.trim().toLowerCase().slice(0, -PLAIN_SUFFIX.length);
    let spec = plainVariants.get(base);
    if (!spec) {
      const model = getModel(base);
      spec = { ...model, label: `${model.label} without calendar effects` };
      plainVariants.set(base, spec);
    }
    return spec;
  }
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
