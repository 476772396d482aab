/**
 * Timing of zheev (not a test): `npx tsx scripts/bench-zheev.ts [n …]`.
 * Prints the best-of-runs time per call for random Hermitian matrices, with and without
 * eigenvectors, and the split between the three stages.
 */
import { performance } from 'node:perf_hooks';
import { cmatrix } from '../src/linalg/cmatrix.ts';
import { zheev, ZheevWorkspace } from '../src/linalg/zheev.ts';
import { zhetrdBackTransform, zhetrdBase } from '../src/linalg/zhetrd.ts';
import { zsteqrBase } from '../src/linalg/zsteqr.ts';

/** Random Hermitian matrix, entries uniform in the unit square (seeded LCG, reproducible). */
function randomHermitian(n: number, seed: number): Float64Array {
  let s = seed >>> 0;
  const next = (): number => {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0;
    return (2 * s) / 4294967296 - 1;
  };
  const a = new Float64Array(2 * n * n);
  for (let i = 0; i < n; i++) {
    for (let j = 0; j <= i; j++) {
      const re = next();
      const im = i === j ? 0 : next();
      a[2 * (i * n + j)] = re;
      a[2 * (i * n + j) + 1] = im;
      a[2 * (j * n + i)] = re;
      a[2 * (j * n + i) + 1] = -im;
    }
  }
  return a;
}

function best(fn: () => void, budgetMs: number): number {
  for (let i = 0; i < 3; i++) fn(); // warm-up / JIT
  let bestMs = Infinity;
  const until = performance.now() + budgetMs;
  let runs = 0;
  while (runs < 5 || performance.now() < until) {
    const t = performance.now();
    fn();
    bestMs = Math.min(bestMs, performance.now() - t);
    runs++;
  }
  return bestMs;
}

const sizes = process.argv.slice(2).map(Number);
for (const n of sizes.length > 0 ? sizes : [21, 51, 101, 201]) {
  const a = { rows: n, cols: n, data: randomHermitian(n, 12345 + n) };
  const ws = new ZheevWorkspace(n);
  const budget = 1500;
  const tv = best(() => void zheev(a, { vectors: true }, ws), budget);
  const tn = best(() => void zheev(a, { vectors: false }, ws), budget);
  // stage split
  const tr = best(() => {
    ws.a.set(a.data);
    zhetrdBase(n, ws.a, ws.d, ws.e, ws.tau, ws.phase, ws.work);
  }, budget / 3);
  ws.a.set(a.data);
  zhetrdBase(n, ws.a, ws.d, ws.e, ws.tau, ws.phase, ws.work);
  const d0 = ws.d.slice();
  const e0 = ws.e.slice();
  const tq = best(() => {
    ws.d.set(d0);
    ws.e.set(e0);
    ws.y.fill(0);
    for (let i = 0; i < n * n; i += n + 1) ws.y[i] = 1;
    zsteqrBase(n, ws.d, ws.e, ws.y, ws.work);
  }, budget / 3);
  const z = cmatrix(n, n);
  const tb = best(() => zhetrdBackTransform(n, ws.a, ws.tau, ws.phase, ws.y, z.data, ws.bt), budget / 3);
  console.log(
    `n=${String(n).padStart(4)}  vectors ${tv.toFixed(3)} ms  values ${tn.toFixed(3)} ms  ` +
      `[zhetrd ${tr.toFixed(3)}, zsteqr+vectors ${tq.toFixed(3)}, back-transform ${tb.toFixed(3)}]`,
  );
}
