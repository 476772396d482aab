/**
 * Evaluating sweep points: one row per point, with the reuse that makes sweeps cheap. Each
 * worker keeps an {@link EvalContext}: design models by geometry (points that differ only in
 * wavelength, angle or polarization share one) and the solver's layer-mode cache (a layer's
 * eigenmodes depend on its permittivity profile, λ and the incidence, not on its thickness, so a
 * depth or thickness sweep solves each distinct layer profile once per wavelength and incidence).
 * Cached work is the same arithmetic as fresh work: rows equal single `solve()` calls of
 * `designAt`'s design to the last bit.
 */
import { type DesignModel, designToModel, parseIndexLiteral, problemAt, type Problem, type ReadText } from '../design/index.ts';
import { type Complex, ModeCache, solve, type Structure } from '../solver/index.ts';
import { isPointError, oneLine } from './errors.ts';
import { coverIndex, mountThetaDeg } from './mount.ts';
import { type OutputCell, outputCells, PointResults } from './outputs.ts';
import { geometryKey, modelInput, pointAt, rawPointDesign, readIncidence } from './point.ts';
import type { SweepPlan, SweepRow } from './types.ts';

/** Sizes of a context's caches. */
export interface EvalContextOptions {
  /** memory the layer-mode cache may hold, MB (default 256); it is sized at the first point from the retained orders */
  readonly modeCacheMB?: number;
  /** design models kept, least recently used dropped first (default 32) */
  readonly maxModels?: number;
}

/** Per-worker state of a sweep: caches and counters. Not shared between threads. */
export interface EvalContext {
  /** layer eigenmodes shared by every solve of this context; created at the first solve */
  modes: ModeCache | null;
  /** wavelength-independent design models (or the error building one) by geometry key */
  readonly models: Map<string, DesignModel | Error>;
  readonly options: Required<EvalContextOptions>;
  /** points evaluated, points failed, models built */
  readonly stats: { points: number; failed: number; modelsBuilt: number };
}

/**
 * A fresh context for one worker (or the main thread).
 * @param options cache sizes
 * @throws {RangeError} for a non-positive size
 * @example
 * const ctx = createEvalContext();
 * for (let i = 0; i < plan.count; i++) rows.push(evaluatePoint(plan, i, ctx));
 */
export function createEvalContext(options: EvalContextOptions = {}): EvalContext {
  const modeCacheMB = options.modeCacheMB ?? 256;
  const maxModels = options.maxModels ?? 32;
  if (!(modeCacheMB > 0)) throw new RangeError(`createEvalContext: modeCacheMB must be > 0, found ${modeCacheMB}`);
  if (!(Number.isInteger(maxModels) && maxModels >= 1)) throw new RangeError(`createEvalContext: maxModels must be a whole number ≥ 1, found ${maxModels}`);
  return { modes: null, models: new Map(), options: { modeCacheMB, maxModels }, stats: { points: 0, failed: 0, modelsBuilt: 0 } };
}

function modelFor(ctx: EvalContext, raw: Record<string, unknown>, readText: ReadText | undefined): DesignModel {
  const key = geometryKey(raw);
  let m = ctx.models.get(key);
  if (m !== undefined) {
    ctx.models.delete(key); // most recently used last
    ctx.models.set(key, m);
  } else {
    try {
      m = designToModel(modelInput(raw), readText);
    } catch (e) {
      if (!isPointError(e)) throw e;
      m = e;
    }
    ctx.stats.modelsBuilt++;
    ctx.models.set(key, m);
    if (ctx.models.size > ctx.options.maxModels) ctx.models.delete(ctx.models.keys().next().value!);
  }
  if (m instanceof Error) throw m;
  return m;
}

/** The context's mode cache, created at the first solve with as many entries as the budget holds. */
function modesFor(ctx: EvalContext, p: Problem): ModeCache {
  if (!ctx.modes) {
    const o = p.options.orders;
    const N = typeof o === 'number' ? 2 * o + 1 : o.max - o.min + 1;
    const n = p.incidence.phiDeg ? 2 * N : N;
    const bytes = 64 * n * n; // W, V and the LU factors of both: four n×n complex matrices
    const entries = Math.floor((ctx.options.modeCacheMB * 1024 * 1024) / bytes);
    ctx.modes = new ModeCache(Math.min(4096, Math.max(16, entries)));
  }
  return ctx.modes;
}

const cellCache = new WeakMap<SweepPlan, OutputCell[]>();
function cellsOf(plan: SweepPlan): OutputCell[] {
  let c = cellCache.get(plan);
  if (!c) {
    c = outputCells(plan.outputs, plan.orders);
    cellCache.set(plan, c);
  }
  return c;
}

