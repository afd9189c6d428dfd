/**
 * The forecast log in the workbook (excel/forecastLog.ts) against a stored book over
 * office-addin-mock (mockBook.ts): what is read back, and that an append writes only the
 * plan's rows, below the last one, as plain values with their number formats.
 */
import { analyse } from "../../../src/core/analysis";
import { LOG_COLUMNS, LOG_MARK, LOG_SHEET, LogRefused, appendPlan, logEntries, type LogEntry } from "../../../src/core/record/log";
import { appendToLog, gridFromA1, logWrite, readForecastLog, readLogCells } from "../../../src/taskpane/excel/forecastLog";
import { laneSeries } from "../../engine/lane";
import { MockBook, type Value } from "./mockBook";

const series = laneSeries(160);
const report = analyse(series, { method: "drift", horizon: 4, levels: [80, 95], checks: false });
const analysed = [{ name: "Halden–Corvane FEU", series, report }];
const AT = "2026-12-03T09:00:00Z";
const { entries } = logEntries(analysed, AT);

/** Excel's 1900 date system: days since 1899-12-30 (so 2026-11-27 is 46353, as in log.test.ts). */
function serial(iso: string): number {
  return (Date.parse(`${iso}T00:00:00Z`) - Date.UTC(1899, 11, 30)) / 86_400_000;
}

/** The same forecasts one week later (a later origin): what the next week's Publish logs. */
function weekLater(es: LogEntry[]): LogEntry[] {
  const next = (iso: string): string => new Date(Date.parse(`${iso}T00:00:00Z`) + 7 * 86_400_000).toISOString().slice(0, 10);
  return es.map((e) => ({ ...e, origin: next(e.origin), target: next(e.target), point: e.point + 10, loggedAt: "2026-12-10T09:00:00Z" }));
}

const col = (name: (typeof LOG_COLUMNS)[number]): number => LOG_COLUMNS.indexOf(name);

async function startLog(book: MockBook): Promise<void> {
  const plan = appendPlan(await book.run(readForecastLog), entries);
  await book.run((c) => appendToLog(c, plan, null));
}

