/**
 * Materials: dispersion models (constant, Sellmeier, Cauchy, Drude, Lorentz–Drude, tables), the
 * built-in library with citations and valid ranges, users' own materials from CSV text or JSON
 * model entries, and a library that resolves names and enforces valid ranges.
 *
 * Units: vacuum wavelength in µm; photon energies in eV (ω[eV] = 1.239842/λ[µm]). Conventions:
 * exp(−iωt), ñ = n + iκ with κ ≥ 0 absorbing, ε = ñ², ñ = √ε on the branch Im ñ ≥ 0.
 * No Node-only imports: CSV is parsed from text.
 */
export * from './errors.ts';
export * from './material.ts';
export type { MaterialInfoInput } from './info.ts';
export * from './photon.ts';
export * from './constant.ts';
export * from './sellmeier.ts';
export * from './cauchy.ts';
export * from './drude.ts';
export * from './lorentz-drude.ts';
export * from './table.ts';
export * from './uniaxial.ts';
export * from './length-unit.ts';
export * from './csv.ts';
export * from './csv-write.ts';
export * from './schema.ts';
export * from './entry.ts';
export * from './builtins.ts';
export * from './library.ts';
export { suggestNames } from './suggest.ts';
export { formatUm, modelLabel } from './format.ts';
