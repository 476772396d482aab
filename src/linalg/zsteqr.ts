/**
 * Eigenvalues and eigenvectors of a real symmetric tridiagonal matrix T by the implicit QL / QR
 * algorithm with Wilkinson shifts — the zsteqr step of the Hermitian eigensolver (zheev.ts).
 *
 * Method (Golub & Van Loan, Matrix Computations, 4th ed., §8.3.4–8.3.5, Alg. 8.3.2 and 8.3.3;
 * LAPACK Users' Guide, 3rd ed. 1999, routines zsteqr/dsteqr):
 * - T is split wherever an off-diagonal is negligible, |e_i| ≤ ε·√|d_i|·√|d_{i+1}|, and each
 *   unreduced block is iterated on separately.
 * - Each block is scaled into a range where squares of its entries cannot overflow or underflow.
 * - A block whose largest diagonal entry sits at the bottom is iterated with QR steps (chasing
 *   the bulge downwards, deflating at the top), otherwise with QL steps (chasing upwards,
 *   deflating at the bottom): graded matrices then converge from their small end, which keeps
 *   small eigenvalues accurate.
 * - The shift is the eigenvalue of the 2×2 end block closer to its corner entry (Wilkinson); a
 *   2×2 block that splits off is diagonalised directly by one Jacobi rotation (GVL Alg. 8.5.1).
 * - At most 30·n steps in total, after which the caller reports non-convergence.
 *
 * The rotations are real, and here they are accumulated into a **real** matrix Y (T = Y·Λ·Yᵀ):
 * half the memory traffic of rotating complex vectors, and the complex Householder factor is
 * applied once afterwards (zhetrdBackTransform). Y is row-major, so a rotation of columns
 * (i, i+1) touches two adjacent doubles of every row; all rotations of one sweep are saved and
 * then applied row by row, each row carrying one running value through the whole sweep — one
 * load and one store per rotation and row, all unit-stride.
 */

const EPS = 2 ** -53; // unit roundoff
const EPS2 = EPS * EPS;
const SAFMIN = 2 ** -1022; // smallest normal double
const SSFMAX = Math.sqrt(1 / SAFMIN) / 3; // block scaled down to this if larger: no overflow in squares
const SSFMIN = Math.sqrt(SAFMIN) / EPS2; // block scaled up to this if smaller: no harmful underflow
const ROT_LO = 1e-145; // sqrt(g² + f²) is accurate between these; outside, rescale first
const ROT_HI = 1e145;
/** Iteration budget per unit of n (LAPACK's choice). */
export const ZSTEQR_MAXIT = 30;

/**
 * Unchecked in-place kernel.
 *
 * @param n order.
 * @param d in: diagonal of T (length ≥ n); out: eigenvalues in ascending order.
 * @param e in: off-diagonal of T (length ≥ n−1); destroyed.
 * @param y null for eigenvalues only; else n×n real row-major, on entry a matrix Y₀ (the
 *   identity for eigenvectors of T), on exit Y₀·Y with the columns of Y the orthonormal
 *   eigenvectors of T, ordered like d.
 * @param work scratch, length ≥ 2n (rotation cosines and sines of one sweep).
 * @param maxitPerN iteration budget per unit of n (default 30; tests lower it to exercise the
 *   failure report).
 * @returns 0 on success; otherwise the number of off-diagonals that had not converged to zero
 *   within maxitPerN·n QL/QR steps (d and y are then not meaningful).
 * @example
 * // T = tridiag(1, 2, 1) of order 2 has eigenvalues 1 and 3
 * const d = Float64Array.of(2, 2), e = Float64Array.of(1, 0), y = Float64Array.of(1, 0, 0, 1);
 * zsteqrBase(2, d, e, y, new Float64Array(4)); // 0; d = [1, 3], y columns ±(1, −1)/√2, ±(1, 1)/√2
 */
