import { analyse } from "../../src/core/analysis";
import { readWeekly } from "../../src/core/series/intake";
import { InputError } from "../../src/core/series/errors";
import { lastYear } from "../../src/core/models/naive";

// An invented lane: 120 weeks ending on Fridays from 2024-08-02, ISO text dates.
function laneBlock(n: number): { values: unknown[][]; dates: unknown[][] } {
  const values: unknown[][] = [["Lane rate"]];
  const dates: unknown[][] = [["Week ending"]];
  const start = Date.UTC(2024, 7, 2);
  for (let t = 0; t < n; t++) {
    values.push([2000 + 150 * Math.sin((2 * Math.PI * t) / 52) + 3 * t]);
    dates.push([new Date(start + t * 7 * 86_400_000).toISOString().slice(0, 10)]);
  }
  return { values, dates };
}

describe("analyse()", () => {
  const { values, dates } = laneBlock(120);
  const series = readWeekly(values, { dates });

  test("outlook rows carry the next week-ending dates and the model's own numbers", () => {
    const r = analyse(series, { method: "lastyear", horizon: 4, levels: [80, 95] });
    const t = r.tables.outlook;
    expect(t.columns).toEqual(["Step", "Week ending", "Forecast", "Low 80%", "High 80%", "Low 95%", "High 95%"]);
    expect(r.lastWeek).toBe("2026-11-13"); // 2024-08-02 + 119 weeks
    expect(t.rows.map((row) => row[1])).toEqual(["2026-11-20", "2026-11-27", "2026-12-04", "2026-12-11"]);
    const fc = lastYear.fit(series.values).forecast(4, [80, 95]);
    expect(t.rows[2][2]).toBe(fc.point[2]);
    expect(t.rows[2][5]).toBe(fc.lower[1][2]);
    expect(t.notes.join(" ")).toMatch(/not advice to book, fix or trade/);
  });

  test("TBATS: the search table lists every fitted structure best first, and the factor table comes from its seasonal states", () => {
    const r = analyse(series, { method: "tbats", horizon: 4, checks: false });
    const search = r.tables.search;
    expect(search).toBeDefined();
    const rows = search?.rows ?? [];
    expect(search?.columns).toEqual(["Structure", "AIC", "AIC above best", "Chosen"]);
    // Best first, differences from the best non-negative, exactly one chosen: the fitted structure.
    for (let i = 1; i < rows.length; i++) expect(rows[i][1] as number).toBeGreaterThanOrEqual(rows[i - 1][1] as number);
    expect(rows[0][2]).toBe(0);
    expect(rows.filter((row) => row[3] === "chosen")).toHaveLength(1);
    // The chosen row is the structure the outlook was made with.
    expect(r.tables.outlook.notes[0]).toBe(`Method: ${rows[0][0]}.`);
    const season = r.tables.modelSeason;
    expect(season?.title).toBe("Seasonal factors by ISO week (TBATS)");
    expect(season?.rows).toHaveLength(52);
    // Multiplicative factors average exactly 1 over the weeks observed.
    const f = (season?.rows ?? []).map((row) => row[1]).filter((v): v is number => typeof v === "number");
    expect(f.reduce((a, b) => a + b, 0) / f.length).toBeCloseTo(1, 12);
  });

  test('"auto" picks the method with the lowest mean MASE in the backtest and says so', () => {
    const bt = { methods: ["lastweek", "drift", "lastyear"], testWeeks: 20, horizon: 2, modes: ["fixed" as const] };
    const r = analyse(series, { method: "auto", horizon: 3, checks: false, backtest: bt });
    const acc = r.tables.backtest;
    expect(acc?.title).toBe("Backtest accuracy");
    // Mean MASE over weeks ahead 1–2 per method, from the table itself.
    const mase = new Map<string, number[]>();
    for (const row of acc?.rows ?? []) mase.set(row[0] as string, [...(mase.get(row[0] as string) ?? []), row[7] as number]);
    const means = [...mase.entries()].map(([m, v]) => [m, v.reduce((a, b) => a + b, 0) / v.length] as const);
    const best = means.reduce((a, b) => (b[1] < a[1] ? b : a))[0];
    expect(r.tables.outlook.title).toBe(`Outlook: ${best}`);
    expect(r.tables.outlook.notes[1]).toMatch(new RegExp(`^Chosen by backtest: ${best} had the lowest MASE averaged over 1–2 weeks ahead, from every week of the last 20 weeks`));
    expect(r.tables.backtestSignificance?.rows).toHaveLength(2 * 2);
    expect(r.options.method).toBe("auto");
  });

  test("a backtest can accompany any method; its tables come back beside the outlook", () => {
    const r = analyse(series, { method: "lastweek", horizon: 2, checks: false, backtest: { methods: ["lastweek", "drift"], testWeeks: 10, horizon: 1, modes: ["fixed"] } });
    expect(r.tables.outlook.title).toBe("Outlook: Last week");
    expect(r.tables.backtest?.rows).toHaveLength(2);
    expect(r.tables.backtestOrigins?.rows).toHaveLength(2 * 10);
    expect(r.tables.backtestCost?.rows.map((row) => row[3])).toEqual([1, 1]);
  });

  test("a method without a search has no search table", () => {
    const r = analyse(series, { method: "lastyear", horizon: 2, checks: false });
    expect(r.tables.search).toBeUndefined();
    expect(r.tables.modelSeason).toBeUndefined();
  });

  test("the data table states what was read", () => {
    const r = analyse(series, { method: "lastweek", horizon: 1 });
    const d = Object.fromEntries(r.tables.data.rows.map((row) => [row[0], row[1]]));
    expect(d["Series"]).toBe("Lane rate");
    expect(d["Weeks read"]).toBe(120);
    expect(d["First week ending"]).toBe("2024-08-02");
    expect(d["Weeks end on"]).toBe("Friday");
  });

  test("defaults: seasonal naive with two years of history, 12 weeks, 80 and 95", () => {
    const r = analyse(series);
    expect(r.options).toEqual({ method: "lastyear", horizon: 12, levels: [80, 95], checks: true, backtest: null, choose: "mase", spans: [], thresholds: [], decompose: false, seasonKind: null, calendar: { lunarNewYear: null, events: [] }, backtestThrough: null });
    expect(r.tables.outlook.rows).toHaveLength(12);
  });

  test("bad options and short data are InputErrors with plain sentences", () => {
    const expectCode = (fn: () => unknown, code: string, text: RegExp): void => {
      try {
        fn();
        throw new Error("expected an InputError");
      } catch (e) {
        expect(e).toBeInstanceOf(InputError);
        expect((e as InputError).code).toBe(code);
        expect((e as InputError).message).toMatch(text);
      }
    };
    expectCode(() => analyse(series, { horizon: 0 }), "BAD_OPTION", /whole number from 1 to 260/);
    expectCode(() => analyse(series, { horizon: 2.5 }), "BAD_OPTION", /whole number/);
    expectCode(() => analyse(series, { levels: [100] }), "BAD_OPTION", /between 0 and 100/);
    expectCode(() => analyse(series, { method: "crystal" }), "BAD_OPTION", /not available/);
    const short = readWeekly(laneBlock(30).values, { dates: laneBlock(30).dates });
    expectCode(() => analyse(short, { method: "lastyear" }), "TOO_FEW_POINTS", /at least 54 weeks/);
  });
});

