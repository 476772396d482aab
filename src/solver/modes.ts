/**
 * Eigenmodes of one layer: propagation constants q (kz/k0) and the tangential-field matrices
 * W (E) and V (H) whose columns are the modes, for the stable interface recursion.
 *
 * Fields are normalized with H' = Z0·H and z' = k0·z, so ∇'×E = iH' and ∇'×H' = −iεE. With
 * Kx = diag(kx,m/k0), ky = ky/k0, E = [[ε]] (Toeplitz of ε), A = [[1/ε]], D = E⁻¹, Ep = A⁻¹
 * (Fourier factorization rules: Li, J. Opt. Soc. Am. A 13, 1870 (1996); Lalanne & Morris,
 * J. Opt. Soc. Am. A 13, 779 (1996) — Dx = Ep·Ex for the component normal to the
 * discontinuities, Laurent's rule for the tangential ones), Maxwell's equations for a
 * y-invariant layer give d/dz'(Ex, Ey) = iP(Hx, Hy), d/dz'(Hx, Hy) = iQ(Ex, Ey) with
 *   P = [[ky·Kx·D, I − Kx·D·Kx], [ky²·D − I, −ky·D·Kx]],  Q = [[−ky·Kx, Kx² − E], [Ep − ky², ky·Kx]].
 * P·Q and Q·P are block lower-triangular, so the 2N-mode problem splits into two N×N
 * eigenproblems (the two-eigenproblem formulation of conical diffraction: Moharam, Grann,
 * Pommet & Gaylord, J. Opt. Soc. Am. A 12, 1077 (1995)):
 *   "E-type" modes, Ex = 0:  Ω_E = E − Kx² − ky²,           eigvecs W_E (Ey), eigvals q²;
 *   "H-type" modes, Hx = 0:  Ω_H = Ep·(I − Kx·D·Kx) − ky², eigvecs W_H (Hy), eigvals q².
 * Their other components follow without further solves:
 *   E-type: Hx = −W_E·(q² + ky²)/q,  Hy = ky·Kx·W_E/q;
 *   H-type: Ex = (I − Kx·D·Kx)·W_H/q,  Ey = −ky·D·Kx·W_H/q.
 * In the classical mount (ky = 0) E-type is TE (Ey, Hx) and H-type is TM (Hy, Ex), solved as
 * two independent N-sized problems. Homogeneous media need no eigensolve: their modes are plane
 * waves, taken in the s/p basis in conical incidence (the Ex = 0 / Hx = 0 pair degenerates when
 * kx² = ε there), and as TE/TM in the classical mount.
 *
 * A forward mode (exp(+iqz')) has tangential fields (W·c, V·c); a backward one (W·c, −V·c).
 */
import {
  cmatrix,
  conjTranspose,
  type CMatrix,
  LinalgError,
  type LUFactors,
  toeplitz,
  zdiagLeft,
  zdiagRight,
  zgemm,
  zgetrf,
  zgetri,
  zgetrs,
  zpotrf,
  zsqrtUpper,
} from '../linalg/index.ts';
import { zgeev } from '../linalg/zgeev.ts';
import { zheev } from '../linalg/zheev.ts';
import { indexFromPermittivity } from './fourier.ts';
import { isShared } from './cache.ts';
import { LU_INVERSE, LU_MODES_V, LU_MODES_W, scratchLU, scratchMatrix } from './scratch.ts';

/** Scratch slots of modulatedModes' N×N temporaries (see scratch.ts). */
const S_E = 0, S_D = 1, S_EP = 2, S_A = 3, S_B = 4, S_OMEGA = 5, S_BW = 6, S_BL = 7, S_H = 8, S_LH = 9, S_KXWH = 10, S_DKW = 11, S_L = 12;

