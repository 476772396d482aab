/**
 * What a design answer measures, and how candidate designs are evaluated.
 *
 * A {@link Quantity} is the efficiency of one order (or the sum of several) in reflection or
 * transmission, for TE, TM, unpolarized light (mean of TE and TM) or the worse of TE and TM,
 * taken over the conditions of use: every wavelength of a band × every angle (fixed angles, or
 * the Littrow or constant-deviation angle of an order at each wavelength), combined by their mean
 * or their minimum.
 *
 * Candidates are evaluated through the sweep engine: a batch of candidate designs becomes one
 * 'zip' sweep plan whose rows are (candidate, wavelength, angle) triples, so a design field is
 * set by the same path code as in `furrow sweep` (src/sweep/fields.ts), every row is what
 * `evaluatePoint` gives (equal to a single solve to the last bit), and a plan can run in-process
 * with one shared evaluation context (models and layer eigenmodes reused between candidates that
 * differ only in thicknesses) or on a worker pool (a {@link PlanRunner} from the command line).
 */
import { z } from 'zod';
import { designToModel, InputError, lengthUm, angleDeg, pickLength, type ReadText } from '../design/index.ts';
import { createEvalContext, type EvalContext, evaluatePoint, planSweep, SweepSpecSchema, type SweepParameterSpec } from '../sweep/index.ts';
import { type FieldInfo, pathText, resolveField, setField } from '../sweep/fields.ts';
import type { Mount, SweepPlan, SweepRow } from '../sweep/types.ts';

// ---------------------------------------------------------------------------------------------
// schema

/** A length as text with its unit, e.g. "350 nm". */
const LengthText = z.string().min(1, { error: 'expected a length with a unit, e.g. "350 nm"' });
/**
 * A value of a design field: a number, or text with a unit for lengths ("10 nm") and angles ("0.5 deg").
 * @example
 * FieldValueSchema.parse('10 nm'); FieldValueSchema.parse(0.02);
 */
export const FieldValueSchema = z.union([z.number(), z.string().min(1)]);

/**
 * The fields of a quantity (shared by objectives, constraints and tolerance targets).
 * @example
 * z.strictObject({ ...quantityShape, min: z.number() }); // a constraint's rules
 */
export const quantityShape = {
  /** the order, or a list of orders whose efficiencies are added (e.g. [-1, 1]) */
  order: z.union([z.number().int({ error: 'expected a whole diffraction order' }), z.array(z.number().int({ error: 'expected whole diffraction orders' })).min(1, { error: 'give at least one order' })]),
  /** reflected (R) or transmitted (T) */
  side: z.enum(['R', 'T']),
  /** TE, TM, unpolarized (mean of TE and TM) or worst (the smaller of TE and TM) */
  polarization: z.enum(['TE', 'TM', 'unpolarized', 'worst']).default('unpolarized'),
  /** combination over the band and the angles: their mean or their minimum */
  over: z.enum(['mean', 'min']).default('mean'),
};

/**
 * An efficiency to measure (zod, strict; efficiencies are fractions 0…1 of the incident flux).
 * @example
 * QuantitySchema.parse({ order: [-1, 1], side: 'T' }); // → polarization 'unpolarized', over 'mean'
 */
export const QuantitySchema = z.strictObject(quantityShape);
export type QuantityInput = z.input<typeof QuantitySchema>;
export type Quantity = z.output<typeof QuantitySchema>;

/**
 * Wavelengths of use: a range ("from", "to", "count") or a list ("values"); lengths with units.
 * Which form is given is checked by {@link bandWavelengths}.
 * @example
 * BandSchema.parse({ from: '1000 nm', to: '1060 nm', count: 7 });
 */
export const BandSchema = z.strictObject({
  from: LengthText.optional(),
  to: LengthText.optional(),
  count: z.number().int({ error: 'expected a whole number of wavelengths' }).min(1, { error: 'expected at least 1 wavelength' }).max(1000, { error: 'at most 1000 wavelengths' }).optional(),
  values: z.array(LengthText).min(1, { error: 'give at least one wavelength' }).max(1000, { error: 'at most 1000 wavelengths' }).optional(),
});

