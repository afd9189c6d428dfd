/** A1 cell names, as every sink writes and reads them: column letters and 1-based rows. */

/** "A" → 0, "Z" → 25, "AA" → 26 (letters of either case). */
export function columnIndex(letters: string): number {
  let col = 0;
  for (const ch of letters.toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
  return col - 1;
}

/** The column letters of a 0-based column: 0 → "A", 26 → "AA". */
export function columnLetters(col: number): string {
  let c = col + 1;
  let letters = "";
  while (c > 0) {
    const r = (c - 1) % 26;
    letters = String.fromCharCode(65 + r) + letters;
    c = Math.floor((c - 1) / 26);
  }
  return letters;
}

/** The A1 name of a 0-based cell, e.g. {row: 11, col: 2} → "C12". */
export function cellName(row: number, col: number): string {
  return `${columnLetters(col)}${row + 1}`;
}
