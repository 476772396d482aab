/**
 * From a parameter as written (a list, or a range with a count or a step; lengths with units)
 * to a {@link SweepAxis}: numbers in the axis unit, endpoints exact, and the CSV column name.
 * Internal to src/sweep.
 */
import { InputError } from '../design/index.ts';
import type { FieldInfo } from './fields.ts';
import type { SweepParameterSpec } from './spec.ts';
import type { SweepAxis } from './types.ts';

/** Most values one axis may have (a step far smaller than the span is almost always a slip). */
export const MAX_AXIS_VALUES = 1_000_000;

/** Length units an axis can use, as powers of ten of a metre. */
const LENGTH_EXP: Readonly<Record<string, number>> = { nm: -9, um: -6, mm: -3 };

function normUnit(u: string): string {
  return u.trim().replace(/µ|μ/g, 'u');
}

const QUANTITY = /^\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*([A-Za-zµμ°]*)\s*$/;

/** Convert `v` in unit `from` to unit `to` (powers of ten; exact for equal units). */
function convertLength(v: number, from: string, to: string): number {
  const d = LENGTH_EXP[from]! - LENGTH_EXP[to]!;
  return d >= 0 ? v * 10 ** d : v / 10 ** -d;
}

/** The unit written in a text like "400nm" (normalized), or null for a bare number / no text. */
function unitIn(v: number | string | undefined): string | null {
  if (typeof v !== 'string') return null;
  const m = QUANTITY.exec(v);
  return m && m[2] ? normUnit(m[2]) : null;
}

/**
 * Build the axis of parameter `i`.
 * @throws {InputError} naming 'sweep.parameters[i].<field>' for every problem
 */
export function buildAxis(p: SweepParameterSpec, i: number, f: FieldInfo): SweepAxis {
  const at = (k: string): string => `sweep.parameters[${i}]${k ? `.${k}` : ''}`;
  const isRange = p.from !== undefined || p.to !== undefined || p.count !== undefined || p.step !== undefined || p.log !== undefined;
  if (p.values !== undefined && isRange) throw new InputError(at('values'), 'give a list of values or a range (from, to, count or step), not both');
  if (p.values === undefined && !isRange) throw new InputError(at(''), 'give "values": [...] or a range "from", "to" with "count" or "step"');

  // the axis unit
  let unit: string | null = null;
  let bareOk = true; // bare numbers are in the axis unit
  const given = p.unit !== undefined ? normUnit(p.unit) : undefined;
  if (f.kind === 'length-text') {
    const inferred = unitIn(p.from) ?? unitIn(p.values?.find((v) => typeof v === 'string'));
    unit = given ?? inferred;
    bareOk = given !== undefined;
    if (unit === null) {
      throw new InputError(at(p.values ? 'values' : 'from'), `'${p.path}' is a length: write the values with a unit ("400 nm") or give "unit": "nm"`);
    }
    const source = given !== undefined ? 'unit' : unitIn(p.from) !== null ? 'from' : `values[${p.values!.findIndex((v) => unitIn(v) !== null)}]`;
    if (LENGTH_EXP[unit] === undefined) throw new InputError(at(source), `expected a length unit nm, um or mm, found '${unit}'`);
  } else if (f.kind === 'length-number' || f.kind === 'angle') {
    unit = f.unit;
    if (given !== undefined && given !== unit) throw new InputError(at('unit'), `'${p.path}' is in ${unit} by its name; remove "unit" or use the field's text form`);
  } else if (given !== undefined) {
    throw new InputError(at('unit'), `'${p.path}' has no unit; remove "unit"`);
  }

  // one written value → number in the axis unit (or the raw value for raw fields)
  const read = (v: number | string, k: string, isStep = false): number | string => {
    if (f.kind === 'raw' && !isStep) return v;
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) throw new InputError(at(k), `expected a finite number, found ${v}`);
      if (f.kind === 'length-text' && !bareOk) throw new InputError(at(k), `${v} has no unit; write "${v} ${unit}" (or give "unit")`);
      return v;
    }
    const m = QUANTITY.exec(v);
    if (!m) throw new InputError(at(k), `expected ${describe(f, unit)}, found "${v}"`);
    const num = Number(m[1]);
    const u = m[2] ? normUnit(m[2]) : '';
    if (f.kind === 'length-text' || f.kind === 'length-number') {
      if (u === '') {
        if (f.kind === 'length-text' && !bareOk) throw new InputError(at(k), `"${v}" has no unit; write "${v} ${unit}"`);
        return num;
      }
      if (LENGTH_EXP[u] === undefined) throw new InputError(at(k), `expected a length in nm, um or mm, found "${v}"`);
      return convertLength(num, u, unit!);
    }
    if (f.kind === 'angle') {
      if (u === '' || u === 'deg' || u === '°') return num;
      throw new InputError(at(k), `expected an angle in degrees ("30" or "30 deg"), found "${v}"`);
    }
    if (u !== '') throw new InputError(at(k), `'${p.path}' has no unit; expected a number, found "${v}"`);
    return num;
  };

  let values: Array<number | string>;
  if (p.values !== undefined) {
    values = p.values.map((v, j) => read(v, `values[${j}]`));
  } else {
    if (p.from === undefined) throw new InputError(at('from'), 'missing: a range needs "from" and "to"');
    if (p.to === undefined) throw new InputError(at('to'), 'missing: a range needs "from" and "to"');
    if (f.kind === 'raw' && !f.numeric) throw new InputError(at('from'), `'${p.path}' takes a list of values, not a range`);
    const from = read(p.from, 'from');
    const to = read(p.to, 'to');
    if (typeof from !== 'number') throw new InputError(at('from'), `expected a number for a range, found "${from}"`);
    if (typeof to !== 'number') throw new InputError(at('to'), `expected a number for a range, found "${to}"`);
    values = rangeValues(p, from, to, (v, k) => read(v, k, true), at, unit);
  }
  if (values.length > MAX_AXIS_VALUES) throw new InputError(at(p.values ? 'values' : p.step !== undefined ? 'step' : 'count'), `${values.length} values; at most ${MAX_AXIS_VALUES} per parameter`);

  // each value as the design will take it
  const where = (j: number): string => (p.values ? `values[${j}]` : j === 0 ? 'from' : 'to');
  values.forEach((v, j) => {
    if (f.kind === 'integer' && !Number.isInteger(v)) {
      throw new InputError(at(p.values ? where(j) : p.step !== undefined ? 'step' : 'count'), `'${p.path}' takes whole numbers; the range gives ${v}${p.values ? '' : '; choose from, to and count (or step) that land on whole numbers'}`);
    }
    if (f.kind !== 'length-text' && f.kind !== 'angle' && !f.accepts(v)) {
      throw new InputError(at(where(j)), `${JSON.stringify(v)} is not accepted by '${p.path}'${f.kind === 'raw' ? '' : ` (${describe(f, unit)})`}`);
    }
  });
  return { path: p.path, values, unit, column: baseColumn(f, unit) };
}

