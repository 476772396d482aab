/**
 * Sweeps: vary design fields over ranges (grid or zip), set the incidence by a mount, and turn
 * each point into one CSV row of efficiencies. Pure: no Node-only imports, so the same code runs
 * in worker threads and browsers. `planSweep` validates once; `evaluatePoint` runs anywhere the
 * plan (plain JSON) is sent.
 */
export type * from './types.ts';
export { DEFAULT_OUTPUTS, parseParameterFlag, type SweepParameterSpec, type SweepSpec, SweepSpecSchema } from './spec.ts';
export { designAt, MAX_POINTS, planSweep } from './plan.ts';
export { pointAt } from './point.ts';
export { createEvalContext, type EvalContext, type EvalContextOptions, evaluatePoint, formatCell } from './evaluate.ts';
export { headerText, rowText, type SweepFormat } from './rows-text.ts';
