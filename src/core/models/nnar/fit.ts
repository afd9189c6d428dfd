/**
 * The NNAR model behind the model interface (types.ts): a seasonal neural-network
 * autoregression NNAR(p, P, k)[52] after Hyndman & Athanasopoulos, Forecasting: Principles and
 * Practice, "Neural network autoregression" — lags 1..p and 52·1..52·P of the (optionally
 * Box-Cox transformed, always centred and scaled) series into k logistic hidden units and a
 * linear output, averaged over `repeats` networks. The pieces are in network.ts (one network,
 * its penalised error and gradient), ensemble.ts (training, recursion, paths), options.ts and
 * settings.ts (defaults and checks).
 *
 * Scales. y is the data, x = g(y) the Box-Cox transform (x = y without one), z = (x − x̄)/s_x
 * what the networks see. fitted and residuals are on the data scale (residual = y − fitted);
 * sigma2 and the bootstrap errors are on the x scale, as summary() says.
 */
import { quantileSorted } from "../../math/quantile";
import { MersenneTwister, Rng } from "../../math/rng";
import { InputError } from "../../series/errors";
import { appendWeeks, checkHorizon, checkLevels } from "../arguments";
import type { FitSummary, Fitted, Forecast, MethodCode, ModelSpec, UpdateOptions } from "../types";
import {
  Ensemble,
  TrainingRecord,
  derivedSeeds,
  ensembleFitted,
  pointPath,
  samplePaths,
  startingWeights,
  train,
} from "./ensemble";
import { weightCount } from "./network";
import { NnarOptions, SEASON, minLength } from "./options";
import { NnarSettings, Scaling, buildDesign, resolve, scaled, toDataScale, toTransformed } from "./settings";

/** "1–11 and 52", "1, 2 and 52, 104": runs of consecutive lags as ranges. */
function describeLags(lags: number[]): string {
  const parts: string[] = [];
  let start = lags[0];
  for (let i = 1; i <= lags.length; i++) {
    if (i < lags.length && lags[i] === lags[i - 1] + 1) continue;
    const end = lags[i - 1];
    parts.push(end === start ? `${start}` : end === start + 1 ? `${start}, ${end}` : `${start}–${end}`);
    start = lags[i];
  }
  return parts.length === 1 ? parts[0] : `${parts.slice(0, -1).join(", ")} and ${parts[parts.length - 1]}`;
}

/** Everything a fit carries forward into update(). */
interface State {
  settings: NnarSettings;
  y: Float64Array;
  x: Float64Array;
  scaling: Scaling;
  ensemble: Ensemble;
  record: TrainingRecord;
  notes: string[];
}

class NnarFit implements Fitted {
  readonly method: MethodCode = "nnar";
  readonly n: number;
  readonly aicc = NaN; // no likelihood: the networks are fitted by penalised least squares
  readonly sigma2: number;
  readonly fitted: Float64Array;
  readonly residuals: Float64Array;
  private readonly z: Float64Array;
  /** Centred one-step residuals on the z scale, the bootstrap's errors. */
  private readonly errors: Float64Array;

  constructor(private readonly s: State) {
    const { settings, y, x, scaling, ensemble } = s;
    this.n = y.length;
    this.z = scaled(x, scaling);
    const data = buildDesign(this.z, settings.lags, settings.maxLag);
    const zHat = ensembleFitted(ensemble, data);
    this.fitted = new Float64Array(this.n).fill(NaN);
    this.residuals = new Float64Array(this.n).fill(NaN);
    const m = data.rows;
    const ex = new Float64Array(m);
    let ss = 0;
    let mean = 0;
    for (let r = 0; r < m; r++) {
      const t = settings.maxLag + r;
      const xHat = scaling.mean + scaling.sd * zHat[r];
      ex[r] = x[t] - xHat;
      ss += ex[r] * ex[r];
      mean += ex[r];
      this.fitted[t] = toDataScale(xHat, settings.lambda);
      this.residuals[t] = y[t] - this.fitted[t];
    }
    mean /= m;
    this.sigma2 = ss / m;
    this.errors = new Float64Array(m);
    for (let r = 0; r < m; r++) this.errors[r] = (ex[r] - mean) / scaling.sd;
  }

  private toData(zv: number): number {
    return toDataScale(this.s.scaling.mean + this.s.scaling.sd * zv, this.s.settings.lambda);
  }

  forecast(h: number, levels: number[]): Forecast {
    checkHorizon(h);
    checkLevels(levels);
    const e = this.s.ensemble;
    const zPoint = pointPath(e, this.z, h);
    const point = new Float64Array(h);
    for (let s = 0; s < h; s++) point[s] = this.toData(zPoint[s]);
    const lower = levels.map(() => new Float64Array(h));
    const upper = levels.map(() => new Float64Array(h));
    if (levels.length > 0) {
      // Deterministic: the paths' generator is seeded from the model seed on every call.
      const rng = new MersenneTwister(derivedSeeds(this.s.settings.seed, 0).forecast);
      const paths = samplePaths(e, this.z, h, this.s.settings.paths, this.errors, rng);
      const column = new Float64Array(paths.length);
      for (let s = 0; s < h; s++) {
        for (let j = 0; j < paths.length; j++) column[j] = paths[j][s];
        column.sort();
        levels.forEach((l, i) => {
          const tail = (1 - l / 100) / 2;
          // Quantiles on the z scale, then back-transformed (g⁻¹ is increasing).
          lower[i][s] = this.toData(quantileSorted(column, tail));
          upper[i][s] = this.toData(quantileSorted(column, 1 - tail));
        });
      }
    }
    return { point, levels: [...levels], lower, upper };
  }

