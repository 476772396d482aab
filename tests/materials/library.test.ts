/** The material library: valid ranges, extrapolation warnings, names, suggestions, uniaxial axes, user overrides. */
import { describe, expect, it } from 'vitest';
import { MaterialError, MaterialLibrary, constantMaterial, sellmeierMaterial, uniaxialMaterial } from '../../src/materials/index.ts';

const lib = new MaterialLibrary();
const caught = (f: () => unknown): MaterialError => {
  try {
    f();
  } catch (e) {
    if (e instanceof MaterialError) return e;
    throw e;
  }
  throw new Error('expected a MaterialError');
};

describe('valid ranges', () => {
  it('a wavelength outside the range throws, naming material, λ and range (Rakić 1998: 0.1–6 eV = 0.2066403–12.39842 µm)', () => {
    const e = caught(() => lib.indexAt('Au-LD', 15));
    expect(e.code).toBe('out-of-range');
    expect(e.message).toBe("material 'Au-LD': wavelength 15 µm is outside its valid range 0.2066403–12.39842 µm");
    expect(e.material).toBe('Au-LD');
    expect(e.details.wavelengthUm).toBe(15);
    expect(e.details.rangeUm![0]).toBeCloseTo(1.239842 / 6, 15);
    expect(caught(() => lib.evaluate('fused-silica', 0.2)).message).toBe("material 'fused-silica': wavelength 0.2 µm is outside its valid range 0.21–3.71 µm");
  });

  it('with allowExtrapolation a formula is evaluated as it stands and the result carries a warning', () => {
    const r = lib.evaluate('Au-LD', 15, { allowExtrapolation: true });
    const raw = lib.resolve('Au-LD').index(15);
    expect(r.index).toEqual(raw);
    expect(r.warnings).toEqual(["material 'Au-LD': wavelength 15 µm is outside its valid range 0.2066403–12.39842 µm; the Lorentz–Drude formula was extrapolated"]);
    expect(lib.evaluate('Au-LD', 10, { allowExtrapolation: true }).warnings).toEqual([]);
  });

  it('with allowExtrapolation a table holds its end row and says so (Johnson & Christy 1972 Ag at 1.61 µm: 0.15 + 11.85i)', () => {
    const r = lib.evaluate('Ag-JC', 2, { allowExtrapolation: true });
    expect(r.index).toEqual({ re: 0.15, im: 11.85 });
    expect(r.warnings[0]).toMatch(/^material 'Ag-JC': wavelength 2 µm is outside its valid range 0\.4959–1\.61 µm; the nearest tabulated value was used$/);
  });

  it('range ends are inclusive and tolerate unit round-off ("400 nm" as 400/1000 µm)', () => {
    expect(lib.evaluate('fused-silica', 0.21).warnings).toEqual([]);
    expect(lib.evaluate('fused-silica', 3.71).warnings).toEqual([]);
    expect(lib.indexAt('Si-Green2008', 400 / 1000)).toEqual({ re: 5.613, im: 0.296 }); // Green 2008 row at 0.40 µm
    expect(lib.indexAt('Si-Green2008', 0.4 * (1 + 1e-12)).re).toBeCloseTo(5.613, 9);
  });

  it('non-positive or non-finite wavelengths are refused even with allowExtrapolation', () => {
    for (const x of [0, -1, NaN, Infinity]) {
      expect(caught(() => lib.evaluate('air', x, { allowExtrapolation: true })).code).toBe('invalid-argument');
    }
  });
});

describe('names', () => {
  it('are case-insensitive and ignore surrounding spaces', () => {
    expect(lib.resolve('FUSED-SILICA').id).toBe('fused-silica');
    expect(lib.resolve(' au-ld ').id).toBe('Au-LD');
    expect(lib.resolve('mgf2').id).toBe('MgF2');
  });

  it('an unknown name suggests the intended one and points to the listing', () => {
    expect(caught(() => lib.resolve('gold')).message).toBe("unknown material 'gold'; did you mean 'Au-LD' or 'Au-JC'? (furrow materials lists them)");
    expect(caught(() => lib.resolve('au-lb')).message).toBe("unknown material 'au-lb'; did you mean 'Au-LD'? (furrow materials lists them)");
    expect(caught(() => lib.resolve('fused-silca')).message).toBe("unknown material 'fused-silca'; did you mean 'fused-silica'? (furrow materials lists them)");
    expect(caught(() => lib.resolve('Si')).details.suggestions).toEqual(['Si-Green2008', 'Si-Li1980']);
    const e = caught(() => lib.resolve('xyz'));
    expect(e.code).toBe('unknown-material');
    expect(e.message).toBe("unknown material 'xyz' (furrow materials lists them)");
  });

  it('a library without built-ins knows only what it was given', () => {
    const empty = new MaterialLibrary({ builtins: false });
    expect(empty.list()).toEqual([]);
    expect(caught(() => empty.resolve('air')).code).toBe('unknown-material');
  });
});

