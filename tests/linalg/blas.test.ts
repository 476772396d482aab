/**
 * zgemm and the element-wise kernels against their definitions. The product tests run on both
 * backends (WebAssembly SIMD and pure TypeScript) against the plain triple loop.
 */
import fc from 'fast-check';
import { afterAll, describe, expect, it } from 'vitest';
import { cmatrix, fromRows, identity, type CMatrix } from '../../src/linalg/cmatrix.ts';
import { zadd, zaddDiag, zaxpy, zdiagLeft, zdiagRight, zscal, zsub } from '../../src/linalg/elementwise.ts';
import { LinalgError } from '../../src/linalg/errors.ts';
import { zgemm } from '../../src/linalg/zgemm.ts';
import { setLinalgBackend, wasmAvailable } from '../../src/linalg/wasm/runtime.ts';
import { diffNorm, fro, naiveMul, randomComplex } from './util.ts';

const backends = wasmAvailable() ? (['wasm', 'ts'] as const) : (['ts'] as const);

afterAll(() => {
  setLinalgBackend('auto');
});

/** alpha·x + beta·y for whole matrices, written out entry by entry (reference). */
function combine(alpha: readonly [number, number], x: CMatrix, beta: readonly [number, number], y: CMatrix): CMatrix {
  const o = cmatrix(x.rows, x.cols);
  for (let p = 0; p < o.data.length; p += 2) {
    const xr = x.data[p]!;
    const xi = x.data[p + 1]!;
    const yr = y.data[p]!;
    const yi = y.data[p + 1]!;
    o.data[p] = alpha[0] * xr - alpha[1] * xi + beta[0] * yr - beta[1] * yi;
    o.data[p + 1] = alpha[0] * xi + alpha[1] * xr + beta[0] * yi + beta[1] * yr;
  }
  return o;
}

function expectShapeError(f: () => unknown): void {
  let caught: unknown;
  try {
    f();
  } catch (e) {
    caught = e;
  }
  expect(caught).toBeInstanceOf(LinalgError);
  expect((caught as LinalgError).code).toBe('shape');
}

/** dense n×n diagonal matrix from interleaved entries */
function diagMatrix(d: Float64Array, n: number): CMatrix {
  const m = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    m.data[2 * (i * n + i)] = d[2 * i]!;
    m.data[2 * (i * n + i) + 1] = d[2 * i + 1]!;
  }
  return m;
}

