/**
 * zgeev (general complex eigensolver) and its kernels zgebal, zgehrd/zunghr, zhseqr, ztrevc.
 *
 * Every expected value names its source beside it. The residual bound 1e-12 on
 * ‖AV − VΛ‖_F/(‖A‖_F·‖V‖_F) is what a backward-stable method delivers (O(n·ε), ε ≈ 1.1e-16;
 * Golub & Van Loan, Matrix Computations, 4th ed., §7.5.6–7.6) with two orders of margin at
 * n = 201. Eigenvalue tolerances are ε·‖A‖ times the eigenvalue condition (Bauer–Fike, GVL
 * Thm 7.2.2) with margin; where a case is chosen to be normal the condition is 1.
 *
 * The main cases run on both backends of the project (the WebAssembly SIMD kernels and the pure
 * TypeScript loops), since zhseqr has a separate code path for each.
 */
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { afterAll, describe, expect, it } from 'vitest';
import { cmatrix, fromRows, type CMatrix } from '../../src/linalg/cmatrix.ts';
import { LinalgError } from '../../src/linalg/errors.ts';
import { setLinalgBackend, wasmAvailable, type LinalgBackend } from '../../src/linalg/wasm/runtime.ts';
import { zgebak, zgebal } from '../../src/linalg/zgebal.ts';
import { zgeev, ZgeevWorkspace, type ZgeevResult } from '../../src/linalg/zgeev.ts';
import { zgehrd, zgehrdWorkLength, zunghr, zunghrWorkLength } from '../../src/linalg/zgehrd.ts';
import { QrScratch, zhseqr } from '../../src/linalg/zhseqr.ts';
import { eigResidual, fro, naiveMul, randomComplex, randomHermitian, rng } from './util.ts';

/** Backward-stability bound on the relative residual (see the file comment). */
const RES_TOL = 1e-12;

// ---------------------------------------------------------------------------------------------
// helpers

function expectBelow(label: string, actual: number, bound: number): void {
  expect(actual, `${label}: actual ${actual}, expected < ${bound}`).toBeLessThan(bound);
}

/** Relative residual of a result (vectors required). */
function residual(a: CMatrix, r: ZgeevResult): number {
  return eigResidual(a, r.values, r.vectors!);
}

/** Largest |‖v_j‖₂ − 1| over the columns. */
function unitNormError(v: CMatrix): number {
  const n = v.rows;
  let worst = 0;
  for (let j = 0; j < v.cols; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) {
      const k = 2 * (i * v.cols + j);
      s += v.data[k]! ** 2 + v.data[k + 1]! ** 2;
    }
    worst = Math.max(worst, Math.abs(Math.sqrt(s) - 1));
  }
  return worst;
}

/**
 * Distance between two eigenvalue multisets (interleaved): each expected value is paired with
 * the nearest still-unpaired computed one; returns the largest pairing distance. Greedy pairing
 * is exact when the errors are below half the separation, which holds for every case here.
 */
function multisetDistance(expected: Float64Array, actual: Float64Array): number {
  const n = expected.length / 2;
  expect(actual.length, 'eigenvalue count').toBe(expected.length);
  const used = new Uint8Array(n);
  let worst = 0;
  for (let i = 0; i < n; i++) {
    let best = Infinity;
    let bj = -1;
    for (let j = 0; j < n; j++) {
      if (used[j]) continue;
      const d = Math.hypot(expected[2 * i]! - actual[2 * j]!, expected[2 * i + 1]! - actual[2 * j + 1]!);
      if (d < best) {
        best = d;
        bj = j;
      }
    }
    used[bj] = 1;
    worst = Math.max(worst, best);
  }
  return worst;
}

function trace(a: CMatrix): [number, number] {
  let tr = 0;
  let ti = 0;
  for (let i = 0; i < a.rows; i++) {
    tr += a.data[2 * (i * a.cols + i)]!;
    ti += a.data[2 * (i * a.cols + i) + 1]!;
  }
  return [tr, ti];
}

/** Plain Gauss–Jordan inverse with partial pivoting (reference helper for S·D·S⁻¹). */
function inverse(a: CMatrix): CMatrix {
  const n = a.rows;
  const m = cmatrix(n, 2 * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      m.data[2 * (i * 2 * n + j)] = a.data[2 * (i * n + j)]!;
      m.data[2 * (i * 2 * n + j) + 1] = a.data[2 * (i * n + j) + 1]!;
    }
    m.data[2 * (i * 2 * n + n + i)] = 1;
  }
  const w = 2 * n;
  for (let c = 0; c < n; c++) {
    let p = c;
    for (let r = c + 1; r < n; r++) {
      if (Math.hypot(m.data[2 * (r * w + c)]!, m.data[2 * (r * w + c) + 1]!) >
        Math.hypot(m.data[2 * (p * w + c)]!, m.data[2 * (p * w + c) + 1]!)) p = r;
    }
    for (let j = 0; j < w; j++) {
      for (const t of [0, 1]) {
        const x = m.data[2 * (c * w + j) + t]!;
        m.data[2 * (c * w + j) + t] = m.data[2 * (p * w + j) + t]!;
        m.data[2 * (p * w + j) + t] = x;
      }
    }
    const pr = m.data[2 * (c * w + c)]!;
    const pi = m.data[2 * (c * w + c) + 1]!;
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (let j = 0; j < w; j++) {
      const xr = m.data[2 * (c * w + j)]!;
      const xi = m.data[2 * (c * w + j) + 1]!;
      m.data[2 * (c * w + j)] = xr * ir - xi * ii;
      m.data[2 * (c * w + j) + 1] = xr * ii + xi * ir;
    }
    for (let r = 0; r < n; r++) {
      if (r === c) continue;
      const fr = m.data[2 * (r * w + c)]!;
      const fi = m.data[2 * (r * w + c) + 1]!;
      for (let j = 0; j < w; j++) {
        const xr = m.data[2 * (c * w + j)]!;
        const xi = m.data[2 * (c * w + j) + 1]!;
        m.data[2 * (r * w + j)] -= fr * xr - fi * xi;
        m.data[2 * (r * w + j) + 1] -= fr * xi + fi * xr;
      }
    }
  }
  const inv = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      inv.data[2 * (i * n + j)] = m.data[2 * (i * w + n + j)]!;
      inv.data[2 * (i * n + j) + 1] = m.data[2 * (i * w + n + j) + 1]!;
    }
  }
  return inv;
}

