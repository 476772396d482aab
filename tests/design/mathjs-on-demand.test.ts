/**
 * mathjs is loaded only when a design needs it: plain lengths ("350 nm") and the usual profiles
 * are read without it (a sweep worker thread then starts without its 0.6 s and 32 MB), an
 * expression profile or an unusual unit loads it on first use. This file runs in its own process
 * (vitest's forks pool), so nothing else has loaded it before.
 */
import { readFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { describe, expect, it } from 'vitest';
import { lengthUm } from '../../src/design/index.ts';
import { createEvalContext, evaluatePoint, planSweep } from '../../src/sweep/index.ts';
import { mathjsLoaded, profileFromExpression } from '../../src/structure/index.ts';

const examples = resolve(dirname(fileURLToPath(import.meta.url)), '../../src/design/examples');

describe('mathjs on demand', () => {
  it('a sweep point of the blazed example is evaluated without loading mathjs; an expression profile loads it', () => {
    const path = resolve(examples, 'blazed-aluminium-spectrometer.json');
    const readText = (f: string): string => readFileSync(resolve(examples, f), 'utf8');
    const plan = planSweep(JSON.parse(readFileSync(path, 'utf8')), { parameters: [{ path: 'incidence.wavelength', values: ['450 nm', '0.55 um'] }] }, readText);
    const row = evaluatePoint(plan, 1, createEvalContext(), readText);
    expect(row.status).toBe('ok');
    expect(lengthUm('632.8 nm', 'x')).toBe(0.6328);
    expect(mathjsLoaded()).toBe(false);
    const p = profileFromExpression({ periodUm: 1, expression: '0.1*(1 - cos(2*pi*x))', ridgeMaterial: 'R', grooveMaterial: 'G', slices: 4 });
    expect(p.depthUm).toBeCloseTo(0.2, 12); // max of 0.1·(1 − cos 2πx) at x = ½
    expect(mathjsLoaded()).toBe(true);
  });
});
