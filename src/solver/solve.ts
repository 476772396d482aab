/**
 * `solve()`: efficiencies, amplitudes and energy balance of every order for a layered grating
 * under one incident plane wave — the rigorous coupled-wave (Fourier modal) method.
 *
 * Method: M. G. Moharam & T. K. Gaylord, J. Opt. Soc. Am. 71, 811 (1981) (rigorous coupled-wave
 * analysis); Fourier factorization rules of L. Li, J. Opt. Soc. Am. A 13, 1870 (1996) and
 * P. Lalanne & G. M. Morris, J. Opt. Soc. Am. A 13, 779 (1996); conical diffraction by two N×N
 * eigenproblems (Moharam, Grann, Pommet & Gaylord, J. Opt. Soc. Am. A 12, 1077 (1995)); a
 * stable recursion over the layers (see stack.ts). Homogeneous layers and half-spaces are
 * solved analytically; lossless modulated layers use the Hermitian eigen path.
 */
import { cmatrix, type CMatrix, LinalgError, zsqrtUpper } from '../linalg/index.ts';
import { SolverError } from './errors.ts';
import { directionAngles } from './grating-equation.ts';
import { indexFromPermittivity, isLossless, permittivityOf, profileCoefficients } from './fourier.ts';
import { type Family, homogeneousModes, type Modes, modulatedModes } from './modes.ts';
import { MediumFailure, solveStack } from './stack.ts';
import { ModeCache } from './cache.ts';
import type { Complex, Incidence, Jones, OrderResult, Profile, Response, SolveOptions, SolveResult, Structure } from './types.ts';
import { validateProblem } from './validate.ts';

export const SOLVER_VERSION = '0.1.0';

const DEG = Math.PI / 180;

/** Per-order geometry and the raw field amplitudes of one incidence. */
interface Raw {
  /** tangential (Ex, Ey, Hx, Hy) of the backward wave per order in the cover, at z = 0 */
  refl: Float64Array;
  /** the same for the forward wave in the substrate at the last interface */
  trans: Float64Array;
}

/**
 * Solve one grating problem.
 * @param structure cover, layers, substrate and period (µm).
 * @param incidence wavelength (µm), angles (deg) and optional polarization of interest.
 * @param options retained orders and method switches.
 * @param cache optional store of layer modes shared across calls (see cache.ts): a depth or
 *   thickness sweep then solves each distinct layer profile once per wavelength and incidence.
 * @returns s (TE) and p (TM) responses, and the requested polarization's, with every
 *   propagating order's efficiency, angles and complex amplitudes.
 * @throws {SolverError} 'invalid-input' naming the field, expected and found value;
 *   'numerical' with the layer, wavelength and angle when a kernel fails.
 * @example
 * // a bare glass surface, normal incidence: R = ((1.5 − 1)/(1.5 + 1))² = 0.04 (Fresnel)
 * solve({ periodUm: 1, cover: {re: 1, im: 0}, substrate: {re: 1.5, im: 0}, layers: [] },
 *       { wavelengthUm: 0.6, thetaDeg: 0 }, { orders: 2 }).s.R; // → 0.04
 */
