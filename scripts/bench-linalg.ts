/**
 * Benchmark of the dense complex kernels that carry nearly all of the solver's run time:
 * zgemm (N×N·N×N), zgesv (LU factor + solve with N right-hand sides), zgeev (general eigen,
 * with vectors) and zheev (Hermitian eigen, with vectors), at N = 21, 51, 101, 201 — and, side
 * by side in the same run, the same operations in numpy on one thread
 * (scripts/numpy_linalg_bench.py), with the ratio ours/numpy.
 *
 *   npm run bench:linalg                       # table + one JSON object per line
 *   npx tsx scripts/bench-linalg.ts --sizes 101,201 --repeats 21 --backend ts --no-numpy
 *
 * Speed lives here, not in the unit tests: timings depend on the machine and its load.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { cmatrix, type CMatrix } from '../src/linalg/cmatrix.ts';
import { hermitianPart, seededMatrix } from './bench-matrices.ts';
import { zgemm } from '../src/linalg/zgemm.ts';
import { luFactors, zgesv } from '../src/linalg/zgetrf.ts';
import { linalgBackend, setLinalgBackend, type LinalgBackend } from '../src/linalg/wasm/runtime.ts';

/** The kernels measured, in table order. */
export const BENCH_KERNELS = ['zgemm', 'zgesv', 'zgeev', 'zheev'] as const;
export type BenchKernel = (typeof BENCH_KERNELS)[number];

/** One table row: our median time per call, numpy's, and their ratio (null when not measured). */
export interface BenchRow {
  readonly kernel: BenchKernel;
  readonly n: number;
  /** null when the kernel is not available in this tree. */
  readonly median_ms: number | null;
  readonly numpy_ms: number | null;
  /** median_ms / numpy_ms. */
  readonly ratio: number | null;
}

export interface BenchOptions {
  /** Matrix orders (default 21, 51, 101, 201). */
  readonly sizes?: readonly number[];
  /** Timed samples per kernel and size; the median is reported (default 15). */
  readonly repeats?: number;
  /** Also time numpy (default true; skipped with a message when python3 or numpy is absent). */
  readonly numpy?: boolean;
  /** Backend of zgemm/zgesv (default: whatever is active). */
  readonly backend?: LinalgBackend | 'auto';
  /** Progress and skip messages (default: console.error, so stdout stays table + JSON). */
  readonly log?: (message: string) => void;
}

export interface BenchResult {
  readonly rows: BenchRow[];
  /** Backend that zgemm/zgesv ran on. */
  readonly backend: LinalgBackend;
  /** Why numpy was not measured, or a description of its build when it was. */
  readonly numpyNote: string;
}

/**
 * Median ms per call. Warm-up first (at least 3 calls and 50 ms, so the JIT has optimized the
 * kernel), then each sample runs enough calls to last about 1 ms.
 */
function medianMs(fn: () => void, repeats: number): number {
  const warm = performance.now();
  for (let c = 0; c < 3 || performance.now() - warm < 50; c++) fn();
  const t0 = performance.now();
  fn();
  const once = Math.max(performance.now() - t0, 1e-4);
  const inner = Math.max(1, Math.floor(1 / once));
  const samples: number[] = [];
  for (let r = 0; r < repeats; r++) {
    const s = performance.now();
    for (let i = 0; i < inner; i++) fn();
    samples.push((performance.now() - s) / inner);
  }
  samples.sort((a, b) => a - b);
  return samples[samples.length >> 1]!;
}


type EigenFn = (a: CMatrix, options: { vectors: boolean }) => unknown;

// the eigen-solvers are written alongside this script; a missing or unfinished module is
// reported as "not available" rather than failing the whole benchmark
async function loadEigen(path: string, name: string): Promise<EigenFn | null> {
  try {
    const mod = (await import(path)) as Record<string, unknown>;
    const fn = mod[name];
    return typeof fn === 'function' ? (fn as EigenFn) : null;
  } catch {
    return null;
  }
}

