/**
 * Stable combination of the layers: a reflection-matrix recursion from the substrate up, then
 * the incident amplitudes carried down.
 *
 * Amplitudes in each medium are referenced at its own interfaces, so every propagation factor
 * X = exp(i·q·k0·d) has |X| ≤ 1 and a layer 50 wavelengths thick or an opaque metal slab never
 * overflows: this is the scattering-matrix approach (Redheffer star product specialised to
 * incidence from the cover; L. Li, "Formulation and comparison of two recursive matrix
 * algorithms for modeling layered diffraction gratings", J. Opt. Soc. Am. A 13, 1024 (1996)).
 *
 * At the interface below medium j (amplitudes c±) and above medium j+1 (amplitudes c'±,
 * with c'− = R'·c'+ at the top of j+1): W_j(c+ + c−) = W_{j+1}(I + R')c'+ and
 * V_j(c+ − c−) = V_{j+1}(I − R')c'+. With A = W_j⁻¹W_{j+1}(I + R'), B = V_j⁻¹V_{j+1}(I − R'),
 * S = (A + B)/2 and Δ = (A − B)/2:  c'+ = S⁻¹c+ and c− = Δ·S⁻¹·c+, so the reflection matrix
 * at the bottom of medium j is Δ·S⁻¹ and at its top X·Δ·S⁻¹·X.
 */
import { cmatrix, type CMatrix, type LUFactors, zdiagLeft, zgetrf, zgetrs, zgetrsT, zgemm } from '../linalg/index.ts';
import { isShared } from './cache.ts';
import type { Modes } from './modes.ts';
import { LU_STACK, scratchLU, scratchMatrix } from './scratch.ts';

/** Scratch slots of solveStack (see scratch.ts); the interface matrices of unshared modes use two more. */
const S_F = 0, S_G = 1, S_TMP = 2, S_TMP2 = 3, S_T = 4, S_U = 5;

export interface StackResult {
  /** backward amplitudes in the cover at z = 0, one column per incident vector */
  readonly reflected: CMatrix;
  /** forward amplitudes in the substrate at the last interface */
  readonly transmitted: CMatrix;
  /**
   * With `keepInterior`: for each layer 1…L (index j − 1), the forward amplitudes at its top and
   * the backward amplitudes at its bottom, from which the field anywhere inside follows with
   * propagation factors of modulus ≤ 1.
   */
  readonly interior?: ReadonlyArray<{ readonly forwardTop: CMatrix; readonly backwardBottom: CMatrix }>;
}

/**
 * @param media cover, layers top to bottom, substrate; all with the same mode count n.
 * @param thickness normalized thicknesses k0·d of media[1 … L] (index 0 and L+1 unused).
 * @param incident n×c forward amplitudes in the cover at z = 0.
 */
export function solveStack(media: ReadonlyArray<Modes>, thickness: ReadonlyArray<number>, incident: Readonly<CMatrix>, keepInterior = false): StackResult {
  const L = media.length - 2;
  const n = media[0]!.n;
  const lus: LUFactors[] = new Array(L + 1);
  // reflection matrices at the bottom of each layer, kept only for interior fields
  const rBottom: CMatrix[] = new Array(L + 1);
  // exp(i·q·k0·d) of each layer 1…L
  const phases: Float64Array[] = new Array(L + 1);
  let delta0: CMatrix | null = null;
  // R' at the top of the medium below the current interface; null means zero (substrate)
  let rTop: CMatrix | null = null;
  const F = scratchMatrix(n, S_F);
  const G = scratchMatrix(n, S_G);
  const tmp = scratchMatrix(n, S_TMP);
  const tmp2 = scratchMatrix(n, S_TMP2);
  for (let j = L; j >= 0; j--) {
    const upper = media[j]!;
    const lower = media[j + 1]!;
    // interface matrices T = W_j⁻¹·W_{j+1}, U = V_j⁻¹·V_{j+1}: they depend on the two media only,
    // so a thickness sweep with cached modes computes them once
    let T: CMatrix, U: CMatrix;
    try {
      ({ T, U } = interfaceMatrices(upper, lower));
    } catch (e) {
      throw new MediumFailure(j, e); // factoring a medium's W or V: the failure belongs to that medium
    }
    if (rTop === null) {
      F.data.set(T.data); // A = T
      G.data.set(U.data); // B = U
    } else {
      // A = T·(I + R') = T + T·R', B = U·(I − R') = U − U·R'
      F.data.set(T.data);
      zgemm(F, T, rTop, [1, 0], [1, 0]);
      G.data.set(U.data);
      zgemm(G, U, rTop, [-1, 0], [1, 0]);
    }
    // Sᵀ = (A + B)ᵀ/2 into tmp and Δ = (A − B)/2 into F, or Δᵀ into tmp2 when R is needed: the
    // factors of Sᵀ give R = Δ·S⁻¹ as (S⁻ᵀ·Δᵀ)ᵀ, an ordinary left solve (the fast kernel), and
    // S·x = c as a transposed solve on the few incident columns
    const f = F.data;
    const g = G.data;
    const t = tmp.data;
    const last = j === 0;
    for (let r = 0; r < n; r++) {
      for (let c = 0; c < n; c++) {
        const p = 2 * (r * n + c);
        const q = 2 * (c * n + r);
        const ar = f[p]!;
        const ai = f[p + 1]!;
        const br = g[p]!;
        const bi = g[p + 1]!;
        t[q] = 0.5 * (ar + br);
        t[q + 1] = 0.5 * (ai + bi);
        if (last) {
          f[p] = 0.5 * (ar - br);
          f[p + 1] = 0.5 * (ai - bi);
        } else {
          tmp2.data[q] = 0.5 * (ar - br);
          tmp2.data[q + 1] = 0.5 * (ai - bi);
        }
      }
    }
    lus[j] = zgetrf(tmp, scratchLU(n, LU_STACK + j));
    if (last) {
      delta0 = F;
      break;
    }
    // R at the bottom of medium j = Δ·S⁻¹ = (S⁻ᵀ·Δᵀ)ᵀ; at its top X·R·X
    zgetrs(lus[j]!, tmp2, tmp2);
    const r: CMatrix = rTop ?? cmatrix(n, n);
    transposeInto(r, tmp2);
    if (keepInterior) rBottom[j] = { rows: n, cols: n, data: r.data.slice() };
    // propagation factors of layer j, used again when the amplitudes are carried down
    phases[j] = phase(upper.q, thickness[j]!);
    scaleBoth(r, phases[j]!);
    rTop = r;
  }
  // carry the incident amplitudes down: c+ (top of medium j+1) = S_j⁻¹ · X_j · c+ (top of j)
  const c = incident.cols;
  let cur = zgetrsT(lus[0]!, incident) as CMatrix;
  const reflected = zgemm(cmatrix(n, c), delta0!, cur);
  const interior: Array<{ forwardTop: CMatrix; backwardBottom: CMatrix }> = [];
  for (let j = 1; j <= L; j++) {
    const forwardTop = keepInterior ? { rows: n, cols: c, data: cur.data.slice() } : null;
    zdiagLeft(cur, phases[j]!, cur);
    if (forwardTop) interior.push({ forwardTop, backwardBottom: zgemm(cmatrix(n, c), rBottom[j]!, cur) });
    cur = zgetrsT(lus[j]!, cur, cur) as CMatrix;
  }
  return keepInterior ? { reflected, transmitted: cur, interior } : { reflected, transmitted: cur };
}

