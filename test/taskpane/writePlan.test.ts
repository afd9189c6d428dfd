/**
 * What the pane puts into the cells of a managed sheet.
 */
import type { ManagedSheet } from "../../src/core/present/sheets";
import { TEXT_FORMAT, writePlan, writtenValue } from "../../src/taskpane/writePlan";

describe("write plan", () => {
  it("writes ISO dates as Excel date serials", () => {
    // Excel's DATE(2025,1,3) is 45660 (the serial the readSelection tests use); 2026-11-27 is 693 days later.
    expect(writtenValue("2025-01-03", "date")).toBe(45660);
    expect(writtenValue("2026-11-27", "date")).toBe(46353);
    // Outside a date-styled cell ISO text stays text; blanks and non-finite numbers are empty.
    expect(writtenValue("2026-11-27", "note")).toBe("2026-11-27");
    expect(writtenValue(null, "rate")).toBe("");
    expect(writtenValue(Number.NaN, "rate")).toBe("");
  });

  it("gives every cell a format and every styled range its look", () => {
    const sheet: ManagedSheet = {
      kind: "outlook",
      name: "Fairlead Outlook",
      cells: [
        ["Fairlead managed sheet", "Outlook"],
        ["Week ending", "Forecast"],
        ["2026-12-04", 1834.25],
        ["1/2", null],
      ],
      width: 2,
      styles: [
        { row: 0, col: 0, rows: 1, cols: 1, style: "mark" },
        { row: 1, col: 0, rows: 1, cols: 2, style: "header" },
        { row: 2, col: 0, rows: 1, cols: 1, style: "date" },
        { row: 2, col: 1, rows: 1, cols: 1, style: "rate" },
      ],
      names: [],
      charts: [],
      blocks: [],
    };
    const plan = writePlan(sheet);
    expect(plan.values).toEqual([
      ["Fairlead managed sheet", "Outlook"],
      ["Week ending", "Forecast"],
      [46360, 1834.25],
      ["1/2", ""],
    ]);
    // Text as text: "1/2" must not turn into 1 February.
    expect(plan.formats).toEqual([
      [TEXT_FORMAT, TEXT_FORMAT],
      [TEXT_FORMAT, TEXT_FORMAT],
      ["yyyy-mm-dd", "#,##0.0"],
      [TEXT_FORMAT, "General"],
    ]);
    expect(plan.looks.map((l) => [l.row, l.col, l.rows, l.cols, l.font?.bold ?? false, l.fill ?? null])).toEqual([
      [0, 0, 1, 1, true, null],
      [1, 0, 1, 2, true, "#E8EEF4"],
    ]);
  });
});
