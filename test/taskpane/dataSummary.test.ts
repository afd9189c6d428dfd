/** The Data section: the core's Data table for a selection, and sentences that point at cells. */
import { InputError } from "../../src/core/series/errors";
import { cellName, describeFailure, originOf, summariseBlocks } from "../../src/taskpane/dataSummary";

// Fridays as Excel serials: 2025-01-03 is 45660 (1900 date system).
const friday = (k: number): number => 45660 + 7 * k;
const facts = (rows: (string | number | null)[][]): Record<string, unknown> =>
  Object.fromEntries(rows.map((r) => [r[0], r[1]]));

describe("summariseBlocks", () => {
  it("shows the core's Data table for a dated series with a filled week", () => {
    // The week ending 2025-01-17 (k = 2) is missing from the dates: one filled week.
    const weeks = [0, 1, 3, 4];
    const v = summariseBlocks({
      address: "Rates!C1:C5",
      values: [["Halden–Corvane"], [1800], [1810], [1830], [1840]],
      dates: [["Week ending"], ...weeks.map((k) => [friday(k)])],
      datesAddress: "Rates!B1:B5",
      datesFrom: "left",
    });
    expect(v.ratesAddress).toBe("Rates!C1:C5");
    expect(v.datesAddress).toBe("Rates!B1:B5");
    expect(v.weeks).toBe(5);
    expect(v.table.title).toBe("Data");
    expect(facts(v.table.rows)).toMatchObject({
      Series: "Halden–Corvane",
      "Weeks read": 5,
      "First week ending": "2025-01-03",
      "Last week ending": "2025-01-31",
      "Weeks end on": "Friday",
      "Weeks filled": 1,
    });
    expect(v.table.notes.some((w) => w.includes("2025-01-17"))).toBe(true);
  });

  it("says when no dates were found", () => {
    const v = summariseBlocks({ address: "Rates!A1:A4", values: [[1], [2], [3], [4]], datesFrom: "none" });
    expect(v.datesAddress).toBeNull();
    expect(facts(v.table.rows)).toMatchObject({ Series: null, "Weeks read": 4, "First week ending": null, "Weeks end on": null });
    expect(v.table.notes.join(" ")).toMatch(/No dates were given/);
  });

  it("lets the intake's InputError through, with the sheet cell it points at", () => {
    const blocks = { address: "'Lane book'!D10:D12", values: [[1], ["x"], [3]], datesFrom: "none" as const };
    let caught: unknown;
    try {
      summariseBlocks(blocks);
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(InputError);
    expect((caught as InputError).cell).toEqual({ row: 10, col: 3 });
    expect(describeFailure(caught, blocks)).toBe("Row 2 holds \"x\", which is not a number. (Cell 'Lane book'!D11.)");
  });
});

describe("addresses", () => {
  it("reads the top-left cell of an A1 address", () => {
    expect(originOf("Rates!C12:C40")).toEqual({ sheet: "Rates", row: 11, col: 2 });
    expect(originOf("'Lane book'!$AB$2")).toEqual({ sheet: "'Lane book'", row: 1, col: 27 });
    expect(originOf("A1")).toEqual({ sheet: "", row: 0, col: 0 });
    expect(originOf("Rates!#REF!")).toBeNull();
  });
  it("names cells in A1 style, past column Z", () => {
    expect(cellName(0, 0)).toBe("A1");
    expect(cellName(11, 2)).toBe("C12");
    expect(cellName(4, 25)).toBe("Z5");
    expect(cellName(4, 26)).toBe("AA5");
    expect(cellName(0, 701)).toBe("ZZ1");
    expect(cellName(0, 702)).toBe("AAA1");
  });
});

describe("describeFailure", () => {
  it("shows an InputError's own sentence", () => {
    expect(describeFailure(new InputError("NOT_A_NUMBER", "Row 2 holds \"x\", which is not a number."))).toBe(
      "Row 2 holds \"x\", which is not a number.",
    );
  });

  it("explains Excel's cell-edit mode and hides any other internal text", () => {
    expect(describeFailure({ code: "InvalidOperationInCellEditMode", message: "x" })).toMatch(/editing a cell/);
    const plain = describeFailure(new Error("RichApi.Error at line 4711"));
    expect(plain).not.toMatch(/RichApi|4711/);
    expect(plain).toMatch(/Read selection again/);
  });
});
