/**
 * `furrow tolerance`: Monte Carlo fabrication tolerances of a design — the distribution of the
 * target efficiency, the yield against a spec, and one-at-a-time sensitivities — from the design
 * file's "tolerance" section with flags laid over it. Registered by `registerOptimizeCommands`
 * (optimize.ts), which shares the flag parsing.
 */
import type { Command } from 'commander';
import { InputError } from '../design/index.ts';
import { toleranceAnalysis, type ToleranceResult } from '../optimize/index.ts';
import { createEvalContext } from '../sweep/index.ts';
import { applyQuantityFlags, collect, poolRunner, poolWorthMs, type QuantityFlags, quantityOptions, workersFlag } from './optimize.ts';
import { readDesignFile } from './design-file.ts';

interface ToleranceFlags extends QuantityFlags {
  param: string[];
  samples?: string;
  seed?: string;
  spec?: string;
  workers?: string;
  json?: boolean;
}

const NUM = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;
const val = (s: string): number | string => (NUM.test(s.trim()) ? Number(s.trim()) : s.trim());

/**
 * `--param` text → a tolerance parameter: `PATH=±D` or `PATH=+-D` (uniform on nominal ± D),
 * `PATH=sigma:S` (normal), each optionally followed by `:step=H`.
 * @throws {InputError} at '--param'
 * @example
 * parseToleranceFlag('grating.depth=±10nm');          // { path: 'grating.depth', plusMinus: '10nm' }
 * parseToleranceFlag('grating.duty=sigma:0.02:step=0.001'); // { path: 'grating.duty', sigma: 0.02, step: 0.001 }
 */
export function parseToleranceFlag(text: string): Record<string, unknown> {
  const m = /^\s*([^=\s]+)\s*=\s*(?:(?:±|\+-|\+\/-)\s*([^:]+?)|sigma\s*:\s*([^:]+?))\s*(?::\s*step\s*=\s*([^:]+?))?\s*$/.exec(text);
  if (!m) throw new InputError('--param', `expected PATH=±D (uniform), PATH=sigma:S (normal), optionally :step=H — e.g. grating.depth=±10nm or grating.duty=sigma:0.02 — found "${text}"`);
  return { path: m[1], ...(m[2] !== undefined ? { plusMinus: val(m[2]) } : { sigma: val(m[3]!) }), ...(m[4] !== undefined ? { step: val(m[4]) } : {}) };
}

function toleranceSpec(design: Record<string, unknown>, f: ToleranceFlags): Record<string, unknown> {
  const own = design.tolerance;
  if (own !== undefined && (typeof own !== 'object' || own === null || Array.isArray(own))) throw new InputError('tolerance', 'expected an object with "efficiency" and "parameters"');
  const s: Record<string, unknown> = own ? structuredClone(own as Record<string, unknown>) : {};
  if (f.param.length) s.parameters = f.param.map(parseToleranceFlag);
  applyQuantityFlags(s, 'efficiency', f);
  const whole = (v: string, flag: string, hi: number): number => {
    const n = Number(v);
    if (!/^\s*\d+\s*$/.test(v) || !(n >= (flag === '--seed' ? 0 : 1) && n <= hi)) throw new InputError(flag, `expected a whole number ${flag === '--seed' ? 0 : 1}…${hi}, found "${v}"`);
    return n;
  };
  if (f.samples !== undefined) s.samples = whole(f.samples, '--samples', 1_000_000);
  if (f.seed !== undefined) s.seed = whole(f.seed, '--seed', 0xffffffff);
  if (f.spec !== undefined) {
    if (!NUM.test(f.spec.trim())) throw new InputError('--spec', `expected an efficiency such as 0.85, found "${f.spec}"`);
    s.spec = Number(f.spec);
  }
  if (own === undefined && !f.param.length) {
    throw new InputError('tolerance', 'the design has no "tolerance" section; add one, or give --param PATH=±D (or PATH=sigma:S) with --order and --side');
  }
  return s;
}

const fx = (v: number | null, d = 6): string => (v === null || !Number.isFinite(v) ? '—' : v.toFixed(d));
const num = (v: number): string => String(+v.toPrecision(6));
const withUnit = (v: number, unit: string | null): string => (unit === 'deg' ? `${num(v)}°` : unit ? `${num(v)} ${unit}` : num(v));
const sci = (v: number): string => (Number.isFinite(v) ? v.toExponential(3) : '—');

/**
 * The tolerance report as text lines (efficiencies to 6 decimals; sensitivities per parameter unit).
 * @param ran how the samples ran (in-process, worker threads)
 * @example
 * for (const l of toleranceReport(design.title, await toleranceAnalysis(design, spec))) console.log(l);
 */
