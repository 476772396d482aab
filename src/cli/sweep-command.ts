/**
 * `furrow sweep` and `furrow merge` on the command line: flags → plan → worker pool → rows on disk.
 *
 * Where things go:
 * - rows: the --output file (CSV or JSON Lines), or standard output for `-o -`;
 * - the run header: `<output>.run.json` beside a file output (none for standard output);
 * - the progress line: stderr, only on a terminal and without --quiet;
 * - the closing summary: the command's normal output, or stderr when the rows use standard output;
 * - errors: one line through the CLI's error path (exit 2 for bad input, 1 for a failed write,
 *   130/143 when stopped by SIGINT/SIGTERM). With `-o -` an error or interruption message is
 *   printed like every CLI error (on standard output, after the rows); the exit code tells.
 *
 * `--workers 1` evaluates on the main thread only; `--workers N` on the main thread and N − 1
 * worker threads (see sweep-run.ts).
 */
import { closeSync, existsSync, fstatSync, ftruncateSync, openSync, readFileSync, writeSync } from 'node:fs';
import { availableParallelism } from 'node:os';
import { resolve } from 'node:path';
import type { Command } from 'commander';
import { InputError } from '../design/index.ts';
import { SOLVER_VERSION } from '../solver/index.ts';
import { planSweep, type SweepSpec } from '../sweep/index.ts';
import type { SweepPlan } from '../sweep/types.ts';
import { CliFailure } from './errors.ts';
import { readDesignFile } from './design-file.ts';
import { mergeShards } from './merge.ts';
import { createProgress } from './progress.ts';
import {
  headerText,
  openForAppend,
  OrderedWriter,
  readRunHeader,
  scanRows,
  sidecarPath,
  SweepFileError,
  sweepHash,
  writeRunHeader,
  type RunHeader,
  type ShardInfo,
  type SweepFormat,
} from './sweep-output.ts';
import { runPoints, THREADS_WORTH_MS } from './sweep-run.ts';
import { chooseShard, shardBlock, shardPath } from './sweep-shard.ts';
import { specFromFlags, type SpecFlags } from './sweep-spec.ts';

export interface SweepFlags extends SpecFlags {
  output: string;
  format?: string;
  workers?: string;
  batch?: string;
  shard?: string;
  shards?: string;
  resume?: boolean;
  overwrite?: boolean;
  quiet?: boolean;
}

function wholeNumber(text: string, flag: string, lo: number, hi: number): number {
  const n = Number(text);
  if (!/^\s*\d+\s*$/.test(text) || !(n >= lo && n <= hi)) throw new InputError(flag, `expected a whole number ${lo}…${hi}, found "${text}"`);
  return n;
}

function chooseFormat(flag: string | undefined, output: string): SweepFormat {
  if (flag === undefined) return /\.(jsonl|ndjson)$/i.test(output) ? 'jsonl' : 'csv';
  if (flag === 'csv' || flag === 'jsonl') return flag;
  throw new InputError('--format', `expected csv or jsonl, found "${flag}"`);
}

function numberOrNull(v: unknown): number | null {
  return typeof v === 'number' ? v : null;
}

/** Checks that an existing run header describes the same sweep and block as this run. */
function checkResumable(output: string, h: RunHeader, mine: Omit<RunHeader, 'started' | 'finished' | 'complete' | 'written' | 'failed' | 'command'>): void {
  const side = sidecarPath(output);
  if (h.designHash !== mine.designHash) {
    throw new InputError(
      '--resume',
      `${output} was written for a different design or sweep (run header ${side} has ${h.designHash.slice(0, 19)}…, this run is ${mine.designHash.slice(0, 19)}…): use another --output, or --overwrite to start it again`,
    );
  }
  if (h.solverVersion !== mine.solverVersion) {
    throw new InputError('--resume', `${output} was written by furrow ${h.solverVersion}, this is ${mine.solverVersion}: its rows would not match; start a new output`);
  }
  if (h.format !== mine.format) throw new InputError('--resume', `${output} holds ${h.format}, this run writes ${mine.format}: give the same --format`);
  const a = h.shard;
  const b = mine.shard;
  if ((a === null) !== (b === null) || (a && b && (a.first !== b.first || a.end !== b.end))) {
    const d = (s: ShardInfo | null): string => (s ? `shard ${s.index}/${s.count}` : 'the whole sweep');
    throw new InputError('--resume', `${output} holds ${d(a)}, this run is ${d(b)}: give the same --shard`);
  }
}

