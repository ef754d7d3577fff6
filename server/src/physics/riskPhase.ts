/**
 * The phase a risk figure belongs to (physics.md section 7): `plastic` from placement to final
 * set, where cracking follows capillary suction at the surface, and `hardening` after final set,
 * where drying stress is compared with the growing tensile strength. The phase is always
 * reported with the figures.
 */
import { DEFAULT_SETTING_SHIFT_OPTIONS } from './strengthDevelopment.ts';

/** `plastic` before final set, `hardening` after it. */
export type RiskPhase = 'plastic' | 'hardening';

/**
 * Phase at an equivalent age: `hardening` once the equivalent age is past final set, otherwise
 * `plastic`.
 *
 * @param equivalentAgeDays equivalent age since placement at 20 degC, days
 * @param finalSetEquivalentAgeDays equivalent age at final set, days; default 0.25 d (6 h at
 *   20 degC, from memory: about 4 to 8 h for ordinary mixes; see SettingShiftOptions)
 * @returns `hardening` when age > final set (matching `inPlaceStrength().hasSet`); a NaN age or
 *   final set gives `plastic`, the phase that does not credit the mix with strength.
 * Source: physics.md 7 after ASTM C403 (final set as the end of the plastic state).
 */
export function riskPhase(
  equivalentAgeDays: number,
  finalSetEquivalentAgeDays: number = DEFAULT_SETTING_SHIFT_OPTIONS.finalSetEquivalentAgeDays,
): RiskPhase {
  return equivalentAgeDays > finalSetEquivalentAgeDays ? 'hardening' : 'plastic';
}
