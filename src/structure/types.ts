/**
 * Records of the structure layer: wavelength-independent geometry that names its materials, the
 * results of the profile builders, and the analytic descriptions builders keep so that coatings
 * can re-slice a profile and plots can draw its true outline.
 *
 * Coordinates: x along the period (fractions of the period in segments, µm where the name says
 * so); inside a profile, heights are measured upward from the base of the ridge (z = 0) to its
 * top; layers are listed top (cover side) to bottom, as in the solver.
 */

/** One piece of a sliced layer: material `material` over [from, to), fractions of the period. */
export interface NamedSegment {
  /** start, fraction of the period in [0, 1) */
  readonly from: number;
  /** end, fraction of the period in (from, 1] */
  readonly to: number;
  /** material name, resolved to a complex index later */
  readonly material: string;
}

/**
 * One layer of the geometry, with materials by name so that wavelength sweeps can reuse it.
 * - `uniform`: a homogeneous film.
 * - `segments`: piecewise-constant; the segments tile [0, 1) in order.
 * - `cosine`: a volume index-modulated slice, ε(x) = ε_material + Δε·cos(2πx/Λ − φ).
 */
export type GeometryLayer =
  | { readonly kind: 'uniform'; readonly thicknessUm: number; readonly material: string }
  | { readonly kind: 'segments'; readonly thicknessUm: number; readonly segments: ReadonlyArray<NamedSegment> }
  | {
      readonly kind: 'cosine';
      readonly thicknessUm: number;
      readonly material: string;
      /** modulation amplitude Δε of the permittivity (dimensionless) */
      readonly deltaEps: number;
      /** phase φ (radians) of the cosine: maxima of ε at x/Λ = φ/(2π) + integer */
      readonly phaseRad: number;
    };

/**
 * How slice boundaries are placed in height:
 * - 'uniform': equal slice heights;
 * - 'adaptive': more slices where the profile's fill changes fastest with height (see
 *   `sliceShape` in slicing.ts for the rule).
 */
export type SliceStrategy = 'uniform' | 'adaptive';

/**
 * A single-valued surface h(x) ≥ 0 over one period: the height (µm) of the top of the material
 * below it above the base, at x.
 */
export interface HeightProfile {
  /** period Λ (µm) */
  readonly periodUm: number;
  /** lowest height (µm) */
  readonly minUm: number;
  /** highest height (µm) */
  readonly maxUm: number;
  /**
   * Heights (µm, strictly between 0 and `maxUm`) at which the surface has a horizontal plateau,
   * or below which everything is material: slice boundaries belong there.
   */
  readonly levelsUm: ReadonlyArray<number>;
  /**
   * true when `vertices()` are the exact corners of a piecewise-linear surface; false when they
   * sample a curved one (a sinusoid, an expression, a coating's rounded outer surface)
   */
  readonly exact: boolean;
  /**
   * Where the surface is above height `zUm`: sorted, disjoint intervals [a, b] of x in fractions
   * of the period within [0, 1], such that h(x) > zUm inside them. Exact (closed-form
   * intersections) for piecewise-linear surfaces, the sinusoid and coatings over polylines;
   * root-found for expressions (see `profileFromExpression`).
   */
  above(zUm: number): Array<[number, number]>;
  /**
   * The fraction of the period where h(x) > zUm (the total width of `above(zUm)`), without
   * building the intervals; optional (slicing measures with it when present).
   */
  fillAbove?(zUm: number): number;
  /** h(x) in µm at x given as a fraction of the period. */
  heightAt(x: number): number;
  /**
   * Vertices (x µm from 0 to Λ, h µm) of the surface over one period, in order: the exact corners
   * of a piecewise-linear surface, or a dense sampling of a curved one.
   */
  vertices(): Array<[number, number]>;
}

/**
 * An analytic cross-section over one period: which material sits where at each height. The
 * slicer samples it at the mid-height of every slice.
 */
export interface ProfileShape {
  /** period Λ (µm) */
  readonly periodUm: number;
  /** height of the top of the shape above its base (µm) */
  readonly heightUm: number;
  /** heights in (0, heightUm) where a slice boundary must fall (plateaus, material interfaces) */
  readonly breaksUm: ReadonlyArray<number>;
  /** materials across one period at height `zUm` (0 < zUm < heightUm), tiling [0, 1) in order */
  materialsAt(zUm: number): NamedSegment[];
  /**
   * Optional, for one material under a single-valued surface in another: the fraction of the
   * period the ridge fills at `zUm`. The ridge at a greater height lies within the ridge at a
   * lower one, so the fraction of the period whose material differs between two heights is the
   * difference of the fills — what slicing measures, here without building segments.
   */
  fillAt?(zUm: number): number;
}

/** What every profile builder returns. */
export interface ProfileResult {
  /** slices top (cover side) to bottom (ridge base) */
  readonly layers: GeometryLayer[];
  /** number of slices actually used (may differ from the request: see `notes`) */
  readonly slices: number;
  /** total height of the profile (µm): the sum of the slice thicknesses */
  readonly depthUm: number;
  /** remarks: derived quantities (e.g. a blaze depth), adjustments, approximations */
  readonly notes: string[];
  /** period Λ (µm) */
  readonly periodUm: number;
  /** material of the ridge (below the surface) */
  readonly ridgeMaterial: string;
  /** material around the ridge (the groove, above the surface) */
  readonly grooveMaterial: string;
  /** the analytic cross-section, when it is piecewise-constant in x at every height */
  readonly shape?: ProfileShape;
  /**
   * Single-valued interfaces h(x) from the ridge base upward (the ridge's surface, then each
   * coating's outer surface); the last is the top surface. Empty when the profile overhangs.
   */
  readonly surfaces: ReadonlyArray<HeightProfile>;
}

/** What the thin-film stack builder returns. */
export interface StackResult {
  /** uniform films, top (cover side) to bottom */
  readonly layers: GeometryLayer[];
  /** total thickness (µm) */
  readonly thicknessUm: number;
  /** remarks, e.g. the physical thickness a quarter-wave became */
  readonly notes: string[];
}

/** Parameters every sliced profile builder takes. */
export interface SlicedProfileParams {
  /** grating period Λ (µm) */
  readonly periodUm: number;
  /** material of the ridge (below the surface), by name */
  readonly ridgeMaterial: string;
  /** material filling the grooves (above the surface), by name — usually the cover's */
  readonly grooveMaterial: string;
  /** requested number of slices (integer ≥ 1) */
  readonly slices: number;
  /** slicing strategy, default 'uniform' */
  readonly strategy?: SliceStrategy;
}
