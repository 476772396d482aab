/** Helpers for the structure tests: fill of a material in a slice, slice mid-heights. */
import type { GeometryLayer, ProfileResult } from '../../src/structure/index.ts';

/** Fraction of the period that `material` occupies in a layer. */
export function fill(layer: GeometryLayer, material: string): number {
  if (layer.kind === 'segments') return layer.segments.filter((s) => s.material === material).reduce((a, s) => a + s.to - s.from, 0);
  return layer.material === material ? 1 : 0;
}

/** Mid-heights above the base (µm) of a profile's slices, in the order of `layers` (top first). */
export function midHeights(p: ProfileResult): number[] {
  const out: number[] = [];
  let top = p.depthUm;
  for (const l of p.layers) {
    out.push(top - l.thicknessUm / 2);
    top -= l.thicknessUm;
  }
  return out;
}

/** Segments of a layer as [from, to, material] triples. */
export function segs(layer: GeometryLayer): Array<[number, number, string]> {
  if (layer.kind === 'segments') return layer.segments.map((s) => [s.from, s.to, s.material]);
  if (layer.kind === 'uniform') return [[0, 1, layer.material]];
  return [[0, 1, layer.material]];
}

/** True when the layer's segments tile [0, 1) in order without gaps or overlaps. */
export function tiles(layer: GeometryLayer): boolean {
  const s = segs(layer);
  if (s[0]![0] !== 0 || s[s.length - 1]![1] !== 1) return false;
  for (let i = 0; i < s.length; i++) {
    if (!(s[i]![1] > s[i]![0])) return false;
    if (i > 0 && s[i]![0] !== s[i - 1]![1]) return false;
  }
  return true;
}
