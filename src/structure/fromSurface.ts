/**
 * From a single-valued surface h(x) to a sliced profile: at height z the ridge material fills
 * the x where h(x) > z, the groove material the rest. Internal to src/structure.
 */
import { segmentsFromRegions } from './segments.ts';
import { polylineSurface } from './polyline.ts';
import { sliceShape } from './slicing.ts';
import type { HeightProfile, ProfileResult, ProfileShape, SliceStrategy } from './types.ts';

/** The cross-section of a ridge of `ridge` under `surface`, in `groove`. */
export function surfaceShape(surface: HeightProfile, ridge: string, groove: string): ProfileShape {
  const shape: ProfileShape = {
    periodUm: surface.periodUm,
    heightUm: surface.maxUm,
    breaksUm: surface.levelsUm,
    materialsAt: (z) => segmentsFromRegions([{ set: surface.above(z), material: ridge }], groove),
  };
  // two different materials: the fill measures the change with height (see ProfileShape.fillAt)
  if (surface.fillAbove && ridge !== groove) return { ...shape, fillAt: (z) => surface.fillAbove!(z) };
  return shape;
}

/** Slice a surface profile into a {@link ProfileResult}. */
export function profileFromSurface(
  surface: HeightProfile,
  p: { ridgeMaterial: string; grooveMaterial: string; slices: number; strategy: SliceStrategy },
  notes: string[],
): ProfileResult {
  const shape = surfaceShape(surface, p.ridgeMaterial, p.grooveMaterial);
  const s = sliceShape(shape, p.slices, p.strategy);
  return {
    layers: s.layers,
    slices: s.layers.length,
    depthUm: surface.maxUm,
    notes: [...notes, ...s.notes],
    periodUm: surface.periodUm,
    ridgeMaterial: p.ridgeMaterial,
    grooveMaterial: p.grooveMaterial,
    shape,
    surfaces: [surface],
  };
}

/** Slice the polyline surface through `vertices` (x µm, h µm over one period). */
export function polylineProfile(
  c: { periodUm: number; ridgeMaterial: string; grooveMaterial: string; slices: number; strategy: SliceStrategy },
  vertices: ReadonlyArray<readonly [number, number]>,
  notes: string[],
): ProfileResult {
  return profileFromSurface(polylineSurface(c.periodUm, vertices), c, notes);
}
