/** Users' materials as JSON model entries: every model, the embeddable schema, and field-named errors. */
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import ref from '../../reference/materials.json' with { type: 'json' };
import { MaterialEntrySchema, MaterialError, MaterialLibrary, materialFromEntry } from '../../src/materials/index.ts';

describe('JSON material entries', () => {
  it('constant: n, k, any wavelength by default', () => {
    const m = materialFromEntry({ name: 'my-Cr', model: 'constant', n: 3.1, k: 3.3, citation: 'datasheet' });
    expect(m.index(0.5)).toEqual({ re: 3.1, im: 3.3 });
    expect(m.validRangeUm).toEqual([0, Infinity]);
    expect(m.user).toBe(true);
    expect(m.citation).toBe('datasheet');
  });

  it('sellmeier with CUm reproduces Malitson 1965 fused silica n(0.6328 µm) = 1.457018 (computed, reference/materials.json)', () => {
    const fs = ref.entries['fused-silica'];
    const m = materialFromEntry({ name: 'my-silica', model: 'sellmeier', B: fs.B, CUm: fs.CUm, rangeUm: fs.rangeUm });
    expect(m.index(0.6328).re).toBeCloseTo(1.457018, 6);
  });

  it('sellmeier with C2Um2 and A: the rutile form n² = A + B/(λ² − C) rewritten (DeVore 1951, from memory)', () => {
    const o = ref.entries['TiO2-rutile'].ordinary;
    const m = materialFromEntry({ name: 'my-rutile', model: 'sellmeier', A: o.A - o.B / o.C2Um2, B: [o.B / o.C2Um2], C2Um2: [o.C2Um2], rangeUm: [0.43, 1.53], fromMemory: true });
    expect(m.index(0.6328).re).toBeCloseTo(2.583697, 6); // computed, reference/materials.json
    expect(m.notes).toContain('from memory');
  });

  it('cauchy with absorption: n = 2.2 + 0.03/λ², κ = 0.002/λ² at 0.5 µm (formula)', () => {
    const m = materialFromEntry({ name: 'my-TiO2', model: 'cauchy', A: 2.2, BUm2: 0.03, absorption: { A: 0, BUm2: 0.002 }, rangeUm: [0.45, 1.2], citation: 'our fit' });
    expect(m.index(0.5).re).toBeCloseTo(2.32, 14);
    expect(m.index(0.5).im).toBeCloseTo(0.008, 15);
  });

  it('drude: ωp = 9 eV, γ = 0.1 eV at 1 eV gives ε = −79.19802 + 8.019802i (formula by hand)', () => {
    const m = materialFromEntry({ name: 'free', model: 'drude', plasmaEv: 9, dampingEv: 0.1, rangeUm: [0.5, 5] });
    const v = m.index(1.239842);
    expect(v.re * v.re - v.im * v.im).toBeCloseTo(-79.19802, 5);
    expect(2 * v.re * v.im).toBeCloseTo(8.019802, 6);
  });

  it('lorentz-drude with the Rakić 1998 gold parameters matches Au(0.6328 µm) = 0.31228 + 3.14605i (computed)', () => {
    const p = ref.entries['lorentz-drude'].metals.Au;
    const m = materialFromEntry({
      name: 'my-Au',
      model: 'lorentz-drude',
      plasmaEv: p.plasmaEv,
      f0: p.f0,
      gamma0Ev: p.gamma0Ev,
      oscillators: p.oscillators.map(([f, gammaEv, omegaEv]) => ({ f, gammaEv, omegaEv })),
      rangeUm: [0.207, 12.4],
    });
    expect(m.index(0.6328).re).toBeCloseTo(0.31228, 5);
    expect(m.index(0.6328).im).toBeCloseTo(3.14605, 5);
  });

  it('table in nm or µm, with the table span as default range', () => {
    const a = materialFromEntry({ name: 't', model: 'table', wavelengthNm: [400, 500, 600], n: [1.5, 1.4, 1.3], k: [0.1, 0, 0] });
    const b = materialFromEntry({ name: 't', model: 'table', wavelengthUm: [0.4, 0.5, 0.6], n: [1.5, 1.4, 1.3], k: [0.1, 0, 0] });
    expect(a.validRangeUm).toEqual([0.4, 0.6]);
    expect(a.index(0.45).re).toBeCloseTo(1.45, 14);
    expect(a.index(0.45).im).toBeCloseTo(b.index(0.45).im, 15);
  });

  it('the schema embeds in another zod schema (as a design file does)', () => {
    const Design = z.object({ materials: z.array(MaterialEntrySchema) });
    const ok = Design.safeParse({ materials: [{ name: 'a', model: 'constant', n: 1.5 }, { name: 'b', model: 'cauchy', A: 1.5, rangeUm: [0.4, 1] }] });
    expect(ok.success).toBe(true);
    expect(Design.safeParse({ materials: [{ name: 'a', model: 'cauchy', A: 1.5 }] }).success).toBe(false);
  });

  const fails = (entry: unknown, re: RegExp) => {
    let e: unknown;
    try {
      materialFromEntry(entry);
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(MaterialError);
    expect((e as Error).message).toMatch(re);
  };

  it('errors name the entry and the field', () => {
    fails({ name: 'x', model: 'sellmeyer', B: [1] }, /^material 'x': model must be one of 'constant', 'sellmeier', .* found "sellmeyer"$/);
    fails({ name: 'x', model: 'sellmeier', B: [1], CUm: [0.1] }, /material 'x': rangeUm: required: the valid range \[min, max\] in µm/);
    fails({ name: 'x', model: 'sellmeier', B: [1], CUm: [0.1], C2Um2: [0.01], rangeUm: [0.3, 1] }, /CUm: give exactly one of CUm/);
    fails({ name: 'x', model: 'sellmeier', B: [1, 2], CUm: [0.1], rangeUm: [0.3, 1] }, /B and CUm must have the same length/);
    fails({ name: 'x', model: 'constant', n: 1.5, k: -0.1 }, /material 'x': k: /);
    fails({ name: 'x', model: 'constant', n: 1.5, colour: 'red' }, /material 'x': \(entry\): .*colour/);
    fails({ name: 'x:o', model: 'constant', n: 1.5 }, /name: name must have no surrounding spaces and no ":"/);
    fails({ name: 'x', model: 'cauchy', A: 1.5, rangeUm: [1, 0.5] }, /rangeUm: range must be \[min, max\] with min < max/);
    fails({ name: 'x', model: 'lorentz-drude', plasmaEv: 9, f0: 0.5, gamma0Ev: 0.05, oscillators: [{ f: 0.1, gammaEv: -0.2, omegaEv: 1 }], rangeUm: [0.3, 1] }, /oscillators\[0\]\.gammaEv: /);
    fails({ name: 'x', model: 'table', wavelengthNm: [500, 400], n: [1, 1] }, /table row 2: wavelength 0\.4 µm is not greater than 0\.5 µm/);
    fails([1, 2], /a material entry must be a JSON object, found an array/);
  });

  it('a library entry overrides the built-in of the same name, case-insensitively', () => {
    const lib = new MaterialLibrary();
    lib.addEntry({ name: 'FUSED-SILICA', model: 'constant', n: 1.45, citation: 'our melt' });
    expect(lib.indexAt('fused-silica', 0.6328)).toEqual({ re: 1.45, im: 0 });
    expect(lib.resolve('Fused-Silica').citation).toBe('our melt');
  });
});