export function zsteqrBase(
  n: number,
  d: Float64Array,
  e: Float64Array,
  y: Float64Array | null,
  work: Float64Array,
  maxitPerN = ZSTEQR_MAXIT,
): number {
  if (n <= 1) return 0;
  const maxit = maxitPerN * n;
  let jtot = 0;
  // cs[i], sn[i] describe the rotation of columns (i, i+1):  x_i ← c·x_i − s·x_{i+1},
  // x_{i+1} ← s·x_i + c·x_{i+1}. Stored in the two halves of `work`.
  const sOff = n;

  let l1 = 0;
  while (l1 < n) {
    if (l1 > 0) e[l1 - 1] = 0;
    // Find the end of the unreduced block starting at l1.
    let m = l1;
    for (; m < n - 1; m++) {
      const tst = Math.abs(e[m]!);
      if (tst === 0) break;
      if (tst <= Math.sqrt(Math.abs(d[m]!)) * Math.sqrt(Math.abs(d[m + 1]!)) * EPS) {
        e[m] = 0;
        break;
      }
    }
    let l = l1;
    const lsv = l;
    let lend = m;
    const lendsv = lend;
    l1 = m + 1;
    if (lend === l) continue; // 1×1 block: already an eigenvalue

    // Scale the block into the safe range.
    let anorm = 0;
    for (let i = l; i <= lend; i++) anorm = Math.max(anorm, Math.abs(d[i]!));
    for (let i = l; i < lend; i++) anorm = Math.max(anorm, Math.abs(e[i]!));
    if (anorm === 0) continue;
    let scale = 1;
    if (anorm > SSFMAX) scale = SSFMAX / anorm;
    else if (anorm < SSFMIN) scale = SSFMIN / anorm;
    if (scale !== 1) {
      for (let i = l; i <= lend; i++) d[i]! *= scale;
      for (let i = l; i < lend; i++) e[i]! *= scale;
    }

    // Iterate from the end with the smaller diagonal entry.
    if (Math.abs(d[lend]!) < Math.abs(d[l]!)) {
      lend = lsv;
      l = lendsv;
    }

    if (lend > l) {
      // ---- QL: deflate at the top (index l), chase from the bottom of the active part up.
      for (;;) {
        let mm = l;
        for (; mm < lend; mm++) {
          const em = e[mm]!;
          if (em * em <= EPS2 * Math.abs(d[mm]! * d[mm + 1]!) + SAFMIN) break;
        }
        if (mm < lend) e[mm] = 0;
        if (mm === l) {
          l++; // d[l] converged
          if (l <= lend) continue;
          break;
        }
        if (mm === l + 1) {
          jacobi2(d, e, l, y, n);
          l += 2;
          if (l <= lend) continue;
          break;
        }
        if (jtot === maxit) break;
        jtot++;
        // Wilkinson shift from the top 2×2 block; g starts as d[mm] − shift.
        const p0 = d[l]!;
        const el = e[l]!;
        let g = (d[l + 1]! - p0) / (2 * el);
        let r = hypotOne(g);
        g = d[mm]! - p0 + el / (g + (g >= 0 ? r : -r));
        let s = 1;
        let c = 1;
        let p = 0;
        for (let i = mm - 1; i >= l; i--) {
          const ei = e[i]!;
          const f = s * ei;
          const b = c * ei;
          // Rotation zeroing f against g: c = g/r, s = f/r, r = √(g² + f²).
          if (f === 0) {
            c = 1;
            s = 0;
            r = g;
          } else if (g === 0) {
            c = 0;
            s = 1;
            r = f;
          } else {
            r = Math.sqrt(g * g + f * f);
            if (!(r > ROT_LO && r < ROT_HI)) r = scaledHypot(g, f);
            c = g / r;
            s = f / r;
          }
          if (i !== mm - 1) e[i + 1] = r;
          g = d[i + 1]! - p;
          r = (d[i]! - g) * s + 2 * c * b;
          p = s * r;
          d[i + 1] = g + p;
          g = c * r - b;
          work[i] = c;
          work[sOff + i] = s;
        }
        if (y !== null) rotateBackward(y, n, l, mm, work, sOff);
        d[l]! -= p;
        e[l] = g;
      }
    } else {
      // ---- QR: deflate at the bottom (index l), chase from the top of the active part down.
      for (;;) {
        let mm = l;
        for (; mm > lend; mm--) {
          const em = e[mm - 1]!;
          if (em * em <= EPS2 * Math.abs(d[mm]! * d[mm - 1]!) + SAFMIN) break;
        }
        if (mm > lend) e[mm - 1] = 0;
        if (mm === l) {
          l--;
          if (l >= lend) continue;
          break;
        }
        if (mm === l - 1) {
          jacobi2(d, e, l - 1, y, n);
          l -= 2;
          if (l >= lend) continue;
          break;
        }
        if (jtot === maxit) break;
        jtot++;
        const p0 = d[l]!;
        const el = e[l - 1]!;
        let g = (d[l - 1]! - p0) / (2 * el);
        let r = hypotOne(g);
        g = d[mm]! - p0 + el / (g + (g >= 0 ? r : -r));
        let s = 1;
        let c = 1;
        let p = 0;
        for (let i = mm; i < l; i++) {
          const ei = e[i]!;
          const f = s * ei;
          const b = c * ei;
          if (f === 0) {
            c = 1;
            s = 0;
            r = g;
          } else if (g === 0) {
            c = 0;
            s = 1;
            r = f;
          } else {
            r = Math.sqrt(g * g + f * f);
            if (!(r > ROT_LO && r < ROT_HI)) r = scaledHypot(g, f);
            c = g / r;
            s = f / r;
          }
          if (i !== mm) e[i - 1] = r;
          g = d[i]! - p;
          r = (d[i + 1]! - g) * s + 2 * c * b;
          p = s * r;
          d[i] = g + p;
          g = c * r - b;
          // Mirror image of the QL step: in the convention of `work` this rotation has sine −s.
          work[i] = c;
          work[sOff + i] = -s;
        }
        if (y !== null) rotateForward(y, n, mm, l, work, sOff);
        d[l]! -= p;
        e[l - 1] = g;
      }
    }

    // Undo the scaling of this block (its off-diagonals too: they decide convergence below).
    if (scale !== 1) {
      const inv = 1 / scale;
      for (let i = lsv; i <= lendsv; i++) d[i]! *= inv;
      for (let i = lsv; i < lendsv; i++) e[i]! *= inv;
    }
    if (jtot >= maxit) break;
  }

  if (jtot >= maxit) {
    let bad = 0;
    for (let i = 0; i < n - 1; i++) if (e[i] !== 0) bad++;
    if (bad > 0) return bad;
  }

  // Ascending order. Selection sort: at most n−1 column swaps of y, each O(n).
  for (let i = 0; i < n - 1; i++) {
    let k = i;
    let p = d[i]!;
    for (let j = i + 1; j < n; j++) {
      if (d[j]! < p) {
        k = j;
        p = d[j]!;
      }
    }
    if (k !== i) {
      d[k] = d[i]!;
      d[i] = p;
      if (y !== null) {
        for (let r = 0; r < n * n; r += n) {
          const t = y[r + i]!;
          y[r + i] = y[r + k]!;
          y[r + k] = t;
        }
      }
    }
  }
  return 0;
}

