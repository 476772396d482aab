/**
 * The `furrow` command line. Thin: it reads files, calls the library and prints. Every error a
 * user can cause is printed as one clear message (exit code 2), never a stack trace.
 */
import { Command, CommanderError } from 'commander';
import { InputError, type Problem } from '../design/index.ts';
import { SolverError, SOLVER_VERSION } from '../solver/index.ts';
import { describeProblem, orderTable } from './format.ts';
import { ordersReport } from './orders.ts';
import { registerFieldsCommand } from './fields.ts';
import { CliFailure } from './errors.ts';
import { readDesignFile } from './design-file.ts';
import { registerSweepCommands } from './sweep-command.ts';
import { registerOptimizeCommands } from './optimize.ts';
import { registerViewCommand } from './view.ts';
import { runDemo } from './demo.ts';
import { MaterialError, MaterialLibrary } from '../materials/index.ts';
import { materialsList, materialsShow } from './materials.ts';
import { designJsonSchema, designToModel, lengthUm, problemAt } from '../design/index.ts';
import { type ConvergedResult, solveConverged } from '../optimize/index.ts';

export { CliFailure };

function loadDesign(path: string): Problem {
  const { design, readText } = readDesignFile(path);
  return problemAt(designToModel(design, readText));
}

function parseLevel(flag: string, v: string | undefined, max: number): 'auto' | number | undefined {
  if (v === undefined || v === 'auto') return v;
  const n = Number(v);
  if (!(Number.isInteger(n) && n >= 0 && n <= max)) throw new CliFailure(`${flag}: expected "auto" or an integer 0…${max}, found "${v}"`);
  return n;
}

const sci = (x: number): string => (Number.isNaN(x) ? '—' : x.toExponential(1));

function runSolve(c: ConvergedResult, ms: number, json: boolean, out: (s: string) => void): void {
  const p = c.problem;
  const r = c.result;
  const convergence = {
    orders: c.orders,
    slices: c.slices,
    ordersChange: Number.isNaN(c.ordersChange) ? null : c.ordersChange,
    slicesChange: Number.isNaN(c.slicesChange) ? null : c.slicesChange,
    converged: c.converged,
    history: c.history.map((h) => ({ ...h, change: Number.isNaN(h.change) ? null : h.change })),
  };
  if (json) {
    out(
      JSON.stringify(
        { input: { title: p.title, structure: p.structure, incidence: p.incidence, options: p.options }, notes: p.notes, warnings: p.warnings, convergence, result: r },
        null,
        2,
      ),
    );
    return;
  }
  for (const l of describeProblem(p)) out(l);
  for (const n of p.notes) out(`note        ${n}`);
  out('');
  for (const l of orderTable(r)) out(l);
  out('');
  const ord = Number.isNaN(c.ordersChange) ? `orders −${c.orders}…${c.orders} (fixed; --orders auto estimates the error)` : `orders −${c.orders}…${c.orders}, last change ${sci(c.ordersChange)}`;
  const sl = c.slices === null ? '' : Number.isNaN(c.slicesChange) ? `; slices ${c.slices} (fixed; --slices auto estimates the error)` : `; slices ${c.slices}, last change ${sci(c.slicesChange)}`;
  out(`convergence ${ord}${sl}${c.converged ? '' : ' — NOT converged at the ceiling'}`);
  for (const w of p.warnings) out(`warning: ${w}`);
  out(`solved in ${ms.toFixed(1)} ms (${c.history.length} solve${c.history.length === 1 ? '' : 's'}, furrow ${SOLVER_VERSION})`);
}

function solveCommand(
  raw: unknown,
  readText: ((f: string) => string) | undefined,
  o: { json?: boolean; orders?: string; slices?: string; tolerance?: string; maxOrders?: string },
  out: (s: string) => void,
): void {
  const orders = parseLevel('--orders', o.orders ?? 'auto', 1000);
  const maxOrders = parseLevel('--max-orders', o.maxOrders, 1000);
  if (maxOrders === 'auto') throw new CliFailure('--max-orders: expected an integer');
  const slices = parseLevel('--slices', o.slices, 1000);
  const tolerance = o.tolerance === undefined ? 1e-4 : Number(o.tolerance);
  if (!(tolerance > 0 && tolerance < 1)) throw new CliFailure(`--tolerance: expected an absolute efficiency tolerance in (0, 1), found "${o.tolerance}"`);
  const t0 = performance.now();
  const c = solveConverged(
    raw,
    { ...(orders !== undefined ? { orders } : {}), ...(slices !== undefined ? { slices } : {}), ...(maxOrders !== undefined ? { maxOrders } : {}), tolerance },
    readText,
  );
  runSolve(c, performance.now() - t0, !!o.json, out);
}

