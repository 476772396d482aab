/**
 * Lamellar (rectangular) profile: a ridge of duty cycle f and depth d, one slice. Optionally
 * slanted: the ridge leans by the slant angle α from the normal, so at height z above its base
 * it is shifted along +x by tan α·z (α > 0 leans toward +x as it rises toward the cover); a
 * slanted ridge is sliced, each slice taking the position at its mid-height.
 */
import { profileFromShape, profileFromSurface } from './fromSurface.ts';
import { polylineSurface } from './polyline.ts';
import { segmentsFromRegions, wrapInterval, type Interval } from './segments.ts';
import type { ProfileResult, ProfileShape, SliceStrategy } from './types.ts';
import { angleIn, common, duty, fraction, num, positiveLength, record } from './validate.ts';

export interface LamellarParams {
  /** grating period Λ (µm) */
  readonly periodUm: number;
  /** duty cycle: fraction of the period occupied by the ridge, (0, 1) */
  readonly duty: number;
  /** ridge height (µm) */
  readonly depthUm: number;
  /** left edge of the ridge at its base, fraction of the period in [0, 1); default 0 */
  readonly offset?: number;
  /** slant of the ridge from the normal (degrees), (−90°, 90°); default 0 */
  readonly slantDeg?: number;
  readonly ridgeMaterial: string;
  readonly grooveMaterial: string;
  /** slices for a slanted ridge (integer ≥ 1, required then); a straight ridge uses one */
  readonly slices?: number;
  /** slicing strategy; a slanted ridge changes at a constant rate, so both give equal heights */
  readonly strategy?: SliceStrategy;
}

/**
 * Lamellar grating: ridge over [offset, offset + f) of the period at its base.
 * @param p period and depth (µm), duty, offset, slant (degrees), materials, slices, strategy
 * @returns one slice (straight) or `slices` slices (slanted), top first
 * @throws {StructureError} on duty outside (0, 1), non-positive depth or period, slant outside
 *   (−90°, 90°), a slanted ridge without a valid slice count
 * @example
 * lamellar({ periodUm: 0.5, duty: 0.4, depthUm: 0.1, ridgeMaterial: 'Au', grooveMaterial: 'air' }).layers[0];
 * // → { kind: 'segments', thicknessUm: 0.1, segments: [Au over [0, 0.4), air over [0.4, 1)] }
 */
export function lamellar(p: LamellarParams): ProfileResult {
  const r = record('lamellar', p);
  const slant = r.slantDeg === undefined ? 0 : angleIn('lamellar.slantDeg', r.slantDeg, -90, 90);
  const c = common('lamellar', r, slant === 0);
  const f = duty('lamellar.duty', r.duty);
  const d = positiveLength('lamellar.depthUm', r.depthUm);
  const offset = r.offset === undefined ? 0 : fraction('lamellar.offset', r.offset);
  const L = c.periodUm;
  const x0 = offset * L;
  if (slant === 0) {
    const surface = polylineSurface(L, [
      [x0, 0],
      [x0, d],
      [x0 + f * L, d],
      [x0 + f * L, 0],
      [x0 + L, 0],
    ]);
    return profileFromSurface(surface, c, []);
  }
  const tan = Math.tan((slant * Math.PI) / 180);
  const shape: ProfileShape = {
    periodUm: L,
    heightUm: d,
    breaksUm: [],
    materialsAt(z) {
      const set: Interval[] = [];
      const left = x0 + tan * z;
      wrapInterval(left, left + f * L, L, set);
      set.sort((a, b) => a[0] - b[0]);
      return segmentsFromRegions([{ set, material: c.ridgeMaterial }], c.grooveMaterial);
    },
  };
  return profileFromShape(shape, c, [`slanted ridge: top shifted by tan(${num(slant)}°)·d = ${num(tan * d)} µm from the base`], []);
}
