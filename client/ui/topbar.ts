/**
 * The top bar: site name, connection and outbox status in words, and 'Send now'.
 * "3 readings saved on this tablet, not yet sent" / "All on the server".
 */
import { h, replace } from './h';
import { currentSiteName, onSiteChange } from '../app';
import { loadOutbox, onOutboxChange, outboxCounts } from '../offline/outbox';
import { onSyncChange, sendNow, syncStatus } from '../offline/sync';

function plural(n: number, one: string, many: string): string { return `${n} ${n === 1 ? one : many}`; }

export function outboxText(): { text: string; tone: 'ok' | 'pending' | 'attention' } {
  const c = outboxCounts();
  const s = syncStatus();
  const parts: string[] = [];
  let tone: 'ok' | 'pending' | 'attention' = 'ok';
  if (c.readings > 0) {
    parts.push(c.sending > 0 ? `Sending ${plural(c.readings, 'reading', 'readings')}…` : `${plural(c.readings, 'reading', 'readings')} saved on this tablet, not yet sent`);
    tone = 'pending';
  } else if (c.other > 0) {
    parts.push(`${plural(c.other, 'change', 'changes')} saved on this tablet, not yet sent`);
    tone = 'pending';
  }
  if (c.attention > 0) { parts.push(`${plural(c.attention, 'item needs', 'items need')} attention`); tone = 'attention'; }
  if (parts.length === 0) return { text: 'All on the server', tone: 'ok' };
  if (!s.online && tone !== 'ok') parts.push('waiting for the network');
  else if (!s.running && s.nextRetryAt && tone !== 'ok') {
    const secs = Math.max(1, Math.round((s.nextRetryAt - Date.now()) / 1000));
    parts.push(`retry in ${secs} s`);
  }
  return { text: parts.join(' · '), tone };
}

export function mountTopbar(host: HTMLElement): void {
  const site = h('a', { class: 'tb-site', href: '#/' });
  const conn = h('span', { class: 'tb-conn' });
  const status = h('a', { class: 'tb-status', href: '#/outbox', 'data-testid': 'outbox-status' });
  const send = h('button', { type: 'button', class: 'btn btn-send', onclick: () => sendNow() }, 'Send now');
  host.append(
    h('div', { class: 'tb-left' }, h('span', { class: 'tb-logo', 'aria-hidden': 'true' }), site),
    h('div', { class: 'tb-right' }, conn, status, send),
  );
  const update = () => {
    replace(site, currentSiteName() ?? 'chargewalk');
    const online = syncStatus().online;
    conn.textContent = online ? 'Online' : 'Offline';
    conn.className = `tb-conn ${online ? 'is-online' : 'is-offline'}`;
    const t = outboxText();
    status.textContent = t.text;
    status.className = `tb-status tone-${t.tone}`;
    send.disabled = t.tone === 'ok' || syncStatus().running;
  };
  onOutboxChange(update);
  onSyncChange(update);
  onSiteChange(update);
  setInterval(update, 1000);
  void loadOutbox().then(update);
  update();
}
