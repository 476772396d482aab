/**
 * Unitary reduction of a general complex matrix to upper Hessenberg form, H = Qᴴ·A·Q, and the
 * explicit formation of Q.
 *
 * Method: Householder reflectors, one per column (Golub & Van Loan, Matrix Computations, 4th ed.,
 * §7.4.3, Algorithm 7.4.2; the LAPACK routines zgehrd / zunghr, Anderson et al., LAPACK Users'
 * Guide, 3rd ed., SIAM 1999, §2.4.8). Reflector k is H_k = I − τ_k·v_k·v_kᴴ with v_k(0) = 1,
 * acting on rows/columns k+1..ihi; it is chosen so that H_kᴴ·x = β·e₁ with β real, where x is
 * column k below the diagonal. Then A ← H_kᴴ·A·H_k and Q = H_ilo·H_ilo+1···H_ihi-2.
 *
 * Layout: all matrices are n×n, interleaved (re, im), row-major (see {@link CMatrix}). Both the
 * left update (w = vᴴ·A, A −= τ̄·v·w) and the right update (y = A·v, A −= τ·y·vᴴ) are written as
 * sweeps along rows, so every inner loop is unit-stride in this layout.
 *
 * Only the block ilo..ihi left by balancing is reduced; outside it the matrix is already upper
 * triangular and Q is the identity.
 *
 * @module
 */
import { zgemmBase } from './zgemm.ts';

/** Columns per panel of the blocked reduction. */
export const GEHRD_BLOCK = 32;
/** Panels are used while more than this many columns remain to be reduced. */
const GEHRD_CROSSOVER = 64;

/** Length (doubles) of the `work` array {@link zgehrd} needs at order n. */
export function zgehrdWorkLength(n: number): number {
  const nb = GEHRD_BLOCK;
  return 2 * (5 * nb * n + 2 * nb * nb) + 8 * n;
}

/**
 * Reduce rows/columns ilo..ihi of the n×n matrix `a` to upper Hessenberg form in place.
 *
 * On return, `a` holds H (entries below the first subdiagonal are set to exactly 0), and the
 * reflectors are stored for {@link zunghr}: v_k occupies row k of `vs` (complex entries
 * 0..ihi-k-1, v_k(0) = 1) and τ_k is `tau[2k], tau[2k+1]`.
 *
 * Large blocks are reduced in panels of {@link GEHRD_BLOCK} columns (the blocked algorithm of
 * Quintana-Ortí & van de Geijn, "Improving the performance of reduction to Hessenberg form",
 * ACM TOMS 32, 2006, as in LAPACK zgehrd/zlahr2): within a panel only the panel's columns are
 * updated, using Y = A·V·T and the compact WY form I − V·T·Vᴴ of the panel's reflectors; the
 * rest of the matrix is then updated by matrix products (the project's zgemm), leaving only the
 * products A·v (one per column) as matrix-vector work. Pass `big` (an n×n scratch) to enable
 * the panels; without it, and for the last columns, one reflector is applied at a time. The
 * kernel trusts its input; it allocates only typed-array views of its scratch, once per panel.
 *
 * @param n order of the matrix
 * @param ilo first row/column of the block to reduce (0-based), from zgebal
 * @param ihi last row/column of the block (inclusive)
 * @param a n×n, interleaved row-major, length ≥ 2n²; overwritten by H
 * @param vs n×n scratch (length ≥ 2n²) receiving the reflector vectors
 * @param tau length ≥ 2n, receives the reflector scalars τ_k (complex)
 * @param work scratch, length ≥ 2n (unblocked) or ≥ {@link zgehrdWorkLength}(n) (with `big`)
 * @param big optional n×n scratch (length ≥ 2n²) that enables the blocked algorithm
 * @throws nothing: the kernel trusts its input
 * @example
 * zgehrd(n, ilo, ihi, h, vs, tau, work, scratch);   // h is now Hessenberg
 * zunghr(n, ilo, ihi, vs, tau, q, work);            // q·h·qᴴ reproduces the input
 */
