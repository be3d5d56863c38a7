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
import type { Db } from '../db';
import { eventFromRow, followUpFromRow, verifyingReadingDetail, type EventRow, type FollowUpRow } from '../../shared/follow-ups';
export { eventFromRow, followUpFromRow };
import { getReadingEntity } from './readings';

const SELECT = `SELECT f.*, s.code AS spot_code, s.name AS spot_name FROM follow_ups f JOIN spots s ON s.id = f.spot_id`;

async function getRow(db: Db, id: string): Promise<FollowUpRow | undefined> {
  return (await db.get(`${SELECT} WHERE f.id = ?`, id)) as FollowUpRow | undefined;
}

export async function getFollowUp(db: Db, id: string): Promise<FollowUpWithEvents | null> {
  const r = (await getRow(db, id));
  if (!r) return null;
  const events = ((await db.all('SELECT * FROM follow_up_events WHERE follow_up_id = ? ORDER BY at, seq', id)) as EventRow[]).map(eventFromRow);
  return { ...followUpFromRow(r), events };
}

function statusWhere(status: 'open' | 'closed' | 'all'): string {
  return status === 'all' ? '' : ` AND f.status = '${status}'`;
}

/** Open ones first (by due date, none last), then closed ones, newest first. */
const ORDER = `ORDER BY f.status = 'closed', CASE WHEN f.status = 'open' THEN COALESCE(f.due_date, '9999-12-31') END,
  f.created_at DESC, f.id`;

