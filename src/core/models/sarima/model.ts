/**
 * A fitted seasonal ARIMA model behind the model interface: forecasts with intervals,
 * simulated paths, updates with and without re-estimation, and the summary table.
 *
 * Forecasts: the filter's last predicted state gives the ARMA forecasts of the differenced,
 * regression-adjusted series; undoing the differences with the observed history and adding
 * the regression gives z-forecasts; the h-step error variance is σ²Σ_{j<h}ψ_j² with ψ the
 * weights of the integrated model θ(B)Θ(B^s)/[φ(B)Φ(B^s)(1 − B)^d(1 − B^s)^D] (Box, Jenkins &
 * Reinsel, 2008, eq. 5.1.16) plus the final state's uncertainty (errorSd), which makes the
 * intervals exact given the parameters even where the gain has not converged (an MA root on
 * the unit circle); the uncertainty of β̂ is not added (common practice). Simulated paths
 * use the ψ-weights alone, exact once the gain has converged. Box-Cox forecasts are
 * back-transformed quantiles: the point is the median on the rate scale unless the
 * bias-adjusted mean is asked for.
 */
import { boxCoxInverse, boxCoxMeanBiasAdjusted, boxCoxTransform } from "../../math/boxcox";
import { normalMultiplier } from "../../math/distributions";
import type { Rng } from "../../math/rng";
import { appendWeeks, checkHorizon, checkLevels } from "../arguments";
import type { FitSummary, Fitted, Forecast, ParameterRow, SearchedStructure, UpdateOptions } from "../types";
import { aiccOf, estimate, evaluate, prepare, unconstrainedFrom, type ArmaCoefficients, type Estimate, type Prepared } from "./estimate";
import { centralHessian } from "../../math/optimise";
import { symmetricInverse } from "../../math/symmetric";
import { adjustedInnovation, armaFilter, logLikAtSigma2 } from "./filter";
import { expandAr, expandMa, multiplyAr, psiWeights } from "./polynomial";
import { orderLabel, regressorColumns, validateSpec, type RegressorSet, type SarimaSpec } from "./spec";
import { calendarRegressors, type CalendarSpec } from "../../series/calendarRegressors";

export interface SarimaFitOptions {
  /** Point forecast as the bias-adjusted mean instead of the median (Box-Cox only). */
  biasAdjust?: boolean;
  /** Sentences from the order search, carried into summary(). */
  notes?: string[];
  /** Every candidate tried by the automatic search, for the summary. */
  candidates?: { structure: string; aicc: number }[];
  /**
   * The calendar the regressors came from: a re-estimation over more weeks builds them again,
   * so an event week first seen in the new weeks joins (as a backtest re-estimated every week
   * sees a strike after its first origin).
   */
  calendar?: CalendarSpec;
}

/** Whether two regressor sets have the same columns (by name). */
function sameColumns(a: RegressorSet | undefined, b: RegressorSet | undefined): boolean {
  return (a?.names ?? []).join("\u0000") === (b?.names ?? []).join("\u0000");
}

export class SarimaFitted implements Fitted {
  readonly method = "sarima" as const;
  readonly n: number;
  readonly aicc: number;
  readonly sigma2: number;
  readonly fitted: Float64Array;
  readonly residuals: Float64Array;
  /** Exact log-likelihood of the differenced (transformed) series. */
  readonly logLik: number;
  /** P_{n+1|n} of the ARMA state, computed on the first forecast. */
  private finalCovariance?: Float64Array;
  private standardErrors?: Float64Array;

  constructor(
    readonly y: Float64Array,
    readonly prep: Prepared,
    readonly est: Estimate,
    private readonly options: SarimaFitOptions = {},
  ) {
    this.n = y.length;
    this.sigma2 = est.sigma2;
    this.logLik = est.logLik;
    this.aicc = aiccOf(est.logLik, est.nobs, prep.spec, est.beta.length);
    // One-step fitted values: z_t − v_t, v the regression-adjusted innovation (first d + sD weeks have none).
    const m = prep.delta.length;
    const lambda = prep.spec.lambda;
    const filter = est.evaluation.filter;
    this.fitted = new Float64Array(this.n).fill(NaN);
    this.residuals = new Float64Array(this.n).fill(NaN);
    for (let t = m; t < this.n; t++) {
      const v = adjustedInnovation(filter, est.beta, t - m);
      const zf = prep.z[t] - v;
      this.fitted[t] = lambda === null ? zf : boxCoxInverse(zf, lambda);
      this.residuals[t] = y[t] - this.fitted[t];
    }
  }

