/**
 * zheev (Hermitian eigensolver) and its kernels zhetrd / zsteqr.
 *
 * Every expected value names its source beside it. Bounds of the form 1e-12 on relative
 * residuals and orthonormality are what a backward-stable method delivers (O(n·ε) with
 * ε ≈ 1.1e-16, GVL 4th ed. §8.3.6) with two orders of margin at n = 201.
 */
import fc from 'fast-check';
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { describe, expect, it } from 'vitest';
import { cmatrix, conjTranspose, fromRows, identity, type CMatrix } from '../../src/linalg/cmatrix.ts';
import { LinalgError } from '../../src/linalg/errors.ts';
import { isHermitian, zheev, ZheevWorkspace, type ZheevResult } from '../../src/linalg/zheev.ts';
import { zhetrdBackTransform, zhetrdBase } from '../../src/linalg/zhetrd.ts';
import { zsteqrBase } from '../../src/linalg/zsteqr.ts';
import { diffNorm, eigResidual, fro, naiveMul, randomComplex, randomHermitian, rng } from './util.ts';

const TOL = 1e-12;

// ---------------------------------------------------------------------------------------------
// helpers

function expectAtMost(label: string, actual: number, bound: number): void {
  expect(actual, `${label}: actual ${actual}, expected ≤ ${bound}`).toBeLessThanOrEqual(bound);
}

/** Relative residual ‖AV − VΛ‖_F/(‖A‖_F‖V‖_F); for A = 0 the absolute residual. */
function residual(a: CMatrix, r: ZheevResult): number {
  const n = a.rows;
  const w = new Float64Array(2 * n);
  for (let i = 0; i < n; i++) w[2 * i] = r.values[i]!;
  if (fro(a) === 0) {
    // eigResidual divides by ‖A‖; here AV = 0 so VΛ itself must vanish.
    let s = 0;
    for (const x of r.values) s += x * x;
    return Math.sqrt(s);
  }
  return eigResidual(a, w, r.vectors!);
}

/** ‖VᴴV − I‖_F. */
function orthoError(v: CMatrix): number {
  return diffNorm(naiveMul(conjTranspose(v), v), identity(v.rows));
}

/** Largest i with values[i] < values[i−1], or −1 when ascending. */
function firstDescent(values: Float64Array): number {
  for (let i = 1; i < values.length; i++) if (values[i]! < values[i - 1]!) return i;
  return -1;
}

/** The standard checks on a full decomposition. */
function checkDecomposition(label: string, a: CMatrix, tol = TOL): ZheevResult {
  const r = zheev(a);
  const n = a.rows;
  expect(r.n).toBe(n);
  expect(r.values.length).toBe(n);
  expect(r.vectors!.rows).toBe(n);
  expect(r.vectors!.cols).toBe(n);
  expect(firstDescent(r.values), `${label}: eigenvalues not ascending at index shown`).toBe(-1);
  expectAtMost(`${label} residual ‖AV−VΛ‖/(‖A‖‖V‖)`, residual(a, r), tol);
  expectAtMost(`${label} orthonormality ‖VᴴV−I‖_F`, orthoError(r.vectors!), tol);
  return r;
}

/** Max |values[i] − expected[i]| / scale. */
function maxRelDiff(values: Float64Array, expected: ArrayLike<number>, scale: number): number {
  expect(values.length).toBe(expected.length);
  let m = 0;
  for (let i = 0; i < values.length; i++) m = Math.max(m, Math.abs(values[i]! - expected[i]!));
  return m / scale;
}

/** Make a numerically Hermitian matrix exactly Hermitian: (M + Mᴴ)/2. */
function hermitianPart(m: CMatrix): CMatrix {
  const n = m.rows;
  const h = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      const ij = 2 * (i * n + j);
      const ji = 2 * (j * n + i);
      h.data[ij] = 0.5 * (m.data[ij]! + m.data[ji]!);
      h.data[ij + 1] = 0.5 * (m.data[ij + 1]! - m.data[ji + 1]!);
    }
  }
  return h;
}

