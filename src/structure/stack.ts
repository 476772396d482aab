/**
 * Thin-film stacks: a list of films, optionally repeated (N × (H, L) is films [H, L] with
 * repeat N), top (cover side) first, emitted as 'uniform' layers. Thicknesses are lengths or
 * quarter-waves at a design wavelength λ0: q quarter-waves of a film of index n (real part at
 * λ0) are q·λ0/(4n) thick, an optical thickness of q·λ0/4 (definition). Place a stack above or
 * below a grating with `compose`.
 */
import type { Complex } from '../solver/index.ts';
import type { GeometryLayer, StackResult } from './types.ts';
import { fail, integerAtLeast, material, num, positiveLength, record } from './validate.ts';

export type FilmSpec =
  | { readonly material: string; /** physical thickness (µm) */ readonly thicknessUm: number; readonly quarterWaves?: undefined }
  | { readonly material: string; /** optical thickness in quarter-waves at the design wavelength */ readonly quarterWaves: number; readonly thicknessUm?: undefined };

export interface ThinFilmStackParams {
  /** films, top (cover side) first */
  readonly films: ReadonlyArray<FilmSpec>;
  /** how many times the list repeats (integer ≥ 1), default 1 */
  readonly repeat?: number;
  /** design wavelength λ0 (µm), needed for quarter-wave films */
  readonly designWavelengthUm?: number;
  /** index of a material at a wavelength (µm), needed for quarter-wave films; its real part is used */
  readonly indexOf?: (material: string, wavelengthUm: number) => Complex | number;
}

/**
 * Build a thin-film stack.
 * @param p films (thickness in µm or quarter-waves), repeat count, design wavelength (µm) and
 *   index callback for quarter-waves
 * @returns uniform layers top first, total thickness (µm), notes with resolved quarter-waves
 * @throws {StructureError} on an empty list, non-positive thicknesses or quarter-wave counts,
 *   both or neither of thicknessUm and quarterWaves in a film, a quarter-wave film without a
 *   design wavelength or index callback, an index whose real part is not > 0, repeat < 1
 * @example
 * // 8 × (H, L) quarter-wave mirror at 0.55 µm
 * thinFilmStack({ films: [{ material: 'TiO2', quarterWaves: 1 }, { material: 'SiO2', quarterWaves: 1 }], repeat: 8,
 *                 designWavelengthUm: 0.55, indexOf: (m) => (m === 'TiO2' ? 2.35 : 1.46) });
 */
export function thinFilmStack(p: ThinFilmStackParams): StackResult {
  const r = record('stack', p);
  if (!Array.isArray(r.films) || r.films.length === 0) fail('stack.films', 'a non-empty list of films', r.films);
  const repeat = r.repeat === undefined ? 1 : integerAtLeast('stack.repeat', r.repeat, 1);
  const notes: string[] = [];
  const resolved = new Map<string, number>();
  const films = (r.films as ReadonlyArray<Record<string, unknown>>).map((f, i) => {
    const field = `stack.films[${i}]`;
    const m = material(`${field}.material`, f?.material);
    if ((f.thicknessUm === undefined) === (f.quarterWaves === undefined)) {
      fail(field, 'exactly one of thicknessUm and quarterWaves', f.thicknessUm === undefined ? 'neither' : 'both');
    }
    if (f.thicknessUm !== undefined) return { material: m, t: positiveLength(`${field}.thicknessUm`, f.thicknessUm) };
    const q = f.quarterWaves;
    if (typeof q !== 'number' || !Number.isFinite(q) || !(q > 0)) fail(`${field}.quarterWaves`, 'a number of quarter-waves > 0', q);
    const lambda = positiveLength('stack.designWavelengthUm', r.designWavelengthUm);
    if (typeof r.indexOf !== 'function') fail('stack.indexOf', 'a function (material, wavelengthUm) → index, needed for quarter-wave films', r.indexOf);
    let n = resolved.get(m);
    if (n === undefined) {
      const v = (r.indexOf as (m: string, l: number) => Complex | number)(m, lambda);
      n = typeof v === 'number' ? v : v?.re;
      if (typeof n !== 'number' || !Number.isFinite(n) || !(n > 0)) fail(`stack.indexOf('${m}', ${lambda})`, 'an index with real part > 0', typeof v === 'number' ? v : v);
      resolved.set(m, n);
      notes.push(`${m}: n = ${num(n)} at λ0 = ${num(lambda)} µm, a quarter-wave is ${num(lambda / (4 * n))} µm`);
    }
    return { material: m, t: (q * lambda) / (4 * n) };
  });
  const layers: GeometryLayer[] = [];
  for (let k = 0; k < repeat; k++) for (const f of films) layers.push({ kind: 'uniform', thicknessUm: f.t, material: f.material });
  return { layers, thicknessUm: layers.reduce((s, l) => s + l.thicknessUm, 0), notes };
}
