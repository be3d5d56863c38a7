/**
 * Follow-up widgets shared by the spot screen, the review and the round screen:
 * the card (class, action, who, due, history), the form that opens one, and the
 * sheet that closes one with a verifying reading or a written reason.
 */
import { z } from 'zod';
import { h, replace } from './h';
import { field, showFieldErrors, zodFields } from './form';
import { openSheet } from './sheet';
import { verdictChip } from './verdict';
import { fmtAsEntered, fmtDateTime, fmtField } from './format';
import { errorText, NetworkError } from '../api';
import { closeFollowUp, closePending, openFollowUp, FollowUpFormSchema } from '../follow-ups';
import { FINDING_CLASSES, FINDING_LABEL, type FindingClass, type FollowUp, type FollowUpWithEvents } from '../review-api';
import type { LocalReading } from '../offline/types';

const CLASS_ICON: Record<FindingClass, string> = { observation: '○', 'minor-nonconformance': '◆', 'major-nonconformance': '▲' };

export function findingChip(c: FindingClass): HTMLElement {
  return h('span', { class: `chip finding finding-${c}`, dataset: { finding: c } },
    h('span', { class: 'chip-icon', 'aria-hidden': 'true' }, CLASS_ICON[c] ?? '○'), ` ${FINDING_LABEL[c] ?? c}`);
}