function describe(f: FieldInfo, unit: string | null): string {
  switch (f.kind) {
    case 'length-text':
    case 'length-number':
      return `a length such as "400 ${unit}"`;
    case 'angle':
      return 'an angle in degrees';
    case 'integer':
      return 'a whole number';
    case 'number':
      return 'a number';
    case 'raw':
      return 'a value of the field';
  }
}

function rangeValues(
  p: SweepParameterSpec,
  from: number,
  to: number,
  read: (v: number | string, k: string) => number | string,
  at: (k: string) => string,
  unit: string | null,
): number[] {
  const show = (v: number): string => `${v}${unit && unit !== 'deg' ? ` ${unit}` : ''}`;
  if (p.count !== undefined && p.step !== undefined) throw new InputError(at('step'), 'give "count" or "step", not both');
  if (p.count === undefined && p.step === undefined) throw new InputError(at('count'), 'missing: a range needs "count" (number of points) or "step"');
  if (p.log) {
    if (p.step !== undefined) throw new InputError(at('step'), 'a log range takes "count", not "step"');
    if (!(from > 0)) throw new InputError(at('from'), `a log range needs from > 0, found ${show(from)}`);
    if (!(to > 0)) throw new InputError(at('to'), `a log range needs to > 0, found ${show(to)}`);
  }
  if (p.count !== undefined) {
    const n = p.count;
    if (!(Number.isInteger(n) && n >= 1)) throw new InputError(at('count'), `expected a whole number of points ≥ 1, found ${n}`);
    if (n > MAX_AXIS_VALUES) throw new InputError(at('count'), `${n} points; at most ${MAX_AXIS_VALUES} per parameter`);
    if (n === 1) {
      if (from !== to) throw new InputError(at('count'), `1 point cannot span ${show(from)} to ${show(to)}; give count ≥ 2, or "values": [${from}]`);
      return [from];
    }
    const out = new Array<number>(n);
    if (p.log) {
      const ratio = to / from;
      for (let k = 0; k < n; k++) out[k] = from * ratio ** (k / (n - 1));
    } else {
      for (let k = 0; k < n; k++) out[k] = from + ((to - from) * k) / (n - 1);
    }
    out[0] = from;
    out[n - 1] = to;
    return out;
  }
  const step = read(p.step!, 'step');
  if (typeof step !== 'number' || !Number.isFinite(step) || step === 0) throw new InputError(at('step'), `expected a non-zero step, found ${JSON.stringify(p.step)}`);
  if (to !== from && Math.sign(to - from) !== Math.sign(step)) {
    throw new InputError(at('to'), `${show(to)} is ${to < from ? 'below' : 'above'} from (${show(from)}) while the step is ${step > 0 ? 'positive' : 'negative'}; swap from and to, or change the step's sign`);
  }
  const span = (to - from) / step;
  // a step that lands on `to` within rounding includes it exactly
  const n = Math.floor(span + 1e-9) + 1;
  if (n > MAX_AXIS_VALUES) throw new InputError(at('step'), `${n} points; at most ${MAX_AXIS_VALUES} per parameter`);
  const out = new Array<number>(n);
  for (let k = 0; k < n; k++) out[k] = from + k * step;
  if (Math.abs(span - (n - 1)) <= 1e-9) out[n - 1] = to;
  return out;
}

/** camelCase → snake_case */
function snake(s: string): string {
  return s.replace(/([a-z0-9])([A-Z])/g, '$1_$2').toLowerCase();
}

/** Column of an axis from its field's own name, with the unit: wavelength_nm, angle_deg, duty. */
export function baseColumn(f: FieldInfo, unit: string | null): string {
  let base = f.name;
  if (f.kind === 'length-number') base = base.replace(/(Nm|Um)$/, '');
  if (f.kind === 'angle') base = base.replace(/Deg$/, '');
  const col = snake(base);
  return unit ? `${col}_${unit}` : col;
}

/** A longer column that names the field's parents: layers_2_thickness_nm, coating_thickness_nm. */
export function qualifiedColumn(f: FieldInfo, unit: string | null, parents: number): string {
  const prefix: string[] = [];
  let names = 0;
  for (let k = f.tokens.length - 2; k >= 0 && names < parents; k--) {
    const t = f.tokens[k]!;
    prefix.unshift(typeof t === 'number' ? String(t) : snake(t));
    if (typeof t === 'string') names++;
  }
  return [...prefix, baseColumn(f, unit)].join('_');
}
