/**
 * Monte Carlo tolerances: the statistics machinery on figures of merit whose distributions are
 * known, the design-bound analysis (zero tolerances, sensitivities against independent finite
 * differences, failed samples), reproducibility across runs and worker counts, and validation.
 */
import { describe, expect, it } from 'vitest';
import { designToModel, InputError, problemAt } from '../../src/design/index.ts';
import { drawSamples, monteCarlo, percentile, sensitivities, summarize, toleranceAnalysis } from '../../src/optimize/index.ts';
import { solve } from '../../src/solver/index.ts';

/** Binary phase grating near its π step (Λ = 10 µm, λ = 1 µm, n = 1.5); small orders keep it quick. */
const binary = {
  title: 'binary phase grating',
  periodUm: 10,
  cover: 'air',
  substrate: 1.5,
  grating: { profile: 'lamellar', duty: 0.5, depth: '950 nm', ridge: 1.5 },
  incidence: { wavelength: '1000 nm', angleDeg: 0 },
  orders: 16,
};

/** T(+1) in TE of the binary grating with a depth (nm) and duty, solved independently. */
function t1(depthNm: number, duty: number): number {
  const p = problemAt(designToModel({ ...binary, grating: { ...binary.grating, depth: `${depthNm} nm`, duty } }));
  const r = solve(p.structure, p.incidence, p.options);
  return r.s.transmitted.find((o) => o.m === 1)!.efficiency;
}

describe('percentiles follow definition 7 of Hyndman & Fan (Am. Stat. 50 (1996) 361), the R and NumPy default', () => {
  it('interpolates between order statistics at h = (n − 1)p', () => {
    expect(percentile([1, 2, 3, 4], 0.5)).toBe(2.5);
    // h = 4 · 0.4 = 1.6 → 20 + 0.6 · (35 − 20) = 29 (worked by hand from the definition)
    expect(percentile([15, 20, 35, 40, 50], 0.4)).toBeCloseTo(29, 12);
    expect(percentile([15, 20, 35, 40, 50], 0)).toBe(15);
    expect(percentile([15, 20, 35, 40, 50], 1)).toBe(50);
    expect(percentile([7], 0.95)).toBe(7);
  });

  it('summarizes with the sample standard deviation (n − 1) and skips non-finite values', () => {
    const s = summarize([2, 4, 4, 4, 5, 5, 7, 9, Number.NaN]);
    expect(s.count).toBe(8);
    expect(s.mean).toBe(5);
    expect(s.std).toBeCloseTo(Math.sqrt(32 / 7), 12); // Σ(x − 5)² = 32 (by hand)
  });
});

