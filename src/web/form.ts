/**
 * The design editor's form: the common fields of a design file, read from and written into the
 * design object. The JSON text stays the source of truth; the form is a view of it that writes
 * edits back in the spelling the file already uses (`depth` text, `depthNm` or `depthUm`).
 */
import { pickLength } from '../design/index.ts';

type Obj = Record<string, unknown>;

export interface FieldDef {
  readonly id: string;
  readonly label: string;
  readonly unit?: string;
  readonly kind: 'number' | 'text' | 'select';
  readonly options?: ReadonlyArray<readonly [string, string]>;
  readonly step?: string;
  readonly placeholder?: string;
  readonly title?: string;
  readonly group: 'design' | 'grating' | 'coating' | 'incidence' | 'numerics';
  /** field paths of the design whose errors are shown under this field */
  readonly paths: ReadonlyArray<string>;
  show(d: Obj): boolean;
  get(d: Obj): string;
  set(d: Obj, v: string): void;
}

const isObj = (v: unknown): v is Obj => typeof v === 'object' && v !== null && !Array.isArray(v);

/** A number shown in a form field: up to 6 significant digits, no trailing zeros. */
export function shortNumber(v: number): string {
  if (!Number.isFinite(v)) return '';
  return String(Number(v.toPrecision(6)));
}

function child(d: Obj, key: string, create = false): Obj | null {
  const v = d[key];
  if (isObj(v)) return v;
  if (!create) return null;
  const o: Obj = {};
  d[key] = o;
  return o;
}

/** Length of `name` in nm as form text ('' when absent or unreadable). */
function lengthNm(o: Obj | null, name: string): string {
  if (!o) return '';
  try {
    const um = pickLength(o, name, '');
    return um === undefined ? '' : shortNumber(um * 1000);
  } catch {
    const t = o[name];
    return typeof t === 'string' ? t : '';
  }
}

/** Write a length given in nm, in the spelling the object already uses; '' removes it. */
function setLengthNm(o: Obj, name: string, text: string): void {
  const t = text.trim();
  const has = (k: string): boolean => o[k] !== undefined;
  if (t === '') {
    delete o[name];
    delete o[`${name}Nm`];
    delete o[`${name}Um`];
    return;
  }
  const n = Number(t);
  if (has(`${name}Nm`) && Number.isFinite(n)) o[`${name}Nm`] = n;
  else if (has(`${name}Um`) && Number.isFinite(n)) o[`${name}Um`] = Number((n / 1000).toPrecision(12));
  else {
    delete o[`${name}Nm`];
    delete o[`${name}Um`];
    o[name] = `${t} nm`;
  }
}

/** A number field of an object: '' removes it; text that is not a number is kept as text so the check names it. */
function setNumber(o: Obj, key: string, text: string): void {
  const t = text.trim();
  if (t === '') delete o[key];
  else o[key] = Number.isFinite(Number(t)) ? Number(t) : t;
}

/** A material reference as form text. */
function materialText(v: unknown): string {
  if (v === undefined) return '';
  if (typeof v === 'number') return String(v);
  if (typeof v === 'string') return v;
  if (isObj(v) && typeof v['n'] === 'number') return `${v['n']}${Number(v['k'] ?? 0) < 0 ? '-' : '+'}${Math.abs(Number(v['k'] ?? 0))}i`;
  return JSON.stringify(v);
}

function setMaterial(o: Obj, key: string, text: string): void {
  const t = text.trim();
  if (t === '') delete o[key];
  else o[key] = t;
}

export const PROFILES = ['lamellar', 'trapezoid', 'sawtooth', 'triangle', 'sinusoidal', 'multilevel', 'volume', 'table', 'expression'] as const;
export type ProfileKind = (typeof PROFILES)[number];

const profileOf = (d: Obj): string => {
  if (Array.isArray(d['layers'])) return 'layers';
  const g = child(d, 'grating');
  return g && typeof g['profile'] === 'string' ? g['profile'] : 'none';
};

const isProfile =
  (...kinds: string[]) =>
  (d: Obj): boolean =>
    kinds.includes(profileOf(d));

