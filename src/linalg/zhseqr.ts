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
 *   whose "spike" coupling to the rest is negligible are deflated at once, and a third of the
 *   others (those nearest the bottom) serve as the shifts of the following sweeps. Measured on
 *   random matrices (scripts/bench-zgeev.ts): about 8% less time at order 200, 25% at 400;
 * - an iteration cap of 30 sweeps per eigenvalue of the active block (total), after which the
 *   kernel reports failure instead of looping forever.
 *
 * Performance. Almost all the time goes into applying plane rotations. They run in small
 * WebAssembly SIMD kernels (one complex entry per 128-bit vector; see the end of this file) on H
 * and Z in place when the project's WebAssembly backend is active, else in TypeScript loops.
 * Storage is interleaved (re, im), row-major (see {@link CMatrix}), so the left
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
import { zgemmBase } from './zgemm.ts';
import { linalgBackend } from './wasm/runtime.ts';

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
/**
 * Active blocks at least this large use aggressive early deflation. Below it the window's own
 * Schur form and products cost more than the sweeps they save (measured at orders 100–200).
 */
export const AED_MIN_ORDER = 120;
/**
 * Fraction of a window's undeflated eigenvalues used as shifts before the next window is tried:
 * those that were nearest the bottom. Measured on random matrices of order 100–400, a third
 * gave the least work; using all of them as separate single-shift sweeps spends many sweeps on
 * still-poor shifts.
 */
const SHIFT_FRACTION = 1 / 3;
/** Percentage of the window that must deflate for the next window to be tried before sweeping. */
const NIBBLE = 14;

/**
 * Deflation-window size for an active block of order nh (0: no early deflation). Grows like
 * nh/(2·log₂ nh): half the rule of thumb of the LAPACK tuning routine iparmq, because with the
 * SIMD sweeps the window's own Schur form weighs relatively more (measured at orders 100–400).
 */
export function aedWindow(nh: number): number {
  if (nh < AED_MIN_ORDER) return 0;
  const w = Math.round(nh / (2 * Math.round(Math.log2(nh))));
  return Math.min(nh - 1, Math.max(10, w + (w & 1)));
}

/** Result slots of the small complex helpers below (one allocation at module load). */
const OUT = new Float64Array(2);
/** Rotation from {@link givens}: c, Re s, Im s, Re r, Im r. */
const ROT = new Float64Array(5);
/**
 * Input of {@link givens}: f (re, im), g (re, im). The rotation helpers take their numbers
 * through these arrays, not as arguments: in the large QR routines the engine does not inline
 * them, and a double passed to a call that is not inlined is boxed on the heap — some 120 kB of
 * garbage per eigen-solve at n = 31, which kept the collector busy.
 */
const GIN = new Float64Array(4);

/**
 * Working storage of {@link zhseqr} at order n, allocated once per workspace: the n×n matrices
 * H and Z themselves (so the SIMD rotation kernels can work on them in place, they live in the
 * kernels' WebAssembly memory when that is available, else in an ordinary buffer), the packed
 * rotations of a sweep, and the aggressive-early-deflation window (about 10·w² + 4·w·n doubles
 * for the largest window w).
 */
export class QrScratch {
  /** n×n working matrix for H (and the balanced A and T before/after it). */
  readonly h: Float64Array;
  /** n×n matrix for Q and the Schur vectors. */
  readonly z: Float64Array;
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
  /** n×w: copies of the rows/columns next to the window, and their products with U. */
  readonly slab: Float64Array;
  readonly slab2: Float64Array;
  /** w×w: the window's transformation U and Uᴴ, contiguous for the matrix products. */
  readonly u: Float64Array;
  readonly uh: Float64Array;
  /** Rotations of one sweep packed for the SIMD kernels: (c, c, Re s, Re s, Im s, −Im s). */
  readonly rot: Float64Array;
  /** The SIMD kernels bound to the memory holding h, z, t, v and rot; null without SIMD. */
  readonly kernels: RotationKernels | null;

