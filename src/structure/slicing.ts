/**
 * Staircase approximation of a cross-section: choose slice boundaries in height, then give each
 * slice the materials found at its mid-height.
 *
 * Rule for the boundaries. The height range is first cut at the shape's breaks (plateaus,
 * material interfaces), so no slice straddles a jump of the fill. On each piece the "change"
 * C(z) is the cumulative fraction of the period whose material differs between neighbouring
 * heights, measured on 128 equal steps; for a single-valued surface this is the cumulative
 * |d(fill)/dz|, measured from the fill itself when the shape gives it (`fillAt`). A piece over
 * which nothing changes (a flat level, a uniform film) gets exactly one
 * slice. The remaining slices are shared out by weight, each piece getting at least one:
 * - 'uniform': weight = height, and equal heights within a piece;
 * - 'adaptive': weight density w(z) = α/H + (1 − α)·c(z)/C_total with α = 0.25 and H the total
 *   height, and boundaries at equal increments of ∫w within a piece. The α share of plain height
 *   keeps flat stretches from being starved: no slice is taller than about H/(α·S) = 4·H/S.
 * Where the fill changes at a constant rate (a sawtooth, a trapezoid) both rules agree.
 */
import { segmentsDiffer } from './segments.ts';
import type { GeometryLayer, NamedSegment, ProfileShape, SliceStrategy } from './types.ts';

/** Share of plain height in the adaptive weight. */
export const ADAPTIVE_HEIGHT_SHARE = 0.25;
/** Steps per piece on which the change C(z) is measured. */
const STEPS = 128;

/** Slices of a shape, top first, with their boundaries. */
export interface Slicing {
  /** slices top (cover side) first */
  readonly layers: GeometryLayer[];
  /** slice boundaries in height above the base (µm), ascending, from 0 to the shape's height */
  readonly boundariesUm: number[];
  readonly notes: string[];
}

/**
 * Cut a shape into slices and sample each at mid-height.
 * @param shape the cross-section
 * @param slices requested number of slices (≥ 1); more are used when the shape has more
 *   pieces than that (one per piece), fewer never — except that pieces over which nothing
 *   changes take one slice each and hand the rest on
 * @param strategy 'uniform' or 'adaptive' (rule in the module comment)
 * @throws never for a valid shape: builders validate their parameters before calling it
 * @example
 * const s = sliceShape(shape, 20, 'adaptive');
 * s.layers.length; // ≥ the number of pieces between the shape's breaks
 */
