/**
 * Toeplitz matrices from Fourier coefficients.
 *
 * In the Fourier modal method the convolution of a periodic function with a truncated Fourier
 * series is the n×n Toeplitz matrix T_ij = c_(i−j) (Laurent's rule), with c_k the k-th Fourier
 * coefficient; orders i, j run over −M…M, n = 2M + 1, so coefficients −(n−1)…(n−1) are needed.
 */
import { cmatrix, type CMatrix } from './cmatrix.ts';
import { LinalgError } from './errors.ts';

/**
 * @param coeffs interleaved complex Fourier coefficients c_k for k = −(n−1)…(n−1); c_k sits at
 *   index 2·(k + n − 1). Length at least 2·(2n − 1).
 * @param n matrix order.
 * @param out n×n output (allocated if absent).
 * @returns out with out_ij = c_(i−j).
 * @throws {LinalgError} 'shape' when too few coefficients are given.
 * @example
 * toeplitz(new Float64Array([3, 0, 2, 0, 1, 0]), 2); // c_-1 = 3, c_0 = 2, c_1 = 1 → [[2, 3], [1, 2]]
 */
export function toeplitz<T extends CMatrix>(coeffs: Float64Array, n: number, out?: T): T | CMatrix {
  if (coeffs.length < 2 * (2 * n - 1)) {
    throw new LinalgError('toeplitz', 'shape', n, `need ${2 * n - 1} coefficients (k = −${n - 1}…${n - 1}), got ${coeffs.length / 2}`);
  }
  const t = out ?? cmatrix(n, n);
  if (t.rows !== n || t.cols !== n) throw new LinalgError('toeplitz', 'shape', n, `output is ${t.rows}×${t.cols}`);
  const d = t.data;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const src = 2 * (i - j + n - 1);
      const dst = 2 * (i * n + j);
      d[dst] = coeffs[src]!;
      d[dst + 1] = coeffs[src + 1]!;
    }
  }
  return t;
}
