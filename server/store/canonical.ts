import { createHash } from 'node:crypto';

/**
 * Canonical JSON: object keys sorted, undefined members left out, no spaces.
 * Two inputs that mean the same thing give the same text, so its hash tells an
 * identical retry (a duplicate) from a different reading sent with the same id
 * (a conflict).
 * @example canonicalJson({ b: 1, a: [true, null] }) // '{"a":[true,null],"b":1}'
 */
export function canonicalJson(value: unknown): string {
  if (value === null || typeof value !== 'object') return JSON.stringify(value) ?? 'null';
  if (Array.isArray(value)) return `[${value.map((v) => (v === undefined ? 'null' : canonicalJson(v))).join(',')}]`;
  const entries = Object.entries(value as Record<string, unknown>)
    .filter(([, v]) => v !== undefined)
    .sort(([a], [b]) => (a < b ? -1 : a > b ? 1 : 0));
  return `{${entries.map(([k, v]) => `${JSON.stringify(k)}:${canonicalJson(v)}`).join(',')}}`;
}

/** SHA-256 (hex) of the canonical JSON of a value. */
export function contentHash(value: unknown): string {
  return createHash('sha256').update(canonicalJson(value)).digest('hex');
}

/** An ISO 8601 date-time with offset, as UTC with milliseconds ("2026-03-02T08:15:00.000Z"): text order is time order. */
export function toUtcIso(isoWithOffset: string): string {
  return new Date(isoWithOffset).toISOString();
}
