/**
 * A small seeded pseudo-random generator, so Monte Carlo runs and Latin-hypercube scans are
 * reproducible: the same seed gives the same numbers on every machine and in every thread.
 *
 * Generator: xoshiro128** (Blackman & Vigna, "Scrambled linear pseudorandom number generators",
 * ACM TOMS 47 (2021); 32-bit state words, period 2^128 − 1), its state filled from the seed by a
 * 32-bit SplitMix-style mixer. Doubles take 53 random bits from two outputs. Normal deviates by
 * the Box–Muller transform (Box & Muller, Ann. Math. Stat. 29 (1958) 610), one deviate per two
 * uniforms, so every call consumes the same amount of the stream.
 */

/** A reproducible stream of random numbers. */
export interface Random {
  /** a double uniformly distributed in [0, 1), 53 random bits */
  uniform(): number;
  /** a standard normal deviate (mean 0, standard deviation 1) */
  normal(): number;
  /** a whole number uniformly distributed in [0, n) */
  below(n: number): number;
}

/**
 * Largest seed accepted (seeds are whole numbers 0 … 2^32 − 1).
 * @example
 * createRandom(MAX_SEED); // the last valid stream
 */
export const MAX_SEED = 0xffffffff;

function mix32(a: number): number {
  let t = a | 0;
  t = Math.imul(t ^ (t >>> 16), 0x21f0aaad);
  t = Math.imul(t ^ (t >>> 15), 0x735a2d97);
  return (t ^ (t >>> 15)) >>> 0;
}

/**
 * A generator started from `seed`.
 * @param seed whole number 0 … 2^32 − 1
 * @throws {RangeError} for any other seed
 * @example
 * const r = createRandom(7);
 * r.uniform(); // same value on every run with seed 7
 * r.normal();  // standard normal deviate
 */
export function createRandom(seed: number): Random {
  if (!(Number.isInteger(seed) && seed >= 0 && seed <= MAX_SEED)) throw new RangeError(`seed must be a whole number 0…${MAX_SEED}, found ${seed}`);
  let x = seed >>> 0;
  const word = (): number => {
    x = (x + 0x9e3779b9) >>> 0;
    return mix32(x);
  };
  let s0 = word();
  let s1 = word();
  let s2 = word();
  let s3 = word();
  if ((s0 | s1 | s2 | s3) === 0) s0 = 1; // the all-zero state is a fixed point
  const next = (): number => {
    const r = Math.imul(rotl(Math.imul(s1, 5) >>> 0, 7), 9) >>> 0;
    const t = (s1 << 9) >>> 0;
    s2 = (s2 ^ s0) >>> 0;
    s3 = (s3 ^ s1) >>> 0;
    s1 = (s1 ^ s2) >>> 0;
    s0 = (s0 ^ s3) >>> 0;
    s2 = (s2 ^ t) >>> 0;
    s3 = rotl(s3, 11);
    return r;
  };
  const uniform = (): number => ((next() >>> 5) * 67108864 + (next() >>> 6)) / 9007199254740992;
  return {
    uniform,
    normal(): number {
      const u1 = 1 - uniform(); // (0, 1]: the logarithm stays finite
      const u2 = uniform();
      return Math.sqrt(-2 * Math.log(u1)) * Math.cos(2 * Math.PI * u2);
    },
    below(n: number): number {
      if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`below: n must be a whole number ≥ 1, found ${n}`);
      return Math.floor(uniform() * n);
    },
  };
}

function rotl(v: number, k: number): number {
  return ((v << k) | (v >>> (32 - k))) >>> 0;
}

/**
 * Centred Latin-hypercube sample of `n` points in [0, 1]^dims: along every axis each of the n
 * equal strata holds exactly one point, at the stratum's centre; the pairing of strata between
 * axes is a random permutation per axis (McKay, Beckman & Conover, Technometrics 21 (1979) 239).
 * @throws {RangeError} for n < 1 or dims < 1
 * @example
 * latinHypercube(4, 2, createRandom(1)); // 4 points; each axis holds 0.125, 0.375, 0.625, 0.875 once
 */
export function latinHypercube(n: number, dims: number, rng: Random): number[][] {
  if (!(Number.isInteger(n) && n >= 1)) throw new RangeError(`latinHypercube: n must be a whole number ≥ 1, found ${n}`);
  if (!(Number.isInteger(dims) && dims >= 1)) throw new RangeError(`latinHypercube: dims must be a whole number ≥ 1, found ${dims}`);
  const points = Array.from({ length: n }, () => new Array<number>(dims).fill(0));
  for (let d = 0; d < dims; d++) {
    const perm = Array.from({ length: n }, (_, i) => i);
    for (let i = n - 1; i > 0; i--) {
      const j = rng.below(i + 1);
      [perm[i], perm[j]] = [perm[j]!, perm[i]!];
    }
    for (let i = 0; i < n; i++) points[i]![d] = (perm[i]! + 0.5) / n;
  }
  return points;
}