/** √(g² + 1) without overflow for large |g|. */
function hypotOne(g: number): number {
  const a = Math.abs(g);
  return a < 1e150 ? Math.sqrt(a * a + 1) : a;
}

/** √(a² + b²) by scaling with the larger magnitude (the rare slow path; a, b not both 0). */
function scaledHypot(a: number, b: number): number {
  const x = Math.abs(a);
  const z = Math.abs(b);
  const big = x > z ? x : z;
  const sa = x / big;
  const sb = z / big;
  return big * Math.sqrt(sa * sa + sb * sb);
}

/**
 * Diagonalise the 2×2 block [[a, b], [b, c]] at rows/columns (k, k+1) with one Jacobi rotation
 * J = [[cs, sn], [−sn, cs]] so that Jᵀ·B·J is diagonal (GVL Alg. 8.5.1, the symmetric Schur
 * decomposition), and apply it to columns k, k+1 of y.
 */
function jacobi2(d: Float64Array, e: Float64Array, k: number, y: Float64Array | null, n: number): void {
  const a = d[k]!;
  const b = e[k]!;
  const c = d[k + 1]!;
  e[k] = 0;
  if (b === 0) return;
  // tan θ = t is the smaller root of t² + 2τt − 1 = 0, τ = (c − a)/(2b): |θ| ≤ π/4.
  const tau = (c - a) / (2 * b);
  const at = Math.abs(tau);
  const root = at < 1e150 ? Math.sqrt(1 + tau * tau) : at;
  const t = tau >= 0 ? 1 / (tau + root) : -1 / (-tau + root);
  const cs = 1 / Math.sqrt(1 + t * t);
  const sn = t * cs;
  d[k] = a - t * b;
  d[k + 1] = c + t * b;
  if (y === null) return;
  for (let r = k; r < n * n; r += n) {
    const x0 = y[r]!;
    const x1 = y[r + 1]!;
    y[r] = cs * x0 - sn * x1;
    y[r + 1] = sn * x0 + cs * x1;
  }
}

