// Fill and edge checks hold to 5e-12 (toBeCloseTo(…, 11)): slicing snaps segment edges to 1e-12 of
// the period so that depth sweeps reuse layer modes exactly (src/structure/slicing.ts, layerOf).
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  lamellar,
  multiLevel,
  profileFromExpression,
  profileFromTable,
  sawtooth,
  sinusoid,
  symmetricTriangle,
  trapezoid,
  volumeGrating,
} from '../../src/structure/index.ts';
import { fill, midHeights, segs, tiles } from './helpers.ts';

const DEG = Math.PI / 180;
const base = { ridgeMaterial: 'R', grooveMaterial: 'G' } as const;

describe('sawtooth()', () => {
  it('derives the depth d = Λ·sinθB·cosθB for the right-angle blaze', () => {
    for (const [L, b] of [
      [1, 30],
      [0.8333, 17.5],
      [3.3, 63.4],
    ] as const) {
      const g = sawtooth({ periodUm: L, blazeDeg: b, slices: 4, ...base });
      // geometry: base Λ, base angles θB and 90° − θB, right angle at the apex
      expect(g.depthUm).toBeCloseTo(L * Math.sin(b * DEG) * Math.cos(b * DEG), 13);
      expect(g.notes.join(' ')).toContain('depth');
    }
  });

  it('derives the depth d = Λ/(cot θB + cot β), β = 180° − apex − θB, for other apex angles', () => {
    // geometry: apex 120° on a 30° blaze is the isosceles triangle with 30° base angles, d = (Λ/2)·tan 30°
    expect(sawtooth({ periodUm: 2, blazeDeg: 30, apexDeg: 120, slices: 3, ...base }).depthUm).toBeCloseTo(Math.tan(30 * DEG), 13);
    // geometry: apex 90° − θB makes the anti-blaze facet vertical, d = Λ·tan θB
    expect(sawtooth({ periodUm: 1, blazeDeg: 25, apexDeg: 65, slices: 3, ...base }).depthUm).toBeCloseTo(Math.tan(25 * DEG), 13);
  });

  it('has ridge [z·cot θB, Λ − z·cot β] and fill 1 − z/d at every slice mid-height', () => {
    const L = 1.2;
    const b = 26;
    const g = sawtooth({ periodUm: L, blazeDeg: b, slices: 9, ...base });
    expect(g.slices).toBe(9);
    const d = g.depthUm;
    midHeights(g).forEach((z, i) => {
      const l = g.layers[i]!;
      expect(tiles(l)).toBe(true);
      // geometry: the fill of a right-angle blaze falls linearly from 1 at the base to 0 at the apex
      expect(fill(l, 'R')).toBeCloseTo(1 - z / d, 11);
      const ridge = segs(l).find((s) => s[2] === 'R')!;
      expect(ridge[0]).toBeCloseTo(z / Math.tan(b * DEG) / L, 11);
      expect(ridge[1]).toBeCloseTo(1 - (z * Math.tan(b * DEG)) / L, 11);
    });
  });

  it('keeps fill = 1 − z/d and a clean tiling over random blaze and apex angles', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 1, max: 80, noNaN: true }),
        fc.double({ min: 0, max: 0.999, noNaN: true }),
        fc.integer({ min: 1, max: 25 }),
        (b, u, n) => {
          const apex = 90 - b + u * 90; // [90° − θB, 180° − θB)
          const g = sawtooth({ periodUm: 0.7, blazeDeg: b, apexDeg: apex, slices: n, ...base });
          midHeights(g).forEach((z, i) => {
            expect(tiles(g.layers[i]!)).toBe(true);
            expect(fill(g.layers[i]!, 'R')).toBeCloseTo(1 - z / g.depthUm, 9); // geometry (any triangle)
          });
        },
      ),
      { seed: 20240611, numRuns: 60 },
    );
  });
});

describe('symmetricTriangle()', () => {
  it('ties depth and apex angle by d = (Λ/2)·cot(γ/2) either way', () => {
    // geometry: a 90° apex over a period Λ is Λ/2 deep
    expect(symmetricTriangle({ periodUm: 1, apexDeg: 90, slices: 2, ...base }).depthUm).toBeCloseTo(0.5, 14);
    const g = symmetricTriangle({ periodUm: 2, depthUm: 1 / Math.sqrt(3), slices: 2, ...base });
    expect(g.notes[0]).toContain('apex angle 120°'); // geometry: tan(60°) = 1/(1/√3)
  });

  it('has fill 1 − z/d centred on the period', () => {
    const g = symmetricTriangle({ periodUm: 1, depthUm: 0.3, slices: 6, ...base });
    midHeights(g).forEach((z, i) => {
      const r = segs(g.layers[i]!).find((s) => s[2] === 'R')!;
      expect(r[1] - r[0]).toBeCloseTo(1 - z / 0.3, 11); // geometry
      expect((r[0] + r[1]) / 2).toBeCloseTo(0.5, 11);
    });
  });
});

