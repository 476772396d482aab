/** Design answers on top of the solver: convergence control. */
export * from './converge.ts';
