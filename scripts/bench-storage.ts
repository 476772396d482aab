/**
 * Interleaved (re, im, re, im, …) against split (re[], im[]) Float64Array storage for the two
 * loops that dominate the dense kernels, written the same way for both layouts:
 *  - the multiply C = A·B (i–k–j order, two rows of C per pass, as zgemm's TypeScript path), and
 *  - the LU trailing update (unblocked right-looking elimination with partial pivoting, as
 *    zgetrf's TypeScript path, whose time is almost all the rank-1 update of the trailing matrix).
 *
 *   npx tsx scripts/bench-storage.ts [--sizes 101,201] [--repeats 31]
 *
 * Prints the best ms per call for each layout and the ratio split/interleaved (> 1: interleaved
 * is faster). The figures are summarized in scripts/STORAGE.md.
 */
import { pathToFileURL } from 'node:url';

export interface StorageRow {
  readonly kernel: 'multiply' | 'lu-update';
  readonly n: number;
  readonly interleaved_ms: number;
  readonly split_ms: number;
  /** split_ms / interleaved_ms */
  readonly ratio: number;
}

/**
 * Best (minimum) ms per call of two functions, sampled alternately (A, B, A, B, …) after a
 * warm-up of both. Alternation makes slow drifts in machine load hit both layouts alike, and
 * the minimum, unlike the median, ignores samples in which another process took the core: the
 * question here is the intrinsic speed ratio of two layouts, not a typical call time.
 */
function pairedBestMs(fa: () => void, fb: () => void, repeats: number): [number, number] {
  for (const f of [fa, fb]) {
    const warm = performance.now();
    for (let c = 0; c < 3 || performance.now() - warm < 50; c++) f();
  }
  const sa: number[] = [];
  const sb: number[] = [];
  for (let r = 0; r < repeats; r++) {
    let s = performance.now();
    fa();
    sa.push(performance.now() - s);
    s = performance.now();
    fb();
    sb.push(performance.now() - s);
  }
  return [Math.min(...sa), Math.min(...sb)];
}

// ---- multiply ---------------------------------------------------------------------------------

function mulInterleaved(n: number, A: Float64Array, B: Float64Array, C: Float64Array): void {
  const n2 = 2 * n;
  C.fill(0);
  for (let i = 0; i + 1 < n; i += 2) {
    const c0 = i * n2;
    const c1 = c0 + n2;
    for (let k = 0; k < n; k++) {
      const xr = A[c0 + 2 * k]!;
      const xi = A[c0 + 2 * k + 1]!;
      const yr = A[c1 + 2 * k]!;
      const yi = A[c1 + 2 * k + 1]!;
      const b0 = k * n2;
      for (let j = 0; j < n2; j += 2) {
        const br = B[b0 + j]!;
        const bi = B[b0 + j + 1]!;
        C[c0 + j] += xr * br - xi * bi;
        C[c0 + j + 1] += xr * bi + xi * br;
        C[c1 + j] += yr * br - yi * bi;
        C[c1 + j + 1] += yr * bi + yi * br;
      }
    }
  }
  if (n % 2 === 1) {
    const c0 = (n - 1) * n2;
    for (let k = 0; k < n; k++) {
      const xr = A[c0 + 2 * k]!;
      const xi = A[c0 + 2 * k + 1]!;
      const b0 = k * n2;
      for (let j = 0; j < n2; j += 2) {
        C[c0 + j] += xr * B[b0 + j]! - xi * B[b0 + j + 1]!;
        C[c0 + j + 1] += xr * B[b0 + j + 1]! + xi * B[b0 + j]!;
      }
    }
  }
}

function mulSplit(n: number, Ar: Float64Array, Ai: Float64Array, Br: Float64Array, Bi: Float64Array, Cr: Float64Array, Ci: Float64Array): void {
  Cr.fill(0);
  Ci.fill(0);
  for (let i = 0; i + 1 < n; i += 2) {
    const c0 = i * n;
    const c1 = c0 + n;
    for (let k = 0; k < n; k++) {
      const xr = Ar[c0 + k]!;
      const xi = Ai[c0 + k]!;
      const yr = Ar[c1 + k]!;
      const yi = Ai[c1 + k]!;
      const b0 = k * n;
      for (let j = 0; j < n; j++) {
        const br = Br[b0 + j]!;
        const bi = Bi[b0 + j]!;
        Cr[c0 + j] += xr * br - xi * bi;
        Ci[c0 + j] += xr * bi + xi * br;
        Cr[c1 + j] += yr * br - yi * bi;
        Ci[c1 + j] += yr * bi + yi * br;
      }
    }
  }
  if (n % 2 === 1) {
    const c0 = (n - 1) * n;
    for (let k = 0; k < n; k++) {
      const xr = Ar[c0 + k]!;
      const xi = Ai[c0 + k]!;
      const b0 = k * n;
      for (let j = 0; j < n; j++) {
        Cr[c0 + j] += xr * Br[b0 + j]! - xi * Bi[b0 + j]!;
        Ci[c0 + j] += xr * Bi[b0 + j]! + xi * Br[b0 + j]!;
      }
    }
  }
}

// ---- LU with the rank-1 trailing update ----------------------------------------------------------

