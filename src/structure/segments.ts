/**
 * Interval arithmetic on fractions of the period and conversion of nested regions into the
 * ordered segments a slice needs. Internal to src/structure.
 */
import type { NamedSegment } from './types.ts';

/** Pieces narrower than this (fraction of the period) are absorbed by a neighbour. */
export const MIN_WIDTH = 1e-12;

export type Interval = [number, number];

/** Sort and merge overlapping or touching intervals; empty ones are dropped. */
export function mergeIntervals(list: Interval[]): Interval[] {
  const xs = list.filter((iv) => iv[1] > iv[0]).sort((p, q) => p[0] - q[0]);
  const out: Interval[] = [];
  for (const iv of xs) {
    const last = out[out.length - 1];
    if (last && iv[0] <= last[1]) last[1] = Math.max(last[1], iv[1]);
    else out.push([iv[0], iv[1]]);
  }
  return out;
}

/**
 * Map an interval of x (any real numbers, in units of `period`) onto one period [0, period),
 * splitting it at the seam; returns fractions of the period.
 */
export function wrapInterval(a: number, b: number, period: number, out: Interval[]): void {
  const fa = a / period;
  const fb = b / period;
  if (fb - fa >= 1) {
    out.push([0, 1]);
    return;
  }
  const k = Math.floor(fa);
  const s = fa - k;
  const e = fb - k;
  if (e <= 1) out.push([s, e]);
  else {
    out.push([s, 1]);
    out.push([0, e - 1]);
  }
}

/** True when x lies inside one of the sorted, disjoint intervals. */
export function contains(set: ReadonlyArray<Interval>, x: number): boolean {
  let lo = 0;
  let hi = set.length - 1;
  while (lo <= hi) {
    const mid = (lo + hi) >> 1;
    const iv = set[mid]!;
    if (x < iv[0]) hi = mid - 1;
    else if (x > iv[1]) lo = mid + 1;
    else return true;
  }
  return false;
}

/**
 * Segments tiling [0, 1) from regions given in priority order: a point takes the material of the
 * first region that contains it, else `background`. Adjacent equal materials are merged and
 * slivers narrower than {@link MIN_WIDTH} absorbed.
 */
export function segmentsFromRegions(
  regions: ReadonlyArray<{ readonly set: ReadonlyArray<Interval>; readonly material: string }>,
  background: string,
): NamedSegment[] {
  const cuts = [0, 1];
  for (const r of regions) for (const [a, b] of r.set) cuts.push(Math.min(1, Math.max(0, a)), Math.min(1, Math.max(0, b)));
  cuts.sort((p, q) => p - q);
  const raw: Array<{ from: number; to: number; material: string }> = [];
  for (let i = 0; i + 1 < cuts.length; i++) {
    const a = cuts[i]!;
    const b = cuts[i + 1]!;
    if (!(b > a)) continue;
    const m = 0.5 * (a + b);
    const hit = regions.find((r) => contains(r.set, m));
    raw.push({ from: a, to: b, material: hit ? hit.material : background });
  }
  return tidySegments(raw);
}

/**
 * Merge adjacent segments of equal material, absorb slivers, and pin the ends to 0 and 1.
 * Input must be in order and contiguous.
 */
export function tidySegments(raw: ReadonlyArray<{ from: number; to: number; material: string }>): NamedSegment[] {
  const out: Array<{ from: number; to: number; material: string }> = [];
  for (const s of raw) {
    const last = out[out.length - 1];
    if (last && (last.material === s.material || s.to - s.from < MIN_WIDTH)) last.to = s.to;
    else if (last && last.to - last.from < MIN_WIDTH) {
      // a sliver at the start takes the next material
      last.to = s.to;
      last.material = s.material;
    } else out.push({ ...s });
  }
  // merging slivers may have made equal neighbours adjacent
  const merged: Array<{ from: number; to: number; material: string }> = [];
  for (const s of out) {
    const last = merged[merged.length - 1];
    if (last && last.material === s.material) last.to = s.to;
    else merged.push(s);
  }
  if (merged.length > 0) {
    merged[0]!.from = 0;
    merged[merged.length - 1]!.to = 1;
  }
  return merged;
}

/** Fraction of the period where the two tilings disagree on the material. */
export function segmentsDiffer(a: ReadonlyArray<NamedSegment>, b: ReadonlyArray<NamedSegment>): number {
  let i = 0;
  let j = 0;
  let at = 0;
  let differ = 0;
  while (i < a.length && j < b.length) {
    const sa = a[i]!;
    const sb = b[j]!;
    const end = Math.min(sa.to, sb.to);
    if (sa.material !== sb.material) differ += end - at;
    at = end;
    if (sa.to <= end) i++;
    if (sb.to <= end) j++;
  }
  return differ;
}