export async function listSpotFollowUps(db: Db, spotId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[]> {
  return ((await db.all(`${SELECT} WHERE f.spot_id = ?${statusWhere(status)} ${ORDER}`, spotId)) as FollowUpRow[]).map(followUpFromRow);
}

export async function listSiteFollowUps(db: Db, siteId: string, status: 'open' | 'closed' | 'all'): Promise<FollowUp[]> {
  return ((await db.all(`${SELECT} WHERE f.site_id = ?${statusWhere(status)} ${ORDER}`, siteId)) as FollowUpRow[]).map(followUpFromRow);
}

/** Every follow-up of a site with its events (the JSON export). */
export async function exportSiteFollowUps(db: Db, siteId: string): Promise<{ followUps: FollowUp[]; events: FollowUpEvent[] }> {
  const followUps = ((await db.all(`${SELECT} WHERE f.site_id = ? ORDER BY f.created_at, f.id`, siteId)) as FollowUpRow[]).map(followUpFromRow);
  const events = ((await db.all(`SELECT e.* FROM follow_up_events e JOIN follow_ups f ON f.id = e.follow_up_id
    WHERE f.site_id = ? ORDER BY e.at, e.seq`, siteId)) as EventRow[]).map(eventFromRow);
  return { followUps, events };
}

async function addEvent(db: Db, e: Omit<FollowUpEvent, 'id'>): Promise<void> {
  (await db.run('INSERT INTO follow_up_events (id, follow_up_id, kind, at, "by", reading_id, reason, detail) VALUES (?, ?, ?, ?, ?, ?, ?, ?)', newId(), e.followUpId, e.kind, e.at, e.by, e.readingId, e.reason, JSON.stringify(e.detail)));
}

export async function insertFollowUp(db: Db, input: FollowUpInput, now: string): Promise<FollowUpWithEvents> {
  const spot = (await db.get('SELECT site_id FROM spots WHERE id = ?', input.spotId)) as { site_id: string } | undefined;
  if (!spot) throw notFound(`no spot with id ${input.spotId}`, ['spotId']);
  if (input.openedFromReadingId !== null) {
    const r = (await db.get('SELECT spot_id FROM readings WHERE id = ?', input.openedFromReadingId)) as { spot_id: string } | undefined;
    if (!r) throw notFound(`no reading with id ${input.openedFromReadingId}`, ['openedFromReadingId']);
    if (r.spot_id !== input.spotId) throw invalid('the reading was taken at another spot than this follow-up\'s', ['openedFromReadingId']);
  }
  const id = input.id ?? newId();
  if (input.id && (await getRow(db, id))) throw conflict(`a follow-up with id ${id} already exists`, ['id']);
  (await db.run(`INSERT INTO follow_ups (id, site_id, spot_id, opened_from_reading_id, finding_class, action, assignee, due_date, status,
      opened_by, created_at, updated_at) VALUES (?, ?, ?, ?, ?, ?, ?, ?, 'open', ?, ?, ?)`, id, spot.site_id, input.spotId, input.openedFromReadingId, input.findingClass, input.action, input.assignee, input.dueDate,
      input.by, now, now));
  (await addEvent(db, {
    followUpId: id, kind: 'opened', at: now, by: input.by, readingId: input.openedFromReadingId, reason: null,
    detail: { findingClass: input.findingClass, action: input.action, assignee: input.assignee, dueDate: input.dueDate },
  }));
  return (await getFollowUp(db, id))!;
}

async function requireRow(db: Db, id: string): Promise<FollowUpRow> {
  const r = (await getRow(db, id));
  if (!r) throw notFound(`no follow-up with id ${id}`, ['id']);
  return r;
}

export async function editFollowUp(db: Db, id: string, edit: FollowUpEdit, now: string): Promise<FollowUpWithEvents> {
  const r = (await requireRow(db, id));
  const before = followUpFromRow(r);
  const changes: Record<string, { from: unknown; to: unknown }> = {};
  for (const k of ['findingClass', 'action', 'assignee', 'dueDate'] as const) {
    const to = edit[k];
    if (to !== undefined && to !== before[k]) changes[k] = { from: before[k], to };
  }
  if (Object.keys(changes).length === 0) return (await getFollowUp(db, id))!;
  const after = { ...before, ...Object.fromEntries(Object.entries(changes).map(([k, c]) => [k, c.to])) } as FollowUp;
  (await db.run('UPDATE follow_ups SET finding_class = ?, action = ?, assignee = ?, due_date = ?, updated_at = ? WHERE id = ?', after.findingClass, after.action, after.assignee, after.dueDate, now, id));
  (await addEvent(db, { followUpId: id, kind: 'edited', at: now, by: edit.by, readingId: null, reason: null, detail: changes }));
  return (await getFollowUp(db, id))!;
}

/**
 * Closes with a verifying reading or a written reason. A verifying reading must be a
 * current, not deleted revision of a reading of the same spot, taken after the
 * follow-up was opened, within limits now (verdict 'ok'); otherwise 409 saying why.
 */
export async function closeFollowUp(db: Db, id: string, close: FollowUpClose, now: string): Promise<FollowUpWithEvents> {
  const r = (await requireRow(db, id));
  if (r.status === 'closed') throw conflict(`this follow-up is already closed (${r.closed_at ?? ''}); reopen it first`);
  let detail: Record<string, unknown> = {};
  if (close.verifyingReadingId !== undefined) {
    const reading = (await getReadingEntity(db, close.verifyingReadingId));
    if (!reading) throw notFound(`no reading with id ${close.verifyingReadingId}`, ['verifyingReadingId']);
    detail = verifyingReadingDetail(r, reading);
  }
  const readingId = close.verifyingReadingId ?? null;
  const reason = close.reason ?? null;
  (await db.run(`UPDATE follow_ups SET status = 'closed', closed_at = ?, closed_by_reading_id = ?, closed_reason = ?, closed_by = ?, updated_at = ?
    WHERE id = ?`, now, readingId, reason, close.by, now, id));
  (await addEvent(db, { followUpId: id, kind: 'closed', at: now, by: close.by, readingId, reason, detail }));
  return (await getFollowUp(db, id))!;
}

export async function reopenFollowUp(db: Db, id: string, reopen: FollowUpReopen, now: string): Promise<FollowUpWithEvents> {
  const r = (await requireRow(db, id));
  if (r.status === 'open') throw conflict('this follow-up is open already');
  (await db.run(`UPDATE follow_ups SET status = 'open', closed_at = NULL, closed_by_reading_id = NULL, closed_reason = NULL, closed_by = NULL,
    updated_at = ? WHERE id = ?`, now, id));
  (await addEvent(db, {
    followUpId: id, kind: 'reopened', at: now, by: reopen.by, readingId: null, reason: reopen.reason,
    detail: { closedAt: r.closed_at, closedByReadingId: r.closed_by_reading_id, closedReason: r.closed_reason },
  }));
  return (await getFollowUp(db, id))!;
}
