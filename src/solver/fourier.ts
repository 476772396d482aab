/**
 * Fourier coefficients of a layer's permittivity profile.
 *
 * For piecewise-constant profiles the coefficients are exact (closed form of the integral over
 * each segment), so there is no sampling error: with ε(x) = Σ_k c_k·exp(i·k·2πx/Λ),
 *   c_k = Σ_segments v·(exp(−i2πk·a) − exp(−i2πk·b)) / (i2πk),   c_0 = Σ v·(b − a),
 * for a segment of value v on [a, b) (fractions of the period).
 */
import { zsqrtPrincipal } from '../linalg/index.ts';
import type { Complex, Profile, Segment } from './types.ts';

/** ñ = √ε on the principal branch (n ≥ 0; κ ≥ 0 for an absorbing ε), the inverse of permittivityOf. */
export function indexFromPermittivity(re: number, im: number): Complex {
  const out = new Float64Array(2);
  zsqrtPrincipal(re, im, out, 0);
  return { re: out[0]!, im: out[1]! };
}

/** ε = ñ² as [re, im]. */
export function permittivityOf(n: Complex): [number, number] {
  return [n.re * n.re - n.im * n.im, 2 * n.re * n.im];
}

/**
 * Coefficients c_k, k = −K…K, interleaved (c_k at 2·(k + K)), of ε(x) (or of 1/ε(x) when
 * `inverse`) for the profile.
 */
export function profileCoefficients(profile: Profile, K: number, inverse: boolean): Float64Array {
  const out = new Float64Array(2 * (2 * K + 1));
  switch (profile.kind) {
    case 'uniform': {
      const [er, ei] = permittivityOf(profile.index);
      const v = inverse ? reciprocal(er, ei) : [er, ei];
      out[2 * K] = v[0]!;
      out[2 * K + 1] = v[1]!;
      return out;
    }
    case 'segments':
      segmentCoefficients(profile.segments, K, inverse, out);
      return out;
    case 'fourier': {
      const src = inverse ? profile.inversePermittivity : profile.permittivity;
      const Ks = (src.length - 1) / 2;
      for (let k = -Math.min(K, Ks); k <= Math.min(K, Ks); k++) {
        const c = src[k + Ks]!;
        out[2 * (k + K)] = c.re;
        out[2 * (k + K) + 1] = c.im;
      }
      return out;
    }
  }
}

function reciprocal(re: number, im: number): [number, number] {
  const d = re * re + im * im;
  return [re / d, -im / d];
}

/** Exact coefficients of a piecewise-constant profile into `out` (k = −K…K). */
export function segmentCoefficients(segments: ReadonlyArray<Segment>, K: number, inverse: boolean, out: Float64Array): void {
  out.fill(0);
  for (const seg of segments) {
    const [er, ei] = permittivityOf(seg.index);
    const [vr, vi] = inverse ? reciprocal(er, ei) : [er, ei];
    const a = seg.from;
    const b = seg.to;
    out[2 * K] += vr * (b - a);
    out[2 * K + 1] += vi * (b - a);
    for (let k = 1; k <= K; k++) {
      const w = 2 * Math.PI * k;
      // (exp(−iwa) − exp(−iwb)) / (iw) for +k; the −k term is the same with w → −w
      const dr = Math.cos(w * a) - Math.cos(w * b);
      const di = -Math.sin(w * a) + Math.sin(w * b);
      // divide (dr + i·di) by (i·w): (dr + i di)/(i w) = (di − i dr)/w
      const gr = di / w;
      const gi = -dr / w;
      // +k
      out[2 * (K + k)] += vr * gr - vi * gi;
      out[2 * (K + k) + 1] += vr * gi + vi * gr;
      // −k: (exp(iwa) − exp(iwb))/(−iw) = conj of the +k geometric factor
      out[2 * (K - k)] += vr * gr + vi * gi;
      out[2 * (K - k) + 1] += -vr * gi + vi * gr;
    }
  }
}

/** True when every value the profile takes is real (no absorption or gain). */
export function isLossless(profile: Profile): boolean {
  switch (profile.kind) {
    case 'uniform':
      return profile.index.im === 0 || profile.index.re === 0;
    case 'segments':
      return profile.segments.every((s) => s.index.im === 0 || s.index.re === 0);
    case 'fourier': {
      // ε(x) real ⇔ c_−k = conj(c_k)
      const c = profile.permittivity;
      const K = (c.length - 1) / 2;
      for (let k = 0; k <= K; k++) {
        const a = c[K + k]!;
        const b = c[K - k]!;
        const scale = Math.abs(a.re) + Math.abs(a.im) + Math.abs(b.re) + Math.abs(b.im) + 1e-300;
        if (Math.abs(a.re - b.re) > 1e-14 * scale || Math.abs(a.im + b.im) > 1e-14 * scale) return false;
      }
      return true;
    }
  }
}
