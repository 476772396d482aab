/**
 * Eigenvalues and eigenvectors of a complex Hermitian matrix — LAPACK zheev (uplo = 'L').
 *
 * A = V·Λ·Vᴴ in three stages (Golub & Van Loan, Matrix Computations, 4th ed., §8.3; LAPACK
 * Users' Guide, 3rd ed. 1999, zheev = zhetrd + zsteqr + zunmtr):
 * 1. zhetrd.ts — Householder reduction to a real symmetric tridiagonal T, A = Q·T·Qᴴ;
 * 2. zsteqr.ts — implicit QL/QR with Wilkinson shifts, T = Y·Λ·Yᵀ with Y real;
 * 3. V = Q·Y, applying the reflectors of Q to Y (skipped when only eigenvalues are wanted).
 * The matrix is first scaled by a power of two when its largest entry is outside
 * [2^−485, 2^485] (as zheev does), so no intermediate square can overflow or underflow harmfully;
 * the eigenvalues are scaled back exactly.
 *
 * Accuracy: backward stable — the computed pairs satisfy ‖A·V − V·Λ‖ = O(ε·‖A‖) and
 * ‖VᴴV − I‖ = O(ε) (GVL Thm. 8.3.2 and §8.3.6), eigenvalue errors O(ε·‖A‖₂).
 */