/** A material reference of the design as the design reads it: 1.5 → "1.5", {n, k} → "n+ki". */
function materialText(v: unknown): string {
  if (typeof v === 'number') return String(v);
  if (typeof v === 'string') return v.trim();
  const o = v as { n: number; k?: number };
  const k = o.k ?? 0;
  return `${o.n}${k < 0 ? '-' : '+'}${Math.abs(k)}i`;
}

/**
 * A flat half-space of the reference material under the point's cover: the coating material,
 * else the ridge material, else the substrate.
 */
function flatStructure(raw: Record<string, unknown>, model: DesignModel, p: Problem): Structure {
  const g = raw.grating as { coating?: { material?: unknown }; ridge?: unknown } | undefined;
  const ref = materialText(g?.coating?.material ?? g?.ridge ?? raw.substrate);
  const n: Complex = parseIndexLiteral(ref) ?? model.library.evaluate(ref, p.incidence.wavelengthUm, { allowExtrapolation: model.allowExtrapolation }).index;
  return { periodUm: p.structure.periodUm, cover: p.structure.cover, substrate: n, layers: [] };
}

/**
 * Evaluate one point: its design, the mount's θ, the solve (and the flat reference for relative
 * efficiencies), and the row of cells aligned with `plan.columns`.
 *
 * Cells: the point index, the axes' values, θ (deg) under a Littrow or deviation mount, then the
 * outputs (see outputs.ts: an order that does not propagate has efficiency 0; a value that cannot
 * exist, such as the phase of an absent order, is ''), then status and error.
 *
 * @param index point index in [0, plan.count)
 * @param ctx this worker's caches
 * @param readText reads CSV material tables named by the design
 * @returns status 'ok', or 'failed' with the reason (input, material, mount or solver message)
 *   and '' in every output cell — a point's own failure never throws
 * @throws {RangeError} for an index outside the plan; anything else thrown is a bug
 * @example
 * const row = evaluatePoint(plan, 0, createEvalContext());
 * row.cells[plan.columns.indexOf('R_-1_TE')]; // efficiency of order −1, TE
 */
export function evaluatePoint(plan: SweepPlan, index: number, ctx: EvalContext, readText?: ReadText): SweepRow {
  const point = pointAt(plan, index);
  const outs = cellsOf(plan);
  const mounted = plan.mount.kind !== 'fixed';
  let theta: number | '' = '';
  ctx.stats.points++;
  const failed = (e: Error): SweepRow => {
    ctx.stats.failed++;
    const msg = oneLine(e);
    return { index, status: 'failed', cells: [index, ...point.values, ...(mounted ? [theta] : []), ...outs.map(() => ''), 'failed', msg], error: msg };
  };
  try {
    const raw = rawPointDesign(plan, point.values);
    const inc = readIncidence(raw);
    const model = modelFor(ctx, raw, readText);
    let thetaDeg = inc.thetaDeg;
    if (plan.mount.kind !== 'fixed') {
      thetaDeg = mountThetaDeg(plan.mount, inc.wavelengthUm, model.periodUm, coverIndex(model, inc.wavelengthUm).re);
      theta = thetaDeg;
    }
    const p = problemAt(model, inc.wavelengthUm, { ...inc, thetaDeg });
    const modes = modesFor(ctx, p);
    const result = solve(p.structure, p.incidence, p.options, modes);
    const flat = plan.outputs.relative ? solve(flatStructure(raw, model, p), p.incidence, p.options, modes) : undefined;
    const res = new PointResults(result, flat);
    const values = outs.map((c) => res.value(c));
    const bad = values.findIndex((v) => typeof v === 'number' && !Number.isFinite(v));
    if (bad >= 0) return failed(new Error(`the solver returned a non-finite value for ${plan.columns[plan.columns.length - 2 - outs.length + bad]}`));
    return { index, status: 'ok', cells: [index, ...point.values, ...(mounted ? [theta] : []), ...values, 'ok', ''] };
  } catch (e) {
    if (!isPointError(e)) throw e;
    return failed(e);
  }
}

/**
 * CSV text of one cell: finite numbers as the shortest text that reads back to the same double
 * (at most 17 significant digits); '' stays ''; text is quoted (with inner quotes doubled) when
 * it holds a comma, a quote, a line break or surrounding spaces.
 * @throws {RangeError} for NaN or ±Infinity (rows never hold them)
 * @example
 * formatCell(0.1 + 0.2); // '0.30000000000000004'
 * formatCell('');        // ''
 * formatCell('a, b');    // '"a, b"'
 */
export function formatCell(v: number | string): string {
  if (typeof v === 'number') {
    if (!Number.isFinite(v)) throw new RangeError(`formatCell: expected a finite number, found ${v}`);
    return String(v);
  }
  return /[",\r\n]|^\s|\s$/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}