describe('the Monte Carlo machinery reproduces known distributions through a linear figure of merit', () => {
  const N = 20_000;

  it('uniform: η = 0.2 + 0.01·x with x uniform on 100 ± 10 — mean 1.2, percentiles 1.2 + 0.1·(2p − 1), σ = 0.1/√3 (definition of the uniform law)', async () => {
    const r = await monteCarlo({
      nominal: [100],
      distributions: [{ kind: 'uniform', halfWidth: 10 }],
      samples: N,
      seed: 11,
      evaluate: async (ps) => ps.map(([x]) => 0.2 + 0.01 * x!),
    });
    const s = r.stats!;
    // sampling errors (N = 20000): mean 0.1/√(3N) = 4e-4; a p-quantile √(p(1−p)/N) · 0.2 = 3.1e-4 at 5 %;
    // bounds ≈ 5 standard errors
    expect(Math.abs(s.mean - 1.2)).toBeLessThan(2e-3);
    expect(Math.abs(s.p5 - 1.11)).toBeLessThan(1.6e-3);
    expect(Math.abs(s.p50 - 1.2)).toBeLessThan(3.5e-3);
    expect(Math.abs(s.p95 - 1.29)).toBeLessThan(1.6e-3);
    expect(Math.abs(s.std - 0.1 / Math.sqrt(3))).toBeLessThan(1.5e-3);
    expect(s.min).toBeGreaterThanOrEqual(1.1);
    expect(s.max).toBeLessThanOrEqual(1.3);
  });

  it('normal: η = x with x normal (0.5, σ 0.02) — 5 %/95 % at 0.5 ∓ 1.6449σ (standard normal quantiles, Abramowitz & Stegun table 26.1) and a yield of 5 % above the 95 % point', async () => {
    const sigma = 0.02;
    const spec = 0.5 + 1.6449 * sigma;
    const r = await monteCarlo({ nominal: [0.5], distributions: [{ kind: 'normal', sigma }], samples: N, seed: 5, evaluate: async (ps) => ps.map(([x]) => x!), spec });
    const s = r.stats!;
    // standard errors: mean σ/√N = 1.4e-4; std σ/√(2N) = 1e-4; 5 % quantile √(.05·.95/N)/φ(1.645) · σ = 3e-4;
    // yield √(.05·.95/N) = 1.5e-3; bounds ≈ 5 standard errors
    expect(Math.abs(s.mean - 0.5)).toBeLessThan(7e-4);
    expect(Math.abs(s.std - sigma)).toBeLessThan(5e-4);
    expect(Math.abs(s.p5 - (0.5 - 1.6449 * sigma))).toBeLessThan(1.5e-3);
    expect(Math.abs(s.p95 - spec)).toBeLessThan(1.5e-3);
    expect(Math.abs(s.p50 - 0.5)).toBeLessThan(1e-3);
    expect(Math.abs(r.yield! - 0.05)).toBeLessThan(7.5e-3);
    expect(r.failed).toBe(0);
  });

  it('two independent normals add in quadrature: η = 2x − 3y has σ = √(4σx² + 9σy²) (variance of a sum of independent variables)', async () => {
    const r = await monteCarlo({
      nominal: [1, 2],
      distributions: [
        { kind: 'normal', sigma: 0.1 },
        { kind: 'normal', sigma: 0.05 },
      ],
      samples: N,
      seed: 8,
      evaluate: async (ps) => ps.map(([x, y]) => 2 * x! - 3 * y!),
    });
    const sd = Math.sqrt(4 * 0.01 + 9 * 0.0025); // 0.25
    expect(Math.abs(r.stats!.mean - (2 - 6))).toBeLessThan(5 * (sd / Math.sqrt(N)));
    expect(Math.abs(r.stats!.std - sd)).toBeLessThan(5 * (sd / Math.sqrt(2 * N)));
  });

  it('gives exactly the nominal values for zero widths', () => {
    const s = drawSamples([0.1 + 0.2, 700], [{ kind: 'uniform', halfWidth: 0 }, { kind: 'normal', sigma: 0 }], 50, 3);
    for (const p of s) expect(p).toEqual([0.1 + 0.2, 700]);
  });

  it('counts failed samples as not meeting the spec', async () => {
    const r = await monteCarlo({
      nominal: [0],
      distributions: [{ kind: 'uniform', halfWidth: 1 }],
      samples: 1000,
      seed: 2,
      evaluate: async (ps) => ps.map(([x]) => (x! < 0 ? Number.NaN : 1)),
      spec: 0.5,
    });
    expect(r.failed).toBeGreaterThan(400);
    expect(r.yield).toBeCloseTo((1000 - r.failed) / 1000, 12);
    expect(r.stats!.count).toBe(1000 - r.failed);
  });

  it('takes central differences of a cubic exactly up to the h² term: d/dx x³ at 2 with h = 0.1 → 12 + h² (Taylor series)', async () => {
    const [s] = await sensitivities(async (ps) => ps.map(([x]) => x! ** 3), [2], [0.1]);
    expect(s!.derivative).toBeCloseTo(12.01, 10);
  });
});

