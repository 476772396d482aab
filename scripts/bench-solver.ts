/**
 * Solver speed benchmark: median time of a whole `solve()` on two reference gratings, where that
 * time goes, and — side by side in the same run — a plain numpy implementation of the same method
 * (scripts/numpy_rcwa.py, single-threaded), whose efficiencies are also compared order by order.
 *
 *   npx tsx scripts/bench-solver.ts                    # tables + one JSON object per case
 *   npx tsx scripts/bench-solver.ts --repeats 5 --cases metal --no-numpy
 *
 * Cases (lengths µm, angles deg):
 *   metal-lamellar   one binary layer, period = λ = 1, depth 1, fill 0.5, ridge and substrate
 *                    0.22 + 6.71i, air cover, θ = 30°, TM, M = 50 (101 orders);
 *   sawtooth-20      a blazed profile approximated by 20 lamellar slices: period 1, blaze angle
 *                    17.5° (order −1 in Littrow at 0.6 µm: 17.46°), depth = tan(17.5°) = 0.3153,
 *                    slices of depth/20; the ridge of slice k (k = 0 at the top) fills the fraction
 *                    (k + ½)/20 of the period, ending on the vertical wall at x = Λ; index 1.5
 *                    ridges in air on a 1.5 substrate; λ = 0.6, θ = 10°, TE, M = 25 and 50.
 *
 * What is timed:
 *   solve ms     the public `solve()`, which always solves TE and TM (both families);
 *   pol ms       the requested polarization alone: Fourier coefficients, the layers' modes and the
 *                stack recursion, built from the same exported solver modules (modes.ts, stack.ts)
 *                as `solve()` does, without its field/efficiency post-processing;
 *   numpy ms     the numpy solver doing TE and TM; numpy pol ms: the requested polarization;
 *                both with numpy.linalg.eig on every layer (the straightforward implementation);
 *   numpy eigh   the same numpy solver with numpy.linalg.eigh on layers of real ε — the
 *                like-for-like comparison where Furrow takes its Hermitian path (zheev).
 * Efficiencies: solve()'s s and p responses against numpy's TE and TM at the same M, max |Δη| over
 * the propagating orders of both sides and R, T (the two should agree to ~1e-9 or better).
 * Breakdown (requested polarization, per solve, summed over the layers): Fourier coefficients;
 * Toeplitz matrices and the inverses/products that form the eigenproblem; the eigensolver
 * itself (zheev or zgeev, timed on the very matrices the layers produce); the rest of the modes
 * (eigenvector post-products, LU of W and V) by difference; the stack recursion (timed on the
 * prebuilt modes) and the share of it spent in its dense kernels (zgemm, zgetrs, zgetrf,
 * each timed alone at the same N and multiplied by its call count); the other
 * polarization's path; and the post-processing of `solve()` by difference. numpy reports the
 * share of its solve spent in eig (or eigh).
 *
 * Speed lives here, not in the unit tests: timings depend on the machine and its load.
 */
import { spawnSync } from 'node:child_process';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { cmatrix, type CMatrix } from '../src/linalg/cmatrix.ts';
import { seededMatrix } from './bench-matrices.ts';
import { toeplitz } from '../src/linalg/toeplitz.ts';
import { zgemm } from '../src/linalg/zgemm.ts';
import { zgetrf, zgetri, zgetrs } from '../src/linalg/zgetrf.ts';
import { zpotrf } from '../src/linalg/zpotrf.ts';
import { LinalgError } from '../src/linalg/errors.ts';
import { linalgBackend } from '../src/linalg/wasm/runtime.ts';
import { zgeev } from '../src/linalg/zgeev.ts';
import { zheev } from '../src/linalg/zheev.ts';
import { solve } from '../src/solver/index.ts';
import type { Complex, Incidence, Layer, Profile, Response, Structure } from '../src/solver/index.ts';
import { isLossless, permittivityOf, profileCoefficients } from '../src/solver/fourier.ts';
import { homogeneousModes, modulatedModes, type Family, type Modes } from '../src/solver/modes.ts';
import { solveStack } from '../src/solver/stack.ts';

// ---------------------------------------------------------------------------------------------
// Cases
// ---------------------------------------------------------------------------------------------

export interface SolverBenchCase {
  /** short name used on the command line and in the JSON lines */
  readonly name: string;
  readonly description: string;
  readonly structure: Structure;
  readonly incidence: Incidence;
  /** orders −M…M */
  readonly M: number;
  /** the polarization the case is about (solve() computes both regardless) */
  readonly polarization: 'TE' | 'TM';
}

const AIR: Complex = { re: 1, im: 0 };
const METAL: Complex = { re: 0.22, im: 6.71 };
const GLASS: Complex = { re: 1.5, im: 0 };

