/** Validation of the descriptive fields every model factory takes (internal to the materials layer). */
import { MaterialError } from './errors.ts';
import type { MaterialInfo } from './material.ts';

/** What a model factory accepts besides its coefficients. */
export interface MaterialInfoInput {
  /** short stable name; no ':' (reserved for the ':o' / ':e' axes of uniaxial entries) */
  readonly id: string;
  /** where the numbers come from */
  readonly citation: string;
  /** [min, max] valid vacuum wavelength, µm; 0 ≤ min < max (max may be Infinity) */
  readonly validRangeUm: readonly [number, number];
  readonly notes?: readonly string[];
  /** mark numbers that were not re-read in the source; adds the note 'from memory' */
  readonly fromMemory?: boolean;
  readonly user?: boolean;
}

const ID = /^[^\s:][^:]*$/;

/**
 * Check and freeze the descriptive fields.
 * @throws {MaterialError} 'invalid-data' for an empty or ill-formed id or an invalid range
 */
export function checkInfo(info: MaterialInfoInput): MaterialInfo {
  const id = info.id;
  const idOk = typeof id === 'string' && id.trim() === id && id.length > 0 && ID.test(id);
  if (!idOk) {
    throw new MaterialError('invalid-data', `a material name must be non-empty, without surrounding spaces and without ':' (found ${JSON.stringify(id)})`, undefined);
  }
  const [lo, hi] = info.validRangeUm;
  if (!(Number.isFinite(lo) && lo >= 0 && (Number.isFinite(hi) || hi === Infinity) && hi > lo)) {
    throw new MaterialError('invalid-data', `valid range must be [min, max] µm with 0 ≤ min < max, found [${lo}, ${hi}]`, id, { path: 'rangeUm' });
  }
  const notes = [...(info.fromMemory ? ['from memory'] : []), ...(info.notes ?? [])];
  return Object.freeze({
    id,
    citation: info.citation,
    validRangeUm: Object.freeze([lo, hi]) as readonly [number, number],
    notes: Object.freeze(notes),
    fromMemory: !!info.fromMemory,
    user: !!info.user,
  });
}

/** Throw unless every value is a finite number; names the field. */
export function checkFinite(id: string, field: string, values: readonly number[]): void {
  values.forEach((v, i) => {
    if (!(typeof v === 'number' && Number.isFinite(v))) {
      throw new MaterialError('invalid-data', `${field}[${i}] must be a finite number, found ${v}`, id, { path: `${field}[${i}]` });
    }
  });
}