/** Random unitary: Q of the QR factorization of a random complex matrix (Gram–Schmidt, twice). */
function randomUnitary(n: number, seed: number): CMatrix {
  const g = randomComplex(n, n, seed);
  const q = cmatrix(n, n);
  const col = new Float64Array(2 * n);
  for (let j = 0; j < n; j++) {
    for (let i = 0; i < n; i++) {
      col[2 * i] = g.data[2 * (i * n + j)]!;
      col[2 * i + 1] = g.data[2 * (i * n + j) + 1]!;
    }
    for (let pass = 0; pass < 2; pass++) {
      for (let k = 0; k < j; k++) {
        let sr = 0;
        let si = 0; // qₖᴴ·col
        for (let i = 0; i < n; i++) {
          const qr = q.data[2 * (i * n + k)]!;
          const qi = q.data[2 * (i * n + k) + 1]!;
          sr += qr * col[2 * i]! + qi * col[2 * i + 1]!;
          si += qr * col[2 * i + 1]! - qi * col[2 * i]!;
        }
        for (let i = 0; i < n; i++) {
          const qr = q.data[2 * (i * n + k)]!;
          const qi = q.data[2 * (i * n + k) + 1]!;
          col[2 * i] -= qr * sr - qi * si;
          col[2 * i + 1] -= qr * si + qi * sr;
        }
      }
    }
    let nrm = 0;
    for (let i = 0; i < 2 * n; i++) nrm += col[i]! * col[i]!;
    nrm = Math.sqrt(nrm);
    for (let i = 0; i < n; i++) {
      q.data[2 * (i * n + j)] = col[2 * i]! / nrm;
      q.data[2 * (i * n + j) + 1] = col[2 * i + 1]! / nrm;
    }
  }
  return q;
}

/** U·diag(dv)·Uᴴ, symmetrized. */
function withSpectrum(dv: readonly number[], seed: number): CMatrix {
  const n = dv.length;
  const u = randomUnitary(n, seed);
  const ud = cmatrix(n, n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j < n; j++) {
      ud.data[2 * (i * n + j)] = u.data[2 * (i * n + j)]! * dv[j]!;
      ud.data[2 * (i * n + j) + 1] = u.data[2 * (i * n + j) + 1]! * dv[j]!;
    }
  }
  return hermitianPart(naiveMul(ud, conjTranspose(u)));
}

function scaled(a: CMatrix, s: number): CMatrix {
  const b = cmatrix(a.rows, a.cols);
  for (let k = 0; k < a.data.length; k++) b.data[k] = a.data[k]! * s;
  return b;
}

function trace(a: CMatrix): number {
  let t = 0;
  for (let i = 0; i < a.rows; i++) t += a.data[2 * (i * a.cols + i)]!;
  return t;
}

function sortedCopy(xs: readonly number[]): number[] {
  return [...xs].sort((x, y) => x - y);
}

// ---------------------------------------------------------------------------------------------

