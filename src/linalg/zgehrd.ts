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

/**
 * Reduce rows/columns ilo..ihi of the n×n matrix `a` to upper Hessenberg form in place.
 *
 * On return, `a` holds H (entries below the first subdiagonal are set to exactly 0), and the
 * reflectors are stored for {@link zunghr}: v_k occupies row k of `vs` (complex entries
 * 0..ihi-k-1, v_k(0) = 1) and τ_k is `tau[2k], tau[2k+1]`. The kernel trusts its input and
 * allocates nothing.
 *
 * @param n order of the matrix
 * @param ilo first row/column of the block to reduce (0-based), from zgebal
 * @param ihi last row/column of the block (inclusive)
 * @param a n×n, interleaved row-major, length ≥ 2n²; overwritten by H
 * @param vs n×n scratch (length ≥ 2n²) receiving the reflector vectors
 * @param tau length ≥ 2n, receives the reflector scalars τ_k (complex)
 * @param work length ≥ 2n scratch
 * @example
 * zgehrd(n, ilo, ihi, h, vs, tau, work);   // h is now Hessenberg
 * zunghr(n, ilo, ihi, vs, tau, q);         // q·h·qᴴ reproduces the input
 */
export function zgehrd(
  n: number,
  ilo: number,
  ihi: number,
  a: Float64Array,
  vs: Float64Array,
  tau: Float64Array,
  work: Float64Array,
): void {
  const rs = 2 * n;
  for (let k = 0; k < n; k++) {
    tau[2 * k] = 0;
    tau[2 * k + 1] = 0;
  }
  for (let k = ilo; k <= ihi - 2; k++) {
    const m = ihi - k; // length of the reflector (rows k+1..ihi)
    const c0 = (k + 1) * rs + 2 * k; // position of a(k+1, k)
    const ar = a[c0]!;
    const ai = a[c0 + 1]!;
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
    const vb = k * rs; // v_k lives in row k of vs
    if (xmax === 0 && ai === 0) {
      // Column already in Hessenberg form with a real subdiagonal: H_k = I.
      continue;
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
    const tr = (bs - sar) / bs;
    const ti = -sai / bs;
    tau[2 * k] = tr;
    tau[2 * k + 1] = ti;
    const dr = sar - bs;
    const di = sai;
    const dd = dr * dr + di * di;
    const qr = dr / dd; // 1/(α−β) = conj(d)/|d|²
    const qi = -di / dd;
    vs[vb] = 1;
    vs[vb + 1] = 0;
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
}

/**
 * Form the unitary Q = H_ilo···H_ihi-2 of {@link zgehrd} explicitly in the n×n array `q`.
 *
 * The product is accumulated from the last reflector backwards, so that reflector k only ever
 * meets the trailing block rows/columns k+1..ihi (the leading part is still the identity), which
 * costs about ⅔·(ihi−ilo)³ complex multiply-adds instead of (ihi−ilo)³.
 *
 * @param n order of the matrix
 * @param ilo first row/column of the reduced block (0-based)
 * @param ihi last row/column of the reduced block (inclusive)
 * @param vs reflector vectors from zgehrd (row k holds v_k)
 * @param tau reflector scalars from zgehrd, length ≥ 2n
 * @param q n×n output, interleaved row-major, length ≥ 2n²
 * @param work length ≥ 2n scratch
 * @example
 * zunghr(n, ilo, ihi, vs, tau, q, work);
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
  for (let k = ihi - 2; k >= ilo; k--) {
    const tr = tau[2 * k]!;
    const ti = tau[2 * k + 1]!;
    if (tr === 0 && ti === 0) continue;
    const m = ihi - k;
    const vb = k * rs;
    const col0 = 2 * (k + 1);
    const wl = 2 * m;
    // Row k+1 of the block is still e₀, so w = vᴴ·Q_block starts as conj(v_0)·e₀ = e₀.
    work[0] = 1;
    for (let c = 1; c < wl; c++) work[c] = 0;
    for (let i = 1; i < m; i++) {
      const rb = (k + 1 + i) * rs + col0;
      const vr = vs[vb + 2 * i]!;
      const vi = -vs[vb + 2 * i + 1]!;
      for (let c = 2; c < wl; c += 2) {
        const xr = q[rb + c]!;
        const xi = q[rb + c + 1]!;
        work[c] += vr * xr - vi * xi;
        work[c + 1] += vr * xi + vi * xr;
      }
    }
    // Q_block −= τ·v·w.
    for (let i = 0; i < m; i++) {
      const rb = (k + 1 + i) * rs + col0;
      const vr = vs[vb + 2 * i]!;
      const vi = vs[vb + 2 * i + 1]!;
      const fr = tr * vr - ti * vi; // τ·v_i
      const fi = tr * vi + ti * vr;
      for (let c = 0; c < wl; c += 2) {
        const wr = work[c]!;
        const wi = work[c + 1]!;
        q[rb + c] -= fr * wr - fi * wi;
        q[rb + c + 1] -= fr * wi + fi * wr;
      }
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
