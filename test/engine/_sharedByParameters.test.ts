import { describe, expect, it } from 'vitest';
import { sharedByParameters } from '../../server/src/engine/_sharedByParameters.ts';
import { createElementModel } from '../../server/src/engine/elementModel.ts';
import { loadMaterialPreset } from '../../server/src/engine/materialPreset.ts';

describe('sharedByParameters()', () => {
  it('builds once for equal parameters, whatever the object, and apart for different ones', () => {
    let builds = 0;
    const build = () => ({ id: (builds += 1) });
    const first = sharedByParameters('test-equal', { a: 1, b: [2, 3] }, build);
    expect(sharedByParameters('test-equal', { a: 1, b: [2, 3] }, build)).toBe(first);
    expect(sharedByParameters('test-equal', { a: 1, b: [2, 4] }, build)).not.toBe(first);
    expect(sharedByParameters('test-other-kind', { a: 1, b: [2, 3] }, build)).not.toBe(first);
    expect(builds).toBe(3);
  });

  it('tells NaN, Infinity and null apart (JSON alone writes all three as null)', () => {
    const build = () => ({});
    const entries = [Number.NaN, Number.POSITIVE_INFINITY, null].map((value) =>
      sharedByParameters('test-non-finite', { value }, build),
    );
    expect(new Set(entries).size).toBe(3);
  });

  it('lets models of one preset share their pore curves and give the same numbers', () => {
    const make = () =>
      createElementModel({
        material: loadMaterialPreset('cement-mortar-fine'),
        thicknessM: 0.03,
        dryingCase: 'one-face',
        options: { cellCount: 20 },
      });
    const a = make();
    const b = make();
    expect(b.hydraulics.retention).toBe(a.hydraulics.retention);
    const pressures = Float64Array.from({ length: 20 }, (_, i) => -1e4 * (i + 1));
    const out = () => Array.from({ length: 4 }, () => new Float64Array(20));
    const [wa, ca, ka] = out() as Float64Array[];
    const [wb, cb, kb] = out() as Float64Array[];
    a.hydraulics.evaluate(pressures, wa as Float64Array, ca as Float64Array, ka as Float64Array);
    b.hydraulics.evaluate(pressures, wb as Float64Array, cb as Float64Array, kb as Float64Array);
    expect(Array.from(wb as Float64Array)).toEqual(Array.from(wa as Float64Array));
    expect(Array.from(kb as Float64Array)).toEqual(Array.from(ka as Float64Array));
  });
});
