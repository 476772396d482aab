/**
 * Element-wise kernels on whole matrices: sums, scaling, axpy and products with diagonal
 * matrices. Every kernel writes into `out` and returns it; `out` may alias any input (each
 * output entry depends only on the same entry of the inputs, or on one row/column scale).
 */
import type { CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';

function sameShape(kernel: string, out: Readonly<CMatrix>, ...xs: Readonly<CMatrix>[]): void {
  for (const x of xs) {
    if (x.rows !== out.rows || x.cols !== out.cols) {
      throw new LinalgError(kernel, 'shape', out.rows, `shape ${x.rows}×${x.cols} does not match ${out.rows}×${out.cols}`);
    }
  }
}

/**
 * out = a + b (all r×c).
 * @throws {LinalgError} 'shape' when the shapes differ.
 * @example
 * zadd(cmatrix(1, 1), fromRows([[1]]), fromRows([[[0, 2]]])); // → [[1 + 2i]]
 */
export function zadd<T extends CMatrix>(out: T, a: Readonly<CMatrix>, b: Readonly<CMatrix>): T {
  sameShape('zadd', out, a, b);
  const o = out.data;
  const x = a.data;
  const y = b.data;
  for (let p = 0; p < o.length; p++) o[p] = x[p]! + y[p]!;
  return out;
}

/**
 * out = a − b (all r×c).
 * @throws {LinalgError} 'shape' when the shapes differ.
 * @example
 * zsub(cmatrix(1, 1), fromRows([[3]]), fromRows([[1]])); // → [[2]]
 */
export function zsub<T extends CMatrix>(out: T, a: Readonly<CMatrix>, b: Readonly<CMatrix>): T {
  sameShape('zsub', out, a, b);
  const o = out.data;
  const x = a.data;
  const y = b.data;
  for (let p = 0; p < o.length; p++) o[p] = x[p]! - y[p]!;
  return out;
}

/**
 * out = alpha·a (both r×c), alpha = [re, im].
 * @throws {LinalgError} 'shape' when the shapes differ.
 * @example
 * zscal(cmatrix(1, 1), [0, 1], fromRows([[2]])); // → [[2i]]
 */
export function zscal<T extends CMatrix>(out: T, alpha: readonly [number, number], a: Readonly<CMatrix>): T {
  sameShape('zscal', out, a);
  const [ar, ai] = alpha;
  const o = out.data;
  const x = a.data;
  for (let p = 0; p < o.length; p += 2) {
    const xr = x[p]!;
    const xi = x[p + 1]!;
    o[p] = ar * xr - ai * xi;
    o[p + 1] = ar * xi + ai * xr;
  }
  return out;
}

/**
 * y = alpha·x + y (BLAS zaxpy on whole r×c matrices); returns y. x may be y itself.
 * @throws {LinalgError} 'shape' when the shapes differ.
 * @example
 * zaxpy(fromRows([[1]]), [2, 0], fromRows([[3]])); // → [[7]]
 */
export function zaxpy<T extends CMatrix>(y: T, alpha: readonly [number, number], x: Readonly<CMatrix>): T {
  sameShape('zaxpy', y, x);
  const [ar, ai] = alpha;
  const o = y.data;
  const s = x.data;
  for (let p = 0; p < o.length; p += 2) {
    const xr = s[p]!;
    const xi = s[p + 1]!;
    o[p] += ar * xr - ai * xi;
    o[p + 1] += ar * xi + ai * xr;
  }
  return y;
}

/**
 * out = diag(d)·a: row i of the r×c matrix `a` scaled by d_i. `d` is interleaved complex,
 * length at least 2·r. Equivalent to, but O(n²) instead of O(n³), a product with a dense
 * diagonal matrix.
 * @throws {LinalgError} 'shape' when out and a differ in shape or d is too short.
 * @example
 * zdiagLeft(cmatrix(2, 1), new Float64Array([2, 0, 0, 1]), fromRows([[1], [1]])); // → [[2], [i]]
 */
export function zdiagLeft<T extends CMatrix>(out: T, d: Float64Array, a: Readonly<CMatrix>): T {
  sameShape('zdiagLeft', out, a);
  if (d.length < 2 * a.rows) throw new LinalgError('zdiagLeft', 'shape', a.rows, `diagonal has ${d.length / 2} entries, need ${a.rows}`);
  const o = out.data;
  const x = a.data;
  const c2 = 2 * a.cols;
  for (let i = 0; i < a.rows; i++) {
    const dr = d[2 * i]!;
    const di = d[2 * i + 1]!;
    const base = i * c2;
    for (let p = base; p < base + c2; p += 2) {
      const xr = x[p]!;
      const xi = x[p + 1]!;
      o[p] = dr * xr - di * xi;
      o[p + 1] = dr * xi + di * xr;
    }
  }
  return out;
}

/**
 * out = a·diag(d): column j of the r×c matrix `a` scaled by d_j. `d` is interleaved complex,
 * length at least 2·c.
 * @throws {LinalgError} 'shape' when out and a differ in shape or d is too short.
 * @example
 * zdiagRight(cmatrix(1, 2), fromRows([[1, 1]]), new Float64Array([2, 0, 0, 1])); // → [[2, i]]
 */
export function zdiagRight<T extends CMatrix>(out: T, a: Readonly<CMatrix>, d: Float64Array): T {
  sameShape('zdiagRight', out, a);
  if (d.length < 2 * a.cols) throw new LinalgError('zdiagRight', 'shape', a.cols, `diagonal has ${d.length / 2} entries, need ${a.cols}`);
  const o = out.data;
  const x = a.data;
  const c2 = 2 * a.cols;
  for (let i = 0; i < a.rows; i++) {
    const base = i * c2;
    for (let j = 0; j < c2; j += 2) {
      const dr = d[j]!;
      const di = d[j + 1]!;
      const xr = x[base + j]!;
      const xi = x[base + j + 1]!;
      o[base + j] = dr * xr - di * xi;
      o[base + j + 1] = dr * xi + di * xr;
    }
  }
  return out;
}

/**
 * out = a + diag(d): d_i added to entry (i, i) for i < min(rows, cols); d interleaved complex,
 * length at least 2·min(rows, cols).
 * @throws {LinalgError} 'shape' when out and a differ in shape or d is too short.
 * @example
 * zaddDiag(cmatrix(2, 2), identity(2), new Float64Array([1, 0, 0, 1])); // → [[2, 0], [0, 1 + i]]
 */
export function zaddDiag<T extends CMatrix>(out: T, a: Readonly<CMatrix>, d: Float64Array): T {
  sameShape('zaddDiag', out, a);
  const n = Math.min(a.rows, a.cols);
  if (d.length < 2 * n) throw new LinalgError('zaddDiag', 'shape', a.rows, `diagonal has ${d.length / 2} entries, need ${n}`);
  if (out.data !== a.data) out.data.set(a.data);
  // row stride is cols: entry (i, i) of a rows×cols matrix
  const step = 2 * (a.cols + 1);
  for (let i = 0; i < n; i++) {
    const p = i * step;
    out.data[p] += d[2 * i]!;
    out.data[p + 1] += d[2 * i + 1]!;
  }
  return out;
}
