/**
 * The stress-free reference of the hardening-phase drying stress (physics.md sections 5 and 7).
 *
 * A fresh mix flows and relaxes any stress until it sets; its risk before final set is the
 * plastic criterion (surface suction against the air-entry value). Counting strains from a
 * stress-free state at final set is common practice in early-age stress analysis (as the
 * zero-stress temperature at final set in early-age thermal cracking). With the `final-set`
 * reference the model records the equivalent pore pressure profile pi_set(x) at the moment the
 * SURFACE reaches final set, and the stress afterwards is the drying-stress function of physics.md
 * section 5 applied to pi(x) - pi_set(x) (exact for the increment: the function is linear in pi).
 *
 * One instant for the whole profile, the surface's final set, rather than each depth's own: the
 * phase of the risk figures switches on the surface's equivalent age (physics.md 7), so the
 * stress is zero exactly when the hardening-phase utilization starts; and the plate model of
 * section 5 gives every layer the same stiffness, so it cannot represent set and unset layers
 * side by side. The depths of a thin element set within a short time of one another (our
 * assumption; a surface that dries early may set last, since drying slows its hydration).
 */
import { riskPhase } from '../physics/riskPhase.ts';
import { SECONDS_PER_DAY } from '../physics/units.ts';
import type { ElementMaterial } from './elementMaterial.ts';

/**
 * Where the drying stress is counted from:
 * - `final-set`: the profile at the surface's final set (default; common practice, see above);
 *   before final set the stress is zero (the mix flows).
 * - `placement`: the saturated profile at placement, pi = 0 (the model's behaviour before the
 *   option existed; it counts the suction built while the mix was a suspension).
 */
export type StressReference = 'final-set' | 'placement';

/** The stress references, in the order the CLI lists them. */
export const STRESS_REFERENCES: readonly StressReference[] = ['final-set', 'placement'];

/** Default stress reference: `final-set` (common practice in early-age stress analysis). */
export const DEFAULT_STRESS_REFERENCE: StressReference = 'final-set';

/**
 * True once the surface of the element has reached final set: its equivalent age is past the
 * mix's final set (the same test as the risk phase, `riskPhase`). A material without a mix (stone,
 * earthen plaster) carries stress from placement: always true.
 *
 * @param material the element material
 * @param surfaceEquivalentAgeS equivalent age of the surface cell, s; NaN gives false
 */
export function surfaceHasSet(material: ElementMaterial, surfaceEquivalentAgeS: number): boolean {
  const mix = material.mix;
  if (mix === undefined) return true;
  return (
    riskPhase(surfaceEquivalentAgeS / SECONDS_PER_DAY, mix.setting.finalSetEquivalentAgeDays) ===
    'hardening'
  );
}