/**
 * Apply the QL sweep's rotations i = hi−1 down to lo (in that order) to the columns of y:
 * each row carries the freshly rotated x_i into the next rotation as its x_{i+1}. That carried
 * value is a serial dependency (multiply then add per rotation), so four rows are swept together
 * to keep four independent chains in flight and to load each (c, s) once per four rows.
 */
function rotateBackward(y: Float64Array, n: number, lo: number, hi: number, w: Float64Array, sOff: number): void {
  const nn = n * n;
  const n4 = 4 * n;
  let r = 0;
  for (; r + n4 <= nn; r += n4) {
    const r1 = r + n;
    const r2 = r1 + n;
    const r3 = r2 + n;
    let t0 = y[r + hi]!;
    let t1 = y[r1 + hi]!;
    let t2 = y[r2 + hi]!;
    let t3 = y[r3 + hi]!;
    for (let i = hi - 1; i >= lo; i--) {
      const c = w[i]!;
      const s = w[sOff + i]!;
      const x0 = y[r + i]!;
      const x1 = y[r1 + i]!;
      const x2 = y[r2 + i]!;
      const x3 = y[r3 + i]!;
      y[r + i + 1] = s * x0 + c * t0;
      y[r1 + i + 1] = s * x1 + c * t1;
      y[r2 + i + 1] = s * x2 + c * t2;
      y[r3 + i + 1] = s * x3 + c * t3;
      t0 = c * x0 - s * t0;
      t1 = c * x1 - s * t1;
      t2 = c * x2 - s * t2;
      t3 = c * x3 - s * t3;
    }
    y[r + lo] = t0;
    y[r1 + lo] = t1;
    y[r2 + lo] = t2;
    y[r3 + lo] = t3;
  }
  for (; r < nn; r += n) {
    let t = y[r + hi]!;
    for (let i = hi - 1; i >= lo; i--) {
      const c = w[i]!;
      const s = w[sOff + i]!;
      const xi = y[r + i]!;
      y[r + i + 1] = s * xi + c * t;
      t = c * xi - s * t;
    }
    y[r + lo] = t;
  }
}

/** Apply the QR sweep's rotations i = lo up to hi−1 (in that order) to the columns of y; four rows at a time as above. */
function rotateForward(y: Float64Array, n: number, lo: number, hi: number, w: Float64Array, sOff: number): void {
  const nn = n * n;
  const n4 = 4 * n;
  let r = 0;
  for (; r + n4 <= nn; r += n4) {
    const r1 = r + n;
    const r2 = r1 + n;
    const r3 = r2 + n;
    let t0 = y[r + lo]!;
    let t1 = y[r1 + lo]!;
    let t2 = y[r2 + lo]!;
    let t3 = y[r3 + lo]!;
    for (let i = lo; i < hi; i++) {
      const c = w[i]!;
      const s = w[sOff + i]!;
      const x0 = y[r + i + 1]!;
      const x1 = y[r1 + i + 1]!;
      const x2 = y[r2 + i + 1]!;
      const x3 = y[r3 + i + 1]!;
      y[r + i] = c * t0 - s * x0;
      y[r1 + i] = c * t1 - s * x1;
      y[r2 + i] = c * t2 - s * x2;
      y[r3 + i] = c * t3 - s * x3;
      t0 = s * t0 + c * x0;
      t1 = s * t1 + c * x1;
      t2 = s * t2 + c * x2;
      t3 = s * t3 + c * x3;
    }
    y[r + hi] = t0;
    y[r1 + hi] = t1;
    y[r2 + hi] = t2;
    y[r3 + hi] = t3;
  }
  for (; r < nn; r += n) {
    let t = y[r + lo]!;
    for (let i = lo; i < hi; i++) {
      const c = w[i]!;
      const s = w[sOff + i]!;
      const xn = y[r + i + 1]!;
      y[r + i] = c * t - s * xn;
      t = s * t + c * xn;
    }
    y[r + hi] = t;
  }
}
