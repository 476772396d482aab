/**
 * Eigenvalues and right eigenvectors of a general (non-Hermitian) complex matrix.
 *
 * Pipeline (the driver structure of LAPACK's zgeev; Anderson et al., LAPACK Users' Guide,
 * 3rd ed., SIAM 1999, §2.3.4 and §2.4.8; Golub & Van Loan, Matrix Computations, 4th ed., ch. 7):
 * 0. scale the matrix by a power of 2 if its largest entry is below √(underflow)/ε or above the
 *    reciprocal (undone on the eigenvalues at the end; eigenvectors are unaffected);
 * 1. {@link zgebal}: permute to isolate eigenvalues and scale by powers of 2 (balancing);
 * 2. {@link zgehrd}: Householder reduction to upper Hessenberg form H = Qᴴ·A·Q;
 * 3. {@link zhseqr}: shifted QR iteration to the complex Schur form T = Zᴴ·H·Z;
 * 4. {@link ztrevc}: eigenvectors of T by back-substitution, transformed back by Q·Z;
 * 5. undo balancing, then scale every eigenvector to unit 2-norm with its largest-modulus
 *    component real and positive (a fixed phase makes results reproducible across calls).
 *
 * The matrix products (blocked reduction, formation of Q, back-transform) go through the
 * project's zgemm and the QR sweeps through SIMD rotation kernels when the WebAssembly backend
 * is active (wasm/runtime.ts); the TypeScript paths give the same results to rounding.
 *
 * @module
 */
