/**
 * Conformal coating: a layer of thickness t laid over a profile's top surface, occupying the
 * points above the surface within distance t of it measured along the surface normal — the
 * usual metal overcoat on a resist or glass profile. Its outer surface is the facets moved by t
 * along their normals, rounded with radius t over convex corners (ridge tops) and trimmed where
 * the moved facets cross over concave corners (groove bottoms); see offset.ts. The coated
 * profile is re-sliced as a whole: in each slice the ridge keeps its material, the coating takes
 * the groove material's place between the surface and the outer surface, and the groove
 * material stays above. Coatings can be stacked (a coating over a coated profile follows the
 * previous coating's outer surface, sampled at 1024 points per period).
 */
import { offsetSurface } from './offset.ts';
import { segmentsFromRegions, type Interval } from './segments.ts';
import { profileFromShape } from './fromSurface.ts';
import type { ProfileResult, ProfileShape, SliceStrategy } from './types.ts';
import { fail, material, num, positiveLength, record, sliceCount, strategy } from './validate.ts';

export interface ConformalCoatingParams {
  /** coating thickness along the surface normal (µm) */
  readonly thicknessUm: number;
  /** coating material */
  readonly material: string;
  /** requested slices for the whole coated profile (integer ≥ 1) */
  readonly slices: number;
  readonly strategy?: SliceStrategy;
}

/**
 * Coat a profile conformally and re-slice it.
 * @param profile a profile with a single-valued top surface (not slanted, undercut or volume)
 * @param p thickness (µm), material, slices, strategy
 * @returns the coated profile, top first; `depthUm` = the profile's height + t; `surfaces` gains
 *   the coating's outer surface
 * @throws {StructureError} when the profile has no single-valued surface, on a non-positive
 *   thickness, a coating material equal to the groove material, a bad slice count or strategy
 * @example
 * const g = sawtooth({ periodUm: 1, blazeDeg: 20, ridgeMaterial: 'resist', grooveMaterial: 'air', slices: 20 });
 * conformalCoating(g, { thicknessUm: 0.05, material: 'Al', slices: 30 }).depthUm; // → g.depthUm + 0.05
 */
export function conformalCoating(profile: ProfileResult, p: ConformalCoatingParams): ProfileResult {
  const r = record('coating', p);
  const t = positiveLength('coating.thicknessUm', r.thicknessUm);
  const coat = material('coating.material', r.material);
  const slices = sliceCount('coating.slices', r.slices);
  const strat = strategy('coating.strategy', r.strategy);
  const base = profile?.shape;
  const top = profile?.surfaces?.[profile.surfaces.length - 1];
  if (!base || !top) {
    fail('coating.profile', 'a profile with a single-valued top surface (not slanted, undercut, non-nested levels or volume)', profile?.notes?.length ? `one without (${profile.notes.join('; ')})` : 'one without');
  }
  const groove = profile.grooveMaterial;
  if (coat === groove) fail('coating.material', `a material other than the groove material '${groove}'`, coat);
  const outer = offsetSurface(top, t);
  const H = Math.max(base.heightUm, outer.maxUm);
  const breaks = new Set<number>([...base.breaksUm, ...outer.levelsUm]);
  if (base.heightUm < H) breaks.add(base.heightUm);
  const shape: ProfileShape = {
    periodUm: base.periodUm,
    heightUm: H,
    breaksUm: [...breaks].sort((a, b) => a - b),
    materialsAt(z) {
      const below = z < base.heightUm ? base.materialsAt(z) : [{ from: 0, to: 1, material: groove }];
      const regions: Array<{ set: Interval[]; material: string }> = [];
      for (const s of below) if (s.material !== groove) regions.push({ set: [[s.from, s.to]], material: s.material });
      regions.push({ set: outer.above(z), material: coat });
      return segmentsFromRegions(regions, groove);
    },
  };
  return profileFromShape(
    shape,
    { ridgeMaterial: profile.ridgeMaterial, grooveMaterial: groove, slices, strategy: strat },
    [
      ...profile.notes.filter((n) => !n.startsWith('slices:')),
      `conformal coating: ${num(t)} µm of ${coat} along the surface normal (rounded with radius ${num(t)} µm over convex corners); coated height ${num(H)} µm`,
    ],
    [...profile.surfaces, outer],
  );
}