describe('toleranceAnalysis() of a grating design', () => {
  it('gives every sample the nominal efficiency when every tolerance is zero', async () => {
    const r = await toleranceAnalysis(binary, {
      efficiency: { order: 1, side: 'T', polarization: 'TE' },
      parameters: [
        { path: 'grating.depth', plusMinus: '0 nm' },
        { path: 'grating.duty', sigma: 0 },
      ],
      samples: 12,
    });
    expect(r.draws).toHaveLength(12);
    for (const d of r.draws) {
      expect(d.values).toEqual([950, 0.5]);
      expect(d.efficiency).toBe(r.nominal);
    }
    expect(r.stats!.std).toBe(0);
    expect(r.stats!.p5).toBe(r.nominal);
    expect(r.stats!.p95).toBe(r.nominal);
    expect(r.nominal).toBe(t1(950, 0.5)); // the nominal is the plain solve, to the bit
    // zero tolerances fall back to the stated default steps: 1 nm and 0.001
    expect(r.parameters.map((p) => p.sensitivity.step)).toEqual([1, 0.001]);
  });

  it('reports sensitivities equal to central differences computed independently with solve()', async () => {
    const r = await toleranceAnalysis(binary, {
      efficiency: { order: 1, side: 'T', polarization: 'TE' },
      parameters: [
        { path: 'grating.depth', plusMinus: '20 nm' }, // default step: a tenth, 2 nm
        { path: 'grating.duty', sigma: 0.02, step: 0.005 },
      ],
      samples: 8,
    });
    const dDepth = (t1(952, 0.5) - t1(948, 0.5)) / 4;
    const dDuty = (t1(950, 0.505) - t1(950, 0.495)) / 0.01;
    expect(r.parameters[0]!.sensitivity.step).toBe(2);
    expect(r.parameters[0]!.sensitivity.derivative).toBeCloseTo(dDepth, 12);
    expect(r.parameters[1]!.sensitivity.derivative).toBeCloseTo(dDuty, 10);
    expect(r.parameters[1]!.swing).toBeCloseTo(dDuty * 0.02, 10);
    // below the π step T(+1) still rises with depth (scalar theory: sin² of half the phase step)
    expect(r.parameters[0]!.sensitivity.derivative).toBeGreaterThan(0);
    // every sample's efficiency is the plain solve of its design
    const d = r.draws[3]!;
    expect(d.efficiency).toBe(t1(d.values[0]!, d.values[1]!));
  });

  it('is reproducible: the same numbers for the same seed, others for another seed', async () => {
    const spec = { efficiency: { order: 1, side: 'T', polarization: 'TE' }, parameters: [{ path: 'grating.depth', sigma: '15 nm' }], samples: 10, seed: 77, spec: 0.38 };
    const a = await toleranceAnalysis(binary, spec);
    const b = await toleranceAnalysis(binary, spec);
    const c = await toleranceAnalysis(binary, { ...spec, seed: 78 });
    expect(b.draws).toEqual(a.draws);
    expect(b.stats).toEqual(a.stats);
    expect(b.yield).toBe(a.yield);
    expect(c.draws).not.toEqual(a.draws);
  });

  it('reports samples whose design is invalid as failed, with the reason', async () => {
    const r = await toleranceAnalysis(binary, {
      efficiency: { order: 1, side: 'T', polarization: 'TE' },
      parameters: [{ path: 'grating.duty', sigma: 0.3 }], // P(duty ∉ (0, 1)) = P(|z| > 1.67) ≈ 9.5 %
      samples: 60,
      seed: 1,
      spec: 0,
    });
    expect(r.failed).toBeGreaterThan(0);
    expect(r.failures[0]).toMatch(/duty/);
    expect(r.yield).toBeCloseTo((60 - r.failed) / 60, 12);
    expect(r.draws.filter((d) => d.efficiency === null)).toHaveLength(r.failed);
  });

  const bad: Array<[string, unknown, RegExp]> = [
    ['both plusMinus and sigma', { parameters: [{ path: 'grating.depth', plusMinus: '5 nm', sigma: '5 nm' }] }, /^tolerance\.parameters\[0\]: give "plusMinus" \(uniform on nominal ± value\) or "sigma" \(normal\), exactly one/],
    ['a negative width', { parameters: [{ path: 'grating.duty', sigma: -0.1 }] }, /^tolerance\.parameters\[0\]\.sigma: expected a width ≥ 0/],
    ['a length without a unit', { parameters: [{ path: 'grating.depth', plusMinus: 5 }] }, /^tolerance\.parameters\[0\]\.plusMinus: 'grating\.depth' is a length: write it with a unit/],
    ['a part the design lacks', { parameters: [{ path: 'grating.coating.thickness', plusMinus: '5 nm' }] }, /^tolerance\.parameters\[0\]\.path: the design has no 'grating\.coating'/],
    ['no samples', { parameters: [{ path: 'grating.depth', plusMinus: '5 nm' }], samples: 0 }, /^tolerance\.samples: /],
    ['a misspelt field', { parameters: [{ path: 'grating.depth', plusminus: '5 nm' }] }, /tolerance\.parameters\[0\]\.plusminus: unknown field/],
  ];
  for (const [what, extra, re] of bad) {
    it(`rejects ${what}, naming the field`, async () => {
      const e = await toleranceAnalysis(binary, { efficiency: { order: 1, side: 'T' }, ...(extra as object) }).catch((x: unknown) => x);
      expect(e).toBeInstanceOf(InputError);
      expect((e as Error).message).toMatch(re);
    });
  }
});
