/**
 * A small declarative form builder for the set-up screens. Each field names the
 * payload path it fills ('defaultDistance.value', 'geometry.radiusM'), so zod
 * issue paths and the server's 400 `fields` land beside the right input.
 */
import type { z } from 'zod';
import { h } from '../../ui/h';
import { field, numberInput, readNumber, showFieldErrors, textInput, zodFields } from '../../ui/form';
import { api, ApiError, NetworkError } from '../../api';

export type FieldSpec =
  | { kind: 'text'; path: string; label: string; hint?: string; empty?: 'keep' | 'null' }
  | { kind: 'textarea'; path: string; label: string; hint?: string }
  | { kind: 'number'; path: string; label: string; hint?: string; empty: 'null' | 'omit' }
  | { kind: 'date'; path: string; label: string; hint?: string }
  | { kind: 'select'; path: string; label: string; hint?: string; options: readonly { value: string; label: string }[]; empty?: 'null'; cast?: 'number' }
  | { kind: 'checks'; path: string; label: string; hint?: string; options: readonly { value: string; label: string }[] };

export interface BuiltForm {
  el: HTMLElement;
  read(): Record<string, unknown>;
}

export function getPath(obj: unknown, path: string): unknown {
  let cur: unknown = obj;
  for (const p of path.split('.')) {
    if (cur === null || cur === undefined || typeof cur !== 'object') return undefined;
    cur = (cur as Record<string, unknown>)[p];
  }
  return cur;
}

export function setPath(obj: Record<string, unknown>, path: string, value: unknown): void {
  const parts = path.split('.');
  let cur = obj;
  parts.slice(0, -1).forEach((p) => {
    if (typeof cur[p] !== 'object' || cur[p] === null) cur[p] = {};
    cur = cur[p] as Record<string, unknown>;
  });
  const last = parts[parts.length - 1]!;
  if (value === undefined) delete cur[last];
  else cur[last] = value;
}

export function buildFields(specs: FieldSpec[], initial: unknown): BuiltForm {
  const readers: ((out: Record<string, unknown>) => void)[] = [];
  const els = specs.map((s) => {
    const init = getPath(initial, s.path);
    switch (s.kind) {
      case 'text': {
        const el = textInput(typeof init === 'string' ? init : '');
        readers.push((o) => setPath(o, s.path, el.value === '' && s.empty === 'null' ? null : el.value));
        return field(s.label, el, s.path, s.hint);
      }
      case 'textarea': {
        const el = h('textarea', { rows: 3 });
        el.value = typeof init === 'string' ? init : '';
        readers.push((o) => setPath(o, s.path, el.value));
        return field(s.label, el, s.path, s.hint);
      }
      case 'number': {
        const el = numberInput(typeof init === 'number' ? init : null);
        readers.push((o) => {
          const n = readNumber(el);
          setPath(o, s.path, n === null ? (s.empty === 'null' ? null : undefined) : n);
        });
        return field(s.label, el, s.path, s.hint);
      }
      case 'date': {
        const el = h('input', { type: 'date', value: typeof init === 'string' ? init : '' });
        readers.push((o) => setPath(o, s.path, el.value));
        return field(s.label, el, s.path, s.hint);
      }
      case 'select': {
        const cur = init === null || init === undefined ? '' : String(init);
        const el = h('select', null, s.options.map((o) => h('option', { value: o.value, selected: o.value === cur ? true : undefined }, o.label)));
        readers.push((o) => {
          const v = el.value;
          setPath(o, s.path, v === '' && s.empty === 'null' ? null : s.cast === 'number' && v !== '' ? Number(v) : v);
        });
        return field(s.label, el, s.path, s.hint);
      }
      case 'checks': {
        const cur = Array.isArray(init) ? init.map(String) : [];
        const boxes = s.options.map((o) => {
          const cb = h('input', { type: 'checkbox', value: o.value, checked: cur.includes(o.value) || undefined });
          return { cb, el: h('label', { class: 'check' }, cb, ` ${o.label}`) };
        });
        const group = h('div', { class: 'checks', role: 'group', 'aria-label': s.label }, boxes.map((b) => b.el));
        readers.push((o) => setPath(o, s.path, boxes.filter((b) => b.cb.checked).map((b) => b.cb.value)));
        return field(s.label, group, s.path, s.hint);
      }
    }
    return null;
  });
  return {
    el: h('div', { class: 'form-grid' }, els),
    read() {
      const out: Record<string, unknown> = {};
      for (const r of readers) r(out);
      return out;
    },
  };
}

/**
 * Validates `raw` with the shared schema, shows messages beside their fields, and
 * sends it. Resolves with the server's answer, or null when nothing was saved.
 */
export async function validateAndSend<T>(form: HTMLElement, schema: z.ZodType, raw: unknown, method: 'POST' | 'PUT', path: string): Promise<T | null> {
  const parsed = schema.safeParse(raw);
  if (!parsed.success) {
    showFieldErrors(form, zodFields(parsed.error), 'Please correct the fields marked below.');
    return null;
  }
  try {
    const res = await api<T>(method, path, parsed.data);
    showFieldErrors(form, []);
    return res;
  } catch (e) {
    if (e instanceof ApiError) showFieldErrors(form, e.fields, e.message);
    else if (e instanceof NetworkError) showFieldErrors(form, [], 'Set-up changes need a connection to the server. Nothing was saved.');
    else showFieldErrors(form, [], (e as Error).message);
    return null;
  }
}