export function zgehrd(
  n: number,
  ilo: number,
  ihi: number,
  a: Float64Array,
  vs: Float64Array,
  tau: Float64Array,
  work: Float64Array,
  big?: Float64Array,
): void {
  for (let k = 0; k < n; k++) {
    tau[2 * k] = 0;
    tau[2 * k + 1] = 0;
  }
  let k = ilo;
  if (big !== undefined) {
    const nb = GEHRD_BLOCK;
    while (ihi - 1 - k > GEHRD_CROSSOVER) {
      reducePanel(n, ihi, k, nb, a, vs, tau, work, big);
      k += nb;
    }
  }
  for (; k <= ihi - 2; k++) reduceColumn(n, ihi, k, a, vs, tau, work);
}

/**
 * Householder reflector for column k, rows k+1..ihi of `a`: H = I − τ·v·vᴴ with Hᴴ·x = β·e₁,
 * β real. Writes v (v(0) = 1) to row k of `vs`, τ to tau[2k..], β to a(k+1, k) and zeros below.
 * Returns false (τ = 0, H = I) when the column is already reduced with a real subdiagonal.
 */
function makeReflector(n: number, ihi: number, k: number, a: Float64Array, vs: Float64Array, tau: Float64Array): boolean {
  const rs = 2 * n;
  const m = ihi - k; // length of the reflector (rows k+1..ihi)
  const c0 = (k + 1) * rs + 2 * k; // position of a(k+1, k)
  const vb = k * rs;
  const ar = a[c0]!;
  const ai = a[c0 + 1]!;
  vs[vb] = 1;
  vs[vb + 1] = 0;
  // Scale by the largest component so the norm neither overflows nor underflows.
  let scl = Math.abs(ar) > Math.abs(ai) ? Math.abs(ar) : Math.abs(ai);
  let xmax = 0;
  for (let q = 1; q < m; q++) {
    const p = c0 + q * rs;
    const x = Math.abs(a[p]!);
    const y = Math.abs(a[p + 1]!);
    if (x > xmax) xmax = x;
    if (y > xmax) xmax = y;
  }
  if (xmax > scl) scl = xmax;
  if (xmax === 0 && ai === 0) {
    for (let q = 1; q < m; q++) {
      vs[vb + 2 * q] = 0;
      vs[vb + 2 * q + 1] = 0;
    }
    tau[2 * k] = 0;
    tau[2 * k + 1] = 0;
    return false;
  }
  let ss = 0;
  for (let q = 1; q < m; q++) {
    const p = c0 + q * rs;
    const x = a[p]! / scl;
    const y = a[p + 1]! / scl;
    ss += x * x + y * y;
  }
  const sar = ar / scl;
  const sai = ai / scl;
  // β = −sign(Re α)·‖(α, x)‖, so α − β never cancels.
  let bs = Math.sqrt(sar * sar + sai * sai + ss);
  if (sar >= 0) bs = -bs;
  // τ = (β − α)/β; v = x/(α − β), everything in the scaled units (|α−β| ≥ |β| ≥ 1 there).
  tau[2 * k] = (bs - sar) / bs;
  tau[2 * k + 1] = -sai / bs;
  const dr = sar - bs;
  const di = sai;
  const dd = dr * dr + di * di;
  const qr = dr / dd; // 1/(α−β) = conj(d)/|d|²
  const qi = -di / dd;
  for (let q = 1; q < m; q++) {
    const p = c0 + q * rs;
    const x = a[p]! / scl;
    const y = a[p + 1]! / scl;
    vs[vb + 2 * q] = x * qr - y * qi;
    vs[vb + 2 * q + 1] = x * qi + y * qr;
    a[p] = 0;
    a[p + 1] = 0;
  }
  a[c0] = bs * scl;
  a[c0 + 1] = 0;
  return true;
}

