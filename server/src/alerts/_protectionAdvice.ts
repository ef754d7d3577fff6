/**
 * What protection a warning asks for, given the phase and the measures already in place: the
 * measures of the phase (common practice, e.g. ACI 308R, ACI 305R) that are not yet in place,
 * never an active one as new advice. Before final set: fogging, windbreaks and shade; with fogging
 * and a windbreak in place, shade and then a covering held clear of the fresh surface or a higher
 * fog rate. After final set: wet covering or a curing compound, windbreaks and shade.
 *
 * A covering (wet covering, ponding, a curing compound) takes the place of fogging: the surface
 * under it loses no water to the air, so fog above it adds nothing. Shade is not a kind of the
 * measure log, so the text cannot know it is up and asks for it "if it is not shaded yet".
 */
import type { MeasureKind } from '../live/types.ts';

/** Every measure of the phase with none in place (the wording before the log was read). */
const ALL_MEASURES: Record<'plastic' | 'hardening', string> = {
  plastic:
    'fog the air just above the surface (a fine mist; do not work water into the surface), put up windbreaks on the windward side, shade the surface from the sun',
  hardening:
    'cover the surface with wet burlap or plastic sheeting and keep it wet, or spray a curing compound; keep windbreaks and shade up',
};

const FOG = 'fog the air just above the surface (a fine mist; do not work water into the surface)';
const WINDBREAK = 'put up windbreaks on the windward side';
const SHADE = 'shade the surface from the sun if it is not shaded yet';
const COVER_CLEAR =
  'cover the surface with plastic sheeting held clear of it on a frame (the sheet must not touch the fresh surface)';
const RAISE_FOG = 'raise the fog rate, keeping it a fine mist';
const COVER_WET =
  'cover the surface with wet burlap or plastic sheeting and keep it wet, or spray a curing compound';

/** Kinds that keep the surface from losing water to the air (physics.md 4). */
const COVERING_KINDS: readonly MeasureKind[] = ['wet-covering', 'ponding', 'curing-compound'];

/**
 * The protection still to apply, as a clause to follow "now," or "get people and material ready
 * to"; null when every measure of the phase is in place (a covering and a windbreak), and
 * the crew can only keep them going, check them and call the site engineer.
 *
 * @param phase - the state's phase (before final set: `plastic`)
 * @param inPlace - kinds of measure in place at the notice's time
 */
export function protectionToAdd(
  phase: 'plastic' | 'hardening',
  inPlace: ReadonlySet<MeasureKind>,
): string | null {
  if (inPlace.size === 0) return ALL_MEASURES[phase];
  const covered = COVERING_KINDS.some((kind) => inPlace.has(kind));
  const sheltered = inPlace.has('windbreak');
  if (covered && sheltered) return null;
  if (phase === 'hardening') {
    const shelter = sheltered ? SHADE : `${WINDBREAK} and ${SHADE}`;
    return covered ? shelter : `${COVER_WET}; ${shelter}`;
  }
  if (inPlace.has('fogging') && sheltered)
    return `${SHADE}, then ${COVER_CLEAR} or, where it cannot be covered, ${RAISE_FOG}`;
  const steps = [
    ...(covered || inPlace.has('fogging') ? [] : [FOG]),
    ...(sheltered ? [] : [WINDBREAK]),
    SHADE,
  ];
  return steps.join(', ');
}