  get spec(): SarimaSpec {
    return this.prep.spec;
  }

  /** Point forecasts and error standard deviations on the model (z) scale. */
  private zForecast(h: number): { point: Float64Array; sd: Float64Array; psi: Float64Array } {
    const { prep, est } = this;
    const { spec, delta } = prep;
    const n = this.n;
    const m = delta.length;
    const beta = est.beta;
    const kb = beta.length;
    const { filter } = est.evaluation;
    const ar = expandAr(est.coefficients.ar, est.coefficients.sar, spec.s);
    const ma = expandMa(est.coefficients.ma, est.coefficients.sma, spec.s);
    // State of the regression-adjusted difference: a_w − Σ β_j a_{x_j}.
    const r = filter.r;
    const a = Float64Array.from(filter.finalState.subarray(0, r));
    for (let j = 0; j < kb; j++) {
      for (let i = 0; i < r; i++) a[i] -= beta[j] * filter.finalState[(j + 1) * r + i];
    }
    const wf = new Float64Array(h);
    for (let s = 0; s < h; s++) {
      wf[s] = a[0];
      const a0 = a[0];
      for (let i = 0; i < r - 1; i++) a[i] = a[i + 1];
      a[r - 1] = 0;
      for (let j = 0; j < ar.length && j < r; j++) if (ar[j] !== 0) a[j] += ar[j] * a0;
    }
    // Undo the differences on u = z − xβ, then add the regression back.
    const hist = new Float64Array(n + h);
    // Regressors of the fitted weeks are in prep; only the future rows are new.
    const future = regressorColumns(prep.regressors, n, n + h);
    const xb = (t: number): number => {
      let s = 0;
      for (let j = 0; j < kb; j++) s += beta[j] * (t < n ? prep.levelX[j][t] : future[j][t - n]);
      return s;
    };
    for (let t = 0; t < n; t++) hist[t] = prep.z[t] - xb(t);
    const point = new Float64Array(h);
    for (let s = 0; s < h; s++) {
      const t = n + s;
      let u = wf[s];
      for (let j = 1; j <= m; j++) if (delta[j - 1] !== 0) u += delta[j - 1] * hist[t - j];
      hist[t] = u;
      point[s] = u + xb(t);
    }
    const psi = psiWeights(multiplyAr(ar, delta), ma, h);
    const sd = this.errorSd(ar, ma, psi, h);
    return { point, sd, psi };
  }

  /**
   * Exact h-step error standard deviations given the data. With P_n the filter's final state
   * covariance, g_j = Z T^{j−1} and c the weights of 1/[(1 − B)^d(1 − B^s)^D], the error of the
   * undifferenced forecast at step h is v_hᵀ(α_n − a_n) + Σ_{k=0}^{h−2} Ψ_k ε_{n+h−1−k} with
   * v_h = Σ_{j=1}^{h} c_{h−j} g_jᵀ, so Var_h = σ²·(v_hᵀ P_n v_h + Σ_{k≤h−2} Ψ_k²). Once the gain
   * has converged this equals σ²Σ_{k<h}Ψ_k²; it differs where the data cannot pin the state
   * down, e.g. a seasonal MA on the unit circle.
   */
  private errorSd(ar: Float64Array, ma: Float64Array, psi: Float64Array, h: number): Float64Array {
    const { prep } = this;
    if (!this.finalCovariance) {
      this.finalCovariance = armaFilter(ar, ma, prep.w, 1, true).finalCovariance as Float64Array;
    }
    const P = this.finalCovariance;
    const r = Math.max(ar.length, ma.length + 1);
    const phi = new Float64Array(r);
    phi.set(ar);
    const c = psiWeights(prep.delta, new Float64Array(0), h);
    const rows: Float64Array[] = [];
    let g = new Float64Array(r);
    g[0] = 1;
    for (let j = 0; j < h; j++) {
      rows.push(g);
      const next = new Float64Array(r);
      let s0 = 0;
      for (let i = 0; i < r; i++) s0 += g[i] * phi[i];
      next[0] = s0;
      for (let k = 1; k < r; k++) next[k] = g[k - 1];
      g = next;
    }
    const sd = new Float64Array(h);
    const v = new Float64Array(r);
    let shocks = 0;
    for (let step = 1; step <= h; step++) {
      v.fill(0);
      for (let j = 1; j <= step; j++) {
        const cj = c[step - j];
        if (cj === 0) continue;
        const row = rows[j - 1];
        for (let i = 0; i < r; i++) v[i] += cj * row[i];
      }
      let quad = 0;
      for (let i = 0; i < r; i++) {
        if (v[i] === 0) continue;
        let s = 0;
        for (let k = 0; k < r; k++) s += P[i * r + k] * v[k];
        quad += v[i] * s;
      }
      if (step >= 2) shocks += psi[step - 2] * psi[step - 2];
      sd[step - 1] = Math.sqrt(this.est.sigma2 * Math.max(quad + shocks, 0));
    }
    return sd;
  }

