/** Sweep plans: points, ranges, units, columns, and validation that names the field. */
import { describe, expect, it } from 'vitest';
import { InputError } from '../../src/design/index.ts';
import { designAt, parseParameterFlag, planSweep, pointAt, type SweepSpec } from '../../src/sweep/index.ts';

/** A small dielectric lamellar grating, 1 µm period, at 500 nm. */
const design = {
  title: 'plan test',
  period: '1 um',
  cover: 1,
  substrate: 1.5,
  grating: { profile: 'lamellar', duty: 0.5, depth: '200 nm', ridge: 1.5 },
  incidence: { wavelength: '500 nm', angleDeg: 0 },
  orders: 6,
};
const plan = (spec: SweepSpec, d: unknown = design) => planSweep(d, spec);
const wl = (from: string | number, to: string | number, count: number) => ({ path: 'incidence.wavelength', from, to, count });

describe('points', () => {
  it('a grid has the product of the axis lengths, first axis slowest', () => {
    const p = plan({ parameters: [wl('400nm', '600nm', 3), { path: 'grating.duty', values: [0.3, 0.5] }] });
    expect(p.count).toBe(6);
    expect(p.combine).toBe('grid');
    const seen = Array.from({ length: p.count }, (_, i) => pointAt(p, i).values);
    expect(seen).toEqual([[400, 0.3], [400, 0.5], [500, 0.3], [500, 0.5], [600, 0.3], [600, 0.5]]);
    expect(pointAt(p, 4).index).toBe(4);
  });

  it('a zip takes the i-th values together', () => {
    const p = plan({ parameters: [wl('400nm', '600nm', 3), { path: 'grating.duty', values: [0.3, 0.4, 0.5] }], combine: 'zip' });
    expect(p.count).toBe(3);
    expect([0, 1, 2].map((i) => pointAt(p, i).values)).toEqual([[400, 0.3], [500, 0.4], [600, 0.5]]);
  });

  it('pointAt rejects an index outside the plan', () => {
    const p = plan({ parameters: [wl('400nm', '600nm', 3)] });
    expect(() => pointAt(p, 3)).toThrow(RangeError);
    expect(() => pointAt(p, -1)).toThrow(RangeError);
    expect(() => pointAt(p, 1.5)).toThrow(RangeError);
  });

  it('three axes in a grid: index = ((i0·n1) + i1)·n2 + i2 (mixed radix, last axis fastest)', () => {
    const p = plan({ parameters: [wl('400nm', '500nm', 2), { path: 'grating.duty', values: [0.3, 0.4, 0.5] }, { path: 'incidence.angleDeg', values: [0, 5, 10, 15] }] });
    expect(p.count).toBe(24);
    const i0 = 1, i1 = 2, i2 = 3;
    expect(pointAt(p, (i0 * 3 + i1) * 4 + i2).values).toEqual([500, 0.5, 15]);
  });
});

