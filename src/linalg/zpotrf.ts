/**
 * Cholesky factorization of a Hermitian positive-definite matrix, A = L·Lᴴ — LAPACK zpotrf
 * (lower). The solver uses it to turn the lossless TM eigenproblem Ω = Ep·H (a product of a
 * Hermitian positive-definite and a Hermitian matrix) into the Hermitian problem Lᴴ·H·L, whose
 * real eigenvalues and orthogonal eigenvectors keep energy balance at round-off.
 * Reference: Golub & Van Loan, Matrix Computations, 4th ed., Alg. 4.2.1.
 */
import { cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';

/**
 * Factor A = L·Lᴴ reading the lower triangle of `a`. Returns L (zeros above the diagonal).
 * @throws {LinalgError} 'singular' when A is not numerically positive definite (a pivot ≤ 0);
 *   callers use this as the test for positive definiteness and fall back to a general path.
 * @example
 * zpotrf(fromRows([[4, 2], [2, 5]])); // → [[2, 0], [1, 2]]
 */
export function zpotrf(a: Readonly<CMatrix>, out?: CMatrix): CMatrix {
  const n = a.rows;
  if (a.cols !== n) throw new LinalgError('zpotrf', 'shape', n, `matrix is ${a.rows}×${a.cols}, not square`);
  const l = out ?? cmatrix(n, n);
  const status = zpotrfBase(n, a.data, l.data);
  if (status >= 0) throw new LinalgError('zpotrf', 'singular', n, `matrix is not positive definite (pivot ${status})`);
  return l;
}

/** Unchecked: writes L into `L` (row-major, n×n). Returns −1, or the failing pivot index. */
export function zpotrfBase(n: number, A: Float64Array, L: Float64Array): number {
  const n2 = 2 * n;
  L.fill(0, 0, n * n2);
  for (let j = 0; j < n; j++) {
    const rj = j * n2;
    // d = A_jj − Σ_k |L_jk|²
    let d = A[rj + 2 * j]!;
    for (let k = 0; k < 2 * j; k++) d -= L[rj + k]! * L[rj + k]!;
    if (!(d > 0)) return j;
    const ljj = Math.sqrt(d);
    L[rj + 2 * j] = ljj;
    const inv = 1 / ljj;
    for (let i = j + 1; i < n; i++) {
      const ri = i * n2;
      // L_ij = (A_ij − Σ_k L_ik·conj(L_jk)) / L_jj
      let sr = A[ri + 2 * j]!;
      let si = A[ri + 2 * j + 1]!;
      for (let k = 0; k < 2 * j; k += 2) {
        const ar = L[ri + k]!;
        const ai = L[ri + k + 1]!;
        const br = L[rj + k]!;
        const bi = L[rj + k + 1]!;
        sr -= ar * br + ai * bi;
        si -= ai * br - ar * bi;
      }
      L[ri + 2 * j] = sr * inv;
      L[ri + 2 * j + 1] = si * inv;
    }
  }
  return -1;
}