/** Ridge of `ridge` over [1 − fill, 1), `groove` over [0, 1 − fill). */
function lamellar(thicknessUm: number, fill: number, ridge: Complex, groove: Complex): Layer {
  return {
    thicknessUm,
    profile: {
      kind: 'segments',
      segments: [
        { from: 0, to: 1 - fill, index: groove },
        { from: 1 - fill, to: 1, index: ridge },
      ],
    },
  };
}

/** Sawtooth of the given blaze angle as `slices` lamellar layers (see the file header). */
export function sawtoothStructure(periodUm: number, blazeDeg: number, slices: number, ridge: Complex, cover: Complex, substrate: Complex): Structure {
  const depth = periodUm * Math.tan((blazeDeg * Math.PI) / 180);
  const layers: Layer[] = [];
  for (let k = 0; k < slices; k++) layers.push(lamellar(depth / slices, (k + 0.5) / slices, ridge, cover));
  return { periodUm, cover, substrate, layers };
}

/** The benchmark's cases, in table order. */
export function solverBenchCases(): SolverBenchCase[] {
  const metal: Structure = { periodUm: 1, cover: AIR, substrate: METAL, layers: [lamellar(1, 0.5, METAL, AIR)] };
  const saw = sawtoothStructure(1, 17.5, 20, GLASS, AIR, GLASS);
  const sawInc: Incidence = { wavelengthUm: 0.6, thetaDeg: 10 };
  return [
    {
      name: 'metal-lamellar',
      description: 'binary metal layer, Λ = λ = 1 µm, d = 1 µm, f = 0.5, ñ = 0.22 + 6.71i, θ = 30°',
      structure: metal,
      incidence: { wavelengthUm: 1, thetaDeg: 30 },
      M: 50,
      polarization: 'TM',
    },
    {
      name: 'sawtooth-20',
      description: '20-slice dielectric sawtooth, Λ = 1 µm, blaze 17.5°, n = 1.5 on 1.5, λ = 0.6 µm, θ = 10°',
      structure: saw,
      incidence: sawInc,
      M: 25,
      polarization: 'TE',
    },
    {
      name: 'sawtooth-20',
      description: '20-slice dielectric sawtooth, Λ = 1 µm, blaze 17.5°, n = 1.5 on 1.5, λ = 0.6 µm, θ = 10°',
      structure: saw,
      incidence: sawInc,
      M: 50,
      polarization: 'TE',
    },
  ];
}

// ---------------------------------------------------------------------------------------------
// Timing
// ---------------------------------------------------------------------------------------------

/**
 * Median ms per call of each function, measured round-robin so that a change of machine load
 * during the run weighs on every function alike. Warm-up first (each function at least 3 calls
 * and `warmMs`, so the JIT has optimized the code); then `repeats` rounds, one sample of each
 * function per round; a sample runs enough calls to last about 1 ms.
 */
function interleavedMedians(fns: ReadonlyArray<() => void>, repeats: number, warmMs = 100): number[] {
  const inner = fns.map((fn) => {
    const warm = performance.now();
    for (let c = 0; c < 3 || performance.now() - warm < warmMs; c++) fn();
    const t0 = performance.now();
    fn();
    const once = Math.max(performance.now() - t0, 1e-4);
    return Math.max(1, Math.floor(1 / once));
  });
  const samples: number[][] = fns.map(() => []);
  for (let r = 0; r < repeats; r++) {
    fns.forEach((fn, k) => {
      const s = performance.now();
      for (let i = 0; i < inner[k]!; i++) fn();
      samples[k]!.push((performance.now() - s) / inner[k]!);
    });
  }
  return samples.map((x) => {
    x.sort((a, b) => a - b);
    return x[x.length >> 1]!;
  });
}

// ---------------------------------------------------------------------------------------------
// The per-family path, from the solver's own modules (as solve() runs it for one family)
// ---------------------------------------------------------------------------------------------

interface Geometry {
  readonly kx: Float64Array;
  readonly i0: number;
  readonly k0: number;
}

function geometry(structure: Structure, incidence: Incidence, M: number): Geometry {
  const N = 2 * M + 1;
  const kx0 = structure.cover.re * Math.sin((incidence.thetaDeg * Math.PI) / 180);
  const K = incidence.wavelengthUm / structure.periodUm;
  const kx = new Float64Array(N);
  for (let i = 0; i < N; i++) kx[i] = kx0 + (i - M) * K;
  return { kx, i0: M, k0: (2 * Math.PI) / incidence.wavelengthUm };
}

