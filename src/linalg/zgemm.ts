/**
 * Complex matrix product, BLAS zgemm semantics without transposes:
 * `out = alpha·a·b + beta·out`.
 *
 * Loop order i–k–j so the innermost loop walks a row of `b` and a row of `out` with unit stride
 * (row-major interleaved storage), two rows of `out` at a time so each loaded element of `b`
 * feeds two complex multiply-adds; the k loop is cut into panels so the rows of `b` in use stay
 * in cache for large n. That loop is the fallback; when WebAssembly SIMD is available the
 * product runs in the register-blocked kernel of wasm/kernels.as (about 5× faster).
 */
import type { CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';
import { activeKernels, wasmZgemm } from './wasm/runtime.ts';

const K_PANEL = 64;
/**
 * Below this many complex multiply-adds (m·n·k) the TypeScript loop beats the WebAssembly
 * kernel, whose fixed cost is the copy in and out and the packing (scripts/bench-linalg.ts).
 */
const WASM_MIN_MADDS = 128;

/**
 * @param out result, rows(a)×cols(b); must not alias `a` or `b`.
 * @param alpha complex scale of the product as [re, im] (default 1).
 * @param beta complex scale of the old `out` as [re, im] (default 0: `out` is overwritten;
 *   its old contents are ignored even if they are NaN).
 * @returns `out`
 * @throws {LinalgError} 'shape' when the sizes do not conform.
 * @example
 * zgemm(cmatrix(2, 2), fromRows([[1, 2], [3, 4]]), identity(2)); // → [[1, 2], [3, 4]]
 */
export function zgemm<T extends CMatrix>(
  out: T,
  a: Readonly<CMatrix>,
  b: Readonly<CMatrix>,
  alpha: readonly [number, number] = [1, 0],
  beta: readonly [number, number] = [0, 0],
): T {
  if (a.cols !== b.rows || out.rows !== a.rows || out.cols !== b.cols) {
    throw new LinalgError(
      'zgemm',
      'shape',
      a.rows,
      `cannot multiply ${a.rows}×${a.cols} by ${b.rows}×${b.cols} into ${out.rows}×${out.cols}`,
    );
  }
  if (out.data === a.data || out.data === b.data) {
    throw new LinalgError('zgemm', 'shape', a.rows, 'out must not alias an input');
  }
  zgemmBase(a.rows, b.cols, a.cols, alpha[0], alpha[1], a.data, b.data, beta[0], beta[1], out.data);
  return out;
}

/**
 * Unchecked kernel: C(m×n) = alpha·A(m×k)·B(k×n) + beta·C, all row-major interleaved with
 * leading dimensions equal to their column counts. Runs the WebAssembly SIMD kernel when that
 * backend is active and the product is large enough, else the TypeScript loop below. C must not
 * overlap A or B.
 */
export function zgemmBase(
  m: number,
  n: number,
  k: number,
  alphaRe: number,
  alphaIm: number,
  A: Float64Array,
  B: Float64Array,
  betaRe: number,
  betaIm: number,
  C: Float64Array,
): void {
  const wasm = activeKernels();
  if (wasm !== null && m * n * k >= WASM_MIN_MADDS && m > 0 && n > 0) {
    wasmZgemm(wasm, m, n, k, alphaRe, alphaIm, A, B, betaRe, betaIm, C);
    return;
  }
  zgemmTs(m, n, k, alphaRe, alphaIm, A, B, betaRe, betaIm, C);
}

// the pure-TypeScript product (fallback backend and small sizes)
function zgemmTs(
  m: number,
  n: number,
  k: number,
  alphaRe: number,
  alphaIm: number,
  A: Float64Array,
  B: Float64Array,
  betaRe: number,
  betaIm: number,
  C: Float64Array,
): void {
  const n2 = 2 * n;
  const total = m * n2;
  if (betaRe === 0 && betaIm === 0) {
    C.fill(0, 0, total);
  } else if (!(betaRe === 1 && betaIm === 0)) {
    for (let p = 0; p < total; p += 2) {
      const cr = C[p]!;
      const ci = C[p + 1]!;
      C[p] = betaRe * cr - betaIm * ci;
      C[p + 1] = betaRe * ci + betaIm * cr;
    }
  }
  if (m === 0 || n === 0 || k === 0) return;
  const unitAlpha = alphaRe === 1 && alphaIm === 0;
  const k2 = 2 * k;
  for (let k0 = 0; k0 < k; k0 += K_PANEL) {
    const k1 = Math.min(k, k0 + K_PANEL);
    let i = 0;
    for (; i + 1 < m; i += 2) {
      const c0 = i * n2;
      const c1 = c0 + n2;
      const a0 = i * k2;
      const a1 = a0 + k2;
      for (let kk = k0; kk < k1; kk++) {
        let xr = A[a0 + 2 * kk]!;
        let xi = A[a0 + 2 * kk + 1]!;
        let yr = A[a1 + 2 * kk]!;
        let yi = A[a1 + 2 * kk + 1]!;
        if (!unitAlpha) {
          const tr = alphaRe * xr - alphaIm * xi;
          xi = alphaRe * xi + alphaIm * xr;
          xr = tr;
          const ur = alphaRe * yr - alphaIm * yi;
          yi = alphaRe * yi + alphaIm * yr;
          yr = ur;
        }
        const b0 = kk * n2;
        for (let j = 0; j < n2; j += 2) {
          const br = B[b0 + j]!;
          const bi = B[b0 + j + 1]!;
          C[c0 + j] += xr * br - xi * bi;
          C[c0 + j + 1] += xr * bi + xi * br;
          C[c1 + j] += yr * br - yi * bi;
          C[c1 + j + 1] += yr * bi + yi * br;
        }
      }
    }
    if (i < m) {
      const c0 = i * n2;
      const a0 = i * k2;
      for (let kk = k0; kk < k1; kk++) {
        let xr = A[a0 + 2 * kk]!;
        let xi = A[a0 + 2 * kk + 1]!;
        if (!unitAlpha) {
          const tr = alphaRe * xr - alphaIm * xi;
          xi = alphaRe * xi + alphaIm * xr;
          xr = tr;
        }
        const b0 = kk * n2;
        for (let j = 0; j < n2; j += 2) {
          const br = B[b0 + j]!;
          const bi = B[b0 + j + 1]!;
          C[c0 + j] += xr * br - xi * bi;
          C[c0 + j + 1] += xr * bi + xi * br;
        }
      }
    }
  }
}