/**
 * The conditions of use shared by objective, constraints and tolerance targets: band, fixed
 * angles (degrees), or a Littrow / constant-deviation mount (the sweep section's mount rules).
 * @example
 * z.strictObject({ ...conditionsShape }).parse({ mount: { kind: 'littrow', order: -1 } });
 */
export const conditionsShape = {
  /** wavelengths (default: the design's) */
  band: BandSchema.optional(),
  /** fixed polar angles in degrees (default: the design's angle) */
  angles: z.array(z.number()).min(1, { error: 'give at least one angle' }).max(100, { error: 'at most 100 angles' }).optional(),
  /** Littrow or constant-deviation mount: the angle follows the wavelength */
  mount: SweepSpecSchema.shape.mount,
};

/**
 * Turn zod issues under a section into one InputError (one line per problem; an unknown field is
 * named in the path).
 * @example
 * sectionError('optimize', OptimizeSpecSchema.safeParse({ x: 1 }).error!).message;
 * // 'optimize: these fields need changing:\n  - optimize.variables: …\n  - optimize.x: unknown field …'
 */
export function sectionError(section: string, err: z.ZodError): InputError {
  const lines = err.issues.flatMap((i) => {
    const path = section + i.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('');
    if (i.code === 'unrecognized_keys') return i.keys.map((k) => ({ path: `${path}.${k}`, text: 'unknown field (remove it or check its spelling)' }));
    return [{ path, text: i.message }];
  });
  if (lines.length === 1) return new InputError(lines[0]!.path, lines[0]!.text);
  return new InputError(section, 'these fields need changing:\n' + lines.map((l) => `  - ${l.path}: ${l.text}`).join('\n'));
}

// ---------------------------------------------------------------------------------------------
// parameters (design fields by path)

/** A numeric design field resolved against a design, with its values' unit. */
export interface DesignParameter {
  /** the path as written ('grating.depth') */
  readonly path: string;
  readonly field: FieldInfo;
  /** unit of the numbers: 'nm' or 'um' for lengths, 'deg' for angles, null for unitless fields */
  readonly unit: 'nm' | 'um' | 'deg' | null;
}

/**
 * Resolve a design field that takes continuous numbers.
 * @param at where errors point, e.g. 'optimize.variables[0].path'
 * @throws {InputError} for an unknown path (with the closest names), a field that is not a
 *   number, or a whole-number field (orders, slices …)
 * @example
 * designParameter(design, 'grating.depth', 'optimize.variables[0].path').unit; // 'nm'
 */
export function designParameter(design: unknown, path: string, at: string): DesignParameter {
  const field = resolveField(design, path, at);
  if (field.kind === 'raw') throw new InputError(at, `'${path}' does not take numbers; choose a numeric field such as 'grating.depth' or 'grating.duty'`);
  if (field.kind === 'integer') throw new InputError(at, `'${path}' takes whole numbers; only continuous fields (lengths, angles, fractions) can be varied here`);
  const unit = field.kind === 'length-text' ? 'nm' : field.kind === 'angle' ? 'deg' : field.unit === 'nm' || field.unit === 'um' ? field.unit : null;
  return { path: pathText(field.tokens), field, unit };
}

const NUMBER_WITH_UNIT = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*[A-Za-zµμ°]+\s*$/;

/** 12 significant digits: keeps "350 nm" → 350 rather than 350.00000000000006 */
const tidy = (v: number): number => Number(v.toPrecision(12));

/**
 * A value (or a difference, for tolerances and steps) of a parameter, as a number in its unit.
 * Lengths take text with a unit ("10 nm", "0.01 um"; a bare number only where the field's name
 * carries the unit, like depthNm); angles take degrees (a number or "0.5 deg"); other fields a
 * number.
 * @param at where errors point
 * @throws {InputError}
 * @example
 * parameterValue(depthParam, '0.35 um', 'optimize.variables[0].max'); // 350 (nm)
 */
