/**
 * Timing of zgeev (not a test): best-of-N wall time per call at the sizes the solver uses, with a
 * reused workspace, mean CPU time, and a per-phase breakdown.
 * Run: `npx tsx scripts/bench-zgeev.ts [sizes…]` (FURROW_NO_WASM=1 for the TypeScript paths).
 *
 * For a native reference on the same machine, single-threaded LAPACK through numpy:
 *   env -u OPENBLAS_CORETYPE -u OPENBLAS_L2_SIZE OMP_NUM_THREADS=1 OPENBLAS_NUM_THREADS=1 \
 *     python3 -c "import numpy as np, time; a = np.random.rand(201, 201) + 1j*np.random.rand(201, 201); \
 *     np.linalg.eig(a); t = time.perf_counter(); [np.linalg.eig(a) for _ in range(20)]; \
 *     print((time.perf_counter() - t) / 20 * 1e3, 'ms')"
 * Other processes on a shared machine inflate both; compare runs taken back to back.
 */
import { seededMatrix } from './bench-matrices.ts';
import { zgebal } from '../src/linalg/zgebal.ts';
import { ZgeevWorkspace, zgeev } from '../src/linalg/zgeev.ts';
import { zgehrd, zunghr } from '../src/linalg/zgehrd.ts';
import { zhseqr } from '../src/linalg/zhseqr.ts';
import { ztrevc } from '../src/linalg/ztrevc.ts';


function best(xs: number[]): number {
  const s = [...xs].sort((x, y) => x - y);
  return s[0]!; // minimum: the machine is shared, the fastest run is the least disturbed
}

/** CPU time per call (ms) over a batch: less sensitive than wall time to other load on the machine. */
function cpuTime(reps: number, f: () => void): number {
  const c0 = process.cpuUsage();
  for (let r = 0; r < reps; r++) f();
  const c = process.cpuUsage(c0);
  return (c.user + c.system) / 1000 / reps;
}

function time(reps: number, f: () => void): number {
  const ts: number[] = [];
  for (let r = 0; r < reps; r++) {
    const t0 = performance.now();
    f();
    ts.push(performance.now() - t0);
  }
  return best(ts);
}

const sizes = process.argv.length > 2 ? process.argv.slice(2).map(Number) : [21, 51, 101, 201];
for (const n of sizes) {
  const a = seededMatrix(n, 1234 + n);
  const ws = new ZgeevWorkspace(n);
  const reps = Math.max(7, Math.round(3000 / n));
  for (let w = 0; w < 3 * reps; w++) zgeev(a, {}, ws); // warm-up (JIT)
  const tv = time(reps, () => zgeev(a, {}, ws));
  const te = time(reps, () => zgeev(a, { vectors: false }, ws));
  const tc = cpuTime(reps, () => zgeev(a, {}, ws));

  // Phase breakdown on the same matrix.
  const v = new Float64Array(2 * n * n);
  const w = new Float64Array(2 * n);
  const ph = [0, 0, 0, 0, 0];
  const phases: number[][] = [[], [], [], [], []];
  for (let r = 0; r < reps; r++) {
    let t = performance.now();
    ws.h.set(a.data);
    zgebal(n, ws.h, ws.scale, ws.range, true, true);
    const ilo = ws.range[0]!;
    const ihi = ws.range[1]!;
    let t2 = performance.now();
    phases[0]!.push(t2 - t);
    t = t2;
    zgehrd(n, ilo, ihi, ws.h, ws.aux, ws.tau, ws.work, ws.z);
    t2 = performance.now();
    phases[1]!.push(t2 - t);
    t = t2;
    zunghr(n, ilo, ihi, ws.aux, ws.tau, ws.z, ws.work);
    t2 = performance.now();
    phases[2]!.push(t2 - t);
    t = t2;
    zhseqr(n, ilo, ihi, ws.h, true, ws.z, w, ws.rotC, ws.rotS, ws.qr);
    t2 = performance.now();
    phases[3]!.push(t2 - t);
    t = t2;
    ztrevc(n, ws.h, ws.z, ws.aux, v, ws.work);
    t2 = performance.now();
    phases[4]!.push(t2 - t);
  }
  for (let k = 0; k < 5; k++) ph[k] = best(phases[k]!);
  console.log(
    `n=${n}: zgeev ${tv.toFixed(3)} ms best wall, ${tc.toFixed(3)} ms mean CPU (values only ${te.toFixed(3)} ms) | ` +
      `gebal ${ph[0]!.toFixed(2)} gehrd ${ph[1]!.toFixed(2)} unghr ${ph[2]!.toFixed(2)} ` +
      `hseqr ${ph[3]!.toFixed(2)} trevc ${ph[4]!.toFixed(2)}`,
  );
}