export interface SweepResult {
  readonly output: string;
  readonly block: { readonly first: number; readonly end: number };
  readonly alreadyDone: number;
  readonly written: number;
  readonly failed: number;
  readonly seconds: number;
  readonly retriedBatches: number;
}

/** The whole `furrow sweep` command; `command` is the command line recorded in the run header. */
export async function sweepCommand(designPath: string, flags: SweepFlags, command: ReadonlyArray<string>, say: (s: string) => void): Promise<SweepResult> {
  const workers = flags.workers === undefined ? availableParallelism() : wholeNumber(flags.workers, '--workers', 1, 1024);
  const batch = flags.batch === undefined ? undefined : wholeNumber(flags.batch, '--batch', 1, 100_000);
  const shard = chooseShard(flags.shard, flags.shards);
  const output = shardPath(flags.output, shard);
  const toStdout = output === '-';
  if (toStdout && shard) throw new InputError('--output', 'a shard needs an output file (use {shard} in its name, e.g. -o part-{shard}.csv)');
  if (toStdout && flags.resume) throw new InputError('--resume', 'standard output cannot be resumed: give --output FILE');
  const format = chooseFormat(flags.format, output);

  const { design, baseDir } = readDesignFile(designPath);
  const filesRead = new Map<string, string>();
  const readText = (file: string): string => {
    const t = readFileSync(resolve(baseDir, file), 'utf8');
    filesRead.set(file, t);
    return t;
  };
  const spec: SweepSpec = specFromFlags(design, flags);
  const plan: SweepPlan = planSweep(design, spec, readText);
  const block = shard ? shardBlock(plan.count, shard.index, shard.count) : null;
  const first = block ? block.first : 0;
  const end = block ? block.end : plan.count;
  const d = design as Record<string, unknown>;
  const identity = {
    furrowSweepRun: 1,
    solverVersion: SOLVER_VERSION,
    designHash: sweepHash(plan, filesRead),
    design: designPath,
    title: typeof d.title === 'string' ? d.title : null,
    retainedOrders: numberOrNull(d.orders),
    slices: numberOrNull(d.slices),
    reportedOrders: plan.orders,
    format,
    columns: plan.columns,
    points: plan.count,
    shard: block,
  } as const;

  // open the output: new, or continued after the rows already in it
  let fd: number | null = null;
  let next = first;
  let failedBefore = 0;
  let started = new Date().toISOString();
  if (!toStdout) {
    const exists = existsSync(output);
    if (exists && flags.resume) {
      if (!existsSync(sidecarPath(output))) throw new InputError('--resume', `${output} has no run header (${sidecarPath(output)}), so it cannot be checked: use another --output`);
      const h = readRunHeader(output);
      checkResumable(output, h, identity);
      const scan = scanRows(output, format, plan.columns, first, end);
      next = scan.next;
      failedBefore = scan.failed;
      started = h.started;
      fd = openForAppend(output, scan.validBytes);
      if (!scan.hasHeader) writeSync(fd, headerText(format, plan.columns));
    } else {
      if (exists && !flags.overwrite) throw new InputError('--output', `${output} exists already: add --resume to continue it or --overwrite to replace it`);
      fd = openSync(output, 'w');
      writeSync(fd, headerText(format, plan.columns));
    }
  } else {
    process.stdout.write(headerText(format, plan.columns));
  }
  const header = (complete: boolean, written: number, failed: number, finished: string | null): RunHeader => ({
    ...identity,
    command,
    started,
    finished,
    complete,
    written,
    failed,
  });
  if (!toStdout) writeRunHeader(output, header(next === end, next - first, failedBefore, null));

  const outFd = fd;
  const sink = outFd === null ? (t: string) => void process.stdout.write(t) : fileSink(outFd);
  const writer = new OrderedWriter(next, end, format, plan.columns, sink);
  const stop = new AbortController();
  const abort = new AbortController();
  const alreadyDone = next - first;
  const progress = createProgress(end - first, alreadyDone, !flags.quiet);
  const got: { signal: NodeJS.Signals | null } = { signal: null };
  const onSignal = (s: NodeJS.Signals): void => {
    if (got.signal === null) {
      got.signal = s;
      stop.abort();
      progress.stop(); // the bar ends here, so the notice below gets a line of its own
      if (!flags.quiet) process.stderr.write(`furrow: ${s}: finishing the running batches (send it again to stop at once)\n`);
    } else abort.abort();
  };
  process.on('SIGINT', onSignal);
  process.on('SIGTERM', onSignal);
  const t0 = performance.now();
  let retriedBatches = 0;
  let threadFault: string | null = null;
  let lanes = 1;
  try {
    if (next < end) {
      const summary = await runPoints({
        plan,
        baseDir,
        first: next,
        end,
        workers,
        // by default (no --workers) a run too short to repay starting threads stays on this thread
        ...(flags.workers === undefined ? { deferThreadsMs: THREADS_WORTH_MS } : {}),
        ...(batch !== undefined ? { batch } : {}),
        onRow: (r) => writer.add(r),
        onProgress: (n) => progress.update(alreadyDone + n, failedBefore + writer.failed),
        frontier: () => writer.next,
        maxAhead: 4096,
        stop: stop.signal,
        abort: abort.signal,
      });
      retriedBatches = summary.retriedBatches;
      threadFault = summary.threadFault;
      lanes = summary.lanes;
    }
  } catch (e) {
    const io = e as NodeJS.ErrnoException;
    if (typeof io.code === 'string' && io.syscall === 'write') {
      const kept = toStdout ? '' : `; the ${writer.next - first} rows before are kept: make room and run again with --resume`;
      throw new CliFailure(`cannot write ${toStdout ? 'standard output' : output}: ${io.code}${kept}`, 1);
    }
    throw e;
  } finally {
    progress.stop();
    process.off('SIGINT', onSignal);
    process.off('SIGTERM', onSignal);
    if (outFd !== null) {
      closeSync(outFd);
      const complete = writer.next === end;
      try {
        writeRunHeader(output, header(complete, writer.next - first, failedBefore + writer.failed, new Date().toISOString()));
      } catch {
        // e.g. a full disk: the header written at the start stays (it says "not complete"), and the error that stopped the run is the one to report
      }
    }
  }
  const seconds = (performance.now() - t0) / 1000;
  const result: SweepResult = {
    output,
    block: { first, end },
    alreadyDone,
    written: writer.written,
    failed: failedBefore + writer.failed,
    seconds,
    retriedBatches,
  };
  if (writer.next < end) {
    const where = toStdout ? 'standard output cannot be resumed' : `continue with the same command and --resume`;
    const sig = got.signal ?? 'SIGINT';
    // exit status 128 + signal number, as a shell reports a command stopped by that signal
    throw new CliFailure(
      `sweep interrupted (${sig}): ${writer.next - first} of ${end - first} points are in ${toStdout ? 'the output' : output}; ${where}`,
      sig === 'SIGTERM' ? 143 : 130,
    );
  }
  if (!flags.quiet) {
    const rate = writer.written / Math.max(seconds, 1e-9);
    const failedText = result.failed ? `, ${result.failed} failed (status column)` : '';
    const resumed = alreadyDone ? ` (${alreadyDone} were already there)` : '';
    const retried =
      (retriedBatches ? `; ${retriedBatches} batch${retriedBatches === 1 ? '' : 'es'} run again after a worker fault` : '') +
      (threadFault !== null ? `; the worker threads failed (${threadFault}), so the main thread ran their points` : '');
    say(
      writer.written === 0 && alreadyDone > 0
        ? `sweep: ${output} is already complete (${end - first} points${failedText})`
        : `sweep: ${end - first} points${resumed}${failedText} → ${toStdout ? 'standard output' : output}; ${writer.written} computed in ${seconds.toFixed(1)} s, ${rate.toPrecision(3)} points/s on ${lanes} worker${lanes === 1 ? '' : 's'}${retried}`,
    );
  }
  return result;
}

