/**
 * The figures of "now" over the ensemble: each member evaluated by the element model
 * (physics.md 5 to 7), then per-figure quantiles (5 %, 50 %, 95 %) over the members; depth
 * profiles with the probe readings beside the model; the in-place compressive strength and the
 * time to a target strength.
 */
import { quantileOfSorted } from '../calibration/index.ts';
import { evaluateElement } from '../engine/index.ts';
import type { ElementFigures, ElementModel, ElementState } from '../engine/index.ts';
import { ageForInPlaceCompressiveStrengthDays } from '../physics/index.ts';
import { modelRelativeHumidityAt } from './memberModel.ts';
import type { ProbeRole } from './streamRoles.ts';
import type { BandPoint, ProbeProfilePoint, RunProfiles } from './types.ts';

const SECONDS_PER_DAY = 86_400;

/** 5 %, 50 % and 95 % quantiles of the finite values (Hyndman and Fan definition 7); NaN when none. */
export function bandPoint(values: readonly number[]): BandPoint {
  const sorted = values.filter(Number.isFinite).sort((a, b) => a - b);
  return {
    p05: quantileOfSorted(sorted, 0.05),
    p50: quantileOfSorted(sorted, 0.5),
    p95: quantileOfSorted(sorted, 0.95),
  };
}

/** Mean and sample standard deviation of the finite values. */
export function meanAndSd(values: readonly number[]): { mean: number; sd: number } {
  const finite = values.filter(Number.isFinite);
  const n = finite.length;
  if (n === 0) return { mean: Number.NaN, sd: Number.NaN };
  let mean = 0;
  for (const value of finite) mean += value / n;
  let sum = 0;
  for (const value of finite) sum += (value - mean) ** 2;
  return { mean, sd: n > 1 ? Math.sqrt(sum / (n - 1)) : Number.NaN };
}

/** Evaluations of every member (the model's figures). */
export function evaluateMembers(
  model: ElementModel,
  members: readonly ElementState[],
): ElementFigures[] {
  return members.map((member) => evaluateElement(model, member));
}

/** Depth profiles of the ensemble (mm, MPa, fraction) with each RH probe beside the model. */
export function ensembleProfiles(
  model: ElementModel,
  members: readonly ElementState[],
  figures: readonly ElementFigures[],
  rhProbes: readonly { role: ProbeRole; measuredPercent: number | null }[],
): RunProfiles {
  const n = model.grid.cellCount;
  const band = (pick: (figure: ElementFigures, i: number) => number) => {
    const p05: number[] = [];
    const p50: number[] = [];
    const p95: number[] = [];
    for (let i = 0; i < n; i += 1) {
      const point = bandPoint(figures.map((figure) => pick(figure, i)));
      p05.push(point.p05);
      p50.push(point.p50);
      p95.push(point.p95);
    }
    return { p05, p50, p95 };
  };
  const probes: ProbeProfilePoint[] = rhProbes.map(({ role, measuredPercent }) => {
    const values = members.map((member) => {
      model.applyState(member);
      return 100 * modelRelativeHumidityAt(model, member, role.domainDepthM);
    });
    const { mean, sd } = meanAndSd(values);
    return {
      device: role.device,
      sensor: role.sensor,
      depthMm: role.depthMm,
      measuredRhPercent: measuredPercent,
      modelRhPercent: mean,
      modelRhSdPercent: sd,
    };
  });
  return {
    depthMm: Array.from(model.grid.centresM, (depthM) => depthM * 1000),
    saturation: band((figure, i) => figure.profiles.saturation[i] as number),
    stressMPa: band((figure, i) => (figure.profiles.stressPa[i] as number) / 1e6),
    probes,
  };
}

/**
 * Hours until the element's mean in-place compressive strength reaches `targetMPa`, if the
 * equivalent age keeps growing at `ageRate` (s of equivalent age per s, the last interval's):
 * `(t_e(target) - t_e(now)) / rate / 3600`, with t_e(target) from the inverse of the setting-
 * shifted strength law (EN 1992-1-1 eq. 3.2 via ageForInPlaceCompressiveStrengthDays).
 *
 * @returns 0 when reached, null without a mix, with a rate <= 0 or NaN, or a target never reached.
 */
export function timeToTargetStrengthH(
  model: ElementModel,
  meanEquivalentAgeS: number,
  ageRate: number,
  targetMPa: number,
): number | null {
  const mix = model.material.mix;
  if (mix === undefined) return null;
  const targetAgeS =
    ageForInPlaceCompressiveStrengthDays(targetMPa, mix.strength, mix.setting) * SECONDS_PER_DAY;
  if (!Number.isFinite(targetAgeS)) return null;
  if (meanEquivalentAgeS >= targetAgeS) return 0;
  if (!(ageRate > 0)) return null;
  return (targetAgeS - meanEquivalentAgeS) / ageRate / 3600;
}