describe('ranges', () => {
  it('a linear range has exact endpoints and equal spacing (400–700 nm in 31 points: 10 nm apart)', () => {
    const v = plan({ parameters: [wl('400nm', '700nm', 31)] }).axes[0]!.values as number[];
    expect(v.length).toBe(31);
    expect(v[0]).toBe(400);
    expect(v[30]).toBe(700);
    for (let k = 1; k < 31; k++) expect(v[k]! - v[k - 1]!).toBeCloseTo(10, 11); // round-off of a few ulps of 700
  });

  it('a log range has exact endpoints and a constant ratio (0.4–1.6 µm, 25 points: ratio 4^(1/24))', () => {
    const v = plan({ parameters: [parseParameterFlag('incidence.wavelength=0.4um:1.6um:25:log')] }).axes[0]!.values as number[];
    expect(v.length).toBe(25);
    expect(v[0]).toBe(0.4);
    expect(v[24]).toBe(1.6);
    const r = 4 ** (1 / 24);
    for (let k = 1; k < 25; k++) expect(Math.abs(v[k]! / v[k - 1]! / r - 1)).toBeLessThan(1e-14); // a few ulps
  });

  it('a step range stops at the last point not past "to", and includes "to" when the step lands on it', () => {
    const a = plan({ parameters: [parseParameterFlag('grating.depth=100nm:500nm:step=10nm')] }).axes[0]!.values as number[];
    expect(a.length).toBe(41);
    expect(a[0]).toBe(100);
    expect(a[40]).toBe(500);
    const b = plan({ parameters: [{ path: 'grating.depth', from: '100 nm', to: '505 nm', step: '10 nm' }] }).axes[0]!.values as number[];
    expect(b.length).toBe(41);
    expect(b[40]).toBe(500);
    const c = plan({ parameters: [{ path: 'grating.depth', from: '500nm', to: '100nm', step: '-100nm' }] }).axes[0]!.values;
    expect(c).toEqual([500, 400, 300, 200, 100]);
    // 0.1 µm steps from 0.1 to 0.3: (0.3 − 0.1)/0.1 = 1.9999999999999998 in doubles, still 3 points ending at 0.3
    const d = plan({ parameters: [{ path: 'grating.depth', from: '0.1um', to: '0.3um', step: '0.1um' }] }).axes[0]!.values;
    expect(d).toEqual([0.1, 0.2, 0.3]);
  });

  it('a list keeps its values and order', () => {
    const p = plan({ parameters: [parseParameterFlag('incidence.angleDeg=0,10,20')] });
    expect(p.axes[0]).toEqual({ path: 'incidence.angleDeg', values: [0, 10, 20], unit: 'deg', column: 'angle_deg' });
  });

  it('a step in another unit is converted to the axis unit (step=0.01um on an nm axis is 10 nm)', () => {
    const v = plan({ parameters: [{ path: 'grating.depth', from: '100nm', to: '130nm', step: '0.01um' }] }).axes[0]!.values;
    expect(v).toEqual([100, 110, 120, 130]);
  });
});

describe('units', () => {
  it('values are kept in the unit of "from" (to in nm is converted: 700 nm = 0.7 µm)', () => {
    const p = plan({ parameters: [wl('0.4um', '700nm', 4)] });
    expect(p.axes[0]!.unit).toBe('um');
    expect(p.axes[0]!.column).toBe('wavelength_um');
    expect(p.axes[0]!.values[0]).toBe(0.4);
    expect(p.axes[0]!.values[3]).toBe(0.7);
  });

  it('"unit" gives bare numbers their unit', () => {
    const p = plan({ parameters: [{ path: 'grating.depth', from: 100, to: 300, count: 3, unit: 'nm' }] });
    expect(p.axes[0]).toMatchObject({ values: [100, 200, 300], unit: 'nm', column: 'depth_nm' });
  });

  it('a field named in nm takes nm numbers, and text with a unit is converted (0.45 µm = 450 nm)', () => {
    const p = plan({ parameters: [{ path: 'incidence.wavelengthNm', values: [400, '0.45um', 500] }] });
    expect(p.axes[0]).toMatchObject({ values: [400, 450, 500], unit: 'nm', column: 'wavelength_nm' });
  });

  it('designAt writes lengths as text with the axis unit and drops the field\'s other spellings', () => {
    const d = { ...design, incidence: { wavelengthNm: 500 } };
    const p = plan({ parameters: [{ path: 'incidence.wavelength', values: ['523.4 nm'] }, { path: 'periodNm', values: [800] }] }, { ...d, period: undefined, grooveDensityPerMm: 1000 });
    const out = designAt(p, pointAt(p, 0)) as Record<string, any>;
    expect(out.incidence).toEqual({ wavelength: '523.4 nm' });
    expect(out.periodNm).toBe(800);
    expect(out.grooveDensityPerMm).toBeUndefined();
    expect(out.grating).toEqual(design.grating);
  });

  it('degrees and unitless fields are written as numbers', () => {
    const p = plan({ parameters: [{ path: 'incidence.angleDeg', values: ['12.5 deg'] }, { path: 'grating.duty', values: [0.42] }, { path: 'orders', values: [9] }] });
    const out = designAt(p, pointAt(p, 0)) as Record<string, any>;
    expect(out.incidence.angleDeg).toBe(12.5);
    expect(out.grating.duty).toBe(0.42);
    expect(out.orders).toBe(9);
    expect(p.axes.map((a) => a.column)).toEqual(['angle_deg', 'duty', 'orders']);
  });

  it('columns of two fields with the same name carry their parents (layers_0_thickness_nm)', () => {
    const raw = { period: '1 um', substrate: 1.5, incidence: { wavelength: '600 nm' }, orders: 3, layers: [{ thickness: '100 nm', index: 2 }, { thickness: '50 nm', index: 1.4 }] };
    const p = plan({ parameters: [{ path: 'layers[0].thickness', values: ['100nm'] }, { path: 'layers[1].thickness', values: ['60nm'] }] }, raw);
    expect(p.axes.map((a) => a.column)).toEqual(['layers_0_thickness_nm', 'layers_1_thickness_nm']);
  });
});