/** Tangential-field matrices of one medium, with the operations the recursion needs. */
export interface Modes {
  /** number of modes (N classical, 2N conical) */
  readonly n: number;
  /** normalized propagation constants q = kz/k0, interleaved, branch Im q ≥ 0 */
  readonly q: Float64Array;
  /** out = W·M (M is n×c) */
  mulW(out: CMatrix, m: Readonly<CMatrix>): CMatrix;
  /** out = W as a dense n×n matrix */
  denseW(out: CMatrix): CMatrix;
  /** out = V as a dense n×n matrix */
  denseV(out: CMatrix): CMatrix;
  mulV(out: CMatrix, m: Readonly<CMatrix>): CMatrix;
  /** out = W⁻¹·M; `out` may be `m` */
  solveW(out: CMatrix, m: Readonly<CMatrix>): CMatrix;
  solveV(out: CMatrix, m: Readonly<CMatrix>): CMatrix;
}

/** Which field family a classical-mount problem carries. */
export type Family = 'TE' | 'TM' | 'conical';

/**
 * Smallest |q| kept: an order exactly at grazing (q = 0) would make the tangential field matrices
 * singular; moving q off zero by this much leaves every efficiency finite and continuous, and
 * changes nothing measurable elsewhere.
 */
const Q_FLOOR = 1e-9;

/** q = √(q²) on the decaying/outgoing branch, kept off zero. */
export function propagationConstant(q2re: number, q2im: number, out: Float64Array, k: number): void {
  zsqrtUpper(q2re, q2im, out, 2 * k, 1e-13);
  const r = out[2 * k]!;
  const i = out[2 * k + 1]!;
  if (Math.abs(r) + Math.abs(i) < Q_FLOOR) {
    out[2 * k] = Q_FLOOR;
    out[2 * k + 1] = Q_FLOOR;
  }
}

// ---------------------------------------------------------------------------------------------
// Homogeneous media: 2×2 blocks of diagonal matrices
// ---------------------------------------------------------------------------------------------

/**
 * Modes of a homogeneous medium of permittivity ε for tangential wavevectors kx (length N) and
 * ky. W and V are block-diagonal (one 1×1 or 2×2 block per order), so their products and
 * inverses cost O(n²) on an n×c matrix.
 * @param azimuthUnit (cos φ, sin φ) of the incidence, the s direction used where kx = ky = 0.
 */
export function homogeneousModes(
  eps: readonly [number, number],
  kx: Float64Array,
  ky: number,
  family: Family,
  azimuthUnit: readonly [number, number],
): Modes {
  const N = kx.length;
  const q = new Float64Array(2 * N);
  for (let i = 0; i < N; i++) propagationConstant(eps[0] - kx[i]! * kx[i]! - ky * ky, eps[1], q, i);
  if (family === 'TE') {
    // W = I (Ey), V = −q (Hx)
    const w = diagOnes(N);
    const v = new Float64Array(2 * N);
    for (let k = 0; k < 2 * N; k++) v[k] = -q[k]!;
    return new DiagModes(N, q, w, v);
  }
  if (family === 'TM') {
    // W = q/ε (Ex), V = 1 (Hy)
    const w = new Float64Array(2 * N);
    const [er, ei] = eps;
    const d = er * er + ei * ei;
    for (let i = 0; i < N; i++) {
      const qr = q[2 * i]!;
      const qi = q[2 * i + 1]!;
      w[2 * i] = (qr * er + qi * ei) / d;
      w[2 * i + 1] = (qi * er - qr * ei) / d;
    }
    return new DiagModes(N, q, w, diagOnes(N));
  }
  // conical: s-mode and p-mode per order; (ux, uy) = (kx, ky)/|kt|
  const { re: nr, im: ni } = indexFromPermittivity(eps[0], eps[1]);
  const nn = nr * nr + ni * ni;
  const W = new BlockModes(N, q);
  for (let i = 0; i < N; i++) {
    const kt = Math.hypot(kx[i]!, ky);
    const ux = kt > 1e-12 ? kx[i]! / kt : azimuthUnit[0];
    const uy = kt > 1e-12 ? ky / kt : azimuthUnit[1];
    const qr = q[2 * i]!;
    const qi = q[2 * i + 1]!;
    // q/n
    const qnr = (qr * nr + qi * ni) / nn;
    const qni = (qi * nr - qr * ni) / nn;
    // W rows (Ex, Ey), cols (s, p): [[−uy, ux·q/n], [ux, uy·q/n]]
    W.setW(i, -uy, 0, ux * qnr, ux * qni, ux, 0, uy * qnr, uy * qni);
    // V rows (Hx, Hy): [[−q·ux, −n·uy], [−q·uy, n·ux]]
    W.setV(i, -qr * ux, -qi * ux, -nr * uy, -ni * uy, -qr * uy, -qi * uy, nr * ux, ni * ux);
  }
  W.finish();
  return W;
}

