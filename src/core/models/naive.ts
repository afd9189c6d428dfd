/**
 * The three baselines every model must beat, behind the model interface:
 *   lastweek — naive: the next weeks equal the last observed week (random walk);
 *   lastyear — seasonal naive: each future week equals the same week a year (52 weeks) earlier;
 *   drift    — random walk with drift: the line through the first and last observations.
 * Intervals are Gaussian with the h-step variances of each model's own error process:
 *   naive  Var_h = σ²·h;
 *   seasonal naive Var_h = σ²·(⌊(h−1)/52⌋ + 1) (one new shock per year elapsed);
 *   drift  Var_h = σ²·h + h²·Var(ĉ), Var(ĉ) = σ²/(n−1), since ĉ is the mean of n−1 differences
 *          and the forecast error is Σ shocks + h(c − ĉ).
 * σ² is the mean squared residual with the degrees of freedom of the estimated drift removed.
 */
import { normalMultiplier } from "../math/distributions";
import type { Rng } from "../math/rng";
import { WEEKS_PER_YEAR } from "../series/calendar";
import { appendWeeks, checkHorizon, checkLevels } from "./arguments";
import type { FitSummary, Fitted, Forecast, MethodCode, ModelSpec, ParameterRow, UpdateOptions } from "./types";

type Kind = "lastweek" | "lastyear" | "drift";

interface BaselineParams {
  lag: number;
  drift: number;
  sigma2: number;
  /** Residual count behind sigma2 (and the drift), for Var(ĉ). */
  m: number;
}

function estimate(kind: Kind, y: Float64Array): BaselineParams {
  const lag = kind === "lastyear" ? WEEKS_PER_YEAR : 1;
  const n = y.length;
  const m = n - lag;
  let drift = 0;
  if (kind === "drift") drift = (y[n - 1] - y[0]) / (n - 1);
  let ss = 0;
  for (let t = lag; t < n; t++) {
    const e = y[t] - y[t - lag] - drift;
    ss += e * e;
  }
  const dof = m - (kind === "drift" ? 1 : 0);
  return { lag, drift, sigma2: ss / dof, m };
}

class BaselineFit implements Fitted {
  readonly method: MethodCode;
  readonly n: number;
  readonly aicc: number;
  readonly sigma2: number;
  readonly fitted: Float64Array;
  readonly residuals: Float64Array;

  constructor(
    private readonly kind: Kind,
    private readonly y: Float64Array,
    private readonly p: BaselineParams,
  ) {
    this.method = kind;
    this.n = y.length;
    this.sigma2 = p.sigma2;
    const { lag, drift } = p;
    this.fitted = new Float64Array(this.n).fill(NaN);
    this.residuals = new Float64Array(this.n).fill(NaN);
    let ssMl = 0;
    for (let t = lag; t < this.n; t++) {
      this.fitted[t] = y[t - lag] + drift;
      this.residuals[t] = y[t] - this.fitted[t];
      ssMl += this.residuals[t] ** 2;
    }
    // Gaussian likelihood of the residuals at the ML variance; k counts σ² and the drift.
    const m = this.n - lag;
    const k = kind === "drift" ? 2 : 1;
    const logLik = -0.5 * m * (Math.log((2 * Math.PI * ssMl) / m) + 1);
    this.aicc = m - k - 1 > 0 ? -2 * logLik + 2 * k + (2 * k * (k + 1)) / (m - k - 1) : NaN;
  }

  /** Point forecast and variance at step s (1-based). */
  private step(s: number): { point: number; variance: number } {
    const { y, p, n } = this;
    if (this.kind === "lastyear") {
      const back = p.lag - ((s - 1) % p.lag);
      const years = Math.floor((s - 1) / p.lag) + 1;
      return { point: y[n - back], variance: p.sigma2 * years };
    }
    if (this.kind === "drift") {
      return { point: y[n - 1] + s * p.drift, variance: p.sigma2 * s + (s * s * p.sigma2) / p.m };
    }
    return { point: y[n - 1], variance: p.sigma2 * s };
  }

  forecast(h: number, levels: number[]): Forecast {
    checkHorizon(h);
    checkLevels(levels);
    const z = levels.map(normalMultiplier);
    const point = new Float64Array(h);
    const lower = levels.map(() => new Float64Array(h));
    const upper = levels.map(() => new Float64Array(h));
    for (let s = 1; s <= h; s++) {
      const { point: f, variance } = this.step(s);
      point[s - 1] = f;
      const sd = Math.sqrt(variance);
      for (let i = 0; i < z.length; i++) {
        lower[i][s - 1] = f - z[i] * sd;
        upper[i][s - 1] = f + z[i] * sd;
      }
    }
    return { point, levels: [...levels], lower, upper };
  }

  simulate(h: number, paths: number, rng: Rng): Float64Array[] {
    checkHorizon(h);
    const { y, p, n } = this;
    const sd = Math.sqrt(p.sigma2);
    const out: Float64Array[] = [];
    for (let j = 0; j < paths; j++) {
      // Each path draws its own drift so that simulated spread matches Var_h above.
      const c = this.kind === "drift" ? p.drift + Math.sqrt(p.sigma2 / p.m) * rng.normal() : 0;
      const path = new Float64Array(h);
      for (let s = 0; s < h; s++) {
        const prev = s - p.lag >= 0 ? path[s - p.lag] : y[n + s - p.lag];
        path[s] = prev + c + sd * rng.normal();
      }
      out.push(path);
    }
    return out;
  }

  update(newY: Float64Array, options: UpdateOptions): Fitted {
    const y = appendWeeks(this.y, newY, "The baseline");
    return new BaselineFit(this.kind, y, options.reestimate ? estimate(this.kind, y) : this.p);
  }

  summary(): FitSummary {
    const words: Record<Kind, string> = {
      lastweek: "last week's rate carried forward (naive)",
      lastyear: `the same week a year earlier (seasonal naive, lag ${this.p.lag})`,
      drift: "last week's rate plus the average weekly change (drift)",
    };
    const parameters: ParameterRow[] = [{ name: "sigma", value: Math.sqrt(this.p.sigma2) }];
    if (this.kind === "drift") {
      parameters.unshift({ name: "drift per week", value: this.p.drift, se: Math.sqrt(this.p.sigma2 / this.p.m) });
    }
    return { method: this.kind, structure: words[this.kind], parameters, armaDf: 0, notes: [] };
  }
}

function baseline(kind: Kind, label: string): ModelSpec {
  const minLength = (): number => (kind === "lastyear" ? WEEKS_PER_YEAR + 2 : 3);
  return {
    code: kind,
    label,
    minLength,
    fit(y: Float64Array): Fitted {
      if (y.length < minLength()) {
        throw new RangeError(`${label} needs at least ${minLength()} weeks, got ${y.length}`);
      }
      for (let i = 0; i < y.length; i++) {
        if (!Number.isFinite(y[i])) throw new RangeError(`${label} needs finite values; week ${i + 1} is ${y[i]}`);
      }
      return new BaselineFit(kind, Float64Array.from(y), estimate(kind, y));
    },
  };
}

export const lastWeek = baseline("lastweek", "Last week");
export const lastYear = baseline("lastyear", "Same week last year");
export const drift = baseline("drift", "Drift");
