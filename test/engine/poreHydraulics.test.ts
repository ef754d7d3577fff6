import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { createPoreHydraulics } from '../../server/src/engine/poreHydraulics.ts';
import { waterSurfaceTensionNPerM } from '../../server/src/physics/waterSurfaceTension.ts';
import { equivalentPorePressureCurve } from '../../server/src/physics/equivalentPorePressure.ts';

const poreSizes = {
  kind: 'lognormal' as const,
  modes: [{ medianDiameterM: 0.05e-6, geometricSd: 3, volumeFraction: 1 }],
};
const make = () => createPoreHydraulics({ poreSizes, porosity: 0.15, tortuosity: 3, cellCount: 3 });

describe('createPoreHydraulics()', () => {
  it('its tabulated saturation agrees with the physics retention curve to 1e-4', () => {
    const hydraulics = make();
    for (const suctionPa of [1e4, 1e5, 1e6, 5e6, 2e7, 1e8]) {
      const expected = hydraulics.retention.saturation(-suctionPa);
      expect(Math.abs(hydraulics.saturationAt(0, -suctionPa) - expected)).toBeLessThan(1e-4);
    }
  });

  it('water content is monotone in pressure and pressureForWaterContent() inverts it (property)', () => {
    const hydraulics = make();
    hydraulics.specificStoragePerPa.fill(1e-9);
    fc.assert(
      fc.property(
        fc.double({ min: 3, max: 8.5, noNaN: true }),
        fc.double({ min: 0.01, max: 0.5, noNaN: true }),
        (logSuction, gap) => {
          const pressure = -(10 ** logSuction);
          const wetter = pressure * (1 - gap);
          expect(hydraulics.waterContentAt(0, wetter)).toBeGreaterThanOrEqual(
            hydraulics.waterContentAt(0, pressure),
          );
          const target = hydraulics.waterContentAt(0, pressure);
          const found = hydraulics.pressureForWaterContent(0, target, wetter);
          expect(Math.abs(hydraulics.waterContentAt(0, found) - target)).toBeLessThan(1e-12);
        },
      ),
      { numRuns: 200 },
    );
  });

  it('pressureKeepingWater() after a change of scale and storage holds the water, as pressureForWaterContent() does (property)', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 3.7, max: 8.5, noNaN: true }),
        fc.double({ min: -0.01, max: 0.01, noNaN: true }),
        fc.boolean(),
        (logSuction, relativeChange, evaluatedFirst) => {
          const hydraulics = make();
          hydraulics.specificStoragePerPa.fill(1e-9);
          const pressures = Float64Array.from([-(10 ** logSuction), -1e4, -1e5]);
          const scratch = () => new Float64Array(3);
          if (evaluatedFirst) hydraulics.evaluate(pressures, scratch(), scratch(), scratch());
          const pressure = pressures[0] as number;
          const water = hydraulics.waterContentAt(0, pressure);
          const scaleBefore = hydraulics.pressureScale[0] as number;
          hydraulics.diameterScale[0] = 1 + relativeChange;
          hydraulics.specificStoragePerPa[0] = 1e-9 * (1 - relativeChange);
          hydraulics.refreshScale();
          const kept = hydraulics.pressureKeepingWater(0, water, pressure, scaleBefore);
          const searched = hydraulics.pressureForWaterContent(0, water, pressure);
          expect(Math.abs(hydraulics.waterContentAt(0, kept) - water)).toBeLessThan(1e-14);
          expect(Math.abs(kept - searched)).toBeLessThanOrEqual(1e-9 * Math.abs(searched));
        },
      ),
      { numRuns: 100 },
    );
  });

  it('scales suction with surface tension (Young-Laplace) when a cell warms up', () => {
    const hydraulics = make();
    hydraulics.temperatureK[1] = 313.15;
    hydraulics.refreshTemperature();
    const ratio = waterSurfaceTensionNPerM(313.15) / waterSurfaceTensionNPerM(293.15);
    // Same saturation at the suction scaled by gamma(T) / gamma(20 degC).
    expect(hydraulics.saturationAt(1, -1e6 * ratio)).toBeCloseTo(
      hydraulics.saturationAt(0, -1e6),
      9,
    );
  });

  it.each([
    { name: 'each cell its own temperature', temperaturesK: [283.15, 303.15, 293.15] },
    { name: 'a run of cells at one temperature', temperaturesK: [303.15, 303.15, 303.15] },
    { name: 'a neighbour shared after a change', temperaturesK: [298.15, 298.15, 285.15] },
  ])(
    'refreshTemperature() gives every cell the coefficients of its own temperature ($name)',
    ({ temperaturesK }) => {
      // The refresh copies a neighbour's coefficients when it shares the temperature: each cell
      // must end up with what a model at that one temperature gives it (conductivity including
      // vapour, Kelvin coefficient, pressure scale), after an earlier, different refresh.
      const hydraulics = make();
      hydraulics.temperatureK.set([290.15, 290.15, 300.15]);
      hydraulics.refreshTemperature();
      hydraulics.temperatureK.set(temperaturesK);
      hydraulics.refreshTemperature();
      const pressuresPa = new Float64Array([-3e6, -3e6, -3e6]);
      const outputs = () => Array.from({ length: 4 }, () => new Float64Array(3));
      const [water, capacity, conductivity, slope] = outputs() as [
        Float64Array,
        Float64Array,
        Float64Array,
        Float64Array,
      ];
      hydraulics.evaluate(pressuresPa, water, capacity, conductivity, undefined, slope);
      temperaturesK.forEach((temperatureK, cell) => {
        const alone = make();
        alone.temperatureK.fill(temperatureK);
        alone.refreshTemperature();
        const [w, c, k, s] = outputs() as [Float64Array, Float64Array, Float64Array, Float64Array];
        alone.evaluate(pressuresPa, w, c, k, undefined, s);
        expect(conductivity[cell]).toBe(k[cell]);
        expect(slope[cell]).toBe(s[cell]);
        expect(water[cell]).toBe(w[cell]);
        expect(hydraulics.inverseKelvinCoefficientPerPa(cell)).toBe(
          alone.inverseKelvinCoefficientPerPa(cell),
        );
        expect(hydraulics.pressureScale[cell]).toBe(alone.pressureScale[cell]);
      });
    },
  );

  it('equivalentPorePressurePa() reads its table within 2e-6 of the physics curve (Coussy 2004), refined and warm cells too', () => {
    const hydraulics = make();
    hydraulics.diameterScale[1] = 0.37;
    hydraulics.temperatureK[2] = 303.15;
    hydraulics.refreshTemperature();
    const curve = equivalentPorePressureCurve(hydraulics.retention);
    for (const cell of [0, 1, 2]) {
      const scale = hydraulics.pressureScale[cell] as number;
      const airEntrySuction = -hydraulics.airEntryPressurePa(cell);
      // From the air entry to 1e8 times it, 0.001 apart in ln(suction): nodes and between them.
      for (let k = 0; k <= 18000; k += 1) {
        const pressure = -airEntrySuction * Math.exp(k * 0.001);
        const exact = curve.fromLiquidPressure(pressure * scale) / scale;
        expect(
          Math.abs(hydraulics.equivalentPorePressurePa(cell, pressure) / exact - 1),
        ).toBeLessThan(2e-6);
      }
      // Saturated: pi is the liquid pressure itself.
      expect(hydraulics.equivalentPorePressurePa(cell, -0.5 * airEntrySuction)).toBe(
        -0.5 * airEntrySuction,
      );
    }
  });

  it('waterContents() gives the water and storage of evaluate() to the bit (property)', () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 2, max: 9.5, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.double({ min: 0.2, max: 1, noNaN: true }),
        (logSuctions, scale) => {
          const hydraulics = make();
          hydraulics.specificStoragePerPa.fill(1e-9);
          hydraulics.diameterScale[1] = scale;
          hydraulics.refreshScale();
          const pressures = Float64Array.from(logSuctions, (logSuction) => -(10 ** logSuction));
          const columns = () => Array.from({ length: 5 }, () => new Float64Array(3));
          const [water, capacity, conductivity, storage, alone] = columns() as Float64Array[];
          const aloneStorage = new Float64Array(3);
          hydraulics.evaluate(
            pressures,
            water as Float64Array,
            capacity as Float64Array,
            conductivity as Float64Array,
            storage,
          );
          hydraulics.waterContents(pressures, alone as Float64Array, aloneStorage);
          expect(Array.from(alone as Float64Array)).toEqual(Array.from(water as Float64Array));
          expect(Array.from(aloneStorage)).toEqual(Array.from(storage as Float64Array));
        },
      ),
      { numRuns: 200 },
    );
  });

  it("setTemperaturesKeepingWater() keeps each cell's water and leaves the curves of refreshTemperature() (property)", () => {
    fc.assert(
      fc.property(
        fc.array(fc.double({ min: 3.7, max: 8.5, noNaN: true }), { minLength: 3, maxLength: 3 }),
        fc.array(fc.double({ min: 275, max: 330, noNaN: true }), { minLength: 3, maxLength: 3 }),
        (logSuctions, temperatures) => {
          const hydraulics = make();
          hydraulics.specificStoragePerPa.fill(1e-9);
          const pressures = Float64Array.from(logSuctions, (logSuction) => -(10 ** logSuction));
          const before = Array.from(pressures, (pressure, cell) =>
            hydraulics.waterContentAt(cell, pressure),
          );
          const changed = hydraulics.setTemperaturesKeepingWater(
            Float64Array.from(temperatures),
            pressures,
          );
          expect(changed).toBe(true);
          const reference = make();
          reference.temperatureK.set(temperatures);
          reference.refreshTemperature();
          pressures.forEach((pressure, cell) => {
            expect(
              Math.abs(hydraulics.waterContentAt(cell, pressure) - (before[cell] as number)),
            ).toBeLessThan(1e-14);
            expect(hydraulics.pressureScale[cell]).toBe(reference.pressureScale[cell]);
            expect(hydraulics.inverseKelvinPerPa[cell]).toBe(reference.inverseKelvinPerPa[cell]);
          });
          expect(
            hydraulics.setTemperaturesKeepingWater(Float64Array.from(temperatures), pressures),
          ).toBe(false);
        },
      ),
      { numRuns: 100 },
    );
  });

  it('fillProfiles() gives saturationAt(), relativeHumidity() and equivalentPorePressurePa() to the bit', () => {
    const hydraulics = make();
    hydraulics.diameterScale[1] = 0.4;
    hydraulics.temperatureK[2] = 310.15;
    hydraulics.refreshTemperature();
    for (const logSuction of [2, 3.5, 4.5, 5.5, 6.5, 7.5, 8.5, 9.5]) {
      const pressures = Float64Array.from([1e3, -(10 ** logSuction), -(10 ** (logSuction + 0.3))]);
      const saturation: number[] = [];
      const humidity: number[] = [];
      const equivalent: number[] = [];
      hydraulics.fillProfiles(pressures, saturation, humidity, equivalent);
      pressures.forEach((pressure, cell) => {
        expect(saturation[cell]).toBe(hydraulics.saturationAt(cell, pressure));
        expect(humidity[cell]).toBe(hydraulics.relativeHumidity(cell, Math.min(0, pressure)));
        expect(equivalent[cell]).toBe(hydraulics.equivalentPorePressurePa(cell, pressure));
      });
    }
  });

  it('refined pores (diameters halved) need twice the suction for the same saturation', () => {
    const hydraulics = make();
    hydraulics.diameterScale[2] = 0.5;
    hydraulics.refreshScale();
    expect(hydraulics.saturationAt(2, -2e6)).toBeCloseTo(hydraulics.saturationAt(0, -1e6), 9);
  });
});

describe('createPoreHydraulics() with a measured saturated permeability', () => {
  it('rescales the bundle curve to it (physics.md section 3) and keeps the relative shape', () => {
    const bundle = make();
    const measured = createPoreHydraulics({
      poreSizes,
      porosity: 0.15,
      tortuosity: 3,
      cellCount: 3,
      saturatedPermeabilityM2: 1e-19,
    });
    expect(measured.permeability.saturatedPermeabilityM2).toBe(1e-19);
    const ratio = (h: typeof bundle) =>
      h.permeability.permeabilityAtPressureM2(-5e6) / h.permeability.saturatedPermeabilityM2;
    expect(ratio(measured)).toBeCloseTo(ratio(bundle), 12);
  });
});