/** S·diag(d)·S⁻¹ with d interleaved. */
function similarity(s: CMatrix, d: Float64Array): CMatrix {
  const n = s.rows;
  const sd = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const k = 2 * (i * n + j);
      const xr = s.data[k]!;
      const xi = s.data[k + 1]!;
      sd.data[k] = xr * d[2 * j]! - xi * d[2 * j + 1]!;
      sd.data[k + 1] = xr * d[2 * j + 1]! + xi * d[2 * j]!;
    }
  }
  return naiveMul(sd, inverse(s));
}

/** A well-conditioned random S = I + 0.3·(random complex), κ(S) of order 10. */
function wellConditioned(n: number, seed: number): CMatrix {
  const s = randomComplex(n, n, seed);
  for (let k = 0; k < s.data.length; k++) s.data[k]! *= 0.3 / Math.sqrt(n);
  for (let i = 0; i < n; i++) s.data[2 * (i * n + i)]! += 1;
  return s;
}

/** Tridiagonal Toeplitz matrix: a on the diagonal, b above, c below. */
function tridiagonalToeplitz(n: number, a: [number, number], b: [number, number], c: [number, number]): CMatrix {
  const m = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    m.data[2 * (i * n + i)] = a[0];
    m.data[2 * (i * n + i) + 1] = a[1];
    if (i + 1 < n) {
      m.data[2 * (i * n + i + 1)] = b[0];
      m.data[2 * (i * n + i + 1) + 1] = b[1];
      m.data[2 * ((i + 1) * n + i)] = c[0];
      m.data[2 * ((i + 1) * n + i) + 1] = c[1];
    }
  }
  return m;
}

/** Companion matrix of the monic polynomial with the given roots (first row −coefficients). */
function companion(roots: ReadonlyArray<readonly [number, number]>): CMatrix {
  const n = roots.length;
  // coefficients of Π(z − r_k), highest degree first
  let coef: Array<[number, number]> = [[1, 0]];
  for (const [rr, ri] of roots) {
    const next: Array<[number, number]> = [...coef.map((): [number, number] => [0, 0]), [0, 0]];
    for (let k = 0; k < coef.length; k++) {
      const [cr, ci] = coef[k]!;
      next[k]![0] += cr;
      next[k]![1] += ci;
      next[k + 1]![0] -= cr * rr - ci * ri;
      next[k + 1]![1] -= cr * ri + ci * rr;
    }
    coef = next;
  }
  const m = cmatrix(n, n);
  for (let j = 0; j < n; j++) {
    m.data[2 * j] = -coef[j + 1]![0];
    m.data[2 * j + 1] = -coef[j + 1]![1];
  }
  for (let i = 1; i < n; i++) m.data[2 * (i * n + i - 1)] = 1;
  return m;
}

function interleave(values: ReadonlyArray<readonly [number, number]>): Float64Array {
  const out = new Float64Array(2 * values.length);
  values.forEach(([re, im], k) => {
    out[2 * k] = re;
    out[2 * k + 1] = im;
  });
  return out;
}

const backends: LinalgBackend[] = wasmAvailable() ? ['wasm', 'ts'] : ['ts'];
afterAll(() => {
  setLinalgBackend('auto');
});

// ---------------------------------------------------------------------------------------------
// residuals on classes of matrices

