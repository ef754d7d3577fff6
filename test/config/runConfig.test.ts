import { describe, expect, it } from 'vitest';
import { validationIssues } from '../helpers/validationIssues.ts';
import { parseRunConfig } from '../../server/src/config/runConfig.ts';
import { exampleRunInput } from '../helpers/exampleRun.ts';

function issuesOf(input: unknown): readonly string[] {
  return validationIssues(() => parseRunConfig(input));
}

describe('parseRunConfig()', () => {
  it('accepts the example run and fills in defaults', () => {
    const config = parseRunConfig(exampleRunInput());
    expect(config.leadTimeMin).toBe(90);
    expect(config.thresholds.utilization).toEqual([0.57, 0.69, 1.0]);
    expect(config.element.restraint).toEqual({ mode: 'flat', degree: 0 });
    expect(config.recipients).toEqual([]);
  });

  const base = exampleRunInput();
  const cases: { name: string; input: unknown; expected: string }[] = [
    {
      name: 'probe deeper than the element',
      input: {
        ...base,
        element: { kind: 'slab', thicknessMm: 100, drying: 'one-face' },
        probes: [{ device: 'p1', sensor: 'rh-140', quantity: 'rh', depthMm: 140 }],
      },
      expected: 'probes[0].depthMm must be between 0 and the element thickness (100 mm): got 140',
    },
    {
      name: 'placedAt without an offset',
      input: { ...base, placedAt: '2026-06-14T11:20:00' },
      expected:
        'placedAt must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T11:20:00+02:00: got "2026-06-14T11:20:00"',
    },
    {
      name: 'unknown drying case',
      input: { ...base, element: { kind: 'slab', thicknessMm: 100, drying: 'both' } },
      expected: 'element.drying must be "one-face" or "two-face": got "both"',
    },
    {
      name: 'quantity not rh or temperature',
      input: { ...base, probes: [{ device: 'p', sensor: 's', quantity: 'ph', depthMm: 5 }] },
      expected: 'probes[0].quantity must be "rh" or "temperature": got "ph"',
    },
    {
      name: 'site with a topic wildcard',
      input: { ...base, site: 'deck/+' },
      expected: `site must be a site id of 1 to 64 letters, digits, '.', '_' or '-': got "deck/+"`,
    },
    {
      name: 'mast height as a string',
      input: { ...base, weather: { ...base.weather, mastHeightM: '2' } },
      expected: 'weather.mastHeightM must be a number in m: got "2"',
    },
    {
      name: 'negative lead time',
      input: { ...base, leadTimeMin: -5 },
      expected: 'leadTimeMin must be at least 1 min: got -5',
    },
    {
      name: 'a sensor claimed twice',
      input: {
        ...base,
        probes: [
          { device: 'p', sensor: 's', quantity: 'rh', depthMm: 5 },
          { device: 'p', sensor: 's', quantity: 'temperature', depthMm: 5 },
        ],
      },
      expected: 'probes[1].sensor must name a sensor used once per run: p/s is already probes[0]',
    },
    {
      name: 'an unknown top-level field',
      input: { ...base, colour: 'red' },
      expected: 'configuration has unknown field(s) colour',
    },
    {
      name: 'missing weather station',
      input: { ...base, weather: undefined },
      expected: 'weather is required: got nothing',
    },
  ];
  it.each(cases)('rejects $name, naming field, rule and value', ({ input, expected }) => {
    expect(issuesOf(input)).toContain(expected);
  });
});
