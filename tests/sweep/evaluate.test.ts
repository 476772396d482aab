/**
 * Sweep evaluation: rows against single solves of the same designs, mounts against the grating
 * equation, failures that stay in their row, relative efficiency and PDL by their definitions,
 * and the reuse of models and layer modes.
 */
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { designToModel, problemAt } from '../../src/design/index.ts';
import { type OrderResult, type Response, solve, type SolveResult } from '../../src/solver/index.ts';
import { createEvalContext, designAt, evaluatePoint, formatCell, planSweep, pointAt, type SweepPlan, type SweepRow } from '../../src/sweep/index.ts';

/** The reference: the point's design file through the single-design path, solved without any cache. */
function fresh(plan: SweepPlan, i: number): SolveResult {
  const p = problemAt(designToModel(designAt(plan, pointAt(plan, i))));
  return solve(p.structure, p.incidence, p.options);
}
const cell = (plan: SweepPlan, row: SweepRow, col: string): number | string => {
  const k = plan.columns.indexOf(col);
  if (k < 0) throw new Error(`no column ${col}`);
  return row.cells[k]!;
};
const num = (plan: SweepPlan, row: SweepRow, col: string): number => {
  const v = cell(plan, row, col);
  if (typeof v !== 'number') throw new Error(`${col} is '${v}'`);
  return v;
};
const rowsOf = (plan: SweepPlan): SweepRow[] => {
  const ctx = createEvalContext();
  return Array.from({ length: plan.count }, (_, i) => evaluatePoint(plan, i, ctx));
};
const find = (r: Response, side: 'R' | 'T', m: number): OrderResult | undefined => (side === 'R' ? r.reflected : r.transmitted).find((o) => o.m === m);

/** A dielectric sinusoid (4 slices), 1 µm period, few orders so the file runs fast. */
const sinusoid = {
  period: '1 um',
  cover: 1,
  substrate: 1.5,
  grating: { profile: 'sinusoidal', depth: '150 nm', ridge: 1.5, slices: 4 },
  incidence: { wavelength: '500 nm', angleDeg: 10 },
  orders: 5,
};

