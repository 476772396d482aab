/**
 * Right-hand solve with an LU factorization: X·A = B, i.e. X = B·A⁻¹, without forming A⁻¹.
 *
 * With P·A = L·U, X·A = B becomes (X·Pᵀ)·L·U = B. Row-major storage makes every row of B an
 * independent problem, and both triangular sweeps below run along rows of U and L (unit
 * stride): z·U = b forward, then y·L = z backward, then X = Y·P as column swaps in reverse
 * pivot order. Costs the same n³ as a left solve and half of forming the inverse and
 * multiplying. Reference: Golub & Van Loan, Matrix Computations, 4th ed., §3.1–3.4 (triangular
 * systems, LU with partial pivoting), transposed.
 */
import { cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import type { LUFactors } from './zgetrf.ts';

/**
 * @param f factors of the n×n matrix A from zgetrf.
 * @param b m×n right-hand side.
 * @param out m×n result (may be `b`).
 * @returns out = b·A⁻¹
 * @throws {LinalgError} 'shape' when sizes disagree.
 * @example
 * zgetrsRight(zgetrf(fromRows([[2, 0], [0, 4]])), fromRows([[2, 4]])); // → [[1, 1]]
 */
export function zgetrsRight<T extends CMatrix>(f: Readonly<LUFactors>, b: Readonly<CMatrix>, out?: T): T | CMatrix {
  const n = f.n;
  if (b.cols !== n) throw new LinalgError('zgetrsRight', 'shape', n, `right-hand side has ${b.cols} columns, expected ${n}`);
  const x = out ?? cmatrix(b.rows, b.cols);
  if (x.rows !== b.rows || x.cols !== b.cols) {
    throw new LinalgError('zgetrsRight', 'shape', n, `output is ${x.rows}×${x.cols}, expected ${b.rows}×${b.cols}`);
  }
  if (x.data !== b.data) x.data.set(b.data);
  zgetrsRightBase(n, b.rows, f.lu.data, f.ipiv, x.data);
  return x;
}

/** Unchecked in-place kernel on the m×n row-major X. */
export function zgetrsRightBase(n: number, m: number, LU: Float64Array, ipiv: Int32Array, X: Float64Array): void {
  const n2 = 2 * n;
  for (let r = 0; r < m; r++) {
    const x0 = r * n2;
    // z·U = b: z_k = b_k / U_kk, then b_j −= z_k·U_kj for j > k (row k of U)
    for (let k = 0; k < n; k++) {
      const uk = k * n2;
      const dr = LU[uk + 2 * k]!;
      const di = LU[uk + 2 * k + 1]!;
      const br = X[x0 + 2 * k]!;
      const bi = X[x0 + 2 * k + 1]!;
      let zr: number;
      let zi: number;
      if (Math.abs(dr) >= Math.abs(di)) {
        const t = di / dr;
        const d = dr + di * t;
        zr = (br + bi * t) / d;
        zi = (bi - br * t) / d;
      } else {
        const t = dr / di;
        const d = di + dr * t;
        zr = (br * t + bi) / d;
        zi = (bi * t - br) / d;
      }
      X[x0 + 2 * k] = zr;
      X[x0 + 2 * k + 1] = zi;
      if (zr === 0 && zi === 0) continue;
      for (let j = 2 * k + 2; j < n2; j += 2) {
        const ur = LU[uk + j]!;
        const ui = LU[uk + j + 1]!;
        X[x0 + j] -= zr * ur - zi * ui;
        X[x0 + j + 1] -= zr * ui + zi * ur;
      }
    }
    // y·L = z (unit lower L): y_k = z_k after all j > k are done, then z_j −= y_k·L_kj, j < k
    for (let k = n - 1; k > 0; k--) {
      const lk = k * n2;
      const yr = X[x0 + 2 * k]!;
      const yi = X[x0 + 2 * k + 1]!;
      if (yr === 0 && yi === 0) continue;
      for (let j = 0; j < 2 * k; j += 2) {
        const lr = LU[lk + j]!;
        const li = LU[lk + j + 1]!;
        X[x0 + j] -= yr * lr - yi * li;
        X[x0 + j + 1] -= yr * li + yi * lr;
      }
    }
    // X = Y·P: undo the interchanges as column swaps, last pivot first
    for (let k = n - 1; k >= 0; k--) {
      const p = ipiv[k]!;
      if (p !== k) {
        const a = x0 + 2 * k;
        const c = x0 + 2 * p;
        const tr = X[a]!;
        const ti = X[a + 1]!;
        X[a] = X[c]!;
        X[a + 1] = X[c + 1]!;
        X[c] = tr;
        X[c + 1] = ti;
      }
    }
  }
}