/** One unblocked step: reflector for column k, then A ← Hᴴ·A·H. `work` ≥ 2n. */
function reduceColumn(
  n: number,
  ihi: number,
  k: number,
  a: Float64Array,
  vs: Float64Array,
  tau: Float64Array,
  work: Float64Array,
): void {
  if (!makeReflector(n, ihi, k, a, vs, tau)) return;
  const rs = 2 * n;
  const m = ihi - k;
  const vb = k * rs;
  const tr = tau[2 * k]!;
  const ti = tau[2 * k + 1]!;

  // Right update, rows 0..ihi: A[:, k+1..ihi] −= (τ·A·v)·vᴴ. One row at a time: the dot
  // product and the update read the same short row, which stays in L1.
  const col0 = 2 * (k + 1);
  for (let r = 0; r <= ihi; r++) {
    const rb = r * rs + col0;
    let yr = 0;
    let yi = 0;
    for (let q = 0; q < 2 * m; q += 2) {
      const xr = a[rb + q]!;
      const xi = a[rb + q + 1]!;
      const vr = vs[vb + q]!;
      const vi = vs[vb + q + 1]!;
      yr += xr * vr - xi * vi;
      yi += xr * vi + xi * vr;
    }
    const sr = tr * yr - ti * yi;
    const si = tr * yi + ti * yr;
    for (let q = 0; q < 2 * m; q += 2) {
      const vr = vs[vb + q]!;
      const vi = vs[vb + q + 1]!;
      // (sr + i si)·conj(vr + i vi)
      a[rb + q] -= sr * vr + si * vi;
      a[rb + q + 1] -= si * vr - sr * vi;
    }
  }

  // Left update, rows k+1..ihi, columns k+1..n-1: w = vᴴ·A (accumulated row by row), then
  // A −= τ̄·v·w.
  const wl = 2 * (n - k - 1);
  for (let q = 0; q < wl; q++) work[q] = 0;
  for (let i = 0; i < m; i++) {
    const rb = (k + 1 + i) * rs + col0;
    const vr = vs[vb + 2 * i]!;
    const vi = -vs[vb + 2 * i + 1]!; // conj(v_i)
    for (let q = 0; q < wl; q += 2) {
      const xr = a[rb + q]!;
      const xi = a[rb + q + 1]!;
      work[q] += vr * xr - vi * xi;
      work[q + 1] += vr * xi + vi * xr;
    }
  }
  for (let i = 0; i < m; i++) {
    const rb = (k + 1 + i) * rs + col0;
    const vr = vs[vb + 2 * i]!;
    const vi = vs[vb + 2 * i + 1]!;
    // f = conj(τ)·v_i
    const fr = tr * vr + ti * vi;
    const fi = tr * vi - ti * vr;
    for (let q = 0; q < wl; q += 2) {
      const wr = work[q]!;
      const wi = work[q + 1]!;
      a[rb + q] -= fr * wr - fi * wi;
      a[rb + q + 1] -= fr * wi + fi * wr;
    }
  }
}

/**
 * Reduce columns k0..k0+nb-1 as one panel (see {@link zgehrd}). With Q = I − V·T·Vᴴ the
 * panel's reflectors and A the matrix at the start of the panel, the result is Qᴴ·(A − Y·Vᴴ)
 * where Y = A·V·T. Column j of the panel is formed on the fly from column j of A, Y and V; the
 * new column of Y is τ·(A·v − Y·(Vᴴ·v)) and the new column of T is −τ·T·(Vᴴ·v), τ. Afterwards
 * the columns right of the panel get A −= Y·Vᴴ and A ← (I − V·Tᴴ·Vᴴ)·A as matrix products.
 */
