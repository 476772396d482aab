/**
 * Homogeneous stacks against the closed forms of thin-film optics: Fresnel coefficients of one
 * interface and the Airy summation of a single film, TE and TM, oblique and lossy (Born & Wolf,
 * Principles of Optics, 7th ed., §1.5.2 and §1.6.4; exp(−iωt), ñ = n + iκ).
 */
import { describe, expect, it } from 'vitest';
import { solve } from '../../src/solver/index.ts';
import type { Complex, Layer, Structure } from '../../src/solver/index.ts';
import ref from '../../reference/exact-limits.json' with { type: 'json' };
import { abs2, add, c, type C, div, exp, mul, sqrtUp, sub } from './complex.ts';

const cx = (re: number, im = 0): Complex => ({ re, im });

/** cos of the angle in medium n for tangential k (n_c sinθ): √(ε − kt²)/n. Returns n·cosθ. */
function ncos(n: C, kt: number): C {
  return sqrtUp(sub(mul(n, n), c(kt * kt)));
}

/** Fresnel r for TE (s) and TM (p, field convention: ratio of tangential H, i.e. of Hy). */
function fresnel(n1: C, n2: C, kt: number, pol: 'TE' | 'TM'): C {
  const a = ncos(n1, kt);
  const b = ncos(n2, kt);
  if (pol === 'TE') return div(sub(a, b), add(a, b));
  // r_p for Hy: (ε2·kz1 − ε1·kz2)/(ε2·kz1 + ε1·kz2)
  const e1 = mul(n1, n1);
  const e2 = mul(n2, n2);
  return div(sub(mul(e2, a), mul(e1, b)), add(mul(e2, a), mul(e1, b)));
}

/** Airy: film n2 of thickness d between n1 (cover) and n3. */
function airyR(n1: C, n2: C, n3: C, d: number, lambda: number, kt: number, pol: 'TE' | 'TM'): number {
  const r12 = fresnel(n1, n2, kt, pol);
  const r23 = fresnel(n2, n3, kt, pol);
  const beta = mul(c(0, (2 * Math.PI * d) / lambda), ncos(n2, kt)); // i·k0·d·n2cosθ2
  const e = exp(mul(c(2), beta));
  const r = div(add(r12, mul(r23, e)), add(c(1), mul(mul(r12, r23), e)));
  return abs2(r);
}

const structure = (cover: Complex, substrate: Complex, layers: Layer[] = []): Structure => ({
  periodUm: 0.4,
  cover,
  substrate,
  layers,
});

