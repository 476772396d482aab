/**
 * Dense complex linear algebra on interleaved row-major Float64Arrays (see cmatrix.ts).
 * Routine names follow LAPACK/BLAS; README table in DEVELOPERS.md.
 */
export * from './cmatrix.ts';
export * from './errors.ts';
export * from './elementwise.ts';
export * from './zgemm.ts';
export * from './zgetrf.ts';
export * from './zsqrt.ts';
export * from './toeplitz.ts';
export * from './zgetrsRight.ts';
export * from './zpotrf.ts';
export * from './zgetrsT.ts';
