/**
 * Host side of the WebAssembly SIMD kernels (kernels.as): loading, backend choice, and the
 * copy-in / call / copy-out wrappers that zgemm.ts and zgetrf.ts dispatch to.
 *
 * The module is compiled synchronously at import time from the base64 text in kernels.wasm.ts,
 * so it works the same in Node, in workers and in browsers, with no file access and no await.
 * When WebAssembly or its SIMD extension is missing (the module then fails validation), or when
 * the environment variable `FURROW_NO_WASM=1` is set, every kernel runs its pure-TypeScript
 * path; `setLinalgBackend` switches at run time (tests compare the two paths this way).
 *
 * Memory: the kernels work in the module's own linear memory. Each call copies its operands in
 * and its result out, O(n²) against O(n³) arithmetic; the memory grows to the largest call seen
 * and is then reused, never shrunk. Calls are synchronous and never nest, so one arena suffices.
 */
import { KERNELS_WASM_BASE64 } from './kernels.wasm.ts';

/** Which implementation the dense kernels use. */
export type LinalgBackend = 'wasm' | 'ts';

interface KernelExports {
  readonly memory: WebAssembly.Memory;
  heapBase(): number;
  zgemmWorkBytes(m: number, n: number, k: number): number;
  zgetrfWorkBytes(n: number): number;
  zgetrsWorkBytes(n: number, m: number): number;
  zgemm(
    m: number, n: number, k: number,
    alphaRe: number, alphaIm: number,
    pA: number, lda: number,
    pB: number, ldb: number,
    betaRe: number, betaIm: number,
    pC: number, ldc: number,
    pWork: number,
  ): void;
  zgetrf(n: number, pA: number, pIpiv: number, pWork: number): number;
  zgetrs(n: number, m: number, pLU: number, pIpiv: number, pX: number, pWork: number): void;
}

const PAGE = 65536;

function decodeBase64(text: string): Uint8Array<ArrayBuffer> {
  // atob exists in Node ≥ 16, browsers and workers; Buffer would tie this to Node
  const bin = atob(text);
  const bytes = new Uint8Array(new ArrayBuffer(bin.length));
  for (let i = 0; i < bin.length; i++) bytes[i] = bin.charCodeAt(i);
  return bytes;
}

function envForcesFallback(): boolean {
  const env = (globalThis as { process?: { env?: Record<string, string | undefined> } }).process?.env;
  const v = env?.['FURROW_NO_WASM'];
  return v !== undefined && v !== '' && v !== '0';
}

function load(): { exports: KernelExports | null; reason: string } {
  if (typeof WebAssembly !== 'object' || typeof WebAssembly.Module !== 'function') {
    return { exports: null, reason: 'WebAssembly is not available' };
  }
  try {
    const bytes = decodeBase64(KERNELS_WASM_BASE64);
    // an engine without SIMD rejects the module at validation; that is the feature test
    if (!WebAssembly.validate(bytes)) return { exports: null, reason: 'WebAssembly SIMD is not supported' };
    const instance = new WebAssembly.Instance(new WebAssembly.Module(bytes), {});
    return { exports: instance.exports as unknown as KernelExports, reason: 'loaded' };
  } catch (e) {
    return { exports: null, reason: `WebAssembly kernels failed to load: ${e instanceof Error ? e.message : String(e)}` };
  }
}

const loaded = load();
const kernels = loaded.exports;
let active: LinalgBackend = kernels !== null && !envForcesFallback() ? 'wasm' : 'ts';

/** True when the WebAssembly SIMD kernels loaded (whether or not they are the active backend). */
export function wasmAvailable(): boolean {
  return kernels !== null;
}

/** Why the WebAssembly kernels are or are not available (for diagnostics and the CLI). */
export function wasmStatus(): string {
  return loaded.reason;
}

/** The backend the dense kernels use now. */
export function linalgBackend(): LinalgBackend {
  return active;
}

/**
 * Choose the backend of zgemm, zgetrf, zgetrs (and so zgesv, zgetri). 'auto' picks WebAssembly
 * when it loaded, ignoring `FURROW_NO_WASM`. Returns the backend now active.
 * @throws {Error} when 'wasm' is requested but the module could not be loaded.
 * @example
 * setLinalgBackend('ts'); // force the pure-TypeScript kernels
 * setLinalgBackend('auto');
 */
export function setLinalgBackend(backend: LinalgBackend | 'auto'): LinalgBackend {
  if (backend === 'wasm' && kernels === null) throw new Error(`cannot use the wasm backend: ${loaded.reason}`);
  active = backend === 'ts' || kernels === null ? 'ts' : 'wasm';
  return active;
}