function diagOnes(N: number): Float64Array {
  const d = new Float64Array(2 * N);
  for (let i = 0; i < N; i++) d[2 * i] = 1;
  return d;
}

/** Diagonal W and V (classical mount, homogeneous medium). */
class DiagModes implements Modes {
  private readonly wInv: Float64Array;
  private readonly vInv: Float64Array;
  constructor(
    readonly n: number,
    readonly q: Float64Array,
    private readonly w: Float64Array,
    private readonly v: Float64Array,
  ) {
    this.wInv = invertDiag(w);
    this.vInv = invertDiag(v);
  }
  mulW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zdiagLeft(out, this.w, m);
  }
  denseW(out: CMatrix): CMatrix {
    return diagInto(out, this.w);
  }
  denseV(out: CMatrix): CMatrix {
    return diagInto(out, this.v);
  }
  mulV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zdiagLeft(out, this.v, m);
  }
  solveW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zdiagLeft(out, this.wInv, m);
  }
  solveV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zdiagLeft(out, this.vInv, m);
  }
}

function diagInto(out: CMatrix, d: Float64Array): CMatrix {
  const n = out.rows;
  out.data.fill(0);
  for (let i = 0; i < n; i++) {
    out.data[2 * (i * n + i)] = d[2 * i]!;
    out.data[2 * (i * n + i) + 1] = d[2 * i + 1]!;
  }
  return out;
}

function negated(d: Float64Array): Float64Array {
  return d.map((v) => -v);
}

function invertDiag(d: Float64Array): Float64Array {
  const o = new Float64Array(d.length);
  for (let k = 0; k < d.length; k += 2) {
    const r = d[k]!;
    const i = d[k + 1]!;
    const s = r * r + i * i;
    o[k] = r / s;
    o[k + 1] = -i / s;
  }
  return o;
}

/**
 * W and V made of 2×2 blocks of diagonals: rows (x-block, y-block) of N each, columns (s-block,
 * p-block). Stored per order as 8 reals [a, b, c, d] for [[a, b], [c, d]].
 */
class BlockModes implements Modes {
  readonly n: number;
  private readonly w: Float64Array;
  private readonly v: Float64Array;
  private wInv: Float64Array;
  private vInv: Float64Array;
  /** per mode: the s-block then the p-block share each order's q */
  readonly q: Float64Array;
  constructor(
    private readonly N: number,
    qOrders: Float64Array,
  ) {
    this.n = 2 * N;
    this.q = new Float64Array(4 * N);
    this.q.set(qOrders, 0);
    this.q.set(qOrders, 2 * N);
    this.w = new Float64Array(8 * N);
    this.v = new Float64Array(8 * N);
    this.wInv = this.w;
    this.vInv = this.v;
  }
  setW(i: number, ...e: number[]): void {
    this.w.set(e, 8 * i);
  }
  setV(i: number, ...e: number[]): void {
    this.v.set(e, 8 * i);
  }
  finish(): void {
    this.wInv = invertBlocks(this.w, this.N);
    this.vInv = invertBlocks(this.v, this.N);
  }
  mulW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return applyBlocks(out, this.w, this.N, m);
  }
  denseW(out: CMatrix): CMatrix {
    return blocksInto(out, this.w, this.N);
  }
  denseV(out: CMatrix): CMatrix {
    return blocksInto(out, this.v, this.N);
  }
  mulV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return applyBlocks(out, this.v, this.N, m);
  }
  solveW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return applyBlocks(out, this.wInv, this.N, m);
  }
  solveV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return applyBlocks(out, this.vInv, this.N, m);
  }
}

