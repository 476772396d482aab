/** Shared pieces of the sweep-runner tests: a small design, the CLI as a child process, file polling. */
import { spawn, type ChildProcess } from 'node:child_process';
import { existsSync, mkdtempSync, readFileSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createEvalContext, evaluatePoint, planSweep } from '../../src/sweep/index.ts';
import { headerText, rowText } from '../../src/cli/sweep-output.ts';
import { specFromFlags } from '../../src/cli/sweep-spec.ts';

export const ROOT = fileURLToPath(new URL('../..', import.meta.url));
export const BIN = join(ROOT, 'src/cli/bin.mjs');

export function tempDir(prefix = 'furrow-sweep-'): string {
  return mkdtempSync(join(tmpdir(), prefix));
}

/** A lamellar glass grating solved with 4 retained orders: a few ms per point. */
export function smallDesign(depthNm = 300): Record<string, unknown> {
  return {
    title: 'sweep test: glass lamellar grating',
    period: '1 um',
    cover: 1,
    substrate: 1.5,
    grating: { profile: 'lamellar', depth: `${depthNm} nm`, duty: 0.5, ridge: 1.5 },
    incidence: { wavelength: '600 nm', angleDeg: 10 },
    orders: 4,
  };
}

export function writeJson(dir: string, name: string, value: unknown): string {
  const p = join(dir, name);
  writeFileSync(p, JSON.stringify(value, null, 2));
  return p;
}

export interface Exit {
  readonly code: number | null;
  readonly signal: NodeJS.Signals | null;
  readonly stdout: string;
  readonly stderr: string;
}

/** Starts `node src/cli/bin.mjs …`; `done` resolves when it exits. */
export function startFurrow(args: ReadonlyArray<string>, env: Record<string, string> = {}): { child: ChildProcess; done: Promise<Exit> } {
  const child = spawn(process.execPath, [BIN, ...args], { cwd: ROOT, env: { ...process.env, ...env }, stdio: ['ignore', 'pipe', 'pipe'] });
  let stdout = '';
  let stderr = '';
  child.stdout!.on('data', (d: Buffer) => (stdout += d.toString()));
  child.stderr!.on('data', (d: Buffer) => (stderr += d.toString()));
  const done = new Promise<Exit>((res) => child.on('close', (code, signal) => res({ code, signal, stdout, stderr })));
  return { child, done };
}

export function furrow(args: ReadonlyArray<string>, env: Record<string, string> = {}): Promise<Exit> {
  return startFurrow(args, env).done;
}

/** Lines of a file that end with a newline (an unterminated tail is returned separately). */
export function fileLines(path: string): { lines: string[]; tail: string } {
  const text = existsSync(path) ? readFileSync(path, 'utf8') : '';
  const parts = text.split('\n');
  const tail = parts.pop()!;
  return { lines: parts, tail };
}

/** Waits until the file holds at least n complete lines. */
export async function waitForLines(path: string, n: number, timeoutMs = 40_000): Promise<void> {
  const t0 = Date.now();
  while (fileLines(path).lines.length < n) {
    if (Date.now() - t0 > timeoutMs) throw new Error(`${path} did not reach ${n} lines in ${timeoutMs} ms`);
    await new Promise((r) => setTimeout(r, 50));
  }
}

/** The CSV a sweep must produce, computed here point by point, each with a fresh engine context (no cache). */
export function expectedCsv(design: unknown, params: string[]): string {
  const plan = planSweep(design, specFromFlags(design, { param: params }));
  let text = headerText('csv', plan.columns);
  for (let i = 0; i < plan.count; i++) text += rowText('csv', plan.columns, evaluatePoint(plan, i, createEvalContext()).cells);
  return text;
}
