import { inflateSync } from "zlib";
import { XMLValidator } from "fast-xml-parser";
import { chartPng, chartSvg, dateAxisLabels, escapeXml, formatTick, niceTicks } from "../../src/batch/chartImage";
import type { ColumnChartSpec, LineChartSpec, RadarChartSpec } from "../../src/core/present/chartSpec";

// ---- invented data: the fictional "Tidemark Box Index" ----

function weekly(start: string, n: number): string[] {
  const t0 = Date.parse(`${start}T00:00:00Z`);
  return Array.from({ length: n }, (_, i) => new Date(t0 + i * 7 * 86_400_000).toISOString().slice(0, 10));
}

/** 30 weeks of history (a gap at weeks 10–11, the peak 2,400 at week 20), then 10 forecast weeks. */
function lineSpec(title = "Tidemark Box Index: outlook – A&B <West>"): LineChartSpec {
  const nh = 30;
  const h = 10;
  const history: (number | null)[] = Array.from({ length: nh }, (_, i) => 2000 + 10 * i);
  history[10] = null;
  history[11] = null;
  history[20] = 2400;
  history[5] = 1900; // the minimum
  const last = history[nh - 1] as number;
  const pad = (): (number | null)[] => new Array<number | null>(nh - 1).fill(null);
  const band = (w: number): { low: (number | null)[]; high: (number | null)[] } => ({
    low: [...pad(), last, ...Array.from({ length: h }, (_, s) => last - w * (s + 1))],
    high: [...pad(), last, ...Array.from({ length: h }, (_, s) => last + w * (s + 1))],
  });
  return {
    kind: "line",
    id: "outlook-tidemark",
    title,
    categories: weekly("2025-01-03", nh + h),
    series: [
      { name: "Tidemark Box Index", values: [...history, ...new Array<null>(h).fill(null)], role: "history" },
      { name: "Forecast (ETS)", values: [...pad(), last, ...new Array<number>(h).fill(last)], role: "forecast" },
    ],
    // Widest first; the widest reaches 2,290 ± 100, inside the history's range 1,900–2,400.
    bands: [{ name: "95% interval", ...band(10) }, { name: "80% interval", ...band(6) }],
    yTitle: "Rate",
    caption: "Fairlead, as of week ending 2025-07-25",
  };
}

function radarSpec(): RadarChartSpec {
  const years = ["2022", "2023", "2024"];
  return {
    kind: "radar",
    id: "season-tidemark",
    title: "Tidemark Box Index: rates by ISO week, 2022–2024",
    categories: Array.from({ length: 52 }, (_, i) => `W${String(i + 1).padStart(2, "0")}`),
    series: years.map((name, k) => ({
      name,
      role: "year" as const,
      // The latest year stops at week 30 and misses week 12: two runs round the circle.
      values: Array.from({ length: 52 }, (_, i) => (k === 2 && (i === 11 || i >= 30) ? null : 1500 + 100 * k + 200 * Math.sin((2 * Math.PI * i) / 52))),
    })),
    caption: "Fairlead, as of week ending 2024-07-26",
  };
}

function columnSpec(title = "Tidemark Box Index: backtest MASE by weeks ahead"): ColumnChartSpec {
  return {
    kind: "column",
    id: "backtest-tidemark",
    title,
    categories: ["1 wk", "2 wk", "4 wk", "8 wk"],
    series: [
      { name: "Seasonal naive", values: [1, 1.1, 1.2, 1.3], role: "method" },
      { name: "ETS", values: [0.5, 0.6, null, 0.9], role: "method" },
      { name: "SARIMA", values: [0.4, 0.55, 0.7, 0.8], role: "method" },
    ],
    yTitle: "MASE",
    caption: "Fairlead, as of week ending 2025-07-25; re-estimated yearly",
  };
}

// ---- small SVG readers ----

function attr(el: string, name: string): number {
  const m = new RegExp(`\\s${name}="([^"]*)"`).exec(el);
  if (!m) throw new Error(`no ${name} in ${el}`);
  return Number(m[1]);
}

function elements(svg: string, tag: string, cls: string): string[] {
  return svg.match(new RegExp(`<${tag} class="${cls}"[^>]*>`, "g")) ?? [];
}

function plotRect(svg: string): { left: number; top: number; right: number; bottom: number } {
  const [r] = elements(svg, "rect", "plot");
  const left = attr(r, "x");
  const top = attr(r, "y");
  return { left, top, right: left + attr(r, "width"), bottom: top + attr(r, "height") };
}

