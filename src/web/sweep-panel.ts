/**
 * The sweep panel: which design fields can be swept for the current design (in the spelling the
 * design uses, so the sweep sets the field it has), sensible starting ranges, and the sweep
 * section (`SweepSpec`) the panel's settings stand for — the same object a design file's "sweep"
 * section or the CLI's flags produce, planned by the same `planSweep`.
 */
import { pickLength } from '../design/index.ts';
import type { SweepParameterSpec, SweepSpec } from '../sweep/index.ts';
import { axisTitle } from './plots.ts';
import { shortNumber } from './form.ts';

type Obj = Record<string, unknown>;
const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

export interface ParamChoice {
  /** the design path the sweep sets */
  readonly path: string;
  readonly label: string;
  /** unit of the panel's from/to numbers: 'nm', 'deg', or '' */
  readonly unit: string;
  /** values are lengths: written with their unit ("400 nm") */
  readonly length: boolean;
  /** the starting range for this design */
  readonly defaults: readonly [from: number, to: number, count: number];
}

/** `name`, `nameNm` or `nameUm`: the spelling present in o (default: the text one). */
function spelling(o: Obj, name: string): string {
  for (const k of [name, `${name}Nm`, `${name}Um`]) if (o[k] !== undefined) return k;
  return name;
}

function lengthNmOf(o: Obj, name: string): number | null {
  try {
    const um = pickLength(o, name, '');
    return um === undefined ? null : um * 1000;
  } catch {
    return null;
  }
}

/** Round to a readable value (2 significant digits, or whole nanometres). */
function nice(v: number): number {
  if (!(v > 0)) return v;
  const p = 10 ** (Math.floor(Math.log10(v)) - 1);
  return Math.round(v / p) * p;
}

const clampAngle = (v: number): number => Math.max(-85, Math.min(85, v));

/** The parameters this design offers, the most common first. */
export function paramChoices(raw: unknown): ParamChoice[] {
  if (!isObj(raw)) return [];
  const out: ParamChoice[] = [];
  const inc = isObj(raw['incidence']) ? raw['incidence'] : {};
  const lambda = lengthNmOf(inc, 'wavelength') ?? 500;
  const add = (path: string, unit: string, length: boolean, defaults: readonly [number, number, number]): void => {
    out.push({ path, label: axisTitle(path, unit === '' ? null : unit), unit, length, defaults });
  };
  add(`incidence.${spelling(inc, 'wavelength')}`, 'nm', true, [nice(0.7 * lambda), nice(1.4 * lambda), 31]);
  const theta = typeof inc['angleDeg'] === 'number' ? inc['angleDeg'] : 0;
  add('incidence.angleDeg', 'deg', false, [clampAngle(Math.round(theta - 30)), clampAngle(Math.round(theta + 30)), 31]);
  const g = isObj(raw['grating']) ? raw['grating'] : null;
  if (g) {
    const kind = g['profile'];
    if (['lamellar', 'trapezoid', 'triangle', 'sinusoidal', 'multilevel'].includes(String(kind)) && (g['depth'] ?? g['depthNm'] ?? g['depthUm']) !== undefined) {
      const d = lengthNmOf(g, 'depth') ?? 100;
      add(`grating.${spelling(g, 'depth')}`, 'nm', true, [nice(0.25 * d), nice(2 * d), 21]);
    }
    if (kind === 'volume' && (g['thickness'] ?? g['thicknessNm'] ?? g['thicknessUm']) !== undefined) {
      const t = lengthNmOf(g, 'thickness') ?? 1000;
      add(`grating.${spelling(g, 'thickness')}`, 'nm', true, [nice(0.25 * t), nice(2 * t), 21]);
    }
    if (typeof g['duty'] === 'number') add('grating.duty', '', false, [0.1, 0.9, 17]);
    if (typeof g['blazeDeg'] === 'number') add('grating.blazeDeg', 'deg', false, [Math.max(1, Math.round(g['blazeDeg'] / 3)), Math.min(45, Math.round(g['blazeDeg'] * 3)), 21]);
    if (typeof g['sidewallDeg'] === 'number') add('grating.sidewallDeg', 'deg', false, [60, 90, 16]);
    if (typeof g['deltaN'] === 'number') add('grating.deltaN', '', false, [nice(g['deltaN'] / 4), nice(g['deltaN'] * 2), 21]);
    const c = isObj(g['coating']) ? g['coating'] : null;
    if (c) {
      const t = lengthNmOf(c, 'thickness') ?? 100;
      add(`grating.coating.${spelling(c, 'thickness')}`, 'nm', true, [nice(0.1 * t), nice(2 * t), 21]);
    }
  }
  if (typeof raw['grooveDensityPerMm'] === 'number') {
    const n = raw['grooveDensityPerMm'];
    add('grooveDensityPerMm', '', false, [nice(0.5 * n), nice(1.5 * n), 21]);
  } else {
    const p = lengthNmOf(raw, 'period');
    if (p !== null) add(spelling(raw, 'period'), 'nm', true, [nice(0.5 * p), nice(1.5 * p), 21]);
  }
  const orders = typeof raw['orders'] === 'number' ? raw['orders'] : 20;
  add('orders', '', false, [5, Math.max(40, 5 * Math.ceil(orders / 5)), 8]);
  add('slices', '', false, [4, 40, 10]);
  return out;
}

