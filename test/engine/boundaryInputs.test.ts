import { describe, expect, it } from 'vitest';
import {
  BoundaryInputError,
  checkBoundaryInputs,
  fillCellTemperatures,
} from '../../server/src/engine/boundaryInputs.ts';

const base = {
  airTemperatureK: 293.15,
  relativeHumidity: 0.5,
  windMS: 2,
  surfaceTemperatureK: 295.15,
};

describe('fillCellTemperatures()', () => {
  it('interpolates linearly between probe depths and holds the end values beyond them', () => {
    const centres = Float64Array.from([0.001, 0.02, 0.035, 0.05, 0.09]);
    const out = new Float64Array(5);
    fillCellTemperatures(
      {
        ...base,
        probeTemperatures: [
          { depthM: 0.05, temperatureK: 310 },
          { depthM: 0.02, temperatureK: 300 },
        ],
      },
      centres,
      out,
    );
    expect(Array.from(out)).toEqual([300, 300, 305, 310, 310]);
  });

  it('puts every cell at the surface temperature without probes', () => {
    const out = new Float64Array(3);
    fillCellTemperatures(base, Float64Array.from([0.001, 0.01, 0.1]), out);
    expect(Array.from(out)).toEqual([295.15, 295.15, 295.15]);
  });
});

describe('checkBoundaryInputs()', () => {
  it.each([
    [
      'relativeHumidity',
      { relativeHumidity: 1.2 },
      /relativeHumidity must be between 0 and 1: got 1.2/,
    ],
    ['windMS', { windMS: -1 }, /windMS must not be negative: got -1/],
    [
      'a freezing probe',
      { probeTemperatures: [{ depthM: 0.01, temperatureK: 272 }] },
      /probeTemperatures\[0\]\.temperatureK must be at or above 0 degC/,
    ],
    [
      'a NaN air temperature',
      { airTemperatureK: Number.NaN },
      /airTemperatureK must be a finite number: got NaN/,
    ],
  ])('refuses %s', (_label, change, message) => {
    expect(() => checkBoundaryInputs({ ...base, ...change })).toThrow(BoundaryInputError);
    expect(() => checkBoundaryInputs({ ...base, ...change })).toThrow(message);
  });

  it('accepts air below freezing over concrete above it', () => {
    expect(() => checkBoundaryInputs({ ...base, airTemperatureK: 268.15 })).not.toThrow();
  });
});
