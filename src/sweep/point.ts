/**
 * Points of a plan: the index → values map (grid or zip), the raw design of a point, its
 * incidence (read and checked exactly as `designToModel` reads it), and the key under which
 * points share one wavelength-independent model. Internal to src/sweep except `pointAt`.
 */
import { InputError, IncidenceSchema, pickLength } from '../design/index.ts';
import type { Incidence, Jones } from '../solver/index.ts';
import { parsePath, setField, type Token } from './fields.ts';
import type { SweepPlan, SweepPoint } from './types.ts';

/**
 * The point at `index` in the plan's order: grid points run with the first axis slowest (the
 * last axis changes at every step); zip points take the index-th value of every axis.
 * @throws {RangeError} for an index that is not a whole number in [0, plan.count)
 * @example
 * // axes wavelength [400, 500] nm × duty [0.3, 0.5, 0.7], grid
 * pointAt(plan, 4).values; // → [500, 0.5]
 */
export function pointAt(plan: SweepPlan, index: number): SweepPoint {
  if (!(Number.isInteger(index) && index >= 0 && index < plan.count)) {
    throw new RangeError(`pointAt: index must be a whole number in [0, ${plan.count}), found ${index}`);
  }
  const values = new Array<number | string>(plan.axes.length);
  if (plan.combine === 'zip') {
    plan.axes.forEach((a, k) => (values[k] = a.values[index]!));
  } else {
    let rest = index;
    for (let k = plan.axes.length - 1; k >= 0; k--) {
      const a = plan.axes[k]!;
      values[k] = a.values[rest % a.values.length]!;
      rest = Math.floor(rest / a.values.length);
    }
  }
  return { index, values };
}

const tokenCache = new WeakMap<SweepPlan, ReadonlyArray<ReadonlyArray<Token>>>();

/** The parsed paths of the plan's axes (computed once per plan object). */
export function axisTokens(plan: SweepPlan): ReadonlyArray<ReadonlyArray<Token>> {
  let t = tokenCache.get(plan);
  if (!t) {
    t = plan.axes.map((a, i) => parsePath(a.path, `sweep.parameters[${i}].path`));
    tokenCache.set(plan, t);
  }
  return t;
}

/**
 * A deep copy of the plan's design with the point's values set. Under a Littrow or deviation
 * mount the design's own angle is replaced by 0 until the mount's θ is known (the design's
 * value is not used, so it cannot make the point fail).
 */
export function rawPointDesign(plan: SweepPlan, values: ReadonlyArray<number | string>): Record<string, unknown> {
  const d = structuredClone(plan.design) as Record<string, unknown>;
  const tokens = axisTokens(plan);
  plan.axes.forEach((a, k) => setField(d, tokens[k]!, a.unit, values[k]!));
  const inc = d.incidence;
  if (plan.mount.kind !== 'fixed' && typeof inc === 'object' && inc !== null && !Array.isArray(inc)) (inc as Record<string, unknown>).angleDeg = 0;
  return d;
}

/**
 * The incidence of a raw design, read and checked as `designToModel` reads it (same schema,
 * same length parser, same messages), so a point reusing another point's model gets the bits a
 * fresh model would.
 * @throws {InputError}
 */
export function readIncidence(raw: Record<string, unknown>): Incidence {
  const parsed = IncidenceSchema.safeParse(raw.incidence);
  if (!parsed.success) {
    const lines = parsed.error.issues.map((i) => {
      const path = 'incidence' + i.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('');
      return `  - ${path}: ${i.message}${i.code === 'unrecognized_keys' ? ' (remove it or check its spelling)' : ''}`;
    });
    throw new InputError('design', 'these fields need changing:\n' + lines.join('\n'));
  }
  const d = parsed.data;
  const wl = pickLength(d, 'wavelength', 'incidence');
  if (wl === undefined) throw new InputError('incidence.wavelength', 'missing: give "wavelength": "632.8 nm" or "wavelengthNm": 632.8');
  if (!(wl > 0)) throw new InputError('incidence.wavelength', `expected a wavelength > 0, found ${wl} µm`);
  if (!(Math.abs(d.angleDeg) < 90)) throw new InputError('incidence.angleDeg', `expected a polar angle in (−90°, 90°), found ${d.angleDeg}`);
  const pol = d.polarization;
  const polarization: Incidence['polarization'] =
    pol === undefined || typeof pol === 'string' ? pol : ({ s: { re: pol.s[0], im: pol.s[1] }, p: { re: pol.p[0], im: pol.p[1] } } satisfies Jones);
  return { wavelengthUm: wl, thetaDeg: d.angleDeg, phiDeg: d.azimuthDeg, ...(polarization !== undefined ? { polarization } : {}) };
}

/**
 * Points whose designs differ only in the incidence share a model: the key is the design
 * without its incidence, and the model is built with a placeholder incidence (the point's own is
 * passed to `problemAt`).
 */
export function geometryKey(raw: Record<string, unknown>): string {
  const copy: Record<string, unknown> = { ...raw };
  delete copy.incidence;
  return JSON.stringify(copy);
}

/** The design a shared model is built from: the point's, with a placeholder incidence. */
export function modelInput(raw: Record<string, unknown>): Record<string, unknown> {
  return { ...raw, incidence: { wavelengthUm: 1 } };
}