export function toleranceReport(title: string, r: ToleranceResult, ran = 'in-process'): string[] {
  const L: string[] = [];
  L.push(`design       ${title}`);
  L.push(`efficiency   ${r.efficiency}`);
  L.push(`conditions   ${r.conditions}`);
  L.push(`nominal      η = ${fx(r.nominal)}`);
  L.push('');
  const w = Math.max(9, ...r.parameters.map((p) => p.path.length));
  L.push(`${'parameter'.padEnd(w)}  ${'nominal'.padStart(12)}  ${'tolerance'.padEnd(18)}  ${'∂η/∂p'.padStart(11)} ${'per'.padEnd(4)} ${'step'.padStart(10)}  ${'Δη over tol.'.padStart(12)}`);
  for (const p of r.parameters) {
    const d = p.distribution;
    const tol = d.kind === 'uniform' ? `uniform ± ${withUnit(d.halfWidth, p.unit)}` : `normal σ ${withUnit(d.sigma, p.unit)}`;
    const per = p.unit === 'deg' ? '°' : p.unit ?? '1';
    L.push(`${p.path.padEnd(w)}  ${withUnit(p.nominal, p.unit).padStart(12)}  ${tol.padEnd(18)}  ${sci(p.sensitivity.derivative).padStart(11)} /${per.padEnd(3)} ${withUnit(p.sensitivity.step, p.unit).padStart(10)}  ${(Number.isFinite(p.swing) ? (p.swing >= 0 ? '+' : '') + p.swing.toFixed(5) : '—').padStart(12)}`);
  }
  L.push('(central differences (η(p+h) − η(p−h))/2h at the nominal design; Δη over tol. = ∂η/∂p × half-width or σ)');
  L.push('');
  L.push(`Monte Carlo  ${r.samples} samples, seed ${r.seed}${r.failed ? `, ${r.failed} failed` : ''} (${ran})`);
  if (r.stats) {
    const s = r.stats;
    L.push(`  mean ${fx(s.mean)}   std ${fx(s.std)}`);
    L.push(`  5 % ${fx(s.p5)}   50 % ${fx(s.p50)}   95 % ${fx(s.p95)}   (min ${fx(s.min)}, max ${fx(s.max)})`);
  } else {
    L.push('  no sample could be evaluated');
  }
  if (r.spec !== null && r.yield !== null) L.push(`  yield ${(100 * r.yield).toFixed(1)} % with η ≥ ${r.spec}${r.failed ? ' (failed samples count as below spec)' : ''}`);
  for (const f of r.failures) L.push(`  failure: ${f}`);
  L.push('');
  L.push(`solves       ${r.solves} in ${r.seconds.toFixed(2)} s`);
  return L;
}

async function toleranceCommand(path: string, f: ToleranceFlags, out: (s: string) => void): Promise<void> {
  const { design, baseDir, readText } = readDesignFile(path);
  const spec = toleranceSpec(design, f);
  const workers = workersFlag(f.workers);
  const ctx = createEvalContext();
  const pool = poolRunner(baseDir, workers, ctx, readText, poolWorthMs());
  const r = await toleranceAnalysis(design, spec, { readText, context: ctx, runner: pool.run });
  const title = typeof design.title === 'string' ? design.title : path;
  if (f.json) out(JSON.stringify({ design: title, ...r, ran: pool.describe() }, null, 2));
  else for (const l of toleranceReport(title, r, pool.describe())) out(l);
}

/**
 * Register `furrow tolerance` (called by `registerOptimizeCommands`).
 * @param out where the command prints
 * @throws nothing itself; the action throws InputError / CliFailure for bad input
 * @example
 * registerToleranceCommand(program, (s) => console.log(s));
 */
export function registerToleranceCommand(program: Command, out: (s: string) => void): void {
  const c = program
    .command('tolerance')
    .description('Monte Carlo fabrication tolerances: distribution of an efficiency, yield against a spec, sensitivities')
    .argument('<design>', 'design file (JSON), optionally with a "tolerance" section')
    .option('--param <path=±d|path=sigma:s>', 'a toleranced field: uniform ± d or normal σ, optionally :step=h for its sensitivity (repeatable; replaces the section\'s parameters)', collect, []);
  quantityOptions(c, 'efficiency')
    .option('--samples <n>', 'Monte Carlo samples (default 200)')
    .option('--seed <n>', 'random stream (default 1); the same value gives the same numbers')
    .option('--spec <eta>', 'the efficiency a part must reach; the yield is the share of samples at or above it')
    .option('--workers <n>', 'worker threads for the samples (default: this machine\'s); the numbers do not depend on it')
    .option('--json', 'print the result as JSON, with every sample')
    .action(async (design: string, f: ToleranceFlags) => toleranceCommand(design, f, out));
}
