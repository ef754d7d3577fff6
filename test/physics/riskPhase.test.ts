import { describe, expect, it } from 'vitest';
import { riskPhase } from '../../server/src/physics/riskPhase.ts';
import {
  DEFAULT_SETTING_SHIFT_OPTIONS,
  inPlaceStrength,
} from '../../server/src/physics/strengthDevelopment.ts';

describe('riskPhase()', () => {
  // Source: physics.md 7 (plastic until final set, hardening after); final set 6 h default.
  it.each([
    [0, 'plastic'],
    [0.2, 'plastic'],
    [0.25, 'plastic'],
    [0.2501, 'hardening'],
    [3, 'hardening'],
    [Number.NaN, 'plastic'],
  ] as const)('at %f d with the default final set is %s', (age, phase) => {
    expect(riskPhase(age)).toBe(phase);
  });

  it('takes the final set of the mix', () => {
    expect(riskPhase(0.3, 0.35)).toBe('plastic');
    expect(riskPhase(0.4, 0.35)).toBe('hardening');
  });

  it('agrees with inPlaceStrength().hasSet at the default final set', () => {
    const model = { kind: 'code-shifted', fcmMPa: 38, fctmMPa: 2.9, s: 0.25 } as const;
    for (const age of [0.1, 0.25, 0.26, 1]) {
      expect(riskPhase(age) === 'hardening').toBe(inPlaceStrength(age, model).hasSet);
    }
    expect(DEFAULT_SETTING_SHIFT_OPTIONS.finalSetEquivalentAgeDays).toBe(0.25);
  });
});
