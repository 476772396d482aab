/**
 * Complex square roots: the principal branch and the upper (Im ≥ 0) branch used for
 * propagation constants, including branch cuts, signed zeros, tolerance and extreme magnitudes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { zsqrtPrincipal, zsqrtUpper } from '../../src/linalg/zsqrt.ts';

const EPS = 2 ** -52;

function principal(re: number, im: number): [number, number] {
  const o = new Float64Array(2);
  zsqrtPrincipal(re, im, o);
  return [o[0]!, o[1]!];
}

function upper(re: number, im: number, tol = 0): [number, number] {
  const o = new Float64Array(2);
  zsqrtUpper(re, im, o, 0, tol);
  return [o[0]!, o[1]!];
}

/**
 * |w² − z| / |z|, computed after scaling w by a power of two so that squaring cannot overflow
 * or underflow (scaling by 2^k is exact).
 */
function squareError(re: number, im: number, w: [number, number]): number {
  const m = Math.max(Math.abs(w[0]), Math.abs(w[1]));
  const k = m === 0 ? 0 : Math.round(Math.log2(m));
  const s = 2 ** -k;
  const wr = w[0] * s;
  const wi = w[1] * s;
  const zr = re * s * s;
  const zi = im * s * s;
  return Math.hypot(wr * wr - wi * wi - zr, 2 * wr * wi - zi) / Math.hypot(zr, zi);
}

/** finite doubles spread over the whole exponent range, both signs */
const wideDouble = fc.double({ noNaN: true, noDefaultInfinity: true, min: -Number.MAX_VALUE, max: Number.MAX_VALUE });

describe('zsqrtPrincipal', () => {
  it('values worked by hand', () => {
    // check value: hand computation, (2 − i)² = 3 − 4i, (1 + i)² = 2i, (2i)² = −4
    expect(principal(3, -4)).toEqual([2, -1]);
    expect(principal(0, 2)).toEqual([1, 1]);
    expect(principal(4, 0)).toEqual([2, 0]);
    expect(principal(-4, 0)).toEqual([0, 2]);
    expect(principal(0, 0)).toEqual([0, 0]);
  });

  it('writes at the offset and nowhere else', () => {
    // check value: the function's contract
    const o = new Float64Array([7, 7, 7, 7, 7]);
    zsqrtPrincipal(-9, 0, o, 2);
    expect(Array.from(o)).toEqual([7, 7, 0, 3, 7]);
  });

  it('branch cut on the negative real axis follows the sign of the zero imaginary part', () => {
    // check value: Kahan (1987) and C99 Annex G, csqrt(−x ± i0) = 0 ± i√x
    const up = principal(-4, 0);
    const down = principal(-4, -0);
    expect(up).toEqual([0, 2]);
    expect(down).toEqual([0, -2]);
    // just below the cut the root is close to −2i, continuous from below
    const below = principal(-4, -1e-300);
    expect(below[1]).toBe(-2);
    expect(Object.is(principal(0, -0)[1], -0)).toBe(true);
  });

  it('huge and tiny magnitudes neither overflow nor underflow', () => {
    // check value: √(2^1022) = 2^511 exactly, √(2^-1074) = 2^-537 exactly; elsewhere the
    // definition w² = z checked with exact power-of-two rescaling
    expect(principal(2 ** 1022, 0)).toEqual([2 ** 511, 0]);
    expect(principal(-(2 ** 1022), 0)).toEqual([0, 2 ** 511]);
    expect(principal(2 ** -1074, 0)).toEqual([2 ** -537, 0]);
    expect(principal(Number.MAX_VALUE, 0)[0]).toBeCloseTo(Math.sqrt(Number.MAX_VALUE), -140);
    for (const [re, im] of [
      [Number.MAX_VALUE, 0],
      [Number.MAX_VALUE, Number.MAX_VALUE],
      [-Number.MAX_VALUE, -Number.MAX_VALUE],
      [-Number.MAX_VALUE, 1],
      [1e308, -1e-308],
      [Number.MIN_VALUE, 0],
      [-Number.MIN_VALUE, 0],
      [1e-310, 3e-311],
      [-3e-320, 1e-321],
      [2.2250738585072014e-308, -2.2250738585072014e-308],
    ] as Array<[number, number]>) {
      const w = principal(re, im);
      expect(Number.isFinite(w[0]) && Number.isFinite(w[1])).toBe(true);
      expect(w[0]).toBeGreaterThanOrEqual(0);
      // subnormal inputs carry fewer bits, so only the normal range gets the tight bound
      const tol = Math.hypot(re, im) < 2.2250738585072014e-308 ? 1e-3 : 4 * EPS;
      expect(squareError(re, im, w)).toBeLessThan(tol);
    }
  });

  it('infinite parts follow C99 Annex G', () => {
    // check value: ISO C99 Annex G.6.4.2 (csqrt)
    expect(principal(1, Infinity)).toEqual([Infinity, Infinity]);
    expect(principal(-1, -Infinity)).toEqual([Infinity, -Infinity]);
    expect(principal(Number.NaN, Infinity)).toEqual([Infinity, Infinity]);
    expect(principal(Infinity, 2)).toEqual([Infinity, 0]);
    expect(principal(-Infinity, 2)).toEqual([0, Infinity]);
  });

  it('property: w² = z to a few ulps and Re w ≥ 0 over the whole finite range', () => {
    // check value: definition of the principal root; Kahan's algorithm is accurate to a few ulps
    fc.assert(
      fc.property(wideDouble, wideDouble, (re, im) => {
        if (re === 0 && im === 0) return true;
        const w = principal(re, im);
        if (!(w[0] >= 0)) return false;
        const tiny = Math.hypot(re, im) < 1e-300;
        return squareError(re, im, w) < (tiny ? 1e-3 : 4 * EPS);
      }),
      { numRuns: 2000 },
    );
  });

  it('property: the imaginary part of the root has the sign of the imaginary part of z', () => {
    // check value: the principal root maps the upper/lower half planes to the first/fourth
    // quadrant (definition, Re w ≥ 0)
    fc.assert(
      fc.property(wideDouble, wideDouble, (re, im) => {
        const w = principal(re, im);
        // a root part that underflows to zero keeps the sign as ±0
        return im === 0 ? true : (w[1] < 0 || Object.is(w[1], -0)) === im < 0;
      }),
      { numRuns: 1000 },
    );
  });
});