describe('sinusoid()', () => {
  it('has fill arccos(2z/d − 1)/π at every slice mid-height, both strategies', () => {
    for (const strategy of ['uniform', 'adaptive'] as const) {
      const g = sinusoid({ periodUm: 0.9, depthUm: 0.25, slices: 11, strategy, ...base });
      midHeights(g).forEach((z, i) => {
        // geometry: (d/2)(1 − cos u) > z on an arc of u of length 2·arccos(1 − 2z/d)'s complement
        expect(fill(g.layers[i]!, 'R')).toBeCloseTo(Math.acos((2 * z) / 0.25 - 1) / Math.PI, 11);
      });
    }
  });

  it('adaptive slicing puts thinner slices at crest and trough, none taller than 4·H/S', () => {
    const S = 12;
    const u = sinusoid({ periodUm: 1, depthUm: 0.3, slices: S, strategy: 'uniform', ...base });
    const a = sinusoid({ periodUm: 1, depthUm: 0.3, slices: S, strategy: 'adaptive', ...base });
    expect(a.slices).toBe(S);
    for (const l of u.layers) expect(l.thicknessUm).toBeCloseTo(0.3 / S, 14); // definition of 'uniform'
    const t = a.layers.map((l) => l.thicknessUm);
    expect(t[0]!).toBeLessThan(0.3 / S); // crest: the fill changes fastest there (arccos' slope diverges)
    expect(t[S - 1]!).toBeLessThan(0.3 / S); // trough
    expect(t[S / 2]!).toBeGreaterThan(0.3 / S); // mid-depth: slowest change
    for (const x of t) expect(x).toBeLessThanOrEqual((4 * 0.3) / S); // the α = 0.25 height share (design rule)
    expect(t.reduce((s, x) => s + x, 0)).toBeCloseTo(0.3, 14);
  });
});

describe('trapezoid()', () => {
  it('varies the width linearly with height between the given bottom and top widths', () => {
    const g = trapezoid({ periodUm: 2, depthUm: 0.5, bottomWidthUm: 1.2, topWidthUm: 0.4, offset: 0.1, slices: 7, ...base });
    midHeights(g).forEach((z, i) => {
      const w = 1.2 + ((0.4 - 1.2) * z) / 0.5; // geometry: straight sidewalls
      const r = segs(g.layers[i]!).find((s) => s[2] === 'R')!;
      expect((r[1] - r[0]) * 2).toBeCloseTo(w, 11);
      expect(r[0] * 2).toBeCloseTo(0.2 + (1.2 - w) / 2, 11); // symmetric about the ridge centre
    });
  });

  it('turns duty at mid-height and sidewall angle into wb = fΛ + d·cot α, wt = fΛ − d·cot α', () => {
    const g = trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.5, sidewallDeg: 80, slices: 5, ...base });
    const run = 0.4 / Math.tan(80 * DEG); // geometry
    expect(g.notes[0]).toContain(`bottom width ${Number((0.5 + run).toPrecision(6))} µm`);
    midHeights(g).forEach((z, i) => expect(fill(g.layers[i]!, 'R')).toBeCloseTo(0.5 + run - (2 * run * z) / 0.4, 11));
    expect(g.surfaces.length).toBe(1);
  });

  it('slices undercut sidewalls (angle > 90°) with the ridge widening upward, without a surface', () => {
    const g = trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.5, sidewallDeg: 100, slices: 4, ...base });
    const f = g.layers.map((l) => fill(l, 'R'));
    expect(f[0]!).toBeGreaterThan(f[3]!);
    // geometry: w(z) = f·Λ + d·cot α·(1 − 2z/d), with cot α < 0 for an undercut
    midHeights(g).forEach((z, i) => expect(f[i]!).toBeCloseTo(0.5 + (0.4 / Math.tan(100 * DEG)) * (1 - (2 * z) / 0.4), 11));
    expect(g.surfaces.length).toBe(0);
    expect(g.notes.join(' ')).toContain('undercut');
  });
});