describe.each(backends)('zgemm (%s backend)', (backend) => {
  const use = () => setLinalgBackend(backend);

  it('JSDoc example: a·I = a', () => {
    use();
    // check value: definition of the identity
    const a = fromRows([[1, 2], [3, 4]]);
    const c = zgemm(cmatrix(2, 2), a, identity(2));
    expect(Array.from(c.data)).toEqual([1, 0, 2, 0, 3, 0, 4, 0]);
  });

  it('a 2×2 product worked by hand', () => {
    use();
    // check value: hand computation, (1+i)(2−i) + 3·i = 3 + i + 3i = 3 + 4i, etc.
    const a = fromRows([[[1, 1], 3]]);
    const b = fromRows([[[2, -1]], [[0, 1]]]);
    const c = zgemm(cmatrix(1, 1), a, b);
    expect(Array.from(c.data)).toEqual([3, 4]);
  });

  const shapes: Array<[number, number, number]> = [
    [1, 1, 1],
    [2, 3, 4],
    [5, 1, 7],
    [1, 9, 3],
    [8, 8, 8],
    [21, 21, 21],
    [17, 30, 5],
    [64, 3, 129],
    [101, 101, 101],
    [201, 13, 201],
  ];
  for (const [m, k, n] of shapes) {
    it(`matches the triple loop for ${m}×${k} · ${k}×${n}`, () => {
      use();
      const a = randomComplex(m, k, 7 * m + k);
      const b = randomComplex(k, n, 11 * n + k);
      const c = zgemm(cmatrix(m, n), a, b);
      // tolerance: |fl(AB) − AB| ≤ γ_k |A||B| (Higham, Accuracy and Stability, 2nd ed., §3.5)
      expect(diffNorm(c, naiveMul(a, b))).toBeLessThan(4 * k * 1.2e-16 * fro(a) * fro(b));
    });
  }

  it('alpha and beta: out = alpha·a·b + beta·out', () => {
    use();
    for (const [m, k, n] of [[3, 4, 5], [23, 9, 31], [40, 40, 40]] as const) {
      const a = randomComplex(m, k, 1);
      const b = randomComplex(k, n, 2);
      const c0 = randomComplex(m, n, 3);
      for (const [alpha, beta] of [
        [[1, 0], [1, 0]],
        [[0.5, -2], [0, 0]],
        [[-1, 0], [1, 0]],
        [[0, 1], [0.25, -0.75]],
      ] as Array<[[number, number], [number, number]]>) {
        const c = cmatrix(m, n);
        c.data.set(c0.data);
        zgemm(c, a, b, alpha, beta);
        // check value: BLAS zgemm definition, reference computed from the triple loop
        const ref = combine(alpha, naiveMul(a, b), beta, c0);
        expect(diffNorm(c, ref)).toBeLessThan(1e-13 * (fro(ref) + 1));
      }
    }
  });

  it('beta = 0 overwrites out even when it holds NaN', () => {
    use();
    // check value: BLAS zgemm definition (with beta = 0, C need not be set on input)
    const a = randomComplex(12, 12, 4);
    const b = randomComplex(12, 12, 5);
    const c = cmatrix(12, 12);
    c.data.fill(Number.NaN);
    zgemm(c, a, b);
    expect(diffNorm(c, naiveMul(a, b))).toBeLessThan(1e-13);
  });

  it('NaN in an input propagates (IEEE arithmetic, no skipped zeros)', () => {
    use();
    // check value: IEEE 754, 0·NaN = NaN; entry (0,0) of a is zero on purpose
    const a = randomComplex(10, 10, 6);
    a.data[0] = 0;
    a.data[1] = 0;
    const b = randomComplex(10, 10, 7);
    b.data[2 * 3] = Number.NaN; // b(0, 3)
    const c = zgemm(cmatrix(10, 10), a, b);
    for (let i = 0; i < 10; i++) expect(Number.isNaN(c.data[2 * (i * 10 + 3)]!)).toBe(true);
    expect(Number.isNaN(c.data[2 * 4]!)).toBe(false);
  });

  it('empty inner dimension gives beta·out; empty outer dimensions are no-ops', () => {
    use();
    // check value: definition, a sum over an empty k range is zero
    const c0 = randomComplex(3, 4, 8);
    const c = cmatrix(3, 4);
    c.data.set(c0.data);
    zgemm(c, cmatrix(3, 0), cmatrix(0, 4), [1, 0], [2, 0]);
    for (let p = 0; p < c.data.length; p++) expect(c.data[p]).toBe(2 * c0.data[p]!);
    expect(zgemm(cmatrix(0, 5), cmatrix(0, 3), cmatrix(3, 5)).data.length).toBe(0);
    zgemm(c, cmatrix(3, 0), cmatrix(0, 4));
    expect(c.data.every((v) => v === 0)).toBe(true);
  });

  it('property: distributive over addition, (a1 + a2)·b = a1·b + a2·b', () => {
    use();
    // check value: ring axiom of matrix multiplication
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 12 }), fc.integer({ min: 1, max: 12 }), fc.integer(), (m, k, n, seed) => {
        const a1 = randomComplex(m, k, seed);
        const a2 = randomComplex(m, k, seed + 1);
        const b = randomComplex(k, n, seed + 2);
        const lhs = zgemm(cmatrix(m, n), zadd(cmatrix(m, k), a1, a2), b);
        const rhs = zgemm(cmatrix(m, n), a1, b);
        zgemm(rhs, a2, b, [1, 0], [1, 0]);
        return diffNorm(lhs, rhs) <= 1e-13 * (1 + fro(lhs));
      }),
      { numRuns: 60 },
    );
  });
});

describe('zgemm argument checks', () => {
  it('non-conforming shapes throw LinalgError("shape")', () => {
    // check value: definition, a (m×k)·b (k×n) needs rows(b) = cols(a) and out m×n
    expectShapeError(() => zgemm(cmatrix(2, 2), cmatrix(2, 3), cmatrix(2, 2)));
    expectShapeError(() => zgemm(cmatrix(3, 2), cmatrix(2, 2), cmatrix(2, 2)));
    expectShapeError(() => zgemm(cmatrix(2, 3), cmatrix(2, 2), cmatrix(2, 2)));
  });

  it('out aliasing an input is rejected', () => {
    // check value: the kernel's contract; an in-place product would read overwritten entries
    const a = randomComplex(4, 4, 9);
    const b = randomComplex(4, 4, 10);
    expectShapeError(() => zgemm(a, a, b));
    expectShapeError(() => zgemm(b, a, b));
    expectShapeError(() => zgemm({ rows: 4, cols: 4, data: a.data }, a, b));
  });
});