describe('zsqrtUpper', () => {
  it('outgoing branch: Im ≥ 0, and Re > 0 on the positive real axis', () => {
    // check value: definition of the branch for exp(i·kz·z) with exp(−iωt): decaying or outgoing
    expect(upper(4, 0)).toEqual([2, 0]);
    expect(upper(4, -0)).toEqual([2, -0]);
    expect(upper(-4, 0)).toEqual([0, 2]); // evanescent: purely imaginary, decaying
    const lowerCut = upper(-4, -0);
    expect(lowerCut[1]).toBe(2); // the −0 side is flipped into the upper half plane
    expect(lowerCut[0] === 0).toBe(true);
    // 3 − 4i has principal root 2 − i; the upper branch takes −(2 − i) = −2 + i
    expect(upper(3, -4)).toEqual([-2, 1]);
    expect(upper(3, 4)).toEqual([2, 1]);
  });

  it('tol: a round-off-level negative imaginary part does not flip a propagating root', () => {
    // check value: the function's contract, |Im w| ≤ tol·(|Re w| + |Im w|) counts as zero
    const z: [number, number] = [4, -1e-14]; // principal root ≈ 2 − 2.5e-15 i
    const strict = upper(z[0], z[1]);
    expect(strict[0]).toBeCloseTo(-2, 14);
    expect(strict[1]).toBeGreaterThan(0);
    const tolerant = upper(z[0], z[1], 1e-12);
    expect(tolerant[0]).toBeCloseTo(2, 14);
    expect(tolerant[1]).toBeLessThan(0);
    expect(tolerant[1]).toBeGreaterThan(-1e-14);
    // a clearly lossy/gainy part is still flipped under the same tolerance
    expect(upper(4, -1e-3, 1e-12)[1]).toBeGreaterThan(0);
  });

  it('property: Im w ≥ 0 (tol = 0) and w² = z over the whole finite range', () => {
    // check value: definition of the branch; the flip w → −w keeps w² unchanged
    fc.assert(
      fc.property(wideDouble, wideDouble, (re, im) => {
        if (re === 0 && im === 0) return true;
        const w = upper(re, im);
        if (w[1] < 0) return false;
        if (w[1] === 0 && w[0] < 0) return false;
        const tiny = Math.hypot(re, im) < 1e-300;
        return squareError(re, im, w) < (tiny ? 1e-3 : 4 * EPS);
      }),
      { numRuns: 2000 },
    );
  });

  it('property: on the real axis the root is √x (x ≥ 0) or i√|x| (x < 0)', () => {
    // check value: definition, Re ≥ 0 on the real axis
    fc.assert(
      fc.property(wideDouble, (x) => {
        const w = upper(x, 0);
        return x >= 0 ? w[0] === Math.sqrt(x) && w[1] === 0 : w[0] === 0 && w[1] === Math.sqrt(-x);
      }),
      { numRuns: 1000 },
    );
  });
});
