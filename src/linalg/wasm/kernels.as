// AssemblyScript source of the WebAssembly SIMD kernels behind zgemm, zgetrf and zgetrs.
//
// Built by `node scripts/build-wasm.mjs` into kernels.wasm.ts (base64). The file has the `.as`
// extension so the project's TypeScript compiler does not try to type-check it (v128, load<T>
// and @inline are AssemblyScript, not TypeScript); the build script feeds it to asc as a .ts
// source.
//
// Conventions: every matrix is row-major with interleaved (re, im) f64 pairs, exactly as
// CMatrix stores it, so one complex entry is one v128 (lane 0 = re, lane 1 = im). Pointers are
// byte offsets into this module's linear memory; leading dimensions (lda, ldb, ldc) count
// complex entries. The JavaScript side (runtime.ts) owns the memory layout: it copies the
// operands in, passes a workspace pointer and copies the results out. Nothing here allocates.
//
// Why this shape: wasm SIMD has 128-bit vectors and (without relaxed SIMD) no fused
// multiply-add, so the multiply is bound by the number of f64x2 multiplies and adds. A complex
// multiply-add c += a·b costs the minimum four of them when b is pre-packed together with
// i·b = (−b.im, b.re): c += splat(a.re)·b + splat(a.im)·(i·b). The 4×2 register block (eight
// v128 accumulators, four packed-B vectors, two splats and two temporaries) is the largest that
// fits V8's 15 allocatable XMM registers without spilling; larger blocks and k-unrolling
// measured slower (scripts/STORAGE.md).

// register block of the multiply: MR rows × NR complex columns
const MR: i32 = 4;
const NR: i32 = 2;
// cache blocking: a KC×NR packed strip of B (16 KiB) stays in L1, an MC×KC packed block of A
// (512 KiB) in L2
const KC: i32 = 256;
const MC: i32 = 128;
// block size of the LU factorization and of the triangular solves
const NB: i32 = 32;
// bytes of the edge-block scratch area at the end of the workspace
const SCRATCH: i32 = 16 * MR * NR;

/** First free byte after the module's static data: the host lays out its buffers from here. */
export function heapBase(): usize {
  return __heap_base;
}

/** Workspace bytes that zgemm needs for C(m×n) += A(m×k)·B(k×n). */
export function zgemmWorkBytes(m: i32, n: i32, k: i32): i32 {
  const kc = min(k, KC);
  const mc = min(m, MC);
  const mp = ((mc + MR - 1) / MR) * MR;
  const np = ((n + NR - 1) / NR) * NR;
  return 16 * kc * mp + 32 * kc * np + SCRATCH;
}

/** Workspace bytes that zgetrf (order n) needs. */
export function zgetrfWorkBytes(n: i32): i32 {
  return zgemmWorkBytes(n, n, NB);
}

/** Workspace bytes that zgetrs (order n, m right-hand sides) needs. */
export function zgetrsWorkBytes(n: i32, m: i32): i32 {
  return zgemmWorkBytes(n, m, NB);
}

// ---------------------------------------------------------------------------------------------
// multiply

// Pack rows k0..k0+kc of B (columns 0..n) scaled by alpha into NR-column strips: for each strip
// and each row, NR pairs (α·b, i·α·b). A partial last strip is padded with zeros so the
// micro-kernel needs no column edge case in its inner loop.
function packB(kc: i32, n: i32, ar: f64, ai: f64, pB: usize, ldb: i32, dst: usize): void {
  const rowBytes = <usize>ldb << 4;
  for (let j = 0; j < n; j += NR) {
    const w = min(NR, n - j);
    let src = pB + (<usize>j << 4);
    for (let kk = 0; kk < kc; kk++) {
      let s = src;
      for (let q = 0; q < NR; q++) {
        if (q < w) {
          const br = load<f64>(s);
          const bi = load<f64>(s, 8);
          const xr = ar * br - ai * bi;
          const xi = ar * bi + ai * br;
          v128.store(dst, f64x2(xr, xi));
          v128.store(dst, f64x2(-xi, xr), 16);
        } else {
          v128.store(dst, f64x2.splat(0));
          v128.store(dst, f64x2.splat(0), 16);
        }
        dst += 32;
        s += 16;
      }
      src += rowBytes;
    }
  }
}

