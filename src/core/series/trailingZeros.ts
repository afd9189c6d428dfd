/**
 * Trailing rows of 0 at the foot of a rate column: formula rows a desk has set up for weeks
 * to come, which show 0 until the week's rate is in.
 */
import { isBlankCell, readRateCell } from "./cells";
import { Locator, positionName, positionsName } from "./wording";

/** The rate a cell reads as, or undefined for a blank or a cell the intake will refuse. */
function peekRate(raw: unknown): number | undefined {
  const r = readRateCell(raw);
  return typeof r === "number" ? r : undefined;
}

/**
 * Desks pre-fill formula rows for weeks to come, and those show 0 until the week is in. A
 * run of exact zeros (blanks among them allowed) at the end of the kept rows, after a
 * non-zero rate, is therefore trimmed like blank rows, unless a zero appears earlier too:
 * a series that holds zeros elsewhere may really be at zero, and a zero in the middle is a
 * rate like any other. Cells are only peeked at here; problems are still reported in row
 * order by the main read. Returns undefined when nothing is trimmed.
 */
export function trailingZeros(
  cells: readonly unknown[],
  first: number,
  last: number,
): { keptLast: number; warning: (loc: Locator) => string } | undefined {
  let end = last;
  const zeroRows: number[] = [];
  for (; end >= first; end--) {
    if (isBlankCell(cells[end])) continue;
    if (peekRate(cells[end]) !== 0) break;
    zeroRows.push(end);
  }
  if (zeroRows.length === 0 || end < first) return undefined; // nothing but zeros
  for (let i = first; i < end; i++) if (peekRate(cells[i]) === 0) return undefined;
  const keptLast = end;
  const count = last - keptLast;
  const allZero = zeroRows.length === count;
  return {
    keptLast,
    warning: (loc) => {
      const run = Array.from({ length: count }, (_, k) => keptLast + 1 + k);
      const hold = allZero ? (count === 1 ? "holds 0" : "hold 0") : "hold 0 or nothing";
      const weeks = count === 1 ? "a week" : "weeks";
      return count === 1
        ? `The last ${loc.unit} (${positionName(loc, run[0])}) ${hold}, read as ${weeks} not yet ` +
            "filled in, and was left out."
        : `The last ${count} ${loc.unit}s (${positionsName(loc, run)}) ${hold}, read as ${weeks} ` +
            "not yet filled in, and were left out.";
    },
  };
}
