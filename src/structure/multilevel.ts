/**
 * Multi-level binary profiles, in two forms:
 * - `levels`: binary levels listed top to bottom, each with its thickness and the intervals of
 *   the period its ridge occupies;
 * - `steps`: N equal steps approximating a blaze of depth d — on [k/N, (k+1)/N) of the period the
 *   height is k·d/N, k = 0…N−1, rising with x like the sawtooth (common practice for N-level
 *   kinoforms: the staircase samples the ramp d·x/Λ at the left end of each step). Its actual
 *   height is (N − 1)·d/N, made of N − 1 slices of d/N.
 */
import { polylineProfile } from './fromSurface.ts';
import { polylineSurface } from './polyline.ts';
import { segmentsFromRegions, type Interval } from './segments.ts';
import { layerOf } from './slicing.ts';
import type { HeightProfile, ProfileResult, ProfileShape } from './types.ts';
import { common, fail, finite, integerAtLeast, num, positiveLength, record } from './validate.ts';

interface MultiLevelCommon {
  /** grating period Λ (µm) */
  readonly periodUm: number;
  readonly ridgeMaterial: string;
  readonly grooveMaterial: string;
}

export type MultiLevelParams = MultiLevelCommon &
  (
    | {
        /** levels top (cover side) to bottom */
        readonly levels: ReadonlyArray<{
          readonly thicknessUm: number;
          /** ridge intervals [from, to) in fractions of the period, sorted, disjoint, within [0, 1] */
          readonly ridges: ReadonlyArray<{ readonly from: number; readonly to: number }>;
        }>;
      }
    | {
        /** number of levels N ≥ 2 */
        readonly steps: number;
        /** depth d of the blaze being approximated (µm) */
        readonly blazeDepthUm: number;
      }
  );

/**
 * Multi-level binary grating (levels given, or an N-step blaze approximation).
 * @param p period (µm), materials, and `levels` or `steps` + `blazeDepthUm`
 * @returns one slice per level, top first; when the ridges of the levels are nested (each level
 *   contains the one above it) the profile also has a single-valued surface and can be coated
 * @throws {StructureError} on non-positive thicknesses, ridge intervals outside [0, 1], unsorted
 *   or overlapping ridges, steps < 2 or not an integer, both or neither form
 * @example
 * multiLevel({ periodUm: 2, steps: 4, blazeDepthUm: 1, ridgeMaterial: 'SiO2', grooveMaterial: 'air' }).layers.length; // → 3
 */
export function multiLevel(p: MultiLevelParams): ProfileResult {
  const r = record('multiLevel', p);
  const c = common('multiLevel', { ...r, slices: 1 });
  const L = c.periodUm;
  if ((r.levels === undefined) === (r.steps === undefined)) {
    fail('multiLevel', 'either levels, or steps and blazeDepthUm', r.levels === undefined ? 'neither' : 'both');
  }
  if (r.steps !== undefined) {
    const n = integerAtLeast('multiLevel.steps', r.steps, 2);
    const d = positiveLength('multiLevel.blazeDepthUm', r.blazeDepthUm);
    const v: Array<[number, number]> = [[0, 0]];
    for (let k = 0; k < n; k++) {
      v.push([(k * L) / n, (k * d) / n]);
      v.push([((k + 1) * L) / n, (k * d) / n]);
    }
    v.push([L, 0]);
    return polylineProfile({ ...c, slices: n - 1 }, v, [
      `${n}-level staircase approximating a blaze of depth ${num(d)} µm: steps of ${num(d / n)} µm, total height ${num(((n - 1) * d) / n)} µm`,
    ]);
  }
  if (!Array.isArray(r.levels) || r.levels.length === 0) fail('multiLevel.levels', 'a non-empty list of levels', r.levels);
  const levels = (r.levels as ReadonlyArray<Record<string, unknown>>).map((lv, i) => {
    const f = `multiLevel.levels[${i}]`;
    const t = positiveLength(`${f}.thicknessUm`, lv?.thicknessUm);
    if (!Array.isArray(lv.ridges)) fail(`${f}.ridges`, 'a list of {from, to} intervals', lv.ridges);
    let at = 0;
    const ridges: Interval[] = (lv.ridges as ReadonlyArray<Record<string, unknown>>).map((iv, j) => {
      const a = finite(`${f}.ridges[${j}].from`, iv?.from);
      const b = finite(`${f}.ridges[${j}].to`, iv?.to);
      if (!(a >= at && a < 1)) fail(`${f}.ridges[${j}].from`, `a fraction in [${num(at)}, 1) (sorted, disjoint ridges within the period)`, a);
      if (!(b > a && b <= 1)) fail(`${f}.ridges[${j}].to`, `a fraction in (${num(a)}, 1]`, b);
      at = b;
      return [a, b];
    });
    return { t, ridges };
  });
  const layers = levels.map((lv) =>
    layerOf(lv.t, segmentsFromRegions([{ set: lv.ridges, material: c.ridgeMaterial }], c.grooveMaterial)),
  );
  const depth = levels.reduce((s, lv) => s + lv.t, 0);
  // bottom-up heights of level boundaries
  const bottoms: number[] = [];
  let h = depth;
  for (const lv of levels) {
    h -= lv.t;
    bottoms.push(Math.max(0, h));
  }
  const shape: ProfileShape = {
    periodUm: L,
    heightUm: depth,
    breaksUm: bottoms.filter((b) => b > 0),
    materialsAt(z) {
      const i = bottoms.findIndex((b) => z >= b);
      const lv = levels[i < 0 ? levels.length - 1 : i]!;
      return segmentsFromRegions([{ set: lv.ridges, material: c.ridgeMaterial }], c.grooveMaterial);
    },
  };
  const surface = nestedSurface(L, levels, bottoms);
  return {
    layers,
    slices: layers.length,
    depthUm: depth,
    notes: surface ? [] : ['the levels are not nested (a level reaches beyond the one below it): no single-valued surface, so no conformal coating'],
    periodUm: L,
    ridgeMaterial: c.ridgeMaterial,
    grooveMaterial: c.grooveMaterial,
    shape,
    surfaces: surface ? [surface] : [],
  };
}

/**
 * The surface h(x) when every level's ridge lies within the ridge of the level below (then the
 * ridge is a staircase without overhangs); undefined otherwise.
 */
function nestedSurface(
  L: number,
  levels: ReadonlyArray<{ t: number; ridges: Interval[] }>,
  bottoms: ReadonlyArray<number>,
): HeightProfile | undefined {
  const cuts = new Set<number>([0, 1]);
  for (const lv of levels) for (const [a, b] of lv.ridges) cuts.add(a).add(b);
  const xs = [...cuts].sort((a, b) => a - b);
  const v: Array<[number, number]> = [];
  for (let k = 0; k + 1 < xs.length; k++) {
    const m = 0.5 * (xs[k]! + xs[k + 1]!);
    // walk up from the bottom level: ridge must be contiguous from the base
    let top = 0;
    let open = true;
    for (let i = levels.length - 1; i >= 0; i--) {
      const inRidge = levels[i]!.ridges.some(([a, b]) => m > a && m < b);
      if (inRidge && !open) return undefined;
      if (inRidge) top = bottoms[i]! + levels[i]!.t;
      else open = false;
    }
    v.push([xs[k]! * L, top], [xs[k + 1]! * L, top]);
  }
  return polylineSurface(L, v);
}
