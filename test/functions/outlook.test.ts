/**
 * FAIRLEAD.OUTLOOK and the error mapping every worksheet function shares.
 *
 * Excel's CustomFunctions global exists only inside Office, so a stand-in with the same
 * constructor and ErrorCode values ("#VALUE!", "#NUM!", "#N/A", as in
 * @types/custom-functions-runtime) is installed on globalThis.
 */
import { InputError, InputErrorCode } from "../../src/core/series/errors";
import {
  ArgumentError,
  asNumberProblem,
  excelErrorSpec,
  guarded,
  INPUT_ERROR_VALUES,
  toCustomFunctionsError,
} from "../../src/functions/errors";
import { table } from "../../src/core/report";
import { EngineCancelled, EngineError } from "../../src/engine/errors";
import { analyse } from "../../src/core/analysis";
import { readWeekly } from "../../src/core/series/intake";
import { lunarOffset } from "../../src/core/series/lunarRegressors";
import { outlook, outlookRows, readCoverage } from "../../src/functions/functions";

class FakeError {
  constructor(
    readonly code: string,
    readonly message?: string,
  ) {}
}
const fakeRuntime = {
  Error: FakeError,
  ErrorCode: { invalidValue: "#VALUE!", notAvailable: "#N/A", invalidNumber: "#NUM!" },
};
Object.assign(globalThis, { CustomFunctions: fakeRuntime });

/** Excel passes null for an omitted optional argument, which the signatures type as undefined. */
const OMITTED = null as unknown as undefined;

/** Runs `f` and returns what it threw. */
function thrown(f: () => unknown): unknown {
  try {
    f();
  } catch (e) {
    return e;
  }
  throw new Error("expected a throw");
}

async function excelErrorAsync(p: Promise<unknown>): Promise<FakeError> {
  let e: unknown;
  try {
    await p;
  } catch (x) {
    e = x;
  }
  expect(e).toBeInstanceOf(FakeError);
  return e as FakeError;
}

function excelError(f: () => unknown): FakeError {
  const e = thrown(f);
  expect(e).toBeInstanceOf(FakeError);
  return e as FakeError;
}

describe("error mapping", () => {
  // The table the worksheet functions promise (src/functions/errors.ts header).
  const expected: Record<InputErrorCode, string> = {
    NOT_A_NUMBER: "#VALUE!",
    CELL_ERROR: "#VALUE!",
    NOT_A_DATE: "#VALUE!",
    NOT_WEEKLY: "#VALUE!",
    DUPLICATE_DATE: "#VALUE!",
    UNSORTED_DATES: "#VALUE!",
    LONG_GAP: "#VALUE!",
    SHAPE: "#VALUE!",
    BAD_OPTION: "#VALUE!",
    NON_POSITIVE: "#NUM!",
    CONSTANT_SERIES: "#NUM!",
    TOO_FEW_POINTS: "#N/A",
  };

  it.each(Object.entries(expected))("maps InputError %s to %s with its sentence", (code, value) => {
    const sentence = `Row 4 is the cause of ${code}.`;
    const spec = excelErrorSpec(new InputError(code as InputErrorCode, sentence));
    expect(spec).toEqual({ value, message: sentence });
    const err = excelError(() => guarded(() => {
      throw new InputError(code as InputErrorCode, sentence);
    }));
    expect(err.code).toBe(value);
    // Excel shows custom messages with #VALUE! and #N/A only.
    expect(err.message).toBe(value === "#NUM!" ? undefined : sentence);
  });

  it("covers every code with no extra entries", () => {
    expect(Object.keys(INPUT_ERROR_VALUES).sort()).toEqual(Object.keys(expected).sort());
  });

  it("turns a BAD_OPTION into #NUM! only where asked", () => {
    const bad = new InputError("BAD_OPTION", "The number of weeks ahead must be a whole number from 1 to 260; got 0.");
    const e = thrown(() => asNumberProblem(() => {
      throw bad;
    }));
    expect(e).toBeInstanceOf(ArgumentError);
    expect(excelErrorSpec(e)).toEqual({ value: "#NUM!", message: bad.message });
    const other = new InputError("NOT_A_NUMBER", "Row 2 holds \"x\", which is not a number.");
    expect(thrown(() => asNumberProblem(() => {
      throw other;
    }))).toBe(other);
  });

  it("gives internal failures a plain sentence, never the internal text", () => {
    const internal = new Error("singular matrix in kalman.ts:120");
    const spec = excelErrorSpec(internal);
    expect(spec.value).toBe("#VALUE!");
    expect(spec.message).not.toContain("kalman");
    expect(spec.message).toMatch(/^Fairlead could not compute/);
    expect(excelErrorSpec(new RangeError("lambda out of range")).value).toBe("#NUM!");
    expect(excelErrorSpec("a thrown string").value).toBe("#VALUE!");
  });

  it("maps the engine's failures: a stopped job is #N/A, a failed worker #VALUE! with its sentence", () => {
    expect(excelErrorSpec(new EngineCancelled("The TBATS analysis was cancelled."))).toEqual({
      value: "#N/A",
      message: "The calculation was stopped before it finished; recalculate to run it again.",
    });
    expect(excelErrorSpec(new EngineError("The TBATS analysis stopped: its worker ran out of memory."))).toEqual({
      value: "#VALUE!",
      message: "The TBATS analysis stopped: its worker ran out of memory.",
    });
  });

  it("passes a CustomFunctions.Error through unchanged", () => {
    const own = new FakeError("#N/A", "already mapped");
    expect(thrown(() => guarded(() => {
      throw own;
    }))).toBe(own);
    expect(toCustomFunctionsError({ value: "#N/A", message: "m" })).toEqual(new FakeError("#N/A", "m"));
  });
});

