/**
 * Reduction of a Hermitian matrix to real symmetric tridiagonal form, A = Q·T·Qᴴ — the zhetrd
 * step of the Hermitian eigensolver (zheev.ts), plus the back-transformation that turns
 * eigenvectors of T into eigenvectors of A.
 *
 * Method (Golub & Van Loan, Matrix Computations, 4th ed., §8.3.1; LAPACK Users' Guide, 3rd ed.
 * 1999, routines zhetrd/zhetd2/zunmtr): for k = 0 … n−2 a Householder reflector
 * H_k = I − τ_k·v_k·v_kᴴ (τ_k real, so H_k is Hermitian and unitary) maps column k below the
 * diagonal onto β_k·e₁; the trailing block is updated as H·B·H = B − v·wᴴ − w·vᴴ with
 * p = τ·B·v, w = p − (τ/2)(vᴴp)·v. Only the lower triangle of the trailing block is read and
 * written, so the work is (16/3)n³ real flops instead of twice that.
 *
 * The reflectors here take β_k = −e^{i·arg α}·‖x‖ (α the leading entry of x) rather than forcing
 * β real, which keeps τ real and avoids cancellation in v = x − β·e₁. The sub-diagonal of the
 * resulting Hermitian tridiagonal T_c is therefore complex; a diagonal unitary
 * D = diag(δ₀ … δ_{n−1}) with δ₀ = 1, δ_{k+1} = δ_k·β_k/|β_k| makes Dᴴ·T_c·D real with
 * off-diagonals |β_k| ≥ 0. Altogether A = (H₀⋯H_{n−2}·D)·T·(H₀⋯H_{n−2}·D)ᴴ.
 *
 * Storage (all interleaved complex, row-major like cmatrix.ts): reflector k is stored in row k
 * of the working matrix, columns k+1 … n−1 (the part of that row above the diagonal, which the
 * lower-triangle algorithm never touches), with v_k[0] = 1 stored explicitly. That keeps each
 * reflector contiguous for the unit-stride loops of the back-transformation.
 */

/** Below this, a sum of squares may have lost accuracy to underflow (≈ 2^−960). */
const SSQ_TINY = 1.0e-289;
/** Scratch for unitPhase's result (module-level so the per-column call allocates nothing). */
const PH = new Float64Array(2);

/**
 * out = z/|z| for z = re + i·im (out = 1 for z = 0). A subnormal z carries too few bits for
 * z/|z| to have modulus 1 to working precision — which would make the reflectors and the phase
 * scaling D slightly non-unitary — so such z is first scaled into the normal range by 2^600,
 * which is exact.
 */
function unitPhase(re: number, im: number, out: Float64Array): void {
  if (re === 0 && im === 0) {
    out[0] = 1;
    out[1] = 0;
    return;
  }
  if (Math.abs(re) < 1e-290 && Math.abs(im) < 1e-290) {
    re *= 2 ** 600;
    im *= 2 ** 600;
  }
  const h = Math.hypot(re, im);
  out[0] = re / h;
  out[1] = im / h;
}

/**
 * In-place reduction (unchecked kernel: the caller validated shapes and finiteness, and scaled
 * the matrix so its largest entry lies in about [1e-146, 1e146], where no sum of squares here can
 * overflow).
 *
 * @param n order.
 * @param A n×n interleaved row-major. On entry the lower triangle (diagonal included; imaginary
 *   parts of the diagonal are ignored) holds the Hermitian matrix; the strictly upper triangle is
 *   ignored. On exit the lower triangle is destroyed and row k, columns k+1 … n−1 hold v_k.
 * @param d out, length ≥ n: diagonal of T.
 * @param e out, length ≥ n−1: off-diagonal of T, real and ≥ 0.
 * @param tau out, length ≥ n−1: τ_k (0 when H_k = I).
 * @param phase out, length ≥ 2n: interleaved δ_k of the phase scaling D.
 * @param work scratch, length ≥ 2n.
 * @example
 * // [[2, −i], [i, 2]] is already tridiagonal: T = [[2, 1], [1, 2]] with D = diag(1, i)
 * const A = fromRows([[2, [0, -1]], [[0, 1], 2]]).data, d = new Float64Array(2), e = new Float64Array(2);
 * zhetrdBase(2, A, d, e, new Float64Array(2), new Float64Array(4), new Float64Array(4)); // d = [2, 2], e[0] = 1
 */
