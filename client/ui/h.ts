/**
 * A tiny DOM builder. Text children become Text nodes, so user text is never
 * parsed as markup: there is no innerHTML anywhere in the client.
 *
 * @example h('button', { class: 'big', onclick: save }, 'Save')
 */
export type Child = Node | string | number | null | undefined | false | Child[];

export interface Attrs {
  [key: string]: unknown;
  class?: string;
  style?: Partial<CSSStyleDeclaration> | string;
  dataset?: Record<string, string>;
}

export function h<K extends keyof HTMLElementTagNameMap>(tag: K, attrs?: Attrs | null, ...children: Child[]): HTMLElementTagNameMap[K] {
  const el = document.createElement(tag);
  if (attrs) setAttrs(el, attrs);
  append(el, children);
  return el;
}

function setAttrs(el: HTMLElement, attrs: Attrs): void {
  for (const [key, value] of Object.entries(attrs)) {
    if (value === undefined || value === null || value === false) continue;
    if (key === 'class') el.className = String(value);
    else if (key === 'style') {
      // cssText (CSSOM) rather than a style attribute: the server's CSP forbids inline style attributes.
      if (typeof value === 'string') el.style.cssText = value;
      else Object.assign(el.style, value);
    } else if (key === 'dataset') Object.assign(el.dataset, value as Record<string, string>);
    else if (key.startsWith('on') && typeof value === 'function') {
      el.addEventListener(key.slice(2), value as EventListener);
    } else if (key === 'value' && 'value' in el) (el as HTMLInputElement).value = String(value);
    else if (key === 'checked' && 'checked' in el) (el as HTMLInputElement).checked = Boolean(value);
    else if (key === 'text') el.textContent = String(value);
    else if (key === 'innerHTML') throw new Error('h(): innerHTML is not allowed');
    else el.setAttribute(key, value === true ? '' : String(value));
  }
}

export function append(parent: Node, children: Child[]): void {
  for (const c of children) {
    if (c === null || c === undefined || c === false) continue;
    if (Array.isArray(c)) append(parent, c);
    else if (typeof c === 'string' || typeof c === 'number') parent.appendChild(document.createTextNode(String(c)));
    else parent.appendChild(c);
  }
}

/** Replaces all children of `el` (text stays text). */
export function replace(el: Element, ...children: Child[]): void {
  el.replaceChildren();
  append(el, children);
}

export function $(sel: string, root: ParentNode = document): HTMLElement | null {
  return root.querySelector<HTMLElement>(sel);
}
