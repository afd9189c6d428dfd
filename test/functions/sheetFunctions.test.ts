/**
 * The FAIRLEAD.* functions with cells as Excel hands them over (a header cell, numbers stored
 * as text with separators, a blank week, dates as serials), each compared with analyse() on
 * the same series: the functions add nothing and lose nothing. Then the cache (a second call
 * fits nothing; one changed cell refits), the header switch, and one case per error path.
 *
 * With no Worker in jest's Node environment, the shared engine runs its jobs on the calling
 * thread (src/functions/engine.ts), through the same pool and cache as in Excel.
 */
import * as analysis from "../../src/core/analysis";
import { dateToExcelSerial } from "../../src/core/series/excelDate";
import { readWeekly } from "../../src/core/series/intake";
import type { ReportTable } from "../../src/core/report";
import { createEngine, InlineTransport } from "../../src/engine";
import { useFunctionsEngine } from "../../src/functions/engine";
import { backtest, chance, decompose, fitsummary, meanahead, nonlinearity, outlook, stationarity, weekfactors } from "../../src/functions/functions";
import { laneSeries } from "../engine/lane";

class FakeError {
  constructor(
    readonly code: string,
    readonly message?: string,
  ) {}
}
Object.assign(globalThis, {
  CustomFunctions: { Error: FakeError, ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!" } },
});
const OMITTED = null as unknown as undefined;

// 170 weeks of the invented lane: more than three years, so the seasonal results exist.
const lane = laneSeries(170);
const rateCells: unknown[][] = [["Halden–Corvane FEU"]];
const dateCells: unknown[][] = [["Week ending"]];
lane.values.forEach((v, i) => {
  // Week 10 as text with a thousands separator, as a pasted figure often is; week 40 blank.
  rateCells.push([i === 10 ? v.toLocaleString("en-US", { maximumFractionDigits: 2 }) : i === 40 ? null : v]);
  dateCells.push([dateToExcelSerial(lane.dates[i])]);
});
const series = readWeekly(rateCells, { dates: dateCells });

function cells(t: ReportTable | undefined, columns: string[]): unknown[][] {
  if (!t) throw new Error("table missing");
  return t.rows.map((r) => columns.map((c) => r[t.columns.indexOf(c)] ?? ""));
}

async function errorOf(p: Promise<unknown>): Promise<FakeError> {
  try {
    await p;
  } catch (e) {
    expect(e).toBeInstanceOf(FakeError);
    return e as FakeError;
  }
  throw new Error("expected an Excel error");
}

beforeAll(() => {
  useFunctionsEngine(createEngine(new InlineTransport()));
});

describe("each function equals analyse() on the same cells", () => {
  test("the intake read the cells as the core does: text number parsed, the blank week filled", () => {
    expect(series.values[10]).toBeCloseTo(lane.values[10], 2);
    expect(series.filled[40]).toBe(true);
  });

  test("MEANAHEAD: the span's average and bounds", async () => {
    const out = await meanahead(rateCells, 1, 13, "sarima", OMITTED, dateCells);
    const want = analysis.analyse(series, { method: "sarima", horizon: 1, checks: false, spans: [{ from: 1, to: 13 }] }).tables.meanAhead;
    expect(out).toEqual(cells(want, ["Average", "Low 80%", "High 80%", "Low 95%", "High 95%"]));
  });

  test("CHANCE: the probability of a rate above a level in week 4", async () => {
    const level = lane.values[169] * 1.03;
    const out = await chance(rateCells, level, 4, OMITTED, "lastweek", dateCells);
    const want = analysis.analyse(series, { method: "lastweek", horizon: 1, checks: false, thresholds: [{ level, week: 4, direction: "above" }] }).tables.chance;
    expect(out).toEqual(cells(want, ["Probability"]));
    expect(out[0][0]).toBeGreaterThan(0);
    expect(out[0][0]).toBeLessThan(1);
    const below = await chance(rateCells, level, 4, "below", "lastweek", dateCells);
    expect((below[0][0] as number) + (out[0][0] as number)).toBeCloseTo(1, 12); // no path lands exactly on the level
  });

  test("WEEKFACTORS: 52 ISO weeks, multiplicative by default, additive when asked", async () => {
    const out = await weekfactors(rateCells, dateCells);
    const want = analysis.analyse(series, { method: "lastweek", horizon: 1 }).tables.weekFactors;
    expect(out).toEqual(cells(want, ["ISO week", "Factor", "Years averaged"]));
    expect(out).toHaveLength(52);
    const additive = await weekfactors(rateCells, dateCells, "additive");
    const mean = additive.reduce((a, r) => a + (r[1] as number), 0) / 52;
    expect(Math.abs(mean)).toBeLessThan(1e-9); // additive effects average 0 (factors.ts)
    const product = out.reduce((a, r) => a + Math.log(r[1] as number), 0);
    expect(Math.abs(product / 52)).toBeLessThan(0.01); // multiplicative factors average about 1
  });

  test("DECOMPOSE: trend, seasonal and remainder lined up with the input rows", async () => {
    const out = await decompose(rateCells, dateCells);
    const want = analysis.analyse(series, { method: "lastweek", horizon: 1, checks: false, decompose: true }).tables.decomposition;
    // The header cell's row stays empty so the spill lines up with the rates beside it.
    expect(out).toHaveLength(rateCells.length);
    expect(out[0]).toEqual(["", "", ""]);
    expect(out.slice(1)).toEqual(cells(want, ["Trend", "Seasonal", "Remainder"]));
    expect((await decompose(rateCells, dateCells, true))[0]).toEqual(["Trend", "Seasonal", "Remainder"]);
  });

  test("DECOMPOSE: a week the dates skip has no input row, and the rows after it keep their own weeks", async () => {
    const skipRates = rateCells.filter((_, i) => i !== 51);
    const skipDates = dateCells.filter((_, i) => i !== 51);
    const out = await decompose(skipRates, skipDates);
    expect(out).toHaveLength(skipRates.length);
    const skipped = readWeekly(skipRates, { dates: skipDates });
    expect(skipped.values.length).toBe(170); // the intake put the missing week back (filled)
    const full = cells(analysis.analyse(skipped, { method: "lastweek", horizon: 1, checks: false, decompose: true }).tables.decomposition, ["Trend", "Seasonal", "Remainder"]);
    expect(out.slice(1, 51)).toEqual(full.slice(0, 50));
    expect(out.slice(51)).toEqual(full.slice(51));
  });

  test("STATIONARITY: every test, or only those on one form of the rates", async () => {
    const cols = ["Test", "Statistic", "p-value", "Lags", "5% critical value", "Verdict"];
    const all = await stationarity(rateCells);
    const want = analysis.analyse(series, { method: "lastweek", horizon: 1 }).tables.stationarity;
    // Undated here (no dates argument): the series is the same rates without dates.
    const undated = readWeekly(rateCells);
    expect(all).toEqual(cells(analysis.analyse(undated, { method: "lastweek", horizon: 1 }).tables.stationarity, cols));
    expect(want).toBeDefined();
    const logs = await stationarity(rateCells, "logs");
    expect(logs.length).toBeGreaterThan(0);
    expect(logs.length).toBeLessThan(all.length);
    for (const r of logs) expect(String(r[0])).toMatch(/log levels$/);
  });

  test("NONLINEARITY and FITSUMMARY", async () => {
    const undated = readWeekly(rateCells);
    const nl = await nonlinearity(rateCells);
    expect(nl).toEqual(cells(analysis.analyse(undated, { method: "lastweek", horizon: 1 }).tables.nonlinearity, ["Test", "Statistic", "p-value", "Lags", "Verdict"]));
    const fit = await fitsummary(rateCells, "sarima", true);
    const r = analysis.analyse(undated, { method: "sarima", horizon: 1, checks: false });
    expect(fit[0]).toEqual(["Parameter", "Value", "Std. error"]);
    expect(fit[1]).toEqual(["Structure", r.model.structure, ""]);
    expect(fit.slice(2)).toEqual(cells(r.tables.fit, ["Parameter", "Value", "Std. error"]));
  });

  test("BACKTEST: the accuracy table for the asked methods, weeks and refit", async () => {
    const out = await backtest(rateCells, 8, 2, "fixed", [["lastweek, drift"]], true);
    const undated = readWeekly(rateCells);
    const want = analysis.analyse(undated, { method: "lastweek", horizon: 1, checks: false, backtest: { testWeeks: 8, horizon: 2, modes: ["fixed"], methods: ["lastweek", "drift"] } }).tables.backtest;
    const cols = ["Method", "Weeks ahead", "MAPE %", "MASE", "RMSE", "Coverage 80%", "Coverage 95%"];
    expect(out[0]).toEqual(cols);
    expect(out.slice(1)).toEqual(cells(want, cols));
    expect(out).toHaveLength(1 + 2 * 2);
  });

  test("the header switch puts the column names on top", async () => {
    const plain = await outlook(rateCells, 3, "lastweek", OMITTED, dateCells);
    const withHeader = await outlook(rateCells, 3, "lastweek", OMITTED, dateCells, true);
    expect(withHeader[0]).toEqual(["Week ending", "Forecast", "Low 80%", "High 80%", "Low 95%", "High 95%"]);
    expect(withHeader.slice(1)).toEqual(plain);
  });
});

describe("the cache", () => {
  test("a second call with the same cells fits nothing; a changed cell refits", async () => {
    useFunctionsEngine(createEngine(new InlineTransport()));
    const spy = jest.spyOn(analysis, "analyse");
    try {
      const first = await outlook(rateCells, 4, "tbats", OMITTED, dateCells);
      expect(spy).toHaveBeenCalledTimes(1);
      const again = await outlook(rateCells, 4, "tbats", OMITTED, dateCells);
      expect(spy).toHaveBeenCalledTimes(1);
      expect(again).toEqual(first);
      const edited = rateCells.map((r) => [...r]);
      edited[120] = [Number(edited[120][0]) + 1];
      await outlook(edited, 4, "tbats", OMITTED, dateCells);
      expect(spy).toHaveBeenCalledTimes(2);
    } finally {
      spy.mockRestore();
    }
  });
});

describe("bad input: an Excel error value with a sentence", () => {
  const short = rateCells.slice(0, 30);
  test.each<[string, () => Promise<unknown>, string, RegExp]>([
    ["rates not a range", () => outlook(5 as unknown as unknown[][], 4), "#VALUE!", /range of cells/],
    ["text among the rates", () => outlook([["Rate"], [100], ["tbc"], [101]], 2), "#VALUE!", /holds "tbc"/],
    ["an error value among the rates", () => outlook([[100], ["#N/A"], [101], [102]], 2), "#VALUE!", /#N\/A/],
    ["weeks ahead as text", () => outlook(rateCells, "four" as unknown as number), "#VALUE!", /Weeks ahead must be a number/],
    ["weeks ahead 0", () => outlook(rateCells, 0), "#NUM!", /whole number from 1 to 260/],
    ["a span backwards", () => meanahead(rateCells, 6, 2), "#NUM!", /from an earlier week to a later one/],
    ["a level as text", () => chance(rateCells, "high" as unknown as number, 2), "#VALUE!", /level must be a number/],
    ["a direction of neither", () => chance(rateCells, 2000, 2, "sideways"), "#VALUE!", /"above" or "below"/],
    ["factors without dates", () => weekfactors(rateCells), "#VALUE!", /need the week-ending dates/],
    ["an unknown kind", () => weekfactors(rateCells, dateCells, "logs"), "#VALUE!", /"multiplicative" or "additive"/],
    ["multiplicative with a negative rate", () => weekfactors(rateCells.map((r, i) => (i === 5 ? [-1] : r)), dateCells, "multiplicative"), "#NUM!", /above zero/],
    ["too few weeks for seasonal factors", () => weekfactors(short, dateCells.slice(0, 30)), "#N/A", /three years/],
    ["an unknown form", () => stationarity(rateCells, "squares"), "#VALUE!", /"levels", "logs" or "changes"/],
    ["a refit of 0 weeks", () => backtest(rateCells, 8, 2, 0), "#NUM!", /whole N from 1 to 52/],
    ["methods as a number", () => backtest(rateCells, 8, 2, "fixed", [[3]]), "#VALUE!", /codes written as text/],
    ["an unknown method", () => fitsummary(rateCells, "oracle"), "#VALUE!", /"oracle" is not available/],
    ["a header switch of neither", () => nonlinearity(rateCells, "maybe" as unknown as boolean), "#VALUE!", /TRUE or FALSE/],
    ["too little data", () => outlook([[100], [101]], 2), "#N/A", /./],
  ])("%s", async (_what, call, code, message) => {
    const e = await errorOf(call());
    expect(e.code).toBe(code);
    if (code !== "#NUM!") expect(e.message).toMatch(message);
  });
});
