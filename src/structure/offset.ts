/**
 * The outer surface of a conformal coating: the set of points above a surface within distance t
 * of it, i.e. the union of discs of radius t centred on the surface, above the surface. Along a
 * flat facet this is the facet moved by t along its normal; at a convex corner (a ridge top) it
 * is a circular arc of radius t; at a concave corner (a groove bottom) the two offset facets meet
 * and the part of each beyond the other is trimmed. The region is single-valued: for a fixed x
 * the union of the discs centred on the (continuous) surface is one interval of height, so the
 * coating lies exactly between h(x) and the upper envelope h_c(x) of the discs.
 *
 * Each edge of the polyline contributes a capsule (the points within t of the edge); the part
 * of a capsule above a height z projects onto one interval of x, found in closed form from the
 * capsule's extreme points and its intersection with the line at height z. The union of those
 * intervals is where h_c > z — exact for a polyline. Curved surfaces enter as their dense
 * polyline (`vertices()`), whose chord error is stated by the builder that made them.
 */
import { mergeIntervals, wrapInterval, type Interval } from './segments.ts';
import type { HeightProfile } from './types.ts';

/**
 * Samples per period of the outer surface's `vertices()` (it is curved at convex corners), besides
 * its corners (where arcs meet moved facets) and walls, which are always included.
 */
const OUTLINE_SAMPLES = 1024;

/**
 * The outer surface of a coating of thickness `tUm` (µm) over `base`.
 * @param base the surface being coated (its `vertices()` are used)
 * @param tUm coating thickness along the surface normal (µm), > 0
 */
export function offsetSurface(base: HeightProfile, tUm: number): HeightProfile {
  const L = base.periodUm;
  const v = base.vertices();
  const edges: Array<[number, number, number, number]> = [];
  for (let i = 0; i + 1 < v.length; i++) {
    const [ax, az] = v[i]!;
    const [bx, bz] = v[i + 1]!;
    if (ax !== bx || az !== bz) edges.push([ax, az, bx, bz]);
  }
  // a jump at the seam (h(Λ⁻) ≠ h(0)) is a vertical wall there
  const first = v[0]!;
  const last = v[v.length - 1]!;
  if (last[1] !== first[1]) edges.push([L, Math.min(first[1], last[1]), L, Math.max(first[1], last[1])]);
  if (edges.length === 0) edges.push([v[0]![0], v[0]![1], v[0]![0], v[0]![1]]);
  const max = base.maxUm + tUm;
  // edges come in vertex order (the seam wall, at x = Λ, last), so their left and right ends are
  // both non-decreasing: the edges within reach of an abscissa are a contiguous run
  const ordered = edges;
  const firstReaching = (x: number): number => {
    // first edge whose right end bx ≥ x
    let lo = 0;
    let hi = ordered.length;
    while (lo < hi) {
      const mid = (lo + hi) >> 1;
      if (ordered[mid]![2] < x) lo = mid + 1;
      else hi = mid;
    }
    return lo;
  };
  const heightAt = (x: number): number => {
    const xu = (x - Math.floor(x)) * L;
    let best = -Infinity;
    for (const xs of [xu, xu - L, xu + L]) {
      for (let i = firstReaching(xs - tUm); i < ordered.length && ordered[i]![0] <= xs + tUm; i++) {
        const [ax, az, bx, bz] = ordered[i]!;
        best = Math.max(best, capsuleTop(ax, az, bx, bz, tUm, xs));
      }
    }
    return best;
  };
  const levels = new Set<number>();
  for (const [ax, az, bx, bz] of edges) {
    const h = az + tUm;
    if (bx > ax && az === bz && h > 0 && h < max) levels.add(h);
  }
  // corners of the outer surface lie where an arc meets a moved facet or the surface jumps: at
  // x_vertex ± t, at the ends of each moved facet, and at vertical walls of the base
  const special = new Set<number>();
  const addSpecial = (x: number): void => {
    const f = x / L - Math.floor(x / L);
    if (f > 1e-12 && f < 1 - 1e-12) special.add(f);
  };
  // (only for a true polyline: a sampled curve has a mild corner at every sample, and the
  // regular sampling below already resolves it)
  for (const [ax, az, bx, bz] of base.exact ? edges : []) {
    for (const x of [ax - tUm, ax, ax + tUm, bx - tUm, bx, bx + tUm]) addSpecial(x);
    const len = Math.hypot(bx - ax, bz - az);
    if (bx > ax) {
      addSpecial(ax - ((bz - az) / len) * tUm);
      addSpecial(bx - ((bz - az) / len) * tUm);
    }
  }
  let samples: Array<[number, number]> | undefined;
  const vertices = (): Array<[number, number]> => {
    if (!samples) {
      const xs = new Set<number>(special);
      for (let i = 1; i < OUTLINE_SAMPLES; i++) xs.add(i / OUTLINE_SAMPLES);
      const eps = 1e-11;
      const pts: Array<[number, number]> = [[0, heightAt(0)]];
      for (const f of [...xs].sort((a, b) => a - b)) {
        if (special.has(f)) {
          // one-sided limits catch vertical walls of the outer surface
          const left = heightAt(f - eps);
          const mid = heightAt(f);
          const right = heightAt(f + eps);
          for (const h of [left, mid, right]) {
            const last = pts[pts.length - 1]!;
            if (last[0] !== f * L || Math.abs(last[1] - h) > 1e-9 * (1 + Math.abs(h))) pts.push([f * L, h]);
          }
        } else pts.push([f * L, heightAt(f)]);
      }
      pts.push([L, pts[0]![1]]);
      samples = pts;
    }
    return samples.map((p) => [p[0], p[1]]);
  };
  let min = Infinity;
  for (const [, h] of vertices()) min = Math.min(min, h);
  return {
    periodUm: L,
    minUm: min,
    maxUm: max,
    levelsUm: [...levels].sort((a, b) => a - b),
    exact: false,
    above(z: number): Array<[number, number]> {
      const out: Interval[] = [];
      for (const [ax, az, bx, bz] of edges) {
        const r = capsuleAbove(ax, az, bx, bz, tUm, z);
        if (r) wrapInterval(r[0], r[1], L, out);
      }
      return mergeIntervals(out);
    },
    heightAt,
    vertices,
  };
}

