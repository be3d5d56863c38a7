/**
 * Follow-ups: corrective actions opened from a hot spot (issue 4). One follows a
 * spot until it is closed by a verifying reading within limits (linked) or by a
 * written reason; every change is kept as an event.
 *
 * This file must not import entities.ts (entities.ts imports it for the set-up
 * bundle, which carries the open follow-ups to the tablet).
 */
import { z } from 'zod';
import { Id, IsoDate, requiredText, text } from './common';

export const FINDING_CLASSES = ['observation', 'minor-nonconformance', 'major-nonconformance'] as const;
export type FindingClass = (typeof FINDING_CLASSES)[number];
export const FINDING_CLASS_LABEL: Record<FindingClass, string> = {
  observation: 'Observation',
  'minor-nonconformance': 'Minor nonconformance',
  'major-nonconformance': 'Major nonconformance',
};

const findingClass = z.enum(FINDING_CLASSES, { error: 'finding class must be observation, minor-nonconformance or major-nonconformance' });
const who = text('who', 120).default('');

export const FollowUpInputSchema = z.object({
  id: Id.optional(),
  spotId: Id,
  /** The reading that showed the problem (optional). */
  openedFromReadingId: Id.nullable().default(null),
  findingClass,
  /** What to do, in plain words. */
  action: requiredText('action', 2000),
  assignee: text('assignee', 120).default(''),
  dueDate: IsoDate.nullable().default(null),
  /** Who opens it (kept in the history). */
  by: who,
}).meta({ id: 'FollowUpInput' });
export type FollowUpInput = z.infer<typeof FollowUpInputSchema>;

export const FollowUpEditSchema = z.object({
  findingClass: findingClass.optional(),
  action: requiredText('action', 2000).optional(),
  assignee: text('assignee', 120).optional(),
  dueDate: IsoDate.nullable().optional(),
  by: who,
}).superRefine((e, ctx) => {
  if (e.findingClass === undefined && e.action === undefined && e.assignee === undefined && e.dueDate === undefined) {
    ctx.addIssue({ code: 'custom', path: [], message: 'give at least one of findingClass, action, assignee or dueDate to change' });
  }
}).meta({ id: 'FollowUpEdit' });
export type FollowUpEdit = z.infer<typeof FollowUpEditSchema>;

export const FollowUpCloseSchema = z.object({
  /** A current reading of the same spot, taken after the follow-up was opened, within limits. */
  verifyingReadingId: Id.optional(),
  /** Or a written reason (e.g. "the tote was taken out of service"). */
  reason: requiredText('reason', 2000).optional(),
  by: who,
}).superRefine((c, ctx) => {
  if ((c.verifyingReadingId === undefined) === (c.reason === undefined)) {
    ctx.addIssue({
      code: 'custom', path: c.verifyingReadingId === undefined ? ['verifyingReadingId'] : ['reason'],
      message: 'close with either a verifying reading (verifyingReadingId) or a written reason, not both and not neither',
    });
  }
}).meta({ id: 'FollowUpClose' });
export type FollowUpClose = z.infer<typeof FollowUpCloseSchema>;

export const FollowUpReopenSchema = z.object({
  reason: requiredText('reason', 2000),
  by: who,
}).meta({ id: 'FollowUpReopen' });
export type FollowUpReopen = z.infer<typeof FollowUpReopenSchema>;

export const FollowUpStatusSchema = z.enum(['open', 'closed']);

export const FollowUpSchema = z.object({
  id: z.string(),
  siteId: z.string(),
  spotId: z.string(),
  /** The spot's code and name, for lists (as they are now). */
  spotCode: z.string(),
  spotName: z.string(),
  openedFromReadingId: z.string().nullable(),
  findingClass,
  action: z.string(),
  assignee: z.string(),
  dueDate: z.string().nullable(),
  status: FollowUpStatusSchema,
  openedBy: z.string(),
  closedAt: z.string().nullable(),
  closedByReadingId: z.string().nullable(),
  closedReason: z.string().nullable(),
  closedBy: z.string().nullable(),
  createdAt: z.string(),
  updatedAt: z.string(),
}).meta({ id: 'FollowUp', description: 'A corrective action on a spot: open until closed by a verifying reading within limits or a written reason.' });
export type FollowUp = z.infer<typeof FollowUpSchema>;

export const FOLLOW_UP_EVENT_KINDS = ['opened', 'edited', 'closed', 'reopened'] as const;

export const FollowUpEventSchema = z.object({
  id: z.string(),
  followUpId: z.string(),
  kind: z.enum(FOLLOW_UP_EVENT_KINDS),
  at: z.string(),
  by: z.string(),
  /** The verifying reading of a close. */
  readingId: z.string().nullable(),
  reason: z.string().nullable(),
  /** Edits: { field: { from, to } }; a close by reading: the reading's verdict then. */
  detail: z.record(z.string(), z.unknown()),
}).meta({ id: 'FollowUpEvent' });
export type FollowUpEvent = z.infer<typeof FollowUpEventSchema>;

export const FollowUpWithEventsSchema = FollowUpSchema.safeExtend({
  /** The history, oldest first. */
  events: z.array(FollowUpEventSchema),
}).meta({ id: 'FollowUpWithEvents' });
export type FollowUpWithEvents = z.infer<typeof FollowUpWithEventsSchema>;

export const FollowUpListSchema = z.object({ followUps: z.array(FollowUpSchema) }).meta({ id: 'FollowUpList' });

/** ?status=open|closed|all (default: all for a spot, open for a site). */
export const FollowUpListQuerySchema = z.object({
  status: z.enum(['open', 'closed', 'all'], { error: 'status must be open, closed or all' }).optional(),
});
