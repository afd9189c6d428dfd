/** A check on the first rate read: is it on the scale of the rates after it? */
import { Locator, capitalise, positionName, weeksWord } from "./wording";
import { median as medianOf } from "../math/median";

/** Factor beyond which the first rate is called out of scale with the ones after it. */
const OUT_OF_SCALE = 5;
/** How many rates after the first its scale is judged against. */
const SCALE_WINDOW = 10;

/**
 * A warning when the first rate is far out of scale with the next rates (below 1/5 or above
 * 5 times the median of the next up to 10): often an index name or year typed as a header
 * and read as a number ("CNY 2024" over rates near 200). The rate is kept; the desk decides.
 * Needs at least three rates after the first (a median of one or two is no measure of
 * scale) and a positive median to judge by.
 */
export function firstValueOutOfScale(
  rows: readonly { at: number; value: number | null }[],
  loc: Locator,
): string | undefined {
  const observed = rows.filter((r) => r.value !== null) as { at: number; value: number }[];
  if (observed.length < 4) return undefined;
  const head = observed[0];
  const next = observed.slice(1, 1 + SCALE_WINDOW).map((r) => r.value);
  const m = next.length;
  const median = medianOf(next);
  if (!(median > 0)) return undefined;
  if (head.value >= median / OUT_OF_SCALE && head.value <= median * OUT_OF_SCALE) return undefined;
  return (
    `${capitalise(positionName(loc, head.at))} holds ${head.value}, far out of scale with the ` +
    `${weeksWord(m)} after it (median ${median}); it was kept, but check that it is a rate and ` +
    "not a year or code typed as a header."
  );
}
