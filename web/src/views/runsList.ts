/**
 * The list of runs: site, element (the run's name), placed at (with its offset), open or
 * closed, each linking to its page. Open runs first, newest placement first.
 */
import { getJson } from '../api.ts';
import type { RunDetail, RunSummary } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatFigure } from '../format.ts';
import { formatSiteDateTime, formatUtcOffset, siteOffsetMin } from '../siteTime.ts';

/** Runs whose element the list fetches (one detail request each). */
const MAX_DETAILS = 50;

/** "topping 75 mm - " for a run's element, or nothing when unknown. */
function elementWords(element: RunDetail['config']['element'] | undefined): string {
  return element === undefined
    ? ''
    : `${element.kind} ${formatFigure(element.thicknessMm, 0, 'mm')} - `;
}

/** Open runs first, then by placement, newest first. */
export function sortRuns(runs: readonly RunSummary[]): RunSummary[] {
  return [...runs].sort((a, b) => {
    if (a.status !== b.status) return a.status === 'open' ? -1 : 1;
    return Date.parse(b.placedAt) - Date.parse(a.placedAt);
  });
}

/** Renders the runs list into `root`. */
export async function showRunsList(root: HTMLElement): Promise<void> {
  document.title = 'Runs - Meniscus';
  replaceChildren(root, el('p', { class: 'empty' }, 'Loading runs...'));
  const answer = await getJson<{ runs: RunSummary[] }>('/runs');
  const runs = sortRuns(answer?.runs ?? []);
  // The list answer has no element: each run's detail gives it (a site box holds a few runs;
  // past MAX_DETAILS the name alone is shown).
  const details = await Promise.all(
    runs
      .slice(0, MAX_DETAILS)
      .map((run) => getJson<RunDetail>(`/runs/${encodeURIComponent(run.id)}`).catch(() => null)),
  );
  const elementOf = new Map(
    details.flatMap((detail) => (detail === null ? [] : [[detail.id, detail.config.element]])),
  );
  if (runs.length === 0) {
    replaceChildren(
      root,
      el('h1', {}, 'Runs'),
      el(
        'p',
        { class: 'empty' },
        'No runs yet. A run starts when its configuration is posted to /api/runs (see the README), or run `npm run demo`.',
      ),
    );
    return;
  }
  replaceChildren(
    root,
    el('h1', {}, 'Runs'),
    el(
      'ul',
      { class: 'run-list', id: 'run-list' },
      ...runs.map((run) => {
        const offset = siteOffsetMin(run.placedAt);
        return el(
          'li',
          { class: `run-item ${run.status}` },
          el('a', { href: `/runs/${encodeURIComponent(run.id)}` }, run.name),
          el(
            'p',
            { class: 'detail' },
            `Site ${run.site} - `,
            elementWords(elementOf.get(run.id)),
            `placed ${formatSiteDateTime(Date.parse(run.placedAt), offset)} (${formatUtcOffset(offset)}) - `,
            el('strong', {}, run.status === 'open' ? 'open' : 'closed'),
          ),
        );
      }),
    ),
  );
}
