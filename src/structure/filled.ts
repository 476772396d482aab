/**
 * Filled (planarizing) overcoat: the coating material fills the grooves and continues to a flat
 * top at a given thickness above the profile's highest point. The profile's slices are kept,
 * with the groove material replaced by the coating; a uniform film of the coating is added on
 * top when the thickness above the highest point is > 0.
 */
import { polylineSurface } from './polyline.ts';
import type { GeometryLayer, NamedSegment, ProfileResult, ProfileShape } from './types.ts';
import { fail, material, nonNegativeLength, num, record } from './validate.ts';

export interface FilledCoatingParams {
  /** coating material */
  readonly material: string;
  /** thickness of the flat coating above the profile's highest point (µm, ≥ 0) */
  readonly thicknessUm: number;
}

/**
 * Fill a profile's grooves with a coating up to a flat top.
 * @param profile any profile (sliced layers whose groove material is replaced; 'cosine' slices
 *   of a volume grating are left as they are)
 * @param p material and thickness above the highest point (µm)
 * @returns the filled profile, top first: [flat film if t > 0] + the profile's slices
 * @throws {StructureError} on a negative thickness or a material equal to the groove material
 * @example
 * filledCoating(sinusoid({ periodUm: 1, depthUm: 0.2, ridgeMaterial: 'glass', grooveMaterial: 'air', slices: 10 }),
 *               { material: 'resist', thicknessUm: 0.1 }).depthUm; // → 0.3
 */
export function filledCoating(profile: ProfileResult, p: FilledCoatingParams): ProfileResult {
  const r = record('filledCoating', p);
  const coat = material('filledCoating.material', r.material);
  const t = nonNegativeLength('filledCoating.thicknessUm', r.thicknessUm);
  if (!profile || !Array.isArray(profile.layers)) fail('filledCoating.profile', 'a profile result', profile);
  const groove = profile.grooveMaterial;
  if (coat === groove) fail('filledCoating.material', `a material other than the groove material '${groove}'`, coat);
  const swap = (segs: ReadonlyArray<NamedSegment>): NamedSegment[] => {
    const out: NamedSegment[] = [];
    for (const s of segs) {
      const m = s.material === groove ? coat : s.material;
      const last = out[out.length - 1];
      if (last && last.material === m) out[out.length - 1] = { from: last.from, to: s.to, material: m };
      else out.push({ from: s.from, to: s.to, material: m });
    }
    return out;
  };
  const layers: GeometryLayer[] = [];
  if (t > 0) layers.push({ kind: 'uniform', thicknessUm: t, material: coat });
  for (const l of profile.layers) {
    if (l.kind === 'uniform') layers.push(l.material === groove ? { ...l, material: coat } : l);
    else if (l.kind === 'segments') {
      const segs = swap(l.segments);
      layers.push(segs.length === 1 ? { kind: 'uniform', thicknessUm: l.thicknessUm, material: segs[0]!.material } : { ...l, segments: segs });
    } else layers.push(l);
  }
  const H = profile.depthUm + t;
  const base = profile.shape;
  const shape: ProfileShape | undefined = base && {
    periodUm: base.periodUm,
    heightUm: H,
    breaksUm: t > 0 ? [...base.breaksUm, base.heightUm] : base.breaksUm,
    materialsAt: (z) => (z >= base.heightUm ? [{ from: 0, to: 1, material: coat }] : swap(base.materialsAt(z))),
  };
  const flat = polylineSurface(profile.periodUm, [
    [0, H],
    [profile.periodUm, H],
  ]);
  return {
    layers,
    slices: layers.length,
    depthUm: H,
    notes: [...profile.notes, `filled with ${coat} to a flat top ${num(t)} µm above the highest point (total ${num(H)} µm)`],
    periodUm: profile.periodUm,
    ridgeMaterial: profile.ridgeMaterial,
    grooveMaterial: groove,
    ...(shape ? { shape } : {}),
    surfaces: [...profile.surfaces, flat],
  };
}
