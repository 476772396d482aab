/** Design answers on top of the solver: convergence control. */
export * from './converge.ts';
/** Design answers: optimization of design fields and Monte Carlo fabrication tolerances. */
export * from './random.ts';
export * from './brent.ts';
export * from './nelder-mead.ts';
export * from './objective.ts';
export * from './optimize.ts';
export * from './tolerance.ts';
