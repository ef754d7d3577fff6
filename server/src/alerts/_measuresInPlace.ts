/**
 * The curing measures of the measure log that are in place at a notice's time, and the sentence
 * that tells the crew lead they are logged and counted. A warning repeated after the crew acted
 * must show that the forecast saw what they did, or it reads as if the system had not.
 */
import type { MeasureEntry, MeasureKind } from '../live/types.ts';
import { localClock } from './_localTime.ts';

/** Words for a kind the engine applies (terms of the trade, vocabulary.md). */
interface KindWords {
  /** In the logged sentence: `fogging`, `a windbreak`. */
  name: string;
  /** After "keep": `the fogging`. */
  the: string;
  /** How the crew checks it works, a clause. */
  check: string;
}

const KIND_WORDS: Record<MeasureKind, KindWords> = {
  fogging: {
    name: 'fogging',
    the: 'the fogging',
    check: 'the fog reaches the surface as a fine mist, with no water standing on it',
  },
  windbreak: {
    name: 'a windbreak',
    the: 'the windbreak',
    check: 'the windbreak stands on the windward side',
  },
  'wet-covering': {
    name: 'wet covering',
    the: 'the wet covering',
    check: 'the covering stays wet and held down at its edges',
  },
  ponding: {
    name: 'ponding',
    the: 'the ponding',
    check: 'the water stays over the whole surface',
  },
  'curing-compound': {
    name: 'a curing compound',
    the: 'the curing compound',
    check: 'the curing compound covers the whole surface without gaps',
  },
};

/** Words for several entries of a kind at once, where they differ from one entry's. */
const SEVERAL_WORDS: Partial<Record<MeasureKind, KindWords>> = {
  windbreak: {
    name: 'windbreaks',
    the: 'the windbreaks',
    check: 'the windbreaks stand on the windward side',
  },
};

/** Kinds in the order the text names them when they start at the same time. */
const KIND_ORDER = Object.keys(KIND_WORDS) as MeasureKind[];

/** One kind of measure in place: its entries taken together. */
export interface KindInPlace {
  kind: MeasureKind;
  /** Entries of the kind in place. */
  count: number;
  /** Earliest start of those entries, ms since the epoch. */
  sinceMs: number;
  /** Latest logged end when every entry has one (the forecast counts it), else null. */
  untilMs: number | null;
}

/**
 * The kinds of measure in place at `timeMs`: entries with `startMs <= timeMs < endMs` (an open
 * end counts as still in place), the rule the engine applies (curingMeasuresActiveAt,
 * server/src/physics/curingMeasures.ts). Entries of a kind the engine does not apply are left
 * out, since the forecast does not count them. Ordered by start, then by KIND_ORDER.
 *
 * @param measures - the measure log as the engine had it for the state
 * @param timeMs - the notice's event time, ms since the epoch
 */
export function kindsInPlaceAt(measures: readonly MeasureEntry[], timeMs: number): KindInPlace[] {
  const byKind = new Map<MeasureKind, KindInPlace>();
  for (const entry of measures) {
    if (!isKnownKind(entry.kind)) continue;
    if (entry.startMs > timeMs || (entry.endMs !== null && timeMs >= entry.endMs)) continue;
    const known = byKind.get(entry.kind);
    if (known === undefined) {
      byKind.set(entry.kind, {
        kind: entry.kind,
        count: 1,
        sinceMs: entry.startMs,
        untilMs: entry.endMs,
      });
      continue;
    }
    known.count += 1;
    known.sinceMs = Math.min(known.sinceMs, entry.startMs);
    known.untilMs =
      known.untilMs === null || entry.endMs === null ? null : Math.max(known.untilMs, entry.endMs);
  }
  return [...byKind.values()].sort(
    (a, b) => a.sinceMs - b.sinceMs || KIND_ORDER.indexOf(a.kind) - KIND_ORDER.indexOf(b.kind),
  );
}

/**
 * `Fogging and a windbreak are logged since 12:50 and are counted in this forecast.` When the
 * starts differ or an end is logged, each is given its own: `Fogging (since 12:50, to end at
 * 18:00) and a windbreak (since 13:00) are logged and counted in this forecast.` Null when
 * nothing is in place.
 *
 * @param offsetMin - the run's UTC offset, min (local clock times)
 */
export function inPlaceSentence(inPlace: readonly KindInPlace[], offsetMin: number): string | null {
  const first = inPlace[0];
  if (first === undefined) return null;
  const plural = inPlace.length > 1 || (first.count > 1 && SEVERAL_WORDS[first.kind] !== undefined);
  const are = plural ? 'are' : 'is';
  const shared = inPlace.every((item) => item.sinceMs === first.sinceMs && item.untilMs === null);
  if (shared) {
    const names = listOf(inPlace.map((item) => wordsOf(item).name));
    return `${capital(names)} ${are} logged since ${localClock(first.sinceMs, offsetMin)} and ${are} counted in this forecast.`;
  }
  const names = listOf(
    inPlace.map(
      (item) =>
        `${wordsOf(item).name} (since ${localClock(item.sinceMs, offsetMin)}` +
        (item.untilMs === null ? ')' : `, to end at ${localClock(item.untilMs, offsetMin)})`),
    ),
  );
  return `${capital(names)} ${are} logged and counted in this forecast.`;
}

/** `keep the fogging and the windbreak going`. */
export function keepGoing(inPlace: readonly KindInPlace[]): string {
  return `keep ${listOf(inPlace.map((item) => wordsOf(item).the))} going`;
}

/** `the fog reaches the surface ...; the windbreak stands on the windward side`. */
export function checks(inPlace: readonly KindInPlace[]): string {
  return inPlace.map((item) => wordsOf(item).check).join('; ');
}

function isKnownKind(kind: string): kind is MeasureKind {
  return Object.hasOwn(KIND_WORDS, kind);
}

function wordsOf(item: KindInPlace): KindWords {
  return (item.count > 1 ? SEVERAL_WORDS[item.kind] : undefined) ?? KIND_WORDS[item.kind];
}

/** `a`, `a and b`, `a, b and c` (British English: no comma before "and"). */
const conjunction = new Intl.ListFormat('en-GB', { style: 'long', type: 'conjunction' });
function listOf(items: readonly string[]): string {
  return conjunction.format(items);
}

function capital(text: string): string {
  return text.charAt(0).toUpperCase() + text.slice(1);
}
