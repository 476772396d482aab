/**
 * Lengths and angles: the direct reading of plain "number unit" texts must give the very double
 * mathjs's unit parser gives (the design file's units are defined by mathjs; the direct path only
 * saves loading it), and everything else still goes through mathjs.
 */
import { createRequire } from 'node:module';
import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import { ANGLE_UNITS, angleDeg, InputError, LENGTH_UNITS, lengthUm } from '../../src/design/units.ts';

// the reference: mathjs itself, loaded here independently of the engine's on-demand access
const math = createRequire(import.meta.url)('mathjs') as typeof import('mathjs');

const numberText = fc.oneof(
  fc.double({ min: -1e6, max: 1e6, noNaN: true }).map((x) => String(x)),
  fc.tuple(fc.nat(99999), fc.nat(9999)).map(([a, b]) => `${a}.${b}`),
  fc.tuple(fc.integer({ min: 1, max: 9 }), fc.integer({ min: -12, max: 12 })).map(([a, e]) => `${a}e${e}`),
  fc.nat(999).map((a) => `.${a}`),
);

describe('plain quantities read without mathjs', () => {
  it('lengths equal mathjs unit(text).toNumber("um") bit for bit (mathjs is the definition)', () => {
    fc.assert(
      fc.property(numberText, fc.constantFrom(...Object.keys(LENGTH_UNITS)), fc.constantFrom('', ' ', '  '), (x, u, sp) => {
        const text = `${x}${sp}${u}`;
        expect(Object.is(lengthUm(text, 'p'), math.unit(text).toNumber('um'))).toBe(true);
      }),
      { numRuns: 2000 },
    );
  });

  it('angles equal mathjs unit(text).toNumber("deg") bit for bit, e.g. "30 deg" → 29.999999999999996 as mathjs reads it', () => {
    fc.assert(
      fc.property(numberText, fc.constantFrom(...Object.keys(ANGLE_UNITS)), (x, u) => {
        const text = `${x} ${u}`;
        expect(Object.is(angleDeg(text, 'p'), math.unit(text).toNumber('deg'))).toBe(true);
      }),
      { numRuns: 1000 },
    );
    // (30·(π/180))/(π/180) in doubles, which is mathjs's arithmetic
    expect(angleDeg('30 deg', 'p')).toBe(29.999999999999996);
  });

  it('other units and forms still go through mathjs', () => {
    expect(lengthUm('5 nanometer', 'p')).toBe(math.unit('5 nanometer').toNumber('um'));
    expect(lengthUm('2 inch', 'p')).toBe(math.unit('2 inch').toNumber('um'));
    expect(angleDeg('1 arcmin', 'p')).toBe(math.unit('1 arcmin').toNumber('deg'));
    expect(lengthUm('1.2 µm', 'p')).toBe(1.2);
  });

  it('wrong and non-finite inputs are refused with the field path', () => {
    expect(() => lengthUm('5 NM', 'grating.depth')).toThrow(InputError);
    expect(() => lengthUm('5 NM', 'grating.depth')).toThrow(/grating\.depth: expected a length with a unit/);
    expect(() => lengthUm('30 deg', 'period')).toThrow(/period: expected a length/);
    expect(() => angleDeg('3 nm', 'incidence.angle')).toThrow(/incidence\.angle: expected an angle/);
    expect(() => lengthUm('1e400 nm', 'period')).toThrow(/period: expected a finite length/);
    expect(() => lengthUm('1_000 nm', 'period')).toThrow(/period: expected a length/);
  });
});
