/** Small DOM builders for the report page (no framework; d3-selection draws the SVG). */

type Child = Node | string | null | undefined | false;

/** `el('p', { class: 'hint' }, 'text', child)` */
export function el<K extends keyof HTMLElementTagNameMap>(tag: K, attrs: Record<string, string | number | boolean | null | undefined> = {}, ...children: Child[]): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  for (const [k, v] of Object.entries(attrs)) {
    if (v === null || v === undefined || v === false) continue;
    node.setAttribute(k, v === true ? '' : String(v));
  }
  append(node, ...children);
  return node;
}

export function append(node: Node, ...children: Child[]): void {
  for (const c of children) {
    if (c === null || c === undefined || c === false) continue;
    node.appendChild(typeof c === 'string' ? document.createTextNode(c) : c);
  }
}

export function clear(node: Element): void {
  while (node.firstChild) node.removeChild(node.firstChild);
}

export function byId<T extends HTMLElement = HTMLElement>(id: string): T {
  const node = document.getElementById(id);
  if (!node) throw new Error(`report page: element #${id} is missing`);
  return node as T;
}

/** A definition list; each row's value carries `data-field` so it can be found by name. */
export function fields(rows: [field: string, label: string, value: Child | Child[]][]): HTMLDListElement {
  const dl = el('dl');
  for (const [field, label, value] of rows) {
    const dd = el('dd', { 'data-field': field });
    append(dd, ...(Array.isArray(value) ? value : [value]));
    append(dl, el('dt', {}, label), dd);
  }
  return dl;
}
