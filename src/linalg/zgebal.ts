/**
 * Balancing of a general complex matrix before the eigenvalue computation, and the matching
 * back-transformation of right eigenvectors.
 *
 * Method (the one of the LAPACK routines zgebal / zgebak; Anderson et al., LAPACK Users' Guide,
 * 3rd ed., SIAM 1999, §2.4.8; Parlett & Reinsch, "Balancing a matrix for calculation of
 * eigenvalues and eigenvectors", Numer. Math. 13, 1969):
 *
 * 1. Permutation. A row whose only nonzero in the still-active columns is its diagonal isolates
 *    an eigenvalue; it is swapped (as a similarity: row and column together) to the bottom of
 *    the active range. Likewise a column whose only nonzero in the active rows is its diagonal is
 *    swapped to the top. Afterwards
 *        Pᵀ·A·P = [ T11  X   Y  ]
 *                 [  0   B   W  ]      rows/columns 0..ilo-1, ilo..ihi, ihi+1..n-1,
 *                 [  0   0  T33 ]
 *    with T11, T33 upper triangular, so only B (rows/cols ilo..ihi) needs the QR iteration.
 * 2. Scaling. Row i and column i of B are scaled by 1/f and f, f a power of 2 (so the scaling is
 *    exact), until the 2-norms of row i and column i are within a factor of 2. Norms include the
 *    diagonal, which keeps strongly diagonal matrices from being over-scaled (James, Langou &
 *    Lowery, "On matrix balancing and eigenvector computation", 2014). Balancing reduces ‖B‖, and
 *    the eigenvalue error of a backward-stable QR iteration is proportional to that norm.
 *
 * Storage: the matrix is n×n, interleaved (re, im), row-major, as in {@link CMatrix} `data`.
 *
 * @module
 */

/** Scaling radix: powers of 2 keep the scaling exact in binary floating point. */
const RADIX = 2;
/** A sweep of scalings stops when no row/column pair shrinks its norm sum below this factor. */
const FACTOR = 0.95;
/** Smallest normalized double divided by the unit roundoff (2⁻¹⁰²² / 2⁻⁵²). */
const SFMIN1 = 2 ** -1022 / 2 ** -52;
const SFMAX1 = 1 / SFMIN1;
const SFMIN2 = SFMIN1 * RADIX;
const SFMAX2 = 1 / SFMIN2;

/**
 * Balance the n×n matrix `a` in place: permute to isolate eigenvalues, then scale.
 *
 * On return `range[0] = ilo`, `range[1] = ihi` (0-based, inclusive; for n = 0, ilo = 0 and
 * ihi = -1), and `scale` describes the transformation: for i < ilo or i > ihi, `scale[i]` is the
 * index that row/column i was swapped with; for ilo ≤ i ≤ ihi it is the scaling factor d_i, so
 * that the balanced matrix is D⁻¹·Pᵀ·A·P·D.
 *
 * The kernel trusts its input (finite entries, arrays of the right length) and allocates nothing.
 *
 * @param n order of the matrix
 * @param a n×n matrix, interleaved row-major, length ≥ 2n²; overwritten by the balanced matrix
 * @param scale output, length ≥ n
 * @param range output, length ≥ 2: ilo, ihi
 * @param permute isolate eigenvalues by permutation (otherwise ilo = 0, ihi = n-1)
 * @param doScale apply the diagonal scaling
 * @throws nothing: the kernel trusts its input
 * @example
 * const scale = new Float64Array(n), range = new Int32Array(2);
 * zgebal(n, h, scale, range, true, true);
 * const ilo = range[0]!, ihi = range[1]!;
 */