  constructor(n: number) {
    const w = aedWindow(n);
    const m = w + 1;
    this.nwMax = w;
    const inMemory = 4 * n * n + 4 * m * m + 6 * Math.max(n, m);
    const mod = getRotationModule();
    let buffer: ArrayBuffer | null = null;
    let kernels: RotationKernels | null = null;
    if (mod !== null) {
      try {
        const mem = new WebAssembly.Memory({ initial: Math.max(1, Math.ceil((8 * inMemory) / 65536)) });
        const inst = new WebAssembly.Instance(mod, { env: { mem } });
        kernels = inst.exports as unknown as RotationKernels;
        buffer = mem.buffer; // fixed size: the memory never grows, so these views stay valid
      } catch {
        kernels = null;
      }
    }
    if (buffer === null) buffer = new ArrayBuffer(8 * inMemory);
    let at = 0;
    const take = (len: number): Float64Array => {
      const view = new Float64Array(buffer, 8 * at, len);
      at += len;
      return view;
    };
    this.h = take(2 * n * n);
    this.z = take(2 * n * n);
    this.t = take(2 * m * m);
    this.v = take(2 * m * m);
    this.rot = take(6 * Math.max(n, m));
    this.kernels = kernels;
    this.vs = new Float64Array(2 * m * m);
    this.tau = new Float64Array(2 * m);
    this.work = new Float64Array(2 * m);
    this.wv = new Float64Array(2 * m);
    this.shifts = new Float64Array(2 * m);
    this.slab = new Float64Array(2 * w * n);
    this.slab2 = new Float64Array(2 * w * n);
    this.u = new Float64Array(2 * w * w);
    this.uh = new Float64Array(2 * w * w);
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
 * @param scratch working storage for order n (early deflation, and the SIMD kernels when `h`
 *   and `z` are its own `h` and `z`); null disables both
 * @returns 0 on success; otherwise i+1 where i is the row at which the iteration cap was hit
 *   (eigenvalues i+1..ihi had converged, the others in w are not set)
 * @throws nothing: the kernel trusts its input and reports non-convergence by its result
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
  return qrIterate(n, ilo, ihi, h, wantt, z, ilo, ihi, w, rc, rsn, scratch, scratch);
}

/**
 * {@link zhseqr} with an explicit row range iloz..ihiz of Z to update; `sc` enables early
 * deflation, `mem` the SIMD kernels for whichever of h, z lie in its memory.
 */
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
  mem: QrScratch | null,
): number {
  const rs = 2 * n;
  // SIMD kernels apply to arrays inside their memory (byte offsets), −1 marks the TS loops.
  const kern = mem !== null && mem.kernels !== null && linalgBackend() === 'wasm' ? mem.kernels : null;
  const hOff = kern !== null && h.buffer === mem!.rot.buffer ? h.byteOffset : -1;
  const zOff = kern !== null && z !== null && z.buffer === mem!.rot.buffer ? z.byteOffset : -1;
  const rot = mem !== null ? mem.rot : null;
  const rotOff = rot !== null ? rot.byteOffset : 0;
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
          nq = Math.ceil((nw - nd) * SHIFT_FRACTION);
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
            nq = Math.max(nq, 1);
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
          GIN[0] = v1r;
          GIN[1] = v1i;
          GIN[2] = v2r;
          GIN[3] = v2i;
          givens();
        } else {
          GIN[0] = h[pk - 2]!;
          GIN[1] = h[pk - 1]!;
          GIN[2] = h[pk + rs - 2]!;
          GIN[3] = h[pk + rs - 1]!;
          givens();
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
        if (kern !== null) {
          const o = 6 * k;
          rot![o] = c;
          rot![o + 1] = c;
          rot![o + 2] = sr;
          rot![o + 3] = sr;
          rot![o + 4] = si;
          rot![o + 5] = -si;
        }

        // Left: rows k, k+1, columns k..i2 (unit stride): [x; y] ← [c·x + s·y; −s̄·x + c·y].
        if (hOff >= 0) {
          kern!.rotPair(hOff + 8 * pk, hOff + 8 * (pk + rs), i2 - k + 1, rotOff + ROT_BYTES * k);
        } else {
          rotateRowPair(h, pk, pk + rs, k * rs + 2 * i2 + 2);
        }
        // Right, only rows k+1..min(k+2, i), whose columns k, k+1 feed the next rotation:
        // [x y] ← [c·x + s̄·y, −s·x + c·y]. Rows ≤ k are done after the sweep.
        const rEnd = k + 2 < i ? k + 2 : i;
        for (let r = k + 1; r <= rEnd; r++) rotateColPair(h, r * rs + 2 * k);
      }

      // --- Deferred right rotations: row r has had those of sweeps k < r already (rows k+1,
      // k+2 above); it still needs k = max(r, m)..i-1, in order.
      if (hOff >= 0) {
        const rb = rotOff + ROT_BYTES * m;
        if (i1 < m) kern!.rotRect(hOff + 8 * (i1 * rs + 2 * m), m - i1, 8 * rs, i - m, rb);
        kern!.rotStair(hOff + 8 * (m * rs + 2 * m), i - m, 8 * rs, i - m, rb);
      } else {
        for (let r = i1; r < i; r++) rotateRow(h, r * rs, r > m ? r : m, i - 1, rc, rsn);
      }
      if (zOff >= 0) {
        kern!.rotRect(zOff + 8 * (iloz * rs + 2 * m), ihiz - iloz + 1, 8 * rs, i - m, rotOff + ROT_BYTES * m);
      } else if (z !== null) {
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
  if (qrIterate(m, 1, nw, t, true, v, 1, nw, sc.wv, rc, rsn, null, sc) > 0) return -1;

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
  // columns right of the window from the left (only with the full Schur form), and Z. These are
  // the bulk of the window's cost and run as matrix products (the project's zgemm).
  const u = sc.u;
  const uh = sc.uh;
  for (let r = 0; r < nw; r++) {
    for (let c = 0; c < nw; c++) {
      const p = (r + 1) * ms + 2 * (c + 1);
      const ur = v[p]!;
      const ui = v[p + 1]!;
      u[2 * (r * nw + c)] = ur;
      u[2 * (r * nw + c) + 1] = ui;
      uh[2 * (c * nw + r)] = ur;
      uh[2 * (c * nw + r) + 1] = -ui;
    }
  }
  const ltop = wantt ? 0 : ktop;
  if (kwtop > ltop) multiplyColumnsByU(h, n, ltop, kwtop - 1, kwtop, nw, u, sc);
  if (z !== null) multiplyColumnsByU(z, n, iloz, ihiz, kwtop, nw, u, sc);
  if (wantt && kbot + 1 < n) {
    const nc = n - kbot - 1;
    const nc2 = 2 * nc;
    const c0 = 2 * (kbot + 1);
    const x = sc.slab;
    const y = sc.slab2;
    for (let k = 0; k < nw; k++) {
      const hb = (kwtop + k) * rs + c0;
      for (let q = 0; q < nc2; q++) x[k * nc2 + q] = h[hb + q]!;
    }
    zgemmBase(nw, nc, nw, 1, 0, uh, x, 0, 0, y);
    for (let k = 0; k < nw; k++) {
      const hb = (kwtop + k) * rs + c0;
      for (let q = 0; q < nc2; q++) h[hb + q] = y[k * nc2 + q]!;
    }
  }
  return nd;
}