export function parameterValue(p: DesignParameter, v: number | string, at: string): number {
  const k = p.field.kind;
  let out: number;
  if (k === 'length-text' || k === 'length-number') {
    if (typeof v === 'number') {
      if (k === 'length-text') throw new InputError(at, `'${p.path}' is a length: write it with a unit, e.g. "${v} nm"`);
      out = v;
    } else {
      const um = lengthUm(v, at);
      out = p.unit === 'nm' ? tidy(um * 1000) : tidy(um);
    }
  } else if (k === 'angle') {
    out = typeof v === 'number' ? v : NUMBER_WITH_UNIT.test(v) ? angleDeg(v, at) : Number.NaN;
    if (Number.isNaN(out)) throw new InputError(at, `expected an angle in degrees (a number or "0.5 deg"), found "${v}"`);
  } else {
    if (typeof v !== 'number') throw new InputError(at, `'${p.path}' has no unit; expected a number, found "${v}"`);
    out = v;
  }
  if (!Number.isFinite(out)) throw new InputError(at, `expected a finite value, found ${JSON.stringify(v)}`);
  return out;
}

/**
 * The value with its unit for messages: "350 nm", "8.6°", "0.5" (6 significant digits).
 * @example
 * showValue(depthParam, 350); // '350 nm'
 */
export function showValue(p: DesignParameter, v: number): string {
  const n = +v.toPrecision(6);
  return p.unit === 'deg' ? `${n}°` : p.unit ? `${n} ${p.unit}` : `${n}`;
}

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/** Fields that the schema fills with 0 when absent. */
const ZERO_DEFAULTS = new Set(['incidence.angleDeg', 'incidence.azimuthDeg', 'grating.offset', 'grating.slantDeg']);

/**
 * The design's own value of a parameter, in the parameter's unit.
 * @param at where errors point
 * @throws {InputError} when the design does not give the field (and it has no default)
 * @example
 * nominalValue(design, designParameter(design, 'grating.duty', 'x'), 'x'); // 0.5
 */
export function nominalValue(design: unknown, p: DesignParameter, at: string): number {
  const tokens = p.field.tokens;
  let box: unknown = design;
  for (let k = 0; k < tokens.length - 1; k++) box = isRecord(box) || Array.isArray(box) ? (box as Record<string | number, unknown>)[tokens[k]!] : undefined;
  const parentPath = pathText(tokens.slice(0, -1));
  const name = tokens[tokens.length - 1] as string;
  const missing = (): never => {
    throw new InputError(at, `the design gives no value for '${p.path}', so there is no nominal value to vary around; add it to the design`);
  };
  if (!isRecord(box)) return missing();
  if (p.field.kind === 'length-text' || p.field.kind === 'length-number') {
    const base = name.replace(/(Nm|Um)$/, '');
    let um = pickLength(box, base, parentPath);
    if (um === undefined && tokens.length === 1 && base === 'period' && typeof box.grooveDensityPerMm === 'number') um = 1000 / box.grooveDensityPerMm;
    if (um === undefined) return missing();
    return p.unit === 'um' ? um : tidy(um * 1000);
  }
  const v = box[name];
  if (typeof v === 'number') return v;
  if (v === undefined && ZERO_DEFAULTS.has(p.field.quantity)) return 0;
  return missing();
}

/**
 * A copy of the raw design with parameters set (lengths written as text in nm, or as numbers
 * for fields whose name carries the unit), as the sweep engine sets them.
 * @example
 * withValues(design, [depthParam], [420]); // → { …, grating: { …, depth: "420 nm" } }
 */
export function withValues(design: unknown, params: ReadonlyArray<DesignParameter>, values: ReadonlyArray<number>): Record<string, unknown> {
  const d = structuredClone(design) as Record<string, unknown>;
  params.forEach((p, k) => setField(d, p.field.tokens, p.field.kind === 'length-text' ? 'nm' : p.field.kind === 'length-number' ? p.unit : null, values[k]!));
  return d;
}

