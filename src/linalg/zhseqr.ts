/**
 * Complex Schur form of an upper Hessenberg matrix by the implicitly shifted QR iteration:
 * T = Zᴴ·H·Z with T upper triangular and Z unitary.
 *
 * Method: implicit single-shift QR with a bulge chased by plane rotations (Golub & Van Loan,
 * Matrix Computations, 4th ed., §7.5; the LAPACK routine zlahqr as described in Anderson et al.,
 * LAPACK Users' Guide, 3rd ed., SIAM 1999), with
 * - deflation when a subdiagonal entry is negligible, by the conservative test of Ahues &
 *   Tisseur (LAPACK Working Note 122, 1997), which compares it with the neighbouring 2×2 block
 *   rather than only with the two diagonal entries;
 * - the Wilkinson shift (eigenvalue of the trailing 2×2 block closer to the last diagonal entry);
 * - exceptional ad-hoc shifts after every 10 sweeps without a deflation, alternating between
 *   the bottom and the top of the active block, to break the rare cycles of the plain shift;
 * - a sweep may start in the middle of the active block when two consecutive subdiagonal entries
 *   are small enough that the entry the first rotation creates is negligible;
 * - for large active blocks, aggressive early deflation (Braman, Byers & Mathias, "The multishift
 *   QR algorithm. Part II: Aggressive early deflation", SIAM J. Matrix Anal. Appl. 23, 2002; the
 *   LAPACK routines zlaqr0/zlaqr3): the trailing window is reduced to Schur form, eigenvalues
 *   whose "spike" coupling to the rest is negligible are deflated at once, and the others are
 *   used as the shifts of the following sweeps. It typically halves the number of sweeps, which
 *   dominate the cost;
 * - an iteration cap of 30 sweeps per eigenvalue of the active block (total), after which the
 *   kernel reports failure instead of looping forever.
 *
 * Performance. Storage is interleaved (re, im), row-major (see {@link CMatrix}), so the left
 * application of a rotation (rows k, k+1) is unit-stride but the right application (columns
 * k, k+1) strides by a whole row. Left and right multiplications commute, so the right
 * rotations of a sweep are only applied at once where the next rotation is computed from them
 * (rows k+1, k+2, next to the bulge). For every other row, and for every row of Z, the sweep's
 * rotations are applied afterwards in one pass along the row: each entry is loaded and stored
 * once and the whole pass is unit-stride. Every entry sees exactly the same sequence of
 * operations as in the textbook ordering, only at a different time, so the arithmetic is
 * identical. Without the Schur form (eigenvalues only) rotations touch only the active block.
 *
 * @module
 */
import { zgehrd, zunmhrRight } from './zgehrd.ts';

/** Sweeps allowed per eigenvalue of the active block, in total over the whole reduction. */
export const QR_SWEEPS_PER_EIGENVALUE = 30;

/** The iteration cap used by {@link zhseqr} for an active block of order nh. */
export function qrIterationCap(nh: number): number {
  return QR_SWEEPS_PER_EIGENVALUE * Math.max(10, nh);
}

/** Relative machine precision (spacing of doubles at 1). */
const ULP = 2 ** -52;
/** Smallest positive normalized double. */
const SAFMIN = 2 ** -1022;
/** Sweeps without a deflation between two exceptional shifts. */
const KEXSH = 10;
/** Deflation-window rounds without a deflation before the window's shifts are replaced. */
const KEXAED = 4;
/** Size of the exceptional shift relative to the subdiagonal entry it is built from. */
const DAT1 = 0.75;
/** Active blocks at least this large use aggressive early deflation. */
export const AED_MIN_ORDER = 40;
/** Percentage of the window that must deflate for the next window to be tried before sweeping. */
const NIBBLE = 14;

/**
 * Deflation-window size for an active block of order nh (0: no early deflation). Grows like
 * nh/log₂(nh), the rule of thumb of the LAPACK tuning routine iparmq.
 */
export function aedWindow(nh: number): number {
  if (nh < AED_MIN_ORDER) return 0;
  const w = Math.round(nh / Math.round(Math.log2(nh)));
  return Math.min(nh - 1, Math.max(10, w + (w & 1)));
}

/** Result slots of the small complex helpers below (one allocation at module load). */
const OUT = new Float64Array(2);
/** Rotation from {@link givens}: c, Re s, Im s, Re r, Im r. */
const ROT = new Float64Array(5);

