/**
 * Workspaces kept between calls: the eigen-solvers' scratch (and, for zgeev, a WebAssembly
 * memory and instance for the SIMD rotation kernels) is costly to create, and a sweep makes
 * thousands of calls at the same few orders. Creating it on every call allocated ~100 kB of
 * buffers plus a wasm memory per eigen-solve; the garbage collector then spent about a quarter
 * of a core freeing them on background threads.
 *
 * One workspace per order, at most `KEEP` orders (least recently used dropped). JavaScript runs
 * one call at a time per thread and the eigen-solvers neither call back nor await, so a workspace
 * is never used by two calls at once; each worker thread has its own module instance.
 */

/** Orders kept per kind of workspace. */
export const KEEP = 4;

/**
 * A keyed-by-order store of reusable workspaces.
 * @example
 * const zgeevSpace = new WorkspaceStore((n) => new ZgeevWorkspace(n));
 * zgeev(a, {}, zgeevSpace.get(a.rows));
 */
export class WorkspaceStore<W> {
  private readonly byOrder = new Map<number, W>();
  constructor(private readonly make: (n: number) => W) {}

  /** The workspace for order n, created on first use. */
  get(n: number): W {
    let w = this.byOrder.get(n);
    if (w === undefined) {
      w = this.make(n);
      if (this.byOrder.size >= KEEP) this.byOrder.delete(this.byOrder.keys().next().value!);
    } else {
      this.byOrder.delete(n); // most recently used last
    }
    this.byOrder.set(n, w);
    return w;
  }

  /** Orders currently kept (most recently used last). */
  orders(): number[] {
    return [...this.byOrder.keys()];
  }
}