/** The single index of a profile that is homogeneous in fact, else null. */
function uniformIndex(p: Profile): Complex | null {
  if (p.kind === 'uniform') return p.index;
  if (p.kind === 'segments') {
    const a = p.segments[0]!.index;
    return p.segments.every((s) => s.index.re === a.re && s.index.im === a.im) ? a : null;
  }
  return null;
}

const AZ: readonly [number, number] = [1, 0];

function layerModes(layer: Layer, g: Geometry, family: Family): Modes {
  const u = uniformIndex(layer.profile);
  if (u) return homogeneousModes(permittivityOf(u), g.kx, 0, family, AZ);
  const N = g.kx.length;
  return modulatedModes({
    epsCoeffs: profileCoefficients(layer.profile, N - 1, false),
    invEpsCoeffs: profileCoefficients(layer.profile, N - 1, true),
    kx: g.kx,
    ky: 0,
    family,
    lossless: isLossless(layer.profile),
    factorization: 'inverse',
    hermitian: true,
  });
}

interface Prepared {
  readonly media: Modes[];
  readonly thickness: number[];
  readonly incident: CMatrix;
}

function prepare(structure: Structure, g: Geometry, family: Family): Prepared {
  const media: Modes[] = [homogeneousModes(permittivityOf(structure.cover), g.kx, 0, family, AZ)];
  const thickness = [0];
  for (const layer of structure.layers) {
    media.push(layerModes(layer, g, family));
    thickness.push(g.k0 * layer.thicknessUm);
  }
  media.push(homogeneousModes(permittivityOf(structure.substrate), g.kx, 0, family, AZ));
  thickness.push(0);
  const incident = cmatrix(g.kx.length, 1);
  incident.data[2 * g.i0] = family === 'TE' ? 1 : structure.cover.re;
  return { media, thickness, incident };
}

function familyPath(structure: Structure, g: Geometry, family: Family): void {
  const p = prepare(structure, g, family);
  solveStack(p.media, p.thickness, p.incident);
}

// ---------------------------------------------------------------------------------------------
// The pieces of one layer's modes, formed as modes.ts forms them, to time each kernel alone
// ---------------------------------------------------------------------------------------------

/** Everything up to the eigensolver; returns the matrix handed to it and which solver. */
function eigenproblem(epsC: Float64Array, invC: Float64Array, kx: Float64Array, family: Family, lossless: boolean): { kind: 'zheev' | 'zgeev'; a: CMatrix } {
  const N = kx.length;
  const E = toeplitz(epsC, N) as CMatrix;
  if (family === 'TE') {
    for (let i = 0; i < N; i++) E.data[2 * (i * N + i)] -= kx[i]! * kx[i]!;
    return { kind: lossless ? 'zheev' : 'zgeev', a: E };
  }
  const D = zgetri(E) as CMatrix;
  const Ep = zgetri(toeplitz(invC, N)) as CMatrix;
  const B = cmatrix(N, N);
  for (let i = 0; i < N; i++) {
    for (let j = 0; j < N; j++) {
      const p = 2 * (i * N + j);
      const s = kx[i]! * kx[j]!;
      B.data[p] = (i === j ? 1 : 0) - s * D.data[p]!;
      B.data[p + 1] = -s * D.data[p + 1]!;
    }
  }
  if (lossless) {
    let L: CMatrix | null = null;
    try {
      L = zpotrf(Ep);
    } catch (e) {
      if (!(e instanceof LinalgError)) throw e;
    }
    if (L) {
      const BL = zgemm(cmatrix(N, N), B, L);
      const LH = cmatrix(N, N);
      for (let i = 0; i < N; i++) {
        for (let j = 0; j < N; j++) {
          LH.data[2 * (j * N + i)] = L.data[2 * (i * N + j)]!;
          LH.data[2 * (j * N + i) + 1] = -L.data[2 * (i * N + j) + 1]!;
        }
      }
      return { kind: 'zheev', a: zgemm(cmatrix(N, N), LH, BL) };
    }
  }
  return { kind: 'zgeev', a: zgemm(cmatrix(N, N), Ep, B) };
}

function runEigen(p: { kind: 'zheev' | 'zgeev'; a: CMatrix }): void {
  if (p.kind === 'zheev') zheev(p.a, { vectors: true });
  else zgeev(p.a, { vectors: true });
}

/** Seeded entries in [−1, 1) plus n on the diagonal: a well-conditioned matrix. */
function wellConditioned(n: number, seed: number): CMatrix {
  const a = seededMatrix(n, seed);
  for (let i = 0; i < n; i++) a.data[2 * (i * n + i)] += n;
  return a;
}