interface NumpyRun {
  readonly times: Map<string, number>;
  readonly note: string;
}

function runNumpy(sizes: readonly number[], repeats: number, kernels: readonly string[]): NumpyRun {
  const script = fileURLToPath(new URL('./numpy_linalg_bench.py', import.meta.url));
  const env: Record<string, string | undefined> = { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  // these pin OpenBLAS to an older kernel on some processors; unset for this command only
  delete env['OPENBLAS_CORETYPE'];
  delete env['OPENBLAS_L2_SIZE'];
  const r = spawnSync('python3', [script, '--sizes', sizes.join(','), '--repeats', String(repeats), '--kernels', kernels.join(',')], {
    env,
    encoding: 'utf8',
    maxBuffer: 1 << 24,
  });
  const times = new Map<string, number>();
  if (r.error) return { times, note: `numpy comparison skipped: python3 not runnable (${r.error.message})` };
  if (r.status === 3) return { times, note: 'numpy comparison skipped: numpy is not installed' };
  if (r.status !== 0) return { times, note: `numpy comparison skipped: numpy_linalg_bench.py exited ${r.status}: ${r.stderr.trim()}` };
  let note = 'numpy';
  for (const line of r.stdout.split('\n')) {
    if (!line.trim()) continue;
    const o = JSON.parse(line) as { info?: unknown; kernel?: string; n?: number; median_ms?: number };
    if (o.info !== undefined) note = `numpy ${JSON.stringify(o.info)}`;
    else if (o.kernel !== undefined && o.n !== undefined && o.median_ms !== undefined) times.set(`${o.kernel}:${o.n}`, o.median_ms);
  }
  return { times, note };
}

/**
 * Time the four kernels at each size (and numpy's, unless disabled).
 * @returns rows in kernel-major order, with the backend used and a note on the numpy run.
 * @example
 * const { rows } = await runLinalgBench({ sizes: [51], repeats: 5, numpy: false });
 * console.log(rows.find((r) => r.kernel === 'zgemm')?.median_ms);
 */
export async function runLinalgBench(options: BenchOptions = {}): Promise<BenchResult> {
  const sizes = options.sizes ?? [21, 51, 101, 201];
  const repeats = options.repeats ?? 15;
  const log = options.log ?? ((m: string) => console.error(m));
  const previous = linalgBackend();
  if (options.backend !== undefined) setLinalgBackend(options.backend);
  const backend = linalgBackend();
  const zgeev = await loadEigen('../src/linalg/zgeev.ts', 'zgeev');
  const zheev = await loadEigen('../src/linalg/zheev.ts', 'zheev');
  const ours = new Map<string, number | null>();
  const wantNumpy = options.numpy ?? true;
  const numpyTimes = new Map<string, number>();
  let numpyNote = wantNumpy ? '' : 'numpy comparison not requested';
  try {
    // JIT warm-up of every kernel on a small matrix first (the eigen-solvers take dozens of
    // calls to reach optimized code), so the first size is timed at steady state too
    {
      const n = Math.min(...sizes, 21);
      const a = seededMatrix(n, 1);
      const h = hermitianPart(a);
      const out = cmatrix(n, n);
      const fns: Array<() => unknown> = [() => zgemm(out, a, a), () => zgesv(a, a, out)];
      if (zgeev) fns.push(() => zgeev(a, { vectors: true }));
      if (zheev) fns.push(() => zheev(h, { vectors: true }));
      for (const fn of fns) {
        const t0 = performance.now();
        for (let c = 0; c < 30 || performance.now() - t0 < 200; c++) fn();
      }
    }
    for (const n of sizes) {
      const a = seededMatrix(n, 1000 + n);
      const b = seededMatrix(n, 2000 + n);
      const h = hermitianPart(a);
      const out = cmatrix(n, n);
      const f = luFactors(n);
      log(`timing n = ${n} …`);
      ours.set(`zgemm:${n}`, medianMs(() => zgemm(out, a, b), repeats));
      ours.set(`zgesv:${n}`, medianMs(() => zgesv(a, b, out, f), repeats));
      ours.set(`zgeev:${n}`, zgeev ? medianMs(() => zgeev(a, { vectors: true }), repeats) : null);
      ours.set(`zheev:${n}`, zheev ? medianMs(() => zheev(h, { vectors: true }), repeats) : null);
      // numpy right after ours at each size, so slow drifts in machine load hit both alike
      if (wantNumpy && (numpyNote === '' || numpyTimes.size > 0)) {
        log(`timing numpy (single-threaded), n = ${n} …`);
        const run = runNumpy([n], repeats, BENCH_KERNELS);
        numpyNote = run.note;
        if (run.times.size === 0) log(run.note);
        for (const [key, ms] of run.times) numpyTimes.set(key, ms);
      }
    }
  } finally {
    setLinalgBackend(previous);
  }
  const rows: BenchRow[] = [];
  for (const kernel of BENCH_KERNELS) {
    for (const n of sizes) {
      const m = ours.get(`${kernel}:${n}`) ?? null;
      const p = numpyTimes.get(`${kernel}:${n}`) ?? null;
      rows.push({ kernel, n, median_ms: m, numpy_ms: p, ratio: m !== null && p !== null && p > 0 ? m / p : null });
    }
  }
  return { rows, backend, numpyNote };
}

function fmt(v: number | null, digits: number): string {
  return v === null ? 'n/a' : v.toFixed(digits);
}

/** The rows as a fixed-width text table. */
export function formatBenchTable(rows: readonly BenchRow[]): string {
  const head = ['kernel', 'n', 'ours ms', 'numpy ms', 'ours/numpy'];
  const body = rows.map((r) => [
    r.kernel,
    String(r.n),
    r.median_ms === null ? 'not available' : fmt(r.median_ms, 4),
    fmt(r.numpy_ms, 4),
    r.ratio === null ? 'n/a' : `${r.ratio.toFixed(2)}×`,
  ]);
  const widths = head.map((h, c) => Math.max(h.length, ...body.map((row) => row[c]!.length)));
  const line = (cells: string[]) => cells.map((s, c) => (c < 1 ? s.padEnd(widths[c]!) : s.padStart(widths[c]!))).join('  ');
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...body.map(line)].join('\n');
}

