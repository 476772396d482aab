/**
 * Fabrication tolerances: how much efficiency a design loses when its depth, duty cycle,
 * sidewall, period or coating come out off nominal.
 *
 * A Monte Carlo run draws every toleranced parameter independently — uniform on nominal ± d, or
 * normal with standard deviation σ — evaluates the target efficiency of each sample and reports
 * its mean, standard deviation, 5th/50th/95th percentiles and the yield against a spec (η ≥ spec).
 * One-at-a-time sensitivities ∂η/∂p come from central differences at the nominal design,
 * (η(p + h) − η(p − h)) / 2h, with the step h stated in the result.
 *
 * Reproducible: samples are drawn on the calling thread from one seeded stream (random.ts) in a
 * fixed order (sample by sample, parameters in the order given), and every sample's efficiency
 * is a deterministic solve, so the same seed gives identical numbers whether the samples run
 * in-process or on any number of worker threads.
 */
import { z } from 'zod';
import { InputError, type ReadText } from '../design/index.ts';
import { createEvalContext, type EvalContext } from '../sweep/index.ts';
import {
  conditionsShape,
  DesignEvaluator,
  type DesignParameter,
  designOnly,
  designParameter,
  describeConditions,
  describeQuantity,
  FieldValueSchema,
  inProcessRunner,
  nominalValue,
  parameterValue,
  type PlanRunner,
  QuantitySchema,
  resolveConditions,
  sectionError,
  showValue,
} from './objective.ts';
import { createRandom, MAX_SEED } from './random.ts';

// ---------------------------------------------------------------------------------------------
// the generic machinery

/** How one parameter scatters around its nominal value. */
export type Distribution =
  /** uniform on [nominal − halfWidth, nominal + halfWidth] */
  | { readonly kind: 'uniform'; readonly halfWidth: number }
  /** normal with mean nominal and standard deviation sigma */
  | { readonly kind: 'normal'; readonly sigma: number };

/** Evaluates a figure of merit at many points (parameter vectors); NaN for a point that fails. */
export type EvaluateMany = (points: ReadonlyArray<ReadonlyArray<number>>) => Promise<ReadonlyArray<number>>;

/**
 * Draw Monte Carlo samples: sample by sample, each parameter in order, one uniform (uniform
 * distributions) or one Box–Muller normal (two uniforms) per parameter from the seeded stream.
 * A zero half-width or σ gives the nominal value exactly.
 * @param seed whole number 0 … 2^32 − 1
 * @throws {RangeError} for mismatched lengths, a negative width, a non-whole sample count or a bad seed
 * @example
 * drawSamples([100], [{ kind: 'uniform', halfWidth: 5 }], 3, 1); // [[x1], [x2], [x3]], 95 ≤ xi < 105
 */
export function drawSamples(nominal: ReadonlyArray<number>, distributions: ReadonlyArray<Distribution>, samples: number, seed: number): number[][] {
  if (nominal.length !== distributions.length) throw new RangeError(`drawSamples: ${nominal.length} nominal values for ${distributions.length} distributions`);
  if (!(Number.isInteger(samples) && samples >= 1)) throw new RangeError(`drawSamples: samples must be a whole number ≥ 1, found ${samples}`);
  distributions.forEach((d, j) => {
    const w = d.kind === 'uniform' ? d.halfWidth : d.sigma;
    if (!(w >= 0 && Number.isFinite(w))) throw new RangeError(`drawSamples: the width of parameter ${j} must be ≥ 0, found ${w}`);
  });
  const rng = createRandom(seed);
  const out: number[][] = [];
  for (let s = 0; s < samples; s++) {
    out.push(
      distributions.map((d, j) => {
        const x0 = nominal[j]!;
        if (d.kind === 'uniform') {
          const u = rng.uniform();
          return d.halfWidth === 0 ? x0 : x0 + d.halfWidth * (2 * u - 1);
        }
        const z = rng.normal();
        return d.sigma === 0 ? x0 : x0 + d.sigma * z;
      }),
    );
  }
  return out;
}

/**
 * The p-quantile of sorted values by linear interpolation between order statistics, h = (n − 1)p
 * (Hyndman & Fan, Am. Stat. 50 (1996) 361, definition 7 — the default of R and NumPy).
 * @param sorted values in ascending order (at least one)
 * @param p probability in [0, 1]
 * @throws {RangeError} for an empty list or p outside [0, 1]
 * @example
 * percentile([1, 2, 3, 4], 0.5); // 2.5
 */
export function percentile(sorted: ReadonlyArray<number>, p: number): number {
  const n = sorted.length;
  if (n === 0) throw new RangeError('percentile: no values');
  if (!(p >= 0 && p <= 1)) throw new RangeError(`percentile: p must be in [0, 1], found ${p}`);
  const h = (n - 1) * p;
  const lo = Math.floor(h);
  const hi = Math.min(n - 1, lo + 1);
  return sorted[lo]! + (h - lo) * (sorted[hi]! - sorted[lo]!);
}