/**
 * Scratch for the aggressive-early-deflation window of {@link zhseqr} at order n (allocated once
 * per workspace; about 6·w² + 2·w·n doubles for the largest window w).
 */
export class QrScratch {
  /** Largest deflation window for this order. */
  readonly nwMax: number;
  /** (w+1)×(w+1): the window with a leading row/column for the spike. */
  readonly t: Float64Array;
  /** (w+1)×(w+1): the window's Schur vectors. */
  readonly v: Float64Array;
  /** (w+1)×(w+1): Householder vectors of the window's re-reduction. */
  readonly vs: Float64Array;
  readonly tau: Float64Array;
  readonly work: Float64Array;
  /** Eigenvalues of the window. */
  readonly wv: Float64Array;
  /** Shifts for the following sweeps. */
  readonly shifts: Float64Array;
  /** w×n: product slab for the update of the rows right of the window, and row copies. */
  readonly slab: Float64Array;

  constructor(n: number) {
    const w = aedWindow(n);
    const m = w + 1;
    this.nwMax = w;
    this.t = new Float64Array(2 * m * m);
    this.v = new Float64Array(2 * m * m);
    this.vs = new Float64Array(2 * m * m);
    this.tau = new Float64Array(2 * m);
    this.work = new Float64Array(2 * m);
    this.wv = new Float64Array(2 * m);
    this.shifts = new Float64Array(2 * m);
    this.slab = new Float64Array(2 * Math.max(w * n, m));
  }
}

/**
 * Reduce the upper Hessenberg block ilo..ihi of `h` to upper triangular (Schur) form.
 *
 * Eigenvalues go to `w` (interleaved, length 2n) in diagonal order; entries outside ilo..ihi
 * (isolated by balancing) are copied from the diagonal. With `wantt`, the whole matrix is
 * transformed (T = Zᴴ·H·Z in all of `h`, entries below the diagonal exactly 0); without it only
 * the active block is updated and `h` is left as scratch. When `z` is given, the rotations are
 * also applied to its rows ilo..ihi (Z ← Z·Gᴴ), so passing the Q of the Hessenberg reduction
 * yields the Schur vectors of the original matrix. The kernel trusts its input (finite,
 * Hessenberg with zeros below the subdiagonal) and allocates nothing.
 *
 * @param n order of the matrix
 * @param ilo first row/column of the active block (0-based)
 * @param ihi last row/column of the active block (inclusive)
 * @param h n×n upper Hessenberg, interleaved row-major, length ≥ 2n²; overwritten
 * @param wantt compute the full Schur form T (needed for eigenvectors)
 * @param z n×n unitary (interleaved row-major) to accumulate the rotations into, or null
 * @param w output eigenvalues, length ≥ 2n
 * @param rc scratch, length ≥ n (cosines of a sweep's rotations)
 * @param rsn scratch, length ≥ 2n (complex sines of a sweep's rotations)
 * @param scratch deflation-window scratch for order n; null disables early deflation
 * @returns 0 on success; otherwise i+1 where i is the row at which the iteration cap was hit
 *   (eigenvalues i+1..ihi had converged, the others in w are not set)
 * @example
 * const info = zhseqr(n, ilo, ihi, h, true, q, w, rc, rsn, new QrScratch(n));
 * if (info > 0) throw new LinalgError('zgeev', 'no-convergence', n, '…');
 */
export function zhseqr(
  n: number,
  ilo: number,
  ihi: number,
  h: Float64Array,
  wantt: boolean,
  z: Float64Array | null,
  w: Float64Array,
  rc: Float64Array,
  rsn: Float64Array,
  scratch: QrScratch | null,
): number {
  return qrIterate(n, ilo, ihi, h, wantt, z, ilo, ihi, w, rc, rsn, scratch);
}