export function zhetrdBase(
  n: number,
  A: Float64Array,
  d: Float64Array,
  e: Float64Array,
  tau: Float64Array,
  phase: Float64Array,
  work: Float64Array,
): void {
  if (n === 0) return;
  const n2 = 2 * n;
  let dr = 1; // δ_k, carried along the recurrence δ_{k+1} = δ_k·β_k/|β_k|
  let di = 0;
  phase[0] = 1;
  phase[1] = 0;
  for (let k = 0; k < n - 1; k++) {
    const m = n - k - 1; // length of x = A(k+1 … n−1, k)
    const vo = k * n2 + 2 * (k + 1); // v_k lives in row k, right of the diagonal
    d[k] = A[k * n2 + 2 * k]!;

    // Gather x (a strided column) into the contiguous slot of v_k; accumulate ‖x(1:)‖².
    let sig = 0;
    for (let t = 0; t < m; t++) {
      const src = (k + 1 + t) * n2 + 2 * k;
      const xr = A[src]!;
      const xi = A[src + 1]!;
      A[vo + 2 * t] = xr;
      A[vo + 2 * t + 1] = xi;
      if (t > 0) sig += xr * xr + xi * xi;
    }
    let restZero = sig === 0;
    if (sig < SSQ_TINY && m > 1) {
      // The squares may have underflowed (even to 0): decide "nothing to annihilate" exactly.
      restZero = true;
      for (let t = 2; t < 2 * m; t++) {
        if (A[vo + t] !== 0) {
          restZero = false;
          break;
        }
      }
    }
    // β_k = |β_k|·(ur + i·ui): the new off-diagonal, to be made real by the phase scaling.
    let babs: number;
    let ur: number;
    let ui: number;
    if (restZero) {
      // Nothing below the sub-diagonal: H_k = I and β_k = α.
      tau[k] = 0;
      babs = Math.hypot(A[vo]!, A[vo + 1]!);
      unitPhase(A[vo]!, A[vo + 1]!, PH);
      ur = PH[0]!;
      ui = PH[1]!;
    } else {
      let back = 1;
      if (A[vo]! * A[vo]! + A[vo + 1]! * A[vo + 1]! + sig < SSQ_TINY) {
        // ‖x‖ is so small that its square lost digits to underflow, or is itself subnormal with
        // too few bits for H_k to be unitary to working precision. v_k and τ_k do not change
        // when x is scaled, so scale x by 2^600 (exact) and scale only β back at the end.
        back = 2 ** -600;
        sig = 0;
        for (let t = 0; t < 2 * m; t++) {
          const y = A[vo + t]! * 2 ** 600;
          A[vo + t] = y;
          if (t > 1) sig += y * y;
        }
      }
      const ar = A[vo]!;
      const ai = A[vo + 1]!;
      const aabs = Math.hypot(ar, ai); // once per column: no underflow in ar²
      const xnorm = Math.sqrt(aabs * aabs + sig);
      // φ = α/|α| (1 when α = 0); β = −φ‖x‖; 1/(α − β) = conj(φ)/(|α| + ‖x‖); τ = 1 + |α|/‖x‖.
      unitPhase(ar, ai, PH);
      const phr = PH[0]!;
      const phi = PH[1]!;
      babs = xnorm * back;
      ur = -phr;
      ui = -phi;
      // v = (x − β·e₁)/(α − β), i.e. v₀ = 1, v_t = x_t·conj(φ)/(|α| + ‖x‖); divided rather than
      // multiplied by a reciprocal, which could overflow (|v_t| ≤ 1 either way).
      const den = aabs + xnorm;
      A[vo] = 1;
      A[vo + 1] = 0;
      for (let t = 1; t < m; t++) {
        const xr = A[vo + 2 * t]!;
        const xi = A[vo + 2 * t + 1]!;
        A[vo + 2 * t] = (xr * phr + xi * phi) / den;
        A[vo + 2 * t + 1] = (xi * phr - xr * phi) / den;
      }
      const tk = 1 + aabs / xnorm;
      tau[k] = tk;
      hermitianRank2Update(n2, k + 1, m, A, vo, tk, work);
    }
    // Off-diagonal of T and the phase recurrence δ_{k+1} = δ_k·β_k/|β_k|.
    e[k] = babs;
    if (babs !== 0) {
      const nr = dr * ur - di * ui;
      di = dr * ui + di * ur;
      dr = nr;
    }
    phase[2 * (k + 1)] = dr;
    phase[2 * (k + 1) + 1] = di;
  }
  d[n - 1] = A[(n - 1) * n2 + 2 * (n - 1)]!;
}

