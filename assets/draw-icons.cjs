#!/usr/bin/env node
// Draws Cutline's icons (assets/icon-SIZE.png): a dashed cutoff line down the
// middle of a rounded tile, and a fitted line that steps up where it crosses
// it — the picture of a discontinuity. A tiny PNG encoder (zlib from Node),
// 4×4 supersampling for smooth edges. Run: node assets/draw-icons.cjs
'use strict';
const fs = require('fs');
const path = require('path');
const zlib = require('zlib');

const SIZES = [16, 32, 64, 80, 128];
const TILE = [20, 83, 116]; // deep teal
const LINE = [255, 255, 255];
const CUT = [255, 196, 61]; // amber cutoff

const CRC_TABLE = Array.from({ length: 256 }, (_, n) => {
  let c = n;
  for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1;
  return c >>> 0;
});
function crc32(buf) {
  let c = 0xffffffff;
  for (const b of buf) c = CRC_TABLE[(c ^ b) & 0xff] ^ (c >>> 8);
  return (c ^ 0xffffffff) >>> 0;
}
function chunk(type, data) {
  const len = Buffer.alloc(4);
  len.writeUInt32BE(data.length);
  const body = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4);
  crc.writeUInt32BE(crc32(body));
  return Buffer.concat([len, body, crc]);
}
/** RGBA pixels (size × size × 4) to a PNG file's bytes. */
function encodePng(size, rgba) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(size, 0);
  ihdr.writeUInt32BE(size, 4);
  ihdr[8] = 8; // bit depth
  ihdr[9] = 6; // RGBA
  const raw = Buffer.alloc(size * (size * 4 + 1));
  for (let y = 0; y < size; y++) {
    raw[y * (size * 4 + 1)] = 0; // filter: none
    rgba.copy(raw, y * (size * 4 + 1) + 1, y * size * 4, (y + 1) * size * 4);
  }
  return Buffer.concat([
    Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]),
    chunk('IHDR', ihdr),
    chunk('IDAT', zlib.deflateSync(raw, { level: 9 })),
    chunk('IEND', Buffer.alloc(0)),
  ]);
}

/** Distance from (x, y) to the segment (ax, ay)–(bx, by). */
function segDist(x, y, ax, ay, bx, by) {
  const dx = bx - ax;
  const dy = by - ay;
  const t = Math.max(0, Math.min(1, ((x - ax) * dx + (y - ay) * dy) / (dx * dx + dy * dy)));
  return Math.hypot(x - (ax + t * dx), y - (ay + t * dy));
}

/** The colour at a point of the unit square (0..1), or null outside the tile. */
function shade(u, v, size) {
  const r = 0.18; // corner radius
  const cx = Math.min(Math.max(u, r), 1 - r);
  const cy = Math.min(Math.max(v, r), 1 - r);
  if (Math.hypot(u - cx, v - cy) > r) return null;
  const w = Math.max(0.07, 1.5 / size); // stroke width, at least a pixel and a half
  // Cutoff: dashed vertical line at u = 0.5.
  const dash = Math.floor(v * 7) % 2 === 0;
  if (dash && Math.abs(u - 0.5) < w * 0.5 && v > 0.1 && v < 0.9) return CUT;
  // Fitted line: rising below the cutoff, stepping up, rising above it.
  if (segDist(u, v, 0.12, 0.78, 0.46, 0.64) < w * 0.6) return LINE;
  if (segDist(u, v, 0.54, 0.38, 0.88, 0.24) < w * 0.6) return LINE;
  return TILE;
}

function draw(size) {
  const S = 4;
  const rgba = Buffer.alloc(size * size * 4);
  for (let y = 0; y < size; y++) {
    for (let x = 0; x < size; x++) {
      let r = 0;
      let g = 0;
      let b = 0;
      let a = 0;
      for (let sy = 0; sy < S; sy++) {
        for (let sx = 0; sx < S; sx++) {
          const c = shade((x + (sx + 0.5) / S) / size, (y + (sy + 0.5) / S) / size, size);
          if (!c) continue;
          r += c[0];
          g += c[1];
          b += c[2];
          a++;
        }
      }
      const k = (y * size + x) * 4;
      if (a > 0) {
        rgba[k] = Math.round(r / a);
        rgba[k + 1] = Math.round(g / a);
        rgba[k + 2] = Math.round(b / a);
      }
      rgba[k + 3] = Math.round((255 * a) / (S * S));
    }
  }
  return encodePng(size, rgba);
}

for (const size of SIZES) fs.writeFileSync(path.join(__dirname, `icon-${size}.png`), draw(size));
console.log(`wrote ${SIZES.map((s) => `icon-${s}.png`).join(', ')}`);
