/**
 * Messages between the sweep runner and its worker threads. A task is a contiguous block of
 * point indices; its result carries the rows packed into one Float64Array (transferred, not
 * copied) plus the few text cells, so a batch of wide rows crosses threads cheaply.
 */
import type { SweepPlan, SweepRow } from '../sweep/types.ts';

/** Given once to every worker thread (piscina workerData). */
export interface WorkerSetup {
  readonly plan: SweepPlan;
  /** directory of the design file: files it names (material tables) are read relative to it */
  readonly baseDir: string;
  /** a fresh evaluation context for every point (no cache reuse; for measurements) */
  readonly freshContextPerPoint: boolean;
}

/** Evaluate points first … first+count−1. */
export interface BatchTask {
  readonly first: number;
  readonly count: number;
}

/** Rows of a batch, packed. */
export interface BatchResult {
  readonly first: number;
  readonly count: number;
  /** cells per row (plan.columns.length) */
  readonly width: number;
  /** time spent evaluating, ms (for batch sizing) */
  readonly ms: number;
  /** count × width numbers, row-major; a text cell's slot holds NaN and its text is in `texts` */
  readonly numbers: Float64Array;
  /** [slot, text] for every cell that is a string */
  readonly texts: ReadonlyArray<readonly [number, string]>;
  /** one per row: 1 where the point failed */
  readonly failed: Uint8Array;
  /** [row, reason] for failed rows that carry a reason */
  readonly errors: ReadonlyArray<readonly [number, string]>;
}

export function packRows(first: number, width: number, rows: ReadonlyArray<SweepRow>, ms: number): BatchResult {
  const numbers = new Float64Array(rows.length * width);
  const texts: [number, string][] = [];
  const failed = new Uint8Array(rows.length);
  const errors: [number, string][] = [];
  rows.forEach((r, k) => {
    if (r.index !== first + k) throw new RangeError(`row for point ${r.index} where point ${first + k} was expected`);
    if (r.cells.length !== width) throw new RangeError(`row for point ${r.index} has ${r.cells.length} cells, the columns are ${width}`);
    for (let j = 0; j < width; j++) {
      const v = r.cells[j]!;
      const slot = k * width + j;
      if (typeof v === 'number') numbers[slot] = v;
      else {
        numbers[slot] = Number.NaN;
        texts.push([slot, v]);
      }
    }
    if (r.status === 'failed') {
      failed[k] = 1;
      if (r.error !== undefined) errors.push([k, r.error]);
    }
  });
  return { first, count: rows.length, width, ms, numbers, texts, failed, errors };
}

export function unpackRows(b: BatchResult): SweepRow[] {
  const text = new Map(b.texts);
  const err = new Map(b.errors);
  const rows: SweepRow[] = [];
  for (let k = 0; k < b.count; k++) {
    const cells: (number | string)[] = new Array(b.width);
    for (let j = 0; j < b.width; j++) {
      const slot = k * b.width + j;
      const t = text.get(slot);
      cells[j] = t !== undefined ? t : b.numbers[slot]!;
    }
    const e = err.get(k);
    rows.push(b.failed[k] ? { index: b.first + k, status: 'failed', cells, ...(e !== undefined ? { error: e } : {}) } : { index: b.first + k, status: 'ok', cells });
  }
  return rows;
}
