/** Calibration parameters in words (web/src/panels/calibrationTable.ts). */
import { describe, expect, it } from 'vitest';
import { formatParameter, parameterLabel } from '../../../web/src/panels/calibrationTable.ts';

describe('parameterLabel()', () => {
  it.each([
    ['permeabilityMultiplier', { label: 'permeability multiplier', scale: 1, unit: 'x' }],
    ['initialBleedFilmKgM2', { label: 'initial bleed film', scale: 1, unit: 'kg/m²' }],
    ['rhBias:probe-c5/rh-05', { label: 'RH bias of probe probe-c5/rh-05', scale: 100, unit: '%' }],
    ['somethingNew', { label: 'somethingNew', scale: 1, unit: '' }],
  ])('parameterLabel(%j)', (name, expected) => {
    expect(parameterLabel(name)).toEqual(expected);
  });
});

describe('formatParameter()', () => {
  it.each([
    [2.345, '2.35'],
    [0.0123, '0.0123'],
    [0.00123, '1.23e-3'],
    [123456, '1.23e+5'],
    [0, '0'],
    [Number.NaN, 'no value'],
  ])('formatParameter(%s) is %j', (value, expected) => {
    expect(formatParameter(value)).toBe(expected);
  });
});