// Pack rows 0..mc of A (columns k0..k0+kc, pA already offset) into MR-row blocks: for each block
// and each column, the MR entries contiguous. Missing rows of a partial block are zeros.
function packA(mc: i32, kc: i32, pA: usize, lda: i32, dst: usize): void {
  const rowBytes = <usize>lda << 4;
  for (let i = 0; i < mc; i += MR) {
    const h = min(MR, mc - i);
    const src = pA + <usize>i * rowBytes;
    for (let kk = 0; kk < kc; kk++) {
      const col = src + (<usize>kk << 4);
      for (let q = 0; q < MR; q++) {
        if (q < h) v128.store(dst, v128.load(col + <usize>q * rowBytes));
        else v128.store(dst, f64x2.splat(0));
        dst += 16;
      }
    }
  }
}

// c + a·b for one complex entry: r = splat(a.re), q = splat(a.im), b and s = i·b packed
@inline
function cmadd(c: v128, r: v128, q: v128, b: v128, s: v128): v128 {
  return f64x2.add(c, f64x2.add(f64x2.mul(r, b), f64x2.mul(q, s)));
}

// C(h×w block at pC) += packed A block (MR×kc) · packed B strip (kc×NR); h ≤ MR, w ≤ NR.
function microKernel(kc: i32, pa: usize, pb: usize, pC: usize, ldc: i32, h: i32, w: i32, scratch: usize): void {
  let c00 = f64x2.splat(0);
  let c01 = f64x2.splat(0);
  let c10 = f64x2.splat(0);
  let c11 = f64x2.splat(0);
  let c20 = f64x2.splat(0);
  let c21 = f64x2.splat(0);
  let c30 = f64x2.splat(0);
  let c31 = f64x2.splat(0);
  const paEnd = pa + (<usize>kc << 6);
  while (pa < paEnd) {
    const b0 = v128.load(pb);
    const s0 = v128.load(pb, 16);
    const b1 = v128.load(pb, 32);
    const s1 = v128.load(pb, 48);
    let r = v128.load64_splat(pa);
    let q = v128.load64_splat(pa, 8);
    c00 = cmadd(c00, r, q, b0, s0);
    c01 = cmadd(c01, r, q, b1, s1);
    r = v128.load64_splat(pa, 16);
    q = v128.load64_splat(pa, 24);
    c10 = cmadd(c10, r, q, b0, s0);
    c11 = cmadd(c11, r, q, b1, s1);
    r = v128.load64_splat(pa, 32);
    q = v128.load64_splat(pa, 40);
    c20 = cmadd(c20, r, q, b0, s0);
    c21 = cmadd(c21, r, q, b1, s1);
    r = v128.load64_splat(pa, 48);
    q = v128.load64_splat(pa, 56);
    c30 = cmadd(c30, r, q, b0, s0);
    c31 = cmadd(c31, r, q, b1, s1);
    pa += 64;
    pb += 64;
  }
  const rowBytes = <usize>ldc << 4;
  if (h == MR && w == NR) {
    let pc = pC;
    v128.store(pc, f64x2.add(v128.load(pc), c00));
    v128.store(pc, f64x2.add(v128.load(pc, 16), c01), 16);
    pc += rowBytes;
    v128.store(pc, f64x2.add(v128.load(pc), c10));
    v128.store(pc, f64x2.add(v128.load(pc, 16), c11), 16);
    pc += rowBytes;
    v128.store(pc, f64x2.add(v128.load(pc), c20));
    v128.store(pc, f64x2.add(v128.load(pc, 16), c21), 16);
    pc += rowBytes;
    v128.store(pc, f64x2.add(v128.load(pc), c30));
    v128.store(pc, f64x2.add(v128.load(pc, 16), c31), 16);
    return;
  }
  // edge block: park the accumulators, then add only the entries that exist
  v128.store(scratch, c00);
  v128.store(scratch, c01, 16);
  v128.store(scratch, c10, 32);
  v128.store(scratch, c11, 48);
  v128.store(scratch, c20, 64);
  v128.store(scratch, c21, 80);
  v128.store(scratch, c30, 96);
  v128.store(scratch, c31, 112);
  for (let i = 0; i < h; i++) {
    const row = pC + <usize>i * rowBytes;
    for (let j = 0; j < w; j++) {
      const p = row + (<usize>j << 4);
      v128.store(p, f64x2.add(v128.load(p), v128.load(scratch + (<usize>(i * NR + j) << 4))));
    }
  }
}