function invertBlocks(b: Float64Array, N: number): Float64Array {
  const o = new Float64Array(8 * N);
  for (let i = 0; i < N; i++) {
    const k = 8 * i;
    const [ar, ai, br, bi, cr, ci, dr, di] = [b[k]!, b[k + 1]!, b[k + 2]!, b[k + 3]!, b[k + 4]!, b[k + 5]!, b[k + 6]!, b[k + 7]!];
    // det = a·d − b·c
    const detr = ar * dr - ai * di - (br * cr - bi * ci);
    const deti = ar * di + ai * dr - (br * ci + bi * cr);
    const s = detr * detr + deti * deti;
    const ir = detr / s;
    const ii = -deti / s;
    // inverse = [[d, −b], [−c, a]] / det
    o[k] = dr * ir - di * ii;
    o[k + 1] = dr * ii + di * ir;
    o[k + 2] = -(br * ir - bi * ii);
    o[k + 3] = -(br * ii + bi * ir);
    o[k + 4] = -(cr * ir - ci * ii);
    o[k + 5] = -(cr * ii + ci * ir);
    o[k + 6] = ar * ir - ai * ii;
    o[k + 7] = ar * ii + ai * ir;
  }
  return o;
}

/** The 2N×2N matrix of diagonal blocks, dense. */
function blocksInto(out: CMatrix, b: Float64Array, N: number): CMatrix {
  const n = 2 * N;
  const o = out.data;
  o.fill(0);
  for (let i = 0; i < N; i++) {
    const k = 8 * i;
    const put = (r: number, c: number, off: number): void => {
      o[2 * (r * n + c)] = b[k + off]!;
      o[2 * (r * n + c) + 1] = b[k + off + 1]!;
    };
    put(i, i, 0);
    put(i, N + i, 2);
    put(N + i, i, 4);
    put(N + i, N + i, 6);
  }
  return out;
}

/** out = B·m for block matrix B (2N×2N of diagonal blocks); out may alias m. */
function applyBlocks(out: CMatrix, b: Float64Array, N: number, m: Readonly<CMatrix>): CMatrix {
  const c2 = 2 * m.cols;
  const s = m.data;
  const o = out.data;
  for (let i = 0; i < N; i++) {
    const k = 8 * i;
    const ar = b[k]!, ai = b[k + 1]!, br = b[k + 2]!, bi = b[k + 3]!;
    const cr = b[k + 4]!, ci = b[k + 5]!, dr = b[k + 6]!, di = b[k + 7]!;
    const top = i * c2;
    const bot = (N + i) * c2;
    for (let j = 0; j < c2; j += 2) {
      const xr = s[top + j]!, xi = s[top + j + 1]!;
      const yr = s[bot + j]!, yi = s[bot + j + 1]!;
      o[top + j] = ar * xr - ai * xi + br * yr - bi * yi;
      o[top + j + 1] = ar * xi + ai * xr + br * yi + bi * yr;
      o[bot + j] = cr * xr - ci * xi + dr * yr - di * yi;
      o[bot + j + 1] = cr * xi + ci * xr + dr * yi + di * yr;
    }
  }
  return out;
}

// ---------------------------------------------------------------------------------------------
// Modulated layers: dense eigenmodes
// ---------------------------------------------------------------------------------------------

