/**
 * A modal sheet (native <dialog>): pick-lists, confirmations and small forms.
 * Closes on its Close button or Escape; resolves with the picked value or null.
 */
import { h, type Child } from './h';

export function openSheet(title: string, build: (close: (v?: unknown) => void) => Child, opts: { wide?: boolean } = {}): Promise<unknown> {
  return new Promise((resolve) => {
    let result: unknown = null;
    const dlg = h('dialog', { class: `sheet${opts.wide ? ' sheet-wide' : ''}`, 'aria-label': title });
    const close = (v?: unknown) => { result = v === undefined ? null : v; dlg.close(); };
    dlg.append(
      h('div', { class: 'sheet-head' },
        h('h2', null, title),
        h('button', { type: 'button', class: 'btn btn-ghost sheet-close', onclick: () => close(null) }, 'Close')),
      h('div', { class: 'sheet-body' }, build(close)),
    );
    dlg.addEventListener('close', () => { dlg.remove(); resolve(result); });
    document.body.append(dlg);
    dlg.showModal();
  });
}

/** A list of big buttons; resolves with the picked value or null. */
export function pickOne<T extends string>(title: string, options: readonly { value: T; label: string; hint?: string }[], current?: T | null): Promise<T | null> {
  return openSheet(title, (close) => h('div', { class: 'pick-list' },
    options.map((o) => h('button', {
      type: 'button', class: `pick${o.value === current ? ' pick-current' : ''}`, 'aria-pressed': String(o.value === current),
      onclick: () => close(o.value),
    }, h('span', { class: 'pick-label' }, o.label), o.hint ? h('span', { class: 'pick-hint' }, o.hint) : null)),
  )) as Promise<T | null>;
}

export function confirmSheet(title: string, message: string, yes: string, danger = false): Promise<boolean> {
  return openSheet(title, (close) => [
    h('p', { class: 'sheet-message' }, message),
    h('div', { class: 'row gap' },
      h('button', { type: 'button', class: `btn ${danger ? 'btn-danger' : 'btn-primary'}`, onclick: () => close(true) }, yes),
      h('button', { type: 'button', class: 'btn', onclick: () => close(false) }, 'Cancel')),
  ]).then((v) => v === true);
}

/** A short transient message at the bottom of the screen (role=status). */
export function toast(message: string, kind: 'ok' | 'warn' | 'error' = 'ok'): void {
  let host = document.getElementById('toasts');
  if (!host) { host = h('div', { id: 'toasts', role: 'status', 'aria-live': 'polite' }); document.body.append(host); }
  const t = h('div', { class: `toast toast-${kind}` }, message);
  host.replaceChildren(t); // one at a time: a stack would cover the screen
  setTimeout(() => t.remove(), 2500);
}
