/**
 * The outbox, in words: what is saved on this tablet and not yet on the server,
 * and what the server refused or holds differently (kept here until looked at).
 */
import { h, replace } from '../ui/h';
import { syncChip } from '../ui/verdict';
import { fmtDateTime } from '../ui/format';
import { loadOutbox, onOutboxChange, outboxItems, retryItem, syncStateOf } from '../offline/outbox';
import { sendNow, syncStatus } from '../offline/sync';
import type { OutboxItem } from '../offline/types';
import { keepStorage, STORAGE_MODE_TEXT, type StorageMode } from '../offline/storage';

const KIND_LABEL: Record<OutboxItem['kind'], string> = {
  round: 'Round start', reading: 'Reading', skip: 'Skipped spot', finish: 'Round finish', correction: 'Correction', tombstone: 'Deletion', 'follow-up-close': 'Follow-up closed',
};

function describe(i: OutboxItem): string {
  const b = i.body as Record<string, unknown>;
  if (i.kind === 'reading' || i.kind === 'correction') {
    return `${b.polarity === '-' ? '−' : '+'}${String(b.value)} ${String(b.unit)}`;
  }
  if (i.kind === 'round') return `by ${String(b.surveyor)}`;
  if (i.kind === 'skip' || i.kind === 'tombstone') return String(b.reason ?? '');
  if (i.kind === 'follow-up-close') return b.verifyingReadingId ? 'with a verifying reading' : String(b.reason ?? '');
  return '';
}

export async function outboxPage(root: HTMLElement): Promise<() => void> {
  await loadOutbox();
  const body = h('div', { class: 'page outbox' });
  root.append(body);
  let storage: StorageMode | null = null;
  const render = () => {
    const items = [...outboxItems()].sort((a, b) => (a.seq ?? 0) - (b.seq ?? 0));
    const attention = items.filter((i) => i.status === 'rejected' || i.status === 'conflict');
    const waiting = items.filter((i) => i.status === 'pending' || i.status === 'sending');
    const s = syncStatus();
    replace(body,
      h('div', { class: 'row between wrap' }, h('h1', null, 'Outbox'),
        h('button', { type: 'button', class: 'btn btn-primary', onclick: () => sendNow(), disabled: waiting.length === 0 || undefined }, 'Send now')),
      h('p', { class: 'muted' }, s.lastError ? `Last attempt failed: ${s.lastError}` : s.lastSuccessAt ? `Last sent ${fmtDateTime(new Date(s.lastSuccessAt).toISOString())}` : ''),
      storage ? h('p', { class: 'muted', dataset: { testid: 'storage-mode', mode: storage } }, STORAGE_MODE_TEXT[storage]) : null,
      h('section', { class: 'card' },
        h('h2', null, `Needs attention (${attention.length})`),
        attention.length === 0 ? h('p', { class: 'muted' }, 'Nothing refused by the server.') : h('ul', { class: 'list' }, attention.map((i) => h('li', { class: 'outbox-item' },
          h('span', null, `${KIND_LABEL[i.kind]} ${describe(i)} · ${fmtDateTime(i.createdAt)}`),
          syncChip(syncStateOf(i.key).state, i.message),
          h('button', { type: 'button', class: 'btn btn-small', onclick: async () => { await retryItem(i.key); sendNow(); } }, 'Try again'))))),
      h('section', { class: 'card' },
        h('h2', null, `Waiting to be sent (${waiting.length})`),
        waiting.length === 0 ? h('p', { class: 'muted' }, 'All on the server.') : h('ul', { class: 'list' }, waiting.map((i) => h('li', { class: 'outbox-item' },
          h('span', null, `${KIND_LABEL[i.kind]} ${describe(i)} · ${fmtDateTime(i.createdAt)}`),
          syncChip(syncStateOf(i.key).state, i.attempts ? `tried ${i.attempts}×` : null))))),
    );
  };
  render();
  void keepStorage().then((m) => { storage = m; render(); });
  return onOutboxChange(render) as () => void;
}
