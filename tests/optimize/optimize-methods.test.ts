/**
 * The derivative-free methods and the random stream behind `furrow optimize` and
 * `furrow tolerance`, on functions whose minima are known in closed form.
 */
import { describe, expect, it } from 'vitest';
import { brentMinimize, createRandom, latinHypercube, nelderMead } from '../../src/optimize/index.ts';

describe('brentMinimize finds one-dimensional minima', () => {
  it('of a parabola, to the tolerance, in few evaluations (parabolic steps are exact on a parabola)', async () => {
    // minimum at x = 2 (by construction)
    const r = await brentMinimize((x) => (x - 2) ** 2 + 1, 0, 5, { tolerance: 1e-8 });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x - 2)).toBeLessThan(1e-7);
    expect(r.f).toBeCloseTo(1, 12);
    expect(r.evaluations).toBeLessThan(12);
  });

  it('of cos on [0, 2π]: x = π (analytic)', async () => {
    const r = await brentMinimize(Math.cos, 0, 2 * Math.PI, { tolerance: 1e-9 });
    expect(Math.abs(r.x - Math.PI)).toBeLessThan(1e-7);
  });

  it('at an end of the interval when the function falls toward it: |x| on [1, 3] → 1', async () => {
    const r = await brentMinimize((x) => Math.abs(x), 1, 3, { tolerance: 1e-8 });
    expect(r.x - 1).toBeLessThan(1e-7);
  });

  it('from a given start, without calling the function there, and with asynchronous functions', async () => {
    const calls: number[] = [];
    const r = await brentMinimize(
      async (x) => {
        calls.push(x);
        return (x - 0.3) ** 4; // minimum at 0.3, flat bottom: slower, still found
      },
      0,
      1,
      { tolerance: 1e-6, start: { x: 0.5, f: 0.2 ** 4 } },
    );
    expect(calls).not.toContain(0.5);
    expect(Math.abs(r.x - 0.3)).toBeLessThan(0.02); // x⁴ is flat within 0.02 to 1.6e-7: the tolerance on x is not resolvable in f
  });

  it('stops at maxEvaluations and says it did not converge', async () => {
    const r = await brentMinimize((x) => Math.sin(50 * x) + x, 0, 10, { tolerance: 1e-12, maxEvaluations: 5 });
    expect(r.evaluations).toBe(5);
    expect(r.converged).toBe(false);
  });

  it('refuses an empty interval and a non-positive tolerance', async () => {
    await expect(brentMinimize((x) => x, 1, 1, { tolerance: 1e-6 })).rejects.toThrow(/a < b/);
    await expect(brentMinimize((x) => x, 0, 1, { tolerance: 0 })).rejects.toThrow(/tolerance/);
  });
});

describe('nelderMead finds minima of several variables inside a box', () => {
  it('of a scaled quadratic: (1, −2) (by construction)', async () => {
    const r = await nelderMead(([x, y]) => (x! - 1) ** 2 + 10 * (y! + 2) ** 2, [0, 0], {
      lower: [-5, -5],
      upper: [5, 5],
      step: [0.5, 0.5],
      xTolerance: 1e-8,
      fTolerance: 1e-14,
    });
    expect(r.converged).toBe(true);
    expect(Math.abs(r.x[0]! - 1)).toBeLessThan(1e-6);
    expect(Math.abs(r.x[1]! + 2)).toBeLessThan(1e-6);
  });

  it("of Rosenbrock's valley: (1, 1) (Rosenbrock, Computer J. 3 (1960) 175)", async () => {
    const r = await nelderMead(([x, y]) => 100 * (y! - x! * x!) ** 2 + (1 - x!) ** 2, [-1.2, 1], {
      lower: [-2, -2],
      upper: [2, 2],
      step: [0.2, 0.2],
      xTolerance: 1e-9,
      fTolerance: 1e-16,
      maxEvaluations: 2000,
    });
    expect(Math.abs(r.x[0]! - 1)).toBeLessThan(1e-4);
    expect(Math.abs(r.x[1]! - 1)).toBeLessThan(1e-4);
  });

  it('on the bound when the unconstrained minimum lies outside, never calling outside the box', async () => {
    const seen: number[][] = [];
    const r = await nelderMead(
      (x) => {
        seen.push([...x]);
        return (x[0]! - 3) ** 2 + (x[1]! - 0.5) ** 2; // unconstrained minimum (3, 0.5); box x ≤ 1
      },
      [0.2, 0.2],
      { lower: [0, 0], upper: [1, 1], step: [0.25, 0.25], xTolerance: 1e-7, fTolerance: 1e-14 },
    );
    for (const p of seen) for (const v of p) expect(v >= 0 && v <= 1).toBe(true);
    expect(r.x[0]).toBeCloseTo(1, 6);
    expect(r.x[1]).toBeCloseTo(0.5, 5);
  });

  it('refuses a start outside the box and mismatched lengths', async () => {
    const o = { lower: [0], upper: [1], step: [0.1], xTolerance: 1e-6, fTolerance: 1e-9 };
    await expect(nelderMead(() => 0, [2], o)).rejects.toThrow(/outside/);
    await expect(nelderMead(() => 0, [0.5, 0.5], o)).rejects.toThrow(/one entry per variable/);
  });
});

