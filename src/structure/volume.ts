/**
 * Volume (index-modulated) grating: a layer of thickness T whose permittivity varies as
 * ε(x, h) = ε0 + Δε·cos(2πx/Λ − φ(h)), h the height above the layer's bottom. Slanted fringes
 * (slant α from the normal, α > 0 leaning toward +x as they rise toward the cover) follow
 * φ(h) = φ0 + 2π·tan α·h/Λ, so a fringe maximum sits at x = Λ·φ0/(2π) + tan α·h. The layer is
 * cut into slices of equal height (the phase changes at a constant rate, so 'adaptive' gives the
 * same), each a 'cosine' layer with the phase at its mid-height; unslanted, one slice suffices.
 *
 * Index modulation: with n(x) = n0 + Δn·cos(·), ε = n0² + 2·n0·Δn·cos(·) + Δn²·cos²(·). This
 * builder uses Δε = 2·n0·Δn and keeps ε0 from the material, i.e. it drops the Δn²·cos² term:
 * an absolute error ≤ Δn² in ε (relative to the modulation, ≤ Δn/(2·n0)); the note says how big.
 */
import type { GeometryLayer, ProfileResult } from './types.ts';
import { angleIn, fail, finite, material, num, positiveLength, record, sliceCount, strategy } from './validate.ts';

export type VolumeGratingParams = {
  /** grating period Λ (µm) */
  readonly periodUm: number;
  /** layer thickness T (µm) */
  readonly thicknessUm: number;
  /** base material (ε0 = its index squared, resolved later) */
  readonly material: string;
  /** fringe slant from the normal (degrees), (−90°, 90°); default 0 */
  readonly slantDeg?: number;
  /** phase φ0 (radians) of the modulation at the bottom of the layer; default 0 */
  readonly phaseRad?: number;
  /** slices (integer ≥ 1) for slanted fringes; unslanted uses one */
  readonly slices?: number;
  readonly strategy?: 'uniform' | 'adaptive';
} & (
  | { /** permittivity modulation amplitude Δε */ readonly deltaEps: number; readonly deltaN?: undefined }
  | {
      /** index modulation amplitude Δn */
      readonly deltaN: number;
      /** real base index n0 used to convert Δn to Δε = 2·n0·Δn */
      readonly n0: number;
      readonly deltaEps?: undefined;
    }
);

/**
 * Sliced volume cosine grating.
 * @param p period and thickness (µm), base material, Δε or (Δn, n0), slant (degrees), phase
 *   (radians), slices
 * @returns 'cosine' slices top first (the grating region has no ridge: ridge and groove material
 *   both name the base material, `shape` is absent and `surfaces` empty)
 * @throws {StructureError} on non-positive period or thickness, both or neither of deltaEps and
 *   deltaN, deltaN without a positive n0, slant outside (−90°, 90°), bad slice count
 * @example
 * volumeGrating({ periodUm: 0.5, thicknessUm: 10, material: 'gelatin', deltaN: 0.02, n0: 1.5, slantDeg: 10, slices: 30 });
 */
export function volumeGrating(p: VolumeGratingParams): ProfileResult {
  const r = record('volume', p);
  const L = positiveLength('volume.periodUm', r.periodUm);
  const T = positiveLength('volume.thicknessUm', r.thicknessUm);
  const mat = material('volume.material', r.material);
  const slant = r.slantDeg === undefined ? 0 : angleIn('volume.slantDeg', r.slantDeg, -90, 90);
  const phase0 = r.phaseRad === undefined ? 0 : finite('volume.phaseRad', r.phaseRad);
  strategy('volume.strategy', r.strategy);
  const slices = slant === 0 && r.slices === undefined ? 1 : sliceCount('volume.slices', r.slices);
  if ((r.deltaEps === undefined) === (r.deltaN === undefined)) {
    fail('volume', 'exactly one of deltaEps and deltaN', r.deltaEps === undefined ? 'neither' : 'both');
  }
  const notes: string[] = [];
  let deltaEps: number;
  if (r.deltaEps !== undefined) deltaEps = finite('volume.deltaEps', r.deltaEps);
  else {
    const dn = finite('volume.deltaN', r.deltaN);
    const n0 = r.n0;
    if (typeof n0 !== 'number' || !Number.isFinite(n0) || !(n0 > 0)) fail('volume.n0', 'a real base index > 0 (needed to convert deltaN to deltaEps)', n0);
    deltaEps = 2 * n0 * dn;
    notes.push(`Δε = 2·n0·Δn = ${num(deltaEps)}; the dropped Δn²·cos² term is at most ${num(dn * dn)} in ε (${num(Math.abs(dn) / (2 * n0))} of the modulation)`);
  }
  const tan = Math.tan((slant * Math.PI) / 180);
  const n = slant === 0 ? 1 : slices;
  if (n !== slices) notes.push(`slices: 1 used instead of ${slices}: unslanted fringes do not change with depth`);
  if (slant !== 0) notes.push(`slanted fringes: the phase advances by 2π·tan α·T/Λ = ${num((2 * Math.PI * tan * T) / L)} rad over the layer, ${num((2 * Math.PI * tan * T) / L / n)} rad per slice`);
  const layers: GeometryLayer[] = [];
  for (let i = n - 1; i >= 0; i--) {
    const hMid = ((i + 0.5) * T) / n;
    layers.push({ kind: 'cosine', thicknessUm: T / n, material: mat, deltaEps, phaseRad: phase0 + (2 * Math.PI * tan * hMid) / L });
  }
  return { layers, slices: n, depthUm: T, notes, periodUm: L, ridgeMaterial: mat, grooveMaterial: mat, surfaces: [] };
}
