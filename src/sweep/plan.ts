/**
 * Planning a sweep: validate the sweep section against the design once, resolve ranges and
 * units into axes, the mount and the outputs into columns, and 'all' orders from the sweep's corner
 * points. Then `designAt` gives any point's design file.
 */
import { type DesignModel, designToModel, InputError, parseIndexLiteral, problemAt, type ReadText } from '../design/index.ts';
import { MaterialError } from '../materials/index.ts';
import type { SolveOptions } from '../solver/index.ts';
import { buildAxis, qualifiedColumn } from './axis.ts';
import { type FieldInfo, resolveField } from './fields.ts';
import { coverIndex, mountThetaDeg } from './mount.ts';
import { isPointError } from './errors.ts';
import { cellName, outputCells } from './outputs.ts';
import { geometryKey, modelInput, pointAt, rawPointDesign, readIncidence } from './point.ts';
import { DEFAULT_OUTPUTS, specError, type SweepSpec, SweepSpecSchema } from './spec.ts';
import type { Mount, OutputSpec, SweepAxis, SweepPlan, SweepPoint } from './types.ts';

/** Most points one plan may have. */
export const MAX_POINTS = 1_000_000_000;

/** List values checked one by one against the design at planning (longer lists: the ends). */
const CHECK_EACH_UP_TO = 64;

const DEG = Math.PI / 180;

function isRecord(v: unknown): v is Record<string, unknown> {
  return typeof v === 'object' && v !== null && !Array.isArray(v);
}

/**
 * Validate a sweep and resolve it into a plan.
 *
 * Checks, each failure an InputError naming the field ('sweep.parameters[0].to',
 * 'sweep.mount.order', 'sweep.outputs.polarizations[2]' …): the section's types; every path
 * against this design (a misspelt one gets the closest field names); units (lengths carry one;
 * values are kept in the unit of `from` or `unit`); ranges (count ≥ 1, step toward `to`, log
 * spacing with positive ends); equal lengths for 'zip'; the mount (non-zero order, classical
 * incidence, no parameter on the angle it sets); the outputs. The design is built at the first
 * point and at each parameter's other values (the ends of ranges, each value of a short list;
 * on a zip, at those points themselves, since its values go together), so a value the design
 * rejects is reported here, naming the parameter. What can only fail at some points (a material out of
 * range, a mount without solution) is left to those points.
 *
 * `outputs.orders: 'all'` becomes the orders that propagate in the cover (R) or the substrate
 * (T) at any corner of the sweep (each parameter's ends, and each value of a short list), within
 * the design's retained orders.
 *
 * @param design the design file's object (a "sweep" section in it is ignored: pass it as `spec`)
 * @param spec the sweep section, or what the CLI flags built
 * @param readText reads CSV material tables named by the design
 * @throws {InputError}
 * @example
 * const plan = planSweep(design, { parameters: [{ path: 'incidence.wavelength', from: '400 nm', to: '700 nm', count: 31 }] });
 * plan.count;      // 31
 * plan.columns[1]; // 'wavelength_nm'
 */