/** Which matrix a scratch factor slot holds the LU factors of now. */
const factoredInto = new WeakMap<LUFactors, CMatrix>();

/**
 * Dense W, V and their LU factors. The factors are formed when first needed: kept with the modes
 * once a mode cache shares them (they will be used again), otherwise in scratch, where W's
 * factors also serve the solveV of the same interface when V = −W·diag(q).
 */
class DenseModes implements Modes {
  private luW: LUFactors | null = null;
  private luV: LUFactors | null = null;
  /** −1/q per mode, when V = −W·diag(q) */
  private readonly negInvQ: Float64Array | null;
  constructor(
    readonly n: number,
    readonly q: Float64Array,
    readonly W: CMatrix,
    readonly V: CMatrix,
    vIsMinusWq: boolean,
  ) {
    // V = −W·diag(q) (classical TE) needs no factorization of its own: V⁻¹ = −diag(1/q)·W⁻¹
    this.negInvQ = vIsMinusWq ? negated(invertDiag(q)) : null;
  }
  private factors(which: 'W' | 'V'): LUFactors {
    const kept = which === 'W' ? this.luW : this.luV;
    if (kept) return kept;
    const m = which === 'W' ? this.W : this.V;
    if (isShared(this)) {
      const f = zgetrf(m);
      if (which === 'W') this.luW = f;
      else this.luV = f;
      return f;
    }
    const f = scratchLU(this.n, which === 'W' ? LU_MODES_W : LU_MODES_V);
    if (factoredInto.get(f) !== m) {
      factoredInto.delete(f); // not valid while being overwritten (a singular W throws midway)
      zgetrf(m, f);
      factoredInto.set(f, m);
    }
    return f;
  }
  mulW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zgemm(out, this.W, m);
  }
  denseW(out: CMatrix): CMatrix {
    out.data.set(this.W.data);
    return out;
  }
  denseV(out: CMatrix): CMatrix {
    out.data.set(this.V.data);
    return out;
  }
  mulV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zgemm(out, this.V, m);
  }
  solveW(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    return zgetrs(this.factors('W'), m, out) as CMatrix;
  }
  solveV(out: CMatrix, m: Readonly<CMatrix>): CMatrix {
    if (!this.negInvQ) return zgetrs(this.factors('V'), m, out) as CMatrix;
    zgetrs(this.factors('W'), m, out);
    return zdiagLeft(out, this.negInvQ, out);
  }
}

/** Inputs for the modes of a modulated layer. */
export interface ModulatedLayerInput {
  /** Fourier coefficients of ε, k = −(N−1)…(N−1), interleaved (index 2·(k + N − 1)) */
  readonly epsCoeffs: Float64Array;
  /** Fourier coefficients of 1/ε, same layout */
  readonly invEpsCoeffs: Float64Array;
  /** normalized kx,m/k0 for the N retained orders */
  readonly kx: Float64Array;
  readonly ky: number;
  readonly family: Family;
  /** ε(x) real everywhere: the Hermitian eigen path is allowed */
  readonly lossless: boolean;
  readonly factorization: 'inverse' | 'laurent';
  readonly hermitian: boolean;
}

/**
 * Eigenmodes of a layer with a modulated permittivity.
 * @throws {LinalgError} from the kernels (singular Toeplitz matrix, QR not converging).
 */
