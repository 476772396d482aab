/** Wavelength units of user tables (CSV headers and explicit unit arguments). */
import { MaterialError } from './errors.ts';

/** A length unit and its exact conversion to µm: multiply by `mul`, then divide by `div`. */
export interface LengthUnit {
  /** canonical symbol: 'nm', 'µm', 'mm', 'Å' */
  readonly symbol: 'nm' | 'µm' | 'mm' | 'Å';
  readonly mul: number;
  readonly div: number;
}

const NM: LengthUnit = { symbol: 'nm', mul: 1, div: 1000 };
const UM: LengthUnit = { symbol: 'µm', mul: 1, div: 1 };
const MM: LengthUnit = { symbol: 'mm', mul: 1000, div: 1 };
const ANGSTROM: LengthUnit = { symbol: 'Å', mul: 1, div: 10000 };

const NAMES: Record<string, LengthUnit> = {
  nm: NM, nanometer: NM, nanometers: NM, nanometre: NM, nanometres: NM,
  um: UM, 'µm': UM, 'μm': UM, micron: UM, microns: UM, micrometer: UM, micrometers: UM, micrometre: UM, micrometres: UM,
  mm: MM, millimeter: MM, millimeters: MM, millimetre: MM, millimetres: MM,
  'å': ANGSTROM, '\u212b': ANGSTROM, angstrom: ANGSTROM, angstroms: ANGSTROM,
};

/**
 * Look up a wavelength unit: nm, µm (also um, μm, micron), mm, Å (also 'A', angstrom), and the
 * spelled-out names, case-insensitively except the bare 'A' (Å).
 * @returns the unit, or undefined when the text names none of them
 * @example
 * parseLengthUnit('um'); // {symbol: 'µm', mul: 1, div: 1}
 */
export function parseLengthUnit(text: string): LengthUnit | undefined {
  const t = text.trim();
  if (t === 'A') return ANGSTROM;
  return NAMES[t.toLowerCase()];
}

/**
 * Like {@link parseLengthUnit}, throwing for an unknown unit.
 * @throws {MaterialError} 'invalid-argument' naming the unit and the accepted ones
 * @example
 * requireLengthUnit('nm', 'my-film'); // {symbol: 'nm', mul: 1, div: 1000}
 */
export function requireLengthUnit(text: string, material: string | undefined): LengthUnit {
  const u = parseLengthUnit(text);
  if (!u) throw new MaterialError('invalid-argument', `unknown wavelength unit '${text}'; use nm, µm (um), mm or Å`, material);
  return u;
}

/**
 * A value in the unit converted to µm (exact for µm and mm, correctly rounded for nm and Å).
 * @example
 * toUm(632.8, parseLengthUnit('nm')!); // 0.6328
 */
export function toUm(value: number, unit: LengthUnit): number {
  return (value * unit.mul) / unit.div;
}

/**
 * A value in µm converted to the unit.
 * @example
 * fromUm(0.6328, parseLengthUnit('nm')!); // 632.8
 */
export function fromUm(valueUm: number, unit: LengthUnit): number {
  return (valueUm * unit.div) / unit.mul;
}
