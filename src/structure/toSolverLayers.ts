/**
 * From geometry (materials by name) to the solver's layers (complex indices), at one wavelength.
 *
 * 'cosine' slices become exact Fourier coefficients. With θ = 2πx/Λ − φ, a = ε0, b = Δε:
 * - ε(x) = a + b·cos θ has c₀ = a, c_{±1} = (b/2)·e^{∓iφ} and nothing else;
 * - 1/ε(x) = (1/s)·[1 + 2·Σ_{k≥1} ρ^k·cos kθ] with s² = a² − b² and ρ = (s − a)/b = −b/(a + s)
 *   (the Poisson-kernel series; geometry of the generating function), so its k-th coefficient
 *   is ρ^|k|·e^{−ikφ}/s. a and b may be complex; of the two roots ±s exactly one gives |ρ| < 1
 *   (the two ρ multiply to 1), and that one is taken. |ρ| = 1 would mean ε vanishes somewhere.
 * Both are truncated at k = −K…K with K = `harmonics` (≥ 0). The solver builds Toeplitz matrices from
 * differences of order indices, so for orders −M…M it needs k = −2M…2M: pass harmonics = 2M.
 *
 * Adjacent slices that resolve to identical profiles are merged into one thicker layer.
 */
import type { Complex, Layer, Profile, Segment } from '../solver/index.ts';
import type { GeometryLayer } from './types.ts';
import { fail, finite, integerAtLeast, material as materialName, nonNegativeLength } from './validate.ts';

/**
 * Resolve material names and emit the solver's layers.
 * @param layers geometry, top (cover side) first
 * @param indexOf complex index n + iκ of a material at the wavelength of interest
 * @param harmonics K ≥ 0: 'cosine' slices get coefficients k = −K…K (use 2M for orders −M…M;
 *   K = 0 keeps only the mean, which is all a single retained order sees)
 * @returns solver layers, top first, with identical neighbours merged
 * @throws {StructureError} on a malformed layer (segments that do not tile [0, 1) in order, a
 *   negative thickness, an unknown kind), a non-finite index, harmonics < 0 or not an
 *   integer, or a cosine slice whose permittivity vanishes for some x
 * @example
 * toSolverLayers([{ kind: 'uniform', thicknessUm: 0.1, material: 'MgF2' }], () => ({ re: 1.38, im: 0 }), 20);
 * // → [{ thicknessUm: 0.1, profile: { kind: 'uniform', index: { re: 1.38, im: 0 } } }]
 */
export function toSolverLayers(layers: ReadonlyArray<GeometryLayer>, indexOf: (material: string) => Complex, harmonics: number): Layer[] {
  if (!Array.isArray(layers)) fail('layers', 'a list of geometry layers', layers);
  if (typeof indexOf !== 'function') fail('indexOf', 'a function from material name to complex index', indexOf);
  const K = integerAtLeast('harmonics', harmonics, 0);
  const cache = new Map<string, Complex>();
  const resolve = (field: string, name: unknown): Complex => {
    const m = materialName(field, name);
    let n = cache.get(m);
    if (!n) {
      const v = indexOf(m);
      finite(`indexOf('${m}').re`, v?.re);
      finite(`indexOf('${m}').im`, v?.im);
      n = { re: v.re, im: v.im };
      cache.set(m, n);
    }
    return n;
  };
  const out: Layer[] = [];
  layers.forEach((l, i) => {
    const f = `layers[${i}]`;
    const t = nonNegativeLength(`${f}.thicknessUm`, l?.thicknessUm);
    let profile: Profile;
    switch (l.kind) {
      case 'uniform':
        profile = { kind: 'uniform', index: resolve(`${f}.material`, l.material) };
        break;
      case 'segments':
        profile = { kind: 'segments', segments: resolveSegments(f, l.segments, resolve) };
        break;
      case 'cosine': {
        const n = resolve(`${f}.material`, l.material);
        const deltaEps = finite(`${f}.deltaEps`, l.deltaEps);
        const phase = finite(`${f}.phaseRad`, l.phaseRad);
        profile = cosineProfile([n.re * n.re - n.im * n.im, 2 * n.re * n.im], deltaEps, phase, K, `${f}.deltaEps`);
        break;
      }
      default:
        fail(`${f}.kind`, "'uniform', 'segments' or 'cosine'", (l as { kind?: unknown })?.kind);
    }
    const last = out[out.length - 1];
    if (last && sameProfile(last.profile, profile)) out[out.length - 1] = { thicknessUm: last.thicknessUm + t, profile };
    else out.push({ thicknessUm: t, profile });
  });
  return out;
}

