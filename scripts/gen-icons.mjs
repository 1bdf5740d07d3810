#!/usr/bin/env node
/**
 * Draws the add-in's ribbon and store icons (assets/icon-16.png … icon-80.png) with no image
 * library: a small anti-aliased rasteriser and a PNG encoder on node:zlib.
 *
 * Design: a deep slate-teal tile (#16425B) with a shear-thinning flow curve in amber (#F2A541):
 * a flat plateau bending into a falling line (viscosity against rate, log-log), and white
 * measured points on it from 32 px up. Run `node scripts/gen-icons.mjs` after changing it.
 */
import { Buffer } from "node:buffer";
import process from "node:process";
import console from "node:console";
import { deflateSync } from "node:zlib";
import { mkdirSync, writeFileSync } from "node:fs";
import { dirname, join } from "node:path";
import { fileURLToPath } from "node:url";

export const SIZES = [16, 32, 64, 80];
export const COLOURS = { tile: [0x16, 0x42, 0x5b], curve: [0xf2, 0xa5, 0x41], point: [0xff, 0xff, 0xff] };

const here = dirname(fileURLToPath(import.meta.url));
const outDir = join(here, "..", "assets");

// Unit-square geometry (y downwards). The curve: plateau, smooth knee, power-law fall.
const CURVE = [];
for (let i = 0; i <= 60; i++) {
  const x = 0.17 + (0.66 * i) / 60;
  const t = (x - 0.17) / 0.66; // 0..1 along the rate axis
  const logEta = -Math.log(1 + Math.pow(7 * t, 1.6)) / Math.log(1 + Math.pow(7, 1.6)); // 0 → -1
  CURVE.push([x, 0.3 - 0.42 * logEta]);
}
const POINTS = [0.12, 0.45, 0.75].map((f) => CURVE[Math.round(f * (CURVE.length - 1))]);

function segmentDistance(px, py, [ax, ay], [bx, by]) {
  const dx = bx - ax;
  const dy = by - ay;
  const t = Math.max(0, Math.min(1, ((px - ax) * dx + (py - ay) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(px - (ax + t * dx), py - (ay + t * dy));
}

function insideTile(x, y, radius) {
  const cx = Math.min(Math.max(x, radius), 1 - radius);
  const cy = Math.min(Math.max(y, radius), 1 - radius);
  return Math.hypot(x - cx, y - cy) <= radius && x >= 0 && x <= 1 && y >= 0 && y <= 1;
}

/** RGBA pixels of the icon at `size` px, 4×4 supersampling per pixel. */
export function drawIcon(size) {
  const px = Buffer.alloc(size * size * 4);
  const stroke = size <= 16 ? 0.14 : 0.1;
  const dotRadius = size >= 32 ? 0.065 : 0;
  const n = 4;
  for (let j = 0; j < size; j++) {
    for (let i = 0; i < size; i++) {
      let r = 0, g = 0, b = 0, a = 0;
      for (let sj = 0; sj < n; sj++) {
        for (let si = 0; si < n; si++) {
          const x = (i + (si + 0.5) / n) / size;
          const y = (j + (sj + 0.5) / n) / size;
          if (!insideTile(x, y, 0.2)) continue;
          let c = COLOURS.tile;
          let d = Infinity;
          for (let k = 1; k < CURVE.length; k++) d = Math.min(d, segmentDistance(x, y, CURVE[k - 1], CURVE[k]));
          if (d <= stroke / 2) c = COLOURS.curve;
          for (const p of POINTS) if (dotRadius > 0 && Math.hypot(x - p[0], y - p[1]) <= dotRadius) c = COLOURS.point;
          r += c[0]; g += c[1]; b += c[2]; a += 255;
        }
      }
      const samples = n * n;
      const o = (j * size + i) * 4;
      const cover = a / 255;
      px[o] = cover ? Math.round(r / cover) : 0;
      px[o + 1] = cover ? Math.round(g / cover) : 0;
      px[o + 2] = cover ? Math.round(b / cover) : 0;
      px[o + 3] = Math.round(a / samples);
    }
  }
  return px;
}

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});

function crc32(buf) {
  let c = 0xffffffff;
  for (const byte of buf) c = CRC_TABLE[(c ^ byte) & 0xff] ^ (c >>> 8);
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

/** Encodes RGBA pixels as a PNG (8-bit RGBA, no filtering). */
export function encodePng(size, rgba) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // colour type RGBA
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) rgba.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk("IHDR", ihdr),
    chunk("IDAT", deflateSync(raw, { level: 9 })),
    chunk("IEND", Buffer.alloc(0)),
  ]);
}

if (process.argv[1] === fileURLToPath(import.meta.url)) {
  mkdirSync(outDir, { recursive: true });
  for (const size of SIZES) {
    const file = join(outDir, `icon-${size}.png`);
    writeFileSync(file, encodePng(size, drawIcon(size)));
    console.log(`wrote ${file}`);
  }
}
