/**
 * Chart images for the batch runner's output books: a ChartSpec (core/present/chartSpec.ts)
 * drawn as SVG by our own code, then rasterised to PNG by resvg with DejaVu Sans loaded from
 * the npm package, so the pixels do not depend on the fonts of the machine running the batch.
 * The layout (title, legend, plot, caption) is shared by the three kinds in chartFrame.ts.
 */
import * as fs from "fs";
import { initWasm, Resvg } from "@resvg/resvg-wasm";
import type { ChartSeries, ChartSpec, ColumnChartSpec, LineChartSpec, RadarChartSpec } from "../core/present/chartSpec";
import { dateAxisLabels, escapeXml, formatTick, niceTicks, px, textWidth } from "./chartAxes";
import type { LegendItem, Plot } from "./chartFrame";
import { COLORS, LABEL_SIZE, PALETTE, emptyChart, frame, svgDocument, yAxis } from "./chartFrame";

export interface ChartSize {
  width: number;
  height: number;
}

const DEFAULT_SIZE: ChartSize = { width: 960, height: 480 };
const RADAR_SIZE: ChartSize = { width: 640, height: 640 };
/** Band opacities, widest first: each inner band adds to the ones under it. */
const BAND_OPACITY = [0.14, 0.18, 0.22, 0.26];
/** Share of the data range left above and below the lines, so no line runs along the frame. */
const Y_PAD = 0.05;

function finite(v: number | null | undefined): v is number {
  return typeof v === "number" && Number.isFinite(v);
}

function finiteValues(lists: (number | null)[][]): number[] {
  const out: number[] = [];
  for (const l of lists) for (const v of l) if (finite(v)) out.push(v);
  return out;
}

function extent(vs: number[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of vs) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return [lo, hi];
}

/**
 * An SVG path through the finite points, a new subpath after each gap; a point with gaps on
 * both sides has no segment to show, so it is returned for a dot instead.
 */
function gappedPath(points: ([number, number] | null)[]): { d: string; dots: [number, number][] } {
  const parts: string[] = [];
  const dots: [number, number][] = [];
  let run: [number, number][] = [];
  const flush = (): void => {
    if (run.length === 1) dots.push(run[0]);
    else if (run.length > 1) parts.push(run.map(([x, y], k) => `${k === 0 ? "M" : "L"}${px(x)} ${px(y)}`).join(""));
    run = [];
  };
  for (const p of points) {
    if (p) run.push(p);
    else flush();
  }
  flush();
  return { d: parts.join(""), dots };
}

function seriesElement(cls: string, d: string, dots: [number, number][], stroke: string, width: number, dash?: string): string {
  const out: string[] = [];
  if (d) {
    const dashAttr = dash ? ` stroke-dasharray="${dash}"` : "";
    out.push(
      `<path class="series ${cls}" d="${d}" fill="none" stroke="${stroke}" stroke-width="${width}"${dashAttr} stroke-linejoin="round" stroke-linecap="round"/>`,
    );
  }
  for (const [x, y] of dots) out.push(`<circle class="dot ${cls}" cx="${px(x)}" cy="${px(y)}" r="${px(width + 0.5)}" fill="${stroke}"/>`);
  return out.join("");
}

function lineStyle(s: ChartSeries, k: number): { stroke: string; width: number; dash?: string } {
  if (s.role === "history") return { stroke: COLORS.history, width: 1.8 };
  if (s.role === "forecast") return { stroke: COLORS.forecast, width: 2, dash: "6 4" };
  return { stroke: PALETTE[k % PALETTE.length], width: 1.8 };
}

function lineLegend(spec: LineChartSpec): LegendItem[] {
  const items: LegendItem[] = spec.series.map((s, k) => {
    const st = lineStyle(s, k);
    return { label: s.name, swatch: "line", color: st.stroke, dash: st.dash };
  });
  // A band's swatch shows the tint it has on the chart, over the wider bands beneath it.
  let clear = 1;
  spec.bands.forEach((b, i) => {
    clear *= 1 - BAND_OPACITY[Math.min(i, BAND_OPACITY.length - 1)];
    items.push({ label: b.name, swatch: "fill", color: COLORS.forecast, opacity: 1 - clear });
  });
  return items;
}