/** The grating object for a newly chosen profile kind: the shared fields kept, its own given sensible starting values. */
export function switchProfile(d: Obj, kind: string): void {
  if (kind === profileOf(d)) return;
  if (kind === 'none') {
    delete d['grating'];
    return;
  }
  const old = child(d, 'grating') ?? {};
  const depthNm = Number(lengthNm(old, 'depth')) || 100;
  const keep: Obj = {};
  for (const k of ['ridge', 'groove', 'slices', 'slicing', 'coating']) if (old[k] !== undefined) keep[k] = old[k];
  const depth = `${depthNm} nm`;
  const own: Record<ProfileKind, Obj> = {
    lamellar: { duty: 0.5, depth },
    trapezoid: { depth, duty: 0.5, sidewallDeg: 80 },
    sawtooth: { blazeDeg: 10 },
    triangle: { depth },
    sinusoidal: { depth },
    multilevel: { steps: 4, depth },
    volume: { thickness: '10 um', deltaN: 0.02, ridge: 1.5 },
    table: { points: [[0, 0], [0.25, depthNm], [0.5, depthNm], [0.75, 0], [1, 0]], heightUnit: 'nm' },
    expression: { expression: `${depthNm / 2}*(1 + sin(2*pi*x))`, heightUnit: 'nm' },
  };
  delete d['layers'];
  const g: Obj = { profile: kind, ...own[kind as ProfileKind], ...keep };
  if (kind === 'volume') delete g['coating'];
  // keep the grating where it was in the file's key order
  d['grating'] = g;
}

