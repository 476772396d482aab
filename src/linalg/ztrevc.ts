/**
 * Right eigenvectors of an upper triangular (Schur) matrix T, transformed back by the Schur
 * vectors Z, so that the columns of V = Z·X are eigenvectors of A = Z·T·Zᴴ.
 *
 * Method (Golub & Van Loan, Matrix Computations, 4th ed., §7.6.4; the LAPACK routine ztrevc,
 * Anderson et al., LAPACK Users' Guide, 3rd ed., SIAM 1999): for eigenvalue λ_j = T(j, j) the
 * vector x with x_j = 1, x_k = 0 for k > j solves (T(0:j-1, 0:j-1) − λ_j·I)·x = −T(0:j-1, j) by
 * back-substitution. Two protections, as in LAPACK:
 * - small pivots: a diagonal difference T(i,i) − λ_j smaller than
 *   smin = max(ulp·|λ_j|, smlnum) is replaced by smin, so (nearly) repeated eigenvalues give a
 *   large but finite solution instead of a division by zero;
 * - growth: before a division that could push an entry past a bound chosen so that no later dot
 *   product can overflow, the partial solution is scaled down (the vector's direction is all
 *   that matters).
 *
 * Layout: interleaved (re, im), row-major (see {@link CMatrix}). Back-substitution uses the dot
 * product form along rows of T (unit stride); the coefficient matrix X is kept row-major so the
 * product Z·X is a plain dense matrix product.
 *
 * @module
 */

import { zgemmBase } from './zgemm.ts';

const ULP = 2 ** -52;
const SAFMIN = 2 ** -1022;

/**
 * Compute V = Z·X, X the upper triangular matrix of eigenvectors of the n×n upper triangular T.
 *
 * Column j of V is an (unnormalized) right eigenvector for T(j, j). The kernel trusts its input
 * and allocates nothing (the product may use the SIMD kernels' own reusable memory).
 *
 * @param n order of the matrices
 * @param t n×n upper triangular (only the upper triangle is read), interleaved row-major
 * @param z n×n unitary Schur vectors, interleaved row-major
 * @param x n×n scratch (length ≥ 2n²), receives X
 * @param v n×n output (length ≥ 2n²), receives V
 * @param work scratch, length ≥ 2n
 * @throws nothing: the kernel trusts its input
 * @example
 * ztrevc(n, t, z, x, vectors.data, work);
 */
export function ztrevc(
  n: number,
  t: Float64Array,
  z: Float64Array,
  x: Float64Array,
  v: Float64Array,
  work: Float64Array,
): void {
  const rs = 2 * n;
  const smlnum = SAFMIN * (n / ULP);

  // Entries of a partial solution are kept below `bound`, so a dot product of a row of T with
  // it stays below MAX_VALUE/4: n·tmax·bound ≤ MAX_VALUE/4.
  let tmax = 0;
  for (let i = 0; i < n; i++) {
    for (let q = i * rs + 2 * i; q < (i + 1) * rs; q += 2) {
      const m = Math.abs(t[q]!) + Math.abs(t[q + 1]!);
      if (m > tmax) tmax = m;
    }
  }
  const bound = Number.MAX_VALUE / 4 / Math.max(1, n) / Math.max(1, tmax);

  x.fill(0, 0, 2 * n * n);
  for (let j = 0; j < n; j++) {
    const pjj = j * rs + 2 * j;
    const lr = t[pjj]!;
    const li = t[pjj + 1]!;
    let smin = ULP * (Math.abs(lr) + Math.abs(li));
    if (smin < smlnum) smin = smlnum;
    // work holds x_0..x_j (interleaved); x_j = 1.
    work[2 * j] = 1;
    work[2 * j + 1] = 0;
    for (let i = j - 1; i >= 0; i--) {
      const rb = i * rs;
      // num = −Σ_{k=i+1..j} T(i,k)·x_k
      let sr = 0;
      let si = 0;
      for (let q = 2 * (i + 1); q <= 2 * j; q += 2) {
        const ar = t[rb + q]!;
        const ai = t[rb + q + 1]!;
        const xr = work[q]!;
        const xi = work[q + 1]!;
        sr += ar * xr - ai * xi;
        si += ar * xi + ai * xr;
      }
      let nr = -sr;
      let ni = -si;
      let dr = t[rb + 2 * i]! - lr;
      let di = t[rb + 2 * i + 1]! - li;
      let dabs = Math.abs(dr) + Math.abs(di);
      if (dabs < smin) {
        dr = smin;
        di = 0;
        dabs = smin;
      }
      // |num/d| ≤ 2·|num|₁/|d|₁: keep the quotient under `bound` by scaling x_{i+1..j} first.
      const nabs = Math.abs(nr) + Math.abs(ni);
      const limit = dabs < 1 ? bound * dabs : bound;
      if (nabs > limit) {
        const f = (0.5 * limit) / nabs;
        for (let q = 2 * (i + 1); q <= 2 * j + 1; q++) work[q] *= f;
        nr *= f;
        ni *= f;
      }
      // x_i = num/d by Smith's algorithm (|d|² is never formed, so tiny pivots are safe).
      if (Math.abs(dr) >= Math.abs(di)) {
        const r = di / dr;
        const den = dr + di * r;
        work[2 * i] = (nr + ni * r) / den;
        work[2 * i + 1] = (ni - nr * r) / den;
      } else {
        const r = dr / di;
        const den = di + dr * r;
        work[2 * i] = (nr * r + ni) / den;
        work[2 * i + 1] = (ni * r - nr) / den;
      }
    }
    // Scatter into column j of X.
    for (let i = 0; i <= j; i++) {
      x[i * rs + 2 * j] = work[2 * i]!;
      x[i * rs + 2 * j + 1] = work[2 * i + 1]!;
    }
  }

  // V = Z·X as one matrix product (the project's zgemm, SIMD-accelerated where available): it
  // is the largest single piece of work here and a dense product runs several times faster
  // than any loop that exploits the triangular shape of X.
  zgemmBase(n, n, n, 1, 0, z, x, 0, 0, v);
}