describe('zheev: residual and orthonormality', () => {
  for (const n of [2, 3, 4, 7, 16, 21, 51, 101, 201]) {
    it(`random Hermitian n = ${n}`, () => {
      const a = randomHermitian(n, 1000 + n);
      const r = checkDecomposition(`random Hermitian n=${n}`, a);
      // trace = Σλ (the trace is a similarity invariant)
      expectAtMost(`random Hermitian n=${n} |tr A − Σλ|/‖A‖_F`, Math.abs(trace(a) - r.values.reduce((s, x) => s + x, 0)) / fro(a), TOL);
    });
  }

  it('real symmetric n = 40, and eigenvalues agree with ml-matrix EigenvalueDecomposition', () => {
    const n = 40;
    const r0 = rng(77);
    const rows: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
    for (let i = 0; i < n; i++) for (let j = 0; j <= i; j++) rows[i]![j] = rows[j]![i] = 2 * r0() - 1;
    const a = fromRows(rows);
    const r = checkDecomposition('real symmetric n=40', a);
    // reference: ml-matrix's independent real symmetric solver (tred2/tql2 lineage)
    const ref = sortedCopy(new EigenvalueDecomposition(new Matrix(rows), { assumeSymmetric: true }).realEigenvalues);
    const scale = Math.max(...ref.map(Math.abs));
    expectAtMost('real symmetric n=40 max|λ − λ_ml-matrix|/max|λ|', maxRelDiff(r.values, ref, scale), TOL);
  });

  it('diagonal matrix: eigenvalues are exactly the sorted diagonal, vectors are unit vectors', () => {
    // source: a diagonal matrix is its own eigen-decomposition
    const diag = [3, -1, 0, 2.5, -1, 7, 1e-3, -4];
    const n = diag.length;
    const a = cmatrix(n, n);
    diag.forEach((x, i) => (a.data[2 * (i * n + i)] = x));
    const r = checkDecomposition('diagonal', a, 0);
    expect(Array.from(r.values), 'diagonal: eigenvalues vs sorted diagonal (exact)').toEqual(sortedCopy(diag));
    // every column has exactly one entry of modulus 1, in a row whose diagonal is that eigenvalue
    for (let j = 0; j < n; j++) {
      let hits = 0;
      for (let i = 0; i < n; i++) {
        const m = Math.hypot(r.vectors!.data[2 * (i * n + j)]!, r.vectors!.data[2 * (i * n + j) + 1]!);
        if (m !== 0) {
          hits++;
          expect(m, `diagonal: |V[${i},${j}]|`).toBe(1);
          expect(diag[i], `diagonal: row of the unit entry in column ${j}`).toBe(r.values[j]);
        }
      }
      expect(hits, `diagonal: nonzeros in column ${j}`).toBe(1);
    }
  });

  it('zero matrix and identity', () => {
    // source: every vector is an eigenvector; the eigenvalues are 0 (resp. 1) n times
    const z = checkDecomposition('zero 6×6', cmatrix(6, 6), 0);
    expect(Array.from(z.values)).toEqual([0, 0, 0, 0, 0, 0]);
    const id = checkDecomposition('identity 6×6', identity(6), 0);
    expect(Array.from(id.values)).toEqual([1, 1, 1, 1, 1, 1]);
  });

  it('already tridiagonal, complex off-diagonals, n = 60', () => {
    const n = 60;
    const g = rng(5);
    const a = cmatrix(n, n);
    for (let i = 0; i < n; i++) {
      a.data[2 * (i * n + i)] = 2 * g() - 1;
      if (i + 1 < n) {
        const br = 2 * g() - 1;
        const bi = 2 * g() - 1;
        a.data[2 * ((i + 1) * n + i)] = br;
        a.data[2 * ((i + 1) * n + i) + 1] = bi;
        a.data[2 * (i * n + i + 1)] = br;
        a.data[2 * (i * n + i + 1) + 1] = -bi;
      }
    }
    checkDecomposition('complex tridiagonal n=60', a);
  });

  it('exactly repeated eigenvalues: U·diag(1×20, 2×20, −3×20)·Uᴴ, n = 60', () => {
    const dv = [...new Array<number>(20).fill(1), ...new Array<number>(20).fill(2), ...new Array<number>(20).fill(-3)];
    const a = withSpectrum(dv, 11);
    const r = checkDecomposition('repeated 1,2,−3 ×20', a);
    // source: U unitary, so the spectrum of U·D·Uᴴ is D
    expectAtMost('repeated: max|λ − D|/‖D‖∞', maxRelDiff(r.values, sortedCopy(dv), 3), TOL);
  });

  it('nearly repeated eigenvalues: a cluster 1 + k·1e-13 among well-separated ones, n = 40', () => {
    const dv = [
      ...Array.from({ length: 15 }, (_, k) => 1 + k * 1e-13),
      ...Array.from({ length: 25 }, (_, k) => -5 + 0.37 * k),
    ];
    const a = withSpectrum(dv, 12);
    const r = checkDecomposition('cluster 1+k·1e-13', a);
    expectAtMost('cluster: max|λ − D|/‖D‖∞', maxRelDiff(r.values, sortedCopy(dv), 5), TOL);
  });

  it('all eigenvalues equal up to 1e-15 relative (one big cluster), n = 30', () => {
    const dv = Array.from({ length: 30 }, (_, k) => 4 * (1 + ((k % 3) - 1) * 1e-15));
    const a = withSpectrum(dv, 13);
    const r = checkDecomposition('near-multiple of I', a);
    expectAtMost('near-multiple of I: max|λ − D|/‖D‖∞', maxRelDiff(r.values, sortedCopy(dv), 4), TOL);
  });

  it('badly scaled: the same matrix times 2^1000, 2^1020, 2^−990, 2^−1000 gives the scaled eigenvalues', () => {
    const n = 25;
    const a = randomHermitian(n, 21);
    const base = zheev(a);
    for (const e of [1000, 1020, -990, -1000]) {
      const s = 2 ** e;
      const r = zheev(scaled(a, s));
      // source: eigenvalues of s·A are s·λ(A); scaling by a power of two is exact in floating point
      const unscaled = r.values.map((x) => x / s);
      expectAtMost(`scaled 2^${e}: max|λ/s − λ(A)|/‖A‖_F`, maxRelDiff(unscaled, base.values, fro(a)), TOL);
      // residual of the unscaled problem with the returned vectors
      expectAtMost(
        `scaled 2^${e} residual`,
        residual(a, { n, values: unscaled, vectors: r.vectors }),
        TOL,
      );
      expectAtMost(`scaled 2^${e} orthonormality`, orthoError(r.vectors!), TOL);
    }
  });

  it('graded: A_ij = g_i g_j R_ij with g spanning 1e-8 … 1e8, both orientations', () => {
    const n = 30;
    const rr = randomHermitian(n, 31);
    for (const dir of [1, -1]) {
      const a = cmatrix(n, n);
      for (let i = 0; i < n; i++) {
        for (let j = 0; j < n; j++) {
          const gi = 10 ** (dir * (-8 + (16 * i) / (n - 1)));
          const gj = 10 ** (dir * (-8 + (16 * j) / (n - 1)));
          a.data[2 * (i * n + j)] = gi * gj * rr.data[2 * (i * n + j)]!;
          a.data[2 * (i * n + j) + 1] = gi * gj * rr.data[2 * (i * n + j) + 1]!;
        }
      }
      checkDecomposition(`graded dir=${dir}`, a);
    }
  });

  it('tiny couplings next to O(1) entries (squares underflow): entries 1e-170 off the diagonal', () => {
    const n = 12;
    const a = randomHermitian(n, 41);
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        if (Math.abs(i - j) > 1) {
          a.data[2 * (i * n + j)]! *= 1e-170;
          a.data[2 * (i * n + j) + 1]! *= 1e-170;
        }
      }
    }
    checkDecomposition('tiny couplings', a);
  });
});