/** Summary of a Monte Carlo distribution. */
export interface Distribution1D {
  /** samples that gave a value */
  readonly count: number;
  readonly mean: number;
  /** sample standard deviation (n − 1 in the denominator; 0 for one sample) */
  readonly std: number;
  readonly min: number;
  readonly p5: number;
  readonly p50: number;
  readonly p95: number;
  readonly max: number;
}

/**
 * Mean, standard deviation, extremes and 5th/50th/95th percentiles of the finite values.
 * @throws {RangeError} when no value is finite
 * @example
 * summarize([1, 2, 3]).mean; // 2
 */
export function summarize(values: ReadonlyArray<number>): Distribution1D {
  const v = values.filter((x) => Number.isFinite(x));
  if (v.length === 0) throw new RangeError('summarize: no finite values');
  const sorted = [...v].sort((a, b) => a - b);
  const n = v.length;
  // shifted by the first value: equal values give exactly that value and a zero deviation
  const x0 = v[0]!;
  const mean = x0 + v.reduce((s, x) => s + (x - x0), 0) / n;
  const std = n > 1 ? Math.sqrt(v.reduce((s, x) => s + (x - mean) ** 2, 0) / (n - 1)) : 0;
  return { count: n, mean, std, min: sorted[0]!, p5: percentile(sorted, 0.05), p50: percentile(sorted, 0.5), p95: percentile(sorted, 0.95), max: sorted[n - 1]! };
}

/** A central-difference sensitivity. */
export interface Sensitivity {
  /** the step h (parameter unit) */
  readonly step: number;
  /** η(p + h) and η(p − h) */
  readonly plus: number;
  readonly minus: number;
  /** (η(p + h) − η(p − h)) / 2h, per parameter unit; NaN when a side failed */
  readonly derivative: number;
}

/**
 * One-at-a-time sensitivities by central differences: all 2·n displaced points in one call of
 * `evaluate` (parameter j + step, then − step, in parameter order).
 * @throws {RangeError} for mismatched lengths or a step that is not > 0
 * @example
 * const [s] = await sensitivities(async (ps) => ps.map(([x]) => 3 * x!), [1], [0.1]);
 * s.derivative; // 3
 */
export async function sensitivities(evaluate: EvaluateMany, nominal: ReadonlyArray<number>, steps: ReadonlyArray<number>): Promise<Sensitivity[]> {
  if (nominal.length !== steps.length) throw new RangeError(`sensitivities: ${nominal.length} nominal values for ${steps.length} steps`);
  steps.forEach((h, j) => {
    if (!(h > 0 && Number.isFinite(h))) throw new RangeError(`sensitivities: the step of parameter ${j} must be > 0, found ${h}`);
  });
  const pts: number[][] = [];
  nominal.forEach((_, j) => {
    for (const sign of [1, -1]) {
      const p = [...nominal];
      p[j] = nominal[j]! + sign * steps[j]!;
      pts.push(p);
    }
  });
  const v = await evaluate(pts);
  return nominal.map((_, j) => {
    const plus = v[2 * j]!;
    const minus = v[2 * j + 1]!;
    // the actual displacement, in case nominal ± h rounds
    const span = nominal[j]! + steps[j]! - (nominal[j]! - steps[j]!);
    return { step: steps[j]!, plus, minus, derivative: (plus - minus) / span };
  });
}

/** Result of {@link monteCarlo}. */
export interface MonteCarloResult {
  readonly samples: ReadonlyArray<ReadonlyArray<number>>;
  /** one value per sample (NaN where it failed) */
  readonly values: ReadonlyArray<number>;
  /** over the samples that gave a value; null when none did */
  readonly stats: Distribution1D | null;
  /** fraction of all samples with value ≥ spec (failed samples count as not meeting it); null without a spec */
  readonly yield: number | null;
  /** samples that gave no value */
  readonly failed: number;
}

/**
 * A Monte Carlo run of any figure of merit: draw, evaluate (one call for all samples),
 * summarize, and the yield against a spec.
 * @throws {RangeError} as {@link drawSamples}
 * @example
 * const r = await monteCarlo({ nominal: [0], distributions: [{ kind: 'normal', sigma: 1 }], samples: 1000, seed: 1,
 *   evaluate: async (ps) => ps.map(([x]) => x!), spec: 0 });
 * r.stats!.mean; // ≈ 0;  r.yield ≈ 0.5
 */
