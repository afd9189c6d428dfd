/**
 * The BDS test of Brock, Dechert, Scheinkman & LeBaron (1996), "A test for independence based
 * on the correlation dimension", Econometric Reviews 15, 197–235, applied to the residuals of
 * the linear AR(p) null: dependence left after the linear fit is evidence of nonlinearity.
 *
 * For a series x_1..x_N, ε > 0 and the m-histories x_s^m = (x_s, …, x_{s+m−1}), s = 1..N_m with
 * N_m = N − m + 1, the correlation integral is
 *   C_m(ε) = 2/(N_m(N_m − 1)) Σ_{s<t} Π_{j=0}^{m−1} I(|x_{s+j} − x_{t+j}| < ε)   (strict "<"),
 * and under i.i.d. √N_m [C_m(ε) − C_1(ε)^m] → N(0, σ_m²(ε)) with the paper's variance
 *   σ_m² = 4[K^m + 2 Σ_{j=1}^{m−1} K^{m−j}C^{2j} + (m − 1)²C^{2m} − m²K C^{2m−2}],
 * C = C_1(ε) and K = K(ε) = 6/(N(N−1)(N−2)) Σ_{t<s<r} h(x_t, x_s, x_r) over the whole series,
 * h the symmetrised product of two closeness indicators. The statistic is
 * W_m = √N_m [C_m − C_1^m]/σ_m, two-sided normal p-value.
 *
 * Choices (documented, and matched by the reference fixture):
 * - C_1 inside C_1^m is taken on the same N_m points that carry the m-histories' last
 *   coordinates (x_m..x_N), so C_m and C_1^m are estimated on one sample — the correctly sized
 *   form that Kanzler (1999, "Very fast and correctly sized estimation of the BDS statistic")
 *   recommends; C and K in σ_m use all N points.
 * - ε = 1.5 s, s the sample standard deviation (divisor N − 1) of the residuals: for a normal
 *   sample C_1 ≈ P(|Z| < 1.5/√2) ≈ 0.71, the range Kanzler found best sized; `distance` changes
 *   the multiple.
 *
 * Computation. All pairs are visited once, by lag d = t − s. Along one lag the indicators
 * I(s, s+d) form runs; a run of L consecutive close pairs holds L − m + 1 close pairs of
 * m-histories, so one O(N²) pass gives C_m for every m at once. The same pass gives the row
 * sums r_t = Σ_{s≠t} I(s, t), from which Σ_{t<s<r} h = Σ_t r_t(r_t − 1)/6.
 */
import { normalSf } from "../../math/distributions";
import { InputError } from "../../series/errors";
import type { TestResult } from "../types";
import {
  ArOrderOptions, fitAr, nonlinearityVerdict, orderParameters, prepareSeries, PreparedSeries,
} from "./arOrder";

export const DEFAULT_BDS_DISTANCE = 1.5;
export const DEFAULT_BDS_MAX_DIMENSION = 5;

export interface BdsOptions extends ArOrderOptions {
  /** ε as a multiple of the residuals' standard deviation; default 1.5. */
  distance?: number;
  /** Embedding dimensions 2..maxDimension are tested; default 5. */
  maxDimension?: number;
}

export interface BdsStatistics {
  epsilon: number;
  /** Full-sample C_1(ε) and K(ε), the inputs of σ_m. */
  c1: number;
  k: number;
  /** Index m − 2 for dimension m = 2..maxDimension. */
  dimensions: number[];
  cm: Float64Array;
  /** C_1 on the N_m points x_m..x_N. */
  c1Sub: Float64Array;
  sigma: Float64Array;
  z: Float64Array;
  pValue: Float64Array;
}