export function solve(structure: Structure, incidence: Incidence, options: SolveOptions, cache?: ModeCache): SolveResult {
  const setup = setupProblem(structure, incidence, options);
  const { families, kx, ky, orders, epsCover, epsSub, nc, theta, az, classical } = setup;
  // identical layers share their modes within this solve even without a cache
  const store = cache ?? new ModeCache(structure.layers.length + 2);
  const raws: Raw[] = []; // [s, p]
  for (const family of families) {
    const { media, thickness, inc } = familyMedia(setup, structure, incidence, family, store);
    let res;
    try {
      res = solveStack(media, thickness, inc);
    } catch (e) {
      if (e instanceof MediumFailure) throw numerical(e.cause, e.medium - 1, incidence, family);
      throw numerical(e, -1, incidence, family);
    }
    const cover = media[0]!;
    const sub = media[media.length - 1]!;
    for (let col = 0; col < inc.cols; col++) {
      raws.push({
        refl: tangential(cover, res.reflected, col, family, -1),
        trans: tangential(sub, res.transmitted, col, family, +1),
      });
    }
  }
  // classical: raws = [TE, TM]; conical: [s, p] — both are the s and p incidences
  const geom: Geometry = { kx, ky, orders, epsCover, epsSub, nc, theta, az, classical };
  const incFlux = 0.5 * nc * Math.cos(theta); // |E| = 1 plane wave
  const sResp = response(raws[0]!, geom, incFlux);
  const pResp = response(raws[1]!, geom, incFlux);
  let requested: Response | undefined;
  if (incidence.polarization !== undefined) {
    const j = jonesOf(incidence.polarization);
    const mix = (a: Float64Array, b: Float64Array): Float64Array => {
      const o = new Float64Array(a.length);
      for (let k = 0; k < a.length; k += 2) {
        o[k] = j.s.re * a[k]! - j.s.im * a[k + 1]! + j.p.re * b[k]! - j.p.im * b[k + 1]!;
        o[k + 1] = j.s.re * a[k + 1]! + j.s.im * a[k]! + j.p.re * b[k + 1]! + j.p.im * b[k]!;
      }
      return o;
    };
    requested = response({ refl: mix(raws[0]!.refl, raws[1]!.refl), trans: mix(raws[0]!.trans, raws[1]!.trans) }, geom, incFlux);
  }
  return {
    solver: { name: 'furrow', version: SOLVER_VERSION, method: 'RCWA (Fourier modal method), inverse-rule factorization, S-matrix recursion' },
    orders,
    classical,
    s: sResp,
    p: pResp,
    ...(requested ? { requested } : {}),
  };
}

/** @internal What solve() and nearField() derive from the input before any eigensolve. */
export interface Setup {
  readonly N: number;
  /** index of order 0 in the retained list */
  readonly i0: number;
  readonly kx: Float64Array;
  readonly ky: number;
  readonly orders: number[];
  readonly classical: boolean;
  readonly families: Family[];
  readonly k0: number;
  readonly nc: number;
  readonly theta: number;
  readonly az: [number, number];
  readonly epsCover: [number, number];
  readonly epsSub: [number, number];
  readonly factorization: 'inverse' | 'laurent';
  readonly hermitian: boolean;
  readonly waveKey: string;
}

/** @internal Validate and derive the orders' wavevectors (normalized by k0). */
export function setupProblem(structure: Structure, incidence: Incidence, options: SolveOptions): Setup {
  validateProblem(structure, incidence, options);
  const { min: mMin, max: mMax } = typeof options.orders === 'number' ? { min: -options.orders, max: options.orders } : options.orders;
  const N = mMax - mMin + 1;
  const lambda = incidence.wavelengthUm;
  const theta = incidence.thetaDeg * DEG;
  const phi = (incidence.phiDeg ?? 0) * DEG;
  const nc = structure.cover.re;
  const kx0 = nc * Math.sin(theta) * Math.cos(phi);
  const ky = incidence.phiDeg ? nc * Math.sin(theta) * Math.sin(phi) : 0;
  const classical = ky === 0 && (incidence.phiDeg ?? 0) === 0 && options.formulation !== 'conical';
  const K = lambda / structure.periodUm; // grating vector / k0
  const kx = new Float64Array(N);
  const orders: number[] = [];
  for (let i = 0; i < N; i++) {
    kx[i] = kx0 + (mMin + i) * K;
    orders.push(mMin + i);
  }
  const az: [number, number] = [Math.cos(phi), Math.sin(phi)];
  const factorization = options.factorization ?? 'inverse';
  const hermitian = options.hermitian ?? true;
  return {
    N,
    i0: -mMin,
    kx,
    ky,
    orders,
    classical,
    families: classical ? ['TE', 'TM'] : ['conical'],
    k0: (2 * Math.PI) / lambda,
    nc,
    theta,
    az,
    epsCover: permittivityOf(structure.cover),
    epsSub: permittivityOf(structure.substrate),
    factorization,
    hermitian,
    waveKey: `${factorization}|${hermitian}|${ky}|${az[0]},${az[1]}|${Array.prototype.join.call(kx, ',')}`,
  };
}

