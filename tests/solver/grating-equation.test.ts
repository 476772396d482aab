import fc from 'fast-check';
import { describe, expect, it } from 'vitest';
import {
  angularDispersion,
  blazeAngleFor,
  blazeWavelength,
  constantDeviation,
  cutoffWavelength,
  degToRad,
  directionAngles,
  freeSpectralRange,
  linearDispersion,
  linesPerMmFromPeriodNm,
  linesPerMmFromPeriodUm,
  littrowAngle,
  orderDirections,
  periodNmFromLinesPerMm,
  periodUmFromLinesPerMm,
  propagatingOrders,
  radToDeg,
  rayleighAngles,
  rayleighWavelengths,
  resolvingPower,
  type OrderDirection,
  type OrderInMedium,
  type PropagatingOrder,
} from '../../src/solver/grating-equation.ts';

// ---------------------------------------------------------------------------------------------
// helpers
// ---------------------------------------------------------------------------------------------

function near(actual: number, expected: number, tol: number, what = ''): void {
  if (!(Math.abs(actual - expected) <= tol)) {
    throw new Error(`${what} expected ${expected} ± ${tol}, got ${actual}`);
  }
}

function prop(o: OrderInMedium, what: string): PropagatingOrder {
  if (!o.propagating) throw new Error(`${what}: expected a propagating order`);
  return o;
}

function one(list: OrderDirection[], m: number): OrderDirection {
  const o = list.find((d) => d.m === m);
  if (o === undefined) throw new Error(`order ${m} missing`);
  return o;
}

/** Independent evaluation of the normalised in-plane wavevector of order m. */
function alphaBeta(
  m: number,
  wavelength: number,
  period: number,
  theta: number,
  phi: number,
  nCover: number,
): [number, number] {
  return [
    nCover * Math.sin(theta) * Math.cos(phi) + (m * wavelength) / period,
    nCover * Math.sin(theta) * Math.sin(phi),
  ];
}

const RUNS = { numRuns: 300 };
const wavelengthArb = fc.double({ min: 0.05, max: 5, noNaN: true });
const periodArb = fc.double({ min: 0.1, max: 10, noNaN: true });
const thetaArb = fc.double({ min: -1.5, max: 1.5, noNaN: true });
const phiArb = fc.double({ min: -Math.PI, max: Math.PI, noNaN: true });
const indexArb = fc.double({ min: 0.2, max: 4, noNaN: true });
const orderArb = fc.integer({ min: -6, max: 6 });
const nonzeroOrderArb = orderArb.filter((m) => m !== 0);

// ---------------------------------------------------------------------------------------------
// reference values
// ---------------------------------------------------------------------------------------------

