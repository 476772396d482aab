/**
 * A sweep stopped midway — Ctrl-C (SIGINT), SIGTERM, or killed outright (SIGKILL) — leaves a
 * file of complete rows, and `--resume` finishes it into exactly the file an uninterrupted run
 * writes. A resume against a changed design is refused.
 *
 * The runs are slowed with the worker's test-only FURROW_TEST_POINT_DELAY_MS so that they are
 * still going when the signal arrives; the signal is sent once rows are on disk.
 */
import { existsSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { beforeAll, describe, expect, it } from 'vitest';
import { fileLines, furrow, smallDesign, startFurrow, tempDir, waitForLines, writeJson } from './run-helpers.ts';

const dir = tempDir();
const design = smallDesign();
const designPath = writeJson(dir, 'design.json', design);
const sweepArgs = ['sweep', designPath, '--param', 'incidence.wavelength=400nm:800nm:40', '--quiet'];
const slow = { FURROW_TEST_POINT_DELAY_MS: '80' };
let reference = '';

beforeAll(async () => {
  const r = await furrow([...sweepArgs, '--workers', '1', '-o', join(dir, 'reference.csv')]);
  expect(r.code).toBe(0);
  reference = readFileSync(join(dir, 'reference.csv'), 'utf8');
});

/** Every line complete, each a row of the reference in order: the file is valid CSV and a prefix of the full one. */
function expectCompletePrefix(path: string): number {
  const { lines, tail } = fileLines(path);
  expect(tail).toBe('');
  const want = reference.split('\n');
  const width = want[0]!.split(',').length;
  lines.forEach((l, i) => {
    expect(l.split(',')).toHaveLength(width);
    expect(l).toBe(want[i]);
  });
  return lines.length - 1;
}

describe('a sweep interrupted, then resumed', () => {
  it('Ctrl-C (SIGINT): running batches finish, finished rows stay, exit 130 with how to resume; --resume completes it byte for byte', async () => {
    const out = join(dir, 'sigint.csv');
    const run = startFurrow([...sweepArgs, '--workers', '2', '--batch', '2', '-o', out], slow);
    await waitForLines(out, 1 + 6);
    run.child.kill('SIGINT');
    const r = await run.done;
    expect(r.code).toBe(130);
    const done = expectCompletePrefix(out);
    expect(done).toBeGreaterThanOrEqual(6);
    expect(done).toBeLessThan(40);
    expect(r.stdout).toContain(`furrow: sweep interrupted (SIGINT): ${done} of 40 points are in ${out}; continue with the same command and --resume`);
    expect(JSON.parse(readFileSync(`${out}.run.json`, 'utf8'))).toMatchObject({ complete: false, written: done });

    const again = await furrow([...sweepArgs, '--workers', '2', '-o', out, '--resume']);
    expect(again.code).toBe(0);
    expect(readFileSync(out, 'utf8')).toBe(reference);
    expect(JSON.parse(readFileSync(`${out}.run.json`, 'utf8'))).toMatchObject({ complete: true, written: 40 });
  });

  it('SIGKILL: nothing gets to clean up, yet every line on disk is complete; --resume completes it byte for byte', async () => {
    const out = join(dir, 'sigkill.csv');
    const run = startFurrow([...sweepArgs, '--workers', '2', '--batch', '3', '-o', out], slow);
    await waitForLines(out, 1 + 5);
    run.child.kill('SIGKILL');
    const r = await run.done;
    expect(r.signal).toBe('SIGKILL');
    const done = expectCompletePrefix(out);
    expect(done).toBeLessThan(40);
    expect(JSON.parse(readFileSync(`${out}.run.json`, 'utf8')).complete).toBe(false);

    const again = await furrow([...sweepArgs.filter((a) => a !== '--quiet'), '--workers', '1', '-o', out, '--resume']);
    expect(again.code).toBe(0);
    expect(again.stdout).toMatch(new RegExp(`sweep: 40 points \\(${done} were already there\\)`));
    expect(readFileSync(out, 'utf8')).toBe(reference);
  });

  it('SIGTERM on one worker (points run on the main thread): exit 143, complete rows in point order', async () => {
    const out = join(dir, 'sigterm.csv');
    const many = ['sweep', designPath, '--param', 'incidence.wavelength=400nm:800nm:4000', '--quiet', '-o', out];
    const run = startFurrow([...many, '--workers', '1']);
    await waitForLines(out, 1 + 40);
    run.child.kill('SIGTERM');
    const r = await run.done;
    expect(r.code).toBe(143);
    expect(r.stdout).toMatch(/sweep interrupted \(SIGTERM\): \d+ of 4000 points/);
    const { lines, tail } = fileLines(out);
    expect(tail).toBe('');
    expect(lines.length).toBeLessThan(4001);
    lines.slice(1).forEach((l, i) => expect(l.startsWith(`${i},`)).toBe(true));
  });

  it('--resume refuses a file written for another design, and leaves it as it was', async () => {
    const out = join(dir, 'sigint.csv');
    const before = readFileSync(out, 'utf8');
    const other = writeJson(dir, 'deeper.json', smallDesign(310));
    const r = await furrow(['sweep', other, '--param', 'incidence.wavelength=400nm:800nm:40', '--workers', '1', '-o', out, '--resume']);
    expect(r.code).toBe(2);
    expect(r.stdout.trim().split('\n')).toHaveLength(1);
    expect(r.stdout).toMatch(/^furrow: --resume: .*sigint\.csv was written for a different design or sweep \(run header .*sigint\.csv\.run\.json has sha256:[0-9a-f]{12}…, this run is sha256:[0-9a-f]{12}…\)/);
    expect(readFileSync(out, 'utf8')).toBe(before);
    expect(existsSync(`${out}.run.json`)).toBe(true);
  });
});