describe('rows are single solves', () => {
  it('every output cell equals the same number read from solve() of designAt()\'s design, to the last bit', () => {
    const plan = planSweep(sinusoid, {
      parameters: [{ path: 'incidence.wavelength', values: ['500nm', '650nm'] }, { path: 'grating.depth', values: ['100nm', '180nm'] }],
      outputs: { phases: true },
    });
    const rows = rowsOf(plan);
    rows.forEach((row, i) => {
      expect(row.status).toBe('ok');
      const r = fresh(plan, i);
      const resp = { TE: r.s, TM: r.p } as const;
      for (const side of ['R', 'T'] as const) {
        for (const m of plan.orders) {
          for (const pol of ['TE', 'TM'] as const) {
            const o = find(resp[pol], side, m);
            expect(cell(plan, row, `${side}_${m}_${pol}`)).toBe(o ? o.efficiency : 0);
            const a = o && (pol === 'TE' ? o.amplitudeS : o.amplitudeP);
            expect(cell(plan, row, `phase_${side}_${m}_${pol}_deg`)).toBe(a ? (Math.atan2(a.im, a.re) * 180) / Math.PI : '');
          }
          // unpolarized: the mean of TE and TM (DEVELOPERS.md)
          const te = find(r.s, side, m)?.efficiency ?? 0;
          const tm = find(r.p, side, m)?.efficiency ?? 0;
          expect(cell(plan, row, `${side}_${m}_unpol`)).toBe(0.5 * (te + tm));
        }
      }
      for (const [pol, x] of [['TE', r.s], ['TM', r.p]] as const) {
        expect(cell(plan, row, `R_${pol}`)).toBe(x.R);
        expect(cell(plan, row, `T_${pol}`)).toBe(x.T);
        expect(cell(plan, row, `A_${pol}`)).toBe(x.A);
      }
      expect(cell(plan, row, 'status')).toBe('ok');
      expect(cell(plan, row, 'error')).toBe('');
      expect(row.cells.slice(0, 3)).toEqual([i, ...pointAt(plan, i).values]);
    });
  });

  it('a plan sent through structured cloning (as to a worker) gives the same rows', () => {
    const plan = planSweep(sinusoid, { parameters: [{ path: 'grating.depth', values: ['100nm', '180nm'] }] });
    const a = rowsOf(plan);
    const b = rowsOf(structuredClone(plan));
    expect(b).toEqual(a);
  });

  it('points that differ only in the incidence share one design model', () => {
    const plan = planSweep(sinusoid, { parameters: [{ path: 'incidence.wavelength', from: '500nm', to: '700nm', count: 3 }, { path: 'incidence.angleDeg', values: [0, 5] }] });
    const ctx = createEvalContext();
    for (let i = 0; i < plan.count; i++) evaluatePoint(plan, i, ctx);
    expect(ctx.stats).toEqual({ points: 6, failed: 0, modelsBuilt: 1 });
  });

  it('the order beyond a propagating window is 0 (no power) and its phase is empty', () => {
    // grating equation, θ = 10°, Λ = 1 µm: order −2 propagates in the substrate at 500 nm (|sin10° − 1.0| = 0.83 < 1.5)
    // and not at 900 nm (|0.17 − 1.8| = 1.63 > 1.5)
    const plan = planSweep(sinusoid, { parameters: [{ path: 'incidence.wavelength', values: ['500nm', '900nm'] }], outputs: { phases: true, sides: ['T'] } });
    expect(plan.orders).toContain(-2);
    const [first, second] = rowsOf(plan);
    expect(num(plan, first!, 'T_-2_TE')).toBeGreaterThan(0);
    expect(cell(plan, second!, 'T_-2_TE')).toBe(0);
    expect(cell(plan, second!, 'phase_T_-2_TE_deg')).toBe('');
  });

  it("'requested' is the design's polarization (TM here, and TE/TM when swept)", () => {
    const d = { ...sinusoid, incidence: { ...sinusoid.incidence, polarization: 'TM' } };
    const p1 = planSweep(d, { parameters: [{ path: 'grating.depth', values: ['120nm'] }], outputs: { polarizations: ['TM', 'requested'], orders: [-1, 0] } });
    const [row] = rowsOf(p1);
    expect(cell(p1, row!, 'R_-1_req')).toBe(cell(p1, row!, 'R_-1_TM'));
    const p2 = planSweep(sinusoid, { parameters: [{ path: 'incidence.polarization', values: ['TE', 'TM'] }], outputs: { polarizations: ['TE', 'TM', 'requested'], orders: [-1] } });
    const [te, tm] = rowsOf(p2);
    expect(cell(p2, te!, 'R_-1_req')).toBe(cell(p2, te!, 'R_-1_TE'));
    expect(cell(p2, tm!, 'R_-1_req')).toBe(cell(p2, tm!, 'R_-1_TM'));
    expect(cell(p2, te!, 'polarization')).toBe('TE');
  });

  it('evaluatePoint rejects an index outside the plan (a caller\'s bug, not a point failure)', () => {
    const plan = planSweep(sinusoid, { parameters: [{ path: 'grating.depth', values: ['100nm'] }] });
    expect(() => evaluatePoint(plan, 1, createEvalContext())).toThrow(RangeError);
  });
});

