/**
 * Runs a block of a sweep's points on `workers` lanes — this (the main) thread and workers − 1
 * worker threads of a piscina pool — and hands back every row, in whatever order points finish.
 * Prints nothing: the caller writes rows and shows progress.
 *
 * - The main thread is one of the workers: it starts evaluating at once, while the threads start
 *   (a thread needs about 0.2–0.3 s to load the engine), and one thread fewer is started. It
 *   takes points in slices of about MAIN_SLICE_MS, between which its event loop runs (thread
 *   results, signals, output). `--workers 1` starts no thread at all.
 * - Threads get contiguous batches. The first hold one point each; after that a batch is sized
 *   to take about TARGET_BATCH_MS (so per-task overhead stays far below 1 %), but never so large
 *   that a lane would sit idle at the end of the run. Each thread holds up to QUEUED_PER_THREAD
 *   batches, so it goes on to the next while its last result waits for the main thread.
 *   First tries may share a thread's queue; a retry runs alone on its thread.
 * - Each lane keeps one evaluation context for the whole run, so the engine's caches work across
 *   batches; contiguous batches keep neighbouring points, which share most work, on one lane.
 * - Dispatch never runs further ahead of the first unwritten point than `maxAhead` points, so
 *   the rows held back for in-order writing stay few.
 * - A batch whose thread dies (process.exit, a crash) or that throws is run again once; if it fails
 *   again its points run one by one, and a point that still fails becomes a row with status
 *   'failed' and the reason. On the main thread a point that throws is tried once more with a
 *   fresh context, then reported the same way. The run goes on. If the threads fail six times in
 *   a row, or fail while starting (they cannot load the engine, say; piscina then starts no
 *   more), they are given up and the main thread runs the rest; the summary says why.
 *   Until a thread has finished a batch, a point is not blamed for its thread's failure.
 * - `stop` ends dispatching; running batches finish and are delivered (a thread batch that fails
 *   then is evaluated on the main thread instead, so the rows finished after it can still be
 *   written in order). `abort` also cancels the threads' running batches (their threads are
 *   terminated).
 */