export function buildProgram(out: (s: string) => void): Command {
  const program = new Command();
  program
    .name('furrow')
    .description('Rigorous diffraction-grating efficiencies (RCWA / Fourier modal method)')
    .version(SOLVER_VERSION)
    .exitOverride()
    .configureOutput({ writeOut: (s) => out(s.trimEnd()), writeErr: (s) => out(s.trimEnd()) });
  program
    .command('solve')
    .description('efficiency, angle and amplitude of every propagating order, TE and TM, with R, T and A')
    .argument('<design>', 'design file (JSON)')
    .option('--json', 'print the full result as JSON (schema in README)')
    .option('--orders <M|auto>', 'retain orders −M…M, or "auto": raise them from the design\'s until converged (default auto)')
    .option('--slices <N|auto>', 'slices of the profile, or "auto": double them until converged (default: the design\'s)')
    .option('--tolerance <abs>', 'convergence tolerance on every efficiency (default 1e-4)')
    .option('--max-orders <M>', 'ceiling for --orders auto (default 2.5× the start, at least 40)')
    .action((design: string, opts: { json?: boolean; orders?: string; slices?: string; tolerance?: string; maxOrders?: string }) => {
      const { design: raw, readText } = readDesignFile(design);
      solveCommand(raw, readText, opts, out);
    });
  program
    .command('orders')
    .description('grating-equation summary: order directions, Rayleigh anomalies, Littrow angles')
    .argument('<design>', 'design file (JSON)')
    .action((design: string) => {
      for (const l of ordersReport(loadDesign(design))) out(l);
    });
  const materials = program.command('materials').description('the material library: built-in dispersion data with sources and valid ranges');
  materials
    .command('list', { isDefault: true })
    .description('list every material with its model, valid range and source')
    .action(() => {
      for (const l of materialsList(new MaterialLibrary())) out(l);
    });
  materials
    .command('show')
    .description("one material's n and k over a wavelength range")
    .argument('<name>', 'material name (see furrow materials)')
    .option('--from <length>', 'first wavelength, with unit', '400 nm')
    .option('--to <length>', 'last wavelength, with unit', '800 nm')
    .option('--steps <n>', 'number of intervals', '8')
    .option('--allow-extrapolation', 'evaluate outside the valid range, with a warning')
    .action((name: string, o: { from: string; to: string; steps: string; allowExtrapolation?: boolean }) => {
      const steps = Number(o.steps);
      if (!(Number.isInteger(steps) && steps >= 1 && steps <= 10000)) throw new CliFailure(`--steps: expected an integer 1…10000, found "${o.steps}"`);
      const lines = materialsShow(new MaterialLibrary(), name, lengthUm(o.from, '--from'), lengthUm(o.to, '--to'), steps, {
        allowExtrapolation: !!o.allowExtrapolation,
      });
      for (const l of lines) out(l);
    });
  registerSweepCommands(program, out);
  registerOptimizeCommands(program, out);
  registerViewCommand(program, out);
  registerFieldsCommand(program, out, loadDesign, (msg) => {
    throw new CliFailure(msg);
  });
  program
    .command('schema')
    .description('print the design file\'s JSON Schema (for editor completion and validation)')
    .action(() => out(JSON.stringify({ $id: 'https://furrow.invalid/design.schema.json', title: 'Furrow design file', ...(designJsonSchema() as object) }, null, 2)));
  program
    .command('demo')
    .description('sweep the example blazed aluminium grating over 400–700 nm in Littrow (TE, TM) and summarize its efficiency')
    .option('--output <file.csv>', 'where the demo sweep writes its rows', 'furrow-demo.csv')
    .option('--quiet', 'no progress line')
    .action(async (o: { output: string; quiet?: boolean }) => {
      await runDemo(out, o.output, !!o.quiet);
    });
  return program;
}

/** Run the CLI; returns the exit code. */
export async function main(argv: string[], out: (s: string) => void = (s) => console.log(s)): Promise<number> {
  const program = buildProgram(out);
  try {
    await program.parseAsync(argv);
    return 0;
  } catch (e) {
    if (e instanceof CommanderError) return e.exitCode === 0 ? 0 : 2;
    if (e instanceof CliFailure) {
      out(`furrow: ${e.message}`);
      return e.exitCode;
    }
    if (e instanceof MaterialError) {
      out(`furrow: ${e.message}`);
      return 2;
    }
    if (e instanceof InputError) {
      out(e.path.startsWith('--') ? `furrow: ${e.message}` : `furrow: invalid design — ${e.message}`);
      return 2;
    }
    if (e instanceof SolverError) {
      out(`furrow: ${e.code === 'invalid-input' ? 'invalid input — ' : ''}${e.message}`);
      return e.code === 'invalid-input' ? 2 : 3;
    }
    throw e;
  }
}
