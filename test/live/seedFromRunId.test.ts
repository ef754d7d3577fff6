/**
 * seedFromRunId(): FNV-1a, 32 bit. Reference values: the FNV offset basis for the empty text and
 * the published FNV-1a test vectors for "a" and "foobar" (Fowler, Noll and Vo, FNV test suite;
 * values from memory, consistent with the simulators' own fnv1a32).
 */
import { describe, expect, it } from 'vitest';
import { seedFromRunId } from '../../server/src/live/seedFromRunId.ts';
import { fnv1a32 } from '../../simulators/src/seededRandom.ts';

describe('seedFromRunId()', () => {
  it.each([
    { text: '', hash: 0x811c9dc5 },
    { text: 'a', hash: 0xe40c292c },
    { text: 'foobar', hash: 0xbf9cf968 },
  ])('hashes "$text" to $hash', ({ text, hash }) => {
    expect(seedFromRunId(text)).toBe(hash);
  });

  it.each(['ferngate-l3', 'run-2026-07-16', 'x'])('agrees with the simulators for "%s"', (id) => {
    expect(seedFromRunId(id)).toBe(fnv1a32(id));
  });
});
