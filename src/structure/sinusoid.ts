/**
 * Sinusoidal (holographic) profile h(x) = (d/2)·(1 − cos 2πx/Λ): base at x = 0, crest at x = Λ/2.
 * Where it lies above a height z is closed-form: x/Λ ∈ (a, 1 − a), a = arccos(1 − 2z/d)/(2π),
 * so the ridge fill is arccos(2z/d − 1)/π (geometry).
 */
import { profileFromSurface } from './fromSurface.ts';
import type { HeightProfile, ProfileResult, SlicedProfileParams } from './types.ts';
import { common, positiveLength, record } from './validate.ts';

/** Vertices per period of the sinusoid's polyline (used for coatings and outlines). */
export const SINUSOID_SAMPLES = 1024;

export interface SinusoidParams extends SlicedProfileParams {
  /** peak-to-valley depth (µm) */
  readonly depthUm: number;
}

/**
 * Sliced sinusoid. Its `vertices()` are 1024 chords per period: chord error ≤ d·π²/(4·1024²)
 * ≈ 2.4·10⁻⁶·d, which is all a conformal coating over it inherits.
 * @param p period and depth (µm), materials, slices, strategy ('adaptive' puts more slices near
 *   the crest and the trough, where the fill changes fastest)
 * @returns slices top first
 * @throws {StructureError} on non-positive depth or period, bad slice count or strategy
 * @example
 * sinusoid({ periodUm: 0.8, depthUm: 0.2, ridgeMaterial: 'resist', grooveMaterial: 'air', slices: 16, strategy: 'adaptive' });
 */
export function sinusoid(p: SinusoidParams): ProfileResult {
  const r = record('sinusoid', p);
  const c = common('sinusoid', r);
  const d = positiveLength('sinusoid.depthUm', r.depthUm);
  const L = c.periodUm;
  const heightAt = (x: number): number => 0.5 * d * (1 - Math.cos(2 * Math.PI * x));
  const surface: HeightProfile = {
    periodUm: L,
    minUm: 0,
    maxUm: d,
    levelsUm: [],
    exact: false,
    above(z) {
      if (z < 0) return [[0, 1]];
      if (z >= d) return [];
      const a = Math.acos(1 - (2 * z) / d) / (2 * Math.PI);
      return a < 0.5 ? [[a, 1 - a]] : [];
    },
    heightAt,
    vertices() {
      const v: Array<[number, number]> = [];
      for (let i = 0; i <= SINUSOID_SAMPLES; i++) v.push([(i / SINUSOID_SAMPLES) * L, heightAt(i / SINUSOID_SAMPLES)]);
      return v;
    },
  };
  return profileFromSurface(surface, c, []);
}