/** Subpaths of a path's d, each a list of points. */
function subpaths(el: string): [number, number][][] {
  const d = /\sd="([^"]*)"/.exec(el)?.[1] ?? "";
  return d
    .split("M")
    .filter((s) => s.length > 0)
    .map((s) =>
      s
        .replace(/Z$/, "")
        .split("L")
        .map((p) => p.trim().split(/\s+/).map(Number) as [number, number]),
    );
}

function polygonPoints(el: string): [number, number][] {
  const pts = /\spoints="([^"]*)"/.exec(el)?.[1] ?? "";
  return pts.split(" ").map((p) => p.split(",").map(Number) as [number, number]);
}

// ---- a small PNG decoder (W3C PNG specification, 2nd ed. 2003: chunks §5, filters §9) ----

interface Decoded {
  width: number;
  height: number;
  rgba: Uint8Array;
}

function decodePng(png: Uint8Array): Decoded {
  const buf = Buffer.from(png);
  let off = 8;
  let width = 0;
  let height = 0;
  const idat: Buffer[] = [];
  while (off < buf.length) {
    const len = buf.readUInt32BE(off);
    const type = buf.toString("latin1", off + 4, off + 8);
    const data = buf.subarray(off + 8, off + 8 + len);
    if (type === "IHDR") {
      width = data.readUInt32BE(0);
      height = data.readUInt32BE(4);
      // Only what resvg writes: 8-bit RGBA, not interlaced.
      expect([data[8], data[9], data[12]]).toEqual([8, 6, 0]);
    } else if (type === "IDAT") idat.push(data);
    else if (type === "IEND") break;
    off += 12 + len;
  }
  const raw = inflateSync(Buffer.concat(idat));
  const bpp = 4;
  const stride = width * bpp;
  const out = new Uint8Array(stride * height);
  for (let y = 0; y < height; y++) {
    const filter = raw[y * (stride + 1)];
    const src = y * (stride + 1) + 1;
    for (let i = 0; i < stride; i++) {
      const a = i >= bpp ? out[y * stride + i - bpp] : 0;
      const b = y > 0 ? out[(y - 1) * stride + i] : 0;
      const c = i >= bpp && y > 0 ? out[(y - 1) * stride + i - bpp] : 0;
      let pred = 0;
      if (filter === 1) pred = a;
      else if (filter === 2) pred = b;
      else if (filter === 3) pred = (a + b) >> 1;
      else if (filter === 4) {
        const p = a + b - c;
        const pa = Math.abs(p - a);
        const pb = Math.abs(p - b);
        const pc = Math.abs(p - c);
        pred = pa <= pb && pa <= pc ? a : pb <= pc ? b : c;
      } else if (filter !== 0) throw new Error(`PNG filter ${filter}`);
      out[y * stride + i] = (raw[src + i] + pred) & 0xff;
    }
  }
  return { width, height, rgba: out };
}

function pixel(img: Decoded, x: number, y: number): number[] {
  const i = (Math.round(y) * img.width + Math.round(x)) * 4;
  return Array.from(img.rgba.subarray(i, i + 4));
}

function nonWhite(img: Decoded, y0: number, y1: number): number {
  let n = 0;
  for (let y = y0; y < y1; y++) for (let x = 0; x < img.width; x++) if (pixel(img, x, y).slice(0, 3).some((c) => c < 250)) n++;
  return n;
}

// ---- tests ----