/**
 * @internal The media (cover, layers, substrate) of one field family with their normalized
 * thicknesses, and the incident mode amplitudes: one column (TE or TM) in the classical mount,
 * two (s, p) in conical incidence.
 */
export function familyMedia(
  setup: Setup,
  structure: Structure,
  incidence: Incidence,
  family: Family,
  store: ModeCache,
): { media: Modes[]; thickness: number[]; inc: CMatrix } {
  const { kx, ky, az, waveKey, factorization, hermitian, k0, i0, N, nc } = setup;
  const half = (eps: [number, number]): Modes => store.get(`${family}|${waveKey}|h:${eps[0]},${eps[1]}`, () => homogeneousModes(eps, kx, ky, family, az));
  const media: Modes[] = [half(setup.epsCover)];
  const thickness: number[] = [0];
  structure.layers.forEach((layer, li) => {
    try {
      const key = `${family}|${waveKey}|${profileKey(layer.profile)}`;
      media.push(store.get(key, () => layerModes(layer.profile, kx, ky, family, az, factorization, hermitian)));
    } catch (e) {
      throw numerical(e, li, incidence, family);
    }
    thickness.push(k0 * layer.thicknessUm);
  });
  media.push(half(setup.epsSub));
  thickness.push(0);
  const n = media[0]!.n;
  // incident mode amplitudes: classical TE (Ey = 1) is s; classical TM (Hy = n_c) is p;
  // conical s/p modes of the cover are the s/p unit vectors themselves
  const inc = cmatrix(n, family === 'conical' ? 2 : 1);
  if (family === 'TE') inc.data[2 * i0] = 1;
  else if (family === 'TM') inc.data[2 * i0] = nc;
  else {
    inc.data[2 * (i0 * 2)] = 1; // s-mode of order 0, column 0
    inc.data[2 * ((N + i0) * 2 + 1)] = 1; // p-mode of order 0, column 1
  }
  return { media, thickness, inc };
}

function layerModes(
  profile: Profile,
  kx: Float64Array,
  ky: number,
  family: Family,
  az: readonly [number, number],
  factorization: 'inverse' | 'laurent',
  hermitian: boolean,
): Modes {
  const uniform = uniformIndex(profile);
  if (uniform) return homogeneousModes(permittivityOf(uniform), kx, ky, family, az);
  const N = kx.length;
  return modulatedModes({
    epsCoeffs: profileCoefficients(profile, N - 1, false),
    invEpsCoeffs: profileCoefficients(profile, N - 1, true),
    kx,
    ky,
    family,
    lossless: isLossless(profile),
    factorization,
    hermitian,
  });
}

/** A string that identifies a profile's permittivity exactly (numbers in full precision). */
function profileKey(p: Profile): string {
  switch (p.kind) {
    case 'uniform':
      return `u:${p.index.re},${p.index.im}`;
    case 'segments':
      return 's:' + p.segments.map((s) => `${s.from},${s.to},${s.index.re},${s.index.im}`).join(';');
    case 'fourier':
      return 'f:' + p.permittivity.map((c) => `${c.re},${c.im}`).join(';') + '/' + p.inversePermittivity.map((c) => `${c.re},${c.im}`).join(';');
  }
}

/** The index of a profile that is in fact homogeneous, else null. */
function uniformIndex(p: Profile): Complex | null {
  if (p.kind === 'uniform') return p.index;
  if (p.kind === 'segments') {
    const first = p.segments[0]!.index;
    return p.segments.every((s) => s.index.re === first.re && s.index.im === first.im) ? first : null;
  }
  const K = (p.permittivity.length - 1) / 2;
  for (let k = 0; k < p.permittivity.length; k++) {
    if (k === K) continue;
    const c = p.permittivity[k]!;
    if (c.re !== 0 || c.im !== 0) return null;
  }
  // ε constant: index = √ε0
  const c0 = p.permittivity[K]!;
  return indexFromPermittivity(c0.re, c0.im);
}