describe('mounts', () => {
  const water = { period: '0.8 um', cover: 1.33, substrate: '0.9+6.5i', grating: { profile: 'lamellar', duty: 0.5, depth: '100 nm', ridge: '0.9+6.5i' }, incidence: { wavelength: '500 nm' }, orders: 6 };

  it('Littrow: 2·Λ·n_c·sinθ = −m·λ (grating equation, common practice) and order −1 returns at −θ', () => {
    const plan = planSweep(water, { parameters: [{ path: 'incidence.wavelength', from: '400nm', to: '700nm', count: 4 }], mount: { kind: 'littrow', order: -1 }, outputs: { orders: [-1, 0], sides: ['R'] } });
    const rows = rowsOf(plan);
    rows.forEach((row, i) => {
      const theta = num(plan, row, 'theta_deg');
      const lambdaUm = (pointAt(plan, i).values[0] as number) / 1000;
      expect(Math.abs(2 * 0.8 * 1.33 * Math.sin((theta * Math.PI) / 180) - lambdaUm)).toBeLessThan(1e-15); // asin round trip: a few ulps
      expect(theta).toBeGreaterThan(0); // this project's sign: order −1 in Littrow at positive θ
      const back = find(fresh(plan, i).s, 'R', -1)!;
      expect(back.thetaDeg).toBeCloseTo(-theta, 9); // asin of a value computed from sinθ − λ/(Λ·n_c): ~1e-13 rad
      expect(cell(plan, row, 'R_-1_TE')).toBe(back.efficiency);
    });
  });

  it('constant deviation: θ + θm = δ for the order m (grating-equation.ts)', () => {
    const plan = planSweep({ ...water, cover: 1 }, { parameters: [{ path: 'incidence.wavelength', values: ['500nm', '800nm'] }], mount: { kind: 'deviation', order: 1, deviationDeg: 20 }, outputs: { orders: [1], sides: ['R'] } });
    rowsOf(plan).forEach((row, i) => {
      expect(row.status).toBe('ok');
      const out = find(fresh(plan, i).s, 'R', 1)!;
      expect(num(plan, row, 'theta_deg') + out.thetaDeg).toBeCloseTo(20, 9);
    });
  });

  it('a point where the mount has no solution fails with the reason; the others succeed', () => {
    // 2·Λ·n_c = 2.128 µm: no Littrow incidence for order −1 at λ = 2.2 µm
    const plan = planSweep(water, { parameters: [{ path: 'incidence.wavelength', values: ['600nm', '2200nm', '900nm'] }], mount: { kind: 'littrow', order: -1 }, outputs: { orders: [-1, 0] } });
    const rows = rowsOf(plan);
    expect(rows.map((r) => r.status)).toEqual(['ok', 'failed', 'ok']);
    expect(rows[1]!.error).toMatch(/^sweep\.mount: no Littrow incidence for order -1 at λ = 2\.2 µm.*is not below 1/);
    expect(cell(plan, rows[1]!, 'theta_deg')).toBe('');
    expect(cell(plan, rows[1]!, 'R_-1_TE')).toBe('');
    expect(cell(plan, rows[1]!, 'error')).toBe(rows[1]!.error);
    expect(typeof cell(plan, rows[2]!, 'R_-1_TE')).toBe('number');
  });
});

