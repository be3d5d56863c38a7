/**
 * On-screen numeric pad: digits, decimal point, backspace. Big keys for gloved
 * hands; keeps the value as the typed string so "0.50" stays as entered.
 * A hardware keyboard works too (digits, '.', ',', Backspace) while the pad is shown.
 */
import { h } from './h';

export interface Numpad {
  el: HTMLElement;
  value(): string;
  set(v: string): void;
  clear(): void;
  /** Listen to the keyboard while this pad is on screen; returns a remover. */
  bindKeyboard(target?: Window): () => void;
}

export function numpad(opts: { onChange: (v: string) => void; maxLength?: number; label?: string }): Numpad {
  let value = '';
  const max = opts.maxLength ?? 9;
  const press = (k: string) => {
    if (k === 'back') value = value.slice(0, -1);
    else if (k === '.') {
      if (value.includes('.')) return;
      value = value === '' ? '0.' : `${value}.`;
    } else {
      if (value.replace('.', '').length >= max) return;
      value = value === '0' ? k : value + k;
    }
    opts.onChange(value);
  };
  const key = (k: string, label: string, aria: string) =>
    h('button', { type: 'button', class: `key${k === 'back' ? ' key-back' : ''}`, 'aria-label': aria, dataset: { key: k }, onclick: () => press(k) }, label);
  const el = h('div', { class: 'numpad', role: 'group', 'aria-label': opts.label ?? 'Number pad' },
    ...['7', '8', '9', '4', '5', '6', '1', '2', '3'].map((d) => key(d, d, d)),
    key('.', '.', 'decimal point'), key('0', '0', '0'), key('back', '⌫', 'delete last digit'));
  return {
    el,
    value: () => value,
    set(v) { value = v; opts.onChange(value); },
    clear() { value = ''; opts.onChange(value); },
    bindKeyboard(target = window) {
      const onKey = (e: KeyboardEvent) => {
        const t = e.target as HTMLElement | null;
        if (t && (t.tagName === 'INPUT' || t.tagName === 'TEXTAREA' || t.tagName === 'SELECT')) return;
        if (!el.isConnected || el.closest('dialog:not([open])')) return;
        if (/^[0-9]$/.test(e.key)) press(e.key);
        else if (e.key === '.' || e.key === ',') press('.');
        else if (e.key === 'Backspace') press('back');
        else return;
        e.preventDefault();
      };
      target.addEventListener('keydown', onKey);
      return () => target.removeEventListener('keydown', onKey);
    },
  };
}