/**
 * Check that the design accepts a parameter value on its own (other parameters at the design's
 * values), so a bad bound is reported where it is written.
 * @throws {InputError} at `at`, quoting the design's complaint
 * @example
 * checkValue(design, dutyParam, 1.2, 'optimize.variables[0].max'); // throws: '1.2 makes the design invalid: …'
 */
export function checkValue(design: unknown, p: DesignParameter, v: number, at: string, readText?: ReadText): void {
  if (p.field.kind !== 'length-text' && !p.field.accepts(v)) throw new InputError(at, `${showValue(p, v)} is not accepted by '${p.path}'`);
  try {
    designToModel(withValues(design, [p], [v]), readText);
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
    if (e.path.startsWith('materialTables')) throw e;
    throw new InputError(at, `${showValue(p, v)} makes the design invalid: ${e.message}`);
  }
}

// ---------------------------------------------------------------------------------------------
// conditions of use

/** Conditions as resolved: wavelengths (nm) or the design's, angles (deg) or the design's, the mount. */
export interface Conditions {
  /** null: the design's wavelength */
  readonly wavelengthsNm: ReadonlyArray<number> | null;
  /** null: the design's angle (or the mount's) */
  readonly anglesDeg: ReadonlyArray<number> | null;
  readonly mount: Mount;
}

/**
 * Resolve the band, angles and mount of a section.
 * @param section 'optimize' or 'tolerance' (where errors point)
 * @throws {InputError}
 * @example
 * resolveConditions({ band: { values: ['1030 nm'] }, angles: [0, 5] }, 'optimize');
 * // → { wavelengthsNm: [1030], anglesDeg: [0, 5], mount: { kind: 'fixed' } }
 */
export function resolveConditions(s: { band?: z.output<typeof BandSchema> | undefined; angles?: number[] | undefined; mount?: Mount | undefined }, section: string): Conditions {
  const wavelengthsNm = s.band ? bandWavelengths(s.band, `${section}.band`) : null;
  const mount: Mount = s.mount ?? { kind: 'fixed' };
  if (mount.kind !== 'fixed' && s.angles) throw new InputError(`${section}.angles`, `the ${mount.kind} mount sets the angle at every wavelength; remove "angles" or the mount`);
  if (mount.kind !== 'fixed' && mount.order === 0) throw new InputError(`${section}.mount.order`, 'order 0 is the specular reflection, which has no Littrow or deviation angle; give a non-zero order (−1 is in Littrow at positive θ)');
  (s.angles ?? []).forEach((a, k) => {
    if (!(Math.abs(a) < 90)) throw new InputError(`${section}.angles[${k}]`, `expected a polar angle in (−90°, 90°), found ${a}`);
  });
  return { wavelengthsNm, anglesDeg: s.angles ?? null, mount };
}

/**
 * The wavelengths (nm) of a band: its "values", or "count" points from "from" to "to" with both
 * ends exact.
 * @param at where errors point, e.g. 'optimize.band'
 * @throws {InputError}
 * @example
 * bandWavelengths({ from: '1000 nm', to: '1060 nm', count: 4 }, 'optimize.band'); // [1000, 1020, 1040, 1060]
 */
