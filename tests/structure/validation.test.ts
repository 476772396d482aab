/** Every parameter rule: bad input in, a message naming the parameter, the expectation and the value out. */
import { describe, expect, it } from 'vitest';
import {
  compose,
  conformalCoating,
  crossSection,
  filledCoating,
  lamellar,
  multiLevel,
  profileFromExpression,
  profileFromTable,
  sawtooth,
  sinusoid,
  StructureError,
  symmetricTriangle,
  thinFilmStack,
  toSolverLayers,
  trapezoid,
  volumeGrating,
  type GeometryLayer,
} from '../../src/structure/index.ts';

const m = { ridgeMaterial: 'R', grooveMaterial: 'G' } as const;
// deliberately ill-typed inputs, as they arrive from untyped callers
const loose = (x: unknown): any => x;

function message(f: () => unknown): string {
  try {
    f();
  } catch (e) {
    expect(e).toBeInstanceOf(StructureError);
    return (e as Error).message;
  }
  throw new Error('expected a StructureError, nothing was thrown');
}

describe('parameter validation', () => {
  const cases: Array<[string, () => unknown, string | RegExp]> = [
    // duty cycle (definition: fraction of the period occupied by the ridge, strictly inside (0, 1))
    ['duty > 1', () => lamellar({ periodUm: 1, duty: 1.2, depthUm: 0.1, ...m }), 'lamellar.duty: expected a duty cycle in (0, 1), found 1.2'],
    ['duty = 0', () => lamellar({ periodUm: 1, duty: 0, depthUm: 0.1, ...m }), 'lamellar.duty: expected a duty cycle in (0, 1), found 0'],
    ['trapezoid duty', () => trapezoid({ periodUm: 1, depthUm: 0.1, duty: 1, sidewallDeg: 80, slices: 2, ...m }), 'trapezoid.duty: expected a duty cycle in (0, 1), found 1'],
    // lengths
    ['negative depth', () => lamellar({ periodUm: 1, duty: 0.5, depthUm: -0.1, ...m }), 'lamellar.depthUm: expected a length > 0 µm, found -0.1'],
    ['zero period', () => sawtooth({ periodUm: 0, blazeDeg: 10, slices: 3, ...m }), 'sawtooth.periodUm: expected a length > 0 µm, found 0'],
    ['NaN period', () => sinusoid({ periodUm: NaN, depthUm: 0.1, slices: 3, ...m }), 'sinusoid.periodUm: expected a length > 0 µm, found NaN'],
    ['zero volume thickness', () => volumeGrating({ periodUm: 1, thicknessUm: 0, material: 'M', deltaEps: 0.1 }), 'volume.thicknessUm: expected a length > 0 µm, found 0'],
    ['zero coating thickness', () => conformalCoating(lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.1, ...m }), { thicknessUm: 0, material: 'Al', slices: 3 }), 'coating.thicknessUm: expected a length > 0 µm, found 0'],
    ['negative fill thickness', () => filledCoating(lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.1, ...m }), { thicknessUm: -1, material: 'Al' }), 'filledCoating.thicknessUm: expected a length ≥ 0 µm, found -1'],
    ['negative film', () => thinFilmStack({ films: [{ material: 'H', thicknessUm: -0.1 }] }), 'stack.films[0].thicknessUm: expected a length > 0 µm, found -0.1'],
    // slices and strategy
    ['slices = 0', () => sawtooth({ periodUm: 1, blazeDeg: 10, slices: 0, ...m }), 'sawtooth.slices: expected an integer ≥ 1, found 0'],
    ['slices not an integer', () => sinusoid({ periodUm: 1, depthUm: 0.1, slices: 2.5, ...m }), 'sinusoid.slices: expected an integer ≥ 1, found 2.5'],
    ['slanted lamellar without slices', () => lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.1, slantDeg: 10, ...m }), 'lamellar.slices: expected an integer ≥ 1, found undefined'],
    ['unknown strategy', () => sinusoid({ periodUm: 1, depthUm: 0.1, slices: 3, strategy: loose('clever'), ...m }), "sinusoid.strategy: expected 'uniform' or 'adaptive', found clever"],
    ['coating slices', () => conformalCoating(lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.1, ...m }), { thicknessUm: 0.01, material: 'Al', slices: -2 }), 'coating.slices: expected an integer ≥ 1, found -2'],
    // materials
    ['empty material', () => sinusoid({ periodUm: 1, depthUm: 0.1, slices: 3, ridgeMaterial: '', grooveMaterial: 'G' }), 'sinusoid.ridgeMaterial: expected a material name (non-empty text), found '],
    // angles
    ['blaze angle 95°', () => sawtooth({ periodUm: 1, blazeDeg: 95, slices: 3, ...m }), 'sawtooth.blazeDeg: expected an angle in (0°, 90°), found 95'],
    ['apex overhanging', () => sawtooth({ periodUm: 1, blazeDeg: 30, apexDeg: 50, slices: 3, ...m }), 'sawtooth.apexDeg: expected an angle in [90° − blazeDeg, 180° − blazeDeg) = [60°, 150°) so the anti-blaze facet neither overhangs nor vanishes, found 50'],
    ['apex closing the facet', () => sawtooth({ periodUm: 1, blazeDeg: 30, apexDeg: 150, slices: 3, ...m }), /sawtooth\.apexDeg: .* found 150$/],
    ['slant 90°', () => lamellar({ periodUm: 1, duty: 0.5, depthUm: 0.1, slantDeg: 90, slices: 3, ...m }), 'lamellar.slantDeg: expected an angle in (-90°, 90°), found 90'],
    ['volume slant', () => volumeGrating({ periodUm: 1, thicknessUm: 1, material: 'M', deltaEps: 0.1, slantDeg: -95, slices: 2 }), 'volume.slantDeg: expected an angle in (-90°, 90°), found -95'],
    ['triangle apex 180°', () => symmetricTriangle({ periodUm: 1, apexDeg: 180, slices: 3, ...m }), 'triangle.apexDeg: expected an angle in (0°, 180°), found 180'],
    ['triangle both', () => symmetricTriangle(loose({ periodUm: 1, apexDeg: 90, depthUm: 0.2, slices: 3, ...m })), 'triangle: expected exactly one of depthUm and apexDeg, found both'],
    ['triangle neither', () => symmetricTriangle(loose({ periodUm: 1, slices: 3, ...m })), 'triangle: expected exactly one of depthUm and apexDeg, found neither'],
    // trapezoid self-intersection
    [
      'sidewall angle making the top width negative',
      () => trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.5, sidewallDeg: 30, slices: 3, ...m }),
      'trapezoid.sidewallDeg: expected an angle in [38.6598°, 141.34°] so that the top and bottom widths stay within [0, Λ] (no self-intersection) for duty 0.5 and depth 0.4 µm, found 30 (top width -0.19282 µm, bottom width 1.19282 µm, period 1 µm)',
    ],
    ['undercut wider than the period', () => trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.8, sidewallDeg: 120, slices: 3, ...m }), /trapezoid\.sidewallDeg: .*found 120 \(top width 1\.03094 µm/],
    ['top width beyond the period', () => trapezoid({ periodUm: 1, depthUm: 0.4, bottomWidthUm: 0.5, topWidthUm: 1.5, slices: 3, ...m }), 'trapezoid.topWidthUm: expected a width in [0, Λ] = [0, 1] µm, found 1.5'],
    ['trapezoid both forms', () => trapezoid(loose({ periodUm: 1, depthUm: 0.4, bottomWidthUm: 0.5, topWidthUm: 0.3, duty: 0.5, sidewallDeg: 80, slices: 3, ...m })), 'trapezoid: expected either bottomWidthUm and topWidthUm, or duty and sidewallDeg, found both forms'],
    // expressions
    ['expression that does not parse', () => profileFromExpression({ periodUm: 1, expression: '0.1*sin(2*pi*x', slices: 3, ...m }), /^expression\.expression: expected an expression in x \(mathjs syntax\), found "0\.1\*sin\(2\*pi\*x" \(.*\)$/],
    ['expression with another variable', () => profileFromExpression({ periodUm: 1, expression: '0.1*x + y*z', slices: 3, ...m }), 'expression.expression: expected an expression in the single variable x, found "0.1*x + y*z" using y, z'],
    ['expression assigning', () => profileFromExpression({ periodUm: 1, expression: 'x = 0.2', slices: 3, ...m }), 'expression.expression: expected a single expression (no assignments or ";"), found "x = 0.2"'],
    // 2049/4096 is the first sample where 0.1·sin(2πx) < 0 (definition of the sampling)
    ['negative height', () => profileFromExpression({ periodUm: 1, expression: '0.1*sin(2*pi*x)', slices: 3, ...m }), 'expression.expression: expected a height ≥ 0 µm at every x in [0, 1), found -0.000153398 at x = 0.500244'],
    ['infinite height', () => profileFromExpression({ periodUm: 1, expression: '0.01/abs(x - 0.5)', slices: 3, ...m }), 'expression.expression: expected a finite real height in µm at every x in [0, 1), found Infinity at x = 0.5'],
    ['complex height', () => profileFromExpression({ periodUm: 1, expression: 'sqrt(x - 0.5)', slices: 3, ...m }), /^expression\.expression: expected a finite real height in µm at every x in \[0, 1\), found 0\.7071\d*i at x = 0$/],
    ['unknown function', () => profileFromExpression({ periodUm: 1, expression: 'bump(x)', slices: 3, ...m }), /^expression\.expression: expected an expression that evaluates to a height, found "bump\(x\)" failing at x = 0/],
    ['flat zero expression', () => profileFromExpression({ periodUm: 1, expression: '0*x', slices: 3, ...m }), 'expression.expression: expected a height > 0 µm somewhere, found "0*x" = 0 everywhere'],
    // tables
    ['table too short', () => profileFromTable({ periodUm: 1, points: [[0, 0.1]], slices: 3, ...m }), 'table.points: expected at least 2 points [x, heightUm], found 1 point(s)'],
    ['table x decreasing', () => profileFromTable({ periodUm: 1, points: [[0.5, 0.1], [0.2, 0]], slices: 3, ...m }), 'table.points[1][0]: expected x in [0.5, 1) (fractions of the period, non-decreasing), found 0.2'],
    ['table x = 1', () => profileFromTable({ periodUm: 1, points: [[0, 0.1], [1, 0]], slices: 3, ...m }), 'table.points[1][0]: expected x in [0, 1) (fractions of the period, non-decreasing), found 1'],
    ['table negative height', () => profileFromTable({ periodUm: 1, points: [[0, 0.1], [0.5, -0.2]], slices: 3, ...m }), 'table.points[1][1]: expected a height ≥ 0 µm, found -0.2'],
    // multi-level
    ['steps = 1', () => multiLevel({ periodUm: 1, steps: 1, blazeDepthUm: 0.5, ...m }), 'multiLevel.steps: expected an integer ≥ 2, found 1'],
    ['overlapping ridges', () => multiLevel({ periodUm: 1, levels: [{ thicknessUm: 0.1, ridges: [{ from: 0.1, to: 0.5 }, { from: 0.4, to: 0.6 }] }], ...m }), 'multiLevel.levels[0].ridges[1].from: expected a fraction in [0.5, 1) (sorted, disjoint ridges within the period), found 0.4'],
    ['zero-thickness level', () => multiLevel({ periodUm: 1, levels: [{ thicknessUm: 0, ridges: [] }], ...m }), 'multiLevel.levels[0].thicknessUm: expected a length > 0 µm, found 0'],
    // volume
    ['deltaN without n0', () => volumeGrating(loose({ periodUm: 1, thicknessUm: 1, material: 'M', deltaN: 0.01 })), 'volume.n0: expected a real base index > 0 (needed to convert deltaN to deltaEps), found undefined'],
    ['deltaEps and deltaN', () => volumeGrating(loose({ periodUm: 1, thicknessUm: 1, material: 'M', deltaN: 0.01, deltaEps: 0.03, n0: 1.5 })), 'volume: expected exactly one of deltaEps and deltaN, found both'],
    // stacks
    ['quarter-wave without wavelength', () => thinFilmStack({ films: [{ material: 'H', quarterWaves: 1 }], indexOf: () => 2 }), 'stack.designWavelengthUm: expected a length > 0 µm, found undefined'],
    ['quarter-wave without indices', () => thinFilmStack({ films: [{ material: 'H', quarterWaves: 1 }], designWavelengthUm: 0.5 }), 'stack.indexOf: expected a function (material, wavelengthUm) → index, needed for quarter-wave films, found undefined'],
    ['index ≤ 0', () => thinFilmStack({ films: [{ material: 'H', quarterWaves: 1 }], designWavelengthUm: 0.5, indexOf: () => ({ re: -1, im: 0 }) }), `stack.indexOf('H', 0.5): expected an index with real part > 0, found {"re":-1,"im":0}`],
    ['both thickness forms', () => thinFilmStack({ films: [loose({ material: 'H', quarterWaves: 1, thicknessUm: 0.1 })] }), 'stack.films[0]: expected exactly one of thicknessUm and quarterWaves, found both'],
    ['repeat 0', () => thinFilmStack({ films: [{ material: 'H', thicknessUm: 0.1 }], repeat: 0 }), 'stack.repeat: expected an integer ≥ 1, found 0'],
    ['no films', () => thinFilmStack({ films: [] }), 'stack.films: expected a non-empty list of films, found []'],
    // conversion to solver layers
    ['segments with a gap', () => toSolverLayers([{ kind: 'segments', thicknessUm: 0.1, segments: [{ from: 0, to: 0.4, material: 'A' }, { from: 0.5, to: 1, material: 'B' }] }], () => ({ re: 1, im: 0 }), 4), 'layers[0].segments[1].from: expected 0.4 (segments tile [0, 1) in order, without gaps or overlaps), found 0.5'],
    ['segments short of 1', () => toSolverLayers([{ kind: 'segments', thicknessUm: 0.1, segments: [{ from: 0, to: 0.4, material: 'A' }] }], () => ({ re: 1, im: 0 }), 4), 'layers[0].segments: expected segments ending at 1 (the full period), found 0.4'],
    ['negative harmonics', () => toSolverLayers([], () => ({ re: 1, im: 0 }), -1), 'harmonics: expected an integer ≥ 0, found -1'],
    ['unknown layer kind', () => toSolverLayers(loose([{ kind: 'wavy', thicknessUm: 0.1 }]), () => ({ re: 1, im: 0 }), 2), "layers[0].kind: expected 'uniform', 'segments' or 'cosine', found wavy"],
    ['non-finite index', () => toSolverLayers([{ kind: 'uniform', thicknessUm: 0.1, material: 'X' }], () => ({ re: NaN, im: 0 }), 2), "indexOf('X').re: expected a finite number, found NaN"],
    ['negative layer thickness', () => toSolverLayers([{ kind: 'uniform', thicknessUm: -0.1, material: 'X' }], () => ({ re: 1, im: 0 }), 2), 'layers[0].thicknessUm: expected a length ≥ 0 µm, found -0.1'],
    // plotting and assembly
    ['periods 0', () => crossSection([], 1, 0), 'crossSection.periods: expected an integer ≥ 1, found 0'],
    ['negative period in a cross-section', () => crossSection([], -1), 'crossSection.periodUm: expected a length > 0 µm, found -1'],
    ['compose with a non-list', () => compose(loose({ grating: 42 })), 'compose.grating: expected a layer list or a result with layers, found 42'],
  ];
  for (const [name, f, want] of cases) {
    it(`rejects ${name}`, () => {
      const msg = message(f);
      if (typeof want === 'string') expect(msg).toBe(want);
      else expect(msg).toMatch(want);
    });
  }

  it('names the field, the expectation and the value on the error object', () => {
    try {
      sawtooth({ periodUm: 1, blazeDeg: 95, slices: 3, ...m });
    } catch (e) {
      const err = e as StructureError;
      expect([err.field, err.expected, err.found]).toEqual(['sawtooth.blazeDeg', 'an angle in (0°, 90°)', '95']);
      return;
    }
    throw new Error('no error');
  });

  it('accepts the limits of each rule', () => {
    // apex exactly 90° − θB (vertical anti-blaze facet) and a sidewall angle giving a zero top width are admissible
    expect(sawtooth({ periodUm: 1, blazeDeg: 30, apexDeg: 60, slices: 2, ...m }).depthUm).toBeCloseTo(Math.tan(Math.PI / 6), 14);
    const lo = (Math.atan2(0.4, 0.5) * 180) / Math.PI;
    expect(trapezoid({ periodUm: 1, depthUm: 0.4, duty: 0.5, sidewallDeg: lo, slices: 2, ...m }).notes[0]).toMatch(/top width (0|[0-9.e-]+) µm/);
    const layers: GeometryLayer[] = [{ kind: 'uniform', thicknessUm: 0, material: 'A' }];
    expect(toSolverLayers(layers, () => ({ re: 1, im: 0 }), 0).length).toBe(1);
  });
});
