/**
 * The parts every chart image shares (chartImage.ts): white page, bold title top-left, legend
 * under it, caption bottom-left, and the value axis with its grid. Fixed positions from the
 * image edges keep charts of one book aligned with each other when they sit side by side.
 */
import type { ChartSpec } from "../core/present/chartSpec";
import { escapeXml, formatTick, px, textWidth } from "./chartAxes";

export const COLORS = {
  text: "#1A1A1A",
  muted: "#5F5F5F",
  grid: "#E2E2E2",
  axis: "#8C8C8C",
  history: "#1F3A68",
  forecast: "#E07000",
};
/**
 * Series colours for methods: Okabe and Ito's colour-blind-safe set ("Color universal
 * design", 2008), without its yellow, which is too pale on white for thin marks.
 */
export const PALETTE = ["#0072B2", "#E69F00", "#009E73", "#D55E00", "#56B4E9", "#CC79A7", "#4D4D4D"];

export const TITLE_SIZE = 16;
export const LEGEND_SIZE = 12;
export const LABEL_SIZE = 11;
export const CAPTION_SIZE = 11;
const MARGIN = 16;
const TITLE_BASELINE = 26;
const LEGEND_BASELINE = 50;
const LEGEND_ROW = 18;
/** Room at the bottom for the x labels and the caption under them. */
const BOTTOM_ROOM = 48;
const RIGHT_ROOM = 24;

export interface LegendItem {
  label: string;
  swatch: "line" | "fill";
  color: string;
  dash?: string;
  opacity?: number;
}

/** The header and footer drawn, and the y where the plot may begin. */
export interface Frame {
  parts: string[];
  top: number;
}

export interface Plot {
  left: number;
  right: number;
  top: number;
  bottom: number;
  /** Value to y pixel. */
  y: (v: number) => number;
}

/** `text` shortened with an ellipsis to fit `width` px, as estimated for DejaVu Sans. */
function fitText(text: string, size: number, width: number, bold = false): string {
  if (textWidth(text, size, bold) <= width) return text;
  const chars = [...text];
  let n = chars.length;
  while (n > 1 && textWidth(`${chars.slice(0, n).join("")}…`, size, bold) > width) n--;
  return `${chars.slice(0, n).join("").trimEnd()}…`;
}

function legend(items: LegendItem[], width: number): { parts: string[]; bottom: number } {
  const parts: string[] = [];
  let x = MARGIN;
  let y = LEGEND_BASELINE;
  for (const it of items) {
    const label = fitText(it.label, LEGEND_SIZE, width - 2 * MARGIN - 28);
    const w = 28 + textWidth(label, LEGEND_SIZE) + 18;
    if (x > MARGIN && x + w > width - MARGIN) {
      x = MARGIN;
      y += LEGEND_ROW;
    }
    if (it.swatch === "line") {
      const dash = it.dash ? ` stroke-dasharray="${it.dash}"` : "";
      parts.push(`<line x1="${px(x)}" y1="${px(y - 4)}" x2="${px(x + 22)}" y2="${px(y - 4)}" stroke="${it.color}" stroke-width="2.5"${dash}/>`);
    } else {
      const op = it.opacity === undefined ? "" : ` fill-opacity="${it.opacity.toFixed(3)}"`;
      parts.push(`<rect x="${px(x + 4)}" y="${px(y - 10)}" width="14" height="10" fill="${it.color}"${op}/>`);
    }
    parts.push(`<text class="legend" x="${px(x + 28)}" y="${px(y)}" font-size="${LEGEND_SIZE}" fill="${COLORS.text}">${escapeXml(label)}</text>`);
    x += w;
  }
  return { parts, bottom: items.length > 0 ? y + 10 : TITLE_BASELINE + 8 };
}

/**
 * Page, title, legend and caption. The title's place is kept even when it is empty, so the
 * plot of a chart does not move with its title.
 */
