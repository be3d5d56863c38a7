/**
 * Deterministic ids for imported data: the same file imported twice makes the same
 * ids, so the readings ingest answers 'duplicate' for every row the second time.
 *
 * The id is UUIDv7-shaped (RFC 9562, 5.7): the first 48 bits are the Unix time in
 * ms (the reading's time, so inserts stay time-ordered), then version 7, 12 bits,
 * variant 10, 62 bits; those 74 bits come from SHA-256 of the content instead of
 * a random source (RFC 9562 allows any method for them; uniqueness here rests on
 * the hash).
 */
import { createHash } from 'node:crypto';

export function deterministicUuidV7(timeMs: number, ...parts: string[]): string {
  const h = createHash('sha256');
  for (const p of parts) h.update(p).update('\u0000');
  const digest = h.digest();
  const bytes = Buffer.alloc(16);
  const ms = Math.max(0, Math.min(Math.floor(timeMs), 2 ** 48 - 1));
  bytes.writeUIntBE(ms, 0, 6);
  digest.copy(bytes, 6, 0, 10);
  bytes[6] = (bytes[6]! & 0x0f) | 0x70; // version 7
  bytes[8] = (bytes[8]! & 0x3f) | 0x80; // variant 10
  const hex = bytes.toString('hex');
  return `${hex.slice(0, 8)}-${hex.slice(8, 12)}-${hex.slice(12, 16)}-${hex.slice(16, 20)}-${hex.slice(20)}`;
}
