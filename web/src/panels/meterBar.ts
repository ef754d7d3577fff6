/**
 * A horizontal bar gauge: the value as a filled bar on a scale from 0, with labelled marks (the
 * run's thresholds) on the scale. The value is always written beside it; the bar only helps the
 * eye. Exposed to assistive technology as a meter.
 */
import { el } from '../dom.ts';

/** One labelled mark on a meter's scale. */
export interface MeterMark {
  value: number;
  label: string;
}

export interface MeterOptions {
  /** Accessible name, e.g. "utilization". */
  name: string;
  /** The value; null draws an empty bar. */
  value: number | null;
  /** Top of the scale (bottom is 0); values above it fill the bar. */
  max: number;
  marks?: readonly MeterMark[];
  /** Extra class of the fill, e.g. "past-threshold" (the text says the same in words). */
  tone?: string;
}

/** Position of a value on the scale, percent 0..100. */
function position(value: number, max: number): number {
  if (!(max > 0) || !Number.isFinite(value)) return 0;
  return Math.min(100, Math.max(0, (value / max) * 100));
}

/** Builds a meter element (rebuild it to update). */
export function meterBar(options: MeterOptions): HTMLElement {
  const fill = el('div', { class: `meter-fill ${options.tone ?? ''}`.trim() });
  fill.style.width = `${options.value === null ? 0 : position(options.value, options.max)}%`;
  const track = el('div', { class: 'meter-track' }, fill);
  const marks = el('div', { class: 'meter-marks', 'aria-hidden': 'true' });
  // Labels closer than this (percent of the scale) go on the next row so they never overlap.
  const minGapPercent = 14;
  const rowEnds: number[] = [];
  const sorted = [...(options.marks ?? [])].sort((a, b) => a.value - b.value);
  for (const mark of sorted) {
    const leftPercent = position(mark.value, options.max);
    const left = `${leftPercent}%`;
    const tick = el('div', { class: 'meter-tick' });
    tick.style.left = left;
    track.appendChild(tick);
    let row = rowEnds.findIndex((end) => leftPercent - end >= minGapPercent);
    if (row === -1) row = rowEnds.length;
    rowEnds[row] = leftPercent;
    const label = el('span', { class: 'meter-mark-label' }, mark.label);
    label.style.left = left;
    label.style.top = `${0.15 + row * 1.05}rem`;
    marks.appendChild(label);
  }
  marks.style.height = `${rowEnds.length * 1.05}rem`;
  return el(
    'div',
    {
      class: 'meter',
      role: 'meter',
      'aria-label': options.name,
      'aria-valuemin': 0,
      'aria-valuemax': options.max,
      'aria-valuenow': options.value ?? undefined,
    },
    track,
    marks,
  );
}