export function zgebal(
  n: number,
  a: Float64Array,
  scale: Float64Array,
  range: Int32Array,
  permute: boolean,
  doScale: boolean,
): void {
  for (let i = 0; i < n; i++) scale[i] = 1;
  let ilo = 0;
  let ihi = n - 1;
  const rs = 2 * n; // row stride in doubles

  if (permute && n > 0) {
    // Rows isolating an eigenvalue: every entry in columns 0..ihi other than the diagonal is 0.
    // After a swap the active range shrinks, so the search restarts (LAPACK does the same).
    let found = true;
    while (found && ihi > 0) {
      found = false;
      for (let j = ihi; j >= 0; j--) {
        const base = j * rs;
        let isolated = true;
        for (let k = 0; k <= ihi; k++) {
          if (k !== j && (a[base + 2 * k] !== 0 || a[base + 2 * k + 1] !== 0)) {
            isolated = false;
            break;
          }
        }
        if (isolated) {
          scale[ihi] = j;
          if (j !== ihi) swapSimilarity(n, a, j, ihi);
          ihi--;
          found = true;
          break;
        }
      }
    }
    // Columns isolating an eigenvalue: every entry in rows ilo..ihi other than the diagonal is 0.
    found = true;
    while (found && ilo < ihi) {
      found = false;
      for (let j = ilo; j <= ihi; j++) {
        let isolated = true;
        for (let r = ilo; r <= ihi; r++) {
          const p = r * rs + 2 * j;
          if (r !== j && (a[p] !== 0 || a[p + 1] !== 0)) {
            isolated = false;
            break;
          }
        }
        if (isolated) {
          scale[ilo] = j;
          if (j !== ilo) swapSimilarity(n, a, j, ilo);
          ilo++;
          found = true;
          break;
        }
      }
    }
  }
  range[0] = ilo;
  range[1] = ihi;
  if (!doScale || ilo >= ihi) return;

  // Iterative scaling of the block ilo..ihi.
  let noconv = true;
  while (noconv) {
    noconv = false;
    for (let i = ilo; i <= ihi; i++) {
      // 2-norms of column i and row i restricted to the block, computed with a max-scaled sum so
      // entries near the overflow threshold are safe.
      let cmax = 0;
      for (let r = ilo; r <= ihi; r++) {
        const p = r * rs + 2 * i;
        const x = Math.abs(a[p]!);
        const y = Math.abs(a[p + 1]!);
        if (x > cmax) cmax = x;
        if (y > cmax) cmax = y;
      }
      let rmax = 0;
      const rb = i * rs;
      for (let k = ilo; k <= ihi; k++) {
        const x = Math.abs(a[rb + 2 * k]!);
        const y = Math.abs(a[rb + 2 * k + 1]!);
        if (x > rmax) rmax = x;
        if (y > rmax) rmax = y;
      }
      if (cmax === 0 || rmax === 0) continue;
      let css = 0;
      for (let r = ilo; r <= ihi; r++) {
        const p = r * rs + 2 * i;
        const x = a[p]! / cmax;
        const y = a[p + 1]! / cmax;
        css += x * x + y * y;
      }
      let rss = 0;
      for (let k = ilo; k <= ihi; k++) {
        const x = a[rb + 2 * k]! / rmax;
        const y = a[rb + 2 * k + 1]! / rmax;
        rss += x * x + y * y;
      }
      let c = cmax * Math.sqrt(css);
      let r = rmax * Math.sqrt(rss);
      // Largest moduli in the whole column (rows 0..ihi) and row (columns ilo..n-1): the scaling
      // must not push any of those entries past the overflow or underflow thresholds.
      let ca = 0;
      for (let q = 0; q <= ihi; q++) {
        const m = modulusAt(a, q * rs + 2 * i);
        if (m > ca) ca = m;
      }
      let ra = 0;
      for (let k = ilo; k < n; k++) {
        const m = modulusAt(a, rb + 2 * k);
        if (m > ra) ra = m;
      }

      let g = r / RADIX;
      let f = 1;
      const s = c + r;
      while (c < g && Math.max(f, c, ca) < SFMAX2 && Math.min(r, g, ra) > SFMIN2) {
        f *= RADIX;
        c *= RADIX;
        ca *= RADIX;
        r /= RADIX;
        g /= RADIX;
        ra /= RADIX;
      }
      g = c / RADIX;
      while (g >= r && Math.max(r, ra) < SFMAX2 && Math.min(f, c, g, ca) > SFMIN2) {
        f /= RADIX;
        c /= RADIX;
        g /= RADIX;
        ca /= RADIX;
        r *= RADIX;
        ra *= RADIX;
      }
      // Only scale when it pays off noticeably; otherwise the sweep could cycle forever.
      if (c + r >= FACTOR * s) continue;
      const si = scale[i]!;
      if (f < 1 && si < 1 && f * si <= SFMIN1) continue;
      if (f > 1 && si > 1 && si >= SFMAX1 / f) continue;
      scale[i] = si * f;
      noconv = true;
      const ginv = 1 / f;
      for (let k = ilo; k < n; k++) {
        a[rb + 2 * k] *= ginv;
        a[rb + 2 * k + 1] *= ginv;
      }
      for (let q = 0; q <= ihi; q++) {
        const p = q * rs + 2 * i;
        a[p] *= f;
        a[p + 1] *= f;
      }
    }
  }
}

