/**
 * The text of a PDF that Chromium printed (page.pdf), with no PDF library: the
 * content streams are inflated (FlateDecode, node:zlib), text-showing operators
 * (Tj, TJ) read, and each font's glyph codes mapped to characters through its
 * ToUnicode CMap (bfchar and bfrange). Enough for Skia's PDFs, which show text
 * as hex glyph strings in Identity-H fonts; not a general PDF parser.
 *
 * Reference: ISO 32000-1:2008, 7.3.8 (streams), 9.4 (text objects), 9.10.3
 * (ToUnicode CMaps); Adobe Technical Note 5014 (CMap syntax).
 */
import { inflateSync } from 'node:zlib';

interface PdfObject { dict: string; data: Buffer | null }

function readObjects(pdf: Buffer): Map<number, PdfObject> {
  const src = pdf.toString('latin1');
  const out = new Map<number, PdfObject>();
  const re = /(\d+)\s+0\s+obj\b/g;
  let m: RegExpExecArray | null;
  while ((m = re.exec(src))) {
    const start = m.index + m[0].length;
    const end = src.indexOf('endobj', start);
    if (end < 0) break;
    const body = src.slice(start, end);
    const si = body.indexOf('stream');
    let dict = body;
    let data: Buffer | null = null;
    if (si >= 0 && body.lastIndexOf('endstream') > si) {
      dict = body.slice(0, si);
      let ds = start + si + 'stream'.length;
      if (src[ds] === '\r') ds++;
      if (src[ds] === '\n') ds++;
      const len = /\/Length\s+(\d+)(?!\s+0\s+R)/.exec(dict);
      const de = len ? ds + Number(len[1]) : start + body.lastIndexOf('endstream');
      let raw = pdf.subarray(ds, de);
      if (/\/FlateDecode/.test(dict)) {
        try { raw = inflateSync(raw); } catch { raw = Buffer.alloc(0); }
      }
      data = raw;
    }
    out.set(Number(m[1]), { dict, data });
    re.lastIndex = end;
  }
  return out;
}

/** code (hex, as written in the content) -> text */
function parseCMap(text: string): { map: Map<string, string>; bytes: number } {
  const map = new Map<string, string>();
  const hexToStr = (hx: string) => {
    let s = '';
    for (let i = 0; i + 4 <= hx.length; i += 4) s += String.fromCharCode(parseInt(hx.slice(i, i + 4), 16));
    return s;
  };
  let bytes = 2;
  const cs = /begincodespacerange\s*<([0-9a-fA-F]+)>/.exec(text);
  if (cs) bytes = cs[1]!.length / 2;
  for (const block of text.matchAll(/beginbfchar([\s\S]*?)endbfchar/g)) {
    for (const p of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]*)>/g)) map.set(p[1]!.toUpperCase(), hexToStr(p[2]!));
  }
  for (const block of text.matchAll(/beginbfrange([\s\S]*?)endbfrange/g)) {
    for (const p of block[1]!.matchAll(/<([0-9a-fA-F]+)>\s*<([0-9a-fA-F]+)>\s*(<[0-9a-fA-F]*>|\[[^\]]*\])/g)) {
      const lo = parseInt(p[1]!, 16);
      const hi = parseInt(p[2]!, 16);
      const width = p[1]!.length;
      if (p[3]!.startsWith('[')) {
        const items = [...p[3]!.matchAll(/<([0-9a-fA-F]*)>/g)].map((x) => hexToStr(x[1]!));
        for (let c = lo; c <= hi; c++) map.set(c.toString(16).toUpperCase().padStart(width, '0'), items[c - lo] ?? '');
      } else {
        const base = p[3]!.slice(1, -1);
        const first = parseInt(base.slice(-4) || '0', 16);
        const prefix = hexToStr(base.slice(0, -4));
        for (let c = lo; c <= hi; c++) map.set(c.toString(16).toUpperCase().padStart(width, '0'), prefix + String.fromCharCode(first + c - lo));
      }
    }
  }
  return { map, bytes };
}

export function pdfText(pdf: Buffer): string {
  const objs = readObjects(pdf);
  // Font objects with a ToUnicode CMap.
  const cmaps = new Map<number, { map: Map<string, string>; bytes: number }>();
  for (const [n, o] of objs) {
    const tu = /\/ToUnicode\s+(\d+)\s+0\s+R/.exec(o.dict);
    if (!tu) continue;
    const c = objs.get(Number(tu[1]));
    if (c?.data) cmaps.set(n, parseCMap(c.data.toString('latin1')));
  }
  // Type0 fonts point at descendants; the ToUnicode sits on the Type0 font itself in Skia's output.
  // Resource names -> font object numbers (from every /Font << ... >> dictionary).
  const names = new Map<string, number>();
  for (const o of objs.values()) {
    for (const f of o.dict.matchAll(/\/Font\s*<<([\s\S]*?)>>/g)) {
      for (const e of f[1]!.matchAll(/\/([^\s/<>[\]()]+)\s+(\d+)\s+0\s+R/g)) names.set(e[1]!, Number(e[2]));
    }
  }
  const decode = (hex: string, font: number | undefined): string => {
    const cm = font !== undefined ? cmaps.get(font) : undefined;
    const h = hex.replace(/\s+/g, '').toUpperCase();
    if (!cm) return '';
    let s = '';
    const step = cm.bytes * 2;
    for (let i = 0; i + step <= h.length; i += step) s += cm.map.get(h.slice(i, i + step)) ?? '';
    return s;
  };
  const parts: string[] = [];
  for (const o of objs.values()) {
    if (!o.data || /\/Subtype\s*\/(Image|Type1C|CIDFontType0C|OpenType)|\/Length1/.test(o.dict)) continue;
    const content = o.data.toString('latin1');
    if (!/\bBT\b/.test(content)) continue;
    let font: number | undefined;
    const tok = /\/([^\s/<>[\]()]+)\s+[\d.]+\s+Tf|<([0-9a-fA-F\s]*)>\s*Tj|\[((?:[^\]])*)\]\s*TJ|\b(Td|TD|T\*|Tm|ET)\b/g;
    let t: RegExpExecArray | null;
    while ((t = tok.exec(content))) {
      if (t[1]) font = names.get(t[1]);
      else if (t[2] !== undefined) parts.push(decode(t[2], font));
      else if (t[3] !== undefined) {
        for (const x of t[3].matchAll(/<([0-9a-fA-F\s]*)>|(-?[\d.]+)/g)) {
          if (x[1] !== undefined) parts.push(decode(x[1], font));
          else if (Number(x[2]) < -200) parts.push(' ');
        }
      } else parts.push(t[4] === 'ET' ? '\n' : ' ');
    }
  }
  return parts.join('').replace(/[ \t]+/g, ' ');
}

/** For assertions: the text with every run of whitespace removed. */
export function squash(s: string): string {
  // NFKC folds the ligatures the fonts use (U+FB01 'ﬁ' -> 'fi').
  return s.normalize('NFKC').replace(/\s+/g, '');
}
