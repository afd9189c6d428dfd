/**
 * The track record against a hand computation: a log of two publishes (origins 2026-11-27 and
 * 2026-12-04) and the two weeks of rates pasted since. Every expected number below is worked
 * out by hand in its comment from the values in the log and the actuals; the errors follow
 * Hyndman & Athanasopoulos, Forecasting: Principles and Practice (3rd ed.), §5.8: actual minus
 * forecast, MAPE the mean of |100·e/y|.
 */
import type { LogEntry } from "../../../src/core/record/log";
import { actualsOf, trackRecord, type SeriesActuals } from "../../../src/core/record/track";
import { trackSheet } from "../../../src/core/present/trackSheet";
import { MANAGED_MARK } from "../../../src/core/present/stamp";
import { analyse } from "../../../src/core/analysis";
import { laneSeries } from "../../engine/lane";

const LANE = "Corvane–Estmar FEU";
function entry(origin: string, target: string, ahead: number, point: number, inner: [number, number], outer: [number, number], at: string, method = "tbats"): LogEntry {
  return { loggedAt: at, series: LANE, origin, target, ahead, method, point, inner: { level: 80, low: inner[0], high: inner[1] }, outer: { level: 95, low: outer[0], high: outer[1] } };
}

const LOG: LogEntry[] = [
  entry("2026-11-27", "2026-12-04", 1, 100, [95, 105], [90, 110], "2026-11-30T08:00:00Z"),
  entry("2026-11-27", "2026-12-11", 2, 102, [94, 110], [88, 116], "2026-11-30T08:00:00Z"),
  entry("2026-11-27", "2026-12-18", 3, 104, [93, 115], [86, 122], "2026-11-30T08:00:00Z"),
  entry("2026-12-04", "2026-12-11", 1, 95, [91, 99], [89, 101], "2026-12-07T08:00:00Z"),
  entry("2026-12-04", "2026-12-18", 2, 97, [90, 104], [86, 108], "2026-12-07T08:00:00Z"),
];

// The two weeks pasted after the first publish: 104 and 90.
const ACTUALS = new Map<string, SeriesActuals>([
  // A MASE scale of 8 at every origin (the same-week-a-year-earlier error; set by hand here).
  [LANE, { byWeek: new Map([["2026-11-27", 98], ["2026-12-04", 104], ["2026-12-11", 90]]), last: "2026-12-11", scaleAt: () => 8 }],
]);

