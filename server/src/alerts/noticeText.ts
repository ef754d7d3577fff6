/**
 * The words of a crew notice: a one-line title and a plain-language text for a crew lead reading
 * a phone on site. The level written out, what is happening, the curing measures of the log
 * already in place and counted in the forecast, what to do now (the measures of the phase not
 * yet in place, _protectionAdvice.ts; with all of them in place: keep them going, check them and
 * call the site engineer), the key figures with units, the element and site, local times in the
 * run's own offset, and the caution every output carries (physics.md).
 */
import type { RunConfig } from '../config/runConfig.ts';
import { placedAtMs } from '../config/runConfig.ts';
import { CAUTION_TEXT } from '../live/caution.ts';
import type { MeasureEntry, RunState } from '../live/types.ts';
import { fixed2, formatDuration, localClock, localDateTime, offsetMinOf } from './_localTime.ts';
import { inPlaceSentence, kindsInPlaceAt } from './_measuresInPlace.ts';
import type { KindInPlace } from './_measuresInPlace.ts';
import { warningWording } from './_warningWording.ts';
import type { Wording } from './_warningWording.ts';
import type { NoticeDraft, NoticeFigures, NoticeKind } from './types.ts';

/** What a text needs besides the draft. */
export interface NoticeTextContext {
  config: RunConfig;
  /** Phase of the state the notice comes from. */
  phase: RunState['phase'];
  /** The alert options' dwell, min, for the easing text [30]. */
  dwellMin?: number;
  /**
   * The run's measure log as the engine had it for the state [none]. A warning names the
   * entries in place at the draft's time (raisedAtMs) and advises only what is not.
   */
  measures?: readonly MeasureEntry[];
}

/** Kinds of notice that ask for curing protection. */
const WARNING_KINDS: readonly NoticeKind[] = [
  'utilization',
  'margin-outlook',
  'evaporation-rate',
  'bleed-exceeded',
];

/** What each concern is called in an easing notice. */
function concernName(conditionKey: string): string {
  if (conditionKey === 'margin') return 'cracking warning';
  if (conditionKey === 'drying') return 'fast-drying warning';
  if (conditionKey.startsWith('data:')) return 'missing-data warning';
  return 'notice';
}

/**
 * Title and text of a notice.
 *
 * Title: `<LEVEL>: <what to do or what happened> - <when or the key figure>`. Text: paragraphs
 * for where and when, what is happening, the measures in place (warnings only, when the log has
 * any at the draft's time), what to do now, the figures, and the caution.
 */
export function noticeText(
  draft: NoticeDraft,
  context: NoticeTextContext,
): { title: string; text: string } {
  const { config } = context;
  const offset = offsetMinOf(config.placedAt);
  const phase = context.phase === 'hardening' ? 'hardening' : 'plastic';
  const where = `${config.name ?? `${config.element.kind}, ${config.element.thicknessMm} mm`} (site ${config.site})`;
  const sincePlacement = draft.raisedAtMs - placedAtMs(config);
  const when =
    `${localDateTime(draft.raisedAtMs, offset)}, ${formatDuration(sincePlacement)} after placement at ` +
    `${localClock(placedAtMs(config), offset)}, ${phase === 'plastic' ? 'before final set' : 'after final set'}.`;
  const warning = WARNING_KINDS.includes(draft.kind);
  // Measures only matter to a warning: the other notices ask for no protection.
  const inPlace = warning ? kindsInPlaceAt(context.measures ?? [], draft.raisedAtMs) : [];
  const logged = inPlaceSentence(inPlace, offset);
  const { headline, happening, todo } = wording(
    draft,
    phase,
    offset,
    context.dwellMin ?? 30,
    inPlace,
  );
  const title = `${draft.level}: ${headline}${draft.repeat ? ' (repeated: not yet acknowledged)' : ''}`;
  const paragraphs = [
    `${draft.level} - ${where}`,
    when,
    `What is happening: ${sentence(happening)}`,
    ...(logged === null ? [] : [logged]),
    `What to do now: ${sentence(todo)}`,
    `Figures: ${figureLine(draft.figures, offset, phase)}.`,
    CAUTION_TEXT,
  ];
  return { title, text: paragraphs.join('\n\n') };
}

/** Capital first letter, full stop at the end. */
function sentence(text: string): string {
  const trimmed = text.trim();
  const capital = trimmed.charAt(0).toUpperCase() + trimmed.slice(1);
  return /[.!?]$/.test(capital) ? capital : `${capital}.`;
}

