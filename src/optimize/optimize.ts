/**
 * Design optimization: which values of some design fields (depth, duty, blaze angle, coating
 * thickness …) give the best efficiency over the band, angles and polarizations of use, subject
 * to constraints.
 *
 * Method: a coarse scan of the box (a grid, or a Latin hypercube for many variables) finds the
 * basins; the best scan points that lie apart from each other are refined locally — Brent's
 * method on the scan cell around the point for one variable, Nelder–Mead from the point for
 * several — in coordinates scaled to [0, 1] per variable. The scan can run on a worker pool
 * (`scanRunner`); the refinement runs here with one evaluation context, so layer eigenmodes are
 * reused where only thicknesses change.
 *
 * Constraints are met lexicographically: every candidate that meets them scores above every one
 * that does not, and among those that do not, the smaller total violation scores higher.
 */
import { z } from 'zod';
import { designToModel, InputError, lengthUm, problemAt, type ReadText } from '../design/index.ts';
import { createEvalContext, type EvalContext } from '../sweep/index.ts';
import { brentMinimize } from './brent.ts';
import { nelderMead } from './nelder-mead.ts';
import {
  BandSchema,
  bandWavelengths,
  type CandidateValues,
  checkValue,
  type Conditions,
  conditionsShape,
  DesignEvaluator,
  type DesignParameter,
  designOnly,
  designParameter,
  describeConditions,
  describeQuantity,
  featureWidths,
  type FeatureWidths,
  FieldValueSchema,
  inProcessRunner,
  nominalValue,
  parameterValue,
  type PlanRunner,
  type Quantity,
  quantityShape,
  resolveConditions,
  sectionError,
  showValue,
  withValues,
} from './objective.ts';
import { createRandom, latinHypercube, MAX_SEED } from './random.ts';

// ---------------------------------------------------------------------------------------------
// the "optimize" section

const VariableSchema = z.strictObject({
  /** design field, dotted: 'grating.depth', 'grating.coating.thickness', 'below.films[0].thickness' */
  path: z.string().min(1, { error: 'give the design field to vary, e.g. "grating.depth"' }),
  /** lower bound (lengths with a unit: "100 nm") */
  min: FieldValueSchema,
  /** upper bound */
  max: FieldValueSchema,
});

const GoalSchema = z.union([z.enum(['maximize', 'minimize']), z.strictObject({ target: z.number() })], {
  error: 'expected "maximize", "minimize" or {"target": 0.5}',
});

/**
 * Rules of the "optimize" section (zod, strict). Meaning (paths against the design, units,
 * bounds the design accepts) is checked by {@link optimize}.
 * @example
 * OptimizeSpecSchema.parse({ variables: [{ path: 'grating.depth', min: '100 nm', max: '1 um' }], objective: { order: -1, side: 'R' } });
 */
export const OptimizeSpecSchema = z.strictObject({
  variables: z.array(VariableSchema).min(1, { error: 'give at least one variable' }).max(8, { error: 'at most 8 variables' }),
  objective: z.strictObject({ ...quantityShape, goal: GoalSchema.default('maximize') }),
  /** other efficiencies that must stay within bounds, e.g. TM ≥ 0.9 */
  constraints: z.array(z.strictObject({ ...quantityShape, min: z.number().optional(), max: z.number().optional() })).max(20).optional(),
  /** narrowest ridge and groove of a lamellar or trapezoid profile, lengths with units */
  minFeature: z.strictObject({ ridge: z.string().min(1).optional(), groove: z.string().min(1).optional() }).optional(),
  ...conditionsShape,
  /** the coarse scan: 'grid' (points per variable) or 'lhs' (points in all) */
  scan: z.strictObject({ method: z.enum(['grid', 'lhs']).optional(), points: z.number().int({ error: 'expected a whole number of points' }).min(2, { error: 'expected at least 2 points' }).optional() }).optional(),
  /** scan points refined locally (the best ones that lie apart) */
  starts: z.number().int().min(1).max(10).optional(),
  /** refinement stops when the search moves less than this fraction of each variable's range */
  xTolerance: z.number().gt(0).max(0.1).optional(),
  /** most solves (one solve = one candidate at one wavelength and angle, TE and TM) */
  maxSolves: z.number().int().min(1).max(10_000_000).optional(),
  /** seed of the Latin-hypercube scan */
  seed: z.number().int().min(0).max(MAX_SEED).optional(),
  /** wavelengths of the curves reported at the optimum (default: across the band, or ±10 % around a single wavelength) */
  curve: BandSchema.optional(),
});
export type OptimizeSpec = z.input<typeof OptimizeSpecSchema>;