/**
 * B ← H·B·H for the trailing Hermitian block B = A(o … o+m−1, o … o+m−1) (lower triangle),
 * H = I − τ·v·vᴴ with v (length m) at A[vo …]. `p` (length ≥ 2m) is scratch.
 *
 * Both passes take the rows of B in pairs (i, i+1): each element of v, p or w loaded in the
 * inner loop then serves two rows, which cuts the loads and stores per flop by about a third.
 */
function hermitianRank2Update(
  n2: number,
  o: number,
  m: number,
  A: Float64Array,
  vo: number,
  tk: number,
  p: Float64Array,
): void {
  const m2 = 2 * m;
  for (let t = 0; t < m2; t++) p[t] = 0;
  // p = B·v from the lower triangle: row i contributes B(i, 0:i)·v(0:i) to p_i and, through
  // Hermitian symmetry, conj(B(i, j))·v_i to p_j — both walks along row i are unit-stride.
  let i = 0;
  for (; i + 1 < m; i += 2) {
    const ra = (o + i) * n2 + 2 * o;
    const rb = ra + n2;
    const ii = 2 * i;
    const var_ = A[vo + ii]!;
    const vai = A[vo + ii + 1]!;
    const vbr = A[vo + ii + 2]!;
    const vbi = A[vo + ii + 3]!;
    let sar = 0;
    let sai = 0;
    let sbr = 0;
    let sbi = 0;
    for (let jj = 0; jj < ii; jj += 2) {
      const xr = A[ra + jj]!;
      const xi = A[ra + jj + 1]!;
      const yr = A[rb + jj]!;
      const yi = A[rb + jj + 1]!;
      const vr = A[vo + jj]!;
      const vi = A[vo + jj + 1]!;
      sar += xr * vr - xi * vi;
      sai += xr * vi + xi * vr;
      sbr += yr * vr - yi * vi;
      sbi += yr * vi + yi * vr;
      p[jj] += xr * var_ + xi * vai + yr * vbr + yi * vbi;
      p[jj + 1] += xr * vai - xi * var_ + yr * vbi - yi * vbr;
    }
    // B(i+1, i), then the two (real) diagonal entries.
    const xr = A[rb + ii]!;
    const xi = A[rb + ii + 1]!;
    sbr += xr * var_ - xi * vai;
    sbi += xr * vai + xi * var_;
    const da = A[ra + ii]!;
    const db = A[rb + ii + 2]!;
    p[ii] += sar + da * var_ + xr * vbr + xi * vbi;
    p[ii + 1] += sai + da * vai + xr * vbi - xi * vbr;
    p[ii + 2] += sbr + db * vbr;
    p[ii + 3] += sbi + db * vbi;
  }
  if (i < m) {
    const ra = (o + i) * n2 + 2 * o;
    const ii = 2 * i;
    const var_ = A[vo + ii]!;
    const vai = A[vo + ii + 1]!;
    let sar = 0;
    let sai = 0;
    for (let jj = 0; jj < ii; jj += 2) {
      const xr = A[ra + jj]!;
      const xi = A[ra + jj + 1]!;
      const vr = A[vo + jj]!;
      const vi = A[vo + jj + 1]!;
      sar += xr * vr - xi * vi;
      sai += xr * vi + xi * vr;
      p[jj] += xr * var_ + xi * vai;
      p[jj + 1] += xr * vai - xi * var_;
    }
    const da = A[ra + ii]!;
    p[ii] += sar + da * var_;
    p[ii + 1] += sai + da * vai;
  }
  // w = τ·p − (τ²/2)(vᴴp)·v, stored over p; vᴴ(B v) is real for Hermitian B.
  let vp = 0;
  for (let t = 0; t < m2; t += 2) vp += A[vo + t]! * p[t]! + A[vo + t + 1]! * p[t + 1]!;
  const kk = 0.5 * tk * tk * vp;
  for (let t = 0; t < m2; t++) p[t] = tk * p[t]! - kk * A[vo + t]!;
  // B ← B − v·wᴴ − w·vᴴ on the lower triangle; the diagonal stays exactly real.
  //   (v_i·conj(w_j) + w_i·conj(v_j)) = (vr·wr' + vi·wi' + wr·vr' + wi·vi')
  //                                   + i(vi·wr' − vr·wi' + wi·vr' − wr·vi')   (primes: index j)
  i = 0;
  for (; i + 1 < m; i += 2) {
    const ra = (o + i) * n2 + 2 * o;
    const rb = ra + n2;
    const ii = 2 * i;
    const var_ = A[vo + ii]!;
    const vai = A[vo + ii + 1]!;
    const war = p[ii]!;
    const wai = p[ii + 1]!;
    const vbr = A[vo + ii + 2]!;
    const vbi = A[vo + ii + 3]!;
    const wbr = p[ii + 2]!;
    const wbi = p[ii + 3]!;
    for (let jj = 0; jj < ii; jj += 2) {
      const vr = A[vo + jj]!;
      const vi = A[vo + jj + 1]!;
      const wr = p[jj]!;
      const wi = p[jj + 1]!;
      A[ra + jj] -= var_ * wr + vai * wi + war * vr + wai * vi;
      A[ra + jj + 1] -= vai * wr - var_ * wi + wai * vr - war * vi;
      A[rb + jj] -= vbr * wr + vbi * wi + wbr * vr + wbi * vi;
      A[rb + jj + 1] -= vbi * wr - vbr * wi + wbi * vr - wbr * vi;
    }
    A[rb + ii] -= vbr * war + vbi * wai + wbr * var_ + wbi * vai;
    A[rb + ii + 1] -= vbi * war - vbr * wai + wbi * var_ - wbr * vai;
    A[ra + ii] -= 2 * (var_ * war + vai * wai);
    A[ra + ii + 1] = 0;
    A[rb + ii + 2] -= 2 * (vbr * wbr + vbi * wbi);
    A[rb + ii + 3] = 0;
  }
  if (i < m) {
    const ra = (o + i) * n2 + 2 * o;
    const ii = 2 * i;
    const var_ = A[vo + ii]!;
    const vai = A[vo + ii + 1]!;
    const war = p[ii]!;
    const wai = p[ii + 1]!;
    for (let jj = 0; jj < ii; jj += 2) {
      const vr = A[vo + jj]!;
      const vi = A[vo + jj + 1]!;
      const wr = p[jj]!;
      const wi = p[jj + 1]!;
      A[ra + jj] -= var_ * wr + vai * wi + war * vr + wai * vi;
      A[ra + jj + 1] -= vai * wr - var_ * wi + wai * vr - war * vi;
    }
    A[ra + ii] -= 2 * (var_ * war + vai * wai);
    A[ra + ii + 1] = 0;
  }
}