  simulate(h: number, paths: number, rng: Rng): Float64Array[] {
    checkHorizon(h);
    if (!Number.isInteger(paths) || paths < 1) {
      throw new InputError("BAD_OPTION", `The number of simulated paths must be a whole number of at least 1; got ${paths}.`);
    }
    const out = samplePaths(this.s.ensemble, this.z, h, paths, this.errors, rng);
    for (const path of out) for (let s = 0; s < h; s++) path[s] = this.toData(path[s]);
    return out;
  }

  update(newY: Float64Array, options: UpdateOptions): NnarFit {
    const { settings, scaling } = this.s;
    const y = appendWeeks(this.s.y, newY, "NNAR");
    const n = y.length;
    const x = new Float64Array(n);
    x.set(this.s.x);
    x.set(toTransformed(newY, settings.lambda), this.n);
    const notes = [...this.s.notes];
    let { ensemble, record } = this.s;
    if (options.reestimate) {
      // Warm start: each network from its previous weights, with the lags, λ and scaling kept so
      // that those weights still mean what they meant.
      const data = buildDesign(scaled(x, scaling), settings.lags, settings.maxLag);
      const t = train(data, ensemble.shape, settings.decay, ensemble.weights, settings.repeats, settings.refitIter);
      ensemble = { ...ensemble, weights: t.weights };
      record = t.record;
      notes.push(`Re-estimated on ${n} weeks from the previous weights (up to ${settings.refitIter} iterations); lags, λ and scaling kept from the first fit.`);
    } else if (newY.length > 0) {
      notes.push(`Extended by ${newY.length} week(s) with the weights and scaling of the fit to ${this.n} weeks.`);
    }
    return new NnarFit({ settings, y, x, scaling, ensemble, record, notes });
  }

  /** What the networks were given and learnt (copies), for inspection and tests. */
  internals(): { weights: Float64Array; weightsPerNetwork: number; lags: number[]; hidden: number; mean: number; sd: number; lambda: number | null } {
    const e = this.s.ensemble;
    return {
      weights: Float64Array.from(e.weights),
      weightsPerNetwork: weightCount(e.shape),
      lags: [...e.lags],
      hidden: e.shape.hidden,
      mean: this.s.scaling.mean,
      sd: this.s.scaling.sd,
      lambda: this.s.settings.lambda,
    };
  }

  summary(): FitSummary {
    const { settings: st, record } = this.s;
    const plural = (m: number, word: string): string => `${m} ${word}${m === 1 ? "" : "s"}`;
    const structure =
      `NNAR(${st.p},${st.P},${st.size})[${SEASON}]: the rates ${describeLags(st.lags)} weeks back feed ` +
      `${plural(st.size, "hidden unit")}, averaged over ${plural(st.repeats, "network")}`;
    const W = weightCount(this.s.ensemble.shape);
    const notes = [
      ...this.s.notes,
      `Weight decay ${st.decay} on the connection weights (biases not penalised), on the sum of squared errors of the scaled series.`,
      `sigma2 is the mean squared one-step residual on the ${st.lambda === null ? "data" : "Box-Cox"} scale; there is no likelihood, so AICc is not defined.`,
      `Intervals: ${st.paths} simulated paths with errors resampled from the in-sample residuals; bounds are sample quantiles (Hyndman & Fan definition 7). The point forecast is the recursive forecast without errors${st.lambda === null ? "" : ", back-transformed without a bias adjustment (so nearer a median than a mean on the data scale)"}.`,
    ];
    if (record.converged < st.repeats) {
      notes.push(`${st.repeats - record.converged} of ${st.repeats} networks stopped at the ${st.maxIter}-iteration limit of the optimiser (early stopping is usual for these networks).`);
    }
    if (record.stuck > 0) notes.push(`${record.stuck} network(s) could not be trained and kept their starting weights.`);
    return {
      method: "nnar",
      structure,
      parameters: [
        { name: "p (recent weeks)", value: st.p },
        { name: "P (seasonal lags)", value: st.P },
        { name: "k (hidden units)", value: st.size },
        { name: "decay", value: st.decay },
        // λ = 1 is y − 1, which the centring removes: the same fit as no transform.
        { name: "Box-Cox lambda (1 = none)", value: st.lambda ?? 1 },
        { name: "networks", value: st.repeats },
        { name: "weights per network", value: W },
        { name: `sigma (${st.lambda === null ? "data" : "Box-Cox"} scale)`, value: Math.sqrt(this.sigma2) },
      ],
      armaDf: 0,
      notes,
    };
  }
}

/** Fits NNAR to weekly rates y; see NnarOptions for the settings and their defaults. */
export function fitNnar(y: ArrayLike<number>, options?: NnarOptions): NnarFit {
  const r = resolve(y, options);
  const st = r.settings;
  const shape = { inputs: st.lags.length, hidden: st.size };
  const data = buildDesign(scaled(r.x, r.scaling), st.lags, st.maxLag);
  const starts = startingWeights(shape, derivedSeeds(st.seed, st.repeats).networks);
  const t = train(data, shape, st.decay, starts, st.repeats, st.maxIter);
  const ensemble: Ensemble = { shape, lags: st.lags, maxLag: st.maxLag, repeats: st.repeats, weights: t.weights };
  return new NnarFit({ settings: st, y: r.y, x: r.x, scaling: r.scaling, ensemble, record: t.record, notes: r.notes });
}

export type { NnarFit };

export const nnar: ModelSpec<NnarOptions> = {
  code: "nnar",
  label: "Neural network autoregression (NNAR)",
  minLength: (options?: NnarOptions) => minLength(options ?? {}),
  fit: (y: Float64Array, options?: NnarOptions) => fitNnar(y, options),
};
