/**
 * Building DOM nodes without HTML strings: every text from the server (names, notice texts,
 * error messages) goes in as text, never as markup.
 */

/** Children accepted by el(): nodes, text, or nothing (skipped). */
export type Child = Node | string | null | undefined | false;

/**
 * Creates an element with attributes and children.
 *
 * @param tag - element name
 * @param attributes - set with setAttribute; `class` for classes; false/null/undefined skipped,
 *   true sets the attribute empty
 * @param children - appended in order; strings become text nodes
 */
export function el<K extends keyof HTMLElementTagNameMap>(
  tag: K,
  attributes: Record<string, string | number | boolean | null | undefined> = {},
  ...children: Child[]
): HTMLElementTagNameMap[K] {
  const node = document.createElement(tag);
  for (const [name, value] of Object.entries(attributes)) {
    if (value === false || value === null || value === undefined) continue;
    node.setAttribute(name, value === true ? '' : String(value));
  }
  append(node, ...children);
  return node;
}

/** Appends children (strings as text) to a node. */
export function append(parent: Node, ...children: Child[]): void {
  for (const child of children) {
    if (child === null || child === undefined || child === false) continue;
    parent.appendChild(typeof child === 'string' ? document.createTextNode(child) : child);
  }
}

/** Replaces all children of a node. */
export function replaceChildren(parent: Element, ...children: Child[]): void {
  parent.replaceChildren();
  append(parent, ...children);
}

/** A titled panel: `<section class="panel"><h2>title</h2>...</section>`. */
export function panel(id: string, title: string, ...children: Child[]): HTMLElement {
  return el(
    'section',
    { class: 'panel', id, 'aria-labelledby': `${id}-title` },
    el('h2', { id: `${id}-title` }, title),
    ...children,
  );
}