/**
 * C(m×n) = alpha·A(m×k)·B(k×n) + beta·C. With beta = 0 the old C is never read (NaN there does
 * not propagate); with alpha = 0 or k = 0 A and B are never read. C must not overlap A or B.
 */
export function zgemm(
  m: i32, n: i32, k: i32,
  alphaRe: f64, alphaIm: f64,
  pA: usize, lda: i32,
  pB: usize, ldb: i32,
  betaRe: f64, betaIm: f64,
  pC: usize, ldc: i32,
  pWork: usize,
): void {
  if (m <= 0 || n <= 0) return;
  const cRow = <usize>ldc << 4;
  if (betaRe == 0 && betaIm == 0) {
    for (let i = 0; i < m; i++) memory.fill(pC + <usize>i * cRow, 0, <usize>n << 4);
  } else if (!(betaRe == 1 && betaIm == 0)) {
    for (let i = 0; i < m; i++) rowScale(n, betaRe, betaIm, pC + <usize>i * cRow);
  }
  if (k <= 0 || (alphaRe == 0 && alphaIm == 0)) return;
  gemmAcc(m, n, k, alphaRe, alphaIm, pA, lda, pB, ldb, pC, ldc, pWork);
}

// C += alpha·A·B (the blocked loop nest behind zgemm, also used by the LU and solves)
function gemmAcc(
  m: i32, n: i32, k: i32,
  alphaRe: f64, alphaIm: f64,
  pA: usize, lda: i32,
  pB: usize, ldb: i32,
  pC: usize, ldc: i32,
  pWork: usize,
): void {
  const kcMax = min(k, KC);
  const mcMax = min(m, MC);
  const mp = ((mcMax + MR - 1) / MR) * MR;
  const np = ((n + NR - 1) / NR) * NR;
  const packedA = pWork;
  const packedB = packedA + <usize>(16 * kcMax * mp);
  const scratch = packedB + <usize>(32 * kcMax * np);
  const aRow = <usize>lda << 4;
  const bRow = <usize>ldb << 4;
  const cRow = <usize>ldc << 4;
  for (let k0 = 0; k0 < k; k0 += KC) {
    const kc = min(KC, k - k0);
    packB(kc, n, alphaRe, alphaIm, pB + <usize>k0 * bRow, ldb, packedB);
    const stripBytes = <usize>(32 * NR) * <usize>kc;
    const blockBytes = <usize>(16 * MR) * <usize>kc;
    for (let i0 = 0; i0 < m; i0 += MC) {
      const mc = min(MC, m - i0);
      packA(mc, kc, pA + <usize>i0 * aRow + (<usize>k0 << 4), lda, packedA);
      for (let j = 0; j < n; j += NR) {
        const w = min(NR, n - j);
        const pb = packedB + <usize>(j / NR) * stripBytes;
        for (let i = 0; i < mc; i += MR) {
          const h = min(MR, mc - i);
          microKernel(kc, packedA + <usize>(i / MR) * blockBytes, pb, pC + <usize>(i0 + i) * cRow + (<usize>j << 4), ldc, h, w, scratch);
        }
      }
    }
  }
}

// ---------------------------------------------------------------------------------------------
// row operations