/** Reflectors applied together by zhetrdBackTransform. */
export const BACK_TRANSFORM_BLOCK = 4;

/**
 * Back-transformation Z = H₀⋯H_{n−2}·D·Y: eigenvectors Y of the real tridiagonal T (columns of
 * a real n×n row-major matrix) become eigenvectors Z of A. Cost 8n³ real flops — less than
 * forming Q and multiplying.
 *
 * The reflectors are applied right to left in blocks of four (k₀ … k₀+3), in the spirit of the
 * blocked zunmtr: for rows k₀+1 … n−1 of Z,
 *   u_c = v_cᴴ·Z                       (one pass over Z for all four),
 *   w_c = u_c − Σ_{c' > c} τ_{c'}·(v_cᴴ v_{c'})·w_{c'}   (4×n, cheap),
 *   Z  ← Z − Σ_c τ_c·v_c·w_c           (one more pass),
 * which equals applying H_{k₀+3}, …, H_{k₀} one after the other (expand the products), but
 * reads and writes Z twice per four reflectors instead of twice per reflector. The first pass
 * walks a column of Z with the four sums in registers; the second walks rows with the four
 * coefficients τ_c·v_c[r] in registers.
 *
 * @param A reflectors as left by zhetrdBase.
 * @param y n×n real row-major, read only.
 * @param Z out, n×n interleaved row-major (fully overwritten).
 * @param work scratch, length ≥ 16n.
 * @example
 * // after zhetrdBase and zsteqrBase(n, d, e, y, …): the eigenvectors of A
 * const vectors = cmatrix(n, n);
 * zhetrdBackTransform(n, A, tau, phase, y, vectors.data, new Float64Array(16 * n));
 */