/** {@link zhseqr} with an explicit row range iloz..ihiz of Z to update. */
function qrIterate(
  n: number,
  ilo: number,
  ihi: number,
  h: Float64Array,
  wantt: boolean,
  z: Float64Array | null,
  iloz: number,
  ihiz: number,
  w: Float64Array,
  rc: Float64Array,
  rsn: Float64Array,
  sc: QrScratch | null,
): number {
  const rs = 2 * n;
  for (let j = 0; j < n; j++) {
    if (j >= ilo && j <= ihi) continue;
    w[2 * j] = h[j * rs + 2 * j]!;
    w[2 * j + 1] = h[j * rs + 2 * j + 1]!;
  }
  if (ilo > ihi) return 0;
  if (ilo === ihi) {
    w[2 * ilo] = h[ilo * rs + 2 * ilo]!;
    w[2 * ilo + 1] = h[ilo * rs + 2 * ilo + 1]!;
    return 0;
  }
  const nh = ihi - ilo + 1;
  // Subdiagonal entries below this are treated as zero outright (LAPACK's choice of scale).
  const smlnum = SAFMIN * (nh / ULP);
  const itmax = qrIterationCap(nh);
  let its = 0;
  let kdefl = 0;
  let kround = 0;
  let i1 = 0;
  let i2 = n - 1;
  // Shifts delivered by the deflation window, used one per sweep: shifts[2q], shifts[2q+1].
  let nq = 0;
  let qpos = 0;

  let i = ihi;
  while (i >= ilo) {
    let l = ilo;
    for (;;) {
      // --- Look for a negligible subdiagonal entry H(k, k-1), scanning upwards from i.
      let k = i;
      for (; k > l; k--) {
        const pk = k * rs + 2 * k;
        const pkm = pk - rs - 2;
        const hsub = Math.abs(h[pk - 2]!) + Math.abs(h[pk - 1]!);
        if (hsub <= smlnum) break;
        let tst = Math.abs(h[pkm]!) + Math.abs(h[pkm + 1]!) + Math.abs(h[pk]!) + Math.abs(h[pk + 1]!);
        if (tst === 0) {
          if (k - 2 >= l) tst += Math.abs(h[pkm - 2]!) + Math.abs(h[pkm - 1]!);
          if (k + 1 <= i) tst += Math.abs(h[pk + rs]!) + Math.abs(h[pk + rs + 1]!);
        }
        if (hsub <= ULP * tst) {
          // Ahues–Tisseur: accept only if the product of the off-diagonal pair is negligible
          // against the 2×2 block's diagonal data, which avoids premature deflation of graded
          // matrices.
          const hsup = Math.abs(h[pkm + 2]!) + Math.abs(h[pkm + 3]!);
          const ab = hsub > hsup ? hsub : hsup;
          const ba = hsub > hsup ? hsup : hsub;
          const hkk = Math.abs(h[pk]!) + Math.abs(h[pk + 1]!);
          const dd = Math.abs(h[pkm]! - h[pk]!) + Math.abs(h[pkm + 1]! - h[pk + 1]!);
          const aa = hkk > dd ? hkk : dd;
          const bb = hkk > dd ? dd : hkk;
          const s = aa + ab;
          const rhs = ULP * (bb * (aa / s));
          if (ba * (ab / s) <= (smlnum > rhs ? smlnum : rhs)) break;
        }
      }
      l = k;
      if (l > ilo) {
        const p = l * rs + 2 * (l - 1);
        h[p] = 0;
        h[p + 1] = 0;
      }
      if (l >= i) break; // H(i, i) has split off

      if (its >= itmax) return i + 1;
      if (!wantt) {
        i1 = l;
        i2 = i;
      }

      // --- Aggressive early deflation, when the previous window's shifts are used up.
      const nact = i - l + 1;
      if (sc !== null && qpos >= nq && nact >= AED_MIN_ORDER) {
        its++;
        const nw = Math.min(aedWindow(nact), sc.nwMax);
        const nd = aed(n, h, l, i, nw, wantt, z, iloz, ihiz, rc, rsn, sc, smlnum);
        if (nd >= 0) {
          qpos = 0;
          nq = nw - nd;
          if (nd > 0) {
            kdefl = 0;
            kround = 0;
            // Many deflations: split them off and look again before spending sweeps.
            if (100 * nd > NIBBLE * nw) nq = 0;
            continue;
          }
          kround++;
          if (kround % KEXAED === 0) {
            // The window keeps failing to deflate: replace its shifts by ad-hoc ones built from
            // the trailing diagonal, as after 10 plain sweeps without progress.
            const sh = sc.shifts;
            for (let q = 0; q < nq; q++) {
              const j = i - (q % nact);
              const pj = j * rs + 2 * j;
              const sub = j > l ? Math.abs(h[pj - 2]!) + Math.abs(h[pj - 1]!) : 0;
              sh[2 * q] = h[pj]! + DAT1 * sub;
              sh[2 * q + 1] = h[pj + 1]!;
            }
          }
        } else {
          nq = 0;
        }
      }

      its++;
      kdefl++;

      // --- Shift.
      const pii = i * rs + 2 * i;
      let tr: number;
      let ti: number;
      if (qpos < nq && sc !== null) {
        tr = sc.shifts[2 * qpos]!;
        ti = sc.shifts[2 * qpos + 1]!;
        qpos++;
      } else if (kdefl % (2 * KEXSH) === 0) {
        const s = DAT1 * (Math.abs(h[pii - 2]!) + Math.abs(h[pii - 1]!));
        tr = h[pii]! + s;
        ti = h[pii + 1]!;
      } else if (kdefl % KEXSH === 0) {
        const pll = l * rs + 2 * l;
        const s = DAT1 * (Math.abs(h[pll + rs]!) + Math.abs(h[pll + rs + 1]!));
        tr = h[pll]! + s;
        ti = h[pll + 1]!;
      } else {
        // Wilkinson shift: the eigenvalue of [a b; c d] (trailing 2×2) nearer to d, written as
        // d − u²/(x + y) with u² = b·c, x = (a − d)/2, y = ±√(x² + u²) chosen along x so the
        // denominator does not cancel. u = √b·√c keeps magnitudes linear in the entries.
        tr = h[pii]!;
        ti = h[pii + 1]!;
        const pim = pii - rs - 2;
        csqrt(h[pii - rs]!, h[pii - rs + 1]!);
        const ar = OUT[0]!;
        const ai = OUT[1]!;
        csqrt(h[pii - 2]!, h[pii - 1]!);
        const br = OUT[0]!;
        const bi = OUT[1]!;
        const ur = ar * br - ai * bi;
        const ui = ar * bi + ai * br;
        let s = Math.abs(ur) + Math.abs(ui);
        if (s !== 0) {
          const xr = 0.5 * (h[pim]! - tr);
          const xi = 0.5 * (h[pim + 1]! - ti);
          const sx = Math.abs(xr) + Math.abs(xi);
          if (sx > s) s = sx;
          const xsr = xr / s;
          const xsi = xi / s;
          const usr = ur / s;
          const usi = ui / s;
          csqrt(xsr * xsr - xsi * xsi + usr * usr - usi * usi, 2 * (xsr * xsi + usr * usi));
          let yr = s * OUT[0]!;
          let yi = s * OUT[1]!;
          if (sx > 0 && (xr / sx) * yr + (xi / sx) * yi < 0) {
            yr = -yr;
            yi = -yi;
          }
          cdiv(ur, ui, xr + yr, xi + yi);
          const qr = OUT[0]!;
          const qi = OUT[1]!;
          tr -= ur * qr - ui * qi;
          ti -= ur * qi + ui * qr;
        }
      }

      // --- Start of the sweep: look for two consecutive small subdiagonal entries, so the
      // rotation started at row m only creates a negligible entry at (m+1, m-1).
      let m = i - 1;
      let v1r = 0;
      let v1i = 0;
      let v2r = 0;
      let v2i = 0;
      for (;; m--) {
        const pmm = m * rs + 2 * m;
        const h11r = h[pmm]!;
        const h11i = h[pmm + 1]!;
        const h21r = h[pmm + rs]!;
        const h21i = h[pmm + rs + 1]!;
        const s11r = h11r - tr;
        const s11i = h11i - ti;
        const s = Math.abs(s11r) + Math.abs(s11i) + Math.abs(h21r) + Math.abs(h21i);
        v1r = s11r / s;
        v1i = s11i / s;
        v2r = h21r / s;
        v2i = h21i / s;
        if (m === l) break;
        const h10 = Math.abs(h[pmm - 2]!) + Math.abs(h[pmm - 1]!);
        const h22 = Math.abs(h[pmm + rs + 2]!) + Math.abs(h[pmm + rs + 3]!);
        const lhs = h10 * (Math.abs(v2r) + Math.abs(v2i));
        const rhs = ULP * ((Math.abs(v1r) + Math.abs(v1i)) * (Math.abs(h11r) + Math.abs(h11i) + h22));
        if (lhs <= rhs) break;
      }

      // --- The sweep: rotation k acts on rows/columns k, k+1.
      for (let k = m; k < i; k++) {
        const pk = k * rs + 2 * k;
        if (k === m) {
          givens(v1r, v1i, v2r, v2i);
        } else {
          givens(h[pk - 2]!, h[pk - 1]!, h[pk + rs - 2]!, h[pk + rs - 1]!);
        }
        const c = ROT[0]!;
        const sr = ROT[1]!;
        const si = ROT[2]!;
        if (k > m) {
          h[pk - 2] = ROT[3]!;
          h[pk - 1] = ROT[4]!;
          h[pk + rs - 2] = 0;
          h[pk + rs - 1] = 0;
        } else if (m > l) {
          // The entry the rotation would put at (m+1, m-1) is negligible by the choice of m.
          h[pk - 2] *= c;
          h[pk - 1] *= c;
        }
        rc[k] = c;
        rsn[2 * k] = sr;
        rsn[2 * k + 1] = si;

        // Left: rows k, k+1, columns k..i2 (unit stride): [x; y] ← [c·x + s·y; −s̄·x + c·y].
        rotateRowPair(h, pk, pk + rs, k * rs + 2 * i2 + 2, c, sr, si);
        // Right, only rows k+1..min(k+2, i), whose columns k, k+1 feed the next rotation:
        // [x y] ← [c·x + s̄·y, −s·x + c·y]. Rows ≤ k are done after the sweep.
        const rEnd = k + 2 < i ? k + 2 : i;
        for (let r = k + 1; r <= rEnd; r++) rotateColPair(h, r * rs + 2 * k, c, sr, si);
      }

      // --- Deferred right rotations: row r has had those of sweeps k < r already (rows k+1,
      // k+2 above); it still needs k = max(r, m)..i-1, in order.
      for (let r = i1; r < i; r++) rotateRow(h, r * rs, r > m ? r : m, i - 1, rc, rsn);
      if (z !== null) {
        for (let r = iloz; r <= ihiz; r++) rotateRow(z, r * rs, m, i - 1, rc, rsn);
      }
    }

    // H(i, i) is an eigenvalue; continue with the block above.
    const pii = i * rs + 2 * i;
    w[2 * i] = h[pii]!;
    w[2 * i + 1] = h[pii + 1]!;
    kdefl = 0;
    kround = 0;
    i = l - 1;
  }
  return 0;
}

