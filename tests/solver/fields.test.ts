/**
 * Near fields against physics: the standing wave of a uniform film (transfer-matrix closed form,
 * Born & Wolf, Principles of Optics, §1.6) and continuity of the tangential E and H across every
 * interface of a grating (Maxwell's boundary conditions).
 */
import { describe, expect, it } from 'vitest';
import { nearField } from '../../src/solver/index.ts';
import type { Complex, NearField, Structure } from '../../src/solver/index.ts';
import { add, c, type C, div, exp, mul, sqrtUp, sub } from './complex.ts';

const cx = (re: number, im = 0): Complex => ({ re, im });

function at(f: NearField, comp: Float64Array, iz: number, ix: number): C {
  const nx = f.xUm.length;
  return [comp[2 * (iz * nx + ix)]!, comp[2 * (iz * nx + ix) + 1]!];
}

describe('near fields', () => {
  it('TE field in and around a uniform absorbing film equals the analytic standing wave (Born & Wolf §1.6)', () => {
    const lambda = 0.6;
    const theta = 30;
    const n1 = c(1);
    const n2 = c(1.8, 0.05);
    const n3 = c(1.5);
    const d = 0.23;
    const s: Structure = { periodUm: 0.5, cover: cx(1), substrate: cx(1.5), layers: [{ thicknessUm: d, profile: { kind: 'uniform', index: cx(1.8, 0.05) } }] };
    const f = nearField(s, { wavelengthUm: lambda, thetaDeg: theta }, { orders: 2 }, 'TE', { nx: 4, periods: 1, samplesPerUm: 40 });
    // closed form: kz_i = k0·√(n_i² − sin²θ); Ey = A_i e^{i kz z} + B_i e^{−i kz z}; Ey and Hx = ∂Ey/∂z/(i) continuous
    const k0 = (2 * Math.PI) / lambda;
    const kt = Math.sin((theta * Math.PI) / 180);
    const kz = [n1, n2, n3].map((n) => mul(c(k0), sqrtUp(sub(mul(n, n), c(kt * kt)))));
    // substrate: only forward, amplitude t at z = d; go upward with interface matching
    // in film: Ey(z) = a e^{i k2 (z − d)} + b e^{−i k2 (z − d)}; at z = d: a + b = t, k2(a − b) = k3 t
    const t: C = c(1); // unnormalized, fix below
    const a2 = mul(c(0.5), mul(t, add(c(1), div(kz[2]!, kz[1]!))));
    const b2 = mul(c(0.5), mul(t, sub(c(1), div(kz[2]!, kz[1]!))));
    // at z = 0: E0 = a2 e^{−i k2 d} + b2 e^{i k2 d}, H0 ∝ k2 (a2 e^{−i k2 d} − b2 e^{i k2 d})
    const ea = mul(a2, exp(mul(c(0, -1), mul(kz[1]!, c(d)))));
    const eb = mul(b2, exp(mul(c(0, 1), mul(kz[1]!, c(d)))));
    const E0 = add(ea, eb);
    const H0 = mul(kz[1]!, sub(ea, eb));
    // cover: E = i0 e^{i k1 z} + r e^{−i k1 z}: i0 + r = E0, k1 (i0 − r) = H0
    const i0 = mul(c(0.5), add(E0, div(H0, kz[0]!)));
    const scale = div(c(1), i0);
    const film = (z: number): C => mul(scale, add(mul(a2, exp(mul(c(0, 1), mul(kz[1]!, c(z - d))))), mul(b2, exp(mul(c(0, -1), mul(kz[1]!, c(z - d)))))));
    const cover = (z: number): C => {
      const r = sub(E0, i0);
      return mul(scale, add(mul(i0, exp(mul(c(0, 1), mul(kz[0]!, c(z))))), mul(r, exp(mul(c(0, -1), mul(kz[0]!, c(z)))))));
    };
    const subst = (z: number): C => mul(scale, mul(t, exp(mul(c(0, 1), mul(kz[2]!, c(z - d))))));
    let worst = 0;
    for (let iz = 0; iz < f.zUm.length; iz++) {
      const z = f.zUm[iz]!;
      const r = f.region[iz]!;
      const expected = r === -1 ? cover(z) : r === 0 ? film(z) : subst(z);
      // the field at x carries exp(i·kx·x); compare at x = 0
      const got = at(f, f.E.y, iz, 0);
      worst = Math.max(worst, Math.hypot(got[0] - expected[0], got[1] - expected[1]));
    }
    expect(worst).toBeLessThan(1e-12);
  });

  const grating: Structure = {
    periodUm: 0.7,
    cover: cx(1),
    substrate: cx(0.3, 4),
    layers: [
      { thicknessUm: 0.2, profile: { kind: 'segments', segments: [{ from: 0, to: 0.35, index: cx(2.1) }, { from: 0.35, to: 1, index: cx(1) }] } },
      { thicknessUm: 0.1, profile: { kind: 'uniform', index: cx(1.46) } },
      { thicknessUm: 0.15, profile: { kind: 'segments', segments: [{ from: 0, to: 0.6, index: cx(0.5, 3) }, { from: 0.6, to: 1, index: cx(1.46) }] } },
    ],
  };
  for (const [name, inc, pol] of [
    ['TE', { wavelengthUm: 0.55, thetaDeg: 15 }, 'TE'],
    ['TM', { wavelengthUm: 0.55, thetaDeg: 15 }, 'TM'],
    ['conical, mixed polarization', { wavelengthUm: 0.55, thetaDeg: 25, phiDeg: 40 }, { s: cx(1), p: cx(0, 1) }],
  ] as const) {
    it(`tangential E and H are continuous across every interface of a lossy multilayer grating (${name})`, () => {
      const f = nearField(grating, inc, { orders: 10 }, pol, { nx: 24, periods: 1, samplesPerUm: 20 });
      const nx = f.xUm.length;
      let checked = 0;
      for (let iz = 0; iz + 1 < f.zUm.length; iz++) {
        if (f.region[iz] === f.region[iz + 1] || Math.abs(f.zUm[iz]! - f.zUm[iz + 1]!) > 1e-12) continue;
        checked++;
        for (const comp of [f.E.x, f.E.y, f.H.x, f.H.y]) {
          let scale = 1e-300;
          let diff = 0;
          for (let i = 0; i < nx; i++) {
            const a = at(f, comp, iz, i);
            const b = at(f, comp, iz + 1, i);
            scale = Math.max(scale, Math.hypot(a[0], a[1]));
            diff = Math.max(diff, Math.hypot(a[0] - b[0], a[1] - b[1]));
          }
          // same Fourier truncation on both sides: continuity holds to round-off, not truncation
          expect(diff / Math.max(scale, 1e-3), `interface at z = ${f.zUm[iz]}`).toBeLessThan(1e-9);
        }
      }
      expect(checked).toBe(4);
      expect(f.peaks.length).toBeGreaterThanOrEqual(4);
      expect(f.peaks.every((p) => Number.isFinite(p.peak))).toBe(true);
    });
  }

  it('rejects a meaningless grid with a message naming it', () => {
    expect(() => nearField(grating, { wavelengthUm: 0.5, thetaDeg: 0 }, { orders: 2 }, 'TE', { nx: 1 })).toThrow(/grid\.nx/);
  });
});
