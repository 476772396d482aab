/**
 * The `furrow` command line. Thin: it reads files, calls the library and prints. Every error a
 * user can cause is printed as one clear message (exit code 2), never a stack trace.
 */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { Command, CommanderError } from 'commander';
import { InputError, parseDesign, type Problem } from '../design/index.ts';
import { SolverError, solve, SOLVER_VERSION } from '../solver/index.ts';
import { describeProblem, orderTable } from './format.ts';
import { ordersReport } from './orders.ts';
import { registerFieldsCommand } from './fields.ts';
import { demoDesign } from './demo.ts';
import { MaterialError, MaterialLibrary } from '../materials/index.ts';
import { materialsList, materialsShow } from './materials.ts';
import { designJsonSchema, lengthUm } from '../design/index.ts';

/** A user-facing failure: message and exit code. */
export class CliFailure extends Error {
  constructor(
    message: string,
    readonly exitCode = 2,
  ) {
    super(message);
  }
}

function loadDesign(path: string): Problem {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new CliFailure(`cannot read design file ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const dir = dirname(resolve(path));
  return parseDesign(text, path, (file) => readFileSync(resolve(dir, file), 'utf8'));
}

function withOverrides(p: Problem, opts: { orders?: string }): Problem {
  if (opts.orders === undefined) return p;
  const M = Number(opts.orders);
  if (!(Number.isInteger(M) && M >= 0 && M <= 1000)) throw new CliFailure(`--orders: expected an integer 0…1000, found "${opts.orders}"`);
  return { ...p, options: { ...p.options, orders: M } };
}

function runSolve(p: Problem, json: boolean, out: (s: string) => void): void {
  const t0 = performance.now();
  const r = solve(p.structure, p.incidence, p.options);
  const ms = performance.now() - t0;
  if (json) {
    out(
      JSON.stringify(
        { input: { title: p.title, structure: p.structure, incidence: p.incidence, options: p.options }, notes: p.notes, warnings: p.warnings, result: r },
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
  for (const w of p.warnings) out(`warning: ${w}`);
  out(`solved in ${ms.toFixed(1)} ms (furrow ${SOLVER_VERSION})`);
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
    .option('--orders <M>', 'retain orders −M…M (overrides the design file)')
    .action((design: string, opts: { json?: boolean; orders?: string }) => runSolve(withOverrides(loadDesign(design), opts), !!opts.json, out));
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
  registerFieldsCommand(program, out, loadDesign, (msg) => {
    throw new CliFailure(msg);
  });
  program
    .command('schema')
    .description('print the design file\'s JSON Schema (for editor completion and validation)')
    .action(() => out(JSON.stringify({ $id: 'https://furrow.invalid/design.schema.json', title: 'Furrow design file', ...(designJsonSchema() as object) }, null, 2)));
  program
    .command('demo')
    .description('solve the built-in example (a blazed aluminium spectrometer grating) and show the result')
    .action(() => {
      out('Furrow demo: a blazed, aluminium-coated reflection grating for a visible spectrometer, TE and TM.');
      out('');
      runSolve(demoDesign(), false, out);
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