describe("niceTicks", () => {
  // The common "nice numbers" rule (Heckbert, "Nice numbers for graph labels", Graphics Gems,
  // 1990): ticks are spaced 1, 2 or 5 × 10^k.
  test("the desk's usual ranges get round ticks", () => {
    expect(niceTicks(0, 1000, 3)).toEqual([0, 500, 1000]);
    expect(niceTicks(0, 1234, 5)).toEqual([0, 500, 1000, 1500]);
    // Built as integers over a power of ten: 0.1 × 3 is exactly 0.3, not 0.30000000000000004.
    expect(niceTicks(0, 0.3, 4)).toEqual([0, 0.1, 0.2, 0.3]);
    expect(niceTicks(-0.35, 1.25, 5)).toEqual([-0.5, 0, 0.5, 1, 1.5]);
  });

  test("on random ranges: covers [min, max], 1-2-5 steps, about the requested count", () => {
    let s = 12345;
    const rnd = (): number => (s = (Math.imul(s, 1664525) + 1013904223) >>> 0) / 2 ** 32;
    for (let k = 0; k < 500; k++) {
      const scale = 10 ** Math.floor(rnd() * 8 - 3);
      const min = (rnd() - 0.3) * 10 * scale;
      const max = min + rnd() * 10 * scale + 1e-6 * scale;
      const count = 3 + Math.floor(rnd() * 8);
      const t = niceTicks(min, max, count);
      const step = t[1] - t[0];
      expect(t[0]).toBeLessThanOrEqual(min);
      expect(t[t.length - 1]).toBeGreaterThanOrEqual(max);
      // No more than one step of slack at either end.
      expect(min - t[0]).toBeLessThan(step);
      expect(t[t.length - 1] - max).toBeLessThan(step);
      const e = Math.floor(Math.log10(step) + 1e-9);
      expect([1, 2, 5]).toContain(Math.round(step / 10 ** e));
      for (let i = 2; i < t.length; i++) expect(Math.abs(t[i] - t[i - 1] - step)).toBeLessThan(step * 1e-9);
      // Rounding the raw step (max − min)/(count − 1) to 1, 2 or 5 × 10^k changes it by a factor
      // in (2/3, 5/3); the covering ends add at most two intervals. That bounds the count.
      const raw = (max - min) / (count - 1);
      expect(step / raw).toBeGreaterThan(2 / 3 - 1e-9);
      expect(step / raw).toBeLessThan(5 / 3 + 1e-9);
      expect(t.length).toBeGreaterThanOrEqual(Math.floor(0.6 * (count - 1)) + 1);
      expect(t.length).toBeLessThanOrEqual(Math.ceil(1.5 * (count - 1)) + 3);
    }
  });

  test("a flat range still gets an axis around the value; no finite bound gives none", () => {
    const t = niceTicks(2000, 2000, 5);
    expect(t.length).toBeGreaterThan(2);
    expect(t[0]).toBeLessThan(2000);
    expect(t[t.length - 1]).toBeGreaterThan(2000);
    expect(niceTicks(0, 0, 5)).toEqual([-1, -0.5, 0, 0.5, 1]);
    expect(niceTicks(Number.NaN, 1, 5)).toEqual([]);
  });
});

describe("tick labels and text", () => {
  test("thousands separators, and decimals only as fine as the step", () => {
    expect(formatTick(12500, 500)).toBe("12,500");
    expect(formatTick(1234567, 1)).toBe("1,234,567");
    expect(formatTick(-1500, 500)).toBe("-1,500");
    expect(formatTick(0.6, 0.2)).toBe("0.6");
    expect(formatTick(0, 0.2)).toBe("0.0");
    expect(formatTick(0.05, 0.05)).toBe("0.05");
    expect(formatTick(-0, 1)).toBe("0");
    expect(formatTick(999, 1)).toBe("999");
  });

  test("XML specials are escaped and forbidden control characters dropped", () => {
    expect(escapeXml(`A&B <West> "x" 'y' –\u0007`)).toBe("A&amp;B &lt;West&gt; &quot;x&quot; &apos;y&apos; –");
  });
});

describe("dateAxisLabels", () => {
  test("about 700 weeks: one label a year, at the first week of January", () => {
    const cats = weekly("2012-01-06", 700);
    const labels = dateAxisLabels(cats, 860, 11);
    expect(labels.map((l) => l.label)).toEqual(Array.from({ length: 14 }, (_, k) => String(2012 + k)));
    for (const l of labels) expect(cats[l.index]).toMatch(/^\d{4}-01-0[1-7]$/);
  });

  test("three and a half years: month labels at the first week of their month, never crowded", () => {
    const cats = weekly("2022-01-07", 182);
    const labels = dateAxisLabels(cats, 860, 11);
    expect(labels.length).toBeGreaterThanOrEqual(6);
    for (const l of labels) {
      expect(l.label).toMatch(/^(Jan|Apr|Jul|Oct) \d{4}$/);
      expect(Number(cats[l.index].slice(8, 10))).toBeLessThanOrEqual(7);
    }
    // The spacing rule: 0.6 em per character at 11 px plus an 8 px gap between neighbours.
    const perWeek = 860 / 181;
    for (let k = 1; k < labels.length; k++) expect((labels[k].index - labels[k - 1].index) * perWeek).toBeGreaterThanOrEqual(8 * 0.6 * 11 + 8);
  });

  test("categories that are not dates are thinned evenly from the first", () => {
    const cats = Array.from({ length: 300 }, (_, i) => String(i + 1));
    const labels = dateAxisLabels(cats, 860, 11);
    expect(labels[0]).toEqual({ index: 0, label: "1" });
    const every = labels[1].index;
    expect(every).toBeGreaterThan(1);
    labels.forEach((l, k) => expect(l.index).toBe(k * every));
  });
});

