/**
 * The caution every output of the engine carries (RunState.caution), in a bar fixed to the
 * bottom of the window so it stays in sight whatever is scrolled.
 */
import { el } from '../dom.ts';

/** Creates the bar; `update` sets its text (the server's words, unchanged). */
export function cautionBar(): { element: HTMLElement; update(text: string): void } {
  const text = el('span', {});
  const element = el(
    'aside',
    { class: 'caution', id: 'caution', 'aria-label': 'caution' },
    el('strong', {}, 'Caution: '),
    text,
  );
  return {
    element,
    update(next) {
      text.textContent = next;
    },
  };
}