// ---------------------------------------------------------------------------------------------
// results

/** One variable at the optimum. */
export interface OptimizedVariable {
  readonly path: string;
  /** 'nm', 'um', 'deg' or null (unitless) */
  readonly unit: string | null;
  readonly min: number;
  readonly max: number;
  readonly value: number;
  /** the design's own value, when it gives one */
  readonly nominal: number | null;
}

/** A quantity's value at a point. */
export interface QuantityValue {
  readonly description: string;
  readonly value: number | null;
}

/** Efficiency over wavelength at the optimum, for one angle condition. */
export interface OptimumCurve {
  /** the angle condition: a fixed angle, the design's, or the mount */
  readonly angle: string;
  readonly wavelengthsNm: ReadonlyArray<number>;
  /** the objective's orders and side, TE and TM (null where the solve failed) */
  readonly te: ReadonlyArray<number | null>;
  readonly tm: ReadonlyArray<number | null>;
}

/** What {@link optimize} returns. */
export interface OptimizeResult {
  readonly variables: ReadonlyArray<OptimizedVariable>;
  readonly objective: QuantityValue & { readonly goal: 'maximize' | 'minimize' | { readonly target: number } };
  readonly constraints: ReadonlyArray<QuantityValue & { readonly min: number | null; readonly max: number | null; readonly met: boolean }>;
  /** ridge and groove widths (µm) at the optimum, when minFeature is given */
  readonly feature: { readonly ridgeUm: number; readonly grooveUm: number; readonly minRidgeUm: number | null; readonly minGrooveUm: number | null; readonly met: boolean } | null;
  /** every constraint met */
  readonly feasible: boolean;
  /** the objective at the design as given (null when it does not give every variable or fails) */
  readonly nominalObjective: number | null;
  readonly conditions: string;
  readonly curves: ReadonlyArray<OptimumCurve>;
  readonly scan: { readonly method: 'grid' | 'lhs'; readonly points: number; readonly solves: number; readonly ran: string };
  readonly refine: {
    readonly method: 'brent' | 'nelder-mead';
    readonly starts: ReadonlyArray<{ readonly from: ReadonlyArray<number>; readonly to: ReadonlyArray<number>; readonly objective: number | null; readonly evaluations: number; readonly converged: boolean }>;
    readonly solves: number;
  };
  /** every solve of the run (scan, refinement, nominal and curves) */
  readonly solves: number;
  readonly seconds: number;
  readonly warnings: ReadonlyArray<string>;
  /** notes of the design at the optimum (slices, derived depth …) */
  readonly notes: ReadonlyArray<string>;
}

/** Options of {@link optimize}. */
export interface OptimizeOptions {
  /** reads CSV material tables named by the design */
  readonly readText?: ReadText;
  /** evaluates the coarse scan's plan, e.g. on a worker pool (default: in-process) */
  readonly scanRunner?: PlanRunner;
  /** said in the report of the scan, after it ran: how scanRunner ran (default 'in-process') */
  readonly scanRunnerName?: string | (() => string);
  /** the in-process evaluation context (default: a fresh one) */
  readonly context?: EvalContext;
}

/** Score of a candidate that could not be evaluated: below every other. */
const FAILED = -1e6;

interface Visit {
  readonly u: ReadonlyArray<number>;
  readonly x: ReadonlyArray<number>;
  readonly values: ReadonlyArray<number>;
  readonly feature: FeatureWidths | null;
  readonly violation: number;
  readonly feasible: boolean;
  readonly score: number;
  readonly error?: string;
}

const GRID_DEFAULT: Readonly<Record<number, number>> = { 1: 21, 2: 9, 3: 5, 4: 4 };

/**
 * Find the values of the variables that give the best objective under the constraints.
 *
 * @param design the design file's object ("sweep", "optimize" and "tolerance" sections are ignored)
 * @param spec the "optimize" section, or what the command line's flags built
 * @returns the best point, its objective and constraints, efficiency curves (TE, TM) at the
 *   optimum, the number of solves and the time
 * @throws {InputError} naming the field ('optimize.variables[0].max', 'optimize.band.from' …)
 *   for every problem of the section or a bound the design rejects
 * @example
 * const r = await optimize(design, {
 *   variables: [{ path: 'grating.depth', min: '100 nm', max: '400 nm' }],
 *   objective: { order: -1, side: 'R', polarization: 'TE' },
 *   mount: { kind: 'littrow', order: -1 },
 * });
 * r.variables[0].value; // depth in nm
 * r.objective.value;    // R(−1) TE at that depth
 */
