/**
 * analyse() with the backtest kept to the first k weeks (options.backtestThrough), which the
 * pane's refresh uses: the backtest tables and the method "auto" picks must be those of the
 * k-week series, bit for bit, and the outlook the chosen method's fit on every week.
 */
import { analyse } from "../../src/core/analysis";
import { laneSeries } from "../engine/lane";

const BACKTEST = { methods: ["lastweek", "lastyear", "drift"], testWeeks: 20, horizon: 4, modes: ["every" as const] };

describe("backtestThrough", () => {
  const full = laneSeries(160);
  const k = 156;
  const prefix = laneSeries(156);

  it("scores the first k weeks only, as a run on those weeks does, and says so", () => {
    const kept = analyse(full, { method: "auto", horizon: 6, checks: false, backtest: BACKTEST, backtestThrough: k });
    const then = analyse(prefix, { method: "auto", horizon: 6, checks: false, backtest: BACKTEST });
    expect(kept.tables.backtest!.rows).toEqual(then.tables.backtest!.rows);
    expect(kept.tables.backtestOrigins!.rows).toEqual(then.tables.backtestOrigins!.rows);
    expect(kept.model.method).toBe(then.model.method);
    expect(kept.tables.backtest!.notes[kept.tables.backtest!.notes.length - 1]).toBe(
      `This backtest is the one of the last full run, through week ending ${then.lastWeek}; the 4 weeks since are not scored yet.`,
    );
    expect(kept.options.backtestThrough).toBe(k);
    // The outlook is the chosen method fitted on all 160 weeks.
    const direct = analyse(full, { method: kept.model.method, horizon: 6, checks: false });
    expect(kept.tables.outlook.rows).toEqual(direct.tables.outlook.rows);
    expect(kept.lastWeek).toBe(direct.lastWeek);
  });

  it("means every week when k reaches the series' length, and refuses a k below 1", () => {
    const all = analyse(full, { method: "auto", horizon: 4, checks: false, backtest: BACKTEST, backtestThrough: 999 });
    expect(all.options.backtestThrough).toBeNull();
    expect(all.tables.backtest!.rows).toEqual(analyse(full, { method: "auto", horizon: 4, checks: false, backtest: BACKTEST }).tables.backtest!.rows);
    expect(() => analyse(full, { method: "auto", backtest: BACKTEST, backtestThrough: 0 })).toThrow(/at least 1/);
  });
});