/**
 * Aggressive early deflation on the trailing window kbot-nw+1..kbot of the active block
 * ktop..kbot (Braman, Byers & Mathias 2002; LAPACK zlaqr3 without its recursion).
 *
 * With the window W = U·T·Uᴴ in Schur form and s = H(kwtop, kwtop-1), the similarity by U turns
 * column kwtop-1 of the window into the spike s·(first row of U)ᴴ. Eigenvalue T(j, j) deflates
 * when its spike entry is negligible against |T(j, j)|; non-deflatable ones are moved to the
 * top of T by swaps of adjacent diagonal entries. The spike of the remaining top part is then
 * folded back by a Householder reflector and that part reduced to Hessenberg form again, and
 * the whole window transformation is applied to the rows to its left, the columns to its right
 * and to Z.
 *
 * Returns the number of deflated eigenvalues (the bottom rows of the window, now triangular
 * with zero subdiagonal) and leaves the undeflated window eigenvalues in `sc.shifts`
 * (nw − nd of them); returns −1 if the window's own QR iteration failed (nothing changed).
 */
function aed(
  n: number,
  h: Float64Array,
  ktop: number,
  kbot: number,
  nw: number,
  wantt: boolean,
  z: Float64Array | null,
  iloz: number,
  ihiz: number,
  rc: Float64Array,
  rsn: Float64Array,
  sc: QrScratch,
  smlnum: number,
): number {
  const rs = 2 * n;
  const m = nw + 1; // window plus a leading row/column that carries the spike
  const ms = 2 * m;
  const t = sc.t;
  const v = sc.v;
  const kwtop = kbot - nw + 1;
  const pspk = kwtop * rs + 2 * (kwtop - 1);
  let sr = h[pspk]!;
  let si = h[pspk + 1]!;

  t.fill(0, 0, 2 * m * m);
  for (let r = 0; r < nw; r++) {
    const c0 = r > 0 ? r - 1 : 0;
    const src = (kwtop + r) * rs + 2 * kwtop;
    const dst = (r + 1) * ms + 2;
    for (let q = 2 * c0; q < 2 * nw; q++) t[dst + q] = h[src + q]!;
  }
  v.fill(0, 0, 2 * m * m);
  for (let j = 0; j < m; j++) v[j * ms + 2 * j] = 1;
  if (qrIterate(m, 1, nw, t, true, v, 1, nw, sc.wv, rc, rsn, null) > 0) return -1;

  // Deflation check from the bottom; an undeflatable eigenvalue is moved to the top so the
  // deflatable ones collect at the bottom.
  let sabs = Math.abs(sr) + Math.abs(si);
  let ns = nw;
  let ilst = 1;
  while (ilst <= ns) {
    const pj = ns * ms + 2 * ns;
    let foo = Math.abs(t[pj]!) + Math.abs(t[pj + 1]!);
    if (foo === 0) foo = sabs;
    const spike = sabs * (Math.abs(v[ms + 2 * ns]!) + Math.abs(v[ms + 2 * ns + 1]!));
    const tol = ULP * foo;
    if (spike <= (tol > smlnum ? tol : smlnum)) {
      ns--;
    } else {
      for (let q = ns - 1; q >= ilst; q--) swapDiagonal(t, v, m, q);
      ilst++;
    }
  }
  if (ns === 0) {
    sr = 0;
    si = 0;
    sabs = 0;
  }
  const nd = nw - ns;
  for (let q = 0; q < ns; q++) {
    const p = (q + 1) * ms + 2 * (q + 1);
    sc.shifts[2 * q] = t[p]!;
    sc.shifts[2 * q + 1] = t[p + 1]!;
  }
  if (nd === 0) return 0; // nothing deflates: keep H as it was, only the shifts are used

  // Spike s·conj(U(0, j)) for the undeflated part, zero for the deflated part.
  for (let j = 1; j <= nw; j++) {
    const p = j * ms;
    if (j <= ns) {
      const ur = v[ms + 2 * j]!;
      const ui = -v[ms + 2 * j + 1]!;
      t[p] = sr * ur - si * ui;
      t[p + 1] = sr * ui + si * ur;
    } else {
      t[p] = 0;
      t[p + 1] = 0;
    }
  }
  if (ns > 1 && sabs !== 0) {
    // Reflect the spike onto its first entry and restore Hessenberg form in one reduction of
    // the bordered matrix (its column 0 is the spike); rows/columns past ns are untouched.
    zgehrd(m, 0, ns, t, sc.vs, sc.tau, sc.work);
    zunmhrRight(m, 0, ns, sc.vs, sc.tau, v, m, 1, nw);
  }

  // Copy the window back; H(kwtop, kwtop-1) becomes the folded spike.
  for (let r = 0; r < nw; r++) {
    const c0 = r > 0 ? r - 1 : 0;
    const dst = (kwtop + r) * rs + 2 * kwtop;
    const src = (r + 1) * ms + 2;
    for (let q = 2 * c0; q < 2 * nw; q++) h[dst + q] = t[src + q]!;
  }
  h[pspk] = t[ms]!;
  h[pspk + 1] = t[ms + 1]!;

  // Apply U (= v without its border) to the rest: rows above the window from the right,
  // columns right of the window from the left (only with the full Schur form), and Z.
  const ltop = wantt ? 0 : ktop;
  const slab = sc.slab;
  for (let r = ltop; r < kwtop; r++) mulRowByU(h, r * rs + 2 * kwtop, v, m, nw, slab);
  if (z !== null) {
    for (let r = iloz; r <= ihiz; r++) mulRowByU(z, r * rs + 2 * kwtop, v, m, nw, slab);
  }
  if (wantt && kbot + 1 < n) {
    const nc2 = 2 * (n - kbot - 1);
    const c0 = 2 * (kbot + 1);
    slab.fill(0, 0, nw * nc2);
    for (let k = 0; k < nw; k++) {
      const hb = (kwtop + k) * rs + c0;
      const ub = (k + 1) * ms + 2;
      for (let j = 0; j < nw; j++) {
        const fr = v[ub + 2 * j]!;
        const fi = -v[ub + 2 * j + 1]!; // conj(U(k, j))
        if (fr === 0 && fi === 0) continue;
        const ob = j * nc2;
        for (let q = 0; q < nc2; q += 2) {
          const xr = h[hb + q]!;
          const xi = h[hb + q + 1]!;
          slab[ob + q] += fr * xr - fi * xi;
          slab[ob + q + 1] += fr * xi + fi * xr;
        }
      }
    }
    for (let j = 0; j < nw; j++) {
      const hb = (kwtop + j) * rs + c0;
      const ob = j * nc2;
      for (let q = 0; q < nc2; q++) h[hb + q] = slab[ob + q]!;
    }
  }
  return nd;
}

