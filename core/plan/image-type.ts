/**
 * Plan images accepted: PNG, JPEG and (sanitized) SVG. The type is decided from
 * the file's first bytes, never from its name or the browser's claim.
 * PNG signature: 89 50 4E 47 0D 0A 1A 0A (PNG spec, ISO/IEC 15948 5.2);
 * JPEG: FF D8 FF (JPEG File Interchange Format / ITU-T T.81 SOI marker).
 */
export type PlanImageType = 'image/png' | 'image/jpeg' | 'image/svg+xml';

export function sniffPlanImageType(bytes: Uint8Array): PlanImageType | null {
  const png = [0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a];
  if (bytes.length >= 8 && png.every((b, i) => bytes[i] === b)) return 'image/png';
  if (bytes.length >= 3 && bytes[0] === 0xff && bytes[1] === 0xd8 && bytes[2] === 0xff) return 'image/jpeg';
  // SVG: text that, after an optional BOM, XML declaration, comments and whitespace, opens <svg.
  const head = new TextDecoder('utf-8', { fatal: false }).decode(bytes.subarray(0, 4096)).replace(/^\uFEFF/, '');
  const stripped = head.replace(/^\s*(<\?xml[^>]*\?>\s*)?(<!--[\s\S]*?-->\s*)*/, '');
  if (/^<svg[\s>]/.test(stripped)) return 'image/svg+xml';
  return null;
}

/** Largest plan image accepted, bytes. */
export const MAX_PLAN_IMAGE_BYTES = 5 * 1024 * 1024;
