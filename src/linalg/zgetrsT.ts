/**
 * Transposed solve with an LU factorization: Aᵀ·X = B from the factors of A (LAPACK zgetrs with
 * trans = 'T'; plain transpose, not conjugate).
 *
 * With P·A = L·U, Aᵀ = Uᵀ·Lᵀ·P: solve Uᵀ·Y = B (forward, Uᵀ lower), Lᵀ·Z = Y (backward, unit
 * upper), X = Pᵀ·Z. Each step walks a row of U or L and axpys whole rows of X, so it stays
 * unit-stride in row-major storage. The solver uses it to factor Sᵀ once and serve both
 * R = Δ·S⁻¹ (as Rᵀ = S⁻ᵀ·Δᵀ, a left solve the WebAssembly kernel runs) and S·x = c (a
 * transposed solve with few columns, here).
 * Reference: Golub & Van Loan, Matrix Computations, 4th ed., §3.1–3.4.
 */
import { cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import type { LUFactors } from './zgetrf.ts';

/**
 * @param f factors of the n×n matrix A (zgetrf).
 * @param b n×m right-hand side; `out` may be `b`.
 * @returns out = A⁻ᵀ·b
 * @throws {LinalgError} 'shape' when sizes disagree.
 * @example
 * zgetrsT(zgetrf(fromRows([[1, 2], [0, 1]])), fromRows([[1], [4]])); // Aᵀ = [[1, 0], [2, 1]] → [[1], [2]]
 */
export function zgetrsT<T extends CMatrix>(f: Readonly<LUFactors>, b: Readonly<CMatrix>, out?: T): T | CMatrix {
  const n = f.n;
  if (b.rows !== n) throw new LinalgError('zgetrsT', 'shape', n, `right-hand side has ${b.rows} rows, expected ${n}`);
  const x = out ?? cmatrix(b.rows, b.cols);
  if (x.rows !== b.rows || x.cols !== b.cols) throw new LinalgError('zgetrsT', 'shape', n, `output is ${x.rows}×${x.cols}, expected ${b.rows}×${b.cols}`);
  if (x.data !== b.data) x.data.set(b.data);
  zgetrsTBase(n, b.cols, f.lu.data, f.ipiv, x.data);
  return x;
}

/** Unchecked in-place kernel on the n×m row-major X. */
export function zgetrsTBase(n: number, m: number, LU: Float64Array, ipiv: Int32Array, X: Float64Array): void {
  const n2 = 2 * n;
  const m2 = 2 * m;
  // Uᵀ·Y = B: finish row i (divide by U_ii), then X_j −= U_ij·X_i for j > i
  for (let i = 0; i < n; i++) {
    const ui = i * n2;
    const dr = LU[ui + 2 * i]!;
    const di = LU[ui + 2 * i + 1]!;
    let ir: number;
    let ii: number;
    if (Math.abs(dr) >= Math.abs(di)) {
      const r = di / dr;
      const d = dr + di * r;
      ir = 1 / d;
      ii = -r / d;
    } else {
      const r = dr / di;
      const d = di + dr * r;
      ir = r / d;
      ii = -1 / d;
    }
    const xi = i * m2;
    for (let c = 0; c < m2; c += 2) {
      const yr = X[xi + c]!;
      const yi = X[xi + c + 1]!;
      X[xi + c] = yr * ir - yi * ii;
      X[xi + c + 1] = yr * ii + yi * ir;
    }
    for (let j = i + 1; j < n; j++) {
      const ur = LU[ui + 2 * j]!;
      const uim = LU[ui + 2 * j + 1]!;
      if (ur === 0 && uim === 0) continue;
      const xj = j * m2;
      for (let c = 0; c < m2; c += 2) {
        const yr = X[xi + c]!;
        const yi = X[xi + c + 1]!;
        X[xj + c] -= ur * yr - uim * yi;
        X[xj + c + 1] -= ur * yi + uim * yr;
      }
    }
  }
  // Lᵀ·Z = Y: row i is final once rows > i are done; then X_j −= L_ij·X_i for j < i
  for (let i = n - 1; i > 0; i--) {
    const li = i * n2;
    const xi = i * m2;
    for (let j = 0; j < i; j++) {
      const lr = LU[li + 2 * j]!;
      const lim = LU[li + 2 * j + 1]!;
      if (lr === 0 && lim === 0) continue;
      const xj = j * m2;
      for (let c = 0; c < m2; c += 2) {
        const yr = X[xi + c]!;
        const yi = X[xi + c + 1]!;
        X[xj + c] -= lr * yr - lim * yi;
        X[xj + c + 1] -= lr * yi + lim * yr;
      }
    }
  }
  // X = Pᵀ·Z: the interchanges in reverse order
  for (let k = n - 1; k >= 0; k--) {
    const p = ipiv[k]!;
    if (p !== k) {
      const a = k * m2;
      const b = p * m2;
      for (let c = 0; c < m2; c++) {
        const t = X[a + c]!;
        X[a + c] = X[b + c]!;
        X[b + c] = t;
      }
    }
  }
}