export async function monteCarlo(o: {
  readonly nominal: ReadonlyArray<number>;
  readonly distributions: ReadonlyArray<Distribution>;
  readonly samples: number;
  readonly seed: number;
  readonly evaluate: EvaluateMany;
  readonly spec?: number;
}): Promise<MonteCarloResult> {
  const samples = drawSamples(o.nominal, o.distributions, o.samples, o.seed);
  const values = await o.evaluate(samples);
  if (values.length !== samples.length) throw new RangeError(`monteCarlo: ${values.length} values for ${samples.length} samples`);
  const failed = values.filter((v) => !Number.isFinite(v)).length;
  const stats = failed === values.length ? null : summarize(values);
  const y = o.spec === undefined ? null : values.filter((v) => Number.isFinite(v) && v >= o.spec!).length / values.length;
  return { samples, values, stats, yield: y, failed };
}

// ---------------------------------------------------------------------------------------------
// the "tolerance" section

const ParameterSchema = z.strictObject({
  /** design field, dotted: 'grating.depth', 'grating.duty', 'grating.sidewallDeg', 'period', 'grating.coating.thickness' */
  path: z.string().min(1, { error: 'give the design field, e.g. "grating.depth"' }),
  /** uniform on nominal ± this (lengths with a unit: "10 nm") */
  plusMinus: FieldValueSchema.optional(),
  /** normal with this standard deviation */
  sigma: FieldValueSchema.optional(),
  /** step of the central difference (default: a tenth of plusMinus or sigma) */
  step: FieldValueSchema.optional(),
});

/**
 * Rules of the "tolerance" section (zod, strict). Meaning (paths, units, nominal values) is
 * checked by {@link toleranceAnalysis}.
 * @example
 * ToleranceSpecSchema.parse({ efficiency: { order: -1, side: 'R' }, parameters: [{ path: 'grating.depth', plusMinus: '10 nm' }] });
 */
export const ToleranceSpecSchema = z.strictObject({
  /** the efficiency whose distribution is wanted */
  efficiency: QuantitySchema,
  parameters: z.array(ParameterSchema).min(1, { error: 'give at least one toleranced parameter' }).max(32, { error: 'at most 32 parameters' }),
  ...conditionsShape,
  /** Monte Carlo samples (default 200) */
  samples: z.number().int({ error: 'expected a whole number of samples' }).min(1).max(1_000_000).optional(),
  /** seed of the random stream (default 1) */
  seed: z.number().int({ error: 'expected a whole number' }).min(0).max(MAX_SEED).optional(),
  /** the efficiency a part must reach: the yield is the fraction of samples with η ≥ spec */
  spec: z.number().optional(),
});
export type ToleranceSpec = z.input<typeof ToleranceSpecSchema>;

/** One toleranced parameter in the result. */
export interface ToleranceParameter {
  readonly path: string;
  /** 'nm', 'um', 'deg' or null */
  readonly unit: string | null;
  readonly nominal: number;
  readonly distribution: Distribution;
  /** central-difference sensitivity at the nominal design */
  readonly sensitivity: Sensitivity;
  /** derivative × (half-width or σ): first-order change of η over the tolerance (NaN when the derivative is) */
  readonly swing: number;
}

/** What {@link toleranceAnalysis} returns. */
export interface ToleranceResult {
  readonly efficiency: string;
  readonly conditions: string;
  /** η of the nominal design */
  readonly nominal: number;
  readonly parameters: ReadonlyArray<ToleranceParameter>;
  readonly samples: number;
  readonly seed: number;
  readonly stats: Distribution1D | null;
  readonly spec: number | null;
  readonly yield: number | null;
  readonly failed: number;
  /** the first few failure reasons */
  readonly failures: ReadonlyArray<string>;
  /** each sample's parameter values and η (null where it failed) */
  readonly draws: ReadonlyArray<{ readonly values: ReadonlyArray<number>; readonly efficiency: number | null }>;
  readonly solves: number;
  readonly seconds: number;
}

/** Options of {@link toleranceAnalysis}. */
export interface ToleranceOptions {
  readonly readText?: ReadText;
  /** evaluates the Monte Carlo plan, e.g. on a worker pool (default: in-process) */
  readonly runner?: PlanRunner;
  /** the in-process evaluation context (nominal and sensitivities; default: a fresh one) */
  readonly context?: EvalContext;
}

/** Default difference steps for a parameter toleranced at zero: 1 nm, 0.1°, 0.001. */
function zeroStep(p: DesignParameter): number {
  return p.unit === 'nm' ? 1 : p.unit === 'um' ? 0.001 : p.unit === 'deg' ? 0.1 : 0.001;
}