export async function optimize(design: unknown, spec: unknown, options: OptimizeOptions = {}): Promise<OptimizeResult> {
  const t0 = performance.now();
  const parsed = OptimizeSpecSchema.safeParse(spec);
  if (!parsed.success) throw sectionError('optimize', parsed.error);
  const s = parsed.data;
  const readText = options.readText;
  const base = designOnly(design);
  const conditions = resolveConditions(s, 'optimize');
  if (s.curve) bandWavelengths(s.curve, 'optimize.curve');
  const k = s.variables.length;

  // variables
  const params: DesignParameter[] = [];
  const lo: number[] = [];
  const hi: number[] = [];
  s.variables.forEach((v, i) => {
    const at = `optimize.variables[${i}]`;
    const p = designParameter(base, v.path, `${at}.path`);
    const min = parameterValue(p, v.min, `${at}.min`);
    const max = parameterValue(p, v.max, `${at}.max`);
    if (!(max > min)) throw new InputError(`${at}.max`, `expected a bound above min (${showValue(p, min)}), found ${showValue(p, max)}`);
    checkValue(base, p, min, `${at}.min`, readText);
    checkValue(base, p, max, `${at}.max`, readText);
    params.push(p);
    lo.push(min);
    hi.push(max);
  });

  // constraints
  const constraints = (s.constraints ?? []).map((c, i) => {
    const at = `optimize.constraints[${i}]`;
    if (c.min === undefined && c.max === undefined) throw new InputError(at, 'give "min" and/or "max" (efficiencies, 0…1)');
    if (c.min !== undefined && c.max !== undefined && !(c.max >= c.min)) throw new InputError(`${at}.max`, `expected max ≥ min (${c.min}), found ${c.max}`);
    return c;
  });
  let minRidgeUm: number | null = null;
  let minGrooveUm: number | null = null;
  if (s.minFeature) {
    const f = s.minFeature;
    if (f.ridge === undefined && f.groove === undefined) throw new InputError('optimize.minFeature', 'give "ridge" and/or "groove", lengths with a unit such as "150 nm"');
    if (f.ridge !== undefined) minRidgeUm = positiveLength(f.ridge, 'optimize.minFeature.ridge');
    if (f.groove !== undefined) minGrooveUm = positiveLength(f.groove, 'optimize.minFeature.groove');
    const g = base.grating as { profile?: unknown } | undefined;
    if (featureWidths(base) === null) {
      throw new InputError('optimize.minFeature', `feature widths are defined for lamellar and trapezoid profiles; this design has ${g?.profile !== undefined ? `a ${JSON.stringify(g.profile)} profile` : 'no "grating"'}`);
    }
  }
  const quantities: Quantity[] = [s.objective, ...constraints];
  const goal = s.objective.goal;

  // the design's own values (null where it gives none): the plan is checked at them, since the
  // design is valid there, while a corner of the box may not be (the bounds are checked one by one)
  const nominal: Array<number | null> = params.map((p, i) => {
    try {
      return nominalValue(base, p, `optimize.variables[${i}].path`);
    } catch (e) {
      if (e instanceof InputError) return null;
      throw e;
    }
  });

  const ctx = options.context ?? createEvalContext();
  const run = inProcessRunner(readText, ctx);
  const scanRun = options.scanRunner ?? run;
  const ev = new DesignEvaluator(
    base,
    params,
    quantities,
    conditions,
    'optimize',
    s.variables.map((_, i) => `optimize.variables[${i}].path`),
    nominal.map((v, i) => v ?? lo[i]!),
    readText,
  );
  const nc = ev.conditionCount;
  const maxSolves = s.maxSolves ?? 5000;

  // scoring
  const goalValue = (v: number): number => (goal === 'maximize' ? v : goal === 'minimize' ? -v : -Math.abs(v - goal.target));
  const geometry = (x: ReadonlyArray<number>): { feature: FeatureWidths | null; violation: number } => {
    if (minRidgeUm === null && minGrooveUm === null) return { feature: null, violation: 0 };
    let feature: FeatureWidths | null = null;
    try {
      feature = featureWidths(withValues(base, params, x));
    } catch (e) {
      if (!(e instanceof InputError)) throw e;
    }
    if (feature === null) return { feature, violation: 0 };
    let violation = 0;
    if (minRidgeUm !== null) violation += Math.max(0, (minRidgeUm - feature.ridgeUm) / minRidgeUm);
    if (minGrooveUm !== null) violation += Math.max(0, (minGrooveUm - feature.grooveUm) / minGrooveUm);
    return { feature, violation };
  };
  const visit = (u: ReadonlyArray<number>, x: ReadonlyArray<number>, c: CandidateValues | null, geo: { feature: FeatureWidths | null; violation: number }): Visit => {
    let violation = geo.violation;
    if (c === null) return { u, x, values: quantities.map(() => Number.NaN), feature: geo.feature, violation, feasible: false, score: -2 - violation };
    if (c.error !== undefined) return { u, x, values: c.values, feature: geo.feature, violation, feasible: false, score: FAILED, error: c.error };
    constraints.forEach((q, i) => {
      const v = c.values[i + 1]!;
      if (q.min !== undefined) violation += Math.max(0, q.min - v);
      if (q.max !== undefined) violation += Math.max(0, v - q.max);
    });
    const feasible = violation <= 1e-12;
    return { u, x, values: c.values, feature: geo.feature, violation, feasible, score: feasible ? goalValue(c.values[0]!) : -2 - violation };
  };

  const memo = new Map<string, Visit>();
  const all: Visit[] = [];
  const toX = (u: ReadonlyArray<number>): number[] => u.map((ui, i) => (ui <= 0 ? lo[i]! : ui >= 1 ? hi[i]! : lo[i]! + ui * (hi[i]! - lo[i]!)));
  /** evaluate points given in [0, 1]^k; geometric violations skip the solve */
  const evaluate = async (us: ReadonlyArray<ReadonlyArray<number>>, runner: PlanRunner): Promise<Visit[]> => {
    const out: Array<Visit | null> = us.map(() => null);
    const todo: Array<{ i: number; u: ReadonlyArray<number>; x: number[]; geo: ReturnType<typeof geometry> }> = [];
    us.forEach((u, i) => {
      const x = toX(u);
      const key = x.join(',');
      const m = memo.get(key);
      if (m) {
        out[i] = m;
        return;
      }
      const geo = geometry(x);
      if (geo.violation > 0) {
        const v = visit(u, x, null, geo);
        memo.set(key, v);
        all.push(v);
        out[i] = v;
      } else if (!todo.some((t) => t.x.join(',') === key)) todo.push({ i, u, x, geo });
    });
    const results = await ev.evaluate(
      todo.map((t) => t.x),
      runner,
    );
    todo.forEach((t, j) => {
      const v = visit(t.u, t.x, results[j]!, t.geo);
      memo.set(t.x.join(','), v);
      all.push(v);
    });
    return us.map((u, i) => out[i] ?? memo.get(toX(u).join(','))!);
  };

  // coarse scan
  const method = s.scan?.method ?? (k <= 4 ? 'grid' : 'lhs');
  let points: number[][];
  let spacing: number;
  if (method === 'grid') {
    const n = s.scan?.points ?? GRID_DEFAULT[k] ?? 3;
    const total = n ** k;
    if (total > 100_000) throw new InputError('optimize.scan.points', `a grid of ${n} points per variable over ${k} variables has ${total} points; at most 100000 — use fewer points or "method": "lhs"`);
    points = [];
    for (let idx = 0; idx < total; idx++) {
      const u: number[] = [];
      let rest = idx;
      for (let d = k - 1; d >= 0; d--) {
        u[d] = (rest % n) / (n - 1);
        rest = Math.floor(rest / n);
      }
      points.push(u);
    }
    spacing = 1 / (n - 1);
  } else {
    const n = s.scan?.points ?? Math.max(10, 20 * k);
    if (n > 100_000) throw new InputError('optimize.scan.points', `${n} points; at most 100000`);
    points = latinHypercube(n, k, createRandom(s.seed ?? 1));
    spacing = n ** (-1 / k);
  }
  if (points.length * nc > maxSolves) {
    throw new InputError(s.maxSolves !== undefined ? 'optimize.maxSolves' : 'optimize.scan.points', `the scan alone needs ${points.length * nc} solves (${points.length} points × ${nc} conditions), above maxSolves ${maxSolves}; scan fewer points or raise maxSolves`);
  }
  const scanVisits = await evaluate(points, scanRun);
  const scanSolves = ev.solves;
  const scanRan = typeof options.scanRunnerName === 'function' ? options.scanRunnerName() : (options.scanRunnerName ?? 'in-process');

  // starts: the best local maxima of the scan (no scan point within 1.5 spacings scores higher:
  // on a grid, the point beats its whole neighbourhood), so each start is a separate basin
  const nStarts = s.starts ?? (k === 1 ? 3 : 2);
  const near = (a: Visit, b: Visit): boolean => Math.max(...a.u.map((ui, d) => Math.abs(ui - b.u[d]!))) <= 1.5 * spacing + 1e-12;
  const ranked = scanVisits.map((v, i) => ({ v, i })).sort((a, b) => b.v.score - a.v.score || a.i - b.i);
  const starts: Visit[] = [];
  for (const { v, i } of ranked) {
    if (starts.length >= nStarts || v.score <= FAILED) break;
    const peak = scanVisits.every((w, j) => j === i || !near(v, w) || w.score < v.score || (w.score === v.score && j > i));
    if (peak && starts.every((w) => !near(v, w))) starts.push(v);
  }

  // local refinement
  const xTol = s.xTolerance ?? 1e-3;
  const warnings: string[] = [];
  const refineStarts: Array<{ from: number[]; to: number[]; objective: number | null; evaluations: number; converged: boolean }> = [];
  const budgetEach = (): number => Math.max(1, Math.floor((maxSolves - ev.solves) / nc / Math.max(1, starts.length)));
  let stoppedByBudget = false;
  for (const st of starts) {
    const budget = budgetEach();
    if (maxSolves - ev.solves < nc) {
      stoppedByBudget = true;
      break;
    }
    const f = async (u: ReadonlyArray<number>): Promise<number> => -(await evaluate([u], run))[0]!.score;
    if (k === 1) {
      const a = Math.max(0, st.u[0]! - spacing);
      const b = Math.min(1, st.u[0]! + spacing);
      const r = await brentMinimize((x) => f([x]), a, b, { tolerance: xTol, maxEvaluations: budget, start: { x: st.u[0]!, f: -st.score } });
      const best = memo.get(toX([r.x]).join(','))!;
      refineStarts.push({ from: [...st.x], to: [...best.x], objective: finite(best.values[0]!), evaluations: r.evaluations, converged: r.converged });
      if (!r.converged) stoppedByBudget = true;
    } else {
      const r = await nelderMead(f, st.u, {
        lower: params.map(() => 0),
        upper: params.map(() => 1),
        step: params.map(() => spacing),
        xTolerance: xTol,
        fTolerance: 1e-7,
        maxEvaluations: budget,
        startValue: -st.score,
      });
      const best = memo.get(toX(r.x).join(','))!;
      refineStarts.push({ from: [...st.x], to: [...best.x], objective: finite(best.values[0]!), evaluations: r.evaluations, converged: r.converged });
      if (!r.converged) stoppedByBudget = true;
    }
  }
  const refineSolves = ev.solves - scanSolves;
  if (stoppedByBudget) warnings.push(`the refinement reached maxSolves (${maxSolves}) before converging; the optimum is approximate — raise maxSolves`);

  // the best point of the run
  let best = all[0]!;
  for (const v of all) if (v.score > best.score) best = v;
  if (best.score <= FAILED) {
    throw new InputError('optimize.variables', `no candidate could be evaluated; the first failure: ${best.error ?? 'unknown'}`);
  }
  if (!best.feasible) warnings.push('no candidate met every constraint; the point shown violates them least');
  params.forEach((p, i) => {
    const u = best.u[i]!;
    const at = u <= xTol ? 'lower' : u >= 1 - xTol ? 'upper' : null;
    if (at) warnings.push(`${p.path} is at its ${at} bound (${showValue(p, best.x[i]!)}): the optimum may lie beyond the range`);
  });

  // the design as given
  let nominalObjective: number | null = null;
  if (nominal.every((v) => v !== null)) {
    const [c] = await ev.evaluate([nominal as number[]], run);
    nominalObjective = finite(c!.values[0]!);
  }

  // curves at the optimum
  const atOptimum = withValues(base, params, best.x);
  const wlVar = params.findIndex((p) => p.field.quantity === 'incidence.wavelength');
  const curveNm = curveWavelengths(s.curve, conditions, wlVar >= 0 ? best.x[wlVar]! * (params[wlVar]!.unit === 'um' ? 1000 : 1) : designWavelengthNm(atOptimum));
  const curveEv = new DesignEvaluator(atOptimum, [], [s.objective], { wavelengthsNm: curveNm, anglesDeg: conditions.anglesDeg, mount: conditions.mount }, 'optimize', [], [], readText);
  const [cc] = await curveEv.evaluate([[]], run);
  const per = cc!.perCondition[0]!;
  const nAngles = conditions.anglesDeg?.length ?? 1;
  const angleLabel = (j: number): string =>
    conditions.mount.kind === 'littrow' ? `Littrow, order ${conditions.mount.order}` : conditions.mount.kind === 'deviation' ? `deviation ${conditions.mount.deviationDeg}°, order ${conditions.mount.order}` : conditions.anglesDeg ? `θ = ${conditions.anglesDeg[j]}°` : "the design's angle";
  const curves: OptimumCurve[] = Array.from({ length: nAngles }, (_, j) => ({
    angle: angleLabel(j),
    wavelengthsNm: curveNm,
    te: curveNm.map((_, w) => finite(per[w * nAngles + j]!.te)),
    tm: curveNm.map((_, w) => finite(per[w * nAngles + j]!.tm)),
  }));

  // the design's own warnings and notes at the optimum
  let notes: string[] = [];
  try {
    const p = problemAt(designToModel(atOptimum, readText));
    warnings.push(...p.warnings);
    notes = [...p.notes];
  } catch (e) {
    if (!(e instanceof InputError)) throw e;
  }

  return {
    variables: params.map((p, i) => ({ path: p.path, unit: p.unit, min: lo[i]!, max: hi[i]!, value: best.x[i]!, nominal: nominal[i]! })),
    objective: { description: describeQuantity(s.objective), value: finite(best.values[0]!), goal },
    constraints: constraints.map((q, i) => {
      const v = best.values[i + 1]!;
      const met = Number.isFinite(v) && (q.min === undefined || v >= q.min) && (q.max === undefined || v <= q.max);
      return { description: describeQuantity(q), value: finite(v), min: q.min ?? null, max: q.max ?? null, met };
    }),
    feature:
      s.minFeature && best.feature
        ? {
            ridgeUm: best.feature.ridgeUm,
            grooveUm: best.feature.grooveUm,
            minRidgeUm,
            minGrooveUm,
            met: (minRidgeUm === null || best.feature.ridgeUm >= minRidgeUm) && (minGrooveUm === null || best.feature.grooveUm >= minGrooveUm),
          }
        : null,
    feasible: best.feasible,
    nominalObjective,
    conditions: describeConditions(conditions),
    curves,
    scan: { method, points: points.length, solves: scanSolves, ran: scanRan },
    refine: { method: k === 1 ? 'brent' : 'nelder-mead', starts: refineStarts, solves: refineSolves },
    solves: ev.solves + curveEv.solves,
    seconds: (performance.now() - t0) / 1000,
    warnings: [...new Set(warnings)],
    notes,
  };
}

