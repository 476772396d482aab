/**
 * Cross-section as data for plotting: every slice's segments as rectangles, per material, over
 * one or more periods. x runs along the period from 0 (µm); z runs downward from the top of the
 * first layer (µm), as in the stack.
 */
import type { GeometryLayer } from './types.ts';
import { fail, integerAtLeast, nonNegativeLength, positiveLength } from './validate.ts';

export interface CrossSectionPolygon {
  readonly material: string;
  /** index of the layer (top first) the polygon belongs to */
  readonly layer: number;
  /** closed outline (x µm, z µm), counter-clockwise on a plot with z pointing down */
  readonly points: Array<[number, number]>;
  /** for a 'cosine' slice: its modulation, ε = ε_material + Δε·cos(2πx/Λ − φ) */
  readonly modulation?: { readonly deltaEps: number; readonly phaseRad: number };
}

export interface CrossSection {
  readonly polygons: CrossSectionPolygon[];
  /** periods × Λ (µm) */
  readonly widthUm: number;
  /** total thickness (µm) */
  readonly heightUm: number;
}

/**
 * Rectangles for each slice's segments (a uniform or cosine slice is one rectangle per period).
 * Each period of each slice is covered exactly once.
 * @param layers geometry, top first
 * @param periodUm period Λ (µm)
 * @param periods number of periods drawn (integer ≥ 1), default 2
 * @returns polygons with their material and layer
 * @throws {StructureError} on a non-positive period, periods < 1, a malformed layer
 * @example
 * crossSection(lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.2, ridgeMaterial: 'Si', grooveMaterial: 'air' }).layers, 1, 2).polygons.length; // → 4
 */
export function crossSection(layers: ReadonlyArray<GeometryLayer>, periodUm: number, periods = 2): CrossSection {
  if (!Array.isArray(layers)) fail('crossSection.layers', 'a list of geometry layers', layers);
  const L = positiveLength('crossSection.periodUm', periodUm);
  const n = integerAtLeast('crossSection.periods', periods, 1);
  const polygons: CrossSectionPolygon[] = [];
  let z = 0;
  layers.forEach((l, i) => {
    const t = nonNegativeLength(`crossSection.layers[${i}].thicknessUm`, l?.thicknessUm);
    const z1 = z + t;
    const rect = (x0: number, x1: number): Array<[number, number]> => [
      [x0, z],
      [x0, z1],
      [x1, z1],
      [x1, z],
    ];
    for (let p = 0; p < n; p++) {
      if (l.kind === 'segments') {
        if (!Array.isArray(l.segments)) fail(`crossSection.layers[${i}].segments`, 'a list of segments', l.segments);
        for (const s of l.segments) polygons.push({ material: s.material, layer: i, points: rect((p + s.from) * L, (p + s.to) * L) });
      } else if (l.kind === 'uniform') polygons.push({ material: l.material, layer: i, points: rect(p * L, (p + 1) * L) });
      else if (l.kind === 'cosine') {
        polygons.push({ material: l.material, layer: i, points: rect(p * L, (p + 1) * L), modulation: { deltaEps: l.deltaEps, phaseRad: l.phaseRad } });
      } else fail(`crossSection.layers[${i}].kind`, "'uniform', 'segments' or 'cosine'", (l as { kind?: unknown }).kind);
    }
    z = z1;
  });
  return { polygons, widthUm: n * L, heightUm: z };
}