function luInterleaved(n: number, A: Float64Array): void {
  const n2 = 2 * n;
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const v = Math.abs(A[i * n2 + 2 * k]!) + Math.abs(A[i * n2 + 2 * k + 1]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (p !== k) {
      for (let j = 0; j < n2; j++) {
        const t = A[p * n2 + j]!;
        A[p * n2 + j] = A[k * n2 + j]!;
        A[k * n2 + j] = t;
      }
    }
    const rk = k * n2;
    const pr = A[rk + 2 * k]!;
    const pi = A[rk + 2 * k + 1]!;
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n2;
      const xr = A[ri + 2 * k]!;
      const xi = A[ri + 2 * k + 1]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      A[ri + 2 * k] = lr;
      A[ri + 2 * k + 1] = li;
      for (let j = 2 * k + 2; j < n2; j += 2) {
        const ur = A[rk + j]!;
        const ui = A[rk + j + 1]!;
        A[ri + j] -= lr * ur - li * ui;
        A[ri + j + 1] -= lr * ui + li * ur;
      }
    }
  }
}

function luSplit(n: number, R: Float64Array, I: Float64Array): void {
  for (let k = 0; k < n; k++) {
    let p = k;
    let best = -1;
    for (let i = k; i < n; i++) {
      const v = Math.abs(R[i * n + k]!) + Math.abs(I[i * n + k]!);
      if (v > best) {
        best = v;
        p = i;
      }
    }
    if (p !== k) {
      for (let j = 0; j < n; j++) {
        let t = R[p * n + j]!;
        R[p * n + j] = R[k * n + j]!;
        R[k * n + j] = t;
        t = I[p * n + j]!;
        I[p * n + j] = I[k * n + j]!;
        I[k * n + j] = t;
      }
    }
    const rk = k * n;
    const pr = R[rk + k]!;
    const pi = I[rk + k]!;
    const d = pr * pr + pi * pi;
    const ir = pr / d;
    const ii = -pi / d;
    for (let i = k + 1; i < n; i++) {
      const ri = i * n;
      const xr = R[ri + k]!;
      const xi = I[ri + k]!;
      const lr = xr * ir - xi * ii;
      const li = xr * ii + xi * ir;
      R[ri + k] = lr;
      I[ri + k] = li;
      for (let j = k + 1; j < n; j++) {
        const ur = R[rk + j]!;
        const ui = I[rk + j]!;
        R[ri + j] -= lr * ur - li * ui;
        I[ri + j] -= lr * ui + li * ur;
      }
    }
  }
}

// ---- driver ---------------------------------------------------------------------------------------

function random(len: number, seed: number): Float64Array {
  let s = seed >>> 0;
  const a = new Float64Array(len);
  for (let k = 0; k < len; k++) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    a[k] = s / 2147483648 - 1;
  }
  return a;
}

function split(x: Float64Array): [Float64Array, Float64Array] {
  const re = new Float64Array(x.length / 2);
  const im = new Float64Array(x.length / 2);
  for (let k = 0; k < re.length; k++) {
    re[k] = x[2 * k]!;
    im[k] = x[2 * k + 1]!;
  }
  return [re, im];
}

/**
 * Time both layouts at each size.
 * @returns one row per kernel and size, with the ratio split/interleaved.
 * @example
 * const rows = runStorageBench({ sizes: [51], repeats: 5 });
 */
export function runStorageBench(options: { sizes?: readonly number[]; repeats?: number } = {}): StorageRow[] {
  const sizes = options.sizes ?? [101, 201];
  const repeats = options.repeats ?? 31;
  const rows: StorageRow[] = [];
  for (const n of sizes) {
    const a = random(2 * n * n, n);
    const b = random(2 * n * n, n + 1);
    const c = new Float64Array(2 * n * n);
    const [ar, ai] = split(a);
    const [br, bi] = split(b);
    const cr = new Float64Array(n * n);
    const ci = new Float64Array(n * n);
    const [inter, spl] = pairedBestMs(
      () => mulInterleaved(n, a, b, c),
      () => mulSplit(n, ar, ai, br, bi, cr, ci),
      repeats,
    );
    rows.push({ kernel: 'multiply', n, interleaved_ms: inter, split_ms: spl, ratio: spl / inter });
    // the LU works in place, so each call starts from a fresh copy (the copy is O(n²) of O(n³))
    const work = new Float64Array(a.length);
    const wr = new Float64Array(ar.length);
    const wi = new Float64Array(ai.length);
    const [luI, luS] = pairedBestMs(
      () => {
        work.set(a);
        luInterleaved(n, work);
      },
      () => {
        wr.set(ar);
        wi.set(ai);
        luSplit(n, wr, wi);
      },
      repeats,
    );
    rows.push({ kernel: 'lu-update', n, interleaved_ms: luI, split_ms: luS, ratio: luS / luI });
  }
  return rows;
}

function main(): void {
  const args = process.argv.slice(2);
  let sizes: number[] | undefined;
  let repeats: number | undefined;
  for (let i = 0; i < args.length; i++) {
    if (args[i] === '--sizes') sizes = args[++i]!.split(',').map(Number);
    else if (args[i] === '--repeats') repeats = Number(args[++i]);
    else throw new Error(`unknown option ${args[i]} (use --sizes, --repeats)`);
  }
  const rows = runStorageBench({ sizes, repeats });
  console.log('kernel      n    interleaved ms   split ms   split/interleaved');
  for (const r of rows) {
    console.log(
      `${r.kernel.padEnd(10)} ${String(r.n).padStart(3)} ${r.interleaved_ms.toFixed(3).padStart(16)} ${r.split_ms.toFixed(3).padStart(10)} ${r.ratio.toFixed(2).padStart(18)}`,
    );
  }
  for (const r of rows) console.log(JSON.stringify(r));
}

if (process.argv[1] !== undefined && import.meta.url === pathToFileURL(process.argv[1]).href) main();
