/**
 * Seeded random draws for the simulators (Mersenne Twister through @stdlib): the same seed gives
 * the same noise, gusts and dropouts, so a scenario replays identically. Each device draws from
 * its own stream, derived from the scenario seed and the device id, so adding a device does not
 * change the readings of the others.
 */
import normal from '@stdlib/random-base-normal';
import uniform from '@stdlib/random-base-uniform';

/** Random draws of one stream. */
export interface SeededRandom {
  /** A draw from N(mean, sd); sd 0 returns mean. */
  normal(mean: number, sd: number): number;
  /** A draw from U[0, 1). */
  uniform(): number;
}

/**
 * FNV-1a hash of a text, 32 bit: mixes a device id into the scenario seed.
 * Source: Fowler, Noll and Vo, FNV hash (public domain), offset basis 2166136261, prime 16777619.
 */
export function fnv1a32(text: string): number {
  let hash = 2166136261;
  for (let index = 0; index < text.length; index += 1) {
    hash ^= text.charCodeAt(index);
    hash = Math.imul(hash, 16777619) >>> 0;
  }
  return hash >>> 0;
}

/**
 * A stream seeded from `seed` and `streamName`.
 *
 * @param seed - scenario seed, a whole number 0..2^32-1
 * @param streamName - e.g. the device id; different names give independent-looking streams
 */
export function seededRandom(seed: number, streamName: string): SeededRandom {
  // MT19937 takes a seed in 1..2^32-1: zero is mapped to 1.
  const streamSeed = (seed ^ fnv1a32(streamName)) >>> 0 || 1;
  const normalDraw = normal.factory({ seed: streamSeed });
  const uniformDraw = uniform.factory(0, 1, { seed: (streamSeed ^ 0x9e3779b9) >>> 0 || 1 });
  return {
    normal: (mean, sd) => (sd > 0 ? normalDraw(mean, sd) : mean),
    uniform: () => uniformDraw(),
  };
}
