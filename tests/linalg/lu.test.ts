/**
 * LU factorization and solves: factor residual, solve residual, inverse, failure codes, small-N
 * properties, and a cross-check against ml-matrix on real matrices. Numeric tests run on both
 * backends (WebAssembly SIMD, pure TypeScript).
 */
import fc from 'fast-check';
import { Matrix, solve as mlSolve } from 'ml-matrix';
import { afterAll, describe, expect, it } from 'vitest';
import { cmatrix, fromRows, identity, type CMatrix } from '../../src/linalg/cmatrix.ts';
import { LinalgError, type LinalgErrorCode } from '../../src/linalg/errors.ts';
import { luFactors, zgesv, zgetrf, zgetri, zgetrs, type LUFactors } from '../../src/linalg/zgetrf.ts';
import { setLinalgBackend, wasmAvailable } from '../../src/linalg/wasm/runtime.ts';
import { diffNorm, fro, naiveMul, randomComplex, rng } from './util.ts';

const backends = wasmAvailable() ? (['wasm', 'ts'] as const) : (['ts'] as const);
const EPS = 2 ** -52;

afterAll(() => {
  setLinalgBackend('auto');
});

/** P·A with the recorded interchanges applied in order (LAPACK's ipiv convention). */
function permuteRows(a: CMatrix, ipiv: Int32Array): CMatrix {
  const n = a.rows;
  const c = a.cols;
  const p = cmatrix(n, c);
  p.data.set(a.data);
  for (let k = 0; k < ipiv.length; k++) {
    const r = ipiv[k]!;
    if (r === k) continue;
    for (let j = 0; j < 2 * c; j++) {
      const t = p.data[k * 2 * c + j]!;
      p.data[k * 2 * c + j] = p.data[r * 2 * c + j]!;
      p.data[r * 2 * c + j] = t;
    }
  }
  return p;
}

/** Split packed factors into unit-lower L and upper U. */
function splitLU(f: LUFactors): { l: CMatrix; u: CMatrix } {
  const n = f.n;
  const l = identity(n);
  const u = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const q = 2 * (i * n + j);
      const t = j < i ? l : u;
      t.data[q] = f.lu.data[q]!;
      t.data[q + 1] = f.lu.data[q + 1]!;
    }
  }
  return { l, u };
}

function factorResidual(a: CMatrix, f: LUFactors): number {
  const { l, u } = splitLU(f);
  return diffNorm(permuteRows(a, f.ipiv), naiveMul(l, u)) / fro(a);
}

function solveResidual(a: CMatrix, x: CMatrix, b: CMatrix): number {
  return diffNorm(naiveMul(a, x), b) / (fro(a) * fro(x));
}

function codeOf(f: () => unknown): LinalgErrorCode | 'none' | 'other' {
  try {
    f();
  } catch (e) {
    return e instanceof LinalgError ? e.code : 'other';
  }
  return 'none';
}