describe('homogeneous stacks reduce to thin-film optics', () => {
  it('solve() gives the Fresnel reflectance of fused silica at normal incidence (Malitson index, Born & Wolf)', () => {
    const r = solve(structure(cx(1), cx(ref.fresnelFusedSilica.n)), { wavelengthUm: 0.6328, thetaDeg: 0 }, { orders: 3 });
    expect(Math.abs(r.s.R - ref.fresnelFusedSilica.R)).toBeLessThan(5e-8);
    expect(Math.abs(r.p.R - ref.fresnelFusedSilica.R)).toBeLessThan(5e-8);
    expect(Math.abs(r.s.R + r.s.T - 1)).toBeLessThan(1e-14);
  });

  const cases: Array<{ name: string; n1: number; n3: C; theta: number }> = [
    { name: 'glass 45°', n1: 1, n3: c(1.5), theta: 45 },
    { name: 'from glass into air beyond the critical angle', n1: 1.5, n3: c(1), theta: 50 },
    { name: 'gold-like metal 30°', n1: 1, n3: c(0.31228, 3.14605), theta: 30 },
    { name: 'lossy dielectric 70°', n1: 1.33, n3: c(2.1, 0.3), theta: 70 },
  ];
  for (const k of cases) {
    for (const pol of ['TE', 'TM'] as const) {
      it(`single interface, ${k.name}, ${pol}: R equals the Fresnel |r|² (Born & Wolf §1.5.2)`, () => {
        const lambda = 0.55;
        const r = solve(structure(cx(k.n1), cx(k.n3[0], k.n3[1])), { wavelengthUm: lambda, thetaDeg: k.theta }, { orders: 2 });
        const kt = k.n1 * Math.sin((k.theta * Math.PI) / 180);
        const expected = abs2(fresnel(c(k.n1), k.n3, kt, pol));
        const got = pol === 'TE' ? r.s.R : r.p.R;
        expect(Math.abs(got - expected), `R ${pol}: got ${got}, expected ${expected}`).toBeLessThan(1e-13);
        // no layers: whatever is not reflected enters the substrate, absorbing or not
        const resp = pol === 'TE' ? r.s : r.p;
        expect(Math.abs(resp.A), `A ${pol}`).toBeLessThan(1e-13);
      });
    }
  }

  const films: Array<{ name: string; n2: C; n3: C; d: number; theta: number }> = [
    { name: 'quarter-wave MgF2-like film on glass', n2: c(1.38), n3: c(1.52), d: 0.55 / (4 * 1.38), theta: 0 },
    { name: 'high-index film 40°', n2: c(2.3), n3: c(1.45), d: 0.21, theta: 40 },
    { name: 'thin absorbing metal film 25°', n2: c(0.5, 3.2), n3: c(1.5), d: 0.02, theta: 25 },
    { name: 'lossy film on absorbing substrate 60°', n2: c(1.9, 0.05), n3: c(3.5, 0.02), d: 0.33, theta: 60 },
  ];
  for (const f of films) {
    for (const pol of ['TE', 'TM'] as const) {
      it(`single film, ${f.name}, ${pol}: R equals the Airy formula (Born & Wolf §1.6.4)`, () => {
        const lambda = 0.55;
        const layer: Layer = { thicknessUm: f.d, profile: { kind: 'uniform', index: cx(f.n2[0], f.n2[1]) } };
        const r = solve(structure(cx(1), cx(f.n3[0], f.n3[1]), [layer]), { wavelengthUm: lambda, thetaDeg: f.theta }, { orders: 1 });
        const kt = Math.sin((f.theta * Math.PI) / 180);
        const expected = airyR(c(1), f.n2, f.n3, f.d, lambda, kt, pol);
        const got = pol === 'TE' ? r.s.R : r.p.R;
        expect(Math.abs(got - expected), `R ${pol}: got ${got}, expected ${expected}`).toBeLessThan(1e-12);
      });
      it(`single film, ${f.name}, ${pol}: a vanishing index contrast in a lamellar layer gives the film`, () => {
        // two segments differing by 1e-13 in index: the modulated (eigenmode) path, not the
        // homogeneous shortcut, must reproduce the film
        const lambda = 0.55;
        const n2a = cx(f.n2[0], f.n2[1]);
        const n2b = cx(f.n2[0] + 1e-13, f.n2[1]);
        const layer: Layer = {
          thicknessUm: f.d,
          profile: { kind: 'segments', segments: [{ from: 0, to: 0.3, index: n2a }, { from: 0.3, to: 1, index: n2b }] },
        };
        const r = solve(structure(cx(1), cx(f.n3[0], f.n3[1]), [layer]), { wavelengthUm: lambda, thetaDeg: f.theta }, { orders: 4 });
        const kt = Math.sin((f.theta * Math.PI) / 180);
        const expected = airyR(c(1), f.n2, f.n3, f.d, lambda, kt, pol);
        const got = pol === 'TE' ? r.s.R : r.p.R;
        expect(Math.abs(got - expected), `R ${pol}: got ${got}, expected ${expected}`).toBeLessThan(1e-10);
      });
    }
  }

  it('conical incidence on a film matches Airy for s and p, with no polarization conversion', () => {
    const lambda = 0.6;
    const layer: Layer = { thicknessUm: 0.17, profile: { kind: 'uniform', index: cx(2.0, 0.01) } };
    const r = solve(structure(cx(1), cx(1.5)), { wavelengthUm: lambda, thetaDeg: 35, phiDeg: 50 }, { orders: 1 });
    const r2 = solve(structure(cx(1), cx(1.5), [layer]), { wavelengthUm: lambda, thetaDeg: 35, phiDeg: 50 }, { orders: 1 });
    const kt = Math.sin((35 * Math.PI) / 180);
    expect(Math.abs(r.s.R - abs2(fresnel(c(1), c(1.5), kt, 'TE')))).toBeLessThan(1e-13);
    expect(Math.abs(r.p.R - abs2(fresnel(c(1), c(1.5), kt, 'TM')))).toBeLessThan(1e-13);
    expect(Math.abs(r2.s.R - airyR(c(1), c(2.0, 0.01), c(1.5), 0.17, lambda, kt, 'TE'))).toBeLessThan(1e-12);
    expect(Math.abs(r2.p.R - airyR(c(1), c(2.0, 0.01), c(1.5), 0.17, lambda, kt, 'TM'))).toBeLessThan(1e-12);
    const o = r2.s.reflected.find((x) => x.m === 0)!;
    expect(Math.hypot(o.amplitudeP.re, o.amplitudeP.im)).toBeLessThan(1e-13);
  });
});
