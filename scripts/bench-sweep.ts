/**
 * Sweep runner benchmark: points per second on 1 and 2 workers, and what the engine's caches save.
 *
 *   npm run bench:sweep                                    # both cases, table + one JSON line per run
 *   (that is node --initial-old-space-size=128 --import tsx scripts/bench-sweep.ts: the heap
 *   sizing the furrow command runs with, see src/cli/heap.ts; plain npx tsx runs this thread
 *   with V8's defaults, and the header says so)
 *   npx tsx scripts/bench-sweep.ts --case wavelength --orders 15 --points 400   # a smaller problem
 *   npx tsx scripts/bench-sweep.ts --case depth --depth-points 100 --repeats 3   # fastest of 3
 *
 * Cases:
 *   wavelength  the blazed aluminium spectrometer grating (src/design/examples/
 *               blazed-aluminium-spectrometer.json), λ = 400…700 nm in --points steps (default
 *               400), fixed mount, the design's own 25 orders and 20 slices (--orders and --slices
 *               replace them). Workers 1 and 2.
 *   depth       a 20-slice sawtooth as RCWA sees it: a 21-level staircase (multilevel, steps
 *               21: 20 slices, the ridge of slice k spanning [k/21, 1) of the period, vertical
 *               back wall), n = 1.5 ridges in air on n = 1.5, Λ = 1 µm, λ = 0.6 µm, θ = 10°,
 *               --depth-orders orders (default 25); the blaze depth from 100 to 600 nm in
 *               --depth-points steps (default 100). Every slice keeps its ridge while only the
 *               slice thickness changes, so a worker solves each slice's modes once. With the
 *               caches (one evaluation context per worker for the whole run) and without (a fresh
 *               context for every point). Workers 1 and 2.
 *
 * What is timed: the whole run of `runPoints` as `furrow sweep` uses it (rows produced and
 * dropped, no file), from the call to the last row — so on 2 workers it includes starting the
 * worker thread (it loads the engine: about 0.2–0.3 s). "first row" is the time to the first row,
 * "steady pt/s" the rate after it. One worker is the calling thread; two are the calling thread
 * and one worker thread. "load" is the 1-minute load average at the end of the run: above the
 * core count, other processes were taking CPU and the figures are low. "cpu s" is the CPU time of
 * the whole process (all its threads) and "cores" that over the wall time: how many cores the run
 * actually got — on a busy machine, fewer than its workers.
 *
 * Reading the figures on a 2-core machine: one worker keeps slightly more than one core busy (V8's
 * background threads collect garbage and compile next to the main thread: about 0.07 of a core
 * at 25 orders, 0.1 at 15, where each point is cheaper and allocates more per second), so two
 * workers can at best get 2/1.07 ≈ 1.87× (2/1.1 ≈ 1.8× at 15 orders) out of the two cores.
 *
 * Speed lives here, not in the unit tests: timings depend on the machine and its load.
 */
import { readFileSync } from 'node:fs';
import { availableParallelism, loadavg } from 'node:os';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { planSweep, type SweepSpec } from '../src/sweep/index.ts';
import { runPoints } from '../src/cli/sweep-run.ts';
import { HEAP_FLAGS, tuneHeapForWorkers } from '../src/cli/heap.ts';

const ROOT = resolve(dirname(fileURLToPath(import.meta.url)), '..');

interface Args {
  cases: string[];
  orders: number;
  slices: number;
  points: number;
  depthPoints: number;
  repeats: number;
  depthOrders: number;
}

function parseArgs(argv: string[]): Args {
  const a: Args = { cases: ['wavelength', 'depth'], orders: 25, slices: 20, points: 400, depthPoints: 100, repeats: 1, depthOrders: 25 };
  for (let i = 0; i < argv.length; i++) {
    const v = argv[i + 1];
    const num = (): number => {
      const n = Number(v);
      if (!Number.isInteger(n) || n < 1) throw new Error(`${argv[i]}: expected a whole number ≥ 1, found "${v}"`);
      i++;
      return n;
    };
    switch (argv[i]) {
      case '--case':
        if (v !== 'wavelength' && v !== 'depth') throw new Error(`--case: wavelength or depth, found "${v}"`);
        a.cases = [v];
        i++;
        break;
      case '--orders':
        a.orders = num();
        break;
      case '--slices':
        a.slices = num();
        break;
      case '--points':
        a.points = num();
        break;
      case '--depth-points':
        a.depthPoints = num();
        break;
      case '--depth-orders':
        a.depthOrders = num();
        break;
      case '--repeats':
        a.repeats = num();
        break;
      default:
        throw new Error(`unknown option ${argv[i]} (see the comment at the top of scripts/bench-sweep.ts)`);
    }
  }
  return a;
}

interface Run {
  case: string;
  workers: number;
  cache: boolean;
  points: number;
  seconds: number;
  pointsPerSecond: number;
  firstRowSeconds: number;
  steadyPointsPerSecond: number;
  orders: number;
  slices: number;
  /** CPU time of the whole process (all threads) during the run, s */
  cpuSeconds: number;
  /** cpuSeconds / seconds: how many cores the run kept busy */
  coresUsed: number;
  /** the machine's 1-minute load average when the run ended (other processes compete for the cores) */
  loadAverage: number;
}

function slicesOf(design: Record<string, unknown>): number {
  const g = design.grating as Record<string, unknown>;
  return typeof g.steps === 'number' ? g.steps - 1 : ((g.slices ?? design.slices) as number);
}

