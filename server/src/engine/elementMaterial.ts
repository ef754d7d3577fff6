/**
 * Turns a validated material preset into the SI quantities the element model uses: pore-size
 * distributions in metres, hydration and strength laws, the pore-refinement exponent, setting,
 * bleeding and the critical suction of the plastic phase.
 */
import { parseConcreteClass } from '../physics/concreteClass.ts';
import {
  millsUltimateDegreeOfHydration,
  powersCapillaryPorosity,
  schindlerFolliardDegreeOfHydration,
  type SchindlerFolliardParameters,
} from '../physics/hydration.ts';
import {
  poreDiameterAtFractionM,
  poreDiameterAtPercentileM,
} from '../physics/poreSizeDistribution.ts';
import type { PoreSizeDistribution } from '../physics/retentionCurve.ts';
import {
  cementCoefficientS,
  type InPlaceStrengthModel,
  type SettingShiftOptions,
} from '../physics/strengthDevelopment.ts';
import { SECONDS_PER_DAY, SECONDS_PER_HOUR, M_PER_UM } from '../physics/units.ts';
import { youngLaplacePressurePa } from '../physics/youngLaplace.ts';
import { waterSurfaceTensionNPerM } from '../physics/waterSurfaceTension.ts';
import type { MaterialPreset } from './materialPreset.ts';

/** Hydration, strength and setting of a cementitious mix. */
export interface MixBehaviour {
  hydration: SchindlerFolliardParameters;
  waterCementRatio: number;
  strength: InPlaceStrengthModel & { kind: 'code-shifted' };
  setting: SettingShiftOptions;
  finalSetEquivalentAgeS: number;
  bleedRateKgM2s: number;
  bleedingDurationS: number;
  drainedBulkModulusFloorPa: number;
  /**
   * Exponent kappa of pore refinement, D(alpha) = D_fresh (phi_cap(alpha) / phi_cap(0))^kappa,
   * fixed by the median diameters of the fresh and hardened distributions at the degree of
   * hydration reached at 28 days (physics.md section 2); 0 without a hardened distribution.
   */
  refinementExponent: number;
}

/** A material ready for the element model. */
export interface ElementMaterial {
  preset: MaterialPreset;
  freshPores: PoreSizeDistribution;
  porosity: number;
  tortuosity: number;
  biotCoefficient: number;
  poissonRatio: number;
  relaxationFactor: number;
  /** Critical suction of the plastic phase, Pa (> 0). */
  criticalSuctionPa: number;
  /** Present for cementitious mixes. */
  mix?: MixBehaviour;
  /** Present for non-hydrating materials: constant tensile strength (Pa) and modulus (Pa). */
  fixedStrength?: { tensileStrengthPa: number; modulusPa: number };
}

/** Converts a preset's log-normal modes (um) to a PoreSizeDistribution (m). */
export function presetPores(pores: MaterialPreset['freshPores']): PoreSizeDistribution {
  return {
    kind: 'lognormal',
    modes: pores.lognormal.map((mode) => ({
      medianDiameterM: mode.medianDiameterUm * M_PER_UM,
      geometricSd: mode.geometricSd,
      volumeFraction: mode.volumeFraction,
    })),
  };
}

/** Reference temperature of material figures, K (20 degC, physics.md section 6). */
const REFERENCE_K = 293.15;

/**
 * Builds the element material of a preset. Critical suction: the preset's measured value, else
 * the Young-Laplace suction of the 99th-percentile pore diameter of the fresh distribution at
 * 20 degC (physics.md section 7).
 */