describe.each(backends)('zgeev residuals (%s backend)', (backend) => {
  const use = (): void => {
    setLinalgBackend(backend);
  };

  it('random complex matrices, n up to 201 (balancing on and off)', () => {
    use();
    for (const [n, seed] of [[2, 1], [3, 2], [7, 3], [21, 4], [51, 5], [64, 6], [101, 7], [201, 8]] as const) {
      const a = randomComplex(n, n, seed);
      for (const balance of [true, false]) {
        const r = zgeev(a, { balance });
        expectBelow(`random n=${n} seed=${seed} balance=${balance} residual`, residual(a, r), RES_TOL);
        // column norms are 1 by construction of the output (zgeev contract)
        expectBelow(`random n=${n} unit norms`, unitNormError(r.vectors!), 1e-14);
        // trace(A) = Σλ (the characteristic polynomial's second coefficient)
        const [tr, ti] = trace(a);
        let sr = 0;
        let si = 0;
        for (let k = 0; k < n; k++) {
          sr += r.values[2 * k]!;
          si += r.values[2 * k + 1]!;
        }
        expectBelow(`random n=${n} trace`, Math.hypot(tr - sr, ti - si), 1e-13 * n * fro(a));
      }
    }
  });

  it('complex-symmetric matrices (A = Aᵀ, not Hermitian)', () => {
    use();
    for (const [n, seed] of [[5, 11], [40, 12], [120, 13]] as const) {
      const g = randomComplex(n, n, seed);
      const a = cmatrix(n, n);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          for (const t of [0, 1]) {
            a.data[2 * (i * n + j) + t] = 0.5 * (g.data[2 * (i * n + j) + t]! + g.data[2 * (j * n + i) + t]!);
          }
        }
      }
      const r = zgeev(a);
      expectBelow(`complex-symmetric n=${n} residual`, residual(a, r), RES_TOL);
      expectBelow(`complex-symmetric n=${n} unit norms`, unitNormError(r.vectors!), 1e-14);
    }
  });

  it('Hermitian matrices: residual, and real eigenvalues to within ε·‖A‖', () => {
    use();
    for (const [n, seed] of [[6, 21], [50, 22], [150, 23]] as const) {
      const a = randomHermitian(n, seed);
      const r = zgeev(a);
      expectBelow(`Hermitian n=${n} residual`, residual(a, r), RES_TOL);
      let worstIm = 0;
      for (let k = 0; k < n; k++) worstIm = Math.max(worstIm, Math.abs(r.values[2 * k + 1]!));
      // eigenvalues of a Hermitian matrix are real (GVL Thm 8.1.1); perturbation ≤ ε·‖A‖₂
      expectBelow(`Hermitian n=${n} max |Im λ|`, worstIm, 1e-13 * fro(a));
    }
  });

  it('nearly repeated eigenvalues (S·D·S⁻¹ with clusters 1e-8 wide)', () => {
    use();
    const d = interleave([
      [1, 0], [1 + 1e-8, 0], [1 + 2e-8, 0], [1, 1e-8],
      [2, 1], [2, 1 + 1e-9], [-1, -0.5], [-1 + 1e-10, -0.5],
      [0.5, 0], [3, -2], [3 + 1e-8, -2 - 1e-8], [0, 2],
    ]);
    const s = wellConditioned(12, 31);
    const a = similarity(s, d);
    const r = zgeev(a);
    expectBelow('clustered residual', residual(a, r), RES_TOL);
    expectBelow('clustered unit norms', unitNormError(r.vectors!), 1e-14);
    // Bauer–Fike: |δλ| ≤ κ(S)·‖δA‖ with κ(S) ≈ 10 here (GVL Thm 7.2.2); clusters do not matter
    expectBelow('clustered eigenvalues', multisetDistance(d, r.values), 1e-12 * fro(a));
  });

  it('eigenvalues only (vectors: false) give the same multiset', () => {
    use();
    for (const [n, seed] of [[9, 41], [80, 42], [201, 43]] as const) {
      const a = randomComplex(n, n, seed);
      const full = zgeev(a);
      const only = zgeev(a, { vectors: false });
      expect(only.vectors).toBeNull();
      // same spectrum, computed along a different path (active block only)
      expectBelow(`values-only n=${n}`, multisetDistance(full.values, only.values), 1e-12 * fro(a));
    }
  });
});

// ---------------------------------------------------------------------------------------------
// balancing