describe('element-wise kernels', () => {
  const a = randomComplex(5, 7, 21);
  const b = randomComplex(5, 7, 22);

  it('zadd / zsub entry by entry, also with out = a', () => {
    // check value: definition
    const s = zadd(cmatrix(5, 7), a, b);
    const d = zsub(cmatrix(5, 7), a, b);
    for (let p = 0; p < s.data.length; p++) {
      expect(s.data[p]).toBe(a.data[p]! + b.data[p]!);
      expect(d.data[p]).toBe(a.data[p]! - b.data[p]!);
    }
    const x = cmatrix(5, 7);
    x.data.set(a.data);
    zadd(x, x, b);
    expect(Array.from(x.data)).toEqual(Array.from(s.data));
    zsub(x, x, b);
    expect(diffNorm(x, a)).toBeLessThan(1e-15);
    const y = cmatrix(5, 7);
    y.data.set(b.data);
    zsub(y, a, y); // out aliasing the second operand
    expect(Array.from(y.data)).toEqual(Array.from(d.data));
  });

  it('zscal: (2 − 3i)·(1 + 2i) = 8 + i, and out = a', () => {
    // check value: hand computation
    const m = fromRows([[[1, 2]]]);
    expect(Array.from(zscal(cmatrix(1, 1), [2, -3], m).data)).toEqual([8, 1]);
    zscal(m, [0, 1], m); // i·(1 + 2i) = −2 + i
    expect(Array.from(m.data)).toEqual([-2, 1]);
  });

  it('zaxpy: y = alpha·x + y, and x = y gives (1 + alpha)·x', () => {
    // check value: BLAS zaxpy definition
    const y = cmatrix(5, 7);
    y.data.set(b.data);
    zaxpy(y, [0.5, -1], a);
    expect(diffNorm(y, combine([0.5, -1], a, [1, 0], b))).toBeLessThan(1e-15);
    const z = cmatrix(5, 7);
    z.data.set(a.data);
    zaxpy(z, [1, 0], z);
    for (let p = 0; p < z.data.length; p++) expect(z.data[p]).toBe(2 * a.data[p]!);
  });

  it('zdiagLeft / zdiagRight equal products with the dense diagonal matrix', () => {
    // check value: definition, (D·A)_ij = d_i·a_ij and (A·D)_ij = a_ij·d_j
    const dl = randomComplex(1, 5, 23).data;
    const dr = randomComplex(1, 7, 24).data;
    const left = zdiagLeft(cmatrix(5, 7), dl, a);
    const right = zdiagRight(cmatrix(5, 7), a, dr);
    expect(diffNorm(left, naiveMul(diagMatrix(dl, 5), a))).toBeLessThan(1e-15);
    expect(diffNorm(right, naiveMul(a, diagMatrix(dr, 7)))).toBeLessThan(1e-15);
    const x = cmatrix(5, 7);
    x.data.set(a.data);
    zdiagLeft(x, dl, x);
    expect(Array.from(x.data)).toEqual(Array.from(left.data));
    x.data.set(a.data);
    zdiagRight(x, x, dr);
    expect(Array.from(x.data)).toEqual(Array.from(right.data));
  });

  it('zaddDiag on square and rectangular matrices, and in place', () => {
    // check value: definition, d_i added to entry (i, i) only
    const sq = randomComplex(4, 4, 25);
    const d = randomComplex(1, 4, 26).data;
    const o = zaddDiag(cmatrix(4, 4), sq, d);
    const ref = zadd(cmatrix(4, 4), sq, diagMatrix(d, 4));
    expect(Array.from(o.data)).toEqual(Array.from(ref.data));
    zaddDiag(sq, sq, d);
    expect(Array.from(sq.data)).toEqual(Array.from(ref.data));
    // 2×3: the diagonal is (0,0) and (1,1); row stride is 3, not 2
    const r = zaddDiag(cmatrix(2, 3), cmatrix(2, 3), new Float64Array([1, 0, 2, 0]));
    expect(Array.from(r.data)).toEqual([1, 0, 0, 0, 0, 0, 0, 0, 2, 0, 0, 0]);
    // 3×2: only two diagonal entries exist
    const t = zaddDiag(cmatrix(3, 2), cmatrix(3, 2), new Float64Array([1, 1, 2, 2]));
    expect(Array.from(t.data)).toEqual([1, 1, 0, 0, 0, 0, 2, 2, 0, 0, 0, 0]);
  });

  it('shape mismatches and short diagonals throw LinalgError("shape")', () => {
    // check value: each kernel's stated shape contract
    const c = cmatrix(5, 6);
    expectShapeError(() => zadd(c, a, b));
    expectShapeError(() => zsub(cmatrix(5, 7), a, cmatrix(7, 5)));
    expectShapeError(() => zscal(c, [1, 0], a));
    expectShapeError(() => zaxpy(c, [1, 0], a));
    expectShapeError(() => zdiagLeft(cmatrix(5, 7), new Float64Array(8), a));
    expectShapeError(() => zdiagRight(cmatrix(5, 7), a, new Float64Array(12)));
    expectShapeError(() => zaddDiag(cmatrix(4, 4), cmatrix(4, 4), new Float64Array(6)));
  });
});
