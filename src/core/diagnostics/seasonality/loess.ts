/**
 * Loess on equally spaced points, as STL uses it: Cleveland, Cleveland, McRae & Terpenning
 * (1990), "STL: A Seasonal-Trend Decomposition Procedure Based on Loess", J. Official
 * Statistics 6(1), section 2 ("Loess").
 *
 * The points sit at positions 0 … n−1. A fit at position x uses the q positions nearest x
 * (a window of q consecutive positions, centred where the ends allow), neighbourhood weights
 * v_i = W(|i − x| / λ_q(x)) with the tricube W(u) = (1 − u³)³ for u < 1 and 0 otherwise,
 * λ_q(x) the distance from x to the farthest of the q neighbours. When q exceeds the number
 * of points n, the window is all n points and λ is widened. The paper (section 2, as we recall
 * its text) scales it, λ_q = λ_n · q / n; we widen it instead by ⌊(q − n) / 2⌋ positions,
 * λ_q = λ_n + ⌊(q − n) / 2⌋ — the convention of the reference output (statsmodels STL),
 * found by comparing outputs, not by reading its code: with the scaled rule the seasonal
 * component differs from it by 0.014 ppm on weekly CO2 (seasonal swing about 6 ppm) with
 * n_s = 53 and 14-point cycle-subseries, and by 4.4 on yearly sunspots with n_s = 53; with the
 * widened rule both agree to 1e-11 (test/reference/make_stl.py). Both grow the window smoothly as q
 * grows past n; the reference's rule is kept so users comparing with it see the same numbers.
 * The weights are multiplied by robustness weights when given, and a weighted polynomial of
 * degree 0 (a weighted mean) or 1 (a weighted line) is evaluated at x.
 *
 * Everything is flat over Float64Array: one fit costs O(q), a smooth of n points O(n·q),
 * and with a "jump" j the fit is made only at every j-th position (and the last), the
 * positions between being filled by linear interpolation (the paper's speed-up for long
 * windows, in its section on implementation).
 */

// Tricube weights W(d / λ) = (1 − (d/λ)³)³ for the integer distances d = 0 … λ−1 (W = 0 from
// d = λ on). λ is an integer here (integer positions, integer widening), and consecutive fits
// mostly share it, so the table is rebuilt only when λ changes.
let table = new Float64Array(128);
let tableH = -1;

function tricubeTable(h: number): Float64Array {
  if (h === tableH) return table;
  if (table.length < h) table = new Float64Array(2 * h);
  const inv = 1 / h;
  for (let d = 0; d < h; d++) {
    const u = d * inv;
    const c = 1 - u * u * u;
    table[d] = c * c * c;
  }
  tableH = h;
  return table;
}

/**
 * The loess value at position `x` (may lie outside 0 … n−1, for STL's extension of each
 * cycle-subseries by one period at both ends) from the points `left` … `right` (inclusive)
 * of `y`, window length `q`, degree 0 or 1, optional robustness weights `rw`. Positions
 * `x`, `left`, `right` are whole numbers (the tricube table is indexed by distance).
 * Returns NaN when every weight in the window is zero (the caller decides the fallback).
 */
export function loessAt(
  y: Float64Array,
  n: number,
  q: number,
  degree: 0 | 1,
  x: number,
  left: number,
  right: number,
  rw: Float64Array | null,
): number {
  // λ_q(x): distance to the farthest neighbour in the window, widened when q > n (see above).
  let h = Math.max(x - left, right - x);
  if (q > n) h += (q - n) >> 1;
  if (h <= 0) return y[left];
  const tw = tricubeTable(h);
  // One pass of weighted sums in d = i − x: S0 = Σw, S1 = Σw d, S2 = Σw d², T0 = Σw y,
  // T1 = Σw d y, with w the tricube weight of |d| times the robustness weight.
  let s0 = 0;
  let s1 = 0;
  let s2 = 0;
  let t0 = 0;
  let t1 = 0;
  const from = Math.max(left, x - h + 1);
  const to = Math.min(right, x + h - 1);
  for (let i = from; i <= to; i++) {
    const d = i - x;
    let w = tw[d < 0 ? -d : d];
    if (rw !== null) w *= rw[i];
    const wy = w * y[i];
    s0 += w;
    s1 += w * d;
    s2 += w * d * d;
    t0 += wy;
    t1 += wy * d;
  }
  if (!(s0 > 0)) return NaN;
  const mean = t0 / s0;
  if (degree === 0) return mean;
  // Weighted least-squares line a + b d evaluated at d = 0 (that is, at x):
  // b = (T1 − S1 T0 / S0) / (S2 − S1² / S0), a = T0 / S0 − b S1 / S0.
  const dbar = s1 / s0;
  const sdd = s2 - s1 * dbar;
  // When the weight sits on (almost) one position the slope is not identified: keep the mean.
  if (sdd <= 1e-10 * s0) return mean;
  const b = (t1 - dbar * t0) / sdd;
  return mean - b * dbar;
}

/**
 * Loess smooth of y[0 … n−1] evaluated at every position into out[0 … n−1], fitting at
 * every `jump`-th position and at n−1 and interpolating linearly between them.
 * When a fit has no weight (robustness weights all zero in its window) the observed value
 * is kept at that position.
 */
export function loessSmooth(
  y: Float64Array,
  n: number,
  q: number,
  degree: 0 | 1,
  jump: number,
  rw: Float64Array | null,
  out: Float64Array,
): void {
  if (n <= 0) return;
  if (n === 1) {
    out[0] = y[0];
    return;
  }
  const half = (q - 1) >> 1;
  const step = Math.max(1, Math.min(jump, n - 1));
  let prev = -1;
  for (let x = 0; ; x += step) {
    if (x > n - 1) x = n - 1;
    let left: number;
    let right: number;
    if (q >= n) {
      left = 0;
      right = n - 1;
    } else {
      left = Math.min(Math.max(x - half, 0), n - q);
      right = left + q - 1;
    }
    const v = loessAt(y, n, q, degree, x, left, right, rw);
    out[x] = Number.isNaN(v) ? y[x] : v;
    if (prev >= 0 && x - prev > 1) {
      const a = out[prev];
      const slope = (out[x] - a) / (x - prev);
      for (let i = prev + 1; i < x; i++) out[i] = a + slope * (i - prev);
    }
    prev = x;
    if (x === n - 1) break;
  }
}
