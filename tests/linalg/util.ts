/** Test helpers for linalg: seeded random matrices and plain (slow, obviously correct) reference ops. */
import { cmatrix, type CMatrix } from '../../src/linalg/cmatrix.ts';

/** Mulberry32: a small seeded PRNG so every random test is reproducible. */
export function rng(seed: number): () => number {
  let s = seed >>> 0;
  return () => {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/** Entries uniform in [-1, 1) + i[-1, 1). */
export function randomComplex(n: number, m: number, seed: number): CMatrix {
  const r = rng(seed);
  const a = cmatrix(n, m);
  for (let k = 0; k < a.data.length; k++) a.data[k] = 2 * r() - 1;
  return a;
}

/** Random Hermitian matrix. */
export function randomHermitian(n: number, seed: number): CMatrix {
  const a = randomComplex(n, n, seed);
  const h = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const ij = 2 * (i * n + j);
      const ji = 2 * (j * n + i);
      h.data[ij] = 0.5 * (a.data[ij]! + a.data[ji]!);
      h.data[ij + 1] = 0.5 * (a.data[ij + 1]! - a.data[ji + 1]!);
    }
  }
  return h;
}

/** Plain triple-loop product, the reference for the optimized kernels. */
export function naiveMul(a: CMatrix, b: CMatrix): CMatrix {
  const c = cmatrix(a.rows, b.cols);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < b.cols; j++) {
      let sr = 0;
      let si = 0;
      for (let k = 0; k < a.cols; k++) {
        const ar = a.data[2 * (i * a.cols + k)]!;
        const ai = a.data[2 * (i * a.cols + k) + 1]!;
        const br = b.data[2 * (k * b.cols + j)]!;
        const bi = b.data[2 * (k * b.cols + j) + 1]!;
        sr += ar * br - ai * bi;
        si += ar * bi + ai * br;
      }
      c.data[2 * (i * c.cols + j)] = sr;
      c.data[2 * (i * c.cols + j) + 1] = si;
    }
  }
  return c;
}

/** Frobenius norm of a − b. */
export function diffNorm(a: CMatrix, b: CMatrix): number {
  let s = 0;
  for (let k = 0; k < a.data.length; k++) {
    const d = a.data[k]! - b.data[k]!;
    s += d * d;
  }
  return Math.sqrt(s);
}

/** Frobenius norm. */
export function fro(a: CMatrix): number {
  let s = 0;
  for (let k = 0; k < a.data.length; k++) s += a.data[k]! * a.data[k]!;
  return Math.sqrt(s);
}

/**
 * Relative eigen-residual ‖A·V − V·Λ‖_F / (‖A‖_F·‖V‖_F) for eigenvalues `w` (interleaved)
 * and eigenvectors in the columns of `v`.
 */
export function eigResidual(a: CMatrix, w: Float64Array, v: CMatrix): number {
  const n = a.rows;
  const av = naiveMul(a, v);
  let s = 0;
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const k = 2 * (i * n + j);
      const vr = v.data[k]!;
      const vi = v.data[k + 1]!;
      const lr = w[2 * j]!;
      const li = w[2 * j + 1]!;
      const dr = av.data[k]! - (vr * lr - vi * li);
      const di = av.data[k + 1]! - (vr * li + vi * lr);
      s += dr * dr + di * di;
    }
  }
  return Math.sqrt(s) / (fro(a) * fro(v));
}