/**
 * Monte Carlo tolerance analysis of a design: distribution of the target efficiency, yield
 * against a spec, and one-at-a-time sensitivities.
 * @param design the design file's object ("sweep", "optimize" and "tolerance" sections are ignored)
 * @param spec the "tolerance" section, or what the command line's flags built
 * @throws {InputError} naming the field ('tolerance.parameters[1].sigma' …), or when the nominal
 *   design cannot be evaluated
 * @example
 * const r = await toleranceAnalysis(design, {
 *   efficiency: { order: -1, side: 'R', polarization: 'TE' },
 *   parameters: [{ path: 'grating.depth', plusMinus: '10 nm' }, { path: 'grating.duty', sigma: 0.02 }],
 *   samples: 500, seed: 7, spec: 0.9,
 * });
 * r.stats?.p5;                          // 5th percentile of η
 * r.yield;                              // fraction with η ≥ 0.9
 * r.parameters[0].sensitivity.derivative; // ∂η/∂depth per nm
 */
export async function toleranceAnalysis(design: unknown, spec: unknown, options: ToleranceOptions = {}): Promise<ToleranceResult> {
  const t0 = performance.now();
  const parsed = ToleranceSpecSchema.safeParse(spec);
  if (!parsed.success) throw sectionError('tolerance', parsed.error);
  const s = parsed.data;
  const readText = options.readText;
  const base = designOnly(design);
  const conditions = resolveConditions(s, 'tolerance');

  const params: DesignParameter[] = [];
  const nominal: number[] = [];
  const dists: Distribution[] = [];
  const steps: number[] = [];
  s.parameters.forEach((q, i) => {
    const at = `tolerance.parameters[${i}]`;
    const p = designParameter(base, q.path, `${at}.path`);
    if ((q.plusMinus === undefined) === (q.sigma === undefined)) throw new InputError(at, 'give "plusMinus" (uniform on nominal ± value) or "sigma" (normal), exactly one');
    const w = parameterValue(p, (q.plusMinus ?? q.sigma)!, `${at}.${q.plusMinus !== undefined ? 'plusMinus' : 'sigma'}`);
    if (!(w >= 0)) throw new InputError(`${at}.${q.plusMinus !== undefined ? 'plusMinus' : 'sigma'}`, `expected a width ≥ 0, found ${showValue(p, w)}`);
    const h = q.step !== undefined ? parameterValue(p, q.step, `${at}.step`) : w > 0 ? w / 10 : zeroStep(p);
    if (!(h > 0)) throw new InputError(`${at}.step`, `expected a step > 0, found ${showValue(p, h)}`);
    params.push(p);
    nominal.push(nominalValue(base, p, `${at}.path`));
    dists.push(q.plusMinus !== undefined ? { kind: 'uniform', halfWidth: w } : { kind: 'normal', sigma: w });
    steps.push(h);
  });

  const ev = new DesignEvaluator(
    base,
    params,
    [s.efficiency],
    conditions,
    'tolerance',
    s.parameters.map((_, i) => `tolerance.parameters[${i}].path`),
    nominal,
    readText,
  );
  const run = inProcessRunner(readText, options.context ?? createEvalContext());
  const failures: string[] = [];
  const evaluateWith =
    (runner: PlanRunner): EvaluateMany =>
    async (pts) => {
      const res = await ev.evaluate(pts, runner);
      return res.map((c) => {
        if (c.error !== undefined && failures.length < 5 && !failures.includes(c.error)) failures.push(c.error);
        return c.values[0]!;
      });
    };

  const [eta0] = await evaluateWith(run)([nominal]);
  if (!Number.isFinite(eta0)) throw new InputError('tolerance', `the nominal design cannot be evaluated: ${failures[0] ?? 'no value'}`);
  failures.length = 0;
  const sens = await sensitivities(evaluateWith(run), nominal, steps);
  const samples = s.samples ?? 200;
  const seed = s.seed ?? 1;
  const mc = await monteCarlo({ nominal, distributions: dists, samples, seed, evaluate: evaluateWith(options.runner ?? run), ...(s.spec !== undefined ? { spec: s.spec } : {}) });

  return {
    efficiency: describeQuantity(s.efficiency),
    conditions: describeConditions(conditions),
    nominal: eta0!,
    parameters: params.map((p, j) => {
      const d = dists[j]!;
      return { path: p.path, unit: p.unit, nominal: nominal[j]!, distribution: d, sensitivity: sens[j]!, swing: sens[j]!.derivative * (d.kind === 'uniform' ? d.halfWidth : d.sigma) };
    }),
    samples,
    seed,
    stats: mc.stats,
    spec: s.spec ?? null,
    yield: mc.yield,
    failed: mc.failed,
    failures,
    draws: mc.samples.map((v, i) => ({ values: v, efficiency: Number.isFinite(mc.values[i]!) ? mc.values[i]! : null })),
    solves: ev.solves,
    seconds: (performance.now() - t0) / 1000,
  };
}
