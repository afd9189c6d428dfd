/** Sample quantiles. */

/**
 * Sample quantile of sorted values by linear interpolation between order statistics
 * (Hyndman & Fan, 1996, definition 7): position (m − 1)·prob from the smallest, 0-based.
 */
export function quantileSorted(sorted: Float64Array, prob: number): number {
  const m = sorted.length;
  const pos = (m - 1) * prob;
  const lo = Math.floor(pos);
  const hi = Math.min(lo + 1, m - 1);
  const frac = pos - lo;
  return sorted[lo] + frac * (sorted[hi] - sorted[lo]);
}
