/**
 * Washburn equation of mercury intrusion porosimetry: the pore diameter entered at an intrusion
 * pressure, D = -4 gamma_Hg cos(theta_Hg) / P.
 * Source: Washburn (1921), Physical Review 17(3); ASTM D4404-18 and ISO 15901-1:2016, which give
 * gamma_Hg = 0.485 N/m and theta_Hg = 130 deg as the usual values when the data states none.
 */

/** Surface tension of mercury assumed by ASTM D4404 / ISO 15901-1 when none is stated, N/m. */
export const MERCURY_SURFACE_TENSION_N_PER_M = 0.485;

/** Contact angle of mercury on the solid assumed by ASTM D4404 / ISO 15901-1, rad (130 deg). */
export const MERCURY_CONTACT_ANGLE_RAD = (130 * Math.PI) / 180;

/**
 * Pore diameter (m) entered by mercury at intrusion pressure P (Pa, gauge, > 0):
 * D = -4 gamma cos(theta) / P. With theta > 90 deg the cosine is negative, so D > 0.
 *
 * @param intrusionPressurePa P in Pa, > 0; P <= 0 or NaN gives NaN.
 * @param surfaceTensionNPerM gamma_Hg, default 0.485 N/m.
 * @param contactAngleRad theta_Hg, default 130 deg.
 */
export function washburnDiameterM(
  intrusionPressurePa: number,
  surfaceTensionNPerM = MERCURY_SURFACE_TENSION_N_PER_M,
  contactAngleRad = MERCURY_CONTACT_ANGLE_RAD,
): number {
  if (!(intrusionPressurePa > 0)) return Number.NaN;
  return (-4 * surfaceTensionNPerM * Math.cos(contactAngleRad)) / intrusionPressurePa;
}
