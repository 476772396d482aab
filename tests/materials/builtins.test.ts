/**
 * Every built-in entry against reference/materials.json: the coefficients and tables are written out
 * twice, here and in the code (so a typo in either fails), and every check value is
 * reproduced to the digits its source gives (half a unit in the last digit).
 */
import { describe, expect, it } from 'vitest';
import ref from '../../reference/materials.json' with { type: 'json' };
import {
  HC_EV_UM,
  MaterialLibrary,
  builtinMaterials,
  type LorentzDrudeMaterial,
  type SellmeierMaterial,
  type TableMaterial,
} from '../../src/materials/index.ts';
import { halfUlpOfDecimal, matchesDigits } from './digits.ts';

const lib = new MaterialLibrary();
const E = ref.entries;

interface Check {
  id: string;
  wavelengthUm: number;
  n: string;
  k?: string;
  source: string;
}
const allChecks: Check[] = Object.values(E).flatMap((e) => ('checks' in e ? (e.checks as Check[]) : []));

describe('built-in library reproduces its sources', () => {
  it.each(allChecks.map((c) => [`${c.id} at ${c.wavelengthUm} µm: n = ${c.n}${c.k ? `, k = ${c.k}` : ''} (${c.source})`, c] as const))('%s', (_t, c) => {
    const { index, warnings } = lib.evaluate(c.id, c.wavelengthUm);
    expect(warnings).toEqual([]);
    expect(matchesDigits(index.re, c.n), `n = ${index.re}, source ${c.n}`).toBe(true);
    expect(matchesDigits(index.im, c.k ?? '0'), `k = ${index.im}, source ${c.k ?? 0}`).toBe(true);
  });

  it('the tolerance helper reads digits as written (5.0930e-4 → ±5e-9; 3.4150 → ±5e-5)', () => {
    expect(halfUlpOfDecimal('5.0930e-4')).toBeCloseTo(5e-9, 20);
    expect(halfUlpOfDecimal('3.4150')).toBeCloseTo(5e-5, 18);
    expect(matchesDigits(1.4584623, '1.45846')).toBe(true);
    expect(matchesDigits(1.458466, '1.45846')).toBe(false);
  });

  const sellmeier = (id: string): SellmeierMaterial => lib.resolve(id) as SellmeierMaterial;
  it('fused silica, Si3N4: Sellmeier coefficients and ranges as in Malitson 1965 and Luke et al. 2015', () => {
    for (const id of ['fused-silica', 'Si3N4'] as const) {
      const m = sellmeier(id);
      expect(m.kind).toBe('sellmeier');
      expect(m.params.B).toEqual(E[id].B);
      expect(m.params.CUm).toEqual(E[id].CUm);
      expect(m.params.A).toBe(1);
      expect(m.validRangeUm).toEqual(E[id].rangeUm);
      expect(m.citation).toContain(E[id].citation.split(';')[0]);
    }
  });

  it('sapphire and MgF2: ordinary and extraordinary coefficients as in Malitson & Dodge 1972 and Dodge 1984', () => {
    for (const id of ['sapphire', 'MgF2'] as const) {
      for (const [axis, key] of [['o', 'ordinary'], ['e', 'extraordinary']] as const) {
        const m = sellmeier(`${id}:${axis}`);
        expect(m.params.B).toEqual(E[id][key].B);
        expect(m.params.CUm).toEqual(E[id][key].CUm);
        expect(m.validRangeUm).toEqual(E[id].rangeUm);
        expect(m.citation).toBe(E[id].citation);
      }
    }
  });

  it('TiO2-rutile equals n² = A + B/(λ² − C) with the reference coefficients (from memory) across its range', () => {
    const t = E['TiO2-rutile'];
    for (const [axis, c] of [['o', t.ordinary], ['e', t.extraordinary]] as const) {
      const m = lib.resolve(`TiO2-rutile:${axis}`);
      expect(m.fromMemory).toBe(true);
      expect(m.notes).toContain('from memory');
      expect(m.validRangeUm).toEqual(t.rangeUm);
      for (let x = 0.43; x <= 1.53; x += 0.05) {
        const direct = Math.sqrt(c.A + c.B / (x * x - c.C2Um2));
        expect(m.index(x).re).toBeCloseTo(direct, 13); // same formula rearranged: round-off only
      }
    }
  });

  it('Lorentz–Drude metals: parameters as in Rakić et al. 1998, valid 0.1–6 eV = 1.239842/6 … 1.239842/0.1 µm', () => {
    const ld = E['lorentz-drude'];
    for (const [metal, p] of Object.entries(ld.metals)) {
      const m = lib.resolve(`${metal}-LD`) as LorentzDrudeMaterial;
      expect(m.kind).toBe('lorentz-drude');
      expect(m.params.plasmaEv).toBe(p.plasmaEv);
      expect(m.params.f0).toBe(p.f0);
      expect(m.params.gamma0Ev).toBe(p.gamma0Ev);
      expect(m.params.oscillators.map((o) => [o.f, o.gammaEv, o.omegaEv])).toEqual(p.oscillators);
      expect(m.validRangeUm).toEqual([HC_EV_UM / ld.rangeEv[1]!, HC_EV_UM / ld.rangeEv[0]!]);
      expect(m.citation).toContain('Appl. Opt. 37, 5271 (1998)');
    }
  });

  const tables = ['Si-Li1980', 'Si-Green2008', 'Au-JC', 'Ag-JC', 'Al-Rakic1995'] as const;
  it.each(tables)('%s: the table holds the published rows, spans them, and returns them at the rows to the source digits', (id) => {
    const t = E[id];
    const m = lib.resolve(id) as TableMaterial;
    expect(m.kind).toBe('table');
    const rows = t.rows as string[][];
    expect(m.table.wavelengthUm).toEqual(rows.map((r) => Number(r[0])));
    expect(m.table.n).toEqual(rows.map((r) => Number(r[1])));
    expect(m.table.k).toEqual(rows.map((r) => (r[2] === undefined ? 0 : Number(r[2]))));
    expect(m.validRangeUm).toEqual([Number(rows[0]![0]), Number(rows.at(-1)![0])]);
    expect(m.citation).toBe(t.citation);
    expect(m.notes.join(' ')).toMatch(/coarse table: \d+ verified points/);
    for (const r of rows) {
      const v = lib.evaluate(id, Number(r[0])).index;
      expect(matchesDigits(v.re, r[1]!)).toBe(true);
      expect(matchesDigits(v.im, r[2] ?? '0')).toBe(true);
    }
  });

  it('every built-in has a citation, a valid range, and is listed; only TiO2-rutile is marked from memory', () => {
    const listing = lib.list();
    expect(listing.map((l) => l.id)).toEqual([
      'air', 'vacuum', 'fused-silica', 'sapphire', 'sapphire:o', 'sapphire:e', 'MgF2', 'MgF2:o', 'MgF2:e',
      'TiO2-rutile', 'TiO2-rutile:o', 'TiO2-rutile:e', 'Si3N4', 'Si-Li1980', 'Si-Green2008',
      'Ag-LD', 'Au-LD', 'Cu-LD', 'Al-LD', 'Cr-LD', 'Au-JC', 'Ag-JC', 'Al-Rakic1995',
    ]);
    for (const l of listing) {
      expect(l.citation.length).toBeGreaterThan(10);
      expect(l.validRangeUm[1]).toBeGreaterThan(l.validRangeUm[0]);
      expect(l.origin).toBe('built-in');
      expect(l.fromMemory).toBe(l.id.startsWith('TiO2-rutile'));
      expect(l.notes.includes('from memory')).toBe(l.fromMemory);
      if (l.fromMemory) expect(l.citation).toMatch(/from memory/);
    }
    expect(builtinMaterials().length).toBe(17); // 14 isotropic + 3 uniaxial pairs
  });

  it('air and vacuum are n = 1 exactly at any wavelength (common practice)', () => {
    for (const id of ['air', 'vacuum']) {
      for (const x of [1e-3, 0.5, 1e4]) expect(lib.indexAt(id, x)).toEqual({ re: 1, im: 0 });
    }
  });
});
