/** The command line as a user meets it: output, JSON, and errors without stack traces. */
import { mkdtempSync, writeFileSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { cli } from './run-cli.ts';

const run = (...args: string[]): Promise<{ code: number; text: string }> => cli(args);

const dir = mkdtempSync(join(tmpdir(), 'furrow-cli-'));
const write = (name: string, content: unknown): string => {
  const p = join(dir, name);
  writeFileSync(p, typeof content === 'string' ? content : JSON.stringify(content));
  return p;
};

describe('furrow CLI', () => {
  const glass = write('glass.json', { title: 'bare glass', period: '1 um', substrate: 1.5, incidence: { wavelength: '600 nm', angleDeg: 0 }, orders: 3 });

  it('`furrow solve` prints the order table with R = 0.04 for bare n = 1.5 glass at normal incidence (Fresnel)', async () => {
    const r = await run('solve', glass);
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/design\s+bare glass/);
    expect(r.text).toMatch(/R \(reflected\)\s+0\.040000000\s+0\.040000000/);
  });

  it('`furrow solve --json` prints the documented result with its input', async () => {
    const r = await run('solve', glass, '--json');
    const j = JSON.parse(r.text);
    expect(j.result.solver.name).toBe('furrow');
    expect(j.input.structure.periodUm).toBe(1);
    expect(Math.abs(j.result.s.R - 0.04)).toBeLessThan(1e-14);
    expect(j.result.s.reflected[0]).toHaveProperty('amplitudeS');
  });

  it('`furrow orders` lists the order directions from the grating equation (λ/Λ = 0.6, normal incidence: θ±1 = ±36.870°)', async () => {
    const r = await run('orders', glass);
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/\s1\s+36\.870/);
  });

  it('`furrow demo` sweeps the blazed example in Littrow and summarizes it: the blaze wavelength 2Λ·sinθB = 500.2 nm (common practice), peaks, 50 % band, energy balance', async () => {
    const csv = join(dir, 'demo.csv');
    const r = await run('demo', '--output', csv, '--quiet');
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/blaze wavelength λB = 2Λ·sinθB = 500\.2 nm/);
    const peak = /order −1, TE\s*: peak ([\d.]+) % at ([\d.]+) nm; above 50 % over (\d+)–(\d+) nm/.exec(r.text)!;
    expect(Number(peak[1])).toBeGreaterThan(50);
    expect(Number(peak[2])).toBeGreaterThanOrEqual(400);
    expect(r.text).toMatch(/energy balance: R \+ T ≤ 1 at every point/);
    const { readFileSync } = await import('node:fs');
    const lines = readFileSync(csv, 'utf8').trim().split('\n');
    expect(lines).toHaveLength(32); // header + 31 wavelengths
    expect(lines[0]).toMatch(/^point_index,wavelength_nm,theta_deg,R_-1_TE/);
  });

  it('a malformed design gives a clear message and exit code 2, no stack trace', async () => {
    const bad = write('bad.json', { period: '1 um', substrate: 1.5, incidence: { wavelength: '600 nm' }, layers: [{ thickness: '10 nm', segments: [{ width: 0.4, index: 2 }] }] });
    const r = await run('solve', bad);
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/^furrow: invalid design — layers\[0\]\.segments: segment widths/);
    expect(r.text).not.toMatch(/at .*\.ts:\d+/);
  });

  it('a missing file and bad JSON are reported plainly', async () => {
    expect((await run('solve', join(dir, 'none.json'))).text).toMatch(/cannot read design file .*ENOENT/);
    const r = await run('solve', write('broken.json', '{ "period": '));
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/not valid JSON/);
  });

  it('--orders must be a whole number', async () => {
    const r = await run('solve', glass, '--orders', 'many');
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/--orders: expected "auto" or an integer 0…1000, found "many"/);
  });
});

describe('furrow materials', () => {
  it('lists the library with sources (Malitson 1965 for fused silica)', async () => {
    const r = await run('materials');
    expect(r.code).toBe(0);
    expect(r.text).toMatch(/fused-silica\s+Sellmeier\s+0\.21–3\.71\s+I\. H\. Malitson, J\. Opt\. Soc\. Am\. 55, 1205 \(1965\)/);
  });
  it('shows n, k over a range: Au (Rakić 1998 Lorentz–Drude) at 632.8 nm is 0.31228 + 3.14605i (computed from the published fit)', async () => {
    const r = await run('materials', 'show', 'Au-LD', '--from', '632.8nm', '--to', '632.8nm', '--steps', '1');
    expect(r.code).toBe(0);
    const row = /632\.800\s+0\.632800\s+(\S+)\s+(\S+)/.exec(r.text)!;
    // printed to 6 decimals; the source's value has 5
    expect(Math.abs(Number(row[1]) - 0.31228)).toBeLessThan(5e-6);
    expect(Math.abs(Number(row[2]) - 3.14605)).toBeLessThan(5e-6);
  });
  it('refuses a wavelength outside the valid range and an unknown name, with exit code 2', async () => {
    const a = await run('materials', 'show', 'Au-LD', '--from', '20um', '--to', '30um');
    expect(a.code).toBe(2);
    expect(a.text).toMatch(/outside its valid range/);
    const b = await run('materials', 'show', 'gold');
    expect(b.text).toMatch(/did you mean 'Au-LD'/);
  });
});