/** BDS statistics W_m, m = 2..maxDimension, of the series x itself (module comment). */
export function bdsStatistics(x: Float64Array, maxDimension = DEFAULT_BDS_MAX_DIMENSION, distance = DEFAULT_BDS_DISTANCE): BdsStatistics {
  const N = x.length;
  const M = maxDimension;
  if (N < M + 3) throw new Error(`bds: ${N} points are too few for dimension ${M}`);
  let mean = 0;
  for (let i = 0; i < N; i++) mean += x[i];
  mean /= N;
  let ss = 0;
  for (let i = 0; i < N; i++) ss += (x[i] - mean) * (x[i] - mean);
  const epsilon = distance * Math.sqrt(ss / (N - 1));

  const rowSum = new Float64Array(N);
  // runCount[m] = close pairs of m-histories, m = 1..M.
  const runCount = new Float64Array(M + 1);
  // firstClose[s] = close pairs (s, t), t > s, for the first M − 1 points, to restrict C_1.
  const firstClose = new Float64Array(M);
  for (let d = 1; d < N; d++) {
    let run = 0;
    const last = N - d;
    for (let s = 0; s <= last; s++) {
      // Written without Math.abs: a global lookup per pair is slow inside sandboxed contexts.
      const diff = s < last ? x[s] - x[s + d] : epsilon;
      const close = diff < epsilon && diff > -epsilon;
      if (close) {
        run++;
        rowSum[s]++;
        rowSum[s + d]++;
        if (s < M - 1) firstClose[s]++;
      } else if (run > 0) {
        for (let m = 1; m <= M && m <= run; m++) runCount[m] += run - m + 1;
        run = 0;
      }
    }
  }
  const pairs = (k: number): number => (k * (k - 1)) / 2;
  const c1 = runCount[1] / pairs(N);
  let triples = 0;
  for (let t = 0; t < N; t++) triples += rowSum[t] * (rowSum[t] - 1);
  const k = triples / (N * (N - 1) * (N - 2));

  const dimensions: number[] = [];
  const cm = new Float64Array(M - 1);
  const c1Sub = new Float64Array(M - 1);
  const sigma = new Float64Array(M - 1);
  const z = new Float64Array(M - 1);
  const pValue = new Float64Array(M - 1);
  let dropped = 0;
  for (let m = 2; m <= M; m++) {
    const i = m - 2;
    dropped += firstClose[m - 2];
    const Nm = N - m + 1;
    dimensions.push(m);
    cm[i] = runCount[m] / pairs(Nm);
    c1Sub[i] = (runCount[1] - dropped) / pairs(Nm);
    let v = Math.pow(k, m) + (m - 1) * (m - 1) * Math.pow(c1, 2 * m) - m * m * k * Math.pow(c1, 2 * m - 2);
    for (let j = 1; j <= m - 1; j++) v += 2 * Math.pow(k, m - j) * Math.pow(c1, 2 * j);
    sigma[i] = 2 * Math.sqrt(v);
    z[i] = (Math.sqrt(Nm) * (cm[i] - Math.pow(c1Sub[i], m))) / sigma[i];
    pValue[i] = Math.min(1, 2 * normalSf(Math.abs(z[i])));
  }
  return { epsilon, c1, k, dimensions, cm, c1Sub, sigma, z, pValue };
}

export function bdsPrepared(prep: PreparedSeries, options: Pick<BdsOptions, "distance" | "maxDimension"> = {}): TestResult[] {
  const distance = options.distance ?? DEFAULT_BDS_DISTANCE;
  const maxDimension = options.maxDimension ?? DEFAULT_BDS_MAX_DIMENSION;
  if (!(distance > 0 && distance <= 10)) {
    throw new InputError("BAD_OPTION", `The BDS distance is a multiple of the standard deviation between 0 and 10, such as 1.5; got ${distance}.`);
  }
  if (!Number.isInteger(maxDimension) || maxDimension < 2 || maxDimension > 10) {
    throw new InputError("BAD_OPTION", `The largest BDS embedding dimension must be a whole number from 2 to 10; got ${maxDimension}.`);
  }
  const p = prep.order;
  const { fit } = fitAr(prep, p);
  const s = bdsStatistics(fit.residuals, maxDimension, distance);
  if (!(s.c1 > 0 && s.c1 < 1)) {
    throw new InputError("BAD_OPTION", `With distance ${distance} the BDS test finds ${s.c1 === 0 ? "no" : "only"} close pairs of residuals; use a distance nearer 1.5.`);
  }
  return s.dimensions.map((m, i) => ({
    test: `BDS m=${m}`,
    nullHypothesis: "the AR residuals are independent and identically distributed (the linear fit leaves no structure)",
    statistic: s.z[i],
    pValue: s.pValue[i],
    lags: m,
    parameters: {
      ...orderParameters(prep, p), "embedding dimension": m, "epsilon (multiple of sd)": distance,
      "C_m": s.cm[i], "C_1": s.c1Sub[i], observations: fit.n,
    },
    level: prep.level,
    rejected: s.pValue[i] < prep.level,
    verdict: nonlinearityVerdict(`BDS m=${m} z`, s.z[i], s.pValue[i], prep.level),
  }));
}

/** BDS test on the AR residuals, one result per embedding dimension m = 2..maxDimension. */
export function bds(y: ArrayLike<number>, options: BdsOptions = {}): TestResult[] {
  return bdsPrepared(prepareSeries(y, options, "The BDS test"), options);
}