describe('the random stream is reproducible and well spread', () => {
  it('gives the same numbers for the same seed and different numbers for another', () => {
    const a = createRandom(42);
    const b = createRandom(42);
    const c = createRandom(43);
    const xa = Array.from({ length: 100 }, () => a.uniform());
    const xb = Array.from({ length: 100 }, () => b.uniform());
    const xc = Array.from({ length: 100 }, () => c.uniform());
    expect(xa).toEqual(xb);
    expect(xa).not.toEqual(xc);
  });

  it('draws uniforms in [0, 1) with mean ½ and variance 1/12 (definition of the uniform law)', () => {
    const r = createRandom(1);
    const n = 100_000;
    let s = 0;
    let s2 = 0;
    let outside = 0;
    for (let i = 0; i < n; i++) {
      const u = r.uniform();
      if (!(u >= 0 && u < 1)) outside++;
      s += u;
      s2 += u * u;
    }
    expect(outside).toBe(0);
    const mean = s / n;
    // standard errors: mean √(1/12/n) = 9e-4, variance ≈ 2.7e-4; bounds ≈ 5 standard errors
    expect(Math.abs(mean - 0.5)).toBeLessThan(0.0045);
    expect(Math.abs(s2 / n - mean * mean - 1 / 12)).toBeLessThan(0.0014);
  });

  it('draws normals with mean 0, variance 1 and 5 % beyond ±1.96 (standard normal table)', () => {
    const r = createRandom(9);
    const n = 100_000;
    let s = 0;
    let s2 = 0;
    let tails = 0;
    for (let i = 0; i < n; i++) {
      const z = r.normal();
      s += z;
      s2 += z * z;
      if (Math.abs(z) > 1.959964) tails++;
    }
    // standard errors: mean 0.0032, variance 0.0045, tail share √(0.05·0.95/n) = 6.9e-4; bounds ≈ 5 SE
    expect(Math.abs(s / n)).toBeLessThan(0.016);
    expect(Math.abs(s2 / n - 1)).toBeLessThan(0.023);
    expect(Math.abs(tails / n - 0.05)).toBeLessThan(0.0035);
  });

  it('refuses seeds that are not whole numbers 0 … 2^32 − 1', () => {
    expect(() => createRandom(-1)).toThrow(/seed/);
    expect(() => createRandom(1.5)).toThrow(/seed/);
    expect(() => createRandom(2 ** 32)).toThrow(/seed/);
  });

  it('fills every stratum of every axis exactly once in a Latin hypercube (its definition)', () => {
    const n = 16;
    const pts = latinHypercube(n, 3, createRandom(5));
    expect(pts).toHaveLength(n);
    for (let d = 0; d < 3; d++) {
      const strata = pts.map((p) => Math.floor(p[d]! * n)).sort((a, b) => a - b);
      expect(strata).toEqual([...Array(n).keys()]);
    }
    expect(latinHypercube(n, 3, createRandom(5))).toEqual(pts);
  });
});
