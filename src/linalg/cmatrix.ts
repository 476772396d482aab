/**
 * Dense complex matrix storage shared by every kernel.
 *
 * Layout: one Float64Array, **interleaved** (re, im) pairs, **row-major**. Element (i, j) of an
 * r×c matrix is `data[2*(i*c + j)]` (real part) and `data[2*(i*c + j) + 1]` (imaginary part).
 *
 * Why interleaved: a complex multiply-add reads the real and imaginary parts of the same element
 * together, so interleaving keeps both in one cache line and halves the number of live array
 * base pointers in inner loops (scripts/bench-storage.ts measures interleaved against split
 * re/im arrays for zgemm and the LU update; see DEVELOPERS.md for the figures).
 * Why row-major: the solver builds its matrices row by row (Toeplitz rows, diagonal scalings of
 * rows), and JavaScript code that walks rows with a unit stride is the fast path for V8.
 */
export interface CMatrix {
  readonly rows: number;
  readonly cols: number;
  /** Interleaved (re, im), row-major; length 2·rows·cols. */
  readonly data: Float64Array;
}

/** A zero-filled rows×cols complex matrix. */
export function cmatrix(rows: number, cols: number = rows): CMatrix {
  if (!(Number.isInteger(rows) && rows >= 0 && Number.isInteger(cols) && cols >= 0)) {
    throw new RangeError(`cmatrix: rows and cols must be non-negative integers, got ${rows}×${cols}`);
  }
  return { rows, cols, data: new Float64Array(2 * rows * cols) };
}

/** The n×n identity. */
export function identity(n: number): CMatrix {
  const m = cmatrix(n, n);
  for (let i = 0; i < n; i++) m.data[2 * (i * n + i)] = 1;
  return m;
}

/** A deep copy (or a copy into `out`, which must have the same shape). */
export function copy<T extends CMatrix>(a: Readonly<CMatrix>, out?: T): T | CMatrix {
  const o = out ?? cmatrix(a.rows, a.cols);
  o.data.set(a.data);
  return o;
}

/** Build from row arrays of [re, im] pairs or real numbers (tests and examples). */
export function fromRows(rows: ReadonlyArray<ReadonlyArray<number | readonly [number, number]>>): CMatrix {
  const r = rows.length;
  const c = r === 0 ? 0 : rows[0]!.length;
  const m = cmatrix(r, c);
  for (let i = 0; i < r; i++) {
    const row = rows[i]!;
    if (row.length !== c) throw new RangeError(`fromRows: row ${i} has ${row.length} entries, expected ${c}`);
    for (let j = 0; j < c; j++) {
      const v = row[j]!;
      const k = 2 * (i * c + j);
      if (typeof v === 'number') {
        m.data[k] = v;
      } else {
        m.data[k] = v[0];
        m.data[k + 1] = v[1];
      }
    }
  }
  return m;
}

/** Real part of element (i, j). */
export function re(a: Readonly<CMatrix>, i: number, j: number): number {
  return a.data[2 * (i * a.cols + j)]!;
}

/** Imaginary part of element (i, j). */
export function im(a: Readonly<CMatrix>, i: number, j: number): number {
  return a.data[2 * (i * a.cols + j) + 1]!;
}

/** Set element (i, j). */
export function set(a: CMatrix, i: number, j: number, vre: number, vim = 0): void {
  const k = 2 * (i * a.cols + j);
  a.data[k] = vre;
  a.data[k + 1] = vim;
}

/** True when every entry is finite. */
export function allFinite(data: Float64Array, length = data.length): boolean {
  for (let k = 0; k < length; k++) {
    const v = data[k]!;
    if (v - v !== 0) return false; // NaN or ±Infinity
  }
  return true;
}

/** Frobenius norm. */
export function normFrobenius(a: Readonly<CMatrix>): number {
  // scaled sum of squares, safe against overflow for |a_ij| up to ~1e300
  let scale = 0;
  let ssq = 1;
  const d = a.data;
  for (let k = 0; k < d.length; k++) {
    const v = Math.abs(d[k]!);
    if (v !== 0) {
      if (scale < v) {
        ssq = 1 + ssq * (scale / v) * (scale / v);
        scale = v;
      } else {
        ssq += (v / scale) * (v / scale);
      }
    }
  }
  return scale * Math.sqrt(ssq);
}

/** Conjugate transpose into `out` (must be cols×rows and not alias `a`). */
export function conjTranspose(a: Readonly<CMatrix>, out: CMatrix = cmatrix(a.cols, a.rows)): CMatrix {
  const { rows, cols } = a;
  const s = a.data;
  const d = out.data;
  for (let i = 0; i < rows; i++) {
    for (let j = 0; j < cols; j++) {
      const from = 2 * (i * cols + j);
      const to = 2 * (j * rows + i);
      d[to] = s[from]!;
      d[to + 1] = -s[from + 1]!;
    }
  }
  return out;
}
