/**
 * Every crew notice of the run, newest first: level in words, title, the whole text, figures
 * it was raised on, each delivery (channel, recipient, status, attempts, error) and the
 * acknowledgement.
 */
import type { Notice } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatSiteDateTime, formatSiteTime } from '../siteTime.ts';
import { levelClass } from '../words.ts';
import { acknowledgeForm } from './acknowledgeForm.ts';
import type { Acknowledge } from './noticeBanner.ts';

function deliveryLine(delivery: Notice['deliveries'][number], offsetMin: number): HTMLElement {
  const when =
    delivery.lastAttemptMs === null
      ? ''
      : `, last try ${formatSiteDateTime(delivery.lastAttemptMs, offsetMin)}`;
  const tries = `${delivery.attempts} ${delivery.attempts === 1 ? 'try' : 'tries'}`;
  const next =
    delivery.nextAttemptMs === null || delivery.nextAttemptMs === undefined
      ? ''
      : `, next try ${formatSiteDateTime(delivery.nextAttemptMs, offsetMin)}`;
  return el(
    'li',
    { class: `delivery delivery-${delivery.status}` },
    `${delivery.channel} to ${delivery.recipient}: ${delivery.status} (${tries}${when}${next})`,
    delivery.error === null ? null : ` - ${delivery.error}`,
  );
}

/** Renders the list (or why there is none) into `target`. */
export function renderNoticeList(
  target: HTMLElement,
  notices: readonly Notice[] | null,
  offsetMin: number,
  acknowledge: Acknowledge,
): void {
  if (notices === null) {
    replaceChildren(
      target,
      el('p', { class: 'empty' }, 'This server does not give crew notices (yet).'),
    );
    return;
  }
  if (notices.length === 0) {
    replaceChildren(target, el('p', { class: 'empty' }, 'No crew notices so far.'));
    return;
  }
  replaceChildren(
    target,
    el(
      'ol',
      { class: 'notice-list' },
      ...notices.map((notice) =>
        el(
          'li',
          { class: `notice level-${levelClass(notice.level)}`, id: `notice-${notice.id}` },
          el(
            'p',
            { class: 'notice-head' },
            el('strong', { class: 'level-word' }, notice.level),
            ` ${formatSiteTime(notice.raisedAtMs, offsetMin)} - ${notice.title}`,
          ),
          el(
            'details',
            {},
            el('summary', {}, 'Whole message'),
            el('p', { class: 'notice-text' }, notice.text),
          ),
          notice.deliveries.length === 0
            ? el('p', { class: 'detail' }, 'Not sent to anyone (no recipients for this level).')
            : el(
                'ul',
                { class: 'deliveries' },
                ...notice.deliveries.map((delivery) => deliveryLine(delivery, offsetMin)),
              ),
          acknowledgeForm(notice, offsetMin, acknowledge),
        ),
      ),
    ),
  );
}
