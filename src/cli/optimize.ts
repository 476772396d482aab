/**
 * `furrow optimize` and `furrow tolerance` on the command line: the design file's "optimize" /
 * "tolerance" section, with flags that replace its settings one by one, → the engine
 * (src/optimize) → a table or JSON.
 *
 * The coarse scan of `optimize` and the Monte Carlo samples of `tolerance` run on the sweep
 * runner's worker pool (`runPoints`) when --workers is above 1 and they outlast
 * {@link POOL_WORTH_MS} on this thread; everything else (the sequential local search, the nominal
 * design, sensitivities, curves) runs on this thread with one shared evaluation context.
 */
import { availableParallelism } from 'node:os';
import type { Command } from 'commander';
import { InputError } from '../design/index.ts';
import { optimize, type OptimizeResult, type PlanRunner } from '../optimize/index.ts';
import { createEvalContext, type EvalContext, evaluatePoint } from '../sweep/index.ts';
import type { SweepRow } from '../sweep/types.ts';
import { readDesignFile } from './design-file.ts';
import { runPoints } from './sweep-run.ts';
import { registerToleranceCommand } from './tolerance.ts';

/**
 * Time (ms) a plan runs on this thread before what remains of it goes to the worker pool:
 * starting worker threads costs about a second or more each (mostly loading the TypeScript
 * engine), which shorter plans would not win back.
 * @example
 * // 300 solves of 5 ms finish here (1.5 s); 300 of 50 ms: 60 here, 240 on the threads
 */
export const POOL_WORTH_MS = 3000;

/**
 * The threshold the commands use: POOL_WORTH_MS, or FURROW_POOL_WORTH_MS from the environment —
 * a test hook, so tests can send small jobs to the threads on purpose (no other use).
 * @example
 * // FURROW_POOL_WORTH_MS=0 furrow tolerance … --workers 2   → the samples run on 2 threads
 */
