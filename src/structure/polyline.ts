/**
 * A periodic piecewise-linear surface h(x): the common core of the lamellar, trapezoid,
 * sawtooth, triangle, multi-level and tabulated profiles. Vertical walls are two vertices at the
 * same x. Where the surface lies above a height is found exactly: each edge crosses a level at
 * one point, solved in closed form.
 */
import { mergeIntervals, type Interval } from './segments.ts';
import type { HeightProfile } from './types.ts';

/**
 * Build a surface from vertices (x µm, h µm) in non-decreasing x that span exactly one period,
 * from x0 to x0 + Λ (any x0); the surface repeats with period Λ.
 * @param periodUm period Λ (µm)
 * @param points vertices (x µm, h µm ≥ 0), two at the same x making a vertical wall
 * @returns the surface, with exact `above` intersections
 * @throws never: the builders validate their parameters before calling this (unchecked input
 *   gives a meaningless surface)
 * @example
 * polylineSurface(1, [[0, 0], [0.75, 0.433], [1, 0]]).above(0.2165); // → [[0.375, 0.875]]
 */
export function polylineSurface(periodUm: number, points: ReadonlyArray<readonly [number, number]>): HeightProfile {
  const verts = canonical(periodUm, points);
  let min = Infinity;
  let max = -Infinity;
  for (const [, h] of verts) {
    min = Math.min(min, h);
    max = Math.max(max, h);
  }
  const levels = new Set<number>();
  for (let i = 0; i + 1 < verts.length; i++) {
    const [x1, h1] = verts[i]!;
    const [x2, h2] = verts[i + 1]!;
    if (x2 > x1 && h1 === h2 && h1 > 0 && h1 < max) levels.add(h1);
  }
  if (min > 0 && min < max) levels.add(min);
  const xs = verts.map((v) => v[0]);
  return {
    periodUm,
    minUm: min,
    maxUm: max,
    levelsUm: [...levels].sort((a, b) => a - b),
    exact: true,
    above(z: number): Array<[number, number]> {
      const out: Interval[] = [];
      for (let i = 0; i + 1 < verts.length; i++) {
        const [x1, h1] = verts[i]!;
        const [x2, h2] = verts[i + 1]!;
        if (!(x2 > x1)) continue; // a vertical wall covers no width
        const up1 = h1 > z;
        const up2 = h2 > z;
        if (up1 && up2) out.push([x1, x2]);
        else if (up1) out.push([x1, x1 + ((h1 - z) / (h1 - h2)) * (x2 - x1)]);
        else if (up2) out.push([x2 - ((h2 - z) / (h2 - h1)) * (x2 - x1), x2]);
      }
      return mergeIntervals(out.map(([a, b]) => [a / periodUm, b / periodUm]));
    },
    fillAbove(z: number): number {
      let w = 0;
      for (let i = 0; i + 1 < verts.length; i++) {
        const [x1, h1] = verts[i]!;
        const [x2, h2] = verts[i + 1]!;
        if (!(x2 > x1)) continue;
        const up1 = h1 > z;
        const up2 = h2 > z;
        if (up1 && up2) w += x2 - x1;
        else if (up1) w += ((h1 - z) / (h1 - h2)) * (x2 - x1);
        else if (up2) w += ((h2 - z) / (h2 - h1)) * (x2 - x1);
      }
      return w / periodUm;
    },
    heightAt(x: number): number {
      const xu = (x - Math.floor(x)) * periodUm;
      // last vertex with xs[i] ≤ xu
      let lo = 0;
      let hi = xs.length - 1;
      while (lo < hi) {
        const mid = (lo + hi + 1) >> 1;
        if (xs[mid]! <= xu) lo = mid;
        else hi = mid - 1;
      }
      const i = Math.min(lo, verts.length - 2);
      const [x1, h1] = verts[i]!;
      const [x2, h2] = verts[i + 1]!;
      return x2 > x1 ? h1 + ((xu - x1) / (x2 - x1)) * (h2 - h1) : h2;
    },
    vertices(): Array<[number, number]> {
      return verts.map((v) => [v[0], v[1]]);
    },
  };
}

/**
 * Vertices of one period rotated to start at x = 0 and closed at x = Λ (the closing vertex is
 * the first one shifted by Λ); consecutive duplicates removed.
 */
function canonical(L: number, pts: ReadonlyArray<readonly [number, number]>): Array<[number, number]> {
  const q: Array<[number, number]> = [];
  const shift = Math.floor(pts[0]![0] / L) * L; // bring the first vertex into [0, Λ)
  for (const k of [-1, 0, 1]) {
    for (const [x, h] of pts) {
      const p: [number, number] = [x - shift + k * L, h];
      const last = q[q.length - 1];
      if (!last || last[0] !== p[0] || last[1] !== p[1]) q.push(p);
    }
  }
  const lerp = (a: readonly [number, number], b: readonly [number, number], x: number): [number, number] => [
    x,
    a[1] + ((x - a[0]) / (b[0] - a[0])) * (b[1] - a[1]),
  ];
  let s = q.findIndex((p) => p[0] >= 0);
  const out: Array<[number, number]> = [];
  if (q[s]![0] > 0) out.push(lerp(q[s - 1]!, q[s]!, 0));
  for (; s < q.length && q[s]![0] < L; s++) out.push([q[s]![0], q[s]![1]]);
  out.push([L, out[0]![1]]);
  return out;
}
