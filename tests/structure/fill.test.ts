/**
 * The fill a polyline surface reports without building intervals equals the total width of the
 * intervals it reports above the same height, and slicing with it keeps the slicing rule
 * (sawtooth: under straight facets the ridge width is linear in height — similar triangles — so
 * the fill changes at a constant rate and the adaptive rule gives equal slices).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { polylineSurface, profileFromTable, sawtooth } from '../../src/structure/index.ts';
import { fill } from './helpers.ts';

describe('polyline fill above a height', () => {
  it('equals the width of above(z) for random periodic polylines (to 1e-15 of the period)', () => {
    const poly = fc
      .array(fc.tuple(fc.double({ min: 0, max: 1, noNaN: true }), fc.double({ min: 0, max: 2, noNaN: true })), { minLength: 2, maxLength: 12 })
      .map((pts) => [...pts].sort((a, b) => a[0] - b[0]))
      .filter((pts) => pts[pts.length - 1]![0] - pts[0]![0] < 1);
    fc.assert(
      fc.property(poly, fc.double({ min: 0.5, max: 3, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true }), (pts, L, t) => {
        const s = polylineSurface(L, pts.map(([x, h]) => [x * L, h] as [number, number]));
        const z = s.minUm + t * (s.maxUm - s.minUm);
        const width = s.above(z).reduce((w, [a, b]) => w + (b - a), 0);
        expect(Math.abs(s.fillAbove!(z) - width)).toBeLessThan(1e-15 * 16);
      }),
      { numRuns: 500 },
    );
  });

  it('slices a sawtooth adaptively into equal heights with ridge fills (k + ½)/S (straight facets: fill linear in height, by similar triangles)', () => {
    const S = 10;
    const r = sawtooth({ periodUm: 1, blazeDeg: 10, ridgeMaterial: 'R', grooveMaterial: 'G', slices: S, strategy: 'adaptive' });
    expect(r.slices).toBe(S);
    r.layers.forEach((l, k) => {
      // to 1e-8 relative: the change is measured from 1e-9 of the height inside the ends of the range
      expect(Math.abs(l.thicknessUm / (r.depthUm / S) - 1)).toBeLessThan(1e-8);
      expect(Math.abs(fill(l, 'R') - (k + 0.5) / S)).toBeLessThan(1e-8); // top slice first: the narrowest ridge
    });
  });

  it('gives each flat level of a two-step table profile one slice (nothing changes with height inside a level)', () => {
    const points: Array<[number, number]> = [[0, 0], [0.2, 0], [0.2, 0.3], [0.5, 0.3], [0.5, 0.6], [0.8, 0.6], [0.8, 0]];
    const r = profileFromTable({ periodUm: 1, points, ridgeMaterial: 'R', grooveMaterial: 'G', slices: 20 });
    expect(r.slices).toBe(2);
    expect(r.notes.join(' ')).toMatch(/2 used instead of 20: nothing changes with height over 2 flat level/);
    expect(r.layers.map((l) => l.thicknessUm)).toEqual([0.3, 0.3]);
    expect(fill(r.layers[0]!, 'R')).toBeCloseTo(0.3, 12); // top level: ridge on [0.5, 0.8)
    expect(fill(r.layers[1]!, 'R')).toBeCloseTo(0.6, 12); // lower level: ridge on [0.2, 0.8)
  });
});
