/**
 * Tabulated n and κ against vacuum wavelength, interpolated LINEARLY IN λ for n and for κ
 * separately between neighbouring rows (no smoothing, no extrapolation by slope). Outside the
 * table's span the index holds the nearest end row; `evaluateMaterial` refuses such wavelengths
 * unless extrapolation is allowed, and then says so in a warning.
 *
 * Linear interpolation is only as good as the sampling: between widely spaced rows, or across an
 * absorption edge where κ changes by orders of magnitude, it can be far from the true curve.
 */
import { MaterialError } from './errors.ts';
import { checkInfo, type MaterialInfoInput } from './info.ts';
import type { Material } from './material.ts';
import { formatUm } from './format.ts';

/** Columns of a table, all the same length ≥ 2. */
export interface TableData {
  /** strictly increasing vacuum wavelengths, µm (> 0) */
  readonly wavelengthUm: readonly number[];
  /** refractive index n (≥ 0) */
  readonly n: readonly number[];
  /** extinction coefficient κ (≥ 0); all zeros when omitted */
  readonly k?: readonly number[];
}

/** A tabulated material. */
export interface TableMaterial extends Material {
  readonly kind: 'table';
  /** the rows as given (k filled with zeros when omitted) */
  readonly table: Required<TableData>;
}

/** Descriptive fields of a table; the valid range defaults to the table's span. */
export type TableInfoInput = Omit<MaterialInfoInput, 'validRangeUm'> & { readonly validRangeUm?: readonly [number, number] };

/**
 * Build a tabulated material.
 * @param data wavelengthUm (µm, strictly increasing), n, and optional k, equal lengths ≥ 2
 * @param info id, citation, optional valid range (µm) which must lie within the table's span
 * @throws {MaterialError} 'invalid-data' naming the row (1-based) for a non-finite, non-positive
 *   or non-increasing wavelength, a negative n or κ, mismatched lengths, or fewer than 2 rows
 * @example
 * const m = tableMaterial({ wavelengthUm: [0.5, 0.6], n: [1.5, 1.4], k: [0, 0.1] },
 *   { id: 'measured', citation: 'our ellipsometry, 2024' });
 * m.index(0.55); // {re: 1.45, im: 0.05}
 */
export function tableMaterial(data: TableData, info: TableInfoInput): TableMaterial {
  const id = info.id;
  const x = [...data.wavelengthUm];
  const n = [...data.n];
  const k = data.k ? [...data.k] : x.map(() => 0);
  const bad = (row: number, msg: string): never => {
    throw new MaterialError('invalid-data', `table row ${row + 1}: ${msg}`, id, { path: `row ${row + 1}` });
  };
  if (x.length < 2) throw new MaterialError('invalid-data', `a table needs at least 2 rows, found ${x.length}`, id);
  if (n.length !== x.length || k.length !== x.length) {
    throw new MaterialError('invalid-data', `wavelength, n and k columns must have equal lengths, found ${x.length}, ${n.length}, ${k.length}`, id);
  }
  for (let i = 0; i < x.length; i++) {
    if (!(Number.isFinite(x[i]) && x[i]! > 0)) bad(i, `wavelength must be a finite number > 0 µm, found ${x[i]}`);
    if (i > 0 && !(x[i]! > x[i - 1]!)) bad(i, `wavelength ${formatUm(x[i]!)} µm is not greater than ${formatUm(x[i - 1]!)} µm on the row before`);
    if (!(Number.isFinite(n[i]) && n[i]! >= 0)) bad(i, `n must be a finite number ≥ 0, found ${n[i]}`);
    if (!(Number.isFinite(k[i]) && k[i]! >= 0)) bad(i, `k must be a finite number ≥ 0 (κ ≥ 0 is absorbing), found ${k[i]}`);
  }
  const span: [number, number] = [x[0]!, x[x.length - 1]!];
  const range = info.validRangeUm ?? span;
  if (range[0] < span[0] || range[1] > span[1]) {
    throw new MaterialError('invalid-data', `valid range [${range[0]}, ${range[1]}] µm reaches beyond the table's span [${span[0]}, ${span[1]}] µm`, id, { path: 'rangeUm' });
  }
  const base = checkInfo({ ...info, validRangeUm: range });
  const last = x.length - 1;
  return Object.freeze({
    ...base,
    kind: 'table' as const,
    table: Object.freeze({ wavelengthUm: Object.freeze(x), n: Object.freeze(n), k: Object.freeze(k) }),
    index(wavelengthUm: number) {
      if (!(wavelengthUm > x[0]!)) return { re: n[0]!, im: k[0]! };
      if (!(wavelengthUm < x[last]!)) return { re: n[last]!, im: k[last]! };
      // largest i with x[i] ≤ λ
      let lo = 0;
      let hi = last;
      while (hi - lo > 1) {
        const mid = (lo + hi) >> 1;
        if (x[mid]! <= wavelengthUm) lo = mid;
        else hi = mid;
      }
      const t = (wavelengthUm - x[lo]!) / (x[hi]! - x[lo]!);
      return { re: n[lo]! + t * (n[hi]! - n[lo]!), im: k[lo]! + t * (k[hi]! - k[lo]!) };
    },
  });
}