describe('reference values', () => {
  it('order directions at normal incidence, λ/Λ = 0.5, air over n = 1.5', () => {
    // source: grating equation by hand. Cover: sinθm = 0.5m; substrate: sinθm = 0.5m/1.5.
    const d = orderDirections({
      wavelength: 0.5,
      period: 1,
      thetaRad: 0,
      nSubstrate: 1.5,
      mMin: -4,
      mMax: 4,
    });
    expect(d.map((o) => o.m)).toEqual([-4, -3, -2, -1, 0, 1, 2, 3, 4]);
    const r1 = prop(one(d, 1).reflected, 'R+1');
    near(r1.thetaRad, Math.PI / 6, 1e-15, 'R+1 θ'); // asin(0.5) = 30°
    expect(r1.phiRad).toBe(0);
    near(r1.cosines.z, -Math.sqrt(3) / 2, 1e-15, 'R+1 z');
    near(prop(one(d, -1).reflected, 'R-1').thetaRad, -Math.PI / 6, 1e-15, 'R-1 θ');
    near(prop(one(d, 1).transmitted, 'T+1').thetaRad, 0.3398369094541219, 1e-15, 'T+1 θ'); // asin(1/3)
    near(prop(one(d, 2).transmitted, 'T+2').thetaRad, 0.7297276562269663, 1e-15, 'T+2 θ'); // asin(2/3)
    // order ±2 in air: sinθm = ±1 exactly -> grazing, still propagating, kz = 0
    const r2 = prop(one(d, 2).reflected, 'R+2');
    expect(r2.thetaRad).toBe(Math.PI / 2);
    expect(r2.kzOverK0).toBe(-0);
    // order ±3 in glass: 1.5 = n exactly -> grazing; in air evanescent with decay √(1.5² − 1)
    expect(prop(one(d, -3).transmitted, 'T-3').thetaRad).toBe(-Math.PI / 2);
    const r3 = one(d, 3).reflected;
    expect(r3.propagating).toBe(false);
    if (!r3.propagating) near(r3.decayOverK0, Math.sqrt(1.25), 1e-15, 'R+3 decay');
    const t4 = one(d, 4).transmitted;
    expect(t4.propagating).toBe(false);
    if (!t4.propagating) near(t4.decayOverK0, Math.sqrt(4 - 2.25), 1e-15, 'T+4 decay');
    expect(propagatingOrders({ wavelength: 0.5, period: 1, thetaRad: 0, nSubstrate: 1.5 })).toEqual({
      reflected: { mMin: -2, mMax: 2 },
      transmitted: { mMin: -3, mMax: 3 },
    });
  });

  it('order ranges stay consistent with the flags when an edge order grazes to rounding', () => {
    // source: 1.5·Λ/λ is an integer (225 and 315) in exact arithmetic, so those orders graze in
    // n = 1.5 and floating point decides their flag; the range must follow orderDirections.
    for (const [period, edge] of [
      [0.15, 225],
      [0.21, 315],
    ] as const) {
      const inc = { wavelength: 0.001, period, thetaRad: 0, nSubstrate: 1.5 };
      const flags = orderDirections({ ...inc, mMin: -edge - 2, mMax: edge + 2 });
      const on = flags.filter((o) => o.transmitted.propagating).map((o) => o.m);
      const range = propagatingOrders(inc).transmitted!;
      expect([range.mMin, range.mMax]).toEqual([on[0], on[on.length - 1]]);
      expect(on).toHaveLength(range.mMax - range.mMin + 1);
      expect(Math.abs(range.mMax - edge)).toBeLessThanOrEqual(1);
    }
  });

  it('specular order reproduces the incidence angles, also in a conical mount', () => {
    // source: m = 0 leaves kx, ky unchanged, so θ0 = θ and φ0 = φ when |φ| < 90°.
    const theta = degToRad(35);
    const phi = degToRad(-40);
    const [o] = orderDirections({
      wavelength: 0.7,
      period: 1.3,
      thetaRad: theta,
      phiRad: phi,
      nCover: 1.2,
      nSubstrate: 1.2,
      mMin: 0,
      mMax: 0,
    });
    const r = prop(o!.reflected, 'R0');
    const t = prop(o!.transmitted, 'T0');
    near(r.thetaRad, theta, 1e-15, 'θ0');
    near(r.phiRad, phi, 1e-15, 'φ0');
    near(t.thetaRad, theta, 1e-15, 'θ0 T');
    near(t.cosines.z, Math.cos(theta), 1e-15, 'T0 z');
    near(r.cosines.z, -Math.cos(theta), 1e-15, 'R0 z');
  });

  it('substrate with no propagating order at all', () => {
    // source: β = nCover·sinθ·sinφ = 2·sin60°·1 = 1.732 > nSubstrate = 1.5, so every order is
    // evanescent in the substrate whatever m.
    const inc = {
      wavelength: 0.5,
      period: 1,
      thetaRad: degToRad(60),
      phiRad: Math.PI / 2,
      nCover: 2,
      nSubstrate: 1.5,
    };
    expect(propagatingOrders(inc).transmitted).toBeNull();
    expect(orderDirections({ ...inc, mMin: -5, mMax: 5 }).every((o) => !o.transmitted.propagating)).toBe(true);
    expect(cutoffWavelength(1, 1, inc.thetaRad, inc.phiRad, 2, 1.5).substrate).toBeNull();
    expect(rayleighWavelengths(1, 1, inc.thetaRad, inc.phiRad, 2, 1.5).substrate).toEqual([]);
  });

  it('Rayleigh wavelengths: Λ = 1 µm, θ = 30°, air', () => {
    // source: grating equation sin30° + m·λ/Λ = ±1 -> m = +1 grazes at 0.5 µm, m = −1 at 1.5 µm.
    const theta = degToRad(30);
    const p1 = rayleighWavelengths(1, 1, theta, 0, 1, 1);
    const m1 = rayleighWavelengths(-1, 1, theta, 0, 1, 1);
    expect(p1.cover).toHaveLength(1);
    near(p1.cover[0]!.wavelength, 0.5, 1e-15, '+1');
    expect(p1.cover[0]!.kxOverK0).toBe(1);
    expect(m1.cover).toHaveLength(1);
    near(m1.cover[0]!.wavelength, 1.5, 1e-15, '−1');
    expect(m1.cover[0]!.kxOverK0).toBe(-1);
    // source: same, into n = 1.5: 0.5 + λ = 1.5 -> 1.0 µm; 0.5 − λ = −1.5 -> 2.0 µm
    const glass = rayleighWavelengths(1, 1, theta, 0, 1, 1.5);
    near(glass.substrate[0]!.wavelength, 1, 1e-15, '+1 glass');
    near(rayleighWavelengths(-1, 1, theta, 0, 1, 1.5).substrate[0]!.wavelength, 2, 1e-15, '−1 glass');
    const cut = cutoffWavelength(1, 1, theta, 0, 1, 1.5);
    near(cut.cover, 0.5, 1e-15, 'cutoff cover');
    near(cut.substrate!, 1, 1e-15, 'cutoff substrate');
    expect(rayleighWavelengths(0, 1, theta, 0, 1, 1.5)).toEqual({ cover: [], substrate: [] });
    expect(cutoffWavelength(0, 1, theta, 0, 1, 1.5)).toEqual({ cover: Infinity, substrate: Infinity });
  });

  it('two Rayleigh wavelengths of one order when the substrate is rarer than the cover', () => {
    // source: grating equation. nCover = 1.5, θ = 60°: α0 = 1.299 > nSubstrate = 1, so order −1
    // propagates in the substrate only for −1 ≤ α0 − λ ≤ 1: λ ∈ [0.299, 2.299] (Λ = 1).
    const theta = degToRad(60);
    const a0 = 1.5 * Math.sin(theta);
    const r = rayleighWavelengths(-1, 1, theta, 0, 1.5, 1);
    expect(r.substrate).toHaveLength(2);
    near(r.substrate[0]!.wavelength, a0 - 1, 1e-15, 'short');
    expect(r.substrate[0]!.kxOverK0).toBe(1);
    near(r.substrate[1]!.wavelength, a0 + 1, 1e-15, 'long');
    expect(r.substrate[1]!.kxOverK0).toBe(-1);
    near(cutoffWavelength(-1, 1, theta, 0, 1.5, 1).substrate!, a0 + 1, 1e-15, 'cutoff');
    // order 0 is totally internally reflected at every wavelength
    expect(cutoffWavelength(0, 1, theta, 0, 1.5, 1).substrate).toBeNull();
  });

  it('Rayleigh angles: λ/Λ = 0.5, air', () => {
    // source: sinθ = ±1 − m·λ/Λ -> order +1 grazes at θ = 30°, order −1 at θ = −30°.
    const p = rayleighAngles(1, 0.5, 1, 1, 1);
    expect(p.cover).toHaveLength(1);
    near(p.cover[0]!.thetaRad, Math.PI / 6, 1e-15, '+1');
    expect(p.cover[0]!.kxOverK0).toBe(1);
    near(rayleighAngles(-1, 0.5, 1, 1, 1).cover[0]!.thetaRad, -Math.PI / 6, 1e-15, '−1');
    // source: order 0 in a rarer substrate grazes at the critical angle asin(1/1.5)
    const tir = rayleighAngles(0, 0.5, 1, 1.5, 1);
    expect(tir.cover).toEqual([]);
    expect(tir.substrate.map((a) => a.thetaRad)).toEqual([-Math.asin(1 / 1.5), Math.asin(1 / 1.5)]);
  });

  it('Littrow: 1200 lines/mm at 632.8 nm, order −1', () => {
    // source: common practice, θ = asin(0.6328 µm · 1.2 µm⁻¹ / 2) = asin(0.37968) = 22.31386°
    const theta = littrowAngle(-1, 632.8, periodNmFromLinesPerMm(1200));
    near(radToDeg(theta), 22.313862533531346, 1e-12, 'Littrow deg');
    near(littrowAngle(-1, 0.6328, periodUmFromLinesPerMm(1200)), theta, 1e-15, 'unit-free');
    // order +1 is on the other side; order 0 is normal incidence
    near(littrowAngle(1, 632.8, periodNmFromLinesPerMm(1200)), -theta, 1e-15, '+1');
    expect(littrowAngle(0, 632.8, 833)).toBe(0);
    // source: in a cover of index n the condition is 2nΛ sinθ = −mλ
    near(littrowAngle(-1, 0.6, 1, 1.5), Math.asin(0.2), 1e-15, 'index');
  });

  it('constant deviation: m = 1, λ/Λ = 0.5, δ = 60°', () => {
    // source: derived in the JSDoc: sinψ = mλ/(2Λcos(δ/2)) = 0.288675, θ = 30° − ψ, θm = 30° + ψ
    const c = constantDeviation(1, 0.5, 1, degToRad(60));
    near(radToDeg(c.incidenceRad), 13.22134511903964, 1e-12, 'θ');
    near(radToDeg(c.diffractionRad), 46.77865488096035, 1e-12, 'θm');
    near(radToDeg(c.rotationRad), 16.778654880960357, 1e-12, 'ψ');
    // δ = 0 is Littrow
    const l = constantDeviation(-2, 0.4, 1, 0, 1.3);
    near(l.incidenceRad, littrowAngle(-2, 0.4, 1, 1.3), 1e-15, 'Littrow θ');
    near(l.diffractionRad, -l.incidenceRad, 1e-15, 'Littrow θm');
  });

  it('angular and linear dispersion', () => {
    // source: dθm/dλ = m/(Λ cosθm): m = 1, Λ = 1, θm = 60° -> 1/(1·0.5) = 2 rad per unit
    near(angularDispersion(1, 1, Math.PI / 3), 2, 1e-14, 'dispersion');
    near(angularDispersion(-2, 1, Math.PI / 3), -4, 1e-14, 'dispersion −2');
    near(angularDispersion(1, 1, 0, 1.5), 1 / 1.5, 1e-15, 'in glass');
    near(linearDispersion(1, 1, Math.PI / 3, 1000), 2000, 1e-10, 'linear');
    expect(angularDispersion(0, 1, 0.3)).toBe(0);
  });

  it('resolving power, free spectral range, blaze, groove density', () => {
    // source: R = |m|·N, N = 50 mm · 1200 /mm = 60000 -> R = 120000 in order 2
    near(resolvingPower(2, 50e6, periodNmFromLinesPerMm(1200)), 120000, 1e-7, 'R');
    near(resolvingPower(-2, 50, periodUmFromLinesPerMm(1200) / 1000), 120000, 1e-7, 'R mm');
    // source: FSR = λ/|m|
    expect(freeSpectralRange(2, 500)).toBe(250);
    expect(freeSpectralRange(-2, 500)).toBe(250);
    // source: common practice λB = 2Λ sinθB: Λ = 1 µm, θB = 30° -> 1 µm; 2nd order 0.5 µm
    near(blazeWavelength(Math.PI / 6, 1), 1, 1e-15, 'λB');
    near(blazeWavelength(Math.PI / 6, 1, -2), 0.5, 1e-15, 'λB m=−2');
    near(blazeAngleFor(1, 1), Math.PI / 6, 1e-15, 'θB');
    // source: 1 mm = 1e6 nm = 1e3 µm
    near(periodNmFromLinesPerMm(1200), 833.3333333333334, 1e-12, 'nm');
    near(periodUmFromLinesPerMm(600), 1.6666666666666667, 1e-15, 'µm');
    expect(linesPerMmFromPeriodNm(500)).toBe(2000);
    expect(linesPerMmFromPeriodUm(2)).toBe(500);
    expect(degToRad(180)).toBe(Math.PI);
    expect(radToDeg(Math.PI)).toBe(180);
  });
});

