/**
 * From a design file to the solver's problem: parse, validate, convert units.
 */
import type { z } from 'zod';
import type { Complex, Incidence, Jones, Layer, SolveOptions, Structure } from '../solver/index.ts';
import { type Design, DesignSchema, type IndexSchema } from './schema.ts';
import { InputError, lengthUm } from './units.ts';

export interface Problem {
  readonly title: string;
  readonly structure: Structure;
  readonly incidence: Incidence;
  readonly options: SolveOptions;
}

/** Turn zod issues into one readable message per problem. */
function zodMessage(err: z.ZodError): string {
  return err.issues
    .map((i) => {
      const path = i.path.length ? i.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('').replace(/^\./, '') : 'top level';
      const hint = i.code === 'unrecognized_keys' ? ' (remove it or check its spelling)' : '';
      return `  - ${path}: ${i.message}${hint}`;
    })
    .join('\n');
}

/**
 * Parse JSON text of a design file.
 * @throws {InputError} with the field path and a message saying what to change.
 */
export function parseDesign(text: string, source = 'design'): Problem {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new InputError(source, `not valid JSON: ${(e as Error).message}`);
  }
  return designToProblem(raw);
}

/** Validate a design object and convert it. @throws {InputError} */
export function designToProblem(raw: unknown): Problem {
  const parsed = DesignSchema.safeParse(raw);
  if (!parsed.success) throw new InputError('design', 'these fields need changing:\n' + zodMessage(parsed.error));
  const d: Design = parsed.data;
  const periodUm = pickLength(d, 'period', 'design') ?? densityToPeriod(d.grooveDensityPerMm);
  if (periodUm === undefined) throw new InputError('period', 'give the period ("period": "833.3 nm", "periodUm": 0.8333) or "grooveDensityPerMm": 1200');
  if (!(periodUm > 0)) throw new InputError('period', `expected a period > 0, found ${periodUm} µm`);
  const layers: Layer[] = d.layers.map((l, i) => {
    const path = `layers[${i}]`;
    const t = pickLength(l, 'thickness', path);
    if (t === undefined) throw new InputError(`${path}.thickness`, 'missing: give "thickness": "100 nm" or "thicknessNm": 100');
    if (!(t >= 0)) throw new InputError(`${path}.thickness`, `expected a thickness ≥ 0, found ${t} µm`);
    if ((l.index === undefined) === (l.segments === undefined)) {
      throw new InputError(path, 'give either "index" (a uniform film) or "segments" (a lamellar profile), not both or neither');
    }
    if (l.index !== undefined) return { thicknessUm: t, profile: { kind: 'uniform', index: parseIndex(l.index, `${path}.index`) } };
    const segs = l.segments!;
    const total = segs.reduce((s, x) => s + x.width, 0);
    if (Math.abs(total - 1) > 1e-9) {
      throw new InputError(`${path}.segments`, `segment widths are fractions of the period and must add up to 1; they add up to ${total}`);
    }
    let at = 0;
    const segments = segs.map((s, j) => {
      const from = at;
      at = j === segs.length - 1 ? 1 : at + s.width;
      return { from, to: at, index: parseIndex(s.index, `${path}.segments[${j}].index`) };
    });
    return { thicknessUm: t, profile: { kind: 'segments', segments } };
  });
  const wl = pickLength(d.incidence, 'wavelength', 'incidence');
  if (wl === undefined) throw new InputError('incidence.wavelength', 'missing: give "wavelength": "632.8 nm" or "wavelengthNm": 632.8');
  const pol = d.incidence.polarization;
  const polarization: Incidence['polarization'] =
    pol === undefined || typeof pol === 'string'
      ? pol
      : ({ s: { re: pol.s[0], im: pol.s[1] }, p: { re: pol.p[0], im: pol.p[1] } } satisfies Jones);
  return {
    title: d.title ?? 'untitled design',
    structure: {
      periodUm,
      cover: parseIndex(d.cover, 'cover'),
      substrate: parseIndex(d.substrate, 'substrate'),
      layers,
    },
    incidence: {
      wavelengthUm: wl,
      thetaDeg: d.incidence.angleDeg,
      phiDeg: d.incidence.azimuthDeg,
      ...(polarization !== undefined ? { polarization } : {}),
    },
    options: { orders: d.orders, factorization: d.factorization },
  };
}

function densityToPeriod(perMm: number | undefined): number | undefined {
  if (perMm === undefined) return undefined;
  if (!(perMm > 0)) throw new InputError('grooveDensityPerMm', `expected lines per mm > 0, found ${perMm}`);
  return 1000 / perMm;
}

/** A length given as `name` (text with unit) or `nameNm` / `nameUm` (numbers); at most one. */
function pickLength(obj: Record<string, unknown>, name: string, path: string): number | undefined {
  const found: Array<[string, number]> = [];
  const text = obj[name];
  if (typeof text === 'string') found.push([name, lengthUm(text, `${path}.${name}`)]);
  for (const [suffix, f] of [['Nm', 1e-3], ['Um', 1]] as const) {
    const v = obj[name + suffix];
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) throw new InputError(`${path}.${name}${suffix}`, `expected a finite number, found ${v}`);
      found.push([name + suffix, v * f]);
    }
  }
  if (found.length > 1) throw new InputError(`${path}.${name}`, `given twice (${found.map((x) => x[0]).join(' and ')}): keep one`);
  return found[0]?.[1];
}

/** 1.5 → 1.5 + 0i; "0.22+6.71i" → 0.22 + 6.71i; {n, k}. */
export function parseIndex(v: z.infer<typeof IndexSchema>, path: string): Complex {
  let c: Complex;
  if (typeof v === 'number') c = { re: v, im: 0 };
  else if (typeof v === 'string') {
    const m = /^\s*([+-]?\d*\.?\d+(?:[eE][+-]?\d+)?)\s*(?:([+-])\s*(\d*\.?\d+(?:[eE][+-]?\d+)?)\s*[ij])?\s*$/.exec(v);
    if (!m) throw new InputError(path, `expected an index like 1.5, "0.22+6.71i" or {"n": 0.22, "k": 6.71}, found "${v}"`);
    c = { re: Number(m[1]), im: m[3] ? (m[2] === '-' ? -1 : 1) * Number(m[3]) : 0 };
  } else c = { re: v.n, im: v.k };
  if (!Number.isFinite(c.re) || !Number.isFinite(c.im)) throw new InputError(path, `expected finite n and k, found ${JSON.stringify(v)}`);
  if (c.im < 0) throw new InputError(path, `k must be ≥ 0 (absorption, exp(−iωt) convention), found ${c.im}`);
  if (!(c.re > 0) && c.im === 0) throw new InputError(path, `expected n > 0 for a lossless material, found ${c.re}`);
  return c;
}
