/**
 * From a shape to a sliced profile, in particular from a single-valued surface h(x): at height z
 * the ridge material fills the x where h(x) > z, the groove material the rest. Internal to
 * src/structure.
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

/** Slicing settings and the materials a profile names. */
type SliceSettings = { ridgeMaterial: string; grooveMaterial: string; slices: number; strategy: SliceStrategy };

/**
 * Slice any shape into a {@link ProfileResult}: its notes, then the slicing's; depth = the
 * shape's height; `surfaces` the single-valued surfaces a coating may follow (none for an
 * undercut or slanted ridge).
 */
export function profileFromShape(shape: ProfileShape, p: SliceSettings, notes: string[], surfaces: HeightProfile[]): ProfileResult {
  const s = sliceShape(shape, p.slices, p.strategy);
  return {
    layers: s.layers,
    slices: s.layers.length,
    depthUm: shape.heightUm,
    notes: [...notes, ...s.notes],
    periodUm: shape.periodUm,
    ridgeMaterial: p.ridgeMaterial,
    grooveMaterial: p.grooveMaterial,
    shape,
    surfaces,
  };
}

/** Slice a surface profile into a {@link ProfileResult}. */
export function profileFromSurface(surface: HeightProfile, p: SliceSettings, notes: string[]): ProfileResult {
  return profileFromShape(surfaceShape(surface, p.ridgeMaterial, p.grooveMaterial), p, notes, [surface]);
}

/** Slice the polyline surface through `vertices` (x µm, h µm over one period). */
export function polylineProfile(
  c: { periodUm: number; ridgeMaterial: string; grooveMaterial: string; slices: number; strategy: SliceStrategy },
  vertices: ReadonlyArray<readonly [number, number]>,
  notes: string[],
): ProfileResult {
  return profileFromSurface(polylineSurface(c.periodUm, vertices), c, notes);
}
