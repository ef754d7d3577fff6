/**
 * Headline, cause and advice of a warning (PREPARE, ACT NOW, CRACKING LIKELY on the margin or
 * the drying), given the measures already in place: with none, every measure of the phase; with
 * some, only those not in place, and to keep the others going; with all of them, to keep them
 * going, check they work and call the site engineer, so a repeated warning never reads as if
 * the crew's measures had gone unseen.
 */
import { checks, keepGoing } from './_measuresInPlace.ts';
import type { KindInPlace } from './_measuresInPlace.ts';
import { protectionToAdd } from './_protectionAdvice.ts';
import type { NoticeDraft } from './types.ts';

/** The parts of a notice that depend on its kind. */
export interface Wording {
  /** Title after the level. */
  headline: string;
  /** What is happening, a clause. */
  happening: string;
  /** What to do now, a clause or sentences (the text ends it with a full stop). */
  todo: string;
}

/** What the warning's wording is built from. */
export interface WarningFacts {
  /** What is happening, with the rules' reasons. */
  happening: string;
  /** ` - margin closes at about 13:30, ...` for the headline, or ''. */
  closesIn: string;
  /** Kinds of measure in place at the draft's time (kindsInPlaceAt), possibly none. */
  inPlace: readonly KindInPlace[];
}

/**
 * Wording of a warning draft.
 *
 * @param draft - a draft of kind utilization, margin-outlook, evaporation-rate or bleed-exceeded
 * @param phase - before final set `plastic`, after it `hardening`
 */
export function warningWording(
  draft: NoticeDraft,
  phase: 'plastic' | 'hardening',
  facts: WarningFacts,
): Wording {
  const { happening, closesIn, inPlace } = facts;
  const toAdd = protectionToAdd(phase, new Set(inPlace.map((item) => item.kind)));
  const acted = inPlace.length > 0;
  const keep = acted ? ` ${capital(keepGoing(inPlace))}.` : '';
  const logEach = `Log each ${acted ? 'new ' : ''}measure in Meniscus`;
  const acknowledge = 'acknowledge this notice there, or it is repeated';
  // Every measure of the phase is in place and the warning still holds: more of the same would
  // not help, a failing measure or a decision of the engineer might.
  const allInPlace =
    `${keepGoing(inPlace)} and check they are working: ${checks(inPlace)}. Call the site ` +
    'engineer: every measure these notices ask for is in place and the warning still holds';
  if (draft.level === 'CRACKING LIKELY') {
    return toAdd === null
      ? {
          headline: `check the protection at once and call the site engineer${closesIn}`,
          happening,
          todo: `at once, ${allInPlace}. Check the surface for fine cracks. Log any change of measure in Meniscus and ${acknowledge}`,
        }
      : {
          headline: `protect the surface at once${closesIn}`,
          happening,
          todo: `at once, ${toAdd}.${keep} Check the surface for fine cracks and tell the site engineer. ${logEach} and ${acknowledge}`,
        };
  }
  if (draft.level === 'ACT NOW') {
    return toAdd === null
      ? {
          headline: `check the curing protection and call the site engineer${closesIn}`,
          happening,
          todo: `now, ${allInPlace}. Log any change of measure in Meniscus and ${acknowledge}`,
        }
      : {
          headline: `${acted ? 'add' : 'apply'} curing protection${closesIn}`,
          happening,
          todo: `now, ${toAdd}.${keep} ${logEach} so the outlook counts it, and ${acknowledge}`,
        };
  }
  const dryingOnly = draft.kind === 'evaporation-rate' || draft.kind === 'bleed-exceeded';
  const ready = toAdd === null ? 'check the' : acted ? 'get more' : 'get';
  const suffix = toAdd === null ? '' : ' ready';
  return {
    headline: dryingOnly
      ? `${ready} protection${suffix} - ${draft.kind === 'evaporation-rate' ? 'evaporation rate high' : 'bleed water running out'}`
      : `${ready} curing protection${suffix}${draft.figures.expectedClosingMs === null ? ' - the outlook shows the margin closing' : closesIn}`,
    happening,
    todo: toAdd === null ? allInPlace : `get people and material ready to ${toAdd}.${keep}`,
  };
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
