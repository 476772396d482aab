/** ñ from ε on the absorbing branch (internal to the materials layer). */
import type { Complex } from '../solver/types.ts';
import { zsqrtUpper } from '../linalg/zsqrt.ts';

const buf = new Float64Array(2);

/**
 * ñ = √ε on the branch Im ñ ≥ 0 (and Re ñ ≥ 0 when ε is real and positive): with exp(−iωt) a
 * passive medium has Im ε ≥ 0, whose principal root already lies in the first quadrant; a negative
 * real ε (a lossless metal) gives ñ = i·√|ε|.
 * @example
 * indexFromPermittivity(-4, 0); // {re: 0, im: 2}
 */
export function indexFromPermittivity(epsRe: number, epsIm: number): Complex {
  zsqrtUpper(epsRe, epsIm, buf, 0);
  return { re: buf[0]!, im: buf[1]! };
}