describe("chartSvg", () => {
  test("every kind, and a chart without values, is well-formed XML", () => {
    const empty = { ...columnSpec(), series: [{ name: "ETS", values: [null, null, Number.NaN, null], role: "method" as const }] };
    for (const spec of [lineSpec(), radarSpec(), columnSpec(), empty]) expect(XMLValidator.validate(chartSvg(spec))).toBe(true);
  });

  test("line: escaped title, one path per series, the gap splits history, one polygon per band", () => {
    const svg = chartSvg(lineSpec());
    expect(svg).toContain("Tidemark Box Index: outlook – A&amp;B &lt;West&gt;");
    expect(svg).not.toContain("<West>");
    const history = elements(svg, "path", "series history");
    const forecast = elements(svg, "path", "series forecast");
    expect(history).toHaveLength(1);
    expect(forecast).toHaveLength(1);
    // Weeks 0–9 and 12–29 on either side of the two missing weeks.
    expect(subpaths(history[0]).map((p) => p.length)).toEqual([10, 18]);
    expect(forecast[0]).toContain("stroke-dasharray");
    const bands = elements(svg, "polygon", "band");
    expect(bands).toHaveLength(2);
    // Each band runs over the last history week and 10 forecast weeks: 11 points up, 11 back.
    for (const b of bands) expect(polygonPoints(b)).toHaveLength(22);
    // The inner band is drawn more strongly than the outer one.
    expect(attr(bands[1], "fill-opacity")).toBeGreaterThan(attr(bands[0], "fill-opacity"));
  });

  test("line: the highest and lowest rates sit 5% of the range inside the plot, ends at its edges", () => {
    const svg = chartSvg(lineSpec());
    const plot = plotRect(svg);
    const [a, b] = subpaths(elements(svg, "path", "series history")[0]);
    const pts = [...a, ...b];
    const h = plot.bottom - plot.top;
    // Data 1,900–2,400 padded by 25 each side: the max is 25/550 of the height below the top.
    // Coordinates are written to 0.1 px, so they are good to 0.05 px, plus the plot edges' own.
    const tol = 0.11;
    expect(Math.abs(Math.min(...pts.map((p) => p[1])) - (plot.top + (h * 25) / 550))).toBeLessThan(tol);
    expect(Math.abs(Math.max(...pts.map((p) => p[1])) - (plot.bottom - (h * 25) / 550))).toBeLessThan(tol);
    expect(Math.abs(a[0][0] - plot.left)).toBeLessThan(tol);
    const fc = subpaths(elements(svg, "path", "series forecast")[0])[0];
    expect(Math.abs(fc[fc.length - 1][0] - plot.right)).toBeLessThan(tol);
  });

  test("radar: one path per year, a full year closed, the gappy latest year in two runs and drawn thickest", () => {
    const svg = chartSvg(radarSpec());
    const paths = elements(svg, "path", "series year");
    expect(paths).toHaveLength(3);
    expect(paths[0]).toMatch(/Z"/);
    expect(subpaths(paths[0])[0]).toHaveLength(52);
    // Missing week 12 and weeks 31–52: weeks 13–30 and 1–11.
    expect(subpaths(paths[2]).map((p) => p.length)).toEqual([18, 11]);
    expect(attr(paths[2], "stroke-width")).toBeGreaterThan(attr(paths[1], "stroke-width"));
    expect((svg.match(/class="x-label"[^>]*>W\d\d</g) ?? []).length).toBe(13);
  });

  test("column: one bar per finite value, heights in proportion to the values from a zero base", () => {
    const svg = chartSvg(columnSpec());
    const bars = elements(svg, "rect", "bar");
    expect(bars).toHaveLength(11);
    const plot = plotRect(svg);
    for (const b of bars) expect(Math.abs(attr(b, "y") + attr(b, "height") - plot.bottom)).toBeLessThan(0.11);
    // Bars are written series by series: the first is 1.0, the fourth 1.3.
    expect(attr(bars[3], "height") / attr(bars[0], "height")).toBeCloseTo(1.3, 2);
    expect(svg).toContain(">Seasonal naive</text>");
  });

  test("a spec without finite values draws the frame and one sentence", () => {
    const spec: LineChartSpec = { ...lineSpec(), series: [{ name: "Tidemark Box Index", values: [null, null], role: "history" }], bands: [] };
    const svg = chartSvg(spec);
    expect(svg).toContain(">No values to draw.</text>");
    expect(svg).not.toContain('class="series');
    expect(elements(svg, "rect", "plot")).toHaveLength(1);
  });

  test("the same spec gives the same string", () => {
    expect(chartSvg(lineSpec())).toBe(chartSvg(lineSpec()));
    expect(chartSvg(radarSpec())).toBe(chartSvg(radarSpec()));
  });
});

describe("chartPng", () => {
  const SIGNATURE = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];

  test("PNG of the requested size, and of the default sizes", async () => {
    const png = await chartPng(lineSpec(), { width: 720, height: 360 });
    expect(Array.from(png.subarray(0, 8))).toEqual(SIGNATURE);
    const ihdr = Buffer.from(png.subarray(8, 33));
    expect(ihdr.toString("latin1", 4, 8)).toBe("IHDR");
    expect([ihdr.readUInt32BE(8), ihdr.readUInt32BE(12)]).toEqual([720, 360]);
    expect(decodePng(await chartPng(columnSpec()))).toMatchObject({ width: 960, height: 480 });
    expect(decodePng(await chartPng(radarSpec()))).toMatchObject({ width: 640, height: 640 });
  });

  test("the same spec gives the same bytes", async () => {
    const a = await chartPng(radarSpec());
    const b = await chartPng(radarSpec());
    expect(Buffer.from(a).equals(Buffer.from(b))).toBe(true);
  });

  test("band pixels carry the forecast tint, composited over white; the margin stays white", async () => {
    const spec = lineSpec();
    const svg = chartSvg(spec);
    const img = decodePng(await chartPng(spec));
    // Week 35 (the 6th forecast week): halfway between the forecast line and each band's top.
    const [outer, inner] = elements(svg, "polygon", "band").map(polygonPoints);
    const fcY = subpaths(elements(svg, "path", "series forecast")[0])[0][6][1];
    const [x, innerTop] = inner[6];
    const outerTop = outer[6][1];
    // Source-over compositing (Porter and Duff, 1984) of #E07000 at opacity a on white.
    const tint = (a: number): number[] => [224, 112, 0].map((c) => 255 + (c - 255) * a);
    const both = 1 - (1 - 0.14) * (1 - 0.18);
    const yInner = (fcY + innerTop) / 2;
    const yOuter = (innerTop + outerTop) / 2;
    // Clear of the grid lines under the bands, which would shift the colour.
    const grid = elements(svg, "line", "grid").map((g) => attr(g, "y1"));
    for (const y of [yInner, yOuter]) for (const g of grid) expect(Math.abs(y - g)).toBeGreaterThan(2);
    const inInner = pixel(img, x, yInner);
    const inOuter = pixel(img, x, yOuter);
    // Within 2 of 255: resvg works on 8-bit premultiplied colour, rounding each step.
    tint(both).forEach((c, i) => expect(Math.abs(inInner[i] - c)).toBeLessThanOrEqual(2));
    tint(0.14).forEach((c, i) => expect(Math.abs(inOuter[i] - c)).toBeLessThanOrEqual(2));
    expect(pixel(img, img.width - 4, img.height - 4)).toEqual([255, 255, 255, 255]);
    expect(pixel(img, img.width - 4, 6)).toEqual([255, 255, 255, 255]);
  });

  test("the title is really drawn as text, and only the title rows change without it", async () => {
    const withTitle = decodePng(await chartPng(columnSpec()));
    const without = decodePng(await chartPng(columnSpec("")));
    // The title's baseline is at y = 26; DejaVu Sans Bold at 16 px stays within rows 8–32.
    expect(nonWhite(withTitle, 0, 34)).toBeGreaterThan(300);
    expect(nonWhite(without, 0, 34)).toBe(0);
    const row = 36 * withTitle.width * 4;
    expect(Buffer.from(withTitle.rgba.subarray(row)).equals(Buffer.from(without.rgba.subarray(row)))).toBe(true);
  });
});