export function todayIso(): string {
  const d = new Date();
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

export function isOverdue(f: FollowUp): boolean {
  return f.status === 'open' && typeof f.dueDate === 'string' && f.dueDate < todayIso();
}

function fmtDue(date: string | null): string {
  if (!date) return 'no due date';
  const d = new Date(`${date}T12:00:00`);
  return Number.isNaN(d.getTime()) ? date : d.toLocaleDateString(undefined, { day: 'numeric', month: 'short', year: 'numeric' });
}

/** 'Open follow-up: fit an ioniser (due 3 Mar 2026)' */
export function followUpLine(f: FollowUp): string {
  return `Open follow-up: ${f.action} (${f.dueDate ? `due ${fmtDue(f.dueDate)}` : 'no due date'}${isOverdue(f) ? ', overdue' : ''})`;
}

const EVENT_LABEL: Record<string, string> = { opened: 'Opened', closed: 'Closed', reopened: 'Reopened', edited: 'Changed' };

export interface CardActions {
  onClose?: (f: FollowUp) => void;
  onReopen?: (f: FollowUp) => void;
  /** Show the event history (spot screen). */
  history?: boolean;
}

export function followUpCard(f: FollowUp | FollowUpWithEvents, act: CardActions = {}): HTMLElement {
  const pending = closePending(f.id);
  const events = 'events' in f ? f.events : [];
  const closedWhy = f.closedReason;
  return h('article', { class: `fu-card fu-${f.status}${isOverdue(f) ? ' is-overdue' : ''}`, dataset: { followUpId: f.id, status: pending ? 'closing' : f.status } },
    h('div', { class: 'row gap wrap' },
      findingChip(f.findingClass),
      h('span', { class: `chip fu-status fu-status-${pending ? 'closing' : f.status}` }, pending ? 'closing: saved on this tablet' : f.status === 'open' ? 'OPEN' : 'CLOSED'),
      isOverdue(f) ? h('span', { class: 'chip verdict-alarm' }, '▲ overdue') : null),
    h('p', { class: 'fu-action' }, f.action),
    h('p', { class: 'fu-meta' }, `Who: ${f.assignee || '—'} · ${f.dueDate ? `due ${fmtDue(f.dueDate)}` : 'no due date'} · opened ${fmtDateTime(f.createdAt)}${f.openedBy ? ` by ${f.openedBy}` : ''}`),
    f.status === 'closed' ? h('p', { class: 'fu-meta', dataset: { testid: 'fu-closed-how' } }, `Closed ${fmtDateTime(f.closedAt)}${f.closedBy ? ` by ${f.closedBy}` : ''}${f.closedByReadingId ? ' with a verifying reading within limits' : ''}${closedWhy ? `: ${closedWhy}` : ''}`) : null,
    act.history && events.length ? h('details', { class: 'fu-history' },
      h('summary', null, `History (${events.length})`),
      h('ol', null, events.map((e) => h('li', null,
        `${fmtDateTime(e.at)} · ${EVENT_LABEL[e.kind] ?? e.kind}`,
        e.by ? ` by ${e.by}` : '',
        e.kind === 'closed' && e.readingId ? ' with a verifying reading' : '',
        e.reason ? `: ${e.reason}` : '')))) : null,
    h('div', { class: 'row gap wrap no-print' },
      f.status === 'open' && !pending && act.onClose ? h('button', { type: 'button', class: 'btn btn-small', dataset: { testid: 'fu-close' }, onclick: () => act.onClose!(f) }, 'Close…') : null,
      f.status === 'closed' && act.onReopen ? h('button', { type: 'button', class: 'btn btn-small', dataset: { testid: 'fu-reopen' }, onclick: () => act.onReopen!(f) }, 'Reopen…') : null));
}

/** The form that opens a follow-up; resolves with the new follow-up or null (cancelled). */
export async function openFollowUpForm(opts: { siteId: string; spotId: string; spotLabel: string; openedFromReadingId?: string | null; suggestion?: string }): Promise<FollowUp | null> {
  let cls: FindingClass | null = null;
  const clsRow = h('div', { class: 'seg seg-wrap', role: 'radiogroup', 'aria-label': 'Finding class', dataset: { path: 'findingClass' } });
  const renderCls = () => replace(clsRow, FINDING_CLASSES.map((c) => h('button', {
    type: 'button', class: `seg-btn${c === cls ? ' is-on' : ''}`, role: 'radio', 'aria-checked': String(c === cls), dataset: { value: c },
    onclick: () => { cls = c; renderCls(); },
  }, FINDING_LABEL[c])));
  renderCls();
  const action = h('textarea', { rows: 3, maxlength: 2000, class: 'note-input', placeholder: 'What is to be done (e.g. fit an ionising bar at the rewind)' });
  if (opts.suggestion) action.value = opts.suggestion;
  const assignee = h('input', { type: 'text', maxlength: 120, autocomplete: 'off', placeholder: 'Who does it' });
  const due = h('input', { type: 'date', value: plusDays(14) });
  const result = await openSheet(`Open a follow-up: ${opts.spotLabel}`, (close) => {
    const form = h('form', { class: 'form fu-form', novalidate: true, onsubmit: (e: Event) => { e.preventDefault(); void submit(); } },
      h('div', { class: 'form-errors', hidden: true, role: 'alert' }),
      h('div', { class: 'field' }, h('label', null, 'Finding class'), clsRow, h('p', { class: 'field-error', dataset: { errorFor: 'findingClass' } })),
      field('Action', action, 'action'),
      h('div', { class: 'form-grid' }, field('Assignee', assignee, 'assignee'), field('Due date', due, 'dueDate')),
      h('div', { class: 'row gap' },
        h('button', { type: 'submit', class: 'btn btn-primary', dataset: { testid: 'fu-save' } }, 'Open follow-up'),
        h('button', { type: 'button', class: 'btn', onclick: () => close(null) }, 'Cancel')));
    async function submit(): Promise<void> {
      const input = {
        spotId: opts.spotId, openedFromReadingId: opts.openedFromReadingId ?? null,
        findingClass: cls ?? undefined, action: action.value.trim(), assignee: assignee.value.trim(), dueDate: due.value || null,
      };
      const parsed = FollowUpFormSchema.safeParse(input);
      // The form's own rules (who, when) are said together with the schema's, not after them.
      const extra = [
        ...(!input.assignee ? [{ path: 'assignee', message: 'say who does it' }] : []),
        ...(!input.dueDate ? [{ path: 'dueDate', message: 'give a due date' }] : []),
      ];
      if (!parsed.success) {
        const fields = zodFields(parsed.error);
        showFieldErrors(form, [...fields, ...extra.filter((x) => !fields.some((f) => f.path === x.path))]);
        return;
      }
      try {
        close(await openFollowUp(opts.siteId, input as Parameters<typeof openFollowUp>[1]));
      } catch (e) {
        if (e instanceof z.ZodError) showFieldErrors(form, zodFields(e));
        else if (e instanceof NetworkError) showFieldErrors(form, [], 'Opening a follow-up needs the network: nothing was saved. Try again when online.');
        else showFieldErrors(form, (e as { fields?: { path: string; message: string }[] }).fields ?? [], errorText(e));
      }
    }
    return form;
  }, { wide: true });
  return (result as FollowUp | null) ?? null;
}

function plusDays(n: number): string {
  const d = new Date(Date.now() + n * 86_400_000);
  return `${d.getFullYear()}-${String(d.getMonth() + 1).padStart(2, '0')}-${String(d.getDate()).padStart(2, '0')}`;
}

/** Readings that can verify a follow-up: current, within limits, taken after it was opened. */
export function verifyingCandidates(f: FollowUp, readings: LocalReading[]): LocalReading[] {
  const since = f.createdAt;
  return readings
    .filter((r) => r.spotId === f.spotId && r.supersededById === null && r.deleted === null && r.verdict.level === 'ok' && r.takenAt >= since)
    .sort((a, b) => b.takenAt.localeCompare(a.takenAt))
    .slice(0, 8);
}

/**
 * Closes with a verifying reading (picked) or a written reason. Goes through the
 * outbox: works offline, sent when the network is back. Resolves true when queued.
 */
export async function closeFollowUpSheet(siteId: string, f: FollowUp, readings: LocalReading[]): Promise<boolean> {
  const cands = verifyingCandidates(f, readings);
  const reason = h('textarea', { rows: 3, maxlength: 2000, class: 'note-input', placeholder: 'Why it is closed without a verifying reading', dataset: { testid: 'fu-reason' } });
  const err = h('p', { class: 'field-error', role: 'alert' });
  const done = await openSheet('Close the follow-up', (close) => {
    const withReading = async (r: LocalReading) => {
      try { await closeFollowUp(siteId, f, { verifyingReadingId: r.id }); close(true); } catch (e) { err.textContent = errorText(e); }
    };
    const withReason = async () => {
      try { await closeFollowUp(siteId, f, { reason: reason.value }); close(true); } catch (e) {
        err.textContent = e instanceof z.ZodError ? e.issues.map((i) => i.message).join('; ') : errorText(e);
      }
    };
    return [
      h('p', { class: 'sheet-message' }, f.action),
      h('h3', null, 'With a verifying reading within limits'),
      cands.length === 0
        ? h('p', { class: 'muted', dataset: { testid: 'fu-no-candidates' } }, 'No reading within limits since the follow-up was opened. Take one on a round, or close with a written reason.')
        : h('div', { class: 'pick-list' }, cands.map((r) => h('button', {
          type: 'button', class: 'pick', dataset: { testid: 'fu-verify', readingId: r.id }, onclick: () => void withReading(r),
        }, h('span', { class: 'pick-label' }, `${fmtAsEntered(r)} = ${fmtField(r.fieldVPerM)} `, verdictChip(r.verdict.level)), h('span', { class: 'pick-hint' }, fmtDateTime(r.takenAt))))),
      h('h3', null, 'Or with a written reason'),
      reason,
      err,
      h('div', { class: 'row gap' },
        h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'fu-close-reason' }, onclick: () => void withReason() }, 'Close with this reason'),
        h('button', { type: 'button', class: 'btn', onclick: () => close(false) }, 'Cancel')),
      h('p', { class: 'muted' }, 'The close is saved on this tablet first and sent with the readings (works offline).'),
    ];
  }, { wide: true });
  return done === true;
}

/** Asks for the reason and reopens (needs the network). */
export async function reopenSheet(f: FollowUp, reopen: (reason: string) => Promise<unknown>): Promise<boolean> {
  const reason = h('textarea', { rows: 3, maxlength: 2000, class: 'note-input', placeholder: 'Why it is reopened' });
  const err = h('p', { class: 'field-error', role: 'alert' });
  const done = await openSheet('Reopen the follow-up', (close) => [
    h('p', { class: 'sheet-message' }, f.action), reason, err,
    h('div', { class: 'row gap' },
      h('button', {
        type: 'button', class: 'btn btn-primary', onclick: async () => {
          if (reason.value.trim().length < 3) { err.textContent = 'write why it is reopened'; return; }
          try { await reopen(reason.value.trim()); close(true); } catch (e) {
            err.textContent = e instanceof NetworkError ? 'Reopening needs the network: nothing was changed.' : errorText(e);
          }
        },
      }, 'Reopen'),
      h('button', { type: 'button', class: 'btn', onclick: () => close(false) }, 'Cancel')),
  ]);
  return done === true;
}
