import { h, replace, type Child } from '../../ui/h';

/** A list card with a 'New …' button and a slot where the edit form opens. */
export function sectionLayout(host: HTMLElement, title: string, newLabel: string, onNew: () => void): { formSlot: HTMLElement; list: HTMLElement } {
  const formSlot = h('div', { class: 'form-slot' });
  const list = h('div', { class: 'card' });
  replace(host,
    h('div', { class: 'row between wrap' }, h('h2', null, title),
      h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'new' }, onclick: onNew }, newLabel)),
    formSlot, list);
  return { formSlot, list };
}

export function formCard(title: string, fields: Child, onSave: () => void, onCancel: () => void, extra?: Child): HTMLFormElement {
  const form = h('form', { class: 'card form', novalidate: true },
    h('h3', null, title),
    h('div', { class: 'form-errors', hidden: true, role: 'alert' }),
    fields,
    h('div', { class: 'row gap' },
      h('button', { type: 'submit', class: 'btn btn-primary', dataset: { testid: 'save-form' } }, 'Save'),
      h('button', { type: 'button', class: 'btn', onclick: onCancel }, 'Cancel'),
      extra ?? null));
  form.addEventListener('submit', (e) => { e.preventDefault(); onSave(); });
  return form;
}

export function openForm(slot: HTMLElement, form: HTMLElement): void {
  replace(slot, form);
  form.scrollIntoView({ block: 'start' });
  form.querySelector<HTMLElement>('input, select, textarea')?.focus();
}