/**
 * Undo the balancing on right eigenvectors: V ← P·D·V, applied to the rows of the n×m matrix `v`
 * (interleaved row-major). `scale`, `ilo`, `ihi` are the outputs of {@link zgebal}.
 *
 * @param n number of rows of v (order of the balanced matrix)
 * @param m number of columns of v
 * @param ilo first row/column of the balanced block (0-based)
 * @param ihi last row/column of the balanced block (inclusive)
 * @param scale permutation indices and scaling factors from zgebal, length ≥ n
 * @param v n×m, interleaved row-major; overwritten
 * @throws nothing: the kernel trusts its input
 * @example
 * zgebak(n, n, ilo, ihi, scale, vectors.data);
 */
export function zgebak(
  n: number,
  m: number,
  ilo: number,
  ihi: number,
  scale: Float64Array,
  v: Float64Array,
): void {
  const rs = 2 * m;
  for (let i = ilo; i <= ihi; i++) {
    const d = scale[i]!;
    if (d === 1) continue;
    const b = i * rs;
    for (let k = 0; k < rs; k++) v[b + k] *= d;
  }
  // The swaps were recorded bottom-up for isolated rows (i = n-1, n-2, …, ihi+1) and then
  // top-down for isolated columns (i = 0, 1, …, ilo-1); undo them in the reverse order.
  for (let i = ilo - 1; i >= 0; i--) swapRows(m, v, i, scale[i]!);
  for (let i = ihi + 1; i < n; i++) swapRows(m, v, i, scale[i]!);
}

/**
 * |a[p] + i·a[p+1]| without overflow or the cost of Math.hypot. Takes the array and index, not
 * the two numbers: doubles passed to a call the engine does not inline are boxed on the heap.
 */
function modulusAt(a: Float64Array, p: number): number {
  const ax = Math.abs(a[p]!);
  const ay = Math.abs(a[p + 1]!);
  const big = ax > ay ? ax : ay;
  if (big === 0) return 0;
  const small = ax > ay ? ay : ax;
  const t = small / big;
  return big * Math.sqrt(1 + t * t);
}

/** Exchange rows j and k of an interleaved row-major matrix with m columns. */
function swapRows(m: number, v: Float64Array, j: number, k: number): void {
  if (j === k) return;
  const pj = 2 * m * j;
  const pk = 2 * m * k;
  for (let q = 0; q < 2 * m; q++) {
    const t = v[pj + q]!;
    v[pj + q] = v[pk + q]!;
    v[pk + q] = t;
  }
}

/** Similarity by the transposition (j k): exchange columns j, k and rows j, k of the n×n `a`. */
function swapSimilarity(n: number, a: Float64Array, j: number, k: number): void {
  const rs = 2 * n;
  for (let r = 0; r < n; r++) {
    const pj = r * rs + 2 * j;
    const pk = r * rs + 2 * k;
    const tr = a[pj]!;
    const ti = a[pj + 1]!;
    a[pj] = a[pk]!;
    a[pj + 1] = a[pk + 1]!;
    a[pk] = tr;
    a[pk + 1] = ti;
  }
  swapRows(n, a, j, k);
}