describe('balancing', () => {
  it('badly scaled D·A·D⁻¹ (D from 1e-6 to 1e6): accurate only with balancing', () => {
    const n = 30;
    const a = randomComplex(n, n, 51);
    const reference = zgeev(a, { vectors: false }).values; // similar matrices share eigenvalues
    const b = cmatrix(n, n);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        const f = 10 ** (-6 + (12 * i) / (n - 1)) / 10 ** (-6 + (12 * j) / (n - 1));
        b.data[2 * (i * n + j)] = a.data[2 * (i * n + j)]! * f;
        b.data[2 * (i * n + j) + 1] = a.data[2 * (i * n + j) + 1]! * f;
      }
    }
    const balanced = zgeev(b);
    const plain = zgeev(b, { balance: false });
    expectBelow('scaled residual (balanced)', residual(b, balanced), RES_TOL);
    const errBalanced = multisetDistance(reference, balanced.values);
    const errPlain = multisetDistance(reference, plain.values);
    // balancing restores ‖·‖ ≈ ‖A‖ ≈ 17, so the error is ε·‖A‖·(small condition) again
    expectBelow('scaled eigenvalues, balanced', errBalanced, 1e-12 * fro(a));
    // without it the backward error is ε·‖D·A·D⁻¹‖ ≈ 1e-16·1e12: errors of order 1e-4 or worse
    // (measured here: hundreds), i.e. at least a million times the balanced error
    expect(errPlain, `unbalanced error ${errPlain} vs balanced ${errBalanced}`).toBeGreaterThan(1e6 * errBalanced);
  });

  it('matrices of norm 1e±300: eigenvalues scale with the matrix, vectors unchanged in quality', () => {
    // λ(s·A) = s·λ(A) (homogeneity); the relative residual is scale invariant
    const n = 30;
    const a = randomComplex(n, n, 55);
    const reference = zgeev(a).values;
    for (const s of [1e300, 1e-300, 2 ** -1060]) {
      const b: CMatrix = { rows: n, cols: n, data: a.data.map((x) => x * s) };
      const r = zgeev(b);
      const unscaled = r.values.map((x) => x / s);
      // 2^-1060 is subnormal: the input itself keeps only about 14 significant bits
      const tol = s < 1e-307 ? 1e-3 : 1e-12;
      expectBelow(`scale ${s} eigenvalues`, multisetDistance(reference, unscaled), tol * fro(a));
      expectBelow(`scale ${s} residual`, eigResidual(a, unscaled, r.vectors!), s < 1e-307 ? 1e-3 : RES_TOL);
    }
  });

  it('permutation isolates eigenvalues of zero rows/columns; back-transform restores vectors', () => {
    // Row 2 and column 4 have zero off-diagonal parts, so 2 and 4 are isolated; the rest is dense.
    const n = 7;
    const a = randomComplex(n, n, 61);
    for (let j = 0; j < n; j++) {
      if (j !== 2) {
        a.data[2 * (2 * n + j)] = 0;
        a.data[2 * (2 * n + j) + 1] = 0;
      }
      if (j !== 4) {
        a.data[2 * (j * n + 4)] = 0;
        a.data[2 * (j * n + 4) + 1] = 0;
      }
    }
    const scale = new Float64Array(n);
    const range = new Int32Array(2);
    const h = new Float64Array(a.data);
    zgebal(n, h, scale, range, true, true);
    // one row pushed to the bottom and one column to the top (Parlett & Reinsch 1969)
    expect([range[0], range[1]], 'ilo, ihi').toEqual([1, 5]);
    const r = zgeev(a);
    expectBelow('isolated residual', residual(a, r), RES_TOL);
    const diag = interleave([
      [a.data[2 * (2 * n + 2)]!, a.data[2 * (2 * n + 2) + 1]!],
      [a.data[2 * (4 * n + 4)]!, a.data[2 * (4 * n + 4) + 1]!],
    ]);
    // each isolated diagonal entry is an eigenvalue (block triangular form)
    for (let k = 0; k < 2; k++) {
      let best = Infinity;
      for (let j = 0; j < n; j++) best = Math.min(best, Math.hypot(r.values[2 * j]! - diag[2 * k]!, r.values[2 * j + 1]! - diag[2 * k + 1]!));
      expectBelow(`isolated eigenvalue ${k}`, best, 1e-14);
    }
  });

  it('upper triangular input is fully isolated: eigenvalues are the diagonal, in order', () => {
    const a = fromRows([
      [[1, 1], 2, [0, 3]],
      [0, [-2, 0.5], 4],
      [0, 0, [3, -1]],
    ]);
    const r = zgeev(a);
    // a triangular matrix is its own Schur form (GVL §7.1.4); balancing leaves the order
    expect(Array.from(r.values)).toEqual([1, 1, -2, 0.5, 3, -1]);
    expectBelow('triangular residual', residual(a, r), RES_TOL);
  });

  it('zgebak undoes scaling and permutation on vectors: D⁻¹Pᵀ·A·P·D has the balanced eigenvectors', () => {
    const n = 5;
    const a = randomComplex(n, n, 71);
    // make column 0 isolated and scale rows wildly
    for (let i = 1; i < n; i++) {
      a.data[2 * (i * n)] = 0;
      a.data[2 * (i * n) + 1] = 0;
    }
    for (let j = 0; j < n; j++) {
      a.data[2 * (3 * n + j)]! *= 1e5;
      a.data[2 * (3 * n + j) + 1]! *= 1e5;
    }
    const h = new Float64Array(a.data);
    const scale = new Float64Array(n);
    const range = new Int32Array(2);
    zgebal(n, h, scale, range, true, true);
    // identity columns transformed back are the columns of P·D (zgebak contract)
    const e = new Float64Array(2 * n * n);
    for (let i = 0; i < n; i++) e[2 * (i * n + i)] = 1;
    zgebak(n, n, range[0]!, range[1]!, scale, e);
    const pd: CMatrix = { rows: n, cols: n, data: e };
    // A·(P·D) = (P·D)·B with B the balanced matrix
    const lhs = naiveMul(a, pd);
    const rhs = naiveMul(pd, { rows: n, cols: n, data: h });
    let diff = 0;
    for (let k = 0; k < lhs.data.length; k++) diff = Math.max(diff, Math.abs(lhs.data[k]! - rhs.data[k]!));
    // powers of 2 and permutations are exact in floating point
    expect(diff).toBe(0);
  });
});

// ---------------------------------------------------------------------------------------------
// known spectra