describe("analyse() with the checks", () => {
  // Simulated truth (seeded): log rates follow a random walk plus a fixed annual pattern of
  // ±10%, 470 weekly points — I(1) in logs with strong seasonality by construction.
  const { MersenneTwister } = jest.requireActual("../../src/core/math/rng") as typeof import("../../src/core/math/rng");
  const rng = new MersenneTwister(2026);
  const n = 470;
  const values: unknown[][] = [];
  const dates: unknown[][] = [];
  let walk = Math.log(1500);
  const start = Date.UTC(2017, 0, 6);
  for (let t = 0; t < n; t++) {
    walk += 0.01 * rng.normal();
    const day = new Date(start + t * 7 * 86_400_000);
    const season = 0.1 * Math.sin((2 * Math.PI * t) / (365.25 / 7));
    values.push([Math.exp(walk + season + 0.005 * rng.normal())]);
    dates.push([day.toISOString().slice(0, 10)]);
  }
  const series = readWeekly(values, { dates });
  const r = analyse(series, { method: "lastyear", horizon: 4 });

  test("every check section is present", () => {
    for (const k of ["stationarity", "integration", "seasonStrength", "weekFactors", "nonlinearity", "residualTests", "correlogram"] as const) {
      expect(r.tables[k]).toBeDefined();
    }
    expect(r.warnings.filter((w) => /not run/.test(w))).toEqual([]);
  });

  test("the conclusions match the simulated truth", () => {
    // I(1), concluded on the seasonally adjusted rates (the ±10% annual cycle is real here).
    const [judged, order, evidence] = r.tables.integration?.rows[0] ?? [];
    expect(order).toBe(1);
    expect(evidence).toMatch(/^conclusive/);
    expect(judged).toMatch(/seasonally adjusted/);
    expect(r.tables.weekFactors?.rows).toHaveLength(52);
    const strength = r.tables.seasonStrength?.rows.map((row) => row.join(" ")).join(" ") ?? "";
    expect(strength).toMatch(/[Ss]trong/);
  });

  test("a series too short for the checks still gets its outlook, with sentences saying what was skipped", () => {
    const short = readWeekly(values.slice(0, 20), { dates: dates.slice(0, 20) });
    const s = analyse(short, { method: "lastweek", horizon: 2 });
    expect(s.tables.outlook.rows).toHaveLength(2);
    const skipped = s.warnings.filter((w) => /not run/.test(w));
    expect(skipped.length).toBeGreaterThanOrEqual(2);
    expect(skipped.every((w) => /weeks/.test(w))).toBe(true);
  });

  test("checks can be switched off", () => {
    const off = analyse(series, { method: "lastyear", horizon: 4, checks: false });
    expect(off.tables.stationarity).toBeUndefined();
  });
});