// ---------------------------------------------------------------------------------------------
// properties
// ---------------------------------------------------------------------------------------------

describe('properties', () => {
  it('orderDirections satisfies the grating equation (any mount) and |k| = n·k0', () => {
    fc.assert(
      fc.property(
        wavelengthArb, periodArb, thetaArb, phiArb, indexArb, indexArb,
        (wavelength, period, theta, phi, nCover, nSubstrate) => {
          const list = orderDirections({
            wavelength, period, thetaRad: theta, phiRad: phi, nCover, nSubstrate, mMin: -6, mMax: 6,
          });
          expect(list).toHaveLength(13);
          for (const o of list) {
            const [a, b] = alphaBeta(o.m, wavelength, period, theta, phi, nCover);
            near(o.kxOverK0, a, 1e-12 * (1 + Math.abs(a)), 'kx');
            near(o.kyOverK0, b, 1e-12, 'ky');
            for (const [side, n, sign] of [
              [o.reflected, nCover, -1],
              [o.transmitted, nSubstrate, 1],
            ] as const) {
              const excess = a * a + b * b - n * n;
              if (Math.abs(excess) > 1e-9) expect(side.propagating).toBe(excess < 0);
              if (side.propagating) {
                const { x, y, z } = side.cosines;
                near(x * x + y * y + z * z, 1, 1e-12, '|u|');
                near(n * x, a, 1e-12 * (1 + Math.abs(a)), 'n·ux');
                near(n * y, b, 1e-12, 'n·uy');
                near(z * n, side.kzOverK0, 1e-12, 'kz');
                // |k| = n·k0
                near(a * a + b * b + side.kzOverK0 ** 2, n * n, 1e-10 * (1 + n * n), '|k|');
                expect(Math.sign(z) === sign || z === 0).toBe(true);
                // angles reproduce the direction in the incident parametrisation
                const st = Math.sin(side.thetaRad);
                near(n * st * Math.cos(side.phiRad), a, 1e-10 * (1 + n), 'θm,φm x');
                near(n * st * Math.sin(side.phiRad), b, 1e-10 * (1 + n), 'θm,φm y');
                near(Math.cos(side.thetaRad), Math.abs(z), 1e-10, 'θm z');
                expect(Math.abs(side.phiRad)).toBeLessThanOrEqual(Math.PI / 2);
              } else {
                near(side.decayOverK0 ** 2, excess, 1e-10 * (1 + n * n), 'decay');
                expect(side.decayOverK0).toBeGreaterThanOrEqual(0);
              }
            }
          }
        },
      ),
      RUNS,
    );
  });

  it('classical mount: n·sinθm = nCover·sinθ + m·λ/Λ on both sides, φm = 0', () => {
    fc.assert(
      fc.property(
        wavelengthArb, periodArb, thetaArb, indexArb, indexArb,
        (wavelength, period, theta, nCover, nSubstrate) => {
          const list = orderDirections({
            wavelength, period, thetaRad: theta, nCover, nSubstrate, mMin: -6, mMax: 6,
          });
          for (const o of list) {
            const rhs = nCover * Math.sin(theta) + (o.m * wavelength) / period;
            expect(o.kyOverK0).toBe(0);
            if (o.reflected.propagating) {
              near(nCover * Math.sin(o.reflected.thetaRad), rhs, 1e-12 * (1 + Math.abs(rhs)), 'R');
              expect(o.reflected.phiRad).toBe(0);
            }
            if (o.transmitted.propagating) {
              near(nSubstrate * Math.sin(o.transmitted.thetaRad), rhs, 1e-12 * (1 + Math.abs(rhs)), 'T');
              expect(o.transmitted.phiRad).toBe(0);
            }
          }
        },
      ),
      RUNS,
    );
  });

  it('propagatingOrders agrees exactly with the propagating flags', () => {
    fc.assert(
      fc.property(
        wavelengthArb, periodArb, thetaArb, phiArb, indexArb, indexArb,
        (wavelength, period, theta, phi, nCover, nSubstrate) => {
          const inc = { wavelength, period, thetaRad: theta, phiRad: phi, nCover, nSubstrate };
          const ranges = propagatingOrders(inc);
          const span = Math.ceil((2 * Math.max(nCover, nSubstrate) * period) / wavelength) + 3;
          const list = orderDirections({ ...inc, mMin: -span, mMax: span });
          const inRange = (m: number, r: { mMin: number; mMax: number } | null): boolean =>
            r !== null && m >= r.mMin && m <= r.mMax;
          expect(inRange(0, ranges.reflected)).toBe(true);
          for (const o of list) {
            expect(o.reflected.propagating).toBe(inRange(o.m, ranges.reflected));
            expect(o.transmitted.propagating).toBe(inRange(o.m, ranges.transmitted));
          }
        },
      ),
      RUNS,
    );
  });

  it('Littrow: the order returns along the incident beam', () => {
    fc.assert(
      fc.property(
        nonzeroOrderArb, fc.double({ min: 0.01, max: 0.98, noNaN: true }), periodArb, fc.double({ min: 1, max: 3, noNaN: true }),
        (m, u, period, nCover) => {
          const wavelength = (2 * period * nCover * u) / Math.abs(m);
          const theta = littrowAngle(m, wavelength, period, nCover);
          near(Math.abs(Math.sin(theta)), u, 1e-14, '|sinθ|');
          const [o] = orderDirections({
            wavelength, period, thetaRad: theta, nCover, nSubstrate: 1, mMin: m, mMax: m,
          });
          const r = prop(o!.reflected, 'Littrow order');
          near(r.cosines.x, -Math.sin(theta), 1e-13, 'x');
          near(r.cosines.z, -Math.cos(theta), 1e-13, 'z');
          near(r.thetaRad, -theta, 1e-7, 'θm'); // asin-conditioned near grazing; cosines are tight
        },
      ),
      RUNS,
    );
  });

  it('constant deviation satisfies the grating equation and the deviation', () => {
    fc.assert(
      fc.property(
        fc.double({ min: -1.4, max: 1.4, noNaN: true }),
        fc.double({ min: -1.4, max: 1.4, noNaN: true }),
        fc.integer({ min: 1, max: 4 }),
        periodArb,
        fc.double({ min: 1, max: 2, noNaN: true }),
        (theta, thetaM, k, period, nCover) => {
          const d = Math.sin(thetaM) - Math.sin(theta);
          fc.pre(Math.abs(d) > 1e-3);
          const m = d > 0 ? k : -k;
          const wavelength = (nCover * period * Math.abs(d)) / k;
          const delta = theta + thetaM;
          const c = constantDeviation(m, wavelength, period, delta, nCover);
          near(c.incidenceRad, theta, 1e-9, 'θ');
          near(c.diffractionRad, thetaM, 1e-9, 'θm');
          near(c.incidenceRad + c.diffractionRad, delta, 1e-14, 'δ');
          // grating equation, checked through orderDirections at the returned incidence
          const [o] = orderDirections({
            wavelength, period, thetaRad: c.incidenceRad, nCover, nSubstrate: 1, mMin: m, mMax: m,
          });
          const r = prop(o!.reflected, 'order');
          near(r.thetaRad, c.diffractionRad, 1e-9, 'grating equation');
          // the angle between reversed incident beam and diffracted beam is |δ|
          const dot = -Math.sin(c.incidenceRad) * r.cosines.x + Math.cos(c.incidenceRad) * -r.cosines.z;
          near(Math.acos(Math.min(1, dot)), Math.abs(delta), 1e-7, 'deviation');
        },
      ),
      RUNS,
    );
  });

  it('constant deviation throws exactly when no mount exists', () => {
    fc.assert(
      fc.property(
        nonzeroOrderArb, wavelengthArb, periodArb, fc.double({ min: -3.1, max: 3.1, noNaN: true }),
        (m, wavelength, period, delta) => {
          const s = (m * wavelength) / (2 * period * Math.cos(delta / 2));
          const psi = Math.asin(s);
          const exists =
            Math.abs(s) <= 1 &&
            Math.abs(delta / 2 - psi) < Math.PI / 2 &&
            Math.abs(delta / 2 + psi) <= Math.PI / 2;
          if (exists) expect(() => constantDeviation(m, wavelength, period, delta)).not.toThrow();
          else expect(() => constantDeviation(m, wavelength, period, delta)).toThrow(RangeError);
        },
      ),
      RUNS,
    );
  });

  it('reciprocity: the reversed diffracted beam is sent back along the reversed incident beam', () => {
    fc.assert(
      fc.property(
        wavelengthArb, periodArb, thetaArb, indexArb, indexArb, nonzeroOrderArb,
        (wavelength, period, theta, nCover, nSubstrate, m) => {
          const [o] = orderDirections({
            wavelength, period, thetaRad: theta, nCover, nSubstrate, mMin: m, mMax: m,
          });
          const r = o!.reflected;
          if (r.propagating && Math.abs(r.cosines.z) > 0.05) {
            // light arriving along −u_m, i.e. at incidence −θm, in the same order m
            const [back] = orderDirections({
              wavelength, period, thetaRad: -r.thetaRad, nCover, nSubstrate, mMin: m, mMax: m,
            });
            const rb = prop(back!.reflected, 'reciprocal R');
            near(rb.cosines.x, -Math.sin(theta), 1e-12, 'R x');
            near(rb.cosines.z, -Math.cos(theta), 1e-12, 'R z');
          }
          const t = o!.transmitted;
          if (t.propagating && Math.abs(t.cosines.z) > 0.05) {
            // light arriving from the substrate side along −u_m: swap the two media
            const [back] = orderDirections({
              wavelength, period, thetaRad: -t.thetaRad, nCover: nSubstrate, nSubstrate: nCover, mMin: m, mMax: m,
            });
            const tb = prop(back!.transmitted, 'reciprocal T');
            near(tb.cosines.x, -Math.sin(theta), 1e-12, 'T x');
            near(tb.cosines.z, Math.cos(theta), 1e-12, 'T z');
          }
        },
      ),
      RUNS,
    );
  });

  it('reciprocity in a conical mount (reflection)', () => {
    fc.assert(
      fc.property(
        wavelengthArb, periodArb, thetaArb, phiArb, indexArb, nonzeroOrderArb,
        (wavelength, period, theta, phi, nCover, m) => {
          const [o] = orderDirections({
            wavelength, period, thetaRad: theta, phiRad: phi, nCover, nSubstrate: 1, mMin: m, mMax: m,
          });
          const r = o!.reflected;
          fc.pre(r.propagating && Math.abs(r.cosines.z) > 0.05);
          if (!r.propagating) return;
          const rev = directionAngles(-r.cosines.x, -r.cosines.y);
          const [back] = orderDirections({
            wavelength, period, thetaRad: rev.thetaRad, phiRad: rev.phiRad, nCover, nSubstrate: 1, mMin: m, mMax: m,
          });
          const rb = prop(back!.reflected, 'reciprocal');
          near(rb.cosines.x, -Math.sin(theta) * Math.cos(phi), 1e-12, 'x');
          near(rb.cosines.y, -Math.sin(theta) * Math.sin(phi), 1e-12, 'y');
          near(rb.cosines.z, -Math.cos(theta), 1e-12, 'z');
        },
      ),
      RUNS,
    );
  });

  it('Rayleigh wavelengths make the order graze, and the cutoff separates propagating from evanescent', () => {
    fc.assert(
      fc.property(
        nonzeroOrderArb, periodArb, thetaArb, phiArb, indexArb, indexArb,
        (m, period, theta, phi, nCover, nSubstrate) => {
          const ray = rayleighWavelengths(m, period, theta, phi, nCover, nSubstrate);
          const cut = cutoffWavelength(m, period, theta, phi, nCover, nSubstrate);
          expect(ray.cover).toHaveLength(1);
          expect(cut.cover).toBe(ray.cover[0]!.wavelength);
          const longest = ray.substrate.at(-1);
          expect(cut.substrate).toBe(longest === undefined ? null : longest.wavelength);
          for (const [list, n] of [
            [ray.cover, nCover],
            [ray.substrate, nSubstrate],
          ] as const) {
            for (const g of list) {
              expect(g.wavelength).toBeGreaterThan(0);
              const [a, b] = alphaBeta(m, g.wavelength, period, theta, phi, nCover);
              near(a, g.kxOverK0, 1e-9 * (1 + n), 'kx at graze');
              near(a * a + b * b, n * n, 1e-9 * (1 + n * n), 'grazing');
            }
          }
          const at = (wavelength: number) =>
            orderDirections({
              wavelength, period, thetaRad: theta, phiRad: phi, nCover, nSubstrate, mMin: m, mMax: m,
            })[0]!;
          expect(at(cut.cover * (1 - 1e-6)).reflected.propagating).toBe(true);
          expect(at(cut.cover * (1 + 1e-6)).reflected.propagating).toBe(false);
          if (cut.substrate !== null) {
            expect(at(cut.substrate * (1 + 1e-6)).transmitted.propagating).toBe(false);
          }
        },
      ),
      RUNS,
    );
  });

  it('Rayleigh angles make the order graze', () => {
    fc.assert(
      fc.property(
        orderArb, wavelengthArb, periodArb, indexArb, indexArb, phiArb,
        (m, wavelength, period, nCover, nSubstrate, phi) => {
          const ang = rayleighAngles(m, wavelength, period, nCover, nSubstrate, phi);
          for (const [list, n] of [
            [ang.cover, nCover],
            [ang.substrate, nSubstrate],
          ] as const) {
            for (let i = 0; i < list.length; i++) {
              const g = list[i]!;
              expect(Math.abs(g.thetaRad)).toBeLessThan(Math.PI / 2);
              if (i > 0) expect(g.thetaRad).toBeGreaterThan(list[i - 1]!.thetaRad);
              const [a, b] = alphaBeta(m, wavelength, period, g.thetaRad, phi, nCover);
              near(a, g.kxOverK0, 1e-9 * (1 + n), 'kx at graze');
              near(a * a + b * b, n * n, 1e-9 * (1 + n * n), 'grazing');
            }
          }
        },
      ),
      RUNS,
    );
  });

  it('Rayleigh angles find every grazing incidence (sign changes of the classification)', () => {
    fc.assert(
      fc.property(nonzeroOrderArb, wavelengthArb, periodArb, indexArb, (m, wavelength, period, nCover) => {
        // scan θ on a grid; each change of the cover flag must lie within a grid step of a
        // returned angle
        const ang = rayleighAngles(m, wavelength, period, nCover, 1).cover.map((g) => g.thetaRad);
        const step = 1e-3;
        let prev: boolean | undefined;
        let changes = 0;
        for (let th = -1.5; th <= 1.5; th += step) {
          const [o] = orderDirections({
            wavelength, period, thetaRad: th, nCover, nSubstrate: 1, mMin: m, mMax: m,
          });
          const now = o!.reflected.propagating;
          if (prev !== undefined && now !== prev) {
            changes++;
            expect(ang.some((a) => a > th - step - 1e-12 && a <= th + 1e-12)).toBe(true);
          }
          prev = now;
        }
        expect(ang.filter((a) => a > -1.5 && a < 1.5 - step).length).toBeGreaterThanOrEqual(changes);
      }),
      { numRuns: 40 },
    );
  });

  it('angular dispersion matches the derivative of the grating equation', () => {
    fc.assert(
      fc.property(
        nonzeroOrderArb, wavelengthArb, periodArb, thetaArb, fc.double({ min: 1, max: 2, noNaN: true }),
        (m, wavelength, period, theta, nCover) => {
          const h = 1e-6 * wavelength;
          const thetaM = (wl: number): number | undefined => {
            const r = orderDirections({
              wavelength: wl, period, thetaRad: theta, nCover, nSubstrate: 1, mMin: m, mMax: m,
            })[0]!.reflected;
            return r.propagating ? r.thetaRad : undefined;
          };
          const lo = thetaM(wavelength - h);
          const mid = thetaM(wavelength);
          const hi = thetaM(wavelength + h);
          fc.pre(lo !== undefined && mid !== undefined && hi !== undefined && Math.abs(mid) < 1.3);
          const fd = (hi! - lo!) / (2 * h);
          const exact = angularDispersion(m, period, mid!, nCover);
          near(fd, exact, 1e-5 * Math.abs(exact), 'dθm/dλ');
        },
      ),
      RUNS,
    );
  });

  it('free spectral range: order m at λ + FSR leaves at the angle of order m ± 1 at λ', () => {
    fc.assert(
      fc.property(
        nonzeroOrderArb, wavelengthArb, periodArb, thetaArb,
        (m, wavelength, period, theta) => {
          const next = m + Math.sign(m);
          const a = orderDirections({
            wavelength: wavelength + freeSpectralRange(m, wavelength),
            period, thetaRad: theta, nSubstrate: 1, mMin: m, mMax: m,
          })[0]!;
          const b = orderDirections({
            wavelength, period, thetaRad: theta, nSubstrate: 1, mMin: next, mMax: next,
          })[0]!;
          near(a.kxOverK0, b.kxOverK0, 1e-12 * (1 + Math.abs(b.kxOverK0)), 'sinθm');
        },
      ),
      RUNS,
    );
  });

  it('blaze wavelength and blaze angle are inverse, and blazed incidence is Littrow for m = −1', () => {
    fc.assert(
      fc.property(
        fc.double({ min: 0.01, max: 1.5, noNaN: true }), periodArb, fc.integer({ min: 1, max: 4 }),
        (blaze, period, k) => {
          const wl = blazeWavelength(blaze, period, k);
          near(blazeAngleFor(wl, period, k), blaze, 1e-9, 'inverse');
          near(blazeWavelength(blaze, period, -k), wl, 0, 'sign of m');
          near(littrowAngle(-k, wl, period), blaze, 1e-9, 'Littrow');
        },
      ),
      RUNS,
    );
  });

  it('groove density and period conversions round-trip', () => {
    fc.assert(
      fc.property(fc.double({ min: 1, max: 1e4, noNaN: true }), (l) => {
        near(linesPerMmFromPeriodNm(periodNmFromLinesPerMm(l)), l, 1e-12 * l, 'nm');
        near(linesPerMmFromPeriodUm(periodUmFromLinesPerMm(l)), l, 1e-12 * l, 'µm');
        near(periodNmFromLinesPerMm(l), 1000 * periodUmFromLinesPerMm(l), 1e-9, 'nm vs µm');
      }),
      RUNS,
    );
  });
});

