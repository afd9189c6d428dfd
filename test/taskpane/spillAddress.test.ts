/**
 * A1 address arithmetic. Expected values are worked by hand from Excel's A1 rules: columns
 * A–Z are 1–26, AA follows Z, XFD (16,384) is the last column and 1,048,576 the last row;
 * sheet names with spaces or quotes are quoted, a quote inside doubled.
 */
import {
  columnIndex,
  columnLetters,
  followSpill,
  formatAddress,
  intersect,
  localAddress,
  parseAddress,
  quoteSheet,
  type CellRect,
} from "../../src/taskpane/spillAddress";

const rect = (sheet: string | null, firstRow: number, firstCol: number, lastRow: number, lastCol: number): CellRect => ({ sheet, firstRow, firstCol, lastRow, lastCol });

describe("columns", () => {
  test.each([
    ["A", 0],
    ["Z", 25],
    ["AA", 26],
    ["AZ", 51],
    ["BA", 52],
    ["XFD", 16383],
  ])("%s is column %i (0-based) and back", (letters, index) => {
    expect(columnIndex(letters)).toBe(index);
    expect(columnLetters(index)).toBe(letters);
  });

  test("past XFD is not a column", () => {
    expect(columnIndex("XFE")).toBeNull();
  });
});

describe("parseAddress", () => {
  test("a quoted sheet, absolute marks: 'Sheet name'!$C$5:$C$60 is column C, rows 5–60", () => {
    expect(parseAddress("'Decomp sheet'!$C$5:$C$60")).toEqual(rect("Decomp sheet", 4, 2, 59, 2));
  });

  test("a formula-style source with '=', a plain sheet, mixed marks, reversed corners", () => {
    expect(parseAddress("=Rates!$B$2:$B$50")).toEqual(rect("Rates", 1, 1, 49, 1));
    expect(parseAddress("Rates!D9:B$2")).toEqual(rect("Rates", 1, 1, 8, 3));
    expect(parseAddress("C5")).toEqual(rect(null, 4, 2, 4, 2));
  });

  test("a doubled quote in a sheet name is one quote", () => {
    expect(parseAddress("'Tom''s lanes'!A1:A3")).toEqual(rect("Tom's lanes", 0, 0, 2, 0));
  });

  test.each([
    ["several areas", "(Rates!$A$1:$A$3,Rates!$A$5:$A$7)"],
    ["a list of ranges", "Rates!A1:A3,Rates!A5:A7"],
    ["an array constant", "={1,2,3}"],
    ["a whole column", "Rates!C:C"],
    ["another workbook", "[Book2.xlsx]Rates!$A$1:$A$3"],
    ["an unclosed quote", "'Rates!A1"],
    ["a row past the last", "A1048577"],
    ["empty", ""],
  ])("%s is not followed", (_, text) => {
    expect(parseAddress(text)).toBeNull();
  });
});

describe("formatting", () => {
  test("sheet names are quoted when they are not plain words", () => {
    expect(quoteSheet("Rates")).toBe("Rates");
    expect(quoteSheet("Decomp sheet")).toBe("'Decomp sheet'");
    expect(quoteSheet("Tom's")).toBe("'Tom''s'");
    expect(quoteSheet("2026")).toBe("'2026'");
    // Would read as a cell reference.
    expect(quoteSheet("AB12")).toBe("'AB12'");
  });

  test("addresses come back in the form Excel gives chart sources", () => {
    expect(formatAddress(rect("Decomp sheet", 4, 2, 60, 2))).toBe("'Decomp sheet'!$C$5:$C$61");
    expect(localAddress(rect("Rates", 0, 27, 0, 27))).toBe("$AB$1");
    expect(formatAddress(rect(null, 1, 1, 49, 1))).toBe("$B$2:$B$50");
    const text = "'Tom''s lanes'!$A$1:$A$3";
    expect(formatAddress(parseAddress(text) as CellRect)).toBe(text);
  });
});

describe("intersect", () => {
  test("the overlap of two rectangles on the same sheet (names compared as Excel does, ignoring case)", () => {
    expect(intersect(rect("Rates", 0, 0, 9, 3), rect("rates", 5, 2, 20, 8))).toEqual(rect("Rates", 5, 2, 9, 3));
  });

  test("none when they only touch diagonally, or lie on different sheets", () => {
    expect(intersect(rect("Rates", 0, 0, 4, 4), rect("Rates", 5, 5, 9, 9))).toBeNull();
    expect(intersect(rect("Rates", 0, 0, 9, 9), rect("Other", 0, 0, 9, 9))).toBeNull();
  });
});

describe("followSpill", () => {
  // =FAIRLEAD.DECOMPOSE anchored at A4 (header row), four columns, now down to row 61.
  const spill = rect("Decomp sheet", 3, 0, 60, 3);

  test("C5:C60 with the spill now ending at row 61 becomes C5:C61", () => {
    const now = followSpill(rect("Decomp sheet", 4, 2, 59, 2), spill);
    expect(now).toEqual(rect("Decomp sheet", 4, 2, 60, 2));
    expect(formatAddress(now as CellRect)).toBe("'Decomp sheet'!$C$5:$C$61");
  });

  test("a spill that shrank shortens the series to its last row", () => {
    expect(followSpill(rect("Decomp sheet", 4, 2, 59, 2), rect("Decomp sheet", 3, 0, 50, 3))).toEqual(rect("Decomp sheet", 4, 2, 50, 2));
  });

  test("a one-row source follows the spill's last column", () => {
    expect(followSpill(rect("Decomp sheet", 3, 1, 3, 2), spill)).toEqual(rect("Decomp sheet", 3, 1, 3, 3));
  });

  test("nothing to follow: a block of columns, a first cell outside the spill, another sheet", () => {
    expect(followSpill(rect("Decomp sheet", 4, 1, 59, 2), spill)).toBeNull();
    expect(followSpill(rect("Decomp sheet", 4, 5, 59, 5), spill)).toBeNull();
    expect(followSpill(rect("Decomp sheet", 2, 2, 59, 2), spill)).toBeNull();
    expect(followSpill(rect("Rates", 4, 2, 59, 2), spill)).toBeNull();
  });
});