function reducePanel(
  n: number,
  ihi: number,
  k0: number,
  nb: number,
  a: Float64Array,
  vs: Float64Array,
  tau: Float64Array,
  work: Float64Array,
  big: Float64Array,
): void {
  const rs = 2 * n;
  const nr = ihi + 1; // rows 0..ihi take part
  // Scratch layout: Y (n×nb), V (n×nb, absolute row numbers), Vᴴ (nb×n), W, W2 (nb×n),
  // T, Tᴴ (nb×nb), vectors b, u, w (2n each).
  const oY = 0;
  const oV = oY + 2 * n * nb;
  const oVh = oV + 2 * n * nb;
  const oW = oVh + 2 * n * nb;
  const oW2 = oW + 2 * n * nb;
  const oT = oW2 + 2 * n * nb;
  const oTh = oT + 2 * nb * nb;
  const oB = oTh + 2 * nb * nb;
  const oU = oB + 2 * n;
  const oX = oU + 2 * n;
  const y = work;
  const v = work;
  const t = work;
  v.fill(0, oV, oV + 2 * n * nb);
  t.fill(0, oT, oT + 2 * nb * nb);

  for (let p = 0; p < nb; p++) {
    const j = k0 + p;
    // 1. b = A(0:ihi, j) − Y(:, 0:p-1)·conj(V(j, 0:p-1)).
    for (let r = 0; r < nr; r++) {
      let br = a[r * rs + 2 * j]!;
      let bi = a[r * rs + 2 * j + 1]!;
      const yb = oY + 2 * r * nb;
      const vb = oV + 2 * j * nb;
      for (let q = 0; q < 2 * p; q += 2) {
        const yr = y[yb + q]!;
        const yi = y[yb + q + 1]!;
        const vr = v[vb + q]!;
        const vi = -v[vb + q + 1]!;
        br -= yr * vr - yi * vi;
        bi -= yr * vi + yi * vr;
      }
      work[oB + 2 * r] = br;
      work[oB + 2 * r + 1] = bi;
    }
    // 2. Rows k0+1..ihi: b ← b − V·(Tᴴ·(Vᴴ·b)).
    if (p > 0) {
      for (let q = 0; q < 2 * p; q++) work[oU + q] = 0;
      for (let r = k0 + 1; r < nr; r++) {
        const br = work[oB + 2 * r]!;
        const bi = work[oB + 2 * r + 1]!;
        const vb = oV + 2 * r * nb;
        for (let q = 0; q < 2 * p; q += 2) {
          const vr = v[vb + q]!;
          const vi = -v[vb + q + 1]!;
          work[oU + q] += vr * br - vi * bi;
          work[oU + q + 1] += vr * bi + vi * br;
        }
      }
      // x = Tᴴ·u (Tᴴ lower triangular): x_q = Σ_{q' ≤ q} conj(T(q', q))·u_q'
      for (let q = 0; q < p; q++) {
        let xr = 0;
        let xi = 0;
        for (let q2 = 0; q2 <= q; q2++) {
          const tr = t[oT + 2 * (q2 * nb + q)]!;
          const ti = -t[oT + 2 * (q2 * nb + q) + 1]!;
          const ur = work[oU + 2 * q2]!;
          const ui = work[oU + 2 * q2 + 1]!;
          xr += tr * ur - ti * ui;
          xi += tr * ui + ti * ur;
        }
        work[oX + 2 * q] = xr;
        work[oX + 2 * q + 1] = xi;
      }
      for (let r = k0 + 1; r < nr; r++) {
        const vb = oV + 2 * r * nb;
        let sr = 0;
        let si = 0;
        for (let q = 0; q < 2 * p; q += 2) {
          const vr = v[vb + q]!;
          const vi = v[vb + q + 1]!;
          const xr = work[oX + q]!;
          const xi = work[oX + q + 1]!;
          sr += vr * xr - vi * xi;
          si += vr * xi + vi * xr;
        }
        work[oB + 2 * r] -= sr;
        work[oB + 2 * r + 1] -= si;
      }
    }
    // 3. Store the updated column and 4. reduce it.
    for (let r = 0; r < nr; r++) {
      a[r * rs + 2 * j] = work[oB + 2 * r]!;
      a[r * rs + 2 * j + 1] = work[oB + 2 * r + 1]!;
    }
    makeReflector(n, ihi, j, a, vs, tau);
    const tr = tau[2 * j]!;
    const ti = tau[2 * j + 1]!;
    const m = ihi - j; // v lives on rows j+1..ihi
    const vsb = j * rs;
    for (let q = 0; q < m; q++) {
      v[oV + 2 * ((j + 1 + q) * nb + p)] = vs[vsb + 2 * q]!;
      v[oV + 2 * ((j + 1 + q) * nb + p) + 1] = vs[vsb + 2 * q + 1]!;
    }
    // 5. Y(:, p) = τ·(A(:, j+1..ihi)·v − Y(:, 0:p-1)·u), u = Vᴴ·v; T(0:p-1, p) = −τ·T·u.
    for (let q = 0; q < 2 * p; q++) work[oU + q] = 0;
    for (let r = j + 1; r < nr; r++) {
      const vr0 = vs[vsb + 2 * (r - j - 1)]!;
      const vi0 = vs[vsb + 2 * (r - j - 1) + 1]!;
      const vb = oV + 2 * r * nb;
      for (let q = 0; q < 2 * p; q += 2) {
        const vr = v[vb + q]!;
        const vi = -v[vb + q + 1]!;
        work[oU + q] += vr * vr0 - vi * vi0;
        work[oU + q + 1] += vr * vi0 + vi * vr0;
      }
    }
    const c0 = 2 * (j + 1);
    const m2 = 2 * m;
    // Matrix–vector product A(0:ihi, j+1..ihi)·v, two rows at a time so each entry of v is
    // loaded once for two multiply-adds.
    let r = 0;
    for (; r + 1 < nr; r += 2) {
      const rb0 = r * rs + c0;
      const rb1 = rb0 + rs;
      let s0r = 0;
      let s0i = 0;
      let s1r = 0;
      let s1i = 0;
      for (let q = 0; q < m2; q += 2) {
        const vr = vs[vsb + q]!;
        const vi = vs[vsb + q + 1]!;
        const ar = a[rb0 + q]!;
        const ai = a[rb0 + q + 1]!;
        const br = a[rb1 + q]!;
        const bi = a[rb1 + q + 1]!;
        s0r += ar * vr - ai * vi;
        s0i += ar * vi + ai * vr;
        s1r += br * vr - bi * vi;
        s1i += br * vi + bi * vr;
      }
      y[oY + 2 * (r * nb + p)] = s0r;
      y[oY + 2 * (r * nb + p) + 1] = s0i;
      y[oY + 2 * ((r + 1) * nb + p)] = s1r;
      y[oY + 2 * ((r + 1) * nb + p) + 1] = s1i;
    }
    for (; r < nr; r++) {
      const rb0 = r * rs + c0;
      let s0r = 0;
      let s0i = 0;
      for (let q = 0; q < m2; q += 2) {
        const vr = vs[vsb + q]!;
        const vi = vs[vsb + q + 1]!;
        const ar = a[rb0 + q]!;
        const ai = a[rb0 + q + 1]!;
        s0r += ar * vr - ai * vi;
        s0i += ar * vi + ai * vr;
      }
      y[oY + 2 * (r * nb + p)] = s0r;
      y[oY + 2 * (r * nb + p) + 1] = s0i;
    }
    for (let rr = 0; rr < nr; rr++) {
      const yb = oY + 2 * rr * nb;
      let sr = y[yb + 2 * p]!;
      let si = y[yb + 2 * p + 1]!;
      for (let q = 0; q < 2 * p; q += 2) {
        const yr = y[yb + q]!;
        const yi = y[yb + q + 1]!;
        const ur = work[oU + q]!;
        const ui = work[oU + q + 1]!;
        sr -= yr * ur - yi * ui;
        si -= yr * ui + yi * ur;
      }
      y[yb + 2 * p] = tr * sr - ti * si;
      y[yb + 2 * p + 1] = tr * si + ti * sr;
    }
    for (let q = 0; q < p; q++) {
      let sr = 0;
      let si = 0;
      for (let q2 = q; q2 < p; q2++) {
        const xr = t[oT + 2 * (q * nb + q2)]!;
        const xi = t[oT + 2 * (q * nb + q2) + 1]!;
        const ur = work[oU + 2 * q2]!;
        const ui = work[oU + 2 * q2 + 1]!;
        sr += xr * ur - xi * ui;
        si += xr * ui + xi * ur;
      }
      t[oT + 2 * (q * nb + p)] = -(tr * sr - ti * si);
      t[oT + 2 * (q * nb + p) + 1] = -(tr * si + ti * sr);
    }
    t[oT + 2 * (p * nb + p)] = tr;
    t[oT + 2 * (p * nb + p) + 1] = ti;
  }

  // Trailing update of B = A(0:ihi, c0..n-1), c0 = k0+nb, copied into `big` (contiguous).
  const cstart = k0 + nb;
  const nc = n - cstart;
  const nc2 = 2 * nc;
  for (let r = 0; r < nr; r++) {
    const src = r * rs + 2 * cstart;
    for (let q = 0; q < nc2; q++) big[r * nc2 + q] = a[src + q]!;
  }
  // B −= Y·Vᴴ(:, cstart..n-1); V has no rows past ihi, so those columns of Vᴴ are 0.
  const vh = work;
  for (let q = 0; q < nb; q++) {
    const ob = oVh + q * nc2;
    for (let c = 0; c < nc; c++) {
      const row = cstart + c;
      if (row <= ihi) {
        vh[ob + 2 * c] = v[oV + 2 * (row * nb + q)]!;
        vh[ob + 2 * c + 1] = -v[oV + 2 * (row * nb + q) + 1]!;
      } else {
        vh[ob + 2 * c] = 0;
        vh[ob + 2 * c + 1] = 0;
      }
    }
  }
  const bview = big.subarray(0, nr * nc2);
  zgemmBase(nr, nc, nb, -1, 0, y.subarray(oY, oY + 2 * nr * nb), vh.subarray(oVh, oVh + nb * nc2), 1, 0, bview);
  // Rows k0+1..ihi of B ← (I − V·Tᴴ·Vᴴ)·B: W = Vᴴ·B_rows, W2 = Tᴴ·W, B_rows −= V·W2.
  const mr = ihi - k0;
  for (let q = 0; q < nb; q++) {
    const ob = oVh + q * 2 * mr;
    for (let rr = 0; rr < mr; rr++) {
      const row = k0 + 1 + rr;
      vh[ob + 2 * rr] = v[oV + 2 * (row * nb + q)]!;
      vh[ob + 2 * rr + 1] = -v[oV + 2 * (row * nb + q) + 1]!;
    }
  }
  for (let q = 0; q < nb; q++) {
    for (let q2 = 0; q2 < nb; q2++) {
      t[oTh + 2 * (q * nb + q2)] = t[oT + 2 * (q2 * nb + q)]!;
      t[oTh + 2 * (q * nb + q2) + 1] = -t[oT + 2 * (q2 * nb + q) + 1]!;
    }
  }
  const brows = big.subarray((k0 + 1) * nc2, nr * nc2);
  const wv = work.subarray(oW, oW + nb * nc2);
  const w2v = work.subarray(oW2, oW2 + nb * nc2);
  zgemmBase(nb, nc, mr, 1, 0, vh.subarray(oVh, oVh + nb * 2 * mr), brows, 0, 0, wv);
  zgemmBase(nb, nc, nb, 1, 0, t.subarray(oTh, oTh + 2 * nb * nb), wv, 0, 0, w2v);
  zgemmBase(mr, nc, nb, -1, 0, v.subarray(oV + 2 * (k0 + 1) * nb, oV + 2 * nr * nb), w2v, 1, 0, brows);
  for (let r = 0; r < nr; r++) {
    const dst = r * rs + 2 * cstart;
    for (let q = 0; q < nc2; q++) a[dst + q] = big[r * nc2 + q]!;
  }
}

