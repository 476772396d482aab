/**
 * The built-in material library. Every entry names its source and its valid range; numbers are
 * the published values of the cited papers (the tests hold them against reference/materials.json, a
 * second copy with the check values). Entries whose numbers were recalled rather than
 * re-read carry `fromMemory` and the note 'from memory'.
 *
 * | id | model | source |
 * |---|---|---|
 * | air, vacuum | constant n = 1 | common practice |
 * | fused-silica | Sellmeier | Malitson 1965 |
 * | sapphire (:o, :e) | Sellmeier, uniaxial | Malitson & Dodge 1972 |
 * | MgF2 (:o, :e) | Sellmeier, uniaxial | Dodge 1984 |
 * | TiO2-rutile (:o, :e) | Sellmeier (A + B/(λ² − C) form), uniaxial | DeVore 1951, from memory |
 * | Si3N4 | Sellmeier | Luke et al. 2015 |
 * | Si-Li1980 | table (n) | Li 1980 |
 * | Si-Green2008 | table (n, k) | Green 2008 |
 * | Au-LD, Ag-LD, Cu-LD, Al-LD, Cr-LD | Lorentz–Drude | Rakić et al. 1998 |
 * | Au-JC, Ag-JC | table (n, k) | Johnson & Christy 1972 |
 * | Al-Rakic1995 | table (n, k) | Rakić 1995 |
 */
import { constantMaterial } from './constant.ts';
import { lorentzDrudeMaterial, type LorentzDrudeParams } from './lorentz-drude.ts';
import type { Material } from './material.ts';
import { HC_EV_UM } from './photon.ts';
import { sellmeierMaterial, type SellmeierParams } from './sellmeier.ts';
import { tableMaterial } from './table.ts';
import { uniaxialMaterial, type UniaxialMaterial } from './uniaxial.ts';

/** A built-in entry: an isotropic material or a uniaxial pair. */
export type BuiltinEntry = Material | UniaxialMaterial;

const ANY: readonly [number, number] = [0, Infinity];

function uniaxialSellmeier(
  id: string,
  o: SellmeierParams,
  e: SellmeierParams,
  info: { citation: string; validRangeUm: readonly [number, number]; notes?: string[]; fromMemory?: boolean },
): UniaxialMaterial {
  return uniaxialMaterial(id, sellmeierMaterial(o, { id, ...info }), sellmeierMaterial(e, { id, ...info }));
}

/**
 * The form n² = A + B/(λ² − C) (λ in µm, C in µm²) as a Sellmeier term: B/(λ² − C) =
 * (B/C)·λ²/(λ² − C) − B/C, so A' = A − B/C, B' = B/C, C² = C (an exact identity).
 */
function fromShiftedForm(A: number, B: number, C: number): SellmeierParams {
  return { A: A - B / C, B: [B / C], C2Um2: [C] };
}

const RAKIC_1998 = 'A. D. Rakić, A. B. Djurišić, J. M. Elazar, M. L. Majewski, Appl. Opt. 37, 5271 (1998); Lorentz–Drude fit, valid 0.1–6 eV';
const LD_RANGE: readonly [number, number] = [HC_EV_UM / 6, HC_EV_UM / 0.1];
const osc = (list: ReadonlyArray<readonly [number, number, number]>): LorentzDrudeParams['oscillators'] =>
  list.map(([f, gammaEv, omegaEv]) => ({ f, gammaEv, omegaEv }));

const LD: Record<string, LorentzDrudeParams> = {
  Ag: { plasmaEv: 9.01, f0: 0.845, gamma0Ev: 0.048, oscillators: osc([[0.065, 3.886, 0.816], [0.124, 0.452, 4.481], [0.011, 0.065, 8.185], [0.84, 0.916, 9.083], [5.646, 2.419, 20.29]]) },
  Au: { plasmaEv: 9.03, f0: 0.76, gamma0Ev: 0.053, oscillators: osc([[0.024, 0.241, 0.415], [0.01, 0.345, 0.83], [0.071, 0.87, 2.969], [0.601, 2.494, 4.304], [4.384, 2.214, 13.32]]) },
  Cu: { plasmaEv: 10.83, f0: 0.575, gamma0Ev: 0.03, oscillators: osc([[0.061, 0.378, 0.291], [0.104, 1.056, 2.957], [0.723, 3.213, 5.3], [0.638, 4.305, 11.18]]) },
  Al: { plasmaEv: 14.98, f0: 0.523, gamma0Ev: 0.047, oscillators: osc([[0.227, 0.333, 0.162], [0.05, 0.312, 1.544], [0.166, 1.351, 1.808], [0.03, 3.382, 3.473]]) },
  Cr: { plasmaEv: 10.75, f0: 0.168, gamma0Ev: 0.047, oscillators: osc([[0.151, 3.175, 0.121], [0.15, 1.305, 0.543], [1.149, 2.676, 1.97], [0.825, 1.335, 8.775]]) },
};

const JC_1972 = 'P. B. Johnson and R. W. Christy, Phys. Rev. B 6, 4370 (1972)';
const JC_WAVELENGTHS_UM = [0.4959, 0.6168, 0.8211, 0.984, 1.216, 1.61];
const coarse = (count: number, from: number, to: number): string =>
  `coarse table: ${count} verified points from ${from} to ${to} µm, interpolated linearly; between points the values are only indicative`;

