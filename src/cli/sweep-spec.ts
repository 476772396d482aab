/**
 * The sweep a `furrow sweep` command asks for: the design file's "sweep" section, changed and
 * extended by the command's flags. A --param for a field the section already varies replaces
 * that parameter (in its place); other --params come after the section's, in the order given.
 * --combine, --littrow/--deviation and the output flags replace the section's settings one by one.
 */
import { InputError } from '../design/index.ts';
import { parseParameterFlag, type SweepSpec } from '../sweep/index.ts';

/** The flags that shape the sweep itself (as commander hands them over: text, or true). */
export interface SpecFlags {
  param?: string[];
  combine?: string;
  littrow?: string;
  deviation?: string;
  ordersOut?: string;
  sides?: string;
  pol?: string;
  phases?: boolean;
  relative?: boolean;
  pdl?: boolean;
}

type Mount = NonNullable<SweepSpec['mount']>;
type Outputs = NonNullable<SweepSpec['outputs']>;

const INTEGER = /^[+-]?\d+$/;

function list(text: string): string[] {
  return text
    .split(',')
    .map((s) => s.trim())
    .filter((s) => s !== '');
}

function wholeOrder(text: string, flag: string): number {
  if (!INTEGER.test(text.trim())) throw new InputError(flag, `expected a whole diffraction order, found "${text}"`);
  return Number(text);
}

function mountFromFlags(f: SpecFlags): Mount | undefined {
  if (f.littrow !== undefined && f.deviation !== undefined) throw new InputError('--deviation', 'give --littrow or --deviation, not both');
  if (f.littrow !== undefined) return { kind: 'littrow', order: wholeOrder(f.littrow, '--littrow') };
  if (f.deviation !== undefined) {
    const m = /^\s*([+-]?\d+)\s*:\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(?:deg|°)?\s*$/.exec(f.deviation);
    if (!m) throw new InputError('--deviation', `expected ORDER:DEGREES, e.g. -1:30, found "${f.deviation}"`);
    return { kind: 'deviation', order: Number(m[1]), deviationDeg: Number(m[2]) };
  }
  return undefined;
}

function outputsFromFlags(f: SpecFlags): Partial<Outputs> {
  const o: { -readonly [K in keyof Outputs]?: Outputs[K] } = {};
  if (f.ordersOut !== undefined) {
    const t = f.ordersOut.trim();
    if (t === 'all') o.orders = 'all';
    else {
      const items = list(t);
      if (items.length === 0 || items.some((s) => !INTEGER.test(s))) throw new InputError('--orders-out', `expected whole orders like -1,0,1 or all, found "${f.ordersOut}"`);
      o.orders = items.map(Number);
    }
  }
  if (f.sides !== undefined) {
    const items = list(f.sides.toUpperCase());
    if (items.length === 0 || items.some((s) => s !== 'R' && s !== 'T')) throw new InputError('--sides', `expected R, T or R,T, found "${f.sides}"`);
    o.sides = [...new Set(items)] as ('R' | 'T')[];
  }
  if (f.pol !== undefined) {
    const names: Record<string, 'TE' | 'TM' | 'unpolarized' | 'requested'> = { te: 'TE', tm: 'TM', unpolarized: 'unpolarized', requested: 'requested' };
    const items = list(f.pol).map((s) => names[s.toLowerCase()]);
    if (items.length === 0 || items.some((s) => s === undefined)) throw new InputError('--pol', `expected a list of TE, TM, unpolarized, requested; found "${f.pol}"`);
    o.polarizations = [...new Set(items)] as ('TE' | 'TM' | 'unpolarized' | 'requested')[];
  }
  if (f.phases) o.phases = true;
  if (f.relative) o.relative = true;
  if (f.pdl) o.pdl = true;
  return o;
}

/** The design's sweep section (if any) as an object, or an InputError saying it is not one. */
function sectionOf(design: unknown): Record<string, unknown> | null {
  if (design === null || typeof design !== 'object' || Array.isArray(design)) return null;
  const s = (design as Record<string, unknown>).sweep;
  if (s === undefined) return null;
  if (s === null || typeof s !== 'object' || Array.isArray(s)) throw new InputError('sweep', 'expected an object with "parameters" (and optionally combine, mount, outputs)');
  return s as Record<string, unknown>;
}

/**
 * The sweep to run: the design's section with the flags applied. The result is checked by
 * planSweep (which reports a bad section or flag as an InputError).
 */
export function specFromFlags(design: unknown, f: SpecFlags): SweepSpec {
  const section = sectionOf(design);
  const spec: Record<string, unknown> = section ? { ...section } : {};
  const base = Array.isArray(spec.parameters) ? [...(spec.parameters as unknown[])] : spec.parameters === undefined ? [] : spec.parameters;
  if (f.param && f.param.length) {
    if (!Array.isArray(base)) throw new InputError('sweep.parameters', 'expected a list of parameters');
    for (const text of f.param) {
      let p: ReturnType<typeof parseParameterFlag>;
      try {
        p = parseParameterFlag(text);
      } catch (e) {
        if (e instanceof InputError) throw new InputError('--param', e.message);
        throw e;
      }
      const at = base.findIndex((q) => q !== null && typeof q === 'object' && (q as { path?: unknown }).path === p.path);
      if (at >= 0) base[at] = p;
      else base.push(p);
    }
  }
  spec.parameters = base;
  if (Array.isArray(base) && base.length === 0) {
    throw new InputError('--param', 'nothing to vary: give --param path=values (e.g. incidence.wavelength=400nm:700nm:31) or a "sweep" section in the design');
  }
  if (f.combine !== undefined) {
    if (f.combine !== 'grid' && f.combine !== 'zip') throw new InputError('--combine', `expected grid or zip, found "${f.combine}"`);
    spec.combine = f.combine;
  }
  const mount = mountFromFlags(f);
  if (mount) spec.mount = mount;
  const outputs = outputsFromFlags(f);
  if (Object.keys(outputs).length) {
    const prev = spec.outputs;
    spec.outputs = { ...(prev !== null && typeof prev === 'object' && !Array.isArray(prev) ? prev : {}), ...outputs };
  }
  return spec as unknown as SweepSpec;
}
