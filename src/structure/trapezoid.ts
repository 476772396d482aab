/**
 * Trapezoidal ridge: bottom width wb at the base, top width wt at the depth d, straight
 * sidewalls symmetric about the ridge centre. Given instead as the duty cycle f at mid-height
 * and the sidewall angle α measured from the base plane (90° vertical, < 90° narrowing upward,
 * > 90° undercut): wb = f·Λ + d·cot α, wt = f·Λ − d·cot α (geometry). A shape whose top or
 * bottom width leaves [0, Λ] would intersect itself or its neighbour and is rejected.
 * Undercut ridges are sliced correctly but, having no single-valued surface, cannot be coated.
 */
import { profileFromShape, profileFromSurface } from './fromSurface.ts';
import { polylineSurface } from './polyline.ts';
import { segmentsFromRegions, wrapInterval, type Interval } from './segments.ts';
import type { ProfileResult, ProfileShape, SlicedProfileParams } from './types.ts';
import { angleIn, common, duty, fail, fraction, num, positiveLength, record } from './validate.ts';

export type TrapezoidParams = SlicedProfileParams & {
  /** ridge height (µm) */
  readonly depthUm: number;
  /** left edge of the ridge base, fraction of the period in [0, 1); default 0 */
  readonly offset?: number;
} & (
    | { /** width at the base (µm) */ readonly bottomWidthUm: number; /** width at the top (µm) */ readonly topWidthUm: number }
    | { /** duty cycle at mid-height, (0, 1) */ readonly duty: number; /** sidewall angle from the base plane (degrees), (0°, 180°) */ readonly sidewallDeg: number }
  );

/**
 * Sliced trapezoid; widths vary linearly with height: w(z) = wb + (wt − wb)·z/d.
 * @param p period, depth and widths (µm) or duty and sidewall angle (degrees), offset, materials,
 *   slices, strategy
 * @returns slices top first, depth (µm), notes with both widths
 * @throws {StructureError} on non-positive depth or period, widths outside [0, Λ], a sidewall
 *   angle that makes the shape self-intersect, both or neither width forms
 * @example
 * trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.5, sidewallDeg: 80, ridgeMaterial: 'Si', grooveMaterial: 'air', slices: 8 });
 */
export function trapezoid(p: TrapezoidParams): ProfileResult {
  const r = record('trapezoid', p);
  const c = common('trapezoid', r);
  const L = c.periodUm;
  const d = positiveLength('trapezoid.depthUm', r.depthUm);
  const offset = r.offset === undefined ? 0 : fraction('trapezoid.offset', r.offset);
  const byWidths = r.bottomWidthUm !== undefined || r.topWidthUm !== undefined;
  const byAngle = r.duty !== undefined || r.sidewallDeg !== undefined;
  if (byWidths === byAngle) {
    fail('trapezoid', 'either bottomWidthUm and topWidthUm, or duty and sidewallDeg', byWidths ? 'both forms' : 'neither form');
  }
  let wb: number;
  let wt: number;
  if (byWidths) {
    wb = width('trapezoid.bottomWidthUm', r.bottomWidthUm, L);
    wt = width('trapezoid.topWidthUm', r.topWidthUm, L);
    if (wb === 0 && wt === 0) fail('trapezoid.topWidthUm', 'a width > 0 µm when the bottom width is 0', wt);
  } else {
    const f = duty('trapezoid.duty', r.duty);
    const swa = angleIn('trapezoid.sidewallDeg', r.sidewallDeg, 0, 180);
    const run = d / Math.tan((swa * Math.PI) / 180); // horizontal run of one sidewall
    wb = f * L + (swa === 90 ? 0 : run);
    wt = f * L - (swa === 90 ? 0 : run);
    const m = Math.min(f, 1 - f) * L;
    const lo = (Math.atan2(d, m) * 180) / Math.PI;
    if (!(wt >= -1e-12 * L && wt <= L * (1 + 1e-12) && wb >= -1e-12 * L && wb <= L * (1 + 1e-12))) {
      fail(
        'trapezoid.sidewallDeg',
        `an angle in [${num(lo)}°, ${num(180 - lo)}°] so that the top and bottom widths stay within [0, Λ] (no self-intersection) for duty ${num(f)} and depth ${num(d)} µm`,
        `${swa} (top width ${num(wt)} µm, bottom width ${num(wb)} µm, period ${num(L)} µm)`,
      );
    }
    wb = Math.min(L, Math.max(0, wb));
    wt = Math.min(L, Math.max(0, wt));
  }
  const x0 = offset * L;
  const notes = [`trapezoid: bottom width ${num(wb)} µm, top width ${num(wt)} µm, depth ${num(d)} µm`];
  if (wt <= wb) {
    const inset = (wb - wt) / 2;
    const surface = polylineSurface(L, [
      [x0, 0],
      [x0 + inset, d],
      [x0 + inset + wt, d],
      [x0 + wb, 0],
      [x0 + L, 0],
    ]);
    return profileFromSurface(surface, c, notes);
  }
  // undercut: the ridge widens upward; sliced directly from the widths
  const shape: ProfileShape = {
    periodUm: L,
    heightUm: d,
    breaksUm: [],
    materialsAt(z) {
      const w = wb + ((wt - wb) * z) / d;
      const left = x0 + (wb - w) / 2;
      const set: Interval[] = [];
      wrapInterval(left, left + w, L, set);
      set.sort((a, b) => a[0] - b[0]);
      return segmentsFromRegions([{ set, material: c.ridgeMaterial }], c.grooveMaterial);
    },
  };
  return profileFromShape(shape, c, [...notes, 'undercut sidewalls (top wider than base): no single-valued surface, so this profile cannot take a conformal coating'], []);
}

function width(field: string, v: unknown, L: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || v < 0 || v > L) fail(field, `a width in [0, Λ] = [0, ${num(L)}] µm`, v);
  return v;
}