export function zhetrdBackTransform(
  n: number,
  A: Float64Array,
  tau: Float64Array,
  phase: Float64Array,
  y: Float64Array,
  Z: Float64Array,
  work: Float64Array,
): void {
  const n2 = 2 * n;
  for (let i = 0; i < n; i++) {
    const pr = phase[2 * i]!;
    const pi = phase[2 * i + 1]!;
    const yo = i * n;
    const zo = i * n2;
    for (let j = 0; j < n; j++) {
      const v = y[yo + j]!;
      Z[zo + 2 * j] = pr * v;
      Z[zo + 2 * j + 1] = pi * v;
    }
  }
  // V: the block's reflectors packed by row, V[8(r − r₀) + 2c] = v_c[r] (zero above its start),
  // τ folded in later; W: the sums, W[8j + 2c] = w_c[j].
  const V = work;
  const W = work.subarray(8 * n);
  for (let kHi = n - 2; kHi >= 0; kHi -= 4) {
    const k0 = kHi >= 3 ? kHi - 3 : 0;
    const r0 = k0 + 1; // first row touched by the block
    const rows = n - r0;
    // Pack; skip the block if every τ is 0 (e.g. already tridiagonal input).
    let any = false;
    for (let c = 0; c < 4; c++) {
      const k = k0 + c;
      const tk = k <= kHi ? tau[k]! : 0;
      if (tk !== 0) any = true;
      const vo = k * n2 + 2 * (k + 1);
      for (let r = 0; r < rows; r++) {
        const q = 8 * r + 2 * c;
        if (tk === 0 || r < c) {
          V[q] = 0;
          V[q + 1] = 0;
        } else {
          V[q] = A[vo + 2 * (r - c)]!;
          V[q + 1] = A[vo + 2 * (r - c) + 1]!;
        }
      }
    }
    if (!any) continue;
    const t0 = k0 <= kHi ? tau[k0]! : 0;
    const t1 = k0 + 1 <= kHi ? tau[k0 + 1]! : 0;
    const t2 = k0 + 2 <= kHi ? tau[k0 + 2]! : 0;
    const t3 = k0 + 3 <= kHi ? tau[k0 + 3]! : 0;

    // Pass 1: u_c[j] = Σ_r conj(v_c[r])·Z[r, j], column by column.
    const zBase = r0 * n2;
    for (let j = 0; j < n2; j += 2) {
      let a0r = 0, a0i = 0, a1r = 0, a1i = 0, a2r = 0, a2i = 0, a3r = 0, a3i = 0;
      for (let r = 0, zq = zBase + j, q = 0; r < rows; r++, zq += n2, q += 8) {
        const zr = Z[zq]!;
        const zi = Z[zq + 1]!;
        let vr = V[q]!;
        let vi = V[q + 1]!;
        a0r += vr * zr + vi * zi;
        a0i += vr * zi - vi * zr;
        vr = V[q + 2]!;
        vi = V[q + 3]!;
        a1r += vr * zr + vi * zi;
        a1i += vr * zi - vi * zr;
        vr = V[q + 4]!;
        vi = V[q + 5]!;
        a2r += vr * zr + vi * zi;
        a2i += vr * zi - vi * zr;
        vr = V[q + 6]!;
        vi = V[q + 7]!;
        a3r += vr * zr + vi * zi;
        a3i += vr * zi - vi * zr;
      }
      const wq = 4 * j;
      W[wq] = a0r;
      W[wq + 1] = a0i;
      W[wq + 2] = a1r;
      W[wq + 3] = a1i;
      W[wq + 4] = a2r;
      W[wq + 5] = a2i;
      W[wq + 6] = a3r;
      W[wq + 7] = a3i;
    }

    // Couplings γ_{cc'} = τ_{c'}·(v_cᴴ v_{c'}) for c < c'.
    let g01r = 0, g01i = 0, g02r = 0, g02i = 0, g03r = 0, g03i = 0;
    let g12r = 0, g12i = 0, g13r = 0, g13i = 0, g23r = 0, g23i = 0;
    for (let q = 0; q < 8 * rows; q += 8) {
      const v0r = V[q]!, v0i = V[q + 1]!, v1r = V[q + 2]!, v1i = V[q + 3]!;
      const v2r = V[q + 4]!, v2i = V[q + 5]!, v3r = V[q + 6]!, v3i = V[q + 7]!;
      g01r += v0r * v1r + v0i * v1i;
      g01i += v0r * v1i - v0i * v1r;
      g02r += v0r * v2r + v0i * v2i;
      g02i += v0r * v2i - v0i * v2r;
      g03r += v0r * v3r + v0i * v3i;
      g03i += v0r * v3i - v0i * v3r;
      g12r += v1r * v2r + v1i * v2i;
      g12i += v1r * v2i - v1i * v2r;
      g13r += v1r * v3r + v1i * v3i;
      g13i += v1r * v3i - v1i * v3r;
      g23r += v2r * v3r + v2i * v3i;
      g23i += v2r * v3i - v2i * v3r;
    }
    g01r *= t1; g01i *= t1; g02r *= t2; g02i *= t2; g03r *= t3; g03i *= t3;
    g12r *= t2; g12i *= t2; g13r *= t3; g13i *= t3; g23r *= t3; g23i *= t3;

    // w_3 = u_3; w_c = u_c − Σ_{c'>c} γ_{cc'}·w_{c'}; then scale by τ_c for the update.
    for (let wq = 0; wq < 4 * n2; wq += 8) {
      const w3r = W[wq + 6]!;
      const w3i = W[wq + 7]!;
      const w2r = W[wq + 4]! - (g23r * w3r - g23i * w3i);
      const w2i = W[wq + 5]! - (g23r * w3i + g23i * w3r);
      const w1r = W[wq + 2]! - (g12r * w2r - g12i * w2i) - (g13r * w3r - g13i * w3i);
      const w1i = W[wq + 3]! - (g12r * w2i + g12i * w2r) - (g13r * w3i + g13i * w3r);
      const w0r = W[wq]! - (g01r * w1r - g01i * w1i) - (g02r * w2r - g02i * w2i) - (g03r * w3r - g03i * w3i);
      const w0i = W[wq + 1]! - (g01r * w1i + g01i * w1r) - (g02r * w2i + g02i * w2r) - (g03r * w3i + g03i * w3r);
      W[wq] = t0 * w0r;
      W[wq + 1] = t0 * w0i;
      W[wq + 2] = t1 * w1r;
      W[wq + 3] = t1 * w1i;
      W[wq + 4] = t2 * w2r;
      W[wq + 5] = t2 * w2i;
      W[wq + 6] = t3 * w3r;
      W[wq + 7] = t3 * w3i;
    }

    // Pass 2: Z[r, :] −= Σ_c v_c[r]·(τ_c w_c), row by row.
    for (let r = 0, q = 0, zo = zBase; r < rows; r++, q += 8, zo += n2) {
      const v0r = V[q]!, v0i = V[q + 1]!, v1r = V[q + 2]!, v1i = V[q + 3]!;
      const v2r = V[q + 4]!, v2i = V[q + 5]!, v3r = V[q + 6]!, v3i = V[q + 7]!;
      for (let j = 0, wq = 0; j < n2; j += 2, wq += 8) {
        let wr = W[wq]!;
        let wi = W[wq + 1]!;
        let sr = v0r * wr - v0i * wi;
        let si = v0r * wi + v0i * wr;
        wr = W[wq + 2]!;
        wi = W[wq + 3]!;
        sr += v1r * wr - v1i * wi;
        si += v1r * wi + v1i * wr;
        wr = W[wq + 4]!;
        wi = W[wq + 5]!;
        sr += v2r * wr - v2i * wi;
        si += v2r * wi + v2i * wr;
        wr = W[wq + 6]!;
        wi = W[wq + 7]!;
        sr += v3r * wr - v3i * wi;
        si += v3r * wi + v3i * wr;
        Z[zo + j] -= sr;
        Z[zo + j + 1] -= si;
      }
    }
  }
}
