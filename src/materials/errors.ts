/**
 * Errors raised by the materials layer: an unknown name (with suggestions), a wavelength outside
 * an entry's valid range (with the name, the wavelength and the range), invalid data in a user
 * table or model entry (with the line or field), or an invalid argument.
 */

/** What went wrong, for callers that branch on it. */
export type MaterialErrorCode = 'unknown-material' | 'out-of-range' | 'invalid-data' | 'invalid-argument';

/** Details carried beside the message; every field is optional. */
export interface MaterialErrorDetails {
  /** requested vacuum wavelength, µm */
  readonly wavelengthUm?: number;
  /** the entry's valid range [min, max], µm */
  readonly rangeUm?: readonly [number, number];
  /** 1-based line number in CSV text */
  readonly line?: number;
  /** field path in a JSON model entry, e.g. "B[1]" */
  readonly path?: string;
  /** names suggested for an unknown material */
  readonly suggestions?: readonly string[];
}

/**
 * A material-layer failure. The message is complete on its own and starts with the material's
 * name when there is one: "material 'Au-LD': wavelength 15 µm is outside its valid range …".
 * @example
 * try { lib.indexAt('Au-LD', 15); } catch (e) { if (e instanceof MaterialError) console.log(e.code, e.message); }
 */
export class MaterialError extends Error {
  override readonly name = 'MaterialError';
  constructor(
    readonly code: MaterialErrorCode,
    message: string,
    /** the material's name as the caller gave it, when there is one */
    readonly material: string | undefined,
    readonly details: MaterialErrorDetails = {},
    /** prefix the message with "material 'name': " (default true when a name is given) */
    prefixed = true,
  ) {
    super(material === undefined || !prefixed ? message : `material '${material}': ${message}`);
  }
}
