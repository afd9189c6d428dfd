/** Sample median: the middle value, or the mean of the two middle values for an even count. */
export function median(values: ArrayLike<number>): number {
  const sorted = Float64Array.from(values).sort();
  const m = sorted.length;
  if (m === 0) return NaN;
  const h = m >> 1;
  return m % 2 === 1 ? sorted[h] : 0.5 * (sorted[h - 1] + sorted[h]);
}
