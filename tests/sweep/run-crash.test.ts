/**
 * A worker thread that dies or throws under a batch: the batch runs again; a point that keeps
 * killing its worker becomes a 'failed' row with the reason, and every other row is what an
 * undisturbed run writes. Faults are injected with the worker's test-only hooks
 * (FURROW_TEST_CRASH_AT, FURROW_TEST_CRASH_MODE, FURROW_TEST_CRASH_TOKEN).
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { csvField } from '../../src/cli/sweep-output.ts';
import { expectedCsv, furrow, smallDesign, tempDir, writeJson } from './run-helpers.ts';

const dir = tempDir();
const design = smallDesign();
const designPath = writeJson(dir, 'design.json', design);
const params = ['incidence.wavelength=400nm:800nm:12'];
const args = ['sweep', designPath, '--param', params[0]!, '--workers', '2', '--batch', '4'];
const reference = expectedCsv(design, params);

describe('worker faults', () => {
  it('a point whose worker always exits is retried, then reported failed with the reason; the sweep goes on', async () => {
    const out = join(dir, 'exit.csv');
    const r = await furrow([...args, '-o', out], { FURROW_TEST_CRASH_AT: '5' });
    expect(r.code).toBe(0);
    expect(r.stdout).toMatch(/sweep: 12 points, 1 failed \(status column\) → .*batch(es)? run again after a worker fault/);
    const got = readFileSync(out, 'utf8').split('\n');
    const want = reference.split('\n');
    const columns = want[0]!.split(',');
    expect(got).toHaveLength(want.length);
    got.forEach((line, i) => {
      if (i !== 6) expect(line).toBe(want[i]);
    });
    const failed = got[6]!;
    expect(csvField(failed, 0)).toBe('5');
    expect(csvField(failed, 1)).toBe(csvField(want[6]!, 1)); // the wavelength of point 5
    expect(csvField(failed, columns.indexOf('status'))).toBe('failed');
    expect(csvField(failed, columns.indexOf('error'))).toBe('worker failed on this point, also when retried: worker exited with code: 70');
    for (let j = 2; j < columns.indexOf('status'); j++) expect(csvField(failed, j)).toBe('');
    expect(JSON.parse(readFileSync(`${out}.run.json`, 'utf8'))).toMatchObject({ complete: true, written: 12, failed: 1 });
  });

  it('a worker that throws once under a batch: the retry succeeds and the file is as if nothing happened', async () => {
    const out = join(dir, 'once.csv');
    const token = join(dir, 'fault-fired');
    const r = await furrow([...args, '-o', out], { FURROW_TEST_CRASH_AT: '9', FURROW_TEST_CRASH_MODE: 'throw', FURROW_TEST_CRASH_TOKEN: token });
    expect(r.code).toBe(0);
    expect(readFileSync(out, 'utf8')).toBe(reference);
    expect(existsSync(token)).toBe(true); // the fault did fire
    expect(r.stdout).toMatch(/12 points → .*; 1 batch run again after a worker fault/);
    expect(r.stdout).not.toMatch(/failed/);
    expect(readFileSync(out, 'utf8')).not.toContain('test fault');
  });
});