export function poolWorthMs(): number {
  const v = Number(process.env.FURROW_POOL_WORTH_MS);
  return process.env.FURROW_POOL_WORTH_MS !== undefined && v >= 0 ? v : POOL_WORTH_MS;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * --workers: a whole number 1…1024, default this machine's parallelism.
 * @throws {InputError} at '--workers'
 * @example
 * workersFlag('2'); // 2
 */
export function workersFlag(v: string | undefined): number {
  if (v === undefined) return availableParallelism();
  const n = Number(v);
  if (!/^\s*\d+\s*$/.test(v) || !(n >= 1 && n <= 1024)) throw new InputError('--workers', `expected a whole number 1…1024, found "${v}"`);
  return n;
}

/** A plan runner that may use the worker pool, and what it did. */
export interface PoolRunner {
  readonly run: PlanRunner;
  /** rows evaluated on worker threads so far */
  readonly pooledRows: () => number;
  /** how the plans ran, for the report */
  readonly describe: () => string;
}

/**
 * A plan runner on the sweep runner's worker pool (`runPoints`). Rows are solved here, with the
 * shared context (its cached eigenmodes), until the plan has taken `worthMs` (default
 * POOL_WORTH_MS); whatever remains then goes to `workers` threads. So a plan that is quick here
 * never pays for starting threads, and a long one loses at most `worthMs` of parallel time.
 * Every row is `evaluatePoint`'s either way, so the numbers do not depend on the path. Rows come
 * back in index order.
 * @param worthMs time on this thread after which the rest of a plan goes to the pool (ms)
 * @throws what `runPoints` throws (e.g. an `onRow` failure); a point's own failure is a row
 * @example
 * const pool = poolRunner(dir, 4, createEvalContext(), readText);
 * await optimize(design, spec, { scanRunner: pool.run, scanRunnerName: pool.describe });
 */
export function poolRunner(baseDir: string, workers: number, ctx: EvalContext, readText: (file: string) => string, worthMs = POOL_WORTH_MS): PoolRunner {
  let pooled = 0;
  const run: PlanRunner = async (plan) => {
    const rows: SweepRow[] = new Array(plan.count);
    const t0 = performance.now();
    let i = 0;
    for (; i < plan.count; i++) {
      if (workers > 1 && i > 0 && performance.now() - t0 >= worthMs) {
        await runPoints({ plan, baseDir, first: i, end: plan.count, workers, onRow: (r) => (rows[r.index] = r) });
        pooled += plan.count - i;
        return rows;
      }
      rows[i] = evaluatePoint(plan, i, ctx, readText);
    }
    return rows;
  };
  const describe = (): string =>
    pooled > 0 ? `in-process, then ${workers} worker threads for ${pooled} solves` : workers > 1 ? `in-process: done within ${worthMs / 1000} s, before the worker pool was worth starting` : 'in-process';
  return { run, pooledRows: () => pooled, describe };
}

/** Flags shared by both commands: the measured efficiency and its conditions. */
export interface QuantityFlags {
  order?: string;
  side?: string;
  pol?: string;
  over?: string;
  band?: string;
  angles?: string;
  littrow?: string;
  deviation?: string;
}

const NUM = '[+-]?(?:\\d+\\.?\\d*|\\.\\d+)(?:[eE][+-]?\\d+)?';

function wholeOrders(text: string, flag: string): number | number[] {
  const parts = text.split(',').map((s) => s.trim());
  const out = parts.map((p) => {
    if (!/^[+-]?\d+$/.test(p)) throw new InputError(flag, `expected whole diffraction orders like -1 or -1,1, found "${text}"`);
    return Number(p);
  });
  return out.length === 1 ? out[0]! : out;
}

function numberFlag(text: string, flag: string): number {
  if (!new RegExp(`^\\s*${NUM}\\s*$`).test(text)) throw new InputError(flag, `expected a number, found "${text}"`);
  return Number(text);
}

function wholeFlag(text: string, flag: string, lo: number, hi: number): number {
  const n = Number(text);
  if (!/^\s*\d+\s*$/.test(text) || !(n >= lo && n <= hi)) throw new InputError(flag, `expected a whole number ${lo}…${hi}, found "${text}"`);
  return n;
}

/**
 * The quantity and conditions from flags, laid over a section's own: each flag replaces one field.
 * @param quantityKey 'objective' or 'efficiency'
 * @throws {InputError} naming the flag
 * @example
 * const s = {}; applyQuantityFlags(s, 'objective', { order: '-1', side: 'R', littrow: '-1' });
 * // s → { objective: { order: -1, side: 'R' }, mount: { kind: 'littrow', order: -1 } }
 */
export function applyQuantityFlags(section: Record<string, unknown>, quantityKey: string, f: QuantityFlags): void {
  const q: Record<string, unknown> = isRecord(section[quantityKey]) ? { ...(section[quantityKey] as Record<string, unknown>) } : {};
  if (f.order !== undefined) q.order = wholeOrders(f.order, '--order');
  if (f.side !== undefined) {
    const s = f.side.trim().toUpperCase();
    if (s !== 'R' && s !== 'T') throw new InputError('--side', `expected R (reflected) or T (transmitted), found "${f.side}"`);
    q.side = s;
  }
  if (f.pol !== undefined) {
    const p = f.pol.trim();
    const known: Record<string, string> = { te: 'TE', tm: 'TM', unpolarized: 'unpolarized', unpol: 'unpolarized', worst: 'worst' };
    const v = known[p.toLowerCase()];
    if (!v) throw new InputError('--pol', `expected TE, TM, unpolarized or worst, found "${f.pol}"`);
    q.polarization = v;
  }
  if (f.over !== undefined) {
    if (f.over !== 'mean' && f.over !== 'min') throw new InputError('--over', `expected mean or min, found "${f.over}"`);
    q.over = f.over;
  }
  if (Object.keys(q).length) section[quantityKey] = q;
  if (f.band !== undefined) {
    const t = f.band.trim();
    const parts = t.split(':').map((s) => s.trim());
    if (parts.length === 3) {
      section.band = { from: parts[0], to: parts[1], count: wholeFlag(parts[2]!, '--band', 1, 1000) };
    } else if (parts.length === 1 && t !== '') {
      section.band = { values: t.split(',').map((s) => s.trim()) };
    } else {
      throw new InputError('--band', `expected FROM:TO:COUNT (e.g. 1000nm:1060nm:7) or a list (e.g. 1030nm,1064nm), found "${f.band}"`);
    }
  }
  if (f.angles !== undefined) section.angles = f.angles.split(',').map((s) => numberFlag(s.trim().replace(/(deg|°)$/, ''), '--angles'));
  if (f.littrow !== undefined && f.deviation !== undefined) throw new InputError('--deviation', 'give --littrow or --deviation, not both');
  if (f.littrow !== undefined) {
    if (!/^\s*[+-]?\d+\s*$/.test(f.littrow)) throw new InputError('--littrow', `expected a whole diffraction order, e.g. -1, found "${f.littrow}"`);
    section.mount = { kind: 'littrow', order: Number(f.littrow) };
  }
  if (f.deviation !== undefined) {
    const m = new RegExp(`^\\s*([+-]?\\d+)\\s*:\\s*(${NUM})\\s*(?:deg|°)?\\s*$`).exec(f.deviation);
    if (!m) throw new InputError('--deviation', `expected ORDER:DEGREES, e.g. -1:30, found "${f.deviation}"`);
    section.mount = { kind: 'deviation', order: Number(m[1]), deviationDeg: Number(m[2]) };
  }
}

/**
 * Add the flags of {@link QuantityFlags} to a command.
 * @example
 * quantityOptions(program.command('optimize'), 'objective').option('--json');
 */
export function quantityOptions(c: Command, what: string): Command {
  return c
    .option('--order <m[,m…]>', `order of the ${what}; a list adds the orders' efficiencies (e.g. -1,1)`)
    .option('--side <R|T>', 'reflected (R) or transmitted (T)')
    .option('--pol <TE|TM|unpolarized|worst>', 'polarization; worst takes the smaller of TE and TM (default unpolarized)')
    .option('--over <mean|min>', 'combine the band and angles by their mean (default) or their minimum')
    .option('--band <from:to:count|list>', 'wavelengths of use, e.g. 1000nm:1060nm:7 or 1030nm,1064nm (default: the design\'s)')
    .option('--angles <deg,…>', "fixed polar angles, degrees (default: the design's)")
    .option('--littrow <m>', 'Littrow mount for order m: the angle follows the wavelength')
    .option('--deviation <m:deg>', 'constant-deviation mount: order m, angle between incident and diffracted beams');
}

/**
 * Commander's accumulator for repeatable flags.
 * @example
 * .option('--vary <spec>', '…', collect, [])
 */
export function collect(v: string, prev: string[]): string[] {
  return [...prev, v];
}

// ---------------------------------------------------------------------------------------------
// optimize

interface OptimizeFlags extends QuantityFlags {
  vary: string[];
  maximize?: boolean;
  minimize?: boolean;
  target?: string;
  require: string[];
  minRidge?: string;
  minGroove?: string;
  scan?: string;
  starts?: string;
  xTolerance?: string;
  maxSolves?: string;
  seed?: string;
  curve?: string;
  workers?: string;
  json?: boolean;
}

/**
 * `--vary grating.depth=100nm:1200nm` → { path, min, max }. Numbers stay numbers; text keeps its
 * unit (checked by the engine).
 * @throws {InputError} at '--vary'
 * @example
 * parseVaryFlag('grating.depth=100nm:1200nm'); // { path: 'grating.depth', min: '100nm', max: '1200nm' }
 */
export function parseVaryFlag(text: string): { path: string; min: number | string; max: number | string } {
  const m = /^\s*([^=\s]+)\s*=\s*([^:]+?)\s*:\s*([^:]+?)\s*$/.exec(text);
  if (!m) throw new InputError('--vary', `expected PATH=MIN:MAX, e.g. grating.depth=100nm:1200nm or grating.duty=0.2:0.8, found "${text}"`);
  const val = (s: string): number | string => (new RegExp(`^${NUM}$`).test(s) ? Number(s) : s);
  return { path: m[1]!, min: val(m[2]!), max: val(m[3]!) };
}

/**
 * `--require "R(-1) TM >= 0.9"` → a constraint. Form: SIDE(ORDERS) [POL] [mean|min] (>=|<=) VALUE.
 * @throws {InputError} at '--require'
 * @example
 * parseRequireFlag('T(0) unpolarized <= 0.02'); // { side: 'T', order: 0, polarization: 'unpolarized', max: 0.02 }
 */
export function parseRequireFlag(text: string): Record<string, unknown> {
  const re = new RegExp(`^\\s*([RT])\\s*\\(\\s*([+-]?\\d+(?:\\s*,\\s*[+-]?\\d+)*)\\s*\\)\\s*(TE|TM|unpolarized|unpol|worst)?\\s*(mean|min)?\\s*(>=|<=|≥|≤)\\s*(${NUM})\\s*$`, 'i');
  const m = re.exec(text);
  if (!m) throw new InputError('--require', `expected SIDE(ORDERS) [TE|TM|unpolarized|worst] [mean|min] >= VALUE, e.g. "R(-1) TM >= 0.9", found "${text}"`);
  const orders = m[2]!.split(',').map((s) => Number(s.trim()));
  const polText = m[3]?.toLowerCase();
  const pol = polText === undefined ? undefined : polText === 'te' ? 'TE' : polText === 'tm' ? 'TM' : polText === 'worst' ? 'worst' : 'unpolarized';
  const bound = m[5] === '>=' || m[5] === '≥' ? 'min' : 'max';
  return {
    side: m[1]!.toUpperCase(),
    order: orders.length === 1 ? orders[0]! : orders,
    ...(pol ? { polarization: pol } : {}),
    ...(m[4] ? { over: m[4].toLowerCase() } : {}),
    [bound]: Number(m[6]),
  };
}

/** The optimize section: the design's, with the flags laid over it. */
function optimizeSpec(design: Record<string, unknown>, f: OptimizeFlags): Record<string, unknown> {
  const own = design.optimize;
  if (own !== undefined && !isRecord(own)) throw new InputError('optimize', 'expected an object with "variables" and "objective"');
  const s: Record<string, unknown> = own ? structuredClone(own) : {};
  if (f.vary.length) s.variables = f.vary.map(parseVaryFlag);
  applyQuantityFlags(s, 'objective', f);
  const goals = [f.maximize, f.minimize, f.target !== undefined].filter(Boolean).length;
  if (goals > 1) throw new InputError('--target', 'give one of --maximize, --minimize and --target');
  if (goals === 1) {
    const obj = isRecord(s.objective) ? s.objective : {};
    obj.goal = f.maximize ? 'maximize' : f.minimize ? 'minimize' : { target: numberFlag(f.target!, '--target') };
    s.objective = obj;
  }
  if (f.require.length) s.constraints = f.require.map(parseRequireFlag);
  if (f.minRidge !== undefined || f.minGroove !== undefined) {
    const mf: Record<string, unknown> = isRecord(s.minFeature) ? { ...s.minFeature } : {};
    if (f.minRidge !== undefined) mf.ridge = f.minRidge;
    if (f.minGroove !== undefined) mf.groove = f.minGroove;
    s.minFeature = mf;
  }
  if (f.scan !== undefined) {
    const m = /^\s*(grid|lhs)\s*(?::\s*(\d+)\s*)?$/.exec(f.scan);
    if (!m) throw new InputError('--scan', `expected grid, lhs, grid:N or lhs:N, found "${f.scan}"`);
    s.scan = { method: m[1], ...(m[2] ? { points: Number(m[2]) } : {}) };
  }
  if (f.starts !== undefined) s.starts = wholeFlag(f.starts, '--starts', 1, 10);
  if (f.xTolerance !== undefined) s.xTolerance = numberFlag(f.xTolerance, '--x-tolerance');
  if (f.maxSolves !== undefined) s.maxSolves = wholeFlag(f.maxSolves, '--max-solves', 1, 10_000_000);
  if (f.seed !== undefined) s.seed = wholeFlag(f.seed, '--seed', 0, 0xffffffff);
  if (f.curve !== undefined) {
    const parts = f.curve.split(':').map((x) => x.trim());
    if (parts.length !== 3) throw new InputError('--curve', `expected FROM:TO:COUNT, e.g. 1000nm:1100nm:21, found "${f.curve}"`);
    s.curve = { from: parts[0], to: parts[1], count: wholeFlag(parts[2]!, '--curve', 1, 1000) };
  }
  if (own === undefined && !f.vary.length) {
    throw new InputError('optimize', 'the design has no "optimize" section; add one, or give --vary PATH=MIN:MAX with --order and --side');
  }
  return s;
}

const fx = (v: number | null, d = 6): string => (v === null ? '—' : v.toFixed(d));
const num = (v: number): string => String(+v.toPrecision(7));
const withUnit = (v: number, unit: string | null): string => (unit === 'deg' ? `${num(v)}°` : unit ? `${num(v)} ${unit}` : num(v));

/**
 * The optimize report as text lines (efficiencies to 6 decimals, lengths in their unit).
 * @example
 * for (const l of optimizeReport(design.title, await optimize(design, spec))) console.log(l);
 */
export function optimizeReport(title: string, r: OptimizeResult): string[] {
  const L: string[] = [];
  const goal = r.objective.goal;
  const goalText = typeof goal === 'string' ? goal : `reach ${goal.target} with`;
  L.push(`design       ${title}`);
  L.push(`objective    ${goalText} ${r.objective.description}`);
  L.push(`conditions   ${r.conditions}`);
  for (const v of r.variables) L.push(`variable     ${v.path} in [${withUnit(v.min, v.unit)}, ${withUnit(v.max, v.unit)}]`);
  L.push(`scan         ${r.scan.method}, ${r.scan.points} points, ${r.scan.solves} solves (${r.scan.ran})`);
  const conv = r.refine.starts.filter((s) => s.converged).length;
  L.push(`refine       ${r.refine.method === 'brent' ? 'Brent' : 'Nelder–Mead'} from ${r.refine.starts.length} start${r.refine.starts.length === 1 ? '' : 's'} (${conv} converged), ${r.refine.solves} solves`);
  L.push('');
  L.push('optimum');
  const w = Math.max(...r.variables.map((v) => v.path.length), 10);
  for (const v of r.variables) L.push(`  ${v.path.padEnd(w)}  ${withUnit(v.value, v.unit).padStart(14)}   (design: ${v.nominal === null ? '—' : withUnit(v.nominal, v.unit)})`);
  L.push(`  ${r.objective.description} = ${fx(r.objective.value)}   (design as given: ${fx(r.nominalObjective)})`);
  for (const c of r.constraints) {
    const bound = [c.min !== null ? `≥ ${c.min}` : '', c.max !== null ? `≤ ${c.max}` : ''].filter(Boolean).join(', ');
    L.push(`  constraint ${c.description} ${bound}: ${fx(c.value)} ${c.met ? 'met' : 'NOT met'}`);
  }
  if (r.feature) {
    const f = r.feature;
    const part = (name: string, v: number, min: number | null): string => `${name} ${num(v * 1000)} nm${min !== null ? ` (≥ ${num(min * 1000)} nm)` : ''}`;
    L.push(`  feature    ${part('ridge', f.ridgeUm, f.minRidgeUm)}, ${part('groove', f.grooveUm, f.minGrooveUm)}: ${f.met ? 'met' : 'NOT met'}`);
  }
  for (const c of r.curves) {
    L.push('');
    L.push(`at the optimum: ${r.objective.description.replace(/ (TE|TM|unpolarized|worst)(,.*)?$/, '')} over wavelength, ${c.angle}`);
    L.push(`${'λ (nm)'.padStart(10)} ${'TE'.padStart(10)} ${'TM'.padStart(10)} ${'unpol.'.padStart(10)}`);
    c.wavelengthsNm.forEach((lam, i) => {
      const te = c.te[i]!;
      const tm = c.tm[i]!;
      L.push(`${lam.toFixed(2).padStart(10)} ${fx(te).padStart(10)} ${fx(tm).padStart(10)} ${fx(te === null || tm === null ? null : 0.5 * (te + tm)).padStart(10)}`);
    });
  }
  L.push('');
  L.push(`solves       ${r.solves} in ${r.seconds.toFixed(2)} s`);
  if (!r.feasible) L.push('NOT feasible: no candidate met every constraint');
  for (const wn of r.warnings) L.push(`warning: ${wn}`);
  return L;
}

async function optimizeCommand(path: string, f: OptimizeFlags, out: (s: string) => void): Promise<void> {
  const { design, baseDir, readText } = readDesignFile(path);
  const spec = optimizeSpec(design, f);
  const workers = workersFlag(f.workers);
  const ctx = createEvalContext();
  const pool = poolRunner(baseDir, workers, ctx, readText, poolWorthMs());
  const r = await optimize(design, spec, { readText, context: ctx, scanRunner: pool.run, scanRunnerName: pool.describe });
  const title = typeof design.title === 'string' ? design.title : path;
  if (f.json) out(JSON.stringify({ design: title, ...r }, null, 2));
  else for (const l of optimizeReport(title, r)) out(l);
}

/**
 * Register `furrow optimize` and `furrow tolerance`.
 * @param out where the commands print (one call per line or per JSON document)
 * @throws nothing itself; the commands' actions throw InputError / CliFailure for bad input
 *   (main's error path prints them as one line each, exit 2)
 * @example
 * const program = new Command();
 * registerOptimizeCommands(program, (s) => console.log(s));
 */
export function registerOptimizeCommands(program: Command, out: (s: string) => void): void {
  const c = program
    .command('optimize')
    .description('find the design values (depth, duty, blaze, coating …) that give the best efficiency over the band, angles and polarizations of use')
    .argument('<design>', 'design file (JSON), optionally with an "optimize" section')
    .option('--vary <path=min:max>', 'a design field and its bounds, e.g. grating.depth=100nm:1200nm (repeatable; replaces the section\'s variables)', collect, []);
  quantityOptions(c, 'objective')
    .option('--maximize', 'maximize the objective (default)')
    .option('--minimize', 'minimize the objective')
    .option('--target <eta>', 'bring the objective as close as possible to this efficiency')
    .option('--require <constraint>', 'a constraint, e.g. "R(-1) TM >= 0.9" or "T(0) <= 0.01" (repeatable)', collect, [])
    .option('--min-ridge <length>', 'narrowest ridge of a lamellar or trapezoid profile, e.g. 150nm')
    .option('--min-groove <length>', 'narrowest groove of a lamellar or trapezoid profile')
    .option('--scan <grid[:N]|lhs[:N]>', 'coarse scan: N points per variable (grid) or in all (lhs)')
    .option('--starts <n>', 'separate basins refined locally (default 3 for one variable, 2 for more)')
    .option('--x-tolerance <f>', 'refinement stops below this fraction of each range (default 0.001)')
    .option('--max-solves <n>', 'most solves in all (default 5000)')
    .option('--seed <n>', 'random stream of the lhs scan (default 1)')
    .option('--curve <from:to:count>', 'wavelengths of the efficiency curve at the optimum')
    .option('--workers <n>', `worker threads for the scan (default: this machine's ${availableParallelism()})`)
    .option('--json', 'print the result as JSON')
    .action(async (design: string, f: OptimizeFlags) => optimizeCommand(design, f, out));
  registerToleranceCommand(program, out);
}