describe('lamellar()', () => {
  it('is one slice with the ridge over [offset, offset + f), wrapping at the period', () => {
    const g = lamellar({ periodUm: 1, duty: 0.4, depthUm: 0.2, offset: 0.8, ...base });
    expect(g.slices).toBe(1);
    expect(g.layers[0]!.thicknessUm).toBe(0.2);
    const s = segs(g.layers[0]!);
    expect(s.map((x) => x[2])).toEqual(['R', 'G', 'R']);
    expect(s[0]![1]).toBeCloseTo(0.2, 14); // 0.8 + 0.4 − 1 (definition)
    expect(s[1]![1]).toBeCloseTo(0.8, 14);
  });

  it('shifts a slanted ridge by tan(α)·z at each slice mid-height, keeping the duty cycle', () => {
    const g = lamellar({ periodUm: 0.5, duty: 0.3, depthUm: 0.6, slantDeg: 35, slices: 8, ...base });
    expect(g.slices).toBe(8);
    midHeights(g).forEach((z, i) => {
      const l = g.layers[i]!;
      expect(fill(l, 'R')).toBeCloseTo(0.3, 11);
      const left = ((Math.tan(35 * DEG) * z) / 0.5) % 1; // geometry: leaning toward +x as it rises
      const s = segs(l);
      const r = s.find((x) => x[2] === 'R' && x[0] > 0) ?? s[0]!;
      if (left + 0.3 <= 1) expect(r[0]).toBeCloseTo(left, 11);
      else expect(s[0]![1]).toBeCloseTo(left + 0.3 - 1, 11);
    });
    expect(g.surfaces.length).toBe(0);
  });
});

describe('multiLevel()', () => {
  it('approximates a blaze of depth d by N − 1 slices of d/N with ridge fractions 1 − m/N', () => {
    const N = 8;
    const g = multiLevel({ periodUm: 2, steps: N, blazeDepthUm: 1.6, ...base });
    expect(g.slices).toBe(N - 1);
    expect(g.depthUm).toBeCloseTo((1.6 * (N - 1)) / N, 14); // definition: heights k·d/N, k = 0…N−1
    g.layers.forEach((l, j) => {
      const m = N - 1 - j; // top slice lies between heights (N−2)d/N and (N−1)d/N
      expect(l.thicknessUm).toBeCloseTo(0.2, 14);
      expect(fill(l, 'R')).toBeCloseTo(1 - m / N, 14);
      expect(segs(l).at(-1)).toEqual([expect.closeTo(m / N, 14), 1, 'R']); // rising with x like the sawtooth
    });
  });

  it('passes listed levels through and finds a surface only when they are nested', () => {
    const nested = multiLevel({
      periodUm: 1,
      levels: [
        { thicknessUm: 0.1, ridges: [{ from: 0.4, to: 0.6 }] },
        { thicknessUm: 0.2, ridges: [{ from: 0.2, to: 0.8 }] },
      ],
      ...base,
    });
    expect(nested.depthUm).toBeCloseTo(0.3, 14);
    expect(segs(nested.layers[0]!)).toEqual([
      [0, 0.4, 'G'],
      [0.4, 0.6, 'R'],
      [0.6, 1, 'G'],
    ]);
    expect(nested.surfaces.length).toBe(1);
    expect(nested.surfaces[0]!.heightAt(0.5)).toBeCloseTo(0.3, 14);
    expect(nested.surfaces[0]!.heightAt(0.3)).toBeCloseTo(0.2, 14);
    const overhang = multiLevel({
      periodUm: 1,
      levels: [
        { thicknessUm: 0.1, ridges: [{ from: 0.1, to: 0.9 }] },
        { thicknessUm: 0.2, ridges: [{ from: 0.4, to: 0.6 }] },
      ],
      ...base,
    });
    expect(overhang.surfaces.length).toBe(0);
    expect(overhang.notes[0]).toContain('not nested');
  });
});