/**
 * N×N dense kernel calls of one solveStack() over cover, layers (dense when modulated) and
 * substrate: at the interface below medium j, W·(I + R′) and V·(I − R′) are zgemm when the medium
 * below is dense; W⁻¹· and V⁻¹· are zgetrs (N right-hand sides) when the medium above is dense;
 * Sᵀ is factored (zgetrf) at every interface; R = Δ·S⁻¹ = (S⁻ᵀ·Δᵀ)ᵀ is one more zgetrs at every one but the top.
 */
function stackKernelCounts(dense: readonly boolean[]): { zgemm: number; zgetrs: number; zgetrf: number } {
  const media = [false, ...dense, false];
  const c = { zgemm: 0, zgetrs: 0, zgetrf: 0 };
  for (let j = media.length - 2; j >= 0; j--) {
    if (media[j + 1]) c.zgemm += 2;
    if (media[j]) c.zgetrs += 2;
    c.zgetrf += 1;
    if (j > 0) c.zgetrs += 1;
  }
  return c;
}

// ---------------------------------------------------------------------------------------------
// numpy
// ---------------------------------------------------------------------------------------------

interface NumpyPol {
  readonly orders: number[];
  readonly reflected: number[];
  readonly transmitted: number[];
  readonly propagating_reflected: boolean[];
  readonly propagating_transmitted: boolean[];
  readonly R: number;
  readonly T: number;
}

interface NumpyVariant {
  readonly TE: NumpyPol;
  readonly TM: NumpyPol;
  readonly pol_ms?: number;
  readonly both_ms?: number;
  readonly eig_ms?: number;
}

interface NumpyOut extends NumpyVariant {
  readonly info?: unknown;
  /** the variant with numpy.linalg.eigh on layers of real ε (present when such a layer exists) */
  readonly hermitian?: NumpyVariant;
}

type NumpyRun = { ok: true; out: NumpyOut } | { ok: false; note: string };

function runNumpy(c: SolverBenchCase, repeats: number): NumpyRun {
  const script = fileURLToPath(new URL('./numpy_rcwa.py', import.meta.url));
  const env: Record<string, string | undefined> = { ...process.env, OMP_NUM_THREADS: '1', OPENBLAS_NUM_THREADS: '1', MKL_NUM_THREADS: '1' };
  // these pin OpenBLAS to an older kernel on some processors; unset for this command only
  delete env['OPENBLAS_CORETYPE'];
  delete env['OPENBLAS_L2_SIZE'];
  const input = JSON.stringify({ structure: c.structure, incidence: c.incidence, M: c.M, polarization: c.polarization, repeats, time: true, hermitian: true });
  const r = spawnSync('python3', [script], { env, input, encoding: 'utf8', maxBuffer: 1 << 26 });
  if (r.error) return { ok: false, note: `numpy comparison skipped: python3 not runnable (${r.error.message})` };
  if (r.status === 3) return { ok: false, note: 'numpy comparison skipped: numpy is not installed' };
  if (r.status !== 0) return { ok: false, note: `numpy comparison skipped: numpy_rcwa.py exited ${r.status}: ${r.stderr.trim()}` };
  return { ok: true, out: JSON.parse(r.stdout) as NumpyOut };
}

/** Largest |Δ efficiency| over the propagating orders (and R, T), and whether the order sets match. */
function compare(ours: Response, theirs: NumpyPol): { maxDiff: number; sameOrders: boolean; worst: string } {
  let maxDiff = 0;
  let worst = '';
  const note = (d: number, what: string) => {
    if (d > maxDiff) {
      maxDiff = d;
      worst = what;
    }
  };
  const idx = new Map(theirs.orders.map((m, i) => [m, i]));
  let sameOrders = true;
  for (const [list, eff, prop, side] of [
    [ours.reflected, theirs.reflected, theirs.propagating_reflected, 'r'],
    [ours.transmitted, theirs.transmitted, theirs.propagating_transmitted, 't'],
  ] as const) {
    const mine = new Set(list.map((o) => o.m));
    theirs.orders.forEach((m, i) => {
      if (prop[i] !== mine.has(m)) sameOrders = false;
    });
    for (const o of list) {
      const i = idx.get(o.m);
      if (i === undefined) {
        sameOrders = false;
        continue;
      }
      note(Math.abs(o.efficiency - eff[i]!), `${side}${o.m}`);
    }
  }
  note(Math.abs(ours.R - theirs.R), 'R');
  note(Math.abs(ours.T - theirs.T), 'T');
  return { maxDiff, sameOrders, worst };
}

// ---------------------------------------------------------------------------------------------
// The benchmark
// ---------------------------------------------------------------------------------------------