function lineChart(spec: LineChartSpec, size: ChartSize): string {
  const f = frame(spec, size, lineLegend(spec));
  const vs = finiteValues([...spec.series.map((s) => s.values), ...spec.bands.flatMap((b) => [b.low, b.high])]);
  if (vs.length === 0) return emptyChart(f, size);
  let [lo, hi] = extent(vs);
  const pad = hi > lo ? (hi - lo) * Y_PAD : Math.abs(hi) * Y_PAD || 1;
  lo -= pad;
  hi += pad;
  const { plot, parts } = yAxis(f, size, spec.yTitle, lo, hi, niceTicks(lo, hi, 6));
  const n = spec.categories.length || Math.max(...spec.series.map((s) => s.values.length));
  const x = (i: number): number => (n > 1 ? plot.left + ((plot.right - plot.left) * i) / (n - 1) : (plot.left + plot.right) / 2);
  const y = plot.y;

  spec.bands.forEach((b, i) => {
    const opacity = BAND_OPACITY[Math.min(i, BAND_OPACITY.length - 1)];
    let run: number[] = [];
    const flush = (): void => {
      if (run.length > 1) {
        const upper = run.map((j) => `${px(x(j))},${px(y(b.high[j] as number))}`);
        const lower = run.map((j) => `${px(x(j))},${px(y(b.low[j] as number))}`).reverse();
        parts.push(`<polygon class="band" points="${[...upper, ...lower].join(" ")}" fill="${COLORS.forecast}" fill-opacity="${opacity}"/>`);
      }
      run = [];
    };
    for (let j = 0; j < Math.min(b.low.length, b.high.length); j++) {
      if (finite(b.low[j]) && finite(b.high[j])) run.push(j);
      else flush();
    }
    flush();
  });

  parts.push(...categoryAxis(plot, dateAxisLabels(spec.categories, plot.right - plot.left, LABEL_SIZE).map((l) => ({ x: x(l.index), label: l.label })), size));
  spec.series.forEach((s, k) => {
    const st = lineStyle(s, k);
    const { d, dots } = gappedPath(s.values.map((v, i) => (finite(v) ? [x(i), y(v)] : null)));
    parts.push(seriesElement(s.role, d, dots, st.stroke, st.width, st.dash));
  });
  return svgDocument(size, parts);
}

/** The x axis line, its tick marks and labels; labels are kept inside the image. */
function categoryAxis(plot: Plot, labels: { x: number; label: string }[], size: ChartSize): string[] {
  const out = [`<line class="x-axis" x1="${px(plot.left)}" y1="${px(plot.bottom)}" x2="${px(plot.right)}" y2="${px(plot.bottom)}" stroke="${COLORS.axis}" stroke-width="1"/>`];
  for (const l of labels) {
    const half = textWidth(l.label, LABEL_SIZE) / 2;
    const tx = Math.min(Math.max(l.x, half + 2), size.width - half - 2);
    out.push(`<line x1="${px(l.x)}" y1="${px(plot.bottom)}" x2="${px(l.x)}" y2="${px(plot.bottom + 4)}" stroke="${COLORS.axis}" stroke-width="1"/>`);
    out.push(`<text class="x-label" x="${px(tx)}" y="${px(plot.bottom + 17)}" text-anchor="middle" font-size="${LABEL_SIZE}" fill="${COLORS.muted}">${escapeXml(l.label)}</text>`);
  }
  return out;
}

/** Earlier years fade from light to mid grey-blue; the latest is drawn dark and thick. */
function yearStyle(k: number, count: number): { stroke: string; width: number } {
  if (k === count - 1) return { stroke: COLORS.history, width: 2.6 };
  const light = [0xc6, 0xd1, 0xdf];
  const mid = [0x8c, 0xa0, 0xba];
  const t = count > 2 ? k / (count - 2) : 1;
  const hex = light.map((c, i) => Math.round(c + (mid[i] - c) * t).toString(16).padStart(2, "0")).join("");
  return { stroke: `#${hex.toUpperCase()}`, width: 1.3 };
}

