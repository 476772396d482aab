/**
 * Design fields a sweep can vary: parsing a dotted path ('grating.depth', 'layers[2].thickness'),
 * finding its rule in the design schema (walked together with the design, so a profile's own
 * fields are known), classifying it (a length with a unit, a length in nm/µm, an angle in
 * degrees, an integer, a plain number, or a value the schema checks as it is), and setting it in
 * a copy of the raw design. Internal to src/sweep.
 */
import { DesignSchema, InputError } from '../design/index.ts';
import { suggestNames } from '../materials/index.ts';

/** A path token: a field name or a list index. */
export type Token = string | number;

/** How a field's values are read and written. */
export type FieldKind =
  /** text with a unit ("350 nm"): numbers in the axis unit, written back as text */
  | 'length-text'
  /** number in the unit its name says (`depthNm`, `periodUm`) */
  | 'length-number'
  /** degrees (`…Deg`) */
  | 'angle'
  /** whole numbers (orders, slices, repeat, steps) */
  | 'integer'
  /** any other number (duty, offset, deltaN, grooveDensityPerMm) */
  | 'number'
  /** written as given and checked by the schema (polarization, materials, expressions) */
  | 'raw';

/** A sweepable design field. */
export interface FieldInfo {
  readonly tokens: ReadonlyArray<Token>;
  /** the field's own name (last name token) */
  readonly name: string;
  readonly kind: FieldKind;
  /** fixed unit of the field ('nm', 'um' for length-number; 'deg' for angles), else null */
  readonly unit: 'nm' | 'um' | 'deg' | null;
  /** the quantity the field sets, the same for every spelling ('incidence.wavelength', 'period') */
  readonly quantity: string;
  /** checks one value as the design schema would */
  readonly accepts: (v: unknown) => boolean;
  /** the field takes numbers (so a numeric range is meaningful) */
  readonly numeric: boolean;
}

/** The part of zod's schema records this walk reads (zod 4 keeps them on `.def`). */
interface Def {
  readonly type: string;
  readonly shape?: Readonly<Record<string, SchemaLike>>;
  readonly innerType?: SchemaLike;
  readonly element?: SchemaLike;
  readonly options?: ReadonlyArray<SchemaLike>;
  readonly discriminator?: string;
  readonly values?: ReadonlyArray<unknown>;
}
interface SchemaLike {
  readonly def: Def;
  safeParse(v: unknown): { success: boolean };
}

const WRAPPERS = new Set(['optional', 'default', 'nullable', 'prefault', 'readonly', 'nonoptional', 'catch']);

