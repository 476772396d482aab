/**
 * Complex square roots with an explicit branch.
 *
 * The solver's propagation constants kz = √(ε·k0² − kx²) must pick the root whose field
 * exp(i·kz·z) decays or carries energy away from the interface under the exp(−iωt) convention:
 * Im kz > 0, and Re kz > 0 when Im kz = 0 (propagating, outgoing). `zsqrtUpper` is that branch;
 * `zsqrtPrincipal` is the usual Re ≥ 0 branch.
 */

// Exact powers of two for rescaling: near the overflow threshold |z| + |re| would overflow, and
// among subnormals the intermediate 0.5·(|z| + |re|) would lose bits. Scaling z by 4^±k scales
// the root by 2^±k exactly.
const HUGE = 2 ** 1020;
const TINY = 2 ** -1020;
const DOWN = 2 ** -4; // for |z| ≥ HUGE: root × 2^2
const UP = 2 ** 104; // for |z| < TINY: root × 2^-52

/**
 * Principal square root (Re ≥ 0; on the negative real axis the root is +i·√|x|, or −i·√|x|
 * when the imaginary part is −0). Writes [re, im] into out[offset], out[offset + 1].
 * Computed as in Kahan's "Branch cuts for complex elementary functions" (1987): no cancellation,
 * and no overflow or underflow for any finite |z| (inputs near the limits are rescaled by exact
 * powers of two). Infinite parts follow C99 Annex G: √(x ± i∞) = +∞ ± i∞, √(−∞ + iy) = 0 + i∞.
 * @example
 * const r = new Float64Array(2);
 * zsqrtPrincipal(-4, 0, r); // r = [0, 2]
 */
export function zsqrtPrincipal(re: number, im: number, out: Float64Array, offset = 0): void {
  if (re === 0 && im === 0) {
    out[offset] = 0;
    out[offset + 1] = im;
    return;
  }
  let ar = Math.abs(re);
  let ai = Math.abs(im);
  if (ai === Infinity) {
    out[offset] = Infinity;
    out[offset + 1] = im;
    return;
  }
  let big = ar > ai ? ar : ai;
  let unscale = 1;
  if (big >= HUGE && big !== Infinity) {
    ar *= DOWN;
    ai *= DOWN;
    big *= DOWN;
    unscale = 4;
  } else if (big < TINY) {
    ar *= UP;
    ai *= UP;
    big *= UP;
    unscale = 2 ** -52;
  }
  const small = ar > ai ? ai : ar;
  // |z| without overflow
  const q = small / big;
  const mod = big * Math.sqrt(1 + q * q);
  const t = Math.sqrt(0.5 * (mod + ar));
  // the smaller part of the root is |im|/(2t); with the scaled |im| it scales like t
  const other = ai / (2 * t);
  if (re >= 0) {
    out[offset] = t * unscale;
    out[offset + 1] = (im < 0 || Object.is(im, -0) ? -other : other) * unscale;
  } else {
    out[offset] = other * unscale;
    out[offset + 1] = (im >= 0 && !Object.is(im, -0) ? t : -t) * unscale; // im = −0 stays on the lower side
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
