/**
 * The sweep section of a design file, and the command line's parameter flags, before
 * validation: which fields vary over which values, how points are formed, the mount and the
 * outputs. `planSweep` (plan.ts) turns it into a {@link SweepPlan}.
 */
import { z } from 'zod';
import { InputError } from '../design/index.ts';
import type { OutputSpec } from './types.ts';

/** One swept parameter as written: a list of values, or a range with a count or a step. */
export interface SweepParameterSpec {
  /** design field, dotted, with [i] for list items: 'incidence.wavelength', 'layers[2].thickness' */
  path: string;
  /** explicit values: numbers, or text with a unit for lengths ("400 nm"), or 'TE'/'TM' */
  values?: Array<number | string>;
  /** first value of a range (with a unit for lengths: "400nm") */
  from?: number | string;
  /** last value of a range */
  to?: number | string;
  /** number of points of the range, endpoints included */
  count?: number;
  /** spacing of the range (with a unit for lengths); the range stops at the last point not past `to` */
  step?: number | string;
  /** geometric spacing (needs count and from, to > 0) */
  log?: boolean;
  /** unit of bare numbers for a length field ('nm', 'um', 'mm') or 'deg' */
  unit?: string;
}

/** The sweep section of a design file / the CLI's flags, before validation. */
export interface SweepSpec {
  parameters: SweepParameterSpec[];
  /** 'grid' (default): every combination, first parameter slowest; 'zip': the i-th values together */
  combine?: 'grid' | 'zip';
  /** how θ is set: fixed (the design's), Littrow for an order, or constant deviation */
  mount?: { kind: 'fixed' } | { kind: 'littrow'; order: number } | { kind: 'deviation'; order: number; deviationDeg: number };
  /** defaults: orders 'all', sides ['R','T'], polarizations ['TE','TM','unpolarized'], totals true, phases false, relative false, pdl false */
  outputs?: Partial<OutputSpec>;
}

/** Outputs when the spec leaves them out. */
export const DEFAULT_OUTPUTS: OutputSpec = Object.freeze({
  orders: 'all',
  sides: Object.freeze(['R', 'T'] as const),
  polarizations: Object.freeze(['TE', 'TM', 'unpolarized'] as const),
  totals: true,
  phases: false,
  relative: false,
  pdl: false,
});

const Scalar = z.union([z.number(), z.string().min(1)]);

const ParameterSchema = z.strictObject({
  path: z.string().min(1, { error: 'give the design field to vary, e.g. "incidence.wavelength"' }),
  values: z.array(Scalar).min(1, { error: 'give at least one value' }).optional(),
  from: Scalar.optional(),
  to: Scalar.optional(),
  count: z.number().int({ error: 'expected a whole number of points' }).min(1, { error: 'expected at least 1 point' }).optional(),
  step: Scalar.optional(),
  log: z.boolean().optional(),
  unit: z.string().min(1).optional(),
});

const MountSchema = z.discriminatedUnion('kind', [
  z.strictObject({ kind: z.literal('fixed') }),
  z.strictObject({ kind: z.literal('littrow'), order: z.number().int({ error: 'expected a whole diffraction order' }) }),
  z.strictObject({
    kind: z.literal('deviation'),
    order: z.number().int({ error: 'expected a whole diffraction order' }),
    deviationDeg: z.number(),
  }),
]);

const OutputsSchema = z.strictObject({
  orders: z.union([z.literal('all'), z.array(z.number().int({ error: 'expected whole order numbers' })).min(1, { error: "give at least one order, or 'all'" })]).optional(),
  sides: z.array(z.enum(['R', 'T'])).min(1, { error: "give 'R', 'T' or both" }).optional(),
  polarizations: z.array(z.enum(['TE', 'TM', 'unpolarized', 'requested'])).min(1, { error: 'give at least one polarization' }).optional(),
  totals: z.boolean().optional(),
  phases: z.boolean().optional(),
  relative: z.boolean().optional(),
  pdl: z.boolean().optional(),
});

/**
 * Rules of the sweep section (zod, strict: a misspelt field is an error). Types only; the
 * meaning (ranges, units, paths against the design) is checked by `planSweep`.
 * @example
 * SweepSpecSchema.parse({ parameters: [{ path: 'incidence.wavelength', from: '400 nm', to: '700 nm', count: 31 }] });
 */
