/**
 * The forecast log: what a Publish appends, how a log read back from a sheet is parsed, and
 * what is said about rows changed by hand. The entries come from analyse() on an invented lane;
 * the edits are made here, cell by cell, the way someone would type them.
 */
import { analyse } from "../../../src/core/analysis";
import {
  LOG_COLUMNS,
  LOG_MARK,
  LogRefused,
  appendPlan,
  entryRow,
  logEntries,
  readLog,
  rowCheck,
  type LogEntry,
} from "../../../src/core/record/log";
import type { Cell } from "../../../src/core/report";
import { laneSeries } from "../../engine/lane";

const series = laneSeries(200);
const report = analyse(series, { method: "lastyear", horizon: 4, levels: [95, 80], checks: false });
const analysed = [{ name: "Halden–Corvane FEU", series, report }];
const AT = "2026-12-03T09:00:00Z";

function sheetOf(rows: Cell[][]): unknown[][] {
  return rows.map((r) => [...r]);
}

describe("entries of a published run", () => {
  test("one entry per week ahead, from the outlook table: origin, target, method and both bands", () => {
    const { entries, skipped } = logEntries(analysed, AT);
    expect(skipped).toEqual([]);
    expect(entries).toHaveLength(4);
    const t = report.tables.outlook;
    entries.forEach((e, i) => {
      const row = t.rows[i];
      expect(e.origin).toBe(report.lastWeek);
      expect(e.target).toBe(row[t.columns.indexOf("Week ending")]);
      expect(e.ahead).toBe(i + 1);
      expect(e.method).toBe("lastyear");
      expect(e.point).toBe(row[t.columns.indexOf("Forecast")]);
      // Levels are logged narrow first whatever order the run asked them in.
      expect(e.inner).toEqual({ level: 80, low: row[t.columns.indexOf("Low 80%")], high: row[t.columns.indexOf("High 80%")] });
      expect(e.outer).toEqual({ level: 95, low: row[t.columns.indexOf("Low 95%")], high: row[t.columns.indexOf("High 95%")] });
    });
  });

  test("an undated series is named and left out: its forecasts have no target week to score", () => {
    const undated = { ...series, dates: [] };
    const r = analyse(undated, { method: "lastweek", horizon: 2, checks: false });
    const { entries, skipped } = logEntries([{ name: "Undated", series: undated, report: r }], AT);
    expect(entries).toEqual([]);
    expect(skipped).toEqual(["Undated"]);
  });
});

