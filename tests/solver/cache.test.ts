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

describe('scratch storage across solves', () => {
  /** A lamellar metal grating (lossy: general eigen path) and a lossless one (Hermitian path). */
  const metal = (d: number): Structure => ({
    periodUm: 0.8,
    cover: { re: 1, im: 0 },
    substrate: { re: 0.2, im: 3.2 },
    layers: [{ thicknessUm: d, profile: { kind: 'segments', segments: [{ from: 0, to: 0.4, index: { re: 0.2, im: 3.2 } }, { from: 0.4, to: 1, index: { re: 1, im: 0 } }] } }],
  });
  const bits = (r: ReturnType<typeof solve>): number[] =>
    (['s', 'p'] as const).flatMap((pol) => [...r[pol].reflected, ...r[pol].transmitted].flatMap((o) => [o.efficiency, o.amplitudeS.re, o.amplitudeS.im, o.amplitudeP.re, o.amplitudeP.im]));

  it('interleaved solves of other structures, orders and mounts leave no trace: every result is bit for bit the first one', () => {
    const cases: Array<() => ReturnType<typeof solve>> = [
      () => solve(sawtooth(0.3), { wavelengthUm: 0.55, thetaDeg: 12 }, { orders: 6 }),
      () => solve(metal(0.25), { wavelengthUm: 0.6, thetaDeg: 20 }, { orders: 9 }),
      () => solve(sawtooth(0.2), { wavelengthUm: 0.5, thetaDeg: 5, phiDeg: 30 }, { orders: 4 }),
      () => solve(metal(0.1), { wavelengthUm: 0.7, thetaDeg: 0 }, { orders: 6 }),
    ];
    const first = cases.map((c) => bits(c()));
    for (const k of [3, 1, 0, 2, 2, 0, 3, 1]) expect(bits(cases[k]!())).toEqual(first[k]);
  });

  it('with a cache shared across a depth sweep, kept and scratch interface work agree bit for bit with a second pass', () => {
    const cache = new ModeCache();
    const inc = { wavelengthUm: 0.55, thetaDeg: 12 };
    const depths = [0.1, 0.2, 0.35];
    const pass1 = depths.map((d) => bits(solve(sawtooth(d), inc, { orders: 6 }, cache)));
    const pass2 = depths.map((d) => bits(solve(sawtooth(d), inc, { orders: 6 }, cache)));
    expect(pass2).toEqual(pass1);
  });
});
