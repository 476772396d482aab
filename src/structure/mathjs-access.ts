/**
 * mathjs on demand. The library costs about 0.65 s and 32 MB of heap to load — in every sweep
 * worker thread, where the heap is marked at every major collection — yet most designs need it
 * for nothing: plain lengths such as "632.8 nm" are read without it (see design/units.ts). It is
 * loaded the first time something needs it (an expression profile, a unit outside the common set).
 *
 * On Node the engine loads it itself, synchronously, through `process.getBuiltinModule` (no
 * Node-only import, so the browser bundle stays free of them). A browser page (or any host
 * without that) hands the module over once with {@link provideMathjs}.
 */
import type * as MathJs from 'mathjs';

export type MathModule = typeof MathJs;

let math: MathModule | null = null;

/**
 * Hand the engine a loaded mathjs (the browser page and its workers do this at start-up).
 * @example
 * import * as math from 'mathjs';
 * provideMathjs(math);
 */
export function provideMathjs(m: MathModule): void {
  math = m;
}

/** True once mathjs has been loaded or provided (benchmarks and tests look). */
export function mathjsLoaded(): boolean {
  return math !== null;
}

/**
 * The mathjs module, loaded on first use.
 * @throws {Error} on a host that cannot load modules synchronously and where none was provided
 */
export function mathjs(): MathModule {
  if (math !== null) return math;
  const host = (globalThis as { process?: { getBuiltinModule?: (id: string) => unknown } }).process;
  if (typeof host?.getBuiltinModule === 'function') {
    const mod = host.getBuiltinModule('node:module') as { createRequire(url: string): (id: string) => unknown };
    math = mod.createRequire(import.meta.url)('mathjs') as MathModule;
    return math;
  }
  throw new Error('mathjs has not been provided to the engine: call provideMathjs(math) at start-up');
}
