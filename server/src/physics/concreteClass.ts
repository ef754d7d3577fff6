/**
 * Concrete strength classes of EN 1992-1-1:2004 Table 3.1 and the formulas the table is built on.
 *
 * Units: strengths in MPa and moduli in GPa, as the code defines its formulas, with the unit in
 * every name (`fckMPa`, `ecmGPa`). Convert to Pa at the caller when feeding SI models.
 */

/** The fourteen classes of EN 1992-1-1 Table 3.1: characteristic cylinder / cube strength, MPa. */
const TABLE_3_1_CLASSES = [
  [12, 15],
  [16, 20],
  [20, 25],
  [25, 30],
  [30, 37],
  [35, 45],
  [40, 50],
  [45, 55],
  [50, 60],
  [55, 67],
  [60, 75],
  [70, 85],
  [80, 95],
  [90, 105],
] as const;

/** Names of the strength classes, e.g. `C30/37`, lowest first. */
export const CONCRETE_CLASS_NAMES: readonly string[] = TABLE_3_1_CLASSES.map(
  ([cylinder, cube]) => `C${cylinder}/${cube}`,
);

/** Properties of one EN 1992-1-1 strength class at 28 days. */
export interface ConcreteClassProperties {
  /** Class name as written in EN 206 / EN 1992-1-1, e.g. `C30/37`. */
  readonly name: string;
  /** Characteristic cylinder compressive strength at 28 days, MPa. */
  readonly fckMPa: number;
  /** Characteristic cube compressive strength at 28 days, MPa. */
  readonly fckCubeMPa: number;
  /** Mean cylinder compressive strength at 28 days, MPa (fck + 8 MPa). */
  readonly fcmMPa: number;
  /** Mean axial tensile strength at 28 days, MPa (unrounded formula value). */
  readonly fctmMPa: number;
  /** 5 % fractile of the axial tensile strength, MPa (0.7 fctm). */
  readonly fctk005MPa: number;
  /** 95 % fractile of the axial tensile strength, MPa (1.3 fctm). */
  readonly fctk095MPa: number;
  /** Secant modulus of elasticity at 28 days, GPa (unrounded formula value). */
  readonly ecmGPa: number;
}

/**
 * Raised when a text does not name a strength class of EN 1992-1-1 Table 3.1. Carries the field
 * name and the value received so an edge (CLI flag, configuration) can report them.
 */
export class UnknownConcreteClassError extends Error {
  readonly field: string;
  readonly received: string;

  constructor(field: string, received: string) {
    super(
      `${field} must be one of ${CONCRETE_CLASS_NAMES.join(', ')} (EN 1992-1-1 Table 3.1): ` +
        `got ${JSON.stringify(received)}`,
    );
    this.name = 'UnknownConcreteClassError';
    this.field = field;
    this.received = received;
  }
}

/**
 * Mean cylinder compressive strength at 28 days: `fcm = fck + 8` (MPa).
 *
 * @param fckMPa characteristic cylinder strength, MPa (any real; NaN gives NaN)
 * @returns fcm in MPa
 * Source: EN 1992-1-1:2004 Table 3.1; fib Model Code 2010 eq. 5.1-1 (delta f = 8 MPa).
 */
export function meanCompressiveStrengthMPa(fckMPa: number): number {
  return fckMPa + 8;
}

/**
 * Mean axial tensile strength at 28 days.
 *
 * `fctm = 0.30 fck^(2/3)` for fck <= 50 MPa (up to C50/60), and
 * `fctm = 2.12 ln(1 + fcm / 10)` above, with `fcm = fck + 8` (all MPa).
 *
 * @param fckMPa characteristic cylinder strength, MPa; meaningful from about 12 to 90 MPa
 * @returns fctm in MPa; 0 for fck = 0; NaN for negative fck or NaN
 * Source: EN 1992-1-1:2004 Table 3.1 (same expressions in fib Model Code 2010 eq. 5.1-3a/b).
 */
export function meanTensileStrengthMPa(fckMPa: number): number {
  if (!(fckMPa >= 0)) return Number.NaN;
  if (fckMPa <= 50) return 0.3 * Math.cbrt(fckMPa * fckMPa);
  return 2.12 * Math.log(1 + meanCompressiveStrengthMPa(fckMPa) / 10);
}

/**
 * Secant modulus of elasticity at 28 days: `Ecm = 22 (fcm / 10)^0.3` (GPa, fcm in MPa), for
 * quartzite aggregates (EN 1992-1-1 3.1.3(2): reduce by 10 % for limestone, 30 % for sandstone,
 * raise by 20 % for basalt).
 *
 * @param fcmMPa mean cylinder compressive strength, MPa (>= 0; negative or NaN gives NaN)
 * @returns Ecm in GPa
 * Source: EN 1992-1-1:2004 Table 3.1.
 */
export function secantModulusGPa(fcmMPa: number): number {
  if (!(fcmMPa >= 0)) return Number.NaN;
  return 22 * Math.pow(fcmMPa / 10, 0.3);
}

/**
 * Properties of a concrete with characteristic cylinder strength `fckMPa`, from the formulas of
 * EN 1992-1-1 Table 3.1. `fckCubeMPa` is NaN unless `fckMPa` is one of the tabulated classes.
 *
 * @param fckMPa characteristic cylinder strength, MPa
 * Source: EN 1992-1-1:2004 Table 3.1 (fctk,0.05 = 0.7 fctm, fctk,0.95 = 1.3 fctm).
 */
export function concretePropertiesFromFck(fckMPa: number): ConcreteClassProperties {
  const row = TABLE_3_1_CLASSES.find(([cylinder]) => cylinder === fckMPa);
  const fctmMPa = meanTensileStrengthMPa(fckMPa);
  const fcmMPa = meanCompressiveStrengthMPa(fckMPa);
  return {
    name: row === undefined ? `fck ${fckMPa} MPa` : `C${row[0]}/${row[1]}`,
    fckMPa,
    fckCubeMPa: row === undefined ? Number.NaN : row[1],
    fcmMPa,
    fctmMPa,
    fctk005MPa: 0.7 * fctmMPa,
    fctk095MPa: 1.3 * fctmMPa,
    ecmGPa: secantModulusGPa(fcmMPa),
  };
}

/**
 * Parses a strength class name such as `C30/37` (case and surrounding spaces ignored) into its
 * EN 1992-1-1 Table 3.1 properties. An edge function: it throws for unknown names.
 *
 * @param text the class as typed, e.g. `C30/37` or `c30/37`
 * @param field name of the input for the error message (default `concrete class`)
 * @throws UnknownConcreteClassError when the text is not one of C12/15 .. C90/105
 * Source: EN 1992-1-1:2004 Table 3.1; class notation of EN 206.
 */
export function parseConcreteClass(
  text: string,
  field = 'concrete class',
): ConcreteClassProperties {
  const match = /^C(\d{2})\/(\d{2,3})$/.exec(text.trim().toUpperCase());
  const row =
    match === null
      ? undefined
      : TABLE_3_1_CLASSES.find(
          ([cylinder, cube]) => cylinder === Number(match[1]) && cube === Number(match[2]),
        );
  if (row === undefined) throw new UnknownConcreteClassError(field, text);
  return concretePropertiesFromFck(row[0]);
}