describe("appending", () => {
  const { entries } = logEntries(analysed, AT);

  test("a new log gets the mark, the header and exactly the run's rows", () => {
    const plan = appendPlan(null, entries);
    expect(plan.start).toBe(0);
    expect(plan.rows[0][0]).toBe(LOG_MARK);
    expect(plan.rows[plan.firstEntry - 1]).toEqual([...LOG_COLUMNS]);
    expect(plan.rows.length - plan.firstEntry).toBe(entries.length);
    expect(plan.added).toBe(4);
    expect(plan.sentences[0]).toBe("Started Fairlead Log with 4 forecasts.");
  });

  test("read back, every row is Fairlead's own; a second publish of another week goes below, the first rows untouched", () => {
    const first = appendPlan(null, entries);
    const grid = sheetOf(first.rows);
    const reading = readLog(grid);
    expect(reading.rows.map((r) => r.byHand)).toEqual([false, false, false, false]);
    expect(reading.rows.map((r) => r.entry)).toEqual(entries);
    const later: LogEntry[] = entries.map((e) => ({ ...e, loggedAt: "2026-12-10T09:00:00Z", origin: "2026-12-04", point: e.point + 10 }));
    const second = appendPlan(reading, later);
    expect(second.start).toBe(grid.length);
    expect(second.rows).toHaveLength(4);
    expect(second.added).toBe(4);
    expect(second.entries).toHaveLength(8);
    expect(second.sentences).toEqual(["Added 4 forecasts to Fairlead Log (4 already there)."]);
  });

  test("publishing the same run twice adds nothing the second time, and says so", () => {
    const reading = readLog(sheetOf(appendPlan(null, entries).rows));
    const again = appendPlan(reading, entries.map((e) => ({ ...e, loggedAt: "2026-12-03T09:05:00Z" })));
    expect(again.added).toBe(0);
    expect(again.repeated).toBe(4);
    expect(again.sentences).toContain("4 forecasts were already in the log with the same values and were not added again.");
  });

  test("rows changed, added or half-typed by hand are kept, named by sheet row, and the new rows go below them", () => {
    const grid = sheetOf(appendPlan(null, entries).rows);
    const header = 3;
    // Someone corrects a forecast (row 6 of the sheet), adds a forecast of their own without a
    // check, and types a note two rows further down.
    grid[header + 2][LOG_COLUMNS.indexOf("Forecast")] = 1234.5;
    grid.push(["", "Halden–Corvane FEU", "2026-11-27", "2026-12-04", 1, "desk view", 1500, null, null, null, null, null, null, null]);
    grid.push([]);
    grid.push(["note: the 2026-12-04 figure was revised by the index"]);
    const reading = readLog(grid);
    expect(reading.rows.filter((r) => r.byHand).map((r) => r.row + 1)).toEqual([6, 9]);
    expect(reading.unreadable.map((r) => r + 1)).toEqual([11]);
    expect(reading.next).toBe(11);
    const plan = appendPlan(reading, [{ ...entries[0], origin: "2026-12-04", target: "2026-12-11", loggedAt: "2026-12-10T09:00:00Z" }]);
    expect(plan.start).toBe(11);
    expect(plan.sentences).toEqual([
      "Added 1 forecast to Fairlead Log (5 already there).",
      "2 rows of the log were changed or added by hand (rows 6, 9); they are kept as they stand and scored as they read.",
      "1 row of the log (11) does not read as a forecast (a series, origin and target week, weeks ahead, method and forecast); it is kept and not scored.",
    ]);
    // A hand-changed row no longer counts as Fairlead's: re-publishing its original values adds it again.
    const again = appendPlan(reading, [entries[1]]);
    expect(again.added).toBe(1);
  });

  test("columns are found by header: a column the user inserted stays blank in new rows", () => {
    const grid = sheetOf(appendPlan(null, entries).rows);
    for (let r = 3; r < grid.length; r++) grid[r].splice(2, 0, r === 3 ? "Desk comment" : "ok");
    const reading = readLog(grid);
    expect(reading.rows.every((r) => !r.byHand)).toBe(true);
    const plan = appendPlan(reading, [{ ...entries[0], origin: "2026-12-04", loggedAt: "2026-12-10T09:00:00Z" }]);
    expect(plan.rows[0][2]).toBeNull();
    expect(plan.rows[0][3]).toBe("2026-12-04");
    expect(plan.rows[0]).toHaveLength(LOG_COLUMNS.length + 1);
  });

  test("dates read back as Excel serials or Date objects give the same entries and checks", () => {
    const grid = sheetOf(appendPlan(null, entries).rows);
    const o = LOG_COLUMNS.indexOf("Origin week");
    const t = LOG_COLUMNS.indexOf("Target week");
    // 1900 date system: a serial counts days from 1899-12-30 (Excel's epoch, with its phantom
    // 1900-02-29 before March 1900); 2026-11-27 is 46353 (Python: date(2026,11,27) - date(1899,12,30)).
    const serial = (iso: string): number => (Date.parse(`${iso}T00:00:00Z`) - Date.UTC(1899, 11, 30)) / 86_400_000;
    expect(serial("2026-11-27")).toBe(46353);
    const targets: string[] = [];
    for (let r = 4; r < grid.length; r++) {
      targets.push(grid[r][t] as string);
      grid[r][o] = new Date(`${grid[r][o] as string}T00:00:00Z`);
      grid[r][t] = serial(grid[r][t] as string);
    }
    const reading = readLog(grid);
    expect(reading.rows.every((r) => !r.byHand)).toBe(true);
    expect(reading.rows.map((r) => r.entry.target)).toEqual(targets);
  });

  test("a sheet of that name that is not the log, or a log without its header, is refused with a sentence", () => {
    expect(() => readLog([["My notes"]])).toThrow(LogRefused);
    expect(() => readLog([["My notes"]])).toThrow(/not Fairlead's forecast log/);
    expect(() => readLog([[LOG_MARK], [], [], ["Series", "Week"]])).toThrow(/lost its header row/);
    const grid = sheetOf(appendPlan(null, entries).rows);
    grid[3][LOG_COLUMNS.indexOf("Forecast")] = "Point";
    expect(() => readLog(grid)).toThrow("Fairlead Log has lost the column “Forecast” from its header; restore it, and Fairlead will add to the log again.");
  });

  test("the row check follows every field at Excel's 15 digits", () => {
    const e = entries[0];
    expect(rowCheck(e)).toMatch(/^[0-9a-f]{8}$/);
    expect(rowCheck({ ...e, point: Number(e.point.toPrecision(15)) })).toBe(rowCheck(e));
    expect(rowCheck({ ...e, point: e.point + 0.01 })).not.toBe(rowCheck(e));
    expect(rowCheck({ ...e, method: "tbats" })).not.toBe(rowCheck(e));
    expect(entryRow(e)[LOG_COLUMNS.indexOf("Row check")]).toBe(rowCheck(e));
  });
});
