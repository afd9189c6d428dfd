/**
 * Axis arithmetic and SVG text helpers for the batch runner's chart images (chartImage.ts):
 * round tick values, tick labels, the dated x-axis labels of a line chart, and the escaping
 * and number formatting that keep the SVG valid and byte-stable.
 */

/** Approximate advance of DejaVu Sans per em, a little wide so estimated labels never touch. */
const EM_WIDTH = 0.6;
const EM_WIDTH_BOLD = 0.66;

/** Estimated width in px of `text` at `size` px; the SVG is laid out before any font is read. */
export function textWidth(text: string, size: number, bold = false): number {
  return [...text].length * size * (bold ? EM_WIDTH_BOLD : EM_WIDTH);
}

/** A coordinate with one decimal: a tenth of a pixel is below what the rasteriser shows. */
export function px(x: number): string {
  const s = x.toFixed(1);
  return s === "-0.0" ? "0.0" : s;
}

/**
 * Text safe inside an XML element or attribute. Characters XML 1.0 forbids (most C0 controls)
 * are dropped, since one of them in a series name would make the whole image fail to parse.
 */
export function escapeXml(s: string): string {
  return s
    .replace(/[\u0000-\u0008\u000B\u000C\u000E-\u001F\uFFFE\uFFFF]/g, "")
    .replace(/&/g, "&amp;")
    .replace(/</g, "&lt;")
    .replace(/>/g, "&gt;")
    .replace(/"/g, "&quot;")
    .replace(/'/g, "&apos;");
}

/** The nearest of 1, 2, 5 × 10^k to x (x > 0), as mantissa and exponent so ticks stay exact. */
function niceStep(x: number): { m: number; e: number } {
  let e = Math.floor(Math.log10(x));
  const f = x / 10 ** e;
  let m = f < 1.5 ? 1 : f < 3 ? 2 : f < 7 ? 5 : 10;
  if (m === 10) {
    m = 1;
    e += 1;
  }
  return { m, e };
}

/**
 * Round tick values covering [min, max], about `count` of them, spaced 1, 2 or 5 × 10^k.
 * This is the common "nice numbers" rule (Heckbert, "Nice numbers for graph labels",
 * Graphics Gems, 1990). Heckbert first rounds the range itself up to a nice number, which can
 * halve the number of ticks; the step here is taken from the raw range instead, as d3 does.
 */
export function niceTicks(min: number, max: number, count: number): number[] {
  if (!Number.isFinite(min) || !Number.isFinite(max)) return [];
  let lo = Math.min(min, max);
  let hi = Math.max(min, max);
  if (hi - lo <= Math.abs(hi) * 1e-12) {
    // A flat series still needs an axis: open it around the value.
    const h = lo === 0 ? 1 : Math.abs(lo) * 0.05;
    lo -= h;
    hi += h;
  }
  const { m, e } = niceStep((hi - lo) / Math.max(1, Math.round(count) - 1));
  // k × m × 10^e computed as an integer divided by a power of ten, so 0.1 × 3 prints as 0.3.
  const value = (k: number): number => (e < 0 ? (k * m) / 10 ** -e : k * m * 10 ** e);
  const step = value(1);
  const k0 = Math.floor(lo / step + 1e-9);
  const k1 = Math.ceil(hi / step - 1e-9);
  const ticks: number[] = [];
  for (let k = k0; k <= k1; k++) ticks.push(value(k) === 0 ? 0 : value(k));
  return ticks;
}

/** Decimals that tell ticks `step` apart: none for whole steps, one for 0.5, two for 0.05. */
export function tickDecimals(step: number): number {
  if (!(step > 0) || step >= 1) return 0;
  return Math.min(10, Math.max(0, -Math.floor(Math.log10(step) + 1e-9)));
}

/** A tick label with thousands separators: 12500 → "12,500", -0.5 with step 0.5 → "-0.5". */
export function formatTick(value: number, step: number): string {
  const s = Math.abs(value).toFixed(tickDecimals(step));
  const [whole, frac] = s.split(".");
  const grouped = whole.replace(/\B(?=(\d{3})+(?!\d))/g, ",");
  const body = frac === undefined ? grouped : `${grouped}.${frac}`;
  return value < 0 && /[1-9]/.test(s) ? `-${body}` : body;
}

/** A labelled position along a category axis. */
export interface AxisLabel {
  index: number;
  label: string;
}

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];
/** Months between date labels, tried from the finest until the labels no longer collide. */
const MONTH_STEPS = [1, 3, 6, 12, 24, 60, 120];
const GAP_PX = 8;

interface Ymd {
  y: number;
  m: number;
  d: number;
}

function parseIso(s: string): Ymd | null {
  const r = /^(\d{4})-(\d{2})-(\d{2})$/.exec(s);
  return r ? { y: Number(r[1]), m: Number(r[2]), d: Number(r[3]) } : null;
}

/** Labels at every `every`-th category, for categories that are not dates. */
function evenLabels(categories: string[], plotWidth: number, fontSize: number): AxisLabel[] {
  const n = categories.length;
  if (n === 0) return [];
  const widest = Math.max(...categories.map((c) => textWidth(c, fontSize)));
  const perCat = n > 1 ? plotWidth / (n - 1) : plotWidth;
  const every = Math.max(1, Math.ceil((widest + GAP_PX) / perCat));
  const out: AxisLabel[] = [];
  for (let i = 0; i < n; i += every) out.push({ index: i, label: categories[i] });
  return out;
}

/**
 * The x labels of a line chart over `categories`, spread evenly over `plotWidth` px. ISO dates
 * get calendar labels at the first week of a month, quarter or year ("Jan 2025", "2024"),
 * the finest that leaves room between labels; other categories are thinned evenly.
 */
export function dateAxisLabels(categories: string[], plotWidth: number, fontSize: number): AxisLabel[] {
  const dates = categories.map(parseIso);
  if (dates.length < 2 || dates.some((d) => d === null)) return evenLabels(categories, plotWidth, fontSize);
  const ymd = dates as Ymd[];
  const perCat = plotWidth / (categories.length - 1);
  for (const step of MONTH_STEPS) {
    const labels: AxisLabel[] = [];
    for (let i = 0; i < ymd.length; i++) {
      const { y, m, d } = ymd[i];
      // The first week of a month: a new month against the previous category, or a first
      // category that falls in the month's first seven days.
      const first = i === 0 ? d <= 7 : ymd[i - 1].m !== m || ymd[i - 1].y !== y;
      if (!first) continue;
      const due = step < 12 ? (m - 1) % step === 0 : m === 1 && y % (step / 12) === 0;
      if (due) labels.push({ index: i, label: step < 12 ? `${MONTHS[m - 1]} ${y}` : String(y) });
    }
    if (labels.length < 2) continue;
    const width = Math.max(...labels.map((l) => textWidth(l.label, fontSize)));
    let fits = true;
    for (let k = 1; k < labels.length && fits; k++) fits = (labels[k].index - labels[k - 1].index) * perCat >= width + GAP_PX;
    if (fits) return labels;
  }
  // A span of a few weeks: the dates themselves, thinned.
  const days = ymd.map((d) => `${d.d} ${MONTHS[d.m - 1]} ${d.y}`);
  return evenLabels(days, plotWidth, fontSize);
}