// ---------------------------------------------------------------------------------------------
// input guards
// ---------------------------------------------------------------------------------------------

describe('invalid inputs throw a RangeError naming the argument and the found value', () => {
  const base = { wavelength: 0.5, period: 1, thetaRad: 0.2, nSubstrate: 1.5, mMin: -2, mMax: 2 };
  const cases: Array<[string, () => unknown, RegExp]> = [
    ['NaN wavelength', () => orderDirections({ ...base, wavelength: NaN }), /orderDirections: wavelength must be a finite number > 0; found NaN/],
    ['zero period', () => orderDirections({ ...base, period: 0 }), /period must be a finite number > 0; found 0$/],
    ['negative period', () => propagatingOrders({ ...base, period: -1 }), /propagatingOrders: period .*found -1$/],
    ['infinite period', () => orderDirections({ ...base, period: Infinity }), /period .*found Infinity/],
    ['θ = 90°', () => orderDirections({ ...base, thetaRad: degToRad(90) }), /thetaRad must be .*\|angle\| < π\/2; found 1\.5707963267948966/],
    ['θ = −90°', () => orderDirections({ ...base, thetaRad: -Math.PI / 2 }), /thetaRad .*found -1\.5707963267948966/],
    ['θ = 100°', () => propagatingOrders({ ...base, thetaRad: degToRad(100) }), /thetaRad .*found 1\.745/],
    ['NaN θ', () => orderDirections({ ...base, thetaRad: NaN }), /thetaRad .*found NaN/],
    ['infinite φ', () => orderDirections({ ...base, phiRad: Infinity }), /phiRad must be a finite number; found Infinity/],
    ['zero nCover', () => orderDirections({ ...base, nCover: 0 }), /nCover .*found 0$/],
    ['NaN nSubstrate', () => orderDirections({ ...base, nSubstrate: NaN }), /nSubstrate .*found NaN/],
    ['fractional mMin', () => orderDirections({ ...base, mMin: 0.5 }), /mMin must be an integer; found 0\.5/],
    ['mMax < mMin', () => orderDirections({ ...base, mMin: 3, mMax: 2 }), /mMax must be an integer ≥ mMin \(3\); found 2/],
    ['too many orders', () => orderDirections({ ...base, mMin: -1e6, mMax: 1e6 }), /mMax − mMin \+ 1 must be at most 1000000 orders; found 2000001/],
    ['tiny λ/Λ', () => propagatingOrders({ ...base, wavelength: 1e-300 }), /propagatingOrders: wavelength\/period must be/],
    ['string wavelength', () => orderDirections({ ...base, wavelength: '0.5' as unknown as number }), /wavelength .*found "0\.5"/],
    ['Rayleigh: NaN θ', () => rayleighWavelengths(1, 1, NaN, 0, 1, 1), /rayleighWavelengths: thetaRad .*found NaN/],
    ['Rayleigh: m', () => rayleighWavelengths(1.5, 1, 0.1, 0, 1, 1), /rayleighWavelengths: m must be an integer; found 1\.5/],
    ['cutoff: period', () => cutoffWavelength(1, 0, 0.1, 0, 1, 1), /cutoffWavelength: period .*found 0$/],
    ['cutoff: θ', () => cutoffWavelength(1, 1, 2, 0, 1, 1), /cutoffWavelength: thetaRad .*found 2$/],
    ['Rayleigh angles: λ', () => rayleighAngles(1, -0.5, 1, 1, 1), /rayleighAngles: wavelength .*found -0\.5/],
    ['Rayleigh angles: φ', () => rayleighAngles(1, 0.5, 1, 1, 1, NaN), /rayleighAngles: phiRad .*found NaN/],
    ['Littrow beyond grazing', () => littrowAngle(-3, 1, 1), /littrowAngle: \|m·wavelength\/\(2·period·nCover\)\| must be below 1 .*found 1\.5/],
    ['Littrow exactly grazing', () => littrowAngle(-2, 1, 1), /littrowAngle: .*found 1$/],
    ['Littrow NaN λ', () => littrowAngle(-1, NaN, 1), /littrowAngle: wavelength .*found NaN/],
    ['constant deviation: δ = π', () => constantDeviation(1, 0.5, 1, Math.PI), /constantDeviation: deviationRad must be .*\|angle\| < π; found 3\.14159/],
    ['constant deviation: too long λ', () => constantDeviation(1, 3, 1, 0), /constantDeviation: .*must be at most 1 .*found 1\.5/],
    ['constant deviation: incidence past grazing', () => constantDeviation(1, 0.1, 1, 3), /constantDeviation: the resulting incidence angle must be/],
    ['dispersion at grazing', () => angularDispersion(1, 1, Math.PI / 2), /angularDispersion: diffractionRad .*found 1\.57/],
    ['linear dispersion: focal length', () => linearDispersion(1, 1, 0.1, -1), /linearDispersion: focalLength .*found -1/],
    ['resolving power: width', () => resolvingPower(1, 0, 1), /resolvingPower: illuminatedWidth .*found 0$/],
    ['FSR: order 0', () => freeSpectralRange(0, 500), /freeSpectralRange: m must be a nonzero integer; found 0$/],
    ['blaze: angle 0', () => blazeWavelength(0, 1), /blazeWavelength: blazeAngleRad must be an angle in \(0, π\/2\) radians; found 0$/],
    ['blaze: order 0', () => blazeWavelength(0.3, 1, 0), /blazeWavelength: m must be a nonzero integer; found 0$/],
    ['blaze angle: impossible', () => blazeAngleFor(3, 1), /blazeAngleFor: .*must be below 1 .*found 1\.5/],
    ['groove density 0', () => periodNmFromLinesPerMm(0), /periodNmFromLinesPerMm: linesPerMm .*found 0$/],
    ['groove density NaN', () => periodUmFromLinesPerMm(NaN), /periodUmFromLinesPerMm: linesPerMm .*found NaN/],
    ['period nm −0', () => linesPerMmFromPeriodNm(-0), /linesPerMmFromPeriodNm: periodNm .*found -0$/],
    ['period µm', () => linesPerMmFromPeriodUm(-2), /linesPerMmFromPeriodUm: periodUm .*found -2$/],
    ['degrees NaN', () => degToRad(NaN), /degToRad: degrees .*found NaN/],
    ['not a unit direction', () => directionAngles(1, 1), /directionAngles: x² \+ y² must be at most 1/],
    ['missing input', () => orderDirections(undefined as unknown as Parameters<typeof orderDirections>[0]), /orderDirections: input must be an object; found undefined/],
  ];
  it.each(cases)('%s', (_label, call, message) => {
    let caught: unknown;
    try {
      call();
    } catch (e) {
      caught = e;
    }
    expect(caught).toBeInstanceOf(RangeError);
    expect((caught as Error).message).toMatch(message);
  });

  it('an incidence rounding to grazing is rejected by name rather than misclassified', () => {
    const justBelow = 1.5707963267948963; // largest double below π/2; its sine rounds to 1
    expect(() => orderDirections({ ...base, thetaRad: justBelow })).toThrow(
      /orderDirections: thetaRad .*not numerically grazing; found 1\.5707963267948963/,
    );
    for (const phi of [0, 0.3, 0.7, 1.1, Math.PI / 4, 2.5]) {
      const inc = { wavelength: 0.5, period: 1, thetaRad: justBelow, phiRad: phi, nSubstrate: 1.5 };
      let result: ReturnType<typeof propagatingOrders> | undefined;
      try {
        result = propagatingOrders(inc);
      } catch (e) {
        expect(e).toBeInstanceOf(RangeError);
        expect((e as Error).message).toMatch(/thetaRad .*not numerically grazing; found 1\.5707963267948963/);
      }
      if (result !== undefined) {
        expect(result.reflected.mMin).toBeLessThanOrEqual(0);
        expect(result.reflected.mMax).toBeGreaterThanOrEqual(0);
        const [o] = orderDirections({ ...inc, mMin: 0, mMax: 0 });
        expect(o!.reflected.propagating).toBe(true);
      }
    }
  });
});
