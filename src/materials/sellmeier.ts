/**
 * The Sellmeier dispersion formula
 *
 *   n²(λ) = A + Σᵢ Bᵢ·λ² / (λ² − Cᵢ²),   λ in µm, Cᵢ in µm, A = 1 in the usual form,
 *
 * or, when a source tabulates the squared resonance wavelengths, with Cᵢ² given directly in µm².
 * The index is real (κ = 0); where n² < 0 (between a resonance and its zero) the root is
 * taken on the absorbing branch, ñ = i·√|n²|, which only happens outside physical validity.
 */
import { MaterialError } from './errors.ts';
import { checkFinite, checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';
import { indexFromPermittivity } from './permittivity.ts';

/** Sellmeier coefficients: B with exactly one of `CUm` (Cᵢ in µm) or `C2Um2` (Cᵢ² in µm²). */
export interface SellmeierParams {
  /** constant term; default 1 (n² − 1 = Σ …) */
  readonly A?: number;
  /** dimensionless strengths Bᵢ */
  readonly B: readonly number[];
  /** resonance wavelengths Cᵢ in µm (form n² − 1 = Σ Bλ²/(λ² − C²)) */
  readonly CUm?: readonly number[];
  /** squared resonance wavelengths Cᵢ² in µm² (form n² − 1 = Σ Bλ²/(λ² − C)) */
  readonly C2Um2?: readonly number[];
}

/** A material described by the Sellmeier formula. */
export interface SellmeierMaterial extends Material {
  readonly kind: 'sellmeier';
  /** the coefficients as given */
  readonly params: SellmeierParams;
}

/**
 * Build a Sellmeier material.
 * @param params A (default 1), B, and CUm (µm) or C2Um2 (µm²), arrays of equal length ≥ 1
 * @param info id, citation and valid range (µm)
 * @throws {MaterialError} 'invalid-data' for mismatched or non-finite coefficients, both or
 *   neither of CUm / C2Um2, or bad info
 * @example
 * const silica = sellmeierMaterial(
 *   { B: [0.6961663, 0.4079426, 0.8974794], CUm: [0.0684043, 0.1162414, 9.896161] },
 *   { id: 'fused-silica', citation: 'Malitson 1965', validRangeUm: [0.21, 3.71] });
 * silica.index(0.6328).re; // ≈ 1.457018
 */
export function sellmeierMaterial(params: SellmeierParams, info: MaterialInfoInput): SellmeierMaterial {
  const base = checkInfo(info);
  const A = params.A ?? 1;
  const B = [...params.B];
  if ((params.CUm === undefined) === (params.C2Um2 === undefined)) {
    throw new MaterialError('invalid-data', 'give exactly one of CUm (resonance wavelengths, µm) or C2Um2 (their squares, µm²)', base.id, { path: 'CUm' });
  }
  const field = params.CUm !== undefined ? 'CUm' : 'C2Um2';
  const C = [...(params.CUm ?? params.C2Um2)!];
  checkFinite(base.id, 'A', [A]);
  checkFinite(base.id, 'B', B);
  checkFinite(base.id, field, C);
  if (B.length === 0 || B.length !== C.length) {
    throw new MaterialError('invalid-data', `B and ${field} must have the same length ≥ 1, found ${B.length} and ${C.length}`, base.id, { path: field });
  }
  if (params.C2Um2 !== undefined && C.some((c) => c < 0)) {
    throw new MaterialError('invalid-data', 'C2Um2 are squared wavelengths and must be ≥ 0', base.id, { path: 'C2Um2' });
  }
  const C2 = params.CUm !== undefined ? C.map((c) => c * c) : C;
  const stored: SellmeierParams = Object.freeze(
    params.CUm !== undefined ? { A, B: Object.freeze(B), CUm: Object.freeze(C) } : { A, B: Object.freeze(B), C2Um2: Object.freeze(C) },
  );
  return Object.freeze({
    ...base,
    kind: 'sellmeier' as const,
    params: stored,
    index(wavelengthUm: number) {
      const l2 = wavelengthUm * wavelengthUm;
      let n2 = A;
      for (let i = 0; i < B.length; i++) n2 += (B[i]! * l2) / (l2 - C2[i]!);
      return indexFromPermittivity(n2, 0);
    },
  });
}