describe('zheev: known spectra', () => {
  it('Hermitian tridiagonal Toeplitz (a, b, conj b): λ_k = a + 2|b|cos(kπ/(n+1))', () => {
    // source: closed form for tridiagonal Toeplitz matrices, Böttcher & Grudsky, Spectral
    // Properties of Banded Toeplitz Matrices (SIAM 2005), §2.2; G. D. Smith, Numerical Solution
    // of Partial Differential Equations, 3rd ed. (1985), p. 59.
    const n = 50;
    const ad = 2.5;
    const br = 0.3;
    const bi = 0.4; // |b| = 0.5
    const a = cmatrix(n, n);
    for (let i = 0; i < n; i++) {
      a.data[2 * (i * n + i)] = ad;
      if (i + 1 < n) {
        a.data[2 * ((i + 1) * n + i)] = br; // sub-diagonal b
        a.data[2 * ((i + 1) * n + i) + 1] = bi;
        a.data[2 * (i * n + i + 1)] = br; // super-diagonal conj(b)
        a.data[2 * (i * n + i + 1) + 1] = -bi;
      }
    }
    const r = checkDecomposition('Toeplitz (2.5, 0.3+0.4i)', a);
    const expected = sortedCopy(Array.from({ length: n }, (_, k) => ad + 2 * 0.5 * Math.cos(((k + 1) * Math.PI) / (n + 1))));
    expectAtMost('Toeplitz: max|λ − closed form|/(|a|+2|b|)', maxRelDiff(r.values, expected, ad + 1), TOL);
  });

  it('discrete Laplacian tridiag(−1, 2, −1), n = 100: λ_k = 4 sin²(kπ/(2(n+1))), v_k(j) ∝ sin(jkπ/(n+1))', () => {
    // source: R. J. LeVeque, Finite Difference Methods for ODEs and PDEs (SIAM 2007), §2.10
    const n = 100;
    const a = cmatrix(n, n);
    for (let i = 0; i < n; i++) {
      a.data[2 * (i * n + i)] = 2;
      if (i + 1 < n) {
        a.data[2 * ((i + 1) * n + i)] = -1;
        a.data[2 * (i * n + i + 1)] = -1;
      }
    }
    const r = checkDecomposition('Laplacian n=100', a);
    const expected = Array.from({ length: n }, (_, k) => 4 * Math.sin(((k + 1) * Math.PI) / (2 * (n + 1))) ** 2);
    expectAtMost('Laplacian: max|λ − closed form|/4', maxRelDiff(r.values, expected, 4), TOL);
    // Eigenvectors are unique up to a unit phase for these simple eigenvalues; the smallest gap is
    // ≈ 3π²/(n+1)² ≈ 2.9e-3, so perturbation theory (GVL Thm. 8.1.12) bounds the angle by about
    // ε·‖A‖/gap ≈ 1e-13: |⟨v_exact, v_k⟩| = 1 to 1e-11.
    const v = r.vectors!;
    const norm = Math.sqrt((n + 1) / 2);
    let worst = 0;
    for (let k = 0; k < n; k++) {
      let sr = 0;
      let si = 0;
      for (let j = 0; j < n; j++) {
        const ex = Math.sin(((j + 1) * (k + 1) * Math.PI) / (n + 1)) / norm;
        sr += ex * v.data[2 * (j * n + k)]!;
        si += ex * v.data[2 * (j * n + k) + 1]!;
      }
      worst = Math.max(worst, Math.abs(1 - Math.hypot(sr, si)));
    }
    expectAtMost('Laplacian: max_k |1 − |⟨v_exact, v_k⟩||', worst, 1e-11);
  });

  it('U·D·Uᴴ with chosen D (distinct, mixed signs), n = 45', () => {
    const dv = Array.from({ length: 45 }, (_, k) => (k % 2 === 0 ? 1 : -1) * (0.1 + 0.23 * k));
    const a = withSpectrum(dv, 14);
    const r = checkDecomposition('U·D·Uᴴ', a);
    // source: unitary similarity preserves the spectrum
    const scale = Math.max(...dv.map(Math.abs));
    expectAtMost('U·D·Uᴴ: max|λ − D|/‖D‖∞', maxRelDiff(r.values, sortedCopy(dv), scale), TOL);
  });

  it('2×2 [[2, −i], [i, 2]]: λ = 1, 3 (characteristic polynomial (2−λ)² − 1)', () => {
    const a = fromRows([
      [2, [0, -1]],
      [[0, 1], 2],
    ]);
    const r = checkDecomposition('2×2', a);
    expectAtMost('2×2 eigenvalues', maxRelDiff(r.values, [1, 3], 3), 1e-15);
  });
});

