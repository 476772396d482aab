/**
 * LU factorization with partial (row) pivoting, P·A = L·U — LAPACK zgetrf; and the solves that
 * reuse it: zgetrs (many right-hand sides), zgesv (factor + solve), zgetri (inverse).
 *
 * Factor once, solve many times: the solver factors each interface matrix once and applies it to
 * several blocks. Right-looking elimination: in row-major storage the rank-1 update of the
 * trailing matrix runs along rows with unit stride; only the pivot search walks a column.
 * On the WebAssembly backend (wasm/kernels.as) the factorization and the solves are blocked in
 * panels of 32, so nearly all of their arithmetic runs in the SIMD multiply; the pivot order is
 * the same as the unblocked loop's (same measure, same tie rule).
 * Reference: Golub & Van Loan, Matrix Computations, 4th ed., Alg. 3.4.1; LAPACK Users' Guide,
 * 3rd ed. (SIAM 1999), zgetrf/zgetrs.
 */
import { allFinite, cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import { activeKernels, wasmZgetrf, wasmZgetrs } from './wasm/runtime.ts';

/**
 * Smallest order for which the WebAssembly LU beats the TypeScript loop, and smallest n·n·nrhs
 * for the solve (measured: below these the copy in/out costs more than the loop saves).
 */
const WASM_MIN_N = 6;
const WASM_MIN_SOLVE_MADDS = 128;

/** The factors of P·A = L·U stored together: L (unit diagonal, below) and U (on and above). */
export interface LUFactors {
  readonly n: number;
  /** n×n, L strictly below the diagonal (unit diagonal implied), U on and above. */
  readonly lu: CMatrix;
  /** Row i was swapped with row ipiv[i] at step i (0-based). */
  readonly ipiv: Int32Array;
}

/** Allocate factor storage for order n (reuse it across factorizations of the same size). */
export function luFactors(n: number): LUFactors {
  return { n, lu: cmatrix(n, n), ipiv: new Int32Array(n) };
}

/**
 * Factor a square matrix. `a` is not modified; the factors go into `out` (allocated if absent).
 * @throws {LinalgError} 'shape' if not square or `out` is the wrong size; 'non-finite' if `a`
 *   has NaN/Inf; 'singular' if a pivot is exactly zero.
 * @example
 * const f = zgetrf(fromRows([[0, 1], [2, 3]])); // f.ipiv = [1, 1]
 */
export function zgetrf(a: Readonly<CMatrix>, out?: LUFactors): LUFactors {
  const n = a.rows;
  if (a.cols !== n) throw new LinalgError('zgetrf', 'shape', n, `matrix is ${a.rows}×${a.cols}, not square`);
  const f = out ?? luFactors(n);
  if (f.n !== n) throw new LinalgError('zgetrf', 'shape', n, `factor storage is for n = ${f.n}`);
  if (!allFinite(a.data)) throw new LinalgError('zgetrf', 'non-finite', n, 'matrix has NaN or infinite entries');
  f.lu.data.set(a.data);
  const step = zgetrfBase(n, f.lu.data, f.ipiv);
  if (step >= 0) throw new LinalgError('zgetrf', 'singular', n, `exactly zero pivot at step ${step}: the matrix is singular`);
  return f;
}

/**
 * Unchecked in-place kernel. Returns −1 on success, or the 0-based step at which a pivot was
 * exactly zero (the factorization is then incomplete).
 */
export function zgetrfBase(n: number, A: Float64Array, ipiv: Int32Array): number {
  const wasm = activeKernels();
  if (wasm !== null && n >= WASM_MIN_N) return wasmZgetrf(wasm, n, A, ipiv);
  return zgetrfTs(n, A, ipiv);
}

// unblocked right-looking LU in TypeScript (fallback backend and small sizes)
function zgetrfTs(n: number, A: Float64Array, ipiv: Int32Array): number {
  const n2 = 2 * n;
  for (let k = 0; k < n; k++) {
    // pivot: largest |re| + |im| in column k at or below the diagonal (izamax's measure)
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const q = i * n2 + 2 * k;
      const v = Math.abs(A[q]!) + Math.abs(A[q + 1]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    ipiv[k] = p;
    if (best === 0) return k;
    if (p !== k) {
      const rp = p * n2;
      const rk = k * n2;
      for (let j = 0; j < n2; j++) {
        const t = A[rp + j]!;
        A[rp + j] = A[rk + j]!;
        A[rk + j] = t;
      }
    }
    // reciprocal of the pivot (Smith's formula, no overflow for large entries)
    const rk = k * n2;
    const pr = A[rk + 2 * k]!;
    const pi = A[rk + 2 * k + 1]!;
    let ir: number;
    let ii: number;
    if (Math.abs(pr) >= Math.abs(pi)) {
      const r = pi / pr;
      const d = pr + pi * r;
      ir = 1 / d;
      ii = -r / d;
    } else {
      const r = pr / pi;
      const d = pi + pr * r;
      ir = r / d;
      ii = -1 / d;
    }
    for (let i = k + 1; i < n; i++) {
      const ri = i * n2;
      const q = ri + 2 * k;
      const xr = A[q]!;
      const xi = A[q + 1]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      A[q] = lr;
      A[q + 1] = li;
      if (lr === 0 && li === 0) continue;
      for (let j = 2 * k + 2; j < n2; j += 2) {
        const ur = A[rk + j]!;
        const ui = A[rk + j + 1]!;
        A[ri + j] -= lr * ur - li * ui;
        A[ri + j + 1] -= lr * ui + li * ur;
      }
    }
  }
  return -1;
}

/**
 * Solve A·X = B using the factors of A. `b` is n×nrhs; `out` (n×nrhs) may be `b` itself.
 * @returns out = A⁻¹·b
 * @throws {LinalgError} 'shape' when sizes disagree.
 * @example
 * zgetrs(zgetrf(fromRows([[2, 0], [0, 4]])), fromRows([[2], [4]])); // → [[1], [1]]
 */
export function zgetrs<T extends CMatrix>(f: Readonly<LUFactors>, b: Readonly<CMatrix>, out?: T): T | CMatrix {
  const n = f.n;
  if (b.rows !== n) throw new LinalgError('zgetrs', 'shape', n, `right-hand side has ${b.rows} rows, expected ${n}`);
  const x = out ?? cmatrix(b.rows, b.cols);
  if (x.rows !== b.rows || x.cols !== b.cols) throw new LinalgError('zgetrs', 'shape', n, `output is ${x.rows}×${x.cols}, expected ${b.rows}×${b.cols}`);
  if (x.data !== b.data) x.data.set(b.data);
  zgetrsBase(n, b.cols, f.lu.data, f.ipiv, x.data);
  return x;
}

/** Unchecked in-place solve of the n×m row-major right-hand side X. */
export function zgetrsBase(n: number, m: number, LU: Float64Array, ipiv: Int32Array, X: Float64Array): void {
  const wasm = activeKernels();
  if (wasm !== null && n > 0 && m > 0 && n * n * m >= WASM_MIN_SOLVE_MADDS) {
    wasmZgetrs(wasm, n, m, LU, ipiv, X);
    return;
  }
  zgetrsTs(n, m, LU, ipiv, X);
}

// row-oriented substitution in TypeScript (fallback backend and small sizes)
function zgetrsTs(n: number, m: number, LU: Float64Array, ipiv: Int32Array, X: Float64Array): void {
  const n2 = 2 * n;
  const m2 = 2 * m;
  // apply the row interchanges
  for (let k = 0; k < n; k++) {
    const p = ipiv[k]!;
    if (p !== k) {
      const rp = p * m2;
      const rk = k * m2;
      for (let j = 0; j < m2; j++) {
        const t = X[rp + j]!;
        X[rp + j] = X[rk + j]!;
        X[rk + j] = t;
      }
    }
  }
  // forward: L·Y = P·B, row i of Y -= L_ik·row k of Y
  for (let i = 1; i < n; i++) {
    const xi0 = i * m2;
    const li0 = i * n2;
    for (let k = 0; k < i; k++) {
      const lr = LU[li0 + 2 * k]!;
      const lim = LU[li0 + 2 * k + 1]!;
      if (lr === 0 && lim === 0) continue;
      const xk0 = k * m2;
      for (let j = 0; j < m2; j += 2) {
        const yr = X[xk0 + j]!;
        const yi = X[xk0 + j + 1]!;
        X[xi0 + j] -= lr * yr - lim * yi;
        X[xi0 + j + 1] -= lr * yi + lim * yr;
      }
    }
  }
  // backward: U·X = Y
  for (let i = n - 1; i >= 0; i--) {
    const xi0 = i * m2;
    const ui0 = i * n2;
    for (let k = i + 1; k < n; k++) {
      const ur = LU[ui0 + 2 * k]!;
      const uim = LU[ui0 + 2 * k + 1]!;
      if (ur === 0 && uim === 0) continue;
      const xk0 = k * m2;
      for (let j = 0; j < m2; j += 2) {
        const yr = X[xk0 + j]!;
        const yi = X[xk0 + j + 1]!;
        X[xi0 + j] -= ur * yr - uim * yi;
        X[xi0 + j + 1] -= ur * yi + uim * yr;
      }
    }
    const dr = LU[ui0 + 2 * i]!;
    const di = LU[ui0 + 2 * i + 1]!;
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
    for (let j = 0; j < m2; j += 2) {
      const yr = X[xi0 + j]!;
      const yi = X[xi0 + j + 1]!;
      X[xi0 + j] = yr * ir - yi * ii;
      X[xi0 + j + 1] = yr * ii + yi * ir;
    }
  }
}

/**
 * Solve A·X = B (factor + solve): A n×n, b and out n×nrhs; `out` may be `b`; `factors`
 * (order n) is reused storage for the LU factors.
 * @throws {LinalgError} as zgetrf and zgetrs.
 * @example
 * zgesv(fromRows([[0, 1], [1, 0]]), fromRows([[3], [5]])); // → [[5], [3]]
 */
export function zgesv<T extends CMatrix>(a: Readonly<CMatrix>, b: Readonly<CMatrix>, out?: T, factors?: LUFactors): T | CMatrix {
  const f = zgetrf(a, factors);
  return zgetrs(f, b, out);
}

/**
 * Inverse of the n×n matrix A (via LU and n right-hand sides of the identity) into `out`
 * (n×n). Prefer zgetrs/zgesv when the inverse is only applied.
 * @throws {LinalgError} 'singular' for a singular matrix; as zgetrf otherwise.
 * @example
 * zgetri(fromRows([[[0, 2]]])); // → [[−0.5i]]
 */
export function zgetri<T extends CMatrix>(a: Readonly<CMatrix>, out?: T, factors?: LUFactors): T | CMatrix {
  const n = a.rows;
  const f = zgetrf(a, factors);
  const x = out ?? cmatrix(n, n);
  if (x.rows !== n || x.cols !== n) throw new LinalgError('zgetri', 'shape', n, `output is ${x.rows}×${x.cols}`);
  x.data.fill(0);
  for (let i = 0; i < n; i++) x.data[2 * (i * n + i)] = 1;
  zgetrsBase(n, n, f.lu.data, f.ipiv, x.data);
  return x;
}
