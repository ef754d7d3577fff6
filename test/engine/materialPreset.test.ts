import { describe, expect, it } from 'vitest';
import {
  listMaterialPresets,
  loadMaterialPreset,
  MaterialPresetError,
  parseMaterialPreset,
} from '../../server/src/engine/materialPreset.ts';

describe('material presets', () => {
  it('ships the five materials issue 3 asks for', () => {
    expect(listMaterialPresets()).toEqual([
      'building-stone-coarse',
      'cement-mortar-fine',
      'earthen-plaster',
      'low-wc-concrete',
      'normal-concrete',
    ]);
  });

  it.each(listMaterialPresets())('%s validates and states the origin of every number', (id) => {
    const preset = loadMaterialPreset(id);
    const visit = (value: unknown, path: string): void => {
      if (typeof value === 'number') {
        // A number is either the value of a { value, origin } pair or a figure of a pore mode,
        // whose distribution carries its own origin.
        expect(path, `${id}: ${path}`).toMatch(/(\.value|Pores\.lognormal\[\d\]\.\w+)$/);
      } else if (Array.isArray(value)) {
        value.forEach((item, index) => visit(item, `${path}[${index}]`));
      } else if (value !== null && typeof value === 'object') {
        const record = value as Record<string, unknown>;
        if ('value' in record || 'lognormal' in record) {
          expect(typeof record.origin, `${id}: ${path}.origin`).toBe('string');
        }
        for (const [key, child] of Object.entries(record))
          visit(child, path === '' ? key : `${path}.${key}`);
      }
    };
    visit(preset, '');
  });

  it('hardening concretes refine their pores; the fine mortar and the stone do not hydrate-refine', async () => {
    const { elementMaterialFromPreset } =
      await import('../../server/src/engine/elementMaterial.ts');
    expect(
      elementMaterialFromPreset(loadMaterialPreset('normal-concrete')).mix?.refinementExponent,
    ).toBeGreaterThan(0);
    expect(
      elementMaterialFromPreset(loadMaterialPreset('cement-mortar-fine')).mix?.refinementExponent,
    ).toBe(0);
    expect(
      elementMaterialFromPreset(loadMaterialPreset('building-stone-coarse')).mix,
    ).toBeUndefined();
  });

  it.each([
    [
      'a porosity above 1',
      (p: Record<string, unknown>) => ({ ...p, porosity: { value: 1.5, origin: 'test' } }),
      /porosity\.value .*1\.5/,
    ],
    [
      'a number without its origin',
      (p: Record<string, unknown>) => ({ ...p, tortuosity: { value: 2 } }),
      /tortuosity\.origin/,
    ],
    [
      'shares that do not sum to 1',
      (p: Record<string, unknown>) => ({
        ...p,
        freshPores: {
          origin: 'test',
          lognormal: [{ medianDiameterUm: 1, geometricSd: 2, volumeFraction: 0.5 }],
        },
      }),
      /volumeFraction must sum to 1: got 0.5/,
    ],
  ])('refuses a preset with %s, naming the field', (_label, change, message) => {
    const base = loadMaterialPreset('normal-concrete') as unknown as Record<string, unknown>;
    expect(() => parseMaterialPreset(change(base))).toThrow(MaterialPresetError);
    expect(() => parseMaterialPreset(change(base))).toThrow(message);
  });

  it('names the known presets when asked for an unknown one', () => {
    expect(() => loadMaterialPreset('granite')).toThrow(
      /material must be one of building-stone-coarse, .*: got "granite"/,
    );
  });
});
