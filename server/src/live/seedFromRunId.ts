/**
 * The ensemble seed of a run, derived from its id so a replay of the same run is identical.
 */

/**
 * FNV-1a hash of the run id, 32 bit, as a positive seed: `h = (h XOR c) * 16777619 mod 2^32`
 * over the UTF-16 code units, from the offset basis 2166136261; 0 is mapped to 1 (the generator
 * wants a seed of at least 1).
 *
 * @param runId - any text (an empty id gives the hash of the offset basis)
 * @returns a whole number in 1..2^32-1
 * Source: Fowler, Noll and Vo, FNV hash (public domain).
 */
export function seedFromRunId(runId: string): number {
  let hash = 2166136261;
  for (let index = 0; index < runId.length; index += 1) {
    hash ^= runId.charCodeAt(index);
    hash = Math.imul(hash, 16777619) >>> 0;
  }
  return hash === 0 ? 1 : hash;
}
