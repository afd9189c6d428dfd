/**
 * The options a full run uses when the user changes nothing: the pane's Run button and the
 * batch runner's `run` verb start from these, so the same book gives the same results from
 * either. The method is chosen by a one-year rolling-origin backtest, re-estimated every week,
 * 4 weeks ahead, among the candidates the data have weeks enough for (analysis.ts).
 */
import type { AnalysisOptions } from "../analysis";
import { DEFAULT_BACKTEST_HORIZON, DEFAULT_TEST_WEEKS } from "../evaluate/plan";

/** A fresh copy each call, so no caller can change another's defaults. */
export function runDefaults(): AnalysisOptions {
  return {
    method: "auto",
    horizon: 12,
    levels: [80, 95],
    checks: true,
    backtest: { testWeeks: DEFAULT_TEST_WEEKS, horizon: DEFAULT_BACKTEST_HORIZON, modes: ["every"] },
    choose: "mase",
  };
}