  forecast(h: number, levels: number[]): Forecast {
    checkHorizon(h);
    checkLevels(levels);
    const { point, sd } = this.zForecast(h);
    const lambda = this.spec.lambda;
    const back = (z: number): number => (lambda === null ? z : boxCoxInverse(z, lambda));
    const out: Forecast = { point: new Float64Array(h), levels: [...levels], lower: [], upper: [] };
    for (let s = 0; s < h; s++) {
      out.point[s] =
        lambda !== null && this.options.biasAdjust
          ? boxCoxMeanBiasAdjusted(point[s], sd[s] * sd[s], lambda)
          : back(point[s]);
    }
    for (const level of levels) {
      const k = normalMultiplier(level);
      const lo = new Float64Array(h);
      const hi = new Float64Array(h);
      for (let s = 0; s < h; s++) {
        lo[s] = back(point[s] - k * sd[s]);
        hi[s] = back(point[s] + k * sd[s]);
      }
      out.lower.push(lo);
      out.upper.push(hi);
    }
    return out;
  }

  simulate(h: number, paths: number, rng: Rng): Float64Array[] {
    checkHorizon(h);
    const { point, psi } = this.zForecast(h);
    const lambda = this.spec.lambda;
    const sigma = Math.sqrt(this.sigma2);
    const out: Float64Array[] = [];
    const e = new Float64Array(h);
    for (let p = 0; p < paths; p++) {
      for (let s = 0; s < h; s++) e[s] = sigma * rng.normal();
      const path = new Float64Array(h);
      for (let s = 0; s < h; s++) {
        let z = point[s];
        for (let j = 0; j <= s; j++) z += psi[j] * e[s - j];
        path[s] = lambda === null ? z : boxCoxInverse(z, lambda);
      }
      out.push(path);
    }
    return out;
  }

  update(newY: Float64Array, options: UpdateOptions): Fitted {
    const y = appendWeeks(this.y, newY, "SARIMA");
    const spec = this.spec;
    const z = spec.lambda === null ? Float64Array.from(y) : boxCoxTransform(y, spec.lambda);
    if (options.reestimate) {
      // β is profiled out of the likelihood, so the ARMA start carries over whatever the columns.
      const grown = this.options.calendar ? calendarRegressors(this.options.calendar, y.length) : spec.extra;
      const prep = prepare(z, sameColumns(grown, spec.extra) ? spec : { ...spec, extra: grown });
      const est = estimate(prep, { start: this.est.x });
      return new SarimaFitted(y, prep, est, this.options);
    }
    const prep = prepare(z, spec);
    // Fixed parameters: filter the longer series with the same coefficients, β and σ².
    const evaluation = evaluate(prep, this.est.coefficients, this.est.beta);
    const est: Estimate = {
      ...this.est,
      nobs: prep.w.length,
      evaluation,
      logLik: logLikAtSigma2(evaluation.filter, evaluation.gls.ssr, this.est.sigma2),
      evaluations: 1,
    };
    return new SarimaFitted(y, prep, est, this.options);
  }

  /** Standard errors of the ARMA coefficients from a central-difference Hessian of −ℓ (β, σ² profiled), computed once. */
  private coefficientErrors(): Float64Array {
    if (!this.standardErrors) this.standardErrors = this.hessianErrors();
    return this.standardErrors;
  }

  private hessianErrors(): Float64Array {
    const c = this.est.coefficients;
    const flat = [...c.ar, ...c.ma, ...c.sar, ...c.sma];
    const k = flat.length;
    const out = new Float64Array(k).fill(NaN);
    if (k === 0) return out;
    const split = (v: number[]): ArmaCoefficients => {
      const s = this.spec;
      let o = 0;
      const take = (m: number): Float64Array => Float64Array.from(v.slice(o, (o += m)));
      return { ar: take(s.p), ma: take(s.q), sar: take(s.P), sma: take(s.Q) };
    };
    const f = (v: number[]): number => {
      try {
        return -evaluate(this.prep, split(v)).gls.logLik;
      } catch {
        return NaN;
      }
    };
    const H = centralHessian((v) => f(Array.from(v)), flat, 1e-4);
    try {
      // At a maximum −ℓ's Hessian is positive definite; Cholesky refuses it otherwise.
      const inv = symmetricInverse(H, k);
      for (let i = 0; i < k; i++) out[i] = inv[i * k + i] > 0 ? Math.sqrt(inv[i * k + i]) : NaN;
    } catch {
      // A flat or curved-the-wrong-way direction: the coefficients are reported without standard errors.
    }
    return out;
  }

