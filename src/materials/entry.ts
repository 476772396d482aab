/** Build a material from a JSON model entry (validated with {@link MaterialEntrySchema}). */
import { cauchyMaterial } from './cauchy.ts';
import { constantMaterial } from './constant.ts';
import { drudeMaterial } from './drude.ts';
import { MaterialError } from './errors.ts';
import type { MaterialInfoInput } from './info.ts';
import { lorentzDrudeMaterial } from './lorentz-drude.ts';
import type { Material } from './material.ts';
import { MATERIAL_ENTRY_MODELS, MaterialEntrySchema } from './schema.ts';
import { sellmeierMaterial } from './sellmeier.ts';
import { tableMaterial } from './table.ts';

/**
 * Validate a JSON model entry and build its material (marked as a user material).
 * @param entry the parsed JSON object, e.g. `{"name": "my-TiO2", "model": "cauchy", "A": 2.2, "BUm2": 0.03, "rangeUm": [0.45, 1.2], "citation": "our fit"}`
 * @returns the material
 * @throws {MaterialError} 'invalid-data' naming each offending field, what is expected and what
 *   was found (and the entry's name when it has one)
 * @example
 * const m = materialFromEntry({ name: 'my-film', model: 'constant', n: 1.38 });
 * m.index(0.5); // {re: 1.38, im: 0}
 */
export function materialFromEntry(entry: unknown): Material {
  const name = typeof entry === 'object' && entry !== null && typeof (entry as { name?: unknown }).name === 'string' ? (entry as { name: string }).name : undefined;
  const model = typeof entry === 'object' && entry !== null ? (entry as { model?: unknown }).model : undefined;
  if (typeof entry !== 'object' || entry === null || Array.isArray(entry)) {
    throw new MaterialError('invalid-data', `a material entry must be a JSON object, found ${Array.isArray(entry) ? 'an array' : JSON.stringify(entry)}`, undefined);
  }
  if (!(MATERIAL_ENTRY_MODELS as readonly unknown[]).includes(model)) {
    throw new MaterialError('invalid-data', `model must be one of ${MATERIAL_ENTRY_MODELS.map((m) => `'${m}'`).join(', ')}, found ${JSON.stringify(model)}`, name, { path: 'model' });
  }
  const parsed = MaterialEntrySchema.safeParse(entry);
  if (!parsed.success) {
    const issues = parsed.error.issues.map((i) => `${i.path.length ? i.path.map((p) => (typeof p === 'number' ? `[${p}]` : `.${String(p)}`)).join('').replace(/^\./, '') : '(entry)'}: ${i.message}`);
    const first = parsed.error.issues[0]!.path.map(String).join('.');
    throw new MaterialError('invalid-data', issues.join('; '), name, { path: first });
  }
  const e = parsed.data;
  const info: Omit<MaterialInfoInput, 'validRangeUm'> = {
    id: e.name,
    citation: e.citation ?? 'user entry (no citation given)',
    notes: e.notes ?? [],
    fromMemory: e.fromMemory ?? false,
    user: true,
  };
  switch (e.model) {
    case 'constant':
      return constantMaterial({ n: e.n, k: e.k }, { ...info, validRangeUm: e.rangeUm ?? [0, Infinity] });
    case 'sellmeier':
      return sellmeierMaterial(
        { B: e.B, ...(e.A !== undefined ? { A: e.A } : {}), ...(e.CUm ? { CUm: e.CUm } : {}), ...(e.C2Um2 ? { C2Um2: e.C2Um2 } : {}) },
        { ...info, validRangeUm: e.rangeUm },
      );
    case 'cauchy':
      return cauchyMaterial(
        { A: e.A, ...(e.BUm2 !== undefined ? { BUm2: e.BUm2 } : {}), ...(e.CUm4 !== undefined ? { CUm4: e.CUm4 } : {}), ...(e.absorption ? { absorption: e.absorption } : {}) },
        { ...info, validRangeUm: e.rangeUm },
      );
    case 'drude':
      return drudeMaterial({ plasmaEv: e.plasmaEv, dampingEv: e.dampingEv, ...(e.epsInf !== undefined ? { epsInf: e.epsInf } : {}) }, { ...info, validRangeUm: e.rangeUm });
    case 'lorentz-drude':
      return lorentzDrudeMaterial({ plasmaEv: e.plasmaEv, f0: e.f0, gamma0Ev: e.gamma0Ev, oscillators: e.oscillators }, { ...info, validRangeUm: e.rangeUm });
    case 'table': {
      const x = e.wavelengthUm ?? e.wavelengthNm!.map((v) => v / 1000);
      return tableMaterial({ wavelengthUm: x, n: e.n, ...(e.k ? { k: e.k } : {}) }, { ...info, ...(e.rangeUm ? { validRangeUm: e.rangeUm } : {}) });
    }
  }
}
