/** Words beside the gauges (web/src/panels/figureGauges.ts): a state is never colour alone. */
import { describe, expect, it } from 'vitest';
import { utilizationWords } from '../../../web/src/panels/figureGauges.ts';

describe('utilizationWords()', () => {
  const thresholds = [0.57, 0.69, 1.0];
  it.each<[number | null, string]>([
    [null, 'not yet computed'],
    [0.3, 'below the first threshold (0.57)'],
    [0.57, 'past the threshold 0.57'],
    [0.8, 'past the threshold 0.69'],
    [1.0, 'at or above 1: stress has reached strength'],
    [1.4, 'at or above 1: stress has reached strength'],
  ])('utilizationWords(%s) says %j', (utilization, expected) => {
    expect(utilizationWords(utilization, thresholds)).toBe(expected);
  });

  it('before final set says the suction has reached air entry, not that stress reached strength (physics.md 7)', () => {
    expect(utilizationWords(1.2, thresholds, 'plastic')).toBe(
      'at or above 1: suction has reached air entry, the surface starts to drain',
    );
    expect(utilizationWords(0.8, thresholds, 'plastic')).toBe('past the threshold 0.69');
  });

  it('reads thresholds in any order', () => {
    expect(utilizationWords(0.6, [1.0, 0.57, 0.69])).toBe('past the threshold 0.57');
  });
});
