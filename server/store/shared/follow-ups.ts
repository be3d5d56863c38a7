/** follow_ups and follow_up_events: what both store implementations share (row shapes and mapping). */
import type { FollowUp, FollowUpEvent, Reading } from '../../../core/schemas';
import { conflict } from '../errors';

export interface FollowUpRow {
  id: string;
  site_id: string;
  spot_id: string;
  spot_code: string;
  spot_name: string;
  opened_from_reading_id: string | null;
  finding_class: string;
  action: string;
  assignee: string;
  due_date: string | null;
  status: string;
  opened_by: string;
  closed_at: string | null;
  closed_by_reading_id: string | null;
  closed_reason: string | null;
  closed_by: string | null;
  created_at: string;
  updated_at: string;
}

export interface EventRow {
  id: string;
  follow_up_id: string;
  kind: string;
  at: string;
  by: string;
  reading_id: string | null;
  reason: string | null;
  detail: string;
}

export function followUpFromRow(r: FollowUpRow): FollowUp {
  return {
    id: r.id, siteId: r.site_id, spotId: r.spot_id, spotCode: r.spot_code, spotName: r.spot_name,
    openedFromReadingId: r.opened_from_reading_id, findingClass: r.finding_class as FollowUp['findingClass'],
    action: r.action, assignee: r.assignee, dueDate: r.due_date, status: r.status as FollowUp['status'], openedBy: r.opened_by,
    closedAt: r.closed_at, closedByReadingId: r.closed_by_reading_id, closedReason: r.closed_reason, closedBy: r.closed_by,
    createdAt: r.created_at, updatedAt: r.updated_at,
  };
}

export function eventFromRow(r: EventRow): FollowUpEvent {
  return {
    id: r.id, followUpId: r.follow_up_id, kind: r.kind as FollowUpEvent['kind'], at: r.at, by: r.by,
    readingId: r.reading_id, reason: r.reason, detail: JSON.parse(r.detail) as Record<string, unknown>,
  };
}

/**
 * Checks that `reading` may close the follow-up `r`: taken at its spot, current, not
 * deleted, after the follow-up was opened, and within limits now; otherwise 409 saying
 * why. Answers the detail of the closing event.
 */
export function verifyingReadingDetail(r: FollowUpRow, reading: Reading): Record<string, unknown> {
  const path = ['verifyingReadingId'];
  if (reading.spotId !== r.spot_id) {
    throw conflict(`the verifying reading was taken at another spot, not at ${r.spot_code} (${r.spot_name}): take a reading at this spot`, path);
  }
  if (reading.deleted) throw conflict('the verifying reading is deleted: take a new reading', path);
  if (reading.supersededById) {
    throw conflict(`the verifying reading was corrected (its current revision is ${reading.supersededById}): use the current revision`, path);
  }
  if (reading.takenAt <= r.created_at) {
    throw conflict(`the verifying reading was taken at ${reading.takenAt}, before the follow-up was opened (${r.created_at}): take a new reading after the fix`, path);
  }
  if (reading.verdict.level !== 'ok') {
    throw conflict(`the verifying reading is not within limits (${reading.verdict.level}: ${reading.verdict.reason}); the follow-up stays open`, path);
  }
  return { verdict: { level: reading.verdict.level, reason: reading.verdict.reason }, fieldVPerM: reading.fieldVPerM, takenAt: reading.takenAt };
}
