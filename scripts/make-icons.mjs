#!/usr/bin/env node
// Draws the app icons (192 and 512 px PNG) for the tablet manifest, matching
// client/public/icons/icon.svg: a field-meter scale with its needle on a dark
// tile. Pure Node (zlib for the PNG stream), 4x4 supersampling for smooth edges.
// Run: node scripts/make-icons.mjs  (the PNGs are committed; rerun after a change)
import { deflateSync } from 'node:zlib';
import { writeFileSync } from 'node:fs';
import { join, dirname } from 'node:path';
import { fileURLToPath } from 'node:url';

const out = join(dirname(fileURLToPath(import.meta.url)), '..', 'client', 'public', 'icons');

const hex = (s) => [parseInt(s.slice(1, 3), 16), parseInt(s.slice(3, 5), 16), parseInt(s.slice(5, 7), 16)];
const NAVY = hex('#0d1b2a'); const WHITE = hex('#ffffff'); const RED = hex('#ff5c6c'); const AMBER = hex('#ffb300'); const GREEN = hex('#7dffa8');

function segDist(px, py, ax, ay, bx, by) {
  const vx = bx - ax; const vy = by - ay;
  const t = Math.max(0, Math.min(1, ((px - ax) * vx + (py - ay) * vy) / (vx * vx + vy * vy)));
  return Math.hypot(px - (ax + t * vx), py - (ay + t * vy));
}

// Colour at a point of the 512-unit design, or null for transparent.
function colourAt(x, y) {
  // rounded tile, radius 96
  const r = 96;
  const cx = Math.min(Math.max(x, r), 512 - r); const cy = Math.min(Math.max(y, r), 512 - r);
  if (Math.hypot(x - cx, y - cy) > r) return null;
  let c = NAVY;
  // scale arc: centre (256,344), radius 160, width 40, upper half, round caps
  const d = Math.hypot(x - 256, y - 344);
  const ang = Math.atan2(344 - y, x - 256); // 0 = right, pi/2 = up
  const onArc = (a0, a1) => (Math.abs(d - 160) <= 20 && ang >= a0 && ang <= a1)
    || Math.hypot(x - (256 + 160 * Math.cos(a0)), y - (344 - 160 * Math.sin(a0))) <= 20
    || Math.hypot(x - (256 + 160 * Math.cos(a1)), y - (344 - 160 * Math.sin(a1))) <= 20;
  if (onArc(0, Math.PI)) c = WHITE;
  if (onArc(0, Math.atan2(344 - 205, 336 - 256))) c = RED;
  if (segDist(x, y, 256, 344, 352, 212) <= 14) c = AMBER;
  if (d <= 36) c = AMBER;
  if (x >= 128 && x <= 384 && y >= 408 && y <= 436) {
    const ex = x < 142 ? 142 : x > 370 ? 370 : x;
    if (Math.hypot(x - ex, y - 422) <= 14) c = GREEN;
  }
  return c;
}

function render(size) {
  const ss = 4;
  const px = Buffer.alloc(size * (size * 4 + 1));
  for (let j = 0; j < size; j++) {
    px[j * (size * 4 + 1)] = 0; // filter: none
    for (let i = 0; i < size; i++) {
      let rr = 0; let gg = 0; let bb = 0; let aa = 0;
      for (let sj = 0; sj < ss; sj++) {
        for (let si = 0; si < ss; si++) {
          const x = ((i + (si + 0.5) / ss) / size) * 512; const y = ((j + (sj + 0.5) / ss) / size) * 512;
          const c = colourAt(x, y);
          if (c) { rr += c[0]; gg += c[1]; bb += c[2]; aa += 1; }
        }
      }
      const o = j * (size * 4 + 1) + 1 + i * 4;
      const n = ss * ss;
      px[o] = aa ? Math.round(rr / aa) : 0; px[o + 1] = aa ? Math.round(gg / aa) : 0; px[o + 2] = aa ? Math.round(bb / aa) : 0;
      px[o + 3] = Math.round((aa / n) * 255);
    }
  }
  return png(size, size, px);
}

const CRC = new Uint32Array(256).map((_, n) => { let c = n; for (let k = 0; k < 8; k++) c = c & 1 ? 0xedb88320 ^ (c >>> 1) : c >>> 1; return c >>> 0; });
function crc32(buf) { let c = 0xffffffff; for (const b of buf) c = CRC[(c ^ b) & 0xff] ^ (c >>> 8); return (c ^ 0xffffffff) >>> 0; }
function chunk(type, data) {
  const len = Buffer.alloc(4); len.writeUInt32BE(data.length);
  const td = Buffer.concat([Buffer.from(type, 'ascii'), data]);
  const crc = Buffer.alloc(4); crc.writeUInt32BE(crc32(td));
  return Buffer.concat([len, td, crc]);
}
function png(w, h, raw) {
  const ihdr = Buffer.alloc(13);
  ihdr.writeUInt32BE(w, 0); ihdr.writeUInt32BE(h, 4); ihdr[8] = 8; ihdr[9] = 6; ihdr[10] = 0; ihdr[11] = 0; ihdr[12] = 0;
  return Buffer.concat([Buffer.from([137, 80, 78, 71, 13, 10, 26, 10]), chunk('IHDR', ihdr), chunk('IDAT', deflateSync(raw, { level: 9 })), chunk('IEND', Buffer.alloc(0))]);
}

for (const size of [192, 512]) {
  writeFileSync(join(out, `icon-${size}.png`), render(size));
  console.log(`wrote icons/icon-${size}.png`);
}
