/**
 * Right-hand and transposed LU solves and the Cholesky factor, against their definitions
 * (X·A = B, Aᵀ·X = B, A = L·Lᴴ; Golub & Van Loan, Matrix Computations, 4th ed., §3.1–3.4, §4.2).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cmatrix, conjTranspose, LinalgError, zgetrf, zgetrsRight, zgetrsT, zpotrf } from '../../src/linalg/index.ts';
import { diffNorm, fro, naiveMul, randomComplex, randomHermitian } from './util.ts';

function transpose(a: ReturnType<typeof cmatrix>): ReturnType<typeof cmatrix> {
  const t = cmatrix(a.cols, a.rows);
  for (let i = 0; i < a.rows; i++) {
    for (let j = 0; j < a.cols; j++) {
      t.data[2 * (j * a.rows + i)] = a.data[2 * (i * a.cols + j)]!;
      t.data[2 * (j * a.rows + i) + 1] = a.data[2 * (i * a.cols + j) + 1]!;
    }
  }
  return t;
}

describe('zgetrsRight and zgetrsT', () => {
  for (const n of [1, 2, 7, 51, 201]) {
    it(`zgetrsRight solves X·A = B to a backward-stable residual, n = ${n}`, () => {
      const a = randomComplex(n, n, 100 + n);
      const b = randomComplex(3, n, 200 + n);
      const x = zgetrsRight(zgetrf(a), b);
      const res = diffNorm(naiveMul(x, a), b) / (fro(a) * fro(x));
      expect(res, `‖XA − B‖/(‖A‖‖X‖) at n = ${n}`).toBeLessThan(1e-14);
    });
    it(`zgetrsT solves Aᵀ·X = B to a backward-stable residual, n = ${n}`, () => {
      const a = randomComplex(n, n, 300 + n);
      const b = randomComplex(n, 2, 400 + n);
      const x = zgetrsT(zgetrf(a), b);
      const res = diffNorm(naiveMul(transpose(a), x), b) / (fro(a) * fro(x));
      expect(res, `‖AᵀX − B‖/(‖A‖‖X‖) at n = ${n}`).toBeLessThan(1e-14);
    });
  }
  it('both work in place and reject wrong shapes', () => {
    const a = randomComplex(5, 5, 1);
    const f = zgetrf(a);
    const b = randomComplex(5, 5, 2);
    const expected = zgetrsT(f, b);
    zgetrsT(f, b, b);
    expect(diffNorm(b, expected)).toBe(0);
    expect(() => zgetrsRight(f, randomComplex(2, 4, 3))).toThrow(LinalgError);
    expect(() => zgetrsT(f, randomComplex(4, 2, 3))).toThrow(/zgetrsT \(n = 5\)/);
  });
  it('agree with each other through the transpose for random sizes (fast-check)', () => {
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 1e6 }), (n, seed) => {
        const a = randomComplex(n, n, seed);
        const b = randomComplex(n, n, seed + 1);
        const x1 = zgetrsRight(zgetrf(a), transpose(b)); // X·A = Bᵀ ⇔ Aᵀ·Xᵀ = B
        const x2 = zgetrsT(zgetrf(a), b);
        expect(diffNorm(transpose(x1), x2) / (1 + fro(x2))).toBeLessThan(1e-10);
      }),
      { numRuns: 50, seed: 7 },
    );
  });
});

describe('zpotrf', () => {
  for (const n of [1, 3, 40, 120]) {
    it(`factors a Hermitian positive-definite matrix as L·Lᴴ, n = ${n}`, () => {
      // H + n·I is positive definite for a random Hermitian H with entries in the unit disc
      // (Gershgorin: every eigenvalue ≥ n − (n − 1)·√2 … shifted well above 0 by 2n)
      const h = randomHermitian(n, 9 + n);
      for (let i = 0; i < n; i++) h.data[2 * (i * n + i)] += 2 * n;
      const l = zpotrf(h);
      for (let i = 0; i < n; i++) {
        for (let j = i + 1; j < n; j++) expect(l.data[2 * (i * n + j)]).toBe(0);
        expect(l.data[2 * (i * n + i) + 1]).toBe(0);
        expect(l.data[2 * (i * n + i)]).toBeGreaterThan(0);
      }
      const res = diffNorm(naiveMul(l, conjTranspose(l)), h) / fro(h);
      expect(res).toBeLessThan(1e-14);
    });
  }
  it('reports a matrix that is not positive definite as singular', () => {
    const h = randomHermitian(4, 3);
    h.data[0] = -5;
    expect(() => zpotrf(h)).toThrow(LinalgError);
    expect(() => zpotrf(h)).toThrow(/zpotrf \(n = 4\): matrix is not positive definite/);
  });
});