/** Panel settings of one swept parameter. */
export interface AxisSetting {
  readonly path: string;
  readonly from: string;
  readonly to: string;
  readonly count: string;
}

export interface PanelSettings {
  readonly axes: ReadonlyArray<AxisSetting>;
  /** 'all' or a list of whole orders */
  readonly orders: string;
  readonly polarizations: ReadonlyArray<'TE' | 'TM' | 'unpolarized'>;
  readonly sides: ReadonlyArray<'R' | 'T'>;
  readonly mount: { readonly kind: 'fixed' } | { readonly kind: 'littrow'; readonly order: string };
}

/** A panel problem the sweep planner never sees (text that is not a number, say), with the panel field it is in. */
export class PanelError extends Error {
  constructor(
    readonly field: string,
    message: string,
  ) {
    super(`${field}: ${message}`);
  }
}

function num(text: string, field: string): number {
  const t = text.trim();
  const v = Number(t);
  if (t === '' || !Number.isFinite(v)) throw new PanelError(field, `expected a number, found "${text}"`);
  return v;
}

/**
 * The sweep section these settings stand for.
 * @throws {PanelError} for panel text that is not a number or an order list
 */
export function specFromPanel(s: PanelSettings, choices: ReadonlyArray<ParamChoice>): SweepSpec {
  const parameters: SweepParameterSpec[] = s.axes.map((a, i) => {
    const c = choices.find((x) => x.path === a.path);
    const where = i === 0 ? 'sweep' : 'second parameter';
    const from = num(a.from, `${where} from`);
    const to = num(a.to, `${where} to`);
    const count = num(a.count, `${where} points`);
    return c?.length
      ? { path: a.path, from: `${shortNumber(from)} ${c.unit}`, to: `${shortNumber(to)} ${c.unit}`, count }
      : { path: a.path, from, to, count };
  });
  const o = s.orders.trim();
  let orders: 'all' | number[];
  if (o === '' || o === 'all') orders = 'all';
  else {
    const items = o.split(/[\s,;]+/).filter((x) => x !== '');
    if (!items.every((x) => /^[+-]?\d+$/.test(x.replace('−', '-')))) throw new PanelError('orders', `expected "all" or whole orders like -1, 0, 1; found "${s.orders}"`);
    orders = items.map((x) => Number(x.replace('−', '-')));
  }
  const spec: SweepSpec = {
    parameters,
    combine: 'grid',
    outputs: { orders, sides: [...s.sides], polarizations: [...s.polarizations], totals: true },
  };
  if (s.mount.kind === 'littrow') {
    const m = s.mount.order.trim();
    if (!/^[+-]?\d+$/.test(m)) throw new PanelError('Littrow order', `expected a whole order, found "${s.mount.order}"`);
    spec.mount = { kind: 'littrow', order: Number(m) };
  }
  return spec;
}