describe('known spectra', () => {
  it('tridiagonal Toeplitz: λ_k = a + 2√(bc)·cos(kπ/(N+1)), real and complex a, b, c', () => {
    // Closed form: G. D. Smith, Numerical Solution of Partial Differential Equations, 3rd ed.,
    // OUP 1985, §2.11; Böttcher & Grudsky, Spectral Properties of Banded Toeplitz Matrices,
    // SIAM 2005, Thm 2.4. When |b| = |c| the matrix is unitarily similar to a normal one, so the
    // eigenvalue condition is 1 and the tolerance is a few ε·‖A‖.
    const cases: Array<[number, [number, number], [number, number], [number, number]]> = [
      [10, [2, 0], [1, 0], [1, 0]],
      [30, [1, 1], [0.5, 0.5], [-0.5, 0.5]],
      [16, [0, 1], [1, 1], [0, 0.25]], // |b| ≠ |c|: non-normal, balancing evens it out
      [25, [-1, 0.5], [2, 0], [0.5, 0]],
      [120, [0.3, -0.2], [0, 1], [1, 0]],
    ];
    for (const [n, a, b, c] of cases) {
      const m = tridiagonalToeplitz(n, a, b, c);
      const bcr = b[0] * c[0] - b[1] * c[1];
      const bci = b[0] * c[1] + b[1] * c[0];
      const mod = Math.sqrt(Math.hypot(bcr, bci));
      const arg = Math.atan2(bci, bcr) / 2;
      const expected = new Float64Array(2 * n);
      for (let k = 1; k <= n; k++) {
        const cs = Math.cos((k * Math.PI) / (n + 1));
        expected[2 * (k - 1)] = a[0] + 2 * mod * Math.cos(arg) * cs;
        expected[2 * (k - 1) + 1] = a[1] + 2 * mod * Math.sin(arg) * cs;
      }
      const r = zgeev(m);
      const label = `Toeplitz n=${n} a=${a} b=${b} c=${c}`;
      expectBelow(`${label} eigenvalues`, multisetDistance(expected, r.values), 1e-12 * fro(m));
      expectBelow(`${label} residual`, residual(m, r), RES_TOL);
    }
  });

  it('companion matrix of zⁿ − 1: the n-th roots of unity', () => {
    // det(zI − C) = zⁿ − 1 for the cyclic shift (companion matrix; GVL §7.4.6). C is a
    // permutation matrix (normal, condition 1), and the plain shift makes no progress on it
    // (every Wilkinson shift is 0), so this exercises the exceptional shifts.
    for (const n of [2, 5, 16, 64, 101, 150]) {
      const roots: Array<[number, number]> = [];
      for (let k = 0; k < n; k++) roots.push([Math.cos((2 * Math.PI * k) / n), Math.sin((2 * Math.PI * k) / n)]);
      // companion matrix of zⁿ − 1 written exactly: first row (0, …, 0, 1), ones below the diagonal
      const exact = cmatrix(n, n);
      exact.data[2 * (n - 1)] = 1;
      for (let i = 1; i < n; i++) exact.data[2 * (i * n + i - 1)] = 1;
      const r = zgeev(exact);
      expectBelow(`roots of unity n=${n}`, multisetDistance(interleave(roots), r.values), 1e-13 * n);
      expectBelow(`roots of unity n=${n} residual`, residual(exact, r), RES_TOL);
    }
  });

  it('companion matrix of a polynomial with chosen complex roots', () => {
    // det(zI − C) = p(z) (companion matrix; GVL §7.4.6); the roots are chosen, p is expanded
    // from them. These roots are well separated, so their condition is modest (measured error
    // ≈ 3e-15); the tolerance allows 300 times that.
    const roots: Array<[number, number]> = [
      [1, 2], [-1.5, 0.5], [0.3, -0.7], [2, -1], [-0.8, -1.9], [0, 0.5], [1.2, 0.1], [-2, -0.3],
    ];
    const m = companion(roots);
    const r = zgeev(m);
    expectBelow('chosen roots', multisetDistance(interleave(roots), r.values), 1e-12);
    expectBelow('chosen roots residual', residual(m, r), RES_TOL);
  });

  it('S·D·S⁻¹ with a chosen diagonal D', () => {
    // similar matrices have the same eigenvalues; Bauer–Fike bounds the error by κ(S)·ε·‖A‖
    for (const [n, seed] of [[8, 81], [40, 82]] as const) {
      const d = new Float64Array(2 * n);
      for (let k = 0; k < n; k++) {
        d[2 * k] = k - n / 2;
        d[2 * k + 1] = k % 3 === 0 ? 0.5 * k : -0.25 * k;
      }
      const a = similarity(wellConditioned(n, seed), d);
      const r = zgeev(a);
      expectBelow(`S·D·S⁻¹ n=${n} eigenvalues`, multisetDistance(d, r.values), 1e-12 * fro(a));
      expectBelow(`S·D·S⁻¹ n=${n} residual`, residual(a, r), RES_TOL);
    }
  });

  it('Jordan block perturbed by ε in the corner: eigenvalues ε^(1/n)·e^(2πik/n)', () => {
    // det(zI − (J + ε·e_n·e_1ᵀ)) = zⁿ − ε (J. H. Wilkinson, The Algebraic Eigenvalue Problem,
    // OUP 1965, §2.22): n eigenvalues on the circle of radius ε^(1/n), spread evenly. Measured
    // relative radius errors ≈ 1e-15; the tolerance keeps three orders of margin since the
    // condition of these eigenvalues grows like ε^((1−n)/n).
    for (const [n, eps] of [[6, 1e-6], [8, 1e-8], [12, 1e-12], [5, 1e-3]] as const) {
      const m = cmatrix(n, n);
      for (let i = 0; i + 1 < n; i++) m.data[2 * (i * n + i + 1)] = 1;
      m.data[2 * ((n - 1) * n)] = eps;
      const r = zgeev(m);
      const radius = eps ** (1 / n);
      const angles: number[] = [];
      for (let k = 0; k < n; k++) {
        const re = r.values[2 * k]!;
        const im = r.values[2 * k + 1]!;
        expectBelow(`Jordan n=${n} ε=${eps} radius of λ${k}`, Math.abs(Math.hypot(re, im) / radius - 1), 1e-12);
        angles.push(Math.atan2(im, re));
      }
      angles.sort((x, y) => x - y);
      for (let k = 0; k < n; k++) {
        const next = k + 1 < n ? angles[k + 1]! : angles[0]! + 2 * Math.PI;
        expectBelow(`Jordan n=${n} ε=${eps} angle gap ${k}`, Math.abs(next - angles[k]! - (2 * Math.PI) / n), 1e-10);
      }
      expectBelow(`Jordan n=${n} residual`, residual(m, r), RES_TOL);
    }
  });
});

