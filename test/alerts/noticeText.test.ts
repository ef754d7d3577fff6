import { describe, expect, it } from 'vitest';
import { noticeText } from '../../server/src/alerts/noticeText.ts';
import type { NoticeDraft } from '../../server/src/alerts/types.ts';
import type { MeasureEntry } from '../../server/src/live/types.ts';
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

/** A measure-log entry of `kind` from `fromMin` after T0 (12:20 on site), open or to `toMin`. */
function measure(
  id: string,
  kind: string,
  fromMin: number,
  toMin: number | null = null,
): MeasureEntry {
  return {
    id,
    kind,
    startMs: T0 + fromMin * MIN,
    endMs: toMin === null ? null : T0 + toMin * MIN,
    loggedBy: 'J. Okafor',
  };
}

describe('noticeText() with the measure log', () => {
  const fogging = measure('m1', 'fogging', -30);
  const windbreak = measure('m2', 'windbreak', -30);
  it.each([
    {
      name: 'no measures, before set: fogging, windbreaks and shade, nothing said as logged',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [],
      title: 'ACT NOW: apply curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'What to do now: Now, fog the air just above the surface (a fine mist; do not work water into the surface), put up windbreaks on the windward side, shade the surface from the sun. Log each measure in Meniscus',
      ],
      absent: ['logged since', 'counted in this forecast', 'Keep the', 'site engineer'],
    },
    {
      name: 'fogging and a windbreak before set: shade, then a covering held clear or more fog',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [fogging, windbreak],
      title: 'ACT NOW: add curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Fogging and a windbreak are logged since 11:50 and are counted in this forecast.',
        'What to do now: Now, shade the surface from the sun if it is not shaded yet, then cover the surface with plastic sheeting held clear of it',
        'raise the fog rate',
        'Keep the fogging and the windbreak going. Log each new measure in Meniscus',
      ],
      absent: ['fog the air', 'put up windbreaks'],
    },
    {
      name: 'fogging alone before set: windbreaks and shade, not fogging again',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [fogging],
      title: 'ACT NOW: add curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Fogging is logged since 11:50 and is counted in this forecast.',
        'Now, put up windbreaks on the windward side, shade the surface from the sun if it is not shaded yet. Keep the fogging going.',
      ],
      absent: ['fog the air', 'cover the surface'],
    },
    {
      name: 'a curing compound before set takes the place of fogging',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [measure('m1', 'curing-compound', -10)],
      title: 'ACT NOW: add curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'A curing compound is logged since 12:10 and is counted in this forecast.',
        'Now, put up windbreaks on the windward side, shade the surface',
      ],
      absent: ['fog the air', 'spray a curing compound'],
    },
    {
      name: 'wet covering after set: windbreaks and shade, not another covering',
      level: 'ACT NOW' as const,
      phase: 'hardening' as const,
      measures: [measure('m3', 'wet-covering', -20)],
      title: 'ACT NOW: add curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Wet covering is logged since 12:00 and is counted in this forecast.',
        'What to do now: Now, put up windbreaks on the windward side and shade the surface from the sun if it is not shaded yet. Keep the wet covering going.',
      ],
      absent: ['wet burlap', 'spray a curing compound', 'fog the air'],
    },
    {
      name: 'every measure in place before set: keep them going, check them, call the site engineer',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [fogging, windbreak, measure('m3', 'wet-covering', -5)],
      title:
        'ACT NOW: check the curing protection and call the site engineer - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Fogging (since 11:50), a windbreak (since 11:50) and wet covering (since 12:15) are logged and counted in this forecast.',
        'What to do now: Now, keep the fogging, the windbreak and the wet covering going and check they are working: the fog reaches the surface',
        'the windbreak stands on the windward side',
        'Call the site engineer',
      ],
      absent: ['fog the air', 'put up windbreaks', 'cover the surface', 'raise the fog rate'],
    },
    {
      name: 'every measure in place after set, windbreaks named as several',
      level: 'ACT NOW' as const,
      phase: 'hardening' as const,
      measures: [measure('m1', 'curing-compound', -30), windbreak, measure('m3', 'windbreak', -10)],
      title:
        'ACT NOW: check the curing protection and call the site engineer - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Windbreaks and a curing compound are logged since 11:50 and are counted in this forecast.',
        'keep the windbreaks and the curing compound going',
        'the windbreaks stand on the windward side',
        'Call the site engineer',
      ],
      absent: ['wet burlap', 'spray a curing compound', 'put up windbreaks'],
    },
    {
      name: 'CRACKING LIKELY with every measure in place: check them at once and look for cracks',
      level: 'CRACKING LIKELY' as const,
      phase: 'hardening' as const,
      measures: [measure('m1', 'wet-covering', -30), windbreak],
      title:
        'CRACKING LIKELY: check the protection at once and call the site engineer - margin closes at about 13:30, in about 1 h 10 min',
      parts: ['At once, keep the windbreak and the wet covering going', 'fine cracks'],
      absent: ['wet burlap', 'put up windbreaks'],
    },
    {
      name: 'PREPARE with fogging and a windbreak: get the next measures ready',
      level: 'PREPARE' as const,
      phase: 'plastic' as const,
      measures: [fogging, windbreak],
      title:
        'PREPARE: get more curing protection ready - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'What to do now: Get people and material ready to shade the surface from the sun if it is not shaded yet, then cover the surface',
        'Keep the fogging and the windbreak going.',
      ],
      absent: ['fog the air', 'put up windbreaks'],
    },
    {
      name: 'different starts and a logged end are each given, as the forecast counts them',
      level: 'ACT NOW' as const,
      phase: 'plastic' as const,
      measures: [measure('m1', 'fogging', -30, 300), measure('m2', 'windbreak', -20)],
      title: 'ACT NOW: add curing protection - margin closes at about 13:30, in about 1 h 10 min',
      parts: [
        'Fogging (since 11:50, to end at 17:20) and a windbreak (since 12:00) are logged and counted in this forecast.',
      ],
      absent: ['fog the air'],
    },
  ])('$name', ({ level, phase, measures, title, parts, absent }) => {
    const input = draft({ level });
    const written = noticeText(input, { config: CONFIG, phase, measures });
    expect(written.title).toBe(title);
    for (const part of [...parts, CAUTION_TEXT]) expect(written.text).toContain(part);
    for (const part of absent) expect(written.text).not.toContain(part);
    // no clause left empty, no doubled full stop or space
    expect(written.text).not.toMatch(/\.\.|\s\.|:\s*\.| {2}/);
  });

  it.each([
    { name: 'a measure that starts after the notice', entry: measure('m1', 'fogging', 10) },
    { name: 'a measure that ended before it', entry: measure('m1', 'fogging', -60, -10) },
    {
      name: 'a measure that ends at its time (the end is exclusive)',
      entry: measure('m1', 'fogging', -60, 0),
    },
    { name: 'an entry of a kind the engine does not apply', entry: measure('m1', 'sunshade', -60) },
  ])('does not name $name, and advises as with none', ({ entry }) => {
    const without = noticeText(draft({}), { config: CONFIG, phase: 'plastic' });
    const written = noticeText(draft({}), { config: CONFIG, phase: 'plastic', measures: [entry] });
    expect(written).toEqual(without);
    expect(written.text).toContain('fog the air just above the surface');
  });

  it('names a measure that starts at the notice time (the start is inclusive)', () => {
    const written = noticeText(draft({}), {
      config: CONFIG,
      phase: 'plastic',
      measures: [measure('m1', 'fogging', 0)],
    });
    expect(written.text).toContain(
      'Fogging is logged since 12:20 and is counted in this forecast.',
    );
    expect(written.text).not.toContain('fog the air');
  });

  it('a notice that asks for no protection does not name the measures', () => {
    const silent = draft({
      level: 'NOTE',
      kind: 'sensor-silent',
      conditionKey: 'sensor:probe-a',
      reasons: ['no rh-10 reading from probe-a since 12:05'],
    });
    const written = noticeText(silent, {
      config: CONFIG,
      phase: 'plastic',
      measures: [measure('m1', 'fogging', -30)],
    });
    expect(written).toEqual(noticeText(silent, { config: CONFIG, phase: 'plastic' }));
  });
});
