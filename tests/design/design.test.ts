/** Design files: units, indices, and messages that say what to change. */
import { describe, expect, it } from 'vitest';
import { InputError, designToProblem, lengthUm, parseDesign, parseIndex } from '../../src/design/index.ts';

const base = { period: '1 um', substrate: 1.5, incidence: { wavelength: '500 nm' } };

describe('design files', () => {
  it('reads lengths with units (1 nm = 1e-3 µm, 1 mm = 1e3 µm: SI definitions)', () => {
    expect(lengthUm('632.8 nm', 'x')).toBeCloseTo(0.6328, 15);
    expect(lengthUm('1.2 µm', 'x')).toBeCloseTo(1.2, 15);
    expect(lengthUm('0.5 mm', 'x')).toBeCloseTo(500, 12);
    expect(() => lengthUm('12 parsecs', 'layers[0].thickness')).toThrow(/layers\[0\]\.thickness: expected a length with a unit/);
  });

  it('reads groove density in lines/mm as the period (1200 l/mm → 833.33 nm, definition)', () => {
    const p = designToProblem({ grooveDensityPerMm: 1200, substrate: 1.5, incidence: { wavelengthNm: 500 } });
    expect(p.structure.periodUm).toBeCloseTo(1000 / 1200, 14);
  });

  it('reads complex indices as numbers, "n+ki" strings and {n, k}', () => {
    expect(parseIndex(1.5, 'x')).toEqual({ re: 1.5, im: 0 });
    expect(parseIndex('0.22+6.71i', 'x')).toEqual({ re: 0.22, im: 6.71 });
    expect(parseIndex({ n: 0.2, k: 3.3 }, 'x')).toEqual({ re: 0.2, im: 3.3 });
    expect(() => parseIndex('1.5-0.1i', 'substrate')).toThrow(/substrate: k must be ≥ 0/);
    expect(() => parseIndex('glass', 'cover')).toThrow(/cover: expected an index like/);
  });

  it('turns segment widths into a tiling of the period', () => {
    const p = designToProblem({ ...base, layers: [{ thicknessNm: 100, segments: [{ width: 0.3, index: 2 }, { width: 0.7, index: 1 }] }] });
    const prof = p.structure.layers[0]!.profile;
    expect(prof.kind).toBe('segments');
    if (prof.kind === 'segments') expect(prof.segments.map((s) => [s.from, s.to])).toEqual([[0, 0.3], [0.3, 1]]);
    expect(p.structure.layers[0]!.thicknessUm).toBeCloseTo(0.1, 15);
  });

  const bad: Array<[string, unknown, RegExp]> = [
    ['widths that do not add up to 1', { ...base, layers: [{ thicknessNm: 10, segments: [{ width: 0.5, index: 2 }, { width: 0.4, index: 1 }] }] }, /layers\[0\]\.segments: segment widths .* add up to 0\.9/],
    ['a missing thickness', { ...base, layers: [{ index: 2 }] }, /layers\[0\]\.thickness: missing/],
    ['a thickness given twice', { ...base, layers: [{ thickness: '10 nm', thicknessNm: 10, index: 2 }] }, /given twice/],
    ['both index and segments', { ...base, layers: [{ thicknessNm: 10, index: 2, segments: [{ width: 1, index: 2 }] }] }, /either "index"\/"material" .* or "segments"/],
    ['a misspelt field', { ...base, substrat: 1.5 }, /Unrecognized key.*substrat.*remove it or check its spelling/],
    ['no period', { substrate: 1.5, incidence: { wavelength: '500 nm' } }, /period: missing: give "period"/],
    ['no wavelength', { period: '1 um', substrate: 1.5, incidence: {} }, /incidence\.wavelength: missing/],
    ['a wavelength without unit', { period: '1 um', substrate: 1.5, incidence: { wavelength: '500' } }, /expected a length with a unit/],
    ['orders out of range', { ...base, orders: -3 }, /orders/],
  ];
  for (const [what, d, msg] of bad) {
    it(`rejects ${what} with a message naming the field`, () => {
      expect(() => designToProblem(d)).toThrow(InputError);
      expect(() => designToProblem(d)).toThrow(msg);
    });
  }

  it('rejects text that is not JSON, naming the file', () => {
    expect(() => parseDesign('{ "period": ', 'my.json')).toThrow(/my\.json: not valid JSON/);
  });
});