// ---------------------------------------------------------------------------------------------
// cross-check and properties

describe('cross-checks and properties', () => {
  it('real nonsymmetric matrices: same eigenvalue multiset as ml-matrix EigenvalueDecomposition', () => {
    for (const [n, seed] of [[4, 91], [17, 92], [60, 93]] as const) {
      const r = rng(seed);
      const rows: number[][] = [];
      for (let i = 0; i < n; i++) rows.push(Array.from({ length: n }, () => 2 * r() - 1));
      const evd = new EigenvalueDecomposition(new Matrix(rows));
      const expected = new Float64Array(2 * n);
      for (let k = 0; k < n; k++) {
        expected[2 * k] = evd.realEigenvalues[k]!;
        expected[2 * k + 1] = evd.imaginaryEigenvalues[k]!;
      }
      const a = fromRows(rows);
      const got = zgeev(a, { vectors: false }).values;
      // both are backward-stable QR methods: they agree to a small multiple of ε·‖A‖·cond
      expectBelow(`ml-matrix n=${n}`, multisetDistance(expected, got), 1e-11 * fro(a));
    }
  });

  /** Checks of one result for the properties below. */
  function checkProperty(a: CMatrix, balance: boolean): void {
    const n = a.rows;
    const r = zgeev(a, { balance });
    let amax = 0;
    for (const x of a.data) amax = Math.max(amax, Math.abs(x));
    if (amax === 0) {
      // the zero matrix: every eigenvalue is 0
      expect(r.values.every((x) => x === 0)).toBe(true);
      return;
    }
    // The residual is invariant under A → s·A, Λ → s·Λ; with s a power of 2 the scaling is exact
    // and keeps the norms in the test helpers from underflowing for subnormal entries.
    const e = -Math.floor(Math.log2(amax)); // up to 1074 for subnormals: scale in two exact steps
    const s1 = 2 ** Math.min(e, 1000);
    const s2 = 2 ** (e - Math.min(e, 1000));
    const sa: CMatrix = { rows: n, cols: n, data: a.data.map((x) => x * s1 * s2) };
    const sw = r.values.map((x) => x * s1 * s2);
    expectBelow(`property n=${n} balance=${balance} residual`, eigResidual(sa, sw, r.vectors!), RES_TOL);
    expectBelow(`property n=${n} unit norms`, unitNormError(r.vectors!), 1e-14);
    const [tr, ti] = trace(sa);
    let sr = 0;
    let si = 0;
    for (let k = 0; k < n; k++) {
      sr += sw[2 * k]!;
      si += sw[2 * k + 1]!;
    }
    // trace(A) = Σλ (second coefficient of the characteristic polynomial)
    expectBelow(`property n=${n} trace`, Math.hypot(tr - sr, ti - si), 1e-13 * n * fro(sa));
  }

  const matrixOf = (entry: fc.Arbitrary<number>): fc.Arbitrary<CMatrix> =>
    fc.integer({ min: 1, max: 12 }).chain((n) =>
      fc.array(entry, { minLength: 2 * n * n, maxLength: 2 * n * n }).map((xs): CMatrix => ({ rows: n, cols: n, data: Float64Array.from(xs) })),
    );

  it('property: n = 1…12, entries 0 or 1e-4…10 in modulus: residual bound and trace = Σλ, balanced or not', () => {
    // a tenth of the entries are exactly 0, so the permutation part of balancing is exercised
    const entry = fc
      .tuple(fc.double({ min: 1e-4, max: 10, noNaN: true }), fc.boolean(), fc.nat(9))
      .map(([x, neg, z]) => (z === 0 ? 0 : neg ? -x : x));
    fc.assert(
      fc.property(matrixOf(entry), fc.boolean(), (a, balance) => checkProperty(a, balance)),
      { numRuns: 300, seed: 20261202 },
    );
  });

  it('property: n = 1…12, any doubles in [−10, 10] (subnormals included), without balancing', () => {
    // Unbalanced QR is backward stable for every finite input. With entries spanning hundreds of
    // orders of magnitude, balancing can pick scalings near 2^±500 that magnify the backward
    // error of individual eigenvectors beyond the bound (James, Langou & Lowery, "On matrix
    // balancing and eigenvector computation", 2014); LAPACK's zgeev returns the same vectors
    // there (checked on this generator's counterexample), so that regime is tested unbalanced.
    const entry = fc.double({ min: -10, max: 10, noNaN: true, noDefaultInfinity: true });
    fc.assert(
      fc.property(matrixOf(entry), (a) => checkProperty(a, false)),
      { numRuns: 300, seed: 20261203 },
    );
  });

  it('wasm and TypeScript backends agree to rounding', () => {
    if (!wasmAvailable()) return;
    const a = randomComplex(120, 120, 101);
    setLinalgBackend('wasm');
    const w = zgeev(a);
    setLinalgBackend('ts');
    const t = zgeev(a);
    setLinalgBackend('auto');
    // same algorithm, different summation order in the kernels: ε·‖A‖·cond differences only
    expectBelow('backends eigenvalues', multisetDistance(w.values, t.values), 1e-11 * fro(a));
  });
});

