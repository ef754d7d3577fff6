/**
 * The page of one run. Loads the run, its state, figure history, notices and measure log over
 * REST, then keeps them current from socket.io pushes (and refetches after a reconnect). Panels
 * that hold a form are built once and only their lists are redrawn.
 */
import { getJson, postJson } from '../api.ts';
import type { FigurePoint, Measure, Notice, RunDetail, RunState } from '../contract.ts';
import { el, panel, replaceChildren } from '../dom.ts';
import { figurePointOf, mergeFigurePoints } from '../figureHistory.ts';
import { connectLive } from '../liveConnection.ts';
import { measureTimeFor } from '../measureClock.ts';
import { currentNotice, upsertNotice } from '../noticeFeed.ts';
import { siteOffsetMin, formatUtcOffset } from '../siteTime.ts';
import { renderCalibrationTable } from '../panels/calibrationTable.ts';
import { cautionBar } from '../panels/cautionBar.ts';
import { depthProfilesPanel } from '../panels/depthProfiles.ts';
import { renderFigureGauges } from '../panels/figureGauges.ts';
import { historyPlot } from '../panels/historyPlot.ts';
import { measureLogPanel } from '../panels/measureLog.ts';
import { renderNoticeBanner } from '../panels/noticeBanner.ts';
import { renderNoticeList } from '../panels/noticeList.ts';
import { outlookPlot } from '../panels/outlookPlot.ts';
import { renderRunHeader } from '../panels/runHeader.ts';
import { showConnection } from './connectionStatus.ts';

/** Shows the run `runId` in `root`; returns a function that stops its live link. */
export async function showRunPage(root: HTMLElement, runId: string): Promise<() => void> {
  const base = `/runs/${encodeURIComponent(runId)}`;
  replaceChildren(root, el('p', { class: 'empty' }, 'Loading the run...'));
  const run = await getJson<RunDetail>(base);
  if (run === null) {
    replaceChildren(
      root,
      el('h1', {}, 'No such run'),
      el(
        'p',
        {},
        `There is no run "${runId}" on this server. `,
        el('a', { href: '/' }, 'All runs'),
      ),
    );
    return () => undefined;
  }
  document.title = `${run.name} - Meniscus`;
  const offsetMin = siteOffsetMin(run.placedAt);
  const thresholds = run.config.thresholds;

  let state: RunState | null = null;
  let history: FigurePoint[] = [];
  let historyAvailable = true;
  let notices: Notice[] | null = [];

  const header = el('div', { class: 'run-header', id: 'run-header' });
  const banner = el('div', { class: 'notice-banner', id: 'notice-banner', role: 'status' });
  const gauges = el('div', { class: 'gauges', id: 'gauges' });
  const stressPlot = historyPlot(offsetMin);
  const outlook = outlookPlot(offsetMin);
  const profiles = depthProfilesPanel();
  const calibration = el('div', { id: 'calibration' });
  const noticeList = el('div', { id: 'notice-list' });
  const caution = cautionBar();

  const acknowledge = async (notice: Notice, by: string) => {
    const updated = await postJson<Notice>(`${base}/notices/${encodeURIComponent(notice.id)}/ack`, {
      by,
    });
    notices = upsertNotice(notices ?? [], updated);
    drawNotices();
  };
  const measureLog = measureLogPanel({
    start: async (kind, loggedBy) => {
      const startAt = measureTimeFor(state?.eventTimeMs ?? null, Date.now());
      const logged = await postJson<Measure>(`${base}/measures`, {
        kind,
        loggedBy,
        ...(startAt === null ? {} : { startAt }),
      });
      await loadMeasures();
      return logged;
    },
    end: async (measure, endedBy) => {
      const endAt = measureTimeFor(state?.eventTimeMs ?? null, Date.now());
      const ended = await postJson<Measure>(
        `${base}/measures/${encodeURIComponent(measure.id)}/end`,
        { endedBy, ...(endAt === null ? {} : { endAt }) },
      );
      await loadMeasures();
      return ended;
    },
  });

  replaceChildren(
    root,
    el('nav', { class: 'crumbs' }, el('a', { href: '/' }, 'All runs')),
    el('h1', {}, run.name),
    banner,
    header,
    panel('now', 'Figures now', gauges),
    panel('history', 'Surface stress and tensile strength since placement', stressPlot.element),
    panel('outlook', 'Outlook of utilization', outlook.element),
    panel('profiles', 'Depth profiles', profiles.element),
    panel('measures', 'Measure log', measureLog.element),
    panel('notices', 'Crew notices', noticeList),
    panel('calibration-panel', 'Calibration', calibration),
    caution.element,
  );

  const drawState = () => {
    renderRunHeader(header, run, state, offsetMin);
    renderFigureGauges(gauges, state, thresholds);
    stressPlot.update(
      history,
      historyAvailable
        ? `Times on the site's clock (${formatUtcOffset(offsetMin)}). Stress is not defined before final set.`
        : 'This server keeps no figure history yet: the plot shows the updates since this page opened.',
    );
    outlook.update(state, thresholds.utilization);
    profiles.update(state);
    renderCalibrationTable(calibration, state);
    if (state !== null) caution.update(state.caution);
  };
  const drawNotices = () => {
    // The level leads the tab's title, so a tab in the background still says it.
    const level = notices === null ? null : (currentNotice(notices)?.level ?? null);
    document.title = `${level === null ? '' : `${level} - `}${run.name} - Meniscus`;
    renderNoticeBanner(banner, notices, offsetMin, acknowledge);
    renderNoticeList(noticeList, notices, offsetMin, acknowledge);
  };
  const takeState = (next: RunState) => {
    if (
      state?.eventTimeMs != null &&
      next.eventTimeMs != null &&
      next.eventTimeMs < state.eventTimeMs
    )
      return; // an older push arriving late
    state = next;
    const point = figurePointOf(next);
    if (point !== null) history = mergeFigurePoints(history, [point]);
    drawState();
  };
  async function loadMeasures() {
    const answer = await getJson<{ measures: Measure[] }>(`${base}/measures`);
    measureLog.update(answer?.measures ?? [], offsetMin, run?.status === 'open');
  }
  /**
   * Loads everything over REST. A route that answers 404 (a server without it) is shown as
   * missing; a failed request (the link is down) keeps what the page already shows.
   */
  const loadAll = async () => {
    const kept = <T>(request: Promise<T | null>) => request.catch((): undefined => undefined);
    const [nextState, figures, noticeAnswer] = await Promise.all([
      kept(getJson<RunState>(`${base}/state`)),
      kept(getJson<{ figures: FigurePoint[] }>(`${base}/figures`)),
      kept(getJson<{ notices: Notice[] }>(`${base}/notices`)),
      loadMeasures().catch(() => undefined),
    ]);
    if (figures !== undefined) historyAvailable = figures !== null;
    if (figures) history = mergeFigurePoints(history, figures.figures);
    if (noticeAnswer !== undefined)
      notices =
        noticeAnswer === null ? null : [...noticeAnswer.notices].sort((a, b) => b.seq - a.seq);
    if (nextState) takeState(nextState);
    else drawState();
    drawNotices();
  };

  await loadAll();
  return connectLive(run.id, {
    onState: takeState,
    onNotice: (notice) => {
      notices = upsertNotice(notices ?? [], notice);
      drawNotices();
    },
    onJoined: () => void loadAll(),
    onStatus: showConnection,
  });
}