describe('zheev: property (fast-check)', () => {
  it('random Hermitian n = 1 … 12: ascending, residual, orthonormality, trace = Σλ, values-only agrees', () => {
    const arb = fc.integer({ min: 1, max: 12 }).chain((n) =>
      fc.tuple(
        fc.constant(n),
        fc.array(fc.double({ min: -1, max: 1, noNaN: true }), { minLength: 2 * n * n, maxLength: 2 * n * n }),
      ),
    );
    fc.assert(
      fc.property(arb, ([n, xs]) => {
        const a = cmatrix(n, n);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j <= i; j++) {
            const re = xs[2 * (i * n + j)]!;
            const im = i === j ? 0 : xs[2 * (i * n + j) + 1]!;
            a.data[2 * (i * n + j)] = re;
            a.data[2 * (i * n + j) + 1] = im;
            a.data[2 * (j * n + i)] = re;
            a.data[2 * (j * n + i) + 1] = -im;
          }
        }
        const r = checkDecomposition(`fast-check n=${n}`, a);
        const sum = r.values.reduce((s, x) => s + x, 0);
        // source: trace is invariant under similarity
        expectAtMost(`fast-check n=${n} |tr A − Σλ|`, Math.abs(trace(a) - sum), TOL * Math.max(1, fro(a)));
        const vo = zheev(a, { vectors: false });
        expect(vo.vectors).toBeNull();
        // same QL recurrences with or without the rotations applied: identical values
        expect(Array.from(vo.values), `fast-check n=${n}: values-only vs full`).toEqual(Array.from(r.values));
      }),
      { numRuns: 300, seed: 20240607 },
    );
  });
});

