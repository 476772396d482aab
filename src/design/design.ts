/**
 * From a design file to the solver's problem: validate, convert units, build the profile
 * geometry, resolve materials at the wavelength, and collect warnings (materials evaluated
 * outside their range, too few orders) that travel with the result.
 *
 * Two steps so that sweeps can reuse the wavelength-independent part: `designToModel` (schema,
 * units, geometry, materials library) and `problemAt` (indices at one wavelength → solver input).
 */
import type { z } from 'zod';
import { MaterialError, MaterialLibrary } from '../materials/index.ts';
import type { Complex, Incidence, Jones, SolveOptions, Structure } from '../solver/index.ts';
import {
  compose,
  conformalCoating,
  filledCoating,
  type GeometryLayer,
  lamellar,
  multiLevel,
  profileFromExpression,
  profileFromTable,
  type ProfileResult,
  sawtooth,
  sinusoid,
  StructureError,
  symmetricTriangle,
  thinFilmStack,
  toSolverLayers,
  trapezoid,
  volumeGrating,
} from '../structure/index.ts';
import { type Design, DesignSchema, type GratingSchema, type MaterialRefSchema, type StackSchema } from './schema.ts';
import { InputError, lengthUm } from './units.ts';

/** The wavelength-independent design: geometry with named materials, and everything else. */
export interface DesignModel {
  readonly title: string;
  readonly periodUm: number;
  readonly cover: string;
  readonly substrate: string;
  readonly geometry: ReadonlyArray<GeometryLayer>;
  readonly library: MaterialLibrary;
  readonly incidence: Incidence;
  readonly orders: number;
  readonly factorization: 'inverse' | 'laurent';
  readonly allowExtrapolation: boolean;
  readonly allowGain: boolean;
  /** slices used by the profile, when there is one */
  readonly slices: number | null;
  /** depth of the profile (µm), when there is one */
  readonly depthUm: number | null;
  /** notes from the builders (derived depth, quarter-wave thicknesses …) */
  readonly notes: ReadonlyArray<string>;
}

export interface Problem {
  readonly title: string;
  readonly structure: Structure;
  readonly incidence: Incidence;
  readonly options: SolveOptions;
  /** things the user should know about this result (extrapolated materials, few orders …) */
  readonly warnings: ReadonlyArray<string>;
  /** facts about how the design was built (slice count, derived depth …) */
  readonly notes: ReadonlyArray<string>;
  /** every material of the problem with its index at the wavelength */
  readonly materials: ReadonlyArray<{ readonly name: string; readonly index: Complex }>;
}

/** Turn zod issues into one readable line per problem. */
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
 * Parse the JSON text of a design file and build the problem at its wavelength.
 * @throws {InputError} naming the field and what to change.
 */
export function parseDesign(text: string, source = 'design', readText?: ReadText): Problem {
  return problemAt(parseDesignModel(text, source, readText));
}

/** Parse JSON text into the wavelength-independent model. @throws {InputError} */
export function parseDesignModel(text: string, source = 'design', readText?: ReadText): DesignModel {
  let raw: unknown;
  try {
    raw = JSON.parse(text);
  } catch (e) {
    throw new InputError(source, `not valid JSON: ${(e as Error).message}`);
  }
  return designToModel(raw, readText);
}

/** Validate a design object and build the problem at its wavelength. @throws {InputError} */
export function designToProblem(raw: unknown): Problem {
  return problemAt(designToModel(raw));
}

/** Re-raise builder and material errors as input errors with the design path in front. */
function under<T>(path: string, f: () => T): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof StructureError) throw new InputError(`${path}.${e.field.replace(/^[a-zA-Z]+\./, '')}`, `expected ${e.expected}, found ${e.found}`);
    if (e instanceof MaterialError) throw new InputError(path, e.message);
    throw e;
  }
}

/** Reads a file named in the design (CSV material tables); the CLI reads relative to the design. */
export type ReadText = (file: string) => string;

/**
 * Validate and build the wavelength-independent model.
 * @param readText reads the CSV files named in `materialTables` (the engine has no file access of
 *   its own); designs without tables need none.
 * @throws {InputError}
 */
