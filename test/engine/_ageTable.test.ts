import { describe, expect, it } from 'vitest';
import { createAgeTable } from '../../server/src/engine/_ageTable.ts';
import { schindlerFolliardDegreeOfHydration } from '../../server/src/physics/hydration.ts';
import { strengthDevelopmentFactor } from '../../server/src/physics/strengthDevelopment.ts';

// Two of the laws the element model tabulates: Schindler and Folliard (2005) hydration with an
// ordinary cement's parameters, and EN 1992-1-1 eq. (3.2) strength development (s = 0.25).
const hydration = (ageS: number): number =>
  schindlerFolliardDegreeOfHydration(ageS, { ultimateDegree: 0.75, tauS: 15 * 3600, beta: 0.9 });
const strength = (ageS: number): number => strengthDevelopmentFactor(ageS / 86400, 0.25);

describe('createAgeTable()', () => {
  it('reads both laws within 3e-5 of their range from 1 s to 1e8 s (dense sample between nodes)', () => {
    const table = createAgeTable([hydration, strength]);
    for (let k = 0; k <= 40000; k += 1) {
      const ageS = Math.exp((k / 40000) * Math.log(1e8));
      table.at(ageS);
      expect(Math.abs((table.values[0] as number) - hydration(ageS))).toBeLessThan(0.75 * 3e-5);
      expect(Math.abs((table.values[1] as number) - strength(ageS))).toBeLessThan(1.3 * 3e-5);
    }
  });

  it('is exact at its nodes and outside its range, and answers NaN ages as the laws do', () => {
    const table = createAgeTable([hydration], { minAgeS: 60, maxAgeS: 1e6 });
    for (const ageS of [0, 30, 2e6]) {
      table.at(ageS);
      expect(table.values[0]).toBe(hydration(ageS));
    }
    table.at(Number.NaN);
    expect(table.values[0]).toBeNaN();
    // 2^12 s and 2^16 s are nodes (every power of two is).
    for (const ageS of [4096, 65536]) {
      table.at(ageS);
      expect(table.values[0]).toBe(hydration(ageS));
    }
  });
});
