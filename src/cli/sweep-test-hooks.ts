/**
 * Test-only fault and delay hooks of the sweep runner, read from the environment. They exist so
 * the tests can provoke worker faults and slow runs on purpose; they have no use otherwise.
 *
 *   FURROW_TEST_CRASH_AT=i[,j…]     a worker thread dies (process.exit(70) in that thread) when it
 *                                   reaches point i; on the main thread (which never exits on
 *                                   purpose) the point throws instead
 *   FURROW_TEST_CRASH_MODE=throw    … the evaluation throws an error instead, on any thread
 *   FURROW_TEST_CRASH_TOKEN=<dir>   … only the first time: the fault fires only if it can create <dir>
 *   FURROW_TEST_POINT_DELAY_MS=n    every point takes n ms longer (blocks its thread)
 */
import { mkdirSync } from 'node:fs';

const crashAt = new Set(
  (process.env.FURROW_TEST_CRASH_AT ?? '')
    .split(',')
    .filter((s) => s.trim() !== '')
    .map(Number),
);
const crashMode = process.env.FURROW_TEST_CRASH_MODE === 'throw' ? 'throw' : 'exit';
const crashToken = process.env.FURROW_TEST_CRASH_TOKEN;
const delayMs = Number(process.env.FURROW_TEST_POINT_DELAY_MS ?? 0);
const sleeper = delayMs > 0 ? new Int32Array(new SharedArrayBuffer(4)) : null;

/** Called before each point: fires the configured fault or delay, if any. */
export function testHooks(index: number, onWorkerThread: boolean): void {
  if (sleeper) Atomics.wait(sleeper, 0, 0, delayMs);
  if (!crashAt.has(index)) return;
  if (crashToken !== undefined) {
    try {
      mkdirSync(crashToken);
    } catch {
      return;
    }
  }
  if (crashMode === 'exit' && onWorkerThread) process.exit(70);
  throw new Error(`test fault at point ${index}`);
}