// ---------------------------------------------------------------------------------------------
// contract: sizes, errors, workspace

describe('zgeev contract', () => {
  it('n = 0 and n = 1', () => {
    const r0 = zgeev(cmatrix(0, 0));
    expect(r0.n).toBe(0);
    expect(r0.values.length).toBe(0);
    expect(r0.vectors!.rows).toBe(0);
    const r1 = zgeev(fromRows([[[3, -4]]]));
    // a 1×1 matrix is its own eigenvalue with eigenvector (1)
    expect(Array.from(r1.values)).toEqual([3, -4]);
    expect(Array.from(r1.vectors!.data)).toEqual([1, 0]);
    expect(zgeev(fromRows([[[3, -4]]]), { vectors: false }).vectors).toBeNull();
  });

  it('2×2 with known eigenpairs; largest component of each vector is real and positive', () => {
    // [[2, 1], [0, 3]]: λ = 2 with (1, 0), λ = 3 with (1, 1)/√2 (direct computation)
    const a = fromRows([[2, 1], [0, 3]]);
    const r = zgeev(a);
    expect(Array.from(r.values)).toEqual([2, 0, 3, 0]);
    const v = r.vectors!.data;
    expect(v[0]).toBe(1);
    expect(Math.abs(v[2]! - Math.SQRT1_2)).toBeLessThan(1e-15);
    expect(Math.abs(v[6]! - Math.SQRT1_2)).toBeLessThan(1e-15);
    for (const k of [1, 3, 5, 7]) expect(Math.abs(v[k]!)).toBeLessThan(1e-15);
  });

  it('does not modify its input', () => {
    const a = randomComplex(30, 30, 111);
    const before = Float64Array.from(a.data);
    zgeev(a);
    expect(Array.from(a.data)).toEqual(Array.from(before));
  });

  it('throws LinalgError non-finite on NaN or Infinity, naming zgeev and n', () => {
    for (const bad of [NaN, Infinity, -Infinity]) {
      const a = randomComplex(4, 4, 121);
      a.data[5] = bad;
      let err: unknown;
      try {
        zgeev(a);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(LinalgError);
      expect((err as LinalgError).code).toBe('non-finite');
      expect((err as LinalgError).message).toMatch(/zgeev \(n = 4\)/);
    }
  });

  it('throws LinalgError shape on a non-square matrix or a workspace of another size', () => {
    expect(() => zgeev(cmatrix(3, 4))).toThrowError(expect.objectContaining({ code: 'shape', kernel: 'zgeev' }));
    expect(() => zgeev(randomComplex(5, 5, 1), {}, new ZgeevWorkspace(6))).toThrowError(
      expect.objectContaining({ code: 'shape', kernel: 'zgeev' }),
    );
  });

  it('a reused workspace gives exactly the results of fresh calls, and earlier results stay intact', () => {
    const n = 70;
    const ws = new ZgeevWorkspace(n);
    const a1 = randomComplex(n, n, 131);
    const a2 = randomHermitian(n, 132);
    const r1 = zgeev(a1, {}, ws);
    const r1copy = { values: Float64Array.from(r1.values), vectors: Float64Array.from(r1.vectors!.data) };
    const r2 = zgeev(a2, {}, ws);
    const r2v = zgeev(a2, { vectors: false }, ws);
    const f1 = zgeev(a1);
    const f2 = zgeev(a2);
    // deterministic arithmetic: bit-for-bit equal
    expect(Array.from(r1.values)).toEqual(Array.from(f1.values));
    expect(Array.from(r1.vectors!.data)).toEqual(Array.from(f1.vectors!.data));
    expect(Array.from(r2.values)).toEqual(Array.from(f2.values));
    expect(Array.from(r2.vectors!.data)).toEqual(Array.from(f2.vectors!.data));
    expect(Array.from(r2v.values)).toEqual(Array.from(zgeev(a2, { vectors: false }).values));
    // results are fresh arrays, not views of the workspace
    expect(Array.from(r1.values)).toEqual(Array.from(r1copy.values));
    expect(Array.from(r1.vectors!.data)).toEqual(Array.from(r1copy.vectors));
  });

  it('zhseqr stops at its iteration cap instead of looping when no subdiagonal can deflate', () => {
    // A NaN in H makes every deflation test false (kernels trust their input; zgeev rejects
    // NaN before this). The kernel must still return, reporting the unconverged row.
    const n = 6;
    const h = new Float64Array(2 * n * n);
    for (let i = 0; i < n; i++) {
      h[2 * (i * n + i)] = i;
      if (i > 0) h[2 * (i * n + i - 1)] = 1;
    }
    h[2 * (3 * n + 2)] = NaN;
    const info = zhseqr(n, 0, n - 1, h, true, null, new Float64Array(2 * n), new Float64Array(n), new Float64Array(2 * n), null);
    expect(info).toBeGreaterThan(0);
  });
});

// ---------------------------------------------------------------------------------------------
// kernels

describe('kernels', () => {
  it('zgehrd + zunghr: Q unitary, QᴴAQ Hessenberg and equal to H (blocked and unblocked)', () => {
    for (const [n, blocked] of [[12, false], [150, false], [150, true]] as const) {
      const a = randomComplex(n, n, 141);
      const h = new Float64Array(a.data);
      const vs = new Float64Array(2 * n * n);
      const tau = new Float64Array(2 * n);
      const work = new Float64Array(Math.max(zgehrdWorkLength(n), zunghrWorkLength(n)));
      zgehrd(n, 0, n - 1, h, vs, tau, work, blocked ? new Float64Array(2 * n * n) : undefined);
      const q = new Float64Array(2 * n * n);
      zunghr(n, 0, n - 1, vs, tau, q, work);
      const Q: CMatrix = { rows: n, cols: n, data: q };
      const H: CMatrix = { rows: n, cols: n, data: h };
      let below = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < i - 1; j++) below = Math.max(below, Math.abs(h[2 * (i * n + j)]!) + Math.abs(h[2 * (i * n + j) + 1]!));
      // exact zeros below the subdiagonal (zgehrd contract)
      expect(below).toBe(0);
      // A·Q = Q·H within ε·n·‖A‖ (backward stability of Householder reduction, GVL §7.4.3)
      const aq = naiveMul(a, Q);
      const qh = naiveMul(Q, H);
      let diff = 0;
      for (let k = 0; k < aq.data.length; k++) diff = Math.max(diff, Math.abs(aq.data[k]! - qh.data[k]!));
      expectBelow(`zgehrd n=${n} blocked=${blocked} A·Q − Q·H`, diff, 1e-13 * fro(a));
      // QᴴQ = I
      let orth = 0;
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          let sr = 0;
          let si = 0;
          for (let k = 0; k < n; k++) {
            const xr = q[2 * (k * n + i)]!;
            const xi = -q[2 * (k * n + i) + 1]!;
            const yr = q[2 * (k * n + j)]!;
            const yi = q[2 * (k * n + j) + 1]!;
            sr += xr * yr - xi * yi;
            si += xr * yi + xi * yr;
          }
          orth = Math.max(orth, Math.hypot(sr - (i === j ? 1 : 0), si));
        }
      }
      expectBelow(`zunghr n=${n} ‖QᴴQ − I‖max`, orth, 1e-13);
    }
  });

  it('zhseqr: T = ZᴴHZ upper triangular with Z unitary, with and without early deflation', () => {
    for (const [n, early] of [[90, false], [90, true]] as const) {
      const a = randomComplex(n, n, 151);
      const sc = new QrScratch(n);
      const h = sc.h;
      h.set(a.data);
      const vs = new Float64Array(2 * n * n);
      const tau = new Float64Array(2 * n);
      const work = new Float64Array(Math.max(zgehrdWorkLength(n), zunghrWorkLength(n)));
      zgehrd(n, 0, n - 1, h, vs, tau, work);
      zunghr(n, 0, n - 1, vs, tau, sc.z, work);
      const w = new Float64Array(2 * n);
      const info = zhseqr(n, 0, n - 1, h, true, sc.z, w, new Float64Array(n), new Float64Array(2 * n), early ? sc : null);
      expect(info).toBe(0);
      let below = 0;
      for (let i = 0; i < n; i++) for (let j = 0; j < i; j++) below = Math.max(below, Math.abs(h[2 * (i * n + j)]!) + Math.abs(h[2 * (i * n + j) + 1]!));
      // the Schur form is exactly triangular (deflated entries are set to 0)
      expect(below).toBe(0);
      // A·Z = Z·T (Schur decomposition, GVL Thm 7.1.3) to backward-stable accuracy
      const Z: CMatrix = { rows: n, cols: n, data: sc.z };
      const T: CMatrix = { rows: n, cols: n, data: h };
      const az = naiveMul(a, Z);
      const zt = naiveMul(Z, T);
      let diff = 0;
      for (let k = 0; k < az.data.length; k++) diff = Math.max(diff, Math.abs(az.data[k]! - zt.data[k]!));
      expectBelow(`zhseqr n=${n} early=${early} A·Z − Z·T`, diff, 1e-12 * fro(a));
      for (let k = 0; k < n; k++) {
        expect(w[2 * k]).toBe(h[2 * (k * n + k)]);
        expect(w[2 * k + 1]).toBe(h[2 * (k * n + k) + 1]);
      }
    }
  });
});
