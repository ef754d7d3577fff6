/**
 * Acknowledging a crew notice: who acknowledged it and when, or a name field and a button.
 * POST /api/runs/:id/notices/:noticeId/ack with `{ by }`.
 */
import type { Notice } from '../contract.ts';
import { el } from '../dom.ts';
import { rememberName, rememberedName } from '../personName.ts';
import { formatSiteTime } from '../siteTime.ts';

/** The acknowledgement line or form of one notice. */
export function acknowledgeForm(
  notice: Notice,
  offsetMin: number,
  acknowledge: (notice: Notice, by: string) => Promise<void>,
): HTMLElement {
  if (notice.acknowledgedAtMs !== null) {
    return el(
      'p',
      { class: 'acknowledged' },
      `Acknowledged by ${notice.acknowledgedBy ?? 'someone'} at ${formatSiteTime(notice.acknowledgedAtMs, offsetMin)}.`,
    );
  }
  const inputId = `ack-by-${notice.id}`;
  const name = el('input', {
    id: inputId,
    name: 'by',
    required: true,
    maxlength: 100,
    autocomplete: 'name',
    value: rememberedName(),
  });
  // Kept as typed: a live update redraws the notices, and the new form starts from it.
  name.addEventListener('input', () => rememberName(name.value));
  const message = el('p', { class: 'form-message', role: 'alert' });
  const button = el('button', { type: 'submit' }, 'Acknowledge');
  const form = el(
    'form',
    { class: 'ack-form', 'data-notice': notice.id },
    el('label', { for: inputId }, 'Your name'),
    name,
    button,
    message,
  );
  form.addEventListener('submit', (event) => {
    event.preventDefault();
    const by = name.value.trim();
    if (by === '') {
      message.textContent = 'Type your name to acknowledge.';
      return;
    }
    rememberName(by);
    button.disabled = true;
    acknowledge(notice, by).catch((error: unknown) => {
      message.textContent = `Not acknowledged: ${(error as Error).message}`;
      button.disabled = false;
    });
  });
  return form;
}