export function bandWavelengths(b: z.output<typeof BandSchema>, at: string): number[] {
  const f = (k: string): string => `${at}.${k}`;
  const nm = (t: string, k: string): number => {
    const v = tidy(lengthUm(t, f(k)) * 1000);
    if (!(v > 0)) throw new InputError(f(k), `expected a wavelength > 0, found "${t}"`);
    return v;
  };
  if (b.values !== undefined) {
    if (b.from !== undefined || b.to !== undefined || b.count !== undefined) throw new InputError(at, 'give "values", or "from", "to" and "count", not both');
    return b.values.map((t, k) => nm(t, `values[${k}]`));
  }
  if (b.from === undefined) throw new InputError(f('from'), 'missing: give "from", "to" and "count" (or "values")');
  if (b.to === undefined) throw new InputError(f('to'), 'missing: give "from", "to" and "count" (or "values")');
  const lo = nm(b.from, 'from');
  const hi = nm(b.to, 'to');
  const n = b.count ?? (lo === hi ? 1 : undefined);
  if (n === undefined) throw new InputError(f('count'), 'missing: how many wavelengths from "from" to "to" (ends included)');
  if (n === 1 && lo !== hi) throw new InputError(f('count'), `1 wavelength cannot span ${b.from} to ${b.to}; give count ≥ 2`);
  return Array.from({ length: n }, (_, k) => (k === n - 1 ? hi : n === 1 ? lo : tidy(lo + ((hi - lo) * k) / (n - 1))));
}

/**
 * Text of the conditions for reports.
 * @example
 * describeConditions({ wavelengthsNm: [1000, 1030, 1060], anglesDeg: [0], mount: { kind: 'fixed' } });
 * // '3 wavelengths 1000–1060 nm × θ = 0°'
 */
export function describeConditions(c: Conditions): string {
  const w = c.wavelengthsNm;
  const wl = w === null ? "the design's wavelength" : w.length === 1 ? `λ = ${w[0]} nm` : `${w.length} wavelengths ${Math.min(...w)}–${Math.max(...w)} nm`;
  const an =
    c.mount.kind === 'littrow' ? `Littrow, order ${c.mount.order}` : c.mount.kind === 'deviation' ? `constant deviation ${c.mount.deviationDeg}°, order ${c.mount.order}` : c.anglesDeg === null ? "the design's angle" : `θ = ${c.anglesDeg.join(', ')}°`;
  return `${wl} × ${an}`;
}

/**
 * Text of a quantity for reports.
 * @example
 * describeQuantity({ order: [-1, 1], side: 'T', polarization: 'TE', over: 'mean' }); // 'T(-1 + +1) TE'
 */
export function describeQuantity(q: Quantity): string {
  const orders = (Array.isArray(q.order) ? q.order : [q.order]).map((m) => (m > 0 ? `+${m}` : `${m}`)).join(' + ');
  return `${q.side}(${orders}) ${q.polarization}${q.over === 'min' ? ', minimum over the conditions' : ''}`;
}

// ---------------------------------------------------------------------------------------------
// feature widths

/** Narrowest ridge and groove of a lamellar or trapezoid profile (µm), before any coating. */
export interface FeatureWidths {
  readonly ridgeUm: number;
  readonly grooveUm: number;
}

/**
 * Ridge and groove widths of a raw design's lamellar or trapezoid profile: lamellar f·Λ and
 * (1 − f)·Λ; trapezoid min(top, bottom) and Λ − max(top, bottom), with top/bottom = f·Λ ∓ d/tan(α)
 * for a duty f at mid-height and sidewall α from the grating plane. Null for other profiles.
 * @throws {InputError} when the period or the profile's fields cannot be read
 * @example
 * featureWidths({ periodNm: 1000, grating: { profile: 'lamellar', duty: 0.3, depth: '1 um' }, … }); // { ridgeUm: 0.3, grooveUm: 0.7 }
 */
export function featureWidths(raw: Record<string, unknown>): FeatureWidths | null {
  const g = raw.grating;
  if (!isRecord(g) || (g.profile !== 'lamellar' && g.profile !== 'trapezoid')) return null;
  let L = pickLength(raw, 'period', '');
  if (L === undefined && typeof raw.grooveDensityPerMm === 'number') L = 1000 / raw.grooveDensityPerMm;
  if (L === undefined) throw new InputError('period', 'missing: give "period", "periodNm", "periodUm" or "grooveDensityPerMm"');
  if (g.profile === 'lamellar') {
    const f = Number(g.duty);
    return { ridgeUm: f * L, grooveUm: (1 - f) * L };
  }
  const bottom = pickLength(g, 'bottomWidth', 'grating');
  const top = pickLength(g, 'topWidth', 'grating');
  let wb: number;
  let wt: number;
  if (bottom !== undefined && top !== undefined) {
    wb = bottom;
    wt = top;
  } else {
    const d = pickLength(g, 'depth', 'grating') ?? 0;
    const f = Number(g.duty);
    const swa = Number(g.sidewallDeg);
    const run = swa === 90 ? 0 : d / Math.tan((swa * Math.PI) / 180);
    wb = f * L + run;
    wt = f * L - run;
  }
  return { ridgeUm: Math.max(0, Math.min(wb, wt)), grooveUm: L - Math.max(wb, wt) };
}

