/**
 * The work of one sweep worker thread: evaluate a block of points and return the rows packed.
 * The plan arrives once (workerData); one EvalContext lives for the thread's whole run, so the
 * engine's caches (design models, layer modes) carry over from batch to batch (unless the run
 * asks for a fresh context per point, to measure what the caches save).
 *
 * Test-only fault and delay hooks: see src/cli/sweep-test-hooks.ts.
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { workerData } from 'node:worker_threads';
import { move, transferableSymbol, valueSymbol } from 'piscina';
import { createEvalContext, evaluatePoint } from '../src/sweep/index.ts';
import type { SweepRow } from '../src/sweep/types.ts';
import { packRows, type BatchResult, type BatchTask, type WorkerSetup } from '../src/cli/sweep-protocol.ts';
import { testHooks } from '../src/cli/sweep-test-hooks.ts';

const setup = workerData as WorkerSetup;
let ctx = createEvalContext();
const readText = (file: string): string => readFileSync(resolve(setup.baseDir, file), 'utf8');

export default function evaluateBatch(task: BatchTask): unknown {
  const t0 = performance.now();
  const rows: SweepRow[] = [];
  for (let i = task.first; i < task.first + task.count; i++) {
    testHooks(i, true);
    if (setup.freshContextPerPoint) ctx = createEvalContext();
    rows.push(evaluatePoint(setup.plan, i, ctx, readText));
  }
  const result: BatchResult = packRows(task.first, setup.plan.columns.length, rows, performance.now() - t0);
  // the numbers' buffer moves to the main thread instead of being copied
  return move({ [transferableSymbol]: result.numbers.buffer, [valueSymbol]: result } as never);
}