export function frame(spec: ChartSpec, size: { width: number; height: number }, items: LegendItem[]): Frame {
  const { width, height } = size;
  const room = width - 2 * MARGIN;
  // Long series names first shrink the title a little, then cut it, rather than run off the page.
  let titleSize = TITLE_SIZE;
  while (titleSize > 12 && textWidth(spec.title, titleSize, true) > room) titleSize--;
  const title = fitText(spec.title, titleSize, room, true);
  const parts = [
    `<rect class="page" x="0" y="0" width="${width}" height="${height}" fill="#FFFFFF"/>`,
    `<text class="title" x="${MARGIN}" y="${TITLE_BASELINE}" font-size="${titleSize}" font-weight="bold" fill="${COLORS.text}">${escapeXml(title)}</text>`,
    `<text class="caption" x="${MARGIN}" y="${height - 10}" font-size="${CAPTION_SIZE}" fill="${COLORS.muted}">${escapeXml(fitText(spec.caption, CAPTION_SIZE, room))}</text>`,
  ];
  const l = legend(items, width);
  parts.push(...l.parts);
  return { parts, top: l.bottom + 12 };
}

/**
 * The value axis over [lo, hi]: grid lines and labels at the ticks inside the range, the axis
 * title turned up the left edge, and the plot area whose left edge clears the widest label.
 */
export function yAxis(f: Frame, size: { width: number; height: number }, title: string, lo: number, hi: number, ticks: number[]): { plot: Plot; parts: string[] } {
  const step = ticks.length > 1 ? ticks[1] - ticks[0] : 1;
  const eps = step * 1e-9;
  const shown = ticks.filter((t) => t >= lo - eps && t <= hi + eps);
  const labels = shown.map((t) => formatTick(t, step));
  const titleRoom = title ? LABEL_SIZE + 10 : 0;
  const left = MARGIN + titleRoom + Math.max(0, ...labels.map((l) => textWidth(l, LABEL_SIZE))) + 8;
  const top = f.top + 8;
  const bottom = size.height - BOTTOM_ROOM;
  const right = size.width - RIGHT_ROOM;
  const y = (v: number): number => bottom - ((v - lo) / (hi - lo)) * (bottom - top);
  const parts = [...f.parts];
  parts.push(`<rect class="plot" x="${px(left)}" y="${px(top)}" width="${px(right - left)}" height="${px(bottom - top)}" fill="none"/>`);
  shown.forEach((t, k) => {
    const ty = y(t);
    parts.push(`<line class="grid" x1="${px(left)}" y1="${px(ty)}" x2="${px(right)}" y2="${px(ty)}" stroke="${COLORS.grid}" stroke-width="1"/>`);
    parts.push(`<text class="y-label" x="${px(left - 6)}" y="${px(ty + LABEL_SIZE * 0.35)}" text-anchor="end" font-size="${LABEL_SIZE}" fill="${COLORS.muted}">${escapeXml(labels[k])}</text>`);
  });
  if (title) {
    const tx = MARGIN + LABEL_SIZE * 0.8;
    const ty = (top + bottom) / 2;
    parts.push(`<text class="y-title" transform="translate(${px(tx)} ${px(ty)}) rotate(-90)" text-anchor="middle" font-size="${LABEL_SIZE}" fill="${COLORS.muted}">${escapeXml(title)}</text>`);
  }
  return { plot: { left, right, top, bottom, y }, parts };
}

/** The frame with an outlined, empty plot and one sentence, for a spec without finite values. */
export function emptyChart(f: Frame, size: { width: number; height: number }): string {
  const left = MARGIN;
  const top = f.top + 8;
  const right = size.width - MARGIN;
  const bottom = size.height - BOTTOM_ROOM + 16;
  const parts = [
    ...f.parts,
    `<rect class="plot" x="${px(left)}" y="${px(top)}" width="${px(right - left)}" height="${px(bottom - top)}" fill="none" stroke="${COLORS.grid}" stroke-width="1"/>`,
    `<text class="empty" x="${px((left + right) / 2)}" y="${px((top + bottom) / 2 + 5)}" text-anchor="middle" font-size="14" fill="${COLORS.muted}">No values to draw.</text>`,
  ];
  return svgDocument(size, parts);
}

export function svgDocument(size: { width: number; height: number }, parts: string[]): string {
  const { width, height } = size;
  return [
    `<svg xmlns="http://www.w3.org/2000/svg" width="${width}" height="${height}" viewBox="0 0 ${width} ${height}" font-family="DejaVu Sans">`,
    ...parts,
    "</svg>",
    "",
  ].join("\n");
}