/** The form's fields, in display order. */
export const FIELDS: ReadonlyArray<FieldDef> = [
  {
    id: 'title',
    label: 'Title',
    kind: 'text',
    group: 'design',
    paths: ['title'],
    show: () => true,
    get: (d) => (typeof d['title'] === 'string' ? d['title'] : ''),
    set: (d, v) => (v.trim() === '' ? delete d['title'] : (d['title'] = v)),
  },
  {
    id: 'density',
    label: 'Groove density',
    unit: 'lines/mm',
    kind: 'number',
    step: 'any',
    group: 'design',
    paths: ['grooveDensityPerMm'],
    title: 'grooves per millimetre; sets the period Λ = 1/density',
    show: () => true,
    get: (d) => {
      if (typeof d['grooveDensityPerMm'] === 'number') return shortNumber(d['grooveDensityPerMm']);
      const nm = Number(lengthNm(d, 'period'));
      return nm > 0 ? shortNumber(1e6 / nm) : '';
    },
    set: (d, v) => {
      for (const k of ['period', 'periodNm', 'periodUm']) delete d[k];
      setNumber(d, 'grooveDensityPerMm', v);
    },
  },
  {
    id: 'period',
    label: 'Period Λ',
    unit: 'nm',
    kind: 'number',
    step: 'any',
    group: 'design',
    paths: ['period', 'periodNm', 'periodUm'],
    show: () => true,
    get: (d) => {
      const t = lengthNm(d, 'period');
      if (t !== '') return t;
      const g = d['grooveDensityPerMm'];
      return typeof g === 'number' && g > 0 ? shortNumber(1e6 / g) : '';
    },
    set: (d, v) => {
      delete d['grooveDensityPerMm'];
      setLengthNm(d, 'period', v);
    },
  },
  {
    id: 'cover',
    label: 'Cover',
    kind: 'text',
    group: 'design',
    paths: ['cover'],
    placeholder: 'air',
    title: 'material above the grating: a library name, or an index such as 1.33',
    show: () => true,
    get: (d) => materialText(d['cover']),
    set: (d, v) => setMaterial(d, 'cover', v),
  },
  {
    id: 'substrate',
    label: 'Substrate',
    kind: 'text',
    group: 'design',
    paths: ['substrate'],
    title: 'material below the grating: a library name, or an index such as 1.5 or 0.2+3.3i',
    show: () => true,
    get: (d) => materialText(d['substrate']),
    set: (d, v) => setMaterial(d, 'substrate', v),
  },
  {
    id: 'profile',
    label: 'Profile',
    kind: 'select',
    options: [['none', '(flat: no grating)'], ...PROFILES.map((p) => [p, p] as const), ['layers', 'raw layers (edit in JSON)']],
    group: 'grating',
    paths: ['grating.profile', 'grating', 'layers'],
    show: () => true,
    get: (d) => profileOf(d),
    set: (d, v) => (v === 'layers' ? undefined : switchProfile(d, v)),
  },
  lengthField('depth', 'Depth', ['lamellar', 'trapezoid', 'triangle', 'sinusoidal', 'multilevel']),
  lengthField('thickness', 'Thickness', ['volume']),
  numberField('duty', 'Duty cycle', '', ['lamellar', 'trapezoid'], 'ridge width over the period, 0…1 (at mid-height for a trapezoid)', '0.01'),
  numberField('blazeDeg', 'Blaze angle θB', 'deg', ['sawtooth'], 'facet angle from the grating plane; the depth follows from it', '0.1'),
  numberField('apexDeg', 'Apex angle', 'deg', ['sawtooth', 'triangle'], 'angle at the groove apex (default 90° for a sawtooth)', '0.1', '90'),
  numberField('sidewallDeg', 'Sidewall angle', 'deg', ['trapezoid'], 'sidewall angle from the grating plane', '0.1'),
  numberField('slantDeg', 'Slant angle', 'deg', ['lamellar', 'volume'], 'tilt of the ridges (or fringes) from the normal', '0.1', '0'),
  numberField('steps', 'Steps', '', ['multilevel'], 'number of levels of the staircase', '1'),
  numberField('deltaN', 'Index modulation Δn', '', ['volume'], 'amplitude of the cosine index modulation', '0.001'),
  {
    id: 'expression',
    label: 'Height h(x)',
    unit: 'nm',
    kind: 'text',
    group: 'grating',
    paths: ['grating.expression'],
    title: 'height as an expression in x, the position as a fraction of the period (0…1)',
    show: isProfile('expression'),
    get: (d) => String(child(d, 'grating')?.['expression'] ?? ''),
    set: (d, v) => {
      const g = child(d, 'grating', true)!;
      g['expression'] = v;
      g['heightUnit'] = 'nm';
    },
  },
  {
    id: 'ridge',
    label: 'Ridge material',
    kind: 'text',
    group: 'grating',
    paths: ['grating.ridge'],
    placeholder: 'substrate',
    show: isProfile(...PROFILES),
    get: (d) => materialText(child(d, 'grating')?.['ridge']),
    set: (d, v) => setMaterial(child(d, 'grating', true)!, 'ridge', v),
  },
  {
    id: 'coatingMaterial',
    label: 'Coating',
    kind: 'text',
    group: 'coating',
    paths: ['grating.coating.material', 'grating.coating'],
    placeholder: 'none',
    title: 'coating material (e.g. Al-LD, Au-LD); empty for none',
    show: isProfile(...PROFILES.filter((p) => p !== 'volume')),
    get: (d) => materialText(child(child(d, 'grating') ?? {}, 'coating')?.['material']),
    set: (d, v) => {
      const g = child(d, 'grating', true)!;
      if (v.trim() === '') {
        delete g['coating'];
        return;
      }
      const c = child(g, 'coating');
      if (c) c['material'] = v.trim();
      else g['coating'] = { material: v.trim(), thickness: '50 nm', mode: 'conformal' };
    },
  },
  {
    id: 'coatingThickness',
    label: 'Coating thickness',
    unit: 'nm',
    kind: 'number',
    step: 'any',
    group: 'coating',
    paths: ['grating.coating.thickness', 'grating.coating.thicknessNm', 'grating.coating.thicknessUm'],
    show: (d) => child(child(d, 'grating') ?? {}, 'coating') !== null,
    get: (d) => lengthNm(child(child(d, 'grating') ?? {}, 'coating'), 'thickness'),
    set: (d, v) => setLengthNm(child(child(d, 'grating', true)!, 'coating', true)!, 'thickness', v),
  },
  {
    id: 'coatingMode',
    label: 'Coating mode',
    kind: 'select',
    options: [
      ['conformal', 'conformal (follows the surface)'],
      ['filled', 'filled (flat top)'],
    ],
    group: 'coating',
    paths: ['grating.coating.mode'],
    show: (d) => child(child(d, 'grating') ?? {}, 'coating') !== null,
    get: (d) => String(child(child(d, 'grating') ?? {}, 'coating')?.['mode'] ?? 'conformal'),
    set: (d, v) => {
      child(child(d, 'grating', true)!, 'coating', true)!['mode'] = v;
    },
  },
  {
    id: 'wavelength',
    label: 'Wavelength λ',
    unit: 'nm',
    kind: 'number',
    step: 'any',
    group: 'incidence',
    paths: ['incidence.wavelength', 'incidence.wavelengthNm', 'incidence.wavelengthUm'],
    show: () => true,
    get: (d) => lengthNm(child(d, 'incidence'), 'wavelength'),
    set: (d, v) => setLengthNm(child(d, 'incidence', true)!, 'wavelength', v),
  },
  {
    id: 'angle',
    label: 'Angle of incidence θ',
    unit: 'deg',
    kind: 'number',
    step: '0.1',
    group: 'incidence',
    paths: ['incidence.angleDeg'],
    show: () => true,
    get: (d) => {
      const v = child(d, 'incidence')?.['angleDeg'];
      return v === undefined ? '' : String(v);
    },
    set: (d, v) => setNumber(child(d, 'incidence', true)!, 'angleDeg', v),
  },
  {
    id: 'azimuth',
    label: 'Azimuth φ',
    unit: 'deg',
    kind: 'number',
    step: '0.1',
    placeholder: '0',
    title: '0 is the classical mount; other values give conical incidence',
    group: 'incidence',
    paths: ['incidence.azimuthDeg'],
    show: () => true,
    get: (d) => {
      const v = child(d, 'incidence')?.['azimuthDeg'];
      return v === undefined ? '' : String(v);
    },
    set: (d, v) => setNumber(child(d, 'incidence', true)!, 'azimuthDeg', v),
  },
  {
    id: 'polarization',
    label: 'Polarization of interest',
    kind: 'select',
    options: [
      ['', 'TE and TM'],
      ['TE', 'TE'],
      ['TM', 'TM'],
      ['jones', 'Jones vector (in JSON)'],
    ],
    title: 'TE and TM are always computed; this adds the design\'s own polarization to the solve',
    group: 'incidence',
    paths: ['incidence.polarization'],
    show: () => true,
    get: (d) => {
      const p = child(d, 'incidence')?.['polarization'];
      return p === undefined ? '' : typeof p === 'string' ? p : 'jones';
    },
    set: (d, v) => {
      const inc = child(d, 'incidence', true)!;
      if (v === '') delete inc['polarization'];
      else if (v === 'TE' || v === 'TM') inc['polarization'] = v;
    },
  },
  {
    id: 'orders',
    label: 'Retained orders M',
    unit: '±',
    kind: 'number',
    step: '1',
    placeholder: '20',
    title: 'orders −M…M are kept in the computation',
    group: 'numerics',
    paths: ['orders'],
    show: () => true,
    get: (d) => (d['orders'] === undefined ? '' : String(d['orders'])),
    set: (d, v) => setNumber(d, 'orders', v),
  },
  {
    id: 'slices',
    label: 'Slices',
    kind: 'number',
    step: '1',
    placeholder: '20',
    title: 'staircase layers the profile is cut into',
    group: 'numerics',
    paths: ['slices', 'grating.slices'],
    show: () => true,
    get: (d) => {
      const g = child(d, 'grating')?.['slices'];
      const v = g ?? d['slices'];
      return v === undefined ? '' : String(v);
    },
    set: (d, v) => {
      const g = child(d, 'grating');
      if (g && g['slices'] !== undefined) setNumber(g, 'slices', v);
      else setNumber(d, 'slices', v);
    },
  },
];