export const SweepSpecSchema = z.strictObject({
  parameters: z.array(ParameterSchema).min(1, { error: 'give at least one parameter to vary' }),
  combine: z.enum(['grid', 'zip']).optional(),
  mount: MountSchema.optional(),
  outputs: OutputsSchema.optional(),
});

/** Turn zod issues into InputErrors under 'sweep'. */
export function specError(err: z.ZodError): InputError {
  const lines = err.issues.map((i) => {
    const path = 'sweep' + i.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('');
    const hint = i.code === 'unrecognized_keys' ? ' (remove it or check its spelling)' : '';
    return { path, text: `${i.message}${hint}` };
  });
  if (lines.length === 1) return new InputError(lines[0]!.path, lines[0]!.text);
  return new InputError('sweep', 'these fields need changing:\n' + lines.map((l) => `  - ${l.path}: ${l.text}`).join('\n'));
}

const NUMBER = /^[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?$/;

/** "10" → 10, "0.3" → 0.3, "400nm" → "400nm", " TE " → "TE". */
function scalar(text: string): number | string {
  const t = text.trim();
  return NUMBER.test(t) ? Number(t) : t;
}

/**
 * Read one command-line parameter: `path=from:to:count`, `path=from:to:step=s`,
 * `path=from:to:count:log`, `path=a,b,c`, or `path=value`; an extra `:unit=nm` part gives the
 * unit of bare numbers. Numbers stay numbers, text (lengths with units, 'TE') stays text; the
 * meaning is checked by `planSweep`.
 * @throws {InputError} naming the flag's text when its form is not one of the above
 * @example
 * parseParameterFlag('incidence.wavelength=400nm:700nm:31');
 * // → { path: 'incidence.wavelength', from: '400nm', to: '700nm', count: 31 }
 * parseParameterFlag('grating.depth=100nm:500nm:step=10nm'); // → { …, step: '10nm' }
 * parseParameterFlag('incidence.angleDeg=0,10,20');          // → { …, values: [0, 10, 20] }
 */
export function parseParameterFlag(text: string): SweepParameterSpec {
  const where = `parameter "${text}"`;
  const eq = text.indexOf('=');
  if (eq <= 0) throw new InputError(where, 'expected path=values, e.g. "incidence.wavelength=400nm:700nm:31" or "incidence.angleDeg=0,10,20"');
  const path = text.slice(0, eq).trim();
  const rest = text.slice(eq + 1).trim();
  if (!rest) throw new InputError(where, `no values after "${path}="; give a range like 400nm:700nm:31 or a list like 0,10,20`);
  if (!rest.includes(':')) {
    const values = rest.split(',').map((s) => s.trim());
    if (values.some((v) => v === '')) throw new InputError(where, 'an empty value in the list; separate values with single commas, e.g. 0,10,20');
    return { path, values: values.map(scalar) };
  }
  const parts = rest.split(':').map((s) => s.trim());
  if (parts.length < 3) throw new InputError(where, `a range needs from:to:count or from:to:step=…, found "${rest}"`);
  const out: SweepParameterSpec = { path, from: scalar(parts[0]!), to: scalar(parts[1]!) };
  if (parts[0] === '' || parts[1] === '') throw new InputError(where, `a range needs both ends, found "${rest}"`);
  for (const part of parts.slice(2)) {
    const kv = /^(step|unit|count)\s*=\s*(.+)$/.exec(part);
    if (part === 'log') out.log = true;
    else if (kv?.[1] === 'step') out.step = scalar(kv[2]!);
    else if (kv?.[1] === 'unit') out.unit = kv[2]!.trim();
    else if (kv?.[1] === 'count' || /^\d+$/.test(part)) {
      const n = Number(kv ? kv[2] : part);
      if (!Number.isInteger(n)) throw new InputError(where, `expected a whole number of points, found "${part}"`);
      out.count = n;
    } else {
      throw new InputError(where, `"${part}" is not a count, step=…, unit=… or log`);
    }
  }
  return out;
}
