/**
 * Numerical failure in a linear-algebra kernel.
 *
 * Kernels in `src/linalg` report trouble with this one error type so callers can tell a
 * singular matrix from a non-converging QR iteration from bad input, and every message names
 * the kernel and the matrix size.
 */
export type LinalgErrorCode = 'non-finite' | 'singular' | 'no-convergence' | 'shape';

export class LinalgError extends Error {
  override readonly name = 'LinalgError';
  constructor(
    /** LAPACK-style name of the kernel that failed, e.g. `zgeev`. */
    readonly kernel: string,
    readonly code: LinalgErrorCode,
    /** Order of the matrix involved. */
    readonly n: number,
    detail: string,
  ) {
    super(`${kernel} (n = ${n}): ${detail}`);
  }
}
