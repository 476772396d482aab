/** Convergence control: orders and slices are raised until the efficiencies settle. */
import { describe, expect, it } from 'vitest';
import { designToModel, problemAt } from '../../src/design/index.ts';
import { solveConverged } from '../../src/optimize/index.ts';
import { solve } from '../../src/solver/index.ts';

const lamellar = {
  period: '800 nm',
  substrate: 1.5,
  grating: { profile: 'lamellar', duty: 0.5, depth: '300 nm', ridge: 1.5 },
  incidence: { wavelength: '600 nm', angleDeg: 10 },
  orders: 4,
};

describe('solveConverged', () => {
  it('raises the orders of a dielectric lamellar grating until every efficiency changes by less than the tolerance, and returns the solve at the final M', () => {
    const c = solveConverged(lamellar, { orders: 'auto', tolerance: 1e-5 });
    expect(c.converged).toBe(true);
    expect(c.ordersChange).toBeLessThan(1e-5);
    expect(c.history.length).toBeGreaterThanOrEqual(2);
    for (let i = 1; i < c.history.length; i++) expect(c.history[i]!.orders).toBeGreaterThan(c.history[i - 1]!.orders);
    const p = problemAt({ ...designToModel(lamellar), orders: c.orders });
    const direct = solve(p.structure, p.incidence, p.options);
    expect(direct.s.reflected.map((o) => o.efficiency)).toEqual(c.result.s.reflected.map((o) => o.efficiency));
  });

  it('starts from at least every propagating order plus a margin (λ/Λ = 0.75 in n = 1.5: |m| ≤ 2 propagate, grating equation)', () => {
    const c = solveConverged(lamellar, { orders: 'auto', tolerance: 1e-3 });
    expect(c.history[0]!.orders).toBeGreaterThanOrEqual(7);
  });

  it('doubles the slices of a sawtooth until the staircase settles, reporting the last change', () => {
    const saw = { period: '1 um', substrate: 1.5, grating: { profile: 'sawtooth', blazeDeg: 15, ridge: 1.5 }, incidence: { wavelength: '600 nm', angleDeg: 5 }, orders: 8, slices: 4 };
    const c = solveConverged(saw, { orders: 8, slices: 'auto', tolerance: 2e-3, maxSlices: 64 });
    expect(c.slices).toBeGreaterThan(4);
    expect(Number.isFinite(c.slicesChange)).toBe(true);
    const changes = c.history.slice(1).map((h) => h.change);
    expect(changes[changes.length - 1]).toBeLessThan(changes[0]!);
    expect(c.converged).toBe(c.slicesChange < 2e-3);
  });

  it('says when the ceiling stops it before convergence', () => {
    const c = solveConverged(lamellar, { orders: 'auto', tolerance: 1e-14, maxOrders: 12 });
    expect(c.converged).toBe(false);
    expect(c.orders).toBe(12);
  });
});