/**
 * Row segment x (nw complex entries at `base` of `d`) ← x·U, where U is the window block of the
 * bordered (m×m) matrix `v`. `tmp` (≥ 2nw) holds a copy of x.
 */
function mulRowByU(d: Float64Array, base: number, v: Float64Array, m: number, nw: number, tmp: Float64Array): void {
  const ms = 2 * m;
  const n2 = 2 * nw;
  for (let q = 0; q < n2; q++) {
    tmp[q] = d[base + q]!;
    d[base + q] = 0;
  }
  for (let k = 0; k < nw; k++) {
    const xr = tmp[2 * k]!;
    const xi = tmp[2 * k + 1]!;
    if (xr === 0 && xi === 0) continue;
    const ub = (k + 1) * ms + 2;
    for (let q = 0; q < n2; q += 2) {
      const ur = v[ub + q]!;
      const ui = v[ub + q + 1]!;
      d[base + q] += xr * ur - xi * ui;
      d[base + q + 1] += xr * ui + xi * ur;
    }
  }
}

/**
 * Exchange the adjacent diagonal entries k, k+1 of the upper triangular m×m `t` by a unitary
 * similarity, and accumulate it into the columns of `v` (rows 1..m-1). The rotation G with
 * G·[t12; t22 − t11] = [r; 0] maps the eigenvector of t22 onto e₁, so G·T·Gᴴ has t22 and t11
 * swapped and T(k, k+1) unchanged (the ztrexc construction).
 */
