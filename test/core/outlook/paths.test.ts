/**
 * Span averages and crossing chances from simulated paths, checked against closed forms for
 * the naive method, whose paths are a Gaussian random walk from the last rate with step
 * variance σ²: the average of weeks 1..k is normal with mean y_T and variance
 * σ² Σ_i Σ_j min(i, j) / k² = σ² (k + 1)(2k + 1) / (6k) (the covariance of a random walk,
 * Cov(S_i, S_j) = σ² min(i, j), summed; any time-series textbook), and
 * P(y_{T+h} > L) = 1 − Φ((L − y_T) / (σ √h)).
 */
import { analyse } from "../../../src/core/analysis";
import { normalCdf, normalQuantile } from "../../../src/core/math/distributions";
import { OUTLOOK_PATHS } from "../../../src/core/outlook/paths";
import type { ReportTable } from "../../../src/core/report";
import { InputError } from "../../../src/core/series/errors";
import { laneSeries } from "../../engine/lane";

const series = laneSeries(200);
const n = series.values.length;
const yT = series.values[n - 1];

function col(t: ReportTable, name: string): number {
  const i = t.columns.indexOf(name);
  if (i < 0) throw new Error(`no column ${name}`);
  return i;
}

describe("span averages and chances, naive method (Gaussian random walk)", () => {
  const report = analyse(series, {
    method: "lastweek",
    horizon: 4,
    checks: false,
    spans: [{ from: 1, to: 1 }, { from: 1, to: 4 }, { from: 1, to: 13 }],
    thresholds: [
      { level: yT * 1.05, week: 4, direction: "above" },
      { level: yT * 0.97, week: 8, direction: "below" },
      { level: yT, week: 1, direction: "above" },
    ],
  });
  const fitRows = report.tables.fit.rows;
  // The naive method's fit table gives σ, the residual standard deviation of the weekly changes.
  const sigma2 = Number(fitRows.find((r) => r[0] === "sigma")?.[1] ?? NaN) ** 2;

  test("the fit reports σ, which the closed forms need", () => {
    expect(Number.isFinite(sigma2) && sigma2 > 0).toBe(true);
  });

  test("each span's average: mean within 4 Monte Carlo errors of the last rate, bounds within 4 quantile errors of the normal ones", () => {
    const t = report.tables.meanAhead as ReportTable;
    expect(t.rows).toHaveLength(3);
    for (const r of t.rows) {
      const k = Number(r[col(t, "To week")]);
      const sd = Math.sqrt((sigma2 * (k + 1) * (2 * k + 1)) / (6 * k));
      const mean = Number(r[col(t, "Average")]);
      const se = Number(r[col(t, "Std. error")]);
      // The Monte Carlo error the table states is the one the closed form predicts (to 10%).
      expect(se / (sd / Math.sqrt(OUTLOOK_PATHS))).toBeGreaterThan(0.9);
      expect(se / (sd / Math.sqrt(OUTLOOK_PATHS))).toBeLessThan(1.1);
      expect(Math.abs(mean - yT)).toBeLessThan(4 * se);
      // A sample quantile's standard error is √(p(1−p)/N)/φ(z) in units of sd; 4 of them.
      for (const [level, z] of [[80, normalQuantile(0.9)], [95, normalQuantile(0.975)]] as const) {
        const p = (1 - level / 100) / 2;
        const qSe = (Math.sqrt((p * (1 - p)) / OUTLOOK_PATHS) / (Math.exp((-z * z) / 2) / Math.sqrt(2 * Math.PI))) * sd;
        expect(Math.abs(Number(r[col(t, `Low ${level}%`)]) - (yT - z * sd))).toBeLessThan(4 * qSe);
        expect(Math.abs(Number(r[col(t, `High ${level}%`)]) - (yT + z * sd))).toBeLessThan(4 * qSe);
      }
    }
  });

  test("an average's interval is narrower than the average of the weekly bounds", () => {
    const t = report.tables.meanAhead as ReportTable;
    const o = report.tables.outlook;
    const weeklyHigh = o.rows.slice(0, 4).reduce((a, r) => a + Number(r[col(o, "High 80%")]), 0) / 4;
    const weeklyLow = o.rows.slice(0, 4).reduce((a, r) => a + Number(r[col(o, "Low 80%")]), 0) / 4;
    const span = t.rows[1];
    expect(Number(span[col(t, "High 80%")]) - Number(span[col(t, "Low 80%")])).toBeLessThan(0.9 * (weeklyHigh - weeklyLow));
  });

  test("chances within 4 standard errors of 1 − Φ((L − y_T)/(σ√h)), and week ending dates beside them", () => {
    const t = report.tables.chance as ReportTable;
    for (const r of t.rows) {
      const h = Number(r[col(t, "Week ahead")]);
      const level = Number(r[col(t, "Level")]);
      const above = 1 - normalCdf((level - yT) / Math.sqrt(sigma2 * h));
      const want = r[col(t, "Direction")] === "above" ? above : 1 - above;
      const got = Number(r[col(t, "Probability")]);
      const se = Math.sqrt((want * (1 - want)) / OUTLOOK_PATHS);
      expect(Math.abs(got - want)).toBeLessThan(4 * se + 1e-12);
    }
    expect(t.rows[0][col(t, "Week ending")]).toBe(report.tables.outlook.rows[3][1]);
  });

  test("the same inputs give the same figures, bit for bit", () => {
    const again = analyse(series, { method: "lastweek", horizon: 4, checks: false, spans: [{ from: 1, to: 4 }], thresholds: [{ level: yT, week: 2, direction: "above" }] });
    const once = analyse(series, { method: "lastweek", horizon: 4, checks: false, spans: [{ from: 1, to: 4 }], thresholds: [{ level: yT, week: 2, direction: "above" }] });
    expect(again.tables.meanAhead).toEqual(once.tables.meanAhead);
    expect(again.tables.chance).toEqual(once.tables.chance);
  });
});