function wording(
  draft: NoticeDraft,
  phase: 'plastic' | 'hardening',
  offset: number,
  dwellMin: number,
  inPlace: readonly KindInPlace[],
): Wording {
  const reasons = draft.reasons.join('; ');
  const closing = draft.figures.expectedClosingMs;
  const u = draft.figures.utilization;
  const against = phase === 'plastic' ? 'suction at' : 'stress at';
  const of = phase === 'plastic' ? 'of air entry' : 'of strength';
  const closesIn =
    draft.kind === 'utilization' && u !== null
      ? u >= 1
        ? ` - ${phase === 'plastic' ? 'suction has reached air entry' : 'stress has reached strength'}`
        : ` - ${against} ${Math.round(u * 100)} % ${of}`
      : closing === null
        ? ''
        : closing <= draft.raisedAtMs
          ? ' - the margin is closing now'
          : ` - margin closes at about ${localClock(closing, offset)}, in about ${formatDuration(closing - draft.raisedAtMs)}`;
  const drying =
    phase === 'plastic'
      ? 'the surface is drying faster than water reaches it from below'
      : 'the surface layer shrinks as it dries while the young concrete is still weak';
  switch (draft.kind) {
    case 'utilization':
    case 'margin-outlook':
    case 'evaporation-rate':
    case 'bleed-exceeded': {
      return warningWording(draft, phase, {
        happening: `${drying}: ${reasons}`,
        closesIn,
        inPlace,
      });
    }
    case 'sensor-silent':
      return {
        headline: `a sensor is silent - ${draft.conditionKey.slice('sensor:'.length)}`,
        happening: reasons,
        todo: 'check the device, its cables and its power. Until it reports again the figures lean on the other sensors',
      };
    case 'data-degraded':
      return {
        headline: 'figures rest on missing data',
        happening: reasons,
        todo: 'check the weather station and the probes; trust the figures less until the data is back',
      };
    case 'strength-reached':
      return {
        headline: 'estimated strength target reached',
        happening: reasons,
        todo: 'nothing urgent. Confirm the strength with field-cured specimens or in-place tests before stripping or loading',
      };
    case 'measure-logged':
      return {
        headline: `measure logged - ${draft.reasons[0] ?? ''}`,
        happening: reasons,
        todo: 'nothing; the outlook counts the measure from now on',
      };
    case 'eased': {
      const from = draft.eased?.from ?? 'NOTE';
      const to = draft.eased?.to ?? null;
      if (draft.conditionKey.startsWith('sensor:')) {
        const device = draft.conditionKey.slice('sensor:'.length);
        return {
          headline: `${device} is reporting again`,
          happening: `readings from ${device} have been arriving again for ${dwellMin} min`,
          todo: 'nothing',
        };
      }
      const name = concernName(draft.conditionKey);
      return {
        headline: `eased - the ${name} (${from}) has cleared${to === null ? '' : `; ${to} still holds`}`,
        happening:
          `what raised the ${from} ${name} has stayed below its threshold for ${dwellMin} min` +
          (to === null || reasons === '' ? '' : `. Still: ${reasons}`),
        todo: draft.conditionKey.startsWith('data:')
          ? 'nothing'
          : 'keep the measures in place until the site engineer decides; the watch goes on',
      };
    }
  }
}

function figureLine(
  figures: NoticeFigures,
  offset: number,
  phase: 'plastic' | 'hardening',
): string {
  const parts: string[] = [];
  const u = figures.utilization;
  if (u !== null) {
    const of =
      phase === 'plastic'
        ? 'surface suction over air-entry suction'
        : 'surface stress over tensile strength';
    parts.push(`utilization ${fixed2(u)} (${of}; 1 means cracking)`);
  }
  if (figures.marginMPa !== null) parts.push(`margin ${fixed2(figures.marginMPa)} MPa`);
  if (figures.evaporationKgM2h !== null)
    parts.push(`evaporation rate ${figures.evaporationKgM2h.toFixed(2)} kg/m2/h`);
  if (figures.expectedClosingMs !== null)
    parts.push(`margin expected to close at ${localClock(figures.expectedClosingMs, offset)}`);
  if (figures.probabilityCracking !== null)
    parts.push(
      `chance of the margin closing within the outlook: ${Math.round(figures.probabilityCracking * 100)} %`,
    );
  return parts.length === 0 ? 'none yet' : parts.join(', ');
}
