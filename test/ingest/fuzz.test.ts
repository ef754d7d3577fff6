/**
 * Fuzz: 12,000 payloads from fast-check, most of them malformed or hostile, interleaved with
 * valid ones, through the real ingest and archive. Every bad one must be quarantined with the
 * reason its construction implies, every valid one stored, and ingest must keep going.
 */
import { expect, it } from 'vitest';
import { hostileCases, openFuzzTarget } from '../helpers/hostilePayloads.ts';

it(
  'quarantines 10,000+ hostile payloads with the right reason and stores every valid one',
  { timeout: 60_000 },
  async () => {
    const { archive, ingestor } = openFuzzTarget();
    const cases = hostileCases(12_000, 20260614);
    const valid = cases.filter((c) => c.expected === 'stored');

    for (let start = 0; start < cases.length; start += 400) {
      await Promise.all(
        cases.slice(start, start + 400).map((c) => ingestor.data(c.topic, c.bytes)),
      );
    }

    const bad = cases.filter((c) => c.expected !== 'stored');
    expect(bad.length).toBeGreaterThanOrEqual(10_000);
    const quarantined = [
      ...archive.quarantine(null, 100_000),
      ...archive.quarantine('run-1', 100_000),
    ].sort((a, b) => a.id - b.id);
    const mismatches = bad
      .map((c, i) => ({
        expected: c.expected,
        got: quarantined[i]?.reason,
        bytes: c.bytes.subarray(0, 80).toString(),
      }))
      .filter((m) => m.expected !== m.got);
    expect(mismatches.slice(0, 5)).toEqual([]);
    expect(quarantined).toHaveLength(bad.length);
    expect(archive.totals().readings).toBe(valid.length);
    expect(ingestor.counters.commitFailures).toBe(0);
    expect(archive.integrityCheck()).toEqual(['ok']);
    archive.close();
  },
);