function swapDiagonal(t: Float64Array, v: Float64Array, m: number, k: number): void {
  const ms = 2 * m;
  const pk = k * ms + 2 * k;
  const pl = pk + ms + 2;
  const t11r = t[pk]!;
  const t11i = t[pk + 1]!;
  const t22r = t[pl]!;
  const t22i = t[pl + 1]!;
  givens(t[pk + 2]!, t[pk + 3]!, t22r - t11r, t22i - t11i);
  const c = ROT[0]!;
  const sr = ROT[1]!;
  const si = ROT[2]!;
  if (k + 2 < m) rotateRowPair(t, pk + 4, pk + ms + 4, k * ms + ms, c, sr, si);
  for (let r = 1; r < k; r++) rotateColPair(t, r * ms + 2 * k, c, sr, si);
  for (let r = 1; r < m; r++) rotateColPair(v, r * ms + 2 * k, c, sr, si);
  t[pk] = t22r;
  t[pk + 1] = t22i;
  t[pl] = t11r;
  t[pl + 1] = t11i;
}

/**
 * Plane rotation G = [c s; −s̄ c] (c real, s complex) with G·[f; g] = [r; 0] and
 * r = (f/|f|)·√(|f|² + |g|²); results in ROT. Inputs are scaled by their largest component so
 * nothing overflows or underflows.
 */
