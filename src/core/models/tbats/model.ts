/**
 * A fitted TBATS model behind the model interface: forecasts with intervals from the
 * state-space variance recursion, simulated paths, updates with and without re-estimation,
 * and the seasonal component for factor tables.
 *
 * h-step forecast on the transformed scale (De Livera et al., 2011, §3.2, the standard
 * innovations state-space results of Hyndman et al., 2008, ch. 6):
 *   ẑ_{n+h} = wᵀF^{h−1}x_n,  Var = σ²(1 + Σ_{j=1}^{h−1} c_j²),  c_j = wᵀF^{j−1}g,
 * both by repeated application of the O(state) transition (filter.ts `advance`). Bounds are
 * back-transformed quantiles; the point is the back-transformed median, or with `biasAdjust`
 * the bias-adjusted mean (math/boxcox.ts).
 */
import { boxCoxInverse, boxCoxMeanBiasAdjusted } from "../../math/boxcox";
import { normalMultiplier } from "../../math/distributions";
import type { Rng } from "../../math/rng";
import { appendWeeks, checkHorizon, checkLevels } from "../arguments";
import type { ReportTable } from "../../report";
import type { RegressorSet } from "../sarima/spec";
import { calendarRegressors, type CalendarSpec } from "../../series/calendarRegressors";
import type { FitSummary, Fitted, Forecast, ParameterRow, SearchedStructure, UpdateOptions } from "../types";
import { tbatsWeekFactors } from "./factors";
import { advance, filterPass, predictFrom, type FilterPass } from "./filter";
import { estimate, namedParameters, Objective, parameterCount, prepare, standardErrors, transformInto, type Regressors } from "./estimate";
import { layoutOf, structureLabel, structureWords, type StateLayout, type TbatsParameters, type TbatsStructure } from "./structure";

export interface TbatsCandidate {
  structure: string;
  aic: number;
}

export interface TbatsFitOptions {
  /** Point forecasts as bias-adjusted means on the rate scale (Box-Cox only). */
  biasAdjust?: boolean;
  /** Sentences from the structure search, carried into summary(). */
  notes?: string[];
  /** Every candidate the search fitted. */
  candidates?: TbatsCandidate[];
  /** Whether the optimiser met its tolerances (a note otherwise). */
  converged?: boolean;
  /** Calendar regressors by week index (0 = the first fitted week), on the transformed scale. */
  regressors?: RegressorSet;
  /**
   * The calendar the regressors came from: a re-estimation over more weeks builds them again,
   * so an event week first seen in the new weeks joins (a backtest re-estimated every week).
   */
  calendar?: CalendarSpec;
}

/** The regressors' values over weeks 0 … n − 1, by column. */
export function regressorColumns(set: RegressorSet, n: number): Regressors {
  const m = set.names.length;
  const columns = new Float64Array(m * n);
  const row = new Float64Array(m);
  for (let t = 0; t < n; t++) {
    set.at(t, row);
    for (let j = 0; j < m; j++) columns[j * n + t] = row[j];
  }
  return { count: m, columns };
}

/** Gaussian log-likelihood of y with seeds and σ² at their estimates, Jacobian included. */
export function logLikelihood(sse: number, n: number, lambda: number | null, sumLogY: number): number {
  const sigma2 = sse / n;
  return -0.5 * n * (Math.log(2 * Math.PI * sigma2) + 1) + (lambda === null ? 0 : (lambda - 1) * sumLogY);
}

/** Parameters counted by the information criteria: free parameters, seed states and σ². */
export function informationCount(s: TbatsStructure): number {
  return parameterCount(s) + layoutOf(s).seedCount + 1;
}

export class TbatsFitted implements Fitted {
  readonly method = "tbats" as const;
  readonly n: number;
  readonly aic: number;
  readonly aicc: number;
  /** One-step error variance on the transformed scale. */
  readonly sigma2: number;
  readonly logLik: number;
  readonly fitted: Float64Array;
  readonly residuals: Float64Array;
  readonly layout: StateLayout;
  /** Transformed series and the filter's record over it. */
  readonly z: Float64Array;
  readonly pass: FilterPass;
  /** Regressor coefficients β (empty without regressors) and βᵀu_t over the fitted weeks. */
  readonly coef: Float64Array;
  readonly effect: Float64Array;
  private readonly regressorCount: number;
  /** The regressors over the fitted weeks, built once (for βᵀu and the standard errors). */
  private readonly data: Regressors | null;
  private errorCache?: Map<string, number>;
  private coefErrorCache?: Float64Array;

