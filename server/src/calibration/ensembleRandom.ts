/**
 * One seeded random number generator per ensemble. Every random draw of a calibration (the
 * initial ensemble, model noise inside a forecast step, perturbed observations) comes from it, in
 * a fixed order, so a replay of the same readings gives the same numbers; its state is a plain
 * array of 32-bit integers, so a snapshot taken mid-run resumes exactly where it stopped.
 */
import normalGenerator from '@stdlib/random-base-normal';

/** JSON form of an {@link EnsembleRandom}: the Mersenne Twister state words. */
export interface EnsembleRandomSnapshot {
  /** Layout of the snapshot, bumped if the generator ever changes. */
  generator: 'mt19937-improved-ziggurat';
  /** The MT19937 state as stdlib writes it (unsigned 32-bit integers). */
  state: number[];
}

/** A seeded generator: standard normal and uniform draws sharing one state. */
export interface EnsembleRandom {
  /** A standard normal draw (mean 0, standard deviation 1). */
  normal(): number;
  /** A uniform draw in [0, 1). */
  uniform(): number;
  /** The generator's current state, as plain JSON; restoring it resumes the same sequence. */
  snapshot(): EnsembleRandomSnapshot;
}

/** The part of stdlib's generator this file uses (its bundled types need @stdlib/types). */
interface StdlibNormal {
  (): number;
  readonly PRNG: () => number;
  state: Uint32Array;
}

type NormalFactory = (
  mean: number,
  standardDeviation: number,
  options: { seed?: number; state?: Uint32Array; copy?: boolean },
) => StdlibNormal;

const factory = (normalGenerator as unknown as { factory: NormalFactory }).factory;

function wrap(generator: StdlibNormal): EnsembleRandom {
  const uniform = generator.PRNG;
  return {
    normal: () => generator(),
    uniform: () => uniform(),
    snapshot: () => ({
      generator: 'mt19937-improved-ziggurat',
      state: Array.from(generator.state),
    }),
  };
}

/**
 * Creates the generator of one ensemble from a seed.
 *
 * Method: 32-bit Mersenne Twister (Matsumoto and Nishimura 1998, ACM TOMACS 8(1)) for uniform
 * draws; normal draws by the improved ziggurat of Doornik (2005), both as implemented in
 * stdlib-js (`@stdlib/random-base-normal`), whose whole state lives in the twister.
 *
 * @param seed - integer in [1, 2^32 - 1]; other values are reduced to that range
 *   (`|trunc(seed)| mod (2^32 - 1)`, 0 and NaN become 1) so a run configuration never throws here.
 * @returns a generator; the same seed always gives the same sequence.
 */
export function createEnsembleRandom(seed: number): EnsembleRandom {
  const reduced = Number.isFinite(seed) ? Math.abs(Math.trunc(seed)) % 4294967295 : 0;
  return wrap(factory(0, 1, { seed: reduced === 0 ? 1 : reduced }));
}

/**
 * Restores a generator from {@link EnsembleRandom.snapshot}: the next draws are exactly those the
 * original would have produced. The snapshot is copied, never shared.
 *
 * @param snapshot - a state written by `snapshot()`, possibly through JSON.
 * @throws Error when the state is not an MT19937 state written by this module (a corrupt
 *   snapshot is an edge error: the caller reports it rather than silently reseeding).
 */
export function restoreEnsembleRandom(snapshot: EnsembleRandomSnapshot): EnsembleRandom {
  if (snapshot.generator !== 'mt19937-improved-ziggurat') {
    throw new Error(
      `ensemble random snapshot generator must be "mt19937-improved-ziggurat": got ${JSON.stringify(snapshot.generator)}`,
    );
  }
  const words = snapshot.state;
  if (!Array.isArray(words) || words.some((w) => !Number.isInteger(w) || w < 0 || w > 4294967295)) {
    throw new Error('ensemble random snapshot state must be an array of unsigned 32-bit integers');
  }
  return wrap(factory(0, 1, { state: Uint32Array.from(words), copy: true }));
}