import { allFinite, cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import { zgebak, zgebal } from './zgebal.ts';
import { zgehrd, zgehrdWorkLength, zunghr, zunghrWorkLength } from './zgehrd.ts';
import { QrScratch, qrIterationCap, zhseqr } from './zhseqr.ts';
import { WorkspaceStore } from './workspaces.ts';
import { ztrevc } from './ztrevc.ts';

/** Entries are scaled into [SMLNUM, BIGNUM] first: √(smallest normal)/ε and its reciprocal. */
const SMLNUM = Math.sqrt(2 ** -1022) / 2 ** -52;
const BIGNUM = 1 / SMLNUM;

export interface ZgeevResult {
  readonly n: number;
  /** eigenvalues, interleaved (re, im), length 2n, in the order the Schur form delivers them */
  readonly values: Float64Array;
  /** n×n, column j is the right eigenvector of eigenvalue j, normalized to unit 2-norm; null when vectors: false */
  readonly vectors: CMatrix | null;
}

export interface ZgeevOptions {
  /** Compute right eigenvectors (default true). Eigenvalues alone take roughly 55–65% of the time. */
  readonly vectors?: boolean;
  /**
   * Balance (permute and scale) before the reduction (default true). It makes eigenvalues of
   * badly scaled matrices accurate. For matrices whose entries span hundreds of orders of
   * magnitude it can choose scalings near 2^±500 that magnify the error of individual
   * eigenvectors (LAPACK's zgeev behaves the same); pass false there.
   */
  readonly balance?: boolean;
}

/**
 * All scratch storage for {@link zgeev} at order n, allocated once and reused across calls
 * (about 6n² + 260n doubles). A workspace must not be shared by two calls running at the same time
 * (e.g. across an `await` in a worker that interleaves calls).
 *
 * @example
 * const ws = new ZgeevWorkspace(101);
 * for (const a of matrices) results.push(zgeev(a, {}, ws));
 */
export class ZgeevWorkspace {
  readonly n: number;
  /** n×n working matrix: balanced A, then H, then T. */
  readonly h: Float64Array;
  /** n×n: scratch of the blocked Hessenberg reduction, then Q, then the Schur vectors Q·Z. */
  readonly z: Float64Array;
  /** n×n: Householder vectors, then the eigenvector coefficients X of T. */
  readonly aux: Float64Array;
  /** 2n: Householder scalars. */
  readonly tau: Float64Array;
  /** General scratch, also for the blocked reduction and formation of Q (zgehrd/zunghr). */
  readonly work: Float64Array;
  /** n: balancing permutation and scaling. */
  readonly scale: Float64Array;
  /** n and 2n: the rotations of one QR sweep. */
  readonly rotC: Float64Array;
  readonly rotS: Float64Array;
  /** ilo, ihi from balancing. */
  readonly range: Int32Array;
  /** Working storage of the QR iteration (owns h and z). */
  readonly qr: QrScratch;

  /** @throws {RangeError} when n is not a non-negative integer */
  constructor(n: number) {
    if (!(Number.isInteger(n) && n >= 0)) {
      throw new RangeError(`ZgeevWorkspace: n must be a non-negative integer, got ${n}`);
    }
    this.n = n;
    this.qr = new QrScratch(n);
    // H and Z live in the QR scratch's memory, where the SIMD rotation kernels can reach them.
    this.h = this.qr.h;
    this.z = this.qr.z;
    this.aux = new Float64Array(2 * n * n);
    this.tau = new Float64Array(2 * n);
    this.work = new Float64Array(Math.max(2 * n, zunghrWorkLength(n), zgehrdWorkLength(n)));
    this.scale = new Float64Array(n);
    this.rotC = new Float64Array(n);
    this.rotS = new Float64Array(2 * n);
    this.range = new Int32Array(2);
  }
}

/** Workspaces used when a call passes none. */
const zgeevSpaces = new WorkspaceStore((n) => new ZgeevWorkspace(n));

/**
 * Eigen-decomposition A·V = V·Λ of a general complex n×n matrix.
 *
 * `a` is not modified; `values` and `vectors` are freshly allocated on every call. Eigenvalues
 * appear in the order of the diagonal of the Schur form (no sorting); with vectors, column j of
 * `vectors` belongs to eigenvalue j, has unit 2-norm, and its largest-modulus entry is real and
 * positive. For a defective (or numerically defective) eigenvalue the computed vectors are
 * nearly parallel, as they must be.
 *
 * @param a square matrix, interleaved row-major (see {@link CMatrix})
 * @param options `vectors` (default true), `balance` (default true)
 * @param workspace scratch for this n; when omitted, the thread's kept workspace for this n
 *   (see workspaces.ts)
 * @returns n, eigenvalues (length 2n, interleaved), eigenvectors (n×n) or null
 * @throws {LinalgError} code 'shape' when `a` is not square or the workspace is for another n;
 *   'non-finite' when `a` has a NaN or infinite entry (or the result would overflow);
 *   'no-convergence' when the QR iteration exceeds 30 sweeps per eigenvalue
 * @example
 * const a = fromRows([[2, 1], [0, [3, 1]]]);
 * const { values, vectors } = zgeev(a);
 * // values = [2, 0, 3, 1]; vectors column 0 is e₀
 */
export function zgeev(a: Readonly<CMatrix>, options: ZgeevOptions = {}, workspace?: ZgeevWorkspace): ZgeevResult {
  const n = a.rows;
  if (a.rows !== a.cols) {
    throw new LinalgError('zgeev', 'shape', n, `expected a square matrix, got ${a.rows}×${a.cols}`);
  }
  const len = 2 * n * n;
  if (a.data.length < len) {
    throw new LinalgError('zgeev', 'shape', n, `data has ${a.data.length} doubles, expected ${len}`);
  }
  if (!allFinite(a.data, len)) {
    throw new LinalgError('zgeev', 'non-finite', n, 'input matrix has a NaN or infinite entry');
  }
  const wantv = options.vectors ?? true;
  const balance = options.balance ?? true;
  const ws = workspace ?? zgeevSpaces.get(n);
  if (ws.n !== n) {
    throw new LinalgError('zgeev', 'shape', n, `workspace is for n = ${ws.n}`);
  }
  const values = new Float64Array(2 * n);
  if (n === 0) return { n, values, vectors: wantv ? cmatrix(0, 0) : null };

  const { h, z, aux, tau, work, scale, rotC, rotS, range, qr } = ws;
  h.set(a.data.subarray(0, len));
  // Bring the largest entry into [SMLNUM, BIGNUM] by an exact power of 2 (as LAPACK's zgeev
  // does): the QR iteration treats subdiagonal entries near the underflow threshold as zero, so
  // a matrix of norm 1e-300 would otherwise "converge" at once to its diagonal.
  let amax = 0;
  for (let k = 0; k < len; k++) {
    const x = Math.abs(h[k]!);
    if (x > amax) amax = x;
  }
  let expo = 0;
  if (amax > 0 && amax < SMLNUM) expo = Math.ceil(Math.log2(SMLNUM / amax));
  else if (amax > BIGNUM) expo = -Math.ceil(Math.log2(amax / BIGNUM));
  if (expo !== 0) {
    const f = 2 ** expo;
    for (let k = 0; k < len; k++) h[k] *= f;
  }
  zgebal(n, h, scale, range, balance, balance);
  const ilo = range[0]!;
  const ihi = range[1]!;
  zgehrd(n, ilo, ihi, h, aux, tau, work, z); // z is free until zunghr: panel scratch
  if (wantv) zunghr(n, ilo, ihi, aux, tau, z, work);
  const info = zhseqr(n, ilo, ihi, h, wantv, wantv ? z : null, values, rotC, rotS, qr);
  if (info > 0) {
    const cap = qrIterationCap(ihi - ilo + 1);
    throw new LinalgError(
      'zgeev',
      'no-convergence',
      n,
      `QR iteration did not converge within ${cap} sweeps (30 per eigenvalue of the ` +
        `${ihi - ilo + 1}×${ihi - ilo + 1} active block); it stalled at row ${info - 1}`,
    );
  }
  if (expo !== 0) {
    const f = 2 ** -expo;
    for (let k = 0; k < 2 * n; k++) values[k] *= f;
  }
  if (!allFinite(values)) {
    throw new LinalgError('zgeev', 'non-finite', n, 'eigenvalues overflowed (entries too large)');
  }
  if (!wantv) return { n, values, vectors: null };

  const vectors = cmatrix(n, n);
  const v = vectors.data;
  ztrevc(n, h, z, aux, v, work);
  zgebak(n, n, ilo, ihi, scale, v);
  normalizeColumns(n, v, work, rotC);
  if (!allFinite(v)) {
    throw new LinalgError('zgeev', 'non-finite', n, 'eigenvectors overflowed (entries too large)');
  }
  return { n, values, vectors };
}

/**
 * Scale each column of the n×n `v` to unit 2-norm, then rotate its phase so the entry of largest
 * modulus is real and positive. Column sums are accumulated row by row (unit stride). The norm
 * is computed after dividing by the column's largest |re|+|im|, so it cannot overflow.
 * `acc` (≥ 2n) and `big` (≥ n) are scratch.
 */
function normalizeColumns(n: number, v: Float64Array, acc: Float64Array, big: Float64Array): void {
  const rs = 2 * n;
  // big[j] = max_r |v(r,j)|₁
  big.fill(0, 0, n);
  for (let r = 0; r < n; r++) {
    const b = r * rs;
    for (let j = 0; j < n; j++) {
      const m = Math.abs(v[b + 2 * j]!) + Math.abs(v[b + 2 * j + 1]!);
      if (m > big[j]!) big[j] = m;
    }
  }
  for (let j = 0; j < n; j++) if (big[j] === 0) big[j] = 1;
  // acc[2j] = Σ_r |v(r,j)/big_j|², acc[2j+1] = max_r of the same (index kept separately below)
  acc.fill(0, 0, 2 * n);
  for (let r = 0; r < n; r++) {
    const b = r * rs;
    for (let j = 0; j < n; j++) {
      const s = 1 / big[j]!;
      const x = v[b + 2 * j]! * s;
      const y = v[b + 2 * j + 1]! * s;
      const m2 = x * x + y * y;
      acc[2 * j] += m2;
      if (m2 > acc[2 * j + 1]!) acc[2 * j + 1] = m2;
    }
  }
  // For each column, find the first row whose entry reaches the maximum modulus and build the
  // factor conj(v_k)/|v_k| / ‖v‖ (stored back into acc as a complex number).
  for (let j = 0; j < n; j++) {
    const s = 1 / big[j]!;
    const target = acc[2 * j + 1]!;
    let kr = 1;
    let ki = 0;
    for (let r = 0; r < n; r++) {
      const x = v[r * rs + 2 * j]! * s;
      const y = v[r * rs + 2 * j + 1]! * s;
      if (x * x + y * y >= target) {
        const m = Math.sqrt(x * x + y * y);
        kr = x / m;
        ki = -y / m;
        break;
      }
    }
    const inv = s / Math.sqrt(acc[2 * j]!);
    acc[2 * j] = kr * inv;
    acc[2 * j + 1] = ki * inv;
  }
  for (let r = 0; r < n; r++) {
    const b = r * rs;
    for (let j = 0; j < n; j++) {
      const fr = acc[2 * j]!;
      const fi = acc[2 * j + 1]!;
      const x = v[b + 2 * j]!;
      const y = v[b + 2 * j + 1]!;
      v[b + 2 * j] = x * fr - y * fi;
      v[b + 2 * j + 1] = x * fi + y * fr;
    }
  }
}
