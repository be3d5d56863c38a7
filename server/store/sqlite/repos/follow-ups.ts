/**
 * follow_ups and follow_up_events: corrective actions on a spot and their history.
 *
 * A follow-up closes only with a verifying reading (a current revision of a reading
 * of the same spot, taken after the follow-up was opened, whose verdict is 'ok',
 * recomputed by core/ now) or with a written reason. Reopening clears the closing
 * fields; the events table keeps every step (append-only, triggers refuse edits).
 */
import { newId } from '../../../../core/ids/uuidv7';
import type {
  FollowUp, FollowUpClose, FollowUpEdit, FollowUpEvent, FollowUpInput, FollowUpReopen, FollowUpWithEvents,
} from '../../../../core/schemas';
import { conflict, invalid, notFound } from '../../errors';
import { stmt, type Db } from '../db';
import { eventFromRow, followUpFromRow, verifyingReadingDetail, type EventRow, type FollowUpRow } from '../../shared/follow-ups';
export { eventFromRow, followUpFromRow };
import { getReadingEntity } from './readings';

const SELECT = `SELECT f.*, s.code AS spot_code, s.name AS spot_name FROM follow_ups f JOIN spots s ON s.id = f.spot_id`;

function getRow(db: Db, id: string): FollowUpRow | undefined {
  return stmt(db, `${SELECT} WHERE f.id = ?`).get(id) as FollowUpRow | undefined;
}

export function getFollowUp(db: Db, id: string): FollowUpWithEvents | null {
  const r = getRow(db, id);
  if (!r) return null;
  const events = (stmt(db, 'SELECT * FROM follow_up_events WHERE follow_up_id = ? ORDER BY at, rowid').all(id) as EventRow[]).map(eventFromRow);
  return { ...followUpFromRow(r), events };
}

function statusWhere(status: 'open' | 'closed' | 'all'): string {
  return status === 'all' ? '' : ` AND f.status = '${status}'`;
}

/** Open ones first (by due date, none last), then closed ones, newest first. */
const ORDER = `ORDER BY f.status = 'closed', CASE WHEN f.status = 'open' THEN COALESCE(f.due_date, '9999-12-31') END,
  f.created_at DESC, f.id`;

export function listSpotFollowUps(db: Db, spotId: string, status: 'open' | 'closed' | 'all'): FollowUp[] {
  return (stmt(db, `${SELECT} WHERE f.spot_id = ?${statusWhere(status)} ${ORDER}`).all(spotId) as FollowUpRow[]).map(followUpFromRow);
}

export function listSiteFollowUps(db: Db, siteId: string, status: 'open' | 'closed' | 'all'): FollowUp[] {
  return (stmt(db, `${SELECT} WHERE f.site_id = ?${statusWhere(status)} ${ORDER}`).all(siteId) as FollowUpRow[]).map(followUpFromRow);
}

/** Every follow-up of a site with its events (the JSON export). */
export function exportSiteFollowUps(db: Db, siteId: string): { followUps: FollowUp[]; events: FollowUpEvent[] } {
  const followUps = (stmt(db, `${SELECT} WHERE f.site_id = ? ORDER BY f.created_at, f.id`).all(siteId) as FollowUpRow[]).map(followUpFromRow);
  const events = (stmt(db, `SELECT e.* FROM follow_up_events e JOIN follow_ups f ON f.id = e.follow_up_id
    WHERE f.site_id = ? ORDER BY e.at, e.rowid`).all(siteId) as EventRow[]).map(eventFromRow);
  return { followUps, events };
}

function addEvent(db: Db, e: Omit<FollowUpEvent, 'id'>): void {
  stmt(db, 'INSERT INTO follow_up_events (id, follow_up_id, kind, at, by, reading_id, reason, detail) VALUES (?, ?, ?, ?, ?, ?, ?, ?)')
    .run(newId(), e.followUpId, e.kind, e.at, e.by, e.readingId, e.reason, JSON.stringify(e.detail));
}

