/**
 * Young-Laplace equation for a cylindrical pore with a hemispherical meniscus.
 *
 * The pressure jump across a meniscus of radius r is 2 gamma cos(theta) / r, so for a pore of
 * diameter D the liquid pressure relative to the gas is p = -4 gamma cos(theta) / D.
 * Source: Young (1805), Laplace (1806); in the cylindrical-pore form used by mercury porosimetry,
 * Washburn (1921), Physical Review 17(3). See physics.md section 2.
 */

/**
 * Liquid pressure p (Pa, negative: suction) in equilibrium with a meniscus that spans a pore of
 * diameter `diameterM`: p = -4 gamma cos(theta) / D.
 *
 * @param diameterM pore diameter D in m, > 0. D -> 0 gives -Infinity; D <= 0 or NaN gives NaN.
 * @param surfaceTensionNPerM gamma in N/m (water at 20 degC: 0.07275, IAPWS R1-76(2014)).
 * @param contactAngleRad theta in rad, default 0 (perfect wetting of cement paste by pore water,
 *   our assumption following common practice).
 */
export function youngLaplacePressurePa(
  diameterM: number,
  surfaceTensionNPerM: number,
  contactAngleRad = 0,
): number {
  if (!(diameterM > 0)) return Number.NaN;
  return (-4 * surfaceTensionNPerM * Math.cos(contactAngleRad)) / diameterM;
}

/**
 * Widest pore diameter D* (m) that stays filled at liquid pressure p (Pa): D* = 4 gamma cos(theta) / (-p).
 * Drainage empties pores wider than D* first (physics.md section 2).
 *
 * @param liquidPressurePa p in Pa; p >= 0 returns +Infinity (every pore stays full), NaN gives NaN.
 * @param surfaceTensionNPerM gamma in N/m.
 * @param contactAngleRad theta in rad, default 0.
 */
export function youngLaplaceDiameterM(
  liquidPressurePa: number,
  surfaceTensionNPerM: number,
  contactAngleRad = 0,
): number {
  if (Number.isNaN(liquidPressurePa)) return Number.NaN;
  if (liquidPressurePa >= 0) return Number.POSITIVE_INFINITY;
  return (4 * surfaceTensionNPerM * Math.cos(contactAngleRad)) / -liquidPressurePa;
}
