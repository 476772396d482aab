/**
 * Scratch matrices for the solver's temporaries (Toeplitz matrices, products, the recursion's
 * LU factors), kept between solves instead of allocated and dropped by the hundred per solve.
 * Every n×n complex matrix above a few elements is memory outside the JavaScript heap; a sweep
 * allocating some 7 MB of them per point made the engine collect its heap several times a second,
 * which cost about a fifth of a core in background threads on top of the solve. Only what outlives
 * a call (a layer's W, V and their factors, which the mode cache keeps) is allocated.
 *
 * A slot is a fixed role within one function (the callers name their slots); a scratch matrix is
 * valid until that function returns. Solves do not nest and never await, so one store per thread
 * is enough. Memory is bounded: up to KEEP_ORDERS orders, and layer factor slots up to
 * MAX_LU_SLOTS (deeper stacks allocate the rest per solve).
 */
import { cmatrix, type CMatrix, luFactors, type LUFactors } from '../linalg/index.ts';

/** LU slots: a layer's W and V factors (when its modes are not kept), inverses, the recursion's layers from LU_STACK on. */
export const LU_MODES_W = 0;
export const LU_MODES_V = 1;
export const LU_INVERSE = 2;
export const LU_STACK = 3;

/** Orders whose scratch is kept (least recently used dropped). */
const KEEP_ORDERS = 3;
/** Layer LU slots kept per order; beyond, factors are allocated per solve. */
export const MAX_LU_SLOTS = 128;

class OrderScratch {
  readonly mats: CMatrix[] = [];
  readonly lus: LUFactors[] = [];
  constructor(readonly n: number) {}
}

const byOrder = new Map<number, OrderScratch>();

function orderScratch(n: number): OrderScratch {
  let s = byOrder.get(n);
  if (s === undefined) {
    s = new OrderScratch(n);
    if (byOrder.size >= KEEP_ORDERS) byOrder.delete(byOrder.keys().next().value!);
  } else {
    byOrder.delete(n);
  }
  byOrder.set(n, s);
  return s;
}

/**
 * The n×n scratch matrix of `slot` (contents undefined: callers overwrite it).
 * @example
 * const E = toeplitz(coeffs, N, scratchMatrix(N, SLOT_E));
 */
export function scratchMatrix(n: number, slot: number): CMatrix {
  const s = orderScratch(n);
  let m = s.mats[slot];
  if (m === undefined) {
    m = cmatrix(n, n);
    s.mats[slot] = m;
  }
  return m;
}

/** LU factor storage for order n in `slot`; a fresh one beyond MAX_LU_SLOTS. */
export function scratchLU(n: number, slot: number): LUFactors {
  if (slot >= MAX_LU_SLOTS) return luFactors(n);
  const s = orderScratch(n);
  let f = s.lus[slot];
  if (f === undefined) {
    f = luFactors(n);
    s.lus[slot] = f;
  }
  return f;
}