// x ← s·x for n complex entries
function rowScale(n: i32, sr: f64, si: f64, px: usize): void {
  const vr = f64x2.splat(sr);
  const vi = f64x2(-si, si);
  const end = px + (<usize>n << 4);
  for (let p = px; p < end; p += 16) {
    const x = v128.load(p);
    v128.store(p, f64x2.add(f64x2.mul(vr, x), f64x2.mul(vi, v128.shuffle<f64>(x, x, 1, 0))));
  }
}

// y ← y − l·x for n complex entries (x and y do not overlap)
function rowAxpyNeg(n: i32, lr: f64, li: f64, px: usize, py: usize): void {
  const vr = f64x2.splat(lr);
  const vi = f64x2(-li, li);
  const end = py + (<usize>n << 4);
  let x = px;
  for (let p = py; p < end; p += 16) {
    const xv = v128.load(x);
    const t = f64x2.add(f64x2.mul(vr, xv), f64x2.mul(vi, v128.shuffle<f64>(xv, xv, 1, 0)));
    v128.store(p, f64x2.sub(v128.load(p), t));
    x += 16;
  }
}

// swap n complex entries
function rowSwap(n: i32, px: usize, py: usize): void {
  const end = px + (<usize>n << 4);
  let q = py;
  for (let p = px; p < end; p += 16) {
    const t = v128.load(p);
    v128.store(p, v128.load(q));
    v128.store(q, t);
    q += 16;
  }
}

// 1/(pr + i·pi) by Smith's formula (no overflow for large entries), returned as f64x2
function reciprocal(pr: f64, pi: f64): v128 {
  if (Math.abs(pr) >= Math.abs(pi)) {
    const r = pi / pr;
    const d = pr + pi * r;
    return f64x2(1 / d, -r / d);
  }
  const r = pr / pi;
  const d = pi + pr * r;
  return f64x2(r / d, -1 / d);
}

// ---------------------------------------------------------------------------------------------
// LU factorization

/**
 * Blocked right-looking LU with partial pivoting of the n×n matrix at pA, in place; ipiv
 * (i32 × n at pIpiv) gets the 0-based pivot row of each step. Returns −1, or the step at which
 * the pivot was exactly zero (the factorization then stops there).
 *
 * Each panel of NB columns is factored with full-row interchanges (cheap in row-major storage:
 * they also apply the swaps to the columns left and right of the panel), then the block row of
 * U is found by a unit-lower solve and the trailing matrix is updated by one multiply,
 * A22 −= L21·U12, which carries nearly all the flops.
 */
export function zgetrf(n: i32, pA: usize, pIpiv: usize, pWork: usize): i32 {
  const rowBytes = <usize>n << 4;
  for (let j0 = 0; j0 < n; j0 += NB) {
    const jb = min(NB, n - j0);
    const jend = j0 + jb;
    for (let k = j0; k < jend; k++) {
      // pivot: largest |re| + |im| in column k at or below the diagonal (izamax's measure);
      // the first of equal candidates wins, as in the unblocked TypeScript kernel
      let p = k;
      let best: f64 = -1;
      let q = pA + <usize>k * rowBytes + (<usize>k << 4);
      for (let i = k; i < n; i++) {
        const v = Math.abs(load<f64>(q)) + Math.abs(load<f64>(q, 8));
        if (v > best) {
          best = v;
          p = i;
        }
        q += rowBytes;
      }
      store<i32>(pIpiv + (<usize>k << 2), p);
      if (best == 0) return k;
      const rk = pA + <usize>k * rowBytes;
      if (p != k) rowSwap(n, rk, pA + <usize>p * rowBytes);
      const pivot = rk + (<usize>k << 4);
      const inv = reciprocal(load<f64>(pivot), load<f64>(pivot, 8));
      const ir = f64x2.extract_lane(inv, 0);
      const ii = f64x2.extract_lane(inv, 1);
      const width = jend - k - 1;
      for (let i = k + 1; i < n; i++) {
        const ri = pA + <usize>i * rowBytes;
        const e = ri + (<usize>k << 4);
        const xr = load<f64>(e);
        const xi = load<f64>(e, 8);
        const lr = xr * ir - xi * ii;
        const li = xr * ii + xi * ir;
        store<f64>(e, lr);
        store<f64>(e, li, 8);
        if (width > 0 && (lr != 0 || li != 0)) rowAxpyNeg(width, lr, li, pivot + 16, e + 16);
      }
    }
    if (jend < n) {
      const rest = n - jend;
      // U12 = L11⁻¹·A12: unit lower-triangular solve on the panel's block row
      for (let i = j0 + 1; i < jend; i++) {
        const ri = pA + <usize>i * rowBytes;
        for (let q = j0; q < i; q++) {
          const l = ri + (<usize>q << 4);
          const lr = load<f64>(l);
          const li = load<f64>(l, 8);
          if (lr != 0 || li != 0) rowAxpyNeg(rest, lr, li, pA + <usize>q * rowBytes + (<usize>jend << 4), ri + (<usize>jend << 4));
        }
      }
      // A22 −= L21·U12
      gemmAcc(
        rest, rest, jb, -1, 0,
        pA + <usize>jend * rowBytes + (<usize>j0 << 4), n,
        pA + <usize>j0 * rowBytes + (<usize>jend << 4), n,
        pA + <usize>jend * rowBytes + (<usize>jend << 4), n,
        pWork,
      );
    }
  }
  return -1;
}

