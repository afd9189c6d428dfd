import { detectDelimiter, parseCsv } from "../../src/batch/csv";

// RFC 4180 (Shafranovich, 2005), section 2: quoted fields may hold the delimiter, line breaks
// and doubled quotes; the examples below are the RFC's own rules applied to our kind of file.
describe("parseCsv", () => {
  test("quoted fields keep commas, doubled quotes and line breaks (RFC 4180 §2.5–2.7)", () => {
    const rows = parseCsv('Week ending,"Halden–Corvane, FEU",Note\r\n2026-11-20,"1,834.5","said ""firm""\nthen soft"\r\n');
    expect(rows).toEqual([
      ["Week ending", "Halden–Corvane, FEU", "Note"],
      ["2026-11-20", "1,834.5", 'said "firm"\nthen soft'],
    ]);
  });

  test("a byte-order mark from Excel's CSV UTF-8 is dropped and blank lines carry no row", () => {
    expect(parseCsv("\ufeffA,B\n\n1,2\n\n")).toEqual([["A", "B"], ["1", "2"]]);
  });

  test("the delimiter is the one the header line uses most, outside quotes", () => {
    expect(detectDelimiter("Week;Rate;Other\n1;2;3")).toBe(";");
    expect(detectDelimiter('"a;b";"c;d",x,y\n')).toBe(",");
    expect(detectDelimiter("Week\tRate\n")).toBe("\t");
    expect(parseCsv("Week;Rate\n2026-11-20;1834,5\n")).toEqual([["Week", "Rate"], ["2026-11-20", "1834,5"]]);
  });

  test("a last line without a newline is kept, empty trailing fields too", () => {
    expect(parseCsv("a,b,\n1,,")).toEqual([["a", "b", ""], ["1", "", ""]]);
  });
});
