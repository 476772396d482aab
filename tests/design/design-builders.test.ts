/**
 * Design files with profiles, coatings, stacks and library materials: what they build, the
 * warnings they carry and the messages for every rule they enforce.
 */
import { readdirSync, readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { designToModel, designToProblem, InputError, problemAt } from '../../src/design/index.ts';
import { solve } from '../../src/solver/index.ts';

const base = { period: '1 um', substrate: 'fused-silica', incidence: { wavelength: '632.8 nm' } };
const examplesDir = new URL('../../src/design/examples/', import.meta.url);

describe('design files build real gratings', () => {
  it('resolves library materials at the wavelength: fused silica at 632.8 nm is 1.457018 (Malitson 1965, computed)', () => {
    const p = designToProblem(base);
    expect(p.structure.substrate.re).toBeCloseTo(1.457018, 6);
    expect(p.structure.cover).toEqual({ re: 1, im: 0 });
  });

  it('builds a sawtooth with the depth that follows from the blaze angle (d = Λ·sinθB·cosθB for a 90° apex: geometry)', () => {
    const m = designToModel({ ...base, grating: { profile: 'sawtooth', blazeDeg: 20 }, slices: 12 });
    const t = (20 * Math.PI) / 180;
    expect(m.depthUm!).toBeCloseTo(Math.sin(t) * Math.cos(t), 12);
    expect(m.slices).toBe(12);
    const total = m.geometry.reduce((s, l) => s + l.thicknessUm, 0);
    expect(total).toBeCloseTo(m.depthUm!, 12);
  });

  it('stacks quarter-wave films below a grating, thicknesses λ0/(4n) (definition)', () => {
    const m = designToModel({
      ...base,
      grating: { profile: 'lamellar', duty: 0.5, depth: '100 nm' },
      below: { films: [{ material: '2.3', quarterWaves: 1 }, { material: '1.45', quarterWaves: 1 }], repeat: 3, designWavelength: '1 um' },
    });
    const films = m.geometry.filter((l) => l.kind === 'uniform');
    expect(films).toHaveLength(6);
    expect(films[0]!.thicknessUm).toBeCloseTo(1 / (4 * 2.3), 12);
    expect(films[1]!.thicknessUm).toBeCloseTo(1 / (4 * 1.45), 12);
  });

  it('a quarter-wave mirror under air reaches the thin-film peak reflectance (Macleod, Thin-Film Optical Filters, §5.2)', () => {
    const nH = 2.3;
    const nL = 1.45;
    const ns = 1.52;
    const N = 5;
    const p = designToProblem({
      period: '1 um',
      substrate: String(ns),
      above: { films: [{ material: String(nH), quarterWaves: 1 }, { material: String(nL), quarterWaves: 1 }], repeat: N, designWavelength: '800 nm' },
      incidence: { wavelength: '800 nm' },
      orders: 0,
    });
    // with H next to the cover the stack's admittance is Y = (nH/nL)^(2N)·ns; R = ((1 − Y)/(1 + Y))²
    const Y = (nH / nL) ** (2 * N) * ns;
    const expected = ((1 - Y) / (1 + Y)) ** 2;
    const r = solve(p.structure, p.incidence, p.options);
    expect(Math.abs(r.s.R - expected)).toBeLessThan(1e-12);
  });

  it('carries an extrapolation warning into the problem when allowed, and refuses the wavelength otherwise', () => {
    const d = { ...base, substrate: 'Au-LD', incidence: { wavelength: '15 um' } };
    expect(() => designToProblem(d)).toThrow(/substrate: material 'Au-LD': wavelength 15 µm is outside its valid range/);
    const p = designToProblem({ ...d, allowExtrapolation: true });
    expect(p.warnings.join('\n')).toMatch(/Au-LD/);
  });

  it('warns when the retained orders cannot hold the propagating ones (Λ/λ = 20 has 20 propagating orders per side in air: grating equation)', () => {
    const p = designToProblem({ period: '10 um', substrate: 1.0001, incidence: { wavelength: '500 nm' }, orders: 8 });
    expect(p.warnings.join('\n')).toMatch(/some propagating orders are missing; use "orders" ≥ 3\d/);
    const q = designToProblem({ period: '10 um', substrate: 1.0001, incidence: { wavelength: '500 nm' }, orders: 60 });
    expect(q.warnings).toHaveLength(0);
  });

  it('accepts a gain medium only when asked to', () => {
    const d = { ...base, layers: [{ thickness: '100 nm', index: '1.5-0.01i' }] };
    expect(() => designToProblem(d)).toThrow(/κ = -0\.01 < 0 \(gain\).*"allowGain": true/);
    const p = designToProblem({ ...d, allowGain: true });
    const r = solve(p.structure, p.incidence, p.options);
    expect(r.s.A).toBeLessThan(0); // gain: more light out than in
  });

  const files = readdirSync(examplesDir).filter((f) => f.endsWith('.json'));
  it('ships the three example designs of the invented scenarios (and the raw-form example)', () => {
    expect(files.sort()).toEqual(['blazed-aluminium-spectrometer.json', 'gold-lamellar.json', 'gold-sinusoid-plasmon.json', 'silica-compressor-transmission.json']);
  });
  for (const f of files) {
    it(`example ${f} solves with a sound energy balance`, () => {
      const p = designToProblem(JSON.parse(readFileSync(new URL(f, examplesDir), 'utf8')));
      expect(p.warnings).toEqual([]);
      const r = solve(p.structure, p.incidence, p.options);
      for (const resp of [r.s, r.p]) {
        expect(resp.R + resp.T + resp.A).toBeCloseTo(1, 12);
        expect(resp.A).toBeGreaterThan(-1e-10); // no gain in these designs
      }
    });
  }
});

describe('design validation rules: each bad input gets a message that says what to change', () => {
  const bad: Array<[string, unknown, RegExp]> = [
    ['a negative depth', { ...base, grating: { profile: 'lamellar', duty: 0.5, depthNm: -350 } }, /grating\.depth: expected a depth > 0, found -350 nm; give a positive length like "350 nm"/],
    ['a duty cycle outside (0, 1)', { ...base, grating: { profile: 'lamellar', duty: 1.2, depth: '100 nm' } }, /grating\.duty: expected .*\(0, 1\).*found 1\.2/],
    ['a self-intersecting trapezoid', { ...base, grating: { profile: 'trapezoid', duty: 0.5, sidewallDeg: 10, depth: '2 um' } }, /grating\.sidewallDeg/],
    ['a blaze angle out of range', { ...base, grating: { profile: 'sawtooth', blazeDeg: 95 } }, /grating\.blazeDeg: expected an angle in \(0°, 90°\), found 95/],
    ['an unknown profile', { ...base, grating: { profile: 'zigzag' } }, /grating\.profile: Invalid discriminator value\. Expected 'lamellar' \| 'trapezoid'/],
    ['an unknown material', { ...base, substrate: 'unobtainium' }, /substrate: unknown material 'unobtainium'/],
    ['a lossy cover', { ...base, cover: '1.0+0.1i' }, /cover: the cover must be lossless/],
    ['overlapping segments', { ...base, layers: [{ thickness: '50 nm', segments: [{ from: 0, to: 0.6, index: 2 }, { from: 0.5, to: 1, index: 1 }] }] }, /layers\[0\]\.segments\[1\]: overlaps the previous segment/],
    ['a gap between segments', { ...base, layers: [{ thickness: '50 nm', segments: [{ from: 0, to: 0.4, index: 2 }, { from: 0.5, to: 1, index: 1 }] }] }, /leaves a gap from 0\.4 to 0\.5/],
    ['raw layers together with a grating', { ...base, layers: [{ thickness: '50 nm', index: 2 }], grating: { profile: 'sinusoidal', depth: '50 nm' } }, /either raw "layers" or "grating"/],
    ['a quarter-wave film without a design wavelength', { ...base, below: { films: [{ material: 2, quarterWaves: 1 }] } }, /below\.designWavelength: missing/],
    ['a non-positive wavelength', { ...base, incidence: { wavelengthNm: 0 } }, /incidence\.wavelength: expected a wavelength > 0/],
    ['a grazing angle', { ...base, incidence: { wavelength: '500 nm', angleDeg: 90 } }, /incidence\.angleDeg: expected a polar angle in \(−90°, 90°\), found 90/],
    ['an expression with another variable', { ...base, grating: { profile: 'expression', expression: '50*sin(2*pi*y)', heightUnit: 'nm' } }, /grating\.expression/],
    ['a coating without thickness', { ...base, grating: { profile: 'sinusoidal', depth: '50 nm', coating: { material: 'Au-LD' } } }, /grating\.coating\.thickness: missing/],
  ];
  for (const [what, d, msg] of bad) {
    it(`rejects ${what}`, () => {
      let err: unknown;
      try {
        designToProblem(d);
      } catch (e) {
        err = e;
      }
      expect(err, `no error for ${what}`).toBeInstanceOf(InputError);
      expect((err as Error).message).toMatch(msg);
    });
  }
  it('problemAt re-resolves materials at another wavelength without rebuilding the geometry', () => {
    const m = designToModel({ ...base, grating: { profile: 'sinusoidal', depth: '80 nm', coating: { material: 'Au-LD', thickness: '50 nm' } } });
    const a = problemAt(m, 0.5);
    const b = problemAt(m, 0.8);
    expect(a.structure.layers.length).toBe(b.structure.layers.length);
    expect(a.structure.substrate.re).not.toBe(b.structure.substrate.re);
  });
});
