import { describe, expect, it } from 'vitest';
import { buildDepthGrid, domainDepthM } from '../../server/src/engine/grid.ts';

const at = (values: Float64Array, index: number): number => values[index] ?? Number.NaN;

describe('buildDepthGrid()', () => {
  it.each([
    [0.1, 60, 1e-4],
    [0.2, 60, 1e-4],
    [0.02, 30, 1e-4],
    [0.3, 480, 1e-4],
  ])(
    'covers depth %s m with %s cells, first cell %s m, graded and closed',
    (depthM, cellCount, firstCellM) => {
      const grid = buildDepthGrid(depthM, { cellCount, firstCellM });
      expect(grid.cellCount).toBe(cellCount);
      expect(grid.facesM[0]).toBe(0);
      expect(grid.facesM[cellCount]).toBe(depthM);
      let sum = 0;
      for (let i = 0; i < cellCount; i += 1) {
        const width = at(grid.widthsM, i);
        sum += width;
        expect(grid.centresM[i]).toBeCloseTo(at(grid.facesM, i) + width / 2, 12);
        if (i > 0) expect(width).toBeGreaterThanOrEqual(at(grid.widthsM, i - 1) * (1 - 1e-12));
      }
      expect(Math.abs(sum - depthM) / depthM).toBeLessThan(1e-12);
      expect(Math.abs(at(grid.widthsM, 0) - firstCellM) / firstCellM).toBeLessThan(1e-6);
    },
  );

  it('falls back to a uniform grid when uniform cells are already finer than the first cell', () => {
    const grid = buildDepthGrid(0.003, { cellCount: 60, firstCellM: 1e-4 });
    expect(grid.growthRatio).toBe(1);
    expect(grid.widthsM[59]).toBeCloseTo(0.003 / 60, 15);
  });

  it('gives NaN widths rather than throwing for a non-positive depth', () => {
    expect(Number.isNaN(buildDepthGrid(-1).widthsM[0])).toBe(true);
  });
});

describe('domainDepthM()', () => {
  it('halves the thickness for two-face drying (symmetry plane, physics.md section 1)', () => {
    expect(domainDepthM(0.2, 'two-face')).toBe(0.1);
    expect(domainDepthM(0.2, 'one-face')).toBe(0.2);
  });
});