/**
 * Columns c0..c0+nw-1 of rows r0..r1 of the n×n row-major `d` ← themselves times U (nw×nw,
 * contiguous), through the contiguous slabs of `sc`.
 */
function multiplyColumnsByU(
  d: Float64Array,
  n: number,
  r0: number,
  r1: number,
  c0: number,
  nw: number,
  u: Float64Array,
  sc: QrScratch,
): void {
  const rs = 2 * n;
  const n2 = 2 * nw;
  const rows = r1 - r0 + 1;
  const x = sc.slab;
  const y = sc.slab2;
  for (let r = 0; r < rows; r++) {
    const b = (r0 + r) * rs + 2 * c0;
    for (let q = 0; q < n2; q++) x[r * n2 + q] = d[b + q]!;
  }
  zgemmBase(rows, nw, nw, 1, 0, x, u, 0, 0, y);
  for (let r = 0; r < rows; r++) {
    const b = (r0 + r) * rs + 2 * c0;
    for (let q = 0; q < n2; q++) d[b + q] = y[r * n2 + q]!;
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
  GIN[0] = t[pk + 2]!;
  GIN[1] = t[pk + 3]!;
  GIN[2] = t22r - t11r;
  GIN[3] = t22i - t11i;
  givens();
  if (k + 2 < m) rotateRowPair(t, pk + 4, pk + ms + 4, k * ms + ms);
  for (let r = 1; r < k; r++) rotateColPair(t, r * ms + 2 * k);
  for (let r = 1; r < m; r++) rotateColPair(v, r * ms + 2 * k);
  t[pk] = t22r;
  t[pk + 1] = t22i;
  t[pl] = t11r;
  t[pl + 1] = t11i;
}

/**
 * Plane rotation G = [c s; −s̄ c] (c real, s complex) with G·[f; g] = [r; 0] and
 * r = (f/|f|)·√(|f|² + |g|²); f and g from GIN, results in ROT (c, Re s, Im s, Re r, Im r).
 *
 * |f| and |g| are each computed after scaling by their own largest component, and the phases
 * f/|f|, g/|g| from them, so c² + |s|² = 1 to rounding even when |f|/|g| is far below the square
 * root of the underflow threshold (a single common scale would square such an f into a subnormal
 * and lose the phase, which the property tests caught).
 */
function givens(): void {
  const fr = GIN[0]!;
  const fi = GIN[1]!;
  const gr = GIN[2]!;
  const gi = GIN[3]!;
  const afr = Math.abs(fr);
  const afi = Math.abs(fi);
  const agr = Math.abs(gr);
  const agi = Math.abs(gi);
  const fm = afr > afi ? afr : afi;
  const gm = agr > agi ? agr : agi;
  if (gm === 0) {
    ROT[0] = 1;
    ROT[1] = 0;
    ROT[2] = 0;
    ROT[3] = fr;
    ROT[4] = fi;
    return;
  }
  let t = afr > afi ? afi / afr : afr / afi;
  const tg = agr > agi ? agi / agr : agr / agi;
  const ga = gm * Math.sqrt(1 + tg * tg);
  if (fm === 0) {
    ROT[0] = 0;
    ROT[1] = gr / ga;
    ROT[2] = -gi / ga;
    ROT[3] = ga;
    ROT[4] = 0;
    return;
  }
  const fa = fm * Math.sqrt(1 + t * t);
  const big = fa > ga ? fa : ga;
  t = (fa > ga ? ga : fa) / big;
  const rho = big * Math.sqrt(1 + t * t);
  const phr = fr / fa; // f/|f|
  const phi = fi / fa;
  const ugr = gr / ga; // g/|g|
  const ugi = gi / ga;
  const sg = ga / rho;
  ROT[0] = fa / rho;
  ROT[1] = (phr * ugr + phi * ugi) * sg;
  ROT[2] = (phi * ugr - phr * ugi) * sg;
  ROT[3] = phr * rho;
  ROT[4] = phi * rho;
}

/** Left rotation of two rows from positions p and q (q − p = row stride) up to pend (exclusive of p's row). */
function rotateRowPair(d: Float64Array, p: number, q: number, pend: number): void {
  const c = ROT[0]!;
  const sr = ROT[1]!;
  const si = ROT[2]!;
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
function rotateColPair(d: Float64Array, p: number): void {
  const c = ROT[0]!;
  const sr = ROT[1]!;
  const si = ROT[2]!;
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

// ---- SIMD rotation kernels -----------------------------------------------------------------
//
// The sweeps of the QR iteration spend almost all their time applying plane rotations to pairs
// of complex entries, and plain JavaScript caps that at about 20 scalar flops per pair. A complex
// number fits one 128-bit WebAssembly SIMD vector (lane 0 = re, lane 1 = im), and with the
// rotation pre-packed as C = (c, c), SR = (Re s, Re s), SN = (Im s, −Im s) both updates need
// three vector multiplies, two adds and one lane swap:
//   left  (rows):    x' = C·x + SR·y − SN·swap(y),   y' = C·y − SR·x − SN·swap(x)
//   right (columns): x' = C·x + SR·y + SN·swap(y),   y' = C·y − SR·x + SN·swap(x)
// (from s·y = SR·y − SN·swap(y) and s̄·y = SR·y + SN·swap(y)). The module is tiny, so it is
// assembled here from the instruction list below rather than shipped as a binary; the matrices
// it works on (H, Z and the deflation window) are allocated inside its memory by QrScratch, so
// no data is copied. It is used when the project's WebAssembly backend is active
// (wasm/runtime.ts: FURROW_NO_WASM=1 or setLinalgBackend('ts') select the TypeScript loops).

/** Bytes per packed rotation in the kernels' rotation buffer: C, SR, SN. */
const ROT_BYTES = 48;

/** The SIMD rotation kernels (byte offsets into the memory of the QrScratch that owns them). */
export interface RotationKernels {
  /** Left rotation of two rows: cnt entries from byte offsets p and q, rotation at byte r. */
  rotPair(p: number, q: number, cnt: number, r: number): void;
  /** Right rotations r, r+1, … (cnt of them) swept along nrows rows, from byte p, row stride. */
  rotRect(p: number, nrows: number, stride: number, cnt: number, r: number): void;
  /** As rotRect, but row j starts one entry further right, one rotation later, with cnt − j. */
  rotStair(p: number, nrows: number, stride: number, cnt: number, r: number): void;
}

/** Unsigned LEB128. */
function uleb(n: number, out: number[]): void {
  do {
    let b = n & 0x7f;
    n >>>= 7;
    if (n !== 0) b |= 0x80;
    out.push(b);
  } while (n !== 0);
}

function wasmVec(items: number[][]): number[] {
  const o: number[] = [];
  uleb(items.length, o);
  for (const it of items) o.push(...it);
  return o;
}

function wasmName(s: string): number[] {
  const o: number[] = [];
  uleb(s.length, o);
  for (let k = 0; k < s.length; k++) o.push(s.charCodeAt(k));
  return o;
}

/** Encode the rotation module (binary format of the WebAssembly core spec 2.0 with SIMD). */
function rotationModuleBytes(): Uint8Array<ArrayBuffer> {
  // instructions
  const get = (i: number): number[] => [0x20, i];
  const set = (i: number): number[] => [0x21, i];
  const i32 = (n: number): number[] => {
    // small non-negative constants only (signed LEB128)
    const o = [0x41];
    let v = n;
    for (;;) {
      const b = v & 0x7f;
      v >>= 7;
      if (v === 0 && (b & 0x40) === 0) {
        o.push(b);
        return o;
      }
      o.push(b | 0x80);
    }
  };
  const ADD = [0x6a];
  const SUB = [0x6b];
  const MUL = [0x6c];
  const SHL = [0x74];
  const EQZ = [0x45];
  const LT_S = [0x48];
  const GE_U = [0x4f];
  const BLOCK = [0x02, 0x40];
  const LOOP = [0x03, 0x40];
  const END = [0x0b];
  const brIf = (d: number): number[] => [0x0d, d];
  const br = (d: number): number[] => [0x0c, d];
  const call = (f: number): number[] => [0x10, f];
  const load = (off: number): number[] => {
    const o = [0xfd, 0x00, 4];
    uleb(off, o);
    return o;
  };
  const store = (off: number): number[] => {
    const o = [0xfd, 0x0b, 4];
    uleb(off, o);
    return o;
  };
  const FADD = [0xfd, 0xf0, 0x01];
  const FSUB = [0xfd, 0xf1, 0x01];
  const FMUL = [0xfd, 0xf2, 0x01];
  const SWAP = [0xfd, 0x0d, 8, 9, 10, 11, 12, 13, 14, 15, 0, 1, 2, 3, 4, 5, 6, 7]; // i8x16.shuffle
  const cat = (...parts: number[][]): number[] => ([] as number[]).concat(...parts);
  const I32T = 0x7f;
  const V128T = 0x7b;

  // f0 row1(p, cnt, r): right rotations along one row; x is carried in a register.
  // locals: 3 x, 4 y, 5 c, 6 sr, 7 sn (v128); 8 end (i32)
  const row1 = cat(
    get(0), get(1), i32(16), MUL, ADD, set(8),
    get(0), load(0), set(3),
    BLOCK, LOOP,
    get(0), get(8), GE_U, brIf(1),
    get(2), load(0), set(5), get(2), load(16), set(6), get(2), load(32), set(7),
    get(0), load(16), set(4),
    get(0), get(5), get(3), FMUL, get(6), get(4), FMUL, FADD, get(7), get(4), get(4), SWAP, FMUL, FADD, store(0),
    get(5), get(4), FMUL, get(6), get(3), FMUL, FSUB, get(7), get(3), get(3), SWAP, FMUL, FADD, set(3),
    get(0), i32(16), ADD, set(0),
    get(2), i32(ROT_BYTES), ADD, set(2),
    br(0), END, END,
    get(0), get(3), store(0),
    END,
  );
  // f1 row2(p, cnt, r, stride): the same on rows p and p+stride, two independent chains.
  // locals: 4 x, 5 y, 6 c, 7 sr, 8 sn, 9 u, 10 w (v128); 11 end, 12 q (i32)
  const row2 = cat(
    get(0), get(1), i32(16), MUL, ADD, set(11),
    get(0), get(3), ADD, set(12),
    get(0), load(0), set(4),
    get(12), load(0), set(9),
    BLOCK, LOOP,
    get(0), get(11), GE_U, brIf(1),
    get(2), load(0), set(6), get(2), load(16), set(7), get(2), load(32), set(8),
    get(0), load(16), set(5),
    get(12), load(16), set(10),
    get(0), get(6), get(4), FMUL, get(7), get(5), FMUL, FADD, get(8), get(5), get(5), SWAP, FMUL, FADD, store(0),
    get(12), get(6), get(9), FMUL, get(7), get(10), FMUL, FADD, get(8), get(10), get(10), SWAP, FMUL, FADD, store(0),
    get(6), get(5), FMUL, get(7), get(4), FMUL, FSUB, get(8), get(4), get(4), SWAP, FMUL, FADD, set(4),
    get(6), get(10), FMUL, get(7), get(9), FMUL, FSUB, get(8), get(9), get(9), SWAP, FMUL, FADD, set(9),
    get(0), i32(16), ADD, set(0),
    get(12), i32(16), ADD, set(12),
    get(2), i32(ROT_BYTES), ADD, set(2),
    br(0), END, END,
    get(0), get(4), store(0),
    get(12), get(9), store(0),
    END,
  );
  // f2 rotPair(p, q, cnt, r): left rotation of rows p and q.
  // locals: 4 x, 5 y, 6 c, 7 sr, 8 sn (v128); 9 end (i32)
  const rotPair = cat(
    get(0), get(2), i32(16), MUL, ADD, set(9),
    get(3), load(0), set(6), get(3), load(16), set(7), get(3), load(32), set(8),
    BLOCK, LOOP,
    get(0), get(9), GE_U, brIf(1),
    get(0), load(0), set(4),
    get(1), load(0), set(5),
    get(0), get(6), get(4), FMUL, get(7), get(5), FMUL, FADD, get(8), get(5), get(5), SWAP, FMUL, FSUB, store(0),
    get(1), get(6), get(5), FMUL, get(7), get(4), FMUL, FSUB, get(8), get(4), get(4), SWAP, FMUL, FSUB, store(0),
    get(0), i32(16), ADD, set(0),
    get(1), i32(16), ADD, set(1),
    br(0), END, END,
    END,
  );
  // f3 rotRect(p, nrows, stride, cnt, r): rows in pairs through row2, a last odd row through row1.
  const rotRect = cat(
    BLOCK, LOOP,
    get(1), i32(2), LT_S, brIf(1),
    get(0), get(3), get(4), get(2), call(1),
    get(0), get(2), i32(1), SHL, ADD, set(0),
    get(1), i32(2), SUB, set(1),
    br(0), END, END,
    BLOCK, get(1), EQZ, brIf(0),
    get(0), get(3), get(4), call(0),
    END,
    END,
  );
  // f4 rotStair(p, nrows, stride, cnt, r): row j from p + j·(stride + 16), cnt − j rotations
  // starting at r + j·ROT_BYTES. Rows go in pairs: the first rotation of row j alone (row1 with
  // one rotation), then rows j and j+1 together through row2 from the next column on, which
  // keeps two independent chains in flight instead of one.
  const rotStair = cat(
    BLOCK, LOOP,
    get(1), i32(2), LT_S, brIf(1),
    get(0), i32(1), get(4), call(0),
    get(0), i32(16), ADD, get(3), i32(1), SUB, get(4), i32(ROT_BYTES), ADD, get(2), call(1),
    get(0), get(2), i32(16), ADD, i32(1), SHL, ADD, set(0),
    get(3), i32(2), SUB, set(3),
    get(4), i32(2 * ROT_BYTES), ADD, set(4),
    get(1), i32(2), SUB, set(1),
    br(0), END, END,
    BLOCK, get(1), EQZ, brIf(0),
    get(0), get(3), get(4), call(0),
    END,
    END,
  );
  const body = (locals: number[][], code: number[]): number[] => {
    const inner = cat(wasmVec(locals), code);
    const o: number[] = [];
    uleb(inner.length, o);
    return cat(o, inner);
  };
  const section = (id: number, content: number[]): number[] => {
    const o = [id];
    uleb(content.length, o);
    return cat(o, content);
  };
  const fnType = (nParams: number): number[] => cat([0x60], wasmVec(new Array<number[]>(nParams).fill([I32T])), [0x00]);
  const bytes = cat(
    [0x00, 0x61, 0x73, 0x6d, 0x01, 0x00, 0x00, 0x00],
    section(1, wasmVec([fnType(3), fnType(4), fnType(5)])),
    section(2, wasmVec([cat(wasmName('env'), wasmName('mem'), [0x02, 0x00, 0x01])])),
    section(3, wasmVec([[0], [1], [1], [2], [2]])),
    section(
      7,
      wasmVec([
        cat(wasmName('rotPair'), [0x00, 2]),
        cat(wasmName('rotRect'), [0x00, 3]),
        cat(wasmName('rotStair'), [0x00, 4]),
      ]),
    ),
    section(
      10,
      wasmVec([
        body([[5, V128T], [1, I32T]], row1),
        body([[7, V128T], [2, I32T]], row2),
        body([[5, V128T], [1, I32T]], rotPair),
        body([], rotRect),
        body([], rotStair),
      ]),
    ),
  );
  const out = new Uint8Array(new ArrayBuffer(bytes.length));
  out.set(bytes);
  return out;
}

let rotationModule: WebAssembly.Module | null | undefined;

/** The compiled rotation module, or null where WebAssembly SIMD is unavailable. */
function getRotationModule(): WebAssembly.Module | null {
  if (rotationModule === undefined) {
    try {
      const bytes = rotationModuleBytes();
      rotationModule = typeof WebAssembly === 'object' && WebAssembly.validate(bytes) ? new WebAssembly.Module(bytes) : null;
    } catch {
      rotationModule = null;
    }
  }
  return rotationModule;
}
