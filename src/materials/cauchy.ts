/**
 * The Cauchy formula n(λ) = A + B/λ² + C/λ⁴ (λ in µm, B in µm², C in µm⁴), with an optional
 * extinction coefficient of the same form κ(λ) = Aκ + Bκ/λ² + Cκ/λ⁴ for weakly absorbing films.
 * Use it only in the transparent or weakly absorbing region it was fitted to.
 */
import { checkFinite, checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';

/** Three Cauchy coefficients; B and C default to 0. */
export interface CauchyTerms {
  readonly A: number;
  /** µm² */
  readonly BUm2?: number;
  /** µm⁴ */
  readonly CUm4?: number;
}

/** Cauchy coefficients for n, and optionally for κ. */
export interface CauchyParams extends CauchyTerms {
  /** κ(λ) = A + BUm2/λ² + CUm4/λ⁴; κ must stay ≥ 0 where the material is evaluated */
  readonly absorption?: CauchyTerms;
}

/** A material described by the Cauchy formula. */
export interface CauchyMaterial extends Material {
  readonly kind: 'cauchy';
  readonly params: CauchyParams;
}

/**
 * Build a Cauchy material.
 * @param params A, BUm2 (µm²), CUm4 (µm⁴) and optional `absorption` with the same fields
 * @param info id, citation and valid range (µm)
 * @throws {MaterialError} 'invalid-data' for non-finite coefficients or bad info (a κ that turns
 *   negative is reported when evaluated)
 * @example
 * const film = cauchyMaterial({ A: 1.5, BUm2: 0.01 }, { id: 'resist', citation: 'fit to our data', validRangeUm: [0.4, 1] });
 * film.index(0.5).re; // 1.5 + 0.01/0.25 = 1.54
 */
export function cauchyMaterial(params: CauchyParams, info: MaterialInfoInput): CauchyMaterial {
  const base = checkInfo(info);
  const n = [params.A, params.BUm2 ?? 0, params.CUm4 ?? 0] as const;
  checkFinite(base.id, '[A, BUm2, CUm4]', n);
  const a = params.absorption;
  const k = a ? ([a.A, a.BUm2 ?? 0, a.CUm4 ?? 0] as const) : ([0, 0, 0] as const);
  checkFinite(base.id, 'absorption [A, BUm2, CUm4]', k);
  const stored: CauchyParams = Object.freeze({
    A: n[0],
    BUm2: n[1],
    CUm4: n[2],
    ...(a ? { absorption: Object.freeze({ A: k[0], BUm2: k[1], CUm4: k[2] }) } : {}),
  });
  return Object.freeze({
    ...base,
    kind: 'cauchy' as const,
    params: stored,
    index(wavelengthUm: number) {
      const u = 1 / (wavelengthUm * wavelengthUm);
      return { re: n[0] + u * (n[1] + u * n[2]), im: k[0] + u * (k[1] + u * k[2]) };
    },
  });
}
