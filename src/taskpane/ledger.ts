/**
 * The pane's record of what it wrote on each managed sheet, so that it never overwrites a
 * cell it did not create. For every cell of the rectangle it wrote, the ledger keeps a 32-bit
 * fingerprint of the value (FNV-1a of a canonical text); before rewriting, the pane reads the
 * sheet back and compares. A cell whose value differs, or a filled cell outside the rectangle,
 * is someone's typing: the pane stops and names it.
 *
 * A fingerprint rather than the value keeps the record small (4 bytes a cell, stored in the
 * workbook's settings): a backtest sheet of 700 × 12 cells costs about 45 kB. Two different
 * values share a fingerprint with odds of 1 in 2^32 per edited cell.
 */
import { fnv1a } from "../core/math/fnv1a";

/** Stored per managed sheet (as JSON in the workbook settings). */
export interface SheetLedger {
  sheet: string;
  rows: number;
  cols: number;
  /** Base64 of rows × cols little-endian uint32 fingerprints, row by row. */
  cells: string;
  /** Charts the pane made on this sheet, by name. */
  charts: string[];
  /** Workbook names the pane defined over this sheet. */
  names: string[];
}

/** One cell as Range.values gives it, in a form that compares what was written with what is read. */
export function cellKey(v: unknown): string {
  if (v === null || v === undefined || v === "") return "";
  // Excel keeps 15 significant digits; compare at that precision.
  if (typeof v === "number") return `n:${Number(v.toPrecision(15))}`;
  if (typeof v === "boolean") return `b:${v}`;
  return `s:${String(v)}`;
}

export { fnv1a };

/** The fingerprint of one cell: FNV-1a of its key; the empty cell is 0 (and nothing else is). */
export function fingerprint(v: unknown): number {
  const key = cellKey(v);
  if (key === "") return 0;
  const h = fnv1a(key);
  return h === 0 ? 1 : h;
}

const B64 = "ABCDEFGHIJKLMNOPQRSTUVWXYZabcdefghijklmnopqrstuvwxyz0123456789+/";

function toBase64(bytes: Uint8Array): string {
  let out = "";
  for (let i = 0; i < bytes.length; i += 3) {
    const a = bytes[i];
    const b = i + 1 < bytes.length ? bytes[i + 1] : 0;
    const c = i + 2 < bytes.length ? bytes[i + 2] : 0;
    const n = (a << 16) | (b << 8) | c;
    out += B64[(n >> 18) & 63] + B64[(n >> 12) & 63];
    out += i + 1 < bytes.length ? B64[(n >> 6) & 63] : "=";
    out += i + 2 < bytes.length ? B64[n & 63] : "=";
  }
  return out;
}

function fromBase64(text: string): Uint8Array {
  const clean = text.replace(/=+$/, "");
  const bytes = new Uint8Array(Math.floor((clean.length * 3) / 4));
  let bits = 0;
  let acc = 0;
  let k = 0;
  for (const ch of clean) {
    const v = B64.indexOf(ch);
    if (v < 0) throw new Error("ledger: not base64");
    acc = (acc << 6) | v;
    bits += 6;
    if (bits >= 8) {
      bits -= 8;
      bytes[k++] = (acc >> bits) & 0xff;
    }
  }
  return bytes;
}

/** The ledger of a written rectangle (values as they went into Range.values). */
export function ledgerOf(sheet: string, values: unknown[][], charts: string[] = [], names: string[] = []): SheetLedger {
  const rows = values.length;
  const cols = rows ? Math.max(...values.map((r) => r.length)) : 0;
  const buf = new Uint8Array(rows * cols * 4);
  const view = new DataView(buf.buffer);
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) view.setUint32((r * cols + c) * 4, fingerprint(values[r][c]), true);
  return { sheet, rows, cols, cells: toBase64(buf), charts: [...charts], names: [...names] };
}

/** Fingerprints of the ledger, row by row. */
export function ledgerPrints(ledger: SheetLedger): Uint32Array {
  const bytes = fromBase64(ledger.cells);
  if (bytes.length !== ledger.rows * ledger.cols * 4) throw new Error("ledger: size does not match its rows and columns");
  const view = new DataView(bytes.buffer);
  const out = new Uint32Array(ledger.rows * ledger.cols);
  for (let i = 0; i < out.length; i++) out[i] = view.getUint32(i * 4, true);
  return out;
}

/** True when `x` has a ledger's shape (settings read back from a book may be anything). */
export function isSheetLedger(x: unknown): x is SheetLedger {
  if (typeof x !== "object" || x === null) return false;
  const o = x as Record<string, unknown>;
  const strings = (v: unknown) => Array.isArray(v) && v.every((s) => typeof s === "string");
  return (
    typeof o.sheet === "string" &&
    Number.isInteger(o.rows) &&
    Number.isInteger(o.cols) &&
    typeof o.cells === "string" &&
    strings(o.charts) &&
    strings(o.names)
  );
}

export interface EditedCell {
  /** 0-based on the sheet. */
  row: number;
  col: number;
  /** What the cell holds now ("" when it was cleared). */
  now: unknown;
}

/**
 * Cells of the sheet that differ from what the ledger recorded: `used` is the sheet's used
 * range (values only) with its top-left cell. Up to `limit` cells, in reading order.
 */
export function editedCells(ledger: SheetLedger, used: { row: number; col: number; values: unknown[][] } | null, limit = 20): EditedCell[] {
  const prints = ledgerPrints(ledger);
  const out: EditedCell[] = [];
  const expected = (r: number, c: number): number => (r < ledger.rows && c < ledger.cols ? prints[r * ledger.cols + c] : 0);
  const actual = (r: number, c: number): unknown => {
    if (!used) return "";
    const rr = r - used.row;
    const cc = c - used.col;
    return rr >= 0 && cc >= 0 && rr < used.values.length ? (used.values[rr][cc] ?? "") : "";
  };
  const rows = Math.max(ledger.rows, used ? used.row + used.values.length : 0);
  const cols = Math.max(ledger.cols, used ? used.col + Math.max(0, ...used.values.map((v) => v.length)) : 0);
  for (let r = 0; r < rows && out.length < limit; r++) {
    for (let c = 0; c < cols && out.length < limit; c++) {
      const now = actual(r, c);
      if (fingerprint(now) !== expected(r, c)) out.push({ row: r, col: c, now });
    }
  }
  return out;
}
