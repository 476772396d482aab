/**
 * A sweep worker (an ES module Web Worker): evaluates points of a plan with the same engine
 * functions the CLI's worker threads use (`createEvalContext`, `evaluatePoint`), and hands the
 * rows back through comlink.
 */
import './mathjs.ts';
import { expose } from 'comlink';
import { createEvalContext, evaluatePoint, type EvalContext } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';
import { linalgBackend, wasmStatus } from '../linalg/wasm/runtime.ts';
import { readerOf, type Tables } from './tables.ts';

let plan: SweepPlan | null = null;
let ctx: EvalContext | null = null;
let readText: ((file: string) => string) | undefined;

export interface SweepWorkerApi {
  /** Take a plan (and the material tables its design names); the context starts empty. */
  setPlan(p: SweepPlan, tables: Tables | null): void;
  /** Evaluate points first … first+count−1, in order. */
  evaluate(first: number, count: number): SweepRow[];
  /** Which dense-kernel backend this worker runs ('wasm' or 'ts') and why. */
  engine(): { backend: string; status: string };
}

const api: SweepWorkerApi = {
  setPlan(p, tables) {
    plan = p;
    ctx = createEvalContext();
    readText = tables ? readerOf(tables) : undefined;
  },
  evaluate(first, count) {
    if (!plan || !ctx) throw new Error('evaluate() before setPlan()');
    const rows: SweepRow[] = [];
    for (let i = first; i < first + count; i++) rows.push(evaluatePoint(plan, i, ctx, readText));
    return rows;
  },
  engine() {
    return { backend: linalgBackend(), status: wasmStatus() };
  },
};

expose(api);
