/**
 * Converged or not: raise the retained orders (and the profile's slices) until the efficiencies
 * stop changing, and report the last change as the error estimate of every result.
 *
 * Orders grow geometrically (×1.5, at least +4) from a start that keeps every propagating order
 * plus a margin; slices double. A level counts as converged when the largest change of any
 * propagating order's efficiency (R and T, TE and TM) between it and the previous level is
 * below the tolerance (default 1e-4 absolute, common practice for catalogue efficiencies).
 */
import { type DesignModel, designToModel, problemAt, type Problem, type ReadText } from '../design/index.ts';
import { ModeCache, solve, type SolveResult } from '../solver/index.ts';

export interface ConvergenceOptions {
  /** absolute efficiency tolerance (default 1e-4) */
  readonly tolerance?: number;
  /** 'auto' to converge in orders, or a fixed M */
  readonly orders?: 'auto' | number;
  /** 'auto' to converge in slices (profiles only), or a fixed count, or undefined for the design's */
  readonly slices?: 'auto' | number;
  /** ceilings: a run that reaches them reports "not converged" (default orders: 2.5× the start, at least 40) */
  readonly maxOrders?: number;
  readonly maxSlices?: number;
}

export interface ConvergenceStep {
  readonly orders: number;
  readonly slices: number | null;
  /** largest efficiency change from the previous step (NaN for the first) */
  readonly change: number;
}

export interface ConvergedResult {
  readonly problem: Problem;
  readonly result: SolveResult;
  readonly orders: number;
  readonly slices: number | null;
  /** last change in orders (error estimate from truncation); NaN when orders were fixed */
  readonly ordersChange: number;
  /** last change in slices (error estimate from the staircase); NaN when slices were fixed or there is no profile */
  readonly slicesChange: number;
  readonly converged: boolean;
  readonly history: ReadonlyArray<ConvergenceStep>;
}

/** Largest |Δη| over the propagating orders of both results (an order missing in one counts as 0). */
export function efficiencyChange(a: SolveResult, b: SolveResult): number {
  let worst = 0;
  for (const pol of ['s', 'p'] as const) {
    for (const side of ['reflected', 'transmitted'] as const) {
      const map = new Map<number, number>();
      for (const o of a[pol][side]) map.set(o.m, o.efficiency);
      const seen = new Set<number>();
      for (const o of b[pol][side]) {
        worst = Math.max(worst, Math.abs(o.efficiency - (map.get(o.m) ?? 0)));
        seen.add(o.m);
      }
      for (const [m, e] of map) if (!seen.has(m)) worst = Math.max(worst, Math.abs(e));
    }
  }
  return worst;
}

/** Smallest M that keeps every propagating order, plus a margin of 5. */
function startOrders(p: Problem): number {
  const { structure: s, incidence: i } = p;
  const n = Math.max(s.cover.re, s.substrate.re);
  const a0 = s.cover.re * Math.sin((i.thetaDeg * Math.PI) / 180) * Math.cos(((i.phiDeg ?? 0) * Math.PI) / 180);
  const K = i.wavelengthUm / s.periodUm;
  return Math.ceil((n + Math.abs(a0)) / K) + 5;
}

/**
 * Solve a design with its orders (and slices) raised until converged.
 * @param raw the design file's object
 * @throws {InputError} as designToModel/problemAt; SolverError as solve().
 * @example
 * const r = solveConverged(design, { orders: 'auto' }); r.orders; r.ordersChange; // e.g. 31, 4e-5
 */
export function solveConverged(raw: unknown, options: ConvergenceOptions = {}, readText?: ReadText): ConvergedResult {
  const tol = options.tolerance ?? 1e-4;
  if (!(tol > 0)) throw new RangeError(`tolerance must be > 0, found ${tol}`);
  const maxSlices = options.maxSlices ?? 160;
  const base = raw as Record<string, unknown>;
  const withSlices = (S: number | undefined): DesignModel => designToModel(S === undefined ? base : { ...base, slices: S }, readText);
  let model = withSlices(typeof options.slices === 'number' ? options.slices : undefined);
  const history: ConvergenceStep[] = [];
  const cache = new ModeCache(512);
  const at = (m: DesignModel, M: number): { problem: Problem; result: SolveResult } => {
    const problem = problemAt({ ...m, orders: M });
    return { problem, result: solve(problem.structure, problem.incidence, problem.options, cache) };
  };

  // orders
  let M = typeof options.orders === 'number' ? options.orders : Math.max(model.orders, startOrders(problemAt(model)));
  const maxOrders = options.maxOrders ?? Math.max(40, Math.ceil(2.5 * M));
  let cur = at(model, M);
  let ordersChange = NaN;
  let converged = true;
  history.push({ orders: M, slices: model.slices, change: NaN });
  if (options.orders === 'auto') {
    converged = false;
    while (M < maxOrders) {
      const next = Math.min(maxOrders, Math.max(M + 4, Math.round(M * 1.5)));
      const r = at(model, next);
      ordersChange = efficiencyChange(cur.result, r.result);
      history.push({ orders: next, slices: model.slices, change: ordersChange });
      M = next;
      cur = r;
      if (ordersChange < tol) {
        converged = true;
        break;
      }
    }
  }
  // slices
  let slicesChange = NaN;
  if (options.slices === 'auto' && model.slices !== null) {
    let sliceConverged = false;
    let S = model.slices;
    while (S < maxSlices) {
      const nextS = Math.min(maxSlices, S * 2);
      const m2 = withSlices(nextS);
      const r = at(m2, M);
      slicesChange = efficiencyChange(cur.result, r.result);
      history.push({ orders: M, slices: m2.slices, change: slicesChange });
      S = nextS;
      model = m2;
      cur = r;
      if (slicesChange < tol) {
        sliceConverged = true;
        break;
      }
    }
    converged = converged && sliceConverged;
  }
  return { problem: cur.problem, result: cur.result, orders: M, slices: model.slices, ordersChange, slicesChange, converged, history };
}
