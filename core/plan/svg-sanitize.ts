/**
 * Makes an uploaded SVG floor plan safe to serve: an allowlist of drawing
 * elements and attributes is kept and re-serialized; everything else is
 * dropped: scripts, event handlers, foreignObject, embedded or external images,
 * links, animation, style sheets, and any reference that is not a local
 * fragment (#id). DOCTYPEs and entity declarations are refused outright (they
 * allow entity-expansion and external-entity tricks).
 *
 * This is the first line; the server also serves plan images with a
 * Content-Security-Policy of default-src 'none', and the app shows them with
 * <img>, where SVG cannot run scripts at all.
 */

const ALLOWED_ELEMENTS = new Set([
  'svg', 'g', 'path', 'rect', 'circle', 'ellipse', 'line', 'polyline', 'polygon', 'text', 'tspan', 'title', 'desc',
  'defs', 'use', 'symbol', 'clipPath', 'linearGradient', 'radialGradient', 'stop', 'marker', 'metadata',
]);

/** Elements dropped with everything inside them. */
const DROP_SUBTREE = new Set(['script', 'style', 'foreignObject', 'iframe', 'object', 'embed', 'image', 'audio', 'video']);

const ALLOWED_ATTRIBUTES = new Set([
  'id', 'class', 'x', 'y', 'x1', 'y1', 'x2', 'y2', 'cx', 'cy', 'r', 'rx', 'ry', 'width', 'height', 'd', 'points',
  'viewBox', 'preserveAspectRatio', 'transform', 'fill', 'fill-opacity', 'fill-rule', 'stroke', 'stroke-width',
  'stroke-opacity', 'stroke-linecap', 'stroke-linejoin', 'stroke-dasharray', 'stroke-dashoffset', 'stroke-miterlimit',
  'opacity', 'font-family', 'font-size', 'font-weight', 'font-style', 'text-anchor', 'dominant-baseline', 'dx', 'dy',
  'clip-path', 'clip-rule', 'offset', 'stop-color', 'stop-opacity', 'gradientUnits', 'gradientTransform', 'fx', 'fy',
  'version', 'xmlns', 'xmlns:xlink', 'href', 'xlink:href', 'style', 'visibility', 'display', 'color', 'markerWidth',
  'markerHeight', 'refX', 'refY', 'orient', 'marker-start', 'marker-mid', 'marker-end', 'vector-effect',
  'letter-spacing', 'text-decoration', 'xml:space', 'lengthAdjust', 'textLength',
]);

export interface SanitizedSvg {
  svg: string;
  /** What was removed, in plain words, for the upload report. */
  removed: string[];
}

export class SvgRejectedError extends Error {}

