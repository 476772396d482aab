/**
 * Files of a sweep run: the rows (CSV or JSON Lines, one point a line, in point order), the run
 * header beside them (`<output>.run.json`), and the readers that resume and merge them.
 *
 * Every row is written by one write() call and ends with a newline, so a file cut by a kill holds
 * only complete lines (a defensive reader still drops an unterminated last line).
 */
import { createHash } from 'node:crypto';
import { closeSync, ftruncateSync, openSync, readFileSync, readSync, renameSync, rmSync, writeFileSync } from 'node:fs';
import { headerText, rowText, type SweepFormat } from '../sweep/index.ts';
import type { SweepPlan, SweepRow } from '../sweep/types.ts';

export type { SweepFormat };
export { headerText, rowText };

/** A sweep output, run header or shard file that cannot be used as asked; the message names the file. */
export class SweepFileError extends Error {
  override readonly name = 'SweepFileError';
  constructor(
    readonly file: string,
    message: string,
  ) {
    super(`${file}: ${message}`);
  }
}

/** Version of the run-header layout below. */
export const RUN_HEADER_VERSION = 1;

/** Which contiguous block of the plan's points a run covers (1-based shard number). */
export interface ShardInfo {
  /** shard number K, 1 ≤ K ≤ count */
  readonly index: number;
  readonly count: number;
  /** first point index of the block */
  readonly first: number;
  /** one past the last point index of the block */
  readonly end: number;
}

/** The sidecar `<output>.run.json`: what was run, so a resume or merge can check it continues the same sweep. */
export interface RunHeader {
  readonly furrowSweepRun: number;
  readonly solverVersion: string;
  /** sha256 of the canonical JSON of the resolved plan (design with its sweep) and of every file it read */
  readonly designHash: string;
  readonly design: string | null;
  readonly title: string | null;
  /** the design's retained-orders setting (null when the design leaves the default) */
  readonly retainedOrders: number | null;
  readonly slices: number | null;
  /** the diffraction orders reported in the columns */
  readonly reportedOrders: ReadonlyArray<number>;
  readonly format: SweepFormat;
  readonly columns: ReadonlyArray<string>;
  /** points in the whole sweep (all shards) */
  readonly points: number;
  /** the block this file holds; null for the whole sweep */
  readonly shard: ShardInfo | null;
  readonly command: ReadonlyArray<string>;
  readonly started: string;
  /** filled in when the run ends (finished, interrupted or merged) */
  readonly finished: string | null;
  readonly complete: boolean;
  /** rows in the file */
  readonly written: number;
  /** rows with status 'failed' in the file */
  readonly failed: number;
  readonly mergedFrom?: ReadonlyArray<string>;
}

/** JSON with object keys sorted at every level and no white space: equal values give equal text. */
export function canonicalJson(v: unknown): string {
  if (v === null || typeof v !== 'object') {
    if (typeof v === 'number' && !Number.isFinite(v)) return 'null';
    return v === undefined ? 'null' : JSON.stringify(v);
  }
  if (Array.isArray(v)) return `[${v.map((x) => canonicalJson(x)).join(',')}]`;
  const o = v as Record<string, unknown>;
  const keys = Object.keys(o)
    .filter((k) => o[k] !== undefined)
    .sort();
  return `{${keys.map((k) => `${JSON.stringify(k)}:${canonicalJson(o[k])}`).join(',')}}`;
}

/**
 * Identity of a sweep: sha256 of the canonical JSON of the resolved plan (the design, its axes,
 * combination, mount, outputs and columns) together with the content of every file read while
 * planning (user material tables), so an edited table also counts as a different sweep.
 */
export function sweepHash(plan: SweepPlan, filesRead: ReadonlyMap<string, string>): string {
  const files: Record<string, string> = {};
  for (const [name, text] of filesRead) files[name] = createHash('sha256').update(text).digest('hex');
  const body = canonicalJson({
    design: plan.design,
    axes: plan.axes,
    combine: plan.combine,
    mount: plan.mount,
    outputs: plan.outputs,
    orders: plan.orders,
    columns: plan.columns,
    count: plan.count,
    files,
  });
  return `sha256:${createHash('sha256').update(body).digest('hex')}`;
}

/**
 * Rows arrive in any order; they leave in point order. Each contiguous run of rows is handed to
 * `sink` as one string (one write), as soon as the run starts at the next expected point.
 */
