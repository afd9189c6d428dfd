import { weekBin, weekYearTable } from "../../../../src/core/diagnostics/seasonality/weekYear";
import { isoWeek } from "../../../../src/core/series/isoWeek";
import type { WeeklySeries } from "../../../../src/core/series/types";

const DAY = 86_400_000;

// Weeks ending Sunday from 2015-06-07 (ISO 2015-W23) to 2021-01-03 (ISO 2020-W53). Each value
// encodes its own ISO year and week (100·year + week), so placement is read off the cell.
const dates: Date[] = [];
for (let t = Date.UTC(2015, 5, 7); t <= Date.UTC(2021, 0, 3); t += 7 * DAY) dates.push(new Date(t));
const values = Float64Array.from(dates, (d) => {
  const w = isoWeek(d);
  return 100 * w.year + w.week;
});
const s: WeeklySeries = { dates, values, filled: dates.map(() => false), warnings: [], name: "Test lane" };

describe("week × year table", () => {
  const t = weekYearTable(s);

  test("shape: 52 ISO-week rows, one column per ISO year", () => {
    expect(t.columns).toEqual(["ISO week", "2015", "2016", "2017", "2018", "2019", "2020"]);
    expect(t.rows).toHaveLength(52);
    expect(t.rows.map((r) => r[0])).toEqual(Array.from({ length: 52 }, (_, i) => i + 1));
    expect(t.title).toBe("Rates by ISO week and year — Test lane");
  });

  test("placement: each rate in its ISO week's row and ISO year's column", () => {
    // ISO week calendar: 2015-06-07 is a Sunday in 2015-W23, so 2015 weeks 1–22 are empty.
    for (let w = 1; w <= 22; w++) expect(t.rows[w - 1][1]).toBeNull();
    expect(t.rows[22][1]).toBe(201523);
    expect(t.rows[0][2]).toBe(201601); // 2016-01-10 is 2016-W01; 2016-01-03 is 2015-W53
    expect(t.rows[9][5]).toBe(201910);
    for (let c = 2; c <= 6; c++) expect(t.rows[0][c]).toBe(100 * (2014 + c) + 1);
  });

  test("week 53 (2015 and 2020) is folded into row 52 as the mean of weeks 52 and 53", () => {
    expect(t.rows[51][1]).toBe(201552.5);
    expect(t.rows[51][6]).toBe(202052.5);
    expect(t.rows[51][3]).toBe(201752); // 2017 has 52 weeks: nothing folded
    expect(t.notes.join(" ")).toContain("ISO week 53 (in 2015, 2020) is folded into week 52");
    expect(weekBin(new Date(Date.UTC(2021, 0, 3)))).toEqual({ year: 2020, week: 52, folded: true });
  });
});
