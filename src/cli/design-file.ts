/** Reading a design file from disk: the one place the CLI commands do it. */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { InputError } from '../design/index.ts';
import { CliFailure } from './errors.ts';

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * The design file's object, its folder, and a reader for files it names (relative to it).
 * @throws {CliFailure} when the file cannot be read; {InputError} when it is not a JSON object
 * @example
 * const { design, baseDir, readText } = readDesignFile('my-grating.json');
 */
export function readDesignFile(path: string): { design: Record<string, unknown>; baseDir: string; readText: (file: string) => string } {
  let text: string;
  try {
    text = readFileSync(path, 'utf8');
  } catch (e) {
    throw new CliFailure(`cannot read design file ${path}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  let design: unknown;
  try {
    design = JSON.parse(text);
  } catch (e) {
    throw new InputError(path, `not valid JSON: ${(e as Error).message}`);
  }
  if (!isRecord(design)) throw new InputError(path, 'expected a JSON object (a design file)');
  const baseDir = dirname(resolve(path));
  return { design, baseDir, readText: (file) => readFileSync(resolve(baseDir, file), 'utf8') };
}