function unwrap(s: SchemaLike): SchemaLike {
  let t = s;
  while (WRAPPERS.has(t.def.type) && t.def.innerType) t = t.def.innerType;
  return t;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** The object option of a discriminated union that matches `value`, or null. */
function pickOption(s: SchemaLike, value: unknown): SchemaLike | null {
  const disc = s.def.discriminator;
  if (!disc || !isRecord(value)) return null;
  for (const o of s.def.options ?? []) {
    const lit = o.def.shape?.[disc];
    if (lit && unwrap(lit).def.values?.includes(value[disc])) return o;
  }
  return null;
}

const NAME = /^([A-Za-z_][A-Za-z0-9_]*)((?:\[\d+\])*)$/;

/**
 * Split a dotted path into tokens: 'layers[2].thickness' → ['layers', 2, 'thickness'].
 * @throws {InputError} at `field` when the text is not a path
 */
export function parsePath(path: string, field: string): Token[] {
  const out: Token[] = [];
  const parts = path.trim().split('.');
  for (const part of parts) {
    const m = NAME.exec(part);
    if (!m) throw new InputError(field, `expected a dotted field path such as 'grating.depth' or 'layers[2].thickness', found '${path}'`);
    out.push(m[1]!);
    for (const idx of m[2]!.matchAll(/\[(\d+)\]/g)) out.push(Number(idx[1]));
  }
  return out;
}

/** Tokens back to text: ['layers', 2, 'thickness'] → 'layers[2].thickness'. */
export function pathText(tokens: ReadonlyArray<Token>): string {
  let s = '';
  for (const t of tokens) s += typeof t === 'number' ? `[${t}]` : s ? `.${t}` : t;
  return s;
}

/** Every leaf field path of the schema, following the design's own lists and profile kind. */
function leafPaths(schema: SchemaLike, value: unknown, prefix: Token[], out: string[], depth: number): void {
  if (depth > 8) return;
  const s = unwrap(schema);
  const t = s.def.type;
  if (t === 'object') {
    for (const [k, sub] of Object.entries(s.def.shape ?? {})) leafPaths(sub, isRecord(value) ? value[k] : undefined, [...prefix, k], out, depth + 1);
  } else if (t === 'union' && s.def.discriminator) {
    const o = pickOption(s, value);
    for (const opt of o ? [o] : (s.def.options ?? [])) leafPaths(opt, value, prefix, out, depth + 1);
  } else if (t === 'array' && s.def.element && unwrap(s.def.element).def.type !== 'number' && unwrap(s.def.element).def.type !== 'string') {
    const n = Array.isArray(value) ? value.length : 1;
    for (let i = 0; i < n; i++) leafPaths(s.def.element, Array.isArray(value) ? value[i] : undefined, [...prefix, i], out, depth + 1);
  } else if (prefix.length) {
    out.push(pathText(prefix));
  }
}

/** Lengths come in three spellings: `name` (text), `nameNm`, `nameUm`. */
const LENGTH_SUFFIX = /^(.+)(Nm|Um)$/;

/**
 * Find a field of the design by its path and say how to sweep it.
 * @param field where errors point (e.g. 'sweep.parameters[0].path')
 * @throws {InputError} for a path that is not a field of this design (with the closest names),
 *   a field inside a part the design does not have, or a field that cannot be swept
 */
export function resolveField(design: unknown, path: string, field: string): FieldInfo {
  const tokens = parsePath(path, field);
  let schema: SchemaLike = DesignSchema as unknown as SchemaLike;
  let value: unknown = design;
  let parentShape: Readonly<Record<string, SchemaLike>> = {};
  const unknownField = (): never => {
    const known: string[] = [];
    leafPaths(DesignSchema as unknown as SchemaLike, design, [], known, 0);
    const near = suggestNames(path, known);
    const hint = near.length ? `; did you mean ${near.map((n) => `'${n}'`).join(' or ')}?` : '';
    throw new InputError(field, `'${path}' is not a field of this design${hint}`);
  };
  for (let k = 0; k < tokens.length; k++) {
    const tok = tokens[k]!;
    let s = unwrap(schema);
    const here = pathText(tokens.slice(0, k));
    if (k > 0 && value === undefined) {
      throw new InputError(field, `the design has no '${here}', so '${path}' cannot be varied; add '${here}' to the design first`);
    }
    if (s.def.type === 'union' && s.def.discriminator) {
      const o = pickOption(s, value);
      if (!o) throw new InputError(field, `the design's '${here}' has no valid '${s.def.discriminator}', so its fields are unknown`);
      s = o;
    }
    if (typeof tok === 'string') {
      if (s.def.type !== 'object' || !s.def.shape?.[tok]) return unknownField();
      parentShape = s.def.shape;
      schema = s.def.shape[tok]!;
      value = isRecord(value) ? value[tok] : undefined;
    } else {
      if (s.def.type !== 'array' || !s.def.element) return unknownField();
      if (!Array.isArray(value) || tok >= value.length) {
        const n = Array.isArray(value) ? value.length : 0;
        throw new InputError(field, `'${path}': the design's '${here}' has ${n} item${n === 1 ? '' : 's'} (indices from 0), so [${tok}] does not exist`);
      }
      schema = s.def.element;
      value = value[tok];
    }
  }
  const name = tokens[tokens.length - 1];
  if (typeof name !== 'string') throw new InputError(field, `'${path}' is a list item; sweep one of its fields, e.g. '${path}.thickness'`);
  const leaf = unwrap(schema);
  const t = leaf.def.type;
  const accepts = (v: unknown): boolean => schema.safeParse(v).success;
  const parent = pathText(tokens.slice(0, -1));
  const quantityOf = (base: string): string => {
    const q = parent ? `${parent}.${base}` : base;
    return q === 'grooveDensityPerMm' ? 'period' : q;
  };
  const info = (kind: FieldKind, unit: FieldInfo['unit'], base: string, numeric: boolean): FieldInfo => ({ tokens, name, kind, unit, quantity: quantityOf(base), accepts, numeric });
  if (t === 'string') {
    if (parentShape[`${name}Nm`] && parentShape[`${name}Um`]) return info('length-text', null, name, true);
    return info('raw', null, name, false);
  }
  if (t === 'number') {
    const m = LENGTH_SUFFIX.exec(name);
    if (m && parentShape[m[1]!] && unwrap(parentShape[m[1]!]!).def.type === 'string') return info('length-number', m[2] === 'Nm' ? 'nm' : 'um', m[1]!, true);
    if (name.endsWith('Deg')) return info('angle', 'deg', name, true);
    if (!schema.safeParse(0.5).success && schema.safeParse(1).success) return info('integer', null, name, true);
    return info('number', null, name, true);
  }
  if (t === 'enum' || (t === 'union' && !leaf.def.discriminator)) return info('raw', null, name, accepts(1));
  if (t === 'literal') throw new InputError(field, `'${path}' chooses the kind of the part and cannot be swept; run one sweep per ${name}`);
  if (t === 'object' || t === 'array' || t === 'tuple' || t === 'union') {
    const inner: string[] = [];
    leafPaths(schema, value, [...tokens], inner, 0);
    throw new InputError(field, `'${path}' is a group of fields; sweep one of them${inner.length ? `, e.g. ${inner.slice(0, 3).map((x) => `'${x}'`).join(', ')}` : ''}`);
  }
  throw new InputError(field, `'${path}' is a ${t === 'boolean' ? 'switch (true/false)' : t} field and cannot be swept`);
}

/** Names written by a length axis: the text spelling or the …Nm/…Um number. */
export function lengthSpellings(name: string): { base: string; all: string[] } {
  const m = LENGTH_SUFFIX.exec(name);
  const base = m ? m[1]! : name;
  return { base, all: [base, `${base}Nm`, `${base}Um`] };
}

const LENGTH_UNITS = new Set(['nm', 'um', 'mm']);

/**
 * Set a value in a raw design (mutating it). Lengths remove the field's other spellings (and a
 * period removes grooveDensityPerMm and the reverse) so the design gives the quantity once.
 * @param unit the axis unit: a length unit makes `name` text ("523.4 nm") unless the name
 *   carries its own unit (`depthNm`)
 */
export function setField(design: Record<string, unknown>, tokens: ReadonlyArray<Token>, unit: string | null, value: number | string): void {
  let at: unknown = design;
  for (let k = 0; k < tokens.length - 1; k++) at = (at as Record<string | number, unknown>)[tokens[k]!];
  const box = at as Record<string, unknown>;
  const name = tokens[tokens.length - 1] as string;
  const topLevel = tokens.length === 1;
  if (unit !== null && LENGTH_UNITS.has(unit)) {
    const { base, all } = lengthSpellings(name);
    for (const k of all) delete box[k];
    if (topLevel && base === 'period') delete box.grooveDensityPerMm;
    box[name] = name === base ? `${formatNumber(value as number)} ${unit}` : value;
    return;
  }
  if (topLevel && name === 'grooveDensityPerMm') for (const k of lengthSpellings('period').all) delete box[k];
  box[name] = value;
}

/** A number as the shortest text that reads back to the same double. */
export function formatNumber(v: number): string {
  return String(v);
}