/** Where one solve of the requested polarization spends its time (ms, per solve). */
export interface SolverBreakdown {
  /** Fourier coefficients of ε and 1/ε, every layer */
  readonly fourier_ms: number;
  /** Toeplitz matrices, their inverses and the products that form the eigenproblem */
  readonly setup_ms: number;
  /** zheev / zgeev on the layers' matrices */
  readonly eigen_ms: number;
  /** which eigensolver and at which order */
  readonly eigen: string;
  /** modes minus setup minus eigen: eigenvector products, LU of W and V (by difference) */
  readonly modes_rest_ms: number;
  /** the recursion over the layers and the incident amplitudes carried down */
  readonly stack_ms: number;
  /**
   * the dense kernels the recursion calls, timed alone at this N and multiplied by their counts
   * (zgemm for W·(I ± R), zgetrs for W⁻¹, V⁻¹ and R = (S⁻ᵀ·Δᵀ)ᵀ, zgetrf of Sᵀ)
   */
  readonly stack_kernels_ms: number;
  /** the counts and per-call ms behind stack_kernels_ms */
  readonly stack_kernels: string;
  /** the other polarization's path, in solve() */
  readonly other_pol_ms: number;
  /** solve() − both families: validation, fields, efficiencies, angles (by difference) */
  readonly post_ms: number;
}

/** One table row. */
export interface SolverBenchRow {
  readonly case: string;
  readonly M: number;
  readonly polarization: 'TE' | 'TM';
  readonly layers: number;
  /** median ms of solve() (TE and TM) */
  readonly median_ms: number;
  /** median ms of the requested polarization's path alone */
  readonly pol_ms: number;
  /** numpy, TE and TM; null when not measured */
  readonly numpy_ms: number | null;
  /** numpy, the requested polarization */
  readonly numpy_pol_ms: number | null;
  /** numpy.linalg.eig's share of numpy_pol_ms */
  readonly numpy_eig_ms: number | null;
  /** numpy with eigh on the layers of real ε: the requested polarization, and eigh's share */
  readonly numpy_eigh_pol_ms: number | null;
  readonly numpy_eigh_eig_ms: number | null;
  /** pol_ms / numpy_eigh_pol_ms */
  readonly eigh_pol_ratio: number | null;
  /** median_ms / numpy_ms */
  readonly ratio: number | null;
  /** pol_ms / numpy_pol_ms */
  readonly pol_ratio: number | null;
  /** max |Δ efficiency| against numpy over propagating orders, R and T: [requested, other] */
  readonly max_eff_diff: number | null;
  readonly max_eff_diff_other: number | null;
  /** max |Δ efficiency| against the numpy eigh variant, both polarizations */
  readonly max_eff_diff_eigh: number | null;
  /** where the largest difference of the requested polarization sits (e.g. 'r-1', 'T') */
  readonly worst: string | null;
  /** false when the two disagree on which orders propagate */
  readonly same_orders: boolean | null;
  readonly breakdown: SolverBreakdown;
}

export interface SolverBenchOptions {
  /** timed samples per measurement; the median is reported (default 11) */
  readonly repeats?: number;
  /** also run numpy (default true; skipped with a message when python3 or numpy is absent) */
  readonly numpy?: boolean;
  /** only the cases whose name contains one of these strings */
  readonly cases?: readonly string[];
  /** only these M */
  readonly orders?: readonly number[];
  /** skip the breakdown timings (faster; its fields are then NaN) */
  readonly breakdown?: boolean;
  /** progress and skip messages (default console.error, so stdout stays tables + JSON) */
  readonly log?: (message: string) => void;
}

export interface SolverBenchResult {
  readonly rows: SolverBenchRow[];
  /** backend of zgemm / LU during the run ('wasm' or 'ts') */
  readonly backend: string;
  /** numpy build and kernel, or why numpy was not measured */
  readonly numpyNote: string;
}

/**
 * Run the benchmark.
 * @returns one row per case with the medians, the numpy comparison and the breakdown.
 * @example
 * const { rows } = await runSolverBench({ repeats: 3, cases: ['metal'] });
 * console.log(rows[0]?.median_ms, rows[0]?.ratio);
 */
