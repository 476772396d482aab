/** Reusing layer modes across solves changes no number, and does reuse them. */
import { describe, expect, it } from 'vitest';
import { ModeCache, solve } from '../../src/solver/index.ts';
import type { Layer, Structure } from '../../src/solver/index.ts';

/** A 12-slice staircase sawtooth of a lossy ridge material, scaled to a given depth. */
function sawtooth(depthUm: number): Structure {
  const S = 12;
  const layers: Layer[] = [];
  for (let k = 0; k < S; k++) {
    const fill = (k + 0.5) / S;
    layers.push({
      thicknessUm: depthUm / S,
      profile: { kind: 'segments', segments: [{ from: 0, to: fill, index: { re: 1.6, im: 0.02 } }, { from: fill, to: 1, index: { re: 1, im: 0 } }] },
    });
  }
  return { periodUm: 1, cover: { re: 1, im: 0 }, substrate: { re: 1.6, im: 0.02 }, layers };
}

describe('ModeCache', () => {
  it('a depth sweep with the cache gives the numbers of fresh solves (to 1e-12) and solves each slice once per wavelength', () => {
    const cache = new ModeCache();
    const inc = { wavelengthUm: 0.55, thetaDeg: 12 };
    for (const d of [0.1, 0.2, 0.35, 0.5]) {
      const a = solve(sawtooth(d), inc, { orders: 6 }, cache);
      const b = solve(sawtooth(d), inc, { orders: 6 });
      for (const pol of ['s', 'p'] as const) {
        a[pol].reflected.forEach((o, i) => expect(Math.abs(o.efficiency - b[pol].reflected[i]!.efficiency)).toBeLessThan(1e-12));
        expect(Math.abs(a[pol].T - b[pol].T)).toBeLessThan(1e-12);
      }
    }
    // 12 slice profiles, the cover and the substrate, per family (TE, TM)
    expect(cache.misses).toBe(28);
    expect(cache.hits).toBe(3 * 28);
  });

  it('a new wavelength or angle computes new modes', () => {
    const cache = new ModeCache();
    solve(sawtooth(0.3), { wavelengthUm: 0.55, thetaDeg: 12 }, { orders: 4 }, cache);
    solve(sawtooth(0.3), { wavelengthUm: 0.56, thetaDeg: 12 }, { orders: 4 }, cache);
    solve(sawtooth(0.3), { wavelengthUm: 0.56, thetaDeg: 13 }, { orders: 4 }, cache);
    expect(cache.hits).toBe(0);
    expect(cache.misses).toBe(3 * 28);
  });

  it('drops the least recently used entries beyond its size', () => {
    const cache = new ModeCache(5);
    solve(sawtooth(0.3), { wavelengthUm: 0.55, thetaDeg: 12 }, { orders: 3 }, cache);
    expect(cache.size).toBe(5);
    expect(() => new ModeCache(0)).toThrow(/maxEntries must be an integer ≥ 1/);
  });
});