describe('zheev: property over magnitudes (fast-check)', () => {
  it('entries mixing O(1), 1e-150, subnormal and zero, times 2^e for e in −600 … 1000', () => {
    // Residual and orthonormality are judged on the matrix divided by 2^e again (exact), so the
    // bounds are the same as for O(1) input: scaling must not cost accuracy.
    const entry = fc.oneof(
      fc.double({ min: -1, max: 1, noNaN: true }),
      fc.double({ min: -1e-150, max: 1e-150, noNaN: true }),
      fc.constantFrom(0, 5e-324, -1e-310, 1e-200, 1e-160),
    );
    const arb = fc.integer({ min: 1, max: 10 }).chain((n) =>
      fc.tuple(
        fc.constant(n),
        fc.array(entry, { minLength: 2 * n * n, maxLength: 2 * n * n }),
        fc.integer({ min: -600, max: 1000 }),
      ),
    );
    fc.assert(
      fc.property(arb, ([n, xs, ex]) => {
        const s = 2 ** ex;
        const a = cmatrix(n, n);
        for (let i = 0; i < n; i++) {
          for (let j = 0; j <= i; j++) {
            const re = xs[2 * (i * n + j)]! * s;
            const im = i === j ? 0 : xs[2 * (i * n + j) + 1]! * s;
            a.data[2 * (i * n + j)] = re;
            a.data[2 * (i * n + j) + 1] = im;
            a.data[2 * (j * n + i)] = re;
            a.data[2 * (j * n + i) + 1] = -im;
          }
        }
        let amax = 0;
        for (const x of a.data) amax = Math.max(amax, Math.abs(x));
        // A matrix made only of subnormals is itself known to a few bits; skip it.
        fc.pre(amax === 0 || amax > 1e-290);
        const r = zheev(a);
        expect(firstDescent(r.values), `magnitudes n=${n} e=${ex}: ascending`).toBe(-1);
        const b = scaled(a, 1 / s);
        const values = r.values.map((x) => x / s);
        expectAtMost(`magnitudes n=${n} e=${ex} residual`, residual(b, { n, values, vectors: r.vectors }), TOL);
        expectAtMost(`magnitudes n=${n} e=${ex} orthonormality`, orthoError(r.vectors!), TOL);
      }),
      { numRuns: 400, seed: 424242 },
    );
  });
});

