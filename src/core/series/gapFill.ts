/**
 * The gap rule of the intake: a run of missing weeks (NaN) between two observed weeks is
 * filled by straight-line interpolation between its neighbours, on the log scale when the
 * series is positive (so a gap is filled at a constant weekly growth rate, the natural
 * path for prices) and on the raw scale otherwise.
 */

/** A run of missing weeks: positions start … start + length − 1. */
export interface Gap {
  start: number;
  length: number;
}

export type FillScale = "log" | "raw";

/**
 * The runs of NaN strictly inside `values`, in order. NaN at the very start or end has no
 * neighbour on one side and is not reported (the intake trims those before filling).
 */
export function findGaps(values: Float64Array): Gap[] {
  const gaps: Gap[] = [];
  let first = 0;
  while (first < values.length && Number.isNaN(values[first])) first++;
  let last = values.length - 1;
  while (last >= 0 && Number.isNaN(values[last])) last--;
  let i = first;
  while (i <= last) {
    if (!Number.isNaN(values[i])) {
      i++;
      continue;
    }
    const start = i;
    while (Number.isNaN(values[i])) i++;
    gaps.push({ start, length: i - start });
  }
  return gaps;
}

/** The scale the rule uses for this series: log when every observed value is positive. */
export function fillScale(values: Float64Array): FillScale {
  for (const v of values) if (!Number.isNaN(v) && !(v > 0)) return "raw";
  return "log";
}

/**
 * Fills one gap in place. With neighbours a (before) and b (after) and L missing weeks,
 * week k = 1 … L of the gap gets
 *   log scale: a · r^k with r = (b / a)^(1 / (L + 1))   (geometric interpolation)
 *   raw scale: a + (b − a) · k / (L + 1)                (linear interpolation)
 * Powers of the one-step ratio keep simple cases exact (100, _, _, 800 → 200, 400).
 */
export function fillGap(values: Float64Array, gap: Gap, scale: FillScale): void {
  const { start, length } = gap;
  if (start < 1 || start + length >= values.length) {
    throw new RangeError("A gap at the very start or end of a series cannot be interpolated.");
  }
  const a = values[start - 1];
  const b = values[start + length];
  const steps = length + 1;
  if (scale === "log") {
    if (!(a > 0 && b > 0)) throw new RangeError("Log-scale filling needs positive neighbours.");
    const r = Math.pow(b / a, 1 / steps);
    for (let k = 1; k <= length; k++) values[start + k - 1] = a * Math.pow(r, k);
  } else {
    for (let k = 1; k <= length; k++) values[start + k - 1] = a + ((b - a) * k) / steps;
  }
}
