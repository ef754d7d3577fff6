/**
 * The stress-free reference of the hardening-phase drying stress (physics.md sections 5 and 7).
 *
 * A fresh mix flows and relaxes any stress until it sets; its risk before final set is the
 * plastic criterion (surface suction against the air-entry value). Counting strains from a
 * stress-free state at final set is common practice in early-age stress analysis (as the
 * zero-stress temperature at final set in early-age thermal cracking). With the `final-set`
 * reference the model records the equivalent pore pressure profile pi_set(x) at the moment the
 * ELEMENT reaches final set, and the stress afterwards is the drying-stress function of physics.md
 * section 5 applied to pi(x) - pi_set(x) (exact for the increment: the function is linear in pi).
 *
 * When the element sets: when the equivalent age at a representative depth of its bulk passes
 * the mix's final set (see {@link settingCellIndex}; default mid-depth). ASTM C403 times setting
 * by penetration of mortar sieved from the bulk of the mix, kept in a container: the setting of
 * the mass, not of a surface skin. Following the surface's own age instead made an element whose
 * surface dried early "never set", since drying slows hydration (physics.md 6); the skin then
 * keeps its own low equivalent age, so its strength (each depth follows its own age) stays at the
 * floor of the setting-shifted law while the bulk around it has set.
 *
 * One instant for the whole profile rather than each depth's own: the phase of the risk figures
 * switches at the element's set (physics.md 7), so the stress is zero exactly when the
 * hardening-phase utilization starts; and the plate model of section 5 gives every layer the same
 * stiffness, so it cannot represent set and unset layers side by side (our assumption).
 */
import { riskPhase } from '../physics/riskPhase.ts';
import { SECONDS_PER_DAY } from '../physics/units.ts';
import type { ElementMaterial } from './elementMaterial.ts';

/**
 * Where the drying stress is counted from:
 * - `final-set`: the profile at the element's final set (default; common practice, see above);
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
 * True once an equivalent age is past the mix's final set (the same test as the risk phase,
 * `riskPhase`). A material without a mix (stone, earthen plaster) carries stress from placement:
 * always true.
 *
 * @param material the element material
 * @param equivalentAgeS equivalent age at the setting depth ({@link settingCellIndex}), s; NaN
 *   gives false
 */
export function hasReachedFinalSet(material: ElementMaterial, equivalentAgeS: number): boolean {
  const mix = material.mix;
  if (mix === undefined) return true;
  return (
    riskPhase(equivalentAgeS / SECONDS_PER_DAY, mix.setting.finalSetEquivalentAgeDays) ===
    'hardening'
  );
}

/**
 * Default setting depth: half the element's thickness below the exposed surface, m (our
 * assumption: the middle of the bulk; for two-face drying this is the symmetry plane).
 */
export function defaultSettingDepthM(thicknessM: number): number {
  return 0.5 * thicknessM;
}

/**
 * The cell whose equivalent age decides when the element sets: the cell centre nearest to
 * `settingDepthM` below the exposed surface, clamped to the grid (a depth beyond the modelled
 * domain, e.g. past the symmetry plane of two-face drying, gives the deepest cell).
 *
 * @param centresM cell-centre depths, m, increasing from the surface
 * @param settingDepthM depth, m (>= 0)
 * @throws RangeError when `settingDepthM` is negative or not a finite number
 */
export function settingCellIndex(centresM: Float64Array, settingDepthM: number): number {
  if (!(Number.isFinite(settingDepthM) && settingDepthM >= 0)) {
    throw new RangeError(
      `settingDepthM must be a finite depth of 0 m or more: got ${String(settingDepthM)}`,
    );
  }
  let nearest = 0;
  for (let i = 1; i < centresM.length; i += 1) {
    const distance = Math.abs((centresM[i] as number) - settingDepthM);
    if (distance < Math.abs((centresM[nearest] as number) - settingDepthM)) nearest = i;
  }
  return nearest;
}