// ---------------------------------------------------------------------------------------------
// evaluation

/** Runs every point of a sweep plan and returns the rows in index order (rows[i].index === i). */
export type PlanRunner = (plan: SweepPlan) => Promise<ReadonlyArray<SweepRow>>;

/**
 * A runner that evaluates on this thread with one evaluation context for all plans, so design
 * models and layer eigenmodes carry over from plan to plan (the cheap path for the sequential
 * steps of a local search).
 * @param ctx the shared context (default: a fresh one)
 * @example
 * const run = inProcessRunner(readText);
 * const rows = await run(plan);
 */
export function inProcessRunner(readText?: ReadText, ctx: EvalContext = createEvalContext()): PlanRunner {
  return async (plan) => {
    const rows: SweepRow[] = new Array(plan.count);
    for (let i = 0; i < plan.count; i++) rows[i] = evaluatePoint(plan, i, ctx, readText);
    return rows;
  };
}

/** The quantities of one candidate design. */
export interface CandidateValues {
  /** one value per quantity (NaN when the candidate failed) */
  readonly values: ReadonlyArray<number>;
  /** per quantity, per condition (wavelength-major, then angle): TE and TM of the quantity's orders summed (NaN where the row failed) */
  readonly perCondition: ReadonlyArray<ReadonlyArray<{ readonly te: number; readonly tm: number }>>;
  /** the first failing row's reason */
  readonly error?: string;
}

/** One (wavelength, angle) condition of a plan row. */
interface Condition {
  readonly wavelengthNm: number | null;
  readonly angleDeg: number | null;
}

/**
 * Evaluates quantities of candidate designs (values of a list of parameters) under conditions of
 * use, through sweep plans. Counts the solves (one `solve()` per candidate and condition, both
 * polarizations at once).
 * @example
 * const ev = new DesignEvaluator(design, [depth], [{ order: -1, side: 'R', polarization: 'TE', over: 'mean' }],
 *   { wavelengthsNm: null, anglesDeg: null, mount: { kind: 'littrow', order: -1 } }, 'optimize', ['x'], [300]);
 * const [c] = await ev.evaluate([[320]], inProcessRunner()); c.values[0]; // R(−1) TE at 320 nm depth
 */
export class DesignEvaluator {
  /** rows evaluated so far (each is one solve of TE and TM) */
  solves = 0;
  readonly #template: SweepPlan;
  readonly #conditions: ReadonlyArray<Condition>;
  readonly #columns: ReadonlyArray<ReadonlyArray<{ readonly te: number; readonly tm: number }>>;

