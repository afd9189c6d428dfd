/**
 * Scores of backtest runs: accuracy per method × refit mode × window × horizon (metrics.ts),
 * and Diebold–Mariano tests of each method against the most accurate one per horizon.
 */
import { coverage, mape, mase, maseScale, rmse, smape, winkler } from "./metrics";
import { dieboldMariano } from "./dieboldMariano";
import type { BacktestPlan, BacktestRun, RefitMode } from "./backtest";

export interface HorizonScore {
  method: string;
  label: string;
  mode: RefitMode;
  /** Window index, or −1 for all windows pooled. */
  window: number;
  h: number;
  /** Forecast–actual pairs scored. */
  count: number;
  mape: number;
  smape: number;
  mase: number;
  rmse: number;
  mse: number;
  /** Per level, in the order of plan.levels. */
  coverage: number[];
  winkler: number[];
}

/** Actuals, forecasts and bounds of one run at step h (1-based), over its origins. */
export function stepSeries(y: Float64Array, run: BacktestRun, h: number): { actual: Float64Array; point: Float64Array; lower: Float64Array[]; upper: Float64Array[] } {
  const m = run.origins.length;
  const actual = new Float64Array(m);
  const point = new Float64Array(m);
  const L = run.lower.length;
  const lower = Array.from({ length: L }, () => new Float64Array(m));
  const upper = Array.from({ length: L }, () => new Float64Array(m));
  for (let i = 0; i < m; i++) {
    const target = run.origins[i] + h - 1;
    actual[i] = target < y.length ? y[target] : NaN;
    point[i] = run.point[i][h - 1];
    for (let l = 0; l < L; l++) {
      lower[l][i] = run.lower[l][i][h - 1];
      upper[l][i] = run.upper[l][i][h - 1];
    }
  }
  return { actual, point, lower, upper };
}

function scoreSeries(
  s: { actual: Float64Array; point: Float64Array; lower: Float64Array[]; upper: Float64Array[] },
  scale: number,
  levels: number[],
): Omit<HorizonScore, "method" | "label" | "mode" | "window" | "h"> {
  let count = 0;
  let ss = 0;
  for (let i = 0; i < s.actual.length; i++) {
    const e = s.actual[i] - s.point[i];
    if (Number.isFinite(e)) {
      count++;
      ss += e * e;
    }
  }
  return {
    count,
    mape: mape(s.actual, s.point),
    smape: smape(s.actual, s.point),
    mase: mase(s.actual, s.point, scale),
    rmse: rmse(s.actual, s.point),
    mse: count > 0 ? ss / count : NaN,
    coverage: levels.map((_, l) => coverage(s.actual, s.lower[l], s.upper[l])),
    winkler: levels.map((lev, l) => winkler(s.actual, s.lower[l], s.upper[l], lev)),
  };
}

/** The MASE scale of a window: the in-sample seasonal-naive (or naive) MAE before its first origin. */
export function windowScale(y: Float64Array, plan: BacktestPlan, window: number): number {
  return maseScale(y.subarray(0, plan.windows[window].first)).scale;
}

function concat(parts: Float64Array[]): Float64Array {
  const out = new Float64Array(parts.reduce((a, p) => a + p.length, 0));
  let at = 0;
  for (const p of parts) {
    out.set(p, at);
    at += p.length;
  }
  return out;
}

/**
 * Scores per window and, with more than one window, pooled over windows (MASE then uses each
 * window's own scale on its own errors: the pooled MASE is the mean of |e|/scale over all pairs).
 */