export async function runSolverBench(options: SolverBenchOptions = {}): Promise<SolverBenchResult> {
  const repeats = options.repeats ?? 11;
  const log = options.log ?? ((m: string) => console.error(m));
  const wantNumpy = options.numpy ?? true;
  const wantBreakdown = options.breakdown ?? true;
  let numpyNote = wantNumpy ? 'numpy' : 'numpy comparison not requested';
  const rows: SolverBenchRow[] = [];
  const cases = solverBenchCases().filter(
    (c) => (!options.cases || options.cases.some((s) => c.name.includes(s))) && (!options.orders || options.orders.includes(c.M)),
  );
  for (const c of cases) {
    const { structure, incidence, M, polarization } = c;
    const fam: Family = polarization;
    const other: Family = fam === 'TE' ? 'TM' : 'TE';
    const g = geometry(structure, incidence, M);
    const N = 2 * M + 1;
    let result = solve(structure, incidence, { orders: M });
    const fns: Array<() => void> = [
      () => {
        result = solve(structure, incidence, { orders: M });
      },
      () => familyPath(structure, g, fam),
    ];
    // the breakdown's pieces, prepared outside the timed calls
    const modulated = structure.layers.filter((l) => uniformIndex(l.profile) === null);
    const count = stackKernelCounts(structure.layers.map((l) => uniformIndex(l.profile) === null));
    let problems: Array<{ kind: 'zheev' | 'zgeev'; a: CMatrix }> = [];
    if (wantBreakdown) {
      const coeffs = modulated.map((l) => ({
        eps: profileCoefficients(l.profile, N - 1, false),
        inv: profileCoefficients(l.profile, N - 1, true),
        lossless: isLossless(l.profile),
        layer: l,
      }));
      problems = coeffs.map((k) => eigenproblem(k.eps, k.inv, g.kx, fam, k.lossless));
      const prepared = prepare(structure, g, fam);
      // kernels of the recursion at this N (how often one solve calls each: stackKernelCounts)
      const kA = wellConditioned(N, 11);
      const kB = wellConditioned(N, 12);
      const kOut = cmatrix(N, N);
      const kLU = zgetrf(kA);
      const eig = problems;
      fns.push(
        () => familyPath(structure, g, other),
        () => {
          for (const l of modulated) {
            profileCoefficients(l.profile, N - 1, false);
            profileCoefficients(l.profile, N - 1, true);
          }
        },
        () => {
          for (const k of coeffs) eigenproblem(k.eps, k.inv, g.kx, fam, k.lossless);
        },
        () => {
          for (const p of eig) runEigen(p);
        },
        () => {
          for (const k of coeffs) layerModes(k.layer, g, fam);
        },
        () => solveStack(prepared.media, prepared.thickness, prepared.incident),
        () => zgemm(kOut, kA, kB),
        () => zgetrf(kA, kLU),
        () => zgetrs(kLU, kB, kOut),
      );
    }
    log(`${c.name} M = ${M}: timing solve(), the ${polarization} path${wantBreakdown ? ' and the breakdown' : ''} …`);
    const t = interleavedMedians(fns, repeats);
    const median = t[0]!;
    const pol = t[1]!;
    let breakdown: SolverBreakdown = {
      fourier_ms: NaN,
      setup_ms: NaN,
      eigen_ms: NaN,
      eigen: 'not measured',
      modes_rest_ms: NaN,
      stack_ms: NaN,
      stack_kernels_ms: NaN,
      stack_kernels: 'not measured',
      other_pol_ms: NaN,
      post_ms: NaN,
    };
    if (wantBreakdown) {
      const at = (k: number): number => t[2 + k]!;
      const [otherPol, fourier, setup, eigen, modes, stack] = [at(0), at(1), at(2), at(3), at(4), at(5)];
      const [tGemm, tGetrf, tGetrs] = [at(6), at(7), at(8)];
      const kernels = count.zgemm * tGemm + count.zgetrf * tGetrf + count.zgetrs * tGetrs;
      const kinds = [...new Set(problems.map((p) => p.kind))].join('+');
      breakdown = {
        fourier_ms: fourier,
        setup_ms: setup,
        eigen_ms: eigen,
        eigen: `${problems.length} × ${kinds || 'none'} (N = ${N})`,
        // layerModes = Fourier coefficients + modulatedModes
        modes_rest_ms: modes - fourier - setup - eigen,
        stack_ms: stack,
        stack_kernels_ms: kernels,
        stack_kernels:
          `${count.zgemm} zgemm × ${tGemm.toFixed(3)} + ${count.zgetrs} zgetrs × ${tGetrs.toFixed(3)} + ` +
          `${count.zgetrf} zgetrf × ${tGetrf.toFixed(3)} ms`,
        other_pol_ms: otherPol,
        post_ms: median - pol - otherPol,
      };
    }

    let numpyMs: number | null = null;
    let numpyPol: number | null = null;
    let numpyEig: number | null = null;
    let eighPol: number | null = null;
    let eighEig: number | null = null;
    let diffEigh: number | null = null;
    let diff: number | null = null;
    let diffOther: number | null = null;
    let worst: string | null = null;
    let sameOrders: boolean | null = null;
    if (wantNumpy) {
      log(`${c.name} M = ${M}: numpy …`);
      const r = runNumpy(c, repeats);
      if (r.ok) {
        numpyMs = r.out.both_ms ?? null;
        numpyPol = r.out.pol_ms ?? null;
        numpyEig = r.out.eig_ms ?? null;
        if (r.out.info !== undefined) numpyNote = `numpy ${JSON.stringify(r.out.info)}`;
        const mine = polarization === 'TE' ? result.s : result.p;
        const mineOther = polarization === 'TE' ? result.p : result.s;
        const a = compare(mine, r.out[polarization]);
        const b = compare(mineOther, r.out[polarization === 'TE' ? 'TM' : 'TE']);
        diff = a.maxDiff;
        diffOther = b.maxDiff;
        worst = a.worst;
        sameOrders = a.sameOrders && b.sameOrders;
        const h = r.out.hermitian;
        if (h) {
          eighPol = h.pol_ms ?? null;
          eighEig = h.eig_ms ?? null;
          diffEigh = Math.max(compare(result.s, h.TE).maxDiff, compare(result.p, h.TM).maxDiff);
        }
      } else {
        numpyNote = r.note;
        log(r.note);
      }
    }
    rows.push({
      case: c.name,
      M,
      polarization,
      layers: structure.layers.length,
      median_ms: median,
      pol_ms: pol,
      numpy_ms: numpyMs,
      numpy_pol_ms: numpyPol,
      numpy_eig_ms: numpyEig,
      numpy_eigh_pol_ms: eighPol,
      numpy_eigh_eig_ms: eighEig,
      eigh_pol_ratio: eighPol ? pol / eighPol : null,
      ratio: numpyMs ? median / numpyMs : null,
      pol_ratio: numpyPol ? pol / numpyPol : null,
      max_eff_diff: diff,
      max_eff_diff_other: diffOther,
      max_eff_diff_eigh: diffEigh,
      worst,
      same_orders: sameOrders,
      breakdown,
    });
  }
  return { rows, backend: linalgBackend(), numpyNote };
}