  constructor(
    readonly y: Float64Array,
    readonly structure: TbatsStructure,
    readonly par: TbatsParameters,
    readonly seed: Float64Array,
    readonly options: TbatsFitOptions = {},
    /** σ² to keep (an update without re-estimation); estimated from the errors when absent. */
    sigma2?: number,
    /** Coefficients of options.regressors (required with them). */
    coef?: Float64Array,
  ) {
    const n = y.length;
    this.n = n;
    this.layout = layoutOf(structure);
    const prep = prepare(y);
    this.z = new Float64Array(n);
    transformInto(prep, par.lambda, this.z);
    const set = options.regressors;
    this.regressorCount = set ? set.names.length : 0;
    if (set && (!coef || coef.length !== this.regressorCount)) throw new Error("TbatsFitted: regressors need one coefficient each");
    this.coef = set && coef ? Float64Array.from(coef) : new Float64Array(0);
    this.effect = new Float64Array(n);
    this.data = set ? regressorColumns(set, n) : null;
    const adjusted = Float64Array.from(this.z);
    if (this.data) {
      const cols = this.data.columns;
      for (let j = 0; j < this.regressorCount; j++) {
        const b = this.coef[j];
        for (let t = 0; t < n; t++) this.effect[t] += b * cols[j * n + t];
      }
      for (let t = 0; t < n; t++) adjusted[t] -= this.effect[t];
    }
    this.pass = filterPass(this.layout, par, adjusted, seed);
    let sse = 0;
    for (let t = 0; t < n; t++) sse += this.pass.errors[t] * this.pass.errors[t];
    this.sigma2 = sigma2 ?? sse / n;
    this.logLik = logLikelihood(sse, n, par.lambda, prep.sumLogY);
    const k = informationCount(structure) + this.regressorCount;
    this.aic = -2 * this.logLik + 2 * k;
    this.aicc = n - k - 1 > 0 ? this.aic + (2 * k * (k + 1)) / (n - k - 1) : NaN;
    this.fitted = new Float64Array(n);
    this.residuals = new Float64Array(n);
    for (let t = 0; t < n; t++) {
      this.fitted[t] = this.back(this.pass.predictions[t] + this.effect[t]);
      this.residuals[t] = y[t] - this.fitted[t];
    }
  }

  /** βᵀu_t at week index t (0 = the first fitted week; t ≥ n are forecast weeks). */
  private effectAt(t: number): number {
    const set = this.options.regressors;
    if (!set) return 0;
    const row = new Float64Array(this.regressorCount);
    set.at(t, row);
    let v = 0;
    for (let j = 0; j < row.length; j++) v += this.coef[j] * row[j];
    return v;
  }

  /** Inverse transform; below the transform's range (1 + λz < 0) the rate's limit is 0. */
  private back(z: number): number {
    const lam = this.par.lambda;
    if (lam === null) return z;
    const v = boxCoxInverse(z, lam);
    return Number.isNaN(v) ? 0 : v;
  }

  /** Point forecasts on the transformed scale and the weights c_j, for steps 1..h. */
  private paths(h: number): { mean: Float64Array; variance: Float64Array } {
    const L = this.layout;
    const x = Float64Array.from(this.pass.state);
    const mean = new Float64Array(h);
    for (let s = 0; s < h; s++) {
      mean[s] = predictFrom(L, this.par, x) + this.effectAt(this.n + s);
      advance(L, this.par, x, 0);
    }
    // u_j = F^{j−1} g, starting from g = F·0 + g·1.
    const u = new Float64Array(L.size);
    advance(L, this.par, u, 1);
    const variance = new Float64Array(h);
    let acc = 1;
    for (let s = 0; s < h; s++) {
      variance[s] = this.sigma2 * acc;
      const c = predictFrom(L, this.par, u);
      acc += c * c;
      advance(L, this.par, u, 0);
    }
    return { mean, variance };
  }

