/**
 * True outlines of a profile's surfaces for plotting over its slices: the ridge's surface and
 * each coating's outer surface, as polylines in the coordinates of `crossSection` (x µm from 0,
 * z µm downward from the top of the structure).
 */
import type { HeightProfile, ProfileResult } from './types.ts';
import { fail, integerAtLeast, nonNegativeLength } from './validate.ts';

export interface Outline {
  /** 0 = the ridge's surface, then each coating's outer surface in order */
  readonly index: number;
  /** true when the points are the exact corners; false when they sample a curve */
  readonly exact: boolean;
  readonly points: Array<[number, number]>;
}

/**
 * Polylines of the profile's surfaces over `periods` periods.
 * @param profile a builder's result
 * @param periods number of periods (integer ≥ 1), default 2
 * @param topUm depth z (µm) of the profile's top in the whole stack (the thickness of the layers
 *   above it), default 0
 * @returns one polyline per surface (none for profiles without a single-valued surface)
 * @throws {StructureError} on periods < 1 or a negative topUm
 * @example
 * profileOutline(sawtooth({ periodUm: 1, blazeDeg: 30, ridgeMaterial: 'Al', grooveMaterial: 'air', slices: 10 }), 1)[0].points;
 * // → [[0, 0.433], [0.75, 0], [1, 0.433]]
 */
export function profileOutline(profile: ProfileResult, periods = 2, topUm = 0): Outline[] {
  if (!profile || !Array.isArray(profile.surfaces)) fail('profileOutline.profile', 'a profile result', profile);
  const n = integerAtLeast('profileOutline.periods', periods, 1);
  const top = nonNegativeLength('profileOutline.topUm', topUm);
  const L = profile.periodUm;
  const surfaces: ReadonlyArray<HeightProfile> = profile.surfaces;
  return surfaces.map((s, index) => {
    const v = s.vertices();
    const points: Array<[number, number]> = [];
    for (let p = 0; p < n; p++) {
      v.forEach(([x, h], k) => {
        if (p > 0 && k === 0) return; // shared with the previous period's last vertex
        points.push([p * L + x, top + profile.depthUm - h]);
      });
    }
    return { index, exact: s.exact, points };
  });
}