function radarChart(spec: RadarChartSpec, size: ChartSize): string {
  const count = spec.series.length;
  const legend: LegendItem[] = spec.series.map((s, k) => ({ label: s.name, swatch: "line", color: yearStyle(k, count).stroke }));
  const f = frame(spec, size, legend);
  const vs = finiteValues(spec.series.map((s) => s.values));
  if (vs.length === 0) return emptyChart(f, size);
  const [lo, hi] = extent(vs);
  const ticks = niceTicks(lo, hi, 5);
  const r0 = ticks[0];
  const r1 = ticks[ticks.length - 1];
  const step = ticks[1] - ticks[0];
  // Room for the week labels outside the outer ring and the caption below.
  const top = f.top + 22;
  const bottom = size.height - 48;
  const R = Math.max(10, Math.min(size.width / 2 - 16 - 36, (bottom - top) / 2));
  const cx = size.width / 2;
  const cy = top + (bottom - top) / 2;
  const n = spec.categories.length || Math.max(...spec.series.map((s) => s.values.length));
  const radius = (v: number): number => ((v - r0) / (r1 - r0)) * R;
  const point = (i: number, v: number): [number, number] => {
    const a = -Math.PI / 2 + (2 * Math.PI * i) / n;
    return [cx + radius(v) * Math.cos(a), cy + radius(v) * Math.sin(a)];
  };
  const parts = [...f.parts];
  parts.push(`<rect class="plot" x="${px(cx - R)}" y="${px(cy - R)}" width="${px(2 * R)}" height="${px(2 * R)}" fill="none"/>`);
  const every = Math.max(1, Math.round(n / 13));
  for (let i = 0; i < n; i += every) {
    const [sx, sy] = point(i, r1);
    parts.push(`<line x1="${px(cx)}" y1="${px(cy)}" x2="${px(sx)}" y2="${px(sy)}" stroke="${COLORS.grid}" stroke-width="1"/>`);
    const a = -Math.PI / 2 + (2 * Math.PI * i) / n;
    const lx = cx + (R + 8) * Math.cos(a);
    const ly = cy + (R + 8) * Math.sin(a) + LABEL_SIZE * 0.35 + Math.sin(a) * 4;
    const anchor = Math.cos(a) > 0.3 ? "start" : Math.cos(a) < -0.3 ? "end" : "middle";
    parts.push(`<text class="x-label" x="${px(lx)}" y="${px(ly)}" text-anchor="${anchor}" font-size="${LABEL_SIZE}" fill="${COLORS.muted}">${escapeXml(spec.categories[i] ?? String(i + 1))}</text>`);
  }
  for (const t of ticks) {
    if (radius(t) > 0.5) parts.push(`<circle class="ring" cx="${px(cx)}" cy="${px(cy)}" r="${px(radius(t))}" fill="none" stroke="${COLORS.grid}" stroke-width="1"/>`);
  }
  spec.series.forEach((s, k) => {
    const st = yearStyle(k, count);
    parts.push(seriesElement(s.role, closedPath(s.values, n, point), [], st.stroke, st.width));
  });
  // Ring values last, haloed in white, so the lines crossing the top spoke do not hide them;
  // each sits just inside its ring, clear of the week label above the outer one.
  for (const t of ticks) {
    parts.push(
      `<text class="y-label" x="${px(cx + 4)}" y="${px(cy - radius(t) + LABEL_SIZE)}" font-size="${LABEL_SIZE - 1}" fill="${COLORS.muted}" stroke="#FFFFFF" stroke-width="3" paint-order="stroke">${escapeXml(formatTick(t, step))}</text>`,
    );
  }
  return svgDocument(size, parts);
}

/**
 * A path round the circle: closed when every value is there, otherwise broken at the gaps
 * and started just after one, so the run across the last week into the first stays joined.
 */
function closedPath(values: (number | null)[], n: number, point: (i: number, v: number) => [number, number]): string {
  const at = (i: number): [number, number] | null => {
    const v = values[i];
    return finite(v) ? point(i, v) : null;
  };
  const gap = Array.from({ length: n }, (_, i) => i).find((i) => !finite(values[i]));
  if (gap === undefined) {
    const { d } = gappedPath(Array.from({ length: n }, (_, i) => at(i)));
    return n > 2 ? `${d}Z` : d;
  }
  return gappedPath(Array.from({ length: n }, (_, k) => at((gap + 1 + k) % n))).d;
}

