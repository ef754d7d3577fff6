/**
 * The figures now, one card each: utilization against the run's thresholds, margin, surface
 * stress against strength, evaporation rate against the ACI 305R threshold, bleed film and
 * in-place strength. Every number carries its unit; every state a colour shows is also written.
 */
import type { RunState } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';
import { formatDurationH, formatFigure, formatRange, NO_VALUE } from '../format.ts';
import { meterBar } from './meterBar.ts';

/** The thresholds a run is judged against (run configuration `thresholds`). */
export interface GaugeThresholds {
  utilization: readonly number[];
  evaporationKgM2h: number;
}

function card(id: string, title: string, ...children: (Node | string | null)[]): HTMLElement {
  return el('article', { class: 'gauge', id }, el('h3', {}, title), ...children);
}

/** The card's main figure; a sentence instead of a number is set smaller. */
function bigValue(text: string, testId: string): HTMLElement {
  const inWords = !/^-?\d/.test(text);
  return el('p', { class: `big-value${inWords ? ' in-words' : ''}`, 'data-figure': testId }, text);
}

/**
 * Where utilization stands against the thresholds, in words. Before final set utilization is the
 * surface suction over the air-entry suction (physics.md 7), after it stress over strength.
 */
export function utilizationWords(
  utilization: number | null,
  thresholds: readonly number[],
  phase: RunState['phase'] = 'hardening',
): string {
  if (utilization === null) return 'not yet computed';
  const sorted = [...thresholds].sort((a, b) => a - b);
  const passed = sorted.filter((threshold) => utilization >= threshold);
  if (passed.length === 0) return `below the first threshold (${formatFigure(sorted[0], 2, '')})`;
  const highest = passed[passed.length - 1] ?? 0;
  if (utilization >= 1)
    return phase === 'hardening'
      ? 'at or above 1: stress has reached strength'
      : 'at or above 1: suction has reached air entry, the surface starts to drain';
  return `past the threshold ${formatFigure(highest, 2, '')}`;
}

const notDefined = (state: RunState) =>
  state.phase === 'hardening' ? NO_VALUE : 'not defined before final set';