function givens(fr: number, fi: number, gr: number, gi: number): void {
  const afr = Math.abs(fr);
  const afi = Math.abs(fi);
  const agr = Math.abs(gr);
  const agi = Math.abs(gi);
  let sc = afr > afi ? afr : afi;
  const gm = agr > agi ? agr : agi;
  if (gm > sc) sc = gm;
  if (gm === 0) {
    ROT[0] = 1;
    ROT[1] = 0;
    ROT[2] = 0;
    ROT[3] = fr;
    ROT[4] = fi;
    return;
  }
  const fsr = fr / sc;
  const fsi = fi / sc;
  const gsr = gr / sc;
  const gsi = gi / sc;
  const fa2 = fsr * fsr + fsi * fsi;
  const ga2 = gsr * gsr + gsi * gsi;
  if (fa2 === 0) {
    const ga = Math.sqrt(ga2);
    ROT[0] = 0;
    ROT[1] = gsr / ga;
    ROT[2] = -gsi / ga;
    ROT[3] = ga * sc;
    ROT[4] = 0;
    return;
  }
  const fa = Math.sqrt(fa2);
  const rho = Math.sqrt(fa2 + ga2);
  const phr = fsr / fa;
  const phi = fsi / fa;
  ROT[0] = fa / rho;
  ROT[1] = (phr * gsr + phi * gsi) / rho;
  ROT[2] = (phi * gsr - phr * gsi) / rho;
  ROT[3] = phr * rho * sc;
  ROT[4] = phi * rho * sc;
}