// ---------------------------------------------------------------------------------------------
// Output
// ---------------------------------------------------------------------------------------------

function fmt(v: number | null, digits: number): string {
  return v === null || Number.isNaN(v) ? 'n/a' : v.toFixed(digits);
}

function table(head: string[], body: string[][], leftCols = 1): string {
  const widths = head.map((h, c) => Math.max(h.length, ...body.map((row) => row[c]!.length)));
  const line = (cells: string[]) => cells.map((s, c) => (c < leftCols ? s.padEnd(widths[c]!) : s.padStart(widths[c]!))).join('  ');
  return [line(head), widths.map((w) => '-'.repeat(w)).join('  '), ...body.map(line)].join('\n');
}

const ratio = (v: number | null): string => (v === null ? 'n/a' : `${v.toFixed(2)}×`);

/** The timing table: solve() and the requested polarization against numpy. */
export function formatSolverBenchTable(rows: readonly SolverBenchRow[]): string {
  return table(
    ['case', 'pol', 'M', 'solve ms', 'numpy ms', 'ratio', 'pol ms', 'numpy pol ms', 'pol ratio', 'numpy eigh pol ms', 'vs eigh'],
    rows.map((r) => [
      r.case,
      r.polarization,
      String(r.M),
      fmt(r.median_ms, 2),
      fmt(r.numpy_ms, 2),
      ratio(r.ratio),
      fmt(r.pol_ms, 2),
      fmt(r.numpy_pol_ms, 2),
      ratio(r.pol_ratio),
      fmt(r.numpy_eigh_pol_ms, 2),
      ratio(r.eigh_pol_ratio),
    ]),
    2,
  );
}

/** Efficiency agreement with numpy: max |Δη| over the propagating orders and R, T. */
export function formatAgreementTable(rows: readonly SolverBenchRow[]): string {
  const e = (v: number | null) => (v === null ? 'n/a' : v.toExponential(1));
  return table(
    ['case', 'pol', 'M', `max |Δη| (pol)`, 'at', 'other pol', 'vs numpy eigh (both)', 'same orders'],
    rows.map((r) => [
      r.case,
      r.polarization,
      String(r.M),
      e(r.max_eff_diff),
      r.worst ?? 'n/a',
      e(r.max_eff_diff_other),
      e(r.max_eff_diff_eigh),
      r.same_orders === null ? 'n/a' : r.same_orders ? 'yes' : 'NO',
    ]),
    2,
  );
}