/** Reflectors per block in {@link zunghr}. */
export const UNGHR_BLOCK = 32;

/** Length (doubles) of the `work` array {@link zunghr} needs at order n. */
export function zunghrWorkLength(n: number): number {
  const nb = UNGHR_BLOCK;
  return 2 * (4 * nb * n + 2 * nb * nb) + 2 * n;
}

/**
 * Form the unitary Q = H_ilo···H_ihi-2 of {@link zgehrd} explicitly in the n×n array `q`.
 *
 * The product is accumulated from the last reflector backwards, so that reflector k only meets
 * rows k+1..ihi. Reflectors are taken in blocks of {@link UNGHR_BLOCK} in the compact WY form
 * H_kb···H_ke = I − V·T·Vᴴ (T upper triangular; Schreiber & Van Loan, "A storage-efficient WY
 * representation for products of Householder transformations", SIAM J. Sci. Stat. Comput. 10,
 * 1989; Golub & Van Loan §5.1.7; LAPACK zlarft/zlarfb), so almost all the work is three matrix
 * products on whole rows of Q: W = Vᴴ·Q_rows, W ← T·W, Q_rows −= V·W. Those run in the
 * project's zgemm (SIMD where available), several times faster than one reflector at a time.
 *
 * @param n order of the matrix
 * @param ilo first row/column of the reduced block (0-based)
 * @param ihi last row/column of the reduced block (inclusive)
 * @param vs reflector vectors from zgehrd (row k holds v_k)
 * @param tau reflector scalars from zgehrd, length ≥ 2n
 * @param q n×n output, interleaved row-major, length ≥ 2n²
 * @param work scratch of length ≥ {@link zunghrWorkLength}(n)
 * @throws nothing: the kernel trusts its input
 * @example
 * zunghr(n, ilo, ihi, vs, tau, q, new Float64Array(zunghrWorkLength(n)));
 */
