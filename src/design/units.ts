/**
 * Lengths and angles in user input. Every length carries a unit ("632.8 nm", "1.2 µm",
 * "0.5 mm") or a field name that says it (`thicknessNm`, `periodUm`); angles are degrees.
 * Units are read with mathjs's unit parser, never with eval. The common case — a plain number
 * and one of the units in {@link LENGTH_UNITS} / {@link ANGLE_UNITS} — is read here directly
 * with mathjs's own arithmetic (value × (unit × prefix) ÷ (target unit × prefix)), so the result
 * is the same double mathjs gives, without loading mathjs (see structure/mathjs-access.ts).
 */
import { mathjs } from '../structure/mathjs-access.ts';

/** Units read without mathjs: [unit value, prefix value] in mathjs's base units (m, rad). */
export const LENGTH_UNITS: Readonly<Record<string, readonly [number, number]>> = {
  pm: [1, 1e-12],
  nm: [1, 1e-9],
  um: [1, 1e-6],
  mm: [1, 1e-3],
  cm: [1, 1e-2],
  m: [1, 1],
  angstrom: [1e-10, 1],
};
export const ANGLE_UNITS: Readonly<Record<string, readonly [number, number]>> = {
  deg: [Math.PI / 180, 1],
  rad: [1, 1],
  mrad: [1, 1e-3],
  urad: [1, 1e-6],
};

const PLAIN = /^([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([a-z]+)$/;

/**
 * A plain "number unit" text in the target unit, with mathjs's arithmetic; null when the text
 * is anything else (mathjs then reads it).
 */
function plainQuantity(text: string, units: Readonly<Record<string, readonly [number, number]>>, target: string): number | null {
  const m = PLAIN.exec(text);
  if (m === null || !Object.hasOwn(units, m[2]!)) return null;
  const [uv, pv] = units[m[2]!]!;
  const [tv, tp] = units[target]!;
  return (Number(m[1]) * (uv * pv)) / (tv * tp);
}

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
  let v = plainQuantity(t, LENGTH_UNITS, 'um');
  if (v === null) {
    try {
      v = mathjs().unit(t).toNumber('um');
    } catch {
      throw new InputError(path, `expected a length with a unit such as "632.8 nm", "1.2 um" or "0.5 mm", found "${text}"`);
    }
  }
  if (!Number.isFinite(v)) throw new InputError(path, `expected a finite length, found "${text}"`);
  return v;
}

/** Parse "30 deg" / "0.5 rad" into degrees. */
export function angleDeg(text: string, path: string): number {
  const t = text.trim();
  let v = plainQuantity(t, ANGLE_UNITS, 'deg');
  if (v === null) {
    try {
      v = mathjs().unit(t).toNumber('deg');
    } catch {
      throw new InputError(path, `expected an angle with a unit such as "30 deg", found "${text}" (or give a number in a field ending in Deg)`);
    }
  }
  if (!Number.isFinite(v)) throw new InputError(path, `expected a finite angle, found "${text}"`);
  return v;
}

/** Unit suffixes accepted in field names, and their factor to µm. */
export const LENGTH_SUFFIXES = { Nm: 1e-3, Um: 1, Mm: 1e3 } as const;