export function planSweep(design: unknown, spec: SweepSpec, readText?: ReadText): SweepPlan {
  if (!isRecord(design)) throw new InputError('design', 'expected a JSON object');
  const base = JSON.parse(JSON.stringify(design)) as Record<string, unknown>;
  delete base.sweep;
  const parsed = SweepSpecSchema.safeParse(spec);
  if (!parsed.success) throw specError(parsed.error);
  const s = parsed.data;

  // fields and axes
  const fields: FieldInfo[] = s.parameters.map((p, i) => resolveField(base, p.path, `sweep.parameters[${i}].path`));
  fields.forEach((f, i) => {
    const j = fields.findIndex((g) => g.quantity === f.quantity);
    if (j < i) throw new InputError(`sweep.parameters[${i}].path`, `'${s.parameters[i]!.path}' sets the same quantity as parameters[${j}] ('${s.parameters[j]!.path}'); sweep it once`);
  });
  const built = s.parameters.map((p, i) => buildAxis(p, i, fields[i]!));
  const axes: SweepAxis[] = uniqueColumns(built, fields);

  const combine = s.combine ?? 'grid';
  let count: number;
  if (combine === 'zip') {
    count = axes[0]!.values.length;
    axes.forEach((a, i) => {
      if (a.values.length !== count) {
        const p = s.parameters[i]!;
        throw new InputError(`sweep.parameters[${i}].${p.values ? 'values' : p.count !== undefined ? 'count' : 'step'}`, `"zip" takes the i-th values together, so every parameter needs the same number of values: parameters[0] has ${count}, parameters[${i}] has ${a.values.length}`);
      }
    });
  } else {
    count = axes.reduce((n, a) => n * a.values.length, 1);
    if (count > MAX_POINTS) throw new InputError('sweep.parameters', `${count} points in the grid; at most ${MAX_POINTS}`);
  }

  const mount: Mount = s.mount ?? { kind: 'fixed' };
  if (mount.kind !== 'fixed') {
    if (mount.order === 0) {
      throw new InputError('sweep.mount.order', `order 0 is the specular reflection, which has no ${mount.kind === 'littrow' ? 'Littrow' : 'constant-deviation'} angle; give a non-zero order (−1 is in Littrow at positive θ)`);
    }
    if (mount.kind === 'deviation' && !(Math.abs(mount.deviationDeg) < 180)) throw new InputError('sweep.mount.deviationDeg', `expected a deviation in (−180°, 180°), found ${mount.deviationDeg}`);
    fields.forEach((f, i) => {
      if (f.quantity === 'incidence.angleDeg' || f.quantity === 'incidence.azimuthDeg') {
        throw new InputError(`sweep.parameters[${i}].path`, `the ${mount.kind} mount sets the incidence angle at every point; remove this parameter or use "mount": {"kind": "fixed"}`);
      }
    });
    const az = isRecord(base.incidence) ? base.incidence.azimuthDeg : undefined;
    if (az !== undefined && az !== 0) throw new InputError('sweep.mount', `a ${mount.kind} mount is defined in the classical mount; the design has incidence.azimuthDeg = ${JSON.stringify(az)} (set it to 0)`);
  }

  const outputs: OutputSpec = { ...DEFAULT_OUTPUTS, ...s.outputs };
  checkOutputs(outputs, base, fields);

  // the design at the first point and at each parameter's other values
  const models = new Map<string, DesignModel>();
  const modelOf = (raw: Record<string, unknown>): DesignModel => {
    const key = geometryKey(raw);
    let m = models.get(key);
    if (!m) {
      m = designToModel(modelInput(raw), readText);
      models.set(key, m);
    }
    return m;
  };
  const plan0 = { design: base, axes, combine, mount, outputs, count, columns: [], orders: [] } satisfies SweepPlan;
  const first = pointAt(plan0, 0);
  const raw0 = rawPointDesign(plan0, first.values);
  /** The parameter an error's path is about, or −1. */
  const aboutParameter = (e: InputError): number =>
    fields.findIndex((f) => e.path === f.quantity || e.path.startsWith(f.quantity) || e.path.startsWith(s.parameters[fields.indexOf(f)]!.path));
  /** Build the design at point values `vals` (value number j of each parameter that varies); blame parameter i (null: the first point). */
  const attempt = (vals: ReadonlyArray<number | string>, j: number, i: number | null): void => {
    try {
      const raw = j === 0 ? raw0 : rawPointDesign(plan0, vals);
      readIncidence(raw);
      knownMaterials(modelOf(raw));
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
      // at the first point, and at a zip point (all parameters change together): the parameter
      // the message is about, else the one being checked, else the design itself
      let k = i === null || combine === 'zip' ? aboutParameter(e) : i;
      if (k < 0) k = i ?? -1;
      if (k < 0) throw e;
      const at = s.parameters[k]!.values ? `values[${j}]` : j === 0 ? 'from' : 'to';
      const value = vals[k]!;
      const shown = axes[k]!.unit && axes[k]!.unit !== 'deg' ? `${value} ${axes[k]!.unit}` : JSON.stringify(value);
      throw new InputError(`sweep.parameters[${k}].${at}`, `${shown} makes the design invalid: ${e.message}`);
    }
  };
  attempt(first.values, 0, null);
  const checkedZip = new Set<number>([0]);
  axes.forEach((a, i) => {
    const p = s.parameters[i]!;
    const n = a.values.length;
    const idx = p.values ? (n <= CHECK_EACH_UP_TO ? [...Array(n).keys()] : [0, n - 1]) : [n - 1];
    for (const j of idx) {
      if (j === 0) continue; // the first point
      if (combine === 'zip') {
        // the values of a zip go together: check the point itself, once
        if (checkedZip.has(j)) continue;
        checkedZip.add(j);
        attempt(pointAt(plan0, j).values, j, i);
      } else {
        const vals = [...first.values];
        vals[i] = a.values[j]!;
        attempt(vals, j, i);
      }
    }
  });

  // orders
  const model0 = modelOf(raw0);
  let orders: number[];
  const sweepsOrders = fields.some((f) => f.quantity === 'orders');
  if (outputs.orders === 'all') {
    const found = new Set<number>();
    let failure: Error | null = null;
    let evaluated = 0;
    for (const index of cornerIndices(plan0, s.parameters)) {
      const raw = index === 0 ? raw0 : rawPointDesign(plan0, pointAt(plan0, index).values);
      try {
        for (const m of propagatingAt(plan0, raw, modelOf(raw), outputs.sides)) found.add(m);
        evaluated++;
      } catch (e) {
        if (!isPointError(e)) throw e;
        failure ??= e; // that point will fail when evaluated, with its reason; the others decide
      }
    }
    if (evaluated === 0) {
      throw new InputError('sweep.outputs.orders', `'all' takes the orders that propagate at the sweep's corner points, which cannot be evaluated (${failure!.message}); list the orders instead, e.g. "orders": [-1, 0, 1]`);
    }
    orders = [...found].sort((a, b) => a - b);
  } else {
    const listed: ReadonlyArray<number> = outputs.orders;
    orders = [...listed].sort((a, b) => a - b);
    const M = model0.orders;
    listed.forEach((m, k) => {
      if (listed.indexOf(m) !== k) throw new InputError(`sweep.outputs.orders[${k}]`, `order ${m} is listed twice`);
      if (!sweepsOrders && Math.abs(m) > M) throw new InputError(`sweep.outputs.orders[${k}]`, `order ${m} is outside the retained orders −${M}…${M}; raise the design's "orders" or drop it`);
    });
  }

  const columns = ['point_index', ...axes.map((a) => a.column), ...(mount.kind !== 'fixed' ? ['theta_deg'] : []), ...outputCells(outputs, orders).map(cellName), 'status', 'error'];
  const dup = columns.find((c, k) => columns.indexOf(c) !== k);
  if (dup !== undefined) throw new InputError('sweep.parameters', `two columns would be named '${dup}'; vary a different field`);
  return { design: base, axes, combine, mount, outputs, count, columns, orders };
}

