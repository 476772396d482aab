/**
 * The page's worker pool: as many module workers as the browser reports cores, each evaluating
 * contiguous blocks of a sweep's points. Blocks are sized from the measured time per point (about
 * a fifth of a second each) so progress moves smoothly and a cancel takes effect quickly; a
 * worker still busy shortly after a cancel is terminated and replaced on the next run.
 */
import { wrap, releaseProxy, type Remote } from 'comlink';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';
import type { Tables } from './tables.ts';
import type { SweepWorkerApi } from './worker.ts';

interface Slot {
  worker: Worker;
  api: Remote<SweepWorkerApi>;
  /** the run whose block the worker is computing, or null when idle */
  owner: number | null;
}

export interface Progress {
  readonly done: number;
  readonly total: number;
  readonly elapsedMs: number;
}

export type RunOutcome = 'done' | 'cancelled';

export interface RunHandle {
  readonly finished: Promise<RunOutcome>;
  cancel(): void;
}

/** Time one block should take (ms). */
const BLOCK_MS = 200;
/** How long a cancelled worker may finish its block before it is terminated (ms). */
const GRACE_MS = 300;

export class SweepPool {
  readonly size: number;
  #slots: Array<Slot | null>;
  #current: { cancel(): void } | null = null;
  #runs = 0;

  constructor(size = Math.max(1, Math.min(16, navigator.hardwareConcurrency || 2))) {
    this.size = size;
    this.#slots = new Array<Slot | null>(size).fill(null);
  }

  #slot(k: number): Slot {
    let s = this.#slots[k];
    if (!s) {
      const worker = new Worker(new URL('./worker.ts', import.meta.url), { type: 'module', name: `furrow-sweep-${k + 1}` });
      s = { worker, api: wrap<SweepWorkerApi>(worker), owner: null };
      this.#slots[k] = s;
    }
    return s;
  }

  #kill(k: number): void {
    const s = this.#slots[k];
    if (!s) return;
    s.api[releaseProxy]();
    s.worker.terminate();
    this.#slots[k] = null;
  }

  /** The dense-kernel backend of the first worker ('wasm' or 'ts') and the reason. */
  engine(): Promise<{ backend: string; status: string }> {
    return this.#slot(0).api.engine();
  }

  /**
   * Evaluate every point of `plan`. Rows arrive in blocks (any order between blocks); `onRows`
   * is not called after a cancel. A second run cancels the first.
   * @returns a handle whose `finished` rejects with the worker's message when a block fails
   *   outside the per-point error handling (the engine reports point failures as rows)
   */
  run(plan: SweepPlan, tables: Tables | null, onRows: (rows: SweepRow[]) => void, onProgress: (p: Progress) => void): RunHandle {
    this.#current?.cancel();
    // a worker still finishing a cancelled run's block is replaced rather than waited for
    this.#slots.forEach((s, k) => {
      if (s && s.owner !== null) this.#kill(k);
    });
    const id = ++this.#runs;
    const t0 = performance.now();
    const total = plan.count;
    let next = 0;
    let done = 0;
    let cancelled = false;
    let msPerPoint = 0;
    const used = Math.min(this.size, total);
    let settle: (o: RunOutcome) => void = () => {};
    const finished = new Promise<RunOutcome>((ok, fail) => {
      settle = ok;
      const loops: Array<Promise<void>> = [];
      for (let k = 0; k < used; k++) {
        const slot = this.#slot(k);
        loops.push(
          (async () => {
            slot.owner = id;
            try {
              await slot.api.setPlan(plan, tables);
              while (!cancelled && next < total) {
                const remaining = total - next;
                const fair = Math.ceil(remaining / used);
                const want = msPerPoint > 0 ? Math.round(BLOCK_MS / msPerPoint) : 1;
                const n = Math.max(1, Math.min(want, fair, 256));
                const first = next;
                next += n;
                const b0 = performance.now();
                const rows = await slot.api.evaluate(first, n);
                if (cancelled) return;
                const per = (performance.now() - b0) / n;
                msPerPoint = msPerPoint === 0 ? per : 0.7 * msPerPoint + 0.3 * per;
                done += rows.length;
                onRows(rows);
                onProgress({ done, total, elapsedMs: performance.now() - t0 });
              }
            } finally {
              if (slot.owner === id) slot.owner = null;
            }
          })(),
        );
      }
      Promise.all(loops).then(
        () => ok(cancelled ? 'cancelled' : 'done'),
        (e: unknown) => {
          if (cancelled) return ok('cancelled');
          cancelled = true;
          for (let k = 0; k < used; k++) this.#kill(k);
          fail(e instanceof Error ? e : new Error(String(e)));
        },
      );
    });
    const handle = {
      finished,
      cancel: () => {
        if (cancelled) return;
        cancelled = true;
        settle('cancelled');
        // let short blocks finish (the workers stay warm); stop long ones
        setTimeout(() => {
          this.#slots.forEach((s, k) => {
            if (s && s.owner === id) this.#kill(k);
          });
        }, GRACE_MS);
      },
    };
    this.#current = handle;
    void finished.finally(() => {
      if (this.#current === handle) this.#current = null;
    });
    return handle;
  }
}
