/**
 * Near fields: E and H over x–z across one or more periods, through the layers and a little into
 * the cover and the substrate, rebuilt from the solved mode amplitudes of every region.
 *
 * In each region the tangential fields in the Fourier basis are (Ex, Ey) = W·(a(z) + b(z)) and
 * (Hx, Hy) = V·(a(z) − b(z)) with forward amplitudes a(z) = exp(i·q·k0·(z − z_top))·a_top and
 * backward amplitudes b(z) = exp(i·q·k0·(z_bottom − z))·b_bottom (both factors have modulus ≤ 1,
 * so nothing overflows in thick or opaque layers). The normal components follow from Maxwell's
 * equations: Hz = Kx·Ey − ky·Ex (Fourier, exact) and Dz = ky·Hx − Kx·Hy, with Ez(x) = Dz(x)/ε(x)
 * taken point by point in real space (Dz is continuous across the vertical walls; Ez is not).
 * Fields are normalized to the incident wave: |E_inc| = 1 (H' = Z0·H, so |H'_inc| = n_cover).
 * Time dependence exp(−iωt); the y-dependence exp(i·ky·y) is taken at y = 0.
 */
import { cmatrix, type CMatrix, zgemmBase } from '../linalg/index.ts';
import { ModeCache } from './cache.ts';
import { SolverError } from './errors.ts';
import { indexFromPermittivity, permittivityOf } from './fourier.ts';
import type { Modes } from './modes.ts';
import { familyMedia, jonesOf, setupProblem } from './solve.ts';
import { MediumFailure, phase, solveStack } from './stack.ts';
import type { Complex, Incidence, Jones, Profile, SolveOptions, Structure } from './types.ts';

export interface FieldGrid {
  /** periods across x (default 2) */
  readonly periods?: number;
  /** samples across x (default 64 per period) */
  readonly nx?: number;
  /** samples per µm in z (default: 100 per wavelength in vacuum, at least 4 per layer) */
  readonly samplesPerUm?: number;
  /** how far into the cover (µm, default one wavelength) */
  readonly coverUm?: number;
  /** how far into the substrate (µm, default one wavelength) */
  readonly substrateUm?: number;
}

/** Peak |E|² found inside one material (one complex index). */
export interface FieldPeak {
  readonly index: Complex;
  /** max |E|² over the samples in that material, relative to the incident |E|² = 1 */
  readonly peak: number;
  readonly xUm: number;
  readonly zUm: number;
  /** region of the peak: −1 cover, 0…L−1 the layers, L the substrate */
  readonly region: number;
}

export interface NearField {
  /** x samples (µm), nx of them over the requested periods */
  readonly xUm: Float64Array;
  /**
   * z samples (µm, 0 at the top of the stack, growing into the substrate). Every interface
   * appears twice, once as the bottom of the region above and once as the top of the region
   * below, so continuity can be read off the grid.
   */
  readonly zUm: Float64Array;
  /** region of each z sample: −1 cover, 0…L−1 layers, L substrate */
  readonly region: Int32Array;
  /** complex field components, interleaved (re, im), row-major nz × nx */
  readonly E: { readonly x: Float64Array; readonly y: Float64Array; readonly z: Float64Array };
  readonly H: { readonly x: Float64Array; readonly y: Float64Array; readonly z: Float64Array };
  /** |E|² (nz × nx), relative to the incident wave */
  readonly intensity: Float64Array;
  /** peak |E|² per material (distinct complex index), highest first */
  readonly peaks: ReadonlyArray<FieldPeak>;
}

/**
 * Fields of a grating under one incident polarization.
 * @param polarization 'TE', 'TM' or a Jones vector (normalized internally).
 * @throws {SolverError} as solve(); 'invalid-input' for a bad grid.
 * @example
 * // a bare interface: standing wave in the cover, |E|² between (1 − |r|)² and (1 + |r|)²
 * nearField({ periodUm: 1, cover: {re: 1, im: 0}, substrate: {re: 1.5, im: 0}, layers: [] },
 *           { wavelengthUm: 0.6, thetaDeg: 0 }, { orders: 2 }, 'TE').peaks[0].peak; // → 1.44
 */