/**
 * Every material the model names must be a literal index or known to its library (a value out
 * of range is left to the points; an unknown name would fail every point).
 * @throws {InputError} at 'cover', 'substrate' or 'layers', with the closest names
 */
function knownMaterials(model: DesignModel): void {
  const refs: Array<[string, string]> = [
    [model.cover, 'cover'],
    [model.substrate, 'substrate'],
  ];
  for (const l of model.geometry) {
    if (l.kind === 'segments') for (const sg of l.segments) refs.push([sg.material, 'layers']);
    else refs.push([l.material, 'layers']);
  }
  for (const [ref, path] of refs) {
    if (parseIndexLiteral(ref)) continue;
    try {
      model.library.resolve(ref);
    } catch (e) {
      if (e instanceof MaterialError) throw new InputError(path, e.message);
      throw e;
    }
  }
}

/** Give axes whose columns collide names with more of their path (layers_2_thickness_nm). */
function uniqueColumns(axes: SweepAxis[], fields: FieldInfo[]): SweepAxis[] {
  const out = axes.map((a) => ({ ...a }));
  for (let parents = 1; parents <= 8; parents++) {
    const clash = out.map((a) => out.filter((b) => b.column === a.column).length > 1);
    if (!clash.some(Boolean)) break;
    out.forEach((a, i) => {
      if (clash[i]) a.column = qualifiedColumn(fields[i]!, a.unit, parents);
    });
  }
  return out;
}

function checkOutputs(o: OutputSpec, design: Record<string, unknown>, fields: FieldInfo[]): void {
  const twice = (list: ReadonlyArray<unknown>, name: string): void =>
    list.forEach((v, k) => {
      if (list.indexOf(v) !== k) throw new InputError(`sweep.outputs.${name}[${k}]`, `${JSON.stringify(v)} is listed twice`);
    });
  twice(o.sides, 'sides');
  twice(o.polarizations, 'polarizations');
  if (o.relative && !o.sides.includes('R')) throw new InputError('sweep.outputs.relative', "relative efficiencies are reflectances over a flat mirror's; add 'R' to outputs.sides");
  if (o.phases && !o.polarizations.some((p) => p === 'TE' || p === 'TM')) {
    throw new InputError('sweep.outputs.phases', "phases are reported on each order's s (TE) and p (TM) amplitudes; add 'TE' or 'TM' to outputs.polarizations");
  }
  const k = o.polarizations.indexOf('requested');
  if (k >= 0) {
    const inc = design.incidence;
    const has = isRecord(inc) && inc.polarization !== undefined;
    if (!has && !fields.some((f) => f.quantity === 'incidence.polarization')) {
      throw new InputError(`sweep.outputs.polarizations[${k}]`, "'requested' is the design's incidence.polarization, which this design does not give; set it or sweep 'incidence.polarization'");
    }
  }
}

