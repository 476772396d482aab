/** Seeded test matrices for the benchmarks, so every run times the same inputs. */
import { cmatrix, type CMatrix } from '../src/linalg/cmatrix.ts';

/** Entries uniform in [−1, 1) from a seeded Mulberry32 stream (real and imaginary parts alike). */
export function seededMatrix(n: number, seed: number): CMatrix {
  let s = seed >>> 0;
  const a = cmatrix(n, n);
  for (let k = 0; k < a.data.length; k++) {
    s = (s + 0x6d2b79f5) >>> 0;
    let t = s;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    a.data[k] = 2 * (((t ^ (t >>> 14)) >>> 0) / 4294967296) - 1;
  }
  return a;
}

/** (A + Aᴴ)/2. */
export function hermitianPart(a: CMatrix): CMatrix {
  const n = a.rows;
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