  summary(): FitSummary {
    const spec = this.spec;
    const c = this.est.coefficients;
    const se = this.coefficientErrors();
    const parameters: ParameterRow[] = [];
    let i = 0;
    const push = (name: string, vals: Float64Array): void => {
      vals.forEach((v, j) => parameters.push({ name: `${name}${j + 1}`, value: v, se: se[i++] }));
    };
    push("ar", c.ar);
    push("ma", c.ma);
    push("sar", c.sar);
    push("sma", c.sma);
    const names = this.prep.regressors.names;
    const kb = names.length;
    names.forEach((nm, j) =>
      parameters.push({ name: nm, value: this.est.beta[j], se: Math.sqrt(this.est.betaCov[j * kb + j]) }),
    );
    parameters.push({ name: "sigma2", value: this.sigma2 });
    parameters.push({ name: "log-likelihood", value: this.logLik });
    const parts = [orderLabel(spec)];
    if (spec.constant) parts.push(spec.d + spec.D === 0 ? "with mean" : "with drift");
    if (spec.fourier > 0) parts.push(`+ ${spec.fourier} Fourier pair${spec.fourier > 1 ? "s" : ""} (period ${spec.fourierPeriod.toFixed(2)} weeks)`);
    if (spec.extra) parts.push(`+ ${spec.extra.names.length} further regressor${spec.extra.names.length > 1 ? "s" : ""}`);
    if (spec.lambda !== null) parts.push(`on Box-Cox λ = ${spec.lambda.toFixed(3)}`);
    const notes = [...(this.options.notes ?? []), ...this.est.notes];
    notes.push(
      `Exact likelihood of the ${spec.d + spec.D * spec.s > 0 ? "differenced " : ""}series (${this.est.nobs} weeks)` +
        (spec.lambda !== null ? " on the Box-Cox scale; σ² is on that scale." : "."),
    );
    return { method: "sarima", structure: parts.join(" "), parameters, armaDf: spec.p + spec.q + spec.P + spec.Q, notes };
  }

  /** Candidates the automatic search tried, best first. */
  candidates(): { structure: string; aicc: number }[] {
    return [...(this.options.candidates ?? [])].sort((a, b) => a.aicc - b.aicc);
  }

  searched(): SearchedStructure[] {
    return this.candidates().map((c) => ({ structure: c.structure, criterion: "AICc", value: c.aicc }));
  }
}

/** Fit one given structure to rates y (positive where a Box-Cox λ is set). */
export function fitStructure(y: Float64Array, spec: SarimaSpec, options: SarimaFitOptions = {}): SarimaFitted {
  validateSpec(spec);
  const z = spec.lambda === null ? Float64Array.from(y) : boxCoxTransform(y, spec.lambda);
  const prep = prepare(z, spec);
  return new SarimaFitted(y, prep, estimate(prep), options);
}

/**
 * The model at given coefficients, β and σ² (no estimation): for comparing forecasts with a
 * reference at the reference's own estimates, and for restoring a saved model.
 */
export function fittedAt(
  y: Float64Array,
  spec: SarimaSpec,
  coefficients: ArmaCoefficients,
  beta: ArrayLike<number>,
  sigma2: number,
): SarimaFitted {
  validateSpec(spec);
  const z = spec.lambda === null ? Float64Array.from(y) : boxCoxTransform(y, spec.lambda);
  const prep = prepare(z, spec);
  const evaluation = evaluate(prep, coefficients, beta);
  const kb = prep.regressors.names.length;
  const est: Estimate = {
    coefficients,
    x: unconstrainedFrom(coefficients),
    beta: Float64Array.from(beta),
    betaCov: new Float64Array(kb * kb).fill(NaN),
    sigma2,
    logLik: logLikAtSigma2(evaluation.filter, evaluation.gls.ssr, sigma2),
    nobs: prep.w.length,
    evaluation,
    converged: true,
    evaluations: 1,
    notes: ["Coefficients given, not estimated."],
  };
  return new SarimaFitted(y, prep, est);
}
