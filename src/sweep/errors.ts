/**
 * Which errors belong to a point (its design, materials, mount or solve) rather than to the
 * program. Internal to src/sweep.
 */
import { InputError } from '../design/index.ts';
import { MaterialError } from '../materials/index.ts';
import { SolverError } from '../solver/index.ts';
import { StructureError } from '../structure/index.ts';

/** An error that makes one point fail with its message, the sweep going on. */
export function isPointError(e: unknown): e is Error {
  return e instanceof InputError || e instanceof MaterialError || e instanceof SolverError || e instanceof StructureError;
}

/** The error's message on one line (CSV cells and logs read better without line breaks). */
export function oneLine(e: Error): string {
  return e.message.replace(/\s*\n\s*/g, ' ').trim();
}
