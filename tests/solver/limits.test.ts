/**
 * Known limits of grating theory: the effective-medium (subwavelength) limit, the scalar
 * (wide-period, thin) limit, and the metallic lamellar TM benchmark of the factorization
 * literature.
 */
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/solver/index.ts';
import type { Complex, Layer, Structure } from '../../src/solver/index.ts';
import ref from '../../reference/exact-limits.json' with { type: 'json' };

const cx = (re: number, im = 0): Complex => ({ re, im });
const binary = (d: number, f: number, ridge: Complex, groove: Complex): Layer => ({
  thicknessUm: d,
  profile: { kind: 'segments', segments: [{ from: 0, to: f, index: ridge }, { from: f, to: 1, index: groove }] },
});

describe('effective-medium limit (Rytov, Sov. Phys. JETP 2, 466, 1956)', () => {
  const e = ref.rytovEffectiveIndex;
  const lambda = 1;
  const d = 0.3;
  const film = (n: number) =>
    solve({ periodUm: 1, cover: cx(1), substrate: cx(1.5), layers: [{ thicknessUm: d, profile: { kind: 'uniform', index: cx(n) } }] }, { wavelengthUm: lambda, thetaDeg: 0 }, { orders: 0 });
  const grating = (ratio: number) =>
    solve({ periodUm: ratio * lambda, cover: cx(1), substrate: cx(1.5), layers: [binary(d, e.fill, cx(e.n1), cx(e.n2))] }, { wavelengthUm: lambda, thetaDeg: 0 }, { orders: 15 });
  const ratios = [0.2, 0.1, 0.05];
  const results = ratios.map(grating);
  const filmTE = film(e.nTE).s.R;
  const filmTM = film(e.nTM).p.R;

  it('TE: the zero-order reflectance approaches the film of n_TE = 1.2747549, the gap falling as (Λ/λ)²', () => {
    const gaps = results.map((r) => Math.abs(r.s.R - filmTE));
    expect(gaps[2]).toBeLessThan(1e-4);
    // halving Λ/λ divides the gap by ≈ 4 (second-order correction)
    expect(gaps[0]! / gaps[1]!).toBeGreaterThan(3.5);
    expect(gaps[1]! / gaps[2]!).toBeGreaterThan(3.5);
  });

  it('TM: the zero-order reflectance approaches the film of n_TM = 1.1766968', () => {
    // TM keeps a first-order term from the evanescent boundary layers at the two interfaces
    // (nearly independent of the thickness), so the gap halves with Λ/λ rather than quartering
    const gaps = results.map((r) => Math.abs(r.p.R - filmTM));
    expect(gaps[2]).toBeLessThan(3e-4);
    expect(gaps[0]! / gaps[1]!).toBeGreaterThan(1.6);
    expect(gaps[1]! / gaps[2]!).toBeGreaterThan(1.6);
  });
});

describe('scalar limit (Goodman, Introduction to Fourier Optics: binary π-phase grating, duty 0.5)', () => {
  // lamellar glass grating n = 1.5 in transmission, depth for a π phase step h = λ/(2(n − 1))
  const lambda = 0.5;
  const n = 1.5;
  const h = lambda / (2 * (n - 1));
  const share = (ratio: number, pol: 's' | 'p', m: number): number => {
    const M = Math.round(2.5 * ratio) + 10;
    const r = solve({ periodUm: ratio * lambda, cover: cx(n), substrate: cx(1), layers: [binary(h, 0.5, cx(n), cx(1))] }, { wavelengthUm: lambda, thetaDeg: 0 }, { orders: M });
    // the scalar theory ignores Fresnel reflection: compare shares of the transmitted power
    return r[pol].transmitted.find((o) => o.m === m)!.efficiency / r[pol].T;
  };
  it(`orders ±1 approach 4/π² = ${ref.binaryPhaseGrating.eta1} of the transmitted power as Λ/λ grows, TE and TM`, () => {
    for (const pol of ['s', 'p'] as const) {
      const errs = [5, 10, 20].map((ratio) => Math.abs(share(ratio, pol, 1) - ref.binaryPhaseGrating.eta1));
      expect(errs[1]).toBeLessThan(errs[0]!);
      expect(errs[2]).toBeLessThan(errs[1]!);
      expect(errs[2], `${pol} at Λ/λ = 20`).toBeLessThan(0.006);
    }
  });
  it(`order 3 carries ≈ ${ref.binaryPhaseGrating.eta3} and order 0 vanishes at Λ/λ = 20`, () => {
    expect(Math.abs(share(20, 's', 3) - ref.binaryPhaseGrating.eta3)).toBeLessThan(0.002);
    expect(share(20, 's', 0)).toBeLessThan(0.002);
  });
});

describe('metallic lamellar grating in TM (Li & Haggans, J. Opt. Soc. Am. A 10, 1184, 1993; parameters from memory)', () => {
  const metal = cx(0.22, 6.71);
  const s: Structure = { periodUm: 1, cover: cx(1), substrate: metal, layers: [binary(1, 0.5, metal, cx(1))] };
  const eta = (M: number, factorization: 'inverse' | 'laurent'): number =>
    solve(s, { wavelengthUm: 1, thetaDeg: 30 }, { orders: M, factorization }).p.reflected.find((o) => o.m === -1)!.efficiency;
  it('with the inverse rule the −1st order settles (changes < 1e-3 beyond M = 20); the Laurent rule is still off at M = 80 and heads to the same limit', () => {
    const inv = [20, 30, 40, 80].map((M) => eta(M, 'inverse'));
    for (let i = 1; i < inv.length; i++) expect(Math.abs(inv[i]! - inv[i - 1]!), `inverse M step ${i}`).toBeLessThan(1e-3);
    const limit = inv[inv.length - 1]!;
    const lau40 = eta(40, 'laurent');
    const lau80 = eta(80, 'laurent');
    expect(Math.abs(lau80 - limit)).toBeGreaterThan(1e-3);
    expect(Math.abs(lau80 - limit)).toBeLessThan(Math.abs(lau40 - limit));
  });
});
