/**
 * Curves and look-up tables that are pure functions of a material's parameters, shared by every
 * model built from the same parameters in this process. A site runs many models of one preset
 * (each run's element, each restart, each CLI simulation): building the pore curves and their
 * table costs about 1.4 ms a model, and the lazily filled tables would be filled again by every
 * new model. Sharing changes no number: an entry is built from the parameters alone, and a
 * lazily filled table gives the same value whoever fills a node first.
 *
 * Keys are the JSON of the parameters; each kind keeps its 64 most recently used entries
 * (lru-cache), so a calibration that tries many parameter sets cannot grow it without bound.
 */
import { LRUCache } from 'lru-cache';

const ENTRIES_PER_KIND = 64;
const kinds = new Map<string, LRUCache<string, object>>();
/** Per kind, the entry last found for a parameters object, by identity (no JSON per look-up). */
const byIdentity = new Map<string, WeakMap<object, object>>();

/** JSON writes NaN and the infinities as null: here they keep their names, so keys differ. */
function keyOf(parameters: unknown): string {
  return JSON.stringify(parameters, (_key, value: unknown) =>
    typeof value === 'number' && !Number.isFinite(value) ? String(value) : value,
  );
}

/**
 * The entry of `kind` for `parameters` (plain data: numbers, strings, booleans, plain objects and
 * arrays), built by `build` the first time. A parameters object asked again is found by identity
 * without writing its JSON, so it must not change after its first use (model configuration
 * never does).
 */
export function sharedByParameters<T extends object>(
  kind: string,
  parameters: unknown,
  build: () => T,
): T {
  let identities = byIdentity.get(kind);
  if (identities === undefined) {
    identities = new WeakMap();
    byIdentity.set(kind, identities);
  }
  const isObject = typeof parameters === 'object' && parameters !== null;
  if (isObject) {
    const known = identities.get(parameters);
    if (known !== undefined) return known as T;
  }
  let cache = kinds.get(kind);
  if (cache === undefined) {
    cache = new LRUCache<string, object>({ max: ENTRIES_PER_KIND });
    kinds.set(kind, cache);
  }
  const key = keyOf(parameters);
  let entry = cache.get(key) as T | undefined;
  if (entry === undefined) {
    entry = build();
    cache.set(key, entry);
  }
  if (isObject) identities.set(parameters, entry);
  return entry;
}
