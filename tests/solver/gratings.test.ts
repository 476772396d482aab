/**
 * Lamellar gratings against laws that hold whatever the structure: energy balance, reciprocity,
 * mirror symmetry, and the agreement of the conical formulation with the classical one.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/solver/index.ts';
import type { Complex, Layer, OrderResult, Response, Structure } from '../../src/solver/index.ts';

const cx = (re: number, im = 0): Complex => ({ re, im });
const lamellar = (d: number, cuts: number[], idx: Complex[]): Layer => ({
  thicknessUm: d,
  profile: {
    kind: 'segments',
    segments: idx.map((index, i) => ({ from: i === 0 ? 0 : cuts[i - 1]!, to: i === idx.length - 1 ? 1 : cuts[i]!, index })),
  },
});
const eff = (r: Response, m: number, side: 'R' | 'T' = 'R'): number =>
  ((side === 'R' ? r.reflected : r.transmitted).find((o) => o.m === m) as OrderResult).efficiency;

describe('energy balance', () => {
  it('solve() conserves energy to round-off for random lossless lamellar stacks, TE, TM and conical (fast-check)', () => {
    const layerArb = fc.record({
      d: fc.double({ min: 0.01, max: 1.2, noNaN: true }),
      cut1: fc.double({ min: 0.05, max: 0.45, noNaN: true }),
      cut2: fc.double({ min: 0.55, max: 0.95, noNaN: true }),
      n: fc.array(fc.double({ min: 1, max: 3.5, noNaN: true }), { minLength: 3, maxLength: 3 }),
    });
    fc.assert(
      fc.property(
        fc.array(layerArb, { minLength: 1, maxLength: 3 }),
        fc.double({ min: 0.3, max: 2, noNaN: true }),
        fc.double({ min: -70, max: 70, noNaN: true }),
        fc.constantFrom(0, 0, 25, 60),
        fc.double({ min: 1, max: 2.5, noNaN: true }),
        fc.integer({ min: 2, max: 8 }),
        (layers, periodUm, thetaDeg, phiDeg, nsub, M) => {
          const s: Structure = {
            periodUm,
            cover: cx(1),
            substrate: cx(nsub),
            layers: layers.map((l) => lamellar(l.d, [l.cut1, l.cut2], l.n.map((v) => cx(v)))),
          };
          const r = solve(s, { wavelengthUm: 0.633, thetaDeg, phiDeg }, { orders: M });
          for (const resp of [r.s, r.p]) {
            expect(Math.abs(resp.A), `A = ${resp.A} for ${JSON.stringify({ periodUm, thetaDeg, phiDeg, nsub, M, layers })}`).toBeLessThan(1e-12);
          }
        },
      ),
      { numRuns: 60, seed: 20261202 },
    );
  });

  it('solve() reports positive absorption for a lossy grating and R + T + A = 1', () => {
    const s: Structure = { periodUm: 0.8, cover: cx(1), substrate: cx(1.5), layers: [lamellar(0.2, [0.5], [cx(0.5, 3), cx(1)])] };
    const r = solve(s, { wavelengthUm: 0.6, thetaDeg: 10 }, { orders: 15 });
    for (const resp of [r.s, r.p]) {
      expect(resp.A).toBeGreaterThan(0.01);
      expect(resp.R + resp.T + resp.A).toBeCloseTo(1, 14);
    }
  });
});

describe('reciprocity (Petit ed., Electromagnetic Theory of Gratings, Springer 1980, ch. 1)', () => {
  // an asymmetric, absorbing two-layer grating
  const s: Structure = {
    periodUm: 0.9,
    cover: cx(1),
    substrate: cx(0.3, 4.5),
    layers: [lamellar(0.25, [0.2, 0.55], [cx(1.6), cx(1), cx(2.2, 0.4)]), lamellar(0.15, [0.35, 0.7], [cx(1.3, 0.1), cx(2.5), cx(1)])],
  };
  const lambda = 0.62;
  const M = 8;
  for (const m of [-1, 1]) {
    it(`classical mount, order ${m}: reversed incidence returns the same efficiency to round-off with the shifted order window, TE and TM`, () => {
      const theta = 14;
      const r = solve(s, { wavelengthUm: lambda, thetaDeg: theta }, { orders: M });
      const kxm = Math.sin((theta * Math.PI) / 180) + (m * lambda) / s.periodUm;
      expect(Math.abs(kxm)).toBeLessThan(1); // order m propagates
      const thetaRev = (Math.asin(-kxm) * 180) / Math.PI;
      const rev = solve(s, { wavelengthUm: lambda, thetaDeg: thetaRev }, { orders: { min: m - M, max: m + M } });
      for (const pol of ['s', 'p'] as const) {
        const a = eff(r[pol], m);
        const b = eff(rev[pol], m);
        expect(Math.abs(a - b), `${pol}: η = ${a} forward, ${b} reversed`).toBeLessThan(1e-12);
      }
      // with the same symmetric window it holds only to truncation error
      const revSym = solve(s, { wavelengthUm: lambda, thetaDeg: thetaRev }, { orders: M });
      expect(Math.abs(eff(r.p, m) - eff(revSym.p, m))).toBeLessThan(2e-2);
    });
  }

  it('conical mount: reversed incidence swaps s→p with p→s and keeps s→s and p→p, to round-off', () => {
    const theta = 25;
    const phi = 35;
    const m = -1;
    const r = solve(s, { wavelengthUm: lambda, thetaDeg: theta, phiDeg: phi }, { orders: M });
    const t = (theta * Math.PI) / 180;
    const p = (phi * Math.PI) / 180;
    const kx = Math.sin(t) * Math.cos(p) + (m * lambda) / s.periodUm;
    const ky = Math.sin(t) * Math.sin(p);
    const kt = Math.hypot(kx, ky);
    const thetaRev = (Math.asin(kt) * 180) / Math.PI;
    const phiRev = (Math.atan2(-ky, -kx) * 180) / Math.PI;
    const rev = solve(s, { wavelengthUm: lambda, thetaDeg: thetaRev, phiDeg: phiRev }, { orders: { min: m - M, max: m + M } });
    // polarization-resolved efficiency: |amplitude|²·cosθm/cosθ (lossless cover)
    const part = (o: OrderResult, which: 's' | 'p', cosInc: number): number => {
      const a = which === 's' ? o.amplitudeS : o.amplitudeP;
      return ((a.re ** 2 + a.im ** 2) * Math.cos((o.thetaDeg * Math.PI) / 180)) / cosInc;
    };
    const fwd = (inc: 's' | 'p', out: 's' | 'p'): number => part(r[inc].reflected.find((o) => o.m === m)!, out, Math.cos(t));
    const bwd = (inc: 's' | 'p', out: 's' | 'p'): number =>
      part(rev[inc].reflected.find((o) => o.m === m)!, out, Math.cos((thetaRev * Math.PI) / 180));
    expect(fwd('s', 'p')).toBeGreaterThan(1e-4); // there is polarization conversion to test
    expect(Math.abs(fwd('s', 's') - bwd('s', 's'))).toBeLessThan(1e-12);
    expect(Math.abs(fwd('p', 'p') - bwd('p', 'p'))).toBeLessThan(1e-12);
    expect(Math.abs(fwd('s', 'p') - bwd('p', 's'))).toBeLessThan(1e-12);
    expect(Math.abs(fwd('p', 's') - bwd('s', 'p'))).toBeLessThan(1e-12);
  });
});

describe('formulations and symmetry', () => {
  const s: Structure = {
    periodUm: 0.75,
    cover: cx(1),
    substrate: cx(0.2, 5.0),
    layers: [lamellar(0.3, [0.3, 0.6], [cx(1.5), cx(1), cx(0.6, 2.1)]), { thicknessUm: 0.05, profile: { kind: 'uniform', index: cx(1.8, 0.02) } }],
  };
  it('the conical formulation at φ = 0 reproduces classical TE and TM order by order', () => {
    const inc = { wavelengthUm: 0.55, thetaDeg: 17 };
    const a = solve(s, inc, { orders: 10 });
    const b = solve(s, inc, { orders: 10, formulation: 'conical' });
    for (const pol of ['s', 'p'] as const) {
      expect(b[pol].reflected.map((o) => o.m)).toEqual(a[pol].reflected.map((o) => o.m));
      a[pol].reflected.forEach((o, i) => {
        const q = b[pol].reflected[i]!;
        expect(Math.abs(o.efficiency - q.efficiency)).toBeLessThan(1e-12);
        expect(Math.abs(o.amplitudeS.re - q.amplitudeS.re) + Math.abs(o.amplitudeS.im - q.amplitudeS.im)).toBeLessThan(1e-11);
        expect(Math.abs(o.amplitudeP.re - q.amplitudeP.re) + Math.abs(o.amplitudeP.im - q.amplitudeP.im)).toBeLessThan(1e-11);
      });
      expect(Math.abs(a[pol].A - b[pol].A)).toBeLessThan(1e-12);
    }
  });

  it('a symmetric profile at normal incidence sends equal efficiency into orders +m and −m', () => {
    const sym: Structure = { periodUm: 1.3, cover: cx(1), substrate: cx(1.45), layers: [lamellar(0.4, [0.25, 0.75], [cx(1), cx(2.0, 0.1), cx(1)])] };
    const r = solve(sym, { wavelengthUm: 0.5, thetaDeg: 0 }, { orders: 12 });
    for (const pol of ['s', 'p'] as const) {
      for (const o of r[pol].reflected.filter((x) => x.m > 0)) {
        expect(Math.abs(o.efficiency - eff(r[pol], -o.m)), `${pol} m = ±${o.m}`).toBeLessThan(1e-13);
      }
      for (const o of r[pol].transmitted.filter((x) => x.m > 0)) {
        expect(Math.abs(o.efficiency - eff(r[pol], -o.m, 'T'))).toBeLessThan(1e-13);
      }
    }
  });

  it('a Jones-vector incidence is the coherent sum of the s and p responses', () => {
    const r = solve(s, { wavelengthUm: 0.55, thetaDeg: 17, phiDeg: 20, polarization: { s: cx(1), p: cx(0, 1) } }, { orders: 6 });
    const o = r.requested!.reflected.find((x) => x.m === 0)!;
    const os = r.s.reflected.find((x) => x.m === 0)!;
    const op = r.p.reflected.find((x) => x.m === 0)!;
    const k = Math.SQRT1_2;
    // amplitudeS = (As_s + i·As_p)/√2
    expect(o.amplitudeS.re).toBeCloseTo(k * (os.amplitudeS.re - op.amplitudeS.im), 13);
    expect(o.amplitudeS.im).toBeCloseTo(k * (os.amplitudeS.im + op.amplitudeS.re), 13);
  });
});

describe('thick and grazing cases stay finite', () => {
  it('a lossless layer 50 wavelengths thick conserves energy, and splitting it in two changes nothing', () => {
    const lambda = 0.8;
    const one: Structure = { periodUm: 1.1, cover: cx(1), substrate: cx(1.5), layers: [lamellar(50 * lambda, [0.5], [cx(1.5), cx(1)])] };
    const two: Structure = { ...one, layers: [lamellar(20 * lambda, [0.5], [cx(1.5), cx(1)]), lamellar(30 * lambda, [0.5], [cx(1.5), cx(1)])] };
    const a = solve(one, { wavelengthUm: lambda, thetaDeg: 12 }, { orders: 10 });
    const b = solve(two, { wavelengthUm: lambda, thetaDeg: 12 }, { orders: 10 });
    for (const pol of ['s', 'p'] as const) {
      expect(Number.isFinite(a[pol].R)).toBe(true);
      expect(Math.abs(a[pol].A)).toBeLessThan(1e-11);
      a[pol].reflected.forEach((o, i) => expect(Math.abs(o.efficiency - b[pol].reflected[i]!.efficiency)).toBeLessThan(1e-9));
    }
  });

  it('an opaque metal slab (2 µm of a gold-like metal) does not overflow', () => {
    const s: Structure = { periodUm: 0.6, cover: cx(1), substrate: cx(1.5), layers: [lamellar(2, [0.5], [cx(0.2, 6), cx(1)]), { thicknessUm: 2, profile: { kind: 'uniform', index: cx(0.2, 6) } }] };
    const r = solve(s, { wavelengthUm: 0.8, thetaDeg: 5 }, { orders: 10 });
    for (const pol of ['s', 'p'] as const) {
      expect(Number.isFinite(r[pol].R) && r[pol].R > 0 && r[pol].R < 1).toBe(true);
      expect(r[pol].T).toBeLessThan(1e-10);
    }
  });

  it('an order exactly at grazing (Rayleigh anomaly: Λ = 1 µm, θ = 30°, λ = 0.5 µm, order +1) stays finite and energy is conserved', () => {
    const s: Structure = { periodUm: 1, cover: cx(1), substrate: cx(1.5), layers: [lamellar(0.3, [0.5], [cx(1.5), cx(1)])] };
    const r = solve(s, { wavelengthUm: 0.5, thetaDeg: 30 }, { orders: 6 });
    for (const pol of ['s', 'p'] as const) {
      expect(Number.isFinite(r[pol].R) && Number.isFinite(r[pol].T)).toBe(true);
      expect(Math.abs(r[pol].A)).toBeLessThan(1e-9);
      for (const o of [...r[pol].reflected, ...r[pol].transmitted]) expect(Number.isFinite(o.efficiency)).toBe(true);
    }
    // just off the anomaly the efficiencies are continuous with it
    const near = solve(s, { wavelengthUm: 0.5 + 1e-9, thetaDeg: 30 }, { orders: 6 });
    expect(Math.abs(near.p.R - r.p.R)).toBeLessThan(1e-3);
  });
});