describe('failures stay in their row', () => {
  it('a material out of its range fails that point with the material\'s message', () => {
    const d = { ...sinusoid, substrate: 'fused-silica', grating: { ...sinusoid.grating, ridge: 'fused-silica' } };
    const plan = planSweep(d, { parameters: [{ path: 'incidence.wavelength', values: ['1um', '5um', '2um'] }], outputs: { orders: [0] } });
    const rows = rowsOf(plan);
    expect(rows.map((r) => r.status)).toEqual(['ok', 'failed', 'ok']);
    // the library's range for fused silica is 0.21–3.71 µm
    expect(rows[1]!.error).toMatch(/fused-silica'?: wavelength 5 µm is outside its valid range 0\.21–3\.71 µm/);
    const outputs = plan.columns.slice(2, -2);
    for (const c of outputs) expect(cell(plan, rows[1]!, c)).toBe('');
    expect(cell(plan, rows[1]!, 'status')).toBe('failed');
    expect(rows[1]!.cells.slice(0, 2)).toEqual([1, 5]);
    for (const c of outputs) expect(typeof cell(plan, rows[2]!, c)).toBe('number');
  });

  it('a combination the design rejects fails at that point only (trapezoid whose top width would be negative)', () => {
    // top width = duty·Λ − depth/tan(sidewall): 0.3 − 0.8/tan45° < 0; the other three combinations are valid
    const d = { ...sinusoid, grating: { profile: 'trapezoid', depth: '100 nm', duty: 0.3, sidewallDeg: 80, ridge: 1.5, slices: 2 } };
    const plan = planSweep(d, { parameters: [{ path: 'grating.depth', values: ['100nm', '800nm'] }, { path: 'grating.sidewallDeg', values: [80, 45] }], outputs: { orders: [0] } });
    const rows = rowsOf(plan);
    expect(rows.map((r) => r.status)).toEqual(['ok', 'ok', 'ok', 'failed']);
    expect(rows[3]!.error).toMatch(/^grating/);
    expect(rows[3]!.error).not.toMatch(/\n/);
  });
});

describe('relative efficiency and PDL', () => {
  /** Fresnel reflectances of a flat interface n1 → n2 (complex), Born & Wolf §1.5 / §13.2. */
  function fresnel(n1: number, n2: [number, number], thetaDeg: number): { s: number; p: number } {
    type C = [number, number];
    const mul = (a: C, b: C): C => [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
    const div = (a: C, b: C): C => {
      const d = b[0] * b[0] + b[1] * b[1];
      return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
    };
    const sqrt = (a: C): C => {
      const r = Math.hypot(a[0], a[1]);
      const re = Math.sqrt((r + a[0]) / 2);
      const im = Math.sign(a[1] || 1) * Math.sqrt((r - a[0]) / 2);
      return [re, im];
    };
    const t = (thetaDeg * Math.PI) / 180;
    const ci: C = [Math.cos(t), 0];
    const st = div([n1 * Math.sin(t), 0], n2);
    const ct = sqrt([1 - mul(st, st)[0], -mul(st, st)[1]]);
    const a = [n1 * ci[0], 0] as C;
    const b = mul(n2, ct);
    const rs = div([a[0] - b[0], a[1] - b[1]], [a[0] + b[0], a[1] + b[1]]);
    const c = mul(n2, ci);
    const e: C = [n1 * ct[0], n1 * ct[1]];
    const rp = div([c[0] - e[0], c[1] - e[1]], [c[0] + e[0], c[1] + e[1]]);
    return { s: rs[0] ** 2 + rs[1] ** 2, p: rp[0] ** 2 + rp[1] ** 2 };
  }
  const flatGold = { period: '1 um', cover: 1, substrate: '0.2+3.3i', layers: [], incidence: { wavelength: '633 nm', angleDeg: 30 }, orders: 3 };

  it('the relative efficiency of a flat surface of the reference material is 1 (definition), its R is Fresnel\'s', () => {
    const plan = planSweep(flatGold, { parameters: [{ path: 'incidence.angleDeg', values: [30, 60] }], outputs: { orders: [0], sides: ['R'], relative: true } });
    rowsOf(plan).forEach((row, i) => {
      for (const pol of ['TE', 'TM', 'unpol']) expect(cell(plan, row, `Rrel_0_${pol}`)).toBe(1);
      const f = fresnel(1, [0.2, 3.3], [30, 60][i]!);
      expect(num(plan, row, 'R_0_TE')).toBeCloseTo(f.s, 12);
      expect(num(plan, row, 'R_0_TM')).toBeCloseTo(f.p, 12);
    });
  });

  it('a grating under a thick flat coating reflects like the coating: relative efficiency 1 to the light that reaches the grating', () => {
    // 300 nm of κ = 3.3 at 633 nm: the round trip to the buried grating attenuates the power by
    // exp(−4π·κ·d/λ) = exp(−19.7) ≈ 3e-9, the size of every difference from the flat coating
    const d = { period: '1 um', cover: 1, substrate: 1.5, grating: { profile: 'lamellar', duty: 0.5, depth: '200 nm', ridge: 1.5, coating: { material: '0.2+3.3i', thickness: '300 nm', mode: 'filled' }, slices: 1 }, incidence: { wavelength: '633 nm', angleDeg: 20 }, orders: 5 };
    const plan = planSweep(d, { parameters: [{ path: 'incidence.angleDeg', values: [20] }], outputs: { orders: [0], sides: ['R'], relative: true } });
    const [row] = rowsOf(plan);
    for (const pol of ['TE', 'TM', 'unpol']) expect(Math.abs(num(plan, row!, `Rrel_0_${pol}`) - 1)).toBeLessThan(1e-7);
    // and not 1 against the ridge material: R of glass is ~0.04, so the ratio would be ~20
    expect(num(plan, row!, 'R_0_TE')).toBeGreaterThan(0.9);
  });

  it('PDL is 0 where TE = TM (a flat surface at normal incidence, Fresnel: r_s = r_p)', () => {
    const plan = planSweep({ ...flatGold, substrate: 1.5, incidence: { wavelength: '633 nm' } }, { parameters: [{ path: 'incidence.wavelength', values: ['633nm'] }], outputs: { orders: [0], pdl: true } });
    const [row] = rowsOf(plan);
    // two code paths give 0.04 to round-off (~1e-16 relative): 10·log10(1 + ε) ≈ 4.3·ε dB
    expect(Math.abs(num(plan, row!, 'PDL_R_0_dB'))).toBeLessThan(1e-12);
    expect(Math.abs(num(plan, row!, 'PDL_T_0_dB'))).toBeLessThan(1e-12);
  });

  it('PDL is 10·log10(max/min) of the TE and TM columns, and empty for an order that does not propagate', () => {
    const plan = planSweep(sinusoid, { parameters: [{ path: 'incidence.wavelength', values: ['500nm', '900nm'] }], outputs: { pdl: true } });
    const rows = rowsOf(plan);
    for (const row of rows) {
      for (const side of ['R', 'T']) {
        for (const m of plan.orders) {
          const te = num(plan, row, `${side}_${m}_TE`);
          const tm = num(plan, row, `${side}_${m}_TM`);
          const pdl = cell(plan, row, `PDL_${side}_${m}_dB`);
          if (te === 0 && tm === 0) expect(pdl).toBe('');
          else expect(pdl).toBeCloseTo(10 * Math.log10(Math.max(te, tm) / Math.min(te, tm)), 12);
        }
      }
    }
    expect(cell(plan, rows[1]!, 'PDL_T_-2_dB')).toBe(''); // −2 is evanescent in the substrate at 900 nm (see above)
  });
});

describe('reuse of layer modes', () => {
  it('a depth sweep of a lamellar grating solves the layer once per wavelength and matches fresh solves', () => {
    const d = { ...sinusoid, grating: { profile: 'lamellar', duty: 0.4, depth: '100 nm', ridge: 1.5 }, orders: 8 };
    const plan = planSweep(d, { parameters: [{ path: 'incidence.wavelength', values: ['500nm', '600nm'] }, { path: 'grating.depth', from: '50nm', to: '300nm', count: 6 }], outputs: { orders: [-1, 0, 1] } });
    const ctx = createEvalContext();
    const misses: number[] = [];
    for (let i = 0; i < plan.count; i++) {
      const row = evaluatePoint(plan, i, ctx);
      misses.push(ctx.modes!.misses);
      const r = fresh(plan, i);
      for (const m of [-1, 0, 1]) {
        for (const [pol, x] of [['TE', r.s], ['TM', r.p]] as const) {
          expect(Math.abs(num(plan, row, `R_${m}_${pol}`) - (find(x, 'R', m)?.efficiency ?? 0))).toBeLessThanOrEqual(1e-12);
        }
      }
    }
    // modes are computed at the first depth of each wavelength (points 0 and 6) and reused at the other five
    expect(misses[0]).toBeGreaterThan(0);
    expect(misses.slice(0, 6)).toEqual(Array(6).fill(misses[0]));
    expect(misses[6]).toBeGreaterThan(misses[5]!);
    expect(misses.slice(6)).toEqual(Array(6).fill(misses[6]));
  });

  it('a thickness sweep of one raw layer reuses every layer\'s modes after the first point', () => {
    const raw = {
      period: '0.9 um', cover: 1, substrate: 1.45, orders: 6, incidence: { wavelength: '700 nm', angleDeg: 15 },
      layers: [
        { thickness: '80 nm', segments: [{ width: 0.3, index: 2 }, { width: 0.7, index: 1 }] },
        { thickness: '120 nm', segments: [{ width: 0.6, index: 1.6 }, { width: 0.4, index: 1 }] },
        { thickness: '50 nm', index: 2.1 },
      ],
    };
    const plan = planSweep(raw, { parameters: [{ path: 'layers[1].thickness', from: '50nm', to: '250nm', count: 5 }] });
    const ctx = createEvalContext();
    const first = evaluatePoint(plan, 0, ctx);
    const after = ctx.modes!.misses;
    const rows = [first, ...Array.from({ length: plan.count - 1 }, (_, i) => evaluatePoint(plan, i + 1, ctx))];
    expect(ctx.modes!.misses).toBe(after); // every layer and half-space was solved at the first point
    expect(ctx.modes!.hits).toBeGreaterThanOrEqual(4 * 2 * 3); // 4 more points × 2 families × 3 layers at least
    rows.forEach((row, i) => {
      const r = fresh(plan, i);
      expect(Math.abs(num(plan, row, 'R_TE') - r.s.R)).toBeLessThanOrEqual(1e-12);
      expect(Math.abs(num(plan, row, 'T_TM') - r.p.T)).toBeLessThanOrEqual(1e-12);
    });
  });

  it('a depth sweep of a sliced sinusoid with the cache gives the numbers of fresh solves to 1e-12', () => {
    const plan = planSweep(sinusoid, { parameters: [{ path: 'grating.depth', from: '60nm', to: '240nm', count: 4 }] });
    const ctx = createEvalContext();
    for (let i = 0; i < plan.count; i++) {
      const row = evaluatePoint(plan, i, ctx);
      const r = fresh(plan, i);
      for (const m of plan.orders) {
        for (const side of ['R', 'T'] as const) {
          expect(Math.abs(num(plan, row, `${side}_${m}_TE`) - (find(r.s, side, m)?.efficiency ?? 0))).toBeLessThanOrEqual(1e-12);
          expect(Math.abs(num(plan, row, `${side}_${m}_TM`) - (find(r.p, side, m)?.efficiency ?? 0))).toBeLessThanOrEqual(1e-12);
        }
      }
    }
  });
});

describe('formatCell', () => {
  it('writes numbers that read back to the same double (fast-check)', () => {
    fc.assert(
      fc.property(fc.double({ noNaN: true, noDefaultInfinity: true }), (x) => {
        const t = formatCell(x);
        expect(Number(t)).toBe(x === 0 ? 0 : x); // −0 is written as 0
        expect(t.replace(/^-|e.*$/g, '').replace('.', '').replace(/^0+/, '').length).toBeLessThanOrEqual(17);
      }),
    );
  });

  it("keeps '' empty, leaves plain text alone and quotes text CSV would split", () => {
    expect(formatCell('')).toBe('');
    expect(formatCell('ok')).toBe('ok');
    expect(formatCell('R_-1_TE')).toBe('R_-1_TE');
    expect(formatCell('a, b')).toBe('"a, b"');
    expect(formatCell('say "x"')).toBe('"say ""x"""');
    expect(formatCell('two\nlines')).toBe('"two\nlines"');
    expect(() => formatCell(Number.NaN)).toThrow(RangeError);
    expect(() => formatCell(Infinity)).toThrow(RangeError);
  });
});