function escapeAttr(v: string): string {
  return v.replace(/&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/g, '&amp;').replace(/"/g, '&quot;').replace(/</g, '&lt;');
}

function escapeText(v: string): string {
  return v.replace(/&(?!(?:amp|lt|gt|quot|apos|#\d+|#x[0-9a-fA-F]+);)/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;');
}

function decodeForCheck(v: string): string {
  // Entities could hide "javascript:" or "url(": decode the numeric ones before checking.
  return v
    .replace(/&#x([0-9a-fA-F]+);?/g, (_m, h: string) => String.fromCodePoint(Math.min(parseInt(h, 16), 0x10ffff)))
    .replace(/&#(\d+);?/g, (_m, d: string) => String.fromCodePoint(Math.min(parseInt(d, 10), 0x10ffff)))
    // eslint-disable-next-line no-control-regex -- control characters are exactly what must be stripped
    .replace(/[\s\u0000-\u001f]+/g, '')
    .toLowerCase();
}

function unsafeValue(name: string, value: string): string | null {
  const v = decodeForCheck(value);
  if (v.includes('javascript:') || v.includes('vbscript:') || v.includes('data:')) return `${name} with a script or data URL`;
  if (name === 'href' || name === 'xlink:href') return v.startsWith('#') ? null : `${name} pointing outside the file`;
  if (/url\((?!['"]?#)/.test(v)) return `${name} referencing an outside resource`;
  if (name === 'style' && (v.includes('@import') || v.includes('expression(') || v.includes('behavior:'))) return 'style with imports or expressions';
  return null;
}

const TAG = /<\/?([A-Za-z][\w:.-]*)((?:\s+[^\s=/>]+(?:\s*=\s*(?:"[^"]*"|'[^']*'|[^\s>]+))?)*)\s*(\/?)>/y;
const ATTR = /([^\s=/>]+)(?:\s*=\s*(?:"([^"]*)"|'([^']*)'|([^\s>]+)))?/g;

/**
 * @throws SvgRejectedError when the text is not an SVG we can read safely.
 * @example sanitizeSvg('<svg xmlns="http://www.w3.org/2000/svg"><script>x</script><rect width="10" height="5" onclick="x"/></svg>').svg
 *   // '<svg xmlns="http://www.w3.org/2000/svg"><rect width="10" height="5"/></svg>'
 */
export function sanitizeSvg(input: string): SanitizedSvg {
  if (/<!DOCTYPE|<!ENTITY/i.test(input)) throw new SvgRejectedError('SVG files with a DOCTYPE or entity declarations are not accepted');
  const removed = new Set<string>();
  let out = '';
  let i = 0;
  const stack: { name: string; kept: boolean }[] = [];
  let dropDepth = 0; // > 0 while inside a dropped subtree
  let sawSvg = false;
  while (i < input.length) {
    const lt = input.indexOf('<', i);
    const textEnd = lt === -1 ? input.length : lt;
    if (textEnd > i) {
      const text = input.slice(i, textEnd);
      if (dropDepth === 0 && stack.length > 0 && stack[stack.length - 1]!.kept) out += escapeText(text);
      i = textEnd;
      continue;
    }
    // At '<'
    if (input.startsWith('<!--', i)) {
      const end = input.indexOf('-->', i + 4);
      i = end === -1 ? input.length : end + 3;
      continue;
    }
    if (input.startsWith('<![CDATA[', i)) {
      const end = input.indexOf(']]>', i);
      if (dropDepth === 0) removed.add('CDATA sections');
      i = end === -1 ? input.length : end + 3;
      continue;
    }
    if (input.startsWith('<?', i)) {
      const end = input.indexOf('?>', i);
      i = end === -1 ? input.length : end + 2;
      continue;
    }
    TAG.lastIndex = i;
    const m = TAG.exec(input);
    if (!m) throw new SvgRejectedError(`SVG could not be read near character ${i}`);
    i = TAG.lastIndex;
    const raw = m[0];
    const name = m[1]!;
    const local = name.includes(':') ? name.slice(name.indexOf(':') + 1) : name;
    const closing = raw.startsWith('</');
    const selfClosing = m[3] === '/';
    if (closing) {
      const top = stack.pop();
      if (!top || top.name !== name) throw new SvgRejectedError(`SVG is not well formed: </${name}> does not match`);
      if (dropDepth > 0) { dropDepth--; continue; }
      if (top.kept) out += `</${name}>`;
      continue;
    }
    if (dropDepth > 0) {
      if (!selfClosing) { stack.push({ name, kept: false }); dropDepth++; }
      continue;
    }
    if (!sawSvg) {
      if (local !== 'svg') throw new SvgRejectedError('the file does not start with an <svg> element');
      sawSvg = true;
    }
    const parentKept = stack.length === 0 || stack[stack.length - 1]!.kept;
    if (DROP_SUBTREE.has(local) || !ALLOWED_ELEMENTS.has(name)) {
      removed.add(DROP_SUBTREE.has(local) ? `<${local}> elements` : `unsupported <${name}> elements`);
      if (!selfClosing) {
        if (DROP_SUBTREE.has(local) || !parentKept) { stack.push({ name, kept: false }); dropDepth++; }
        else stack.push({ name, kept: false }); // unknown wrapper: drop the tag, keep allowed children
      }
      continue;
    }
    let attrs = '';
    ATTR.lastIndex = 0;
    let a: RegExpExecArray | null;
    const attrText = m[2] ?? '';
    while ((a = ATTR.exec(attrText)) !== null) {
      const an = a[1]!;
      const av = a[2] ?? a[3] ?? a[4] ?? '';
      if (/^on/i.test(an)) { removed.add('event handler attributes'); continue; }
      if (!ALLOWED_ATTRIBUTES.has(an)) { removed.add(`attribute ${an}`); continue; }
      const why = unsafeValue(an, av);
      if (why) { removed.add(why); continue; }
      attrs += ` ${an}="${escapeAttr(av)}"`;
    }
    out += `<${name}${attrs}${selfClosing ? '/' : ''}>`;
    if (!selfClosing) stack.push({ name, kept: true });
  }
  if (!sawSvg) throw new SvgRejectedError('the file holds no <svg> element');
  if (stack.length) throw new SvgRejectedError(`SVG is not well formed: <${stack[stack.length - 1]!.name}> is never closed`);
  return { svg: out, removed: [...removed] };
}