  forecast(h: number, levels: number[]): Forecast {
    checkHorizon(h);
    checkLevels(levels);
    const { mean, variance } = this.paths(h);
    const lam = this.par.lambda;
    const out: Forecast = { point: new Float64Array(h), levels: [...levels], lower: [], upper: [] };
    for (let s = 0; s < h; s++) {
      out.point[s] = lam !== null && this.options.biasAdjust ? boxCoxMeanBiasAdjusted(mean[s], variance[s], lam) : this.back(mean[s]);
    }
    for (const level of levels) {
      const k = normalMultiplier(level);
      const lo = new Float64Array(h);
      const hi = new Float64Array(h);
      for (let s = 0; s < h; s++) {
        const sd = Math.sqrt(variance[s]);
        lo[s] = this.back(mean[s] - k * sd);
        hi[s] = this.back(mean[s] + k * sd);
      }
      out.lower.push(lo);
      out.upper.push(hi);
    }
    return out;
  }

  simulate(h: number, paths: number, rng: Rng): Float64Array[] {
    checkHorizon(h);
    const L = this.layout;
    const sd = Math.sqrt(this.sigma2);
    const x = new Float64Array(L.size);
    const out: Float64Array[] = [];
    const ahead = new Float64Array(h);
    for (let s = 0; s < h; s++) ahead[s] = this.effectAt(this.n + s);
    for (let p = 0; p < paths; p++) {
      x.set(this.pass.state);
      const path = new Float64Array(h);
      for (let s = 0; s < h; s++) {
        const eps = sd * rng.normal();
        path[s] = this.back(predictFrom(L, this.par, x) + ahead[s] + eps);
        advance(L, this.par, x, eps);
      }
      out.push(path);
    }
    return out;
  }

  update(newY: Float64Array, options: UpdateOptions): Fitted {
    const y = appendWeeks(this.y, newY, "tbats");
    if (!options.reestimate) {
      // Same parameters and seeds, filtered over the longer series; σ² kept as estimated.
      return new TbatsFitted(y, this.structure, this.par, this.seed, { ...this.options, candidates: [] }, this.sigma2, this.coef);
    }
    const grown = this.options.calendar ? calendarRegressors(this.options.calendar, y.length) : this.options.regressors;
    const { regressors: _old, ...rest } = this.options;
    return fitTbatsStructure(y, this.structure, { ...rest, ...(grown ? { regressors: grown } : {}), start: this.par, fixedLambda: this.par.lambda, candidates: [] });
  }

  /**
   * The seasonal component on the transformed scale: in-sample (the value in week t's
   * prediction, Σ s_{j,t−1}) followed by `ahead` future weeks, where the seasonal states only
   * rotate. Level likewise, for turning the component into factors on the rate scale.
   */
  components(ahead = 0): { seasonal: Float64Array; level: Float64Array } {
    const L = this.layout;
    const n = this.n;
    const seasonal = new Float64Array(n + ahead);
    const level = new Float64Array(n + ahead);
    seasonal.set(this.pass.seasonal);
    level.set(this.pass.level);
    const x = Float64Array.from(this.pass.state);
    for (let s = 0; s < ahead; s++) {
      let v = 0;
      for (let j = 0; j < L.harmonicCount; j++) v += x[L.sIndex[j]];
      seasonal[n + s] = v;
      level[n + s] = x[0];
      advance(L, this.par, x, 0);
    }
    return { seasonal, level };
  }