describe("reading the log sheet", () => {
  it("places a used range that does not start at A1 into a grid from A1", () => {
    expect(gridFromA1([[1, 2], ["x", ""]], 2, 1)).toEqual([[], [], ["", 1, 2], ["", "x", ""]]);
    expect(gridFromA1([["a"]], 0, 0)).toEqual([["a"]]);
  });

  it("gives null for a book without the sheet, and the sheet's cells from A1 when it has one", async () => {
    const book = new MockBook();
    expect(await book.run(readLogCells)).toBeNull();
    expect(await book.run(readForecastLog)).toBeNull();
    book.addSheet(LOG_SHEET);
    book.type(LOG_SHEET, 2, 1, "note");
    expect(await book.run(readLogCells)).toEqual([[], [], ["", "note"]]);
  });

  it("refuses a sheet of the log's name that is not the log, with the core's sentence", async () => {
    const book = new MockBook();
    book.addSheet(LOG_SHEET, [["Our own log of calls"], ["2026-11-02", "Called the forwarder"]]);
    const e = await book.run(readForecastLog).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(LogRefused);
    expect((e as Error).message).toMatch(/^The book has a sheet “Fairlead Log” that is not Fairlead's forecast log/);
  });
});

describe("appending to the log", () => {
  it("starts the sheet: head, bold header, one row per forecast, weeks as dates, rates and counts formatted, text as text", async () => {
    const book = new MockBook();
    await startLog(book);
    const grid = book.grid(LOG_SHEET);
    expect(grid[0][0]).toBe(LOG_MARK);
    expect(grid[3].slice(0, LOG_COLUMNS.length)).toEqual([...LOG_COLUMNS]);
    expect(grid).toHaveLength(4 + entries.length);
    expect(book.isBold(LOG_SHEET, 0, 0)).toBe(true);
    for (let c = 0; c < LOG_COLUMNS.length; c++) expect(book.isBold(LOG_SHEET, 3, c)).toBe(true);
    expect(book.isBold(LOG_SHEET, 4, 0)).toBe(false);
    entries.forEach((e, i) => {
      const r = 4 + i;
      const row = grid[r];
      expect(row[col("Origin week")]).toBe(serial(e.origin));
      expect(row[col("Target week")]).toBe(serial(e.target));
      expect(book.format(LOG_SHEET, r, col("Target week"))).toBe("yyyy-mm-dd");
      expect(row[col("Forecast")]).toBe(e.point);
      expect(book.format(LOG_SHEET, r, col("Forecast"))).toBe("#,##0.0");
      expect(book.format(LOG_SHEET, r, col("Outer high"))).toBe("#,##0.0");
      expect(row[col("Weeks ahead")]).toBe(i + 1);
      expect(book.format(LOG_SHEET, r, col("Weeks ahead"))).toBe("0");
      expect(book.format(LOG_SHEET, r, col("Inner %"))).toBe("0");
      expect(row[col("Logged at")]).toBe(AT);
      expect(book.format(LOG_SHEET, r, col("Logged at"))).toBe("@");
      expect(book.format(LOG_SHEET, r, col("Row check"))).toBe("@");
      expect(book.format(LOG_SHEET, r, col("Method"))).toBe("@");
    });
    // What was written reads back as the same entries, none of them taken for hand-made.
    const reading = await book.run(readForecastLog);
    expect(reading!.rows.map((r) => r.entry)).toEqual(entries);
    expect(reading!.rows.some((r) => r.byHand)).toBe(false);
  });

  it("writes only values and formats, formats before values, and no text a host would take for a formula", async () => {
    const book = new MockBook();
    await startLog(book);
    const writes = book.writesTo(LOG_SHEET);
    expect([...new Set(writes.map((w) => w.property))].sort()).toEqual(["numberFormat", "values"]);
    expect(writes.findIndex((w) => w.property === "numberFormat")).toBeLessThan(writes.findIndex((w) => w.property === "values"));
    for (const w of writes.filter((x) => x.property === "values")) {
      for (const v of (w.value as unknown[][]).flat()) {
        expect(typeof v === "number" ? Number.isFinite(v) : typeof v === "string" && !v.startsWith("=")).toBe(true);
      }
    }
  });

  it("adds a later Publish's rows below the last, writing nothing above and leaving the earlier rows as they were", async () => {
    const book = new MockBook();
    await startLog(book);
    const before = book.grid(LOG_SHEET).map((r) => [...r]);
    const formatsBefore = before.map((r, i) => r.map((_, c) => book.format(LOG_SHEET, i, c)));
    const written = book.writes.length;

    const reading = await book.run(readForecastLog);
    const plan = appendPlan(reading, weekLater(entries));
    const done = await book.run((c) => appendToLog(c, plan, reading));
    expect(done).toEqual({ sheet: LOG_SHEET, added: entries.length, firstRow: before.length + 1, lastRow: before.length + entries.length, created: false });

    const after = book.grid(LOG_SHEET);
    expect(after).toHaveLength(before.length + entries.length);
    expect(after.slice(0, before.length)).toEqual(before);
    expect(before.map((r, i) => r.map((_, c) => book.format(LOG_SHEET, i, c)))).toEqual(formatsBefore);
    // Every range this append assigned to lies below the earlier rows.
    const fresh = book.writes.slice(written);
    expect(fresh.length).toBeGreaterThan(0);
    for (const w of fresh) expect(w.row).toBeGreaterThanOrEqual(before.length);
    const again = await book.run(readForecastLog);
    expect(again!.rows.map((r) => r.entry)).toEqual([...entries, ...weekLater(entries)]);
  });

  it("keeps rows edited by hand and a note, and appends below the note", async () => {
    const book = new MockBook();
    await startLog(book);
    book.type(LOG_SHEET, 5, col("Forecast"), 1234.5);
    book.type(LOG_SHEET, 4 + entries.length + 1, 0, "note: week 49 was revised by the index");
    const reading = await book.run(readForecastLog);
    expect(reading!.rows.filter((r) => r.byHand).map((r) => r.row + 1)).toEqual([6]);
    const plan = appendPlan(reading, weekLater(entries));
    await book.run((c) => appendToLog(c, plan, reading));
    const grid = book.grid(LOG_SHEET);
    expect(grid[5][col("Forecast")]).toBe(1234.5);
    expect(grid[4 + entries.length + 1][0]).toBe("note: week 49 was revised by the index");
    expect(grid).toHaveLength(4 + entries.length + 2 + entries.length);
    expect(plan.sentences).toContain("1 row of the log was changed or added by hand (row 6); it is kept as it stands and scored as it reads.");
  });

  it("writes nothing when the rows it would fill were filled after the log was read", async () => {
    const book = new MockBook();
    await startLog(book);
    const reading = await book.run(readForecastLog);
    const plan = appendPlan(reading, weekLater(entries));
    book.type(LOG_SHEET, plan.start + 1, 2, "typed meanwhile");
    const written = book.writes.length;
    const e = await book.run((c) => appendToLog(c, plan, reading)).catch((x: unknown) => x);
    expect(e).toBeInstanceOf(LogRefused);
    expect((e as Error).message).toBe(`Row ${plan.start + 2} of Fairlead Log, below its last forecast, was filled while Fairlead was publishing; nothing was added to the log. Publish again.`);
    expect(book.writes.length).toBe(written);
  });

  it("starts no sheet when there is nothing to log", async () => {
    const book = new MockBook();
    const plan = appendPlan(null, []);
    expect(await book.run((c) => appendToLog(c, plan, null))).toMatchObject({ added: 0, created: false });
    expect(book.sheets.has(LOG_SHEET)).toBe(false);
  });

  it("plans the cells of an append into a log whose columns were moved: styles follow the headers", () => {
    const grid: Value[][] = [[LOG_MARK], [], [], ["Desk note", ...LOG_COLUMNS]];
    const reading = { headerRow: 3, columns: Object.fromEntries(LOG_COLUMNS.map((c, j) => [c, j + 1])) as Record<(typeof LOG_COLUMNS)[number], number>, rows: [], unreadable: [], next: grid.length };
    const w = logWrite(appendPlan(reading, entries.slice(0, 1)), reading);
    expect(w.start).toBe(4);
    expect(w.values[0][0]).toBe("");
    expect(w.values[0][1 + col("Target week")]).toBe(serial(entries[0].target));
    expect(w.formats[0][1 + col("Target week")]).toBe("yyyy-mm-dd");
    expect(w.formats[0][1 + col("Forecast")]).toBe("#,##0.0");
    expect(w.formats[0][0]).toBe("General");
    expect(w.bold).toEqual([]);
  });
});
