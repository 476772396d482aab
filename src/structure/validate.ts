/**
 * Parameter checks shared by the builders. Each throws a {@link StructureError} naming the
 * parameter, the expected and the found value. Internal to src/structure.
 */
import { StructureError } from './errors.ts';
import type { SliceStrategy } from './types.ts';

/** Text for a found value: numbers as they print, everything else as JSON. */
export function shown(v: unknown): string {
  if (typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean' || v === undefined) return String(v);
  try {
    return JSON.stringify(v);
  } catch {
    return String(v);
  }
}

export function fail(field: string, expected: string, found: unknown): never {
  throw new StructureError(field, expected, shown(found));
}

/** A finite number. */
export function finite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) fail(field, 'a finite number', v);
  return v;
}

/** A length > 0 µm (depth, thickness, period). */
export function positiveLength(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0)) fail(field, 'a length > 0 µm', v);
  return v;
}

/** A length ≥ 0 µm. */
export function nonNegativeLength(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 0)) fail(field, 'a length ≥ 0 µm', v);
  return v;
}

/** A duty cycle (fraction of the period occupied by the ridge) in the open interval (0, 1). */
export function duty(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > 0 && v < 1)) fail(field, 'a duty cycle in (0, 1)', v);
  return v;
}

/** A fraction of the period in [0, 1). */
export function fraction(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v >= 0 && v < 1)) fail(field, 'a fraction of the period in [0, 1)', v);
  return v;
}

/** An angle in degrees inside the open interval (lo, hi). */
export function angleIn(field: string, v: unknown, lo: number, hi: number): number {
  if (typeof v !== 'number' || !Number.isFinite(v) || !(v > lo && v < hi)) fail(field, `an angle in (${lo}°, ${hi}°)`, v);
  return v;
}

/** An integer ≥ min. */
export function integerAtLeast(field: string, v: unknown, min: number): number {
  if (typeof v !== 'number' || !Number.isInteger(v) || v < min) fail(field, `an integer ≥ ${min}`, v);
  return v;
}

/** A slice count: an integer ≥ 1. */
export function sliceCount(field: string, v: unknown): number {
  return integerAtLeast(field, v, 1);
}

/** 'uniform' (default when undefined) or 'adaptive'. */
export function strategy(field: string, v: unknown): SliceStrategy {
  if (v === undefined) return 'uniform';
  if (v !== 'uniform' && v !== 'adaptive') fail(field, "'uniform' or 'adaptive'", v);
  return v;
}

/** A material name: a non-empty string. */
export function material(field: string, v: unknown): string {
  if (typeof v !== 'string' || v.trim() === '') fail(field, 'a material name (non-empty text)', v);
  return v;
}

/** A parameter object. */
export function record(field: string, v: unknown): Record<string, unknown> {
  if (typeof v !== 'object' || v === null || Array.isArray(v)) fail(field, 'an object of parameters', v);
  return v as Record<string, unknown>;
}

/** The parameters every sliced builder shares, checked. */
export function common(
  name: string,
  p: Record<string, unknown>,
  slicesOptional = false,
): { periodUm: number; ridgeMaterial: string; grooveMaterial: string; slices: number; strategy: SliceStrategy } {
  return {
    periodUm: positiveLength(`${name}.periodUm`, p.periodUm),
    ridgeMaterial: material(`${name}.ridgeMaterial`, p.ridgeMaterial),
    grooveMaterial: material(`${name}.grooveMaterial`, p.grooveMaterial),
    slices: slicesOptional && p.slices === undefined ? 1 : sliceCount(`${name}.slices`, p.slices),
    strategy: strategy(`${name}.strategy`, p.strategy),
  };
}

/** Format a number for messages and notes: up to 6 significant digits. */
export function num(v: number): string {
  return String(Number(v.toPrecision(6)));
}