/** The fastest of `repeats` runs (the least disturbed by other processes). */
async function bestRun(repeats: number, ...args: Parameters<typeof timeRun>): Promise<Run> {
  let best: Run | null = null;
  for (let k = 0; k < repeats; k++) {
    const r = await timeRun(...args);
    if (best === null || r.seconds < best.seconds) best = r;
  }
  return best!;
}

async function timeRun(name: string, design: Record<string, unknown>, spec: SweepSpec, workers: number, cache: boolean, baseDir: string): Promise<Run> {
  const plan = planSweep(design, spec, (f) => readFileSync(resolve(baseDir, f), 'utf8'));
  let rows = 0;
  let first = 0;
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  await runPoints({
    plan,
    baseDir,
    first: 0,
    end: plan.count,
    workers,
    freshContextPerPoint: !cache,
    onRow: () => {
      if (rows++ === 0) first = performance.now();
    },
  });
  const s = (performance.now() - t0) / 1000;
  const c = process.cpuUsage(c0);
  const cpu = (c.user + c.system) / 1e6;
  const firstS = (first - t0) / 1000;
  return {
    case: name,
    workers,
    cache,
    points: rows,
    seconds: s,
    pointsPerSecond: rows / s,
    firstRowSeconds: firstS,
    steadyPointsPerSecond: (rows - 1) / Math.max(1e-9, s - firstS),
    orders: design.orders as number,
    slices: slicesOf(design),
    cpuSeconds: cpu,
    coresUsed: cpu / s,
    loadAverage: loadavg()[0]!,
  };
}

export async function runSweepBench(a: Args): Promise<Run[]> {
  const runs: Run[] = [];
  if (a.cases.includes('wavelength')) {
    const path = resolve(ROOT, 'src/design/examples/blazed-aluminium-spectrometer.json');
    const design = { ...(JSON.parse(readFileSync(path, 'utf8')) as Record<string, unknown>), orders: a.orders, slices: a.slices };
    const spec: SweepSpec = { parameters: [{ path: 'incidence.wavelength', from: '400nm', to: '700nm', count: a.points }] };
    for (const w of [1, 2]) runs.push(await bestRun(a.repeats, 'wavelength', design, spec, w, true, dirname(path)));
  }
  if (a.cases.includes('depth')) {
    const design = {
      title: 'bench: 20-slice sawtooth (21-level staircase)',
      period: '1 um',
      cover: 1,
      substrate: 1.5,
      grating: { profile: 'multilevel', steps: 21, depth: '300 nm', ridge: 1.5 },
      incidence: { wavelength: '600 nm', angleDeg: 10 },
      orders: a.depthOrders,
    };
    const spec: SweepSpec = { parameters: [{ path: 'grating.depth', from: '100nm', to: '600nm', count: a.depthPoints }] };
    for (const cache of [true, false]) for (const w of [1, 2]) runs.push(await bestRun(a.repeats, 'depth', design, spec, w, cache, ROOT));
  }
  return runs;
}

function table(runs: Run[]): string[] {
  const head = ['case', 'orders', 'slices', 'cache', 'workers', 'points', 'wall s', 'pt/s', 'speed-up', 'first row s', 'steady pt/s', 'cpu s', 'cores', 'load'];
  const rows = runs.map((r) => {
    const base = runs.find((q) => q.case === r.case && q.cache === r.cache && q.workers === 1);
    return [
      r.case,
      String(r.orders),
      String(r.slices),
      r.cache ? 'on' : 'off',
      String(r.workers),
      String(r.points),
      r.seconds.toFixed(2),
      r.pointsPerSecond.toFixed(2),
      base ? `${(r.pointsPerSecond / base.pointsPerSecond).toFixed(2)}×` : '',
      r.firstRowSeconds.toFixed(2),
      r.steadyPointsPerSecond.toFixed(2),
      r.cpuSeconds.toFixed(1),
      r.coresUsed.toFixed(2),
      r.loadAverage.toFixed(1),
    ];
  });
  const width = head.map((h, j) => Math.max(h.length, ...rows.map((r) => r[j]!.length)));
  const line = (cells: string[]): string => cells.map((c, j) => c.padStart(width[j]!)).join('  ');
  return [line(head), ...rows.map(line)];
}

async function main(): Promise<void> {
  const args = parseArgs(process.argv.slice(2));
  tuneHeapForWorkers(); // as the furrow command does
  const mainFlags = HEAP_FLAGS.filter((f) => process.execArgv.includes(f));
  console.log(`heap: worker threads ${HEAP_FLAGS.join(' ')}; this thread ${mainFlags.length === HEAP_FLAGS.length ? 'the same' : 'V8 defaults (run it as npm run bench:sweep to match the furrow command)'}`);
  console.log(`sweep bench: ${availableParallelism()} cores, load average ${loadavg()[0]!.toFixed(1)} at the start (runs are only comparable on an otherwise idle machine)`);
  const runs = await runSweepBench(args);
  for (const l of table(runs)) console.log(l);
  const on = runs.filter((r) => r.case === 'depth' && r.cache);
  const off = runs.filter((r) => r.case === 'depth' && !r.cache);
  for (const r of on) {
    const o = off.find((q) => q.workers === r.workers);
    if (o) console.log(`depth sweep, ${r.workers} worker${r.workers === 1 ? '' : 's'}: the caches make it ${(r.pointsPerSecond / o.pointsPerSecond).toFixed(2)}× faster`);
  }
  for (const r of runs) console.log(JSON.stringify(r));
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((e: unknown) => {
    console.error(`bench-sweep: ${e instanceof Error ? e.message : String(e)}`);
    process.exitCode = 2;
  });
}
