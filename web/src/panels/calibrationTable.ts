/**
 * The calibration: each model parameter the ensemble estimates from the probes, with its mean,
 * spread (one standard deviation) and 5-95 % range. The names are the engine's own.
 */
import type { RunState } from '../contract.ts';
import { el, replaceChildren } from '../dom.ts';

/** Three significant digits, enough to see a parameter move; "no value" for NaN. */
export function formatParameter(value: number): string {
  if (!Number.isFinite(value)) return 'no value';
  if (value === 0) return '0';
  const magnitude = Math.abs(value);
  return magnitude >= 0.01 && magnitude < 10_000 ? value.toPrecision(3) : value.toExponential(2);
}

/** How a parameter is shown: words for the engine's name, a scale and a unit. */
export interface ParameterLabel {
  label: string;
  /** Multiplies the engine's value for display (fractions of RH shown in %). */
  scale: number;
  unit: string;
}

const KNOWN: Record<string, ParameterLabel> = {
  permeabilityMultiplier: { label: 'permeability multiplier', scale: 1, unit: 'x' },
  evaporationExposureMultiplier: { label: 'evaporation exposure multiplier', scale: 1, unit: 'x' },
  exposureMultiplier: { label: 'evaporation exposure multiplier', scale: 1, unit: 'x' },
  curingEfficiency: { label: 'curing efficiency (0 to 1)', scale: 1, unit: '' },
  initialBleedFilmKgM2: { label: 'initial bleed film', scale: 1, unit: 'kg/m²' },
};

/**
 * Words for an engine parameter name: the known element parameters, and `rhBias:<probe>` (a
 * fraction of relative humidity) as "RH bias of <probe>" in %. Others are shown as they come.
 */
export function parameterLabel(name: string): ParameterLabel {
  const known = KNOWN[name];
  if (known !== undefined) return known;
  if (name.startsWith('rhBias:'))
    return { label: `RH bias of probe ${name.slice('rhBias:'.length)}`, scale: 100, unit: '%' };
  return { label: name, scale: 1, unit: '' };
}

/** Renders the table into `target`. */
export function renderCalibrationTable(target: HTMLElement, state: RunState | null): void {
  const rows = state?.calibration ?? [];
  if (rows.length === 0) {
    replaceChildren(target, el('p', { class: 'empty' }, 'No calibration yet.'));
    return;
  }
  replaceChildren(
    target,
    el(
      'p',
      { class: 'detail' },
      `${state?.analysisCount ?? 0} analyses so far, ${state?.memberCount ?? 0} ensemble members.`,
    ),
    el(
      'div',
      { class: 'table-wrap' },
      el(
        'table',
        { id: 'calibration-table' },
        el(
          'thead',
          {},
          el(
            'tr',
            {},
            ...['Parameter', 'Unit', 'Mean', 'Spread (1 sd)', '5 %', '95 %'].map((head) =>
              el('th', {}, head),
            ),
          ),
        ),
        el(
          'tbody',
          {},
          ...rows.map((row) => {
            const { label, scale, unit } = parameterLabel(row.name);
            return el(
              'tr',
              {},
              el('td', { title: row.name }, label),
              el('td', {}, unit),
              el('td', {}, formatParameter(row.mean * scale)),
              el('td', {}, formatParameter(row.sd * scale)),
              el('td', {}, formatParameter(row.p05 * scale)),
              el('td', {}, formatParameter(row.p95 * scale)),
            );
          }),
        ),
      ),
    ),
  );
}