export function sliceShape(shape: ProfileShape, slices: number, strategy: SliceStrategy): Slicing {
  const H = shape.heightUm;
  const tol = 1e-12 * H;
  const cuts = [0, H];
  for (const b of shape.breaksUm) if (b > tol && b < H - tol) cuts.push(b);
  cuts.sort((a, b) => a - b);
  const pieces: Array<{ a: number; b: number; nodes: number[]; cum: number[]; change: number }> = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const a = cuts[i]!;
    const b = cuts[i + 1]!;
    if (b - a <= tol) continue;
    const d = 1e-9 * (b - a);
    const nodes: number[] = [];
    const cum: number[] = [];
    const changeAt = changeMeter(shape);
    let total = 0;
    for (let k = 0; k <= STEPS; k++) {
      const z = a + d + ((b - a - 2 * d) * k) / STEPS;
      total += changeAt(z);
      nodes.push(z);
      cum.push(total);
    }
    nodes[0] = a;
    nodes[STEPS] = b;
    pieces.push({ a, b, nodes, cum, change: total });
  }
  const changeTotal = pieces.reduce((s, p) => s + p.change, 0);
  const adaptive = strategy === 'adaptive' && changeTotal > 1e-12;
  const alpha = ADAPTIVE_HEIGHT_SHARE;
  const weight = (p: (typeof pieces)[number]): number =>
    adaptive ? (alpha * (p.b - p.a)) / H + ((1 - alpha) * p.change) / changeTotal : (p.b - p.a) / H;
  // allocation: flat pieces one slice each, the rest by weight (at least one each)
  const counts = pieces.map(() => 1);
  const active = pieces.map((p, i) => (p.change > 1e-12 ? i : -1)).filter((i) => i >= 0);
  const notes: string[] = [];
  if (active.length > 0) {
    const rest = Math.max(slices - (pieces.length - active.length), active.length);
    const wsum = active.reduce((s, i) => s + weight(pieces[i]!), 0);
    const ideal = active.map((i) => (rest * weight(pieces[i]!)) / wsum);
    active.forEach((i, k) => (counts[i] = Math.max(1, Math.floor(ideal[k]!))));
    let sum = active.reduce((s, i) => s + counts[i]!, 0);
    while (sum < rest) {
      let best = 0;
      active.forEach((i, k) => {
        if (ideal[k]! - counts[i]! > ideal[best]! - counts[active[best]!]!) best = k;
      });
      counts[active[best]!]!++;
      sum++;
    }
    while (sum > rest) {
      let best = -1;
      active.forEach((i, k) => {
        if (counts[i]! > 1 && (best < 0 || counts[i]! - ideal[k]! > counts[active[best]!]! - ideal[best]!)) best = k;
      });
      counts[active[best]!]!--;
      sum--;
    }
  }
  const used = counts.reduce((s, c) => s + c, 0);
  if (used > slices) notes.push(`slices: ${used} used instead of ${slices}: the profile has ${pieces.length} levels that each need a slice of their own`);
  else if (used < slices) notes.push(`slices: ${used} used instead of ${slices}: nothing changes with height over ${pieces.length - active.length} flat level(s), which take one slice each`);
  const boundaries: number[] = [0];
  pieces.forEach((p, i) => {
    const n = counts[i]!;
    for (let k = 1; k < n; k++) {
      if (!adaptive || p.change <= 1e-12) boundaries.push(p.a + ((p.b - p.a) * k) / n);
      else {
        // invert W(z) = α·(z − a)/H + (1 − α)·C(z)/C_total, piecewise linear on the nodes
        const W = (j: number): number => (alpha * (p.nodes[j]! - p.a)) / H + ((1 - alpha) * p.cum[j]!) / changeTotal;
        const target = (W(STEPS) * k) / n;
        let j = 0;
        while (j < STEPS - 1 && W(j + 1) < target) j++;
        const w0 = W(j);
        const w1 = W(j + 1);
        boundaries.push(p.nodes[j]! + ((target - w0) / (w1 - w0)) * (p.nodes[j + 1]! - p.nodes[j]!));
      }
    }
    boundaries.push(p.b);
  });
  const layers: GeometryLayer[] = [];
  for (let i = boundaries.length - 2; i >= 0; i--) {
    const lo = boundaries[i]!;
    const hi = boundaries[i + 1]!;
    layers.push(layerOf(hi - lo, shape.materialsAt(0.5 * (lo + hi))));
  }
  return { layers, boundariesUm: boundaries, notes };
}

/**
 * A function of height that returns the fraction of the period whose material differs from that
 * at the height of its previous call (0 at the first call): from the fill when the shape gives it,
 * else by comparing the segments.
 */
function changeMeter(shape: ProfileShape): (z: number) => number {
  if (shape.fillAt) {
    const fillAt = shape.fillAt;
    let prev: number | null = null;
    return (z) => {
      const f = fillAt(z);
      const c = prev === null ? 0 : Math.abs(prev - f);
      prev = f;
      return c;
    };
  }
  let prev: NamedSegment[] | null = null;
  return (z) => {
    const segs = shape.materialsAt(z);
    const c = prev === null ? 0 : segmentsDiffer(prev, segs);
    prev = segs;
    return c;
  };
}

/** A slice: 'uniform' when one material fills the period, else 'segments'. */
export function layerOf(thicknessUm: number, segments: NamedSegment[]): GeometryLayer {
  if (segments.length === 1) return { kind: 'uniform', thicknessUm, material: segments[0]!.material };
  // Edges rounded to 1e-12 of the period: a profile scaled in depth crosses each slice's
  // mid-height at the same fractions, but computing them through z = t·d leaves last-bit noise
  // that would defeat the solver's mode reuse in depth sweeps. 1e-12·Λ is far below any
  // physical or numerical resolution.
  const snap = (v: number): number => Math.round(v * 1e12) / 1e12;
  return { kind: 'segments', thicknessUm, segments: segments.map((s) => ({ from: snap(s.from), to: snap(s.to), material: s.material })) };
}