function finite(v: number): number | null {
  return Number.isFinite(v) ? v : null;
}

function positiveLength(text: string, at: string): number {
  const v = lengthUm(text, at);
  if (!(v > 0)) throw new InputError(at, `expected a width > 0, found "${text}"`);
  return v;
}

/** The design's wavelength in nm (its incidence as written). */
function designWavelengthNm(raw: Record<string, unknown>): number {
  const inc = raw.incidence as Record<string, unknown>;
  const t = inc.wavelength;
  if (typeof t === 'string') return lengthUm(t, 'incidence.wavelength') * 1000;
  if (typeof inc.wavelengthNm === 'number') return inc.wavelengthNm;
  return (inc.wavelengthUm as number) * 1000;
}

/** Wavelengths of the reported curves: as asked, across the band (21), or ±10 % around a single wavelength (21). */
function curveWavelengths(curve: z.output<typeof BandSchema> | undefined, c: Conditions, centreNm: number): number[] {
  if (curve) return bandWavelengths(curve, 'optimize.curve');
  const w = c.wavelengthsNm;
  let a: number;
  let b: number;
  if (w && w.length > 1) {
    a = Math.min(...w);
    b = Math.max(...w);
  } else {
    const l = w ? w[0]! : centreNm;
    a = 0.9 * l;
    b = 1.1 * l;
  }
  return Array.from({ length: 21 }, (_, i) => (i === 20 ? b : Number((a + ((b - a) * i) / 20).toPrecision(12))));
}