export function modulatedModes(inp: ModulatedLayerInput): Modes {
  const { kx, ky, family } = inp;
  const N = kx.length;
  const E = toeplitz(inp.epsCoeffs, N, scratchMatrix(N, S_E));
  if (family === 'TE') {
    const { w, q } = eigenE(E, kx, ky, inp);
    // V = −W·diag(q)
    const V = zdiagRight(cmatrix(N, N), w, negated(q));
    return new DenseModes(N, q, w, V, true);
  }
  const D = zgetri(E, scratchMatrix(N, S_D), scratchLU(N, LU_INVERSE)); // E⁻¹
  const Ep = inp.factorization === 'inverse' ? zgetri(toeplitz(inp.invEpsCoeffs, N, scratchMatrix(N, S_A)), scratchMatrix(N, S_EP), scratchLU(N, LU_INVERSE)) : E;
  // B = I − Kx·D·Kx
  const B = scratchMatrix(N, S_B);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const p = 2 * (i * N + j);
      const s = kx[i]! * kx[j]!;
      B.data[p] = (i === j ? 1 : 0) - s * D.data[p]!;
      B.data[p + 1] = -s * D.data[p + 1]!;
    }
  }
  const { w: WH, q: qH } = eigenH(Ep, B, ky, inp);
  // X = B·W_H·diag(1/q_H)
  const qInv = invertDiag(qH);
  const BW = zgemm(scratchMatrix(N, S_BW), B, WH);
  if (family === 'TM') {
    return new DenseModes(N, qH, zdiagRight(cmatrix(N, N), BW, qInv), WH, false);
  }
  // conical: both families
  const { w: WE, q: qE } = eigenE(E, kx, ky, inp);
  const n = 2 * N;
  const W = cmatrix(n, n);
  const V = cmatrix(n, n);
  const qAll = new Float64Array(2 * n);
  qAll.set(qE, 0);
  qAll.set(qH, 2 * N);
  // Y = −ky·D·Kx·W_H·diag(1/q_H)
  const KxWH = scratchMatrix(N, S_KXWH);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const p = 2 * (i * N + j);
      KxWH.data[p] = kx[i]! * WH.data[p]!;
      KxWH.data[p + 1] = kx[i]! * WH.data[p + 1]!;
    }
  }
  const DKW = zgemm(scratchMatrix(N, S_DKW), D, KxWH);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const src = 2 * (i * N + j);
      // W: rows Ex (0..N−1), Ey (N..2N−1); cols E-type (0..N−1), H-type (N..2N−1)
      // Ex, E-type = 0
      // Ex, H-type = B·W_H/q_H
      {
        const xr = BW.data[src]!, xi = BW.data[src + 1]!;
        const ir = qInv[2 * j]!, ii = qInv[2 * j + 1]!;
        const dst = 2 * (i * n + N + j);
        W.data[dst] = xr * ir - xi * ii;
        W.data[dst + 1] = xr * ii + xi * ir;
      }
      // Ey, E-type = W_E
      {
        const dst = 2 * ((N + i) * n + j);
        W.data[dst] = WE.data[src]!;
        W.data[dst + 1] = WE.data[src + 1]!;
      }
      // Ey, H-type = −ky·D·Kx·W_H/q_H
      {
        const xr = DKW.data[src]!, xi = DKW.data[src + 1]!;
        const ir = qInv[2 * j]!, ii = qInv[2 * j + 1]!;
        const dst = 2 * ((N + i) * n + N + j);
        W.data[dst] = -ky * (xr * ir - xi * ii);
        W.data[dst + 1] = -ky * (xr * ii + xi * ir);
      }
      // V: rows Hx, Hy
      const wr = WE.data[src]!, wi = WE.data[src + 1]!;
      const qr = qE[2 * j]!, qi = qE[2 * j + 1]!;
      const s = qr * qr + qi * qi;
      const iqr = qr / s, iqi = -qi / s; // 1/q_E
      // Hx, E-type = −W_E·(q² + ky²)/q = −W_E·(q + ky²/q)
      {
        const fr = qr + ky * ky * iqr;
        const fi = qi + ky * ky * iqi;
        const dst = 2 * (i * n + j);
        V.data[dst] = -(wr * fr - wi * fi);
        V.data[dst + 1] = -(wr * fi + wi * fr);
      }
      // Hy, E-type = ky·Kx·W_E/q
      {
        const f = ky * kx[i]!;
        const dst = 2 * ((N + i) * n + j);
        V.data[dst] = f * (wr * iqr - wi * iqi);
        V.data[dst + 1] = f * (wr * iqi + wi * iqr);
      }
      // Hx, H-type = 0; Hy, H-type = W_H
      {
        const dst = 2 * ((N + i) * n + N + j);
        V.data[dst] = WH.data[src]!;
        V.data[dst + 1] = WH.data[src + 1]!;
      }
    }
  }
  return new DenseModes(n, qAll, W, V, false);
}

