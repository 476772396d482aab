/**
 * Arbitrary profile from an expression in x (mathjs syntax): x is the position as a fraction of
 * the period in [0, 1), the value the height in µm (≥ 0); the profile repeats with the period, so
 * when h(1⁻) ≠ h(0) there is a vertical wall at x = 0. Only the variable x and mathjs's numeric
 * constants (pi, e, tau, …) may appear; the expression is compiled by mathjs, never eval'd.
 *
 * Numerics: the expression is sampled at 4096 equal steps; the surface crosses a slice's
 * mid-height between two samples of opposite sides and the crossing is then found by bisection to
 * 10⁻¹³ of the period. Features narrower than a step (Λ/4096) can be missed: a peak or dip that
 * crosses a level twice inside one step goes unseen. The highest and lowest points are refined by
 * golden-section search around the best samples. A coating over such a profile follows the
 * sampled polyline (chord error ≤ max|h''|·(Λ/4096)²/8).
 */
import type * as MathJs from 'mathjs';
import { profileFromSurface } from './fromSurface.ts';
import { mathjs } from './mathjs-access.ts';
import { mergeIntervals, type Interval } from './segments.ts';
import type { HeightProfile, ProfileResult, SlicedProfileParams } from './types.ts';
import { common, fail, num, record } from './validate.ts';

/** Samples per period. */
export const EXPRESSION_SAMPLES = 4096;
/** Bisection stops when the bracket is narrower than this (fraction of the period). */
export const CROSSING_TOLERANCE = 1e-13;

export interface ExpressionProfileParams extends SlicedProfileParams {
  /** height in µm as a function of x ∈ [0, 1) (fraction of the period), e.g. "0.1*(1 - cos(2*pi*x))" */
  readonly expression: string;
}

/**
 * Sliced profile h(x) from an expression.
 * @param p period (µm), expression, materials, slices, strategy
 * @returns slices top first; depth = the highest value (µm)
 * @throws {StructureError} when the expression fails to parse, uses a variable other than x,
 *   assigns, or gives a negative, non-finite or non-real height (the message says at which x),
 *   or is zero everywhere
 * @example
 * profileFromExpression({ periodUm: 1, expression: '0.15*(1 - cos(2*pi*x))', ridgeMaterial: 'resist', grooveMaterial: 'air', slices: 12 });
 */
export function profileFromExpression(p: ExpressionProfileParams): ProfileResult {
  const r = record('expression', p);
  const c = common('expression', r);
  const text = r.expression;
  if (typeof text !== 'string' || text.trim() === '') fail('expression.expression', 'an expression in x (mathjs syntax)', text);
  const math = mathjs();
  let node: MathJs.MathNode;
  try {
    node = math.parse(text);
  } catch (e) {
    fail('expression.expression', 'an expression in x (mathjs syntax)', `"${text}" (${(e as Error).message})`);
  }
  const others = new Set<string>();
  let assigns = false;
  node.traverse((n, path) => {
    if (n.type === 'AssignmentNode' || n.type === 'FunctionAssignmentNode' || n.type === 'BlockNode') assigns = true;
    if (n.type === 'SymbolNode' && path !== 'fn') {
      const name = (n as MathJs.SymbolNode).name;
      if (name !== 'x' && typeof (math as unknown as Record<string, unknown>)[name] !== 'number') others.add(name);
    }
  });
  if (assigns) fail('expression.expression', 'a single expression (no assignments or ";")', `"${text}"`);
  if (others.size > 0) fail('expression.expression', 'an expression in the single variable x', `"${text}" using ${[...others].join(', ')}`);
  const compiled = node.compile();
  const h = (x: number): number => {
    let v: unknown;
    try {
      v = compiled.evaluate({ x });
    } catch (e) {
      fail('expression.expression', 'an expression that evaluates to a height', `"${text}" failing at x = ${num(x)} (${(e as Error).message})`);
    }
    if (typeof v !== 'number' || !Number.isFinite(v)) fail('expression.expression', 'a finite real height in µm at every x in [0, 1)', `${formatValue(v)} at x = ${num(x)}`);
    if (v < 0) fail('expression.expression', 'a height ≥ 0 µm at every x in [0, 1)', `${num(v)} at x = ${num(x)}`);
    return v;
  };
  const surface = sampledSurface(c.periodUm, h);
  if (!(surface.maxUm > 0)) fail('expression.expression', 'a height > 0 µm somewhere', `"${text}" = 0 everywhere`);
  return profileFromSurface(surface, c, [
    `expression profile: depth ${num(surface.maxUm)} µm, sampled at ${EXPRESSION_SAMPLES} steps per period, crossings to ${CROSSING_TOLERANCE} of the period`,
  ]);
}