export function zunghr(
  n: number,
  ilo: number,
  ihi: number,
  vs: Float64Array,
  tau: Float64Array,
  q: Float64Array,
  work: Float64Array,
): void {
  const rs = 2 * n;
  q.fill(0, 0, 2 * n * n);
  for (let i = 0; i < n; i++) q[i * rs + 2 * i] = 1;
  const nb = UNGHR_BLOCK;
  // Carve the scratch: Vᴴ (nb×n), V (n×nb), W and T·W (nb×n each), Vᴴ·V and T (nb×nb).
  const oVh = 0;
  const oV = oVh + 2 * nb * n;
  const oW = oV + 2 * nb * n;
  const oW2 = oW + 2 * nb * n;
  const oS = oW2 + 2 * nb * n;
  const oT = oS + 2 * nb * nb;
  const vh = work.subarray(oVh, oV);
  const vf = work.subarray(oV, oW);
  const w = work.subarray(oW, oW2);
  const w2 = work.subarray(oW2, oS);
  const sm = work.subarray(oS, oT);
  const tm = work.subarray(oT, oT + 2 * nb * nb);
  const vec = work.subarray(oT + 2 * nb * nb);

  const first = ilo;
  const last = ihi - 2; // reflectors first..last
  let ke = last;
  while (ke >= first) {
    const kb = Math.max(first, ke - nb + 1);
    const b = ke - kb + 1;
    const mb = ihi - kb; // rows kb+1..ihi
    if (b < 4 || mb < 16) {
      // Small remainder: one reflector at a time.
      for (let k = ke; k >= kb; k--) applyReflectorLeft(n, ihi, k, vs, tau, q, vec);
      ke = kb - 1;
      continue;
    }
    // V (mb×b), column j = reflector kb+j placed at rows kb+j+1..ihi; and Vᴴ (b×mb).
    vf.fill(0, 0, 2 * mb * b);
    for (let j = 0; j < b; j++) {
      const k = kb + j;
      const vb = k * rs;
      const len = ihi - k;
      for (let t = 0; t < len; t++) {
        const r = j + t; // row within the block
        vf[2 * (r * b + j)] = vs[vb + 2 * t]!;
        vf[2 * (r * b + j) + 1] = vs[vb + 2 * t + 1]!;
      }
    }
    for (let r = 0; r < mb; r++) {
      for (let j = 0; j < b; j++) {
        vh[2 * (j * mb + r)] = vf[2 * (r * b + j)]!;
        vh[2 * (j * mb + r) + 1] = -vf[2 * (r * b + j) + 1]!;
      }
    }
    // T by the forward recurrence T(0:j,j) = −τ_j·T(0:j,0:j)·(Vᴴ·V)(0:j, j), T(j,j) = τ_j.
    zgemmBase(b, b, mb, 1, 0, vh, vf, 0, 0, sm);
    tm.fill(0, 0, 2 * b * b);
    for (let j = 0; j < b; j++) {
      const tr = tau[2 * (kb + j)]!;
      const ti = tau[2 * (kb + j) + 1]!;
      for (let i = 0; i < j; i++) {
        let ar = 0;
        let ai = 0;
        for (let l = i; l < j; l++) {
          const xr = tm[2 * (i * b + l)]!;
          const xi = tm[2 * (i * b + l) + 1]!;
          const yr = sm[2 * (l * b + j)]!;
          const yi = sm[2 * (l * b + j) + 1]!;
          ar += xr * yr - xi * yi;
          ai += xr * yi + xi * yr;
        }
        tm[2 * (i * b + j)] = -(tr * ar - ti * ai);
        tm[2 * (i * b + j) + 1] = -(tr * ai + ti * ar);
      }
      tm[2 * (j * b + j)] = tr;
      tm[2 * (j * b + j) + 1] = ti;
    }
    // Q_rows (rows kb+1..ihi, all n columns: contiguous) ← (I − V·T·Vᴴ)·Q_rows. Columns outside
    // kb+1..ihi of these rows are still 0, so the full width costs little and needs no copy;
    // the one view per block is the only allocation here.
    const qrows = q.subarray((kb + 1) * rs, (ihi + 1) * rs);
    zgemmBase(b, n, mb, 1, 0, vh, qrows, 0, 0, w);
    zgemmBase(b, n, b, 1, 0, tm, w, 0, 0, w2);
    zgemmBase(mb, n, b, -1, 0, vf, w2, 1, 0, qrows);
    ke = kb - 1;
  }
}

