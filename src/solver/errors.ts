/**
 * Errors raised by the solver: invalid input (with the field, what was expected and what was
 * found) or numerical failure in a layer (with the layer, wavelength and angle).
 */
export type SolverErrorCode = 'invalid-input' | 'numerical';

export class SolverError extends Error {
  override readonly name = 'SolverError';
  constructor(
    readonly code: SolverErrorCode,
    message: string,
    /** where it happened: field path for input errors; layer, wavelength, angle for numerics */
    readonly context: Readonly<Record<string, string | number>> = {},
  ) {
    super(message);
  }
}