describe.each(backends)('LU (%s backend)', (backend) => {
  const use = () => setLinalgBackend(backend);

  it('JSDoc example: [[0, 1], [2, 3]] pivots on row 1', () => {
    use();
    // check value: partial pivoting by hand; |2| > |0| so rows swap, then a 1×1 trailing block
    const f = zgetrf(fromRows([[0, 1], [2, 3]]));
    expect(Array.from(f.ipiv)).toEqual([1, 1]);
    // L = [[1, 0], [0, 1]], U = [[2, 3], [0, 1]]
    expect(Array.from(f.lu.data)).toEqual([2, 0, 3, 0, 0, 0, 1, 0]);
  });

  for (const n of [1, 2, 5, 8, 21, 33, 51, 101, 201]) {
    it(`n = ${n}: ‖PA − LU‖ / ‖A‖ and ‖AX − B‖ / (‖A‖‖X‖) at round-off level`, () => {
      use();
      const a = randomComplex(n, n, 300 + n);
      const f = zgetrf(a);
      // bound: backward error of LU with partial pivoting is O(n·u·growth) (Golub & Van Loan
      // 4th ed. Thm 3.4.2); random matrices have small growth, so n·u with margin
      expect(factorResidual(a, f)).toBeLessThan(4 * n * EPS);
      for (const nrhs of [1, 3, n]) {
        const b = randomComplex(n, nrhs, 400 + n + nrhs);
        const x = zgetrs(f, b);
        // check value: common practice, normwise backward error ‖AX − B‖/(‖A‖‖X‖) ≲ n·u
        expect(solveResidual(a, x, b)).toBeLessThan(Math.max(1e-15, 4 * n * EPS));
        expect(solveResidual(a, x, b)).toBeLessThan(1e-13);
      }
    });
  }

  it('multipliers are bounded: |l_ij| ≤ √2 under the |re| + |im| pivot measure', () => {
    use();
    // check value: partial pivoting gives |a_ik| ≤ |a_kk| in the pivot measure (Golub & Van Loan
    // 4th ed. §3.4.3); with |re| + |im| the true moduli satisfy |l| ≤ √2 (since |z|₂ ≤ |z|₁ ≤ √2|z|₂)
    for (const n of [10, 64, 150]) {
      const f = zgetrf(randomComplex(n, n, 500 + n));
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < i; j++) {
          const q = 2 * (i * n + j);
          expect(Math.hypot(f.lu.data[q]!, f.lu.data[q + 1]!)).toBeLessThanOrEqual(Math.SQRT2 * (1 + 4 * EPS));
        }
      }
    }
  });

  it('zgetri(A)·A ≈ I', () => {
    use();
    for (const n of [3, 40, 101]) {
      const a = randomComplex(n, n, 600 + n);
      const inv = zgetri(a);
      // check value: definition of the inverse; error bound κ(A)·n·u (Higham 2nd ed. §14.1),
      // κ of these random matrices is below 1e4
      expect(diffNorm(naiveMul(inv, a), identity(n)) / Math.sqrt(n)).toBeLessThan(1e-11);
    }
  });

  it('zgesv = zgetrf + zgetrs; out may be b itself; factors are reused', () => {
    use();
    const n = 30;
    const a = randomComplex(n, n, 700);
    const b = randomComplex(n, 4, 701);
    const ref = zgetrs(zgetrf(a), b);
    const store = luFactors(n);
    const x = zgesv(a, b, undefined, store);
    expect(Array.from(x.data)).toEqual(Array.from(ref.data));
    const inPlace = cmatrix(n, 4);
    inPlace.data.set(b.data);
    expect(zgesv(a, inPlace, inPlace).data).toBe(inPlace.data);
    expect(Array.from(inPlace.data)).toEqual(Array.from(ref.data));
    // the same storage factors another matrix of the same order
    const a2 = randomComplex(n, n, 702);
    zgetrf(a2, store);
    expect(factorResidual(a2, store)).toBeLessThan(4 * n * EPS);
  });

  it('a Hermitian positive definite system: diagonal dominance keeps rows in place', () => {
    use();
    // check value: for a strictly diagonally dominant matrix by columns, partial pivoting makes
    // no interchanges (Golub & Van Loan 4th ed. Thm 3.4.3); here dominance holds in |re| + |im|
    const n = 25;
    const a = randomComplex(n, n, 800);
    for (let i = 0; i < n; i++) a.data[2 * (i * n + i)] = 4 * n;
    const f = zgetrf(a);
    expect(Array.from(f.ipiv)).toEqual(Array.from({ length: n }, (_, i) => i));
  });

  it('singular matrices throw LinalgError("singular")', () => {
    use();
    // check value: hand elimination; each matrix has rank < n and its multipliers are powers of
    // two, so the elimination is exact and the zero pivot comes out exactly zero
    expect(codeOf(() => zgetrf(cmatrix(3, 3)))).toBe('singular');
    expect(codeOf(() => zgetrf(fromRows([[1, 2], [2, 4]])))).toBe('singular');
    expect(codeOf(() => zgesv(fromRows([[4, 2, 1], [2, 1, 0.5], [1, 3, 5]]), identity(3)))).toBe('singular');
    expect(codeOf(() => zgetri(fromRows([[[1, 1], [2, 2]], [[1, -1], [2, -2]]])))).toBe('singular');
    const n = 50;
    const z = randomComplex(n, n, 900);
    for (let j = 0; j < 2 * n; j++) z.data[7 * 2 * n + j] = 0; // a zero row
    expect(codeOf(() => zgetrf(z))).toBe('singular');
  });

  it('NaN or Inf in A throws LinalgError("non-finite")', () => {
    use();
    // check value: the kernel's contract (checked before factoring)
    for (const bad of [Number.NaN, Number.POSITIVE_INFINITY, Number.NEGATIVE_INFINITY]) {
      const a = randomComplex(12, 12, 1000);
      a.data[2 * 37 + 1] = bad;
      expect(codeOf(() => zgetrf(a))).toBe('non-finite');
      expect(codeOf(() => zgesv(a, identity(12)))).toBe('non-finite');
    }
  });

  it('shape errors', () => {
    use();
    // check value: each kernel's stated shape contract
    expect(codeOf(() => zgetrf(cmatrix(3, 4)))).toBe('shape');
    expect(codeOf(() => zgetrf(identity(3), luFactors(4)))).toBe('shape');
    const f = zgetrf(identity(3));
    expect(codeOf(() => zgetrs(f, cmatrix(4, 2)))).toBe('shape');
    expect(codeOf(() => zgetrs(f, cmatrix(3, 2), cmatrix(3, 3)))).toBe('shape');
    expect(codeOf(() => zgetri(identity(3), cmatrix(3, 2)))).toBe('shape');
  });

  it('property: small random systems are solved to round-off (fast-check)', () => {
    use();
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 9 }), fc.integer({ min: 1, max: 5 }), fc.integer(), (n, nrhs, seed) => {
        const a = randomComplex(n, n, seed);
        const b = randomComplex(n, nrhs, seed ^ 0x5bd1e995);
        let f: LUFactors;
        try {
          f = zgetrf(a);
        } catch (e) {
          // an exactly singular random matrix is possible only in principle
          return e instanceof LinalgError && e.code === 'singular';
        }
        const x = zgetrs(f, b);
        // same bounds as the fixed-size tests above (Golub & Van Loan 4th ed. Thm 3.4.2)
        return factorResidual(a, f) < 8 * n * EPS && solveResidual(a, x, b) < 1e-13;
      }),
      { numRuns: 150 },
    );
  });

  it('property: a zero column j gives an exactly zero pivot at step j', () => {
    use();
    // check value: a zero column stays exactly zero under every row update (each update adds a
    // multiple of that column's zero entry), so step j meets a zero pivot (Golub & Van Loan
    // 4th ed. §3.4); the other, random, columns make an earlier zero pivot improbable
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 40 }), fc.nat(), fc.integer(), (n, col, seed) => {
        const j = col % n;
        const a = randomComplex(n, n, seed);
        for (let i = 0; i < n; i++) {
          a.data[2 * (i * n + j)] = 0;
          a.data[2 * (i * n + j) + 1] = 0;
        }
        try {
          zgetrf(a);
        } catch (e) {
          return e instanceof LinalgError && e.code === 'singular' && e.message.includes(`zero pivot at step ${j}:`);
        }
        return false;
      }),
      { numRuns: 100 },
    );
  });

  it('real matrices: solution agrees with ml-matrix', () => {
    use();
    // check value: independent implementation (ml-matrix LU solve, real arithmetic)
    const r = rng(1234);
    for (const n of [4, 17, 60]) {
      const rowsA = Array.from({ length: n }, () => Array.from({ length: n }, () => 2 * r() - 1));
      const rowsB = Array.from({ length: n }, () => Array.from({ length: 3 }, () => 2 * r() - 1));
      const ours = zgesv(fromRows(rowsA), fromRows(rowsB));
      const theirs = mlSolve(new Matrix(rowsA), new Matrix(rowsB));
      let worst = 0;
      let scale = 0;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < 3; j++) {
          worst = Math.max(worst, Math.abs(ours.data[2 * (i * 3 + j)]! - theirs.get(i, j)));
          scale = Math.max(scale, Math.abs(theirs.get(i, j)));
          // real input stays real: the imaginary parts are exactly zero
          expect(Math.abs(ours.data[2 * (i * 3 + j) + 1]!)).toBe(0);
        }
      }
      // both backward stable: forward difference ≲ κ(A)·n·u; κ < 1e4 for these matrices
      expect(worst / scale).toBeLessThan(1e-10);
    }
  });
});
