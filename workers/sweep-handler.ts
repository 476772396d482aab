/**
 * The work of one sweep worker thread: evaluate a block of points and return the rows packed.
 * The plan arrives once (workerData); one EvalContext lives for the thread's whole run, so the
 * engine's caches (materials, layer modes) carry over from batch to batch.
 *
 * Test-only hooks (read from the environment; they exist so the tests can provoke faults and slow
 * runs on purpose, and have no use otherwise):
 *   FURROW_TEST_CRASH_AT=i[,j…]     the thread dies (process.exit(70) in the worker) when it reaches point i
 *   FURROW_TEST_CRASH_MODE=throw    … or throws an error from the task instead
 *   FURROW_TEST_CRASH_TOKEN=<dir>   … only the first time: the fault fires only if it can create <dir>
 *   FURROW_TEST_POINT_DELAY_MS=n    each point takes n ms longer (blocks the thread)
 */
import { mkdirSync, readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { workerData } from 'node:worker_threads';
import { move, transferableSymbol, valueSymbol } from 'piscina';
import { createEvalContext, evaluatePoint } from '../src/sweep/index.ts';
import type { SweepRow } from '../src/sweep/types.ts';
import { packRows, type BatchResult, type BatchTask, type WorkerSetup } from '../src/cli/sweep-protocol.ts';

const setup = workerData as WorkerSetup;
const ctx = createEvalContext();
const readText = (file: string): string => readFileSync(resolve(setup.baseDir, file), 'utf8');

const crashAt = new Set((process.env.FURROW_TEST_CRASH_AT ?? '').split(',').filter((s) => s.trim() !== '').map(Number));
const crashMode = process.env.FURROW_TEST_CRASH_MODE === 'throw' ? 'throw' : 'exit';
const crashToken = process.env.FURROW_TEST_CRASH_TOKEN;
const delayMs = Number(process.env.FURROW_TEST_POINT_DELAY_MS ?? 0);
const sleeper = delayMs > 0 ? new Int32Array(new SharedArrayBuffer(4)) : null;

function testFault(index: number): void {
  if (!crashAt.has(index)) return;
  if (crashToken !== undefined) {
    try {
      mkdirSync(crashToken);
    } catch {
      return;
    }
  }
  if (crashMode === 'throw') throw new Error(`test fault at point ${index}`);
  process.exit(70);
}

export default function evaluateBatch(task: BatchTask): unknown {
  const t0 = performance.now();
  const rows: SweepRow[] = [];
  for (let i = task.first; i < task.first + task.count; i++) {
    testFault(i);
    if (sleeper) Atomics.wait(sleeper, 0, 0, delayMs);
    rows.push(evaluatePoint(setup.plan, i, ctx, readText));
  }
  const result: BatchResult = packRows(task.first, setup.plan.columns.length, rows, performance.now() - t0);
  // the numbers' buffer moves to the main thread instead of being copied
  return move({ [transferableSymbol]: result.numbers.buffer, [valueSymbol]: result } as never);
}