function lengthField(name: string, label: string, kinds: string[]): FieldDef {
  return {
    id: name,
    label,
    unit: 'nm',
    kind: 'number',
    step: 'any',
    group: 'grating',
    paths: [`grating.${name}`, `grating.${name}Nm`, `grating.${name}Um`],
    show: isProfile(...kinds),
    get: (d) => lengthNm(child(d, 'grating'), name),
    set: (d, v) => setLengthNm(child(d, 'grating', true)!, name, v),
  };
}

function numberField(key: string, label: string, unit: string, kinds: string[], title: string, step: string, placeholder?: string): FieldDef {
  return {
    id: key,
    label,
    ...(unit ? { unit } : {}),
    kind: 'number',
    step,
    ...(placeholder !== undefined ? { placeholder } : {}),
    title,
    group: 'grating',
    paths: [`grating.${key}`],
    show: isProfile(...kinds),
    get: (d) => {
      const v = child(d, 'grating')?.[key];
      return v === undefined ? '' : String(v);
    },
    set: (d, v) => setNumber(child(d, 'grating', true)!, key, v),
  };
}

/**
 * Messages by field: each error goes to the visible field whose path is the longest match (the
 * same path, or one the error's path lies under); errors no visible field claims are returned apart.
 */
export function assignErrors(fields: ReadonlyArray<FieldDef>, errors: ReadonlyMap<string, string>): { byField: Map<string, string[]>; unclaimed: string[] } {
  const byField = new Map<string, string[]>();
  const unclaimed: string[] = [];
  for (const [path, msg] of errors) {
    let best: FieldDef | null = null;
    let bestLen = -1;
    for (const f of fields) {
      for (const p of f.paths) {
        const hit = path === p || path.startsWith(`${p}.`) || path.startsWith(`${p}[`);
        if (hit && p.length > bestLen) {
          best = f;
          bestLen = p.length;
        }
      }
    }
    if (best) byField.set(best.id, [...(byField.get(best.id) ?? []), msg]);
    else unclaimed.push(msg);
  }
  return { byField, unclaimed };
}