export function elementMaterialFromPreset(preset: MaterialPreset): ElementMaterial {
  const freshPores = presetPores(preset.freshPores);
  const criticalSuctionPa =
    preset.mix?.criticalSuctionKPa !== undefined
      ? preset.mix.criticalSuctionKPa.value * 1e3
      : -youngLaplacePressurePa(
          poreDiameterAtPercentileM(freshPores, 99),
          waterSurfaceTensionNPerM(REFERENCE_K),
        );
  const material: ElementMaterial = {
    preset,
    freshPores,
    porosity: preset.porosity.value,
    tortuosity: preset.tortuosity.value,
    biotCoefficient: preset.biotCoefficient.value,
    poissonRatio: preset.poissonRatio.value,
    relaxationFactor: preset.relaxationFactor.value,
    criticalSuctionPa,
  };
  if (preset.fixedStrength !== undefined) {
    material.fixedStrength = {
      tensileStrengthPa: preset.fixedStrength.tensileStrengthMPa.value * 1e6,
      modulusPa: preset.fixedStrength.youngsModulusGPa.value * 1e9,
    };
  }
  const mix = preset.mix;
  if (mix !== undefined) {
    const waterCementRatio = mix.waterCementRatio.value;
    const hydration: SchindlerFolliardParameters = {
      ultimateDegree: millsUltimateDegreeOfHydration(waterCementRatio),
      tauS: mix.hydrationTimeH.value * SECONDS_PER_HOUR,
      beta: mix.hydrationShape.value,
    };
    const properties = parseConcreteClass(mix.concreteClass.value, 'mix.concreteClass');
    const finalSetEquivalentAgeS = mix.finalSetH.value * SECONDS_PER_HOUR;
    let refinementExponent = 0;
    if (preset.hardenedPores !== undefined) {
      const hardened = presetPores(preset.hardenedPores);
      const degree28 = schindlerFolliardDegreeOfHydration(28 * SECONDS_PER_DAY, hydration);
      const porosityRatio =
        powersCapillaryPorosity(waterCementRatio, degree28) /
        powersCapillaryPorosity(waterCementRatio, 0);
      const diameterRatio =
        poreDiameterAtFractionM(hardened, 0.5) / poreDiameterAtFractionM(freshPores, 0.5);
      refinementExponent =
        porosityRatio > 0 && porosityRatio < 1
          ? Math.log(diameterRatio) / Math.log(porosityRatio)
          : 0;
    }
    material.mix = {
      hydration,
      waterCementRatio,
      strength: {
        kind: 'code-shifted',
        fcmMPa: properties.fcmMPa,
        fctmMPa: properties.fctmMPa,
        ecmGPa: properties.ecmGPa,
        s: cementCoefficientS(mix.cementClass.value),
      },
      setting: {
        finalSetEquivalentAgeDays: finalSetEquivalentAgeS / SECONDS_PER_DAY,
        tensileFloorMPa: 0.01,
      },
      finalSetEquivalentAgeS,
      bleedRateKgM2s: mix.bleedRateKgM2h.value / SECONDS_PER_HOUR,
      bleedingDurationS: mix.bleedingDurationH.value * SECONDS_PER_HOUR,
      drainedBulkModulusFloorPa: mix.drainedBulkModulusFloorMPa.value * 1e6,
      refinementExponent,
    };
  }
  return material;
}

/** Smallest diameter factor pore refinement may reach (our assumption: keeps p finite). */
export const MIN_DIAMETER_SCALE = 1e-3;

/**
 * Pore-diameter factor at a degree of hydration: (phi_cap(alpha) / phi_cap(0))^kappa, with
 * phi_cap from Powers-Brownyard (physics.md section 2, our assumption), floored at
 * {@link MIN_DIAMETER_SCALE}; 1 without refinement.
 */
export function refinementDiameterScale(mix: MixBehaviour, degreeOfHydration: number): number {
  if (mix.refinementExponent === 0) return 1;
  const ratio =
    powersCapillaryPorosity(mix.waterCementRatio, degreeOfHydration) /
    powersCapillaryPorosity(mix.waterCementRatio, 0);
  return Math.max(MIN_DIAMETER_SCALE, ratio ** mix.refinementExponent);
}
