/**
 * Surface stress and tensile strength since placement (MPa against the site's clock), from the
 * figure history and each live update. Stress is undefined before final set: those points are
 * gaps, not zeros.
 */
import type uPlot from 'uplot';
import type { FigurePoint } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { axis, createPlotFrame, siteTimeAxis } from '../plotFrame.ts';
import type { PlotFrame } from '../plotFrame.ts';

/** Aligned uPlot data: time (s), stress, strength. */
export function historySeries(points: readonly FigurePoint[]): uPlot.AlignedData {
  return [
    points.map((point) => point.eventTimeMs / 1000),
    points.map((point) => point.surfaceStressMPa),
    points.map((point) => point.fctmMPa),
  ];
}

export interface HistoryPlot {
  element: HTMLElement;
  update(points: readonly FigurePoint[], note: string | null): void;
}

/** The plot panel; draws once there are points, then updates in place. */
export function historyPlot(offsetMin: number): HistoryPlot {
  const chart = el('div', { class: 'chart', id: 'history-chart' });
  const note = el('p', { class: 'detail' });
  const element = el('div', {}, chart, note);
  let frame: PlotFrame | null = null;
  return {
    element,
    update(points, noteText) {
      note.textContent = noteText ?? '';
      if (points.length === 0) {
        frame?.destroy();
        frame = null;
        replaceChildren(chart, el('p', { class: 'empty' }, 'No figures since placement yet.'));
        return;
      }
      const data = historySeries(points);
      if (frame === null) {
        chart.replaceChildren();
        frame = createPlotFrame(
          chart,
          {
            scales: {
              x: { time: true },
              y: { range: (_u, min, max) => [Math.min(0, min), Math.max(0.5, max * 1.1)] },
            },
            axes: [siteTimeAxis(offsetMin), axis('MPa')],
            series: [
              { label: 'time' },
              { label: 'surface stress, MPa', stroke: '#b3261e', width: 2.5, spanGaps: false },
              { label: 'tensile strength, MPa', stroke: '#1f5fa8', width: 2.5, dash: [8, 4] },
            ],
          },
          data,
          offsetMin,
        );
      } else frame.setData(data);
    },
  };
}