  /**
   * @param design the raw design (sections other than the design's own fields removed)
   * @param params the parameters a candidate sets, in order
   * @param quantities what to measure
   * @param conditions band, angles, mount
   * @param section where errors point ('optimize' or 'tolerance')
   * @param paramPaths where each parameter's errors point
   * @param templateValues valid values of the parameters (the plan is checked with them)
   * @throws {InputError} when the conditions or the orders do not fit the design
   */
  constructor(
    readonly design: Record<string, unknown>,
    readonly params: ReadonlyArray<DesignParameter>,
    readonly quantities: ReadonlyArray<Quantity>,
    readonly conditions: Conditions,
    readonly section: string,
    paramPaths: ReadonlyArray<string>,
    templateValues: ReadonlyArray<number>,
    readonly readText?: ReadText,
  ) {
    const c = conditions;
    const wl = c.wavelengthsNm ?? [null];
    const an = c.anglesDeg ?? [null];
    const conds: Condition[] = [];
    for (const w of wl) for (const a of an) conds.push({ wavelengthNm: w, angleDeg: a });
    this.#conditions = conds;
    params.forEach((p, k) => {
      if (c.wavelengthsNm && p.field.quantity === 'incidence.wavelength') throw new InputError(paramPaths[k]!, `the band sets the wavelength; vary '${p.path}' without a band, or remove it`);
      if (c.anglesDeg && p.field.quantity === 'incidence.angleDeg') throw new InputError(paramPaths[k]!, `"angles" set the incidence angle; vary '${p.path}' without "angles", or remove it`);
      if (c.mount.kind !== 'fixed' && (p.field.quantity === 'incidence.angleDeg' || p.field.quantity === 'incidence.azimuthDeg')) throw new InputError(paramPaths[k]!, `the ${c.mount.kind} mount sets the incidence angle; it cannot also be varied`);
      params.forEach((q, j) => {
        if (j < k && q.field.quantity === p.field.quantity) throw new InputError(paramPaths[k]!, `'${p.path}' sets the same quantity as '${q.path}'; give it once`);
      });
    });
    const orders = [...new Set(quantities.flatMap((q) => (Array.isArray(q.order) ? q.order : [q.order])))].sort((a, b) => a - b);
    const sides = [...new Set(quantities.map((q) => q.side))];
    const parameters: SweepParameterSpec[] = params.map((p, k) => ({ path: p.path, values: [templateValues[k]!], ...(p.field.kind === 'length-text' ? { unit: 'nm' } : {}) }));
    if (c.wavelengthsNm) parameters.push({ path: 'incidence.wavelength', values: [c.wavelengthsNm[0]!], unit: 'nm' });
    if (c.anglesDeg) parameters.push({ path: 'incidence.angleDeg', values: [c.anglesDeg[0]!] });
    if (parameters.length === 0) throw new RangeError('DesignEvaluator: give at least one parameter, a band or angles');
    try {
      this.#template = planSweep(design, { parameters, combine: 'zip', mount: c.mount, outputs: { orders, sides, polarizations: ['TE', 'TM'], totals: false } }, readText);
    } catch (e) {
      if (e instanceof InputError) throw this.#mapError(e, paramPaths);
      throw e;
    }
    const cols = this.#template.columns;
    this.#columns = quantities.map((q) =>
      (Array.isArray(q.order) ? q.order : [q.order]).map((m) => ({ te: cols.indexOf(`${q.side}_${m}_TE`), tm: cols.indexOf(`${q.side}_${m}_TM`) })),
    );
  }

  /** Rewrite a planning error's 'sweep.…' path as the section's own field. */
  #mapError(e: InputError, paramPaths: ReadonlyArray<string>): InputError {
    const text = e.message.startsWith(`${e.path}: `) ? e.message.slice(e.path.length + 2) : e.message;
    let path = e.path;
    const m = /^sweep\.parameters\[(\d+)\](.*)$/.exec(path);
    if (m) {
      const k = Number(m[1]);
      const nv = this.params.length;
      path = k < nv ? paramPaths[k]!.replace(/\.path$/, '') : k === nv && this.conditions.wavelengthsNm ? `${this.section}.band` : `${this.section}.angles`;
    } else if (path.startsWith('sweep.mount')) path = path.replace(/^sweep/, this.section);
    else if (path.startsWith('sweep.outputs')) path = `${this.section}.${this.section === 'optimize' ? 'objective' : 'efficiency'}.order`;
    else if (path.startsWith('sweep')) path = path.replace(/^sweep/, this.section);
    return new InputError(path, text);
  }

  /** number of conditions (rows per candidate) */
  get conditionCount(): number {
    return this.#conditions.length;
  }

  /** the conditions in row order */
  get conditionList(): ReadonlyArray<Condition> {
    return this.#conditions;
  }

  /**
   * The plan whose rows are every candidate × every condition (candidate-major).
   * @example
   * const plan = ev.planFor([[300], [400]]); // 2 candidates × the conditions
   */
  planFor(candidates: ReadonlyArray<ReadonlyArray<number>>): SweepPlan {
    const nc = this.#conditions.length;
    const count = candidates.length * nc;
    const t = this.#template;
    const nv = this.params.length;
    const axes = t.axes.map((a, k) => {
      const values = new Array<number>(count);
      for (let i = 0; i < candidates.length; i++) {
        for (let j = 0; j < nc; j++) {
          const cond = this.#conditions[j]!;
          values[i * nc + j] = k < nv ? candidates[i]![k]! : a.path === 'incidence.wavelength' && cond.wavelengthNm !== null ? cond.wavelengthNm : a.path === 'incidence.angleDeg' && cond.angleDeg !== null ? cond.angleDeg : (a.values[0] as number);
        }
      }
      return { ...a, values };
    });
    return { ...t, axes, count };
  }

  /**
   * Evaluate the quantities of candidates with `run`. A candidate with a failed row gets NaN
   * values and the first reason; its per-condition values are NaN at the failed rows only.
   * @example
   * const [c] = await ev.evaluate([[420]], run); c.values[0]; // the first quantity at 420 nm
   */
  async evaluate(candidates: ReadonlyArray<ReadonlyArray<number>>, run: PlanRunner): Promise<CandidateValues[]> {
    if (candidates.length === 0) return [];
    const plan = this.planFor(candidates);
    const rows = await run(plan);
    this.solves += plan.count;
    const nc = this.#conditions.length;
    return candidates.map((_, i) => {
      const mine = rows.slice(i * nc, (i + 1) * nc);
      const bad = mine.find((r) => r.status !== 'ok');
      const perCondition = this.#columns.map((cols) =>
        mine.map((r) => {
          if (r.status !== 'ok') return { te: Number.NaN, tm: Number.NaN };
          let te = 0;
          let tm = 0;
          for (const c of cols) {
            te += r.cells[c.te] as number;
            tm += r.cells[c.tm] as number;
          }
          return { te, tm };
        }),
      );
      if (bad) return { values: this.quantities.map(() => Number.NaN), perCondition, error: bad.error ?? 'failed' };
      const values = this.quantities.map((q, k) => combine(q, perCondition[k]!));
      return { values, perCondition };
    });
  }
}