/** Q ← H_k·Q on rows k+1..ihi (columns k+1..ihi), one reflector; `w` ≥ 2n scratch. */
function applyReflectorLeft(
  n: number,
  ihi: number,
  k: number,
  vs: Float64Array,
  tau: Float64Array,
  q: Float64Array,
  w: Float64Array,
): void {
  const rs = 2 * n;
  const tr = tau[2 * k]!;
  const ti = tau[2 * k + 1]!;
  if (tr === 0 && ti === 0) return;
  const m = ihi - k;
  const vb = k * rs;
  const col0 = 2 * (k + 1);
  const wl = 2 * m;
  for (let c = 0; c < wl; c++) w[c] = 0;
  for (let i = 0; i < m; i++) {
    const rb = (k + 1 + i) * rs + col0;
    const vr = vs[vb + 2 * i]!;
    const vi = -vs[vb + 2 * i + 1]!;
    for (let c = 0; c < wl; c += 2) {
      const xr = q[rb + c]!;
      const xi = q[rb + c + 1]!;
      w[c] += vr * xr - vi * xi;
      w[c + 1] += vr * xi + vi * xr;
    }
  }
  for (let i = 0; i < m; i++) {
    const rb = (k + 1 + i) * rs + col0;
    const vr = vs[vb + 2 * i]!;
    const vi = vs[vb + 2 * i + 1]!;
    const fr = tr * vr - ti * vi; // τ·v_i
    const fi = tr * vi + ti * vr;
    for (let c = 0; c < wl; c += 2) {
      const wr = w[c]!;
      const wi = w[c + 1]!;
      q[rb + c] -= fr * wr - fi * wi;
      q[rb + c + 1] -= fr * wi + fi * wr;
    }
  }
}

