import { describe, expect, it } from 'vitest';
import { matchesDataFilter, parseDeviceTopic } from '../../server/src/ingest/topics.ts';

describe('parseDeviceTopic()', () => {
  const cases = [
    {
      topic: 'meniscus/harbour-deck/probe-a/data',
      expected: { site: 'harbour-deck', device: 'probe-a', channel: 'data' },
    },
    {
      topic: 'meniscus/site_1/mast.2/status',
      expected: { site: 'site_1', device: 'mast.2', channel: 'status' },
    },
    { topic: 'meniscus/harbour-deck/probe-a/data/extra', expected: null },
    { topic: 'meniscus/harbour-deck/probe-a/config', expected: null },
    { topic: 'other/harbour-deck/probe-a/data', expected: null },
    { topic: 'meniscus//probe-a/data', expected: null },
    { topic: 'meniscus/harbour deck/probe-a/data', expected: null },
    { topic: `meniscus/${'s'.repeat(65)}/probe-a/data`, expected: null },
  ];
  it.each(cases)('reads $topic', ({ topic, expected }) => {
    expect(parseDeviceTopic(topic)).toEqual(expected);
  });
});

describe('matchesDataFilter()', () => {
  it('matches what the subscription meniscus/+/+/data delivers, levels unchecked', () => {
    expect(matchesDataFilter('meniscus/a b/c/data')).toBe(true);
    expect(matchesDataFilter('meniscus//c/data')).toBe(true);
    expect(matchesDataFilter('meniscus/a/c/status')).toBe(false);
    expect(matchesDataFilter('meniscus/a/b/c/data')).toBe(false);
  });
});