/** The loaded kernels when the wasm backend is active, else null (the caller falls back). */
export function activeKernels(): KernelExports | null {
  return active === 'wasm' ? kernels : null;
}

// ---- arena ---------------------------------------------------------------------------------

let f64: Float64Array = new Float64Array(0);
let i32: Int32Array = new Int32Array(0);
let base = 0;

/** Make sure `bytes` bytes past the heap base exist; returns the 16-byte-aligned base offset. */
function reserve(k: KernelExports, bytes: number): number {
  if (base === 0) base = (k.heapBase() + 15) & ~15;
  const need = base + bytes;
  const have = k.memory.buffer.byteLength;
  if (need > have) k.memory.grow(Math.ceil((need - have) / PAGE));
  if (f64.buffer !== k.memory.buffer) {
    // growing detaches the old buffer: take fresh views
    f64 = new Float64Array(k.memory.buffer);
    i32 = new Int32Array(k.memory.buffer);
  }
  return base;
}

function copyIn(src: Float64Array, count: number, byteOffset: number): void {
  f64.set(src.length === count ? src : src.subarray(0, count), byteOffset >>> 3);
}

function copyOut(dst: Float64Array, count: number, byteOffset: number): void {
  const at = byteOffset >>> 3;
  dst.set(f64.subarray(at, at + count));
}

/** C(m×n) = alpha·A(m×k)·B(k×n) + beta·C on contiguous interleaved row-major arrays. */
export function wasmZgemm(
  k: KernelExports,
  m: number, n: number, kk: number,
  alphaRe: number, alphaIm: number,
  A: Float64Array, B: Float64Array,
  betaRe: number, betaIm: number,
  C: Float64Array,
): void {
  const aBytes = 16 * m * kk;
  const bBytes = 16 * kk * n;
  const cBytes = 16 * m * n;
  const p = reserve(k, aBytes + bBytes + cBytes + k.zgemmWorkBytes(m, n, kk));
  const pA = p;
  const pB = pA + aBytes;
  const pC = pB + bBytes;
  const pW = pC + cBytes;
  const useAB = kk > 0 && !(alphaRe === 0 && alphaIm === 0);
  if (useAB) {
    copyIn(A, 2 * m * kk, pA);
    copyIn(B, 2 * kk * n, pB);
  }
  // beta = 0: the kernel never reads C, so its old contents (even NaN) need not be copied
  if (!(betaRe === 0 && betaIm === 0)) copyIn(C, 2 * m * n, pC);
  k.zgemm(m, n, kk, alphaRe, alphaIm, pA, kk, pB, n, betaRe, betaIm, pC, n, pW);
  copyOut(C, 2 * m * n, pC);
}

/** In-place LU of the n×n array A; returns −1 or the step with an exactly zero pivot. */
export function wasmZgetrf(k: KernelExports, n: number, A: Float64Array, ipiv: Int32Array): number {
  const aBytes = 16 * n * n;
  const ipBytes = (4 * n + 15) & ~15;
  const p = reserve(k, aBytes + ipBytes + k.zgetrfWorkBytes(n));
  const pIp = p + aBytes;
  copyIn(A, 2 * n * n, p);
  const step = k.zgetrf(n, p, pIp, pIp + ipBytes);
  copyOut(A, 2 * n * n, p);
  // on failure only the steps up to the zero pivot were recorded
  const steps = step < 0 ? n : step + 1;
  ipiv.set(i32.subarray(pIp >>> 2, (pIp >>> 2) + steps));
  return step;
}

/** In-place solve of the n×m right-hand side X with LU factors from zgetrf. */
export function wasmZgetrs(k: KernelExports, n: number, m: number, LU: Float64Array, ipiv: Int32Array, X: Float64Array): void {
  const luBytes = 16 * n * n;
  const ipBytes = (4 * n + 15) & ~15;
  const xBytes = 16 * n * m;
  const p = reserve(k, luBytes + ipBytes + xBytes + k.zgetrsWorkBytes(n, m));
  const pIp = p + luBytes;
  const pX = pIp + ipBytes;
  copyIn(LU, 2 * n * n, p);
  i32.set(ipiv.length === n ? ipiv : ipiv.subarray(0, n), pIp >>> 2);
  copyIn(X, 2 * n * m, pX);
  k.zgetrs(n, m, p, pIp, pX, pX + xBytes);
  copyOut(X, 2 * n * m, pX);
}
