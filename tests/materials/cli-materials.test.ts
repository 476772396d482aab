/** `furrow materials` text: the listing and one material over a range. */
import { describe, expect, it } from 'vitest';
import { materialsList, materialsShow } from '../../src/cli/materials.ts';
import { MaterialError, MaterialLibrary } from '../../src/materials/index.ts';

const lib = new MaterialLibrary();

describe('furrow materials', () => {
  it('lists every name with model, range and source; notes on the lines below', () => {
    const lines = materialsList(lib);
    expect(lines[0]).toBe('built-in materials');
    expect(lines[1]).toMatch(/^name\s+model\s+range \(µm\)\s+source$/);
    const row = (id: string) => lines.find((l) => l.startsWith(`${id} `))!;
    expect(row('fused-silica')).toMatch(/^fused-silica\s+Sellmeier\s+0\.21–3\.71\s+I\. H\. Malitson, J\. Opt\. Soc\. Am\. 55, 1205 \(1965\); 20 °C$/);
    expect(row('Au-LD')).toMatch(/Lorentz–Drude\s+0\.2066403–12\.39842\s+A\. D\. Rakić/);
    expect(row('air')).toMatch(/constant\s+any\s+n = 1 exactly/);
    for (const id of lib.names()) expect(lines.some((l) => l.startsWith(`${id} `))).toBe(true);
    const i = lines.indexOf(row('sapphire'));
    expect(lines[i + 1]).toMatch(/^\s+note: ordinary index of uniaxial sapphire \(sapphire:e for the extraordinary\)$/);
  });

  it('shows the from-memory mark beside such entries', () => {
    const lines = materialsList(lib);
    const i = lines.findIndex((l) => l.startsWith('TiO2-rutile '));
    expect(lines[i]).toMatch(/from memory/);
    expect(lines[i + 1]).toMatch(/note: FROM MEMORY: not re-read in the cited source/);
    const j = lines.findIndex((l) => l.startsWith('fused-silica '));
    expect(lines[j + 1]).not.toMatch(/FROM MEMORY/);
  });

  it('puts user materials first and flags the built-ins they override', () => {
    const own = new MaterialLibrary();
    own.addEntry({ name: 'Au-LD', model: 'constant', n: 0.2, k: 3.3, citation: 'our film' });
    const lines = materialsList(own);
    expect(lines[0]).toBe('user materials (they override built-ins of the same name)');
    expect(lines[2]).toMatch(/^Au-LD\s+constant\s+any\s+our film$/);
    const i = lines.findIndex((l, k) => k > 3 && l.startsWith('Au-LD '));
    expect(lines[i + 1]).toMatch(/note: overridden by the user material of the same name/);
  });

  it('shows n and k from 400 to 800 nm in 8 steps (Green 2008 rows at 400, 500 … 800 nm)', () => {
    const lines = materialsShow(lib, 'si-green2008', 0.4, 0.8, 8);
    expect(lines[0]).toBe('material  Si-Green2008 (table)');
    expect(lines[1]).toMatch(/^source    M\. A\. Green, Sol\. Energy Mater\. Sol\. Cells 92, 1305 \(2008\)/);
    expect(lines[2]).toBe('range     0.4–1.2 µm');
    const table = lines.slice(lines.findIndex((l) => l.includes('λ (nm)')) + 1);
    expect(table).toHaveLength(9);
    expect(table[0]!.trim().split(/\s+/)).toEqual(['400.000', '0.400000', '5.613000', '0.296000']);
    expect(table[2]!.trim().split(/\s+/)).toEqual(['500.000', '0.500000', '4.294000', '0.044165']);
    expect(table[8]!.trim().split(/\s+/)).toEqual(['800.000', '0.800000', '3.675000', '5.4113e-3']);
  });

  it('refuses wavelengths outside the valid range with a MaterialError, or lists them with warnings when allowed', () => {
    expect(() => materialsShow(lib, 'Ag-JC', 0.4, 0.8, 4)).toThrow(/material 'Ag-JC': wavelength 0\.4 µm is outside its valid range 0\.4959–1\.61 µm/);
    const lines = materialsShow(lib, 'Ag-JC', 0.4, 0.8, 4, { allowExtrapolation: true });
    expect(lines).toContain('warning: 1 of 5 wavelengths are outside the valid range and were extrapolated:');
    expect(lines.at(-1)).toMatch(/nearest tabulated value was used/);
  });

  it('checks its arguments and names unknown materials with a suggestion', () => {
    expect(() => materialsShow(lib, 'gold', 0.5, 0.6, 2)).toThrow("unknown material 'gold'; did you mean 'Au-LD' or 'Au-JC'? (furrow materials lists them)");
    expect(() => materialsShow(lib, 'air', 0.8, 0.4, 2)).toThrow(/--to \(0\.4 µm\) is below --from \(0\.8 µm\)/);
    expect(() => materialsShow(lib, 'air', 0.4, 0.8, 0)).toThrow(MaterialError);
    expect(() => materialsShow(lib, 'air', 0.4, 0.8, 2.5)).toThrow(/steps must be an integer/);
    expect(materialsShow(lib, 'air', 0.5, 0.5, 10).filter((l) => /^\s+500\.000/.test(l))).toHaveLength(1);
  });
});