/**
 * Tangential fields (Ex, Ey, Hx, Hy) per order of the amplitudes in column `col` of `amp`,
 * for a backward (dir = −1) or forward (+1) wave in a homogeneous medium.
 */
function tangential(medium: Modes, amp: Readonly<CMatrix>, col: number, family: Family, dir: number): Float64Array {
  const n = medium.n;
  const v = cmatrix(n, 1);
  for (let i = 0; i < n; i++) {
    v.data[2 * i] = amp.data[2 * (i * amp.cols + col)]!;
    v.data[2 * i + 1] = amp.data[2 * (i * amp.cols + col) + 1]!;
  }
  const e = medium.mulW(cmatrix(n, 1), v);
  const h = medium.mulV(cmatrix(n, 1), v);
  const N = family === 'conical' ? n / 2 : n;
  const out = new Float64Array(8 * N); // per order: Ex, Ey, Hx, Hy (re, im)
  for (let i = 0; i < N; i++) {
    const o = 8 * i;
    if (family === 'TE') {
      out[o + 2] = e.data[2 * i]!;
      out[o + 3] = e.data[2 * i + 1]!;
      out[o + 4] = dir * h.data[2 * i]!;
      out[o + 5] = dir * h.data[2 * i + 1]!;
    } else if (family === 'TM') {
      out[o] = e.data[2 * i]!;
      out[o + 1] = e.data[2 * i + 1]!;
      out[o + 6] = dir * h.data[2 * i]!;
      out[o + 7] = dir * h.data[2 * i + 1]!;
    } else {
      out[o] = e.data[2 * i]!;
      out[o + 1] = e.data[2 * i + 1]!;
      out[o + 2] = e.data[2 * (N + i)]!;
      out[o + 3] = e.data[2 * (N + i) + 1]!;
      out[o + 4] = dir * h.data[2 * i]!;
      out[o + 5] = dir * h.data[2 * i + 1]!;
      out[o + 6] = dir * h.data[2 * (N + i)]!;
      out[o + 7] = dir * h.data[2 * (N + i) + 1]!;
    }
  }
  return out;
}

interface Geometry {
  kx: Float64Array;
  ky: number;
  orders: number[];
  epsCover: [number, number];
  epsSub: [number, number];
  nc: number;
  theta: number;
  az: [number, number];
  classical: boolean;
}

function response(raw: Raw, g: Geometry, incFlux: number): Response {
  const refl = orderResults(raw.refl, g, g.epsCover, -1, incFlux);
  const trans = orderResults(raw.trans, g, g.epsSub, +1, incFlux);
  // R and T sum every order: evanescent orders carry no flux in a lossless medium, and in an
  // absorbing substrate T is the whole flux entering it
  let R = 0;
  for (const o of refl) R += o.efficiency;
  let T = 0;
  for (const o of trans) T += o.efficiency;
  return {
    reflected: refl.filter((o) => o.propagating),
    transmitted: trans.filter((o) => o.propagating),
    R,
    T,
    A: 1 - R - T,
  };
}

