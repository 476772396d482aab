import { describe, expect, it } from 'vitest';
import { compose, conformalCoating, crossSection, lamellar, profileOutline, sawtooth, thinFilmStack, volumeGrating } from '../../src/structure/index.ts';

const base = { ridgeMaterial: 'resist', grooveMaterial: 'air' } as const;

describe('crossSection()', () => {
  it('covers every period of every slice exactly once with rectangles', () => {
    const g = conformalCoating(sawtooth({ periodUm: 0.8, blazeDeg: 28, slices: 6, ...base }), { thicknessUm: 0.04, material: 'Al', slices: 9 });
    const layers = compose({ above: thinFilmStack({ films: [{ material: 'MgF2', thicknessUm: 0.1 }] }), grating: g });
    const P = 3;
    const cs = crossSection(layers, 0.8, P);
    expect(cs.widthUm).toBeCloseTo(2.4, 14);
    expect(cs.heightUm).toBeCloseTo(0.1 + g.depthUm, 14);
    let z = 0;
    layers.forEach((l, i) => {
      const mine = cs.polygons.filter((p) => p.layer === i);
      for (const p of mine) {
        expect(p.points.length).toBe(4);
        const zs = p.points.map((q) => q[1]);
        expect(Math.min(...zs)).toBeCloseTo(z, 12);
        expect(Math.max(...zs)).toBeCloseTo(z + l.thicknessUm, 12); // z downward from the top (definition)
      }
      for (let k = 0; k < P; k++) {
        // x-intervals of this period, sorted: they must chain from kΛ to (k+1)Λ without gap or overlap
        const xs = mine
          .map((p) => [Math.min(...p.points.map((q) => q[0])), Math.max(...p.points.map((q) => q[0]))] as const)
          .filter(([a, b]) => a >= k * 0.8 - 1e-12 && b <= (k + 1) * 0.8 + 1e-12)
          .sort((a, b) => a[0] - b[0]);
        expect(xs[0]![0]).toBeCloseTo(k * 0.8, 12);
        for (let j = 1; j < xs.length; j++) expect(xs[j]![0]).toBeCloseTo(xs[j - 1]![1], 12);
        expect(xs.at(-1)![1]).toBeCloseTo((k + 1) * 0.8, 12);
      }
      expect(mine.reduce((s, p) => s + (Math.max(...p.points.map((q) => q[0])) - Math.min(...p.points.map((q) => q[0]))), 0)).toBeCloseTo(P * 0.8, 12);
      z += l.thicknessUm;
    });
  });

  it('draws a lamellar grating as ridge and groove per period, and a cosine slice with its modulation', () => {
    const cs = crossSection(lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.2, ...base }).layers, 1, 2);
    expect(cs.polygons.map((p) => p.material)).toEqual(['resist', 'air', 'resist', 'air']);
    expect(cs.polygons[2]!.points).toEqual([
      [1, 0],
      [1, 0.2],
      [1.5, 0.2],
      [1.5, 0],
    ]);
    const v = crossSection(volumeGrating({ periodUm: 1, thicknessUm: 3, material: 'gel', deltaEps: 0.04, phaseRad: 0.5 }).layers, 1, 1);
    expect(v.polygons).toEqual([{ material: 'gel', layer: 0, points: [[0, 0], [0, 3], [1, 3], [1, 0]], modulation: { deltaEps: 0.04, phaseRad: 0.5 } }]);
  });
});

describe('profileOutline()', () => {
  it('gives the exact sawtooth corners with z downward from the top', () => {
    const g = sawtooth({ periodUm: 1, blazeDeg: 30, slices: 4, ...base });
    const [o] = profileOutline(g, 2, 0.1);
    expect(o!.exact).toBe(true);
    const d = g.depthUm;
    // geometry: apex at x = d·cot 30° = 0.75 Λ, at the top of the profile
    const want = [
      [0, 0.1 + d],
      [0.75, 0.1],
      [1, 0.1 + d],
      [1.75, 0.1],
      [2, 0.1 + d],
    ];
    o!.points.forEach((p, i) => {
      expect(p[0]).toBeCloseTo(want[i]![0]!, 12);
      expect(p[1]).toBeCloseTo(want[i]![1]!, 12);
    });
  });

  it('adds the coating outer surface, t above the ridge top and rounded there', () => {
    const g = conformalCoating(lamellar({ periodUm: 1, duty: 0.4, depthUm: 0.2, offset: 0.3, ...base }), { thicknessUm: 0.05, material: 'Al', slices: 5 });
    const outs = profileOutline(g, 1);
    expect(outs.length).toBe(2);
    const outer = outs[1]!;
    expect(outer.exact).toBe(false);
    const at = (x: number): number => outer.points.reduce((best, p) => (Math.abs(p[0] - x) < Math.abs(best[0] - x) ? p : best))[1];
    expect(at(0.5)).toBeCloseTo(0, 12); // the coating's top: z = 0
    expect(at(0.1)).toBeCloseTo(0.25 - 0.05, 12); // groove floor coated to t: z = depth − t
    // geometry: the arc over the corner at x = 0.3: height d + √(t² − (0.3 − x)²) at x = 0.27
    const x = 0.27;
    const p = outer.points.find((q) => Math.abs(q[0] - x) < 1e-3)!;
    expect(p[1]).toBeCloseTo(0.25 - (0.2 + Math.sqrt(0.05 ** 2 - (0.3 - p[0]) ** 2)), 12);
  });
});
