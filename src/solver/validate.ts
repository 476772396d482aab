/**
 * One check of a solver problem at the public entry, with messages that name the field, what
 * was expected and what was found. Kernels below trust their inputs.
 */
import { SolverError } from './errors.ts';
import type { Complex, Incidence, Profile, SolveOptions, Structure } from './types.ts';

function fail(field: string, expected: string, found: unknown): never {
  const shown = typeof found === 'number' || typeof found === 'string' ? String(found) : JSON.stringify(found);
  throw new SolverError('invalid-input', `${field}: expected ${expected}, found ${shown}`, { field });
}

function finite(field: string, v: unknown): number {
  if (typeof v !== 'number' || !Number.isFinite(v)) fail(field, 'a finite number', v);
  return v;
}

/** Gain media (κ < 0) are refused unless the caller says they are intended. */
function index(field: string, n: unknown, gainAllowed = false): Complex {
  if (typeof n !== 'object' || n === null) fail(field, 'a complex index {re, im}', n);
  const c = n as Complex;
  finite(`${field}.re`, c.re);
  finite(`${field}.im`, c.im);
  if (c.im < 0 && !gainAllowed) fail(`${field}.im`, 'κ ≥ 0 (absorption; exp(−iωt) convention), or options.allowGain for a gain medium', c.im);
  if (c.re === 0 && c.im === 0) fail(field, 'a non-zero index', '0');
  return c;
}

function profile(field: string, p: Profile, gain: boolean): void {
  switch (p?.kind) {
    case 'uniform':
      index(`${field}.index`, p.index, gain);
      return;
    case 'segments': {
      if (!Array.isArray(p.segments) || p.segments.length === 0) fail(`${field}.segments`, 'at least one segment', p.segments);
      let at = 0;
      p.segments.forEach((s, i) => {
        const f = `${field}.segments[${i}]`;
        const from = finite(`${f}.from`, s.from);
        const to = finite(`${f}.to`, s.to);
        if (Math.abs(from - at) > 1e-12) fail(`${f}.from`, `${at} (segments must tile [0, 1) in order, without gaps or overlaps)`, from);
        if (!(to > from)) fail(`${f}.to`, `a value greater than from = ${from}`, to);
        index(`${f}.index`, s.index, gain);
        at = to;
      });
      if (Math.abs(at - 1) > 1e-12) fail(`${field}.segments`, 'segments ending at 1 (the full period)', at);
      return;
    }
    case 'fourier': {
      const a = p.permittivity;
      const b = p.inversePermittivity;
      if (!Array.isArray(a) || a.length % 2 !== 1) fail(`${field}.permittivity`, 'an odd-length list of coefficients k = −K…K', a?.length);
      if (!Array.isArray(b) || b.length !== a.length) fail(`${field}.inversePermittivity`, `${a.length} coefficients like permittivity`, b?.length);
      a.forEach((c, i) => {
        finite(`${field}.permittivity[${i}].re`, c?.re);
        finite(`${field}.permittivity[${i}].im`, c?.im);
      });
      b.forEach((c, i) => {
        finite(`${field}.inversePermittivity[${i}].re`, c?.re);
        finite(`${field}.inversePermittivity[${i}].im`, c?.im);
      });
      return;
    }
    default:
      fail(`${field}.kind`, "'uniform', 'segments' or 'fourier'", (p as { kind?: unknown })?.kind);
  }
}

/** @throws {SolverError} 'invalid-input' */
export function validateProblem(s: Structure, inc: Incidence, opt: SolveOptions): void {
  const gain = opt.allowGain === true;
  const period = finite('structure.periodUm', s.periodUm);
  if (!(period > 0)) fail('structure.periodUm', 'a period > 0 µm', period);
  const cover = index('structure.cover', s.cover);
  if (cover.im !== 0) fail('structure.cover.im', '0 (the cover must be lossless so the incident wave is defined)', cover.im);
  if (!(cover.re > 0)) fail('structure.cover.re', 'a positive index', cover.re);
  index('structure.substrate', s.substrate, gain);
  if (!Array.isArray(s.layers)) fail('structure.layers', 'a list of layers', s.layers);
  s.layers.forEach((l, i) => {
    const t = finite(`structure.layers[${i}].thicknessUm`, l?.thicknessUm);
    if (!(t >= 0)) fail(`structure.layers[${i}].thicknessUm`, 'a thickness ≥ 0 µm', t);
    profile(`structure.layers[${i}].profile`, l.profile, gain);
  });
  const lambda = finite('incidence.wavelengthUm', inc.wavelengthUm);
  if (!(lambda > 0)) fail('incidence.wavelengthUm', 'a wavelength > 0 µm', lambda);
  const theta = finite('incidence.thetaDeg', inc.thetaDeg);
  if (!(Math.abs(theta) < 90)) fail('incidence.thetaDeg', 'a polar angle in (−90°, 90°)', theta);
  if (inc.phiDeg !== undefined) finite('incidence.phiDeg', inc.phiDeg);
  const p = inc.polarization;
  if (p !== undefined && p !== 'TE' && p !== 'TM') {
    if (typeof p !== 'object' || p === null) fail('incidence.polarization', "'TE', 'TM' or a Jones vector {s, p}", p);
    for (const k of ['s', 'p'] as const) {
      finite(`incidence.polarization.${k}.re`, p[k]?.re);
      finite(`incidence.polarization.${k}.im`, p[k]?.im);
    }
    if (p.s.re === 0 && p.s.im === 0 && p.p.re === 0 && p.p.im === 0) fail('incidence.polarization', 'a non-zero Jones vector', '(0, 0)');
  }
  const o = opt.orders;
  if (typeof o === 'number') {
    if (!(Number.isInteger(o) && o >= 0 && o <= 1000)) fail('options.orders', 'an integer M in 0…1000 (orders −M…M)', o);
  } else {
    if (typeof o !== 'object' || o === null) fail('options.orders', 'M or {min, max}', o);
    if (!(Number.isInteger(o.min) && Number.isInteger(o.max) && o.min <= 0 && o.max >= 0 && o.max - o.min <= 2000)) {
      fail('options.orders', 'integers min ≤ 0 ≤ max spanning at most 2001 orders', o);
    }
  }
  if (opt.formulation !== undefined && opt.formulation !== 'auto' && opt.formulation !== 'conical') {
    fail('options.formulation', "'auto' or 'conical'", opt.formulation);
  }
  if (opt.factorization !== undefined && opt.factorization !== 'inverse' && opt.factorization !== 'laurent') {
    fail('options.factorization', "'inverse' or 'laurent'", opt.factorization);
  }
}
