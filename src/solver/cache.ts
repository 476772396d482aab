/**
 * A cache of layer eigenmodes across solves.
 *
 * A layer's modes depend on its permittivity profile, the normalized tangential wavevectors of
 * the retained orders (so λ/Λ, θ, φ and the order window) and the method switches — not on its
 * thickness. A depth sweep of a sliced profile (same fill factors, scaled thicknesses) therefore
 * needs one eigensolve per slice per wavelength; the rest is the cheap layer recursion. Identical
 * slices within one structure share their modes as well. Least-recently-used entries are dropped
 * beyond `maxEntries` (each entry holds a few n×n complex matrices: about 0.5 MB at n = 101).
 */
import type { Modes } from './modes.ts';

/** Modes a cache has handed out more than once (see {@link isShared}). */
const shared = new WeakSet<Modes>();

/**
 * True when a mode cache has returned these modes more than once: work derived from them alone
 * (such as interface matrices between two shared media) may be kept, as it can be asked for again.
 */
export function isShared(m: Modes): boolean {
  return shared.has(m);
}

export class ModeCache {
  readonly #map = new Map<string, Modes>();
  /** lookups answered from the cache */
  hits = 0;
  /** lookups that had to compute modes */
  misses = 0;
  constructor(readonly maxEntries = 128) {
    if (!(Number.isInteger(maxEntries) && maxEntries >= 1)) throw new RangeError(`ModeCache: maxEntries must be an integer ≥ 1, found ${maxEntries}`);
  }
  /** The cached modes for `key`, computing and storing them with `make` when absent. */
  get(key: string, make: () => Modes): Modes {
    const m = this.#map.get(key);
    if (m) {
      this.hits++;
      shared.add(m);
      // refresh recency: Map keeps insertion order
      this.#map.delete(key);
      this.#map.set(key, m);
      return m;
    }
    this.misses++;
    const v = make();
    this.#map.set(key, v);
    if (this.#map.size > this.maxEntries) this.#map.delete(this.#map.keys().next().value!);
    return v;
  }
  get size(): number {
    return this.#map.size;
  }
  clear(): void {
    this.#map.clear();
  }
}
