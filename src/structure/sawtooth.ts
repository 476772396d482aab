/**
 * Sawtooth (blazed) profile. The blaze facet rises from x = 0 at the blaze angle θB to the apex;
 * the anti-blaze facet falls back to the base and closes the period. With the apex angle γ
 * between the facets, the anti-blaze facet makes β = 180° − γ − θB with the grating plane, and
 * the horizontal extents d·cot θB + d·cot β add up to the period, so the depth follows:
 *
 *   d = Λ / (cot θB + cot β),  β = 180° − γ − θB        (geometry)
 *
 * For the usual right-angle blaze (γ = 90°, β = 90° − θB): d = Λ·sin θB·cos θB. For a vertical
 * anti-blaze facet (γ = 90° − θB, β = 90°): d = Λ·tan θB. The facet rising with x faces light
 * incident at positive θ, so the blaze favours reflected order −1 there (first-order Littrow
 * blaze wavelength λB = 2Λ·sin θB, common practice).
 */
import { polylineProfile } from './fromSurface.ts';
import type { ProfileResult, SlicedProfileParams } from './types.ts';
import { angleIn, common, fail, num, record } from './validate.ts';

export interface SawtoothParams extends SlicedProfileParams {
  /** blaze angle θB of the rising facet from the grating plane (degrees), in (0°, 90°) */
  readonly blazeDeg: number;
  /**
   * apex angle γ between the two facets (degrees), default 90 (right-angle blaze); must lie in
   * [90° − θB, 180° − θB) so that the anti-blaze facet neither overhangs nor vanishes
   */
  readonly apexDeg?: number;
}

const DEG = Math.PI / 180;

/**
 * Sliced sawtooth. The depth follows from the period, θB and the apex angle (see the module
 * comment) and is reported in `depthUm` and `notes`. At height z the ridge spans
 * [z·cot θB, Λ − z·cot β], a fill of 1 − z/d.
 * @param p period (µm), blaze and apex angles (degrees), materials, slices and strategy
 * @returns the slices (top first), the number used, the derived depth (µm) and notes
 * @throws {StructureError} on an angle out of range, a non-positive period, a bad slice count
 * @example
 * const g = sawtooth({ periodUm: 1, blazeDeg: 30, ridgeMaterial: 'Al', grooveMaterial: 'air', slices: 20 });
 * g.depthUm; // → 0.4330 = 1·sin 30°·cos 30°
 */
export function sawtooth(p: SawtoothParams): ProfileResult {
  const r = record('sawtooth', p);
  const c = common('sawtooth', r);
  const blaze = angleIn('sawtooth.blazeDeg', r.blazeDeg, 0, 90);
  const apex = r.apexDeg === undefined ? 90 : r.apexDeg;
  if (typeof apex !== 'number' || !Number.isFinite(apex) || !(apex >= 90 - blaze && apex < 180 - blaze)) {
    fail(
      'sawtooth.apexDeg',
      `an angle in [90° − blazeDeg, 180° − blazeDeg) = [${num(90 - blaze)}°, ${num(180 - blaze)}°) so the anti-blaze facet neither overhangs nor vanishes`,
      apex,
    );
  }
  const beta = 180 - apex - blaze;
  const cotB = 1 / Math.tan(blaze * DEG);
  const cotA = beta === 90 ? 0 : 1 / Math.tan(beta * DEG);
  const d = c.periodUm / (cotB + cotA);
  const apexX = d * cotB;
  return polylineProfile(
    c,
    [
      [0, 0],
      [apexX, d],
      [c.periodUm, 0],
    ],
    [
      `sawtooth depth ${num(d)} µm = Λ/(cot θB + cot β) with Λ = ${num(c.periodUm)} µm, θB = ${num(blaze)}°, apex ${num(apex)}°, anti-blaze facet β = ${num(beta)}°`,
      `apex at x = ${num(apexX / c.periodUm)} of the period; first-order Littrow blaze wavelength 2Λ·sin θB = ${num(2 * c.periodUm * Math.sin(blaze * DEG))} µm`,
    ],
  );
}