function resolveSegments(
  f: string,
  segs: unknown,
  resolve: (field: string, name: unknown) => Complex,
): Segment[] {
  if (!Array.isArray(segs) || segs.length === 0) fail(`${f}.segments`, 'at least one segment', segs);
  let at = 0;
  const out: Segment[] = [];
  (segs as ReadonlyArray<Record<string, unknown>>).forEach((s, j) => {
    const g = `${f}.segments[${j}]`;
    const from = finite(`${g}.from`, s?.from);
    const to = finite(`${g}.to`, s?.to);
    if (Math.abs(from - at) > 1e-12) fail(`${g}.from`, `${at} (segments tile [0, 1) in order, without gaps or overlaps)`, from);
    if (!(to > from)) fail(`${g}.to`, `a fraction greater than from = ${from}`, to);
    at = to;
    const index = resolve(`${g}.material`, s.material);
    const last = out[out.length - 1];
    if (last && last.index.re === index.re && last.index.im === index.im) out[out.length - 1] = { from: last.from, to, index };
    else out.push({ from, to, index });
  });
  if (Math.abs(at - 1) > 1e-12) fail(`${f}.segments`, 'segments ending at 1 (the full period)', at);
  return out;
}

/**
 * Exact Fourier coefficients (k = −K…K) of ε = a + b·cos(2πx/Λ − φ) and of 1/ε; a, b complex as
 * [re, im] (b real here). Exported for tests.
 */
export function cosineProfile(a: readonly [number, number], b: number, phase: number, K: number, field = 'deltaEps'): Profile {
  const eps: Complex[] = [];
  const inv: Complex[] = [];
  for (let k = -K; k <= K; k++) {
    eps.push(k === 0 ? { re: a[0], im: a[1] } : Math.abs(k) === 1 ? { re: (b / 2) * Math.cos(k * phase), im: -(b / 2) * Math.sin(k * phase) } : { re: 0, im: 0 });
  }
  if (b === 0) {
    const d = a[0] * a[0] + a[1] * a[1];
    for (let k = -K; k <= K; k++) inv.push(k === 0 ? { re: a[0] / d, im: -a[1] / d } : { re: 0, im: 0 });
    return { kind: 'fourier', permittivity: eps, inversePermittivity: inv };
  }
  // s² = a² − b² = (a − b)(a + b)
  const s = csqrt(cmul([a[0] - b, a[1]], [a[0] + b, a[1]]));
  let apS: [number, number] = [a[0] + s[0], a[1] + s[1]];
  const amS: [number, number] = [a[0] - s[0], a[1] - s[1]];
  let root = s;
  if (Math.hypot(amS[0], amS[1]) > Math.hypot(apS[0], apS[1])) {
    root = [-s[0], -s[1]];
    apS = amS;
  }
  const rho = cdiv([-b, 0], apS); // ρ = −b/(a + s)
  const rabs = Math.hypot(rho[0], rho[1]);
  if (!(rabs < 1 - 1e-12)) fail(field, 'a modulation that keeps ε(x) = ε0 + Δε·cos(·) away from zero for every x', `Δε = ${b} with ε0 = ${a[0]} + ${a[1]}i`);
  const inv0 = cdiv([1, 0], root);
  let pw: [number, number] = [1, 0];
  const pos: Array<[number, number]> = [];
  for (let k = 0; k <= K; k++) {
    pos.push(cmul(pw, inv0)); // ρ^k / s
    pw = cmul(pw, rho);
  }
  for (let k = -K; k <= K; k++) {
    const c = pos[Math.abs(k)]!;
    const e: [number, number] = [Math.cos(k * phase), -Math.sin(k * phase)]; // e^{−ikφ}
    const v = cmul(c, e);
    inv.push({ re: v[0], im: v[1] });
  }
  return { kind: 'fourier', permittivity: eps, inversePermittivity: inv };
}

function cmul(a: readonly [number, number], b: readonly [number, number]): [number, number] {
  return [a[0] * b[0] - a[1] * b[1], a[0] * b[1] + a[1] * b[0]];
}

function cdiv(a: readonly [number, number], b: readonly [number, number]): [number, number] {
  const d = b[0] * b[0] + b[1] * b[1];
  return [(a[0] * b[0] + a[1] * b[1]) / d, (a[1] * b[0] - a[0] * b[1]) / d];
}

/** Principal square root. */
function csqrt(z: readonly [number, number]): [number, number] {
  const m = Math.hypot(z[0], z[1]);
  const re = Math.sqrt(Math.max(0, (m + z[0]) / 2));
  const im = Math.sqrt(Math.max(0, (m - z[0]) / 2));
  return [re, z[1] < 0 ? -im : im];
}

function sameProfile(p: Profile, q: Profile): boolean {
  const eq = (a: Complex, b: Complex): boolean => a.re === b.re && a.im === b.im;
  if (p.kind === 'uniform' && q.kind === 'uniform') return eq(p.index, q.index);
  if (p.kind === 'segments' && q.kind === 'segments') {
    return (
      p.segments.length === q.segments.length &&
      p.segments.every((s, i) => {
        const r = q.segments[i]!;
        return s.from === r.from && s.to === r.to && eq(s.index, r.index);
      })
    );
  }
  if (p.kind === 'fourier' && q.kind === 'fourier') {
    return (
      p.permittivity.length === q.permittivity.length &&
      p.permittivity.every((c, i) => eq(c, q.permittivity[i]!)) &&
      p.inversePermittivity.every((c, i) => eq(c, q.inversePermittivity[i]!))
    );
  }
  return false;
}