describe('columns', () => {
  it('names point_index, the axes, theta_deg under a mount, outputs, status and error', () => {
    const p = plan({
      parameters: [wl('400nm', '600nm', 3)],
      mount: { kind: 'littrow', order: -1 },
      outputs: { orders: [0, -1], sides: ['R'], polarizations: ['TE', 'TM', 'unpolarized'], phases: true, relative: true, pdl: true },
    });
    expect(p.orders).toEqual([-1, 0]);
    expect(p.columns).toEqual([
      'point_index', 'wavelength_nm', 'theta_deg',
      'R_-1_TE', 'R_-1_TM', 'R_-1_unpol', 'R_0_TE', 'R_0_TM', 'R_0_unpol',
      'R_TE', 'A_TE', 'R_TM', 'A_TM', 'R_unpol', 'A_unpol',
      'phase_R_-1_TE_deg', 'phase_R_-1_TM_deg', 'phase_R_0_TE_deg', 'phase_R_0_TM_deg',
      'Rrel_-1_TE', 'Rrel_-1_TM', 'Rrel_-1_unpol', 'Rrel_0_TE', 'Rrel_0_TM', 'Rrel_0_unpol',
      'PDL_R_-1_dB', 'PDL_R_0_dB',
      'status', 'error',
    ]);
  });

  it("the defaults report every propagating order, R and T, TE/TM/unpolarized, with totals", () => {
    const p = plan({ parameters: [wl('500nm', '700nm', 3)] });
    // grating equation at λ/Λ = 0.5, θ = 0: |0.5·m| < 1 in air → m = −1…1; |0.5·m| < 1.5 in n = 1.5 → m = −2…2
    expect(p.orders).toEqual([-2, -1, 0, 1, 2]);
    expect(p.outputs).toEqual({ orders: 'all', sides: ['R', 'T'], polarizations: ['TE', 'TM', 'unpolarized'], totals: true, phases: false, relative: false, pdl: false });
    expect(p.columns.slice(0, 5)).toEqual(['point_index', 'wavelength_nm', 'R_-2_TE', 'R_-2_TM', 'R_-2_unpol']);
    expect(p.columns.slice(-11)).toEqual(['R_TE', 'T_TE', 'A_TE', 'R_TM', 'T_TM', 'A_TM', 'R_unpol', 'T_unpol', 'A_unpol', 'status', 'error']);
    expect(p.columns.length).toBe(2 + 2 * 5 * 3 + 9 + 2);
  });

  it("'all' with reflection only takes the orders propagating in the cover (m = −1…1 at λ/Λ = 0.5)", () => {
    const p = plan({ parameters: [wl('500nm', '700nm', 3)], outputs: { sides: ['R'] } });
    expect(p.orders).toEqual([-1, 0, 1]);
  });

  it("'all' takes the orders propagating anywhere in the range, not only at its first point (grating equation: |λ/Λ·m| < 1 in air)", () => {
    // from 700 nm down to 400 nm: at the first point (λ/Λ = 0.7) only m = −1…1 propagate in air, at 400 nm (0.4) m = −2…2
    const p = plan({ parameters: [wl('700nm', '400nm', 4)], outputs: { sides: ['R'] } });
    expect(p.orders).toEqual([-2, -1, 0, 1, 2]);
    // on a grid with the angle: at θ = 30° and 400 nm, kx = 0.5 + 0.4·m < 1 also for m = 1 and > −1 down to m = −3
    const g = plan({ parameters: [wl('700nm', '400nm', 4), { path: 'incidence.angleDeg', values: [0, 30] }], outputs: { sides: ['R'] } });
    expect(g.orders).toEqual([-3, -2, -1, 0, 1, 2]);
  });

  it('a zip whose values are valid only together is accepted, and a zip point the design rejects is reported with its parameter', () => {
    // sawtooth rule: apex in [90° − blaze, 180° − blaze); (10°, 100°) and (40°, 60°) are both valid, (10°, 60°) is not
    const saw = { ...design, grating: { profile: 'sawtooth', blazeDeg: 20, ridge: 1.5 }, slices: 4 };
    const zip = { parameters: [{ path: 'grating.blazeDeg', values: [10, 40] }, { path: 'grating.apexDeg', values: [100, 60] }], combine: 'zip' as const };
    expect(plan(zip, saw).count).toBe(2);
    const bad = { ...zip, parameters: [zip.parameters[0]!, { path: 'grating.apexDeg', values: [100, 45] }] };
    expect(() => plan(bad, saw)).toThrow(/^sweep\.parameters\[1\]\.values\[1\]: 45 makes the design invalid: .*apexDeg/);
    // on a grid the same values do meet: (10°, 60°) is a point of it
    expect(() => plan({ parameters: zip.parameters }, saw)).toThrow(/^sweep\.parameters\[1\]\.values\[1\]: 60 makes the design invalid/);
  });

  it('the plan is plain JSON (it survives a round trip unchanged)', () => {
    const p = plan({ parameters: [wl('400nm', '600nm', 3)], mount: { kind: 'deviation', order: -1, deviationDeg: 10 } });
    expect(JSON.parse(JSON.stringify(p))).toEqual(p);
  });

  it('a "sweep" section inside the design is not part of the plan\'s design', () => {
    const p = plan({ parameters: [wl('400nm', '600nm', 3)] }, { ...design, sweep: { parameters: [] } });
    expect((p.design as Record<string, unknown>).sweep).toBeUndefined();
  });
});

