import { describe, expect, it } from 'vitest';
import { createHumidityFactorTable } from '../../server/src/engine/_humidityFactorTable.ts';
import { hydrationHumidityFactor } from '../../server/src/physics/hydration.ts';

// The function under the table: Bazant and Prasannan (1989) form, physics/hydration.ts.
const exact = (deficit: number, steepness?: number): number =>
  hydrationHumidityFactor(Math.exp(-deficit), steepness === undefined ? {} : { steepness });

describe('createHumidityFactorTable()', () => {
  it.each([
    { steepness: undefined, bound: 1.5e-7 },
    { steepness: 5, bound: 1.5e-7 },
  ])(
    'at() follows the humidity factor within its stated bound (steepness $steepness)',
    ({ steepness, bound }) => {
      const table = createHumidityFactorTable(steepness === undefined ? {} : { steepness });
      let worst = 0;
      // Off-node points across the tabulated range and beyond it (where the function is exact).
      for (let k = 0; k <= 20_000; k += 1) {
        const deficit = (k + 0.37) * 5e-5;
        worst = Math.max(worst, Math.abs(table.at(deficit) - exact(deficit, steepness)));
      }
      expect(worst).toBeLessThan(bound);
      expect(worst).toBeGreaterThan(0); // it is an interpolation, not the function itself
    },
  );

  it('at() is exactly 1 where the factor is 1 in double precision, and exact beyond the table', () => {
    const table = createHumidityFactorTable();
    expect(table.exactlyOneBelow).toBeGreaterThan(0);
    expect(exact(table.exactlyOneBelow)).toBe(1);
    expect(exact(table.exactlyOneBelow * 1.01)).toBeLessThan(1);
    expect(table.at(0)).toBe(1);
    expect(table.at(table.exactlyOneBelow)).toBe(1);
    expect(table.at(0.9)).toBe(exact(0.9));
    expect(table.at(3)).toBe(exact(3));
    expect(table.at(Number.NaN)).toBeNaN();
  });
});