export function nearField(
  structure: Structure,
  incidence: Incidence,
  options: SolveOptions,
  polarization: 'TE' | 'TM' | Jones,
  grid: FieldGrid = {},
  cache?: ModeCache,
): NearField {
  const setup = setupProblem(structure, incidence, options);
  const lambda = incidence.wavelengthUm;
  const periods = grid.periods ?? 2;
  const nx = grid.nx ?? 64 * periods;
  const perUm = grid.samplesPerUm ?? 100 / lambda;
  const coverUm = grid.coverUm ?? lambda;
  const subUm = grid.substrateUm ?? lambda;
  for (const [name, v, ok] of [
    ['periods', periods, Number.isInteger(periods) && periods >= 1 && periods <= 100],
    ['nx', nx, Number.isInteger(nx) && nx >= 2 && nx <= 100000],
    ['samplesPerUm', perUm, perUm > 0 && Number.isFinite(perUm)],
    ['coverUm', coverUm, coverUm >= 0 && Number.isFinite(coverUm)],
    ['substrateUm', subUm, subUm >= 0 && Number.isFinite(subUm)],
  ] as const) {
    if (!ok) throw new SolverError('invalid-input', `grid.${name}: expected a sensible positive value, found ${v}`, { field: `grid.${name}` });
  }
  const { kx, ky, k0, N } = setup;
  const L = structure.layers.length;
  const store = cache ?? new ModeCache(L + 2);
  const jones = jonesOf(polarization);

  // z samples per region
  const tops: number[] = [0];
  for (const l of structure.layers) tops.push(tops[tops.length - 1]! + l.thicknessUm);
  const zList: number[] = [];
  const rList: number[] = [];
  const addRange = (z0: number, z1: number, region: number): void => {
    const n = Math.max(4, Math.ceil((z1 - z0) * perUm));
    for (let i = 0; i <= n; i++) {
      zList.push(z0 + ((z1 - z0) * i) / n);
      rList.push(region);
    }
  };
  if (coverUm > 0) addRange(-coverUm, 0, -1);
  for (let j = 0; j < L; j++) addRange(tops[j]!, tops[j + 1]!, j);
  if (subUm > 0) addRange(tops[L]!, tops[L]! + subUm, L);
  const nz = zList.length;
  const xUm = new Float64Array(nx);
  const span = periods * structure.periodUm;
  for (let i = 0; i < nx; i++) xUm[i] = (span * i) / (nx - 1);

  const Ex = new Float64Array(2 * nz * nx);
  const Ey = new Float64Array(2 * nz * nx);
  const Ez = new Float64Array(2 * nz * nx);
  const Hx = new Float64Array(2 * nz * nx);
  const Hy = new Float64Array(2 * nz * nx);
  const Hz = new Float64Array(2 * nz * nx);

  // exp(i·kx_m·k0·x) for every order and x
  const basis = new Float64Array(2 * N * nx);
  for (let m = 0; m < N; m++) {
    for (let i = 0; i < nx; i++) {
      const a = kx[m]! * k0 * xUm[i]!;
      basis[2 * (m * nx + i)] = Math.cos(a);
      basis[2 * (m * nx + i) + 1] = Math.sin(a);
    }
  }

  // ε(x) along the x samples, once per region
  const epsRows = new Map<number, Float64Array>();
  const epsRow = (region: number): Float64Array => {
    let r = epsRows.get(region);
    if (!r) {
      r = new Float64Array(2 * nx);
      for (let i = 0; i < nx; i++) {
        const [er, ei] = epsAt(structure, region, xUm[i]!);
        r[2 * i] = er;
        r[2 * i + 1] = ei;
      }
      epsRows.set(region, r);
    }
    return r;
  };
  for (const family of setup.families) {
    const { media, thickness, inc } = familyMedia(setup, structure, incidence, family, store);
    let res;
    try {
      res = solveStack(media, thickness, inc, true);
    } catch (e) {
      throw e instanceof MediumFailure ? e.cause : e;
    }
    const n = media[0]!.n;
    // combine the incident columns with the Jones weights (classical: one family per column)
    const weights: Array<[number, number]> =
      family === 'TE' ? [[jones.s.re, jones.s.im]] : family === 'TM' ? [[jones.p.re, jones.p.im]] : [[jones.s.re, jones.s.im], [jones.p.re, jones.p.im]];
    if (weights.every(([a, b]) => a === 0 && b === 0)) continue;
    const combine = (m: Readonly<CMatrix>): Float64Array => {
      const v = new Float64Array(2 * n);
      for (let r = 0; r < n; r++) {
        for (let c = 0; c < weights.length; c++) {
          const [wr, wi] = weights[c]!;
          const p = 2 * (r * m.cols + c);
          v[2 * r] += wr * m.data[p]! - wi * m.data[p + 1]!;
          v[2 * r + 1] += wr * m.data[p + 1]! + wi * m.data[p]!;
        }
      }
      return v;
    };
    const incV = combine(inc);
    const reflV = combine(res.reflected);
    const transV = combine(res.transmitted);
    const interior = res.interior!.map((x) => ({ top: combine(x.forwardTop), bottom: combine(x.backwardBottom) }));
    const dense = new Map<Modes, { W: CMatrix; V: CMatrix }>();
    const wv = (m: Modes): { W: CMatrix; V: CMatrix } => {
      let d = dense.get(m);
      if (!d) {
        d = { W: m.denseW(cmatrix(n, n)), V: m.denseV(cmatrix(n, n)) };
        dense.set(m, d);
      }
      return d;
    };
    const a = new Float64Array(2 * n);
    const b = new Float64Array(2 * n);
    const sum = new Float64Array(2 * n);
    const dif = new Float64Array(2 * n);
    const e = new Float64Array(2 * n);
    const h = new Float64Array(2 * n);
    // Fourier coefficients of the components at one z, reused for every z
    const fx = new Float64Array(2 * N);
    const fy = new Float64Array(2 * N);
    const gx = new Float64Array(2 * N);
    const gy = new Float64Array(2 * N);
    const gz = new Float64Array(2 * N);
    const dz = new Float64Array(2 * N);
    const dzx = new Float64Array(2 * nx);
    for (let iz = 0; iz < nz; iz++) {
      const z = zList[iz]!;
      const region = rList[iz]!;
      const mi = region + 1; // media index
      const modes = media[mi]!;
      const q = modes.q;
      // forward and backward amplitudes at z
      if (region === -1) {
        // z ≤ 0: a = inc·exp(i q k0 z) (|·| = 1 for the propagating incident order), b = refl·exp(−i q k0 z)
        setPhased(a, incV, q, k0 * z);
        setPhased(b, reflV, q, -k0 * z);
      } else if (region === L) {
        setPhased(a, transV, q, k0 * (z - tops[L]!));
        b.fill(0);
      } else {
        setPhased(a, interior[region]!.top, q, k0 * (z - tops[region]!));
        setPhased(b, interior[region]!.bottom, q, k0 * (tops[region + 1]! - z));
      }
      for (let k = 0; k < 2 * n; k++) {
        sum[k] = a[k]! + b[k]!;
        dif[k] = a[k]! - b[k]!;
      }
      const { W, V } = wv(modes);
      zgemmBase(n, 1, n, 1, 0, W.data, sum, 0, 0, e);
      zgemmBase(n, 1, n, 1, 0, V.data, dif, 0, 0, h);
      if (family === 'TE') {
        fx.fill(0);
        gy.fill(0);
        fy.set(e);
        gx.set(h);
      } else if (family === 'TM') {
        fy.fill(0);
        gx.fill(0);
        fx.set(e);
        gy.set(h);
      } else {
        fx.set(e.subarray(0, 2 * N));
        fy.set(e.subarray(2 * N));
        gx.set(h.subarray(0, 2 * N));
        gy.set(h.subarray(2 * N));
      }
      // Hz = Kx·Ey − ky·Ex; Dz = ky·Hx − Kx·Hy
      for (let m = 0; m < N; m++) {
        for (let t = 0; t < 2; t++) {
          gz[2 * m + t] = kx[m]! * fy[2 * m + t]! - ky * fx[2 * m + t]!;
          dz[2 * m + t] = ky * gx[2 * m + t]! - kx[m]! * gy[2 * m + t]!;
        }
      }
      const row = iz * nx;
      synthesizeAdd(Ex, row, fx, basis, N, nx);
      synthesizeAdd(Ey, row, fy, basis, N, nx);
      synthesizeAdd(Hx, row, gx, basis, N, nx);
      synthesizeAdd(Hy, row, gy, basis, N, nx);
      synthesizeAdd(Hz, row, gz, basis, N, nx);
      // Ez = Dz/ε(x) point by point
      dzx.fill(0);
      synthesizeAdd(dzx, 0, dz, basis, N, nx);
      const epsX = epsRow(region);
      for (let i = 0; i < nx; i++) {
        const er = epsX[2 * i]!;
        const ei = epsX[2 * i + 1]!;
        const d = er * er + ei * ei;
        const vr = dzx[2 * i]!;
        const vi = dzx[2 * i + 1]!;
        Ez[2 * (row + i)] += (vr * er + vi * ei) / d;
        Ez[2 * (row + i) + 1] += (vi * er - vr * ei) / d;
      }
    }
  }

  const intensity = new Float64Array(nz * nx);
  for (let p = 0; p < nz * nx; p++) {
    intensity[p] = Ex[2 * p]! ** 2 + Ex[2 * p + 1]! ** 2 + Ey[2 * p]! ** 2 + Ey[2 * p + 1]! ** 2 + Ez[2 * p]! ** 2 + Ez[2 * p + 1]! ** 2;
  }
  // peaks per material
  const peaks = new Map<string, FieldPeak>();
  for (let iz = 0; iz < nz; iz++) {
    const region = rList[iz]!;
    for (let i = 0; i < nx; i++) {
      const idx = indexAt(structure, region, xUm[i]!);
      const key = `${idx.re},${idx.im}`;
      const v = intensity[iz * nx + i]!;
      const cur = peaks.get(key);
      if (!cur || v > cur.peak) peaks.set(key, { index: idx, peak: v, xUm: xUm[i]!, zUm: zList[iz]!, region });
    }
  }
  return {
    xUm,
    zUm: Float64Array.from(zList),
    region: Int32Array.from(rList),
    E: { x: Ex, y: Ey, z: Ez },
    H: { x: Hx, y: Hy, z: Hz },
    intensity,
    peaks: [...peaks.values()].sort((p, q) => q.peak - p.peak),
  };
}

