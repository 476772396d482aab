/**
 * A material library: the built-in entries plus the user's own, looked up by name
 * case-insensitively. A user material overrides a built-in of the same name (as a coating
 * engineer's own measurement should). Uniaxial entries answer to 'id:o' and 'id:e'; the bare
 * 'id' is the ordinary index and its notes say so.
 */
import type { Complex } from '../solver/types.ts';
import { builtinMaterials, type BuiltinEntry } from './builtins.ts';
import { parseMaterialCsv, type CsvOptions } from './csv.ts';
import { materialFromEntry } from './entry.ts';
import { MaterialError } from './errors.ts';
import { checkInfo } from './info.ts';
import { evaluateMaterial, type EvaluateOptions, type Evaluation, type Material, type MaterialKind } from './material.ts';
import { suggestNames } from './suggest.ts';
import type { UniaxialMaterial } from './uniaxial.ts';

/** One row of {@link MaterialLibrary.list}. */
export interface MaterialListing {
  /** the name to use ('sapphire:e', 'Au-LD', a user's 'my-film') */
  readonly id: string;
  readonly kind: MaterialKind;
  /** µm; [0, ∞) for any wavelength */
  readonly validRangeUm: readonly [number, number];
  readonly citation: string;
  /** caveats: 'from memory', 'ordinary index of uniaxial sapphire …', 'coarse table …' */
  readonly notes: readonly string[];
  readonly fromMemory: boolean;
  readonly origin: 'built-in' | 'user';
  /** true for a built-in hidden by a user entry of the same name */
  readonly overridden: boolean;
}

/** Options of the {@link MaterialLibrary} constructor. */
export interface MaterialLibraryOptions {
  /** start with the built-in entries (default true) */
  readonly builtins?: boolean;
}

const AXIS = /^(.*):([oe])$/i;
const isUniaxial = (e: BuiltinEntry): e is UniaxialMaterial => e.kind === 'uniaxial';

/**
 * Built-in and user materials by name.
 * @example
 * const lib = new MaterialLibrary();
 * lib.indexAt('fused-silica', 0.6328);            // {re: 1.457018…, im: 0}
 * lib.evaluate('Au-LD', 15, { allowExtrapolation: true }).warnings; // ["material 'Au-LD': wavelength 15 µm is outside …"]
 * lib.addCsv('wavelength_nm,n,k\n400,1.47,0\n800,1.45,0\n', { name: 'my-film' });
 */
export class MaterialLibrary {
  readonly #builtins = new Map<string, BuiltinEntry>();
  readonly #users = new Map<string, Material | UniaxialMaterial>();

  constructor(options: MaterialLibraryOptions = {}) {
    if (options.builtins ?? true) for (const e of builtinMaterials()) this.#builtins.set(e.id.toLowerCase(), e);
  }

  /**
   * Add a user material (or a uniaxial pair); it replaces any user or built-in entry of the same
   * name, case-insensitively. A user entry named like a built-in uniaxial crystal also hides that
   * crystal's ':o' and ':e' names.
   * @returns the stored material, marked as a user material
   * @throws {MaterialError} 'invalid-data' for a name containing ':'
   * @example
   * lib.add(constantMaterial({ n: 1.38 }, { id: 'MgF2', citation: 'our coating', validRangeUm: [0.4, 1] }));
   */
  add(material: Material): Material;
  add(material: UniaxialMaterial): UniaxialMaterial;
  add(material: Material | UniaxialMaterial): Material | UniaxialMaterial {
    checkInfo({ id: material.id, citation: '', validRangeUm: [0, Infinity] });
    const mark = (m: Material): Material => Object.freeze({ ...m, user: true });
    const marked: Material | UniaxialMaterial =
      material.kind === 'uniaxial'
        ? Object.freeze({ ...material, ordinary: mark(material.ordinary), extraordinary: mark(material.extraordinary), isotropic: mark(material.isotropic) })
        : mark(material);
    this.#users.set(material.id.toLowerCase(), marked);
    return marked;
  }

  /**
   * Validate a JSON model entry (see `MaterialEntrySchema`) and add it.
   * @throws {MaterialError} 'invalid-data' naming the field
   * @example
   * lib.addEntry({ name: 'my-TiO2', model: 'cauchy', A: 2.2, BUm2: 0.03, rangeUm: [0.45, 1.2], citation: 'our fit' });
   */
  addEntry(entry: unknown): Material {
    return this.add(materialFromEntry(entry));
  }

  /**
   * Parse CSV text (wavelength, n, k; see `parseMaterialCsv`) and add it under `options.name`.
   * @throws {MaterialError} 'invalid-data' naming the line
   * @example
   * lib.addCsv(text, { name: 'my-film', citation: 'ellipsometry, run 12' });
   */
  addCsv(text: string, options: CsvOptions): Material {
    return this.add(parseMaterialCsv(text, options));
  }

  /** Every name {@link resolve} accepts, in listing order. */
  names(): string[] {
    return this.list().filter((l) => !l.overridden).map((l) => l.id);
  }