describe("bad spans and thresholds are refused with a sentence", () => {
  test.each([
    [{ spans: [{ from: 3, to: 2 }] }, /from an earlier week to a later one; got weeks 3 to 2/],
    [{ spans: [{ from: 0, to: 2 }] }, /first week of a span must be a whole number from 1 to 260; got 0/],
    [{ thresholds: [{ level: Number.NaN, week: 2, direction: "above" as const }] }, /level must be a number/],
    [{ thresholds: [{ level: 100, week: 2.5, direction: "above" as const }] }, /week ahead must be a whole number/],
    [{ thresholds: [{ level: 100, week: 2, direction: "sideways" as unknown as "above" }] }, /"above" or "below"; got "sideways"/],
  ])("%j", (options, message) => {
    expect(() => analyse(series, { method: "lastweek", checks: false, ...options })).toThrow(InputError);
    expect(() => analyse(series, { method: "lastweek", checks: false, ...options })).toThrow(message);
  });
});

describe("decomposition", () => {
  test("on log rates the parts multiply back to every rate; one row per week, filled weeks marked", () => {
    const t = analyse(series, { method: "lastweek", checks: false, decompose: true }).tables.decomposition as ReportTable;
    expect(t.rows).toHaveLength(n);
    for (const r of t.rows) {
      const product = Number(r[2]) * Number(r[3]) * Number(r[4]);
      expect(Math.abs(product - Number(r[1]))).toBeLessThan(1e-9 * Number(r[1]));
    }
    expect(t.rows[0][0]).toBe(series.dates[0].toISOString().slice(0, 10));
  });

  test("with a negative value the parts add back to the rate", () => {
    const shifted = { ...series, values: Float64Array.from(series.values, (v, i) => (i === 5 ? -v : v - 1500)) };
    const t = analyse(shifted, { method: "lastweek", checks: false, decompose: true }).tables.decomposition as ReportTable;
    for (const r of t.rows) expect(Math.abs(Number(r[2]) + Number(r[3]) + Number(r[4]) - Number(r[1]))).toBeLessThan(1e-9 * Math.max(1, Math.abs(Number(r[1]))));
    expect(t.notes[0]).toMatch(/trend \+ seasonal \+ remainder/);
  });
});