describe("track record after two pasted weeks", () => {
  const record = trackRecord(LOG, ACTUALS);
  const s = record.series[0];
  const row = (ahead: number | string): (number | string | null)[] => s.summary.rows.find((r) => r[1] === ahead) as (number | string | null)[];

  test("by weeks ahead: counts, mean error, MAE, MAPE and hit rates match the hand computation", () => {
    expect(record.series).toHaveLength(1);
    expect(s.summary.columns).toEqual(["Method", "Weeks ahead", "Forecasts scored", "Awaiting actuals", "Mean error", "Mean absolute error", "MAPE %", "MASE", "Inside 80% interval (%)", "Inside 95% interval (%)"]);
    // 1 week ahead: 12-04 104−100 = +4 (inside 95–105 and 90–110); 12-11 90−95 = −5 (outside 91–99, inside 89–101).
    // Mean error (4 − 5)/2 = −0.5; MAE 4.5; MAPE (4/104 + 5/90)/2·100 = (3.8462 + 5.5556)/2 = 4.7009; hits 1/2, 2/2.
    const h1 = row(1);
    expect(h1.slice(0, 4)).toEqual(["tbats", 1, 2, 0]);
    expect(h1[4]).toBeCloseTo(-0.5, 12);
    expect(h1[5]).toBeCloseTo(4.5, 12);
    expect(h1[6]).toBeCloseTo(((4 / 104 + 5 / 90) / 2) * 100, 10);
    expect(h1[6]).toBeCloseTo(4.7009, 4);
    // MASE (4/8 + 5/8)/2 = 0.5625.
    expect(h1[7]).toBeCloseTo(0.5625, 12);
    expect(h1[8]).toBe(50);
    expect(h1[9]).toBe(100);
    // 2 weeks ahead: 12-11 90−102 = −12 (outside 94–110, inside 88–116); 12-18 not arrived.
    const h2 = row(2);
    expect(h2.slice(0, 4)).toEqual(["tbats", 2, 1, 1]);
    expect(h2[4]).toBe(-12);
    expect(h2[5]).toBe(12);
    expect(h2[6]).toBeCloseTo((12 / 90) * 100, 10);
    expect(h2[7]).toBeCloseTo(12 / 8, 12);
    expect(h2[8]).toBe(0);
    expect(h2[9]).toBe(100);
    // 3 weeks ahead: nothing scored yet, one awaiting; means are blank, not zero.
    expect(row(3)).toEqual(["tbats", 3, 0, 1, null, null, null, null, null, null]);
    // All: errors +4, −5, −12 → mean −13/3, MAE 21/3 = 7; hits 1/3 and 3/3.
    const all = row("All");
    expect(all.slice(0, 4)).toEqual(["tbats", "All", 3, 2]);
    expect(all[4]).toBeCloseTo(-13 / 3, 12);
    expect(all[5]).toBeCloseTo(7, 12);
    // MASE 21/3/8 = 0.875.
    expect(all[7]).toBeCloseTo(0.875, 12);
    expect(all[8]).toBeCloseTo(100 / 3, 10);
    expect(all[9]).toBe(100);
    expect(s.scoredCount).toBe(3);
    expect(s.awaiting).toBe(2);
  });

  test("forecast against outcome: 1 and 3 weeks ahead (4 is not logged, so the longest), latest forecast per target", () => {
    expect(s.outcome.columns).toEqual(["Target week", "Actual", "Forecast 1 week ahead", "Forecast 3 weeks ahead"]);
    expect(s.outcome.rows).toEqual([
      ["2026-12-04", 104, 100, null],
      ["2026-12-11", 90, 95, null],
      ["2026-12-18", null, null, 104],
    ]);
    expect(s.chart?.categories).toEqual(["2026-12-04", "2026-12-11", "2026-12-18"]);
    expect(s.chart?.series.map((x) => x.name)).toEqual(["Actual", "Forecast 1 week ahead", "Forecast 3 weeks ahead"]);
  });

  test("the scored list, newest target first, with yes/no for each interval", () => {
    expect(s.scored.rows.slice(0, 3).map((r) => [r[1], r[2], r[5], r[8], r[9]])).toEqual([
      ["2026-12-18", 2, null, null, null],
      ["2026-12-18", 3, null, null, null],
      ["2026-12-11", 1, 90, "no", "yes"],
    ]);
  });

  test("a re-published origin replaces the earlier forecast; a lane not read is named, not scored", () => {
    const republished = [...LOG, { ...LOG[0], point: 103, loggedAt: "2026-11-30T09:00:00Z" }, { ...LOG[0], series: "Halden–Corvane FEU" }];
    const r = trackRecord(republished, ACTUALS);
    expect(r.superseded).toBe(1);
    expect(r.unread).toEqual(["Halden–Corvane FEU"]);
    // 1 week ahead now: +1 (104−103) and −5 → mean −2.
    expect(r.series[0].summary.rows.find((x) => x[1] === 1)?.[4]).toBeCloseTo(-2, 12);
  });

  test("the MASE scale is the backtest's: last week's rate under two years, the same week a year earlier after", () => {
    const straight = (n: number, slope: number) => {
      const s = laneSeries(n);
      return { ...s, values: Float64Array.from({ length: n }, (_, t) => 100 + slope * t) };
    };
    const run = analyse(laneSeries(60), { method: "lastweek", horizon: 1, checks: false });
    // 60 weeks rising by 2: every week-on-week change is 2, so the scale is 2.
    const short = actualsOf([{ name: LANE, series: straight(60, 2), report: run }]).get(LANE) as SeriesActuals;
    expect(short.scaleAt?.(short.last as string)).toBeCloseTo(2, 12);
    // 120 weeks rising by 1: the same week a year earlier is 52 lower, so the scale is 52.
    const long = actualsOf([{ name: LANE, series: straight(120, 1), report: run }]).get(LANE) as SeriesActuals;
    expect(long.scaleAt?.(long.last as string)).toBeCloseTo(52, 12);
  });

  test("actuals are the observed weeks only: a week the intake filled is not an outcome", () => {
    const series = laneSeries(120);
    const filled = [...series.filled];
    filled[119] = true;
    const a = actualsOf([{ name: LANE, series: { ...series, filled }, report: analyse(series, { method: "lastweek", horizon: 1, checks: false }) }]).get(LANE) as SeriesActuals;
    expect(a.byWeek.size).toBe(119);
    expect(a.last).not.toBeNull();
  });

  test("the sheet: the managed mark, the summary, the outcome with its chart beside it, then the list", () => {
    const sheet = trackSheet(record, {
      version: "0.0.test",
      source: "desk.xlsx › Rates",
      series: [{ name: LANE, first: "2020-01-03", last: "2026-12-11", weeks: 363, method: "TBATS" }],
      options: analyse(laneSeries(120), { method: "lastweek", horizon: 1, checks: false }).options,
      ranAt: "2026-12-14T08:00:00Z",
    });
    expect(sheet.cells[0][0]).toBe(MANAGED_MARK);
    expect(sheet.blocks.map((b) => b.label)).toEqual(["stamp", `${LANE}: trackSummary`, `${LANE}: trackOutcome`, `${LANE}: trackScored`]);
    const outcome = sheet.blocks[2];
    const chart = sheet.charts[0];
    expect(chart.col).toBeGreaterThanOrEqual(outcome.col + outcome.cols);
    expect(sheet.blocks[3].row).toBeGreaterThanOrEqual(chart.row + chart.heightRows);
  });
});