/** Renders the gauges into `target` (replacing what was there). */
export function renderFigureGauges(
  target: HTMLElement,
  state: RunState | null,
  thresholds: GaugeThresholds,
): void {
  if (state === null || state.eventTimeMs === null) {
    replaceChildren(
      target,
      el('p', { class: 'empty' }, 'No figures yet: the engine waits for the first readings.'),
    );
    return;
  }
  const bands = state.nowBands;
  const u = state.utilization;
  // The scale shows the thresholds and the value; the band's upper end is written, not drawn.
  const uMax = Math.max(1.2, (u ?? 0) * 1.15);
  const pastFirst = u !== null && u >= Math.min(...thresholds.utilization);
  const utilization = card(
    'gauge-utilization',
    state.phase === 'hardening'
      ? 'Utilization (stress / strength)'
      : 'Utilization (suction / air-entry suction, before final set)',
    bigValue(u === null ? notDefined(state) : formatFigure(u, 2, ''), 'utilization'),
    meterBar({
      name: 'utilization',
      value: u,
      max: uMax,
      marks: thresholds.utilization.map((value) => ({
        value,
        label: formatFigure(value, 2, ''),
      })),
      tone: u !== null && u >= 1 ? 'at-limit' : pastFirst ? 'past-threshold' : 'calm',
    }),
    el('p', {}, utilizationWords(u, thresholds.utilization, state.phase)),
    bands === null
      ? null
      : el(
          'p',
          { class: 'detail' },
          `5-95 %: ${formatRange(bands.utilization.p05, bands.utilization.p95, 2, '')}`,
        ),
  );
  const margin = card(
    'gauge-margin',
    'Margin (strength minus stress)',
    bigValue(
      state.marginMPa === null ? notDefined(state) : formatFigure(state.marginMPa, 2, 'MPa'),
      'margin',
    ),
    state.marginMPa === null
      ? null
      : el(
          'p',
          {},
          state.marginMPa > 0
            ? 'strength is above the surface stress'
            : 'none left: the surface stress has reached the strength',
        ),
    bands === null || state.marginMPa === null
      ? null
      : el(
          'p',
          { class: 'detail' },
          `5-95 %: ${formatRange(bands.marginMPa.p05, bands.marginMPa.p95, 2, 'MPa')}`,
        ),
  );
  const stress = state.surfaceStressMPa;
  const strength = state.fctmMPa;
  const stressMax = Math.max(0.5, stress ?? 0, strength ?? 0) * 1.1;
  const stressCard = card(
    'gauge-stress',
    'Surface stress against tensile strength',
    bigValue(
      stress === null && strength === null
        ? notDefined(state)
        : `${formatFigure(stress, 2, 'MPa')} of ${formatFigure(strength, 2, 'MPa')}`,
      'stress-strength',
    ),
    el('p', { class: 'meter-caption' }, `surface stress ${formatFigure(stress, 2, 'MPa')}`),
    meterBar({ name: 'surface stress', value: stress, max: stressMax, tone: 'stress' }),
    el('p', { class: 'meter-caption' }, `tensile strength ${formatFigure(strength, 2, 'MPa')}`),
    meterBar({ name: 'tensile strength', value: strength, max: stressMax, tone: 'strength' }),
    state.phase === 'hardening'
      ? null
      : el(
          'p',
          { class: 'detail' },
          'Before final set the risk is the suction (utilization); stress counts from the set.',
        ),
  );
  const evaporation = state.evaporationKgM2h;
  const aciLimit = thresholds.evaporationKgM2h;
  const evaporationCard = card(
    'gauge-evaporation',
    'Evaporation rate',
    bigValue(formatFigure(evaporation, 2, 'kg/m²/h'), 'evaporation'),
    meterBar({
      name: 'evaporation rate',
      value: evaporation,
      max: Math.max(2 * aciLimit, (evaporation ?? 0) * 1.1),
      marks: [{ value: aciLimit, label: `ACI 305R ${formatFigure(aciLimit, 1, '')}` }],
      tone: evaporation !== null && evaporation >= aciLimit ? 'past-threshold' : 'calm',
    }),
    el(
      'p',
      {},
      evaporation === null
        ? 'not yet computed'
        : `${evaporation >= aciLimit ? 'at or above' : 'below'} the ACI 305R precaution threshold (${formatFigure(aciLimit, 1, 'kg/m²/h')})`,
    ),
  );
  const film = state.bleedFilmKgM2;
  const bleed = card(
    'gauge-bleed',
    'Bleed water on the surface',
    bigValue(formatFigure(film, 2, 'kg/m²'), 'bleed-film'),
    el(
      'p',
      {},
      film === null
        ? 'not yet computed'
        : film <= 0
          ? 'no bleed film left: the surface is drying'
          : `film gone in about ${formatDurationH(state.bleedFilmRemainingH)}`,
    ),
    // The probes cannot see a film: the figure is the model's, and the crew can check it.
    el(
      'p',
      { class: 'detail' },
      'estimated by the model (the probes cannot see a film): if bleed water still shows on the surface, the drying warnings may come early',
    ),
  );
  const strengthCard = card(
    'gauge-strength',
    'In-place compressive strength',
    bigValue(formatFigure(state.inPlaceCompressiveStrengthMPa, 1, 'MPa'), 'compressive'),
    el(
      'p',
      {},
      state.timeToTargetStrengthH === null
        ? 'target strength: no estimate yet'
        : state.timeToTargetStrengthH <= 0
          ? 'target strength reached'
          : `target strength in about ${formatDurationH(state.timeToTargetStrengthH)}`,
    ),
  );
  replaceChildren(target, utilization, margin, stressCard, evaporationCard, bleed, strengthCard);
}