/** The breakdown table (requested polarization, ms per solve; share of solve()). */
export function formatBreakdownTable(rows: readonly SolverBenchRow[]): string {
  const body: string[][] = [];
  for (const r of rows) {
    const b = r.breakdown;
    const pct = (v: number) => (Number.isNaN(v) ? 'n/a' : `${((100 * v) / r.median_ms).toFixed(0)}%`);
    const cell = (v: number) => `${fmt(v, 2)} (${pct(v)})`;
    body.push([
      `${r.case} ${r.polarization} M=${r.M}`,
      cell(b.fourier_ms),
      cell(b.setup_ms),
      cell(b.eigen_ms),
      cell(b.modes_rest_ms),
      cell(b.stack_ms),
      fmt(b.stack_kernels_ms, 2),
      cell(b.other_pol_ms),
      cell(b.post_ms),
      r.numpy_eig_ms === null || r.numpy_pol_ms === null ? 'n/a' : `${fmt(r.numpy_eig_ms, 2)} of ${fmt(r.numpy_pol_ms, 2)}`,
      r.numpy_eigh_eig_ms === null || r.numpy_eigh_pol_ms === null ? 'n/a' : `${fmt(r.numpy_eigh_eig_ms, 2)} of ${fmt(r.numpy_eigh_pol_ms, 2)}`,
      b.eigen,
    ]);
  }
  return table(['case', 'fourier', 'toeplitz/inv', 'eigen', 'modes rest', 'stack', 'of which kernels', 'other pol', 'post', 'numpy: eig of pol', 'numpy: eigh of pol', 'eigensolver'], body, 1);
}

/** One line per case, for a summary (e.g. the CLI demo). */
export function formatSolverBenchSummary(rows: readonly SolverBenchRow[]): string[] {
  return rows.map((r) => {
    const vs = r.numpy_ms === null ? '' : ` (numpy ${fmt(r.numpy_ms, 1)} ms, ${ratio(r.ratio)})`;
    const agree = r.max_eff_diff === null ? '' : `, max |Δη| vs numpy ${r.max_eff_diff.toExponential(0)}`;
    return `${r.case} ${r.polarization} M=${r.M}: solve() ${fmt(r.median_ms, 1)} ms${vs}; ${r.polarization} alone ${fmt(r.pol_ms, 1)} ms${agree}`;
  });
}

function parseArgs(argv: readonly string[]): SolverBenchOptions {
  const o: { repeats?: number; numpy?: boolean; cases?: string[]; orders?: number[]; breakdown?: boolean } = {};
  for (let i = 0; i < argv.length; i++) {
    const [key, inline] = argv[i]!.split('=', 2) as [string, string | undefined];
    const value = () => inline ?? argv[++i] ?? '';
    if (key === '--repeats') o.repeats = Number(value());
    else if (key === '--no-numpy') o.numpy = false;
    else if (key === '--no-breakdown') o.breakdown = false;
    else if (key === '--cases') o.cases = value().split(',').filter(Boolean);
    else if (key === '--orders') o.orders = value().split(',').filter(Boolean).map(Number);
    else throw new Error(`unknown option ${key} (use --repeats, --cases, --orders, --no-numpy, --no-breakdown)`);
  }
  if (o.repeats !== undefined && !(Number.isInteger(o.repeats) && o.repeats > 0)) throw new Error(`--repeats: expected a positive integer, got ${o.repeats}`);
  return o;
}

async function main(): Promise<void> {
  const result = await runSolverBench(parseArgs(process.argv.slice(2)));
  console.log(`backend: ${result.backend}; ${result.numpyNote}`);
  console.log("solve ms = solve() (TE and TM); numpy ms = numpy TE and TM (eig); pol = the case's polarization alone; ratio = ours/numpy");
  console.log('numpy eigh = numpy with eigh on layers of real ε, as Furrow does (zheev); 2-core shared machine: medians move with its load');
  console.log(formatSolverBenchTable(result.rows));
  console.log('');
  console.log('efficiency agreement with numpy (same M; propagating orders, R and T):');
  console.log(formatAgreementTable(result.rows));
  console.log('');
  console.log('where the time goes (ms per solve, % of solve ms; requested polarization unless named):');
  console.log(formatBreakdownTable(result.rows));
  for (const r of result.rows) console.log(`stack kernels, ${r.case} M=${r.M}: ${r.breakdown.stack_kernels}`);
  for (const r of result.rows) {
    console.log(
      JSON.stringify({
        case: r.case,
        M: r.M,
        median_ms: r.median_ms,
        numpy_ms: r.numpy_ms,
        ratio: r.ratio,
        polarization: r.polarization,
        pol_ms: r.pol_ms,
        numpy_pol_ms: r.numpy_pol_ms,
        pol_ratio: r.pol_ratio,
        max_eff_diff: r.max_eff_diff,
        max_eff_diff_other: r.max_eff_diff_other,
        numpy_eigh_pol_ms: r.numpy_eigh_pol_ms,
        eigh_pol_ratio: r.eigh_pol_ratio,
        max_eff_diff_eigh: r.max_eff_diff_eigh,
        backend: result.backend,
        breakdown: r.breakdown,
      }),
    );
  }
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) {
  main().catch((e: unknown) => {
    console.error(e);
    process.exit(1);
  });
}
