/**
 * CSV as RFC 4180 describes it: fields separated by commas (or a chosen
 * delimiter), records by CRLF or LF, fields with the delimiter, quotes or line
 * breaks enclosed in double quotes, a quote inside doubled.
 *
 * Spreadsheet safety: a text field starting with = + - @ (or tab/CR) is prefixed
 * with an apostrophe on export so a spreadsheet does not run it as a formula
 * (OWASP "CSV Injection"); numbers are written as numbers.
 */

export interface CsvParseResult {
  rows: string[][];
  /** 1-based line number where each row starts, for error messages. */
  lines: number[];
}

/**
 * Parses CSV text into rows of strings. A leading UTF-8 byte-order mark is
 * dropped. An unterminated quoted field throws with the line where it began.
 * @example parseCsv('a,b\n"x, y",2\n').rows // [['a','b'],['x, y','2']]
 */
export function parseCsv(text: string, delimiter = ','): CsvParseResult {
  if (delimiter.length !== 1 || delimiter === '"' || delimiter === '\n' || delimiter === '\r') {
    throw new Error('CSV delimiter must be one character other than a quote or a line break');
  }
  const src = text.charCodeAt(0) === 0xfeff ? text.slice(1) : text;
  const rows: string[][] = [];
  const lines: number[] = [];
  let row: string[] = [];
  let field = '';
  let i = 0;
  let line = 1;
  let rowLine = 1;
  let inQuotes = false;
  let quoteLine = 0;
  let fieldStarted = false;
  const endRow = () => {
    row.push(field);
    // Skip blank lines (a single empty field).
    if (!(row.length === 1 && row[0] === '')) {
      rows.push(row);
      lines.push(rowLine);
    }
    row = [];
    field = '';
    fieldStarted = false;
  };
  while (i < src.length) {
    const c = src[i]!;
    if (inQuotes) {
      if (c === '"') {
        if (src[i + 1] === '"') { field += '"'; i += 2; continue; }
        inQuotes = false; i++; continue;
      }
      if (c === '\n') line++;
      field += c; i++; continue;
    }
    if (c === '"' && !fieldStarted) { inQuotes = true; quoteLine = line; fieldStarted = true; i++; continue; }
    if (c === delimiter) { row.push(field); field = ''; fieldStarted = false; i++; continue; }
    if (c === '\r' || c === '\n') {
      endRow();
      if (c === '\r' && src[i + 1] === '\n') i++;
      i++; line++; rowLine = line; continue;
    }
    field += c; fieldStarted = true; i++;
  }
  if (inQuotes) throw new Error(`CSV: a quoted field opened on line ${quoteLine} is never closed`);
  if (field !== '' || row.length > 0) endRow();
  return { rows, lines };
}

/** One field, quoted when needed, neutralised against formula injection. */
export function csvField(value: string | number | boolean | null | undefined, delimiter = ','): string {
  if (value === null || value === undefined) return '';
  if (typeof value === 'number') return Number.isFinite(value) ? String(value) : '';
  if (typeof value === 'boolean') return value ? 'true' : 'false';
  let s = value;
  if (/^[=+\-@\t\r]/.test(s)) s = `'${s}`;
  if (s.includes('"') || s.includes(delimiter) || s.includes('\n') || s.includes('\r')) {
    return `"${s.replace(/"/g, '""')}"`;
  }
  return s;
}

/**
 * Writes rows as CSV with CRLF line ends (RFC 4180).
 * @example toCsv([['a', 'b'], ['x, y', 2]]) // 'a,b\r\n"x, y",2\r\n'
 */
export function toCsv(rows: ReadonlyArray<ReadonlyArray<string | number | boolean | null | undefined>>, delimiter = ','): string {
  return rows.map((r) => r.map((v) => csvField(v, delimiter)).join(delimiter)).join('\r\n') + (rows.length ? '\r\n' : '');
}
