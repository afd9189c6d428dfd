/**
 * The model interface (contract in DESIGN.md). Backtests, combinations and every sink use
 * only this; a new model is one folder plus one line in registry.ts.
 */
import type { Rng } from "../math/rng";
import type { ReportTable } from "../report";

/**
 * The key a backtest scores a calendar-taking method under without its calendar regressors:
 * "<code>:plain" (registry.ts resolves it; analysis.ts adds it when the calendar is on).
 */
export const PLAIN_SUFFIX = ":plain";

/** Method codes from the DESIGN.md vocabulary. */
export type MethodCode = "tbats" | "sarima" | "nnar" | "lastyear" | "lastweek" | "drift" | "combo" | "auto";

/** Point forecasts with central prediction intervals, on the scale of the data. */
export interface Forecast {
  /** Point forecast for steps 1..h. */
  point: Float64Array;
  /** Coverage levels in percent, e.g. [80, 95], in the order of lower/upper. */
  levels: number[];
  /** lower[i][s]: lower bound at levels[i] for step s+1. */
  lower: Float64Array[];
  upper: Float64Array[];
}

export interface ParameterRow {
  name: string;
  value: number;
  /** Standard error when the method provides one. */
  se?: number;
}

export interface FitSummary {
  method: MethodCode;
  /** The chosen structure in words, e.g. "seasonal naive, lag 52". */
  structure: string;
  parameters: ParameterRow[];
  /** ARMA coefficients estimated, which residual portmanteau tests subtract (0 for the baselines). */
  armaDf: number;
  /** Plain sentences: fallbacks taken, assumptions made. */
  notes: string[];
}

/** One structure an automatic search fitted, and its information criterion. */
export interface SearchedStructure {
  structure: string;
  criterion: "AIC" | "AICc";
  value: number;
}

export interface UpdateOptions {
  /** false: filter the new weeks with fixed parameters; true: re-estimate from the previous optimum. */
  reestimate: boolean;
}

export interface Fitted {
  readonly method: MethodCode;
  /** Number of observations the model was fitted to. */
  readonly n: number;
  /** Small-sample corrected AIC of the Gaussian likelihood (NaN where it is not defined). */
  readonly aicc: number;
  /** One-step innovation variance on the data scale (or the transformed scale, as summary() says). */
  readonly sigma2: number;
  /** One-step-ahead in-sample fitted values (NaN where the method has none, e.g. the first season). */
  readonly fitted: Float64Array;
  /** y − fitted, NaN where fitted is NaN. */
  readonly residuals: Float64Array;
  forecast(h: number, levels: number[]): Forecast;
  /** `paths` simulated future sample paths of length h, drawn from the fitted model. */
  simulate(h: number, paths: number, rng: Rng): Float64Array[];
  /** A model for the data extended by `newY` (the weeks after the last one fitted). */
  update(newY: Float64Array, options: UpdateOptions): Fitted;
  summary(): FitSummary;
  /** Structures the automatic search fitted, best first (absent for methods without a search). */
  searched?(): SearchedStructure[];
  /** Seasonal factors by ISO week from the model's own seasonal part, for dated weeks (TBATS). */
  weekFactorTable?(dates: Date[]): ReportTable;
}

export interface ModelSpec<O = Record<string, unknown>> {
  code: MethodCode;
  /** The name shown to users. */
  label: string;
  /** Fewest observations the method needs with these options. */
  minLength(options?: O): number;
  fit(y: Float64Array, options?: O): Fitted;
}