  summary(): FitSummary {
    const s = this.structure;
    const p = this.par;
    const se = this.parameterErrors();
    const parameters: ParameterRow[] = namedParameters(p, s).map((q) => {
      const e = se.get(q.name);
      return e !== undefined && Number.isFinite(e) ? { name: q.name, value: q.value, se: e } : { name: q.name, value: q.value };
    });
    if (!s.boxCox && p.lambda !== null) parameters.unshift({ name: "lambda", value: p.lambda });
    const set = this.options.regressors;
    if (set) {
      const ce = this.coefficientErrors();
      set.names.forEach((name, j) => parameters.push(Number.isFinite(ce[j]) ? { name, value: this.coef[j], se: ce[j] } : { name, value: this.coef[j] }));
    }
    parameters.push({ name: "sigma2", value: this.sigma2 });
    parameters.push({ name: "log-likelihood", value: this.logLik });
    parameters.push({ name: "AIC", value: this.aic });
    const notes = [...(this.options.notes ?? [])];
    notes.push(
      `TBATS with ${structureWords(s)}; ${this.layout.seedCount} seed states estimated by regression.` +
        (p.lambda !== null ? " σ² is on the Box-Cox scale." : ""),
    );
    if (set) {
      notes.push(
        `${set.names.length} calendar regressor${set.names.length > 1 ? "s" : ""} (${set.names.join(", ")}) estimated with the seed states` +
          (p.lambda === null
            ? ", in the rates' own units"
            : Math.abs(p.lambda) < 5e-4
              ? " on the log scale (a coefficient of −0.10 is about 10% below the rate expected otherwise)"
              : ` on the Box-Cox scale (λ = ${p.lambda.toFixed(3)})`) +
          "; their standard errors take the smoothing parameters as known.",
      );
    }
    if (this.options.converged === false) notes.push("The optimiser stopped at its evaluation budget before meeting its tolerances; the fit is the best point it found.");
    const m = set ? set.names.length : 0;
    const label = structureLabel(s, p) + (m > 0 ? ` + ${m} calendar regressor${m > 1 ? "s" : ""}` : "");
    return { method: "tbats", structure: label, parameters, armaDf: s.p + s.q, notes };
  }

  /** Standard errors by parameter name (computed once, on first use; NaN where not defined). */
  parameterErrors(): Map<string, number> {
    if (!this.errorCache) this.errorCache = standardErrors(this.y, this.structure, this.par, this.data);
    return this.errorCache;
  }

  /**
   * Standard errors of β given the other parameters: σ̂²·[(XᵀX)⁻¹]_jj of the regression that
   * concentrates the seeds and β (filter.ts), σ̂² = SSE/n; NaN where the regression is singular.
   * Computed once, on first use (summary() is called by every table that names the model).
   */
  private coefficientErrors(): Float64Array {
    if (this.coefErrorCache) return this.coefErrorCache;
    const data = this.data;
    if (!data) return new Float64Array(0);
    const obj = new Objective(prepare(this.y), this.structure, data);
    const sse = obj.sse(this.par);
    const out = new Float64Array(data.count).fill(NaN);
    if (sse > 0) {
      const diag = obj.reg.coefficientInverseDiagonal();
      for (let j = 0; j < data.count; j++) out[j] = Math.sqrt((sse / this.n) * diag[j]);
    }
    this.coefErrorCache = out;
    return out;
  }

  /** Candidates the structure search fitted, best first. */
  candidates(): TbatsCandidate[] {
    return [...(this.options.candidates ?? [])].sort((a, b) => a.aic - b.aic);
  }

  searched(): SearchedStructure[] {
    return this.candidates().map((c) => ({ structure: c.structure, criterion: "AIC", value: c.aic }));
  }

  weekFactorTable(dates: Date[]): ReportTable {
    return tbatsWeekFactors(this, dates).table;
  }
}

export interface StructureFitOptions extends TbatsFitOptions {
  /** Warm start. */
  start?: TbatsParameters;
  /** λ when the structure has no Box-Cox estimate: a fixed transform (default none). */
  fixedLambda?: number | null;
  /** Starting λ for an estimated transform (default 0.5). */
  startLambda?: number | null;
  maxEval?: number;
}

/** Fit one given structure to positive rates y. */
export function fitTbatsStructure(y: Float64Array, structure: TbatsStructure, options: StructureFitOptions = {}): TbatsFitted {
  const prep = prepare(y);
  const est = estimate(prep, structure, options.fixedLambda ?? null, options.startLambda ?? null, {
    start: options.start,
    maxEval: options.maxEval,
    regressors: options.regressors ? regressorColumns(options.regressors, y.length) : null,
  });
  const { start: _s, fixedLambda: _f, startLambda: _l, maxEval: _m, ...fitOptions } = options;
  return new TbatsFitted(y, structure, est.par, est.seed, { ...fitOptions, converged: est.converged }, undefined, est.coef);
}
