/**
 * Uniaxial crystals: two indices, ordinary (E ⊥ optic axis) and extraordinary (E ∥ optic axis).
 * The library names them 'id:o' and 'id:e'; the bare 'id' is the isotropic view, which is the
 * ORDINARY index and says so in its notes.
 */
import { checkInfo } from './info.ts';
import type { Material } from './material.ts';

/** A uniaxial entry: its two principal indices as materials named 'id:o' and 'id:e'. */
export interface UniaxialMaterial {
  readonly id: string;
  readonly kind: 'uniaxial';
  /** ordinary index (E ⊥ optic axis), id 'id:o' */
  readonly ordinary: Material;
  /** extraordinary index (E ∥ optic axis), id 'id:e' */
  readonly extraordinary: Material;
  /** the isotropic view: the ordinary index under the bare id, with a note saying so */
  readonly isotropic: Material;
}

/**
 * Pair two materials as the principal indices of a uniaxial crystal. The components are
 * re-identified as `${id}:o` and `${id}:e` and keep their models, ranges and citations.
 * @param id the crystal's name (no ':')
 * @param ordinary the ordinary index
 * @param extraordinary the extraordinary index
 * @throws {MaterialError} 'invalid-data' for an ill-formed id
 * @example
 * const mgf2 = uniaxialMaterial('MgF2', ordinaryModel, extraordinaryModel);
 * mgf2.isotropic.notes; // ['ordinary index of uniaxial MgF2 (MgF2:e for the extraordinary)']
 */
export function uniaxialMaterial(id: string, ordinary: Material, extraordinary: Material): UniaxialMaterial {
  checkInfo({ id, citation: '', validRangeUm: [0, Infinity] });
  const o: Material = Object.freeze({ ...ordinary, id: `${id}:o`, notes: Object.freeze([...ordinary.notes, `ordinary index of uniaxial ${id}`]) });
  const e: Material = Object.freeze({ ...extraordinary, id: `${id}:e`, notes: Object.freeze([...extraordinary.notes, `extraordinary index of uniaxial ${id}`]) });
  const iso: Material = Object.freeze({ ...ordinary, id, notes: Object.freeze([...ordinary.notes, `ordinary index of uniaxial ${id} (${id}:e for the extraordinary)`]) });
  return Object.freeze({ id, kind: 'uniaxial' as const, ordinary: o, extraordinary: e, isotropic: iso });
}