/** Most points tried for 'all' orders; beyond, each parameter contributes only its ends. */
const MAX_CORNERS = 256;

/**
 * The points at which 'all' orders are collected: every combination of each parameter's ends
 * and, for a list of at most CHECK_EACH_UP_TO values, each value (all points of a zip of that
 * size). An order propagates on an interval of λ, sin θ and λ/Λ (the grating equation is linear
 * in them), so the ends of each range find every order that propagates anywhere in between, up
 * to the dispersion of the cover and substrate.
 */
function cornerIndices(plan: SweepPlan, params: ReadonlyArray<{ readonly values?: unknown }>): number[] {
  if (plan.count <= 1) return [0];
  if (plan.combine === 'zip') return plan.count <= CHECK_EACH_UP_TO ? [...Array(plan.count).keys()] : [0, plan.count - 1];
  const ends = (n: number): number[] => (n > 1 ? [0, n - 1] : [0]);
  let per = plan.axes.map((a, k) => (params[k]?.values && a.values.length <= CHECK_EACH_UP_TO ? [...Array(a.values.length).keys()] : ends(a.values.length)));
  if (per.reduce((p, l) => p * l.length, 1) > MAX_CORNERS) per = plan.axes.map((a) => ends(a.values.length));
  let out = [0];
  plan.axes.forEach((a, k) => {
    // first axis slowest: index = (…(i0·n1 + i1)·n2 + i2…)
    out = out.flatMap((base) => per[k]!.map((i) => base * a.values.length + i));
  });
  return out.slice(0, MAX_CORNERS);
}

/** The retained orders that propagate at one point in the cover (R) and/or substrate (T). */
function propagatingAt(plan: SweepPlan, raw: Record<string, unknown>, model: DesignModel, sides: ReadonlyArray<'R' | 'T'>): number[] {
  const inc = readIncidence(raw);
  const thetaDeg = plan.mount.kind === 'fixed' ? inc.thetaDeg : mountThetaDeg(plan.mount, inc.wavelengthUm, model.periodUm, coverIndex(model, inc.wavelengthUm).re);
  const p = problemAt(model, inc.wavelengthUm, { ...inc, thetaDeg });
  const nc = p.structure.cover.re;
  const sub = p.structure.substrate;
  const t = p.incidence.thetaDeg * DEG;
  const phi = (p.incidence.phiDeg ?? 0) * DEG;
  const kx0 = nc * Math.sin(t) * Math.cos(phi);
  const ky = p.incidence.phiDeg ? nc * Math.sin(t) * Math.sin(phi) : 0;
  const K = p.incidence.wavelengthUm / p.structure.periodUm;
  const { min, max } = window(p.options);
  const out: number[] = [];
  for (let m = min; m <= max; m++) {
    // the solver's test: |k_t| below the medium's index (an absorbing substrate by its real part)
    const kt = Math.hypot(kx0 + m * K, ky);
    const inCover = kt < nc;
    const inSub = sub.im >= 0 && kt < sub.re;
    if ((sides.includes('R') && inCover) || (sides.includes('T') && inSub)) out.push(m);
  }
  return out;
}

function window(o: SolveOptions): { min: number; max: number } {
  return typeof o.orders === 'number' ? { min: -o.orders, max: o.orders } : o.orders;
}

/**
 * The design file of one point: the plan's design with the point's values set — lengths as
 * text in the axis unit ("523.4 nm"), or numbers for fields whose name carries the unit
 * (`depthNm`) and for unitless and degree fields — and, under a Littrow or constant-deviation
 * mount, `incidence.angleDeg` set to the mount's θ. Solving it with `designToModel` +
 * `problemAt` + `solve` gives the point's row to the last bit.
 * @param readText reads CSV material tables, needed only when a mount must evaluate a cover
 *   material given as a table
 * @throws {InputError} when a mount has no solution at the point or its design cannot be built
 * @example
 * designAt(plan, pointAt(plan, 3)); // → { …, incidence: { wavelength: "430 nm", … } }
 */
export function designAt(plan: SweepPlan, point: SweepPoint, readText?: ReadText): unknown {
  const raw = rawPointDesign(plan, point.values);
  if (plan.mount.kind !== 'fixed') {
    const inc = readIncidence(raw);
    const model = designToModel(modelInput(raw), readText);
    const theta = mountThetaDeg(plan.mount, inc.wavelengthUm, model.periodUm, coverIndex(model, inc.wavelengthUm).re);
    (raw.incidence as Record<string, unknown>).angleDeg = theta;
  }
  return raw;
}