/** A surface known only through h(x) (x fraction of the period): sampled, crossings root-found. */
function sampledSurface(L: number, h: (x: number) => number): HeightProfile {
  const N = EXPRESSION_SAMPLES;
  // samples on [0, 1); the closing sample is h(0) again (the surface repeats), so a profile whose
  // h(1⁻) differs from h(0) has a vertical wall at the seam
  const s = new Float64Array(N + 1);
  for (let i = 0; i < N; i++) s[i] = h(i / N);
  s[N] = s[0]!;
  const refine = (sign: 1 | -1): number => {
    let best = 0;
    for (let i = 1; i < N; i++) if (sign * s[i]! > sign * s[best]!) best = i;
    let a = Math.max(0, best - 1) / N;
    let b = Math.min(N, best + 1) / N;
    const g = (Math.sqrt(5) - 1) / 2;
    let x1 = b - g * (b - a);
    let x2 = a + g * (b - a);
    let f1 = sign * h(x1);
    let f2 = sign * h(x2);
    for (let k = 0; k < 60 && b - a > 1e-15; k++) {
      if (f1 > f2) {
        b = x2;
        x2 = x1;
        f2 = f1;
        x1 = b - g * (b - a);
        f1 = sign * h(x1);
      } else {
        a = x1;
        x1 = x2;
        f1 = f2;
        x2 = a + g * (b - a);
        f2 = sign * h(x2);
      }
    }
    return sign * Math.max(sign * s[best]!, f1, f2);
  };
  const max = refine(1);
  const min = refine(-1);
  const levels = new Set<number>();
  for (let i = 0; i + 2 <= N; i++) {
    const v = s[i]!;
    if (v === s[i + 1] && v === s[i + 2] && v > 0 && v < max) levels.add(v);
  }
  if (min > 0 && min < max) levels.add(min);
  const crossing = (a: number, b: number, z: number, upAtA: boolean): number => {
    while (b - a > CROSSING_TOLERANCE) {
      const m = 0.5 * (a + b);
      if (m <= a || m >= b) break;
      if (h(m) > z === upAtA) a = m;
      else b = m;
    }
    return 0.5 * (a + b);
  };
  return {
    periodUm: L,
    minUm: min,
    maxUm: max,
    levelsUm: [...levels].sort((a, b) => a - b),
    exact: false,
    above(z) {
      const out: Interval[] = [];
      let start = s[0]! > z ? 0 : -1;
      for (let i = 0; i < N; i++) {
        const up0 = s[i]! > z;
        const up1 = s[i + 1]! > z;
        if (up0 === up1) continue;
        const x = crossing(i / N, (i + 1) / N, z, up0);
        if (up1) start = x;
        else {
          out.push([start, x]);
          start = -1;
        }
      }
      if (start >= 0) out.push([start, 1]);
      return mergeIntervals(out);
    },
    heightAt: (x) => h(x - Math.floor(x)),
    vertices() {
      const v: Array<[number, number]> = [];
      for (let i = 0; i <= N; i++) v.push([(i / N) * L, s[i]!]);
      return v;
    },
  };
}

function formatValue(v: unknown): string {
  try {
    return mathjs().format(v as MathJs.MathType);
  } catch {
    return String(v);
  }
}
