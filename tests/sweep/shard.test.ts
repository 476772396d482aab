/**
 * Shards: which points shard K of N holds, how K is taken from a Kubernetes indexed Job or a
 * Slurm array, output names per shard; and, with real processes, shards merged into exactly the
 * file of an unsharded run.
 */
import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';
import { chooseShard, shardBlock, shardPath } from '../../src/cli/sweep-shard.ts';
import { furrow, smallDesign, tempDir, writeJson } from './run-helpers.ts';

describe('shard blocks and numbers', () => {
  it('the N blocks tile 0…count−1 in order, their sizes differing by at most one', () => {
    for (let count = 0; count <= 40; count++) {
      for (let n = 1; n <= 12; n++) {
        let next = 0;
        const sizes: number[] = [];
        for (let k = 1; k <= n; k++) {
          const b = shardBlock(count, k, n);
          expect(b.first).toBe(next);
          expect(b).toMatchObject({ index: k, count: n });
          sizes.push(b.end - b.first);
          next = b.end;
        }
        expect(next).toBe(count);
        expect(Math.max(...sizes) - Math.min(...sizes)).toBeLessThanOrEqual(1);
      }
    }
    expect(shardBlock(10, 2, 3)).toEqual({ index: 2, count: 3, first: 3, end: 6 });
  });

  it('K comes from --shard K/N, or from JOB_COMPLETION_INDEX (0-based) or the Slurm array id counted from its first id', () => {
    expect(chooseShard('2/5', undefined, {})).toEqual({ index: 2, count: 5 });
    expect(chooseShard(undefined, undefined, { JOB_COMPLETION_INDEX: '3' })).toBeNull();
    expect(chooseShard('auto/8', undefined, { JOB_COMPLETION_INDEX: '0' })).toEqual({ index: 1, count: 8 });
    expect(chooseShard(undefined, '8', { JOB_COMPLETION_INDEX: '7' })).toEqual({ index: 8, count: 8 });
    expect(chooseShard(undefined, '4', { SLURM_ARRAY_TASK_ID: '1', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_COUNT: '4' })).toEqual({ index: 1, count: 4 });
    expect(chooseShard(undefined, '4', { SLURM_ARRAY_TASK_ID: '3', SLURM_ARRAY_TASK_MIN: '0' })).toEqual({ index: 4, count: 4 });
    expect(chooseShard('auto/4', undefined, { SLURM_ARRAY_TASK_ID: '12', SLURM_ARRAY_TASK_MIN: '10' })).toEqual({ index: 3, count: 4 });
  });

  it('refuses what would leave gaps or overlaps: a K outside 1…N, an array of another size, no index at all, malformed values', () => {
    expect(() => chooseShard('0/4', undefined, {})).toThrow('--shard: shard 0 does not exist: shards are numbered 1…4');
    expect(() => chooseShard('5/4', undefined, {})).toThrow(/shard 5 does not exist/);
    expect(() => chooseShard(undefined, '4', { JOB_COMPLETION_INDEX: '4' })).toThrow(/shard 5 does not exist/);
    expect(() => chooseShard(undefined, '4', { SLURM_ARRAY_TASK_ID: '2', SLURM_ARRAY_TASK_MIN: '1', SLURM_ARRAY_TASK_COUNT: '6' })).toThrow(
      'the Slurm array has 6 tasks but the sweep is split into 4 shards',
    );
    expect(() => chooseShard(undefined, '4', { SLURM_ARRAY_TASK_ID: '2' })).toThrow(/SLURM_ARRAY_TASK_MIN must be whole numbers/);
    expect(() => chooseShard('auto/4', undefined, {})).toThrow(/neither is set/);
    expect(() => chooseShard('2-4', undefined, {})).toThrow('--shard: expected K/N (e.g. 3/16) or auto/N, found "2-4"');
    expect(() => chooseShard('1/4', '4', {})).toThrow(/not both/);
    expect(() => chooseShard(undefined, '0', {})).toThrow(/1…1000000/);
  });

  it('{shard} in the output name becomes K, zero-padded to the width of N, and {shards} becomes N', () => {
    expect(shardPath('out/part-{shard}-of-{shards}.csv', { index: 3, count: 12 })).toBe('out/part-03-of-12.csv');
    expect(shardPath('part-{shard}.csv', { index: 7, count: 9 })).toBe('part-7.csv');
    expect(shardPath('all.csv', null)).toBe('all.csv');
    expect(() => shardPath('part-{shard}.csv', null)).toThrow(/needs --shard or --shards/);
  });
});

describe('shards on separate processes', () => {
  it('three shards (explicit, Kubernetes index, Slurm id) merged are byte-identical to the unsharded run', async () => {
    const dir = tempDir();
    const design = writeJson(dir, 'design.json', smallDesign());
    const base = ['sweep', design, '--param', 'incidence.wavelength=400nm:800nm:7', '--param', 'grating.duty=0.4,0.6', '--quiet'];
    const part = join(dir, 'part-{shard}.csv');
    const runs = await Promise.all([
      furrow([...base, '--shard', '1/3', '--workers', '1', '-o', part]),
      furrow([...base, '--shards', '3', '--workers', '2', '-o', part], { JOB_COMPLETION_INDEX: '1' }),
      furrow([...base, '--shard', 'auto/3', '--workers', '1', '-o', part], { SLURM_ARRAY_TASK_ID: '7', SLURM_ARRAY_TASK_MIN: '5', SLURM_ARRAY_TASK_COUNT: '3' }),
      furrow([...base, '--workers', '1', '-o', join(dir, 'whole.csv')]),
    ]);
    for (const r of runs) expect(r.code).toBe(0);
    const headers = [1, 2, 3].map((k) => JSON.parse(readFileSync(join(dir, `part-${k}.csv.run.json`), 'utf8')));
    expect(headers.map((h) => h.shard)).toEqual([shardBlock(14, 1, 3), shardBlock(14, 2, 3), shardBlock(14, 3, 3)]);
    const whole = readFileSync(join(dir, 'whole.csv'), 'utf8');
    // each shard file is the header and its block of the whole file's rows
    const rows = whole.split('\n');
    headers.forEach((h, k) => {
      expect(readFileSync(join(dir, `part-${k + 1}.csv`), 'utf8')).toBe([rows[0], ...rows.slice(1 + h.shard.first, 1 + h.shard.end), ''].join('\n'));
    });

    const m = await furrow(['merge', join(dir, 'all.csv'), join(dir, 'part-3.csv'), join(dir, 'part-1.csv'), join(dir, 'part-2.csv')]);
    expect(m.code).toBe(0);
    expect(m.stdout).toContain(`merge: 14 points from 3 files → ${join(dir, 'all.csv')}`);
    expect(readFileSync(join(dir, 'all.csv'), 'utf8')).toBe(whole);
  });
});
