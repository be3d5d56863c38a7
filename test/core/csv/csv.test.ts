// CSV behaviour checked against the rules and examples of RFC 4180 section 2, and
// against the OWASP "CSV Injection" advice for exported text fields.
import { describe, expect, it } from 'vitest';
import fc from 'fast-check';
import { csvField, parseCsv, toCsv } from '../../../core/csv';

describe('parseCsv (RFC 4180 section 2)', () => {
  it('rule 1-2: CRLF-separated records, last line break optional', () => {
    expect(parseCsv('aaa,bbb,ccc\r\nzzz,yyy,xxx').rows).toEqual([['aaa', 'bbb', 'ccc'], ['zzz', 'yyy', 'xxx']]);
  });
  it('rule 5-7: quoted fields with commas, line breaks and doubled quotes', () => {
    const { rows, lines } = parseCsv('"aaa","b\r\nbb","c""cc"\r\nzzz,yyy,xxx\r\n');
    expect(rows).toEqual([['aaa', 'b\r\nbb', 'c"cc'], ['zzz', 'yyy', 'xxx']]);
    expect(lines).toEqual([1, 3]);
  });
  it('LF line ends, BOM, blank lines, empty fields', () => {
    expect(parseCsv('\uFEFFa,,c\n\n1,2,\n').rows).toEqual([['a', '', 'c'], ['1', '2', '']]);
  });
  it('semicolon delimiter (common in locales with a decimal comma)', () => {
    expect(parseCsv('a;"1,5"\n', ';').rows).toEqual([['a', '1,5']]);
  });
  it('an unterminated quote names its line', () => {
    expect(() => parseCsv('a,b\n"open,2\n3,4')).toThrow(/line 2/);
  });
  it('empty input gives no rows', () => {
    expect(parseCsv('').rows).toEqual([]);
  });
});

describe('toCsv', () => {
  it('quotes only when needed and neutralises formulas (OWASP CSV Injection)', () => {
    expect(toCsv([['a', 'x, y', 'say "hi"', 2.5, null, true]])).toBe('a,"x, y","say ""hi""",2.5,,true\r\n');
    expect(csvField('=HYPERLINK("x")')).toBe(`"'=HYPERLINK(""x"")"`);
    expect(csvField('-5 kV/m')).toBe("'-5 kV/m");
    expect(csvField(-5)).toBe('-5');
    expect(csvField(NaN)).toBe('');
  });
  it('round trip: parse(toCsv(rows)) = rows for any text not starting with a formula character', () => {
    const safeText = fc.string({ unit: 'grapheme', maxLength: 20 }).filter((s) => !/^[=+\-@\t\r]/.test(s));
    fc.assert(fc.property(fc.array(fc.array(safeText, { minLength: 2, maxLength: 5 }), { minLength: 1, maxLength: 8 }), (rows) => {
      const parsed = parseCsv(toCsv(rows)).rows;
      // Rows that were a single empty field are blank lines and are skipped by design.
      const expected = rows.filter((r) => !(r.length === 1 && r[0] === ''));
      expect(parsed).toEqual(expected);
    }), { seed: 42, numRuns: 200 });
  });
});
