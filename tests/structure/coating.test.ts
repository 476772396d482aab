import { describe, expect, it } from 'vitest';
import {
  conformalCoating,
  filledCoating,
  lamellar,
  multiLevel,
  profileFromExpression,
  sawtooth,
  sinusoid,
  StructureError,
  trapezoid,
  volumeGrating,
} from '../../src/structure/index.ts';
import { fill, midHeights, segs, tiles } from './helpers.ts';

const DEG = Math.PI / 180;
const base = { ridgeMaterial: 'glass', grooveMaterial: 'air' } as const;

/** Coating area per period (µm²) summed over the slices. */
function coatArea(p: { layers: ReadonlyArray<Parameters<typeof fill>[0]>; periodUm: number }, material: string): number {
  return p.layers.reduce((s, l) => s + fill(l, material) * p.periodUm * l.thicknessUm, 0);
}

describe('conformalCoating()', () => {
  const L = 1;
  const f = 0.4;
  const d = 0.2;
  const t = 0.05;
  const lam = lamellar({ periodUm: L, duty: f, depthUm: d, offset: 0.3, ...base });

  it('coats a lamellar ridge: groove floor, sidewalls and rounded top corners, each slice exact', () => {
    const c = conformalCoating(lam, { thicknessUm: t, material: 'Al', slices: 12 });
    expect(c.depthUm).toBeCloseTo(d + t, 14);
    expect(c.slices).toBe(12);
    const mids = midHeights(c);
    c.layers.forEach((l, i) => {
      const z = mids[i]!;
      expect(tiles(l)).toBe(true);
      const s = segs(l);
      if (z < t) {
        // geometry: the groove floor is coated to height t from wall to wall
        expect(s).toEqual([
          [0, 0.3, 'Al'],
          [0.3, expect.closeTo(0.7, 12), 'glass'],
          [expect.closeTo(0.7, 12), 1, 'Al'],
        ]);
      } else if (z < d) {
        // geometry: t on each vertical sidewall
        expect(s.map((x) => x[2])).toEqual(['air', 'Al', 'glass', 'Al', 'air']);
        expect(s[1]![0]).toBeCloseTo(0.3 - t, 12);
        expect(s[3]![1]).toBeCloseTo(0.7 + t, 12);
      } else {
        // geometry: quarter circles of radius t around the top corners, flat between them
        const w = Math.sqrt(t * t - (z - d) ** 2);
        expect(s.map((x) => x[2])).toEqual(['air', 'Al', 'air']);
        expect(s[1]![0]).toBeCloseTo(0.3 - w, 12);
        expect(s[1]![1]).toBeCloseTo(0.7 + w, 12);
      }
    });
    // slice boundaries fall on the floor coating's top (t) and the ridge top (d): two flat levels, one slice each
    const flat = c.layers.filter((l) => l.thicknessUm > t);
    expect(flat.length).toBe(1);
    expect(flat[0]!.thicknessUm).toBeCloseTo(d - t, 14);
    expect(c.layers.at(-1)!.thicknessUm).toBeCloseTo(t, 14);
  });

  it('raises the slice count to one per level when fewer are asked for, and says so', () => {
    const c = conformalCoating(lam, { thicknessUm: t, material: 'Al', slices: 1 });
    expect(c.slices).toBe(3); // floor coating, sidewalls, rounded top: three levels (geometry)
    expect(c.notes.at(-1)).toBe('slices: 3 used instead of 1: the profile has 3 levels that each need a slice of their own');
  });

  it('gives a right-angle sawtooth the offset area t·ℓ + πt²/4 − t² per period', () => {
    const b = 25;
    const g = sawtooth({ periodUm: L, blazeDeg: b, slices: 10, ...base });
    const dd = g.depthUm;
    const ell = dd / Math.sin(b * DEG) + dd / Math.cos(b * DEG);
    // geometry (area of a one-sided offset of a polygon): a quarter disc added at the 90° apex,
    // a t×t square counted twice at the 90° groove bottom
    const expected = t * ell + (Math.PI * t * t) / 4 - t * t;
    const err = (n: number): number => {
      const c = conformalCoating(g, { thicknessUm: t, material: 'Al', slices: n });
      expect(Math.abs(coatArea(c, 'glass') - 0.5 * L * dd)).toBeLessThan(1e-6); // the ridge is untouched: triangle area
      return Math.abs(coatArea(c, 'Al') - expected) / expected;
    };
    // the staircase's area error falls like S^−1.5 (square-root ends of the arc): measured 1.5e-4 and 2.3e-5
    const e100 = err(100);
    const e400 = err(400);
    expect(e400).toBeLessThan(5e-5);
    expect(e400).toBeLessThan(e100 / 4);
  });

  it('gives a sinusoid the area t × arc length (Steiner: the curvature integrates to zero over a period)', () => {
    const dd = 0.2;
    const g = sinusoid({ periodUm: L, depthUm: dd, slices: 10, ...base });
    const c = conformalCoating(g, { thicknessUm: t, material: 'Al', slices: 300, strategy: 'adaptive' });
    let ell = 0;
    const K = 20000;
    for (let k = 0; k < K; k++) {
      const x = (k + 0.5) / K;
      const slope = (dd / 2) * 2 * Math.PI * Math.sin(2 * Math.PI * x); // dh/dx of (d/2)(1 − cos 2πx)
      ell += Math.sqrt(1 + slope * slope) / K; // midpoint quadrature of the arc length (independent)
    }
    // geometry: valid while t stays below the smallest radius of curvature, 1/((d/2)(2π)²) = 0.253 µm
    expect(Math.abs(coatArea(c, 'Al') - t * ell) / (t * ell)).toBeLessThan(1e-4);
  });

  it('coats an expression profile through its sampled polyline with the same Steiner area', () => {
    const e = profileFromExpression({ periodUm: L, expression: '0.1*(1 - cos(2*pi*x))', slices: 10, ...base });
    const c = conformalCoating(e, { thicknessUm: 0.04, material: 'Al', slices: 200, strategy: 'adaptive' });
    let ell = 0;
    const K = 20000;
    for (let k = 0; k < K; k++) {
      const slope = 0.1 * 2 * Math.PI * Math.sin((2 * Math.PI * (k + 0.5)) / K); // dh/dx
      ell += Math.sqrt(1 + slope * slope) / K;
    }
    // geometry (Steiner), as for the sinusoid; 2e-4 allows for 200 slices over 4096 chords
    expect(Math.abs(coatArea(c, 'Al') - 0.04 * ell) / (0.04 * ell)).toBeLessThan(2e-4);
  });

  it('stacks a second coating on the first: four materials across the period in their order', () => {
    const t2 = 0.03;
    const c1 = conformalCoating(lam, { thicknessUm: t, material: 'Cr', slices: 6 });
    const c2 = conformalCoating(c1, { thicknessUm: t2, material: 'Au', slices: 20 });
    expect(c2.depthUm).toBeCloseTo(d + t + t2, 9);
    expect(c2.surfaces.length).toBe(3);
    const mids = midHeights(c2);
    let seen = 0;
    c2.layers.forEach((l, i) => {
      const z = mids[i]!;
      if (!(z > t + t2 && z < d)) return;
      seen++;
      const s = segs(l);
      // geometry: along the sidewalls each coating keeps its thickness
      expect(s.map((x) => x[2])).toEqual(['air', 'Au', 'Cr', 'glass', 'Cr', 'Au', 'air']);
      expect(s[1]![0]).toBeCloseTo(0.3 - t - t2, 9);
      expect(s[2]![0]).toBeCloseTo(0.3 - t, 9);
      expect(s[5]![1]).toBeCloseTo(0.7 + t + t2, 9);
    });
    expect(seen).toBeGreaterThan(0);
  });

  it('coats a nested multi-level staircase and leaves no slice straddling a step', () => {
    const m = multiLevel({ periodUm: 2, steps: 4, blazeDepthUm: 0.8, ...base });
    const c = conformalCoating(m, { thicknessUm: 0.05, material: 'Al', slices: 20 });
    let z = c.depthUm;
    for (const l of c.layers) {
      const lo = z - l.thicknessUm;
      for (const step of [0.2, 0.4, 0.6]) expect(lo < step - 1e-12 && z > step + 1e-12).toBe(false);
      z = lo;
    }
  });

  it('refuses profiles without a single-valued surface and a coating of the groove material', () => {
    const under = trapezoid({ periodUm: 1, depthUm: 0.3, duty: 0.5, sidewallDeg: 95, slices: 3, ...base });
    expect(() => conformalCoating(under, { thicknessUm: 0.02, material: 'Al', slices: 5 })).toThrow(/coating\.profile: expected a profile with a single-valued top surface/);
    const slanted = lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.3, slantDeg: 10, slices: 3, ...base });
    expect(() => conformalCoating(slanted, { thicknessUm: 0.02, material: 'Al', slices: 5 })).toThrow(StructureError);
    const vol = volumeGrating({ periodUm: 1, thicknessUm: 2, material: 'gel', deltaEps: 0.05 });
    expect(() => conformalCoating(vol, { thicknessUm: 0.02, material: 'Al', slices: 5 })).toThrow(/coating\.profile/);
    expect(() => conformalCoating(lam, { thicknessUm: 0.02, material: 'air', slices: 5 })).toThrow("coating.material: expected a material other than the groove material 'air', found air");
  });
});

