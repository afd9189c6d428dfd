/**
 * Nonlinearity checks on a weekly rate series: Keenan, Tsay, Teräsvirta, BDS and McLeod–Li,
 * each against the same linear AR(p) null, p chosen once by AIC (see arOrder.ts) unless given.
 */
import type { ReportTable } from "../../report";
import { isInputError } from "../../series/errors";
import { testTable, TestResult } from "../types";
import { ArOrderOptions, prepareSeries } from "./arOrder";
import { bdsPrepared, DEFAULT_BDS_DISTANCE } from "./bds";
import { keenanPrepared } from "./keenan";
import { mcleodLiPrepared } from "./mcleodLi";
import { terasvirtaPrepared } from "./terasvirta";
import { tsayPrepared } from "./tsay";

export * from "./arOrder";
export * from "./bds";
export * from "./keenan";
export * from "./mcleodLi";
export * from "./terasvirta";
export * from "./tsay";

export interface NonlinearityOptions extends ArOrderOptions {
  /** BDS ε as a multiple of the residual standard deviation; default 1.5. */
  distance?: number;
  /** BDS embedding dimensions 2..maxDimension; default 5. */
  maxDimension?: number;
  /** McLeod–Li lags; default min(20, ⌊N/4⌋). */
  lags?: number;
}

/**
 * Every nonlinearity test as one report table, one row per test (one per BDS dimension).
 * Input errors are thrown; a test that fails internally (e.g. collinear lags) is left out
 * and named in the notes, so the other rows still reach the sheet.
 */
export function nonlinearitySummary(y: ArrayLike<number>, options: NonlinearityOptions = {}): ReportTable {
  const prep = prepareSeries(y, options, "The nonlinearity checks");
  const rows: TestResult[] = [];
  const notes: string[] = [
    prep.chosenBy === "AIC"
      ? `Linear null: AR(${prep.order}) with a constant, order chosen by AIC over 1..${prep.maxOrder} on a common sample.`
      : `Linear null: AR(${prep.order}) with a constant, order as given.`,
  ];
  const runs: [string, () => TestResult[]][] = [
    ["Keenan", () => [keenanPrepared(prep)]],
    ["Tsay", () => [tsayPrepared(prep)]],
    ["Teräsvirta", () => [terasvirtaPrepared(prep)]],
    ["BDS", () => bdsPrepared(prep, options)],
    ["McLeod–Li", () => [mcleodLiPrepared(prep, options)]],
  ];
  for (const [name, run] of runs) {
    try {
      rows.push(...run());
    } catch (e) {
      if (isInputError(e) && e.code === "BAD_OPTION") throw e;
      notes.push(
        isInputError(e)
          ? `${name} left out: ${e.message}`
          : `${name} left out: its regression is degenerate for these rates (too few distinct values or an exact pattern).`,
      );
    }
  }
  notes.push(
    `BDS uses the AR residuals with epsilon = ${options.distance ?? DEFAULT_BDS_DISTANCE} standard deviations; ` +
      "all p-values are asymptotic.",
  );
  return testTable("Nonlinearity checks", rows, notes);
}
