import { describe, expect, it } from 'vitest';
import { noticeText } from '../../server/src/alerts/noticeText.ts';
import type { NoticeDraft } from '../../server/src/alerts/types.ts';
import { CAUTION_TEXT } from '../../server/src/live/caution.ts';
import { CONFIG, MIN, T0 } from './_runStates.ts';

/** T0 is 12:20 on site (placedAt 11:20 at +02:00). */
function draft(fields: Partial<NoticeDraft>): NoticeDraft {
  return {
    level: 'ACT NOW',
    kind: 'margin-outlook',
    conditionKey: 'margin',
    raisedAtMs: T0,
    reasons: [
      "the outlook has the surface stress passing the tensile strength at about 13:30, in about 1 h 10 min (90 % of the outlook's runs)",
    ],
    eased: null,
    repeat: false,
    figures: {
      utilization: 0.42,
      marginMPa: 0.31,
      evaporationKgM2h: 0.85,
      expectedClosingMs: T0 + 70 * MIN,
      probabilityCracking: 0.9,
    },
    ...fields,
  };
}

describe('noticeText()', () => {
  it.each([
    {
      name: 'ACT NOW after set: wet covering or curing compound, closing time and figures',
      draft: draft({}),
      phase: 'hardening' as const,
      title: 'ACT NOW: apply curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'ACT NOW - Harbour deck, bay 2 topping (site harbour-deck)',
        '2026-06-14 12:20 (UTC+02:00), 1 h after placement at 11:20, after final set.',
        'What to do now: Now, cover the surface with wet burlap or plastic sheeting',
        'curing compound',
        'utilization 0.42',
        'margin 0.31 MPa',
        'evaporation rate 0.85 kg/m2/h',
        'margin expected to close at 13:30',
        'within the outlook: 90 %',
      ],
      absent: ['fog the air'],
    },
    {
      name: 'ACT NOW before set: fogging, windbreaks and shade',
      draft: draft({}),
      phase: 'plastic' as const,
      title: 'ACT NOW: apply curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'before final set',
        'What is happening: The surface is drying faster than water reaches it from below',
        'fog the air just above the surface',
        'windbreaks',
        'shade the surface',
        'surface suction over air-entry suction',
      ],
      absent: ['curing compound'],
    },
    {
      name: 'CRACKING LIKELY: at once, and look for cracks',
      draft: draft({
        level: 'CRACKING LIKELY',
        kind: 'utilization',
        figures: { ...draft({}).figures, utilization: 1.05, expectedClosingMs: null },
      }),
      phase: 'hardening' as const,
      title: 'CRACKING LIKELY: protect the surface at once - stress has reached strength',
      parts: ['At once, cover the surface', 'Check the surface for fine cracks'],
      absent: [],
    },
    {
      name: 'a repeat says it was not acknowledged',
      draft: draft({ repeat: true }),
      phase: 'hardening' as const,
      title:
        'ACT NOW: apply curing protection - margin closes at about 13:30, in about 1 h 10 min (repeated: not yet acknowledged)',
      parts: [],
      absent: [],
    },
    {
      name: 'a silent sensor names it',
      draft: draft({
        level: 'NOTE',
        kind: 'sensor-silent',
        conditionKey: 'sensor:probe-a',
        reasons: ['no rh-10 reading from probe-a since 12:05'],
      }),
      phase: 'hardening' as const,
      title: 'NOTE: a sensor is silent - probe-a',
      parts: [
        'What is happening: No rh-10 reading from probe-a since 12:05.',
        'its cables and its power',
      ],
      absent: [],
    },
    {
      name: 'an easing names the concern, the level it eased from and what still holds',
      draft: draft({
        level: 'NOTE',
        kind: 'eased',
        eased: { from: 'ACT NOW', to: 'PREPARE' },
        reasons: ["40 % of the outlook's runs have the margin closing within the next 6 h"],
      }),
      phase: 'hardening' as const,
      title: 'NOTE: eased - the cracking warning (ACT NOW) has cleared; PREPARE still holds',
      parts: [
        'below its threshold for 30 min',
        'Still: 40 %',
        'What to do now: Keep the measures in place',
      ],
      absent: [],
    },
  ])('$name', ({ draft: input, phase, title, parts, absent }) => {
    const written = noticeText(input, { config: CONFIG, phase });
    expect(written.title).toBe(title);
    for (const part of [...parts, CAUTION_TEXT, `${input.level} - `])
      expect(written.text).toContain(part);
    for (const part of absent) expect(written.text).not.toContain(part);
  });

  it('writes local times in the offset of placedAt, not in UTC', () => {
    const written = noticeText(draft({}), {
      config: { ...CONFIG, placedAt: '2026-06-14T06:20:00-03:00' },
      phase: 'hardening',
    });
    // T0 = 10:20 UTC = 07:20 at -03:00; closing 70 min later
    expect(written.text).toContain('2026-06-14 07:20 (UTC-03:00)');
    expect(written.title).toContain('at about 08:30');
  });
});