/**
 * x-extent (lo, hi) of the part above height z of the capsule of radius t around the segment
 * A = (ax, az), B = (bx, bz) with ax ≤ bx; null when no part of it is above z.
 * The capsule is convex, so that extent is bounded by its leftmost/rightmost points (when they
 * are above z) and by its chord along the line at height z.
 */
export function capsuleAbove(ax: number, az: number, bx: number, bz: number, t: number, z: number): [number, number] | null {
  if (Math.max(az, bz) + t <= z) return null;
  let lo = Infinity;
  let hi = -Infinity;
  // extreme points: discs around the end with the least / greatest x
  if (ax < bx) {
    if (az > z) lo = ax - t;
    if (bz > z) hi = bx + t;
  } else if (Math.max(az, bz) > z) {
    lo = ax - t;
    hi = ax + t;
  }
  // chord along the line at height z: discs at both ends …
  for (const [px, pz] of [
    [ax, az],
    [bx, bz],
  ] as const) {
    const dz = z - pz;
    if (Math.abs(dz) < t) {
      const w = Math.sqrt(t * t - dz * dz);
      lo = Math.min(lo, px - w);
      hi = Math.max(hi, px + w);
    }
  }
  // … and the rectangle swept by the segment's normal
  const dx = bx - ax;
  const dz = bz - az;
  const len = Math.hypot(dx, dz);
  if (len > 0) {
    const nx = (-dz / len) * t;
    const nz = (dx / len) * t;
    const quad: Array<readonly [number, number]> = [
      [ax + nx, az + nz],
      [bx + nx, bz + nz],
      [bx - nx, bz - nz],
      [ax - nx, az - nz],
    ];
    for (let k = 0; k < 4; k++) {
      const p = quad[k]!;
      const q = quad[(k + 1) % 4]!;
      const sp = p[1] - z;
      const sq = q[1] - z;
      if (sp === 0 && sq === 0) {
        lo = Math.min(lo, p[0], q[0]);
        hi = Math.max(hi, p[0], q[0]);
      } else if (sp * sq <= 0) {
        const x = p[0] + ((z - p[1]) / (q[1] - p[1])) * (q[0] - p[0]);
        lo = Math.min(lo, x);
        hi = Math.max(hi, x);
      }
    }
  }
  return hi > lo ? [lo, hi] : null;
}

/** Top of the capsule of radius t around A–B (ax ≤ bx) at abscissa x; −∞ outside it. */
function capsuleTop(ax: number, az: number, bx: number, bz: number, t: number, x: number): number {
  let best = -Infinity;
  for (const [px, pz] of [
    [ax, az],
    [bx, bz],
  ] as const) {
    const d = x - px;
    if (Math.abs(d) <= t) best = Math.max(best, pz + Math.sqrt(t * t - d * d));
  }
  const dx = bx - ax;
  if (dx > 0) {
    const dz = bz - az;
    const len = Math.hypot(dx, dz);
    // the facet moved by t along its upward normal (−dz, dx)/len
    const x1 = ax - (dz / len) * t;
    const x2 = bx - (dz / len) * t;
    if (x >= x1 && x <= x2) best = Math.max(best, az + (dx / len) * t + ((x - x1) / dx) * dz);
  }
  return best;
}
