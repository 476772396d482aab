/**
 * Brent's method for the minimum of a function of one variable on an interval, without
 * derivatives: golden-section steps, replaced by parabolic interpolation through the three best
 * points whenever the parabola's step is acceptable (R. P. Brent, "Algorithms for Minimization
 * without Derivatives", Prentice-Hall 1973, ch. 5; the same procedure as Forsythe, Malcolm &
 * Moler's FMIN, 1977). Converges superlinearly on smooth functions and never worse than golden
 * section. The function may be asynchronous (evaluations are awaited one after another).
 */

/** Options of {@link brentMinimize}. */
export interface BrentOptions {
  /** absolute tolerance on x (same unit as a, b); the result is within about this of a local minimum */
  readonly tolerance: number;
  /** most function evaluations (default 100) */
  readonly maxEvaluations?: number;
  /** a point inside [a, b] whose value is already known: the search starts there and saves a call */
  readonly start?: { readonly x: number; readonly f: number };
}

/** Result of a one-dimensional minimization. */
export interface BrentResult {
  /** abscissa of the smallest value found */
  readonly x: number;
  /** the smallest value found */
  readonly f: number;
  /** calls of the function (not counting a given start) */
  readonly evaluations: number;
  /** false when maxEvaluations stopped the search before the tolerance was met */
  readonly converged: boolean;
}

/** (3 − √5)/2: the golden-section fraction. */
const GOLDEN = 0.5 * (3 - Math.sqrt(5));
/** square root of the double epsilon: relative resolution below which x steps are meaningless */
const SQRT_EPS = Math.sqrt(2.220446049250313e-16);

/**
 * Minimize `f` on [a, b].
 * @param f function to minimize; NaN is treated as +Infinity would be, so keep values finite
 *   (return a large number for a point that cannot be evaluated)
 * @param a left end
 * @param b right end (> a)
 * @throws {RangeError} for b ≤ a, a non-positive tolerance, or a start outside [a, b]
 * @example
 * const r = await brentMinimize((x) => (x - 2) ** 2, 0, 5, { tolerance: 1e-8 });
 * r.x; // ≈ 2
 */
export async function brentMinimize(f: (x: number) => number | Promise<number>, a: number, b: number, options: BrentOptions): Promise<BrentResult> {
  if (!(Number.isFinite(a) && Number.isFinite(b) && b > a)) throw new RangeError(`brentMinimize: expected a < b, found [${a}, ${b}]`);
  const tol = options.tolerance;
  if (!(tol > 0)) throw new RangeError(`brentMinimize: tolerance must be > 0, found ${tol}`);
  const maxEval = options.maxEvaluations ?? 100;
  if (!(Number.isInteger(maxEval) && maxEval >= 1)) throw new RangeError(`brentMinimize: maxEvaluations must be a whole number ≥ 1, found ${maxEval}`);
  let evaluations = 0;
  const call = async (x: number): Promise<number> => {
    evaluations++;
    const v = await f(x);
    return Number.isNaN(v) ? Number.POSITIVE_INFINITY : v;
  };
  let x: number;
  let fx: number;
  if (options.start) {
    if (!(options.start.x >= a && options.start.x <= b)) throw new RangeError(`brentMinimize: start ${options.start.x} is outside [${a}, ${b}]`);
    x = options.start.x;
    fx = options.start.f;
  } else {
    x = a + GOLDEN * (b - a);
    fx = await call(x);
  }
  let w = x;
  let v = x;
  let fw = fx;
  let fv = fx;
  let d = 0;
  let e = 0;
  let lo = a;
  let hi = b;
  for (;;) {
    const xm = 0.5 * (lo + hi);
    const tol1 = SQRT_EPS * Math.abs(x) + tol / 3;
    const tol2 = 2 * tol1;
    if (Math.abs(x - xm) <= tol2 - 0.5 * (hi - lo)) return { x, f: fx, evaluations, converged: true };
    if (evaluations >= maxEval) return { x, f: fx, evaluations, converged: false };
    let golden = true;
    if (Math.abs(e) > tol1 && Number.isFinite(fx) && Number.isFinite(fw) && Number.isFinite(fv)) {
      // parabola through (x, fx), (w, fw), (v, fv)
      let r = (x - w) * (fx - fv);
      let q = (x - v) * (fx - fw);
      let p = (x - v) * q - (x - w) * r;
      q = 2 * (q - r);
      if (q > 0) p = -p;
      q = Math.abs(q);
      r = e;
      e = d;
      if (Math.abs(p) < Math.abs(0.5 * q * r) && p > q * (lo - x) && p < q * (hi - x)) {
        d = p / q;
        const u = x + d;
        if (u - lo < tol2 || hi - u < tol2) d = xm >= x ? tol1 : -tol1;
        golden = false;
      }
    }
    if (golden) {
      e = x >= xm ? lo - x : hi - x;
      d = GOLDEN * e;
    }
    const u = Math.abs(d) >= tol1 ? x + d : x + (d >= 0 ? tol1 : -tol1);
    const fu = await call(u);
    if (fu <= fx) {
      if (u >= x) lo = x;
      else hi = x;
      v = w;
      fv = fw;
      w = x;
      fw = fx;
      x = u;
      fx = fu;
    } else {
      if (u < x) lo = u;
      else hi = u;
      if (fu <= fw || w === x) {
        v = w;
        fv = fw;
        w = u;
        fw = fu;
      } else if (fu <= fv || v === x || v === w) {
        v = u;
        fv = fu;
      }
    }
  }
}