function build(): readonly BuiltinEntry[] {
  const list: BuiltinEntry[] = [
    constantMaterial({ n: 1 }, { id: 'air', citation: 'n = 1 exactly (common practice)', validRangeUm: ANY, notes: ['vacuum value; real air is about 1.0003 in the visible'] }),
    constantMaterial({ n: 1 }, { id: 'vacuum', citation: 'n = 1 exactly (definition)', validRangeUm: ANY }),
    sellmeierMaterial(
      { B: [0.6961663, 0.4079426, 0.8974794], CUm: [0.0684043, 0.1162414, 9.896161] },
      { id: 'fused-silica', citation: 'I. H. Malitson, J. Opt. Soc. Am. 55, 1205 (1965); 20 °C', validRangeUm: [0.21, 3.71] },
    ),
    uniaxialSellmeier(
      'sapphire',
      { B: [1.4313493, 0.65054713, 5.3414021], CUm: [0.0726631, 0.1193242, 18.028251] },
      { B: [1.5039759, 0.55069141, 6.5927379], CUm: [0.0740288, 0.1216529, 20.072248] },
      { citation: 'I. H. Malitson and M. J. Dodge, J. Opt. Soc. Am. 62, 1405 (1972); 20 °C', validRangeUm: [0.2, 5.0] },
    ),
    uniaxialSellmeier(
      'MgF2',
      { B: [0.48755108, 0.39875031, 2.3120353], CUm: [0.04338408, 0.09461442, 23.793604] },
      { B: [0.41344023, 0.50497499, 2.4904862], CUm: [0.03684262, 0.09076162, 23.771995] },
      { citation: 'M. J. Dodge, Appl. Opt. 23, 1980 (1984); 19 °C', validRangeUm: [0.2, 7.0] },
    ),
    uniaxialSellmeier('TiO2-rutile', fromShiftedForm(5.913, 0.2441, 0.0803), fromShiftedForm(7.197, 0.3322, 0.0843), {
      citation: 'J. R. DeVore, J. Opt. Soc. Am. 41, 416 (1951); n² = A + B/(λ² − C); coefficients and range from memory',
      validRangeUm: [0.43, 1.53],
      fromMemory: true,
      notes: ['bulk rutile crystal: deposited TiO2 films have lower, process-dependent indices'],
    }),
    sellmeierMaterial(
      { B: [3.0249, 40314], CUm: [0.1353406, 1239.842] },
      { id: 'Si3N4', citation: 'K. Luke et al., Opt. Lett. 40, 4823 (2015); Si3N4 film', validRangeUm: [0.31, 5.5], notes: ['film values: deposited nitride varies with process'] },
    ),
    tableMaterial(
      { wavelengthUm: [1.2, 1.3, 1.55, 2.0, 3.0, 5.0, 10.0], n: [3.5167, 3.5016, 3.4757, 3.451, 3.4302, 3.4195, 3.415] },
      {
        id: 'Si-Li1980',
        citation: 'H. H. Li, J. Phys. Chem. Ref. Data 9, 561 (1980); crystalline Si, 293 K',
        notes: [coarse(7, 1.2, 10), 'n only: k = 0 (weak absorption in this range is not modelled)'],
      },
    ),
    tableMaterial(
      {
        wavelengthUm: [0.4, 0.5, 0.6, 0.7, 0.8, 1.0, 1.2],
        n: [5.613, 4.294, 3.94, 3.772, 3.675, 3.572, 3.52],
        k: [0.296, 0.044165, 0.019934, 0.010528, 0.0054113, 5.093e-4, 2.1008e-7],
      },
      {
        id: 'Si-Green2008',
        citation: 'M. A. Green, Sol. Energy Mater. Sol. Cells 92, 1305 (2008); crystalline Si, 300 K',
        notes: [coarse(7, 0.4, 1.2), 'k spans six decades here: linear interpolation of k is rough near the band edge'],
      },
    ),
    ...Object.entries(LD).map(([metal, p]) => lorentzDrudeMaterial(p, { id: `${metal}-LD`, citation: RAKIC_1998, validRangeUm: LD_RANGE })),
    tableMaterial(
      { wavelengthUm: JC_WAVELENGTHS_UM, n: [1.04, 0.21, 0.16, 0.22, 0.35, 0.56], k: [1.833, 3.272, 5.083, 6.35, 8.145, 11.21] },
      { id: 'Au-JC', citation: `${JC_1972}; Au films`, notes: [coarse(6, 0.4959, 1.61)] },
    ),
    tableMaterial(
      { wavelengthUm: JC_WAVELENGTHS_UM, n: [0.05, 0.06, 0.04, 0.04, 0.09, 0.15], k: [3.093, 4.152, 5.727, 6.992, 8.828, 11.85] },
      { id: 'Ag-JC', citation: `${JC_1972}; Ag films`, notes: [coarse(6, 0.4959, 1.61)] },
    ),
    tableMaterial(
      {
        wavelengthUm: [0.41328, 0.5166, 0.61993, 0.81569, 0.99988, 1.5498],
        n: [0.52135, 0.8734, 1.366, 2.7668, 1.4359, 1.5782],
        k: [5.0008, 6.2418, 7.4052, 8.2573, 9.4939, 15.656],
      },
      {
        id: 'Al-Rakic1995',
        citation: 'A. D. Rakić, Appl. Opt. 34, 4755 (1995); Al films',
        notes: [coarse(6, 0.41328, 1.5498), 'the interband absorption near 0.8 µm is sampled by few points'],
      },
    ),
  ];
  return Object.freeze(list);
}

const BUILTINS = build();

/**
 * The built-in entries (isotropic materials and uniaxial pairs), in listing order.
 * @example
 * builtinMaterials().map((m) => m.id); // ['air', 'vacuum', 'fused-silica', 'sapphire', …]
 */
export function builtinMaterials(): readonly BuiltinEntry[] {
  return BUILTINS;
}
