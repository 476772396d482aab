/**
 * The material record every dispersion model produces, and its evaluation with range enforcement.
 *
 * Conventions (DEVELOPERS.md): time dependence exp(−iωt); complex index ñ = n + iκ with κ ≥ 0
 * absorbing; ε = ñ². Wavelengths are vacuum wavelengths in micrometres.
 */
import type { Complex } from '../solver/types.ts';
import { MaterialError } from './errors.ts';
import { formatRangeUm, formatUm, modelLabel } from './format.ts';

/** The dispersion model behind a material. */
export type MaterialKind = 'constant' | 'sellmeier' | 'cauchy' | 'drude' | 'lorentz-drude' | 'table';

/** Descriptive fields of a material, shared by every model. */
export interface MaterialInfo {
  /** short stable name, e.g. 'fused-silica', 'Au-LD', 'sapphire:o' */
  readonly id: string;
  /** where the numbers come from (paper, handbook, "common practice", "from memory", or the user's note) */
  readonly citation: string;
  /** [min, max] vacuum wavelength in µm over which the source vouches for the model; [0, ∞) for any */
  readonly validRangeUm: readonly [number, number];
  /** caveats shown with the entry and carried into every evaluation: 'from memory', 'ordinary index', … */
  readonly notes: readonly string[];
  /** true when the numbers were not re-read in the cited source */
  readonly fromMemory: boolean;
  /** true for materials added by the user (CSV, JSON entry or code) */
  readonly user: boolean;
}

/** A material: a dispersion model with its valid range and source. */
export interface Material extends MaterialInfo {
  readonly kind: MaterialKind;
  /**
   * The model's complex index ñ = n + iκ at vacuum wavelength `wavelengthUm` (µm), with NO range
   * check: formulas are evaluated as they stand and tables hold their end values outside their
   * span. Use {@link evaluateMaterial} (or `MaterialLibrary.evaluate`) for checked values.
   */
  index(wavelengthUm: number): Complex;
}

/** Options of an evaluation. */
export interface EvaluateOptions {
  /**
   * Evaluate outside the entry's valid range instead of throwing; the result then carries a
   * warning saying so. Default false.
   */
  readonly allowExtrapolation?: boolean;
}

/** The result of evaluating a material: the index and every caveat that goes with it. */
export interface Evaluation {
  /** the material's id as resolved (e.g. 'sapphire' for a request 'SAPPHIRE') */
  readonly material: string;
  /** vacuum wavelength, µm */
  readonly wavelengthUm: number;
  /** ñ = n + iκ, κ ≥ 0 */
  readonly index: Complex;
  /**
   * Problems with this value (extrapolation beyond the valid range). Callers carry these into
   * their results; an empty array means none.
   */
  readonly warnings: readonly string[];
  /** standing caveats of the entry ('from memory', 'ordinary index of a uniaxial crystal', …) */
  readonly notes: readonly string[];
}

/** Relative slack on range ends, so that "400 nm" converted to µm is not refused by round-off. */
export const RANGE_TOLERANCE = 1e-9;

/**
 * True when λ (µm) lies in the material's valid range (ends included, with {@link RANGE_TOLERANCE}).
 * @example
 * inValidRange({ validRangeUm: [0.21, 3.71] }, 0.21); // true
 */
export function inValidRange(material: Pick<Material, 'validRangeUm'>, wavelengthUm: number): boolean {
  const [lo, hi] = material.validRangeUm;
  return wavelengthUm >= lo * (1 - RANGE_TOLERANCE) && wavelengthUm <= hi * (1 + RANGE_TOLERANCE);
}

/**
 * Evaluate a material at a vacuum wavelength with its valid range enforced.
 *
 * @param material the material
 * @param wavelengthUm vacuum wavelength, µm (finite, > 0)
 * @param options `{ allowExtrapolation: true }` returns values outside the valid range with a warning
 * @returns the index with warnings and notes
 * @throws {MaterialError} 'invalid-argument' for a non-positive or non-finite wavelength;
 *   'out-of-range' outside the valid range without `allowExtrapolation`; 'invalid-data' when the
 *   model yields a non-finite index or κ < 0 there (a user model with gain or a pole)
 * @example
 * const e = evaluateMaterial(fusedSilica, 0.6328); // e.index.re ≈ 1.457018, e.warnings = []
 */
export function evaluateMaterial(material: Material, wavelengthUm: number, options: EvaluateOptions = {}): Evaluation {
  if (!(Number.isFinite(wavelengthUm) && wavelengthUm > 0)) {
    throw new MaterialError('invalid-argument', `wavelength must be a positive finite number of µm, found ${wavelengthUm}`, material.id, { wavelengthUm });
  }
  const warnings: string[] = [];
  if (!inValidRange(material, wavelengthUm)) {
    const what = `wavelength ${formatUm(wavelengthUm)} µm is outside its valid range ${formatRangeUm(material.validRangeUm)}`;
    if (!options.allowExtrapolation) {
      throw new MaterialError('out-of-range', what, material.id, { wavelengthUm, rangeUm: material.validRangeUm });
    }
    const how = material.kind === 'table' ? 'the nearest tabulated value was used' : `the ${modelLabel(material.kind)} formula was extrapolated`;
    warnings.push(`material '${material.id}': ${what}; ${how}`);
  }
  const index = material.index(wavelengthUm);
  if (!(Number.isFinite(index.re) && Number.isFinite(index.im))) {
    throw new MaterialError('invalid-data', `the ${modelLabel(material.kind)} model gives a non-finite index at ${formatUm(wavelengthUm)} µm (a pole of the model?)`, material.id, { wavelengthUm });
  }
  if (index.im < 0) {
    throw new MaterialError('invalid-data', `the ${modelLabel(material.kind)} model gives κ = ${index.im} < 0 (gain) at ${formatUm(wavelengthUm)} µm; κ ≥ 0 is absorbing`, material.id, { wavelengthUm });
  }
  return { material: material.id, wavelengthUm, index, warnings, notes: material.notes };
}
