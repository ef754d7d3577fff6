/**
 * The current crew notice at the top of a run page: its level written out in words with what
 * it asks of the crew, its title, when it was raised, and who acknowledged it or a button to do
 * so. Colour backs the words up and never replaces them.
 */
import type { Notice } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { currentNotice } from '../noticeFeed.ts';
import { formatSiteTime } from '../siteTime.ts';
import { levelClass, levelMeaning } from '../words.ts';
import { acknowledgeForm } from './acknowledgeForm.ts';

/** Acknowledges a notice as `by`; rejects with the server's message. */
export type Acknowledge = (notice: Notice, by: string) => Promise<void>;

/**
 * Renders the banner.
 *
 * @param notices - newest first; null when the server has no notices route (yet)
 */
export function renderNoticeBanner(
  target: HTMLElement,
  notices: readonly Notice[] | null,
  offsetMin: number,
  acknowledge: Acknowledge,
): void {
  target.className = 'notice-banner';
  if (notices === null) {
    target.classList.add('level-none');
    replaceChildren(
      target,
      el('p', { class: 'level-line' }, 'Crew notices: not available from this server.'),
    );
    return;
  }
  const notice = currentNotice(notices);
  if (notice === null) {
    target.classList.add('level-none');
    replaceChildren(
      target,
      el('p', { class: 'level-line', id: 'notice-level' }, 'No crew notice: nothing to act on.'),
    );
    return;
  }
  target.classList.add(`level-${levelClass(notice.level)}`);
  replaceChildren(
    target,
    el(
      'p',
      { class: 'level-line' },
      'Crew notice: ',
      el('strong', { id: 'notice-level' }, notice.level),
      ` (${notice.kind === 'eased' ? 'condition cleared' : levelMeaning(notice.level)})`,
    ),
    el('p', { class: 'notice-title', id: 'notice-title' }, notice.title),
    el('p', { class: 'detail' }, `raised at ${formatSiteTime(notice.raisedAtMs, offsetMin)}`),
    acknowledgeForm(notice, offsetMin, acknowledge),
  );
}
