/**
 * Arbitrary profile from a table of (x, height) points: x as a fraction of the period in [0, 1),
 * non-decreasing, height in µm ≥ 0; the surface is linear between points and periodic (the last
 * point joins the first one period later). Two points at the same x make a vertical wall.
 * Intersections with each slice's mid-height are solved exactly. If the lowest height is above
 * zero, the ridge material fills the base up to it (one uniform slice).
 */
import { polylineProfile } from './fromSurface.ts';
import type { ProfileResult, SlicedProfileParams } from './types.ts';
import { common, fail, finite, num, record } from './validate.ts';

export interface TableProfileParams extends SlicedProfileParams {
  /** points [x (fraction of the period, [0, 1)), height (µm, ≥ 0)], x non-decreasing */
  readonly points: ReadonlyArray<readonly [number, number]>;
}

/**
 * Sliced profile through a table of points.
 * @param p period (µm), points, materials, slices, strategy
 * @returns slices top first; depth = the highest point (µm)
 * @throws {StructureError} on fewer than 2 points, x outside [0, 1) or decreasing, negative or
 *   non-finite heights, all heights zero
 * @example
 * // a right-angle blaze of 30° on a 1 µm period, written as a table
 * profileFromTable({ periodUm: 1, points: [[0, 0], [0.75, 0.4330127]], ridgeMaterial: 'Al', grooveMaterial: 'air', slices: 20 });
 */
export function profileFromTable(p: TableProfileParams): ProfileResult {
  const r = record('table', p);
  const c = common('table', r);
  const pts = r.points;
  if (!Array.isArray(pts) || pts.length < 2) fail('table.points', 'at least 2 points [x, heightUm]', Array.isArray(pts) ? `${pts.length} point(s)` : pts);
  let prev = 0;
  let max = 0;
  const v: Array<[number, number]> = (pts as unknown[]).map((pt, i) => {
    if (!Array.isArray(pt) || pt.length !== 2) fail(`table.points[${i}]`, 'a pair [x, heightUm]', pt);
    const x = finite(`table.points[${i}][0]`, pt[0]);
    const h = finite(`table.points[${i}][1]`, pt[1]);
    if (!(x >= prev && x < 1)) fail(`table.points[${i}][0]`, `x in [${num(prev)}, 1) (fractions of the period, non-decreasing)`, x);
    if (!(h >= 0)) fail(`table.points[${i}][1]`, 'a height ≥ 0 µm', h);
    prev = x;
    max = Math.max(max, h);
    return [x * c.periodUm, h];
  });
  if (!(max > 0)) fail('table.points', 'at least one height > 0 µm', 'all heights 0');
  v.push([v[0]![0] + c.periodUm, v[0]![1]]);
  return polylineProfile(c, v, [`tabulated profile: ${pts.length} points, depth ${num(max)} µm`]);
}
