/** Users' n, k tables as CSV text: units in headers, round trip, and errors that name the line. */
import { describe, expect, it } from 'vitest';
import { MaterialError, MaterialLibrary, parseMaterialCsv, tableToCsv, type TableMaterial } from '../../src/materials/index.ts';

const rowsUm = [0.4959, 0.6168, 0.8211];
const expectRows = (m: TableMaterial, x = rowsUm, n = [1.04, 0.21, 0.16], k = [1.833, 3.272, 5.083]) => {
  m.table.wavelengthUm.forEach((v, i) => expect(v).toBeCloseTo(x[i]!, 14));
  expect(m.table.n).toEqual(n);
  expect(m.table.k).toEqual(k);
};
// test data: Johnson & Christy 1972 gold rows, as in reference/materials.json
const body = (scale: number) => `${0.4959 * scale},1.04,1.833\n${0.6168 * scale},0.21,3.272\n${0.8211 * scale},0.16,5.083\n`;

describe('CSV materials', () => {
  it('round trip: a table written as CSV in nm reads back to the same values (Au-JC, Johnson & Christy 1972)', () => {
    const lib = new MaterialLibrary();
    const au = lib.resolve('Au-JC') as TableMaterial;
    const text = tableToCsv(au.table, { unit: 'nm', comments: ['Au, Johnson & Christy 1972'] });
    expect(text.split('\n').slice(0, 3)).toEqual(['# Au, Johnson & Christy 1972', 'wavelength_nm,n,k', '495.9,1.04,1.833']);
    const back = parseMaterialCsv(text, { name: 'my-Au' });
    expect(back.table.n).toEqual(au.table.n);
    expect(back.table.k).toEqual(au.table.k);
    back.table.wavelengthUm.forEach((x, i) => expect(x).toBeCloseTo(au.table.wavelengthUm[i]!, 15));
    for (const x of [0.5, 0.7, 1.3]) {
      expect(back.index(x).re).toBeCloseTo(au.index(x).re, 12);
      expect(back.index(x).im).toBeCloseTo(au.index(x).im, 12);
    }
    expect(back.user).toBe(true);
    expect(back.citation).toBe('user table (no citation given)');
  });

  it('round trip in µm, mm and Å as well (1 µm = 1000 nm = 1e-3 mm = 1e4 Å, SI)', () => {
    const t = { wavelengthUm: [0.4, 0.55, 1.2], n: [1.47, 1.46, 1.45], k: [0.001, 0, 0] };
    for (const unit of ['um', 'µm', 'mm', 'Å']) {
      const back = parseMaterialCsv(tableToCsv(t, { unit }), { name: 'x' });
      back.table.wavelengthUm.forEach((x, i) => expect(x).toBeCloseTo(t.wavelengthUm[i]!, 14));
    }
  });

  it.each([
    ['wavelength_nm,n,k', 1000],
    ['wavelength (nm), n, k', 1000],
    ['Wavelength [nm],n,k', 1000],
    ['wavelength in nm,n,k', 1000],
    ['lambda/nm,n,k', 1000],
    ['wavelength (um), n, k', 1],
    ['wavelength [µm],n,k', 1],
    ['wl_micron,n,k', 1],
    ['wavelength_mm,n,k', 1e-3],
    ['wavelength (Å),n,k', 1e4],
    ['wavelength_A,n,k', 1e4],
    ['wavelength_angstrom,n,k', 1e4],
  ])('header "%s" names the unit', (header, scale) => {
    expectRows(parseMaterialCsv(`${header}\n${body(scale)}`, { name: 'h' }));
  });

  it('skips comments and blank lines, reads CRLF, a byte-order mark, tabs, semicolons and spaces', () => {
    const text = '\uFEFF# measured 2024-05-01\r\n\r\nwavelength_nm\tn\tk   # header\r\n495.9\t1.04\t1.833\r\n# a comment line\r\n616.8\t0.21\t3.272\r\n\r\n821.1\t0.16\t5.083\r\n';
    expectRows(parseMaterialCsv(text, { name: 'c' }));
    expectRows(parseMaterialCsv('wavelength_nm;n;k\n495.9;1.04;1.833\n616.8;0.21;3.272\n821.1;0.16;5.083', { name: 's' }));
    expectRows(parseMaterialCsv('wavelength_nm n k\n495.9  1.04 1.833\n616.8 0.21 3.272\n821.1 0.16 5.083', { name: 'w' }));
  });

  it('columns in any order by header; without k the table is lossless', () => {
    expectRows(parseMaterialCsv('k,n,wavelength_um\n1.833,1.04,0.4959\n3.272,0.21,0.6168\n5.083,0.16,0.8211\n', { name: 'o' }));
    const nOnly = parseMaterialCsv('wavelength_um,n\n1.2,3.5167\n1.3,3.5016\n', { name: 'n' });
    expect(nOnly.table.k).toEqual([0, 0]);
  });

  it('a file without a header takes the unit argument (columns wavelength, n[, k])', () => {
    expectRows(parseMaterialCsv(body(1000), { name: 'u', unit: 'nm' }));
    expectRows(parseMaterialCsv(body(1), { name: 'u', unit: 'µm' }));
    expectRows(parseMaterialCsv(`wavelength,n,k\n${body(1000)}`, { name: 'u', unit: 'nm' }));
  });

  const err = (text: string, re: RegExp, unit?: string) => {
    let e: unknown;
    try {
      parseMaterialCsv(text, { name: 'film', ...(unit ? { unit } : {}) });
    } catch (x) {
      e = x;
    }
    expect(e).toBeInstanceOf(MaterialError);
    expect((e as MaterialError).code).toBe('invalid-data');
    expect((e as MaterialError).message).toMatch(re);
    return e as MaterialError;
  };

  it('errors name the line: a non-numeric value', () => {
    const e = err('wavelength_nm,n,k\n400,1.5,0\n# note\n500,abc,0\n', /^material 'film': CSV line 4: 'abc' in column 2 \(n\) is not a number$/);
    expect(e.details.line).toBe(4);
    err('wavelength_nm,n,k\n400,1.5,\n500,1.4,0\n', /CSV line 2: empty field in column 3 \(k\) is not a number/);
  });

  it('errors name the line: wavelengths not strictly increasing', () => {
    err('wavelength_nm,n,k\n400,1.5,0\n500,1.4,0\n500,1.3,0\n', /CSV line 4: wavelength 500 nm is not greater than 500 nm on line 3/);
    err('wavelength_nm,n,k\n400,1.5,0\n300,1.4,0\n', /CSV line 3: wavelength 300 nm is not greater than 400 nm on line 2/);
    err('wavelength_nm,n,k\n0,1.5,0\n300,1.4,0\n', /CSV line 2: wavelength must be > 0/);
  });

  it('errors name the line: negative k or n', () => {
    err('wavelength_nm,n,k\n400,1.5,0\n500,1.4,-0.01\n', /CSV line 3: k = -0\.01 is negative \(κ ≥ 0 is absorbing/);
    err('wavelength_nm,n,k\n400,-1.5,0\n500,1.4,0\n', /CSV line 2: n = -1\.5 is negative/);
  });

  it('errors: fewer than 2 rows, wrong column count', () => {
    err('wavelength_nm,n,k\n400,1.5,0\n', /CSV has 1 data row; a table needs at least 2/);
    err('# nothing\n', /CSV has 0 data rows/);
    err('wavelength_nm,n,k\n400,1.5,0\n500,1.4\n', /CSV line 3: expected 3 columns \(wavelength, n, k\), found 2/);
  });

  it('errors: header without a unit, unknown unit, conflicting unit, unknown column, no header and no unit', () => {
    err('wavelength,n,k\n400,1.5,0\n500,1.4,0\n', /CSV line 1: the header does not name the wavelength unit/);
    err('wavelength (furlong),n,k\n400,1.5,0\n', /CSV line 1: unknown wavelength unit 'furlong'/);
    err('wavelength_um,n,k\n0.4,1.5,0\n0.5,1.4,0\n', /the header says the wavelengths are in µm but the unit given is nm/, 'nm');
    err('wavelength_nm,n,alpha\n400,1.5,0\n', /CSV line 1: header column 3 'alpha' is not one of/);
    err('\n# c\n400,1.5,0\n500,1.4,0\n', /CSV line 3: no header line naming the wavelength unit/);
    expect(() => parseMaterialCsv(body(1), { name: 'x', unit: 'parsec' })).toThrow(/unknown wavelength unit 'parsec'/);
  });

  it('a CSV material added to a library overrides the built-in of the same name and keeps its citation', () => {
    const lib = new MaterialLibrary();
    const m = lib.addCsv('wavelength_nm,n,k\n400,1.5,0.1\n800,1.3,0.3\n', { name: 'Au-JC', citation: 'our ellipsometry' });
    expect(m.citation).toBe('our ellipsometry');
    expect(lib.indexAt('au-jc', 0.6).re).toBeCloseTo(1.4, 14);
    expect(lib.list().find((l) => l.id === 'Au-JC' && l.origin === 'built-in')!.overridden).toBe(true);
  });
});