export class OrderedWriter {
  #next: number;
  readonly #pending = new Map<number, { readonly text: string; readonly failed: boolean }>();
  #written = 0;
  #failed = 0;

  constructor(
    first: number,
    private readonly end: number,
    private readonly format: SweepFormat,
    private readonly columns: ReadonlyArray<string>,
    private readonly sink: (text: string) => void,
  ) {
    this.#next = first;
  }

  /** index of the next point to be written */
  get next(): number {
    return this.#next;
  }
  /** rows written by this writer */
  get written(): number {
    return this.#written;
  }
  /** of which with status 'failed' */
  get failed(): number {
    return this.#failed;
  }
  /** rows held back, waiting for an earlier point */
  get buffered(): number {
    return this.#pending.size;
  }

  add(row: SweepRow): void {
    if (row.index < this.#next || row.index >= this.end || this.#pending.has(row.index)) {
      throw new RangeError(`row ${row.index} is outside the points still to write (${this.#next}…${this.end - 1}) or came twice`);
    }
    this.#pending.set(row.index, { text: rowText(this.format, this.columns, row.cells), failed: row.status === 'failed' });
    if (row.index !== this.#next) return;
    let chunk = '';
    let upTo = this.#next;
    let failed = 0;
    for (let r = this.#pending.get(upTo); r !== undefined; r = this.#pending.get(++upTo)) {
      chunk += r.text;
      if (r.failed) failed++;
    }
    this.sink(chunk); // if this throws, nothing counts as written and the rows stay pending
    for (let i = this.#next; i < upTo; i++) this.#pending.delete(i);
    this.#written += upTo - this.#next;
    this.#failed += failed;
    this.#next = upTo;
  }
}

/** Calls fn for each line of a file (without its newline), reading in chunks; `complete` is false for an unterminated last line. */
export function forEachLine(path: string, fn: (line: string, start: number, complete: boolean) => boolean | void): void {
  const fd = openSync(path, 'r');
  try {
    const buf = Buffer.alloc(1 << 20);
    let carry: Buffer = Buffer.alloc(0);
    let offset = 0; // file offset of carry[0]
    for (;;) {
      const n = readSync(fd, buf, 0, buf.length, null);
      if (n === 0) break;
      const data = carry.length ? Buffer.concat([carry, buf.subarray(0, n)]) : buf.subarray(0, n);
      let from = 0;
      for (let nl = data.indexOf(10, from); nl >= 0; nl = data.indexOf(10, from)) {
        if (fn(data.toString('utf8', from, nl), offset + from, true) === false) return;
        from = nl + 1;
      }
      carry = Buffer.from(data.subarray(from));
      offset += from;
    }
    if (carry.length) fn(carry.toString('utf8'), offset, false);
  } finally {
    closeSync(fd);
  }
}

/** The point index a row line starts with (CSV: first field; JSON Lines: point_index), or null if the line is not a row. */
export function lineIndex(format: SweepFormat, line: string): number | null {
  if (format === 'csv') {
    const m = /^(\d+)(,|$)/.exec(line);
    return m ? Number(m[1]) : null;
  }
  try {
    const o = JSON.parse(line) as { point_index?: unknown };
    return typeof o.point_index === 'number' && Number.isInteger(o.point_index) ? o.point_index : null;
  } catch {
    return null;
  }
}

/** What an existing output file holds: the header (if complete) and rows first…next−1 in order, in its first `validBytes` bytes. */
export interface ExistingRows {
  readonly next: number;
  readonly validBytes: number;
  readonly hasHeader: boolean;
  /** rows with status 'failed' */
  readonly failed: number;
}

/**
 * The fields of a CSV line, with quoting undone (a quoted field may hold commas and doubled
 * quotes); null for a line whose quotes do not close.
 * @example
 * csvFields('7,407,"no, ""solution""",'); // → ['7', '407', 'no, "solution"', '']
 */
export function csvFields(line: string): string[] | null {
  const out: string[] = [];
  let i = 0;
  for (;;) {
    let value = '';
    if (line[i] === '"') {
      i++;
      for (;;) {
        const q = line.indexOf('"', i);
        if (q < 0) return null;
        value += line.slice(i, q);
        if (line[q + 1] === '"') {
          value += '"';
          i = q + 2;
        } else {
          i = q + 1;
          break;
        }
      }
    } else {
      const c = line.indexOf(',', i);
      value = line.slice(i, c < 0 ? line.length : c);
      i = c < 0 ? line.length : c;
    }
    out.push(value);
    if (line[i] !== ',') return out;
    i++;
  }
}

/** The n-th field (0-based) of a CSV line, with quoting undone; null if the line is shorter (or its quotes do not close). */
export function csvField(line: string, n: number): string | null {
  return csvFields(line)?.[n] ?? null;
}

function rowFailed(format: SweepFormat, line: string, statusColumn: number): boolean {
  if (statusColumn < 0) return false;
  if (format === 'csv') return csvField(line, statusColumn) === 'failed';
  try {
    return (JSON.parse(line) as { status?: unknown }).status === 'failed';
  } catch {
    return false;
  }
}

/**
 * Reads an output file that should hold the header and then the rows of points first, first+1, …
 * in order (a prefix of the block first…end−1). Throws SweepFileError if it holds anything else.
 */
export function scanRows(path: string, format: SweepFormat, columns: ReadonlyArray<string>, first: number, end: number): ExistingRows {
  const header = headerText(format, columns);
  let next = first;
  let validBytes = 0;
  let lineNo = 0;
  let hasHeader = header === '';
  let failed = 0;
  const statusColumn = columns.indexOf('status');
  let problem: string | null = null;
  forEachLine(path, (line, start, complete) => {
    lineNo++;
    if (!complete) return false;
    if (lineNo === 1 && header !== '') {
      if (`${line}\n` !== header) {
        problem = 'its header line is not the columns of this sweep';
        return false;
      }
      hasHeader = true;
      validBytes = Buffer.byteLength(header);
      return true;
    }
    const i = lineIndex(format, line);
    if (i !== next || i >= end) {
      problem = `line ${lineNo} is ${i === null ? 'not a row' : `point ${i}`} where point ${next < end ? next : 'none (the block is complete)'} was expected`;
      return false;
    }
    next++;
    if (rowFailed(format, line, statusColumn)) failed++;
    validBytes = start + Buffer.byteLength(line) + 1;
    return true;
  });
  if (problem) throw new SweepFileError(path, `cannot continue this file: ${problem}`);
  return { next, validBytes, hasHeader, failed };
}

/** Opens an output for appending after `validBytes` (an unterminated last line is cut off). */
export function openForAppend(path: string, validBytes: number): number {
  const fd = openSync(path, 'r+');
  ftruncateSync(fd, validBytes);
  closeSync(fd);
  return openSync(path, 'a');
}

export function sidecarPath(output: string): string {
  return `${output}.run.json`;
}

/** Writes the run header atomically (a temporary file renamed over it). */
export function writeRunHeader(output: string, h: RunHeader): void {
  const p = sidecarPath(output);
  try {
    writeFileSync(`${p}.tmp`, `${JSON.stringify(h, null, 2)}\n`);
    renameSync(`${p}.tmp`, p);
  } catch (e) {
    rmSync(`${p}.tmp`, { force: true });
    throw e;
  }
}

/** Reads and checks the shape of a run header; SweepFileError when it is missing or malformed. */
export function readRunHeader(output: string): RunHeader {
  const p = sidecarPath(output);
  let text: string;
  try {
    text = readFileSync(p, 'utf8');
  } catch (e) {
    throw new SweepFileError(p, `cannot read the run header of ${output}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  let h: Partial<RunHeader>;
  try {
    h = JSON.parse(text) as Partial<RunHeader>;
  } catch {
    throw new SweepFileError(p, 'the run header is not JSON');
  }
  const ok =
    h !== null &&
    typeof h === 'object' &&
    h.furrowSweepRun === RUN_HEADER_VERSION &&
    typeof h.designHash === 'string' &&
    typeof h.solverVersion === 'string' &&
    (h.format === 'csv' || h.format === 'jsonl') &&
    Array.isArray(h.columns) &&
    typeof h.points === 'number' &&
    (h.shard === null || (typeof h.shard === 'object' && typeof h.shard?.first === 'number' && typeof h.shard?.end === 'number'));
  if (!ok) throw new SweepFileError(p, `not a furrow sweep run header (version ${RUN_HEADER_VERSION})`);
  return h as RunHeader;
}
