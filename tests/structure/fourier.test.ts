import { describe, expect, it } from 'vitest';
import type { Complex, Profile } from '../../src/solver/index.ts';
import { type GeometryLayer, toSolverLayers } from '../../src/structure/index.ts';

type C = [number, number];
const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
const div = (a: C, b: C): C => {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
};

/** Index n with n² = ε (principal root), so a test can ask for a given complex ε. */
function indexFor(eps: C): Complex {
  const m = Math.hypot(eps[0], eps[1]);
  const re = Math.sqrt((m + eps[0]) / 2);
  const im = Math.sqrt((m - eps[0]) / 2) * (eps[1] < 0 ? -1 : 1);
  return { re, im };
}

/** k-th Fourier coefficient of f over one period by the trapezoidal rule on Q points (independent check). */
function quadrature(f: (x: number) => C, k: number, Q: number): C {
  let re = 0;
  let im = 0;
  for (let j = 0; j < Q; j++) {
    const x = j / Q;
    const v = mul(f(x), [Math.cos(-2 * Math.PI * k * x), Math.sin(-2 * Math.PI * k * x)]);
    re += v[0] / Q;
    im += v[1] / Q;
  }
  return [re, im];
}

function fourierOf(p: Profile): { eps: ReadonlyArray<Complex>; inv: ReadonlyArray<Complex> } {
  if (p.kind !== 'fourier') throw new Error(`expected a fourier profile, got ${p.kind}`);
  return { eps: p.permittivity, inv: p.inversePermittivity };
}

describe('toSolverLayers() for cosine slices', () => {
  const cases: Array<{ name: string; eps0: C; deltaEps: number; phaseRad: number }> = [
    { name: 'lossless dielectric', eps0: [2.25, 0], deltaEps: 0.3, phaseRad: 0.4 },
    { name: 'absorbing, negative modulation', eps0: [2.24, 0.3], deltaEps: -0.8, phaseRad: -1.1 },
    { name: 'metal-like (Re ε < 0), where the other square-root branch is needed', eps0: [-3, 0.5], deltaEps: 1, phaseRad: 2 },
    { name: 'strong modulation (slowly decaying series)', eps0: [2, 0.01], deltaEps: 1.9, phaseRad: 0 },
  ];
  for (const c of cases) {
    it(`gives exact coefficients of ε and 1/ε: ${c.name}`, () => {
      const K = 12;
      const [layer] = toSolverLayers([{ kind: 'cosine', thicknessUm: 1, material: 'M', deltaEps: c.deltaEps, phaseRad: c.phaseRad }], () => indexFor(c.eps0), K);
      const { eps, inv } = fourierOf(layer!.profile);
      expect(eps.length).toBe(2 * K + 1);
      const epsAt = (x: number): C => [c.eps0[0] + c.deltaEps * Math.cos(2 * Math.PI * x - c.phaseRad), c.eps0[1]];
      for (let k = -K; k <= K; k++) {
        const e = quadrature(epsAt, k, 64);
        const i = quadrature((x) => div([1, 0], epsAt(x)), k, 4096); // geometric convergence for a smooth periodic integrand
        // definition of the coefficients; the sum 1/ε is checked against quadrature, not the closed form
        expect(eps[k + K]!.re).toBeCloseTo(e[0], 13);
        expect(eps[k + K]!.im).toBeCloseTo(e[1], 13);
        expect(inv[k + K]!.re).toBeCloseTo(i[0], 12);
        expect(inv[k + K]!.im).toBeCloseTo(i[1], 12);
      }
    });
  }

  it('keeps only the mean at K = 0 and refuses a permittivity that vanishes', () => {
    const [layer] = toSolverLayers([{ kind: 'cosine', thicknessUm: 1, material: 'M', deltaEps: 0.5, phaseRad: 0 }], () => ({ re: 1.5, im: 0 }), 0);
    const { eps, inv } = fourierOf(layer!.profile);
    expect(eps).toEqual([{ re: 2.25, im: 0 }]);
    expect(inv[0]!.re).toBeCloseTo(1 / Math.sqrt(2.25 * 2.25 - 0.5 * 0.5), 14); // mean of 1/(a + b cos): 1/√(a² − b²) (integral tables)
    expect(() => toSolverLayers([{ kind: 'cosine', thicknessUm: 1, material: 'M', deltaEps: 3, phaseRad: 0 }], () => ({ re: 1.5, im: 0 }), 4)).toThrow(
      'layers[0].deltaEps: expected a modulation that keeps ε(x) = ε0 + Δε·cos(·) away from zero for every x, found Δε = 3 with ε0 = 2.25 + 0i',
    );
  });
});

describe('toSolverLayers() for uniform and segmented slices', () => {
  const table: Record<string, Complex> = { Al: { re: 1.2, im: 7 }, air: { re: 1, im: 0 }, SiO2: { re: 1.46, im: 0 } };
  it('resolves names, merges identical neighbours and segments of equal index, keeps the rest', () => {
    const layers: GeometryLayer[] = [
      { kind: 'uniform', thicknessUm: 0.1, material: 'SiO2' },
      { kind: 'uniform', thicknessUm: 0.2, material: 'SiO2' },
      { kind: 'segments', thicknessUm: 0.05, segments: [{ from: 0, to: 0.5, material: 'Al' }, { from: 0.5, to: 1, material: 'air' }] },
      { kind: 'segments', thicknessUm: 0.05, segments: [{ from: 0, to: 0.5, material: 'Al' }, { from: 0.5, to: 1, material: 'air' }] },
      { kind: 'segments', thicknessUm: 0.05, segments: [{ from: 0, to: 0.3, material: 'Al' }, { from: 0.3, to: 0.6, material: 'air' }, { from: 0.6, to: 1, material: 'vacuum' }] },
    ];
    const out = toSolverLayers(layers, (m) => table[m] ?? { re: 1, im: 0 }, 10);
    expect(out.length).toBe(3);
    expect(out[0]).toEqual({ thicknessUm: expect.closeTo(0.3, 15), profile: { kind: 'uniform', index: { re: 1.46, im: 0 } } });
    expect(out[1]!.thicknessUm).toBeCloseTo(0.1, 15);
    // 'air' and 'vacuum' resolve to the same index: one segment
    expect(out[2]!.profile).toEqual({ kind: 'segments', segments: [{ from: 0, to: 0.3, index: table.Al }, { from: 0.3, to: 1, index: { re: 1, im: 0 } }] });
  });

  it('asks for each material once per call', () => {
    const asked: string[] = [];
    toSolverLayers(
      [
        { kind: 'segments', thicknessUm: 0.05, segments: [{ from: 0, to: 0.5, material: 'Al' }, { from: 0.5, to: 1, material: 'air' }] },
        { kind: 'segments', thicknessUm: 0.05, segments: [{ from: 0, to: 0.4, material: 'Al' }, { from: 0.4, to: 1, material: 'air' }] },
      ],
      (m) => {
        asked.push(m);
        return table[m]!;
      },
      4,
    );
    expect(asked).toEqual(['Al', 'air']);
  });
});
