/**
 * The Nelder–Mead simplex method for the minimum of a function of several variables without
 * derivatives (J. A. Nelder & R. Mead, Computer Journal 7 (1965) 308), with the standard
 * coefficients reflection 1, expansion 2, contraction ½, shrink ½ and the inside/outside
 * contractions of Lagarias, Reeds, Wright & Wright, SIAM J. Optim. 9 (1998) 112. Bounds are
 * kept by projecting every trial point onto the box, so the function is only called inside it.
 * The function may be asynchronous (evaluations are awaited one after another).
 */

/** Options of {@link nelderMead}. */
export interface NelderMeadOptions {
  /** lower bounds, one per variable */
  readonly lower: ReadonlyArray<number>;
  /** upper bounds, one per variable */
  readonly upper: ReadonlyArray<number>;
  /** initial simplex: the start plus one point per axis, `step[i]` along axis i (toward the box's interior when the step would leave it) */
  readonly step: ReadonlyArray<number>;
  /** stop when every vertex is within this of the best, on every axis (same units as x) … */
  readonly xTolerance: number;
  /** … and the values at the vertices differ by at most this */
  readonly fTolerance: number;
  /** most function evaluations (default 200 × variables) */
  readonly maxEvaluations?: number;
  /** the value at the start when already known (saves a call) */
  readonly startValue?: number;
}

/** Result of a Nelder–Mead minimization. */
export interface NelderMeadResult {
  readonly x: ReadonlyArray<number>;
  readonly f: number;
  /** calls of the function (not counting a given start value) */
  readonly evaluations: number;
  /** false when maxEvaluations stopped the search before both tolerances were met */
  readonly converged: boolean;
}

/**
 * Minimize `f` from `start` inside the box [lower, upper].
 * @param f function to minimize; NaN counts as +Infinity (prefer a large finite value for a
 *   point that cannot be evaluated, so the simplex keeps its shape)
 * @throws {RangeError} for mismatched lengths, an empty box, a start outside it, a zero step or non-positive tolerances
 * @example
 * const r = await nelderMead(([x, y]) => (x! - 1) ** 2 + 10 * (y! + 2) ** 2, [0, 0], {
 *   lower: [-5, -5], upper: [5, 5], step: [0.5, 0.5], xTolerance: 1e-8, fTolerance: 1e-12,
 * });
 * r.x; // ≈ [1, −2]
 */
export async function nelderMead(f: (x: ReadonlyArray<number>) => number | Promise<number>, start: ReadonlyArray<number>, options: NelderMeadOptions): Promise<NelderMeadResult> {
  const n = start.length;
  const { lower, upper, step } = options;
  if (n < 1 || lower.length !== n || upper.length !== n || step.length !== n) throw new RangeError(`nelderMead: start, lower, upper and step need one entry per variable (${n})`);
  for (let i = 0; i < n; i++) {
    if (!(lower[i]! < upper[i]!)) throw new RangeError(`nelderMead: variable ${i} has an empty box [${lower[i]}, ${upper[i]}]`);
    if (!(start[i]! >= lower[i]! && start[i]! <= upper[i]!)) throw new RangeError(`nelderMead: start ${start[i]} of variable ${i} is outside [${lower[i]}, ${upper[i]}]`);
    if (!(Math.abs(step[i]!) > 0)) throw new RangeError(`nelderMead: step of variable ${i} must be non-zero, found ${step[i]}`);
  }
  if (!(options.xTolerance > 0) || !(options.fTolerance > 0)) throw new RangeError('nelderMead: xTolerance and fTolerance must be > 0');
  const maxEval = options.maxEvaluations ?? 200 * n;
  let evaluations = 0;
  const clamp = (x: number[]): number[] => x.map((v, i) => Math.min(upper[i]!, Math.max(lower[i]!, v)));
  const call = async (x: ReadonlyArray<number>): Promise<number> => {
    evaluations++;
    const v = await f(x);
    return Number.isNaN(v) ? Number.POSITIVE_INFINITY : v;
  };

  const xs: number[][] = [[...start]];
  const fs: number[] = [options.startValue ?? (await call(start))];
  for (let i = 0; i < n; i++) {
    const p = [...start];
    let s = step[i]!;
    if (p[i]! + s > upper[i]! || p[i]! + s < lower[i]!) s = -s;
    p[i] = Math.min(upper[i]!, Math.max(lower[i]!, p[i]! + s));
    if (p[i] === start[i]) p[i] = start[i]! + (upper[i]! - start[i]! > start[i]! - lower[i]! ? 1 : -1) * Math.min(Math.abs(s), (upper[i]! - lower[i]!) / 2);
    xs.push(p);
    fs.push(await call(p));
  }

  const order = (): void => {
    const idx = fs.map((_, k) => k).sort((a, b) => fs[a]! - fs[b]! || a - b);
    const x2 = idx.map((k) => xs[k]!);
    const f2 = idx.map((k) => fs[k]!);
    xs.splice(0, xs.length, ...x2);
    fs.splice(0, fs.length, ...f2);
  };
  const done = (): boolean => {
    let dx = 0;
    for (let k = 1; k <= n; k++) for (let i = 0; i < n; i++) dx = Math.max(dx, Math.abs(xs[k]![i]! - xs[0]![i]!));
    const df = Math.max(...fs.map((v) => Math.abs(v - fs[0]!)));
    return dx <= options.xTolerance && df <= options.fTolerance;
  };
  const along = (c: number[], x: number[], t: number): number[] => clamp(c.map((ci, i) => ci + t * (x[i]! - ci)));

  order();
  while (!done()) {
    if (evaluations >= maxEval) return { x: xs[0]!, f: fs[0]!, evaluations, converged: false };
    const worst = xs[n]!;
    const c = new Array<number>(n).fill(0);
    for (let k = 0; k < n; k++) for (let i = 0; i < n; i++) c[i]! += xs[k]![i]! / n;
    const xr = along(c, worst, -1);
    const fr = await call(xr);
    if (fr < fs[0]!) {
      const xe = along(c, worst, -2);
      const fe = await call(xe);
      if (fe < fr) {
        xs[n] = xe;
        fs[n] = fe;
      } else {
        xs[n] = xr;
        fs[n] = fr;
      }
    } else if (fr < fs[n - 1]!) {
      xs[n] = xr;
      fs[n] = fr;
    } else {
      const outside = fr < fs[n]!;
      const xc = along(c, worst, outside ? -0.5 : 0.5);
      const fc = await call(xc);
      if (outside ? fc <= fr : fc < fs[n]!) {
        xs[n] = xc;
        fs[n] = fc;
      } else {
        for (let k = 1; k <= n; k++) {
          xs[k] = clamp(xs[0]!.map((b, i) => b + 0.5 * (xs[k]![i]! - b)));
          fs[k] = await call(xs[k]!);
        }
      }
    }
    order();
  }
  return { x: xs[0]!, f: fs[0]!, evaluations, converged: true };
}
