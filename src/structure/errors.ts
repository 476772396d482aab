/**
 * The error every structure builder raises on bad input: it names the parameter, what was
 * expected and what was found.
 * @example
 * try { sawtooth({ periodUm: 1, blazeDeg: 95, ridgeMaterial: 'Al', grooveMaterial: 'air', slices: 10 }); }
 * catch (e) { (e as StructureError).message; } // → "sawtooth.blazeDeg: expected an angle in (0°, 90°), found 95"
 */
export class StructureError extends Error {
  override readonly name = 'StructureError';
  /**
   * @param field parameter path, e.g. `trapezoid.sidewallDeg` or `layers[2].segments[0].from`
   * @param expected what an admissible value looks like
   * @param found the offending value as text
   */
  constructor(
    readonly field: string,
    readonly expected: string,
    readonly found: string,
  ) {
    super(`${field}: expected ${expected}, found ${found}`);
  }
}