describe('filledCoating()', () => {
  it('fills the grooves and adds a flat film above the highest point', () => {
    const g = sawtooth({ periodUm: 1, blazeDeg: 30, slices: 5, ...base });
    const f = filledCoating(g, { material: 'resist', thicknessUm: 0.1 });
    expect(f.depthUm).toBeCloseTo(g.depthUm + 0.1, 14);
    expect(f.layers[0]).toEqual({ kind: 'uniform', thicknessUm: 0.1, material: 'resist' });
    f.layers.slice(1).forEach((l, i) => {
      expect(fill(l, 'air')).toBe(0);
      expect(fill(l, 'glass')).toBeCloseTo(fill(g.layers[i]!, 'glass'), 15); // the ridge is kept (definition)
      expect(l.thicknessUm).toBe(g.layers[i]!.thicknessUm);
    });
    expect(filledCoating(g, { material: 'resist', thicknessUm: 0 }).layers.length).toBe(g.layers.length);
  });

  it('lets a conformal coating follow the flat top', () => {
    const g = sinusoid({ periodUm: 1, depthUm: 0.2, slices: 6, ...base });
    const c = conformalCoating(filledCoating(g, { material: 'resist', thicknessUm: 0.05 }), { thicknessUm: 0.04, material: 'Al', slices: 8 });
    expect(c.layers[0]).toEqual({ kind: 'uniform', thicknessUm: expect.closeTo(0.04, 12), material: 'Al' });
    expect(c.depthUm).toBeCloseTo(0.29, 12);
  });
});
