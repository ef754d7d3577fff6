/**
 * Utilization and margin, the one gauge of both phases (physics.md section 7), and its
 * classification against the thresholds.
 *
 * Units: SI, pressures and stresses in Pa (tension positive); utilization is dimensionless.
 */
import type { RiskPhase } from './riskPhase.ts';

/**
 * Plastic-phase utilization `U = (-p_surface) / p_crit`: the capillary suction at the surface
 * over the critical (air-entry) suction of the fresh mix.
 *
 * @param surfacePressurePa liquid pressure at the surface relative to the gas, Pa (<= 0 once
 *   menisci form; a positive pressure gives a negative U: no suction at all)
 * @param criticalSuctionPa critical suction, Pa (> 0): the Young-Laplace suction of the pore
 *   diameter at the 99th volume percentile of the fresh mix's pore-size distribution, or a
 *   measured critical suction (around 10 to 50 kPa in fresh concrete, from memory). The caller
 *   computes it.
 * @returns U; NaN when the critical suction is not a positive number or the pressure is NaN.
 * Source: physics.md 7 (air-entry criterion for plastic shrinkage cracking).
 */
export function plasticUtilization(surfacePressurePa: number, criticalSuctionPa: number): number {
  if (!(criticalSuctionPa > 0)) return Number.NaN;
  return -surfacePressurePa / criticalSuctionPa;
}

/** Hardening-phase figures. */
export interface HardeningUtilization {
  /** U = sigma_s / fct (negative when the surface is in compression). */
  readonly utilization: number;
  /** Margin fct - sigma_s, Pa (negative once stress exceeds strength). */
  readonly marginPa: number;
}

/**
 * Hardening-phase utilization `U = sigma_s / fct` and margin `fct - sigma_s`.
 *
 * @param surfaceStressPa surface stress, Pa, tension positive
 * @param tensileStrengthPa tensile strength at the surface's equivalent age, Pa (> 0)
 * @returns utilization NaN when the strength is not a positive number; margin follows IEEE
 *   arithmetic (NaN in, NaN out).
 * Source: physics.md 7; the cracking index of early-age thermal-cracking practice is 1 / U.
 */
export function hardeningUtilization(
  surfaceStressPa: number,
  tensileStrengthPa: number,
): HardeningUtilization {
  return {
    utilization: tensileStrengthPa > 0 ? surfaceStressPa / tensileStrengthPa : Number.NaN,
    marginPa: tensileStrengthPa - surfaceStressPa,
  };
}

/** Utilization thresholds; every field is dimensionless. */
export interface UtilizationThresholds {
  /**
   * First threshold. Default 0.57: a cracking index (strength over stress) of 1.75, which
   * cracking-index practice for early-age concrete asks for to prevent cracking (Japan Concrete
   * Institute guideline for control of cracking of mass concrete, value from memory).
   */
  readonly firstUtilization: number;
  /** Second threshold. Default 0.69: cracking index 1.45, to limit cracking (same source, from memory). */
  readonly secondUtilization: number;
  /** Cracking threshold. Default 1.0: stress equal to strength, harmful cracks expected (same source). */
  readonly crackingUtilization: number;
}

/** Defaults of {@link UtilizationThresholds}. */
export const DEFAULT_UTILIZATION_THRESHOLDS: UtilizationThresholds = {
  firstUtilization: 0.57,
  secondUtilization: 0.69,
  crackingUtilization: 1.0,
};

/** Where a utilization stands against the thresholds. */
export type UtilizationState =
  | 'below-first-threshold'
  | 'first-threshold-reached'
  | 'second-threshold-reached'
  | 'cracking-threshold-reached'
  | 'unknown';

/**
 * Classifies a utilization: a threshold counts as reached when U is at or above it.
 *
 * @param utilization U (dimensionless); NaN gives `unknown`
 * @param thresholds see {@link UtilizationThresholds}; assumed ordered (check configuration with
 *   {@link checkUtilizationThresholds})
 * Source: physics.md 7.
 */
export function classifyUtilization(
  utilization: number,
  thresholds: UtilizationThresholds = DEFAULT_UTILIZATION_THRESHOLDS,
): UtilizationState {
  if (Number.isNaN(utilization)) return 'unknown';
  if (utilization >= thresholds.crackingUtilization) return 'cracking-threshold-reached';
  if (utilization >= thresholds.secondUtilization) return 'second-threshold-reached';
  if (utilization >= thresholds.firstUtilization) return 'first-threshold-reached';
  return 'below-first-threshold';
}

/**
 * Edge check of configured thresholds: each must be a finite number above 0, and
 * first < second < cracking.
 *
 * @returns one message per broken rule, naming the field, the rule and the value; empty if valid.
 */
export function checkUtilizationThresholds(thresholds: UtilizationThresholds): string[] {
  const messages: string[] = [];
  const fields = ['firstUtilization', 'secondUtilization', 'crackingUtilization'] as const;
  for (const field of fields) {
    const value = thresholds[field];
    if (!(Number.isFinite(value) && value > 0)) {
      messages.push(`thresholds ${field} must be a finite number above 0: got ${value}`);
    }
  }
  if (!(thresholds.firstUtilization < thresholds.secondUtilization)) {
    messages.push(
      `thresholds secondUtilization must be above firstUtilization (${thresholds.firstUtilization}): got ${thresholds.secondUtilization}`,
    );
  }
  if (!(thresholds.secondUtilization < thresholds.crackingUtilization)) {
    messages.push(
      `thresholds crackingUtilization must be above secondUtilization (${thresholds.secondUtilization}): got ${thresholds.crackingUtilization}`,
    );
  }
  return messages;
}

/** Inputs of {@link riskFigures}, by phase. */
export type RiskInput =
  | {
      readonly phase: 'plastic';
      readonly surfacePressurePa: number;
      readonly criticalSuctionPa: number;
    }
  | {
      readonly phase: 'hardening';
      readonly surfaceStressPa: number;
      readonly tensileStrengthPa: number;
    };

/** Risk figures of one moment, always with their phase. */
export interface RiskFigures {
  readonly phase: RiskPhase;
  readonly utilization: number;
  /** fct - sigma_s, Pa, in the hardening phase; NaN in the plastic phase (no strength to speak of). */
  readonly marginPa: number;
  readonly state: UtilizationState;
}

/**
 * Utilization, margin and state for either phase.
 *
 * @param input the phase and its quantities (see {@link plasticUtilization},
 *   {@link hardeningUtilization})
 * @param thresholds see {@link UtilizationThresholds}
 * Source: physics.md 7.
 */
export function riskFigures(
  input: RiskInput,
  thresholds: UtilizationThresholds = DEFAULT_UTILIZATION_THRESHOLDS,
): RiskFigures {
  const { utilization, marginPa } =
    input.phase === 'plastic'
      ? {
          utilization: plasticUtilization(input.surfacePressurePa, input.criticalSuctionPa),
          marginPa: Number.NaN,
        }
      : hardeningUtilization(input.surfaceStressPa, input.tensileStrengthPa);
  return {
    phase: input.phase,
    utilization,
    marginPa,
    state: classifyUtilization(utilization, thresholds),
  };
}