describe('command-line parameters', () => {
  it('reads the five forms', () => {
    expect(parseParameterFlag('incidence.wavelength=400nm:700nm:31')).toEqual({ path: 'incidence.wavelength', from: '400nm', to: '700nm', count: 31 });
    expect(parseParameterFlag('grating.depth=100nm:500nm:step=10nm')).toEqual({ path: 'grating.depth', from: '100nm', to: '500nm', step: '10nm' });
    expect(parseParameterFlag('incidence.angleDeg=0,10,20')).toEqual({ path: 'incidence.angleDeg', values: [0, 10, 20] });
    expect(parseParameterFlag('grating.duty=0.3:0.7:9')).toEqual({ path: 'grating.duty', from: 0.3, to: 0.7, count: 9 });
    expect(parseParameterFlag('incidence.wavelength=0.4um:1.6um:25:log')).toEqual({ path: 'incidence.wavelength', from: '0.4um', to: '1.6um', count: 25, log: true });
  });

  it('keeps text values as text and takes a unit part', () => {
    expect(parseParameterFlag('incidence.polarization=TE,TM')).toEqual({ path: 'incidence.polarization', values: ['TE', 'TM'] });
    expect(parseParameterFlag('grating.depth=100:300:5:unit=nm')).toEqual({ path: 'grating.depth', from: 100, to: 300, count: 5, unit: 'nm' });
    expect(parseParameterFlag('incidence.angleDeg=-10:10:5')).toMatchObject({ from: -10, to: 10 });
  });

  it('rejects forms it cannot read, quoting the flag', () => {
    expect(() => parseParameterFlag('incidence.wavelength')).toThrow(/parameter "incidence\.wavelength": expected path=values/);
    expect(() => parseParameterFlag('grating.duty=0.3:0.7')).toThrow(/from:to:count/);
    expect(() => parseParameterFlag('grating.duty=0.3:0.7:many')).toThrow(/"many" is not a count/);
    expect(() => parseParameterFlag('grating.duty=0.3,,0.5')).toThrow(/empty value/);
    expect(() => parseParameterFlag('grating.duty=')).toThrow(InputError);
  });
});