/** E-type modes: eigen of Ω_E = E − Kx² − ky². */
function eigenE(E: CMatrix, kx: Float64Array, ky: number, inp: ModulatedLayerInput): { w: CMatrix; q: Float64Array } {
  const N = kx.length;
  const omega = scratchMatrix(N, S_OMEGA);
  omega.data.set(E.data);
  for (let i = 0; i < N; i++) omega.data[2 * (i * N + i)] -= kx[i]! * kx[i]! + ky * ky;
  const q = new Float64Array(2 * N);
  if (inp.lossless && inp.hermitian) {
    // E is Hermitian for real ε(x) (c_−k = conj c_k), so Ω_E is Hermitian
    const r = zheev(omega);
    for (let k = 0; k < N; k++) propagationConstant(r.values[k]!, 0, q, k);
    return { w: r.vectors!, q };
  }
  const r = zgeev(omega);
  for (let k = 0; k < N; k++) propagationConstant(r.values[2 * k]!, r.values[2 * k + 1]!, q, k);
  return { w: r.vectors!, q };
}

/** H-type modes: eigen of Ω_H = Ep·B − ky², B = I − Kx·D·Kx. */
function eigenH(Ep: CMatrix, B: CMatrix, ky: number, inp: ModulatedLayerInput): { w: CMatrix; q: Float64Array } {
  const N = B.rows;
  const q = new Float64Array(2 * N);
  if (inp.lossless && inp.hermitian) {
    // Ep = L·Lᴴ (Hermitian positive definite for ε(x) > 0, under either rule); Lᴴ·B·L is Hermitian with the
    // eigenvalues of Ep·B, and W_H = L·Y maps its eigenvectors back.
    let L: CMatrix | null = null;
    try {
      L = zpotrf(Ep, scratchMatrix(N, S_L));
    } catch (e) {
      if (!(e instanceof LinalgError && e.code === 'singular')) throw e;
    }
    if (L) {
      const BL = zgemm(scratchMatrix(N, S_BL), B, L);
      const LH = conjTranspose(L, scratchMatrix(N, S_LH));
      const H = zgemm(scratchMatrix(N, S_H), LH, BL);
      // enforce exact Hermitian symmetry lost to round-off in the two products
      symmetrize(H);
      const r = zheev(H);
      for (let k = 0; k < N; k++) propagationConstant(r.values[k]! - ky * ky, 0, q, k);
      const w = zgemm(cmatrix(N, N), L, r.vectors!);
      return { w, q };
    }
  }
  const omega = zgemm(scratchMatrix(N, S_OMEGA), Ep, B);
  for (let i = 0; i < N; i++) omega.data[2 * (i * N + i)] -= ky * ky;
  const r = zgeev(omega);
  for (let k = 0; k < N; k++) propagationConstant(r.values[2 * k]!, r.values[2 * k + 1]!, q, k);
  return { w: r.vectors!, q };
}

function symmetrize(h: CMatrix): void {
  const n = h.rows;
  const d = h.data;
  for (let i = 0; i < n; i++) {
    d[2 * (i * n + i) + 1] = 0;
    for (let j = 0; j < i; j++) {
      const a = 2 * (i * n + j);
      const b = 2 * (j * n + i);
      const re = 0.5 * (d[a]! + d[b]!);
      const im = 0.5 * (d[a + 1]! - d[b + 1]!);
      d[a] = re;
      d[a + 1] = im;
      d[b] = re;
      d[b + 1] = -im;
    }
  }
}
