/**
 * The head of a run page: what is watched (element, site), when it was placed (with the site's
 * UTC offset), whether the run is open, the engine's phase, the event time of the last update
 * and the data-quality flags written out.
 */
import type { RunDetail, RunState } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatFigure } from '../format.ts';
import { formatSiteDateTime, formatSiteTime, formatUtcOffset } from '../siteTime.ts';
import { phaseWords } from '../words.ts';

function fact(label: string, value: string, id?: string): HTMLElement {
  return el('div', { class: 'fact' }, el('dt', {}, label), el('dd', { id }, value));
}

/** Renders the header into `target`. */
export function renderRunHeader(
  target: HTMLElement,
  run: RunDetail,
  state: RunState | null,
  offsetMin: number,
): void {
  const { element } = run.config;
  const placedMs = Date.parse(run.placedAt);
  const offset = formatUtcOffset(offsetMin);
  const flags = state?.quality.flags ?? [];
  const quality =
    state === null
      ? el('p', { class: 'quality' }, 'Data quality: not known yet.')
      : el(
          'div',
          { class: `quality ${state.quality.degraded ? 'degraded' : ''}`.trim(), id: 'quality' },
          el(
            'p',
            {},
            state.quality.degraded
              ? 'Data quality: DEGRADED. The figures rest on less data than planned.'
              : flags.length === 0
                ? 'Data quality: no problems flagged.'
                : 'Data quality: usable, with these flags:',
          ),
          flags.length === 0
            ? null
            : el(
                'ul',
                {},
                ...flags.map((flag) =>
                  el(
                    'li',
                    {},
                    `${flag.message} (since ${formatSiteTime(flag.sinceMs, offsetMin)})`,
                  ),
                ),
              ),
        );
  replaceChildren(
    target,
    el(
      'dl',
      { class: 'facts' },
      fact('Site', run.site),
      fact(
        'Element',
        `${element.kind}, ${formatFigure(element.thicknessMm, 0, 'mm')}, drying from ${element.drying === 'two-face' ? 'both faces' : 'one face'}`,
      ),
      fact('Placed at', `${formatSiteDateTime(placedMs, offsetMin)} (${offset})`, 'placed-at'),
      fact(
        'Run',
        run.status === 'open'
          ? 'open: being watched'
          : `closed at ${formatSiteDateTime(Date.parse(run.closedAt ?? ''), offsetMin)}`,
      ),
      fact('Phase', state === null ? 'not known yet' : phaseWords(state.phase), 'phase'),
      fact(
        'Figures as of',
        state?.eventTimeMs === null || state === null
          ? 'no readings yet'
          : `${formatSiteDateTime(state.eventTimeMs, offsetMin)} (${offset}, time of the readings)`,
        'event-time',
      ),
    ),
    quality,
  );
}