function columnChart(spec: ColumnChartSpec, size: ChartSize): string {
  const color = (k: number): string => PALETTE[k % PALETTE.length];
  const f = frame(spec, size, spec.series.map((s, k) => ({ label: s.name, swatch: "fill", color: color(k) })));
  const vs = finiteValues(spec.series.map((s) => s.values));
  if (vs.length === 0) return emptyChart(f, size);
  const [lo, hi] = extent(vs);
  const ticks = niceTicks(Math.min(0, lo), Math.max(0, hi), 6);
  const { plot, parts } = yAxis(f, size, spec.yTitle, ticks[0], ticks[ticks.length - 1], ticks);
  const nCat = Math.max(1, spec.categories.length);
  const group = (plot.right - plot.left) / nCat;
  const inner = group * 0.72;
  const bar = inner / Math.max(1, spec.series.length);
  const y0 = plot.y(0);
  spec.series.forEach((s, k) => {
    s.values.forEach((v, c) => {
      if (!finite(v) || c >= nCat) return;
      const x = plot.left + c * group + (group - inner) / 2 + k * bar;
      const yv = plot.y(v);
      parts.push(
        `<rect class="bar" x="${px(x)}" y="${px(Math.min(yv, y0))}" width="${px(Math.max(1, bar - 1))}" height="${px(Math.abs(y0 - yv))}" fill="${color(k)}"/>`,
      );
    });
  });
  const widest = Math.max(0, ...spec.categories.map((c) => textWidth(c, LABEL_SIZE)));
  const every = Math.max(1, Math.ceil((widest + 8) / group));
  const labels = spec.categories.map((c, i) => ({ x: plot.left + (i + 0.5) * group, label: c })).filter((_, i) => i % every === 0);
  parts.push(...categoryAxis(plot, labels, size));
  // The zero line is the bars' base; drawn over them so a negative bar visibly hangs from it.
  if (ticks[0] < 0) parts.push(`<line x1="${px(plot.left)}" y1="${px(y0)}" x2="${px(plot.right)}" y2="${px(y0)}" stroke="${COLORS.axis}" stroke-width="1"/>`);
  return svgDocument(size, parts);
}

function checkedSize(spec: ChartSpec, size?: ChartSize): ChartSize {
  const s = size ?? (spec.kind === "radar" ? RADAR_SIZE : DEFAULT_SIZE);
  const width = Math.round(s.width);
  const height = Math.round(s.height);
  // Below this the title, legend and axes no longer fit; the sizes come from our own code.
  if (!(width >= 200 && height >= 150 && width <= 8000 && height <= 8000)) {
    throw new RangeError(`Chart image size ${s.width}×${s.height} is outside 200×150 to 8000×8000 px.`);
  }
  return { width, height };
}

/** The chart as an SVG document, `size` in px (default 960×480, radar 640×640); deterministic. */
export function chartSvg(spec: ChartSpec, size?: ChartSize): string {
  const s = checkedSize(spec, size);
  switch (spec.kind) {
    case "line":
      return lineChart(spec, s);
    case "radar":
      return radarChart(spec, s);
    case "column":
      return columnChart(spec, s);
  }
}

let wasmReady: Promise<void> | null = null;
let fonts: Uint8Array[] | null = null;

/** resvg's wasm may be initialised only once a process; a failed start may be retried. */
function ensureWasm(): Promise<void> {
  if (!wasmReady) {
    wasmReady = initWasm(fs.readFileSync(require.resolve("@resvg/resvg-wasm/index_bg.wasm"))).catch((e: unknown) => {
      wasmReady = null;
      throw e;
    });
  }
  return wasmReady;
}

function fontBuffers(): Uint8Array[] {
  if (!fonts) {
    fonts = ["DejaVuSans.ttf", "DejaVuSans-Bold.ttf"].map((f) => new Uint8Array(fs.readFileSync(require.resolve(`dejavu-fonts-ttf/ttf/${f}`))));
  }
  return fonts;
}

/** The chart as PNG bytes, drawn by chartSvg and rasterised at its own size by resvg. */
export async function chartPng(spec: ChartSpec, size?: ChartSize): Promise<Uint8Array> {
  const svg = chartSvg(spec, size);
  await ensureWasm();
  const resvg = new Resvg(svg, {
    font: { fontBuffers: fontBuffers(), loadSystemFonts: false, defaultFontFamily: "DejaVu Sans" },
    fitTo: { mode: "original" },
  });
  try {
    const image = resvg.render();
    try {
      return image.asPng();
    } finally {
      image.free();
    }
  } finally {
    resvg.free();
  }
}

export { dateAxisLabels, escapeXml, formatTick, niceTicks, tickDecimals } from "./chartAxes";
