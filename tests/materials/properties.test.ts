/** Invariants over random admissible inputs (fast-check, fixed seeds). */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { MaterialLibrary, lorentzDrudeMaterial, parseMaterialCsv, tableMaterial, tableToCsv } from '../../src/materials/index.ts';

const lib = new MaterialLibrary();
const SEED = 20260514;

describe('material invariants', () => {
  const ids = lib.names();
  it.each(ids)('%s: κ ≥ 0 and n ≥ 0, finite, everywhere in its valid range (passive media, exp(−iωt) convention)', (id) => {
    const m = lib.resolve(id);
    const [lo, hi] = m.validRangeUm;
    const top = Number.isFinite(hi) ? hi : 1000;
    const bottom = lo > 0 ? lo : 1e-3;
    fc.assert(
      fc.property(fc.double({ min: 0, max: 1, noNaN: true }), (t) => {
        // log-uniform over the range so short wavelengths of wide ranges are sampled too
        const x = Math.min(top, Math.max(bottom, bottom * (top / bottom) ** t));
        const { index, warnings } = lib.evaluate(id, x);
        return warnings.length === 0 && Number.isFinite(index.re) && Number.isFinite(index.im) && index.im >= 0 && index.re >= 0;
      }),
      { numRuns: 300, seed: SEED },
    );
  });

  it('Lorentz–Drude: Im ε ≥ 0 and Im ñ ≥ 0 for any non-negative strengths and dampings (each term absorbs under exp(−iωt))', () => {
    const pos = fc.double({ min: 0, max: 20, noNaN: true });
    fc.assert(
      fc.property(
        fc.double({ min: 0.5, max: 20, noNaN: true }),
        pos,
        pos,
        fc.array(fc.record({ f: pos, gammaEv: pos, omegaEv: pos }), { maxLength: 5 }),
        fc.double({ min: 0.05, max: 50, noNaN: true }),
        (plasmaEv, f0, gamma0Ev, oscillators, x) => {
          const m = lorentzDrudeMaterial({ plasmaEv, f0, gamma0Ev, oscillators }, { id: 'r', citation: 'random', validRangeUm: [0.01, 100] });
          const v = m.index(x);
          if (!Number.isFinite(v.re) || !Number.isFinite(v.im)) return true; // exactly on an undamped pole
          return v.im >= 0 && 2 * v.re * v.im >= -1e-9 * (v.re * v.re + v.im * v.im);
        },
      ),
      { numRuns: 500, seed: SEED },
    );
  });

  it('table interpolation stays between the neighbouring rows (linear interpolation is monotone between nodes)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.double({ min: 0.1, max: 20, noNaN: true }), { minLength: 2, maxLength: 12, comparator: (a, b) => Math.abs(a - b) < 1e-6 }),
        fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { minLength: 24, maxLength: 24 }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (xs, vals, t) => {
          const x = [...xs].sort((a, b) => a - b);
          const n = x.map((_, i) => vals[i]!);
          const k = x.map((_, i) => vals[i + 12]!);
          const m = tableMaterial({ wavelengthUm: x, n, k }, { id: 't', citation: 'random' });
          const w = x[0]! + t * (x.at(-1)! - x[0]!);
          let i = x.findIndex((v) => v > w) - 1;
          if (i < 0) i = x.length - 2;
          const v = m.index(w);
          const within = (a: number, b: number, c: number) => c >= Math.min(a, b) - 1e-12 && c <= Math.max(a, b) + 1e-12;
          return within(n[i]!, n[i + 1]!, v.re) && within(k[i]!, k[i + 1]!, v.im);
        },
      ),
      { numRuns: 300, seed: SEED },
    );
  });

  it('CSV round trip in nm reproduces any valid table (values to 1e-15 relative; wavelengths through 15 digits)', () => {
    fc.assert(
      fc.property(
        fc.uniqueArray(fc.double({ min: 0.2, max: 20, noNaN: true }), { minLength: 2, maxLength: 20, comparator: (a, b) => Math.abs(a - b) < 1e-9 * Math.max(a, b) }),
        fc.array(fc.double({ min: 0, max: 10, noNaN: true }), { minLength: 40, maxLength: 40 }),
        (xs, vals) => {
          const x = [...xs].sort((a, b) => a - b);
          const table = { wavelengthUm: x, n: x.map((_, i) => vals[i]!), k: x.map((_, i) => vals[i + 20]!) };
          const back = parseMaterialCsv(tableToCsv(table, { unit: 'nm' }), { name: 'rt' });
          expect(back.table.n).toEqual(table.n);
          expect(back.table.k).toEqual(table.k);
          back.table.wavelengthUm.forEach((v, i) => expect(Math.abs(v - x[i]!)).toBeLessThanOrEqual(1e-14 * x[i]!));
        },
      ),
      { numRuns: 200, seed: SEED },
    );
  });
});