describe('validation names the field', () => {
  const bad: Array<[string, SweepSpec, RegExp, unknown?]> = [
    ['a misspelt path, with the closest field', { parameters: [wl('400nm', '700nm', 3)].map((p) => ({ ...p, path: 'incidence.wavelenth' })) }, /^sweep\.parameters\[0\]\.path: 'incidence\.wavelenth' is not a field of this design; did you mean 'incidence\.wavelength'\?/],
    ['"to" below "from" with a positive step', { parameters: [{ path: 'grating.depth', from: '400nm', to: '300nm', step: '10nm' }] }, /^sweep\.parameters\[0\]\.to: 300 nm is below from \(400 nm\) while the step is positive/],
    ['a count below 1', { parameters: [wl('400nm', '700nm', 0)] }, /^sweep\.parameters\[0\]\.count: expected at least 1 point/],
    ['a count of 1 over a span', { parameters: [wl('400nm', '700nm', 1)] }, /^sweep\.parameters\[0\]\.count: 1 point cannot span/],
    ['zip with unequal lengths', { parameters: [wl('400nm', '700nm', 3), { path: 'grating.duty', from: 0.3, to: 0.5, count: 4 }], combine: 'zip' }, /^sweep\.parameters\[1\]\.count: "zip" .* parameters\[0\] has 3, parameters\[1\] has 4/],
    ['Littrow in order 0', { parameters: [wl('400nm', '700nm', 3)], mount: { kind: 'littrow', order: 0 } }, /^sweep\.mount\.order: order 0/],
    ['an unknown output polarization', { parameters: [wl('400nm', '700nm', 3)], outputs: { polarizations: ['TE', 'unpol' as 'TE'] } }, /^sweep\.outputs\.polarizations\[1\]: Invalid option/],
    ['a length without a unit', { parameters: [wl(400, 700, 3)] }, /^sweep\.parameters\[0\]\.from: 'incidence\.wavelength' is a length: write the values with a unit/],
    ['an unknown length unit', { parameters: [{ path: 'grating.depth', values: ['2 furlongs'] }] }, /^sweep\.parameters\[0\]\.values\[0\]: expected a length unit nm, um or mm/],
    ['a value the design rejects, at the far end', { parameters: [{ path: 'grating.duty', from: 0.3, to: 1.2, count: 4 }] }, /^sweep\.parameters\[0\]\.to: 1\.2 makes the design invalid: grating\.duty: expected a duty cycle in \(0, 1\)/],
    ['a value the design rejects, at the first point', { parameters: [{ path: 'grating.depth', from: '-100nm', to: '300nm', count: 3 }] }, /^sweep\.parameters\[0\]\.from: -100 nm makes the design invalid: grating\.depth/],
    ['a value the design rejects, in a list', { parameters: [{ path: 'grating.duty', values: [0.3, 0, 0.5] }] }, /^sweep\.parameters\[0\]\.values\[1\]: 0 makes the design invalid/],
    ['an unknown material in a list', { parameters: [{ path: 'substrate', values: [1.4, 'glas'] }] }, /^sweep\.parameters\[0\]\.values\[1\]: "glas" makes the design invalid: substrate: unknown material 'glas'/],
    ['a whole-number field given fractions', { parameters: [{ path: 'orders', from: 5, to: 10, count: 4 }] }, /^sweep\.parameters\[0\]\.count: 'orders' takes whole numbers/],
    ['a choice outside the field\'s options', { parameters: [{ path: 'incidence.polarization', values: ['TE', 'XX'] }] }, /^sweep\.parameters\[0\]\.values\[1\]: "XX" is not accepted by 'incidence\.polarization'/],
    ['the same quantity twice', { parameters: [wl('400nm', '700nm', 3), { path: 'incidence.wavelengthNm', values: [400] }] }, /^sweep\.parameters\[1\]\.path: 'incidence\.wavelengthNm' sets the same quantity as parameters\[0\]/],
    ['a field inside a part the design lacks', { parameters: [{ path: 'grating.coating.thickness', values: ['5nm'] }] }, /^sweep\.parameters\[0\]\.path: the design has no 'grating\.coating'/],
    ['a group of fields', { parameters: [{ path: 'grating', values: [1] }] }, /^sweep\.parameters\[0\]\.path: 'grating' is a group of fields/],
    ['the profile kind', { parameters: [{ path: 'grating.profile', values: ['sinusoidal'] }] }, /^sweep\.parameters\[0\]\.path: 'grating\.profile' chooses the kind/],
    ['a switch', { parameters: [{ path: 'allowGain', values: [1] }] }, /^sweep\.parameters\[0\]\.path: 'allowGain' is a switch/],
    ['the angle swept under a Littrow mount', { parameters: [{ path: 'incidence.angleDeg', values: [3] }], mount: { kind: 'littrow', order: -1 } }, /^sweep\.parameters\[0\]\.path: the littrow mount sets the incidence angle/],
    ['a deviation of 180° or more', { parameters: [wl('400nm', '700nm', 3)], mount: { kind: 'deviation', order: 1, deviationDeg: 200 } }, /^sweep\.mount\.deviationDeg/],
    ['a misspelt key of a parameter', { parameters: [{ path: 'grating.depth', form: '100nm' } as never] }, /^sweep\.parameters\[0\]: Unrecognized key: "form" \(remove it/],
    ['values and a range together', { parameters: [{ path: 'grating.duty', values: [0.3], from: 0.3, to: 0.5, count: 2 }] }, /^sweep\.parameters\[0\]\.values: give a list of values or a range/],
    ['a range with neither count nor step', { parameters: [{ path: 'grating.duty', from: 0.3, to: 0.5 }] }, /^sweep\.parameters\[0\]\.count: missing/],
    ['a log range through zero', { parameters: [{ path: 'incidence.angleDeg', from: 0, to: 10, count: 3, log: true }] }, /^sweep\.parameters\[0\]\.from: a log range needs from > 0/],
    ["'requested' without a design polarization", { parameters: [wl('400nm', '700nm', 3)], outputs: { polarizations: ['requested'] } }, /^sweep\.outputs\.polarizations\[0\]: 'requested' is the design's incidence\.polarization/],
    ['relative efficiency without reflection', { parameters: [wl('400nm', '700nm', 3)], outputs: { sides: ['T'], relative: true } }, /^sweep\.outputs\.relative/],
    ['phases without TE or TM', { parameters: [wl('400nm', '700nm', 3)], outputs: { polarizations: ['unpolarized'], phases: true } }, /^sweep\.outputs\.phases/],
    ['an order outside the retained ones', { parameters: [wl('400nm', '700nm', 3)], outputs: { orders: [0, 30] } }, /^sweep\.outputs\.orders\[1\]: order 30 is outside the retained orders −6…6/],
    ['an order listed twice', { parameters: [wl('400nm', '700nm', 3)], outputs: { orders: [1, 1] } }, /^sweep\.outputs\.orders\[1\]: order 1 is listed twice/],
    ['no parameters', { parameters: [] }, /^sweep\.parameters: give at least one parameter/],
    ['a list index past the end', { parameters: [{ path: 'layers[5].thickness', values: ['5nm'] }] }, /^sweep\.parameters\[0\]\.path: 'layers\[5\]\.thickness': the design's 'layers' has 1 item/, { ...design, grating: undefined, layers: [{ thickness: '10 nm', index: 2 }] }],
    ["'all' when the first point cannot be evaluated", { parameters: [wl('5um', '6um', 2)] }, /^sweep\.outputs\.orders: 'all' takes the orders that propagate at the sweep's corner points, which cannot be evaluated \(.*fused-silica.*outside its valid range/, { ...design, substrate: 'fused-silica' }],
  ];
  for (const [what, spec, msg, d] of bad) {
    it(`rejects ${what}`, () => {
      let err: unknown;
      try {
        plan(spec, d ?? design);
      } catch (e) {
        err = e;
      }
      expect(err).toBeInstanceOf(InputError);
      expect((err as Error).message).toMatch(msg);
    });
  }
});