describe('furrow schema', () => {
  it('prints the JSON Schema of the design file, identical to the committed src/design/design.schema.json', async () => {
    const r = await run('schema');
    expect(r.code).toBe(0);
    const schema = JSON.parse(r.text);
    expect(schema.properties.grating.oneOf ?? schema.properties.grating.anyOf).toBeDefined();
    expect(Object.keys(schema.properties)).toEqual(expect.arrayContaining(['period', 'grooveDensityPerMm', 'substrate', 'grating', 'incidence', 'orders', 'slices']));
    const { readFileSync } = await import('node:fs');
    const committed = JSON.parse(readFileSync(new URL('../../src/design/design.schema.json', import.meta.url), 'utf8'));
    expect(committed, 'regenerate with: node src/cli/bin.mjs schema > src/design/design.schema.json').toEqual(schema);
  });
});

describe('designs with user material tables', () => {
  it('reads a CSV table next to the design and uses it (a flat n = 1.5 table gives R = 0.04 at normal incidence: Fresnel)', async () => {
    write('flat-glass.csv', '# measured on an invented bench\nwavelength_nm,n,k\n400,1.5,0\n800,1.5,0\n');
    const d = write('with-table.json', { period: '1 um', substrate: 'my-glass', materialTables: [{ name: 'my-glass', file: 'flat-glass.csv' }], incidence: { wavelength: '600 nm' }, orders: 3 });
    const r = await run('solve', d, '--json');
    expect(r.code).toBe(0);
    expect(Math.abs(JSON.parse(r.text).result.s.R - 0.04)).toBeLessThan(1e-14);
  });
  it('says which line of a bad table is wrong, and which file is missing', async () => {
    write('bad.csv', 'wavelength_nm,n,k\n400,1.5,0\n500,abc,0\n');
    const d = write('bad-table.json', { period: '1 um', substrate: 'x', materialTables: [{ name: 'x', file: 'bad.csv' }], incidence: { wavelength: '450 nm' } });
    const r = await run('solve', d);
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/materialTables\[0\].*line 3/);
    const m = write('missing-table.json', { period: '1 um', substrate: 'x', materialTables: [{ name: 'x', file: 'nope.csv' }], incidence: { wavelength: '450 nm' } });
    expect((await run('solve', m)).text).toMatch(/materialTables\[0\]\.file: cannot read "nope\.csv": ENOENT/);
  });
  it('notes which index of a uniaxial crystal was used (sapphire: ordinary)', async () => {
    const d = write('sapphire.json', { period: '1 um', substrate: 'sapphire', incidence: { wavelength: '633 nm' }, orders: 2 });
    const r = await run('solve', d);
    expect(r.text).toMatch(/note\s+sapphire: .*ordinary index/);
  });
});

describe('furrow fields', () => {
  it('reports the peak |E|² per material with the laser caution, and writes the grid', async () => {
    // bare glass at normal incidence: the standing wave in air peaks at (1 + |r|)² = 1.44 (Fresnel, r = −0.2)
    const glass = write('glass-fields.json', { period: '1 um', substrate: 1.5, incidence: { wavelength: '600 nm' }, orders: 2 });
    const csv = join(dir, 'fields.csv');
    const r = await run('fields', glass, '--output', csv, '--nx', '8', '--periods', '1');
    expect(r.code).toBe(0);
    const peak = Number(/^air\s+([\d.]+)/m.exec(r.text)![1]);
    expect(Math.abs(peak - 1.44)).toBeLessThan(2e-3); // sampled on a grid of λ/100
    expect(r.text).toMatch(/caution: field-enhancement figures are design estimates, not laser-damage thresholds/);
    const { readFileSync } = await import('node:fs');
    const lines = readFileSync(csv, 'utf8').trim().split('\n');
    expect(lines[0]).toBe('x_nm,z_nm,region,E2,Ex_re,Ex_im,Ey_re,Ey_im,Ez_re,Ez_im,Hx_re,Hx_im,Hy_re,Hy_im,Hz_re,Hz_im');
    expect(lines.length).toBeGreaterThan(100);
  });
  it('refuses a bad polarization', async () => {
    const glass = write('glass-fields2.json', { period: '1 um', substrate: 1.5, incidence: { wavelength: '600 nm' }, orders: 2 });
    const r = await run('fields', glass, '--pol', 'XY');
    expect(r.code).toBe(2);
    expect(r.text).toMatch(/--pol: expected TE or TM/);
  });
});