function orderResults(
  f: Float64Array,
  g: Geometry,
  eps: readonly [number, number],
  dir: number,
  incFlux: number,
): OrderResult[] {
  const all: OrderResult[] = [];
  const { kx, ky } = g;
  const { re: nr, im: ni } = indexFromPermittivity(eps[0], eps[1]);
  const q = new Float64Array(2);
  for (let i = 0; i < kx.length; i++) {
    const o = 8 * i;
    const Ex = [f[o]!, f[o + 1]!] as const;
    const Ey = [f[o + 2]!, f[o + 3]!] as const;
    const Hx = [f[o + 4]!, f[o + 5]!] as const;
    const Hy = [f[o + 6]!, f[o + 7]!] as const;
    // S_z = ½ Re(Ex·Hy* − Ey·Hx*)
    const sz = 0.5 * (Ex[0] * Hy[0] + Ex[1] * Hy[1] - (Ey[0] * Hx[0] + Ey[1] * Hx[1]));
    const efficiency = (dir * sz) / incFlux;
    // Ez = (ky·Hx − kx·Hy)/ε
    const ur = ky * Hx[0] - kx[i]! * Hy[0];
    const ui = ky * Hx[1] - kx[i]! * Hy[1];
    const d = eps[0] * eps[0] + eps[1] * eps[1];
    const Ez = [(ur * eps[0] + ui * eps[1]) / d, (ui * eps[0] - ur * eps[1]) / d] as const;
    const kt = Math.hypot(kx[i]!, ky);
    const propagating = kt < nr && ni === 0 ? true : ni > 0 ? kt < nr : false;
    // the order's own s and p: s = (−uy, ux, 0); p = (ux·kz, uy·kz, −kt)/n
    const ux = kt > 1e-12 ? kx[i]! / kt : g.az[0];
    const uy = kt > 1e-12 ? ky / kt : g.az[1];
    // q = √(ε − kt²) on the decaying/outgoing branch
    zsqrtUpper(eps[0] - kt * kt, eps[1], q, 0);
    const kzr = dir * q[0]!;
    const kzi = dir * q[1]!;
    // amplitudeS = E·s
    const As: Complex = { re: -uy * Ex[0] + ux * Ey[0], im: -uy * Ex[1] + ux * Ey[1] };
    // amplitudeP = E·p = (ux·kz·Ex + uy·kz·Ey − kt·Ez)/n
    const t1r = ux * Ex[0] + uy * Ey[0];
    const t1i = ux * Ex[1] + uy * Ey[1];
    const numr = kzr * t1r - kzi * t1i - kt * Ez[0];
    const numi = kzr * t1i + kzi * t1r - kt * Ez[1];
    const nn = nr * nr + ni * ni;
    const Ap: Complex = { re: (numr * nr + numi * ni) / nn, im: (numi * nr - numr * ni) / nn };
    // angles as in grating-equation.ts: θm signed like kx, φm = atan(ky/kx) in (−90°, 90°]
    let thetaDeg = 90;
    let phiDeg = 0;
    if (propagating) {
      const a = directionAngles(kx[i]! / nr, ky / nr); // kt < n here
      thetaDeg = a.thetaRad / DEG;
      phiDeg = a.phiRad / DEG;
    } else if (kx[i]! < 0) {
      thetaDeg = -90;
    }
    all.push({
      m: g.orders[i]!,
      propagating,
      efficiency,
      thetaDeg,
      phiDeg,
      amplitudeS: As,
      amplitudeP: Ap,
      field: { x: { re: Ex[0], im: Ex[1] }, y: { re: Ey[0], im: Ey[1] }, z: { re: Ez[0], im: Ez[1] } },
    });
  }
  return all;
}

/** @internal The unit-power Jones vector of a polarization. */
export function jonesOf(p: 'TE' | 'TM' | Jones): Jones {
  if (p === 'TE') return { s: { re: 1, im: 0 }, p: { re: 0, im: 0 } };
  if (p === 'TM') return { s: { re: 0, im: 0 }, p: { re: 1, im: 0 } };
  const norm = Math.sqrt(p.s.re ** 2 + p.s.im ** 2 + p.p.re ** 2 + p.p.im ** 2);
  return { s: { re: p.s.re / norm, im: p.s.im / norm }, p: { re: p.p.re / norm, im: p.p.im / norm } };
}

function numerical(e: unknown, layer: number, inc: Incidence, family: Family): Error {
  if (e instanceof LinalgError) {
    const where = layer >= 0 ? `layer ${layer + 1}` : 'the layer stack';
    return new SolverError(
      'numerical',
      `numerical failure in ${where} (${family}) at λ = ${inc.wavelengthUm} µm, θ = ${inc.thetaDeg}°: ${e.message}`,
      { layer: layer + 1, wavelengthUm: inc.wavelengthUm, thetaDeg: inc.thetaDeg, family },
    );
  }
  return e as Error;
}