  /**
   * The material a name stands for (case-insensitive; surrounding spaces ignored). 'X:o' and 'X:e'
   * pick the axes of a uniaxial entry; 'X' alone is its ordinary index, with a note saying so.
   * @throws {MaterialError} 'unknown-material' with up to three suggestions, e.g. "unknown material
   *   'gold'; did you mean 'Au-LD' or 'Au-JC'? (furrow materials lists them)"; 'invalid-argument'
   *   for ':o' / ':e' on an isotropic entry
   * @example
   * lib.resolve('SAPPHIRE:E').id; // 'sapphire:e'
   */
  resolve(name: string): Material {
    const key = String(name).trim().toLowerCase();
    const direct = this.#users.get(key) ?? this.#builtins.get(key);
    if (direct) return direct.kind === 'uniaxial' ? direct.isotropic : direct;
    const axis = AXIS.exec(key);
    if (axis) {
      const base = this.#users.get(axis[1]!) ?? this.#builtins.get(axis[1]!);
      if (base) {
        if (base.kind !== 'uniaxial') {
          throw new MaterialError('invalid-argument', `'${base.id}' has a single (isotropic) index; the ':o' / ':e' suffixes apply to uniaxial crystals only`, name.trim());
        }
        return axis[2] === 'o' ? base.ordinary : base.extraordinary;
      }
    }
    throw this.#unknown(name);
  }

  /**
   * The uniaxial entry a name stands for ('sapphire', 'MgF2', or either axis name).
   * @throws {MaterialError} 'unknown-material' as {@link resolve}; 'invalid-argument' when the
   *   entry is isotropic
   * @example
   * lib.resolveUniaxial('sapphire').extraordinary.index(0.6328).re; // ≈ 1.757871
   */
  resolveUniaxial(name: string): UniaxialMaterial {
    const key = String(name).trim().toLowerCase();
    const baseKey = AXIS.exec(key)?.[1] ?? key;
    const e = this.#users.get(baseKey) ?? this.#builtins.get(baseKey);
    if (!e) throw this.#unknown(name);
    if (e.kind !== 'uniaxial') throw new MaterialError('invalid-argument', `'${e.id}' is isotropic, not a uniaxial crystal`, name.trim());
    return e;
  }

  /**
   * Evaluate a material by name at a vacuum wavelength, with its valid range enforced.
   * @param name material name (case-insensitive)
   * @param wavelengthUm vacuum wavelength, µm
   * @param options `{ allowExtrapolation: true }` to evaluate outside the valid range with a warning
   * @returns index, warnings (to carry into results) and notes
   * @throws {MaterialError} 'unknown-material'; 'out-of-range' (message names the material, λ and
   *   the range); 'invalid-argument' for λ ≤ 0 or non-finite; 'invalid-data' if the model fails there
   * @example
   * lib.evaluate('Au-LD', 0.6328).index; // ≈ {re: 0.31228, im: 3.14605}
   */
  evaluate(name: string, wavelengthUm: number, options: EvaluateOptions = {}): Evaluation {
    return evaluateMaterial(this.resolve(name), wavelengthUm, options);
  }

  /**
   * The index at a wavelength inside the valid range (a throwing convenience over {@link evaluate}).
   * @throws {MaterialError} as {@link evaluate}, and always outside the valid range
   * @example
   * lib.indexAt('Si3N4', 1.55).re; // ≈ 1.996280
   */
  indexAt(name: string, wavelengthUm: number): Complex {
    return this.evaluate(name, wavelengthUm).index;
  }

  /**
   * Every entry with its model, range, source and notes: user entries first (in the order added),
   * then built-ins (those hidden by a user entry flagged `overridden`). A uniaxial entry lists its
   * bare name (the ordinary index), then ':o' and ':e'.
   * @example
   * lib.list().filter((l) => l.fromMemory).map((l) => l.id);
   */
  list(): MaterialListing[] {
    const rows: MaterialListing[] = [];
    const add = (m: Material, origin: 'built-in' | 'user', overridden: boolean): void => {
      rows.push({ id: m.id, kind: m.kind, validRangeUm: m.validRangeUm, citation: m.citation, notes: m.notes, fromMemory: m.fromMemory, origin, overridden });
    };
    const expand = (e: BuiltinEntry): Material[] => (isUniaxial(e) ? [e.isotropic, e.ordinary, e.extraordinary] : [e]);
    for (const e of this.#users.values()) for (const m of expand(e)) add(m, 'user', false);
    for (const [key, e] of this.#builtins) for (const m of expand(e)) add(m, 'built-in', this.#users.has(key));
    return rows;
  }

  #unknown(name: string): MaterialError {
    const shown = String(name).trim();
    const suggestions = suggestNames(shown, this.names());
    const quoted = suggestions.map((s) => `'${s}'`);
    const hint = quoted.length === 0 ? '' : `; did you mean ${quoted.length === 1 ? quoted[0] : `${quoted.slice(0, -1).join(', ')} or ${quoted.at(-1)}`}?`;
    return new MaterialError('unknown-material', `unknown material '${shown}'${hint} (furrow materials lists them)`, shown, { suggestions }, false);
  }
}
