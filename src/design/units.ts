/**
 * Lengths and angles in user input. Every length carries a unit ("632.8 nm", "1.2 µm",
 * "0.5 mm") or a field name that says it (`thicknessNm`, `periodUm`); angles are degrees.
 * Units are read with mathjs's unit parser, never with eval.
 */
import { unit } from 'mathjs';

export class InputError extends Error {
  override readonly name = 'InputError';
  constructor(
    readonly path: string,
    message: string,
  ) {
    super(`${path}: ${message}`);
  }
}

/** Parse "632.8 nm" / "1.2 µm" / "0.5 um" / "1 mm" into micrometres. */
export function lengthUm(text: string, path: string): number {
  const t = text.trim().replace(/µ|μ/g, 'u');
  let v: number;
  try {
    v = unit(t).toNumber('um');
  } catch {
    throw new InputError(path, `expected a length with a unit such as "632.8 nm", "1.2 um" or "0.5 mm", found "${text}"`);
  }
  if (!Number.isFinite(v)) throw new InputError(path, `expected a finite length, found "${text}"`);
  return v;
}

/** Parse "30 deg" / "0.5 rad" into degrees. */
export function angleDeg(text: string, path: string): number {
  let v: number;
  try {
    v = unit(text.trim()).toNumber('deg');
  } catch {
    throw new InputError(path, `expected an angle with a unit such as "30 deg", found "${text}" (or give a number in a field ending in Deg)`);
  }
  if (!Number.isFinite(v)) throw new InputError(path, `expected a finite angle, found "${text}"`);
  return v;
}

/** Unit suffixes accepted in field names, and their factor to µm. */
export const LENGTH_SUFFIXES = { Nm: 1e-3, Um: 1, Mm: 1e3 } as const;
