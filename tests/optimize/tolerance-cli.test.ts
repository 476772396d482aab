/**
 * `furrow tolerance` on the command line: report, JSON, reproducibility (also across worker
 * counts, in a separate process as a user runs it), and one clear line for bad input.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseToleranceFlag } from '../../src/cli/tolerance.ts';
import { cli, cliProcess } from '../cli/run-cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'furrow-tolerance-'));
const design = join(dir, 'binary.json');
writeFileSync(
  design,
  JSON.stringify({
    title: 'binary phase grating',
    periodUm: 10,
    cover: 'air',
    substrate: 1.5,
    grating: { profile: 'lamellar', duty: 0.5, depth: '950 nm', ridge: 1.5 },
    incidence: { wavelength: '1000 nm', angleDeg: 0 },
    orders: 12,
    tolerance: { efficiency: { order: 1, side: 'T', polarization: 'TE' }, parameters: [{ path: 'grating.depth', plusMinus: '20 nm' }], samples: 40, spec: 0.38 },
  }),
);
const args = ['tolerance', design, '--param', 'grating.depth=±20nm', '--param', 'grating.duty=sigma:0.01:step=0.002', '--samples', '40', '--seed', '9', '--spec', '0.38'];

/** JSON result without what may differ between equal runs (time, how it ran). */
const numbers = (text: string): unknown => {
  const j = JSON.parse(text);
  delete j.seconds;
  delete j.ran;
  return j;
};

describe('furrow tolerance', () => {
  it('prints the nominal, sensitivities, the distribution and the yield', async () => {
    const r = await cli([...args, '--workers', '1']);
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/nominal\s+η = 0\.\d{6}/);
    expect(r.text).toMatch(/grating\.depth\s+950 nm\s+uniform ± 20 nm\s+\S+ \/nm\s+2 nm/);
    expect(r.text).toMatch(/grating\.duty\s+0\.5\s+normal σ 0\.01\s+\S+ \/1\s+0\.002/);
    expect(r.text).toMatch(/Monte Carlo\s+40 samples, seed 9 \(in-process\)/);
    expect(r.text).toMatch(/5 % 0\.\d{6}\s+50 % 0\.\d{6}\s+95 % 0\.\d{6}/);
    expect(r.text).toMatch(/yield \d+\.\d % with η ≥ 0\.38/);
  });

  it("uses the design file's section when no flag replaces it, and gives the same numbers for the same seed", async () => {
    const a = await cli(['tolerance', design, '--workers', '1', '--json']);
    const b = await cli(['tolerance', design, '--workers', '1', '--json']);
    expect(a.code).toBe(0);
    const j = JSON.parse(a.text);
    expect(j.parameters.map((p: { path: string }) => p.path)).toEqual(['grating.depth']);
    expect(j.draws).toHaveLength(40);
    expect(j.spec).toBe(0.38);
    expect(numbers(b.text)).toEqual(numbers(a.text));
  });

  it('gives identical numbers on one and on two worker threads', () => {
    // FURROW_POOL_WORTH_MS=0: send even this small job to the threads (a test hook)
    const one = cliProcess([...args, '--workers', '1', '--json']);
    const two = cliProcess([...args, '--workers', '2', '--json'], { FURROW_POOL_WORTH_MS: '0' });
    expect(one.code).toBe(0);
    expect(two.code).toBe(0);
    expect(JSON.parse(two.text).ran).toMatch(/^in-process, then 2 worker threads for \d+ solves$/);
    expect(JSON.parse(one.text).ran).toBe('in-process');
    expect(numbers(two.text)).toEqual(numbers(one.text));
  });

  it('reads toleranced-parameter flags', () => {
    expect(parseToleranceFlag('grating.depth=±10nm')).toEqual({ path: 'grating.depth', plusMinus: '10nm' });
    expect(parseToleranceFlag('grating.depth=+-10nm:step=1nm')).toEqual({ path: 'grating.depth', plusMinus: '10nm', step: '1nm' });
    expect(parseToleranceFlag('grating.duty=sigma:0.02')).toEqual({ path: 'grating.duty', sigma: 0.02 });
  });

  const bad: Array<[string, string[], RegExp]> = [
    ['a parameter without a distribution', ['--param', 'grating.depth=10nm'], /^furrow: --param: expected PATH=±D \(uniform\), PATH=sigma:S \(normal\)/],
    ['a bad sample count', ['--samples', '0'], /^furrow: --samples: expected a whole number 1…1000000, found "0"$/],
    ['a bad spec', ['--spec', 'high'], /^furrow: --spec: expected an efficiency such as 0\.85, found "high"$/],
    ['an unknown path', ['--param', 'grating.dpeth=±5nm'], /^furrow: invalid design — tolerance\.parameters\[0\]\.path: 'grating\.dpeth' is not a field of this design; did you mean 'grating\.depth'/],
    ['a --littrow with --deviation', ['--littrow', '-1', '--deviation', '-1:20'], /^furrow: --deviation: give --littrow or --deviation, not both$/],
  ];
  for (const [what, extra, re] of bad) {
    it(`answers ${what} with one line and exit code 2`, async () => {
      const r = await cli(['tolerance', design, ...extra]);
      expect(r.code).toBe(2);
      expect(r.text.split('\n')).toHaveLength(1);
      expect(r.text).toMatch(re);
    });
  }
});
