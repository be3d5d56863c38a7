/**
 * What the server learns from a floor plan image's bytes: its type (by sniffing,
 * core/plan), its pixel size where the format says it (PNG IHDR, JPEG SOF marker,
 * SVG width/height or viewBox), and a SHA-256 to tell versions apart.
 *
 * PNG: ISO/IEC 15948, 11.2.2 (IHDR: width and height, 4-byte big-endian, at bytes
 * 16 and 20). JPEG: ITU-T T.81, B.2.2 (SOFn: height then width, 2 bytes each, after
 * the marker length and precision).
 */
import { createHash } from 'node:crypto';

export function sha256Hex(bytes: Uint8Array): string {
  return createHash('sha256').update(bytes).digest('hex');
}

export function pngSize(b: Buffer): { width: number; height: number } | null {
  if (b.length < 24 || b.toString('latin1', 12, 16) !== 'IHDR') return null;
  return { width: b.readUInt32BE(16), height: b.readUInt32BE(20) };
}

export function jpegSize(b: Buffer): { width: number; height: number } | null {
  let i = 2;
  while (i + 9 < b.length) {
    if (b[i] !== 0xff) return null;
    const marker = b[i + 1]!;
    if (marker === 0xff) { i++; continue; }
    if (marker === 0xd8 || marker === 0x01 || (marker >= 0xd0 && marker <= 0xd7)) { i += 2; continue; }
    const len = b.readUInt16BE(i + 2);
    const isSof = marker >= 0xc0 && marker <= 0xcf && marker !== 0xc4 && marker !== 0xc8 && marker !== 0xcc;
    if (isSof) return { height: b.readUInt16BE(i + 5), width: b.readUInt16BE(i + 7) };
    if (marker === 0xd9 || marker === 0xda) return null;
    i += 2 + len;
  }
  return null;
}

/** Width and height of a (sanitized) SVG from its root element: width/height in plain numbers or px, else the viewBox. */
export function svgSize(svg: string): { width: number; height: number } | null {
  const root = /<svg\b[^>]*>/i.exec(svg)?.[0];
  if (!root) return null;
  const attr = (name: string) => new RegExp(`\\s${name}\\s*=\\s*["']([^"']*)["']`, 'i').exec(root)?.[1];
  const px = (v: string | undefined) => (v && /^\s*[\d.]+\s*(px)?\s*$/.test(v) ? Number.parseFloat(v) : null);
  const w = px(attr('width'));
  const h = px(attr('height'));
  if (w && h) return { width: w, height: h };
  const vb = attr('viewBox')?.trim().split(/[\s,]+/).map(Number);
  if (vb && vb.length === 4 && vb.every(Number.isFinite) && vb[2]! > 0 && vb[3]! > 0) return { width: vb[2]!, height: vb[3]! };
  return null;
}
