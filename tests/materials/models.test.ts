/** Dispersion formulas against hand evaluations of their definitions, and the ñ = √ε branch. */
import { describe, expect, it } from 'vitest';
import {
  MaterialError,
  cauchyMaterial,
  constantMaterial,
  drudeMaterial,
  evaluateMaterial,
  lorentzDrudeMaterial,
  photonEnergyEv,
  sellmeierMaterial,
  tableMaterial,
} from '../../src/materials/index.ts';
import { indexFromPermittivity } from '../../src/materials/permittivity.ts';

const info = (id = 'test', validRangeUm: [number, number] = [0.1, 20]) => ({ id, citation: 'test', validRangeUm });
const sq = (z: { re: number; im: number }) => ({ re: z.re * z.re - z.im * z.im, im: 2 * z.re * z.im });

describe('dispersion models', () => {
  it('ñ = √ε takes the branch Im ≥ 0: √(−4) = 2i, √(3+4i) = 2+i, √(−3+4i) = 1+2i (algebra)', () => {
    expect(indexFromPermittivity(-4, 0)).toEqual({ re: 0, im: 2 });
    expect(indexFromPermittivity(3, 4)).toEqual({ re: 2, im: 1 });
    expect(indexFromPermittivity(-3, 4)).toEqual({ re: 1, im: 2 });
    expect(indexFromPermittivity(2.25, 0)).toEqual({ re: 1.5, im: 0 });
  });

  it('photon energy: ħω = 1.239842 eV at 1.239842 µm, 2 eV at 0.619921 µm (ω = 1.239842/λ)', () => {
    expect(photonEnergyEv(1.239842)).toBe(1);
    expect(photonEnergyEv(0.619921)).toBeCloseTo(2, 14);
  });

  it('constant: returns n + iκ at every wavelength; rejects κ < 0 and n < 0', () => {
    const m = constantMaterial({ n: 0.2, k: 3.3 }, info());
    expect(m.index(0.3)).toEqual({ re: 0.2, im: 3.3 });
    expect(m.index(9)).toEqual({ re: 0.2, im: 3.3 });
    expect(() => constantMaterial({ n: 1.5, k: -0.1 }, info('gain'))).toThrow(/material 'gain': k must be a finite number ≥ 0/);
    expect(() => constantMaterial({ n: -1 }, info('neg'))).toThrow(/n must be a finite number ≥ 0/);
  });

  it('Sellmeier: one term B = 1, C = 0.1 µm at λ = 0.5 µm gives n² = 1 + 0.25/0.24 (formula by hand)', () => {
    const m = sellmeierMaterial({ B: [1], CUm: [0.1] }, info());
    expect(m.index(0.5).re).toBeCloseTo(Math.sqrt(1 + 0.25 / 0.24), 15);
    expect(m.index(0.5).im).toBe(0);
  });

  it('Sellmeier with C² given (C2Um2) equals the C form with C2 = C² (same formula)', () => {
    const B = [0.6961663, 0.4079426, 0.8974794];
    const C = [0.0684043, 0.1162414, 9.896161];
    const a = sellmeierMaterial({ B, CUm: C }, info());
    const b = sellmeierMaterial({ B, C2Um2: C.map((c) => c * c) }, info());
    for (const x of [0.21, 0.5, 1, 2, 3.7]) expect(b.index(x).re).toBe(a.index(x).re);
  });

  it('Sellmeier constant term A replaces the leading 1: A = 2, B = 0 gives n = √2 (formula)', () => {
    expect(sellmeierMaterial({ A: 2, B: [0], CUm: [0.1] }, info()).index(1).re).toBeCloseTo(Math.SQRT2, 15);
  });

  it('Sellmeier between a resonance and its zero (n² < 0) lands on the absorbing branch ñ = i·√|n²| (formula)', () => {
    const v = sellmeierMaterial({ B: [1], CUm: [1] }, info()).index(0.9);
    const n2 = 1 + 0.81 / (0.81 - 1);
    expect(v.re).toBe(0);
    expect(v.im).toBeCloseTo(Math.sqrt(-n2), 14);
  });

  it('Sellmeier rejects both or neither C form and mismatched lengths, naming the field', () => {
    expect(() => sellmeierMaterial({ B: [1] }, info('s'))).toThrow(/exactly one of CUm .* or C2Um2/);
    expect(() => sellmeierMaterial({ B: [1], CUm: [1], C2Um2: [1] }, info('s'))).toThrow(/exactly one of/);
    expect(() => sellmeierMaterial({ B: [1, 2], CUm: [1] }, info('s'))).toThrow(/B and CUm must have the same length/);
    expect(() => sellmeierMaterial({ B: [NaN], CUm: [1] }, info('s'))).toThrow(/B\[0\] must be a finite number/);
  });

  it('Cauchy: A = 1.5, B = 0.01 µm², C = 0.001 µm⁴ at 0.5 µm gives n = 1.5 + 0.04 + 0.016 = 1.556; κ of the same form', () => {
    const m = cauchyMaterial({ A: 1.5, BUm2: 0.01, CUm4: 0.001, absorption: { A: 0.001, BUm2: 0.0005 } }, info());
    const v = m.index(0.5);
    expect(v.re).toBeCloseTo(1.556, 15);
    expect(v.im).toBeCloseTo(0.001 + 0.0005 / 0.25, 15);
    expect(cauchyMaterial({ A: 1.46 }, info()).index(0.7)).toEqual({ re: 1.46, im: 0 });
  });

  it('Cauchy absorption that turns negative is refused when evaluated (κ ≥ 0 convention)', () => {
    const m = cauchyMaterial({ A: 1.5, absorption: { A: -0.01, BUm2: 0.005 } }, info('fit', [0.3, 1]));
    expect(evaluateMaterial(m, 0.5).index.im).toBeCloseTo(0.01, 15); // −0.01 + 0.005/0.25
    expect(() => evaluateMaterial(m, 0.9)).toThrow(/material 'fit': the Cauchy model gives κ = .* < 0 \(gain\) at 0\.9 µm/);
  });

  it('Drude: ωp = 9 eV, γ = 0.1 eV at ω = 1 eV gives ε = 1 − 81/(1 + 0.1i) = −79.19802 + 8.019802i (formula by hand)', () => {
    const m = drudeMaterial({ plasmaEv: 9, dampingEv: 0.1 }, info());
    const eps = sq(m.index(1.239842));
    expect(eps.re).toBeCloseTo(1 - 81 / 1.01, 11);
    expect(eps.im).toBeCloseTo(8.1 / 1.01, 11);
    expect(m.index(1.239842).im).toBeGreaterThan(0);
  });

  it('Drude without damping below the plasma frequency is a lossless metal: ñ = i·√(ωp²/ω² − 1) (formula)', () => {
    const v = drudeMaterial({ plasmaEv: 9, dampingEv: 0, epsInf: 1 }, info()).index(1.239842 / 3);
    expect(v.re).toBe(0);
    expect(v.im).toBeCloseTo(Math.sqrt(81 / 9 - 1), 13);
  });

  it('Lorentz–Drude with f0 = 1 and no oscillators equals Drude with ε∞ = 1 (same formula)', () => {
    const ld = lorentzDrudeMaterial({ plasmaEv: 9.03, f0: 1, gamma0Ev: 0.053, oscillators: [] }, info());
    const d = drudeMaterial({ plasmaEv: 9.03, dampingEv: 0.053 }, info());
    for (const x of [0.3, 0.6328, 2, 10]) {
      expect(ld.index(x).re).toBeCloseTo(d.index(x).re, 13);
      expect(ld.index(x).im).toBeCloseTo(d.index(x).im, 13);
    }
  });

  it('Lorentz–Drude at a bound resonance ω = ωⱼ: ε = 1 + i·f·ωp²/(ωΓ) (the Rakić 1998 form with exp(−iωt))', () => {
    const m = lorentzDrudeMaterial({ plasmaEv: 2, f0: 0, gamma0Ev: 0, oscillators: [{ f: 0.5, gammaEv: 0.25, omegaEv: 2 }] }, info());
    const eps = sq(m.index(1.239842 / 2));
    expect(eps.re).toBeCloseTo(1, 12);
    expect(eps.im).toBeCloseTo((0.5 * 4) / (2 * 0.25), 12); // = 4
  });

  it('Lorentz–Drude below and above a resonance: ε′ rises below ωⱼ and falls above it (Lorentz oscillator)', () => {
    const m = lorentzDrudeMaterial({ plasmaEv: 2, f0: 0, gamma0Ev: 0, oscillators: [{ f: 0.5, gammaEv: 0.05, omegaEv: 2 }] }, info());
    expect(sq(m.index(1.239842 / 1.9)).re).toBeGreaterThan(1);
    expect(sq(m.index(1.239842 / 2.1)).re).toBeLessThan(1);
  });

  it('Lorentz–Drude rejects negative strengths and dampings, naming the oscillator', () => {
    expect(() => lorentzDrudeMaterial({ plasmaEv: 9, f0: 0.5, gamma0Ev: 0.05, oscillators: [{ f: 0.1, gammaEv: -1, omegaEv: 2 }] }, info('m'))).toThrow(
      /material 'm': oscillators\[0\]\.gammaEv must be a finite number ≥ 0/,
    );
    expect(() => lorentzDrudeMaterial({ plasmaEv: 0, f0: 0.5, gamma0Ev: 0.05, oscillators: [] }, info('m'))).toThrow(/plasmaEv must be/);
  });

  it('table: linear in λ between rows, end rows held outside the span (definition of the interpolation)', () => {
    const m = tableMaterial({ wavelengthUm: [0.5, 0.6, 0.8], n: [1.5, 1.4, 1.2], k: [0, 0.1, 0.3] }, { id: 't', citation: 'test' });
    expect(m.index(0.55).re).toBeCloseTo(1.45, 15);
    expect(m.index(0.55).im).toBeCloseTo(0.05, 15);
    expect(m.index(0.75).re).toBeCloseTo(1.25, 15);
    expect(m.index(0.6)).toEqual({ re: 1.4, im: 0.1 });
    expect(m.index(0.3)).toEqual({ re: 1.5, im: 0 });
    expect(m.index(2)).toEqual({ re: 1.2, im: 0.3 });
    expect(m.validRangeUm).toEqual([0.5, 0.8]);
  });

  it('table rejects bad rows, naming the row', () => {
    const t = (x: number[], n: number[], k?: number[]) => () => tableMaterial({ wavelengthUm: x, n, ...(k ? { k } : {}) }, { id: 'tab', citation: 'test' });
    expect(t([0.5], [1])).toThrow(/material 'tab': a table needs at least 2 rows, found 1/);
    expect(t([0.5, 0.5], [1, 1])).toThrow(/table row 2: wavelength 0\.5 µm is not greater than 0\.5 µm/);
    expect(t([0.5, 0.6], [1, 1], [0, -1])).toThrow(/table row 2: k must be a finite number ≥ 0/);
    expect(t([0.5, 0.6], [1])).toThrow(/equal lengths/);
    expect(() => tableMaterial({ wavelengthUm: [0.5, 0.6], n: [1, 1] }, { id: 'tab', citation: 'x', validRangeUm: [0.4, 0.6] })).toThrow(/reaches beyond the table's span/);
  });

  it('material names: no ":" (reserved for uniaxial axes), no surrounding spaces, valid ranges only', () => {
    expect(() => constantMaterial({ n: 1 }, info('a:o'))).toThrow(MaterialError);
    expect(() => constantMaterial({ n: 1 }, info(' a'))).toThrow(/without surrounding spaces/);
    expect(() => constantMaterial({ n: 1 }, info('a', [1, 0.5]))).toThrow(/material 'a': valid range must be \[min, max\] µm with 0 ≤ min < max/);
  });
});
