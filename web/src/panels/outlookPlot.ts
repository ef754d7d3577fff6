/**
 * The outlook: utilization over the horizon, median with its 5-95 % band, the run's thresholds
 * as lines, and the expected crossing times and probabilities written out below.
 */
import type uPlot from 'uplot';
import type { RunState } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatDurationH, formatFigure, formatPercent } from '../format.ts';
import { axis, createPlotFrame, siteTimeAxis } from '../plotFrame.ts';
import type { PlotFrame } from '../plotFrame.ts';
import { formatFromNow, formatSiteTime } from '../siteTime.ts';

type Outlook = NonNullable<RunState['outlook']>;

const THRESHOLD_COLOURS = ['#7a5a00', '#a34700', '#8e1b1b', '#5a1b6e', '#333333'];

/** Aligned uPlot data: time (s), p05, p50, p95, then one constant series per threshold. */
export function outlookSeries(outlook: Outlook, thresholds: readonly number[]): uPlot.AlignedData {
  const finite = (values: readonly (number | null)[]) =>
    values.map((value) => (value === null || !Number.isFinite(value) ? null : value));
  return [
    outlook.timesMs.map((ms) => ms / 1000),
    finite(outlook.utilizationBand.p05),
    finite(outlook.utilizationBand.p50),
    finite(outlook.utilizationBand.p95),
    ...thresholds.map((threshold) => outlook.timesMs.map(() => threshold)),
  ];
}

/**
 * One sentence per threshold: already reached (utilization now at or above it); expected at a
 * time (when at least half the ensemble crosses it within the horizon); or how likely it is,
 * with the mean time of the members that do cross (the engine's expectedTimeMs is that mean,
 * so it is no forecast of the crossing when few members cross).
 */
export function crossingSentences(
  outlook: Outlook,
  eventTimeMs: number | null,
  utilizationNow: number | null,
  offsetMin: number,
): string[] {
  return outlook.crossings.map((crossing) => {
    const name = `Utilization ${formatFigure(crossing.threshold, 2, '')}`;
    if (utilizationNow !== null && utilizationNow >= crossing.threshold)
      return `${name}: already reached (utilization now ${formatFigure(utilizationNow, 2, '')}).`;
    const within = `within ${formatDurationH(outlook.horizonH)}`;
    const probability = formatPercent(crossing.probability);
    if (crossing.expectedTimeMs === null)
      return `${name}: not reached ${within} (probability ${probability}).`;
    const at = `${formatSiteTime(crossing.expectedTimeMs, offsetMin)}, ${formatFromNow(crossing.expectedTimeMs, eventTimeMs)}`;
    if (crossing.probability >= 0.5)
      return `${name}: expected at ${at} (probability ${within}: ${probability}).`;
    return `${name}: unlikely ${within} (probability ${probability}); where it is reached, at about ${at}.`;
  });
}

export interface OutlookPlot {
  element: HTMLElement;
  update(state: RunState | null, thresholds: readonly number[]): void;
}

/** The outlook panel. */
export function outlookPlot(offsetMin: number): OutlookPlot {
  const chart = el('div', { class: 'chart', id: 'outlook-chart' });
  const sentences = el('ul', { class: 'crossings', id: 'crossings' });
  const summary = el('p', { class: 'detail' });
  const element = el('div', {}, chart, sentences, summary);
  let frame: PlotFrame | null = null;
  let thresholdCount = -1;
  return {
    element,
    update(state, thresholds) {
      const outlook = state?.outlook ?? null;
      if (outlook === null || outlook.timesMs.length === 0) {
        frame?.destroy();
        frame = null;
        replaceChildren(
          chart,
          el('p', { class: 'empty' }, 'No outlook yet: it follows the first analyses.'),
        );
        sentences.replaceChildren();
        summary.textContent = '';
        return;
      }
      const data = outlookSeries(outlook, thresholds);
      if (frame === null || thresholdCount !== thresholds.length) {
        frame?.destroy();
        chart.replaceChildren();
        thresholdCount = thresholds.length;
        frame = createPlotFrame(
          chart,
          {
            scales: {
              x: { time: true },
              y: { range: (_u, _min, max) => [0, Math.max(1.2, (max ?? 0) * 1.05)] },
            },
            axes: [siteTimeAxis(offsetMin), axis('utilization')],
            series: [
              { label: 'time' },
              { label: '5 %', stroke: '#6b8fbf', width: 1 },
              { label: 'median', stroke: '#123f73', width: 2.5 },
              { label: '95 %', stroke: '#6b8fbf', width: 1 },
              ...thresholds.map((threshold, index) => ({
                label: `threshold ${formatFigure(threshold, 2, '')}`,
                stroke: THRESHOLD_COLOURS[index] ?? '#333333',
                width: 1.5,
                dash: [6, 4],
                points: { show: false },
              })),
            ],
            bands: [{ series: [3, 1], fill: 'rgba(31, 95, 168, 0.18)' }],
          },
          data,
          offsetMin,
        );
      } else frame.setData(data);
      replaceChildren(
        sentences,
        ...crossingSentences(
          outlook,
          state?.eventTimeMs ?? null,
          state?.utilization ?? null,
          offsetMin,
        ).map((line) => el('li', {}, line)),
      );
      summary.textContent = `Probability of cracking within the ${formatDurationH(outlook.horizonH)} horizon: ${formatPercent(outlook.probabilityCrackingWithinHorizon)}. Weather ahead: ${outlook.forecastSource === 'supplied' ? 'the supplied forecast' : 'the recent weather held on (no forecast supplied)'}.`;
    },
  };
}