import { allFinite, cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import { zhetrdBackTransform, zhetrdBase } from './zhetrd.ts';
import { ZSTEQR_MAXIT, zsteqrBase } from './zsteqr.ts';
import { WorkspaceStore } from './workspaces.ts';

export interface ZheevResult {
  readonly n: number;
  /** real eigenvalues in ascending order, length n */
  readonly values: Float64Array;
  /** n×n, column j is the unit-norm eigenvector of values[j] (orthonormal set); null when vectors: false */
  readonly vectors: CMatrix | null;
}

/**
 * Scratch storage for `zheev` at one order n: allocate once, pass to every call of that size
 * (the solver diagonalises many matrices of the same order). Not safe to share between calls that
 * run at the same time (e.g. across worker threads give each worker its own).
 */
export class ZheevWorkspace {
  readonly n: number;
  /** @internal working copy of A, then the Householder vectors (2n²) */
  readonly a: Float64Array;
  /** @internal real eigenvectors of the tridiagonal, row-major (n²) */
  readonly y: Float64Array;
  /** @internal tridiagonal diagonal (n) */
  readonly d: Float64Array;
  /** @internal tridiagonal off-diagonal (n) */
  readonly e: Float64Array;
  /** @internal Householder scalars τ (n) */
  readonly tau: Float64Array;
  /** @internal phase scaling δ, interleaved (2n) */
  readonly phase: Float64Array;
  /** @internal back-transformation scratch (16n) */
  readonly bt: Float64Array;
  /** @internal vector scratch (2n) */
  readonly work: Float64Array;

  constructor(n: number) {
    if (!(Number.isInteger(n) && n >= 0)) {
      throw new LinalgError('zheev', 'shape', n, `workspace order must be a non-negative integer, got ${n}`);
    }
    this.n = n;
    this.a = new Float64Array(2 * n * n);
    this.y = new Float64Array(n * n);
    this.d = new Float64Array(n);
    this.e = new Float64Array(n);
    this.tau = new Float64Array(n);
    this.phase = new Float64Array(2 * n);
    this.work = new Float64Array(2 * n);
    this.bt = new Float64Array(16 * n);
  }
}

/** Entries of the working matrix are kept within [SCALE_MIN, SCALE_MAX] in magnitude (max norm). */
const SCALE_MIN = 2 ** -485; // ≈ 1.0e-146 ≈ √(smallest normal / ε)
const SCALE_MAX = 2 ** 485; // ≈ 1.0e146

/** Workspaces used when a call passes none. */
const zheevSpaces = new WorkspaceStore((n) => new ZheevWorkspace(n));

/**
 * Eigen-decomposition of a Hermitian matrix.
 *
 * Only the lower triangle of `a` is read (diagonal included; imaginary parts of the diagonal are
 * taken as zero); the strictly upper triangle is assumed to be its conjugate transpose and is not
 * used, except that every entry must be finite. `a` is not modified; `values` and `vectors` are
 * freshly allocated on each call. Use `isHermitian` first when the input may not be Hermitian.
 *
 * @param a n×n Hermitian matrix.
 * @param options `vectors` (default true): also compute the eigenvectors.
 * @param workspace scratch for this n; when absent, the thread's kept workspace for this n
 *   (see workspaces.ts).
 * @returns eigenvalues ascending (length n) and, if requested, the n×n unitary matrix whose column
 *   j is the eigenvector of values[j].
 * @throws {LinalgError} 'shape' if `a` is not square or the workspace is for another n;
 *   'non-finite' if `a` has a NaN or infinite entry; 'no-convergence' if the QL/QR iteration
 *   needs more than 30·n steps.
 * @example
 * const { values, vectors } = zheev(fromRows([[2, [0, -1]], [[0, 1], 2]]));
 * // values ≈ [1, 3]; vectors column 0 ∝ (1, −i)/√2 … up to a unit phase
 */
export function zheev(
  a: Readonly<CMatrix>,
  options?: { vectors?: boolean },
  workspace?: ZheevWorkspace,
): ZheevResult {
  const n = a.rows;
  if (a.cols !== n) throw new LinalgError('zheev', 'shape', n, `matrix is ${a.rows}×${a.cols}, not square`);
  if (a.data.length < 2 * n * n) {
    throw new LinalgError('zheev', 'shape', n, `data has ${a.data.length} doubles, need ${2 * n * n}`);
  }
  const ws = workspace ?? zheevSpaces.get(n);
  if (ws.n !== n) throw new LinalgError('zheev', 'shape', n, `workspace is for n = ${ws.n}`);
  if (!allFinite(a.data, 2 * n * n)) {
    throw new LinalgError('zheev', 'non-finite', n, 'matrix has NaN or infinite entries');
  }
  const wantVectors = options?.vectors ?? true;
  const values = new Float64Array(n);
  if (n === 0) return { n, values, vectors: wantVectors ? cmatrix(0, 0) : null };

  // Copy the lower triangle, scaled by a power of two (exact) if its size calls for it.
  const src = a.data;
  const A = ws.a;
  const n2 = 2 * n;
  let amax = 0;
  for (let i = 0; i < n; i++) {
    const ro = i * n2;
    for (let j = ro; j <= ro + 2 * i + 1; j++) {
      const v = Math.abs(src[j]!);
      if (v > amax) amax = v;
    }
  }
  let sigma = 1;
  if (amax > 0 && amax < SCALE_MIN) sigma = 2 ** Math.ceil(Math.log2(SCALE_MIN / amax));
  else if (amax > SCALE_MAX) sigma = 2 ** Math.floor(Math.log2(SCALE_MAX / amax));
  for (let i = 0; i < n; i++) {
    const ro = i * n2;
    const end = ro + 2 * i + 2;
    if (sigma === 1) A.set(src.subarray(ro, end), ro);
    else for (let j = ro; j < end; j++) A[j] = src[j]! * sigma;
  }

  zhetrdBase(n, A, ws.d, ws.e, ws.tau, ws.phase, ws.work);
  const y = wantVectors ? ws.y : null;
  if (y !== null) {
    y.fill(0);
    for (let i = 0; i < n * n; i += n + 1) y[i] = 1;
  }
  const bad = zsteqrBase(n, ws.d, ws.e, y, ws.work);
  if (bad > 0) {
    throw new LinalgError(
      'zheev',
      'no-convergence',
      n,
      `tridiagonal QL/QR did not converge in ${ZSTEQR_MAXIT}·n = ${ZSTEQR_MAXIT * n} steps (${bad} off-diagonals left)`,
    );
  }
  const inv = 1 / sigma;
  for (let i = 0; i < n; i++) values[i] = ws.d[i]! * inv;
  let vectors: CMatrix | null = null;
  if (wantVectors) {
    vectors = cmatrix(n, n);
    zhetrdBackTransform(n, A, ws.tau, ws.phase, ws.y, vectors.data, ws.bt);
  }
  // Never hand back NaN: an O(n²) guard against an internal overflow the scaling missed.
  if (!allFinite(values) || (vectors !== null && !allFinite(vectors.data))) {
    throw new LinalgError('zheev', 'no-convergence', n, 'result is not finite (internal overflow)');
  }
  return { n, values, vectors };
}

/**
 * True when `a` is square, finite and Hermitian to a relative tolerance:
 * |a_ij − conj(a_ji)| ≤ tol·max|a_kl| for all i, j (the diagonal must be real to that tolerance).
 * Magnitudes are measured as max(|re|, |im|), so the test costs no square roots. The solver uses
 * this to decide whether a matrix may take the `zheev` path.
 *
 * @param tol relative tolerance, ≥ 0 (default 1e-12; 0 asks for exact symmetry).
 * @example
 * isHermitian(fromRows([[1, [2, 1]], [[2, -1], 3]])); // true
 */
export function isHermitian(a: Readonly<CMatrix>, tol = 1e-12): boolean {
  const n = a.rows;
  if (a.cols !== n) return false;
  const x = a.data;
  const len = 2 * n * n;
  if (!allFinite(x, len)) return false;
  let amax = 0;
  for (let k = 0; k < len; k++) {
    const v = Math.abs(x[k]!);
    if (v > amax) amax = v;
  }
  const lim = tol * amax;
  const n2 = 2 * n;
  for (let i = 0; i < n; i++) {
    if (Math.abs(x[i * n2 + 2 * i + 1]!) > lim) return false;
    for (let j = 0; j < i; j++) {
      const ij = i * n2 + 2 * j;
      const ji = j * n2 + 2 * i;
      if (Math.abs(x[ij]! - x[ji]!) > lim || Math.abs(x[ij + 1]! + x[ji + 1]!) > lim) return false;
    }
  }
  return true;
}