export function designToModel(raw: unknown, readText?: ReadText): DesignModel {
  const parsed = DesignSchema.safeParse(raw);
  if (!parsed.success) throw new InputError('design', 'these fields need changing:\n' + zodMessage(parsed.error));
  const d: Design = parsed.data;
  const library = new MaterialLibrary();
  (d.materials ?? []).forEach((m, i) => under(`materials[${i}]`, () => library.addEntry(m)));
  (d.materialTables ?? []).forEach((t, i) => {
    const path = `materialTables[${i}]`;
    if (!readText) throw new InputError(`${path}.file`, 'this caller cannot read files; give the material as a JSON entry in "materials"');
    let text: string;
    try {
      text = readText(t.file);
    } catch (e) {
      throw new InputError(`${path}.file`, `cannot read "${t.file}": ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
    }
    under(path, () => library.addCsv(text, { name: t.name, ...(t.unit ? { unit: t.unit } : {}), citation: t.citation ?? `user table ${t.file}` }));
  });
  const periodUm = pickLength(d, 'period', '') ?? densityToPeriod(d.grooveDensityPerMm);
  if (periodUm === undefined) throw new InputError('period', 'missing: give "period": "833.3 nm", "periodUm": 0.8333 or "grooveDensityPerMm": 1200');
  if (!(periodUm > 0)) throw new InputError('period', `expected a period > 0, found ${periodUm} µm`);
  const cover = materialRef(d.cover, 'cover');
  const substrate = materialRef(d.substrate, 'substrate');
  const wl = pickLength(d.incidence, 'wavelength', 'incidence');
  if (wl === undefined) throw new InputError('incidence.wavelength', 'missing: give "wavelength": "632.8 nm" or "wavelengthNm": 632.8');
  if (!(wl > 0)) throw new InputError('incidence.wavelength', `expected a wavelength > 0, found ${wl} µm`);
  if (!(Math.abs(d.incidence.angleDeg) < 90)) throw new InputError('incidence.angleDeg', `expected a polar angle in (−90°, 90°), found ${d.incidence.angleDeg}`);
  const pol = d.incidence.polarization;
  const polarization: Incidence['polarization'] =
    pol === undefined || typeof pol === 'string' ? pol : ({ s: { re: pol.s[0], im: pol.s[1] }, p: { re: pol.p[0], im: pol.p[1] } } satisfies Jones);
  const incidence: Incidence = {
    wavelengthUm: wl,
    thetaDeg: d.incidence.angleDeg,
    phiDeg: d.incidence.azimuthDeg,
    ...(polarization !== undefined ? { polarization } : {}),
  };
  // index of a material at the design wavelength, for quarter-wave films
  const realIndex = (m: string, lambda: number): Complex => resolveIndex(library, m, lambda, true).index;

  let geometry: GeometryLayer[];
  let slices: number | null = null;
  let depthUm: number | null = null;
  const notes: string[] = [];
  const usesBuilt = d.grating !== undefined || d.above !== undefined || d.below !== undefined;
  if (d.layers !== undefined && usesBuilt) {
    throw new InputError('layers', 'give either raw "layers" or "grating" (with optional "above"/"below" stacks), not both');
  }
  if (d.layers !== undefined) {
    geometry = d.layers.map((l, i) => rawLayer(l as RawLayer, `layers[${i}]`));
  } else {
    let grating: ProfileResult | undefined;
    if (d.grating) {
      grating = buildGrating(d.grating, { periodUm, cover, substrate, slices: d.grating.slices ?? d.slices, slicing: d.grating.slicing ?? d.slicing });
      slices = grating.slices;
      depthUm = grating.depthUm;
      notes.push(...grating.notes);
    }
    const above = d.above ? under('above', () => thinFilmStack(stackParams(d.above!, 'above', realIndex))) : undefined;
    const below = d.below ? under('below', () => thinFilmStack(stackParams(d.below!, 'below', realIndex))) : undefined;
    if (above) notes.push(...above.notes.map((n) => `above: ${n}`));
    if (below) notes.push(...below.notes.map((n) => `below: ${n}`));
    geometry = compose({ ...(above ? { above } : {}), ...(grating ? { grating } : {}), ...(below ? { below } : {}) });
  }
  return {
    title: d.title ?? 'untitled design',
    periodUm,
    cover,
    substrate,
    geometry,
    library,
    incidence,
    orders: d.orders,
    factorization: d.factorization,
    allowExtrapolation: d.allowExtrapolation,
    allowGain: d.allowGain,
    slices,
    depthUm,
    notes,
  };
}

/**
 * The solver problem at a wavelength (default: the design's), with materials resolved there.
 * @throws {InputError} for a material outside its range (unless extrapolation is allowed) or a
 *   gain medium without `allowGain`.
 */
export function problemAt(model: DesignModel, wavelengthUm: number = model.incidence.wavelengthUm, overrides: Partial<Incidence> = {}): Problem {
  const warnings: string[] = [];
  const materialNotes: string[] = [];
  const cache = new Map<string, Complex>();
  const indexOf = (m: string, path: string): Complex => {
    let v = cache.get(m);
    if (v === undefined) {
      const r = under(path, () => resolveIndex(model.library, m, wavelengthUm, model.allowExtrapolation));
      warnings.push(...r.warnings);
      materialNotes.push(...r.notes.map((n) => `${m}: ${n}`));
      v = r.index;
      if (v.im < 0 && !model.allowGain) {
        throw new InputError(path, `material '${m}' has κ = ${v.im} < 0 (gain) at ${wavelengthUm} µm; set "allowGain": true if a gain medium is intended`);
      }
      cache.set(m, v);
    }
    return v;
  };
  const cover = indexOf(model.cover, 'cover');
  if (cover.im !== 0) throw new InputError('cover', `the cover must be lossless (κ = 0) so the incident wave is defined; '${model.cover}' has κ = ${cover.im}`);
  const substrate = indexOf(model.substrate, 'substrate');
  const harmonics = 2 * model.orders;
  const layers = toSolverLayers(model.geometry, (m) => indexOf(m, 'layers'), harmonics);
  const incidence: Incidence = { ...model.incidence, wavelengthUm, ...overrides };
  warnings.push(...orderWarnings(model, cover.re, substrate.re, incidence));
  return {
    title: model.title,
    structure: { periodUm: model.periodUm, cover, substrate, layers },
    incidence,
    options: { orders: model.orders, factorization: model.factorization, ...(model.allowGain ? { allowGain: true } : {}) },
    warnings: [...new Set(warnings)],
    materials: [...cache.entries()].map(([name, index]) => ({ name, index })),
    notes: [...model.notes, ...new Set(materialNotes), ...(model.slices !== null ? [`profile sliced into ${model.slices} layer${model.slices === 1 ? '' : 's'}`] : [])],
  };
}

/** Warn when the retained orders cannot represent the propagating ones well. */
function orderWarnings(model: DesignModel, nCover: number, nSub: number, inc: Incidence): string[] {
  const t = (inc.thetaDeg * Math.PI) / 180;
  const p = ((inc.phiDeg ?? 0) * Math.PI) / 180;
  const a0 = nCover * Math.sin(t) * Math.cos(p);
  const b = nCover * Math.sin(t) * Math.sin(p);
  const K = inc.wavelengthUm / model.periodUm;
  const n = Math.max(nCover, nSub);
  // largest |m| with (a0 + mK)² + b² < n² in either medium
  const reach = Math.sqrt(Math.max(0, n * n - b * b));
  const mHi = Math.floor((reach - a0) / K);
  const mLo = Math.ceil((-reach - a0) / K);
  const needed = Math.max(Math.abs(mHi), Math.abs(mLo));
  const count = mHi - mLo + 1;
  const M = model.orders;
  if (M < needed) {
    return [`orders: ${count} orders propagate (m = ${mLo}…${mHi}) but only −${M}…${M} are retained, so some propagating orders are missing; use "orders" ≥ ${needed + 10}`];
  }
  if (M < needed + 5) {
    return [`orders: only ${M - needed} evanescent orders retained beyond the ${count} propagating ones; results may not be converged — try "orders" ≥ ${needed + 10} and compare`];
  }
  return [];
}

interface ResolvedIndex {
  index: Complex;
  warnings: string[];
  /** standing caveats of the entry, e.g. which index of a uniaxial crystal is used */
  notes: string[];
}

/** A literal index or a library material at λ. */
function resolveIndex(lib: MaterialLibrary, ref: string, wavelengthUm: number, allowExtrapolation: boolean): ResolvedIndex {
  const lit = parseIndexLiteral(ref);
  if (lit) return { index: lit, warnings: [], notes: [] };
  const e = lib.evaluate(ref, wavelengthUm, { allowExtrapolation });
  return { index: e.index, warnings: [...e.warnings], notes: [...e.notes] };
}

const LITERAL = /^\s*([+-]?\d*\.?\d+(?:[eE][+-]?\d+)?)\s*(?:([+-])\s*(\d*\.?\d+(?:[eE][+-]?\d+)?)\s*[ij])?\s*$/;

/** "1.5" → 1.5 + 0i, "0.22+6.71i" → 0.22 + 6.71i; null when the text is not a number. */
export function parseIndexLiteral(text: string): Complex | null {
  const m = LITERAL.exec(text);
  if (!m) return null;
  return { re: Number(m[1]), im: m[3] ? (m[2] === '-' ? -1 : 1) * Number(m[3]) : 0 };
}

/** Normalize a material reference to a string: a literal index text or a material name. */
function materialRef(v: z.infer<typeof MaterialRefSchema>, path: string): string {
  if (typeof v === 'number') {
    if (!(v > 0) || !Number.isFinite(v)) throw new InputError(path, `expected an index n > 0, found ${v}`);
    return String(v);
  }
  if (typeof v === 'string') {
    const t = v.trim();
    if (t.length === 0) throw new InputError(path, 'expected a material name or an index such as 1.5 or "0.22+6.71i", found an empty text');
    const lit = parseIndexLiteral(t);
    if (lit && !(lit.re > 0 || lit.im > 0)) throw new InputError(path, `expected a non-zero index, found "${v}"`);
    return t;
  }
  if (!Number.isFinite(v.n) || !Number.isFinite(v.k)) throw new InputError(path, `expected finite n and k, found ${JSON.stringify(v)}`);
  return `${v.n}${v.k < 0 ? '-' : '+'}${Math.abs(v.k)}i`;
}

/** Kept for callers that want a literal index only. */
export function parseIndex(v: z.infer<typeof MaterialRefSchema>, path: string): Complex {
  const ref = materialRef(v, path);
  const c = parseIndexLiteral(ref);
  if (!c) throw new InputError(path, `expected an index like 1.5, "0.22+6.71i" or {"n": 0.22, "k": 6.71}, found "${ref}"`);
  if (c.im < 0) throw new InputError(path, `k must be ≥ 0 (absorption, exp(−iωt) convention), found ${c.im}; set "allowGain": true for a gain medium`);
  return c;
}

function densityToPeriod(perMm: number | undefined): number | undefined {
  if (perMm === undefined) return undefined;
  if (!(perMm > 0) || !Number.isFinite(perMm)) throw new InputError('grooveDensityPerMm', `expected lines per mm > 0, found ${perMm}`);
  return 1000 / perMm;
}

/** A length given as `name` (text with unit) or `nameNm` / `nameUm` (numbers); at most one. */
export function pickLength(obj: object, name: string, path: string): number | undefined {
  const o = obj as Record<string, unknown>;
  const at = (k: string): string => (path ? `${path}.${k}` : k);
  const found: Array<[string, number]> = [];
  const text = o[name];
  if (typeof text === 'string') found.push([name, lengthUm(text, at(name))]);
  for (const [suffix, f] of [['Nm', 1e-3], ['Um', 1]] as const) {
    const v = o[name + suffix];
    if (typeof v === 'number') {
      if (!Number.isFinite(v)) throw new InputError(at(name + suffix), `expected a finite number, found ${v}`);
      found.push([name + suffix, v * f]);
    }
  }
  if (found.length > 1) throw new InputError(at(name), `given twice (${found.map((x) => x[0]).join(' and ')}): keep one`);
  return found[0]?.[1];
}

function requireLength(obj: object, name: string, path: string, what = 'a length'): number {
  const v = pickLength(obj, name, path);
  if (v === undefined) throw new InputError(`${path}.${name}`, `missing: give ${what} such as "${name}": "350 nm" or "${name}Nm": 350`);
  return v;
}

function positive(v: number, path: string, what: string): number {
  if (!(v > 0)) throw new InputError(path, `expected ${what} > 0, found ${+(v * 1000).toPrecision(10)} nm; give a positive length like "350 nm"`);
  return v;
}

interface RawLayer {
  thickness?: string;
  thicknessNm?: number;
  thicknessUm?: number;
  index?: z.infer<typeof MaterialRefSchema>;
  material?: z.infer<typeof MaterialRefSchema>;
  segments?: Array<{ width?: number; from?: number; to?: number; index?: z.infer<typeof MaterialRefSchema>; material?: z.infer<typeof MaterialRefSchema> }>;
}

function rawLayer(l: RawLayer, path: string): GeometryLayer {
  const t = pickLength(l, 'thickness', path);
  if (t === undefined) throw new InputError(`${path}.thickness`, 'missing: give "thickness": "100 nm" or "thicknessNm": 100');
  if (!(t >= 0)) throw new InputError(`${path}.thickness`, `expected a thickness ≥ 0, found ${t * 1000} nm`);
  const film = l.index ?? l.material;
  if (l.index !== undefined && l.material !== undefined) throw new InputError(path, 'give "material" or "index", not both');
  if ((film === undefined) === (l.segments === undefined)) {
    throw new InputError(path, 'give either "index"/"material" (a uniform film) or "segments" (a lamellar profile), not both or neither');
  }
  if (film !== undefined) return { kind: 'uniform', thicknessUm: t, material: materialRef(film, `${path}.index`) };
  const segs = l.segments!;
  const byWidth = segs.every((s) => s.width !== undefined && s.from === undefined && s.to === undefined);
  const byRange = segs.every((s) => s.width === undefined && s.from !== undefined && s.to !== undefined);
  if (!byWidth && !byRange) throw new InputError(`${path}.segments`, 'give every segment a "width", or every segment "from" and "to" (fractions of the period)');
  const out: Array<{ from: number; to: number; material: string }> = [];
  if (byWidth) {
    segs.forEach((s, j) => {
      if (!(s.width! > 0)) throw new InputError(`${path}.segments[${j}].width`, `expected a fraction of the period > 0, found ${s.width}`);
    });
    const total = segs.reduce((s, x) => s + x.width!, 0);
    if (Math.abs(total - 1) > 1e-9) throw new InputError(`${path}.segments`, `segment widths are fractions of the period and must add up to 1; they add up to ${total}`);
    let at = 0;
    segs.forEach((s, j) => {
      const from = at;
      at = j === segs.length - 1 ? 1 : at + s.width!;
      out.push({ from, to: at, material: segMaterial(s, `${path}.segments[${j}]`) });
    });
  } else {
    const sorted = segs.map((s, j) => ({ s, j })).sort((a, b) => a.s.from! - b.s.from!);
    let at = 0;
    for (const { s, j } of sorted) {
      const p = `${path}.segments[${j}]`;
      if (!(s.from! >= 0 && s.to! <= 1 && s.to! > s.from!)) throw new InputError(p, `expected 0 ≤ from < to ≤ 1 (fractions of the period), found from ${s.from}, to ${s.to}`);
      if (s.from! < at - 1e-12) throw new InputError(p, `overlaps the previous segment (which ends at ${at}); segments must not overlap`);
      if (s.from! > at + 1e-12) throw new InputError(p, `leaves a gap from ${at} to ${s.from}; segments must cover the whole period`);
      out.push({ from: s.from!, to: s.to!, material: segMaterial(s, p) });
      at = s.to!;
    }
    if (Math.abs(at - 1) > 1e-12) throw new InputError(`${path}.segments`, `segments end at ${at}; they must cover the period up to 1`);
  }
  return { kind: 'segments', thicknessUm: t, segments: out };
}

function segMaterial(s: { index?: z.infer<typeof MaterialRefSchema>; material?: z.infer<typeof MaterialRefSchema> }, path: string): string {
  if ((s.index === undefined) === (s.material === undefined)) throw new InputError(path, 'give the segment one "material" (or "index")');
  return materialRef((s.index ?? s.material)!, `${path}.material`);
}

function stackParams(s: z.infer<typeof StackSchema>, path: string, indexOf: (m: string, l: number) => Complex): Parameters<typeof thinFilmStack>[0] {
  const design = pickLength(s, 'designWavelength', path);
  const films = s.films.map((f, i) => {
    const p = `${path}.films[${i}]`;
    const material = materialRef(f.material, `${p}.material`);
    const t = pickLength(f, 'thickness', p);
    if ((t === undefined) === (f.quarterWaves === undefined)) throw new InputError(p, 'give a "thickness" or "quarterWaves", exactly one');
    if (t !== undefined) return { material, thicknessUm: positive(t, `${p}.thickness`, 'a thickness') };
    if (design === undefined) throw new InputError(`${path}.designWavelength`, 'missing: quarter-wave films need "designWavelength": "550 nm"');
    return { material, quarterWaves: f.quarterWaves! };
  });
  return { films, repeat: s.repeat, ...(design !== undefined ? { designWavelengthUm: design, indexOf } : {}) };
}

interface GratingContext {
  periodUm: number;
  cover: string;
  substrate: string;
  slices: number;
  slicing: 'uniform' | 'adaptive';
}

function buildGrating(g: z.infer<typeof GratingSchema>, c: GratingContext): ProfileResult {
  const path = 'grating';
  const base = {
    periodUm: c.periodUm,
    ridgeMaterial: g.ridge !== undefined ? materialRef(g.ridge, `${path}.ridge`) : c.substrate,
    grooveMaterial: g.groove !== undefined ? materialRef(g.groove, `${path}.groove`) : c.cover,
    slices: c.slices,
    strategy: c.slicing,
  };
  const profile = under(path, (): ProfileResult => {
    switch (g.profile) {
      case 'lamellar':
        return lamellar({ ...base, duty: g.duty, depthUm: positive(requireLength(g, 'depth', path), `${path}.depth`, 'a depth'), ...(g.offset !== undefined ? { offset: g.offset } : {}), ...(g.slantDeg !== undefined ? { slantDeg: g.slantDeg } : {}) });
      case 'trapezoid': {
        const depthUm = positive(requireLength(g, 'depth', path), `${path}.depth`, 'a depth');
        const bottom = pickLength(g, 'bottomWidth', path);
        const top = pickLength(g, 'topWidth', path);
        if (bottom !== undefined || top !== undefined) {
          if (bottom === undefined || top === undefined) throw new InputError(path, 'give both "bottomWidth" and "topWidth", or "duty" and "sidewallDeg"');
          return trapezoid({ ...base, depthUm, bottomWidthUm: bottom, topWidthUm: top });
        }
        if (g.duty === undefined || g.sidewallDeg === undefined) throw new InputError(path, 'give "duty" (at mid-height) and "sidewallDeg", or "bottomWidth" and "topWidth"');
        return trapezoid({ ...base, depthUm, duty: g.duty, sidewallDeg: g.sidewallDeg });
      }
      case 'sawtooth':
        return sawtooth({ ...base, blazeDeg: g.blazeDeg, ...(g.apexDeg !== undefined ? { apexDeg: g.apexDeg } : {}) });
      case 'triangle': {
        const depth = pickLength(g, 'depth', path);
        if ((depth === undefined) === (g.apexDeg === undefined)) throw new InputError(path, 'give the triangle a "depth" or an "apexDeg", exactly one');
        return depth !== undefined ? symmetricTriangle({ ...base, depthUm: positive(depth, `${path}.depth`, 'a depth') }) : symmetricTriangle({ ...base, apexDeg: g.apexDeg! });
      }
      case 'sinusoidal':
        return sinusoid({ ...base, depthUm: positive(requireLength(g, 'depth', path), `${path}.depth`, 'a depth') });
      case 'multilevel':
        return multiLevel({ periodUm: base.periodUm, ridgeMaterial: base.ridgeMaterial, grooveMaterial: base.grooveMaterial, steps: g.steps, blazeDepthUm: positive(requireLength(g, 'depth', path), `${path}.depth`, 'a depth') });
      case 'volume': {
        const thicknessUm = positive(requireLength(g, 'thickness', path), `${path}.thickness`, 'a thickness');
        if ((g.deltaN === undefined) === (g.deltaEps === undefined)) throw new InputError(path, 'give the modulation as "deltaN" or "deltaEps", exactly one');
        const common = { periodUm: base.periodUm, thicknessUm, material: base.ridgeMaterial, slices: base.slices, ...(g.slantDeg !== undefined ? { slantDeg: g.slantDeg } : {}) };
        if (g.deltaEps !== undefined) return volumeGrating({ ...common, deltaEps: g.deltaEps });
        const n0 = parseIndexLiteral(base.ridgeMaterial);
        if (!n0) throw new InputError(`${path}.ridge`, 'a volume grating given by "deltaN" needs its base index as a number (e.g. "ridge": 1.5); or give "deltaEps"');
        return volumeGrating({ ...common, deltaN: g.deltaN!, n0: n0.re });
      }
      case 'table':
        return profileFromTable({ ...base, points: g.points.map(([x, h]) => [x, g.heightUnit === 'nm' ? h / 1000 : h] as [number, number]) });
      case 'expression':
        return profileFromExpression({ ...base, expression: g.heightUnit === 'nm' ? `(${g.expression}) / 1000` : g.expression });
    }
  });
  if (!g.coating) return profile;
  const coat = g.coating;
  const t = positive(requireLength(coat, 'thickness', `${path}.coating`), `${path}.coating.thickness`, 'a coating thickness');
  const material = materialRef(coat.material, `${path}.coating.material`);
  return under(`${path}.coating`, () =>
    coat.mode === 'filled' ? filledCoating(profile, { material, thicknessUm: t }) : conformalCoating(profile, { material, thicknessUm: t, slices: c.slices, strategy: c.slicing }),
  );
}
