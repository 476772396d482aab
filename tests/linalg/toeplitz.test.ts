/**
 * Toeplitz matrices of Fourier coefficients (Laurent's rule), T_ij = c_(i−j).
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { cmatrix } from '../../src/linalg/cmatrix.ts';
import { LinalgError } from '../../src/linalg/errors.ts';
import { toeplitz } from '../../src/linalg/toeplitz.ts';
import { zgemm } from '../../src/linalg/zgemm.ts';
import { randomComplex } from './util.ts';

/** coefficients c_k, k = −(n−1)…(n−1), from a function of k */
function coeffs(n: number, c: (k: number) => [number, number]): Float64Array {
  const out = new Float64Array(2 * (2 * n - 1));
  for (let k = -(n - 1); k <= n - 1; k++) {
    const [re, im] = c(k);
    out[2 * (k + n - 1)] = re;
    out[2 * (k + n - 1) + 1] = im;
  }
  return out;
}

describe('toeplitz', () => {
  it('JSDoc example: c_-1 = 3, c_0 = 2, c_1 = 1 gives [[2, 3], [1, 2]]', () => {
    // check value: definition T_ij = c_(i−j), worked by hand
    const t = toeplitz(new Float64Array([3, 0, 2, 0, 1, 0]), 2);
    expect(Array.from(t.data)).toEqual([2, 0, 3, 0, 1, 0, 2, 0]);
  });

  it('every entry is c_(i−j), complex parts included', () => {
    // check value: definition (Laurent's rule)
    const n = 9;
    const c = coeffs(n, (k) => [k + 0.5, -2 * k]);
    const t = toeplitz(c, n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        expect(t.data[2 * (i * n + j)]).toBe(i - j + 0.5);
        expect(t.data[2 * (i * n + j) + 1]).toBe(-2 * (i - j));
      }
    }
  });

  it('a constant function gives ε·I', () => {
    // check value: the Fourier series of a constant ε has c_0 = ε and no other term
    const n = 7;
    const eps: [number, number] = [2.25, 0.1];
    const t = toeplitz(coeffs(n, (k) => (k === 0 ? eps : [0, 0])), n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const q = 2 * (i * n + j);
        expect([t.data[q], t.data[q + 1]]).toEqual(i === j ? eps : [0, 0]);
      }
    }
  });

  it('a single harmonic exp(i·2πx/Λ) shifts the orders by one', () => {
    // check value: multiplying by exp(i·2πx/Λ) maps Fourier order m to m + 1, so T = the shift
    // matrix with ones where i − j = 1 (definition of the convolution matrix)
    const n = 6;
    const t = toeplitz(coeffs(n, (k) => (k === 1 ? [1, 0] : [0, 0])), n);
    const x = randomComplex(n, 1, 3);
    const y = zgemm(cmatrix(n, 1), t, x);
    expect([y.data[0], y.data[1]]).toEqual([0, 0]);
    for (let i = 1; i < n; i++) {
      expect([y.data[2 * i], y.data[2 * i + 1]]).toEqual([x.data[2 * (i - 1)], x.data[2 * (i - 1) + 1]]);
    }
  });

  it('n = 1 uses c_0 only; out is filled and returned', () => {
    // check value: definition
    const out = cmatrix(1, 1);
    expect(toeplitz(new Float64Array([4, -1]), 1, out)).toBe(out);
    expect(Array.from(out.data)).toEqual([4, -1]);
  });

  it('extra coefficients beyond 2n − 1 are ignored', () => {
    // check value: the layout contract, c_k at index 2·(k + n − 1); a longer array only adds
    // entries past k = n − 1
    const n = 3;
    const c = coeffs(n, (k) => [k, k]);
    const longer = new Float64Array(c.length + 6);
    longer.set(c);
    longer.fill(99, c.length);
    expect(Array.from(toeplitz(longer, n).data)).toEqual(Array.from(toeplitz(c, n).data));
  });

  it('property: T(c) for a Hermitian sequence c_(−k) = conj(c_k) is a Hermitian matrix', () => {
    // check value: a real periodic function has c_(−k) = conj(c_k), and then T_ji = conj(T_ij)
    fc.assert(
      fc.property(fc.integer({ min: 1, max: 20 }), fc.integer(), (n, seed) => {
        const r = randomComplex(1, n, seed).data; // c_0…c_(n−1)
        const c = coeffs(n, (k) => (k >= 0 ? [r[2 * k]!, k === 0 ? 0 : r[2 * k + 1]!] : [r[-2 * k]!, -r[-2 * k + 1]!]));
        const t = toeplitz(c, n);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j < n; j++) {
            const ij = 2 * (i * n + j);
            const ji = 2 * (j * n + i);
            if (t.data[ij] !== t.data[ji] || t.data[ij + 1] !== -t.data[ji + 1]!) return false;
          }
        }
        return true;
      }),
      { numRuns: 100 },
    );
  });

  it('too few coefficients or a wrong-sized out throw LinalgError("shape")', () => {
    // check value: the function's shape contract (2n − 1 coefficients, n×n out)
    for (const f of [() => toeplitz(new Float64Array(2 * 4), 3), () => toeplitz(new Float64Array(10), 3, cmatrix(3, 2))]) {
      let caught: unknown;
      try {
        f();
      } catch (e) {
        caught = e;
      }
      expect(caught).toBeInstanceOf(LinalgError);
      expect((caught as LinalgError).code).toBe('shape');
    }
  });
});
