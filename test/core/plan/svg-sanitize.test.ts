// Hostile SVG cases follow the OWASP XSS Filter Evasion cheat sheet and the SVG 1.1
// specification's scripting features (script element, event attributes, xlink:href).
import { describe, expect, it } from 'vitest';
import { sanitizeSvg, sniffPlanImageType, SvgRejectedError } from '../../../core/plan';

const NS = 'xmlns="http://www.w3.org/2000/svg"';

describe('sanitizeSvg', () => {
  it('keeps an ordinary plan drawing', () => {
    const plan = `<?xml version="1.0"?><svg ${NS} viewBox="0 0 100 50"><!-- hall --><g stroke="#000"><rect x="1" y="1" width="98" height="48" fill="none"/><text x="5" y="10">Hall &amp; store</text></g></svg>`;
    const r = sanitizeSvg(plan);
    expect(r.svg).toBe(`<svg ${NS} viewBox="0 0 100 50"><g stroke="#000"><rect x="1" y="1" width="98" height="48" fill="none"/><text x="5" y="10">Hall &amp; store</text></g></svg>`);
    expect(r.removed).toEqual([]);
  });
  it('drops scripts, handlers, foreignObject, images and outside links', () => {
    const evil = `<svg ${NS} onload="alert(1)"><script>alert(2)</script><script/><foreignObject><div>x</div></foreignObject>`
      + `<image href="http://example.invalid/x.png"/><a href="javascript:alert(3)"><rect width="1" height="1"/></a>`
      + `<use href="http://example.invalid/s.svg#a"/><use href="#local"/><rect style="fill:url(http://example.invalid/a)" width="2"/>`
      + `<rect fill="url(#grad)" width="3"/><animate attributeName="href" to="javascript:alert(4)"/><style>@import url(x)</style></svg>`;
    const r = sanitizeSvg(evil);
    expect(r.svg).not.toMatch(/script|onload|alert|foreignObject|image|javascript|example\.invalid|animate|@import/i);
    expect(r.svg).toContain('<use href="#local"/>');
    expect(r.svg).toContain('<rect fill="url(#grad)" width="3"/>');
    // the <a> wrapper goes but its drawing stays
    expect(r.svg).toContain('<rect width="1" height="1"/>');
    expect(r.removed.length).toBeGreaterThan(3);
  });
  it('sees through entity-encoded javascript: URLs', () => {
    const r = sanitizeSvg(`<svg ${NS}><use href="&#106;avascript:alert(1)"/></svg>`);
    expect(r.svg).toBe(`<svg ${NS}><use/></svg>`);
  });
  it('refuses DOCTYPE and entity declarations (billion laughs, external entities)', () => {
    expect(() => sanitizeSvg(`<!DOCTYPE svg [<!ENTITY a "aaaa">]><svg ${NS}>&a;</svg>`)).toThrow(SvgRejectedError);
  });
  it('refuses what is not an SVG, or is not well formed', () => {
    expect(() => sanitizeSvg('<html><body/></html>')).toThrow(/<svg>/);
    expect(() => sanitizeSvg(`<svg ${NS}><g></svg>`)).toThrow(/does not match/);
    expect(() => sanitizeSvg(`<svg ${NS}><g>`)).toThrow(/never closed/);
  });
  it('escapes text so markup in labels stays text', () => {
    const r = sanitizeSvg(`<svg ${NS}><text>a > b</text></svg>`);
    expect(r.svg).toContain('a &gt; b');
  });
});

describe('sniffPlanImageType', () => {
  it('decides by the first bytes (PNG spec 5.2 signature; JPEG SOI marker)', () => {
    expect(sniffPlanImageType(new Uint8Array([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0]))).toBe('image/png');
    expect(sniffPlanImageType(new Uint8Array([0xff, 0xd8, 0xff, 0xe0]))).toBe('image/jpeg');
    expect(sniffPlanImageType(new TextEncoder().encode(`<?xml version="1.0"?>\n<!-- x --><svg ${NS}/>`))).toBe('image/svg+xml');
    expect(sniffPlanImageType(new TextEncoder().encode('GIF89a'))).toBeNull();
    expect(sniffPlanImageType(new TextEncoder().encode('<html>'))).toBeNull();
    expect(sniffPlanImageType(new Uint8Array([]))).toBeNull();
  });
});