/** A failure while factoring the modes of medium `medium` (0 = cover, 1 … L = layers). */
export class MediumFailure extends Error {
  constructor(
    readonly medium: number,
    override readonly cause: unknown,
  ) {
    super(cause instanceof Error ? cause.message : String(cause));
  }
}

const interfaces = new WeakMap<Modes, WeakMap<Modes, { T: CMatrix; U: CMatrix }>>();

/**
 * T = W_upper⁻¹·W_lower and U = V_upper⁻¹·V_lower. Remembered per pair of mode objects when both
 * are shared (handed out more than once by a mode cache: repeated layers, or a depth sweep from
 * its second point on), since only then can the pair come back; otherwise computed into scratch.
 */
function interfaceMatrices(upper: Modes, lower: Modes): { T: CMatrix; U: CMatrix } {
  const n = upper.n;
  if (!(isShared(upper) && isShared(lower))) return interfaceInto(upper, lower, scratchMatrix(n, S_T), scratchMatrix(n, S_U));
  let row = interfaces.get(upper);
  if (!row) {
    row = new WeakMap();
    interfaces.set(upper, row);
  }
  let e = row.get(lower);
  if (!e) {
    e = interfaceInto(upper, lower, cmatrix(n, n), cmatrix(n, n));
    row.set(lower, e);
  }
  return e;
}

function interfaceInto(upper: Modes, lower: Modes, T: CMatrix, U: CMatrix): { T: CMatrix; U: CMatrix } {
  lower.denseW(T);
  upper.solveW(T, T);
  lower.denseV(U);
  upper.solveV(U, U);
  return { T, U };
}

function transposeInto(out: CMatrix, a: Readonly<CMatrix>): void {
  const n = a.rows;
  const o = out.data;
  const d = a.data;
  for (let r = 0; r < n; r++) {
    for (let c = 0; c < n; c++) {
      const p = 2 * (r * n + c);
      const q = 2 * (c * n + r);
      o[q] = d[p]!;
      o[q + 1] = d[p + 1]!;
    }
  }
}

/** exp(i·q·d) per mode. */
export function phase(q: Float64Array, d: number): Float64Array {
  const x = new Float64Array(q.length);
  for (let k = 0; k < q.length; k += 2) {
    // exp(i(qr + i qi)d) = exp(−qi·d)·(cos(qr·d) + i sin(qr·d))
    const mag = Math.exp(-q[k + 1]! * d);
    const ang = q[k]! * d;
    x[k] = mag * Math.cos(ang);
    x[k + 1] = mag * Math.sin(ang);
  }
  return x;
}

/** r ← diag(x)·r·diag(x) */
function scaleBoth(r: CMatrix, x: Float64Array): void {
  const n = r.rows;
  const d = r.data;
  for (let i = 0; i < n; i++) {
    const ar = x[2 * i]!;
    const ai = x[2 * i + 1]!;
    for (let j = 0; j < n; j++) {
      const br = x[2 * j]!;
      const bi = x[2 * j + 1]!;
      const sr = ar * br - ai * bi;
      const si = ar * bi + ai * br;
      const p = 2 * (i * n + j);
      const vr = d[p]!;
      const vi = d[p + 1]!;
      d[p] = sr * vr - si * vi;
      d[p + 1] = sr * vi + si * vr;
    }
  }
}
