/** A wavelength-independent complex index. */
import { MaterialError } from './errors.ts';
import { checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';

/** Coefficients of a constant material. */
export interface ConstantParams {
  /** refractive index n ≥ 0 */
  readonly n: number;
  /** extinction coefficient κ ≥ 0 (absorbing); default 0 */
  readonly k?: number;
}

/** A material whose index does not depend on wavelength. */
export interface ConstantMaterial extends Material {
  readonly kind: 'constant';
  readonly params: Required<ConstantParams>;
}

/**
 * A constant index ñ = n + iκ.
 * @param params `{n, k}` with n ≥ 0 and κ ≥ 0
 * @param info id, citation and valid range (µm); `[0, Infinity]` for "any wavelength"
 * @throws {MaterialError} 'invalid-data' for a negative or non-finite n or κ, or bad info
 * @example
 * const air = constantMaterial({ n: 1 }, { id: 'air', citation: 'common practice', validRangeUm: [0, Infinity] });
 * air.index(0.5); // {re: 1, im: 0}
 */
export function constantMaterial(params: ConstantParams, info: MaterialInfoInput): ConstantMaterial {
  const base = checkInfo(info);
  const n = params.n;
  const k = params.k ?? 0;
  if (!(Number.isFinite(n) && n >= 0)) throw new MaterialError('invalid-data', `n must be a finite number ≥ 0, found ${n}`, base.id, { path: 'n' });
  if (!(Number.isFinite(k) && k >= 0)) throw new MaterialError('invalid-data', `k must be a finite number ≥ 0 (κ ≥ 0 is absorbing), found ${k}`, base.id, { path: 'k' });
  const value = Object.freeze({ re: n, im: k });
  return Object.freeze({
    ...base,
    kind: 'constant' as const,
    params: Object.freeze({ n, k }),
    index: () => value,
  });
}