describe('uniaxial crystals', () => {
  it("'sapphire' is the ordinary index and says so; ':o' and ':e' pick the axes (Malitson & Dodge 1972, computed n_o, n_e at 0.6328 µm)", () => {
    const bare = lib.evaluate('sapphire', 0.6328);
    const o = lib.evaluate('sapphire:o', 0.6328);
    const e = lib.evaluate('SAPPHIRE:E', 0.6328);
    expect(bare.index).toEqual(o.index);
    expect(bare.material).toBe('sapphire');
    expect(bare.notes.join(' ')).toMatch(/ordinary index of uniaxial sapphire \(sapphire:e for the extraordinary\)/);
    expect(e.material).toBe('sapphire:e');
    expect(e.notes.join(' ')).toMatch(/extraordinary index/);
    expect(o.index.re).toBeCloseTo(1.765904, 6);
    expect(e.index.re).toBeCloseTo(1.757871, 6);
  });

  it('resolveUniaxial gives both axes; axis suffixes on isotropic entries are refused', () => {
    const mg = lib.resolveUniaxial('MgF2:e');
    expect(mg.ordinary.id).toBe('MgF2:o');
    expect(mg.extraordinary.id).toBe('MgF2:e');
    expect(caught(() => lib.resolve('Au-LD:o')).message).toMatch(/'Au-LD' has a single \(isotropic\) index/);
    expect(caught(() => lib.resolveUniaxial('fused-silica')).code).toBe('invalid-argument');
    expect(caught(() => lib.resolve('sapphire:x')).details.suggestions).toEqual(['sapphire:o', 'sapphire:e']);
  });

  it('a user uniaxial pair answers to its axis names', () => {
    const own = new MaterialLibrary();
    const a = constantMaterial({ n: 1.5 }, { id: 'c', citation: 'test', validRangeUm: [0.4, 1] });
    const b = constantMaterial({ n: 1.6 }, { id: 'c', citation: 'test', validRangeUm: [0.4, 1] });
    own.add(uniaxialMaterial('calcite-ish', a, b));
    expect(own.indexAt('calcite-ish:e', 0.5).re).toBe(1.6);
    expect(own.indexAt('calcite-ish', 0.5).re).toBe(1.5);
    expect(own.resolve('calcite-ish:o').user).toBe(true);
  });
});

describe('user materials', () => {
  it('override built-ins of the same name, which the listing flags', () => {
    const own = new MaterialLibrary();
    own.addEntry({ name: 'au-ld', model: 'constant', n: 0.2, k: 3.3, citation: 'our film' });
    expect(own.indexAt('Au-LD', 0.6328)).toEqual({ re: 0.2, im: 3.3 });
    const rows = own.list();
    expect(rows[0]).toMatchObject({ id: 'au-ld', origin: 'user', overridden: false });
    expect(rows.find((r) => r.id === 'Au-LD')).toMatchObject({ origin: 'built-in', overridden: true });
    expect(own.names()).not.toContain('Au-LD');
    expect(lib.indexAt('Au-LD', 0.6328).re).toBeCloseTo(0.31228, 5); // other libraries untouched (Rakić 1998, computed)
  });

  it('an isotropic user entry named like a uniaxial built-in hides its axes, with a clear error', () => {
    const own = new MaterialLibrary();
    own.add(sellmeierMaterial({ B: [1.3], CUm: [0.1] }, { id: 'sapphire', citation: 'our boule', validRangeUm: [0.3, 2] }));
    expect(own.resolve('sapphire').citation).toBe('our boule');
    expect(caught(() => own.resolve('sapphire:e')).message).toMatch(/'sapphire' has a single \(isotropic\) index/);
    expect(own.list().filter((r) => r.id.startsWith('sapphire') && r.origin === 'built-in').every((r) => r.overridden)).toBe(true);
  });

  it('from-memory entries carry the mark into every evaluation', () => {
    expect(lib.evaluate('TiO2-rutile', 0.6328).notes).toContain('from memory');
    expect(lib.evaluate('fused-silica', 0.6328).notes).not.toContain('from memory');
  });
});
