/**
 * A lazily filled table of smooth functions of equivalent age, for the element model's per-step
 * loop: the specific storage and the pore-refinement factor of every cell are functions of that
 * cell's equivalent age alone, and evaluating the strength, hydration and Powers-Brownyard laws
 * for every cell after every step cost more than the transport step itself. The table is uniform
 * in v = log2Linear(age / s) (_log2Linear.ts: log2 made piecewise linear, read off the number's
 * bits, so a look-up needs no Math.log) with a node on every integer v, and interpolated
 * linearly; a node is computed the first time a look-up needs it, so building costs nothing and
 * a run computes only the nodes its ages pass through.
 */
import { log2Linear } from './_log2Linear.ts';

/** Options of {@link createAgeTable}. */
export interface AgeTableOptions {
  /**
   * Youngest tabulated age, s; younger ages call the laws themselves. Default 1 s (our choice):
   * the first steps after placement last seconds, and calling the laws for every cell in each of
   * them cost about a tenth of a whole day's run; the laws are smooth in ln(age) down to there.
   */
  minAgeS?: number;
  /** Oldest tabulated age, s; older ages call the laws themselves. Default 1e9 (about 32 years). */
  maxAgeS?: number;
  /**
   * Nodes per doubling of the age (per unit of v), default 64 (steps of 0.8 to 1.6 % of the
   * age; our choice): the linear interpolation error is below h^2/8 |f''(v)| with h = 1/64,
   * about 3e-5 |f''| (test/engine/_ageTable.test.ts: within 3e-5 of the range of the laws the
   * model tabulates), well below the 1e-3 update threshold of the model; a day of ages from 1 s
   * fills about 1060 nodes, each a call of every law.
   */
  nodesPerDoubling?: number;
}

/** Look-up of several laws at one age; `values[k]` holds law k after {@link AgeTable.at}. */
export interface AgeTable {
  readonly values: Float64Array;
  /** Fills `values` with every law at `ageS` (s). */
  at(ageS: number): void;
}

/**
 * Wraps `laws` (functions of equivalent age in s, pure) in one look-up table uniform in
 * v = log2Linear(age):
 *   f_k(t) ~ f_k,j + w (f_k,j+1 - f_k,j),  j + w = (v(t) - v_0) K,
 * with v_0 the multiple of 1/K at or below v(minAgeS). Exact (the laws themselves) outside
 * [minAgeS, maxAgeS]; a NaN age gives the laws' answer for NaN.
 */
export function createAgeTable(
  laws: readonly ((ageS: number) => number)[],
  options: AgeTableOptions = {},
): AgeTable {
  const lawCount = laws.length;
  const minAgeS = options.minAgeS ?? 1;
  const maxAgeS = options.maxAgeS ?? 1e9;
  const nodesPerUnit = options.nodesPerDoubling ?? 64;
  const coordinateStart = Math.floor(log2Linear(minAgeS) * nodesPerUnit) / nodesPerUnit;
  const lastNode = Math.ceil((log2Linear(maxAgeS) - coordinateStart) * nodesPerUnit);
  const nodes = new Float64Array((lastNode + 1) * lawCount);
  const filled = new Uint8Array(lastNode + 1);
  const values = new Float64Array(lawCount);
  // Ages of the nodes: 2^e (1 + f) at v = e + f, exactly as log2Linear reads them.
  const ageAtNode = (node: number): number => {
    const coordinate = coordinateStart + node / nodesPerUnit;
    const exponent = Math.floor(coordinate);
    return 2 ** exponent * (1 + (coordinate - exponent));
  };
  const fill = (node: number): void => {
    filled[node] = 1;
    const ageS = ageAtNode(node);
    for (let k = 0; k < lawCount; k += 1)
      nodes[node * lawCount + k] = (laws[k] as (a: number) => number)(ageS);
  };
  return {
    values,
    at(ageS) {
      if (!(ageS >= minAgeS && ageS <= maxAgeS)) {
        for (let k = 0; k < lawCount; k += 1) values[k] = (laws[k] as (a: number) => number)(ageS);
        return;
      }
      const position = (log2Linear(ageS) - coordinateStart) * nodesPerUnit;
      const node = Math.min(lastNode - 1, Math.floor(position));
      const weight = position - node;
      if (filled[node] === 0) fill(node);
      if (filled[node + 1] === 0) fill(node + 1);
      const low = node * lawCount;
      const high = low + lawCount;
      for (let k = 0; k < lawCount; k += 1) {
        const below = nodes[low + k] as number;
        values[k] = below + weight * ((nodes[high + k] as number) - below);
      }
    },
  };
}