/**
 * Solve A·X = B in place for the n×m right-hand side at pX, with the factors from zgetrf at
 * pLU/pIpiv. Blocked by NB rows: each block is solved by substitution, then its contribution is
 * removed from all remaining rows by one multiply.
 */
export function zgetrs(n: i32, m: i32, pLU: usize, pIpiv: usize, pX: usize, pWork: usize): void {
  if (n <= 0 || m <= 0) return;
  const luRow = <usize>n << 4;
  const xRow = <usize>m << 4;
  for (let k = 0; k < n; k++) {
    const p = load<i32>(pIpiv + (<usize>k << 2));
    if (p != k) rowSwap(m, pX + <usize>k * xRow, pX + <usize>p * xRow);
  }
  // forward: L·Y = P·B (unit diagonal)
  for (let i0 = 0; i0 < n; i0 += NB) {
    const ib = min(NB, n - i0);
    const iend = i0 + ib;
    for (let i = i0 + 1; i < iend; i++) {
      const li0 = pLU + <usize>i * luRow;
      for (let q = i0; q < i; q++) {
        const l = li0 + (<usize>q << 4);
        const lr = load<f64>(l);
        const li = load<f64>(l, 8);
        if (lr != 0 || li != 0) rowAxpyNeg(m, lr, li, pX + <usize>q * xRow, pX + <usize>i * xRow);
      }
    }
    if (iend < n) {
      gemmAcc(n - iend, m, ib, -1, 0, pLU + <usize>iend * luRow + (<usize>i0 << 4), n, pX + <usize>i0 * xRow, m, pX + <usize>iend * xRow, m, pWork);
    }
  }
  // backward: U·X = Y, blocks from the bottom, on the same block boundaries
  const lastStart = ((n - 1) / NB) * NB;
  for (let i0 = lastStart; i0 >= 0; i0 -= NB) {
    const iend = min(i0 + NB, n);
    for (let i = iend - 1; i >= i0; i--) {
      const ui0 = pLU + <usize>i * luRow;
      const xi = pX + <usize>i * xRow;
      for (let q = i + 1; q < iend; q++) {
        const u = ui0 + (<usize>q << 4);
        const ur = load<f64>(u);
        const ui = load<f64>(u, 8);
        if (ur != 0 || ui != 0) rowAxpyNeg(m, ur, ui, pX + <usize>q * xRow, xi);
      }
      const d = ui0 + (<usize>i << 4);
      const inv = reciprocal(load<f64>(d), load<f64>(d, 8));
      rowScale(m, f64x2.extract_lane(inv, 0), f64x2.extract_lane(inv, 1), xi);
    }
    if (i0 > 0) {
      gemmAcc(i0, m, iend - i0, -1, 0, pLU + (<usize>i0 << 4), n, pX + <usize>i0 * xRow, m, pX, m, pWork);
    }
  }
}
