import type { Reading, Round, SkipInput } from '../../core/schemas';

/** A reading as the tablet keeps it: the server's shape, plus where it came from. */
export type LocalReading = Reading & { origin: 'local' | 'server' };

/** A round as the tablet keeps it; meterId is the tablet's choice for this round (not sent). */
export type LocalRound = Round & { origin: 'local' | 'server'; meterId: string | null };

export type LocalSkip = SkipInput & { origin: 'local' | 'server' };

export type OutboxKind = 'round' | 'reading' | 'skip' | 'finish' | 'correction' | 'tombstone' | 'follow-up-close';

/**
 * pending: saved on this tablet, waiting to be sent; sending: in flight;
 * rejected: the server refused it (4xx) — kept, shown with the reason, can be retried;
 * conflict: the server holds a different record under the same id — kept for review.
 */
export type OutboxStatus = 'pending' | 'sending' | 'rejected' | 'conflict';

export interface OutboxItem {
  /** Order of writes on this tablet (IndexedDB autoIncrement). */
  seq?: number;
  /** Unique per write: 'reading:<id>', 'round:<id>', 'finish:<roundId>', 'tombstone:<readingId>' ... */
  key: string;
  kind: OutboxKind;
  /** The id of the record the write is about (reading id, round id, skip id, follow-up id). */
  entityId: string;
  roundId: string | null;
  spotId: string | null;
  /** For corrections and deletes: the reading revision being corrected or deleted. */
  targetId: string | null;
  path: string;
  body: unknown;
  status: OutboxStatus;
  attempts: number;
  message: string | null;
  createdAt: string;
}

/** What the screen says about a record. */
export type SyncState = 'local' | 'sending' | 'server' | 'rejected' | 'conflict';

export const SYNC_STATE_LABEL: Record<SyncState, string> = {
  local: 'saved on this tablet',
  sending: 'sending',
  server: 'on the server',
  rejected: 'rejected',
  conflict: 'conflict',
};
