/** The rigorous solver: `solve()` and its records. */
export * from './types.ts';
export * from './errors.ts';
export { solve, SOLVER_VERSION } from './solve.ts';
export { ModeCache } from './cache.ts';
export { nearField } from './fields.ts';
export type { FieldGrid, FieldPeak, NearField } from './fields.ts';