/** out = src·exp(i·q·d) per mode. */
function setPhased(out: Float64Array, src: Float64Array, q: Float64Array, d: number): void {
  const x = phase(q, d);
  for (let k = 0; k < out.length; k += 2) {
    const sr = src[k]!;
    const si = src[k + 1]!;
    out[k] = sr * x[k]! - si * x[k + 1]!;
    out[k + 1] = sr * x[k + 1]! + si * x[k]!;
  }
}

/** out[row + i] += Σ_m f_m·basis(m, i) */
function synthesizeAdd(out: Float64Array, row: number, f: Float64Array, basis: Float64Array, N: number, nx: number): void {
  for (let m = 0; m < N; m++) {
    const fr = f[2 * m]!;
    const fi = f[2 * m + 1]!;
    if (fr === 0 && fi === 0) continue;
    const b0 = 2 * m * nx;
    for (let i = 0; i < nx; i++) {
      const br = basis[b0 + 2 * i]!;
      const bi = basis[b0 + 2 * i + 1]!;
      out[2 * (row + i)] += fr * br - fi * bi;
      out[2 * (row + i) + 1] += fr * bi + fi * br;
    }
  }
}

/** The complex index at x in a region (−1 cover, L substrate). */
function indexAt(s: Structure, region: number, xUm: number): Complex {
  if (region < 0) return s.cover;
  if (region >= s.layers.length) return s.substrate;
  const p: Profile = s.layers[region]!.profile;
  if (p.kind === 'uniform') return p.index;
  if (p.kind === 'segments') {
    const f = xUm / s.periodUm - Math.floor(xUm / s.periodUm);
    for (const seg of p.segments) if (f >= seg.from && f < seg.to) return seg.index;
    return p.segments[p.segments.length - 1]!.index;
  }
  // continuous profile: report its mean permittivity's index
  const K = (p.permittivity.length - 1) / 2;
  const c = p.permittivity[K]!;
  return indexFromPermittivity(c.re, c.im);
}

/** ε at x in a region. */
function epsAt(s: Structure, region: number, xUm: number): [number, number] {
  if (region >= 0 && region < s.layers.length) {
    const p = s.layers[region]!.profile;
    if (p.kind === 'fourier') {
      const K = (p.permittivity.length - 1) / 2;
      let re = 0;
      let im = 0;
      for (let k = -K; k <= K; k++) {
        const c = p.permittivity[k + K]!;
        const a = (2 * Math.PI * k * xUm) / s.periodUm;
        re += c.re * Math.cos(a) - c.im * Math.sin(a);
        im += c.re * Math.sin(a) + c.im * Math.cos(a);
      }
      return [re, im];
    }
  }
  return permittivityOf(indexAt(s, region, xUm));
}

