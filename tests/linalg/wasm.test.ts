/**
 * The WebAssembly SIMD kernels against the pure-TypeScript kernels on the same inputs, and the
 * generated module against its source.
 */
import { spawnSync } from 'node:child_process';
import { createHash } from 'node:crypto';
import { readFileSync } from 'node:fs';
import { fileURLToPath } from 'node:url';
import { afterEach, describe, expect, it } from 'vitest';
import { cmatrix, type CMatrix } from '../../src/linalg/cmatrix.ts';
import { zgemm } from '../../src/linalg/zgemm.ts';
import { zgesv, zgetrf, zgetri, zgetrs } from '../../src/linalg/zgetrf.ts';
import { KERNELS_SOURCE_SHA256 } from '../../src/linalg/wasm/kernels.wasm.ts';
import { linalgBackend, setLinalgBackend, wasmAvailable, wasmStatus } from '../../src/linalg/wasm/runtime.ts';
import { fro, randomComplex } from './util.ts';

function withBackend<T>(backend: 'ts' | 'wasm', f: () => T): T {
  setLinalgBackend(backend);
  try {
    return f();
  } finally {
    setLinalgBackend('auto');
  }
}

function relDiff(x: CMatrix, y: CMatrix): number {
  let s = 0;
  for (let k = 0; k < x.data.length; k++) s += (x.data[k]! - y.data[k]!) ** 2;
  return Math.sqrt(s) / Math.max(fro(x), Number.MIN_VALUE);
}

afterEach(() => {
  setLinalgBackend('auto');
});

describe('generated module', () => {
  it('was built from the current kernels.as', () => {
    // check value: sha256 recorded by scripts/build-wasm.mjs (rebuild when this fails)
    const source = readFileSync(new URL('../../src/linalg/wasm/kernels.as', import.meta.url), 'utf8');
    expect(createHash('sha256').update(source).digest('hex')).toBe(KERNELS_SOURCE_SHA256);
  });

  it('loads on Node 20 (which has WebAssembly SIMD)', () => {
    // check value: Node ≥ 16.4 ships wasm SIMD enabled (V8 9.1), so the project's engine has it
    expect(wasmStatus()).toBe('loaded');
    expect(wasmAvailable()).toBe(true);
  });

  it('FURROW_NO_WASM=1 starts on the TypeScript backend', () => {
    // check value: the documented environment switch (runtime.ts), read once at import
    const script = "import { linalgBackend } from './src/linalg/wasm/runtime.ts'; console.log(linalgBackend());";
    const run = (extra: Record<string, string>) =>
      spawnSync(process.execPath, ['--import', 'tsx', '--input-type=module', '-e', script], {
        cwd: fileURLToPath(new URL('../..', import.meta.url)),
        env: { ...process.env, FURROW_NO_WASM: '', ...extra },
        encoding: 'utf8',
      }).stdout.trim();
    expect(run({ FURROW_NO_WASM: '1' })).toBe('ts');
    expect(run({})).toBe('wasm');
  });

  it('backend switch', () => {
    expect(setLinalgBackend('ts')).toBe('ts');
    expect(linalgBackend()).toBe('ts');
    expect(setLinalgBackend('auto')).toBe('wasm');
  });
});

