#!/usr/bin/env node
/**
 * Writes the Fairlead icons (16, 32, 64 and 80 px PNGs) into this folder.
 *
 * The mark: a navy rounded square with a teal line that rises from the lower left to the
 * upper right through two small dips (a weekly rate path), ending in a dot for "this week".
 * Drawn with 4×4 supersampling for smooth edges and encoded as RGBA PNG with zlib, so no
 * image library is needed. Run `node assets/make-icons.js` and commit the PNGs it writes.
 */
"use strict";
const fs = require("fs");
const path = require("path");
const zlib = require("zlib");

const SIZES = [16, 32, 64, 80];
const NAVY = [0x17, 0x2b, 0x4d];
const TEAL = [0x4f, 0xd1, 0xc5];
const SS = 4; // samples per pixel along each axis

// The path in unit coordinates (0,0 top left .. 1,1 bottom right).
const PATH = [
  [0.2, 0.74],
  [0.38, 0.56],
  [0.5, 0.64],
  [0.66, 0.4],
  [0.8, 0.28],
];

function distToSegment(px, py, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const len2 = dx * dx + dy * dy;
  let t = len2 === 0 ? 0 : ((px - ax) * dx + (py - ay) * dy) / len2;
  t = Math.max(0, Math.min(1, t));
  const qx = ax + t * dx - px;
  const qy = ay + t * dy - py;
  return Math.sqrt(qx * qx + qy * qy);
}

/** True when the unit point lies inside the rounded square (corner radius r). */
function insideSquare(x, y, r) {
  const cx = Math.min(Math.max(x, r), 1 - r);
  const cy = Math.min(Math.max(y, r), 1 - r);
  const dx = x - cx;
  const dy = y - cy;
  return x >= 0 && x <= 1 && y >= 0 && y <= 1 && dx * dx + dy * dy <= r * r;
}

/** Which layer a unit point belongs to: 2 = line, 1 = square, 0 = outside. */
function layerAt(x, y, size) {
  if (!insideSquare(x, y, 0.18)) return 0;
  // Keep the stroke at least about 1.6 px wide on the smallest icon.
  const half = Math.max(0.055, 0.8 / size);
  for (let i = 0; i + 1 < PATH.length; i++) {
    const [ax, ay] = PATH[i];
    const [bx, by] = PATH[i + 1];
    if (distToSegment(x, y, ax, ay, bx, by) <= half) return 2;
  }
  const [ex, ey] = PATH[PATH.length - 1];
  const dot = half * 1.9;
  if ((x - ex) ** 2 + (y - ey) ** 2 <= dot * dot) return 2;
  return 1;
}

function render(size) {
  const rgba = Buffer.alloc(size * size * 4);
  for (let py = 0; py < size; py++) {
    for (let px = 0; px < size; px++) {
      let square = 0;
      let line = 0;
      for (let sy = 0; sy < SS; sy++) {
        for (let sx = 0; sx < SS; sx++) {
          const layer = layerAt((px + (sx + 0.5) / SS) / size, (py + (sy + 0.5) / SS) / size, size);
          if (layer === 1) square++;
          else if (layer === 2) line++;
        }
      }
      const covered = square + line;
      const o = (py * size + px) * 4;
      if (covered === 0) continue; // fully transparent
      // Colour is the coverage-weighted mix of the two layers; alpha is total coverage.
      for (let c = 0; c < 3; c++) {
        rgba[o + c] = Math.round((NAVY[c] * square + TEAL[c] * line) / covered);
      }
      rgba[o + 3] = Math.round((255 * covered) / (SS * SS));
    }
  }
  return rgba;
}

const CRC_TABLE = (() => {
  const t = new Uint32Array(256);
  for (let n = 0; n < 256; n++) {
    let c = n;
    for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
    t[n] = c >>> 0;
  }
  return t;
})();

function crc32(buf) {
  let c = 0xffffffff;
  for (let i = 0; i < buf.length; i++) c = CRC_TABLE[(c ^ buf[i]) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}

function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, "ascii"), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}

function encodePng(size, rgba) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  ihdr[10] = 0; // deflate
  ihdr[11] = 0; // adaptive filtering
  ihdr[12] = 0; // no interlace
  const stride = size * 4;
  const raw = Buffer.alloc((stride + 1) * size);
  for (let y = 0; y < size; y++) {
    raw[y * (stride + 1)] = 0; // filter type None
    rgba.copy(raw, y * (stride + 1) + 1, y * stride, (y + 1) * stride);
  }
  const signature = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
  return Buffer.concat([
    signature,
    chunk("IHDR", ihdr),
    chunk("IDAT", zlib.deflateSync(raw, { level: 9 })),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

function iconFileName(size) {
  return `icon-${size}.png`;
}

if (require.main === module) {
  for (const size of SIZES) {
    const file = path.join(__dirname, iconFileName(size));
    fs.writeFileSync(file, encodePng(size, render(size)));
    console.log(`wrote ${path.relative(process.cwd(), file)}`);
  }
}

module.exports = { SIZES, iconFileName, render, encodePng };
