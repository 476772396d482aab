/**
 * Symmetric triangular profile: facets rise from x = 0 and fall back at x = Λ with the apex at
 * x = Λ/2. Depth and apex angle γ are tied by d = (Λ/2)·cot(γ/2) (geometry); give one of them.
 */
import { polylineProfile } from './fromSurface.ts';
import type { ProfileResult, SlicedProfileParams } from './types.ts';
import { angleIn, common, fail, num, positiveLength, record } from './validate.ts';

export type TriangleParams = SlicedProfileParams &
  (
    | { /** depth of the apex above the base (µm) */ readonly depthUm: number; readonly apexDeg?: undefined }
    | { /** apex angle γ between the facets (degrees), in (0°, 180°) */ readonly apexDeg: number; readonly depthUm?: undefined }
  );

/**
 * Sliced symmetric triangle. At height z the ridge spans [z/d·Λ/2, Λ − z/d·Λ/2], fill 1 − z/d.
 * @param p period (µm), depth (µm) or apex angle (degrees), materials, slices, strategy
 * @returns slices top first; `depthUm` is the given or derived depth
 * @throws {StructureError} when both or neither of depthUm and apexDeg are given, or on a value
 *   out of range
 * @example
 * symmetricTriangle({ periodUm: 1, apexDeg: 90, ridgeMaterial: 'resist', grooveMaterial: 'air', slices: 10 }).depthUm; // → 0.5
 */
export function symmetricTriangle(p: TriangleParams): ProfileResult {
  const r = record('triangle', p);
  const c = common('triangle', r);
  if ((r.depthUm === undefined) === (r.apexDeg === undefined)) {
    fail('triangle', 'exactly one of depthUm and apexDeg', `${r.depthUm === undefined ? 'neither' : 'both'}`);
  }
  let d: number;
  let apex: number;
  if (r.depthUm !== undefined) {
    d = positiveLength('triangle.depthUm', r.depthUm);
    apex = (2 * Math.atan(c.periodUm / 2 / d) * 180) / Math.PI;
  } else {
    apex = angleIn('triangle.apexDeg', r.apexDeg, 0, 180);
    d = c.periodUm / 2 / Math.tan((apex * Math.PI) / 360);
  }
  return polylineProfile(
    c,
    [
      [0, 0],
      [c.periodUm / 2, d],
      [c.periodUm, 0],
    ],
    [`symmetric triangle: depth ${num(d)} µm, apex angle ${num(apex)}° (d = (Λ/2)·cot(γ/2))`],
  );
}