export function scoreRuns(y: Float64Array, plan: BacktestPlan, runs: BacktestRun[]): HorizonScore[] {
  const out: HorizonScore[] = [];
  const keys = new Map<string, BacktestRun[]>();
  for (const r of runs) {
    const k = `${r.method}|${String(r.mode)}`;
    if (!keys.has(k)) keys.set(k, []);
    (keys.get(k) as BacktestRun[]).push(r);
  }
  for (const group of keys.values()) {
    group.sort((a, b) => a.window - b.window);
    for (let h = 1; h <= plan.horizon; h++) {
      const scaled: { s: ReturnType<typeof stepSeries>; scale: number }[] = [];
      for (const r of group) {
        const s = stepSeries(y, r, h);
        const scale = windowScale(y, plan, r.window);
        scaled.push({ s, scale });
        out.push({ method: r.method, label: r.label, mode: r.mode, window: r.window, h, ...scoreSeries(s, scale, plan.levels) });
      }
      if (group.length > 1) {
        // Pool: divide each window's values by its own scale for MASE by scoring scaled copies.
        const pooled = {
          actual: concat(scaled.map((x) => x.s.actual)),
          point: concat(scaled.map((x) => x.s.point)),
          lower: plan.levels.map((_, l) => concat(scaled.map((x) => x.s.lower[l]))),
          upper: plan.levels.map((_, l) => concat(scaled.map((x) => x.s.upper[l]))),
        };
        const sc = scoreSeries(pooled, 1, plan.levels);
        let sum = 0;
        let cnt = 0;
        for (const x of scaled) {
          for (let i = 0; i < x.s.actual.length; i++) {
            const e = Math.abs(x.s.actual[i] - x.s.point[i]) / x.scale;
            if (Number.isFinite(e)) {
              sum += e;
              cnt++;
            }
          }
        }
        sc.mase = cnt > 0 ? sum / cnt : NaN;
        out.push({ method: group[0].method, label: group[0].label, mode: group[0].mode, window: -1, h, ...sc });
      }
    }
  }
  return out;
}

export interface DmRow {
  mode: RefitMode;
  h: number;
  method: string;
  label: string;
  best: string;
  bestLabel: string;
  mse: number;
  bestMse: number;
  statistic: number;
  pValue: number;
  n: number;
}

/**
 * Per refit mode and horizon: the method with the lowest MSE over all windows is the best,
 * and every other method is tested against it with the HLN-corrected Diebold–Mariano test on
 * squared errors, two-sided (errors aligned by origin, windows in order).
 */
export function dmAgainstBest(y: Float64Array, plan: BacktestPlan, runs: BacktestRun[]): DmRow[] {
  const rows: DmRow[] = [];
  for (const mode of plan.modes) {
    const byMethod = new Map<string, BacktestRun[]>();
    for (const r of runs) {
      if (r.mode !== mode) continue;
      if (!byMethod.has(r.method)) byMethod.set(r.method, []);
      (byMethod.get(r.method) as BacktestRun[]).push(r);
    }
    for (let h = 1; h <= plan.horizon; h++) {
      const errors = new Map<string, { e: Float64Array; mse: number; label: string }>();
      for (const [method, rs] of byMethod) {
        rs.sort((a, b) => a.window - b.window);
        const parts = rs.map((r) => {
          const s = stepSeries(y, r, h);
          return s.actual.map((a, i) => a - s.point[i]);
        });
        const e = concat(parts);
        let ss = 0;
        let c = 0;
        for (const v of e) {
          if (Number.isFinite(v)) {
            ss += v * v;
            c++;
          }
        }
        errors.set(method, { e, mse: c > 0 ? ss / c : NaN, label: rs[0].label });
      }
      let best: string | null = null;
      for (const [m, v] of errors) if (Number.isFinite(v.mse) && (best === null || v.mse < (errors.get(best) as { mse: number }).mse)) best = m;
      if (best === null) continue;
      const b = errors.get(best) as { e: Float64Array; mse: number; label: string };
      for (const [m, v] of errors) {
        if (m === best) continue;
        let statistic = NaN;
        let pValue = NaN;
        let n = 0;
        try {
          const r = dieboldMariano(v.e, b.e, { horizon: h });
          statistic = r.statistic;
          pValue = r.pValue;
          n = r.n;
        } catch {
          // Too few aligned pairs for this horizon: left empty.
        }
        rows.push({ mode, h, method: m, label: v.label, best, bestLabel: b.label, mse: v.mse, bestMse: b.mse, statistic, pValue, n });
      }
    }
  }
  return rows;
}

/** The method with the lowest mean over horizons of a metric (pooled windows), for one mode. */
export function bestBy(scores: HorizonScore[], mode: RefitMode, metric: "mase" | "mape" | "rmse" | "smape", windows: number): string | null {
  const pick = scores.filter((s) => s.mode === mode && s.window === (windows > 1 ? -1 : 0));
  const means = new Map<string, { sum: number; c: number }>();
  for (const s of pick) {
    const v = s[metric];
    if (!Number.isFinite(v)) continue;
    const m = means.get(s.method) ?? { sum: 0, c: 0 };
    m.sum += v;
    m.c++;
    means.set(s.method, m);
  }
  let best: string | null = null;
  let bestV = Infinity;
  for (const [method, { sum, c }] of means) {
    const v = sum / c;
    if (v < bestV) {
      bestV = v;
      best = method;
    }
  }
  return best;
}