/**
 * Appends text to the output, all of it (a short write is continued). If a write fails (a full
 * disk), the file is cut back to its last complete row before the error goes on, so it stays a
 * file of whole lines.
 */
function fileSink(fd: number): (text: string) => void {
  let size = fstatSync(fd).size;
  return (text) => {
    const buf = Buffer.from(text);
    try {
      for (let off = 0; off < buf.length; ) off += writeSync(fd, buf, off, buf.length - off);
      size += buf.length;
    } catch (e) {
      try {
        ftruncateSync(fd, size);
      } catch {
        // the write's error is the one to report
      }
      throw e;
    }
  };
}

/** A problem with an output or shard file is the user's to fix: one line, exit code 2 (1 for a failed write, e.g. a full disk). */
async function asCliFailure<T>(f: () => Promise<T>): Promise<T> {
  try {
    return await f();
  } catch (e) {
    if (e instanceof SweepFileError) throw new CliFailure(e.message, 2);
    const io = e as NodeJS.ErrnoException;
    if (typeof io.code === 'string' && typeof io.syscall === 'string' && !(e instanceof CliFailure)) {
      throw new CliFailure(`cannot ${io.syscall} ${io.path ?? 'a sweep file'}: ${io.code}`, io.code === 'ENOENT' || io.code === 'EACCES' || io.code === 'EISDIR' ? 2 : 1);
    }
    throw e;
  }
}

