/**
 * Complex square roots with an explicit branch.
 *
 * The solver's propagation constants kz = √(ε·k0² − kx²) must pick the root whose field
 * exp(i·kz·z) decays or carries energy away from the interface under the exp(−iωt) convention:
 * Im kz > 0, and Re kz > 0 when Im kz = 0 (propagating, outgoing). `zsqrtUpper` is that branch;
 * `zsqrtPrincipal` is the usual Re ≥ 0 branch.
 */

/**
 * Principal square root (Re ≥ 0; on the negative real axis the root is +i·√|x|). Writes
 * [re, im] into out[offset], out[offset + 1].
 * Computed as in Kahan's "Branch cuts for complex elementary functions" (1987): no cancellation,
 * no overflow for |z| up to the largest double.
 */
export function zsqrtPrincipal(re: number, im: number, out: Float64Array, offset = 0): void {
  if (re === 0 && im === 0) {
    out[offset] = 0;
    out[offset + 1] = im;
    return;
  }
  const ar = Math.abs(re);
  const ai = Math.abs(im);
  // |z| without overflow
  const big = ar > ai ? ar : ai;
  const small = ar > ai ? ai : ar;
  const q = small / big;
  const mod = big * Math.sqrt(1 + q * q);
  const t = Math.sqrt(0.5 * (mod + ar));
  if (re >= 0) {
    out[offset] = t;
    out[offset + 1] = im / (2 * t);
  } else {
    out[offset] = ai / (2 * t);
    out[offset + 1] = im >= 0 ? t : -t; // im = −0 stays on the lower side
  }
}

/**
 * Square root on the branch Im ≥ 0, and Re ≥ 0 when the imaginary part is zero (or below
 * `tol`·|root|, which treats round-off-level imaginary parts of lossless modes as zero so a
 * propagating mode is never taken as counter-propagating). Writes [re, im] into out.
 */
export function zsqrtUpper(re: number, im: number, out: Float64Array, offset = 0, tol = 0): void {
  zsqrtPrincipal(re, im, out, offset);
  const r = out[offset]!;
  const i = out[offset + 1]!;
  // the principal root already has Re ≥ 0; flip to the upper half plane only when the
  // imaginary part is clearly negative, not round-off on a lossless propagating mode
  if (i < 0 && -i > tol * (r + -i)) {
    out[offset] = -r;
    out[offset + 1] = -i;
  }
}
