/**
 * The measure log: the curing measures the crew applied, with a form to log one starting now
 * (kind and who) and a button to end one that is still applied. The form is built once, so a
 * live update never wipes what someone is typing; only the table is redrawn.
 */
import type { Measure } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { rememberName, rememberedName } from '../personName.ts';
import { formatSiteDateTime } from '../siteTime.ts';
import { MEASURE_KINDS, measureKindWords } from '../words.ts';

/**
 * What the panel asks of the page: log a measure starting now, end one now. Both resolve with
 * the measure as the server stored it and reject with the server's message.
 */
export interface MeasureActions {
  start(kind: string, loggedBy: string): Promise<Measure>;
  end(measure: Measure, endedBy: string): Promise<Measure>;
}

export interface MeasureLogPanel {
  element: HTMLElement;
  update(measures: readonly Measure[], offsetMin: number, runOpen: boolean): void;
}

/** Builds the panel (form and table). */
export function measureLogPanel(actions: MeasureActions): MeasureLogPanel {
  const kind = el(
    'select',
    { id: 'measure-kind', name: 'kind' },
    ...MEASURE_KINDS.map((value) => el('option', { value }, measureKindWords(value))),
  );
  const who = el('input', {
    id: 'measure-by',
    name: 'loggedBy',
    required: true,
    maxlength: 100,
    autocomplete: 'name',
    value: rememberedName(),
  });
  const message = el('p', { class: 'form-message', role: 'status' });
  const submit = el('button', { type: 'submit' }, 'Log measure, starting now');
  const form = el(
    'form',
    { class: 'measure-form', id: 'measure-form' },
    el('div', { class: 'field' }, el('label', { for: 'measure-kind' }, 'Measure'), kind),
    el('div', { class: 'field' }, el('label', { for: 'measure-by' }, 'Who'), who),
    submit,
    message,
  );
  const table = el('div', { class: 'measure-table', id: 'measure-table' });
  form.addEventListener('submit', (event) => {
    event.preventDefault();
    const loggedBy = who.value.trim();
    if (loggedBy === '') {
      message.textContent = 'Type who applies the measure.';
      return;
    }
    rememberName(loggedBy);
    submit.disabled = true;
    message.textContent = 'Logging...';
    actions
      .start(kind.value, loggedBy)
      .then((measure) => {
        message.textContent = `Logged: ${measureKindWords(measure.kind)} by ${measure.loggedBy}, from ${formatSiteDateTime(Date.parse(measure.startAt), shownOffsetMin)}.`;
      })
      .catch((error: unknown) => {
        message.textContent = `Not logged: ${(error as Error).message}`;
      })
      .finally(() => {
        submit.disabled = false;
      });
  });
  const element = el('div', {}, form, table);
  let shownOffsetMin = 0;

  const endButton = (measure: Measure) => {
    const button = el('button', { type: 'button', class: 'secondary' }, 'End now');
    button.addEventListener('click', () => {
      const endedBy = who.value.trim() || rememberedName();
      if (endedBy === '') {
        message.textContent = 'Type your name in "Who" to end a measure.';
        who.focus();
        return;
      }
      button.disabled = true;
      actions.end(measure, endedBy).catch((error: unknown) => {
        message.textContent = `Not ended: ${(error as Error).message}`;
        button.disabled = false;
      });
    });
    return button;
  };

  return {
    element,
    update(measures, offsetMin, runOpen) {
      shownOffsetMin = offsetMin;
      form.hidden = !runOpen;
      if (measures.length === 0) {
        replaceChildren(table, el('p', { class: 'empty' }, 'No measures logged.'));
        return;
      }
      // Times of day on the site's clock, with the date when it is not the first measure's.
      const firstDay = formatSiteDateTime(Date.parse(measures[0]?.startAt ?? ''), offsetMin);
      const time = (iso: string) => {
        const full = formatSiteDateTime(Date.parse(iso), offsetMin);
        return full.slice(0, 10) === firstDay.slice(0, 10) ? full.slice(11) : full;
      };
      replaceChildren(
        table,
        el(
          'table',
          {},
          el(
            'thead',
            {},
            el(
              'tr',
              {},
              ...['Measure', 'Logged by', 'From', 'Until', ''].map((head) => el('th', {}, head)),
            ),
          ),
          el(
            'tbody',
            {},
            ...measures.map((measure) =>
              el(
                'tr',
                { 'data-measure': measure.id },
                el('td', {}, measureKindWords(measure.kind)),
                el('td', {}, measure.loggedBy),
                el('td', {}, time(measure.startAt)),
                el(
                  'td',
                  {},
                  measure.endAt === null
                    ? 'still applied'
                    : `${time(measure.endAt)}${measure.endedBy === null ? '' : ` (${measure.endedBy})`}`,
                ),
                el('td', {}, measure.endAt === null && runOpen ? endButton(measure) : null),
              ),
            ),
          ),
        ),
      );
    },
  };
}