function parseArgs(argv: readonly string[]): BenchOptions {
  const opts: { sizes?: number[]; repeats?: number; numpy?: boolean; backend?: LinalgBackend | 'auto' } = {};
  for (let i = 0; i < argv.length; i++) {
    const [key, inline] = argv[i]!.split('=', 2) as [string, string | undefined];
    const value = () => inline ?? argv[++i] ?? '';
    if (key === '--sizes') opts.sizes = value().split(',').filter(Boolean).map(Number);
    else if (key === '--repeats') opts.repeats = Number(value());
    else if (key === '--no-numpy') opts.numpy = false;
    else if (key === '--backend') opts.backend = value() as LinalgBackend | 'auto';
    else throw new Error(`unknown option ${key} (use --sizes, --repeats, --backend, --no-numpy)`);
  }
  return opts;
}

async function main(): Promise<void> {
  const result = await runLinalgBench(parseArgs(process.argv.slice(2)));
  console.log(`backend: ${result.backend}; ${result.numpyNote}`);
  console.log(formatBenchTable(result.rows));
  for (const r of result.rows) {
    console.log(JSON.stringify({ kernel: r.kernel, n: r.n, median_ms: r.median_ms, numpy_ms: r.numpy_ms, ratio: r.ratio, backend: result.backend }));
  }
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((e: unknown) => {
    console.error(e);
    process.exit(1);
  });
}
