/** "Now" for a measure logged from the dashboard (web/src/measureClock.ts). */
import { describe, expect, it } from 'vitest';
import { measureTimeFor } from '../../web/src/measureClock.ts';

describe('measureTimeFor()', () => {
  const wallMs = Date.parse('2026-12-02T11:00:00Z');
  it.each<[string, number | null, string | null]>([
    ['a live run (event time 3 min behind): the server clock', wallMs - 3 * 60_000, null],
    ['exactly 15 min behind: still live', wallMs - 15 * 60_000, null],
    ['before the first reading: the server clock', null, null],
    [
      'the demo, months behind the wall clock: the time of the latest figures',
      Date.parse('2026-07-16T14:30:00Z'),
      '2026-07-16T14:30:00.000Z',
    ],
    [
      'a run an hour behind (data late): the time of the latest figures',
      wallMs - 3_600_000,
      '2026-12-02T10:00:00.000Z',
    ],
  ])('%s', (_title, eventTimeMs, expected) => {
    expect(measureTimeFor(eventTimeMs, wallMs)).toBe(expected);
  });
});