/** Three years of an invented lane, weeks ending Friday from 2022-01-07, with +200 jumps in weeks 20, 70 and 120. */
function jumpLane() {
  const n = 3 * 52;
  const start = Date.UTC(2022, 0, 7);
  const weekDates = Array.from({ length: n }, (_, t) => new Date(start + t * 7 * 86_400_000));
  const jumps = [20, 70, 120];
  const lane = weekDates.map((_, t) => [1500 + 2 * t + 30 * Math.sin(0.9 * t) + (jumps.includes(t) ? 200 : 0)]);
  const serial = (d: Date): number => (d.getTime() - Date.UTC(1899, 11, 30)) / 86_400_000;
  const serials = weekDates.map((d) => [serial(d)]);
  return { n, start, weekDates, jumps, lane, serial, serials };
}

describe("OUTLOOK", () => {
  // 2025-01-01 is Excel serial 45658 (1900 date system; =DATE(2025,1,1) in Excel, from
  // memory), so the Fridays 2025-01-03 … 2025-01-31 are 45660 + 7k.
  const FRIDAY_2025_01_03 = 45660;
  const dates = [0, 1, 2, 3, 4].map((k) => [FRIDAY_2025_01_03 + 7 * k]);
  const rates = [[100], [102], [101], [103], [104]];
  // Naive (lastweek) by hand: point = last rate 104; one-step differences 2, −1, 2, 1 give
  // σ² = (4 + 1 + 4 + 1) / 4 = 2.5 and Var_h = σ²·h. Standard normal quantiles
  // z(0.90) = 1.2815515655446004 and z(0.975) = 1.959963984540054 (published tables).
  const Z80 = 1.2815515655446004;
  const Z95 = 1.959963984540054;
  // 1e-9 absolute: the only differences allowed are floating-point rounding in the
  // quantile routine and in sqrt, far below a cent on a rate near 100.
  const TOL = 9;

  it("returns week-ending serials, forecast and bounds per coverage level", async () => {
    const out = await outlook([["Halden–Corvane"], ...rates], 3, "lastweek", OMITTED, [["Week ending"], ...dates]);
    expect(out).toHaveLength(3);
    out.forEach((row, s) => {
      const h = s + 1;
      const sd = Math.sqrt(2.5 * h);
      expect(row).toHaveLength(6);
      // Week ending: 2025-01-31 (45688) plus h weeks.
      expect(row[0]).toBe(45688 + 7 * h);
      expect(row[1]).toBeCloseTo(104, TOL);
      expect(row[2]).toBeCloseTo(104 - Z80 * sd, TOL);
      expect(row[3]).toBeCloseTo(104 + Z80 * sd, TOL);
      expect(row[4]).toBeCloseTo(104 - Z95 * sd, TOL);
      expect(row[5]).toBeCloseTo(104 + Z95 * sd, TOL);
    });
  });

  it("takes the model codes: TBATS on three years of an invented lane gives analyse()'s own outlook", async () => {
    // 156 weeks of "Halden–Corvane" with an annual swing of period 365.25/7, no dates.
    const lane = Array.from({ length: 156 }, (_, t) => [1800 + 120 * Math.sin((2 * Math.PI * t) / (365.25 / 7)) + 2 * t + 15 * Math.sin(1.7 * t)]);
    const out = await outlook([["Halden–Corvane"], ...lane], 4, "tbats");
    const series = readWeekly([["Halden–Corvane"], ...lane]);
    const want = analyse(series, { method: "tbats", horizon: 4, checks: false }).tables.outlook.rows;
    expect(out.map((r) => r.slice(1))).toEqual(want.map((r) => r.slice(2)));
  });

  it("with the lunar-new-year switch, SARIMA's outlook is analyse()'s with the calendar; without dates it is refused", async () => {
    // Four years of an invented lane, weeks ending Friday from 2021-01-01, with a dip in the holiday's week.
    const n = 4 * 52 + 10;
    const start = Date.UTC(2021, 0, 1);
    const weekDates = Array.from({ length: n }, (_, t) => new Date(start + t * 7 * 86_400_000));
    const lane = weekDates.map((d, t) => [1500 + 3 * t + 40 * Math.sin(1.3 * t) - (lunarOffset(d) === 0 ? 180 : 0)]);
    const serials = weekDates.map((d) => [(d.getTime() - Date.UTC(1899, 11, 30)) / 86_400_000]);
    const out = await outlook(lane, 6, "sarima", OMITTED, serials, OMITTED, true);
    const series = readWeekly(lane, { dates: serials });
    const want = analyse(series, { method: "sarima", horizon: 6, checks: false, calendar: { lunarNewYear: true } });
    expect(want.tables.fit.rows.map((r) => r[0])).toContain("Lunar new year week");
    expect(out.map((r) => r.slice(1))).toEqual(want.tables.outlook.rows.map((r) => r.slice(2)));
    const plain = await outlook(lane, 6, "sarima", OMITTED, serials, OMITTED, false);
    expect(plain.map((r) => r[1])).not.toEqual(out.map((r) => r[1]));
    const err = await excelErrorAsync(outlook(lane, 6, "sarima", OMITTED, OMITTED, OMITTED, true));
    expect(err.code).toBe("#VALUE!");
    expect(err.message).toBe("The lunar-new-year switch needs the week-ending dates beside the rates: give the dates argument as well.");
    expect((await excelErrorAsync(outlook(lane, 6, "sarima", OMITTED, serials, OMITTED, "maybe" as unknown as boolean))).message).toBe(
      'The lunar-new-year switch is TRUE or FALSE; got "maybe".',
    );
  }, 60_000);

  it("event weeks: a range of dates becomes SARIMA's event regressor, as analyse() with calendar.events; bad cells and weeks outside the rates are #VALUE!", async () => {
    const { n, start, weekDates, jumps, lane, serial, serials } = jumpLane();
    // A column of event dates with a blank, one given as text and one a coming week.
    const events = [[serial(weekDates[20])], [""], [serial(weekDates[70])], ["2024-05-21"], [serial(new Date(start + (n + 1) * 7 * 86_400_000))]];
    const out = await outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, events);
    const iso = (d: Date): string => d.toISOString().slice(0, 10);
    const listed = [iso(weekDates[20]), iso(weekDates[70]), "2024-05-21", iso(new Date(start + (n + 1) * 7 * 86_400_000))];
    const want = analyse(readWeekly(lane, { dates: serials }), { method: "sarima", horizon: 4, checks: false, calendar: { events: listed } });
    expect(want.tables.fit.rows.map((r) => r[0])).toContain("Event weeks");
    expect(out.map((r) => r.slice(1))).toEqual(want.tables.outlook.rows.map((r) => r.slice(2)));
    const bad = await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, [["strike"]]));
    expect(bad.code).toBe("#VALUE!");
    expect(bad.message).toBe('Event weeks are dates; cell 1 of them holds "strike".');
    const late = await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, [["2030-01-01"]]));
    expect(late.code).toBe("#VALUE!");
    expect(late.message).toMatch(/^None of the event weeks falls within the rates/);
    expect((await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, OMITTED, OMITTED, OMITTED, events))).message).toBe(
      "Event weeks need the week-ending dates beside the rates: give the dates argument as well.",
    );
  }, 60_000);

  it("event weeks as a column of marks beside the dates (header on top allowed) equal the same weeks listed as dates; TBATS takes them too", async () => {
    const { n, start, weekDates, jumps, lane, serial, serials } = jumpLane();
    const marks = weekDates.map((_, t) => [t === 20 ? 1 : t === 70 ? "x" : t === 120 ? true : t % 2 === 0 ? 0 : ""]);
    const listed = jumps.map((t) => [serial(weekDates[t])]);
    const byMarks = await outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, marks);
    const byDates = await outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, listed);
    expect(byMarks).toEqual(byDates);
    // With headers on the rates, the dates and the marks, row for row.
    const headed = await outlook([["Lane"], ...lane], 4, "sarima", OMITTED, [["Week ending"], ...serials], OMITTED, OMITTED, [["Strike"], ...marks]);
    expect(headed).toEqual(byDates);
    // TBATS: the same weeks, the same outlook as analyse() with calendar.events.
    const tb = await outlook(lane, 4, "tbats", OMITTED, serials, OMITTED, OMITTED, marks);
    const iso = (d: Date): string => d.toISOString().slice(0, 10);
    const want = analyse(readWeekly(lane, { dates: serials }), { method: "tbats", horizon: 4, checks: false, calendar: { events: jumps.map((t) => iso(weekDates[t])) } });
    expect(want.tables.fit.rows.map((r) => r[0])).toContain("Event weeks");
    expect(tb.map((r) => r.slice(1))).toEqual(want.tables.outlook.rows.map((r) => r.slice(2)));
    // Marks that do not line up with the dates, that mark nothing, or that need dates not given.
    const short = await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, marks.slice(0, 100)));
    expect(short.code).toBe("#VALUE!");
    expect(short.message).toBe("Event weeks marked 1 or 0 need one mark per date: 100 marks for 156 dates.");
    const none = await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, serials, OMITTED, OMITTED, weekDates.map(() => [0])));
    expect(none.message).toBe("Event marks: no week is marked; put 1 (or x) in the rows of the event weeks.");
    expect((await excelErrorAsync(outlook(lane, 4, "sarima", OMITTED, OMITTED, OMITTED, OMITTED, marks))).message).toBe(
      "Event weeks marked 1 or 0 need the dates argument, row for row beside the marks.",
    );
  }, 60_000);

  it("numbers the weeks ahead when no dates are given, and takes one coverage level", async () => {
    const out = await outlook(rates, 2, "lastweek", [[80]]);
    expect(out.map((r) => r[0])).toEqual([1, 2]);
    expect(out[1]).toHaveLength(4);
    expect(out[1][2]).toBeCloseTo(104 - Z80 * Math.sqrt(5), TOL);
  });

  it("puts an #N/A error in a cell with no value, never NaN or a blank", () => {
    const t = table("Outlook", ["Step", "Week ending", "Forecast", "Low 80%", "High 80%"], [
      [1, "2025-02-07", 104, NaN, null],
    ]);
    const [row] = outlookRows(t);
    expect(row[0]).toBe(45695); // 2025-02-07 = 45660 + 35
    expect(row[1]).toBe(104);
    expect(row).toHaveLength(4);
    for (const c of row.slice(2)) {
      expect(c).toBeInstanceOf(FakeError);
      expect((c as FakeError).code).toBe("#N/A");
    }
  });

  it("reads coverage from a number, a row or a column, skipping blanks", () => {
    expect(readCoverage(80)).toEqual([80]);
    expect(readCoverage([[80, 95]])).toEqual([80, 95]);
    expect(readCoverage([[50], [""], [99]])).toEqual([50, 99]);
    expect(readCoverage(null)).toBeUndefined();
  });

  it("chooses the core's default method when none is given (lastweek below two years)", async () => {
    const out = await outlook(rates, 1, OMITTED, OMITTED, dates);
    expect(out[0][1]).toBeCloseTo(104, TOL);
  });

  it("gives #VALUE! with the intake's sentence for text among the rates", async () => {
    const err = await excelErrorAsync(outlook([[100], ["n/a"], [101]], 2));
    expect(err.code).toBe("#VALUE!");
    expect(err.message).toMatch(/Row 2 holds "n\/a"/);
  });

  it.each([
    ["weeks = 0", () => outlook(rates, 0)],
    ["weeks = 2.5", () => outlook(rates, 2.5)],
    ["coverage 120", () => outlook(rates, 2, "lastweek", [[120]])],
    ["coverage 0", () => outlook(rates, 2, "lastweek", [[0]])],
  ])("gives #NUM! for an impossible number (%s)", async (_label, call) => {
    expect((await excelErrorAsync(call())).code).toBe("#NUM!");
  });

  it("gives #VALUE! for text coverage and for an unknown method", async () => {
    expect((await excelErrorAsync(outlook(rates, 2, "lastweek", [["high"]]))).code).toBe("#VALUE!");
    const err = await excelErrorAsync(outlook(rates, 2, "crystalball"));
    expect(err.code).toBe("#VALUE!");
    expect(err.message).toMatch(/"crystalball" is not available/);
    // "auto" runs on the engine's workers now; five weeks are too few for its backtest.
    const auto = await excelErrorAsync(outlook(rates, 2, " Auto "));
    expect(auto.code).toBe("#N/A");
    expect(auto.message).toMatch(/backtest needs more weeks/);
  });

  it("gives #N/A for too little data", async () => {
    expect((await excelErrorAsync(outlook([[100], [101]], 2))).code).toBe("#N/A");
    // The seasonal naive needs more than a year of weeks.
    const err = await excelErrorAsync(outlook(rates, 2, "lastyear"));
    expect(err.code).toBe("#N/A");
    expect(err.message).toMatch(/needs at least \d+ weeks/);
  });
});