function collect(v: string, prev: string[]): string[] {
  return [...prev, v];
}

/** Adds `furrow sweep` and `furrow merge` to the CLI. `out` prints a line of the command's normal output. */
export function registerSweepCommands(program: Command, out: (s: string) => void): void {
  const commandLine = (): string[] => ['furrow', ...((program as Command & { rawArgs?: string[] }).rawArgs ?? []).slice(2)];
  program
    .command('sweep')
    .description('efficiencies over a range of wavelengths, angles, depths … on every core, into CSV or JSON Lines')
    .argument('<design>', 'design file (JSON); its "sweep" section is the starting point the flags below change')
    .option('--param <path=values>', 'vary a design field, e.g. incidence.wavelength=400nm:700nm:31 or grating.duty=0.3,0.4,0.5 (repeatable)', collect, [])
    .option('--combine <grid|zip>', 'grid: every combination, first parameter slowest; zip: the i-th values together')
    .option('--littrow <m>', 'Littrow mount for order m: the angle follows the wavelength')
    .option('--deviation <m:deg>', 'constant-deviation mount: order m, angle between incident and diffracted beams')
    .option('--orders-out <list>', 'orders to report, e.g. -1,0 or all')
    .option('--sides <list>', 'R, T or R,T')
    .option('--pol <list>', 'TE, TM, unpolarized (and/or requested)')
    .option('--phases', 'also the phases of the orders’ amplitudes')
    .option('--relative', 'also efficiencies relative to a flat mirror of the coating material')
    .option('--pdl', 'also the polarization-dependent loss per order (dB)')
    .option('-o, --output <path>', 'output file, or - for standard output (no run header then); {shard} becomes the shard number', '-')
    .option('--format <csv|jsonl>', 'row format (default: jsonl for a .jsonl/.ndjson output, else csv)')
    .option('--workers <n>', `points evaluated in parallel: this thread and n − 1 worker threads (default: ${availableParallelism()}, the cores available, once the run looks longer than ${THREADS_WORTH_MS / 1000} s on one)`)
    .option('--batch <n>', 'points per task (default: sized to about 150 ms of work)')
    .option('--shard <K/N>', 'run only shard K of N (contiguous blocks); auto/N takes K from JOB_COMPLETION_INDEX or SLURM_ARRAY_TASK_ID')
    .option('--shards <n>', 'same as --shard auto/N')
    .option('--resume', 'continue an output file cut short: keep its rows, compute the rest')
    .option('--overwrite', 'replace an existing output file')
    .option('--quiet', 'no progress line and no summary')
    .action(async (design: string, flags: SweepFlags) => {
      const say = flags.output === '-' ? (s: string) => void process.stderr.write(`${s}\n`) : out;
      await asCliFailure(() => sweepCommand(design, flags, commandLine(), say));
    });
  program
    .command('merge')
    .description('join the shard files of one sweep into the file a single run would have written')
    .argument('<output>', 'merged output file')
    .argument('<shards...>', 'shard files (each with its .run.json beside it), in any order')
    .option('--overwrite', 'replace an existing output file')
    .action(async (output: string, shards: string[], o: { overwrite?: boolean }) => {
      const r = await asCliFailure(async () => mergeShards(output, shards, { overwrite: !!o.overwrite, command: commandLine() }));
      out(`merge: ${r.points} points from ${r.files} file${r.files === 1 ? '' : 's'}${r.failed ? `, ${r.failed} failed` : ''} → ${r.output}`);
    });
}