export function insertFollowUp(db: Db, input: FollowUpInput, now: string): FollowUpWithEvents {
  const spot = stmt(db, 'SELECT site_id FROM spots WHERE id = ?').get(input.spotId) as { site_id: string } | undefined;
  if (!spot) throw notFound(`no spot with id ${input.spotId}`, ['spotId']);
  if (input.openedFromReadingId !== null) {
    const r = stmt(db, 'SELECT spot_id FROM readings WHERE id = ?').get(input.openedFromReadingId) as { spot_id: string } | undefined;
    if (!r) throw notFound(`no reading with id ${input.openedFromReadingId}`, ['openedFromReadingId']);
    if (r.spot_id !== input.spotId) throw invalid('the reading was taken at another spot than this follow-up\'s', ['openedFromReadingId']);
  }
  const id = input.id ?? newId();
  if (input.id && getRow(db, id)) throw conflict(`a follow-up with id ${id} already exists`, ['id']);
  stmt(db, `INSERT INTO follow_ups (id, site_id, spot_id, opened_from_reading_id, finding_class, action, assignee, due_date, status,
      opened_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'open', ?, ?, ?)`)
    .run(id, spot.site_id, input.spotId, input.openedFromReadingId, input.findingClass, input.action, input.assignee, input.dueDate,
      input.by, now, now);
  addEvent(db, {
    followUpId: id, kind: 'opened', at: now, by: input.by, readingId: input.openedFromReadingId, reason: null,
    detail: { findingClass: input.findingClass, action: input.action, assignee: input.assignee, dueDate: input.dueDate },
  });
  return getFollowUp(db, id)!;
}

function requireRow(db: Db, id: string): FollowUpRow {
  const r = getRow(db, id);
  if (!r) throw notFound(`no follow-up with id ${id}`, ['id']);
  return r;
}

export function editFollowUp(db: Db, id: string, edit: FollowUpEdit, now: string): FollowUpWithEvents {
  const r = requireRow(db, id);
  const before = followUpFromRow(r);
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const k of ['findingClass', 'action', 'assignee', 'dueDate'] as const) {
    const to = edit[k];
    if (to !== undefined && to !== before[k]) changes[k] = { from: before[k], to };
  }
  if (Object.keys(changes).length === 0) return getFollowUp(db, id)!;
  const after = { ...before, ...Object.fromEntries(Object.entries(changes).map(([k, c]) => [k, c.to])) } as FollowUp;
  stmt(db, 'UPDATE follow_ups SET finding_class = ?, action = ?, assignee = ?, due_date = ?, updated_at = ? WHERE id = ?')
    .run(after.findingClass, after.action, after.assignee, after.dueDate, now, id);
  addEvent(db, { followUpId: id, kind: 'edited', at: now, by: edit.by, readingId: null, reason: null, detail: changes });
  return getFollowUp(db, id)!;
}

/**
 * Closes with a verifying reading or a written reason. A verifying reading must be a
 * current, not deleted revision of a reading of the same spot, taken after the
 * follow-up was opened, within limits now (verdict 'ok'); otherwise 409 saying why.
 */
export function closeFollowUp(db: Db, id: string, close: FollowUpClose, now: string): FollowUpWithEvents {
  const r = requireRow(db, id);
  if (r.status === 'closed') throw conflict(`this follow-up is already closed (${r.closed_at ?? ''}); reopen it first`);
  let detail: Record<string, unknown> = {};
  if (close.verifyingReadingId !== undefined) {
    const reading = getReadingEntity(db, close.verifyingReadingId);
    if (!reading) throw notFound(`no reading with id ${close.verifyingReadingId}`, ['verifyingReadingId']);
    detail = verifyingReadingDetail(r, reading);
  }
  const readingId = close.verifyingReadingId ?? null;
  const reason = close.reason ?? null;
  stmt(db, `UPDATE follow_ups SET status = 'closed', closed_at = ?, closed_by_reading_id = ?, closed_reason = ?, closed_by = ?, updated_at = ?
    WHERE id = ?`).run(now, readingId, reason, close.by, now, id);
  addEvent(db, { followUpId: id, kind: 'closed', at: now, by: close.by, readingId, reason, detail });
  return getFollowUp(db, id)!;
}

export function reopenFollowUp(db: Db, id: string, reopen: FollowUpReopen, now: string): FollowUpWithEvents {
  const r = requireRow(db, id);
  if (r.status === 'open') throw conflict('this follow-up is open already');
  stmt(db, `UPDATE follow_ups SET status = 'open', closed_at = NULL, closed_by_reading_id = NULL, closed_reason = NULL, closed_by = NULL,
    updated_at = ? WHERE id = ?`).run(now, id);
  addEvent(db, {
    followUpId: id, kind: 'reopened', at: now, by: reopen.by, readingId: null, reason: reopen.reason,
    detail: { closedAt: r.closed_at, closedByReadingId: r.closed_by_reading_id, closedReason: r.closed_reason },
  });
  return getFollowUp(db, id)!;
}