describe('zheev: contract', () => {
  it('reads only the lower triangle; ignores imaginary parts of the diagonal; does not modify input', () => {
    const n = 9;
    const a = randomHermitian(n, 51);
    const b = cmatrix(n, n);
    b.data.set(a.data);
    const g = rng(52);
    for (let i = 0; i < n; i++) {
      b.data[2 * (i * n + i) + 1] = 5 * g(); // imaginary diagonal: ignored
      for (let j = i + 1; j < n; j++) {
        b.data[2 * (i * n + j)] = 100 * g(); // upper triangle: garbage, ignored
        b.data[2 * (i * n + j) + 1] = 100 * g();
      }
    }
    const before = b.data.slice();
    const ra = zheev(a);
    const rb = zheev(b);
    expect(Array.from(rb.values)).toEqual(Array.from(ra.values));
    expect(Array.from(rb.vectors!.data)).toEqual(Array.from(ra.vectors!.data));
    expect(Array.from(b.data), 'input unchanged').toEqual(Array.from(before));
  });

  it('n = 0 and n = 1', () => {
    const r0 = zheev(cmatrix(0, 0));
    expect(r0.n).toBe(0);
    expect(r0.values.length).toBe(0);
    expect(r0.vectors!.rows).toBe(0);
    expect(zheev(cmatrix(0, 0), { vectors: false }).vectors).toBeNull();
    // source: a 1×1 Hermitian matrix [a] has eigenvalue Re a, eigenvector [1]
    const r1 = zheev(fromRows([[[-2.75, 0]]]));
    expect(Array.from(r1.values)).toEqual([-2.75]);
    expect(Array.from(r1.vectors!.data)).toEqual([1, 0]);
  });

  it('workspace reuse gives bit-identical results; results are fresh arrays', () => {
    const n = 33;
    const ws = new ZheevWorkspace(n);
    const a = randomHermitian(n, 61);
    const other = randomHermitian(n, 62);
    const fresh = zheev(a);
    const first = zheev(a, {}, ws);
    zheev(other, { vectors: true }, ws);
    zheev(other, { vectors: false }, ws);
    const again = zheev(a, undefined, ws);
    for (const r of [first, again]) {
      expect(Array.from(r.values)).toEqual(Array.from(fresh.values));
      expect(Array.from(r.vectors!.data)).toEqual(Array.from(fresh.vectors!.data));
    }
    expect(again.values).not.toBe(first.values);
    expect(again.vectors!.data).not.toBe(first.vectors!.data);
  });

  function caught(f: () => unknown): LinalgError {
    try {
      f();
    } catch (err) {
      expect(err).toBeInstanceOf(LinalgError);
      return err as LinalgError;
    }
    throw new Error('expected a LinalgError, nothing was thrown');
  }

  it('errors: non-finite, shape, workspace size', () => {
    for (const bad of [NaN, Infinity, -Infinity]) {
      const a = randomHermitian(4, 71);
      a.data[2 * (3 * 4 + 0) + 1] = bad; // lower triangle
      const e = caught(() => zheev(a));
      expect(e.code, `entry ${bad}`).toBe('non-finite');
      expect(e.kernel).toBe('zheev');
      expect(e.n).toBe(4);
      expect(e.message).toMatch(/^zheev \(n = 4\)/);
    }
    const up = randomHermitian(4, 72);
    up.data[2 * (0 * 4 + 3)] = NaN; // upper triangle is checked too
    expect(caught(() => zheev(up)).code).toBe('non-finite');

    const rect = caught(() => zheev(cmatrix(3, 4)));
    expect(rect.code).toBe('shape');
    expect(rect.message).toMatch(/^zheev \(n = 3\).*3×4/);
    const ws = caught(() => zheev(randomHermitian(5, 73), {}, new ZheevWorkspace(6)));
    expect(ws.code).toBe('shape');
    expect(caught(() => new ZheevWorkspace(-1)).code).toBe('shape');
  });
});

