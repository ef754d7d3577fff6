/**
 * Depth profiles below the exposed surface: the model's pore saturation with its 5-95 % band,
 * and each probe's relative humidity beside the model's at its depth.
 */
import type uPlot from 'uplot';
import type { RunState } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatFigure, NBSP } from '../format.ts';
import { axis, createPlotFrame } from '../plotFrame.ts';
import type { PlotFrame } from '../plotFrame.ts';

type Profiles = NonNullable<RunState['profiles']>;

/** Aligned data: depth (mm, surface first), saturation p05, p50, p95 (fractions). */
export function saturationSeries(profiles: Profiles): uPlot.AlignedData {
  return [
    profiles.depthMm,
    profiles.saturation.p05,
    profiles.saturation.p50,
    profiles.saturation.p95,
  ];
}

function probeTable(profiles: Profiles): HTMLElement {
  if (profiles.probes.length === 0)
    return el('p', { class: 'empty' }, 'No humidity probes in this run.');
  const rows = [...profiles.probes].sort((a, b) => a.depthMm - b.depthMm);
  return el(
    'table',
    { id: 'probe-table' },
    el(
      'thead',
      {},
      el(
        'tr',
        {},
        ...['Depth', 'Probe', 'Probe RH', 'Model RH', 'Difference'].map((head) =>
          el('th', {}, head),
        ),
      ),
    ),
    el(
      'tbody',
      {},
      ...rows.map((probe) =>
        el(
          'tr',
          {},
          el('td', {}, formatFigure(probe.depthMm, 0, 'mm')),
          el('td', {}, `${probe.device} ${probe.sensor}`),
          el(
            'td',
            {},
            probe.measuredRhPercent === null
              ? 'no reading'
              : formatFigure(probe.measuredRhPercent, 1, '%'),
          ),
          el(
            'td',
            {},
            `${formatFigure(probe.modelRhPercent, 1, '%')} ±${NBSP}${formatFigure(probe.modelRhSdPercent, 1, '%')}`,
          ),
          el(
            'td',
            {},
            probe.measuredRhPercent === null
              ? ''
              : formatFigure(probe.measuredRhPercent - probe.modelRhPercent, 1, '%'),
          ),
        ),
      ),
    ),
  );
}

export interface DepthProfilesPanel {
  element: HTMLElement;
  update(state: RunState | null): void;
}

/** The profiles panel. */
export function depthProfilesPanel(): DepthProfilesPanel {
  const chart = el('div', { class: 'chart', id: 'saturation-chart' });
  const probes = el('div', { class: 'table-wrap' });
  const element = el(
    'div',
    {},
    el('h3', {}, 'Pore saturation by depth (model, 5-95 % band)'),
    chart,
    el('h3', {}, 'Probe humidity beside the model'),
    probes,
  );
  let frame: PlotFrame | null = null;
  return {
    element,
    update(state) {
      const profiles = state?.profiles ?? null;
      if (profiles === null || profiles.depthMm.length === 0) {
        frame?.destroy();
        frame = null;
        replaceChildren(chart, el('p', { class: 'empty' }, 'No profiles yet.'));
        replaceChildren(probes, el('p', { class: 'empty' }, 'No probe readings yet.'));
        return;
      }
      const data = saturationSeries(profiles);
      if (frame === null) {
        chart.replaceChildren();
        frame = createPlotFrame(
          chart,
          {
            scales: { x: { time: false }, y: { range: [0, 1] } },
            axes: [axis('depth below the surface, mm'), axis('saturation (0 to 1)')],
            series: [
              { label: 'depth, mm' },
              { label: '5 %', stroke: '#6b8fbf', width: 1, points: { show: false } },
              { label: 'median', stroke: '#123f73', width: 2.5, points: { show: false } },
              { label: '95 %', stroke: '#6b8fbf', width: 1, points: { show: false } },
            ],
            bands: [{ series: [3, 1], fill: 'rgba(31, 95, 168, 0.18)' }],
          },
          data,
        );
      } else frame.setData(data);
      replaceChildren(probes, probeTable(profiles));
    },
  };
}
