/**
 * `furrow optimize` on the command line: flags, the design file's section with flags laid over
 * it, text and JSON reports, and one clear line (exit 2) for each kind of bad input.
 */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { parseRequireFlag, parseVaryFlag } from '../../src/cli/optimize.ts';
import { cli } from '../cli/run-cli.ts';

const dir = mkdtempSync(join(tmpdir(), 'furrow-optimize-'));
/** Binary phase grating in the scalar regime (Λ/λ = 10, n = 1.5): the π step is at 1000 nm. */
const binary = {
  title: 'binary phase grating',
  periodUm: 10,
  cover: 'air',
  substrate: 1.5,
  grating: { profile: 'lamellar', duty: 0.5, depth: '800 nm', ridge: 1.5 },
  incidence: { wavelength: '1000 nm', angleDeg: 0 },
  orders: 16,
};
const file = (name: string, obj: unknown): string => {
  const p = join(dir, name);
  writeFileSync(p, JSON.stringify(obj));
  return p;
};
const plain = file('binary.json', binary);
const withSection = file('binary-section.json', {
  ...binary,
  optimize: { variables: [{ path: 'grating.depth', min: '300 nm', max: '1800 nm' }], objective: { order: 0, side: 'T', polarization: 'TE', goal: 'minimize' }, starts: 1 },
});

describe('furrow optimize', () => {
  it('optimizes from flags alone and prints the optimum, the curve at it and the solves', async () => {
    const r = await cli(['optimize', plain, '--vary', 'grating.depth=300nm:1800nm', '--order', '-1,1', '--side', 'T', '--pol', 'TE', '--workers', '1']);
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/objective\s+maximize T\(-1 \+ \+1\) TE/);
    expect(r.text).toMatch(/scan\s+grid, 21 points, 21 solves \(in-process\)/);
    expect(r.text).toMatch(/refine\s+Brent from \d starts? \(\d converged\)/);
    expect(r.text).toMatch(/grating\.depth\s+99\d\.\d+ nm\s+\(design: 800 nm\)/); // the π step at 1000 nm (common practice)
    expect(r.text).toMatch(/λ \(nm\)\s+TE\s+TM\s+unpol\./);
    expect(r.text).toMatch(/solves\s+\d+ in \d+\.\d\d s/);
  });

  it('prints JSON with --json', async () => {
    const r = await cli(['optimize', plain, '--vary', 'grating.depth=300nm:1800nm', '--order', '-1,1', '--side', 'T', '--pol', 'TE', '--workers', '1', '--json']);
    expect(r.code).toBe(0);
    const j = JSON.parse(r.text);
    expect(j.design).toBe('binary phase grating');
    expect(j.variables[0]).toMatchObject({ path: 'grating.depth', unit: 'nm', min: 300, max: 1800, nominal: 800 });
    expect(Math.abs(j.variables[0].value - 1000)).toBeLessThan(20);
    expect(j.curves[0].te).toHaveLength(21);
    expect(j.curves[0].tm).toHaveLength(21);
    expect(j.solves).toBeGreaterThan(21);
    expect(j.seconds).toBeGreaterThan(0);
  });

  it("uses the design file's section, with flags replacing its fields one by one", async () => {
    const own = JSON.parse((await cli(['optimize', withSection, '--workers', '1', '--json'])).text);
    expect(own.objective.description).toBe('T(0) TE');
    expect(own.objective.goal).toBe('minimize');
    expect(own.objective.value).toBeLessThan(0.01); // the zero order vanishes at the π step (scalar theory)
    const over = JSON.parse((await cli(['optimize', withSection, '--order', '-1,1', '--maximize', '--workers', '1', '--json'])).text);
    expect(over.objective.description).toBe('T(-1 + +1) TE'); // side and polarization kept from the file
    expect(over.objective.goal).toBe('maximize');
    expect(over.refine.starts).toHaveLength(1); // "starts": 1 kept from the file
  });

  it('takes constraints, a band, a mount and a scan from flags', async () => {
    const r = await cli(['optimize', plain, '--vary', 'grating.depth=300nm:1800nm', '--order', '1', '--side', 'T', '--pol', 'TE', '--require', 'T(0) TE <= 0.05', '--band', '980nm:1020nm:3', '--scan', 'grid:11', '--workers', '1']);
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/3 wavelengths 980–1020 nm × the design's angle/);
    expect(r.text).toMatch(/scan\s+grid, 11 points, 33 solves/);
    expect(r.text).toMatch(/constraint T\(0\) TE ≤ 0\.05: 0\.0\d+ met/);
  });

  it('reads constraint and variable flags', () => {
    expect(parseRequireFlag('R(-1) TM >= 0.9')).toEqual({ side: 'R', order: -1, polarization: 'TM', min: 0.9 });
    expect(parseRequireFlag('t(-1, 1) worst min ≤ 0.2')).toEqual({ side: 'T', order: [-1, 1], polarization: 'worst', over: 'min', max: 0.2 });
    expect(parseVaryFlag('grating.duty=0.2:0.8')).toEqual({ path: 'grating.duty', min: 0.2, max: 0.8 });
    expect(parseVaryFlag('grating.depth=100nm:1.2um')).toEqual({ path: 'grating.depth', min: '100nm', max: '1.2um' });
  });

  const bad: Array<[string, string[], RegExp]> = [
    ['a length without a unit', ['--vary', 'grating.depth=300:1800', '--order', '1', '--side', 'T'], /^furrow: invalid design — optimize\.variables\[0\]\.min: 'grating\.depth' is a length: write it with a unit, e\.g\. "300 nm"$/],
    ['a malformed --vary', ['--vary', 'grating.depth', '--order', '1', '--side', 'T'], /^furrow: --vary: expected PATH=MIN:MAX/],
    ['a bad --side', ['--vary', 'grating.depth=300nm:1800nm', '--order', '1', '--side', 'X'], /^furrow: --side: expected R \(reflected\) or T \(transmitted\), found "X"$/],
    ['a malformed --require', ['--vary', 'grating.depth=300nm:1800nm', '--order', '1', '--side', 'T', '--require', 'TM > 0.9'], /^furrow: --require: expected SIDE\(ORDERS\)/],
    ['two goals', ['--vary', 'grating.depth=300nm:1800nm', '--order', '1', '--side', 'T', '--maximize', '--target', '0.3'], /^furrow: --target: give one of --maximize, --minimize and --target$/],
    ['a bad --workers', ['--vary', 'grating.depth=300nm:1800nm', '--order', '1', '--side', 'T', '--workers', '0'], /^furrow: --workers: expected a whole number 1…1024, found "0"$/],
    ['no section and no flags', [], /^furrow: invalid design — optimize: the design has no "optimize" section; add one, or give --vary/],
    ['no side', ['--vary', 'grating.depth=300nm:1800nm', '--order', '1'], /^furrow: invalid design — optimize\.objective\.side: /],
  ];
  for (const [what, args, re] of bad) {
    it(`answers ${what} with one line and exit code 2`, async () => {
      const r = await cli(['optimize', plain, ...args]);
      expect(r.code).toBe(2);
      expect(r.text.split('\n')).toHaveLength(1);
      expect(r.text).toMatch(re);
    });
  }

  it('answers a missing file with one line and exit code 2', async () => {
    const r = await cli(['optimize', join(dir, 'nope.json')]);
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/^furrow: cannot read design file .*nope\.json: ENOENT$/);
  });
});