/**
 * A quantity's value from its per-condition TE and TM efficiencies: TE, TM, their mean
 * (unpolarized) or the smaller (worst) at each condition, then the mean or the minimum over the
 * conditions. NaN for no conditions.
 * @example
 * combine({ order: 1, side: 'T', polarization: 'worst', over: 'mean' }, [{ te: 0.9, tm: 0.7 }, { te: 0.6, tm: 0.8 }]); // 0.65
 */
export function combine(q: Quantity, per: ReadonlyArray<{ readonly te: number; readonly tm: number }>): number {
  const vals = per.map(({ te, tm }) => (q.polarization === 'TE' ? te : q.polarization === 'TM' ? tm : q.polarization === 'worst' ? Math.min(te, tm) : 0.5 * (te + tm)));
  if (vals.length === 0) return Number.NaN;
  return q.over === 'min' ? Math.min(...vals) : vals.reduce((s, v) => s + v, 0) / vals.length;
}

/**
 * The design file's object without the sections that are not part of the design ("sweep",
 * "optimize", "tolerance"), so the design schema (strict) accepts it.
 * @throws {InputError} when the design is not a JSON object
 * @example
 * designOnly({ periodNm: 500, optimize: {…}, … }); // → { periodNm: 500, … } (a copy)
 */
export function designOnly(design: unknown): Record<string, unknown> {
  if (!isRecord(design)) throw new InputError('design', 'expected a JSON object');
  const d = structuredClone(design);
  delete d.sweep;
  delete d.optimize;
  delete d.tolerance;
  return d;
}