/**
 * Multiply rows r0..r1 of the matrix `c` (row stride `ldc` complex entries, interleaved) from
 * the right by the Q of {@link zgehrd} on an order-`n` matrix: C ← C·Q, where only columns
 * ilo+1..ihi of C change. Each reflector is applied as y = C·v, C −= τ·y·vᴴ row by row (unit
 * stride). Used to accumulate the small Hessenberg reductions of the QR iteration's deflation
 * window.
 *
 * @param n order of the reduced matrix (row stride of `vs`)
 * @param ilo first row/column of the reduced block (0-based)
 * @param ihi last row/column of the reduced block (inclusive)
 * @param vs reflector vectors from zgehrd (row k holds v_k)
 * @param tau reflector scalars from zgehrd, length ≥ 2n
 * @param c matrix to update, interleaved row-major
 * @param ldc row stride of `c` in complex entries
 * @param r0 first row of `c` to update
 * @param r1 last row of `c` to update (inclusive)
 * @throws nothing: the kernel trusts its input
 * @example
 * zgehrd(m, 0, ns, t, vs, tau, work);
 * zunmhrRight(m, 0, ns, vs, tau, v, m, 1, m - 1); // v ← v·Q
 */
export function zunmhrRight(
  n: number,
  ilo: number,
  ihi: number,
  vs: Float64Array,
  tau: Float64Array,
  c: Float64Array,
  ldc: number,
  r0: number,
  r1: number,
): void {
  const rsv = 2 * n;
  const rsc = 2 * ldc;
  for (let k = ilo; k <= ihi - 2; k++) {
    const tr = tau[2 * k]!;
    const ti = tau[2 * k + 1]!;
    if (tr === 0 && ti === 0) continue;
    const m2 = 2 * (ihi - k);
    const vb = k * rsv;
    const col0 = 2 * (k + 1);
    for (let r = r0; r <= r1; r++) {
      const rb = r * rsc + col0;
      let yr = 0;
      let yi = 0;
      for (let q = 0; q < m2; q += 2) {
        const xr = c[rb + q]!;
        const xi = c[rb + q + 1]!;
        const vr = vs[vb + q]!;
        const vi = vs[vb + q + 1]!;
        yr += xr * vr - xi * vi;
        yi += xr * vi + xi * vr;
      }
      const sr = tr * yr - ti * yi;
      const si = tr * yi + ti * yr;
      for (let q = 0; q < m2; q += 2) {
        const vr = vs[vb + q]!;
        const vi = vs[vb + q + 1]!;
        c[rb + q] -= sr * vr + si * vi;
        c[rb + q + 1] -= si * vr - sr * vi;
      }
    }
  }
}