import { readFileSync } from 'node:fs';
import { resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { Piscina } from 'piscina';
import { createEvalContext, type EvalContext, evaluatePoint, pointAt } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';
import { unpackRows, type BatchResult, type BatchTask, type WorkerSetup } from './sweep-protocol.ts';
import { testHooks } from './sweep-test-hooks.ts';

/** The worker threads' entry (a .mjs that loads the TypeScript handler). */
export const WORKER_ENTRY = fileURLToPath(new URL('../../workers/sweep-worker.mjs', import.meta.url));

/** A batch aims at this much work on one thread. */
export const TARGET_BATCH_MS = 150;
/** … and holds at most this many points. */
export const MAX_BATCH = 512;
/** Batches handed to one thread at a time. */
export const QUEUED_PER_THREAD = 3;
/** The main thread evaluates in slices of about this long, between which it hands out thread work. */
export const MAIN_SLICE_MS = 50;
/** The CLI's deferThreadsMs when --workers is not given: threads start only for a run longer than this on one lane. */
export const THREADS_WORTH_MS = 3000;

export interface PoolRunOptions {
  readonly plan: SweepPlan;
  /** directory of the design file (files it names are read relative to it) */
  readonly baseDir: string;
  /** points first … end−1 are evaluated */
  readonly first: number;
  readonly end: number;
  /** worker threads (≥ 1); never more than there are points */
  readonly workers: number;
  /** fixed batch size; default: sized from measured time per point */
  readonly batch?: number;
  /**
   * Start the worker threads only once this thread's pace shows that the rest would take longer
   * than this many ms on it alone (the CLI's default run uses THREADS_WORTH_MS): a thread needs
   * 0.2–0.3 s to load the engine (about 1 s more when the design needs mathjs) and its first
   * points run slow while the engine warms up, so it repays itself only on a longer run; a short
   * run stays on this thread. Without it the threads start at once, as `--workers N` asks.
   */
  readonly deferThreadsMs?: number;
  /** the worker threads' entry module (default WORKER_ENTRY) */
  readonly workerEntry?: string;
  /** a fresh evaluation context for every point: no reuse of models or layer modes between points (to measure what the caches save) */
  readonly freshContextPerPoint?: boolean;
  /** every row, once, in any order; may throw (e.g. a full disk): the run then stops and rejects with that error */
  readonly onRow: (row: SweepRow) => void;
  /** after each batch: points evaluated so far in this run */
  readonly onProgress?: (evaluated: number) => void;
  /** the first index whose row is not yet written; dispatch stays within maxAhead of it */
  readonly frontier?: () => number;
  readonly maxAhead?: number;
  /** stop dispatching; running batches finish */
  readonly stop?: AbortSignal;
  /** stop at once: running batches are cancelled */
  readonly abort?: AbortSignal;
}

export interface PoolRunSummary {
  /** points whose rows were delivered (including rows failed after a worker fault) */
  readonly delivered: number;
  /** batches run again after a worker fault */
  readonly retriedBatches: number;
  /** points reported failed because their worker kept failing on them */
  readonly workerFailedPoints: number;
  /** true when stop or abort ended the run before every point was delivered */
  readonly interrupted: boolean;
  /** why the worker threads were given up (six faults in a row), so the main thread ran the rest; else null */
  readonly threadFault: string | null;
  /** lanes that took part: this thread and the worker threads started (fewer than asked for a short run with deferThreadsMs) */
  readonly lanes: number;
}

interface Work extends BatchTask {
  /** 0: first try; 1: retry of the batch; 2: a point alone after its batch failed twice */
  readonly attempt: 0 | 1 | 2;
}

/** The row of a point whose worker kept failing: its index and axis values, status 'failed', the reason. */
export function workerFailedRow(plan: SweepPlan, index: number, reason: string): SweepRow {
  const cells: (number | string)[] = plan.columns.map(() => '');
  const at = (name: string): number => plan.columns.indexOf(name);
  if (at('point_index') >= 0) cells[at('point_index')] = index;
  const p = pointAt(plan, index);
  plan.axes.forEach((a, k) => {
    const j = at(a.column);
    if (j >= 0) cells[j] = p.values[k]!;
  });
  if (at('status') >= 0) cells[at('status')] = 'failed';
  if (at('error') >= 0) cells[at('error')] = reason;
  return { index, status: 'failed', cells, error: reason };
}

function messageOf(e: unknown): string {
  return e instanceof Error ? e.message : String(e);
}

/** Evaluate points first … end−1: on this thread and workers − 1 worker threads. */
export async function runPoints(o: PoolRunOptions): Promise<PoolRunSummary> {
  const total = o.end - o.first;
  if (total <= 0) return { delivered: 0, retriedBatches: 0, workerFailedPoints: 0, interrupted: false, threadFault: null, lanes: 0 };
  const lanes = Math.max(1, Math.min(Math.floor(o.workers), total));
  const threads = lanes - 1;
  const setup: WorkerSetup = { plan: o.plan, baseDir: o.baseDir, freshContextPerPoint: !!o.freshContextPerPoint };
  /** the worker threads, once started (at once, or with deferThreadsMs when the work is worth it) */
  let pool: Piscina<BatchTask, BatchResult> | null = null;
  function startThreads(): void {
    if (pool !== null || threads === 0 || destroyed !== null) return;
    pool = new Piscina<BatchTask, BatchResult>({
      filename: o.workerEntry ?? WORKER_ENTRY,
      minThreads: threads,
      maxThreads: threads,
      idleTimeout: 60_000,
      // several batches per thread: the next one waits in the thread, so a thread that finishes
      // does not sit idle until this thread's evaluation slice ends and hands it more work (first
      // tries are therefore not abortable in piscina's sense: cancelling terminates the threads)
      concurrentTasksPerWorker: QUEUED_PER_THREAD,
      workerData: setup,
    });
    // a thread that fails outside a task (while starting) is reported here, not through a task;
    // piscina starts no new thread after a start-up failure, so the threads are done for
    pool.on('error', (e: unknown) => giveUpThreads(messageOf(e)));
  }
  /**
   * With deferThreadsMs: true once this thread's pace says the rest would take longer than that
   * on it alone, judged from the third slice on (the first ones run while the engine warms up,
   * several times slower than the rest) — or at once when the first point alone took longer.
   */
  const worthThreads = (): boolean => {
    const worth = o.deferThreadsMs;
    if (worth === undefined) return true;
    if (mainSlices >= 3) return (o.end - cursor) * lastPace > worth;
    return mainSlices > 0 && firstSliceMs > worth;
  };
  const readText = (file: string): string => readFileSync(resolve(o.baseDir, file), 'utf8');
  const cancel = new AbortController();
  let destroyed: Promise<void> | null = null;
  /** Terminate the threads (once): their running batches are cancelled. */
  const destroyPool = (): Promise<void> => (destroyed ??= pool ? pool.destroy().catch(() => {}) : Promise.resolve());
  cancel.signal.addEventListener('abort', () => void destroyPool());
  const maxInflight = QUEUED_PER_THREAD * threads;
  const retry: Work[] = [];
  let cursor = o.first;
  /** thread batches handed to the pool and not yet settled */
  const inflight = new Set<Work>();
  let mainBusy = false;
  let delivered = 0;
  let retriedBatches = 0;
  let workerFailedPoints = 0;
  let successes = 0;
  /** thread faults since a thread last finished a batch */
  let faultsInARow = 0;
  /** set when the threads are given up (six faults in a row, or none left running): the reason; the main thread then takes all work */
  let threadFault: string | null = null;
  let mainRunning = false;
  let msPerPoint: number | null = null;
  /** this thread's slices so far, the first one's length (ms) and the latest one's pace (ms per point) */
  let mainSlices = 0;
  let firstSliceMs = 0;
  let lastPace = 0;
  let stopped = false;
  let fatal: unknown = null;
  let finish!: () => void;
  const finished = new Promise<void>((r) => (finish = r));

  const halt = (e: unknown): void => {
    if (fatal === null) fatal = e;
    stopped = true;
    cancel.abort();
  };
  const onStop = (): void => {
    stopped = true;
    pump();
  };
  const onAbort = (): void => {
    stopped = true;
    cancel.abort();
    pump();
  };
  o.stop?.addEventListener('abort', onStop);
  o.abort?.addEventListener('abort', onAbort);
  if (o.stop?.aborted) stopped = true;
  if (o.abort?.aborted) onAbort();

  const measured = (ms: number, count: number): void => {
    const sample = ms / Math.max(1, count);
    msPerPoint = msPerPoint === null ? sample : 0.7 * msPerPoint + 0.3 * sample;
  };

  function batchSize(): number {
    const remaining = o.end - cursor;
    if (o.batch !== undefined) return Math.min(o.batch, remaining);
    if (msPerPoint === null) return 1;
    const target = Math.max(1, Math.min(MAX_BATCH, Math.round(TARGET_BATCH_MS / msPerPoint)));
    const balance = Math.max(1, Math.floor(remaining / (2 * lanes)));
    return Math.min(target, balance, remaining);
  }

  const ahead = (): boolean => !!o.frontier && cursor - o.frontier() >= (o.maxAhead ?? Number.POSITIVE_INFINITY);

  function nextWork(): Work | null {
    if (retry.length) return retry.shift()!;
    if (cursor >= o.end || ahead()) return null;
    const count = batchSize();
    const w: Work = { first: cursor, count, attempt: 0 };
    cursor += count;
    return w;
  }

  function deliver(rows: SweepRow[]): void {
    for (const r of rows) o.onRow(r);
    delivered += rows.length;
    o.onProgress?.(delivered);
  }

  /** Points evaluated on this thread, each tried twice (a fresh context the second time) before it is reported failed. */
  function evaluateHere(i: number, ctx: { current: EvalContext }): SweepRow {
    try {
      testHooks(i, false);
      if (o.freshContextPerPoint) ctx.current = createEvalContext();
      return evaluatePoint(o.plan, i, ctx.current, readText);
    } catch {
      retriedBatches++;
      ctx.current = createEvalContext();
      try {
        return evaluatePoint(o.plan, i, ctx.current, readText);
      } catch (e2) {
        workerFailedPoints++;
        return workerFailedRow(o.plan, i, `evaluation failed on this point, also when retried: ${messageOf(e2)}`);
      }
    }
  }

  /** A worker thread failed under a batch: run it again, then point by point, then report the point failed. */
  function fail(w: Work, e: unknown): void {
    faultsInARow++;
    const reason = messageOf(e);
    if (stopped) {
      // stopping: no new thread work, but the batch's rows may be what keeps finished rows after it
      // from being written, so this thread evaluates them (a batch is a fraction of a second)
      const ctx = { current: createEvalContext() };
      const rows: SweepRow[] = [];
      for (let i = w.first; i < w.first + w.count; i++) rows.push(evaluateHere(i, ctx));
      deliver(rows);
      return;
    }
    if (threadFault !== null) {
      retry.push(w);
      if (!mainRunning) void mainLoop();
      return;
    }
    if (faultsInARow >= 6) {
      retry.push(w);
      giveUpThreads(reason);
      return;
    }
    if (w.attempt === 0) {
      retriedBatches++;
      retry.unshift({ ...w, attempt: 1 });
    } else if (w.count > 1) {
      const singles: Work[] = [];
      for (let i = w.first; i < w.first + w.count; i++) singles.push({ first: i, count: 1, attempt: 2 });
      retry.unshift(...singles);
    } else if (successes === 0) {
      retry.push(w); // no thread has worked yet: the point may not be at fault; try again (see threadFault)
    } else {
      workerFailedPoints++;
      deliver([workerFailedRow(o.plan, w.first, `worker failed on this point, also when retried: ${reason}`)]);
    }
  }

  /**
   * The threads fail over and over without finishing a batch (they cannot load the engine, say):
   * stop using them; their batches go back in the queue for the main thread.
   */
  function giveUpThreads(reason: string): void {
    if (threadFault !== null) return;
    threadFault = reason;
    for (const w of inflight) retry.push(w);
    inflight.clear();
    void destroyPool();
    if (!mainRunning) void mainLoop();
  }

  function launch(w: Work): void {
    inflight.add(w);
    // a retry runs alone on its thread (piscina never puts an abortable task beside another), so
    // a batch that shared a thread with one that brought the thread down is not blamed twice
    pool!.run({ first: w.first, count: w.count }, w.attempt > 0 ? { signal: cancel.signal } : {}).then(
      (res) => {
        if (!inflight.delete(w)) return; // given back to the main thread meanwhile
        successes++;
        faultsInARow = 0;
        measured(res.ms, res.count);
        try {
          deliver(unpackRows(res));
        } catch (e) {
          halt(e);
        }
        pump();
      },
      (e: unknown) => {
        if (!inflight.delete(w)) return;
        if (!cancel.signal.aborted) {
          try {
            fail(w, e);
            // a thread that failed while starting is not replaced by piscina
            if (pool!.threads.length === 0) giveUpThreads(messageOf(e));
          } catch (err) {
            halt(err);
          }
        }
        pump();
      },
    );
  }

  function pump(): void {
    if (pool === null && !stopped && cursor < o.end && worthThreads()) startThreads();
    while (pool && threadFault === null && !stopped && inflight.size < maxInflight) {
      const w = nextWork();
      if (w === null) break;
      launch(w);
    }
    if (inflight.size === 0 && !mainBusy && !mainRunning && (stopped || (retry.length === 0 && cursor >= o.end))) finish();
  }

  /**
   * This thread's share: fresh points from the cursor (never the retries of a failed thread
   * batch, which stay on threads), in slices of about MAIN_SLICE_MS between which the event loop
   * runs (thread results, signals, output). A point whose evaluation throws (a fault, not the
   * point's own failure, which is a row) is tried once more with a fresh context, then reported
   * failed.
   */
  const mainCtx = { current: createEvalContext() };
  async function mainLane(): Promise<void> {
    mainBusy = true;
    try {
      while (!stopped && ((cursor < o.end && !ahead()) || (threadFault !== null && retry.length > 0))) {
        const t0 = performance.now();
        const rows: SweepRow[] = [];
        if (threadFault !== null && retry.length > 0) {
          const w = retry.shift()!;
          for (let i = w.first; i < w.first + w.count; i++) rows.push(evaluateHere(i, mainCtx));
        } else {
          const limit = o.batch ?? MAX_BATCH;
          while (!stopped && cursor < o.end && rows.length < limit && (rows.length === 0 || o.batch !== undefined || performance.now() - t0 < MAIN_SLICE_MS)) {
            rows.push(evaluateHere(cursor++, mainCtx));
          }
        }
        const ms = performance.now() - t0;
        measured(ms, rows.length);
        if (mainSlices++ === 0) firstSliceMs = ms;
        lastPace = ms / Math.max(1, rows.length);
        deliver(rows);
        pump(); // hand out thread work (and start the threads, once they are worth it)
        await new Promise<void>((r) => setImmediate(r));
      }
    } catch (e) {
      halt(e);
    } finally {
      mainBusy = false;
      pump();
    }
  }

  /** When the main thread has no fresh points left (or must wait for the writer), it waits and takes some again later. */
  async function mainLoop(): Promise<void> {
    mainRunning = true;
    const more = (): boolean => !stopped && (cursor < o.end || (threadFault !== null && retry.length > 0));
    while (more()) {
      await mainLane();
      if (more()) await new Promise<void>((r) => setTimeout(r, 5));
    }
    mainRunning = false;
    pump();
  }

  try {
    pump(); // the threads' first batches go out before this thread takes any points
    void mainLoop();
    await finished;
  } finally {
    o.stop?.removeEventListener('abort', onStop);
    o.abort?.removeEventListener('abort', onAbort);
    await destroyPool();
  }
  if (fatal !== null) throw fatal;
  return { delivered, retriedBatches, workerFailedPoints, interrupted: delivered < total, threadFault, lanes: pool === null ? 1 : lanes };
}