/** Left rotation of two rows from positions p and q (q − p = row stride) up to pend (exclusive of p's row). */
function rotateRowPair(d: Float64Array, p: number, q: number, pend: number, c: number, sr: number, si: number): void {
  for (; p < pend; p += 2, q += 2) {
    const xr = d[p]!;
    const xi = d[p + 1]!;
    const yr = d[q]!;
    const yi = d[q + 1]!;
    d[p] = c * xr + (sr * yr - si * yi);
    d[p + 1] = c * xi + (sr * yi + si * yr);
    d[q] = c * yr - (sr * xr + si * xi);
    d[q + 1] = c * yi - (sr * xi - si * xr);
  }
}

/** Right rotation of the adjacent entries at p, p+2: [x y] ← [c·x + s̄·y, −s·x + c·y]. */
function rotateColPair(d: Float64Array, p: number, c: number, sr: number, si: number): void {
  const xr = d[p]!;
  const xi = d[p + 1]!;
  const yr = d[p + 2]!;
  const yi = d[p + 3]!;
  d[p] = c * xr + (sr * yr + si * yi);
  d[p + 1] = c * xi + (sr * yi - si * yr);
  d[p + 2] = c * yr - (sr * xr - si * xi);
  d[p + 3] = c * yi - (sr * xi + si * xr);
}

/**
 * Apply the right rotations a..b of a sweep to one row (starting at `base`): for each k in
 * order, [x_k, x_k+1] ← [c·x_k + s̄·x_k+1, −s·x_k + c·x_k+1]. The second entry of each pair is
 * carried in registers into the next rotation, so each entry is loaded and stored once.
 */
function rotateRow(d: Float64Array, base: number, a: number, b: number, rc: Float64Array, rsn: Float64Array): void {
  let p = base + 2 * a;
  let xr = d[p]!;
  let xi = d[p + 1]!;
  for (let k = a; k <= b; k++) {
    const c = rc[k]!;
    const sr = rsn[2 * k]!;
    const si = rsn[2 * k + 1]!;
    const yr = d[p + 2]!;
    const yi = d[p + 3]!;
    d[p] = c * xr + (sr * yr + si * yi);
    d[p + 1] = c * xi + (sr * yi - si * yr);
    const nr = c * yr - (sr * xr - si * xi);
    const ni = c * yi - (sr * xi + si * xr);
    xr = nr;
    xi = ni;
    p += 2;
  }
  d[p] = xr;
  d[p + 1] = xi;
}

/** Principal square root of x + iy into OUT, without overflow for |x|,|y| up to ~1e307. */
function csqrt(x: number, y: number): void {
  if (x === 0 && y === 0) {
    OUT[0] = 0;
    OUT[1] = 0;
    return;
  }
  const ax = Math.abs(x);
  const ay = Math.abs(y);
  const big = ax > ay ? ax : ay;
  const small = ax > ay ? ay : ax;
  const t = small / big;
  const mod = big * Math.sqrt(1 + t * t);
  // √((|z| + |x|)/2) is computed without cancellation; the other part follows from y = 2·u·v.
  const u = Math.sqrt(0.5 * mod + 0.5 * ax);
  const v = ay / (2 * u);
  if (x >= 0) {
    OUT[0] = u;
    OUT[1] = y >= 0 ? v : -v;
  } else {
    OUT[0] = v;
    OUT[1] = y >= 0 ? u : -u;
  }
}

/** (ar + i·ai)/(br + i·bi) into OUT, scaled so |b|² is never formed (Smith's algorithm). */
function cdiv(ar: number, ai: number, br: number, bi: number): void {
  if (Math.abs(br) >= Math.abs(bi)) {
    const t = bi / br;
    const d = br + bi * t;
    OUT[0] = (ar + ai * t) / d;
    OUT[1] = (ai - ar * t) / d;
  } else {
    const t = br / bi;
    const d = bi + br * t;
    OUT[0] = (ar * t + ai) / d;
    OUT[1] = (ai * t - ar) / d;
  }
}
