/**
 * The ledger of cells the pane wrote: fingerprints, their storage, and the comparison that
 * finds someone's typing on a managed sheet.
 */
import { cellKey, editedCells, fingerprint, fnv1a, ledgerOf, ledgerPrints, isSheetLedger } from "../../src/taskpane/ledger";

describe("fingerprints", () => {
  it("are 32-bit FNV-1a", () => {
    // Test vectors of the FNV-1a 32-bit hash as published with the algorithm (Fowler–Noll–Vo,
    // IETF draft-eastlake-fnv, test vectors; from memory of that list): "" → offset basis.
    expect(fnv1a("")).toBe(0x811c9dc5);
    expect(fnv1a("a")).toBe(0xe40c292c);
    expect(fnv1a("foobar")).toBe(0xbf9cf968);
  });

  it("tell text from numbers, and compare numbers at Excel's 15 significant digits", () => {
    expect(fingerprint("")).toBe(0);
    expect(fingerprint(null)).toBe(0);
    expect(fingerprint("12")).not.toBe(fingerprint(12));
    expect(fingerprint(true)).not.toBe(fingerprint("true"));
    // Excel stores 15 significant digits (its documented precision): 0.1 + 0.2 comes back as 0.3.
    expect(cellKey(0.1 + 0.2)).toBe(cellKey(0.3));
    expect(fingerprint(1834.2)).not.toBe(fingerprint(1834.3));
  });
});

describe("ledger storage", () => {
  const values = [
    ["Fairlead managed sheet", "Outlook"],
    ["As of week ending", 46353],
    ["", 1834.25],
  ];

  it("stores 4 bytes a cell as base64, as Node's own encoder writes them", () => {
    const l = ledgerOf("Fairlead Outlook", values, ["Fairlead outlook-x"], ["FL_X_POINT"]);
    expect(l.rows).toBe(3);
    expect(l.cols).toBe(2);
    const bytes = Buffer.alloc(24);
    values.flat().forEach((v, i) => bytes.writeUInt32LE(fingerprint(v), i * 4));
    // Node's Buffer base64 is the reference encoder (RFC 4648).
    expect(l.cells).toBe(bytes.toString("base64"));
    expect(Array.from(ledgerPrints(l))).toEqual(values.flat().map(fingerprint));
    expect(isSheetLedger(JSON.parse(JSON.stringify(l)))).toBe(true);
  });

  it("round-trips every length modulo 3 (base64 padding)", () => {
    for (let n = 1; n <= 7; n++) {
      const row = Array.from({ length: n }, (_, i) => `cell ${i}`);
      const l = ledgerOf("S", [row]);
      expect(l.cells).toBe(Buffer.from(new Uint8Array(new Uint32Array(row.map(fingerprint)).buffer)).toString("base64"));
      expect(Array.from(ledgerPrints(l))).toEqual(row.map(fingerprint));
    }
  });

  it("rejects what is not a ledger", () => {
    expect(isSheetLedger(null)).toBe(false);
    expect(isSheetLedger({ sheet: "S", rows: 1, cols: 1, cells: "AAAAAA==", charts: [1], names: [] })).toBe(false);
    expect(() => ledgerPrints({ sheet: "S", rows: 2, cols: 2, cells: "AAAAAA==", charts: [], names: [] })).toThrow(/size/);
  });
});

describe("edited cells", () => {
  const written = [
    ["Fairlead managed sheet", "Outlook"],
    ["Step", "Forecast"],
    [1, 1834.2],
    [2, 1840.7],
  ];
  const ledger = ledgerOf("Fairlead Outlook", written);

  it("finds nothing when the sheet is as written", () => {
    expect(editedCells(ledger, { row: 0, col: 0, values: written })).toEqual([]);
  });

  it("names a changed cell, a cleared one, and one typed beside the block", () => {
    const now = written.map((r) => [...r, ""]);
    now[3][1] = 1900; // B4 overwritten
    now[2][0] = ""; // A3 cleared
    now[1][2] = "my note"; // C2, outside what was written
    expect(editedCells(ledger, { row: 0, col: 0, values: now })).toEqual([
      { row: 1, col: 2, now: "my note" },
      { row: 2, col: 0, now: "" },
      { row: 3, col: 1, now: 1900 },
    ]);
  });

  it("reads a used range that does not start at A1, and an empty sheet", () => {
    // Used range B2:C2 holds only "Forecast" and a typed value.
    const edits = editedCells(ledger, { row: 1, col: 1, values: [["Forecast", 5]] });
    expect(edits.map((e) => [e.row, e.col])).toEqual([
      [0, 0],
      [0, 1],
      [1, 0],
      [1, 2],
      [2, 0],
      [2, 1],
      [3, 0],
      [3, 1],
    ]);
    expect(editedCells(ledger, null, 3)).toHaveLength(3);
  });
});