describe('zheev: kernels', () => {
  it('zhetrd: Q·T·Qᴴ reproduces A (T real tridiagonal, e ≥ 0)', () => {
    const n = 17;
    const a = randomHermitian(n, 81);
    const A = a.data.slice();
    const d = new Float64Array(n);
    const e = new Float64Array(n);
    const tau = new Float64Array(n);
    const ph = new Float64Array(2 * n);
    zhetrdBase(n, A, d, e, tau, ph, new Float64Array(2 * n));
    for (let k = 0; k < n - 1; k++) expect(e[k], `e[${k}] ≥ 0`).toBeGreaterThanOrEqual(0);
    // Q = H₀⋯H_{n−2}·D, built column by column from the identity through the back-transform
    // (zheev's path), then compared entrywise: ‖Q·T·Qᴴ − A‖_F/‖A‖_F.
    const ws = new ZheevWorkspace(n);
    const y = new Float64Array(n * n);
    for (let i = 0; i < n; i++) y[i * n + i] = 1;
    const q = cmatrix(n, n);
    zhetrdBackTransform(n, A, tau, ph, y, q.data, ws.bt);
    const t = cmatrix(n, n);
    for (let i = 0; i < n; i++) {
      t.data[2 * (i * n + i)] = d[i]!;
      if (i + 1 < n) {
        t.data[2 * ((i + 1) * n + i)] = e[i]!;
        t.data[2 * (i * n + i + 1)] = e[i]!;
      }
    }
    const back = naiveMul(naiveMul(q, t), conjTranspose(q));
    expectAtMost('zhetrd ‖QTQᴴ − A‖/‖A‖', diffNorm(back, a) / fro(a), TOL);
    expectAtMost('zhetrd ‖QᴴQ − I‖', orthoError(q), TOL);
  });

  function tridiagCheck(label: string, d0: number[], e0: number[]): void {
    const n = d0.length;
    const d = Float64Array.from(d0);
    const e = Float64Array.from([...e0, 0]);
    const y = new Float64Array(n * n);
    for (let i = 0; i < n; i++) y[i * n + i] = 1;
    expect(zsteqrBase(n, d, e, y, new Float64Array(2 * n)), `${label}: unconverged count`).toBe(0);
    expect(firstDescent(d), `${label}: ascending`).toBe(-1);
    // ‖T·Y − Y·Λ‖_F/‖T‖_F and ‖YᵀY − I‖_F
    let tn = 0;
    for (let i = 0; i < n; i++) tn += d0[i]! ** 2 + (i + 1 < n ? 2 * e0[i]! ** 2 : 0);
    let res = 0;
    let orth = 0;
    for (let i = 0; i < n; i++) {
      for (let j = 0; j < n; j++) {
        let ty = d0[i]! * y[i * n + j]!;
        if (i > 0) ty += e0[i - 1]! * y[(i - 1) * n + j]!;
        if (i + 1 < n) ty += e0[i]! * y[(i + 1) * n + j]!;
        res += (ty - y[i * n + j]! * d[j]!) ** 2;
        let g = 0;
        for (let k = 0; k < n; k++) g += y[k * n + i]! * y[k * n + j]!;
        orth += (g - (i === j ? 1 : 0)) ** 2;
      }
    }
    expectAtMost(`${label}: ‖TY − YΛ‖/‖T‖`, Math.sqrt(res / tn), TOL);
    expectAtMost(`${label}: ‖YᵀY − I‖`, Math.sqrt(orth), TOL);
  }

  it('zsteqr: graded tridiagonals in both orientations (QL and QR sweeps), and a split one', () => {
    const n = 24;
    const up = Array.from({ length: n }, (_, i) => 10 ** (-6 + i / 2));
    const ee = Array.from({ length: n - 1 }, (_, i) => 0.5 * Math.sqrt(up[i]! * up[i + 1]!));
    tridiagCheck('graded increasing (QL)', up, ee);
    tridiagCheck('graded decreasing (QR)', [...up].reverse(), [...ee].reverse());
    const split = Array.from({ length: n - 1 }, (_, i) => (i % 5 === 4 ? 0 : 1 + 0.1 * i));
    tridiagCheck('split blocks', Array.from({ length: n }, (_, i) => Math.cos(i)), split);
  });

  it('zsteqr: reports unconverged off-diagonals when the iteration budget is exhausted', () => {
    const n = 10;
    const d = Float64Array.from({ length: n }, (_, i) => i);
    const e = new Float64Array(n).fill(1);
    // a budget of 0 steps per unit n: nothing can converge, every off-diagonal is left
    expect(zsteqrBase(n, d, e, null, new Float64Array(2 * n), 0)).toBe(n - 1);
  });
});

describe('isHermitian', () => {
  it('accepts Hermitian input, rejects perturbations above the relative tolerance', () => {
    const a = randomHermitian(10, 91);
    expect(isHermitian(a)).toBe(true);
    expect(isHermitian(a, 0)).toBe(true);
    const b = cmatrix(10, 10);
    b.data.set(a.data);
    b.data[2 * (2 * 10 + 7) + 1] += 1e-9; // |a_27 − conj(a_72)| = 1e-9, max entry < 1
    expect(isHermitian(b, 1e-12)).toBe(false);
    expect(isHermitian(b, 1e-8)).toBe(true);
    const c = cmatrix(10, 10);
    c.data.set(a.data);
    c.data[2 * (4 * 10 + 4) + 1] = 1e-3; // complex diagonal
    expect(isHermitian(c)).toBe(false);
    expect(isHermitian(cmatrix(2, 3))).toBe(false);
    const d = cmatrix(3, 3);
    d.data[0] = NaN;
    expect(isHermitian(d)).toBe(false);
    expect(isHermitian(cmatrix(0, 0))).toBe(true);
  });
});