describe.runIf(wasmAvailable())('wasm and TypeScript paths agree', () => {
  // tolerance: both are backward-stable products summed in different orders, so they differ
  // by a few ulps times the inner dimension (Higham, Accuracy and Stability, 2nd ed., §3.5)
  const shapes: Array<[number, number, number]> = [
    [5, 5, 5],
    [4, 2, 16],
    [7, 3, 11],
    [13, 1, 9],
    [1, 17, 8],
    [33, 65, 17],
    [130, 7, 300], // k above the kernel's 256-deep panel, m above its 128-row block
    [201, 201, 201],
  ];
  for (const [m, n, k] of shapes) {
    it(`zgemm ${m}×${k} · ${k}×${n} with alpha and beta`, () => {
      const a = randomComplex(m, k, 11 + m);
      const b = randomComplex(k, n, 12 + n);
      const c0 = randomComplex(m, n, 13 + k);
      const alpha: [number, number] = [0.3, -1.2];
      const beta: [number, number] = [0.7, 0.1];
      const ct = cmatrix(m, n);
      const cw = cmatrix(m, n);
      ct.data.set(c0.data);
      cw.data.set(c0.data);
      withBackend('ts', () => zgemm(ct, a, b, alpha, beta));
      withBackend('wasm', () => zgemm(cw, a, b, alpha, beta));
      expect(relDiff(ct, cw)).toBeLessThan(1e-14);
    });
  }

  it('zgemm with beta = 0 ignores NaN in out, in both paths', () => {
    // check value: BLAS zgemm definition (beta = 0 means C need not be set on input)
    const a = randomComplex(9, 9, 1);
    const b = randomComplex(9, 9, 2);
    for (const backend of ['ts', 'wasm'] as const) {
      const c = cmatrix(9, 9);
      c.data.fill(Number.NaN);
      withBackend(backend, () => zgemm(c, a, b));
      expect(c.data.every(Number.isFinite)).toBe(true);
    }
  });

  it('zgemm with alpha = 0 scales out by beta only', () => {
    // check value: definition, out = 0·a·b + beta·out
    const a = randomComplex(8, 8, 3);
    const b = randomComplex(8, 8, 4);
    const c0 = randomComplex(8, 8, 5);
    const c = cmatrix(8, 8);
    c.data.set(c0.data);
    withBackend('wasm', () => zgemm(c, a, b, [0, 0], [2, 0]));
    for (let p = 0; p < c.data.length; p++) expect(c.data[p]).toBe(2 * c0.data[p]!);
  });

  for (const n of [6, 31, 32, 33, 64, 65, 101, 201]) {
    it(`zgetrf / zgetrs, n = ${n}: same pivots, factors and solutions`, () => {
      const a = randomComplex(n, n, 100 + n);
      const b = randomComplex(n, 7, 200 + n);
      const ft = withBackend('ts', () => zgetrf(a));
      const fw = withBackend('wasm', () => zgetrf(a));
      // random matrices have no near-ties in the pivot search, so the row orders agree
      expect(Array.from(fw.ipiv)).toEqual(Array.from(ft.ipiv));
      expect(relDiff(ft.lu, fw.lu)).toBeLessThan(1e-12);
      const xt = withBackend('ts', () => zgetrs(ft, b));
      const xw = withBackend('wasm', () => zgetrs(ft, b));
      expect(relDiff(xt, xw)).toBeLessThan(1e-12);
    });
  }

  it('zgesv and zgetri through the wasm path', () => {
    const n = 40;
    const a = randomComplex(n, n, 7);
    const b = randomComplex(n, n, 8);
    const xt = withBackend('ts', () => zgesv(a, b));
    const xw = withBackend('wasm', () => zgesv(a, b));
    expect(relDiff(xt, xw)).toBeLessThan(1e-12);
    const it_ = withBackend('ts', () => zgetri(a));
    const iw = withBackend('wasm', () => zgetri(a));
    expect(relDiff(it_, iw)).toBeLessThan(1e-12);
  });

  it('singular matrix is reported at the same step in both paths', () => {
    // column 20 of a 40×40 matrix is zero: elimination meets an exactly zero pivot at step 20
    // (Golub & Van Loan 4th ed. §3.4: with partial pivoting a zero column gives a zero pivot)
    const n = 40;
    const a = randomComplex(n, n, 9);
    for (let i = 0; i < n; i++) {
      a.data[2 * (i * n + 20)] = 0;
      a.data[2 * (i * n + 20) + 1] = 0;
    }
    for (const backend of ['ts', 'wasm'] as const) {
      expect(() => withBackend(backend, () => zgetrf(a))).toThrow(/zero pivot at step 20/);
    }
  });

  it('inputs given as subarray views are read at their offsets', () => {
    // views with a non-zero byteOffset go through the same copy-in as whole arrays
    const n = 12;
    const pool = randomComplex(3 * n, n, 10).data;
    const a: CMatrix = { rows: n, cols: n, data: pool.subarray(2 * n * n, 4 * n * n) };
    const b: CMatrix = { rows: n, cols: n, data: pool.subarray(4 * n * n, 6 * n * n) };
    const ct = withBackend('ts', () => zgemm(cmatrix(n, n), a, b));
    const cw = withBackend('wasm', () => zgemm(cmatrix(n, n), a, b));
    expect(relDiff(ct, cw)).toBeLessThan(1e-14);
  });
});
