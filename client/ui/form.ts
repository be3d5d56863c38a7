/**
 * Form helpers for the set-up screens: labelled fields that carry the payload
 * path they fill (data-path), and one function that puts every validation
 * message beside its field, whether it came from the shared zod schema before
 * sending or from the server's 400 `fields` afterwards.
 */
import type { z } from 'zod';
import { issuesToFields } from '../../core/schemas';
import { h, type Child } from './h';

export interface FieldMsg { path: string; message: string }

let uid = 0;

/** A labelled control with an error slot for `path` (dotted, e.g. 'geometry.radiusM' or 'rules.2.warn'). */
export function field(label: string, control: HTMLElement, path: string, hint?: string): HTMLElement {
  const id = control.id || `f${++uid}`;
  control.id = id;
  control.dataset.path = path;
  const err = h('p', { class: 'field-error', id: `${id}-err`, dataset: { errorFor: path }, 'aria-live': 'polite' });
  control.setAttribute('aria-describedby', `${id}-err`);
  return h('div', { class: 'field' },
    h('label', { for: id }, label),
    control,
    hint ? h('p', { class: 'field-hint' }, hint) : null,
    err);
}

export function textInput(value: string, attrs: Record<string, unknown> = {}): HTMLInputElement {
  return h('input', { type: 'text', value, autocomplete: 'off', ...attrs });
}

/** Number typed as text (inputmode decimal); empty gives null. */
export function numberInput(value: number | null | undefined, attrs: Record<string, unknown> = {}): HTMLInputElement {
  return h('input', { type: 'text', inputmode: 'decimal', value: value === null || value === undefined ? '' : String(value), autocomplete: 'off', ...attrs });
}

/** Reads a number input: '' -> null, a number -> number, anything else -> NaN (the schema says "must be a number"). */
export function readNumber(el: HTMLInputElement): number | null {
  const s = el.value.trim().replace(',', '.');
  if (s === '') return null;
  const n = Number(s);
  return Number.isFinite(n) ? n : Number.NaN;
}

export function select<T extends string>(options: readonly { value: T; label: string }[], value: T | null | undefined, attrs: Record<string, unknown> = {}): HTMLSelectElement {
  return h('select', attrs, options.map((o) => h('option', { value: o.value, selected: o.value === value ? true : undefined }, o.label)));
}

/** Clears old messages, then shows each message beside its field; unmatched ones go to the form's top box. */
export function showFieldErrors(form: HTMLElement, fields: FieldMsg[], general?: string): void {
  for (const e of form.querySelectorAll<HTMLElement>('.field-error')) e.textContent = '';
  for (const c of form.querySelectorAll<HTMLElement>('[aria-invalid]')) c.removeAttribute('aria-invalid');
  const box = form.querySelector<HTMLElement>('.form-errors');
  const leftovers: string[] = [];
  for (const f of fields) {
    const slot = findSlot(form, f.path);
    if (slot) {
      slot.textContent = slot.textContent ? `${slot.textContent}; ${f.message}` : f.message;
      const ctl = form.querySelector<HTMLElement>(`[data-path="${cssEscape(slot.dataset.errorFor ?? '')}"]`);
      ctl?.setAttribute('aria-invalid', 'true');
    } else leftovers.push(f.path && f.path !== '(body)' ? `${f.path}: ${f.message}` : f.message);
  }
  if (box) {
    const msgs = [...(general ? [general] : []), ...leftovers];
    box.replaceChildren(...msgs.map((m) => h('p', null, m)));
    box.hidden = msgs.length === 0;
  }
  const first = form.querySelector<HTMLElement>('[aria-invalid="true"]');
  first?.focus({ preventScroll: false });
}

/** The error slot for a path, or for its nearest parent path ('geometry.radiusM' -> 'geometry'). */
function findSlot(form: HTMLElement, path: string): HTMLElement | null {
  const parts = path.split('.');
  while (parts.length) {
    const p = parts.join('.');
    const el = form.querySelector<HTMLElement>(`[data-error-for="${cssEscape(p)}"]`);
    if (el) return el;
    parts.pop();
  }
  return null;
}

function cssEscape(s: string): string {
  return typeof CSS !== 'undefined' && CSS.escape ? CSS.escape(s) : s.replace(/["\\]/g, '\\$&');
}

export function zodFields(e: z.ZodError): FieldMsg[] {
  return issuesToFields(e);
}

export function formShell(title: string, ...children: Child[]): HTMLFormElement {
  return h('form', { class: 'form', novalidate: true },
    h('h2', null, title),
    h('div', { class: 'form-errors', hidden: true, role: 'alert' }),
    ...children);
}