describe('profileFromTable()', () => {
  it('reproduces the sawtooth builder from its corner points', () => {
    const d = Math.sin(30 * DEG) * Math.cos(30 * DEG);
    const t = profileFromTable({ periodUm: 1, points: [[0, 0], [0.75, d]], slices: 10, ...base });
    const s = sawtooth({ periodUm: 1, blazeDeg: 30, slices: 10, ...base });
    expect(t.depthUm).toBeCloseTo(s.depthUm, 14);
    t.layers.forEach((l, i) => {
      segs(l).forEach((x, k) => {
        const y = segs(s.layers[i]!)[k]!;
        expect(x[0]).toBeCloseTo(y[0], 11);
        expect(x[2]).toBe(y[2]);
      });
    });
  });

  it('fills the base below the lowest point with one uniform ridge slice and honours vertical walls', () => {
    const t = profileFromTable({ periodUm: 1, points: [[0, 0.1], [0.5, 0.1], [0.5, 0.3], [0.9, 0.3]], slices: 6, ...base });
    // plateaus at 0.1 and 0.3 with linear ramps from 0.9 back to 0 at the next period (geometry)
    const bottom = t.layers.at(-1)!;
    expect(bottom).toMatchObject({ kind: 'uniform', material: 'R' });
    expect(bottom.thicknessUm).toBeCloseTo(0.1, 14);
    midHeights(t).slice(0, -1).forEach((z, i) => {
      // ridge over [0.5, 0.9] plus the ramp from (0.9, 0.3) down to (1, 0.1): h > z for x < 0.9 + 0.1·(0.3 − z)/0.2
      expect(fill(t.layers[i]!, 'R')).toBeCloseTo(0.4 + (0.1 * (0.3 - z)) / 0.2, 11);
    });
  });

  it('matches a dense sampling of random periodic polylines (fill per slice)', () => {
    fc.assert(
      fc.property(fc.array(fc.tuple(fc.double({ min: 0, max: 0.999, noNaN: true }), fc.double({ min: 0, max: 1, noNaN: true })), { minLength: 2, maxLength: 8 }), (raw) => {
        const pts = raw.map(([x, h]) => [x, h] as [number, number]).sort((a, b) => a[0] - b[0]);
        if (Math.max(...pts.map((p) => p[1])) < 0.05) return;
        const t = profileFromTable({ periodUm: 1, points: pts, slices: 5, ...base });
        const surf = t.surfaces[0]!;
        midHeights(t).forEach((z, i) => {
          // independent: midpoint sampling of h(x) > z on 20 000 points (error ≤ a few 1e-4 per crossing)
          let n = 0;
          const K = 20000;
          for (let k = 0; k < K; k++) if (surf.heightAt((k + 0.5) / K) > z) n++;
          expect(Math.abs(fill(t.layers[i]!, 'R') - n / K)).toBeLessThan(2e-3);
          expect(tiles(t.layers[i]!)).toBe(true);
        });
      }),
      { seed: 7, numRuns: 30 },
    );
  });
});

describe('profileFromExpression()', () => {
  it('matches the analytic sinusoid to the root-finding tolerance', () => {
    const e = profileFromExpression({ periodUm: 1, expression: '0.15*(1 - cos(2*pi*x))', slices: 9, strategy: 'adaptive', ...base });
    const s = sinusoid({ periodUm: 1, depthUm: 0.3, slices: 9, strategy: 'adaptive', ...base });
    expect(e.depthUm).toBeCloseTo(0.3, 13); // refined maximum (golden-section search)
    e.layers.forEach((l, i) => {
      expect(l.thicknessUm).toBeCloseTo(s.layers[i]!.thicknessUm, 6); // adaptive rule measured on 128 steps
      segs(l).forEach((x, k) => expect(x[0]).toBeCloseTo(segs(s.layers[i]!)[k]![0], 6));
    });
    const u = profileFromExpression({ periodUm: 1, expression: '0.15*(1 - cos(2*pi*x))', slices: 9, ...base });
    const v = sinusoid({ periodUm: 1, depthUm: 0.3, slices: 9, ...base });
    u.layers.forEach((l, i) => segs(l).forEach((x, k) => expect(x[0]).toBeCloseTo(segs(v.layers[i]!)[k]![0], 11)));
  });

  it('finds plateaus and slices a staircase expression level by level', () => {
    const e = profileFromExpression({ periodUm: 1, expression: '0.1 * floor(4 x)', slices: 10, ...base });
    expect(e.slices).toBe(3);
    expect(e.layers.map((l) => fill(l, 'R'))).toEqual([expect.closeTo(0.25, 11), expect.closeTo(0.5, 11), expect.closeTo(0.75, 11)]);
    expect(e.notes.join(' ')).toContain('3 used instead of 10');
  });
});

describe('volumeGrating()', () => {
  it('advances the phase by 2π·tan α·h/Λ at each slice mid-height and converts Δn to 2·n0·Δn', () => {
    const g = volumeGrating({ periodUm: 0.5, thicknessUm: 4, material: 'M', deltaN: 0.01, n0: 1.5, slantDeg: 12, phaseRad: 0.3, slices: 5 });
    expect(g.slices).toBe(5);
    midHeights(g).forEach((h, i) => {
      const l = g.layers[i]!;
      if (l.kind !== 'cosine') throw new Error('expected a cosine slice');
      expect(l.deltaEps).toBeCloseTo(0.03, 15); // definition: Δε = 2·n0·Δn
      expect(l.phaseRad).toBeCloseTo(0.3 + (2 * Math.PI * Math.tan(12 * DEG) * h) / 0.5, 11); // geometry of tilted fringes
    });
    expect(g.notes[0]).toContain('at most 0.0001'); // Δn² (definition)
    expect(volumeGrating({ periodUm: 1, thicknessUm: 2, material: 'M', deltaEps: 0.1 }).slices).toBe(1);
  });
});
